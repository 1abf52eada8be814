"""Plastic section moduli, plastic neutral axes, plastic moments and shape factors.

For bending with the neutral axis along a direction, the fully plastic stress block is
+fy on one side of the plastic neutral axis (PNA) and -fy on the other; the PNA is where the
two forces balance (for one material: where it halves the area). The plastic modulus is
Wpl = int |d| dA, d the distance from the PNA; for several materials the plastic moment is
Mpl = int fy |d| dA with the PNA from int fy sign(d) dA = 0. The integrals are taken on the
boundary (Green's theorem on the boundary edges above the neutral axis, all edges at once):
exactly along straight sides, and along the true curve where a side is a chord of a recorded
circular or elliptical arc (:attr:`Profile.arcs`, through :mod:`.curved_sides`), so they are
exact for outlines of straight sides, circles and ellipses.

Examples
--------
>>> from warpwise.geometry.shapes import rectangle
>>> p = plastic_properties(rectangle(20.0, 10.0))
>>> round(p.Wpl_x, 9), round(p.Wpl_y, 9)
(500.0, 1000.0)
"""

from __future__ import annotations

from collections.abc import Callable, Sequence
from dataclasses import dataclass

import numpy as np
import shapely
from shapely.geometry.polygon import orient

from ..geometry.profile import Profile
from .curved_sides import CurvedSides, curved_above, curved_sides
from .outline import chord_curves


@dataclass(frozen=True)
class PlasticProperties:
    """Plastic properties (length unit L).

    Attributes
    ----------
    Wpl_x, Wpl_y : float
        Plastic moduli for bending about axes parallel to x (PNA horizontal) and y, L^3.
    Wpl_1, Wpl_2 : float
        Plastic moduli about axes parallel to the principal axes 1 and 2, L^3.
    pna_y : float
        y of the horizontal plastic neutral axis, L.
    pna_x : float
        x of the vertical plastic neutral axis, L.
    Mpl_x, Mpl_y, Mpl_1, Mpl_2 : float or None
        Plastic moments with each region's yield strength, force x L; None unless every
        region has one.
    """

    Wpl_x: float
    Wpl_y: float
    Wpl_1: float
    Wpl_2: float
    pna_y: float
    pna_x: float
    Mpl_x: float | None = None
    Mpl_y: float | None = None
    Mpl_1: float | None = None
    Mpl_2: float | None = None


