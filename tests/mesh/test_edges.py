"""Mesh edges derived once: the unique edges, the element-to-edge map, boundary and interfaces.

Facts of any conforming triangulation (Euler's formula for a planar mesh: V - E + F = 1 + h
with F the triangles and h the holes) and of the node order (corners counter-clockwise, so the
material lies left of every boundary edge as its element runs it). Common practice, no source.
"""

import numpy as np

from warpwise.geometry.shapes import rectangle, tube
from warpwise.materials import builtin_material
from warpwise.mesh.core import build_mesh
from warpwise.mesh.edges import LOCAL_EDGES, mesh_edges


def _brute_edges(elements):
    seen = {}
    for e, tri in enumerate(elements.tolist()):
        for k, (a, b, m) in enumerate(LOCAL_EDGES.tolist()):
            seen.setdefault(frozenset((tri[a], tri[b])), []).append((e, k, tri[m]))
    return seen


def test_edges_match_a_plain_count():
    mesh = build_mesh(tube(30.0, 20.0), size=3.0)
    edges = mesh.edges
    brute = _brute_edges(mesh.elements)
    assert len(edges.nodes) == len(brute)
    for i, (a, b, m) in enumerate(edges.nodes.tolist()):
        owners = brute[frozenset((a, b))]
        assert edges.count[i] == len(owners)
        assert all(mid == m for _, _, mid in owners)  # one mid-side node per edge
        for e, k, _ in owners:
            assert edges.of_element[e, k] == i
    corners = len(np.unique(mesh.elements[:, :3]))
    # Euler for a tube (one hole): V - E + F = 0
    assert corners - len(edges.nodes) + mesh.n_elements == 0


def test_boundary_edges_have_the_material_on_their_left():
    mesh = build_mesh(tube(30.0, 20.0), size=3.0)
    e = mesh.edges
    elem, local = np.nonzero(np.isin(e.of_element, e.boundary))
    assert len(elem) == len(e.boundary)  # each boundary edge has exactly one element
    edge = e.of_element[elem, local]
    a, b = mesh.nodes[e.nodes[edge, 0]], mesh.nodes[e.nodes[edge, 1]]
    third = mesh.nodes[mesh.elements[elem, (local + 2) % 3]]
    d, q = b - a, third - a
    assert np.all(d[:, 0] * q[:, 1] - d[:, 1] * q[:, 0] > 0)  # third corner on the left


def test_interfaces_between_materials():
    # an insert of another material: the interface edges are those shared by two regions
    from warpwise.geometry.profile import profile_from_loops

    outer = [(0, 0), (40, 0), (40, 20), (0, 20)]
    inner = [(10, 5), (30, 5), (30, 15), (10, 15)]
    prof = profile_from_loops([outer, inner], ["steel-S235", "aluminium-6063-T6"])
    mesh = build_mesh(prof, size=2.0)
    e = mesh_edges(mesh.elements, mesh.region)
    assert np.all(e.count[e.interface] == 2)
    pts = mesh.nodes[e.nodes[e.interface, :2].ravel()]
    on_inner = (np.isclose(pts[:, 0], 10) | np.isclose(pts[:, 0], 30) | np.isclose(pts[:, 1], 5)
                | np.isclose(pts[:, 1], 15))
    assert on_inner.all() and len(e.interface) > 0
    assert builtin_material("steel-S235").E > 0


def test_three_node_meshes_get_no_mid_side_nodes():
    tris = np.array([[0, 1, 2], [1, 3, 2]])
    e = mesh_edges(tris)
    assert len(e.nodes) == 5 and np.all(e.nodes[:, 2] == -1) and len(e.boundary) == 4


def test_mesh_keeps_its_edges():
    mesh = build_mesh(rectangle(10.0, 4.0), size=1.0)
    assert mesh.edges is mesh.edges  # derived once
