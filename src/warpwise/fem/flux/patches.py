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
flux), are fixed: they are not unknowns, and their entries go to a discarded slot.

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
    """Patches with the same number of elements and of inner edges through the vertex.

    Attributes
    ----------
    vertex : numpy.ndarray
        Node index of each patch's vertex (p,).
    pair : numpy.ndarray
        Pair index 3 e + i (element e, corner i) of each member of each patch (p, k).
    dof : numpy.ndarray
        Patch unknown of each of the pair's six free RT2 dofs (:data:`FREE_DOFS`), -1 where
        the edge is on the outline (value zero), (p, k, 6).
    sign : numpy.ndarray
        +1 or -1 per free dof (-1 where the element runs the edge against the stored way), (p, k, 6).
    n_edges : int
        Inner edges through the vertex (k for an interior vertex, k - 1 on the outline).
    """

    vertex: np.ndarray
    pair: np.ndarray
    dof: np.ndarray
    sign: np.ndarray
    n_edges: int

    @property
    def size(self) -> int:
        """Unknowns per patch: three per inner edge, one per element but the first."""
        return 3 * self.n_edges + self.pair.shape[1] - 1


def _ranks(keys: np.ndarray) -> np.ndarray:
    """Rank of each entry among the entries of equal key (in order of appearance)."""
    order = np.argsort(keys, kind="stable")
    sorted_keys = keys[order]
    start = np.r_[0, np.flatnonzero(np.diff(sorted_keys)) + 1]
    run = np.repeat(start, np.diff(np.r_[start, len(keys)]))
    rank = np.empty(len(keys), dtype=np.int64)
    rank[order] = np.arange(len(keys)) - run
    return rank


def vertex_patches(mesh: Mesh) -> list[PatchGroup]:
    """The vertex patches of the mesh, grouped by (elements, inner edges).

    Raises
    ------
    PinchedVertexError
        If a vertex is on more than two outline edges (two fans touching at the vertex).
    """
    el = mesh.elements
    edges = mesh.edges
    n, m = mesh.n_nodes, len(el)
    ends = edges.nodes[:, :2]
    outline_at = np.bincount(ends[edges.boundary].ravel(), minlength=n)
    if np.any(outline_at > 2):
        raise PinchedVertexError(f"{int(np.sum(outline_at > 2))} vertex(es) where the mesh is "
                                 "pinched (parts touching at one point)")
    inner = edges.count == 2
    # patch-local number of each inner edge at each of its two ends (-1: an outline edge)
    loc = np.full(ends.shape, -1, dtype=np.int64)
    loc[inner] = _ranks(ends[inner].ravel()).reshape(-1, 2)
    n_inner_at = np.bincount(ends[inner].ravel(), minlength=n)
    # the pairs: vertex, element, corner; the pair's edges through the vertex are the
    # element's edge i (starting at the vertex) and i + 2 (ending there): rotated 0 and 2
    vert = el[:, :3].ravel()
    elem = np.repeat(np.arange(m), 3)
    corner = np.tile(np.arange(3), m)
    local_edges = np.stack([corner, (corner + 2) % 3], axis=1)
    eid = edges.of_element[elem[:, None], local_edges]  # (3m, 2)
    same = ends[eid, 0] == el[elem[:, None], local_edges]  # element runs the edge as stored
    ploc = loc[eid, (ends[eid, 1] == vert[:, None]).astype(np.int64)]  # (3m, 2)
    k = np.arange(3)
    point = np.where(same[:, :, None], k, 2 - k)  # (3m, 2, 3)
    dof = np.where(ploc[:, :, None] >= 0, 3 * ploc[:, :, None] + point, -1).reshape(-1, 6)
    sign = np.repeat(np.where(same, 1.0, -1.0), 3, axis=1)
    return _groups(vert, np.bincount(vert, minlength=n), n_inner_at, dof, sign)


def _groups(vert, n_elems_at, n_inner_at, dof, sign) -> list[PatchGroup]:
    """Split the pairs into patch groups of equal (elements, inner edges)."""
    verts = np.flatnonzero(n_elems_at)
    key = n_elems_at[verts] * (int(n_inner_at.max(initial=0)) + 1) + n_inner_at[verts]
    order = np.argsort(key, kind="stable")
    verts, key = verts[order], key[order]
    bounds = np.r_[0, np.flatnonzero(np.diff(key)) + 1, len(key)]
    pair_order = np.argsort(vert, kind="stable")  # pairs by vertex, each patch's in a row
    pair_start = np.r_[0, np.cumsum(n_elems_at)]
    groups = []
    for s, t in zip(bounds[:-1], bounds[1:], strict=True):  # one step per patch size
        gv = verts[s:t]
        k = int(n_elems_at[gv[0]])
        pairs = pair_order[pair_start[gv][:, None] + np.arange(k)]  # (p, k)
        groups.append(PatchGroup(gv, pairs, dof[pairs], sign[pairs], int(n_inner_at[gv[0]])))
    return groups


__all__ = ["FREE_DOFS", "ROTATION", "PatchGroup", "PinchedVertexError", "vertex_patches"]
