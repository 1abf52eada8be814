"""Guaranteed lower bounds on J: an equilibrated flux, or the Prandtl stress function.

The warping (displacement) solution over-estimates the torsional stiffness of the discrete
section; any statically admissible stress field under-estimates it. Together they bracket the
true J of the meshed domain (exactly the profile for straight-sided outlines):

    J_low <= J <= J_up.

:func:`torsion_lower_bound` picks the method. On a mesh of straight-sided elements (composite
sections included) it is the equilibrated flux (:func:`flux_lower_bound`): the warping stress
tau_h = c (grad psi_h - w), w = (y, -x) about the centroid and c = G / G_ref, reconstructed
patch by patch into an RT2 field sigma with div sigma = 0 on every element and sigma . n = 0
on the outline (:mod:`warpwise.fem.flux`), at O(n) cost and with no second factorisation. Every
such sigma gives, by the principle of minimum complementary energy (Prager & Synge 1947, the
hypercircle; Braess & Schoeberl 2008, Math. Comp. 77),

    J_low = -int (2 sigma . w + |sigma|^2 / c) dA  <=  J,

since for sigma = tau + delta (delta divergence-free, no normal flux) the value is
J - int |delta|^2 / c dA, the cross term int delta . grad psi vanishing for the single-valued
exact warping psi. With the Galerkin property of psi_h the gap is exactly
J_h - J_low = sum_e int_e |sigma - tau_h|^2 / c dA, an element-wise error indicator. On meshes
with curved (isoparametric) elements the reconstruction is not exact, and a homogeneous section
uses the Prandtl stress function instead (:func:`prandtl_lower_bound`, below; a second
factorisation); a composite section with curved elements gets no lower bound.

Prandtl's problem: laplace(phi) = -2 with phi = 0 on every outer boundary and phi = c_k, an
unknown constant, on the boundary of hole k. Minimising
int (|grad phi|^2 / 2 - 2 phi) dA - 2 sum_k c_k A_k over the P2 space (each hole's boundary
nodes tied to one unknown) gives the single-valuedness condition of the warping around each hole
as the natural condition, and J_low = 2 int phi dA + 2 sum_k c_k A_k. Galerkin orthogonality
makes J_low equal to minus twice the minimum, hence below the exact value.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
import scipy.sparse as sp
from scipy.sparse.csgraph import connected_components

from ..errors import AnalysisError
from ..fem.flux.patches import PinchedVertexError
from ..fem.flux.reconstruct import CurvedElementsError, Flux, equilibrate
from ..fem.p2 import ElementValues, assemble_vector
from ..fem.solve import SPDFactor
from ..mesh.core import Mesh

#: Names of the lower-bound methods (:func:`torsion_lower_bound`).
FLUX, PRANDTL = "equilibrated flux", "Prandtl stress function"


@dataclass(frozen=True, eq=False)
class FluxBound:
    """The equilibrated-flux lower bound on J and what comes with it.

    Attributes
    ----------
    J_low : float
        -int (2 sigma . w + |sigma|^2 / c) dA, L^4 (over G_ref for a composite section).
    indicator : numpy.ndarray
        (m,) int_e |sigma - tau_h|^2 / c dA per element, L^4; their sum is J_up - J_low.
    J_up : float
        J of the same warping function, int c (|w|^2 - w . grad psi_h) dA, L^4.
    flux : Flux
        The reconstructed RT2 flux.
    """

    J_low: float
    indicator: np.ndarray
    J_up: float
    flux: Flux


def flux_lower_bound(mesh: Mesh, evc: ElementValues, centroid, psi: np.ndarray,
                     G: np.ndarray | None = None) -> FluxBound:
    """Lower bound J_low from an equilibrated reconstruction of the warping stress.

    Parameters
    ----------
    mesh : Mesh
        A mesh of straight-sided elements.
    evc : ElementValues
        Basis values (not needed by the flux, which integrates on the reference element; taken
        so that both bounds are called alike).
    centroid : (float, float)
        The (modulus-weighted) centroid the warping function refers to, drawing unit.
    psi : numpy.ndarray
        The Galerkin warping function (n,), L^2.
    G : numpy.ndarray, optional
        Element shear modulus ratios G / G_ref (m,) of a composite section.

    Returns
    -------
    FluxBound

    Raises
    ------
    CurvedElementsError
        On a mesh with curved elements.
    PinchedVertexError
        On a mesh pinched at a vertex.

    Examples
    --------
    >>> from warpwise.properties.analysis import analyse
    >>> from warpwise.geometry.shapes import rectangle
    >>> r = analyse(rectangle(20.0, 10.0), 2.0)
    >>> b = flux_lower_bound(r.mesh, r.basis, r.weighted.centroid, r.torsion.psi)
    >>> bool(b.J_low < r.torsion.J), bool(abs(b.J_up - b.J_low - b.indicator.sum()) < 1e-9 * b.J_up)
    (True, True)
    """
    flux = equilibrate(mesh, centroid, psi, G)
    return FluxBound(flux.complementary, flux.indicator, flux.warping, flux)


def torsion_lower_bound(mesh: Mesh, evc: ElementValues, centroid, psi: np.ndarray,
                        stiffness: sp.csr_matrix, G: np.ndarray | None = None,
                        method: str = "auto") -> tuple[float | None, str | None, np.ndarray | None]:
    """The guaranteed lower bound on J by the method that fits the mesh.

    Straight-sided meshes (every element): the equilibrated flux, any materials. Meshes with
    curved elements: the Prandtl stress function for one material (``G`` None or constant),
    none for a composite section.

    Parameters
    ----------
    mesh, evc, centroid, psi, G
        As for :func:`flux_lower_bound`.
    stiffness : scipy.sparse.csr_matrix
        The warping problem's stiffness matrix (for the Prandtl fallback).
    method : str
        Linear solver of the Prandtl fallback (see :class:`warpwise.fem.solve.SPDFactor`).

    Returns
    -------
    (float or None, str or None, numpy.ndarray or None)
        J_low (L^4), the method used (:data:`FLUX` or :data:`PRANDTL`) and, for the flux, the
        element indicators (:attr:`FluxBound.indicator`); (None, None, None) without a bound.
    """
    try:
        bound = flux_lower_bound(mesh, evc, centroid, psi, G)
        return bound.J_low, FLUX, bound.indicator
    except (CurvedElementsError, PinchedVertexError):
        pass
    if G is not None and np.ptp(np.asarray(G, dtype=float)) > 0:
        return None, None, None
    J_low, _ = prandtl_lower_bound(mesh, evc, stiffness, method)
    if G is not None:  # one material given as a composite of equal moduli: K carries G
        J_low = float(J_low * np.asarray(G, dtype=float)[0] ** 2)
    return J_low, PRANDTL, None


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
