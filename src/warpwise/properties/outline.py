"""The outline of a section as pieces: straight sides and exact arcs of circles and ellipses.

The loops of a profile are polygons; where a side of a loop is a chord of a recorded circular or
elliptical arc (:attr:`Profile.arcs`), the piece is that arc itself, so lengths are exact on
true circles and ellipses (and the wall thickness of :mod:`.wall` on true circles: it takes an
ellipse's pieces as their chords); every other side is the straight side of the drawing (a
spline's chords stay chords). The outline is that of the material: the union of the regions,
so interfaces between materials are not part of it.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from shapely.geometry.polygon import orient

from ..geometry.curves import Arc, Curve
from ..geometry.profile import Profile

#: A chord is taken to follow an arc when both ends lie on its curve within this fraction of
#: the radius (in the curve's scaled frame, where it is the unit circle: the readers place arc
#: vertices on the curve to round-off; common practice, no source) and it spans no more than a
#: quarter turn of the parameter (a longer chord is a real straight side, e.g. the flat of a
#: half disc, whose ends also lie on the circle).
ON_CIRCLE, LONGEST_CHORD = 1e-9, 0.5 * np.pi


@dataclass(frozen=True)
class Pieces:
    """The sides of the material outline, as straight pieces or arcs, drawing unit L.

    Attributes
    ----------
    start, end : numpy.ndarray
        Ends of each piece (n, 2), L, in the order of the loop: material on the left.
    arc : numpy.ndarray
        Index of the recorded circular arc a piece follows (n,), -1 for a straight piece or
        one along an ellipse.
    centre, radius : numpy.ndarray
        Centre (n, 2) and radius (n,) of the circular arc pieces, L (nan for the others).
    outer : numpy.ndarray
        True for pieces of an outer loop (n,), False for the edges of holes.
    curve_length : numpy.ndarray
        Length along the recorded curve (circle or ellipse) of each piece that follows one,
        L, nan for a straight piece.
    """

    start: np.ndarray
    end: np.ndarray
    arc: np.ndarray
    centre: np.ndarray
    radius: np.ndarray
    outer: np.ndarray
    curve_length: np.ndarray

    @property
    def turn(self) -> np.ndarray:
        """Angle each arc piece subtends at its centre, radians (0 for straight pieces)."""
        chord = np.hypot(*(self.end - self.start).T)
        ratio = np.clip(chord / np.where(self.arc >= 0, 2.0 * self.radius, np.inf), 0.0, 1.0)
        return np.where(self.arc >= 0, 2.0 * np.arcsin(ratio), 0.0)

    @property
    def length(self) -> np.ndarray:
        """Length of each piece, L: along the curve on arcs and ellipses, the side's length otherwise."""
        chord = np.hypot(*(self.end - self.start).T)
        return np.where(np.isnan(self.curve_length), chord, self.curve_length)


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


def chord_curves(start: np.ndarray, end: np.ndarray, arcs: tuple[Curve, ...]
                 ) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """The recorded curve each side (start -> end) is a chord of, and its ends' parameters.

    Parameters
    ----------
    start, end : numpy.ndarray
        Ends of the sides (n, 2), drawing unit L.
    arcs : tuple of Curve
        The recorded circular and elliptical arcs (:attr:`Profile.arcs`).

    Returns
    -------
    which : numpy.ndarray
        Index of the curve of each side (n,), -1 for a straight side.
    t_start, t_end : numpy.ndarray
        Parameters of the curve at the side's start and end (n,), radians, the short way
        round (``abs(t_end - t_start) <= pi / 2``, a chord spans at most a quarter turn);
        nan for straight sides.
    """
    which = np.full(len(start), -1)
    t_start, t_end = np.full(len(start), np.nan), np.full(len(start), np.nan)
    longest = 2.0 * np.sin(0.5 * LONGEST_CHORD) * (1 + 1e-12)
    for k, arc in enumerate(arcs):  # a loop over the few recorded curves, not over sides
        ua, ub = arc.scaled(start), arc.scaled(end)  # unit circle there
        on = (np.abs(np.hypot(*ua.T) - 1.0) <= ON_CIRCLE) & (np.abs(np.hypot(*ub.T) - 1.0) <= ON_CIRCLE)
        on &= np.hypot(*(ub - ua).T) <= longest
        mid = 0.5 * (ua + ub)
        on &= arc.contains_angle(np.arctan2(mid[:, 1], mid[:, 0]))
        on &= which < 0
        which[on] = k
        ta = np.arctan2(ua[on, 1], ua[on, 0])
        step = np.mod(np.arctan2(ub[on, 1], ub[on, 0]) - ta + np.pi, 2.0 * np.pi) - np.pi
        t_start[on], t_end[on] = ta, ta + step
    return which, t_start, t_end


def outline_pieces(profile: Profile) -> Pieces:
    """The sides of the material outline of a profile (see the module's text).

    Parameters
    ----------
    profile : Profile
        The profile, drawing unit L.

    Returns
    -------
    Pieces
        Straight sides, circular arc pieces and elliptical ones, L.
    """
    loops = _loops(profile)
    start = np.vstack([lp for lp, _ in loops])
    end = np.vstack([np.roll(lp, -1, axis=0) for lp, _ in loops])
    outer = np.concatenate([np.full(len(lp), is_outer) for lp, is_outer in loops])
    which, t_start, t_end = chord_curves(start, end, profile.arcs)
    length = np.full(len(start), np.nan)
    for k, arc in enumerate(profile.arcs):  # a loop over the few recorded curves
        on = which == k
        lo = np.minimum(t_start[on], t_end[on])
        length[on] = arc.length(lo, lo + np.abs(t_end[on] - t_start[on]))
    circle = np.array([isinstance(a, Arc) for a in profile.arcs] + [False])
    which_arc = np.where(circle[which], which, -1)  # -1 picks the last entry
    table = np.array([[a.cx, a.cy, a.r] if isinstance(a, Arc) else [np.nan] * 3
                      for a in profile.arcs] + [[np.nan] * 3])
    data = table[which_arc]
    return Pieces(start, end, which_arc, data[:, :2], data[:, 2], outer, length)


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
    """Outer and total perimeter: exact along recorded arcs and ellipses, the drawn sides elsewhere.

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


__all__ = ["Perimeters", "Pieces", "chord_curves", "outline_pieces", "perimeters"]
