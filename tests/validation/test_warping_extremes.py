"""Largest sectorial coordinate omega_max against the series of the rectangle's warping.

The series and its largest magnitude: tests/support/warping_series.py (Timoshenko & Goodier,
Theory of Elasticity, torsion of a rectangular bar).

The reported omega_max is the largest magnitude over the elements (their quadratics), not only
at the nodes. Measured at the default mesh: +4.3e-4 (2:1) and +1.46e-3 (square, 465 nodes)
against the series (the nodes alone: -3.2e-4 and -4.9e-4); bound 1e-3 (DESIGN.md's default
target), which the square misses until the default sizing gives compact bars more elements
(strict xfail). At the fine setting +3.8e-5 (2:1): the 1e-5 fine target is not met yet either;
bound 1e-4 until the sizing reaches it.
"""

import pytest

from support.warping_series import series_omega_max
from warpwise.geometry.shapes import rectangle
from warpwise.properties.analysis import analyse


@pytest.mark.parametrize("a, b", [
    (20.0, 10.0),
    pytest.param(10.0, 10.0, marks=pytest.mark.xfail(
        strict=True, reason="defect: omega_max of a 20 mm square bar is +1.46e-3 at the default "
                            "mesh (465 nodes), beyond the 1e-3 target")),
])
def test_default_mesh(a, b):
    res = analyse(rectangle(2 * a, 2 * b))
    ref = series_omega_max(a, b)
    assert res.torsion.omega_max == pytest.approx(ref, rel=1e-3)


def test_fine_setting():
    res = analyse(rectangle(40.0, 20.0), refine=2.0)
    assert res.torsion.omega_max == pytest.approx(series_omega_max(20.0, 10.0), rel=1e-4)
