"""Parametric profiles built from exact dimensions (drawing unit, mm by default).

Every function returns a validated :class:`~warpwise.geometry.Profile`. Straight edges are
exact; every circular arc (fillet, bend, corner radius, circle) is a polygon of chords whose
sagitta is at most :data:`ARC_SAGITTA` of the profile's largest dimension, *and* is recorded as
an :class:`~warpwise.geometry.Arc` (the ellipses as an :class:`~warpwise.geometry.EllipseArc`),
so that the mesh puts its boundary nodes on the true curve (curved element edges) and the
computed properties are those of the curved outline.

The modules: :mod:`.dimensions` checks dimensions, :mod:`.outline` cuts arcs into chords and
rounds corners, :mod:`.bars` holds the solid bars and the tubes, :mod:`.rolled` the open sections
of a web and flanges, :mod:`.constant_thickness` the hollow and bent sections of one wall
thickness, and :mod:`.specs` the table of shapes, the spec parser and the listing.

Origins (x to the right, y up):

==================  ===================================================================
shape               origin
==================  ===================================================================
rectangle           centroid (centre)
circle, tube        centre of the circle
ellipse,            centre; semi-axis a along x, b along y
hollow_ellipse
hollow_rectangle    centroid (centre)
i_beam              centroid (centre); web along y, flanges along x
channel             back of the web on x = 0, mid-depth on y = 0; flanges towards +x
channel_with_lips   back of the web on x = 0, mid-depth on y = 0; flanges towards +x,
                    lips turned in towards y = 0
angle               heel (outer corner) at the origin; leg h along +y, leg b along +x
tee                 axis of symmetry on x = 0; foot of the stem on y = 0, flange on top
z_shape             centroid (the centre of point symmetry); web along y, top flange
                    towards +x, bottom flange towards -x
hexagon             centre; two flats parallel to x (the across-flats size is along y)
shaft_with_keyway   centre of the shaft; keyway at the top (+y), centred on x = 0
==================  ===================================================================

Each function checks its dimensions and raises :class:`~warpwise.errors.ProfileError` with a
one-line message for a non-positive size or an impossible combination (a web wider than the
flange, a radius that does not fit...). :func:`shape_from_spec` builds a profile from a text
such as ``"i_beam:h=200,b=100,tw=5.6,tf=8.5,r=12"``; :data:`SHAPES` maps the plain names to
the functions and :func:`describe_shapes` lists them with their parameters.

Examples
--------
>>> round(rectangle(20.0, 10.0).area, 9)
200.0
>>> p = shape_from_spec("i_beam:h=200,b=100,tw=5.6,tf=8.5,r=12")
>>> p.source
'I-beam h=200 b=100 tw=5.6 tf=8.5 r=12'
>>> len(p.arcs)  # one recorded arc per root fillet
4

"""

from .bars import (
    circle,
    ellipse,
    ellipse_points,
    hexagon,
    hollow_ellipse,
    polygon,
    rectangle,
    shaft_with_keyway,
    tube,
)
from .constant_thickness import channel_with_lips, hollow_rectangle, z_shape
from .outline import ARC_MAX_STEP_DEG, ARC_SAGITTA, arc_segments, rounded_loop
from .rolled import angle, channel, i_beam, tee
from .specs import SHAPE_KINDS, SHAPES, ShapeKind, ShapeParameter, describe_shapes, shape_from_spec

__all__ = ["ARC_MAX_STEP_DEG", "ARC_SAGITTA", "SHAPES", "SHAPE_KINDS", "ShapeKind", "ShapeParameter",
           "angle", "arc_segments", "channel", "channel_with_lips", "circle", "describe_shapes",
           "ellipse", "ellipse_points", "hexagon", "hollow_ellipse", "hollow_rectangle", "i_beam", "polygon",
           "rectangle", "rounded_loop", "shaft_with_keyway", "shape_from_spec", "tee", "tube",
           "z_shape"]
