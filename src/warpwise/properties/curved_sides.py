"""Sides of an outline along recorded circles and ellipses, integrated above a level line.

The plastic moduli (:mod:`.plastic`) integrate x dy and x y dy round the part of the boundary
above a neutral axis (Green's theorem). Along a side that is a chord of a recorded curve
(:attr:`Profile.arcs`, matched by :func:`.outline.chord_curves`), the integral is taken along the
curve instead: Gauss-Legendre on each stretch of the side between the points where it crosses
the axis. The integrals of whole sides and their height ranges are found once per frame, the
sides wholly above an axis are summed from a running sum in the order of their lowest points,
and only the few sides the axis crosses are integrated again for each trial position of it.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from ..geometry.curves import Curve

#: Gauss-Legendre points per stretch of a curved side. The integrands are trigonometric
#: polynomials of degree 3 at most over a parameter span of at most pi / 2, where 12 points leave
#: an error below 1e-16 relative (the Gauss remainder (b - a)^25 (12!)^4 / (25 (24!)^3) times
#: the 24th derivative, at most 3^24 times the integrand; common practice, no source).
CURVE_POINTS = 12
_XI, _WQ = np.polynomial.legendre.leggauss(CURVE_POINTS)


@dataclass(frozen=True)
class CurvedSides:
    """Sides that follow recorded curves, in one (rotated) frame, drawing unit L, radians.

    Side k runs along ``centre[k] + cos t * u[k] + sin t * v[k]`` from ``t_start[k]`` to
    ``t_end[k]``, between the heights ``low[k]`` and ``high[k]``; ``above[j]`` sums the weighted
    integrals of x dy and x y dy (L^2, L^3) of the sides ``by_low[j:]`` (sorted by ``low``).
    """

    centre: np.ndarray
    u: np.ndarray
    v: np.ndarray
    t_start: np.ndarray
    t_end: np.ndarray
    weight: np.ndarray
    low: np.ndarray
    high: np.ndarray
    by_low: np.ndarray
    above: np.ndarray

    @property
    def heights(self) -> tuple[float, float]:
        """Lowest and highest y of the sides, L."""
        if len(self.t_start) == 0:
            return np.inf, -np.inf
        return float(self.low.min()), float(self.high.max())


def _integrals(c: CurvedSides, rows: np.ndarray, a: np.ndarray, b: np.ndarray) -> np.ndarray:
    """Integrals of x dy and x y dy (..., 2) along sides ``rows`` (k,) from t = a to b (k, m)."""
    mid, rad = 0.5 * (a + b), 0.5 * (b - a)
    t = mid[..., None] + rad[..., None] * _XI  # (k, m, q)
    cos, sin = np.cos(t), np.sin(t)

    def along(v: np.ndarray) -> np.ndarray:
        return v[rows][:, None, None]

    x = along(c.centre[:, 0]) + along(c.u[:, 0]) * cos + along(c.v[:, 0]) * sin
    y = along(c.centre[:, 1]) + along(c.u[:, 1]) * cos + along(c.v[:, 1]) * sin
    dy = -along(c.u[:, 1]) * sin + along(c.v[:, 1]) * cos
    w = rad[..., None] * _WQ
    return np.stack([np.sum(w * x * dy, axis=-1), np.sum(w * x * y * dy, axis=-1)], axis=-1)


def curved_sides(which: np.ndarray, t_start: np.ndarray, t_end: np.ndarray, arcs: Sequence[Curve],
                 weights: np.ndarray, rot: np.ndarray) -> CurvedSides:
    """The sides along curves (``which >= 0``, see :func:`.outline.chord_curves`) turned by ``rot``.

    Parameters
    ----------
    which, t_start, t_end : numpy.ndarray
        Curve of each side (n,), -1 for straight ones, and the parameters at its ends, radians.
    arcs : sequence of Curve
        The recorded curves ``which`` indexes.
    weights : numpy.ndarray
        Weight of each side (n,) (1, or the yield strength of its region).
    rot : numpy.ndarray
        Rotation matrix (2, 2) applied to the drawing.

    Returns
    -------
    CurvedSides
        With the whole sides' integrals.
    """
    on = which >= 0
    table = np.array([[a.cx, a.cy, a.a, a.b, a.rotation] for a in arcs]).reshape(-1, 5)
    cx, cy, a, b, turn = table[which[on]].T
    e1 = np.stack([np.cos(turn), np.sin(turn)], axis=1)
    e2 = np.stack([-e1[:, 1], e1[:, 0]], axis=1)
    centre, u, v = np.stack([cx, cy], axis=1) @ rot.T, (a[:, None] * e1) @ rot.T, (b[:, None] * e2) @ rot.T
    t0, t1 = t_start[on], t_end[on]
    # heights: the ends, and the top y0 + R (t = phi) and bottom y0 - R where they fall inside
    lo, hi = np.minimum(t0, t1), np.maximum(t0, t1)
    big, phi = np.hypot(u[:, 1], v[:, 1]), np.arctan2(v[:, 1], u[:, 1])
    ends = centre[:, 1, None] + u[:, 1, None] * np.cos(np.stack([lo, hi], 1)) + v[:, 1, None] * np.sin(
        np.stack([lo, hi], 1))
    top = lo + np.mod(phi - lo, 2.0 * np.pi) <= hi
    bottom = lo + np.mod(phi + np.pi - lo, 2.0 * np.pi) <= hi
    low = np.where(bottom, centre[:, 1] - big, ends.min(axis=1))
    high = np.where(top, centre[:, 1] + big, ends.max(axis=1))
    c = CurvedSides(centre, u, v, t0, t1, weights[on], low, high, np.argsort(low), np.zeros((0, 2)))
    whole = _integrals(c, np.arange(len(t0)), t0[:, None], t1[:, None])[:, 0] * c.weight[:, None]
    running = np.cumsum(whole[c.by_low][::-1], axis=0)[::-1]
    above = np.vstack([running, np.zeros((1, 2))])
    return CurvedSides(centre, u, v, t0, t1, c.weight, low, high, c.by_low, above)


def curved_above(c: CurvedSides, yp: float) -> tuple[float, float]:
    """Weighted integrals of x dy and x y dy along the curved sides where y > yp, L^2 and L^3.

    Sides wholly above come from the running sum; along a side the axis crosses,
    y = y0 + u_y cos t + v_y sin t = y0 + R cos(t - phi) equals yp at
    t = phi +- arccos((yp - y0) / R), which cut it into at most three stretches, each
    integrated where it lies above.
    """
    if len(c.t_start) == 0:
        return 0.0, 0.0
    total = c.above[np.searchsorted(c.low[c.by_low], yp, side="right")]  # wholly above
    rows = np.flatnonzero((c.low <= yp) & (c.high > yp))  # the sides the axis crosses
    if len(rows) == 0:
        return float(total[0]), float(total[1])
    t0, t1 = c.t_start[rows], c.t_end[rows]
    lo, hi = np.minimum(t0, t1), np.maximum(t0, t1)
    y0, uy, vy = c.centre[rows, 1], c.u[rows, 1], c.v[rows, 1]
    level = (yp - y0) / np.hypot(uy, vy)
    cut = np.abs(level) < 1.0
    half = np.arccos(np.where(cut, level, 1.0))
    phi = np.arctan2(vy, uy)
    roots = [lo + np.mod(phi + s * half - lo, 2.0 * np.pi) for s in (1.0, -1.0)]
    roots = [np.where(cut & (r < hi), r, hi) for r in roots]
    breaks = np.sort(np.stack([lo, *roots, hi], axis=1), axis=1)
    a, b = breaks[:, :-1], breaks[:, 1:]  # (k, 3) stretches
    m = 0.5 * (a + b)
    above = y0[:, None] + uy[:, None] * np.cos(m) + vy[:, None] * np.sin(m) > yp
    part = _integrals(c, rows, a, b) * above[..., None]  # (k, 3, 2)
    total = total + np.einsum("kmj,k->j", part, np.sign(t1 - t0) * c.weight[rows])
    return float(total[0]), float(total[1])


__all__ = ["CURVE_POINTS", "CurvedSides", "curved_above", "curved_sides"]
