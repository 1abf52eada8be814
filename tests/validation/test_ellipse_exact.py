"""Ellipses followed exactly: parametric shapes and DXF ellipses against closed forms.

The outline of an ellipse is a polygon whose vertices lie on the ellipse (equal parameter
steps) and whose curve is recorded (:class:`~warpwise.geometry.EllipseArc`); the mesh puts its
boundary nodes on the ellipse (curved, isoparametric element edges). What is left is the sliver
between each quadratic edge and the ellipse: an affine image of the circle's, so of relative
size (pi / N)^4 / 15 for N equal parameter steps (the shapes module's estimate for circles,
r^2 a^5 / 30 per edge of half-angle a), 1.5e-9 at N = 256 for the second moments and half of
it for the area. The tolerances below are that floor with a margin of about two; extreme
fibres and perimeters come from the true curve and are exact to round-off.

Sources:
- Area pi a b, Ix = pi a b^3 / 4, Iy = pi a^3 b / 4 of an ellipse of semi-axes a (along x) and
  b: closed forms (any mechanics handbook, e.g. Roark's Formulas, table of section properties).
- Half ellipse: area pi a b / 2, centroid 4 b / (3 pi) above the flat side: closed forms (the
  same tables; the half-ellipse is the affine image of the half disc).
- Perimeter 4 a E(1 - b^2 / a^2), E Legendre's complete elliptic integral of the second kind
  (scipy.special.ellipe); a partial arc by numerical quadrature of ds (scipy.integrate.quad).
- Extreme fibre of an ellipse turned by theta, along x: sqrt(a^2 cos^2 theta + b^2 sin^2 theta)
  (the support function of the ellipse, closed form).
- Torsion: J = pi a^3 b^3 / (a^2 + b^2) (Saint-Venant's ellipse, Timoshenko & Goodier, Theory
  of Elasticity, 3rd ed., ch. 10, "Elliptic Cross Section"); the hollow ellipse bounded by two
  similar ellipses (inner semi-axes k a, k b) has the same stress function, so
  J = pi a^3 b^3 / (a^2 + b^2) (1 - k^4) (Timoshenko & Goodier, the same section, hollow
  section bounded by similar ellipses).
"""

from __future__ import annotations

import math

import ezdxf
import numpy as np
import pytest
from scipy.integrate import quad
from scipy.special import ellipe

from warpwise import analyse
from warpwise.geometry import EllipseArc
from warpwise.geometry.shapes import ellipse, hollow_ellipse
from warpwise.io import load_profile
from warpwise.properties.outline import perimeters

A_ELL, B_ELL, K_HOLLOW = 20.0, 10.0, 0.7

#: Area, second moments and J against the closed forms, at the default mesh and at refine 2:
#: measured at most 1.5e-9 (parametric ellipse, 256 chords: the curved-edge floor above), so
#: 3e-9 is the floor with a margin of two.
CURVED_FLOOR = 3e-9

#: The same for the DXF ellipses, whose chords are finer (the reader's chord tolerance):
#: measured at most 5.7e-10 (hollow ellipse J), 2.4e-10 for the solid and turned ellipses and
#: the half ellipse.
DXF_FLOOR = 1e-9

#: Extreme fibres and perimeters from the true curves: round-off (measured below 2e-15).
ROUND_OFF = 1e-12

REFINES = [pytest.param(1.0, id="default"), pytest.param(2.0, id="refine 2")]


def rel(value: float, exact: float) -> float:
    return value / exact - 1.0


def ellipse_closed_forms(a: float, b: float) -> dict[str, float]:
    """A, Ix, Iy, J and the perimeter of a solid ellipse (sources in the module's text)."""
    return {"A": math.pi * a * b, "Ix": math.pi * a * b**3 / 4, "Iy": math.pi * a**3 * b / 4,
            "J": math.pi * a**3 * b**3 / (a * a + b * b),
            "P": 4.0 * a * float(ellipe(1.0 - (b / a) ** 2))}


def write_dxf(path, ellipses, lines=(), extrusion=(0.0, 0.0, 1.0)):
    """A DXF (mm) of ELLIPSE entities (centre, major axis, ratio, start, end param) and LINEs."""
    doc = ezdxf.new()
    doc.header["$INSUNITS"] = 4
    msp = doc.modelspace()
    for centre, major, ratio, t0, t1 in ellipses:
        msp.add_ellipse(centre, major_axis=(*major, 0.0), ratio=ratio, start_param=t0, end_param=t1,
                        dxfattribs={"extrusion": extrusion})
    for p, q in lines:
        msp.add_line(p, q)
    doc.saveas(path)
    return path


