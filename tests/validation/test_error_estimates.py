"""The error estimate is honest: the true error lies within a factor of 3 of the estimate.

:func:`warpwise.accuracy.estimate_errors` solves each profile on three meshes (refinement r,
r sqrt(2), 2 r), measures the observed rate and extrapolates (Richardson). Here the estimated
relative error of the value reported at r is set against the true relative error, known from a
closed form, at each accuracy setting (draft, normal, fine).

What the estimate can and cannot see (decides which shapes are meaningful):

- It measures the discretisation error on the meshed outline. On straight-sided polygons
  (rectangles, the equilateral triangle) the meshed outline is the profile, so the closed form
  is the exact reference and the error is pure discretisation error: the main checks.
- The ellipse is a 256-gon. At every mesh the estimate uses, no boundary chord is split, and then
  the quadratic warping function -k x y is the exact discrete solution on the polygon (P2
  contains it; see test_torsion_closed_forms): J_h is the closed form applied to the polygon,
  rho_N J, to round-off, and all three meshes agree. Both errors are round-off: "converged".
  The 2e-4 by which the 256-gon falls short of the true ellipse is the user's geometry, not a
  discretisation error, and is rightly not part of the estimate.
- The tube (curved element edges) has psi = 0, so J_h is Ip of the meshed domain, short of the
  circle by (pi / N)^4 / 15 = 1.5e-9 at N = 256 chords (see test_torsion_closed_forms). No mesh
  of the estimate splits a chord, so the estimate sees no change (1e-15); the true error is the
  fixed 1.5e-9 geometry floor: both "converged". The same blind spot at a visible size (64
  chords, draft) is recorded as an expected failure below.

"Converged": where both the true and the estimated error are below CONVERGED = 2e-9 the pair is
accepted without a ratio (round-off is 1e-15 ... 1e-13 here; the largest geometry floor is the
tube's 1.5e-9, hence 2e-9 rather than 1e-9). Where only one of them is below it, the check fails.

Factor 3 (the acceptance criterion of the issue): measured ratios true / estimate, per
draft / normal / fine, are given beside each case; all lie in 0.49 ... 1.07, so the estimate
errs on the safe side where it errs at all.
"""

import numpy as np
import pytest

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


def regular_polygon_factor(segments: int) -> float:
    """Ratio of Ix (= Iy) of the inscribed regular N-gon to that of its circle.

    N R^4 sin(t) (2 + cos t) / 24 against pi R^4 / 4, t = 2 pi / N (sum over the N triangles
    from the centre; common practice, no source; as in test_torsion_closed_forms). The ellipse
    polygon is the affine image of the N-gon, so Ix, Iy and, with the exact discrete psi = -k x y,
    J = (1 - k^2)(Ix + Iy) all scale by this ratio.
    """
    t = 2.0 * np.pi / segments
    return segments * np.sin(t) * (2.0 + np.cos(t)) / (6.0 * np.pi)


def regular_polygon_x2y2(segments: int) -> float:
    """int X^2 Y^2 dA over the regular N-gon of unit circumradius (N not dividing 4).

    The fourth moments are isotropic, int r^4 = 8 int X^2 Y^2, and int r^4 dA over the N
    triangles is N p^6 / 6 * int sec^6 over |phi| < pi / N, p = cos(pi / N) (common practice, no
    source; as in test_shear_centre_warping).
    """
    p, t = np.cos(np.pi / segments), np.tan(np.pi / segments)
    return segments * p**6 * (t + 2 * t**3 / 3 + t**5 / 5) / 24.0


def ellipse_J_Cw(a: float, b: float, segments: int) -> tuple[float, float]:
    """J and Cw of the N-gon inscribed in the ellipse (vertices at equal parameter steps).

    Timoshenko & Goodier, 3rd ed., ch. 10, "Elliptic Cross Section" (from memory):
    J = pi a^3 b^3 / (a^2 + b^2) and psi = -k x y, k = (a^2 - b^2) / (a^2 + b^2), so
    Cw = k^2 int x^2 y^2 dA; on the polygon (where -k x y is the exact discrete solution while
    no chord is split) J -> rho_N J and int x^2 y^2 dA = a^3 b^3 int X^2 Y^2 dA(N-gon).
    """
    k = (a * a - b * b) / (a * a + b * b)
    J = np.pi * a**3 * b**3 / (a * a + b * b) * regular_polygon_factor(segments)
    return float(J), float(k * k * a**3 * b**3 * regular_polygon_x2y2(segments))


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


