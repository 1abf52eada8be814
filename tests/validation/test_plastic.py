"""Plastic section moduli, plastic neutral axes, shape factors and plastic moments.

The plastic modulus of bending about an axis is Wpl = int |d| dA with d the distance from the
plastic neutral axis (PNA), the line that halves the area; with several yield strengths the
plastic moment is Mpl = int fy |d| dA with the PNA balancing int fy sign(d) dA = 0. The
formulas below are exact geometry (the same ones steel design handbooks tabulate Wpl from); the
integrals in :mod:`warpwise.plastic` are taken exactly on the profile's polygons, so every
straight-sided shape is checked to round-off.

Tolerance for polygon-exact shapes: RTOL = 1e-12. Measured: at most 3e-14 on the moduli and
1.5e-14 of the height on the PNA (the bisection runs to 2^-60 of the height; what is left is the
round-off of the polygon clipping, which grows with the number of vertices: the worst cases are
the 4096-gon and the tubes).

Loops without recorded arcs are polygons here (a circle built from ``ellipse_points`` by
``profile_from_loops``: Wpl 1.5e-4 below d^3/6 with 256 segments); where the profile records its
circles and ellipses (``circle``, ``tube``, ``ellipse``, ``hollow_ellipse``, a DXF) the sides
that are their chords are integrated along the true curve, and Wpl is the curve's to round-off
(test_curved_outlines_are_exact). For the N-gon inscribed in a circle
of diameter d, with N a multiple of 4 and a vertex on +x (as
:func:`warpwise.shapes.ellipse_points` places them), each half is a fan of N/2 triangles from
the centre; the sum of their first moments about the diameter is (d^3 / 12) cos^2(pi / N), so
Wpl(N-gon) = (d^3 / 6) cos^2(pi / N) exactly (derived here; sum_{k=1}^{m-1} sin(k pi / m) =
cot(pi / (2 m))). The polygon error against the circle is therefore sin^2(pi / N), which
bounds the comparisons with the circle's d^3 / 6.
"""

import math

import numpy as np
import pytest

from warpwise.geometry.profile import profile_from_loops
from warpwise.geometry.shapes import circle, ellipse, ellipse_points, hollow_ellipse, rectangle, tube
from warpwise.materials import builtin_material, make_material
from warpwise.properties.analysis import analyse
from warpwise.properties.plastic import plastic_properties
from warpwise.report.quantities import values

RTOL = 1e-12


def rel(value: float, exact: float) -> float:
    """Relative difference."""
    return abs(value / exact - 1.0)


def ngon_factor(segments: int) -> float:
    """Wpl of the inscribed regular N-gon over the circle's d^3 / 6 (derivation in the docstring)."""
    return math.cos(math.pi / segments) ** 2


def i_beam_loop(h: float, b: float, tw: float, tf: float) -> np.ndarray:
    """Doubly symmetric I-section without root fillets, centred on the origin."""
    y0, y1 = -h / 2, h / 2
    return np.array([
        [-b / 2, y0], [b / 2, y0], [b / 2, y0 + tf], [tw / 2, y0 + tf], [tw / 2, y1 - tf],
        [b / 2, y1 - tf], [b / 2, y1], [-b / 2, y1], [-b / 2, y1 - tf], [-tw / 2, y1 - tf],
        [-tw / 2, y0 + tf], [-b / 2, y0 + tf],
    ])


def tee_loop(bf: float, tf: float, tw: float, hw: float) -> np.ndarray:
    """Tee: stem tw x hw standing on y = 0, flange bf x tf on top, symmetric about x = 0."""
    return np.array([[-tw / 2, 0.0], [tw / 2, 0.0], [tw / 2, hw], [bf / 2, hw],
                     [bf / 2, hw + tf], [-bf / 2, hw + tf], [-bf / 2, hw], [-tw / 2, hw]])


# ------------------------------------------------------------------------ single shapes


def test_rectangle():
    # exact geometry: Wpl = b h^2 / 4 about the axis parallel to b
    b, h = 30.0, 12.0
    p = plastic_properties(rectangle(b, h))
    assert rel(p.Wpl_x, b * h**2 / 4) < RTOL
    assert rel(p.Wpl_y, h * b**2 / 4) < RTOL
    assert abs(p.pna_y) < RTOL * h and abs(p.pna_x) < RTOL * b


