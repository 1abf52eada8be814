"""The outline of a section as pieces: straight sides and exact circular arcs; its perimeters.

The loops of a profile are polygons; where a side of a loop is a chord of a recorded arc
(:attr:`Profile.arcs`), the piece is that arc itself, so lengths (and the wall thickness of
:mod:`.wall`) are exact on true circles; every other side is the straight side of the drawing
(a spline's chords stay chords). The outline is that of the material: the union of the regions,
so interfaces between materials are not part of it.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from shapely.geometry.polygon import orient

from ..geometry.profile import Arc, Profile

#: A chord is taken to follow an arc when both ends lie on its circle within this fraction of
#: the radius (the readers place arc vertices on the circle to round-off; common practice, no
#: source) and it spans no more than a quarter turn (a longer chord is a real straight side,
#: e.g. the flat of a half disc, whose ends also lie on the circle).
ON_CIRCLE, LONGEST_CHORD = 1e-9, 0.5 * np.pi


@dataclass(frozen=True)
class Pieces:
    """The sides of the material outline, as straight pieces or arcs, drawing unit L.

    Attributes
    ----------
    start, end : numpy.ndarray
        Ends of each piece (n, 2), L, in the order of the loop: material on the left.
    arc : numpy.ndarray
        Index of the recorded arc a piece follows (n,), -1 for a straight piece.
    centre, radius : numpy.ndarray
        Centre (n, 2) and radius (n,) of the arc pieces, L (nan for straight ones).
    outer : numpy.ndarray
        True for pieces of an outer loop (n,), False for the edges of holes.
    """

    start: np.ndarray
    end: np.ndarray
    arc: np.ndarray
    centre: np.ndarray
    radius: np.ndarray
    outer: np.ndarray

    @property
    def turn(self) -> np.ndarray:
        """Angle each arc piece subtends at its centre, radians (0 for straight pieces)."""
        chord = np.hypot(*(self.end - self.start).T)
        ratio = np.clip(chord / np.where(self.arc >= 0, 2.0 * self.radius, np.inf), 0.0, 1.0)
        return np.where(self.arc >= 0, 2.0 * np.arcsin(ratio), 0.0)

    @property
    def length(self) -> np.ndarray:
        """Length of each piece, L: r x angle on arcs, the side's length otherwise."""
        chord = np.hypot(*(self.end - self.start).T)
        return np.where(self.arc >= 0, self.radius * self.turn, chord)


def _loops(profile: Profile) -> list[tuple[np.ndarray, bool]]:
    """Loops of the material outline, material on the left, each with True for an outer one."""
    geom = profile.geometry()
    polys = list(getattr(geom, "geoms", [geom]))
    out: list[tuple[np.ndarray, bool]] = []
    for poly in polys:
        poly = orient(poly, 1.0)  # exterior counter-clockwise, holes clockwise
        out.append((np.asarray(poly.exterior.coords)[:-1], True))
        out.extend((np.asarray(r.coords)[:-1], False) for r in poly.interiors)
    return out


def _arc_of(start: np.ndarray, end: np.ndarray, arcs: tuple[Arc, ...]) -> np.ndarray:
    """Index of the arc each side (start -> end) is a chord of, -1 for none."""
    which = np.full(len(start), -1)
    for k, arc in enumerate(arcs):  # a loop over the few recorded arcs, not over sides
        c = np.array([arc.cx, arc.cy])
        ra, rb = np.hypot(*(start - c).T), np.hypot(*(end - c).T)
        on = (np.abs(ra - arc.r) <= ON_CIRCLE * arc.r) & (np.abs(rb - arc.r) <= ON_CIRCLE * arc.r)
        chord = np.hypot(*(end - start).T)
        on &= chord <= 2.0 * arc.r * np.sin(0.5 * LONGEST_CHORD) * (1 + 1e-12)
        mid = 0.5 * (start + end) - c
        on &= arc.contains_angle(np.arctan2(mid[:, 1], mid[:, 0]))
        which[on & (which < 0)] = k
    return which


def outline_pieces(profile: Profile) -> Pieces:
    """The sides of the material outline of a profile (see the module's text).

    Parameters
    ----------
    profile : Profile
        The profile, drawing unit L.

    Returns
    -------
    Pieces
        Straight sides and arc pieces, L.
    """
    loops = _loops(profile)
    start = np.vstack([lp for lp, _ in loops])
    end = np.vstack([np.roll(lp, -1, axis=0) for lp, _ in loops])
    outer = np.concatenate([np.full(len(lp), is_outer) for lp, is_outer in loops])
    which = _arc_of(start, end, profile.arcs)
    table = np.array([[a.cx, a.cy, a.r] for a in profile.arcs] + [[np.nan] * 3])
    data = table[which]  # -1 picks the nan row
    return Pieces(start, end, which, data[:, :2], data[:, 2], outer)


@dataclass(frozen=True)
class Perimeters:
    """Perimeters of the material outline, drawing unit L.

    Attributes
    ----------
    outer : float
        Length of the outer loops, L.
    total : float
        Outer loops and the edges of holes, L (the surface to coat, per unit length).
    """

    outer: float
    total: float


def perimeters(profile: Profile) -> Perimeters:
    """Outer and total perimeter: exact along recorded arcs, the drawn sides elsewhere.

    Parameters
    ----------
    profile : Profile
        The profile, drawing unit L.

    Returns
    -------
    Perimeters
        In L.

    Examples
    --------
    >>> from warpwise.geometry.shapes import tube
    >>> p = perimeters(tube(40.0, 30.0))
    >>> round(p.outer, 9), round(p.total, 9)  # pi D and pi (D + d)
    (125.663706144, 219.911485751)
    """
    pieces = outline_pieces(profile)
    length = pieces.length
    return Perimeters(float(length[pieces.outer].sum()), float(length.sum()))


__all__ = ["Perimeters", "Pieces", "outline_pieces", "perimeters"]
