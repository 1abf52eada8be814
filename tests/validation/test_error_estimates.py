"""The error estimate is honest: the true error lies within a factor of 3 of the estimate.

:func:`warpwise.accuracy.estimate_errors` solves each profile on three meshes (refinement r,
r sqrt(2), 2 r), measures the observed rate and extrapolates (Richardson). Here the estimated
relative error of the value reported at r is set against the true relative error, known from a
closed form, at each accuracy setting (draft, normal, fine).

What the estimate can and cannot see (decides which shapes are meaningful):

- It measures the discretisation error on the meshed outline. On straight-sided polygons
  (rectangles, the equilateral triangle) the meshed outline is the profile, so the closed form
  is the exact reference and the error is pure discretisation error: the main checks.
- The ellipse is recorded as a curve and followed by the mesh (curved element edges), like the
  circles of the tube: its closed form is the exact reference.
- The tube follows its circles with curved element edges; psi = 0, so J_h is Ip of the meshed
  domain, short of the circle by (pi / n)^4 / 15 for n curved edges per circle. The estimate
  measures those edges against the circles on every mesh (warpwise.properties.geometry_error)
  and so sees that deficit, which no interior refinement changes.

"Converged": where both the true and the estimated error are below CONVERGED = 2e-9 the pair is
accepted without a ratio (round-off is 1e-15 ... 1e-13 here; the largest geometry floor is the
tube's 1.5e-9, hence 2e-9 rather than 1e-9). Where only one of them is below it, the check fails.

Factor 3 (the acceptance criterion of the issue): measured ratios true / estimate, per
draft / normal / fine, are given beside each case; all lie in 0.49 ... 1.07, so the estimate
errs on the safe side where it errs at all.
"""

import numpy as np
import pytest

from support.warping_series import series_omega_max
from warpwise.geometry.shapes import ellipse, polygon, rectangle, tube
from warpwise.properties.accuracy import ACCURACY_LEVELS, estimate_errors

#: Both errors below this: converged (see the module docstring).
CONVERGED = 2e-9
#: Allowed factor between the true and the estimated error.
FACTOR = 3.0


def rectangle_J(bx: float, by: float, terms: int = 2000) -> float:
    """J of a solid bx x by rectangle by the series solution.

    Timoshenko & Goodier, Theory of Elasticity, 3rd ed., ch. 10, "Torsion of Rectangular Bars"
    (from memory), for full sides a >= b: J = a b^3 / 3 [1 - (192 / pi^5) (b / a)
    sum_{n odd} tanh(n pi a / (2 b)) / n^5]; 2000 odd terms leave a truncation below 1e-15.
    """
    a, b = max(bx, by), min(bx, by)
    n = 2.0 * np.arange(terms) + 1.0
    s = np.sum(np.tanh(n * np.pi * a / (2.0 * b)) / n**5)
    return float(a * b**3 / 3.0 * (1.0 - 192.0 / np.pi**5 * (b / a) * s))