def test_rectangle_rotated_and_shifted_principal_moduli():
    # A 40 x 10 rectangle turned 30 degrees and moved: axis 1 (major, I1 = 10 * 40^3 / 12) is
    # across the long side, so bending about it has lever arms along the long side:
    # Wpl_1 = 10 * 40^2 / 4 and Wpl_2 = 40 * 10^2 / 4 (exact geometry).
    long, short = 40.0, 10.0
    res = analyse(rectangle(long, short).moved(angle_deg=30.0, shift=(5.0, 3.0)))
    assert abs(res.geometric.alpha_deg - (-60.0)) < 1e-9
    assert rel(res.plastic.Wpl_1, short * long**2 / 4) < RTOL
    assert rel(res.plastic.Wpl_2, long * short**2 / 4) < RTOL


@pytest.mark.parametrize("segments", [64, 1024, 4096])
def test_solid_circle(segments):
    # exact geometry: d^3 / 6 for the circle, (d^3 / 6) cos^2(pi / N) for the N-gon
    d = 20.0
    p = plastic_properties(profile_from_loops([ellipse_points(d / 2, d / 2, segments)]))
    exact_polygon = d**3 / 6 * ngon_factor(segments)
    assert rel(p.Wpl_x, exact_polygon) < RTOL
    assert rel(p.Wpl_y, exact_polygon) < RTOL
    # against the circle: the polygon error sin^2(pi / N) (6e-7 with 4096 segments) bounds it
    bound = math.sin(math.pi / segments) ** 2
    assert 0.0 < d**3 / 6 - p.Wpl_x <= (bound + RTOL) * d**3 / 6


@pytest.mark.parametrize("D, d", [(100.0, 96.0), (100.0, 99.0), (100.0, 60.0)])
def test_tube(D, d):
    # exact geometry: Wpl = (D^3 - d^3) / 6 (times the N-gon factor: both loops have the same
    # N and vertex angles); thin-walled form d_m^2 t with d_m = (D + d) / 2, t = (D - d) / 2,
    # since (D^3 - d^3) / 6 = d_m^2 t (1 + (t / d_m)^2 / 3) identically.
    n = 1024
    p = plastic_properties(profile_from_loops([ellipse_points(D / 2, D / 2, n),
                                               ellipse_points(d / 2, d / 2, n)]))
    exact = (D**3 - d**3) / 6 * ngon_factor(n)
    assert rel(p.Wpl_x, exact) < RTOL
    assert rel(p.Wpl_y, exact) < RTOL
    dm, t = (D + d) / 2, (D - d) / 2
    thin = dm**2 * t * ngon_factor(n)
    # the thin-walled form is low by exactly (t / d_m)^2 / 3 (1.4e-4 for t / d_m = 0.02)
    assert rel(p.Wpl_x, thin * (1 + (t / dm) ** 2 / 3)) < RTOL
    assert p.Wpl_x / thin - 1 <= (t / dm) ** 2 / 3 + RTOL


def test_doubly_symmetric_i_beam():
    # exact geometry for the polygon without root fillets:
    # Wpl_x = b tf (h - tf) + tw (h - 2 tf)^2 / 4, Wpl_y = tf b^2 / 2 + (h - 2 tf) tw^2 / 4
    h, b, tw, tf = 200.0, 100.0, 5.6, 8.5
    wx = b * tf * (h - tf) + tw * (h - 2 * tf) ** 2 / 4
    wy = 2 * tf * b**2 / 4 + (h - 2 * tf) * tw**2 / 4
    prof = profile_from_loops([i_beam_loop(h, b, tw, tf)])
    p = plastic_properties(prof)
    assert rel(p.Wpl_x, wx) < RTOL and rel(p.Wpl_y, wy) < RTOL
    assert rel(p.Wpl_1, wx) < RTOL and rel(p.Wpl_2, wy) < RTOL  # alpha = 0
    assert abs(p.pna_x) < RTOL * h and abs(p.pna_y) < RTOL * h
    # the moduli do not depend on where the section is drawn; the PNA moves with it
    q = plastic_properties(prof.moved(shift=(13.0, -7.0)))
    assert rel(q.Wpl_x, wx) < RTOL and rel(q.Wpl_y, wy) < RTOL
    assert abs(q.pna_x - 13.0) < RTOL * h and abs(q.pna_y + 7.0) < RTOL * h


