"""Second moments about a given axis or point, and section moduli to given fibres.

From the centroidal values of :class:`~warpwise.properties.geometric.GeometricProperties`
(Ix = int y^2, Iy = int x^2, Ixy = int x y about the centroid) the parallel-axis theorem gives
the moments about axes through a point P = (x0, y0) parallel to x and y::

    Ix_P = Ix + A dy^2,   Iy_P = Iy + A dx^2,   Ixy_P = Ixy + A dx dy,   (dx, dy) = C - P

and a rotation by theta (counter-clockwise from +x) gives, with local coordinates
u = x cos + y sin along the axis and v = -x sin + y cos across it (Mohr's transformation)::

    I_axis = int v^2 = Ix_P cos^2 + Iy_P sin^2 - 2 Ixy_P sin cos
    I_across = int u^2 = Ix_P sin^2 + Iy_P cos^2 + 2 Ixy_P sin cos
    I_product = int u v = (Ix_P - Iy_P) sin cos + Ixy_P (cos^2 - sin^2)

The polar moment about P is Ix_P + Iy_P; the section modulus to a fibre F is
I_axis / |v_F|, v_F the fibre's distance from the axis. Units: the profile's length unit L
(areas L^2, second moments L^4, moduli L^3), angles in degrees.

Examples
--------
>>> g = GeometricProperties(A=200.0, centroid=(0.0, 10.0), Ix=200 * 20**2 / 12, Iy=10**3 * 20 / 12,
...     Ixy=0.0, I1=0.0, I2=0.0, alpha_deg=0.0, Ip=0.0, rx=0.0, ry=0.0, r1=0.0, r2=0.0)
>>> a = axis_properties(g, (0.0, 0.0), 0.0, fibres=[(0.0, 20.0)])  # 10 wide, 20 high, its base
>>> round(a.I_axis, 6), round(10 * 20**3 / 3, 6), round(a.moduli[0], 6)
(26666.666667, 26666.666667, 1333.333333)
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from ..errors import UsageError
from .geometric import GeometricProperties


@dataclass(frozen=True)
class AxisProperties:
    """Second moments about one axis through a given point (length unit L).

    Attributes
    ----------
    point : tuple of float
        The point P (x0, y0) the axis passes through, drawing coordinates, L.
    angle_deg : float
        Angle of the axis from +x, counter-clockwise, degrees.
    I_axis : float
        Second moment about the axis, int v^2 dA (v across the axis), L^4.
    I_across : float
        Second moment about the perpendicular axis through P, int u^2 dA, L^4.
    I_product : float
        Product moment int u v dA in the axis' coordinates (u along, v across), L^4.
    Ip : float
        Polar second moment about P, L^4.
    fibres : tuple of tuple of float
        The fibre points given, L.
    distances : tuple of float
        Signed distance v of each fibre from the axis (positive to the left of the axis
        direction), L.
    moduli : tuple of float
        Section modulus I_axis / |v| to each fibre, L^3.
    """

    point: tuple[float, float]
    angle_deg: float
    I_axis: float
    I_across: float
    I_product: float
    Ip: float
    fibres: tuple[tuple[float, float], ...] = ()
    distances: tuple[float, ...] = ()
    moduli: tuple[float, ...] = ()


def axis_properties(g: GeometricProperties, point: Sequence[float], angle_deg: float,
                    fibres: Sequence[Sequence[float]] = ()) -> AxisProperties:
    """Second moments about the axis through ``point`` at ``angle_deg``, moduli to ``fibres``.

    Parameters
    ----------
    g : GeometricProperties
        Centroidal properties (``result.geometric``, or ``result.weighted`` for the
        transformed section of a composite), length unit L.
    point : (float, float)
        A point of the axis, drawing coordinates, L.
    angle_deg : float
        Angle of the axis from +x, counter-clockwise, degrees.
    fibres : sequence of (float, float), optional
        Fibre points, L, for the section moduli.

    Returns
    -------
    AxisProperties

    Raises
    ------
    UsageError
        A non-finite input, or a fibre on the axis (no modulus there).
    """
    values = [*point, angle_deg, *(v for f in fibres for v in f)]
    if not np.all(np.isfinite(values)):
        raise UsageError("the axis point, angle and fibres must be finite numbers")
    x0, y0 = float(point[0]), float(point[1])
    dx, dy = g.centroid[0] - x0, g.centroid[1] - y0
    ixp, iyp, ixyp = g.Ix + g.A * dy * dy, g.Iy + g.A * dx * dx, g.Ixy + g.A * dx * dy
    t = np.radians(angle_deg)
    c, s = float(np.cos(t)), float(np.sin(t))
    f = np.asarray(fibres, dtype=float).reshape(-1, 2)
    v = -(f[:, 0] - x0) * s + (f[:, 1] - y0) * c
    I_axis = ixp * c * c + iyp * s * s - 2.0 * ixyp * s * c
    size = np.sqrt(g.A)
    on_axis = np.abs(v) <= 1e-12 * size
    if on_axis.any():
        k = int(np.argmax(on_axis)) + 1
        raise UsageError(f"fibre {k} (of those given) lies on the axis: it has no section modulus")
    return AxisProperties(
        point=(x0, y0), angle_deg=float(angle_deg), I_axis=float(I_axis),
        I_across=float(ixp * s * s + iyp * c * c + 2.0 * ixyp * s * c),
        I_product=float((ixp - iyp) * s * c + ixyp * (c * c - s * s)), Ip=float(ixp + iyp),
        fibres=tuple((float(a), float(b)) for a, b in f), distances=tuple(float(d) for d in v),
        moduli=tuple(float(I_axis / abs(d)) for d in v))


__all__ = ["AxisProperties", "axis_properties"]
