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
import shapely

from .errors import AnalysisError
from .fem import ElementValues
from .mesh import Mesh, boundary_edges
from .solve import SPDFactor


def _boundary_loops(mesh: Mesh, holes: list[shapely.LinearRing], tol: float) -> tuple[
        np.ndarray, np.ndarray]:
    """Boundary nodes and, for each, the hole index it lies on (-1 for an outer boundary)."""
    bnd = boundary_edges(mesh.elements)
    nodes = np.unique(bnd)
    which = np.full(len(nodes), -1)
    if holes:
        pts = shapely.points(mesh.nodes[nodes])
        for k, ring in enumerate(holes):
            near = shapely.distance(pts, ring) < tol
            which[near] = k
    return nodes, which


def prandtl_lower_bound(mesh: Mesh, evc: ElementValues, stiffness: sp.csr_matrix,
                        hole_rings: list[shapely.LinearRing], tol: float,
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
    hole_rings : list of shapely.LinearRing
        Boundaries of the holes of the material (interiors of the profile's union).
    tol : float
        Distance within which a boundary node lies on a hole ring, drawing unit.
    method : str
        Linear solver (see :class:`warpwise.solve.SPDFactor`).

    Returns
    -------
    float
        J_low, L^4.
    numpy.ndarray
        Nodal stress function phi (n,), L^2 (phi = 0 on outer boundaries).
    """
    n = mesh.n_nodes
    bnodes, which = _boundary_loops(mesh, hole_rings, tol)
    n_holes = len(hole_rings)
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
    f = np.bincount(mesh.elements.ravel(), weights=local.ravel(), minlength=n)
    hole_area = np.array([shapely.Polygon(r).area for r in hole_rings])
    fr = P.T @ f
    fr[len(free):] += 2.0 * hole_area
    if m == 0:
        raise AnalysisError("the mesh has no interior node for the stress function")
    phi_r = SPDFactor((P.T @ stiffness @ P).tocsr(), method).solve(fr)
    phi = P @ phi_r
    return float(fr @ phi_r), phi
