"""Vertex patches of a triangle mesh, grouped by size for batched dense solves.

The patch of a vertex a is the fan of elements having a as a corner. Its hat function phi_a
(the linear Lagrange function of a, ``lambda_i`` on an element where a is corner i) makes a
partition of unity, ``sum_a phi_a = 1`` on every element; the equilibration splits the flux
residual with it (:mod:`.reconstruct`).

Every (element, corner) pair is one member of one patch, 3 m pairs in all. Each pair is seen
from its vertex: the element's corners are rotated so that the vertex is corner 0, and then the
pair's two edges through the vertex are local edges 0 (vertex -> next corner) and 2 (previous
corner -> vertex), RT2 dofs 0, 1, 2 and 6, 7, 8 (:mod:`.p3`). Unknowns of one patch: the three
normal-flux values of each edge through the vertex, numbered in the direction the mesh stores
the edge (:class:`warpwise.mesh.edges.Edges`), then one multiplier per element (the element's
net outflow). The values of edges on the outline, and the multiplier of the patch's first
element (the multipliers are defined up to a constant on a patch whose boundary carries no
flux), are fixed: their rows and columns become those of the identity.

Patches of the same number of elements and of edges have unknowns of the same size and are
solved together; nothing loops over patches or elements.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ...mesh.core import Mesh

#: Rotation of the six local nodes that makes corner i the first one.
ROTATION = np.array([[0, 1, 2, 3, 4, 5], [1, 2, 0, 4, 5, 3], [2, 0, 1, 5, 3, 4]])
#: RT2 dofs of the pair's two edges through its vertex, in the rotated element.
FREE_DOFS = np.array([0, 1, 2, 6, 7, 8])


class PinchedVertexError(ValueError):
    """A vertex where parts of the mesh touch at one point only (its patch is not one fan)."""


@dataclass(frozen=True, eq=False)
class PatchGroup:
    """Patches with the same number of elements and of edges.

    Attributes
    ----------
    vertex : numpy.ndarray
        Node index of each patch's vertex (p,).
    pair : numpy.ndarray
        Pair index 3 e + i (element e, corner i) of each member of each patch (p, k).
    dof : numpy.ndarray
        Patch unknown of each of the pair's six free RT2 dofs (:data:`FREE_DOFS`), (p, k, 6).
    sign : numpy.ndarray
        +1 or -1 per free dof (-1 where the element runs the edge against the stored way), (p, k, 6).
    fixed : numpy.ndarray
        Unknowns held at zero (outline edges, the first multiplier), (p, size).
    n_edges : int
        Edges through the vertex (k for an interior vertex, k + 1 on the outline).
    """

    vertex: np.ndarray
    pair: np.ndarray
    dof: np.ndarray
    sign: np.ndarray
    fixed: np.ndarray
    n_edges: int

    @property
    def size(self) -> int:
        """Unknowns per patch: three per edge, one per element."""
        return 3 * self.n_edges + self.pair.shape[1]


def _ranks(keys: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Stable order of ``keys`` and the rank of each entry among equal keys."""
    order = np.argsort(keys, kind="stable")
    sorted_keys = keys[order]
    start = np.r_[0, np.flatnonzero(np.diff(sorted_keys)) + 1]
    run = np.repeat(start, np.diff(np.r_[start, len(keys)]))
    rank = np.empty(len(keys), dtype=np.int64)
    rank[order] = np.arange(len(keys)) - run
    return order, rank


def vertex_patches(mesh: Mesh) -> list[PatchGroup]:
    """The vertex patches of the mesh, grouped by (elements, edges).

    Raises
    ------
    PinchedVertexError
        If a vertex is on more than two outline edges (two fans touching at the vertex).
    """
    el = mesh.elements
    edges = mesh.edges
    n = mesh.n_nodes
    m = len(el)
    ends = edges.nodes[:, :2]
    n_edges_at = np.bincount(ends.ravel(), minlength=n)
    outline_at = np.bincount(ends[edges.boundary].ravel(), minlength=n)
    if np.any(outline_at > 2):
        raise PinchedVertexError(f"{int(np.sum(outline_at > 2))} vertex(es) where the mesh is "
                                 "pinched (parts touching at one point)")
    # rank of each edge among the edges at each of its two ends: its patch-local number
    _, loc = _ranks(ends.ravel())
    loc = loc.reshape(-1, 2)
    # the pairs: vertex, element, corner; and their position in their patch
    vert = el[:, :3].ravel()
    elem = np.repeat(np.arange(m), 3)
    corner = np.tile(np.arange(3), m)
    _, position = _ranks(vert)
    n_elems_at = np.bincount(vert, minlength=n)
    # the pair's edges through the vertex: element edge i (starts at the vertex) and i + 2
    # (ends there), rotated local edges 0 and 2
    local_edges = np.stack([corner, (corner + 2) % 3], axis=1)
    eid = edges.of_element[elem[:, None], local_edges]  # (3m, 2)
    first = el[elem[:, None], local_edges]  # first corner of the element's edge
    same = ends[eid, 0] == first
    side = (ends[eid, 1] == vert[:, None]).astype(np.int64)
    ploc = loc[eid, side]  # (3m, 2)
    k = np.arange(3)
    point = np.where(same[:, :, None], k, 2 - k)  # (3m, 2, 3)
    dof = (3 * ploc[:, :, None] + point).reshape(-1, 6)
    sign = np.repeat(np.where(same, 1.0, -1.0), 3, axis=1)
    # fixed outline edges: each outline edge at each of its two ends
    out_vert = ends[edges.boundary].ravel()
    out_loc = loc[edges.boundary].ravel()
    return _groups(vert, position, n_elems_at, n_edges_at, dof, sign, out_vert, out_loc)


def _groups(vert, position, n_elems_at, n_edges_at, dof, sign, out_vert, out_loc):
    """Split the pairs into patch groups of equal (elements, edges)."""
    verts = np.flatnonzero(n_elems_at)
    key = n_elems_at[verts] * (int(n_edges_at.max()) + 1) + n_edges_at[verts]
    order = np.argsort(key, kind="stable")
    verts, key = verts[order], key[order]
    patch_of = np.full(len(n_elems_at), -1)
    groups = []
    bounds = np.r_[0, np.flatnonzero(np.diff(key)) + 1, len(key)]
    # pairs sorted by vertex, then by position: row-major (patch, position) in each group
    pair_order = np.lexsort((position, vert))
    pair_start = np.r_[0, np.cumsum(n_elems_at)]
    for s, t in zip(bounds[:-1], bounds[1:], strict=True):  # one step per patch size
        gv = verts[s:t]
        k, ne = int(n_elems_at[gv[0]]), int(n_edges_at[gv[0]])
        patch_of[gv] = np.arange(len(gv))
        pairs = pair_order[pair_start[gv][:, None] + np.arange(k)]  # (p, k)
        fixed = np.zeros((len(gv), 3 * ne + k), dtype=bool)
        fixed[:, 3 * ne] = True  # the first element's multiplier
        here = np.flatnonzero(np.isin(out_vert, gv))
        rows = patch_of[out_vert[here]]
        for j in range(3):
            fixed[rows, 3 * out_loc[here] + j] = True
        groups.append(PatchGroup(gv, pairs, dof[pairs], sign[pairs], fixed, ne))
    return groups


__all__ = ["FREE_DOFS", "ROTATION", "PatchGroup", "PinchedVertexError", "vertex_patches"]