# Measured: estimated J error 1.2e-15 ... 2.9e-14, Cw 1.7e-14 ... 2.3e-14; true errors against
# the polygon's closed form of the same order; all converged. At draft and normal the three
# meshes of each estimate (2737 ... 8025 nodes) keep all 256 chords unsplit, which is what
# makes -k x y exact (were a chord split, J would move by about 1e-7 and the 1e-12 check below
# would fail). At fine the estimate's finer meshes (elements of 0.0156 sqrt(A) and less) split
# chords near the ends of the major axis: J moves by 1.4e-7 towards the polygon's own
# solution, which has no closed form, so fine has no exact reference here and is left out.
@pytest.mark.parametrize("level", ["draft", "normal"])
def test_ellipse_estimates_converged(level):
    a, b, segments = 20.0, 10.0, 256
    est = estimate_errors(ellipse(a, b, segments=segments), refine=ACCURACY_LEVELS[level])
    J, Cw = ellipse_J_Cw(a, b, segments)
    seen = check_honest(est, {"J": J, "Cw": Cw, "xs": 0.0, "ys": 0.0}, 2 * a)
    assert all(t < 1e-12 and e < 1e-12 for t, e in seen.values()), seen


# Measured: estimated J error 2e-16 ... 2e-15 at draft and normal, true 1.512e-9 at every
# setting (the fixed curved-edge floor (pi / 256)^4 / 15); Cw about 5e-25 (round-off of zero).
# Converged. At fine the estimate's finer meshes split the chords (the reported one does not)
# and see their curved edges approach the circle: 8.6e-9 estimated against the true 1.5e-9,
# on the safe side but beyond the factor 3 (issue 17: estimates that include the geometry
# error).
@pytest.mark.parametrize("level", [
    "draft", "normal",
    pytest.param("fine", marks=pytest.mark.xfail(
        strict=True, reason="defect: at fine the estimate's finer meshes split the tube's "
                            "chords, which the reported mesh keeps: J error estimated 8.6e-9 "
                            "against the true 1.5e-9"))])
def test_tube_estimates_converged(level):
    D, d, segments = 40.0, 30.0, 256
    est = estimate_errors(tube(D, d, segments=segments), refine=ACCURACY_LEVELS[level])
    J = np.pi * (D**4 - d**4) / 32.0  # Roark, torsion table, hollow concentric circle (from memory)
    seen = check_honest(est, {"J": J, "Cw": 0.0, "xs": 0.0, "ys": 0.0}, D)
    floor = (np.pi / segments) ** 4 / 15.0
    # the true J error is the geometry floor and nothing else (psi = 0 on a tube)
    assert seen["J"][0] == pytest.approx(floor, rel=1e-3)


@pytest.mark.xfail(strict=True, reason="the Richardson estimate cannot see the curved-edge "
                   "approximation error when no mesh of the estimate splits a boundary chord")
def test_estimate_sees_curved_edge_error():
    # Tube with 64 chords per circle at draft: the three estimate meshes (refine 0.5, 0.71, 1)
    # all keep every chord as one curved edge, so J is identical on all three and the estimate
    # is 1.7e-16, while the true error (the curved-edge deficit, psi = 0) is 3.87e-7. At normal
    # the chords are split within the estimate and it becomes honest again (3.6e-7 against
    # 3.9e-7). Reference: Roark, hollow concentric circle (from memory).
    D, d = 40.0, 30.0
    est = estimate_errors(tube(D, d, segments=64), refine=ACCURACY_LEVELS["draft"])
    check_honest(est, {"J": np.pi * (D**4 - d**4) / 32.0}, D)
