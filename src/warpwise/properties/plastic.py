"""Plastic section moduli, plastic neutral axes, plastic moments and shape factors.

For bending with the neutral axis along a direction, the fully plastic stress block is
+fy on one side of the plastic neutral axis (PNA) and -fy on the other; the PNA is where the
two forces balance (for one material: where it halves the area). The plastic modulus is
Wpl = int |d| dA, d the distance from the PNA; for several materials the plastic moment is
Mpl = int fy |d| dA with the PNA from int fy sign(d) dA = 0. The integrals are taken exactly on
the profile's polygons (Green's theorem on the boundary edges above the neutral axis, all edges
at once), so they are exact for straight-sided outlines.

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
from shapely import affinity
from shapely.geometry.polygon import orient

from ..geometry.profile import Profile


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


def _above(edges: np.ndarray, weights: np.ndarray, yp: float) -> tuple[float, float]:
    """Weighted area and first moment int w y dA of the material above the line y = yp.

    Green's theorem: area = closed integral of x dy, first moment = closed integral of x y dy
    round the clipped boundary; its pieces along y = yp have dy = 0, so only the parts of the
    edges above the line count, each integrated exactly (x is linear in y along an edge).
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
    return float(np.dot(w, area)), float(np.dot(w, moment))


def _plastic_about_horizontal(polys: list[shapely.Polygon], weights: np.ndarray) -> tuple[float, float]:
    """PNA height and int w |y - yp| dA for a horizontal plastic neutral axis."""
    edges, w = _edges(polys, weights)
    total, first = _above(edges, w, -np.inf)
    y0, y1 = float(edges[..., 1].min()), float(edges[..., 1].max())
    lo, hi = y0, y1
    # bisection on the force balance (above minus below), monotone in yp; 60 halvings reach
    # round-off
    for _ in range(60):
        mid = 0.5 * (lo + hi)
        if 2.0 * _above(edges, w, mid)[0] - total > 0:
            lo = mid
        else:
            hi = mid
    yp = 0.5 * (lo + hi)
    a_up, m_up = _above(edges, w, yp)
    # int w |y - yp| dA = (M_up - yp A_up) + (yp A_down - M_down)
    return yp, (m_up - yp * a_up) + (yp * (total - a_up) - (first - m_up))


def plastic_properties(profile: Profile, alpha_deg: float = 0.0,
                       fy: Sequence[float | None] | None = None) -> PlasticProperties:
    """Plastic moduli and plastic neutral axes about x, y and the principal axes.

    Parameters
    ----------
    profile : Profile
        The profile (its polygons are used exactly).
    alpha_deg : float
        Angle from +x to principal axis 1, degrees.
    fy : sequence of (float or None), optional
        Yield strength of each region, force / L^2; plastic moments are given when all are known.

    Returns
    -------
    PlasticProperties
    """
    polys = [r.polygon for r in profile.regions]
    ones = np.ones(len(polys))
    have_fy = fy is not None and all(f is not None for f in fy)
    strengths = np.array(fy, dtype=float) if have_fy else None

    def about(angle: float) -> tuple[float, float, float | None]:
        # rotate so that the neutral axis direction (angle from +x) becomes horizontal
        rot = [affinity.rotate(p, -angle, origin=(0.0, 0.0)) for p in polys]
        try:
            return _about(rot)
        except shapely.errors.GEOSException:
            # CAD round-off (a coordinate of 6e-17 for zero) can make GEOS build degenerate
            # rings while clipping: snap to a grid far below any real dimension and retry
            grid = 1e-12 * profile.size
            return _about([shapely.set_precision(p, grid) for p in rot])

    def _about(rot: list) -> tuple[float, float, float | None]:
        yp, z = _plastic_about_horizontal(rot, ones)
        m = None
        if strengths is not None:
            m = _plastic_about_horizontal(rot, strengths)[1]
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
