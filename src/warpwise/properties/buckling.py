"""Constants for torsional and flexural-torsional buckling (i0 and the shear-centre offset).

The polar radius of gyration about the shear centre and the shear centre's offset from the
centroid.

With the shear centre at (xs0, ys0) from the centroid, the polar radius of gyration about the
shear centre is i0^2 = (Ix + Iy) / A + xs0^2 + ys0^2 (Timoshenko and Gere, Theory of Elastic
Stability, 2nd ed., chapter 5 on torsional buckling, r0^2 = (Ix + Iy)/A + x0^2 + y0^2; the
chapter from memory). For a composite section the
values are those of the transformed section (the torsion results refer to its centroid).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from .geometric import GeometricProperties
from .torsion import TorsionProperties


@dataclass(frozen=True)
class BucklingConstants:
    """Shear-centre constants of the section (drawing length unit L).

    Attributes
    ----------
    xs0, ys0 : float
        Shear centre (Trefftz) less the centroid, along x and y, L.
    i0 : float
        Polar radius of gyration about the shear centre, sqrt((Ix + Iy)/A + xs0^2 + ys0^2), L.
    """

    xs0: float
    ys0: float
    i0: float


def buckling_constants(geo: GeometricProperties, tor: TorsionProperties) -> BucklingConstants:
    """The shear-centre offset and the polar radius of gyration about the shear centre.

    Parameters
    ----------
    geo : GeometricProperties
        Area properties the torsion results refer to (the weighted ones of a composite), L.
    tor : TorsionProperties
        Torsion results (the shear centre), L.

    Returns
    -------
    BucklingConstants
        Offsets and i0, L.

    Examples
    --------
    >>> from warpwise.properties.analysis import analyse
    >>> from warpwise.geometry.shapes import rectangle
    >>> res = analyse(rectangle(60.0, 20.0))
    >>> round(buckling_constants(res.geometric, res.torsion).i0 ** 2, 6)  # (b^2 + h^2) / 12
    333.333333
    """
    xs0 = tor.shear_centre[0] - geo.centroid[0]
    ys0 = tor.shear_centre[1] - geo.centroid[1]
    return BucklingConstants(xs0, ys0, math.sqrt(geo.Ip / geo.A + xs0**2 + ys0**2))


__all__ = ["BucklingConstants", "buckling_constants"]
