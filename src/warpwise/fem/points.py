"""Fields of six-node elements at arbitrary points: the element holding each, values, gradients.

Vectorised over points and elements.

A point is located in the straight triangle of its element's corners (barycentric coordinates),
then its reference coordinates are refined by Newton's method on the isoparametric map, so
that a point of an element with a curved (arc) edge gets the right reference coordinates. A
point in the thin sliver between a curved boundary edge and its chord is outside every corner
triangle and is reported outside.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..mesh.core import Mesh
from .p2 import shape_functions


@dataclass(frozen=True, eq=False)
class Located:
    """Where points are in a mesh.

    Attributes
    ----------
    element : numpy.ndarray
        Index (p,) of the element holding each point (-1 outside the mesh).
    ref : numpy.ndarray
        Reference coordinates (p, 2) of each point in its element.
    inside : numpy.ndarray
        Boolean (p,): the point is in the mesh.
    """

    element: np.ndarray
    ref: np.ndarray
    inside: np.ndarray


#: Points times elements tested at once (memory of the barycentric test).
BLOCK = 4_000_000


def _corner_triangles(mesh: Mesh, pts: np.ndarray) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Best element (p,), its smallest barycentric coordinate (p,) and (xi, eta) (p, 2)."""
    corners = mesh.nodes[mesh.elements[:, :3]]  # (m, 3, 2)
    e1, e2 = corners[:, 1] - corners[:, 0], corners[:, 2] - corners[:, 0]
    det = e1[:, 0] * e2[:, 1] - e1[:, 1] * e2[:, 0]
    d = pts[:, None, :] - corners[None, :, 0]  # (p, m, 2)
    xi = (d[..., 0] * e2[:, 1] - d[..., 1] * e2[:, 0]) / det
    eta = (e1[:, 0] * d[..., 1] - e1[:, 1] * d[..., 0]) / det
    worst = np.minimum(np.minimum(xi, eta), 1.0 - xi - eta)  # (p, m)
    best = np.argmax(worst, axis=1)
    rows = np.arange(len(pts))
    return best, worst[rows, best], np.column_stack([xi[rows, best], eta[rows, best]])


def locate(mesh: Mesh, points: np.ndarray, tol: float = 1e-9) -> Located:
    """The element and reference coordinates of each point (p, 2), drawing coordinates L.

    ``tol`` is the relative slack of the barycentric test (a point on an edge is inside).
    """
    pts = np.asarray(points, dtype=float).reshape(-1, 2)
    block = max(1, BLOCK // max(mesh.n_elements, 1))
    parts = [_corner_triangles(mesh, pts[i:i + block]) for i in range(0, len(pts), block)]
    best = np.concatenate([b for b, _, _ in parts])
    inside = np.concatenate([w for _, w, _ in parts]) >= -tol
    ref = np.concatenate([r for _, _, r in parts])
    X = mesh.nodes[mesh.elements[best]]  # (p, 6, 2)
    for _ in range(4):  # Newton on the isoparametric map (exact at once for straight edges)
        N, dN = shape_functions(ref)
        J = np.einsum("pki,pkj->pij", X, dN)  # dx_i / dxi_j
        r = pts - np.einsum("pk,pki->pi", N, X)
        ref = np.clip(ref + np.linalg.solve(J, r[..., None])[..., 0], -tol, 1.0 + tol)
    return Located(np.where(inside, best, -1), ref, inside)


def value_at(mesh: Mesh, nodal: np.ndarray, at: Located) -> np.ndarray:
    """Values (p,) of a P2 field with nodal values ``nodal`` (n,) at located points (unit U)."""
    N, _ = shape_functions(at.ref)
    return np.einsum("pk,pk->p", N, nodal[mesh.elements[at.element]])


def gradient_at(mesh: Mesh, nodal: np.ndarray, at: Located) -> np.ndarray:
    """Gradient (p, 2) of a P2 field at located points, U per drawing unit L."""
    N, dN = shape_functions(at.ref)
    X = mesh.nodes[mesh.elements[at.element]]
    J = np.einsum("pki,pkj->pij", X, dN)
    g_ref = np.einsum("pk,pkj->pj", nodal[mesh.elements[at.element]], dN)  # d/dxi_j
    return np.linalg.solve(np.transpose(J, (0, 2, 1)), g_ref[..., None])[..., 0]


__all__ = ["Located", "gradient_at", "locate", "value_at"]
