"""Geometry: profiles, loop checks, parametric shapes, corners and mirror symmetry.

The first stage after reading: raw loops become a validated :class:`Profile`
(:mod:`.loops` judges loops, :mod:`.profile` builds regions, :mod:`.curves` records the
circular and elliptical arcs the loops stand for), :mod:`.shapes` makes parametric
profiles, :mod:`.corners` finds sharp re-entrant corners and :mod:`.symmetry` mirror axes.
"""

from .curves import Arc, Curve, EllipseArc
from .loops import MAX_COORDINATE, POINT_TOLERANCE, check_points, clean_loop, signed_area
from .profile import (
    DEFAULT_SIZE_FACTOR,
    LENGTH_UNITS,
    Profile,
    Region,
    default_element_size,
    profile_from_loops,
)

__all__ = ["DEFAULT_SIZE_FACTOR", "LENGTH_UNITS", "MAX_COORDINATE", "POINT_TOLERANCE", "Arc",
           "Curve", "EllipseArc", "Profile", "Region", "check_points", "clean_loop", "default_element_size",
           "profile_from_loops", "signed_area"]