@pytest.mark.parametrize("bf, tf, tw, hw", [
    (120.0, 10.0, 8.0, 90.0),   # flange area 1200 > A / 2 = 960: PNA in the flange
    (60.0, 6.0, 10.0, 120.0),   # flange area 360 < A / 2 = 780: PNA in the stem
])
def test_unsymmetric_tee(bf, tf, tw, hw):
    # exact geometry: the PNA halves the area; Wpl = sum of |first moments| about it
    A = bf * tf + tw * hw
    if bf * tf >= A / 2:
        yp = hw + tf - A / (2 * bf)
        W = bf * (hw + tf - yp) ** 2 / 2 + bf * (yp - hw) ** 2 / 2 + tw * hw * (yp - hw / 2)
        below = tw * hw + bf * (yp - hw)
    else:
        yp = A / (2 * tw)
        W = tw * yp**2 / 2 + tw * (hw - yp) ** 2 / 2 + bf * tf * (hw + tf / 2 - yp)
        below = tw * yp
    assert below == pytest.approx(A / 2, rel=1e-15)  # the hand PNA does halve the area
    p = plastic_properties(profile_from_loops([tee_loop(bf, tf, tw, hw)]))
    assert abs(p.pna_y - yp) < RTOL * (hw + tf)
    assert rel(p.Wpl_x, W) < RTOL
    assert abs(p.pna_x) < RTOL * bf
    # about the axis of symmetry: the flange and the stem each contribute width^2 / 4 x depth
    assert rel(p.Wpl_y, tf * bf**2 / 4 + hw * tw**2 / 4) < RTOL
    # the PNA of an unsymmetric section is not the elastic one (centroid)
    yc = (bf * tf * (hw + tf / 2) + tw * hw**2 / 2) / A
    assert abs(p.pna_y - yc) > 1.0


# ------------------------------------------------------------------------ shape factors


def test_shape_factor_rectangle():
    # exact geometry: Wpl / Wel = (b h^2 / 4) / (b h^2 / 6) = 1.5
    v = values(analyse(rectangle(30.0, 12.0)))
    assert abs(v["shape_x"] - 1.5) < RTOL
    assert abs(v["shape_y"] - 1.5) < RTOL


def test_shape_factor_circle():
    # exact geometry: (d^3 / 6) / (pi d^3 / 32) = 16 / (3 pi). Wel comes from the curved mesh
    # (the circle, measured 1.5e-9 off with 256 segments: the curved edges' own geometric
    # error), Wpl from the true circle (round-off), so the ratio is 16 / (3 pi) to 3e-9.
    n = 256
    v = values(analyse(circle(20.0, segments=n)))
    exact = 16 / (3 * math.pi)
    assert rel(v["shape_x"], exact) < 3e-9
    assert rel(v["shape_y"], exact) < 3e-9


@pytest.mark.parametrize("name, profile, wpl_x, wpl_y", [
    # the circle and the tube: d^3 / 6 and (D^3 - d^3) / 6 (exact geometry, as above)
    ("circle", lambda: circle(20.0), 20.0**3 / 6, 20.0**3 / 6),
    ("tube", lambda: tube(40.0, 30.0), (40.0**3 - 30.0**3) / 6, (40.0**3 - 30.0**3) / 6),
    # the ellipse: each half has area pi a b / 2 and its centroid 4 b / (3 pi) from the axis,
    # so Wpl_x = 4 a b^2 / 3, Wpl_y = 4 a^2 b / 3 (closed forms); similar hollow: times 1 - k^3
    ("ellipse", lambda: ellipse(20.0, 10.0), 4 * 20.0 * 10.0**2 / 3, 4 * 20.0**2 * 10.0 / 3),
    ("hollow ellipse", lambda: hollow_ellipse(20.0, 10.0, 14.0, 7.0),
     4 * 20.0 * 10.0**2 / 3 * (1 - 0.7**3), 4 * 20.0**2 * 10.0 / 3 * (1 - 0.7**3)),
])
def test_curved_outlines_are_exact(name, profile, wpl_x, wpl_y):
    # the sides along recorded curves are integrated along the curves (Gauss-Legendre on each
    # stretch above or below the axis, exact to round-off): measured at most 9e-16
    p = plastic_properties(profile())
    assert rel(p.Wpl_x, wpl_x) < RTOL, name
    assert rel(p.Wpl_y, wpl_y) < RTOL, name
    assert abs(p.pna_y) < 1e-12 * wpl_y ** (1 / 3) and abs(p.pna_x) < 1e-12 * wpl_x ** (1 / 3)


