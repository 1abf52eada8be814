"""Buckling and torsion constants against closed forms: i0, Wt, the twist per unit torque."""

from __future__ import annotations

import math

import numpy as np
import pytest

from warpwise.geometry.shapes import channel, circle, rectangle, tube
from warpwise.materials import builtin_material
from warpwise.properties.analysis import analyse
from warpwise.report.quantities import values
from warpwise.report.records import record_of


def _rectangle_series(b: float, t: float) -> tuple[float, float]:
    """J and Wt of a solid b x t rectangle (b >= t) by the exact series.

    Timoshenko and Goodier, Theory of Elasticity, 3rd ed., section 109 (torsion of a rectangular
    bar): J = t^3 b / 3 (1 - 192 t / (pi^5 b) sum tanh(n pi b / 2t) / n^5) and
    tau_max = G theta t (1 - 8 / pi^2 sum 1 / (n^2 cosh(n pi b / 2t))), n odd; Roark's
    Formulas for Stress and Strain, Table 10.1 case 4, gives the same values to its 4 figures.
    """
    n = np.arange(1.0, 80.0, 2.0)
    J = t**3 * b / 3 * (1 - 192 * t / (np.pi**5 * b) * np.sum(np.tanh(n * np.pi * b / (2 * t)) / n**5))
    x = n * np.pi * b / (2 * t)
    sech = 2 * np.exp(-x) / (1 + np.exp(-2 * x))  # 1 / cosh without overflow
    k = 1 - 8 / np.pi**2 * np.sum(sech / n**2)
    return float(J), float(J / (k * t))


def test_i0_of_a_rectangle_and_a_tube():
    # shear centre at the centroid (double symmetry), so i0^2 = (Ix + Iy)/A = (b^2 + h^2)/12
    # for a rectangle and (D^2 + d^2)/8 for a tube (closed forms, Roark Table A.1 cases 1
    # and 16 for I and A). Tolerance: exact polygon integrals for the rectangle (round-off);
    # Ip / A of a tube is (D^2 + d^2) / 8; it is meshed on curved edges, its area and Ip exact
    # to the 1e-9 the curved P2 geometry reaches on this mesh (measured 4e-10)
    v = values(analyse(rectangle(60.0, 20.0)))
    assert v["i0"] == pytest.approx(math.sqrt((60.0**2 + 20.0**2) / 12), rel=1e-12)
    assert v["xs0"] == 0.0 and v["ys0"] == 0.0
    v = values(analyse(tube(80.0, 60.0)))
    assert v["i0"] == pytest.approx(math.sqrt((80.0**2 + 60.0**2) / 8), rel=1e-8)


def test_i0_of_a_channel_uses_the_shear_centre_offset():
    # i0^2 = (Ix + Iy)/A + xs0^2 + ys0^2 (Timoshenko and Gere, Theory of Elastic Stability,
    # chapter 5, from memory). A, Ix, Iy of the sharp channel by the rectangle sums (exact);
    # the offset is the analysis' own shear centre; the channel's shear centre lies on its
    # axis of symmetry (ys0 = 0, common practice, no source) and outside the web, on the side
    # away from the flanges (x0 < 0 for flanges towards +x, common practice, no source)
    h, b, tw, tf = 100.0, 50.0, 5.0, 8.0
    res = analyse(channel(h, b, tw, tf))
    v = values(res)
    A = 2 * b * tf + (h - 2 * tf) * tw
    xc = (2 * b * tf * b / 2 + (h - 2 * tf) * tw * tw / 2) / A
    Ix = b * h**3 / 12 - (b - tw) * (h - 2 * tf) ** 3 / 12
    Iy = (2 * tf * b**3 / 3 + (h - 2 * tf) * tw**3 / 3) - A * xc**2
    x0 = res.torsion.shear_centre[0] - res.geometric.centroid[0]
    assert v["ys0"] == 0.0
    assert v["xs0"] == pytest.approx(x0, rel=1e-12) and x0 < -xc
    # exact integrals: the tolerance is round-off of sums of large terms
    assert v["i0"] == pytest.approx(math.sqrt((Ix + Iy) / A + x0**2), rel=1e-10)


def test_wt_of_a_circle_and_a_tube():
    # Wt = pi d^3 / 16 and pi (D^4 - d^4) / (16 D) (Roark, Table 10.1 cases 1 and 10).
    # Curved P2 edges: the recovered boundary stress is exact to 1e-8 here (measured 1.5e-9)
    assert analyse(circle(20.0)).torsion_modulus.Wt == pytest.approx(math.pi * 20.0**3 / 16,
                                                                       rel=1e-8)
    D, d = 80.0, 60.0
    assert analyse(tube(D, d)).torsion_modulus.Wt == pytest.approx(
        math.pi * (D**4 - d**4) / (16 * D), rel=1e-7)


@pytest.mark.parametrize("b,t", [(60.0, 20.0), (20.0, 20.0), (100.0, 10.0)])
def test_wt_of_rectangles(b, t):
    # exact series (Timoshenko and Goodier, Roark Table 10.1 case 4); the largest stress sits
    # at the middle of a long side, recovered from P2 gradients at a node. The recovery error
    # falls as h^2: on the default mesh measured -1.5e-3 (square), 3e-4 (10:1), 2e-5 (3:1);
    # at refine 4, -1e-4, 2e-6, -1e-5, hence 2e-4 there, and the error must shrink with h
    _, Wt = _rectangle_series(b, t)
    coarse = analyse(rectangle(b, t)).torsion_modulus.Wt
    fine = analyse(rectangle(b, t), refine=4.0).torsion_modulus.Wt
    assert fine == pytest.approx(Wt, rel=2e-4)
    assert abs(fine / Wt - 1) < abs(coarse / Wt - 1) or abs(coarse / Wt - 1) < 3e-5


def test_twist_per_torque_in_degrees_in_every_system():
    # theta / T = 1 / (G J) in degrees per metre per N*mm: G = 27000 MPa (the built-in
    # aluminium), J = pi d^4 / 32 (Roark Table 10.1 case 1); in the in system deg/ft per lbf*in
    # (NIST SP 811: inch 0.0254 m, lbf 4.4482216152605 N, exact)
    d = 20.0
    res = analyse(circle(d), materials=builtin_material("aluminium-6063-T6"))
    rec = record_of(res)
    J = math.pi * d**4 / 32
    deg_per_m_per_nmm = math.degrees(1 / (27000.0 * J)) * 1000.0
    assert rec.values["twist_per_torque"] == pytest.approx(deg_per_m_per_nmm, rel=1e-8)
    per_lbf_in = deg_per_m_per_nmm * 0.3048 * 4.4482216152605 * 25.4
    assert rec.in_units("in").values["twist_per_torque"] == pytest.approx(per_lbf_in, rel=1e-8)
    assert math.isnan(values(analyse(circle(d)))["twist_per_torque"])  # no G, no twist
