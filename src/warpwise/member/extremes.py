"""Stations along a member and the largest value of each quantity with where it is.

The largest |value| of a quantity is searched on a dense grid per segment (even spacing plus
points crowded towards the segment ends within a few torsion bending lengths a, where the
warping terms change fastest), both limits at every load point, then refined by a bounded
scalar search (scipy) between the grid neighbours of the best point.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from .solution import MemberTorsion
from .terms import QUANTITIES

#: Grid points per segment for the search of the maxima.
GRID = 400


@dataclass(frozen=True)
class Extreme:
    """The largest |value| of one quantity along the member.

    Attributes
    ----------
    name : str
        Attribute name in :class:`MemberActions`.
    value : float
        The signed value of largest magnitude (units of the quantity).
    z : float
        Where it is, L.
    side : str
        "left" or "right": the limit taken at a load point (where phi''' and T jump).
    """

    name: str
    value: float
    z: float
    side: str


#: Relative difference below which two values along the member are the same maximum (far
#: above the round-off of the closed-form solution, far below any difference that matters).
TIE = 1e-9
#: Relative gain by which the search between grid points must beat the grid's best: above the
#: round-off of the solution (a tie at a support stays there), below any true peak's gain over
#: its nearest grid point (about 1e-10 for a midspan peak between points L/2000 apart).
GAIN = 1e-13


def stations(member: MemberTorsion, count: int = 11) -> np.ndarray:
    """``count`` evenly spaced positions from 0 to L, with every load point added, L."""
    z = np.linspace(0.0, member.length, max(int(count), 2))
    return np.unique(np.concatenate([z, member.starts]))


def _grid(member: MemberTorsion) -> tuple[np.ndarray, np.ndarray]:
    """Search positions per segment (each (k,)): segment index and position."""
    segs, zs = [], []
    a = member.a
    for j in range(len(member.starts) - 1):  # a handful of segments
        z0, z1 = member.starts[j], member.starts[j + 1]
        h = z1 - z0
        u = np.linspace(0.0, 1.0, GRID)
        pts = [z0 + h * u]
        if a > 0:
            near = np.minimum(h, 8.0 * a) * u**3
            pts += [z0 + near, z1 - near]
        z = np.unique(np.clip(np.concatenate(pts), z0, z1))
        segs.append(np.full(z.shape, j))
        zs.append(z)
    return np.concatenate(segs), np.concatenate(zs)


def _value(member: MemberTorsion, name: str, z: float, side: str) -> float:
    return float(getattr(member.actions(np.array([z]), side), name)[0])


def extremes(member: MemberTorsion) -> list[Extreme]:
    """The largest |value| of each quantity of :data:`QUANTITIES` with its position."""
    from scipy.optimize import minimize_scalar  # here, not at start-up (scipy.optimize is slow to load)

    seg, z = _grid(member)
    # the end of a segment is taken from that segment (left limit), its start from the right
    end = np.isin(z, member.starts[1:]) & (z == member.starts[seg + 1])
    left = member.actions(z, "left")
    right = member.actions(z, "right")
    out = []
    for name, _sym in QUANTITIES:
        vals = np.where(end, getattr(left, name), getattr(right, name))
        size_all = np.abs(vals)
        # equal maxima (a symmetric member: both supports and the load point) differ by
        # round-off only; the first along the member is taken, so that the choice does not
        # follow the round-off of a machine and equal sections of two quantities coincide
        # (a flat peak's neighbouring points are one candidate: the best point of the first run)
        near = np.flatnonzero(size_all >= size_all.max() * (1.0 - TIE))
        run = near[: int(np.argmax(np.diff(near) > 1)) + 1] if np.any(np.diff(near) > 1) else near
        k = int(run[np.argmax(size_all[run])])
        best_z, best = float(z[k]), float(vals[k])
        side = "left" if end[k] else "right"
        same = np.flatnonzero(seg == seg[k])
        lo = float(z[max(k - 1, same[0])])
        hi = float(z[min(k + 1, same[-1])])
        if hi > lo:
            def size(t: float, name: str = name, side: str = side) -> float:
                return -abs(_value(member, name, t, side))

            res = minimize_scalar(size, bounds=(lo, hi), method="bounded",
                                  options={"xatol": 1e-12 * member.length})
            v = _value(member, name, float(res.x), side)
            if abs(v) > abs(best) * (1.0 + GAIN):
                best_z, best = float(res.x), v
        out.append(Extreme(name=name, value=best, z=best_z, side=side))
    return out


__all__ = ["GRID", "QUANTITIES", "Extreme", "extremes", "stations"]
