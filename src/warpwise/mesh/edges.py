"""Edges of a triangle mesh, derived once: unique edges, element-to-edge map, boundary, interfaces.

Local edge k of an element joins corners (0, 1), (1, 2), (2, 0) for k = 0, 1, 2; on a
six-node element its mid-side node is node 3 + k. Each unique edge is stored as it runs in the
first element that has it (corner a, corner b, mid-side node), so a boundary edge keeps the
orientation of its only element: material on its left.

Examples
--------
>>> two = np.array([[0, 1, 2, 4, 5, 6], [1, 3, 2, 7, 8, 5]])
>>> e = mesh_edges(two)
>>> len(e.nodes), len(e.boundary), e.nodes[e.boundary].tolist()[0]
(5, 4, [0, 1, 4])
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

#: Corners of local edge k, and its mid-side node on a six-node element.
LOCAL_EDGES = np.array([[0, 1, 3], [1, 2, 4], [2, 0, 5]])


@dataclass(frozen=True, eq=False)
class Edges:
    """The unique edges of a mesh.

    Attributes
    ----------
    nodes : numpy.ndarray
        (e, 3) corner a, corner b, mid-side node (-1 on a three-node mesh), oriented as in the
        first element holding the edge.
    of_element : numpy.ndarray
        (m, 3) index of the unique edge of each element's local edges 0, 1, 2.
    count : numpy.ndarray
        (e,) number of elements sharing each edge (1 on the boundary, 2 inside).
    boundary : numpy.ndarray
        Indices of the edges with one element (the outline), material on the left.
    interface : numpy.ndarray
        Indices of the edges between elements of different regions (material interfaces);
        empty without a region array.
    """

    nodes: np.ndarray
    of_element: np.ndarray
    count: np.ndarray
    boundary: np.ndarray
    interface: np.ndarray

    @property
    def outline_and_interfaces(self) -> np.ndarray:
        """Indices of boundary edges, then interface edges (each once)."""
        return np.concatenate([self.boundary, self.interface])


def mesh_edges(elements: np.ndarray, region: np.ndarray | None = None) -> Edges:
    """Derive the unique edges of a three- or six-node triangle mesh.

    Parameters
    ----------
    elements : numpy.ndarray
        Connectivity (m, 3) or (m, 6), corners counter-clockwise first.
    region : numpy.ndarray, optional
        Region index (m,) of each element, for the interface edges.

    Returns
    -------
    Edges
    """
    elements = np.asarray(elements)
    m = len(elements)
    corners = elements[:, LOCAL_EDGES[:, :2]].reshape(-1, 2)
    mid = elements[:, LOCAL_EDGES[:, 2]].reshape(-1) if elements.shape[1] >= 6 else \
        np.full(3 * m, -1, dtype=elements.dtype)
    pair = np.sort(corners, axis=1).astype(np.int64)
    # one integer per edge, ordered as the (low, high) pairs are (a 1-d unique is several times
    # faster than the row-wise one)
    key = pair[:, 0] * (int(pair.max(initial=0)) + 1) + pair[:, 1]
    _, first, inverse, count = np.unique(key, return_index=True, return_inverse=True,
                                         return_counts=True)
    inverse = inverse.reshape(-1)
    nodes = np.column_stack([corners[first], mid[first]])
    interface = np.zeros(0, dtype=np.int64)
    if region is not None:
        owner = np.repeat(np.asarray(region), 3)
        lo = np.full(len(first), np.iinfo(np.int64).max)
        hi = np.full(len(first), np.iinfo(np.int64).min)
        np.minimum.at(lo, inverse, owner)
        np.maximum.at(hi, inverse, owner)
        interface = np.flatnonzero((count > 1) & (lo != hi))
    return Edges(nodes, inverse.reshape(m, 3), count, np.flatnonzero(count == 1), interface)