def check_solid(result, a: float, b: float, k: float = 0.0, tol: float = CURVED_FLOOR) -> None:
    """A, Ix, Iy, J of an ellipse (hollow: inner semi-axes k a, k b) to ``tol``, and its fibres."""
    exact = ellipse_closed_forms(a, b)
    g = result.geometric
    assert abs(rel(g.A, exact["A"] * (1 - k * k))) < tol
    assert abs(rel(g.Ix, exact["Ix"] * (1 - k**4))) < tol
    assert abs(rel(g.Iy, exact["Iy"] * (1 - k**4))) < tol
    assert abs(rel(result.torsion.J, exact["J"] * (1 - k**4))) < tol
    # extreme fibres from the true ellipse (a vertex of the polygon lies on each axis here,
    # but the mesh nodes are not where the check looks: the fibres come from the curve)
    f = g.fibres
    for key, value in (("x_top", b), ("x_bottom", b), ("y_right", a), ("y_left", a)):
        assert abs(rel(f[key], value)) < ROUND_OFF, key


@pytest.mark.parametrize("refine", REFINES)
def test_parametric_ellipse(refine):
    p = ellipse(A_ELL, B_ELL)
    assert p.arcs == (EllipseArc(0.0, 0.0, A_ELL, B_ELL),)
    check_solid(analyse(p, refine=refine), A_ELL, B_ELL)
    exact = ellipse_closed_forms(A_ELL, B_ELL)
    per = perimeters(p)
    assert abs(rel(per.outer, exact["P"])) < ROUND_OFF and per.total == per.outer


@pytest.mark.parametrize("refine", REFINES)
def test_parametric_hollow_ellipse(refine):
    k = K_HOLLOW
    p = hollow_ellipse(A_ELL, B_ELL, k * A_ELL, k * B_ELL)
    check_solid(analyse(p, refine=refine), A_ELL, B_ELL, k=k)
    per = perimeters(p)
    P = ellipse_closed_forms(A_ELL, B_ELL)["P"]
    assert abs(rel(per.outer, P)) < ROUND_OFF
    assert abs(rel(per.total, P * (1 + k))) < ROUND_OFF  # the inner ellipse is k times the outer


@pytest.mark.parametrize("refine", REFINES)
def test_dxf_ellipse_and_hollow_ellipse(tmp_path, refine):
    full = (0.0, 2 * math.pi)
    solid = load_profile(write_dxf(tmp_path / "ellipse.dxf",
                                   [((5.0, -3.0), (A_ELL, 0.0), B_ELL / A_ELL, *full)]))
    (e,) = solid.arcs
    assert isinstance(e, EllipseArc) and e.full
    assert (e.cx, e.cy, e.a, e.b) == pytest.approx((5.0, -3.0, A_ELL, B_ELL), abs=1e-12)
    res = analyse(solid, refine=refine)
    assert res.geometric.centroid == pytest.approx((5.0, -3.0), abs=1e-9 * A_ELL)
    check_solid(res, A_ELL, B_ELL, tol=DXF_FLOOR)
    assert abs(rel(perimeters(solid).outer, ellipse_closed_forms(A_ELL, B_ELL)["P"])) < ROUND_OFF

    k = K_HOLLOW
    hollow = load_profile(write_dxf(tmp_path / "hollow.dxf", [
        ((0.0, 0.0), (A_ELL, 0.0), B_ELL / A_ELL, *full),
        ((0.0, 0.0), (k * A_ELL, 0.0), B_ELL / A_ELL, *full)]))
    assert len(hollow.arcs) == 2
    check_solid(analyse(hollow, refine=refine), A_ELL, B_ELL, k=k, tol=DXF_FLOOR)


@pytest.mark.parametrize("refine", REFINES)
def test_rotated_ellipse(tmp_path, refine):
    theta = math.radians(30.0)
    a, b = A_ELL, B_ELL
    major = (a * math.cos(theta), a * math.sin(theta))
    p = load_profile(write_dxf(tmp_path / "turned.dxf", [((0.0, 0.0), major, b / a, 0.0, 2 * math.pi)]))
    g = analyse(p, refine=refine).geometric
    exact = ellipse_closed_forms(a, b)
    big, small = exact["Iy"], exact["Ix"]  # about the b-axis and about the a-axis
    s, c = math.sin(theta), math.cos(theta)
    # second moments of the turned ellipse: int y^2 = sin^2 int u^2 + cos^2 int v^2, u along a
    assert abs(rel(g.Ix, s * s * big + c * c * small)) < DXF_FLOOR
    assert abs(rel(g.Iy, c * c * big + s * s * small)) < DXF_FLOOR
    assert abs(g.Ixy - s * c * (big - small)) < DXF_FLOOR * big
    assert abs(rel(g.I1, big)) < DXF_FLOOR and abs(rel(g.I2, small)) < DXF_FLOOR
    assert g.alpha_deg == pytest.approx(30.0 - 90.0, abs=1e-6)  # axis 1 is the b-axis
    # extreme fibres: the support function of the ellipse along x and y; along the principal
    # axes the semi-axes themselves
    f = g.fibres
    assert abs(rel(f["y_right"], math.hypot(a * c, b * s))) < ROUND_OFF
    assert abs(rel(f["x_top"], math.hypot(a * s, b * c))) < ROUND_OFF
    assert abs(rel(f["1_pos"], a)) < ROUND_OFF and abs(rel(f["2_pos"], b)) < ROUND_OFF
    assert abs(rel(perimeters(p).outer, exact["P"])) < ROUND_OFF


