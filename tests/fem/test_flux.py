"""The equilibrated RT2 flux (warpwise.fem.flux): what makes it statically admissible.

The lower bound on J holds for any sigma in H(div) with div sigma = 0 and sigma . n = 0 on the
outline (complementary energy; Braess & Schoeberl 2008, Math. Comp. 77). These tests check each
property on its own, at round-off: the reference basis is dual to its dofs, the divergence
vanishes at random points of every element, the normal component is continuous across every
inner edge and zero on the outline. Tolerances are relative to the largest |sigma| (round-off
of sums of O(10) terms of that size: 1e-12, measured 1e-14 ... 3e-13).
"""

import numpy as np
import pytest

from warpwise.fem.flux import p3
from warpwise.fem.flux.patches import PinchedVertexError, vertex_patches
from warpwise.fem.flux.reconstruct import equilibrate, flux_at, straight_elements
from warpwise.geometry.profile import profile_from_loops
from warpwise.geometry.shapes import rectangle
from warpwise.materials import make_material
from warpwise.mesh.core import Mesh
from warpwise.properties.analysis import analyse

L_SHAPE = profile_from_loops([[(0, 0), (40, 0), (40, 8), (8, 8), (8, 40), (0, 40)]])
HOLLOW = profile_from_loops([[(-20, -20), (20, -20), (20, 20), (-20, 20)],
                             [(-12, -12), (12, -12), (12, 12), (-12, 12)]])
TWO_MATERIALS = profile_from_loops([[(0, 0), (30, 0), (30, 10), (0, 10)],
                                    [(0, 10), (30, 10), (30, 16), (0, 16)]],
                                   materials=["steel", "alu"])
STEEL, ALU = make_material("steel", 210000.0, 0.3), make_material("alu", 70000.0, 0.33)


def test_reference_basis_is_dual_and_rule_exact():
    from math import factorial
    V = p3._dof_matrix(p3.basis_coefficients())
    assert np.abs(V - np.eye(15)).max() < 1e-12
    x, y = p3.DEGREE_6.points.T
    for i in range(7):
        for j in range(7 - i):
            exact = factorial(i) * factorial(j) / factorial(i + j + 2)
            assert abs(p3.DEGREE_6.weights @ (x**i * y**j) - exact) < 1e-15
    # net outflow of each edge dof is its Gauss weight, bubbles carry none
    _, div = p3.rt_values(p3.DEGREE_6.points)
    out = p3.DEGREE_6.weights @ div
    assert np.allclose(out[:9], np.tile(p3.EDGE_WEIGHTS, 3), atol=1e-14)
    assert np.abs(out[9:]).max() < 1e-13


def _flux(profile, size=None, refine=1.0):
    mats = [STEEL, ALU] if profile is TWO_MATERIALS else None
    r = analyse(profile, size, refine=refine, materials=mats)
    wG = r.materials.G if r.materials.composite else None
    return r, equilibrate(r.mesh, r.weighted.centroid, r.torsion.psi, wG)


def _edge_fluxes(mesh, flux, t):
    """sigma . n at parameters t along each local edge of each element, (m, 3, len(t))."""
    m = mesh.n_elements
    out = np.empty((m, 3, len(t)))
    for l, (a, b) in enumerate(p3.EDGE_CORNERS):
        X = mesh.nodes[mesh.elements[:, [a, b]]]
        d = X[:, 1] - X[:, 0]
        n = np.stack([d[:, 1], -d[:, 0]], axis=1) / np.linalg.norm(d, axis=1)[:, None]
        for k, tk in enumerate(t):
            ref = p3.CORNERS[a] + tk * (p3.CORNERS[b] - p3.CORNERS[a])
            s, _ = flux_at(mesh, flux, np.arange(m), np.tile(ref, (m, 1)))
            out[:, l, k] = np.sum(s * n, axis=1)
    return out


@pytest.mark.parametrize("profile", [rectangle(20.0, 10.0), L_SHAPE, HOLLOW, TWO_MATERIALS],
                         ids=["rectangle", "L", "hollow", "two materials"])
