"""Mesh convergence of J: the observed order against the theory of P2 elements.

For six-node (P2, polynomial degree p = 2) elements the warping function converges in the
energy norm as h^p, and J_h - J is an energy of the error, J_h - J = |psi - psi_h|_E^2
(Galerkin orthogonality), so it converges as h^(2p) = h^4 on a smooth solution (common
practice, no source; e.g. Strang & Fix, An Analysis of the Finite Element Method, ch. 3,
from memory). The observed slope of log |J_h - J| against log h over a few meshes halving h is
asserted against that, as scikit-fem's convergence tests do.

The ellipse is not used: its warping function x y is quadratic and is reproduced exactly on
the inscribed polygon whenever the boundary chords are not split (see
test_torsion_closed_forms), and once they are split the reference would have to be the
polygon's own J, which has no closed form. Polygon-exact shapes are used instead, where the
closed form is the exact J of the meshed domain.
"""

import numpy as np
import pytest

from warpwise.geometry.shapes import polygon, rectangle
from warpwise.properties.analysis import analyse


def rectangle_J(long: float, short: float, terms: int = 2000) -> float:
    """Timoshenko & Goodier, Theory of Elasticity, 3rd ed., ch. 10, "Torsion of Rectangular
    Bars" (from memory): J = a b^3 / 3 [1 - (192 / pi^5) (b / a) sum_{n odd} tanh(n pi a /
    (2 b)) / n^5] for full sides a >= b; 2000 odd terms leave a truncation below 1e-15.
    """
    n = 2.0 * np.arange(terms) + 1.0
    s = np.sum(np.tanh(n * np.pi * long / (2.0 * short)) / n**5)
    return float(long * short**3 / 3.0 * (1.0 - 192.0 / np.pi**5 * (short / long) * s))


def observed_order(profile, exact: float, sizes: list[float]) -> tuple[float, np.ndarray]:
    """Least-squares slope of log |J_h - J| against log h, and the relative errors."""
    errors, used = [], []
    for h in sizes:
        res = analyse(profile, mesh_size=h)
        used.append(res.mesh.size)
        errors.append(res.torsion.J / exact - 1.0)
    errors = np.array(errors)
    slope = float(np.polyfit(np.log(used), np.log(np.abs(errors)), 1)[0])
    return slope, errors


def check_errors(errors: np.ndarray) -> None:
    # J_h >= J on a polygon-exact domain (minimum-energy argument, see
    # test_torsion_closed_forms), and the error must fall at every refinement
    assert np.all(errors > 0.0)
    assert np.all(np.diff(errors) < 0.0)


def test_rectangle_order():
    # 2:1 rectangle, h = b/8 ... b/64. Measured errors 1.26e-5, 1.33e-6, 1.10e-7, 8.87e-9:
    # pairwise slopes 3.25, 3.59, 3.64, fitted 3.50. It sits below 4 because the warping
    # function of a rectangle is not smooth at the corners: the series solution has r^2 log r
    # terms there (from memory), so the error carries a log factor; the mesher grades its
    # right-angled corners (geometry.corners.OBTUSE_RANGE_DEG) at a fixed fraction of h, which
    # makes the coarse meshes far better (at b/4 6.4e-5 where the ungraded mesh had 4.4e-4,
    # with a fitted slope of 3.72 over b/4 ... b/32) and the approach to the asymptotic slope
    # slower. Bounds: fitted 3.4 and last pairwise 3.55, just under the measured values; an
    # upper bound of 4.3 catches a pre-asymptotic or lucky fit.
    b = 10.0
    a = 2.0 * b
    slope, errors = observed_order(rectangle(a, b), rectangle_J(a, b),
                                   [b / 8, b / 16, b / 32, b / 64])
    check_errors(errors)
    assert 3.4 <= slope <= 4.3, (slope, errors)
    assert np.log(errors[-2] / errors[-1]) / np.log(2.0) >= 3.55, errors


def test_equilateral_triangle_order():
    # Equilateral triangle of side a: J = sqrt(3) a^4 / 80 (Timoshenko & Goodier, 3rd ed.,
    # ch. 10, "Other Elementary Solutions", from memory). Its warping function is a cubic, so
    # the solution is smooth and the full h^4 rate should show. h = a/8 ... a/64; measured
    # errors 1.07e-4, 7.16e-6, 4.82e-7, 2.99e-8: pairwise slopes 3.90, 3.89, 4.01, fitted
    # 3.93 (3.92 with the earlier mesher). Bound 3.85, just under the measured fits.
    a = 30.0
    tri = np.array([[0.0, 0.0], [a, 0.0], [a / 2.0, a * np.sqrt(3.0) / 2.0]])
    slope, errors = observed_order(polygon(tri), np.sqrt(3.0) * a**4 / 80.0,
                                   [a / 8, a / 16, a / 32, a / 64])
    check_errors(errors)
    assert 3.85 <= slope <= 4.3, (slope, errors)
    # the finest pair alone is already close to the asymptotic 4
    last = np.log(errors[-2] / errors[-1]) / np.log(2.0)
    assert last == pytest.approx(4.0, abs=0.05)