def test_turned_ellipse_about_its_principal_axes():
    # the ellipse turned by 30 degrees and shifted: about its own axes the moduli are those of
    # the upright one (4 a^2 b / 3 about the b-axis, axis 1 at -60 degrees, closed forms as
    # above), the neutral axes through its centre
    a, b = 20.0, 10.0
    p = plastic_properties(ellipse(a, b).moved(angle_deg=30.0, shift=(3.0, 4.0)), alpha_deg=-60.0)
    assert rel(p.Wpl_1, 4 * a * a * b / 3) < RTOL and rel(p.Wpl_2, 4 * a * b * b / 3) < RTOL
    assert abs(p.pna_x - 3.0) < 1e-12 * a and abs(p.pna_y - 4.0) < 1e-12 * a


# ------------------------------------------------------------------------ plastic moments


def test_plastic_moment_one_material_is_fy_times_wpl():
    # exact geometry: with one yield strength Mpl = fy Wpl (fy from the built-in table)
    s = builtin_material("steel-S235")
    p = analyse(rectangle(30.0, 12.0), materials=s).plastic
    assert rel(p.Mpl_x, s.fy * p.Wpl_x) < RTOL
    assert rel(p.Mpl_y, s.fy * p.Wpl_y) < RTOL
    assert rel(p.Mpl_1, s.fy * p.Wpl_1) < RTOL and rel(p.Mpl_2, s.fy * p.Wpl_2) < RTOL


def test_plastic_moment_two_materials_stacked():
    # Hand calculation (exact geometry): b x h1 of fy1 under b x h2 of fy2, y from the bottom.
    # Force balance with the PNA in the lower block: fy1 b yp = fy1 b (h1 - yp) + fy2 b h2,
    # so yp = (fy1 h1 + fy2 h2) / (2 fy1) (7.80 < h1 here), and
    # Mpl_x = fy1 b yp^2 / 2 + fy1 b (h1 - yp)^2 / 2 + fy2 b h2 (h1 - yp + h2 / 2).
    # About the vertical axis of symmetry: Mpl_y = (fy1 h1 + fy2 h2) b^2 / 4.
    b, h1, h2, fy1, fy2 = 40.0, 12.0, 8.0, 355.0, 160.0
    lower = np.array([[0, 0], [b, 0], [b, h1], [0, h1]], float)
    upper = np.array([[0, h1], [b, h1], [b, h1 + h2], [0, h1 + h2]], float)
    prof = profile_from_loops([lower, upper], materials=["steel", "alu"])
    assert [r.material for r in prof.regions] == ["steel", "alu"]
    steel = make_material("steel", 210000.0, 0.3, fy=fy1)
    alu = make_material("alu", 70000.0, 0.33, fy=fy2)
    yp = (fy1 * h1 + fy2 * h2) / (2 * fy1)
    assert yp < h1
    Mx = fy1 * b * yp**2 / 2 + fy1 * b * (h1 - yp) ** 2 / 2 + fy2 * b * h2 * (h1 - yp + h2 / 2)
    My = (fy1 * h1 + fy2 * h2) * b**2 / 4
    res = analyse(prof, materials=[steel, alu])
    assert rel(res.plastic.Mpl_x, Mx) < RTOL
    assert rel(res.plastic.Mpl_y, My) < RTOL
    v = values(res)
    assert rel(v["Mpl_x"], Mx) < RTOL and rel(v["Mpl_y"], My) < RTOL
    # the geometric moduli and PNA stay those of the area (halving it), whatever fy is
    assert rel(res.plastic.Wpl_x, b * (h1 + h2) ** 2 / 4) < RTOL
    assert abs(res.plastic.pna_y - (h1 + h2) / 2) < RTOL * (h1 + h2)


