"""Datasheet basics against exact values: size, extreme fibres, perimeters, surface, thinnest wall."""

from __future__ import annotations

import math

import pytest

from warpwise.geometry.shapes import angle, channel, circle, hollow_rectangle, i_beam, rectangle, tube
from warpwise.properties.analysis import analyse
from warpwise.properties.outline import perimeters
from warpwise.properties.wall import wall_thickness
from warpwise.report.quantities import values
from warpwise.report.records import record_of

# Perimeters and thicknesses below are sums of exact lengths (arcs r x angle): the only error
# is round-off, hence 1e-12 relative (common practice, no source).
EXACT = 1e-12


def test_perimeters_of_shapes_with_arcs():
    # circle pi D, tube pi (D + d) (exact geometry, common practice, no source)
    assert perimeters(circle(20.0)).outer == pytest.approx(math.pi * 20.0, rel=EXACT)
    p = perimeters(tube(80.0, 60.0))
    assert (p.outer, p.total) == pytest.approx((math.pi * 80.0, math.pi * 140.0), rel=EXACT)
    # I-beam with root fillets: 2b top and bottom, 4 tf flange tips, 2(b - tw) - 4r under the
    # flanges, 2(h - 2 tf) - 4r of web, four quarter circles 2 pi r (exact geometry)
    h, b, tw, tf, r = 200.0, 100.0, 5.6, 8.5, 12.0
    exact = 4 * b - 2 * tw + 2 * h - 8 * r + 2 * math.pi * r
    assert perimeters(i_beam(h, b, tw, tf, r)).outer == pytest.approx(exact, rel=EXACT)
    # hollow rectangle with rounded corners ro = 8, ri = ro - t = 4: 2(h + b) - 8 r + 2 pi r
    # per loop
    p = perimeters(hollow_rectangle(100.0, 50.0, 4.0, ro=8.0))
    outer = 2 * (100 + 50) - 8 * 8.0 + 2 * math.pi * 8.0
    inner = 2 * (92 + 42) - 8 * 4.0 + 2 * math.pi * 4.0
    assert (p.outer, p.total) == pytest.approx((outer, outer + inner), rel=EXACT)


def test_perimeter_without_arcs_is_that_of_the_polygon():
    # no recorded arcs: the drawn sides, against shapely's length (reference library)
    prof = channel(100.0, 50.0, 5.0, 8.0)
    assert perimeters(prof).total == pytest.approx(prof.geometry().length, rel=EXACT)
    polygon_circle = circle(20.0, curved=False)
    assert perimeters(polygon_circle).outer == pytest.approx(polygon_circle.geometry().length,
                                                             rel=EXACT)


@pytest.mark.parametrize("length,factor,unit", [("mm", 1e-3, "m2/m"), ("in", 1 / 12, "ft2/ft")])
def test_coated_surface_per_length_in_mm_and_inches(length, factor, unit):
    # surface per length = total perimeter x 1 m (or 1 ft): the perimeter in m (ft); 12 in to
    # the foot (NIST SP 811, B.8, exact)
    D, d = 80.0, 60.0
    rec = record_of(analyse(tube(D, d, units=length)))
    assert rec.values["surface"] == pytest.approx(math.pi * (D + d) * factor, rel=EXACT)
    from warpwise.report.quantities import QUANTITY_BY_KEY, unit_of

    assert unit_of(QUANTITY_BY_KEY["surface"], length) == unit
    # the same section in the other system: m2/m to ft2/ft is 1 / 0.3048 (NIST SP 811, exact)
    other = "in" if length == "mm" else "mm"
    scale = 1 / 0.3048 if length == "mm" else 0.3048
    assert rec.in_units(other).values["surface"] == pytest.approx(rec.values["surface"] * scale,
                                                                 rel=EXACT)


def test_size_and_extreme_fibres():
    # a circle: width = height = D and c = D/2 though the mesh nodes miss the extreme points
    # (the true arc's farthest points are used; exact geometry)
    v = values(analyse(circle(20.0, segments=30)))
    assert (v["width"], v["height"], v["c_top"], v["c_left"]) == pytest.approx(
        (20.0, 20.0, 10.0, 10.0), rel=EXACT)
    assert v["Wel_x_top"] == pytest.approx(v["Ix"] / v["c_top"], rel=EXACT)
    # a channel, web on the left: c_left = xc from the rectangle sums (exact)
    h, b, tw, tf = 100.0, 50.0, 5.0, 8.0
    v = values(analyse(channel(h, b, tw, tf)))
    A = 2 * b * tf + (h - 2 * tf) * tw
    xc = (2 * b * tf * b / 2 + (h - 2 * tf) * tw * tw / 2) / A
    assert (v["width"], v["height"]) == pytest.approx((b, h), rel=EXACT)
    assert (v["c_left"], v["c_right"]) == pytest.approx((xc, b - xc), rel=1e-10)
    assert v["c_top"] == pytest.approx(h / 2, rel=1e-10)


def test_minimum_wall_thickness():
    # constant walls: the value is exact (geometry; round-off only)
    w = wall_thickness(tube(80.0, 60.0))
    assert w.t_min == pytest.approx(10.0, rel=1e-12)
    assert math.hypot(*w.at) == pytest.approx(35.0, rel=1e-12)  # the middle of the wall
    assert wall_thickness(rectangle(40.0, 15.0)).t_min == pytest.approx(15.0, rel=EXACT)
    # channels: the thinner of web and flanges, found in it
    w = wall_thickness(channel(100.0, 50.0, 5.0, 8.0))
    assert w.t_min == pytest.approx(5.0, rel=EXACT) and w.at[0] == pytest.approx(2.5)
    w = wall_thickness(channel(100.0, 50.0, 9.0, 6.0))
    assert w.t_min == pytest.approx(6.0, rel=EXACT) and abs(w.at[1]) == pytest.approx(47.0)
    # I-beam with root fillets: the web, on the web's axis, between the fillets
    w = wall_thickness(i_beam(200.0, 100.0, 5.6, 8.5, 12.0))
    assert w.t_min == pytest.approx(5.6, rel=EXACT)
    assert w.at[0] == pytest.approx(0.0, abs=1e-9) and abs(w.at[1]) <= 100.0 - 8.5 - 12.0
    # an angle with a root radius and rounded toes: the legs, not the rounding at their ends
    assert wall_thickness(angle(80.0, 60.0, 5.0, 6.0, 3.0)).t_min == pytest.approx(5.0, rel=EXACT)
    # rounded hollow rectangle: the wall, also through the concentric corners
    assert wall_thickness(hollow_rectangle(100.0, 50.0, 4.0, ro=8.0)).t_min == pytest.approx(
        4.0, rel=1e-12)
