"""Six-node triangle: shape functions, quadrature and vectorised assembly.

Everything here works on arrays over (element, quadrature point); Python loops run only over
the 6 x 6 local basis-function pairs. Sparse matrices are built once from COO triplets.

Node order of an element: corners 0, 1, 2 counter-clockwise, then the mid-side nodes of edges
(0, 1), (1, 2), (2, 0). The mapping is isoparametric, so elements with a curved edge (mid-side
node off the chord) are handled by the same code.

Examples
--------
>>> N, dN = shape_functions(np.array([[1.0 / 3.0, 1.0 / 3.0]]))
>>> round(float(N.sum()), 12), round(float(dN.sum()), 12)
(1.0, 0.0)

"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
import scipy.sparse as sp

from ..mesh.core import Mesh


@dataclass(frozen=True)
class QuadratureRule:
    """A quadrature rule on the reference triangle (0,0), (1,0), (0,1).

    Attributes
    ----------
    points : numpy.ndarray
        Reference coordinates (q, 2).
    weights : numpy.ndarray
        Weights (q,), summing to the reference area 1/2.
    degree : int
        Polynomial degree integrated exactly.

    """

    points: np.ndarray
    weights: np.ndarray
    degree: int


def _symmetric_rule(groups: list[tuple[float, float]], degree: int) -> QuadratureRule:
    """Rule from (a, w) groups of the orbit (1-2a, a, a) in area coordinates."""
    pts, wts = [], []
    for a, w in groups:
        b = 1.0 - 2.0 * a
        for _l1, l2, l3 in ((b, a, a), (a, b, a), (a, a, b)):
            pts.append((l2, l3))
            wts.append(0.5 * w)
    return QuadratureRule(np.array(pts), np.array(wts), degree)


#: Six-point rule exact to degree 4 (Dunavant 1985, Int. J. Numer. Meth. Eng. 21).
DEGREE_4 = _symmetric_rule(
    [(0.445948490915965, 0.223381589678011), (0.091576213509771, 0.109951743655322)], 4
)


def shape_functions(ref: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Values and reference derivatives of the six quadratic shape functions.

    Parameters
    ----------
    ref : numpy.ndarray
        Reference coordinates (q, 2) as (xi, eta).

    Returns
    -------
    N : numpy.ndarray
        Values (q, 6).
    dN : numpy.ndarray
        Derivatives (q, 6, 2) with respect to (xi, eta).

    """
    xi, eta = ref[:, 0], ref[:, 1]
    L = np.stack([1.0 - xi - eta, xi, eta], axis=1)
    dL = np.array([[-1.0, -1.0], [1.0, 0.0], [0.0, 1.0]])  # dL_i / d(xi, eta)
    N = np.empty((len(ref), 6))
    dN = np.empty((len(ref), 6, 2))
    for i in range(3):
        N[:, i] = L[:, i] * (2.0 * L[:, i] - 1.0)
        dN[:, i, :] = (4.0 * L[:, i] - 1.0)[:, None] * dL[i]
    for k, (i, j) in enumerate(((0, 1), (1, 2), (2, 0))):
        N[:, 3 + k] = 4.0 * L[:, i] * L[:, j]
        dN[:, 3 + k, :] = 4.0 * (L[:, j][:, None] * dL[i] + L[:, i][:, None] * dL[j])
    return N, dN


@dataclass(frozen=True, eq=False)
class ElementValues:
    """Shape functions and their physical gradients at every quadrature point of every element.

    Attributes
    ----------
    N : numpy.ndarray
        Shape function values (q, 6), the same on every element.
    grad : numpy.ndarray
        Physical gradients (m, q, 6, 2), per unit drawing length.
    dA : numpy.ndarray
        Quadrature weight times Jacobian (m, q), drawing unit squared.
    xy : numpy.ndarray
        Physical coordinates of the quadrature points (m, q, 2), drawing unit.

    """

    N: np.ndarray
    grad: np.ndarray
    dA: np.ndarray
    xy: np.ndarray


def _jacobians(X: np.ndarray, dN: np.ndarray) -> tuple[np.ndarray, ...]:
    """Entries j00, j01, j10, j11 and determinant (each (m, q)) of the isoparametric map.

    From coordinates relative to each element's first corner (the derivatives do not change,
    and the round-off of large absolute coordinates is avoided).

    Raises
    ------
    ValueError
        If an element is inverted or degenerate (non-positive Jacobian).
    """
    rel = X - X[:, :1, :]
    x, y = rel[..., 0], rel[..., 1]
    a, b = dN[..., 0], dN[..., 1]  # (q, 6): d N / d xi, d N / d eta
    j00, j01, j10, j11 = x @ a.T, x @ b.T, y @ a.T, y @ b.T  # (m, q): d x_i / d xi_j
    det = j00 * j11 - j01 * j10
    if np.any(det <= 0):
        raise ValueError(f"{int(np.sum(np.any(det <= 0, axis=1)))} element(s) are inverted")
    return j00, j01, j10, j11, det


