"""Vertex patches of a triangle mesh, ordered around their vertex, grouped by size.

The patch of a vertex a is the fan of elements having a as a corner. Its hat function phi_a
(the linear Lagrange function of a, ``lambda_i`` on an element where a is corner i) makes a
partition of unity, ``sum_a phi_a = 1`` on every element; the equilibration splits the flux
residual with it (:mod:`.reconstruct`).

Every (element, corner) pair is one member of one patch, 3 m pairs in all. Each pair is seen
from its vertex: the element's corners are rotated so that the vertex is corner 0 (:data:`ROTATION`),
and then the pair's two edges through the vertex are its out-edge, local edge 0 (vertex ->
next corner, RT2 dofs 0, 1, 2) and its in-edge, local edge 2 (previous corner -> vertex, dofs
6, 7, 8). Around the vertex (clockwise), a pair's out-edge is the next pair's in-edge,
so the members of a patch are ordered by walking across out-edges: member j + 1 lies across
member j's out-edge. Edge j of the patch is member j's in-edge; an interior vertex has a closed
fan (k members, k edges, edge k being edge 0), a vertex on the outline an open one (member 0's
in-edge and member k - 1's out-edge on the outline, k - 1 inner edges). Patches of the same
number of members and kind are solved together; nothing loops over patches or elements.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ...mesh.core import Mesh

#: Rotation of the six local nodes that makes corner i the first one.
ROTATION = np.array([[0, 1, 2, 3, 4, 5], [1, 2, 0, 4, 5, 3], [2, 0, 1, 5, 3, 4]])


class PinchedVertexError(ValueError):
    """A vertex where parts of the mesh touch at one point only (its patch is not one fan)."""


@dataclass(frozen=True, eq=False)
class PatchGroup:
    """Patches with the same number of members and the same kind (closed or open fan).

    Attributes
    ----------
    vertex : numpy.ndarray
        Node index of each patch's vertex (p,).
    pair : numpy.ndarray
        Pair index 3 e + i (element e, corner i) of each member, in fan order (p, k).
    closed : bool
        True for interior vertices (closed fans), False on the outline.
    """

    vertex: np.ndarray
    pair: np.ndarray
    closed: bool

    @property
    def n_edges(self) -> int:
        """Inner edges through the vertex: k for a closed fan, k - 1 for an open one."""
        return self.pair.shape[1] - (0 if self.closed else 1)


def vertex_patches(mesh: Mesh) -> list[PatchGroup]:
    """The vertex patches of the mesh, in fan order, grouped by (members, closed).

    Raises
    ------
    PinchedVertexError
        If a vertex is on more than two outline edges (two fans touching at the vertex), or
        its elements do not make one fan.
    """
    el = mesh.elements
    edges = mesh.edges
    n, m = mesh.n_nodes, len(el)
    ends = edges.nodes[:, :2]
    outline_at = np.bincount(ends[edges.boundary].ravel(), minlength=n)
    if np.any(outline_at > 2):
        raise PinchedVertexError(f"{int(np.sum(outline_at > 2))} vertex(es) where the mesh is "
                                 "pinched (parts touching at one point)")
    vert = el[:, :3].ravel()
    elem = np.repeat(np.arange(m), 3)
    corner = np.tile(np.arange(3), m)
    out_e = edges.of_element[elem, corner]
    in_e = edges.of_element[elem, (corner + 2) % 3]
    # which end of the edge the vertex is; the pair that has an edge as in-edge at an end
    in_pair = np.full((len(ends), 2), -1, dtype=np.int64)
    in_pair[in_e, (ends[in_e, 1] == vert).astype(np.int64)] = np.arange(3 * m)
    succ = in_pair[out_e, (ends[out_e, 1] == vert).astype(np.int64)]  # -1: out-edge on the outline
    n_at = np.bincount(vert, minlength=n)
    # the first member: any one of a closed fan, the one after the outline of an open fan
    pair_order = np.argsort(vert, kind="stable")
    has = n_at > 0
    start = np.full(n, -1, dtype=np.int64)
    start[has] = pair_order[np.r_[0, np.cumsum(n_at)[:-1]][has]]
    opening = np.flatnonzero(edges.count[in_e] == 1)  # in-edge on the outline: an open fan's first
    start[vert[opening]] = opening
    verts = np.flatnonzero(n_at)
    closed = outline_at[verts] == 0
    key = 2 * n_at[verts] + closed
    order = np.argsort(key, kind="stable")
    verts, key = verts[order], key[order]
    bounds = np.r_[0, np.flatnonzero(np.diff(key)) + 1, len(key)]
    groups = []
    for s, t in zip(bounds[:-1], bounds[1:], strict=True):  # one step per patch size
        gv = verts[s:t]
        k, is_closed = int(n_at[gv[0]]), bool(outline_at[gv[0]] == 0)
        walk = np.empty((len(gv), k), dtype=np.int64)
        walk[:, 0] = start[gv]
        for j in range(1, k):  # one step per member: across the previous member's out-edge
            walk[:, j] = succ[walk[:, j - 1]]
            if np.any(walk[:, j] < 0):
                raise PinchedVertexError("the elements at a vertex do not make one fan")
        last = succ[walk[:, -1]]
        if np.any(last != (walk[:, 0] if is_closed else -1)):
            raise PinchedVertexError("the elements at a vertex do not make one fan")
        groups.append(PatchGroup(gv, walk, is_closed))
    return groups


__all__ = ["ROTATION", "PatchGroup", "PinchedVertexError", "vertex_patches"]
