"""Nearest corners by direct search: the same answers as scipy's k-d tree, so the same meshes.

A profile with a few sharp re-entrant corners grades its boundary towards them by searching
the corners directly (:class:`warpwise.mesh.sizing.DirectSearch`); scipy.spatial is loaded
only for many corners. Likewise the ends of drawing pieces are paired within the joining
tolerance directly (:func:`warpwise.io.chains.close_pairs`). The answers must be those of
``cKDTree`` (common practice, no source).
"""

import numpy as np
import pytest
from scipy.spatial import cKDTree

from conftest import SAMPLES
from warpwise.io import load_profile
from warpwise.mesh import sizing
from warpwise.mesh.core import build_mesh


@pytest.mark.parametrize("n, k", [(1, 1), (5, 1), (9, 3), (16, 8)])
def test_direct_search_equals_the_tree(n, k):
    rng = np.random.default_rng(n)
    corners = rng.uniform(-50, 50, (n, 2))
    points = rng.uniform(-80, 80, (5000, 2))
    d, i = sizing.DirectSearch(corners).query(points, k=k)
    dt, it = cKDTree(corners).query(points, k=k)
    assert np.array_equal(i, it)
    assert np.allclose(d, dt, rtol=1e-15, atol=0)
    assert np.array_equal(sizing.nearest_index(points, corners[:3]),
                          cKDTree(points).query(corners[:3])[1])


def test_direct_search_in_chunks(monkeypatch):
    monkeypatch.setattr(sizing, "DIRECT_CHUNK", 7)
    corners = np.array([[0.0, 0.0], [10.0, 0.0], [0.0, 10.0]])
    points = np.random.default_rng(2).uniform(-5, 15, (50, 2))
    d, i = sizing.DirectSearch(corners).query(points, k=2)
    dt, it = cKDTree(corners).query(points, k=2)
    assert np.array_equal(i, it) and np.allclose(d, dt, rtol=1e-15, atol=0)


@pytest.mark.parametrize("sample", ["rail_t_slot_40x45.dxf", "mullion_screw_bosses.dxf"])  # 5, 10 corners
def test_graded_mesh_is_the_trees_mesh(sample, monkeypatch):
    profile = load_profile(SAMPLES / sample)
    direct = build_mesh(profile)
    monkeypatch.setattr(sizing, "DIRECT_SEARCH", 0)  # every search through the k-d tree
    tree = build_mesh(profile)
    assert np.array_equal(direct.nodes, tree.nodes)
    assert np.array_equal(direct.elements, tree.elements)


@pytest.mark.parametrize("n", [2, 40, 600])
def test_close_pairs_equal_the_trees(n):
    from warpwise.io.chains import close_pairs

    rng = np.random.default_rng(n)
    points = np.round(rng.uniform(0, 10, (n, 2)), 1)  # on a 0.1 grid: many pairs, some equal
    for tol in (0.0, 0.1, 0.35):
        mine = {tuple(p) for p in close_pairs(points, tol).tolist()}
        tree = {tuple(p) for p in cKDTree(points).query_pairs(tol, output_type="ndarray").tolist()}
        assert mine == tree