def _physical_gradients(X: np.ndarray, dN: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Physical gradients (m, q, 6, 2) and Jacobians (m, q) of the isoparametric map.

    The Jacobian is formed from coordinates relative to each element's first corner (the map's
    derivatives do not change, and the round-off of large absolute coordinates is avoided),
    by four small matrix products over all elements at once.
    """
    a, b = dN[..., 0], dN[..., 1]  # (q, 6): d N / d xi, d N / d eta
    j00, j01, j10, j11, det = _jacobians(X, dN)
    r = 1.0 / det
    grad = np.empty((X.shape[0], dN.shape[0], dN.shape[1], 2))
    grad[..., 0] = a * (j11 * r)[..., None] - b * (j10 * r)[..., None]
    grad[..., 1] = b * (j00 * r)[..., None] - a * (j01 * r)[..., None]
    return grad, det


def element_values(
    mesh: Mesh, origin: tuple[float, float] = (0.0, 0.0), rule: QuadratureRule = DEGREE_4
) -> ElementValues:
    """Evaluate the basis on every element, coordinates taken relative to ``origin``.

    Parameters
    ----------
    mesh : Mesh
        Six-node triangle mesh.
    origin : (float, float)
        Point subtracted from all coordinates (e.g. the centroid), drawing unit.
    rule : QuadratureRule
        Quadrature rule.

    Returns
    -------
    ElementValues

    Raises
    ------
    ValueError
        If an element is inverted or degenerate (non-positive Jacobian).

    """
    N, dN = shape_functions(rule.points)
    X = mesh.nodes[mesh.elements] - np.asarray(origin, dtype=float)  # (m, 6, 2)
    grad, det = _physical_gradients(X, dN)
    xy = np.stack([X[..., 0] @ N.T, X[..., 1] @ N.T], axis=-1)
    return ElementValues(N, grad, det * rule.weights, xy)


def assemble_vector(mesh: Mesh, local: np.ndarray) -> np.ndarray:
    """Scatter element vectors (m, 6) or (m, 6, r) into a global vector (n,) or (n, r)."""
    idx = mesh.elements.ravel()
    if local.ndim == 2:
        return np.bincount(idx, weights=local.ravel(), minlength=mesh.n_nodes)
    flat = local.reshape(-1, local.shape[2])
    return np.stack(
        [np.bincount(idx, weights=flat[:, c], minlength=mesh.n_nodes) for c in range(flat.shape[1])],
        axis=1,
    )


#: A mid-side node counts as on its chord (element straight-sided) when it lies within this
#: many units of round-off (machine epsilon times the element's coordinate magnitude) of the
#: chord midpoint; the mesher computes it as 0.5 * (a + b), exact to 1 ulp.
STRAIGHT_TOLERANCE_ULPS = 16.0

#: Local (row, column) pairs k <= l of the 6 x 6 element matrix, and where each of the 36
#: entries finds its value among them (symmetry by construction, not by round-off).
_UPPER = np.triu_indices(6)
_FROM_UPPER = np.empty((6, 6), dtype=np.intp)
_FROM_UPPER[_UPPER] = np.arange(len(_UPPER[0]))
_FROM_UPPER[_UPPER[::-1]] = np.arange(len(_UPPER[0]))
_FROM_UPPER = _FROM_UPPER.ravel()


def straight_sided(X: np.ndarray, scale: float = 0.0) -> np.ndarray:
    """Mask (m,) of elements (node coordinates X, (m, 6, 2)) with mid-side nodes on the chords.

    Such elements have a constant Jacobian; the others are curved (isoparametric). The
    round-off allowed is that of the element's coordinates, or of ``scale`` when larger: pass
    the mesh's coordinate magnitude when nodes were computed from other, larger coordinates (a
    mirrored mesh puts a node at 2 c - x, exact only to the round-off of c).
    """
    corners = X[:, :3]
    off = X[:, 3:] - 0.5 * (corners + np.roll(corners, -1, axis=1))  # edges (0,1), (1,2), (2,0)
    off = np.abs(off).reshape(len(X), -1).max(axis=1)
    size = np.maximum(np.abs(X).reshape(len(X), -1).max(axis=1), scale)
    return off <= STRAIGHT_TOLERANCE_ULPS * np.finfo(float).eps * size


def _reference_products(ev: ElementValues) -> np.ndarray:
    """Products of reference derivatives at the quadrature points of ``ev``, (3 q, 21).

    Row ``3 p + t`` holds, for the local pairs k <= l, ``a_k b_l`` (t = 0: xi xi, t = 1:
    eta eta) and ``a_k b_l + b_k a_l`` (t = 2) with a = dN/dxi, b = dN/deta at point p.
    The points are read back from ``ev.N`` (P2 reproduces linear fields exactly).
    """
    _, dN = shape_functions(ev.N @ NODE_POINTS)
    a, b = dN[:, :, 0], dN[:, :, 1]
    k, l = _UPPER
    prod = np.stack([a[:, k] * a[:, l], b[:, k] * b[:, l], a[:, k] * b[:, l] + b[:, k] * a[:, l]],
                    axis=1)  # (q, 3, 21)
    return prod.reshape(-1, len(k))


def _local_stiffness_straight(corners: np.ndarray, w: np.ndarray, ev: ElementValues) -> np.ndarray:
    """Upper triangles (m, 21) of straight-sided element matrices, by one matrix product.

    With a constant Jacobian J, grad N_k = J^-T (dN_k/dxi, dN_k/deta), so
    ke_kl = sum_p w_p (dN_k)^T B (dN_l) with B = J^-1 J^-T = adj(J) adj(J)^T / det(J)^2
    (three distinct entries). Hence ke = C @ R with C (m, 3 q) = w_p * B_t and R the
    reference products: no per-point gradients needed.
    """
    X = corners  # (m, 3, 2)
    j00, j10 = (X[:, 1] - X[:, 0]).T  # d(x, y)/dxi
    j01, j11 = (X[:, 2] - X[:, 0]).T  # d(x, y)/deta
    det = j00 * j11 - j01 * j10
    inv_det2 = 1.0 / (det * det)
    B = np.stack([(j11 * j11 + j01 * j01) * inv_det2, (j10 * j10 + j00 * j00) * inv_det2,
                  -(j11 * j10 + j01 * j00) * inv_det2], axis=1)  # (m, 3)
    C = (w[:, :, None] * B[:, None, :]).reshape(len(X), -1)
    return C @ _reference_products(ev)


def _local_stiffness_general(grad: np.ndarray, w: np.ndarray, block: int = 16384) -> np.ndarray:
    """Upper triangles (c, 21) of element matrices from gradients at the points (curved).

    Works in blocks of elements to bound the (block, q, 21) temporaries.
    """
    k, l = _UPPER
    out = np.empty((len(w), len(k)))
    for s in range(0, len(w), block):
        g = grad[s:s + block]
        out[s:s + block] = np.einsum("cq,cqk->ck", w[s:s + block],
                                     g[:, :, k, 0] * g[:, :, l, 0] + g[:, :, k, 1] * g[:, :, l, 1])
    return out


def stiffness_matrix(mesh: Mesh, ev: ElementValues,
                     coefficient: np.ndarray | None = None) -> sp.csr_matrix:
    """Global matrix of the form integral of c grad(u) . grad(v) dA, symmetric, CSR.

    Straight-sided elements (constant Jacobian, mid-side nodes on their chords) get their element
    matrices from one dense product over all elements; curved (isoparametric) elements use
    the gradients at the quadrature points of ``ev``. Both apply the quadrature of ``ev``
    (which integrates the degree-2 integrand of a straight P2 element exactly), so the two
    ways agree to round-off on straight elements. Element matrices are symmetric bit for bit,
    and so is the result (two distinct nodes share at most two elements, and a + b = b + a).

    Parameters
    ----------
    mesh : Mesh
        The mesh.
    ev : ElementValues
        Basis values on the mesh.
    coefficient : numpy.ndarray, optional
        Element-wise coefficient c (m,), e.g. the shear modulus ratio; default 1.

    Returns
    -------
    scipy.sparse.csr_matrix
        (n, n) matrix, drawing unit**0 (dimensionless for c = 1).

    Examples
    --------
    >>> from warpwise.geometry.shapes import rectangle
    >>> from warpwise.mesh import build_mesh
    >>> mesh = build_mesh(rectangle(2.0, 1.0), size=0.5)
    >>> K = stiffness_matrix(mesh, element_values(mesh))
    >>> float(abs(K @ np.ones(mesh.n_nodes)).max()) < 1e-12, float(abs(K - K.T).max())
    (True, 0.0)

    """
    w = ev.dA if coefficient is None else ev.dA * np.asarray(coefficient, dtype=float)[:, None]
    X = mesh.nodes[mesh.elements]
    straight = straight_sided(X)
    if straight.all():
        upper = _local_stiffness_straight(X[:, :3], w, ev)
    else:
        upper = np.empty((mesh.n_elements, len(_UPPER[0])))
        curved = ~straight
        upper[curved] = _local_stiffness_general(ev.grad[curved], w[curved])
        if straight.any():
            upper[straight] = _local_stiffness_straight(X[straight, :3], w[straight], ev)
    ke = np.take(upper, _FROM_UPPER, axis=1)
    del X, upper, w  # release before the triplets are built (peak memory)
    return sparse_from_local(mesh, ke)


def sparse_from_local(mesh: Mesh, ke: np.ndarray) -> sp.csr_matrix:
    """Build a CSR matrix from element matrices (m, 6, 6) or (m, 36) by summing COO triplets.

    Indices are 32-bit when the node count allows (what scipy would convert them to anyway),
    so the triplets cost half the memory and no conversion pass.
    """
    n = mesh.n_nodes
    e = mesh.elements
    e = e.astype(np.int32 if n < np.iinfo(np.int32).max else np.int64, copy=False)
    rows = np.repeat(e, 6, axis=1).ravel()
    cols = np.tile(e, (1, 6)).ravel()
    mat = sp.csr_matrix((np.ascontiguousarray(ke).reshape(-1), (rows, cols)), shape=(n, n))
    mat.sum_duplicates()
    return mat


def integrate(ev: ElementValues, values: np.ndarray, weight: np.ndarray | None = None) -> float:
    """Integral over the mesh of a field given at quadrature points (m, q).

    Parameters
    ----------
    ev : ElementValues
        Basis values on the mesh.
    values : numpy.ndarray
        Integrand at the quadrature points, (m, q).
    weight : numpy.ndarray, optional
        Element-wise weight (m,), e.g. a modulus ratio.

    Returns
    -------
    float
        The integral, integrand unit times drawing unit squared.

    """
    w = ev.dA if weight is None else ev.dA * weight[:, None]
    return float(np.einsum("mq,mq->", w, values))


def interpolate(mesh: Mesh, ev: ElementValues, nodal: np.ndarray) -> np.ndarray:
    """Values (m, q) at the quadrature points of a nodal P2 field (n,)."""
    return nodal[mesh.elements] @ ev.N.T


def gradient(mesh: Mesh, ev: ElementValues, nodal: np.ndarray) -> np.ndarray:
    """Gradient (m, q, 2) at the quadrature points of a nodal P2 field (n,)."""
    return np.einsum("mk,mqki->mqi", nodal[mesh.elements], ev.grad)


#: Reference coordinates of the six nodes of the element.
NODE_POINTS = np.array([[0, 0], [1, 0], [0, 1], [0.5, 0], [0.5, 0.5], [0, 0.5]], dtype=float)


def nodal_gradient(mesh: Mesh, nodal: np.ndarray, elements: np.ndarray | None = None) -> np.ndarray:
    """Gradient (n, 2) of a P2 field at the nodes, averaged over the elements meeting there.

    The gradient is evaluated at each element's own six nodes and averaged with Jacobian
    (local area) weights, vectorised over elements.

    Parameters
    ----------
    mesh : Mesh
        The mesh.
    nodal : numpy.ndarray
        Nodal values (n,), any unit U.
    elements : numpy.ndarray, optional
        Boolean mask (m,) of the elements to average over (e.g. one material, so that a
        gradient that jumps at an interface is not mixed); nodes outside them get nan.

    Returns
    -------
    numpy.ndarray
        (n, 2) gradient, U per drawing unit.
    """
    conn = mesh.elements if elements is None else mesh.elements[elements]
    _, dN = shape_functions(NODE_POINTS)
    j00, j01, j10, j11, det = _jacobians(mesh.nodes[conn], dN)
    u = nodal[conn]  # (m, 6)
    g_xi, g_eta = u @ dN[..., 0].T, u @ dN[..., 1].T  # (m, 6 nodes): reference derivatives
    # physical gradient J^-T (g_xi, g_eta), weighted by det for the average: det cancels
    wx, wy = g_xi * j11 - g_eta * j10, g_eta * j00 - g_xi * j01
    idx = conn.ravel()
    total = np.bincount(idx, weights=det.ravel(), minlength=mesh.n_nodes)
    with np.errstate(invalid="ignore", divide="ignore"):
        gx = np.bincount(idx, weights=wx.ravel(), minlength=mesh.n_nodes) / total
        gy = np.bincount(idx, weights=wy.ravel(), minlength=mesh.n_nodes) / total
    return np.column_stack([gx, gy])