def _edges(polys: Sequence[shapely.Polygon], weights: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Every boundary edge (e, 2, 2), exterior counter-clockwise and holes clockwise, and its weight."""
    out, w = [], []
    for poly, weight in zip(polys, weights, strict=True):
        poly = orient(poly, 1.0)
        for ring in (poly.exterior, *poly.interiors):
            xy = np.asarray(ring.coords)
            out.append(np.stack([xy[:-1], xy[1:]], axis=1))
            w.append(np.full(len(xy) - 1, weight))
    return np.concatenate(out), np.concatenate(w)


def _above(edges: np.ndarray, weights: np.ndarray, yp: float,
           curved: CurvedSides | None = None) -> tuple[float, float]:
    """Weighted area and first moment int w y dA of the material above the line y = yp.

    Green's theorem: area = closed integral of x dy, first moment = closed integral of x y dy
    round the clipped boundary; its pieces along y = yp have dy = 0, so only the parts of the
    edges above the line count, each integrated exactly (x is linear in y along an edge); the
    ``curved`` sides along their curves (``edges`` then holds the straight ones only).
    """
    (xa, ya), (xb, yb) = edges[:, 0].T, edges[:, 1].T
    lo, hi = np.maximum(np.minimum(ya, yb), yp), np.maximum(ya, yb)
    keep = (hi > lo) & (yb != ya)
    xa, ya, xb, yb, lo, hi, w = (v[keep] for v in (xa, ya, xb, yb, lo, hi, weights))
    slope = (xb - xa) / (yb - ya)
    sign = np.sign(yb - ya)
    x_lo, x_hi = xa + slope * (lo - ya), xa + slope * (hi - ya)
    area = sign * 0.5 * (x_lo + x_hi) * (hi - lo)
    # int x y dy over [lo, hi] with x linear: Simpson's rule is exact for the quadratic
    mid = 0.5 * (lo + hi)
    moment = sign * (hi - lo) / 6.0 * (x_lo * lo + 4.0 * (0.5 * (x_lo + x_hi)) * mid + x_hi * hi)
    c_area, c_moment = (0.0, 0.0) if curved is None else curved_above(curved, yp)
    return float(np.dot(w, area)) + c_area, float(np.dot(w, moment)) + c_moment


def _falling_root(balance: Callable[[float], float], lo: float, hi: float, f_lo: float,
                  f_hi: float) -> float:
    """Where a falling function crosses zero in [lo, hi] (f_lo > 0 > f_hi), to round-off.

    False position with the Illinois rule (the end kept twice has its value halved), and a
    bisection step whenever two steps have not halved the bracket, so it never falls behind
    bisection for long; on the piecewise smooth force balance it ends in about ten steps
    (common practice, no source).
    """
    # the bracket's floor: 1e-15 of its first width, or the spacing of the numbers there
    tol = 1e-15 * (hi - lo) + 4.0 * float(np.spacing(max(abs(lo), abs(hi))))
    kept, width = 0, hi - lo
    for k in range(200):  # a bound: bisection alone would need about 50
        if hi - lo <= tol:
            break
        y = hi - f_hi * (hi - lo) / (f_hi - f_lo)
        if k % 2 == 0:  # every second step: has the bracket halved since the last check?
            if hi - lo > 0.5 * width:
                y = 0.5 * (lo + hi)
            width = hi - lo
        if not lo < y < hi:
            y = 0.5 * (lo + hi)
            if not lo < y < hi:  # no number left between the ends
                break
        f = balance(y)
        if f > 0:
            lo, f_lo = y, f
            f_hi, kept = (0.5 * f_hi, kept) if kept < 0 else (f_hi, -1)
        elif f < 0:
            hi, f_hi = y, f
            f_lo, kept = (0.5 * f_lo, kept) if kept > 0 else (f_lo, 1)
        else:
            return y
    return 0.5 * (lo + hi)


def _plastic_about_horizontal(edges: np.ndarray, w: np.ndarray,
                              curved: CurvedSides | None = None) -> tuple[float, float]:
    """PNA height and int w |y - yp| dA for a horizontal plastic neutral axis."""
    total, first = _above(edges, w, -np.inf, curved)
    y0 = float(edges[..., 1].min(initial=np.inf))
    y1 = float(edges[..., 1].max(initial=-np.inf))
    if curved is not None:
        low, high = curved.heights
        y0, y1 = min(y0, low), max(y1, high)
    lo, hi = y0, y1
    if curved is None or len(curved.t_start) == 0:
        # bisection on the force balance (above minus below), monotone in yp; 60 halvings
        # reach round-off
        for _ in range(60):
            mid = 0.5 * (lo + hi)
            if 2.0 * _above(edges, w, mid, curved)[0] - total > 0:
                lo = mid
            else:
                hi = mid
        yp = 0.5 * (lo + hi)
    else:  # each balance costs more along curves: false position needs far fewer of them
        yp = _falling_root(lambda y: 2.0 * _above(edges, w, y, curved)[0] - total, lo, hi,
                           total, -total)
    a_up, m_up = _above(edges, w, yp, curved)
    # int w |y - yp| dA = (M_up - yp A_up) + (yp A_down - M_down)
    return yp, (m_up - yp * a_up) + (yp * (total - a_up) - (first - m_up))


def plastic_properties(profile: Profile, alpha_deg: float = 0.0,
                       fy: Sequence[float | None] | None = None) -> PlasticProperties:
    """Plastic moduli and plastic neutral axes about x, y and the principal axes.

    Parameters
    ----------
    profile : Profile
        The profile (its polygons are used exactly, and its recorded arcs and ellipses).
    alpha_deg : float
        Angle from +x to principal axis 1, degrees.
    fy : sequence of (float or None), optional
        Yield strength of each region, force / L^2; plastic moments are given when all are known.

    Returns
    -------
    PlasticProperties
    """
    polys = [r.polygon for r in profile.regions]
    have_fy = fy is not None and all(f is not None for f in fy)
    edges, region_of = _edges(polys, np.arange(len(polys), dtype=float))
    region_of = region_of.astype(int)
    ones = np.ones(len(edges))
    strengths = np.array(fy, dtype=float)[region_of] if have_fy else None
    which, t_start, t_end = chord_curves(edges[:, 0], edges[:, 1], profile.arcs)
    straight = which < 0

    def about(angle: float) -> tuple[float, float, float | None]:
        # rotate so that the neutral axis direction (angle from +x) becomes horizontal
        c, s = np.cos(np.radians(angle)), np.sin(np.radians(angle))
        rot = np.array([[c, s], [-s, c]])
        turned = edges[straight] @ rot.T
        curved = curved_sides(which, t_start, t_end, profile.arcs, ones, rot)
        yp, z = _plastic_about_horizontal(turned, ones[straight], curved)
        m = None
        if strengths is not None:
            curved = curved_sides(which, t_start, t_end, profile.arcs, strengths, rot)
            m = _plastic_about_horizontal(turned, strengths[straight], curved)[1]
        return yp, z, m

    yx, zx, mx = about(0.0)
    # neutral axis parallel to y: direction 90 degrees; the rotated "height" is -x
    yy, zy, my = about(90.0)
    _, z1, m1 = about(alpha_deg)
    _, z2, m2 = about(alpha_deg + 90.0)
    def f(v: float | None) -> float | None:
        return None if v is None else float(v)

    return PlasticProperties(Wpl_x=float(zx), Wpl_y=float(zy), Wpl_1=float(z1), Wpl_2=float(z2),
                             pna_y=float(yx), pna_x=float(-yy), Mpl_x=f(mx), Mpl_y=f(my),
                             Mpl_1=f(m1), Mpl_2=f(m2))
