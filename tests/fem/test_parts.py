"""Separate parts analysed as one section: one pinned node per part, J summed, Cw and shear centre.

Sources:
- J of a b x t rectangle: the series solution of Timoshenko & Goodier, Theory of Elasticity,
  3rd ed., sec. 109, J = b t^3 / 3 (1 - 192 t / (pi^5 b) sum_odd tanh(n pi b / 2t) / n^5).
  J of separate parts is the sum of their J (each part twists with its own warping and its own
  free constant; common practice, no source). The finite-element J is an upper bound and
  J_low (the equilibrated flux here) a lower bound of the meshed domain (bounds.py), so the sum must
  lie between them: that is the tightest honest check at a finite mesh.
- Cw and the shear centre of two flanges kept in shape and free to slide along each other: each
  flange bends about its own centroid as the pair twists, as the flanges of an I-section do:
  Cw = h^2 I1 I2 / (I1 + I2) plus the flanges' own warping, shear centre at h I2 / (I1 + I2)
  from flange 1 (Timoshenko & Gere, Theory of Elastic Stability, 2nd ed., sec. 5.10, the
  I-beam with unequal flanges; from memory). The bending part is a polynomial of degree 2 that
  the P2 elements and the degree-4 quadrature hold exactly, so it is checked to round-off
  (1e-8, the solve's residual times the condition number).
"""

import numpy as np
import pytest
import scipy.sparse as sp

from warpwise import analyse
from warpwise.fem.solve import PinnedSolver, connected_parts
from warpwise.io import parse_outline

H = 0.4  # mesh size: J of a 10 x 2 rectangle within 2e-4 of the series (measured)


def rect(x0, y0, b, t):
    return f"{x0} {y0}\n{x0 + b} {y0}\n{x0 + b} {y0 + t}\n{x0} {y0 + t}\n"


def series_j(b, t, terms=400):
    # Timoshenko & Goodier, sec. 109 (b >= t)
    n = np.arange(1, 2 * terms, 2)
    return b * t**3 / 3 * (1 - 192 / np.pi**5 * t / b * np.sum(np.tanh(n * np.pi * b / (2 * t)) / n**5))


def section(*loops, **kw):
    return analyse(parse_outline("\n".join(loops), source="parts.txt", all_parts=True),
                   mesh_size=H, **kw)


def test_connected_parts_of_a_block_matrix():
    k = sp.csr_matrix(np.array([[1.0, -1.0], [-1.0, 1.0]]))
    count, labels = connected_parts(sp.block_diag([k, k, k]))
    assert count == 3 and labels.tolist() == [0, 0, 1, 1, 2, 2]


def test_pinned_solver_pins_one_node_per_part_and_keeps_the_given_one():
    k = sp.csr_matrix(np.array([[1.0, -1.0], [-1.0, 1.0]]))
    s = PinnedSolver(sp.block_diag([k, k, k]).tocsr(), pinned=3)
    assert s.n_parts == 3 and s.pins.tolist() == [0, 3, 4]
    # each part's load sums to zero: K x = f holds exactly at every node
    f = np.array([-1.0, 1.0, 2.0, -2.0, 0.5, -0.5])
    x = s.solve(f)
    assert x.tolist() == [0.0, 1.0, 2.0, 0.0, 0.0, -0.5]
    assert s.residual(x, f) == 0.0


def test_two_rectangles_far_apart_j_is_the_sum_of_the_series():
    r = section(rect(0, 0, 10, 2), rect(0, 50, 10, 2), bounds=True)
    assert r.solver.n_parts == 2
    exact = 2 * series_j(10, 2)
    assert r.torsion.J_low <= exact <= r.torsion.J
    assert r.torsion.J == pytest.approx(exact, rel=2e-4)  # the mesh's own error (measured 1.1e-4)


def test_many_separate_parts_factorise_and_sum():
    # 30 squares of 2 x 2 on a grid: before, the matrix with one pin was singular
    squares = [rect(10 * i, 10 * j, 2, 2) for i in range(6) for j in range(5)]
    r = section(*squares, bounds=True)
    assert r.solver.n_parts == 30
    exact = 30 * series_j(2, 2)  # J of a square = 0.1406 a^4 (Timoshenko & Goodier, sec. 109)
    assert exact == pytest.approx(30 * 0.1406 * 16, rel=1e-3)
    assert r.torsion.J_low <= exact <= r.torsion.J
    # a 2 x 2 square at mesh size 0.4 is five elements across: measured 6.3e-4 above the series
    assert r.torsion.J == pytest.approx(exact, rel=1e-3)


