"""Plastic section moduli, plastic neutral axes, plastic moments and shape factors.

For bending with the neutral axis along a direction, the fully plastic stress block is
+fy on one side of the plastic neutral axis (PNA) and -fy on the other; the PNA is where the
two forces balance (for one material: where it halves the area). The plastic modulus is
Wpl = int |d| dA, d the distance from the PNA; for several materials the plastic moment is
Mpl = int fy |d| dA with the PNA from int fy sign(d) dA = 0. The integrals are taken exactly on
the profile's polygons (shapely clipping), so they are exact for straight-sided outlines.

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


def _first_moment_about(polys: list[shapely.Polygon], weights: np.ndarray, yp: float,
                        box: tuple[float, float, float, float]) -> tuple[float, float]:
    """Weighted (force above - force below, int w |y - yp| dA) for a horizontal line y = yp."""
    x0, y0, x1, y1 = box
    net = 0.0
    moment = 0.0
    for poly, w in zip(polys, weights, strict=True):
        up = shapely.clip_by_rect(poly, x0, yp, x1, y1)
        down = shapely.clip_by_rect(poly, x0, y0, x1, yp)
        a_up, a_dn = up.area, down.area
        net += w * (a_up - a_dn)
        if a_up > 0:
            moment += w * a_up * (up.centroid.y - yp)
        if a_dn > 0:
            moment += w * a_dn * (yp - down.centroid.y)
    return net, moment


def _plastic_about_horizontal(polys: list[shapely.Polygon], weights: np.ndarray) -> tuple[float, float]:
    """PNA height and int w |y - yp| dA for a horizontal plastic neutral axis."""
    bounds = np.array([p.bounds for p in polys])
    x0, y0 = bounds[:, 0].min() - 1.0, bounds[:, 1].min()
    x1, y1 = bounds[:, 2].max() + 1.0, bounds[:, 3].max()
    pad = 1e-9 * max(y1 - y0, 1e-300)
    box = (x0, y0 - pad, x1, y1 + pad)
    lo, hi = y0, y1
    # bisection on the force balance, monotone in yp; 60 halvings reach round-off
    for _ in range(60):
        mid = 0.5 * (lo + hi)
        net, _ = _first_moment_about(polys, weights, mid, box)
        if net > 0:
            lo = mid
        else:
            hi = mid
    yp = 0.5 * (lo + hi)
    return yp, _first_moment_about(polys, weights, yp, box)[1]


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
