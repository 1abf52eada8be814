"""The six-node triangle on its own: nodality, partition of unity, derivatives, quadrature.

Properties of the quadratic Lagrange triangle (Zienkiewicz & Taylor, The Finite Element Method,
vol. 1, the six-node triangle in area coordinates); the finite-difference check follows
scikit-fem's tests/test_elements.py (derivatives against central differences).
"""

import numpy as np
import pytest

from warpwise.fem.p2 import DEGREE_4, NODE_POINTS, element_values, integrate, shape_functions
from warpwise.geometry.shapes import rectangle
from warpwise.mesh.core import build_mesh


def test_nodality():
    # N_i(node j) = delta_ij at the six nodes (corners, then mid-sides of (0,1), (1,2), (2,0))
    N, _ = shape_functions(NODE_POINTS)
    np.testing.assert_allclose(N, np.eye(6), atol=1e-15)


def test_partition_of_unity_and_zero_gradient_sum():
    rng = np.random.default_rng(3)
    pts = rng.random((50, 2))
    pts = pts[pts.sum(axis=1) <= 1.0]
    N, dN = shape_functions(pts)
    np.testing.assert_allclose(N.sum(axis=1), 1.0, atol=1e-14)
    np.testing.assert_allclose(dN.sum(axis=1), 0.0, atol=1e-13)


def test_derivatives_against_central_differences():
    # central differences of a quadratic are exact up to round-off: step 1e-4 gives about
    # 1e-12 (round-off of N / h), so the bound 1e-9 is safe and still catches any wrong term
    pts = np.array([[0.2, 0.3], [0.1, 0.7], [0.6, 0.2], [1 / 3, 1 / 3]])
    _, dN = shape_functions(pts)
    h = 1e-4
    for axis in range(2):
        step = np.zeros(2)
        step[axis] = h
        fd = (shape_functions(pts + step)[0] - shape_functions(pts - step)[0]) / (2 * h)
        np.testing.assert_allclose(dN[:, :, axis], fd, atol=1e-9)


@pytest.mark.parametrize("p,q", [(0, 0), (1, 0), (0, 1), (2, 1), (1, 3), (0, 4), (2, 2)])
def test_quadrature_exact_to_degree_four(p, q):
    # int over the reference triangle of xi^p eta^q = p! q! / (p + q + 2)! (exact)
    from math import factorial

    exact = factorial(p) * factorial(q) / factorial(p + q + 2)
    x, y = DEGREE_4.points[:, 0], DEGREE_4.points[:, 1]
    assert float(np.sum(DEGREE_4.weights * x**p * y**q)) == pytest.approx(exact, rel=1e-13)


def test_element_values_integrate_polynomials_on_a_mesh():
    # on a 20 x 10 rectangle about its centre: A = 200, int x^2 = b^3 h / 12, int x^2 y^2 =
    # b^3 h^3 / 144 (closed forms); quadrature of degree 4 on straight elements is exact, so
    # only round-off remains (bound 1e-12)
    mesh = build_mesh(rectangle(20.0, 10.0), size=2.0)
    ev = element_values(mesh, np.zeros(2))
    x, y = ev.xy[..., 0], ev.xy[..., 1]
    assert integrate(ev, np.ones_like(x)) == pytest.approx(200.0, rel=1e-12)
    assert integrate(ev, x * x) == pytest.approx(20.0**3 * 10.0 / 12.0, rel=1e-12)
    assert integrate(ev, x * x * y * y) == pytest.approx(20.0**3 * 10.0**3 / 144.0, rel=1e-12)