def rectangle_Cw(bx: float, by: float, terms: int = 2000) -> float:
    """Cw = int psi^2 dA of a solid bx x by rectangle, from the series warping function.

    Half-sides a = bx / 2, b = by / 2, centred at the shear centre (two symmetry axes, so psi
    is odd and has zero mean, omega = psi). The warping function of Timoshenko & Goodier's
    series solution (ch. 10, "Torsion of Rectangular Bars", from memory), written for this
    package's convention d(psi)/dn = y n_x - x n_y, is
    psi = x y + sum_{n odd} c_n sin(k_n x) sinh(k_n y), k_n = n pi / (2 a),
    c_n cosh(k_n b) = d_n = -4 (-1)^((n-1)/2) / (a k_n^3)
    (x y meets the condition on x = +-a; the sum is harmonic, has psi_x = 0 on x = +-a and
    cancels the 2 x excess on y = +-b through the sine series of x on (-a, a), coefficients
    beta_n = 2 (-1)^((n-1)/2) / (a k_n^2)). Squaring and integrating term by term (the sines
    are orthogonal on (-a, a), int sin^2 = a) gives, with t_n = tanh(k_n b),
    Cw = 4 a^3 b^3 / 9 + 4 a sum d_n beta_n (b / k_n - t_n / k_n^2)
         + a sum d_n^2 (t_n / k_n - b (1 - t_n^2))
    (derived here; common practice, no source). The terms fall as n^-6, so 2000 terms leave
    round-off only. Cross-check: the 1:1, 2:1 and 5:1 finite-element Cw at refine 4 agree to
    4.7e-6, 3.0e-7 and 2.6e-7 and converge towards it.
    """
    a, b = bx / 2.0, by / 2.0
    n = 2.0 * np.arange(terms) + 1.0
    k = n * np.pi / (2.0 * a)
    sign = np.where((n - 1) % 4 == 0, 1.0, -1.0)
    beta = 2.0 * sign / (a * k**2)
    d = -4.0 * sign / (a * k**3)
    t = np.tanh(k * b)
    return float(4.0 * a**3 * b**3 / 9.0 + 4.0 * a * np.sum(d * beta * (b / k - t / k**2))
                 + a * np.sum(d * d * (t / k - b * (1.0 - t * t))))


def triangle_points(side: float) -> np.ndarray:
    """Equilateral triangle with its centroid at the origin and the x axis a symmetry axis."""
    height = side * np.sqrt(3.0) / 2.0
    return np.array([[2.0 * height / 3.0, 0.0], [-height / 3.0, -side / 2.0],
                     [-height / 3.0, side / 2.0]])


def triangle_J_Cw(side: float) -> tuple[float, float]:
    """J and Cw of the equilateral triangle of ``triangle_points``.

    J = sqrt(3) s^4 / 80 (Timoshenko & Goodier, 3rd ed., ch. 10, "Other Elementary Solutions",
    from memory). The warping function there is a harmonic cubic; in this orientation (height
    h, side x = -h/3) psi = (y^3 - 3 x^2 y) / (2 h) (checked here: d(psi)/dn = -psi_x = y on
    x = -h/3 as required, the other sides follow by the three-fold symmetry; the finite-element
    psi agrees to 2e-7 s^2 at refine 4). It is odd in y, so its mean is zero and the shear
    centre is the centroid, omega = psi, and Cw = int psi^2 dA = s^6 / (13440 sqrt 3)
    = sqrt(3) s^6 / 40320 (integrated here by an exact Gauss rule on the triangle; common
    practice, no source).
    """
    return np.sqrt(3.0) * side**4 / 80.0, np.sqrt(3.0) * side**6 / 40320.0


def true_errors(estimate, exact: dict[str, float], size: float) -> dict[str, float]:
    """True relative errors of the reported values, scaled as the estimator scales them.

    J, Cw relative to the exact value; shear centre coordinates relative to the profile size;
    a Cw that is exactly zero (tube) relative to the estimator's floor scale 1e-6 Ip size^2.
    """
    res = estimate.result
    values = {"J": res.torsion.J, "Cw": res.torsion.Cw,
              "xs": res.torsion.shear_centre[0], "ys": res.torsion.shear_centre[1]}
    out = {}
    for key, ref in exact.items():
        if key in ("xs", "ys"):
            scale = size
        elif key == "Cw":
            scale = max(abs(ref), 1e-6 * res.geometric.Ip * size**2)
        else:
            scale = abs(ref)
        out[key] = abs(values[key] - ref) / scale
    return out


def check_honest(estimate, exact: dict[str, float], size: float) -> dict[str, tuple]:
    """Assert the factor-3 rule (or joint convergence) for every quantity with a reference."""
    true = true_errors(estimate, exact, size)
    seen = {}
    for key, t in true.items():
        e = estimate.relative_error[key]
        seen[key] = (t, e)
        if t < CONVERGED and e < CONVERGED:
            continue  # converged: both at round-off or at the geometry floor
        assert e > 0 and 1.0 / FACTOR <= t / e <= FACTOR, (key, t, e, estimate.nodes)
    return seen