def test_flux_is_statically_admissible(profile):
    r, flux = _flux(profile)
    mesh = r.mesh
    m = mesh.n_elements
    rng = np.random.default_rng(1)
    pts = rng.random((m, 2))
    pts = np.where(pts.sum(axis=1, keepdims=True) > 1.0, 1.0 - pts, pts)
    s, div = flux_at(mesh, flux, np.arange(m), pts)
    scale = np.abs(s).max()
    # div sigma is a quadratic per element: zero at random points, in units of sigma / h
    assert np.abs(div * np.sqrt(np.abs(_areas(mesh)))).max() < 1e-12 * scale
    t = np.array([0.2, 0.5, 0.8])  # symmetric: the neighbour sees 1 - t
    f = _edge_fluxes(mesh, flux, t)
    E = mesh.edges
    occ = np.argsort(E.of_element.ravel(), kind="stable")
    counts = E.count[E.of_element.ravel()[occ]]
    flat = f.reshape(3 * m, -1)[occ]
    outline = flat[counts == 1]
    assert np.abs(outline).max() < 1e-12 * scale
    inner = flat[counts == 2].reshape(-1, 2, len(t))
    assert np.abs(inner[:, 0] + inner[:, 1, ::-1]).max() < 1e-12 * scale
    # the flux is not trivially zero: it carries the torque (J_low close to J)
    assert flux.complementary > 0.99 * r.torsion.J


def _areas(mesh):
    p = mesh.nodes[mesh.elements[:, :3]]
    d1, d2 = p[:, 1] - p[:, 0], p[:, 2] - p[:, 0]
    return 0.5 * (d1[:, 0] * d2[:, 1] - d1[:, 1] * d2[:, 0])


@pytest.mark.parametrize("profile", [rectangle(20.0, 10.0), L_SHAPE, HOLLOW, TWO_MATERIALS],
                         ids=["rectangle", "L", "hollow", "two materials"])
def test_gap_is_the_sum_of_indicators(profile):
    # J_h - J_low = sum_e ||sigma - tau_h||^2 / c exactly (Galerkin orthogonality and
    # int sigma . grad psi_h = 0): round-off, measured 1e-15 ... 6e-13 of J
    r, flux = _flux(profile)
    J = r.torsion.J
    assert abs(J - flux.complementary - flux.indicator.sum()) < 1e-11 * J
    assert np.all(flux.indicator >= 0)


def test_pinned_node_and_constant_do_not_matter():
    r, flux = _flux(L_SHAPE)
    shifted = equilibrate(r.mesh, r.weighted.centroid, r.torsion.psi + 3.0)
    assert abs(shifted.complementary - flux.complementary) < 1e-12 * flux.complementary


def test_composite_equals_homogeneous_for_equal_moduli():
    # one material split into two regions of the same G: the same flux as without regions
    same = profile_from_loops([[(0, 0), (30, 0), (30, 10), (0, 10)],
                               [(0, 10), (30, 10), (30, 16), (0, 16)]], materials=["a", "b"])
    mats = [make_material(name, 70000.0, 0.33) for name in ("a", "b")]
    r = analyse(same, 2.0, materials=mats)
    a = equilibrate(r.mesh, r.weighted.centroid, r.torsion.psi)
    b = equilibrate(r.mesh, r.weighted.centroid, r.torsion.psi, np.full(r.mesh.n_elements, 2.0))
    assert abs(b.complementary - 2.0 * a.complementary) < 1e-12 * a.complementary


def test_curved_elements_are_refused():
    from warpwise.geometry.shapes import circle
    r = analyse(circle(10.0))
    assert not straight_elements(r.mesh).all()
    with pytest.raises(ValueError, match="straight-sided"):
        equilibrate(r.mesh, r.weighted.centroid, r.torsion.psi)


def test_pinched_vertex_is_refused():
    # two triangles touching at node 0 only
    nodes = np.array([[0, 0], [1, 0], [0, 1], [-1, 0], [0, -1]], dtype=float)
    mids = lambda a, b: 0.5 * (nodes[a] + nodes[b])  # noqa: E731
    extra = [mids(0, 1), mids(1, 2), mids(2, 0), mids(0, 3), mids(3, 4), mids(4, 0)]
    nodes = np.vstack([nodes, extra])
    elements = np.array([[0, 1, 2, 5, 6, 7], [0, 3, 4, 8, 9, 10]])
    mesh = Mesh(nodes, elements, np.zeros(2, dtype=np.int64), 1.0)
    with pytest.raises(PinchedVertexError):
        vertex_patches(mesh)


def test_patches_cover_every_pair_once():
    r = analyse(HOLLOW)
    pairs = np.concatenate([g.pair.ravel() for g in vertex_patches(r.mesh)])
    assert np.array_equal(np.sort(pairs), np.arange(3 * r.mesh.n_elements))