def test_plastic_moment_insert():
    # A steel core inside an aluminium ring (insert), both N-gons with the same vertex
    # angles: the PNA is the diameter, so Mpl = fy_ring Wpl(ring) + fy_core Wpl(core) with
    # the N-gon moduli of the module docstring (exact geometry).
    D, d, n = 40.0, 24.0, 256
    prof = profile_from_loops([ellipse_points(D / 2, D / 2, n), ellipse_points(d / 2, d / 2, n)],
                              materials=["ring", "core"])
    ring = make_material("ring", 70000.0, 0.33, fy=160.0)
    core = make_material("core", 210000.0, 0.3, fy=355.0)
    mats = [{"ring": ring, "core": core}[r.material] for r in prof.regions]
    p = plastic_properties(prof, fy=[m.fy for m in mats])
    k = ngon_factor(n)
    exact = ring.fy * (D**3 - d**3) / 6 * k + core.fy * d**3 / 6 * k
    assert rel(p.Mpl_x, exact) < RTOL and rel(p.Mpl_y, exact) < RTOL
    assert abs(p.pna_y) < RTOL * D and abs(p.pna_x) < RTOL * D


def test_no_plastic_moment_without_every_fy():
    # a region without a yield strength (the polyamide has none): no plastic moment at all
    lower = np.array([[0, 0], [10, 0], [10, 2], [0, 2]], float)
    prof = profile_from_loops([lower, lower + [0.0, 2.0]], materials=["a", "b"])
    res = analyse(prof, materials=[builtin_material("steel-S235"),
                                   builtin_material("polyamide-PA66-GF25")])
    assert res.plastic.Mpl_x is None and res.plastic.Mpl_y is None
    assert math.isnan(values(res)["Mpl_x"])
    assert rel(res.plastic.Wpl_x, 10 * 4**2 / 4) < RTOL  # the geometric modulus is still there


@pytest.mark.parametrize("segments", [32, 256])
def test_half_ellipse_neutral_axis_off_the_centre(segments):
    # the half ellipse x^2/a^2 + y^2/b^2 <= 1, y >= 0 (flat side down), its curve recorded: the
    # PNA cuts the curve off the axes, where the sides are split at their crossings. In the
    # frame where the ellipse is the unit circle, the segment above y = c b has the area
    # a b (acos c - c sqrt(1 - c^2)) and the first moment (2/3) a b^2 (1 - c^2)^(3/2) (the
    # circular segment, any table of plane areas, scaled by a and b); c from A_up = pi a b / 4
    # (scipy.optimize.brentq). Exact geometry: only round-off is left (measured 9e-16), at any
    # number of chords.
    from scipy.optimize import brentq

    from warpwise.geometry import EllipseArc

    a, b = 20.0, 10.0
    t = np.linspace(0.0, np.pi, segments + 1)
    loop = np.column_stack([a * np.cos(t), b * np.sin(t)])
    p = plastic_properties(profile_from_loops([loop], arcs=[EllipseArc(0.0, 0.0, a, b, 0.0, 0.0, np.pi)]))

    def up(c):
        return a * b * (math.acos(c) - c * math.sqrt(1 - c * c)), 2 / 3 * a * b * b * (1 - c * c) ** 1.5

    c = brentq(lambda c: up(c)[0] - math.pi * a * b / 4, 0.0, 1.0, xtol=1e-15)
    yp = c * b
    a_up, m_up = up(c)
    area, moment = math.pi * a * b / 2, 2 * a * b * b / 3  # the half ellipse, centroid 4 b / (3 pi)
    wpl_x = (m_up - yp * a_up) + (yp * (area - a_up) - (moment - m_up))
    assert abs(p.pna_y - yp) < 1e-12 * b
    assert rel(p.Wpl_x, wpl_x) < RTOL
    assert rel(p.Wpl_y, 4 * a * a * b / 3 / 2) < RTOL  # half of the ellipse's 4 a^2 b / 3
