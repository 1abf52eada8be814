"""Sharp re-entrant corners of a profile, where the torsion shear stress is singular.

At a re-entrant corner of interior angle alpha > 180 degrees the exact Saint-Venant shear stress
grows without bound as r^(pi/alpha - 1) (r the distance from the corner; exponent -1/3 for a
right-angled corner), so a "maximum shear stress" there depends on the mesh, not on the part.
The mesher grades elements towards these corners so that J and Cw still converge, and the stress
report keeps its maximum away from them and names them.

Examples
--------
>>> from warpwise.geometry import profile_from_loops
>>> ell = profile_from_loops([[(0, 0), (10, 0), (10, 2), (2, 2), (2, 10), (0, 10)]])
>>> [(c.x, c.y, round(c.angle_deg)) for c in reentrant_corners(ell)]
[(2.0, 2.0, 270)]
"""

from __future__ import annotations

from dataclasses import dataclass, replace

import numpy as np
import shapely
from shapely.geometry.polygon import orient

from .profile import Profile
from .rays import first_hits

#: Interior angle above which a corner counts as sharp and re-entrant, degrees.
SHARP_ANGLE_DEG = 190.0


@dataclass(frozen=True)
class Corner:
    """A sharp re-entrant corner.

    Attributes
    ----------
    x, y : float
        Location, drawing coordinates.
    angle_deg : float
        Interior angle on the material side, degrees (> 180).
    radius : float
        Radius around the corner within which the singular stress is left out of reported
        maxima (see :func:`exclusion_radius`), drawing unit; 0 when not measured.
    exponent : float
        Stress singularity exponent pi/alpha - 1 (the stress grows as r to this power).
    """

    x: float
    y: float
    angle_deg: float
    radius: float = 0.0

    @property
    def exponent(self) -> float:
        """Exponent of the shear-stress singularity, pi / alpha - 1 (negative)."""
        return 180.0 / self.angle_deg - 1.0


def outline_corners(profile: Profile, low_deg: float, high_deg: float) -> list[Corner]:
    """Corners of the material outline with an interior angle strictly between two bounds.

    Interfaces between materials are not free boundaries and are not searched; vertices of the
    polygon approximating a recorded circular or elliptical arc (strictly inside its sweep) are
    not corners.

    Parameters
    ----------
    profile : Profile
        The profile.
    low_deg, high_deg : float
        Interior angles (on the material side) between which a vertex counts, degrees.

    Returns
    -------
    list of Corner
        Each without its exclusion radius.
    """
    geom = profile.geometry()
    found: list[Corner] = []
    for poly in getattr(geom, "geoms", [geom]):
        poly = orient(poly, 1.0)  # exterior counter-clockwise, holes clockwise: material on the left
        for ring in (poly.exterior, *poly.interiors):
            p = np.asarray(ring.coords)[:-1]
            e_in = p - np.roll(p, 1, axis=0)
            e_out = np.roll(p, -1, axis=0) - p
            cross = e_in[:, 0] * e_out[:, 1] - e_in[:, 1] * e_out[:, 0]
            dot = np.einsum("ij,ij->i", e_in, e_out)
            turn = np.degrees(np.arctan2(cross, dot))  # left turn positive
            interior = 180.0 - turn
            sharp = (interior > low_deg) & (interior < high_deg)
            # a vertex of the polygon that approximates a recorded arc is not a corner
            for arc in profile.arcs:
                on = np.abs(arc.gap(p)) < 1e-7 * max(arc.a, arc.b, profile.size)
                if not arc.full:
                    on &= arc.contains_angle(arc.param(p), slack=-1e-9)
                sharp &= ~on
            for k in np.flatnonzero(sharp):
                found.append(Corner(float(p[k, 0]), float(p[k, 1]), float(interior[k])))
    return found


#: Interior angles of the convex corners the mesh is graded towards (right angles and obtuse
#: ones), degrees. Between 90 and 180 degrees the warping function near the corner goes as
#: r^(pi/alpha) with 1 < pi/alpha < 2 (Williams 1952, the corner expansion of a harmonic
#: function with Neumann sides, from memory), so its second derivatives are unbounded and a
#: uniform six-node mesh loses its rate (measured, Cw of a 24 mm hexagon bar at the default
#: mesh: +1.1e-2 uniform, -1.1e-3 graded; an octagon +1.8e-2 and -1.7e-3). At a right angle
#: the data y n_x - x n_y of the two sides cannot be met by one quadratic, which leaves an
#: r^2 log r term (from memory): graded, J at a mesh of 0.125 sqrt(A) of a 60 x 40 x 5 angle
#: went from 6.4e-4 to 4.8e-5 and of a 100 x 50 channel from 7.8e-4 to 7.6e-5, Cw of a 20 mm
#: square from 1.6e-3 to 1.5e-4 (against refine 8), for 1 % more nodes on the bundled samples.
#: Flatter vertices (a polygon standing for a curve) have a singular part too weak to pay for
#: the points; acute corners (pi/alpha > 2) none that matters.
OBTUSE_RANGE_DEG = (89.0, 150.5)


