"""A guaranteed lower bound on J from the Prandtl stress function on the same mesh.

The warping (displacement) solution over-estimates the torsional stiffness of the discrete
section; the stress-function solution under-estimates it. Together they bracket the true J of
the meshed domain (exactly the profile for straight-sided outlines):

    J_low <= J <= J_up.

Prandtl's problem: laplace(phi) = -2 with phi = 0 on every outer boundary and phi = c_k, an
unknown constant, on the boundary of hole k. Minimising
int (|grad phi|^2 / 2 - 2 phi) dA - 2 sum_k c_k A_k over the P2 space (each hole's boundary
nodes tied to one unknown) gives the single-valuedness condition of the warping around each hole
as the natural condition, and J_low = 2 int phi dA + 2 sum_k c_k A_k. Galerkin orthogonality
makes J_low equal to minus twice the minimum, hence below the exact value.
"""

from __future__ import annotations

import numpy as np
import scipy.sparse as sp
from scipy.sparse.csgraph import connected_components

from ..errors import AnalysisError
from ..fem.p2 import ElementValues, assemble_vector
from ..fem.solve import SPDFactor
from ..mesh.core import Mesh


def _hole_areas(mesh: Mesh, bnodes: np.ndarray, which: np.ndarray, n_holes: int) -> np.ndarray:
    """Area enclosed by each hole loop of the mesh (curved edges as their chords), L^2."""
    bnd = mesh.edges.nodes[mesh.edges.boundary][:, [0, 2, 1]]  # corner, mid-side, corner
    hole = np.full(mesh.n_nodes, -1)
    hole[bnodes] = which
    h = hole[bnd[:, 0]]
    keep = h >= 0
    # each boundary edge a -> m -> b as two chords through its mid-side node; the hole lies to
    # the right of the edge, so its area is minus the signed area swept
    out = np.zeros(n_holes)
    for i, j in ((0, 1), (1, 2)):
        p, q = mesh.nodes[bnd[keep, i]], mesh.nodes[bnd[keep, j]]
        cross = p[:, 0] * q[:, 1] - q[:, 0] * p[:, 1]
        out -= np.bincount(h[keep], weights=0.5 * cross, minlength=n_holes)
    return out


def boundary_loops(mesh: Mesh) -> tuple[np.ndarray, np.ndarray, int]:
    """Boundary nodes, the hole each lies on (-1: an outer boundary), and the number of holes.

    The boundary edges, oriented as in their element (material on the left), form closed
    loops; a loop enclosing positive area is an outer boundary, negative area a hole. This
    uses the mesh alone (no geometric tolerance), so curved boundaries are classified as well.
    """
    bnd3 = mesh.edges.nodes[mesh.edges.boundary]  # corner a, corner b, mid-side node
    bnd = bnd3[:, :2]
    nodes = np.unique(bnd3)  # corners and mid-side nodes of the boundary edges
    n = mesh.n_nodes
    # the mid-side node of a boundary edge joins the loop of its corners
    links = np.vstack([bnd, bnd3[:, [0, 2]]])
    graph = sp.coo_matrix((np.ones(len(links)), (links[:, 0], links[:, 1])), shape=(n, n))
    _, label = connected_components(graph, directed=False)
    p, q = mesh.nodes[bnd[:, 0]], mesh.nodes[bnd[:, 1]]
    c = mesh.nodes[nodes].mean(axis=0)  # shift for round-off
    cross = (p[:, 0] - c[0]) * (q[:, 1] - c[1]) - (q[:, 0] - c[0]) * (p[:, 1] - c[1])
    comp = label[bnd[:, 0]]
    uniq, comp_index = np.unique(comp, return_inverse=True)
    area = np.bincount(comp_index, weights=0.5 * cross)
    hole_of_comp = np.full(len(uniq), -1)
    holes = np.flatnonzero(area < 0)
    hole_of_comp[holes] = np.arange(len(holes))
    lookup = dict(zip(uniq.tolist(), hole_of_comp.tolist(), strict=True))
    which = np.array([lookup[v] for v in label[nodes].tolist()], dtype=np.int64) if len(nodes) else \
        np.zeros(0, dtype=np.int64)
    return nodes, which, len(holes)


def prandtl_lower_bound(mesh: Mesh, evc: ElementValues, stiffness: sp.csr_matrix,
                        method: str = "auto") -> tuple[float, np.ndarray]:
    """Lower bound J_low from the Prandtl stress function on the mesh.

    Parameters
    ----------
    mesh : Mesh
        The mesh.
    evc : ElementValues
        Basis values (any origin).
    stiffness : scipy.sparse.csr_matrix
        The Laplacian stiffness matrix of the mesh (the one of the warping problem).
    method : str
        Linear solver (see :class:`warpwise.fem.solve.SPDFactor`).

    Returns
    -------
    float
        J_low, L^4.
    numpy.ndarray
        Nodal stress function phi (n,), L^2 (phi = 0 on outer boundaries).
    """
    n = mesh.n_nodes
    bnodes, which, n_holes = boundary_loops(mesh)
    # reduced unknowns: interior nodes, then one per hole; outer boundary nodes are zero
    is_bnd = np.zeros(n, bool)
    is_bnd[bnodes] = True
    col = np.full(n, -1)
    free = np.flatnonzero(~is_bnd)
    col[free] = np.arange(len(free))
    hole_nodes = bnodes[which >= 0]
    col[hole_nodes] = len(free) + which[which >= 0]
    m = len(free) + n_holes
    rows = np.flatnonzero(col >= 0)
    P = sp.csr_matrix((np.ones(len(rows)), (rows, col[rows])), shape=(n, m))
    # load 2 int N_i dA, plus 2 A_k on each hole unknown
    local = 2.0 * np.einsum("mq,qk->mk", evc.dA, evc.N)
    f = assemble_vector(mesh, local)
    hole_area = _hole_areas(mesh, bnodes, which, n_holes)
    fr = P.T @ f
    fr[len(free):] += 2.0 * hole_area
    if m == 0:
        raise AnalysisError("the mesh has no interior node for the stress function")
    phi_r = SPDFactor((P.T @ stiffness @ P).tocsr(), method).solve(fr)
    phi = P @ phi_r
    return float(fr @ phi_r), phi
