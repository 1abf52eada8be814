"""Parametric profiles built from exact dimensions (drawing unit, mm by default).

Every function returns a validated :class:`~warpwise.geometry.Profile`. Straight edges are
exact; every circular arc (fillet, bend, corner radius, circle) is a polygon of chords whose
sagitta is at most :data:`ARC_SAGITTA` of the profile's largest dimension, *and* is recorded as
an :class:`~warpwise.geometry.Arc`, so that the mesh puts its boundary nodes on the true curve
(curved element edges) and the computed properties are those of the curved outline.

The modules: :mod:`.dimensions` checks dimensions, :mod:`.outline` cuts arcs into chords and
rounds corners, :mod:`.bars` holds the solid bars and the tube, :mod:`.rolled` the open sections
of a web and flanges, :mod:`.constant_thickness` the hollow and bent sections of one wall
thickness, and :mod:`.specs` the table of shapes, the spec parser and the listing.

Origins (x to the right, y up):

==================  ===================================================================
shape               origin
==================  ===================================================================
rectangle           centroid (centre)
round_bar, tube     centre of the circle
rhs                 centroid (centre)
i_section           centroid (centre); web along y, flanges along x
channel             back of the web on x = 0, mid-depth on y = 0; flanges towards +x
lipped_channel      back of the web on x = 0, mid-depth on y = 0; flanges towards +x,
                    lips turned in towards y = 0
angle               heel (outer corner) at the origin; leg h along +y, leg b along +x
tee                 axis of symmetry on x = 0; foot of the stem on y = 0, flange on top
zed                 centroid (the centre of point symmetry); web along y, top flange
                    towards +x, bottom flange towards -x
hexagon             centre; two flats parallel to x (the across-flats size is along y)
keyed_shaft         centre of the shaft; keyway at the top (+y), centred on x = 0
==================  ===================================================================

Each function checks its dimensions and raises :class:`~warpwise.errors.ProfileError` with a
one-line message for a non-positive size or an impossible combination (a web wider than the
flange, a radius that does not fit...). :func:`shape_from_spec` builds a profile from a text
such as ``"i_section:h=200,b=100,tw=5.6,tf=8.5,r=12"``; :data:`SHAPES` maps the plain names to
the functions and :func:`describe_shapes` lists them with their parameters.

Examples
--------
>>> round(rectangle(20.0, 10.0).area, 9)
200.0
>>> p = shape_from_spec("i_section:h=200,b=100,tw=5.6,tf=8.5,r=12")
>>> p.source
'I-section h=200 b=100 tw=5.6 tf=8.5 r=12'
>>> len(p.arcs)  # one recorded arc per root fillet
4

"""

from .bars import ellipse, ellipse_points, hexagon, keyed_shaft, polygon, rectangle, round_bar, tube
from .constant_thickness import lipped_channel, rhs, zed
from .outline import ARC_MAX_STEP_DEG, ARC_SAGITTA, arc_segments, rounded_loop
from .rolled import angle, channel, i_section, tee
from .specs import SHAPE_KINDS, SHAPES, ShapeKind, ShapeParameter, describe_shapes, shape_from_spec

__all__ = ["ARC_MAX_STEP_DEG", "ARC_SAGITTA", "SHAPES", "SHAPE_KINDS", "ShapeKind", "ShapeParameter",
           "angle", "arc_segments", "channel", "describe_shapes", "ellipse", "ellipse_points",
           "hexagon", "i_section", "keyed_shaft", "lipped_channel", "polygon", "rectangle",
           "rhs", "round_bar", "rounded_loop", "shape_from_spec", "tee", "tube", "zed"]
