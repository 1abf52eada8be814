"""The largest |value| of a P2 field over the elements, against quadratics it holds exactly.

A six-node element reproduces every quadratic exactly (common practice, no source), so the
largest magnitude found over the mesh must be the quadratic's own maximum over the section,
wherever it lies (inside an element, on an edge, at a corner), to round-off.
"""

import numpy as np
import pytest

from warpwise.fem.field_max import largest_magnitude
from warpwise.geometry.shapes import circle, rectangle
from warpwise.mesh.core import build_mesh


@pytest.fixture(scope="module")
def mesh():
    return build_mesh(rectangle(20.0, 10.0), size=2.0)  # -10..10 x -5..5


def test_interior_maximum_between_nodes(mesh):
    x0, y0 = 1.2345, -0.789  # not a node
    f = 7.0 - 0.01 * (mesh.nodes[:, 0] - x0) ** 2 - 0.02 * (mesh.nodes[:, 1] - y0) ** 2
    top = largest_magnitude(mesh, f)
    assert top.value == pytest.approx(7.0, rel=1e-13)
    assert top.point == pytest.approx((x0, y0), abs=1e-9)
    assert top.value > np.abs(f).max()  # the nodes alone miss it


def test_edge_maximum(mesh):
    # a dome centred outside the section (3.3, -8): its largest value on the section is on the
    # edge y = -5 at x = 3.3, between nodes; the field is positive everywhere
    x, y = mesh.nodes[:, 0], mesh.nodes[:, 1]
    f = 10.0 - 0.01 * (x - 3.3) ** 2 - 0.01 * (y + 8.0) ** 2
    top = largest_magnitude(mesh, f)
    assert top.value == pytest.approx(10.0 - 0.09, rel=1e-13)
    assert top.point == pytest.approx((3.3, -5.0), abs=1e-9)


def test_negative_extreme_and_corner(mesh):
    x, y = mesh.nodes[:, 0], mesh.nodes[:, 1]
    f = x * y  # saddle: largest |f| = 50 at the corners, either sign
    top = largest_magnitude(mesh, f)
    assert abs(top.value) == pytest.approx(50.0, rel=1e-13)
    assert abs(top.point[0]) == pytest.approx(10.0) and abs(top.point[1]) == pytest.approx(5.0)


def test_curved_elements():
    # curved boundary elements: the field's quadratic lives in reference coordinates; a field
    # linear in x peaks at the nodes of the true circle (x = R), so nothing is missed or added
    m = build_mesh(circle(20.0), size=3.0)
    top = largest_magnitude(m, m.nodes[:, 0])
    assert abs(top.value) == pytest.approx(np.abs(m.nodes[:, 0]).max(), rel=1e-12)
