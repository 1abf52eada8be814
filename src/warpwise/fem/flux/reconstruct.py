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
divergence condition fixes the first five and the last one drops out by a scalar division.
Around the ordered fan of a vertex (:mod:`.patches`) the elements' net outflows fix the net
flux through each edge up to one circulation constant (none on the outline), so each patch is
left with a small symmetric positive definite system: two no-net-flux modes per inner edge
(plus the constant), 2 k + 1 unknowns for k elements. Patches of the same size are solved
together by batched dense LU; each pair's 5 x 5 matrix comes from reference tables by one
product with the three entries of J^T J (no Python loop over patches or elements).
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import cache

import numpy as np

from ...mesh.core import Mesh
from ..p2 import straight_sided
from . import p3
from .patches import ROTATION, PatchGroup, vertex_patches

#: Entries (patch unknowns squared times patches) solved at once, bounding the temporaries.
CHUNK_ENTRIES = 1 << 18
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
    return Reference(U, mass, grad_psi, w_part, div_psi, div_w, u, dN, lam,
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
        x, y = corners[..., 0], corners[..., 1]  # w = (y, -x) at the corners
        JTw = np.stack([J[:, 0, 0, None] * y - J[:, 1, 0, None] * x,
                        J[:, 0, 1, None] * y - J[:, 1, 1, None] * x], axis=-1)
        return cls(corners, J, det, G, JTw)


def _pair_terms(geo: Geometry, psi: np.ndarray, c: np.ndarray):
    """A pair's 5 x 5 matrix and vectors in the patch unknowns (:func:`_pair_tables`).

    ``geo`` and ``psi`` (p, 6) are of the elements rotated so that the pair's vertex is
    corner 0 (:data:`warpwise.fem.flux.patches.ROTATION`). Returns the matrix (p, 5, 5), the
    right-hand side (p, 5) without the particular fluxes, the columns (p, 5) that multiply the
    net fluxes of the out- and in-edge, and the element's net outflow (p,).
    """
    t = _pair_tables()
    p = len(c)
    Gs = geo.G / (c * geo.det)[:, None]
    M = Gs @ t.mass  # (p, 25 + 5 + 5 + 5 + 25 + 5 + 3)
    Kv = M[:, :25].reshape(p, 5, 5)
    ko, ki, wm = M[:, 25:30], M[:, 30:35], M[:, 35:40]
    Wg = M[:, 40:65].reshape(p, 5, 5)
    Mgb, mo, mi, Mbb = M[:, 65:70], M[:, 70], M[:, 71], M[:, 72]
    F = psi @ t.grad_psi - geo.JTw.reshape(p, 6) @ t.w_part  # (p, 6): W F and F_beta
    # divergence data c int q_r grad phi_0 . (grad psi_h - w) dA, r = the five non-constant
    # modes and the constant (the net outflow; int lambda_c = 1 / 6)
    J, w = geo.J, geo.corners[..., ::-1] * np.array([1.0, -1.0])  # w = (y, -x) at the corners
    s = (-(J[:, 1, 1] - J[:, 1, 0])[:, None] * w[..., 0]
         - (J[:, 0, 0] - J[:, 0, 1])[:, None] * w[..., 1])  # grad lambda_0 . adj(J) w_c
    B = np.stack([geo.G[:, 1], geo.G[:, 0], -geo.G[:, 2]], axis=1) / geo.det[:, None]
    Bpsi = (B[:, :, None] * psi[:, None, :]).reshape(p, 18)
    g = c[:, None] * (Bpsi @ t.div_psi - s @ t.div_w)  # (p, 6)
    gdiv, g0 = g[:, :5], g[:, 5]
    # eliminate the divergence-free bubble beta: K = Mee - m m^T / Mbb, in the patch unknowns
    inv = 1.0 / Mbb
    Fb = F[:, 5] - np.einsum("pr,pr->p", Mgb, gdiv)
    ws = wm * np.sqrt(inv)[:, None]
    Kv -= ws[:, :, None] * ws[:, None, :]
    ko -= wm * (mo * inv)[:, None]
    ki -= wm * (mi * inv)[:, None]
    rv = F[:, :5] - np.einsum("pkr,pr->pk", Wg, gdiv) - wm * (Fb * inv)[:, None]
    return Kv, rv, ko, ki, g0


#: Patch orientation of a pair's free dofs: the out-edge's values reversed and negated (the next
#: member sees that edge the other way), then the in-edge's (:mod:`.patches`).
_PATCH_DOFS = np.array([2, 1, 0, 6, 7, 8])
_PATCH_SIGNS = np.array([-1.0, -1.0, -1.0, 1.0, 1.0, 1.0])
#: An edge's three values x = F z + N y: z carries the net flux F (o . z = 1 for the Gauss
#: weights o), the orthonormal N (3, 2) the two modes of no net flux.
_Z = np.ones(3)
_N = np.column_stack([np.array([1.0, 0.0, -1.0]) / np.sqrt(2.0),
                      np.array([4.0, -5.0, 4.0]) / np.sqrt(57.0)])


@dataclass(frozen=True, eq=False)
class _PairTables:
    """Reference tensors of :func:`_pair_terms`, flattened for matrix products."""

    mass: np.ndarray  # (3, 73)
    grad_psi: np.ndarray  # (6 nodes, 6): W F and F_beta
    w_part: np.ndarray  # (3 corners x 2, 6)
    div_psi: np.ndarray  # (18, 6)
    div_w: np.ndarray  # (3, 6)


@cache
def _pair_tables() -> _PairTables:
    """Reference tensors for a pair (vertex at corner 0) in the patch unknowns.

    The pair's unknowns v = (y_out (2), y_in (2), F_0 (1)) give its six free dofs in patch
    orientation as u = T5 v (+ the particular fluxes), with T5 = [[N, 0, z], [0, N, z]]: W =
    T5^T Q (5, 15) maps the element's y basis (Q the signed selection of its free dofs) to v.
    """
    ref = reference()
    Q = np.zeros((6, 15))
    Q[np.arange(6), _PATCH_DOFS] = _PATCH_SIGNS
    T5 = np.zeros((6, 5))
    T5[:3, :2], T5[3:, 2:4], T5[:3, 4], T5[3:, 4] = _N, _N, _Z, _Z
    W = T5.T @ Q
    Zo, Zi = Q.T @ np.r_[_Z, 0, 0, 0], Q.T @ np.r_[0, 0, 0, _Z]
    M = ref.mass  # (3, 15, 15)
    mass = np.concatenate([
        np.einsum("ak,tkl,bl->tab", W, M, W).reshape(3, 25),
        np.einsum("ak,tkl,l->ta", W, M, Zo), np.einsum("ak,tkl,l->ta", W, M, Zi),
        np.einsum("ak,tk->ta", W, M[:, :, 14]),
        np.einsum("ak,tkr->tar", W, M[:, :, 9:14]).reshape(3, 25),
        M[:, 9:14, 14], (M[:, :, 14] @ Zo)[:, None], (M[:, :, 14] @ Zi)[:, None],
        M[:, 14, 14][:, None]], axis=1)
    grad_psi = np.vstack([W @ ref.grad_psi[0], ref.grad_psi[0][14]]).T  # (6 nodes, 6)
    wp = ref.w_part[0].reshape(15, 6)
    w_part = np.vstack([W @ wp, wp[14]]).T
    div_psi = np.concatenate([ref.div_psi, _outflow_psi().T[None]], axis=0)  # (6, 6 n, 3 t)
    div_psi = div_psi.transpose(2, 1, 0).reshape(18, 6)
    div_w = np.vstack([ref.div_w, np.full((1, 3), 1.0 / 6.0)]).T  # (3, 6)
    return _PairTables(mass, grad_psi, w_part, div_psi, div_w)


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
    Round-off is judged against the mesh's coordinates (see :func:`warpwise.fem.p2.straight_sided`).
    """
    return straight_sided(mesh.nodes[mesh.elements], float(np.abs(mesh.nodes).max(initial=0.0)))


class CurvedElementsError(ValueError):
    """The mesh has elements with a curved edge, where the reconstruction is not exact."""


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
    warping : float
        ``int c (|w|^2 - w . grad psi_h) dA``, L^4: J of the warping function (the upper bound),
        integrated with the same rule; ``warping - complementary = sum(indicator)``.
    """

    dofs: np.ndarray
    indicator: np.ndarray
    complementary: float
    warping: float


def _rotated(mesh: Mesh, centroid, pairs: np.ndarray, psi: np.ndarray, c: np.ndarray):
    """Geometry, nodal psi and coefficient of the elements of ``pairs``, vertex at corner 0."""
    elem, corner = np.divmod(pairs, 3)
    nodes = mesh.elements[elem[:, None], ROTATION[corner]]  # (p, 6)
    geo = Geometry.of(mesh.nodes[nodes[:, :3]] - np.asarray(centroid, dtype=float))
    return geo, psi[nodes], c[elem]


def _solve_group(mesh, centroid, psi, c, group: PatchGroup, pair_values: np.ndarray) -> None:
    """Solve the patch problems of one group: each pair's edge values into ``pair_values``.

    ``pair_values`` (3 m, 6) gets, for each pair of the group, the values of its out-edge and
    in-edge in the element's own orientation (its RT2 dofs 0, 1, 2 and 6, 7, 8 rotated).

    Unknowns of a patch: the two no-net-flux modes y_e of each inner edge, and for a closed
    fan the net flux F_0 of edge 0. The net fluxes follow from the elements' net outflows g0
    around the fan, F_{j+1} = F_j - g0_j (member j's outflow is F_j - F_{j+1}): particular
    fluxes P_j = -sum_{i<j} g0_i, plus F_0 on a closed fan (zero on an open one, whose first
    and last edges are on the outline). The data are compatible (sum g0 = 0), so this leaves
    a symmetric positive definite system of 2 k + 1 (closed) or 2 k - 2 (open) unknowns.
    """
    k, closed, nE = group.pair.shape[1], group.closed, group.n_edges
    size = 2 * nE + int(closed)
    if size == 0:  # a lone corner element: nothing is free, the data are compatible
        return
    step = max(1, CHUNK_ENTRIES // (size * size))
    for s in range(0, len(group.vertex), step):  # chunks of patches, bounding the memory
        pairs = group.pair[s:s + step]
        p = len(pairs)
        Kv, rv, ko, ki, g0 = _pair_terms(*_rotated(mesh, centroid, pairs.ravel(), psi, c))
        rv = rv.reshape(p, k, 5)
        ko, ki, g0 = ko.reshape(p, k, 5), ki.reshape(p, k, 5), g0.reshape(p, k)
        # particular net flux of edges 0 ... k; edge k is edge 0 (closed) or on the outline:
        # zero either way, the round-off of sum g0 = 0 left in the last element's divergence
        P = np.zeros((p, k + 1))
        P[:, 1:k] = -np.cumsum(g0[:, :-1], axis=1)
        A = np.zeros((p, size * size))
        b = np.zeros((p, size))
        rhs = rv - P[:, 1:, None] * ko - P[:, :-1, None] * ki  # (p, k, 5)
        Kv = Kv.reshape(p, k, 25)
        for j in range(k):  # one step per member; its unknowns' places are the same in the group
            rows, cols, into, local = _member_unknowns(j, k, closed, size)
            A[:, into] += Kv[:, j, local]
            b[:, rows] += rhs[:, j, cols]
        A = A.reshape(p, size, size)
        v = np.linalg.solve(A, b[..., None])[..., 0]
        # edge values x_e = (F_0 + P_e) z + N y_e, e = 0 ... k (zero on the outline)
        F0 = v[:, -1:] if closed else np.zeros((p, 1))
        y = np.zeros((p, k + 1, 2))
        first = 0 if closed else 1
        y[:, first:first + nE] = v[:, :2 * nE].reshape(p, nE, 2)
        if closed:
            y[:, k] = y[:, 0]
        x = (F0 + P)[..., None] * _Z + y @ _N.T  # (p, k + 1, 3)
        if not closed:
            x[:, 0] = x[:, k] = 0.0
        # member j: its out-edge is edge j + 1 seen the other way, its in-edge edge j
        pair_values[pairs.ravel()] = np.concatenate([-x[:, 1:, ::-1], x[:, :-1]], axis=2).reshape(
            -1, 6)


@cache
def _member_unknowns(j: int, k: int, closed: bool, size: int):
    """Where member j's local unknowns (y_out, y_in, F_0) go among the patch unknowns.

    Returns the patch unknowns and the local ones that exist (an outline edge has none),
    and the same for the flattened matrices: patch entries and local entries of the 5 x 5.
    """
    rows, cols = [], []
    out_e, in_e = (j + 1) % k if closed else j + 1, j
    for local, edge in ((0, out_e), (2, in_e)):
        if closed:
            place = 2 * edge
        elif 1 <= edge <= k - 1:
            place = 2 * (edge - 1)
        else:
            continue  # an outline edge: no unknowns
        rows += [place, place + 1]
        cols += [local, local + 1]
    if closed:
        rows.append(2 * k)
        cols.append(4)
    r, c = np.array(rows), np.array(cols)
    return r, c, (r[:, None] * size + r[None, :]).ravel(), (c[:, None] * 5 + c[None, :]).ravel()


def _evaluate(mesh, centroid, psi, c, edge_values: np.ndarray) -> Flux:
    """Divergence-free bubble, dofs, indicators and complementary energy, in element chunks.

    sigma and tau_h are evaluated at the points of :data:`p3.DEGREE_6` (exact for these
    polynomials of degree 6) rather than through the element matrices, so that an indicator
    is not the small difference of large terms.
    """
    ref = reference()
    m, nq = mesh.n_elements, len(ref.weights)
    dofs = np.empty((m, 15))
    indicator = np.empty(m)
    total = upper = 0.0
    values = ref.values.transpose(1, 0, 2).reshape(15, -1)  # (15, q x 2)
    dN = ref.dN.transpose(1, 0, 2).reshape(6, -1)
    beta_mass = ref.mass[:, :, 14]  # (3, 15)
    beta_F = np.concatenate([ref.grad_psi[1][14], -ref.w_part[1][14].ravel()])  # (6 + 6,)
    for s in range(0, m, CHUNK_ELEMENTS):
        e = edge_values[s:s + CHUNK_ELEMENTS]
        nodes = mesh.elements[s:s + CHUNK_ELEMENTS]
        geo = Geometry.of(mesh.nodes[nodes[:, :3]] - np.asarray(centroid, dtype=float))
        ps, cc = psi[nodes], c[s:s + CHUNK_ELEMENTS]
        p = len(e)
        Mb = (geo.G / (cc * geo.det)[:, None]) @ beta_mass  # (p, 15): column beta
        F = np.concatenate([ps, geo.JTw.reshape(p, 6)], axis=1) @ beta_F
        y = np.zeros((p, 15))
        y[:, :9] = e
        y[:, 14] = (F - np.einsum("pk,pk->p", Mb[:, :9], e)) / Mb[:, 14]
        dofs[s:s + CHUNK_ELEMENTS] = y @ ref.U.T
        S = (y @ values).reshape(p, nq, 2)
        gr = (ps @ dN).reshape(p, nq, 2)
        J, inv_det = geo.J, (1.0 / geo.det)[:, None]
        sx = (J[:, 0, 0, None] * S[..., 0] + J[:, 0, 1, None] * S[..., 1]) * inv_det
        sy = (J[:, 1, 0, None] * S[..., 0] + J[:, 1, 1, None] * S[..., 1]) * inv_det
        gx = (J[:, 1, 1, None] * gr[..., 0] - J[:, 1, 0, None] * gr[..., 1]) * inv_det
        gy = (J[:, 0, 0, None] * gr[..., 1] - J[:, 0, 1, None] * gr[..., 0]) * inv_det
        wx = geo.corners[..., 1] @ ref.lam.T  # w = (y, -x) at the points
        wy = -(geo.corners[..., 0] @ ref.lam.T)
        dA = geo.det[:, None] * ref.weights
        ccol = cc[:, None]
        dx, dy = sx - ccol * (gx - wx), sy - ccol * (gy - wy)
        indicator[s:s + CHUNK_ELEMENTS] = np.einsum("pq,pq->p", dA, dx * dx + dy * dy) / cc
        total -= float(np.einsum("pq,pq->", dA, 2.0 * (sx * wx + sy * wy)
                                 + (sx * sx + sy * sy) / ccol))
        upper += float(np.einsum("pq,pq->", dA * ccol, wx * (wx - gx) + wy * (wy - gy)))
    return Flux(dofs, indicator, total, upper)


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
    CurvedElementsError
        If an element has a curved edge.
    PinchedVertexError
        If the mesh is pinched at a vertex (:class:`~warpwise.fem.flux.patches.PinchedVertexError`).
    """
    if not straight_elements(mesh).all():
        raise CurvedElementsError("the flux reconstruction needs straight-sided elements")
    c = np.ones(mesh.n_elements) if coefficient is None else np.asarray(coefficient, dtype=float)
    psi = np.asarray(psi, dtype=float)
    pair_values = np.zeros((3 * mesh.n_elements, 6))  # a lone corner element's stay zero
    for group in vertex_patches(mesh):
        _solve_group(mesh, centroid, psi, c, group, pair_values)
    # element edge l: the out-edge of the pair at corner l plus the in-edge of that at l + 1
    pv = pair_values.reshape(-1, 3, 6)
    edge_values = (pv[:, :, :3] + np.roll(pv[:, :, 3:], -1, axis=1)).reshape(-1, 9)
    return _evaluate(mesh, centroid, psi, c, edge_values)


def flux_at(mesh: Mesh, flux: Flux, elements: np.ndarray, ref_points: np.ndarray):
    """Values (p, 2) and divergences (p,) of sigma at reference points of given elements."""
    v, div = p3.rt_values(np.atleast_2d(ref_points))
    X = mesh.nodes[mesh.elements[elements, :3]]
    geo = Geometry.of(X)
    d = flux.dofs[elements]
    sig = np.einsum("pij,pj->pi", geo.J, np.einsum("pk,pki->pi", d, v)) / geo.det[:, None]
    return sig, np.einsum("pk,pk->p", d, div) / geo.det


__all__ = ["CHUNK_ELEMENTS", "CHUNK_ENTRIES", "CurvedElementsError", "Flux", "Geometry",
           "Reference", "equilibrate", "flux_at", "reference", "straight_elements"]
