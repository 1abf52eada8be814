"""Second moments about a given axis or point, and moduli to given fibres, against closed forms.

Oracles: the rectangle about its base b h^3 / 3 and about its diagonal
b^3 h^3 / (6 (b^2 + h^2)) (Gere & Timoshenko, Mechanics of Materials, appendix of plane-area
properties; from memory); an L-angle moved and turned with shapely so that the axis is the x
axis, then its polygon moments by Green's theorem (Steger 1996, "On the calculation of
arbitrary moments of polygons"), computed here independently of the finite elements.
The finite-element centroidal moments of a polygon are exact up to round-off (quadratic
integrands on straight six-node triangles, degree-4 quadrature), so the tolerances are 1e-10.
"""

import math

import numpy as np
import pytest
from shapely import affinity
from shapely.geometry import Polygon

from warpwise.errors import UsageError
from warpwise.geometry.profile import profile_from_loops
from warpwise.properties.about_axis import axis_properties
from warpwise.properties.analysis import analyse

RECT_B, RECT_H = 30.0, 50.0
#: Our own invented unequal angle: legs 80 x 50, thickness 8 (mm).
ANGLE = [(0, 0), (50, 0), (50, 8), (8, 8), (8, 80), (0, 80)]


@pytest.fixture(scope="module")
def rectangle():
    loop = [(0, 0), (RECT_B, 0), (RECT_B, RECT_H), (0, RECT_H)]
    return analyse(profile_from_loops([loop]))


@pytest.fixture(scope="module")
def angle():
    return analyse(profile_from_loops([ANGLE]))


def _polygon_moments(poly: Polygon) -> tuple[float, float, float]:
    """int y^2, int x^2, int x y over a polygon about the origin (Green's theorem, Steger 1996)."""
    xy = np.asarray(poly.exterior.coords)
    if not poly.exterior.is_ccw:
        xy = xy[::-1]
    x0, y0, x1, y1 = xy[:-1, 0], xy[:-1, 1], xy[1:, 0], xy[1:, 1]
    cross = x0 * y1 - x1 * y0
    ixx = np.sum(cross * (y0 * y0 + y0 * y1 + y1 * y1)) / 12.0
    iyy = np.sum(cross * (x0 * x0 + x0 * x1 + x1 * x1)) / 12.0
    ixy = np.sum(cross * (x0 * y1 + 2 * x0 * y0 + 2 * x1 * y1 + x1 * y0)) / 24.0
    return float(ixx), float(iyy), float(ixy)


def test_rectangle_about_its_base(rectangle):
    a = axis_properties(rectangle.geometric, (0.0, 0.0), 0.0, fibres=[(10.0, RECT_H)])
    # b h^3 / 3 about the base (closed form, Gere & Timoshenko; from memory)
    assert a.I_axis == pytest.approx(RECT_B * RECT_H**3 / 3, rel=1e-10)
    # about the side x = 0 (perpendicular through the corner): h b^3 / 3
    assert a.I_across == pytest.approx(RECT_H * RECT_B**3 / 3, rel=1e-10)
    # product about the corner: b^2 h^2 / 4 (parallel-axis theorem)
    assert a.I_product == pytest.approx(RECT_B**2 * RECT_H**2 / 4, rel=1e-10)
    assert a.Ip == pytest.approx(RECT_B * RECT_H * (RECT_B**2 + RECT_H**2) / 3, rel=1e-10)
    assert a.distances[0] == pytest.approx(RECT_H, rel=1e-12)
    assert a.moduli[0] == pytest.approx(RECT_B * RECT_H**2 / 3, rel=1e-10)


def test_rectangle_about_its_diagonal(rectangle):
    theta = math.degrees(math.atan2(RECT_H, RECT_B))
    a = axis_properties(rectangle.geometric, (0.0, 0.0), theta, fibres=[(RECT_B, 0.0)])
    b, h = RECT_B, RECT_H
    # b^3 h^3 / (6 (b^2 + h^2)) about a diagonal (Gere & Timoshenko; from memory)
    assert a.I_axis == pytest.approx(b**3 * h**3 / (6 * (b * b + h * h)), rel=1e-10)
    # the far corner lies b h / sqrt(b^2 + h^2) from the diagonal, on its right (negative v)
    d = b * h / math.hypot(b, h)
    assert a.distances[0] == pytest.approx(-d, rel=1e-12)
    assert a.moduli[0] == pytest.approx(a.I_axis / d, rel=1e-12)


@pytest.mark.parametrize("point, angle_deg", [((0.0, 0.0), 0.0), ((12.5, -7.0), 30.0),
                                              ((40.0, 60.0), -115.0), ((3.0, 3.0), 90.0)])
def test_angle_about_any_axis_against_moved_polygon(angle, point, angle_deg):
    a = axis_properties(angle.geometric, point, angle_deg)
    moved = affinity.rotate(affinity.translate(Polygon(ANGLE), -point[0], -point[1]),
                            -angle_deg, origin=(0, 0))
    i_axis, i_across, i_product = _polygon_moments(moved)
    scale = i_axis + i_across
    assert a.I_axis == pytest.approx(i_axis, rel=1e-10)
    assert a.I_across == pytest.approx(i_across, rel=1e-10)
    assert a.I_product == pytest.approx(i_product, abs=1e-10 * scale)
    assert a.Ip == pytest.approx(scale, rel=1e-10)


def test_axis_at_principal_angle_through_centroid_gives_principal_moments(angle):
    # Mohr's transformation (common practice, no source): I1, I2 and zero product
    g = angle.geometric
    a = axis_properties(g, g.centroid, g.alpha_deg)
    assert a.I_axis == pytest.approx(g.I1, rel=1e-12)
    assert a.I_across == pytest.approx(g.I2, rel=1e-12)
    assert abs(a.I_product) < 1e-12 * g.I1


def test_fibre_on_the_axis_is_refused(rectangle):
    with pytest.raises(UsageError, match=r"fibre 2 \(of those given\) lies on the axis"):
        axis_properties(rectangle.geometric, (0.0, 0.0), 0.0, fibres=[(1.0, 3.0), (10.0, 0.0)])