def obtuse_corners(profile: Profile) -> list[Corner]:
    """Right-angled and obtuse convex corners of the outline (:data:`OBTUSE_RANGE_DEG`), unmeasured."""
    return outline_corners(profile, *OBTUSE_RANGE_DEG)


def reentrant_corners(profile: Profile, sharp_deg: float = SHARP_ANGLE_DEG, *,
                      measure: bool = True) -> list[Corner]:
    """Corners of the material outline with an interior angle above ``sharp_deg``.

    Found by :func:`outline_corners` (free boundaries only, recorded arcs' vertices left out).

    Parameters
    ----------
    profile : Profile
        The profile.
    sharp_deg : float
        Interior angle threshold, degrees.
    measure : bool
        Also measure each corner's exclusion radius (``Corner.radius``); the mesher, which
        needs only the locations, leaves it out.

    Returns
    -------
    list of Corner
    """
    found = outline_corners(profile, sharp_deg, 360.0)
    if measure and found:
        radii = exclusion_radii(profile, np.array([(c.x, c.y) for c in found]))
        found = [replace(c, radius=float(r)) for c, r in zip(found, radii, strict=True)]
    return found


#: Radius around a sharp re-entrant corner left out of the reported maximum stress, as a
#: fraction of the local material depth (the shortest crossing of the material from the
#: corner: the wall thickness at the inside corner of a thin wall). The singular field
#: r^(pi/alpha - 1) dominates within a fraction of the wall; measured on 40 x 50 channels of
#: walls 1.5 and 3 (sharp inside corners), the largest torsion stress outside the disc over
#: T t / J, at the default mesh and at t / 8: fraction 0.1: 1.276 and 1.309 (mesh-dependent,
#: inside the singular zone), 0.25: 1.106 and 1.101, 0.5: 1.053 and 1.054, 1.0: the same as
#: 0.5 (the largest stress is then on the outer face opposite the corner, 5 % above the wall's
#: own, a junction stress that converges with the mesh). Half the depth is
#: the smallest fraction whose maximum no longer moves with the mesh (common practice for
#: reading a stress "away from the corner", no source).
EXCLUSION_FRACTION = 0.5
#: Directions of the rays cast from a corner into the material, degrees.
RAY_STEP_DEG = 5.0


def exclusion_radii(profile: Profile, corners: np.ndarray) -> np.ndarray:
    """Radius around each corner (k, 2) within which the singular stress is not reported, L.

    The local material depth is the shortest distance from the corner to the outline across
    the material (rays into the material every :data:`RAY_STEP_DEG` degrees, all corners at
    once, :func:`~warpwise.geometry.rays.first_hits`); the radius is
    :data:`EXCLUSION_FRACTION` of it (of the profile size where no ray meets the outline).
    """
    geom = profile.geometry()
    size = profile.size
    ang = np.radians(np.arange(0.0, 360.0, RAY_STEP_DEG))
    d = np.column_stack([np.cos(ang), np.sin(ang)])
    origin = np.repeat(corners, len(d), axis=0)
    direction = np.tile(d, (len(corners), 1))
    start = origin + 1e-6 * size * direction
    inside = shapely.contains_xy(geom, start[:, 0], start[:, 1])
    rings = [r for poly in getattr(geom, "geoms", [geom]) for r in (poly.exterior, *poly.interiors)]
    xy = [np.asarray(r.coords) for r in rings]
    seg_a = np.concatenate([c[:-1] for c in xy])
    seg_b = np.concatenate([c[1:] for c in xy])
    t = np.full(len(origin), np.inf)
    t[inside] = first_hits(seg_a, seg_b, origin[inside], direction[inside], reach=2.0 * size,
                           start=1e-6 * size, first=1.0 / 256.0)
    depth = np.minimum(t.reshape(len(corners), len(d)).min(axis=1), size)
    return EXCLUSION_FRACTION * depth


def exclusion_radius(profile: Profile, corner: Corner) -> float:
    """Radius around ``corner`` within which the singular stress is not reported, drawing unit.

    See :func:`exclusion_radii`, which measures many corners at once.
    """
    return float(exclusion_radii(profile, np.array([[corner.x, corner.y]]))[0])