def test_warping_has_zero_mean_on_each_part():
    r = section(rect(0, 0, 10, 2), rect(3, 40, 4, 3))
    from warpwise.fem.p2 import interpolate

    part = r.solver.labels[r.mesh.elements[:, 0]]
    for field in (r.torsion.psi, r.torsion.omega):
        means = np.bincount(part, weights=(interpolate(r.mesh, r.basis, field) * r.basis.dA).sum(1))
        scale = np.abs(field).max() * r.geometric.A
        assert np.abs(means).max() <= 1e-12 * scale  # round-off


def test_unequal_flanges_shear_centre_and_cw():
    # flange 1: 20 x 2 at y 0..2, flange 2: 10 x 2 at y 50..52, both centred on x = 0; h = 50
    t, b1, b2, h = 2.0, 20.0, 10.0, 50.0
    pair = section(rect(-10, 0, b1, t), rect(-5, 50, b2, t))
    own = [section(rect(-10, 0, b1, t)).torsion.Cw, section(rect(-5, 50, b2, t)).torsion.Cw]
    I1, I2 = t * b1**3 / 12, t * b2**3 / 12
    xs, ys = pair.torsion.shear_centre
    assert xs == pytest.approx(0.0, abs=1e-9 * h)
    # not quite round-off: each flange's own warping (not a polynomial) is discretised on a
    # mesh that is not mirror-symmetric about the flange's mid-plane, which moves ys by 1.9e-9
    # relative (measured with the right-angled corners graded; 6.4e-11 without)
    assert ys == pytest.approx(1.0 + h * I2 / (I1 + I2), rel=5e-9)
    # the flanges' own warping enters as computed alone on the same mesh size
    bending = pair.torsion.Cw - sum(own)
    assert bending == pytest.approx(h**2 * I1 * I2 / (I1 + I2), rel=1e-3)


def test_equal_flanges_cw_is_if_h2_over_2_to_round_off():
    lower, upper = section(rect(0, 0, 10, 2)), section(rect(0, 50, 10, 2))
    pair = section(rect(0, 0, 10, 2), rect(0, 50, 10, 2))
    If = 2 * 10**3 / 12
    bending = pair.torsion.Cw - lower.torsion.Cw - upper.torsion.Cw
    assert bending == pytest.approx(If * 50**2 / 2, rel=1e-7)
    assert pair.torsion.shear_centre == pytest.approx((5.0, 26.0), abs=1e-9)


def test_one_part_is_unchanged():
    # a single part: the per-part rule is the usual one (the same numbers as before, to round-off)
    r = section(rect(0, 0, 10, 2))
    assert r.solver.n_parts == 1 and r.solver.pins.tolist() == [r.solver.pinned]
    assert r.torsion.J == pytest.approx(series_j(10, 2), rel=2e-4)
    assert np.isfinite(r.shear.As_x) and r.shear.As_x == pytest.approx(20 * 5 / 6, rel=2e-2)


def test_shear_properties_of_separate_parts_are_not_computed():
    r = section(rect(0, 0, 10, 2), rect(0, 50, 10, 2))
    assert np.isnan([r.shear.As_x, r.shear.As_y, *r.shear.shear_centre]).all()
    assert np.isnan(r.shear.theta_x).all()


def test_stress_refuses_shear_forces_on_separate_parts(tmp_path, cli):
    f = tmp_path / "pair.txt"
    f.write_text(rect(0, 0, 10, 2) + "\n" + rect(0, 50, 10, 2))
    code, out, err = cli("stress", f, "--all-parts", "--shear-y", "1000")
    assert code == 2 and out == ""
    assert err.strip() == (f"warpwise: error: {f}: shear forces on 2 separate parts taken as one "
                           "section are not computed (the parts would need joining along the bar): "
                           "analyse one part with --part N")
