"""Plastic section moduli, plastic neutral axes, plastic moments and shape factors.

For bending with the neutral axis along a direction, the fully plastic stress block is
+fy on one side of the plastic neutral axis (PNA) and -fy on the other; the PNA is where the
two forces balance (for one material: where it halves the area). The plastic modulus is
Wpl = int |d| dA, d the distance from the PNA; for several materials the plastic moment is
Mpl = int fy |d| dA with the PNA from int fy sign(d) dA = 0. The integrals are taken on the
boundary (Green's theorem on the boundary edges above the neutral axis, all edges at once):
exactly along straight sides, and along the true curve where a side is a chord of a recorded
circular or elliptical arc (:attr:`Profile.arcs`), so they are exact for outlines of straight
sides, circles and ellipses.

Examples
--------
>>> from warpwise.geometry.shapes import rectangle
>>> p = plastic_properties(rectangle(20.0, 10.0))
>>> round(p.Wpl_x, 9), round(p.Wpl_y, 9)
(500.0, 1000.0)
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np
import shapely
from shapely.geometry.polygon import orient

from ..geometry.curves import Curve
from ..geometry.profile import Profile
from .outline import chord_curves

#: Gauss-Legendre points per stretch of a curved side above or below the neutral axis. The
#: integrands are trigonometric polynomials of degree 3 at most over a parameter span of at most
#: pi / 2, where 12 points leave an error below 1e-16 relative (the Gauss remainder with
#: (b - a)^25 (12!)^4 / (25 (24!)^3) times the 24th derivative, at most 3^24 times the
#: integrand; common practice, no source).
CURVE_POINTS = 12


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


@dataclass(frozen=True)
class _CurvedSides:
    """Sides of the outline that follow a recorded curve, in one rotated frame (L, radians).

    Each side runs along ``centre + cos t * u + sin t * v`` from ``t_start`` to ``t_end``.
    """

    centre: np.ndarray
    u: np.ndarray
    v: np.ndarray
    t_start: np.ndarray
    t_end: np.ndarray
    weight: np.ndarray


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


def _curved_sides(which: np.ndarray, t_start: np.ndarray, t_end: np.ndarray,
                  arcs: Sequence[Curve], weights: np.ndarray, rot: np.ndarray) -> _CurvedSides:
    """The curved sides (``which >= 0``) turned by the rotation matrix ``rot``."""
    on = which >= 0
    table = np.array([[a.cx, a.cy, a.a, a.b, a.rotation] for a in arcs] or np.zeros((0, 5)))
    cx, cy, a, b, turn = table[which[on]].T
    e1 = np.stack([np.cos(turn), np.sin(turn)], axis=1)
    e2 = np.stack([-e1[:, 1], e1[:, 0]], axis=1)
    return _CurvedSides(np.stack([cx, cy], axis=1) @ rot.T, (a[:, None] * e1) @ rot.T,
                        (b[:, None] * e2) @ rot.T, t_start[on], t_end[on], weights[on])


def _curved_above(c: _CurvedSides, yp: float) -> tuple[float, float]:
    """Weighted closed integrals of x dy and x y dy along the curved sides, where y > yp.

    Along a side y = y0 + u_y cos t + v_y sin t = y0 + R cos(t - phi) crosses y = yp at
    t = phi +- arccos((yp - y0) / R): at most two crossings split the side into three
    stretches, each integrated by Gauss-Legendre (:data:`CURVE_POINTS`) where it lies above.
    """
    if len(c.t_start) == 0:
        return 0.0, 0.0
    lo, hi = np.minimum(c.t_start, c.t_end), np.maximum(c.t_start, c.t_end)
    sense = np.sign(c.t_end - c.t_start)
    y0, uy, vy = c.centre[:, 1], c.u[:, 1], c.v[:, 1]
    big = np.hypot(uy, vy)
    phi = np.arctan2(vy, uy)
    with np.errstate(invalid="ignore", divide="ignore"):
        level = (yp - y0) / big
    cut = np.abs(level) < 1.0
    half = np.arccos(np.where(cut, level, 1.0))
    breaks = [lo, hi, hi, hi]
    for k, root in enumerate((phi + half, phi - half)):
        at = lo + np.mod(root - lo, 2.0 * np.pi)
        breaks[k + 1] = np.where(cut & (at < hi), at, hi)
    breaks = np.sort(np.stack(breaks, axis=1), axis=1)  # (s, 4)
    a, b = breaks[:, :-1], breaks[:, 1:]  # (s, 3) stretches
    mid, rad = 0.5 * (a + b), 0.5 * (b - a)
    above = y0[:, None] + uy[:, None] * np.cos(mid) + vy[:, None] * np.sin(mid) > yp
    xi, wq = np.polynomial.legendre.leggauss(CURVE_POINTS)
    t = mid[..., None] + rad[..., None] * xi  # (s, 3, q)
    cos, sin = np.cos(t), np.sin(t)
    x = c.centre[:, 0, None, None] + c.u[:, 0, None, None] * cos + c.v[:, 0, None, None] * sin
    y = y0[:, None, None] + uy[:, None, None] * cos + vy[:, None, None] * sin
    dy = -uy[:, None, None] * sin + vy[:, None, None] * cos
    scale = (rad * above)[..., None] * wq * (sense * c.weight)[:, None, None]
    return float(np.sum(scale * x * dy)), float(np.sum(scale * x * y * dy))


def _above(edges: np.ndarray, weights: np.ndarray, yp: float,
           curved: _CurvedSides | None = None) -> tuple[float, float]:
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
    c_area, c_moment = (0.0, 0.0) if curved is None else _curved_above(curved, yp)
    return float(np.dot(w, area)) + c_area, float(np.dot(w, moment)) + c_moment


def _plastic_about_horizontal(edges: np.ndarray, w: np.ndarray,
                              curved: _CurvedSides | None = None) -> tuple[float, float]:
    """PNA height and int w |y - yp| dA for a horizontal plastic neutral axis."""
    total, first = _above(edges, w, -np.inf, curved)
    y0 = float(edges[..., 1].min(initial=np.inf))
    y1 = float(edges[..., 1].max(initial=-np.inf))
    if curved is not None and len(curved.t_start):
        reach = np.hypot(curved.u[:, 1], curved.v[:, 1])  # a curve's extreme heights
        y0 = min(y0, float((curved.centre[:, 1] - reach).min()))
        y1 = max(y1, float((curved.centre[:, 1] + reach).max()))
    lo, hi = y0, y1
    # bisection on the force balance (above minus below), monotone in yp; 60 halvings reach
    # round-off
    for _ in range(60):
        mid = 0.5 * (lo + hi)
        if 2.0 * _above(edges, w, mid, curved)[0] - total > 0:
            lo = mid
        else:
            hi = mid
    yp = 0.5 * (lo + hi)
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
        curved = _curved_sides(which, t_start, t_end, profile.arcs, ones, rot)
        yp, z = _plastic_about_horizontal(turned, ones[straight], curved)
        m = None
        if strengths is not None:
            curved = _curved_sides(which, t_start, t_end, profile.arcs, strengths, rot)
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