def test_moved_parametric_ellipse_keeps_its_curve():
    p = ellipse(A_ELL, B_ELL).moved(angle_deg=30.0, shift=(4.0, -2.0), scale=0.5)
    (e,) = p.arcs
    assert (e.cx, e.cy, e.a, e.b) == pytest.approx((4.0, -2.0, A_ELL / 2, B_ELL / 2), abs=1e-12)
    assert e.rotation == pytest.approx(math.radians(30.0), abs=1e-15)
    g = analyse(p).geometric
    exact = ellipse_closed_forms(A_ELL / 2, B_ELL / 2)
    assert abs(rel(g.I1, exact["Iy"])) < CURVED_FLOOR and abs(rel(g.I2, exact["Ix"])) < CURVED_FLOOR
    assert abs(rel(g.fibres["1_pos"], A_ELL / 2)) < ROUND_OFF


@pytest.mark.parametrize("refine", REFINES)
@pytest.mark.parametrize("below", [False, True], ids=["extrusion +z", "extrusion -z"])
def test_half_ellipse_closed_by_its_major_axis(tmp_path, refine, below):
    # with the extrusion -z the minor axis is -y in the drawing (the ELLIPSE runs clockwise
    # seen from +z), so the parameters 0 to pi draw the lower half; the section is then the
    # mirror image of the upper half
    a, b = A_ELL, B_ELL
    path = write_dxf(tmp_path / "half.dxf", [((0.0, 0.0), (a, 0.0), b / a, 0.0, math.pi)],
                     [((-a, 0.0), (a, 0.0))], extrusion=(0.0, 0.0, -1.0 if below else 1.0))
    p = load_profile(path)
    if below:
        p = p.moved(angle_deg=180.0)  # turned upright (mirrored in x: the same by symmetry)
    (e,) = p.arcs
    assert isinstance(e, EllipseArc) and e.sweep == pytest.approx(math.pi, abs=1e-12)
    g = analyse(p, refine=refine).geometric
    area = math.pi * a * b / 2
    yc = 4.0 * b / (3.0 * math.pi)
    assert abs(rel(g.A, area)) < DXF_FLOOR
    assert abs(g.centroid[1] - yc) < DXF_FLOOR * b and abs(g.centroid[0]) < 1e-12 * a
    # about the flat side: half of the ellipse's; then the parallel axis theorem
    assert abs(rel(g.Ix, math.pi * a * b**3 / 8 - area * yc * yc)) < DXF_FLOOR
    assert abs(rel(g.Iy, math.pi * a**3 * b / 8)) < DXF_FLOOR
    f = g.fibres
    # the fibres are exact from the curve; the centroid they are measured from carries the
    # curved-edge floor
    assert abs(rel(f["x_top"], b - yc)) < DXF_FLOOR and abs(rel(f["x_bottom"], yc)) < DXF_FLOOR
    assert abs(rel(f["y_right"], a)) < ROUND_OFF and abs(rel(f["y_left"], a)) < ROUND_OFF
    # perimeter: the flat side plus the half ellipse, by quadrature of ds = |(-a sin t, b cos t)| dt
    arc, _ = quad(lambda t: math.hypot(a * math.sin(t), b * math.cos(t)), 0.0, math.pi, epsabs=1e-13)
    assert abs(rel(perimeters(p).outer, 2 * a + arc)) < ROUND_OFF


def test_area_converges_at_the_curved_element_rate():
    """Area, Ix and J of the meshed ellipse against N, the chords of the outline (unsplit).

    With curved edges through three points of the ellipse the error falls as N^-4 (the
    sliver of each edge goes as its half-angle to the fifth power, N edges), against N^-2 for
    the polygon (its segments, of area a b (h - sin h) / 2, each go as h^3). Measured slopes
    between N = 64, 128 and 256: 4.000 (area, Ix), 3.91 and 3.93 (J, which also carries the
    interior discretisation error).
    """
    a, b = A_ELL, B_ELL
    exact = ellipse_closed_forms(a, b)
    errors = []
    for n in (64, 128, 256):
        # one mesh size for all three, above the longest chord (1.5 at N = 64), so that every
        # chord stays one curved edge
        r = analyse(ellipse(a, b, segments=n), mesh_size=3.0)
        errors.append([abs(rel(r.geometric.A, exact["A"])), abs(rel(r.geometric.Ix, exact["Ix"])),
                       abs(rel(r.torsion.J, exact["J"]))])
    slopes = np.log2(np.array(errors[:-1]) / np.array(errors[1:]))
    assert np.all(slopes[:, :2] > 3.95) and np.all(slopes[:, :2] < 4.05), slopes
    assert np.all(slopes[:, 2] > 3.85), slopes