SIDE = 10.0


# Measured true / estimated (draft, normal, fine), nodes of the first mesh 585 ... 8245:
#   1:1  J 1.04 1.04 1.02, Cw 1.05 1.08 0.98 (true J 5.3e-5, 3.9e-6, 3.4e-7)
#   2:1  J 1.03 0.97 0.99, Cw 1.04 0.88 0.98 (true J 5.3e-5, 4.0e-6, 3.4e-7)
#   5:1  J 0.90 0.97 0.90, Cw 0.79 0.97 1.02 (true J 4.4e-5, 5.9e-6, 4.8e-7)
# (On the earlier default mesh of 0.125 sqrt(A), right angles ungraded, the 5:1 J at normal
# and fine was over-estimated about twice: a low observed rate across three unstructured
# meshes.) Shear centre: exactly the centre by symmetry; true and estimated coordinates
# errors are round-off (<= 1.3e-14): converged.
@pytest.mark.parametrize("level", list(ACCURACY_LEVELS))
@pytest.mark.parametrize("ratio", [1, 2, 5])
def test_rectangle_estimates(ratio, level):
    bx, by = ratio * SIDE, SIDE
    est = estimate_errors(rectangle(bx, by), refine=ACCURACY_LEVELS[level])
    exact = {"J": rectangle_J(bx, by), "Cw": rectangle_Cw(bx, by), "xs": 0.0, "ys": 0.0}
    seen = check_honest(est, exact, max(bx, by))
    # the discretisation errors are real here (not converged: at least 50 times CONVERGED,
    # smallest measured J 3.4e-7, Cw 1.9e-7), so the ratio rule was applied
    assert seen["J"][0] > 50 * CONVERGED and seen["Cw"][0] > 50 * CONVERGED


# Measured true / estimated (draft, normal, fine), first meshes 579, 2137, 8487 nodes:
#   J  1.01 1.01 1.00 (true 2.2e-5, 1.5e-6, 8.6e-8)
#   Cw 1.04 1.00 1.02 (true 4.0e-5, 1.7e-6, 8.4e-8)
#   xs 1.03 1.02 0.99 (true 2.7e-7, 1.3e-8, 3.4e-10 of the side; the shear centre lies on the
#      symmetry axis, its position along it is a real discretisation error)
#   ys round-off (mirror-symmetric mesh): converged.
@pytest.mark.parametrize("level", list(ACCURACY_LEVELS))
def test_equilateral_triangle_estimates(level):
    side = 30.0
    est = estimate_errors(polygon(triangle_points(side)), refine=ACCURACY_LEVELS[level])
    J, Cw = triangle_J_Cw(side)
    seen = check_honest(est, {"J": J, "Cw": Cw, "xs": 0.0, "ys": 0.0}, side)
    # a real error (above round-off by five orders even at fine, where it falls below
    # CONVERGED), and the factor-3 rule holds for it all the same
    t, e = seen["xs"]
    assert t > 1e-10 and 1.0 / FACTOR <= t / e <= FACTOR, seen["xs"]


# The ellipse against Saint-Venant's closed form (Timoshenko & Goodier, 3rd ed., ch. 10,
# "Elliptic Cross Section", from memory): J = pi a^3 b^3 / (a^2 + b^2), the mesh following the
# recorded ellipse drawn with 64 vertices. Measured true / estimated J error (draft, normal,
# fine): 3.19e-7 / 3.10e-7 (1.03), 3.32e-7 / 3.00e-7 (1.11), 2.24e-8 / 2.23e-8 (1.00): nearly
# all of it is the curved edges' (-k x y is in the quadratic space), which the estimate measures
# against the ellipse on each mesh. With 256 vertices both fall below CONVERGED (1.45e-9).
@pytest.mark.parametrize("level", list(ACCURACY_LEVELS))
def test_ellipse_estimates(level):
    a, b = 20.0, 10.0
    est = estimate_errors(ellipse(a, b, segments=64), refine=ACCURACY_LEVELS[level])
    J = np.pi * a**3 * b**3 / (a * a + b * b)
    seen = check_honest(est, {"J": J, "xs": 0.0, "ys": 0.0}, 2 * a)
    assert seen["J"][0] > CONVERGED  # resolvable: the ratio rule was applied


