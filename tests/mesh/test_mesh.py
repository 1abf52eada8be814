import numpy as np
import pytest

from warpwise.geometry.profile import profile_from_loops
from warpwise.geometry.shapes import rectangle, tube
from warpwise.mesh.core import build_mesh


def test_mid_side_nodes_and_orientation():
    m = build_mesh(rectangle(10.0, 4.0), size=1.0)
    p = m.nodes[m.elements]
    # mid-side nodes sit at edge midpoints of straight elements (the element definition)
    for k, (i, j) in enumerate(((0, 1), (1, 2), (2, 0))):
        assert np.allclose(p[:, 3 + k], 0.5 * (p[:, i] + p[:, j]))
    d1, d2 = p[:, 1] - p[:, 0], p[:, 2] - p[:, 0]
    assert np.all(d1[:, 0] * d2[:, 1] - d1[:, 1] * d2[:, 0] > 0)
    assert m.area == pytest.approx(40.0, rel=1e-12)


def test_thin_wall_gets_two_elements_through_thickness():
    # 100 x 1 strip: default size from sqrt(A) is 1.25, far more than the 1.0 wall
    m = build_mesh(rectangle(100.0, 1.0))
    corners = m.nodes[m.elements[:, :3]]
    heights = np.ptp(corners[:, :, 1], axis=1)
    # with two or more elements through the wall no element spans the whole thickness
    assert heights.max() < 0.75


def test_holes_are_empty():
    m = build_mesh(tube(20.0, 10.0, segments=64))
    r = np.hypot(*m.nodes.T)
    assert r.min() >= 5.0 * np.cos(np.pi / 64) - 1e-9
    area = np.pi / 4 * (20**2 - 10**2)
    assert m.area == pytest.approx(area, rel=2e-3)


def test_two_materials_conform_along_interface():
    outer = [[0, 0], [10, 0], [10, 10], [0, 10]]
    inner = [[3, 3], [7, 3], [7, 7], [3, 7]]
    p = profile_from_loops([outer, inner], ["a", "b"])
    m = build_mesh(p, size=1.0)
    assert set(np.unique(m.region)) == {0, 1}
    assert m.area == pytest.approx(100.0, rel=1e-12)
    c = m.nodes[m.elements[:, :3]]
    d1, d2 = c[:, 1] - c[:, 0], c[:, 2] - c[:, 0]
    areas = 0.5 * (d1[:, 0] * d2[:, 1] - d1[:, 1] * d2[:, 0])
    is_b = np.array([p.regions[r].material == "b" for r in m.region])
    inner_area = areas[is_b].sum()
    assert inner_area == pytest.approx(16.0, rel=1e-12)
