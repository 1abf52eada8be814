"""Equilibrated reconstruction of the torsion flux in RT2, by vertex patches (O(n)).

The discrete torsion stress (per unit twist, over the reference shear modulus) is
``tau_h = c (grad psi_h - w)`` with ``w = (y, -x)`` about the centroid and c = G / G_ref per
element (:mod:`warpwise.properties.torsion`: J = int c (|w|^2 - w . grad psi_h) dA). The exact
stress is divergence-free with no traction on the outline; tau_h is not (its normal component
jumps between elements). The reconstruction sigma = sum_a sigma_a is, on straight-sided
elements, exactly in H(div) with div sigma = 0 on every element and sigma . n = 0 on the
outline, each sigma_a solving on the patch of vertex a

    min ||sigma_a - phi_a tau_h||_{1/c}   over RT2 functions of the patch with
    sigma_a . n = 0 on the patch boundary,  div sigma_a = grad phi_a . tau_h  on each element

(Braess & Schoeberl 2008, Math. Comp. 77; Ern & Vohralik 2015, SIAM J. Numer. Anal. 53; here
the source is zero and the whole outline is a zero-flux Neumann boundary). The data are
compatible, int grad phi_a . tau_h dA = 0, because psi_h is the Galerkin solution tested with
phi_a (P1 is in P2; the row of the pinned node holds too, as every row sums to zero). Then
sum_a div sigma_a = grad(sum_a phi_a) . tau_h = 0 (partition of unity).

The element work is done on the reference triangle once (:func:`reference`): in a basis of RT2
whose bubbles are split into five with a given divergence and one divergence-free bubble, the
divergence condition fixes the first five and the last one drops out by a scalar division, so
each element contributes a 6 x 6 matrix on its two edges through the vertex. The patch problems
(three flux values per edge through the vertex, one net-outflow multiplier per element) are
solved by batched dense LU, grouped by size (:mod:`.patches`).
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import cache

import numpy as np

from ...mesh.core import Mesh
from ..p2 import straight_sided
from . import p3
from .patches import FREE_DOFS, ROTATION, PatchGroup, vertex_patches

#: Entries (patch unknowns squared times patches) solved at once, bounding the temporaries.
CHUNK_ENTRIES = 1 << 22
#: Elements evaluated at once in the last step.
CHUNK_ELEMENTS = 1 << 15
#: Reference gradient of the barycentric coordinate of corner 0.
_GRAD_L0 = np.array([-1.0, -1.0])


@dataclass(frozen=True, eq=False)
class Reference:
    """Reference-element tensors of the reconstruction (vertex at corner 0 where it matters).

    U maps the coefficients y = (9 edge values, 5 divergence modes, 1 divergence-free bubble)
    to the dual RT2 dofs of :mod:`.p3`; every tensor below is in the y basis.
    """

    U: np.ndarray  # (15, 15)
    mass: np.ndarray  # (3, 15, 15): the parts multiplying G00, G11, G01 of G = J^T J
    outflow: np.ndarray  # (9,): int div of each edge function (net outflow)
    grad_psi: np.ndarray  # (2, 15, 6): int lambda grad N_n . u_k, lambda = lambda_0 or 1
    w_part: np.ndarray  # (2, 15, 3, 2): int lambda lambda_c (u_k)_i
    div_psi: np.ndarray  # (5, 6, 3): int q_r grad(lambda_0) . B grad N_n, parts of B
    div_w: np.ndarray  # (5, 3): int q_r lambda_c
    values: np.ndarray  # (q, 15, 2): the y basis at the points of p3.DEGREE_6
    dN: np.ndarray  # (q, 6, 2): P2 reference derivatives there
    lam: np.ndarray  # (q, 3): barycentric coordinates there
    weights: np.ndarray  # (q,)


@cache
def reference() -> Reference:
    """The reference tensors (computed once)."""
    rule = p3.DEGREE_6
    x, wq = rule.points, rule.weights
    v, div = p3.rt_values(x)
    q = p3.multiplier_values(x)
    D = np.einsum("p,pr,pk->rk", wq, q, div)  # (6, 15)
    Db, De = D[1:, 9:], D[1:, :9]
    _, _, vt = np.linalg.svd(Db)
    T = np.column_stack([np.linalg.pinv(Db), vt[-1]])  # Db T = [I_5, 0]
    U = np.zeros((15, 15))
    U[:9, :9] = np.eye(9)
    U[9:, :9] = -T[:, :5] @ De
    U[9:, 9:] = T
    u = np.einsum("pbc,bk->pkc", v, U)
    mass = np.stack([np.einsum("p,pk,pl->kl", wq, u[..., 0], u[..., 0]),
                     np.einsum("p,pk,pl->kl", wq, u[..., 1], u[..., 1]),
                     np.einsum("p,pk,pl->kl", wq, u[..., 0], u[..., 1])
                     + np.einsum("p,pk,pl->kl", wq, u[..., 1], u[..., 0])])
    _, dN = p3.shape_functions(x)
    lam = np.column_stack([1.0 - x[:, 0] - x[:, 1], x[:, 0], x[:, 1]])
    hat = np.stack([lam[:, 0], np.ones(len(x))])  # phi_a of corner 0, and sum_a phi_a
    grad_psi = np.einsum("p,ap,pni,pki->akn", wq, hat, dN, u)
    w_part = np.einsum("p,ap,pc,pki->akci", wq, hat, lam, u)
    g0 = _GRAD_L0
    qdN = np.einsum("p,pr,pnj->rnj", wq, q[:, 1:], dN)  # (5, 6, 2)
    div_psi = np.stack([g0[0] * qdN[..., 0], g0[1] * qdN[..., 1],
                        g0[0] * qdN[..., 1] + g0[1] * qdN[..., 0]], axis=-1)
    div_w = np.einsum("p,pr,pc->rc", wq, q[:, 1:], lam)
    # the net outflow of edge value k is its Gauss weight (bubbles carry none)
    return Reference(U, mass, np.tile(p3.EDGE_WEIGHTS, 3), grad_psi, w_part, div_psi, div_w, u, dN, lam,
                     wq)


@dataclass(frozen=True, eq=False)
class Geometry:
    """Affine maps of straight-sided elements (corners relative to the centroid)."""

    corners: np.ndarray  # (m, 3, 2)
    J: np.ndarray  # (m, 2, 2): columns d x / d xi, d x / d eta
    det: np.ndarray  # (m,)
    G: np.ndarray  # (m, 3): G00, G11, G01 of J^T J
    JTw: np.ndarray  # (m, 3, 2): J^T w at the corners

    @classmethod
    def of(cls, corners: np.ndarray) -> Geometry:
        """From corner coordinates (m, 3, 2)."""
        J = np.stack([corners[:, 1] - corners[:, 0], corners[:, 2] - corners[:, 0]], axis=2)
        det = J[:, 0, 0] * J[:, 1, 1] - J[:, 0, 1] * J[:, 1, 0]
        G = np.stack([J[:, 0, 0] ** 2 + J[:, 1, 0] ** 2, J[:, 0, 1] ** 2 + J[:, 1, 1] ** 2,
                      J[:, 0, 0] * J[:, 0, 1] + J[:, 1, 0] * J[:, 1, 1]], axis=1)
        w = np.stack([corners[..., 1], -corners[..., 0]], axis=-1)  # (y, -x) at the corners
        return cls(corners, J, det, G, np.einsum("mij,mci->mcj", J, w))


def _pair_terms(geo: Geometry, psi: np.ndarray, c: np.ndarray):
    """Element matrix (p, 6, 6), right-hand side (p, 6) and net outflow (p,) of each pair.

    ``geo`` and ``psi`` (p, 6) are of the elements rotated so that the pair's vertex is
    corner 0 (:data:`warpwise.fem.flux.patches.ROTATION`).
    """
    ref = reference()
    f = FREE_DOFS
    scale = 1.0 / (c * geo.det)
    M = np.einsum("pt,tkl->pkl", geo.G * scale[:, None], ref.mass[:, :, 9:])  # columns 9..14
    Mee = np.einsum("pt,tkl->pkl", geo.G * scale[:, None], ref.mass[:, f][:, :, f])
    m_f, Meg_f = M[:, f, 5], M[:, f, :5]
    Mgb, Mbb = M[:, 9:14, 5], M[:, 14, 5]
    F = ref.grad_psi[0] @ psi.T - np.einsum("kci,pci->kp", ref.w_part[0], geo.JTw)  # (15, p)
    # divergence data: c int q_r grad phi_0 . (grad psi_h - w), five non-constant modes
    J = geo.J
    adjJ = np.stack([np.stack([J[:, 1, 1], -J[:, 0, 1]], -1),
                     np.stack([-J[:, 1, 0], J[:, 0, 0]], -1)], axis=1)  # (p, 2, 2)
    w = np.stack([geo.corners[..., 1], -geo.corners[..., 0]], axis=-1)
    s = np.einsum("i,pij,pcj->pc", _GRAD_L0, adjJ, w)  # grad lambda_0 . adj(J) w_c
    B = np.stack([geo.G[:, 1], geo.G[:, 0], -geo.G[:, 2]], axis=1) / geo.det[:, None]
    gdiv = c[:, None] * (np.einsum("rnt,pt,pn->pr", ref.div_psi, B, psi) - s @ ref.div_w.T)
    Fb = F[14] - np.einsum("pr,pr->p", Mgb, gdiv)
    K = Mee - m_f[:, :, None] * m_f[:, None, :] / Mbb[:, None, None]
    r = F[f].T - np.einsum("pkr,pr->pk", Meg_f, gdiv) - m_f * (Fb / Mbb)[:, None]
    # net outflow of the element: c int grad phi_0 . (grad psi_h - w) dA (int lambda_c = 1/6)
    g0 = c * (np.einsum("tn,pt,pn->p", _outflow_psi(), B, psi) - s.sum(axis=1) / 6.0)
    return K, r, g0


@cache
def _outflow_psi() -> np.ndarray:
    """(3 parts of B, 6): int grad lambda_0 . B grad N_n over the reference triangle."""
    rule = p3.DEGREE_6
    _, dN = p3.shape_functions(rule.points)
    i = np.einsum("p,pnj->nj", rule.weights, dN)  # (6, 2)
    g0 = _GRAD_L0
    return np.stack([g0[0] * i[:, 0], g0[1] * i[:, 1], g0[0] * i[:, 1] + g0[1] * i[:, 0]], axis=0)


def straight_elements(mesh: Mesh) -> np.ndarray:
    """Mask (m,) of the straight-sided elements (mid-side nodes on the chords).

    The reconstruction is exact (div sigma = 0, sigma . n continuous) on these only: on an
    element with a curved edge the isoparametric psi_h and an affine RT2 field do not match.
    """
    return straight_sided(mesh.nodes[mesh.elements])


@dataclass(frozen=True, eq=False)
class Flux:
    """An equilibrated flux: RT2 dofs per element and the energies it gives.

    Attributes
    ----------
    dofs : numpy.ndarray
        (m, 15) dofs of sigma in the dual basis of :mod:`.p3`, per element (Piola-mapped),
        L (stress per unit twist over G_ref).
    indicator : numpy.ndarray
        (m,) ``int_e |sigma - tau_h|^2 / c dA``, L^4.
    complementary : float
        ``-int (2 sigma . w + |sigma|^2 / c) dA``, L^4: the lower bound on J.
    """

    dofs: np.ndarray
    indicator: np.ndarray
    complementary: float


def _rotated(mesh: Mesh, centroid, pairs: np.ndarray, psi: np.ndarray, c: np.ndarray):
    """Geometry, nodal psi and coefficient of the elements of ``pairs``, vertex at corner 0."""
    elem, corner = np.divmod(pairs, 3)
    nodes = mesh.elements[elem[:, None], ROTATION[corner]]  # (p, 6)
    geo = Geometry.of(mesh.nodes[nodes[:, :3]] - np.asarray(centroid, dtype=float))
    return geo, psi[nodes], c[elem]


def _solve_group(mesh, centroid, psi, c, group: PatchGroup, edge_values: np.ndarray) -> None:
    """Solve the patch problems of one group; add the edge values to ``edge_values`` (m, 9)."""
    k, size, nE = group.pair.shape[1], group.size, 3 * group.n_edges
    outflow = reference().outflow[FREE_DOFS]
    step = max(1, CHUNK_ENTRIES // (size * size))
    for s in range(0, len(group.vertex), step):
        pairs, dof = group.pair[s:s + step], group.dof[s:s + step]
        sign, fixed = group.sign[s:s + step], group.fixed[s:s + step]
        p = len(pairs)
        K, r, g0 = _pair_terms(*_rotated(mesh, centroid, pairs.ravel(), psi, c))
        K, r, g0 = K.reshape(p, k, 6, 6), r.reshape(p, k, 6), g0.reshape(p, k)
        A = np.zeros((p, size, size))
        b = np.zeros((p, size))
        at = np.arange(p)[:, None]
        for j in range(k):  # one step per position in the patch: no index repeats in a step
            d, sg = dof[:, j], sign[:, j]
            A[at[:, :, None], d[:, :, None], d[:, None, :]] += sg[:, :, None] * sg[:, None, :] * K[:, j]
            A[at, d, nE + j] += sg * outflow
            A[at, nE + j, d] += sg * outflow
            b[at, d] += sg * r[:, j]
            b[:, nE + j] = g0[:, j]
        keep = ~fixed
        A *= keep[:, :, None] & keep[:, None, :]
        A[:, np.arange(size), np.arange(size)] += fixed
        b *= keep
        x = np.linalg.solve(A, b[..., None])[..., 0]
        local = sign * np.take_along_axis(x[:, None, :], dof.reshape(p, 1, -1), axis=2).reshape(
            p, k, 6)
        elem, corner = np.divmod(pairs.ravel(), 3)
        # rotated local edges 0 and 2 are the element's edges i and i + 2
        target = 3 * np.stack([corner, (corner + 2) % 3], axis=1)[:, :, None] + np.arange(3)
        np.add.at(edge_values, (elem[:, None], target.reshape(-1, 6)), local.reshape(-1, 6))


def _evaluate(mesh, centroid, psi, c, edge_values: np.ndarray) -> Flux:
    """Divergence-free bubble, dofs, indicators and complementary energy, in element chunks."""
    ref = reference()
    m = mesh.n_elements
    dofs = np.empty((m, 15))
    indicator = np.empty(m)
    total = 0.0
    for s in range(0, m, CHUNK_ELEMENTS):
        e = edge_values[s:s + CHUNK_ELEMENTS]
        nodes = mesh.elements[s:s + CHUNK_ELEMENTS]
        geo = Geometry.of(mesh.nodes[nodes[:, :3]] - np.asarray(centroid, dtype=float))
        ps, cc = psi[nodes], c[s:s + CHUNK_ELEMENTS]
        scale = 1.0 / (cc * geo.det)
        M = np.einsum("pt,tk->pk", geo.G * scale[:, None], ref.mass[:, :, 14])  # column beta
        F = ref.grad_psi[1][14] @ ps.T - np.einsum("ci,pci->p", ref.w_part[1][14], geo.JTw)
        y = np.zeros((len(e), 15))
        y[:, :9] = e
        y[:, 14] = (F - np.einsum("pk,pk->p", M[:, :9], e)) / M[:, 14]
        dofs[s:s + CHUNK_ELEMENTS] = y @ ref.U.T
        sig_ref = np.einsum("pk,qki->pqi", y, ref.values)
        sig = np.einsum("pij,pqj->pqi", geo.J, sig_ref) / geo.det[:, None, None]
        gref = np.einsum("pn,qni->pqi", ps, ref.dN)
        adj = np.stack([np.stack([geo.J[:, 1, 1], -geo.J[:, 1, 0]], -1),
                        np.stack([-geo.J[:, 0, 1], geo.J[:, 0, 0]], -1)], axis=1)  # adj(J)^T
        grad = np.einsum("pij,pqj->pqi", adj, gref) / geo.det[:, None, None]  # J^-T grad^
        xy = np.einsum("qc,pci->pqi", ref.lam, geo.corners)
        w = np.stack([xy[..., 1], -xy[..., 0]], axis=-1)
        dA = geo.det[:, None] * ref.weights
        diff = sig - cc[:, None, None] * (grad - w)
        indicator[s:s + CHUNK_ELEMENTS] = np.einsum("pq,pqi,pqi->p", dA, diff, diff) / cc
        total -= float(np.einsum("pq,pqi,pqi->", dA, sig, 2.0 * w + sig / cc[:, None, None]))
    return Flux(dofs, indicator, total)


def equilibrate(mesh: Mesh, centroid, psi: np.ndarray, coefficient: np.ndarray | None = None) -> Flux:
    """Equilibrated RT2 reconstruction of the torsion stress of a warping solution.

    Parameters
    ----------
    mesh : Mesh
        A mesh of straight-sided elements (:func:`straight_elements`).
    centroid : (float, float)
        The (modulus-weighted) centroid the warping function refers to, drawing unit.
    psi : numpy.ndarray
        The Galerkin warping function (n,) about the centroid, L^2 (any constant per part).
    coefficient : numpy.ndarray, optional
        Element shear modulus ratios G / G_ref (m,); default 1.

    Returns
    -------
    Flux

    Raises
    ------
    ValueError
        If an element has a curved edge, or the mesh is pinched at a vertex
        (:class:`~warpwise.fem.flux.patches.PinchedVertexError`).
    """
    if not straight_elements(mesh).all():
        raise ValueError("the flux reconstruction needs straight-sided elements")
    c = np.ones(mesh.n_elements) if coefficient is None else np.asarray(coefficient, dtype=float)
    psi = np.asarray(psi, dtype=float)
    edge_values = np.zeros((mesh.n_elements, 9))
    for group in vertex_patches(mesh):
        _solve_group(mesh, centroid, psi, c, group, edge_values)
    return _evaluate(mesh, centroid, psi, c, edge_values)


def flux_at(mesh: Mesh, flux: Flux, elements: np.ndarray, ref_points: np.ndarray):
    """Values (p, 2) and divergences (p,) of sigma at reference points of given elements."""
    v, div = p3.rt_values(np.atleast_2d(ref_points))
    X = mesh.nodes[mesh.elements[elements, :3]]
    geo = Geometry.of(X)
    d = flux.dofs[elements]
    sig = np.einsum("pij,pj->pi", geo.J, np.einsum("pk,pki->pi", d, v)) / geo.det[:, None]
    return sig, np.einsum("pk,pk->p", d, div) / geo.det


__all__ = ["CHUNK_ELEMENTS", "CHUNK_ENTRIES", "Flux", "Geometry", "Reference", "equilibrate",
           "flux_at", "reference", "straight_elements"]