# Measured: true J error 1.512e-9 at draft and normal (the curved-edge floor (pi / 256)^4 / 15,
# every chord one curved edge), 9.45e-11 at fine (each chord split in two: the floor / 16);
# the estimate, which measures the curved edges against the circles on each mesh
# (warpwise.properties.geometry_error), gives 1.512e-9 (1.00), 1.512e-9 (1.00) and
# 9.45e-11 (1.00): the three meshes' corrected J agree to round-off. Cw about 5e-25 (round-off of
# zero) and the shear centre (round-off): converged.
@pytest.mark.parametrize("level", list(ACCURACY_LEVELS))
def test_tube_estimates_see_the_curved_edges(level):
    D, d, segments = 40.0, 30.0, 256
    est = estimate_errors(tube(D, d, segments=segments), refine=ACCURACY_LEVELS[level])
    J = np.pi * (D**4 - d**4) / 32.0  # Roark, torsion table, hollow concentric circle (from memory)
    seen = check_honest(est, {"J": J, "Cw": 0.0, "xs": 0.0, "ys": 0.0}, D)
    # psi = 0 on a tube, so the true J error is the curved-edge deficit of Ip and nothing else:
    # (pi / n)^4 / 15 for n curved edges per circle (test_torsion_closed_forms); the boundary is
    # split with the refinement factor, so fine has twice the chords' edges
    pieces = max(1, round(ACCURACY_LEVELS[level]))
    floor = (np.pi / (segments * pieces)) ** 4 / 15.0
    assert seen["J"][0] == pytest.approx(floor, rel=1e-3)
    # the estimate sees it although no interior refinement could (factor 3 rule: check_honest)
    assert est.relative_error["J"] == pytest.approx(floor, rel=1e-2)


def test_estimate_sees_curved_edge_error():
    # Tube with 64 chords per circle at draft: the three estimate meshes (refine 0.5, 0.71, 1)
    # all keep every chord as one curved edge, so J is the same on all three; the true error
    # (the curved-edge deficit, psi = 0) is 3.87e-7, and the estimate finds it by measuring the
    # edges against the circles (before this measure it was 1.7e-16). Reference: Roark, hollow
    # concentric circle (from memory).
    D, d = 40.0, 30.0
    est = estimate_errors(tube(D, d, segments=64), refine=ACCURACY_LEVELS["draft"])
    seen = check_honest(est, {"J": np.pi * (D**4 - d**4) / 32.0}, D)
    assert seen["J"][0] > 1e-7  # resolvable: the ratio rule was applied


# omega_max, the largest |omega| over the elements, against the rectangle's series
# (tests/support/warping_series.py: Timoshenko & Goodier). Its estimate is the spread of the
# three meshes' values (a largest value moves between elements: no power law to fit).
# Measured true / estimated (draft, normal, fine): 1:1 0.84 0.62 0.83 (true 7.4e-4, 1.5e-4,
# 3.7e-5), 2:1 0.89 0.64 0.96 (true 3.3e-4, 4.2e-5, 2.3e-5), 5:1 1.09 0.80 0.66 (true 1.5e-4,
# 1.2e-5, 3.0e-6).
@pytest.mark.parametrize("ratio, level", [(r, lv) for r in (1, 2, 5) for lv in ACCURACY_LEVELS])
def test_omega_max_estimates(ratio, level):
    bx, by = ratio * 2 * SIDE, 2 * SIDE
    est = estimate_errors(rectangle(bx, by), refine=ACCURACY_LEVELS[level])
    true = abs(est.result.torsion.omega_max / series_omega_max(bx / 2, by / 2) - 1.0)
    e = est.relative_error["omega_max"]
    assert true > 1e-6  # resolvable: the ratio rule applies
    assert 1.0 / FACTOR <= true / e <= FACTOR, (true, e, est.nodes)
