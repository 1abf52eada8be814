"""Filled contour bands of a field on a triangle mesh: one outline per band, in one pass.

A nodal field, linear on each triangle (the four straight sub-triangles of every six-node
element), is cut at the band edges: the part of a triangle between two edges is the convex
polygon whose corners are, walking the triangle's sides counter-clockwise, the corners inside
the band and the points where a side crosses a band edge. Every corner of such a piece is
named by what it is (a mesh node, or the crossing of one band edge on one mesh edge), and its
position is computed once from the mesh edge in a fixed direction, so two triangles that share
a side give the same points. The sides that two pieces of one band share cancel; what is left
is the outline of the band's region, chained into closed rings (even-odd filling then gives
the region, holes and all). All of it is numpy over every triangle at once: no Python loop
over elements or nodes.

Examples
--------
>>> nodes = np.array([[0.0, 0.0], [1.0, 0.0], [1.0, 1.0], [0.0, 1.0]])
>>> rings = band_rings(nodes, np.array([[0, 1, 2], [0, 2, 3]]), nodes[:, 0], [0.0, 0.5, 1.0])
>>> rings.band.tolist(), [len(p) for p in rings.rings()]
([0, 1], [5, 5])
>>> rings.rings()[0].tolist()  # the left half of the square: x from 0 to 0.5
[[0.0, 0.0], [0.5, 0.0], [0.5, 0.5], [0.5, 1.0], [0.0, 1.0]]
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np


@dataclass(frozen=True)
class Rings:
    """Closed rings of points, each belonging to one band.

    Attributes
    ----------
    points : numpy.ndarray
        Every ring's points (m, 2), drawing coordinates, ring after ring (not repeated at the end).
    start : numpy.ndarray
        Index of each ring's first point (r + 1,), the last entry m.
    band : numpy.ndarray
        Band of each ring (r,).
    """

    points: np.ndarray
    start: np.ndarray
    band: np.ndarray

    def rings(self) -> list[np.ndarray]:
        """The rings as separate (k, 2) arrays."""
        return [self.points[a:b] for a, b in zip(self.start[:-1], self.start[1:], strict=True)]

    @staticmethod
    def join(parts: list[Rings]) -> Rings:
        """Several sets of rings as one (the bands keep their numbers)."""
        parts = [p for p in parts if len(p.band)]
        if not parts:
            return Rings(np.zeros((0, 2)), np.zeros(1, np.int64), np.zeros(0, np.int64))
        offsets = np.cumsum([0] + [len(p.points) for p in parts])
        start = np.concatenate([p.start[:-1] + o for p, o in zip(parts, offsets, strict=False)]
                               + [offsets[-1:]])
        return Rings(np.vstack([p.points for p in parts]), start,
                     np.concatenate([p.band for p in parts]))


def band_of(values: np.ndarray, levels: np.ndarray) -> np.ndarray:
    """Band index of each value (a value on an inner band edge belongs to the band above)."""
    return np.clip(np.searchsorted(levels, values, side="right") - 1, 0, len(levels) - 2)


def _counter_clockwise(nodes: np.ndarray, tris: np.ndarray) -> np.ndarray:
    """Triangles turned counter-clockwise; those of no area left out."""
    p0, p1, p2 = nodes[tris[:, 0]], nodes[tris[:, 1]], nodes[tris[:, 2]]
    area2 = (p1[:, 0] - p0[:, 0]) * (p2[:, 1] - p0[:, 1]) - (p1[:, 1] - p0[:, 1]) * (p2[:, 0] - p0[:, 0])
    tris = np.where((area2 < 0)[:, None], tris[:, [0, 2, 1]], tris)
    return tris[area2 != 0]


class _Cut:
    """The mesh edges of the triangles and where a field crosses given levels on them."""

    def __init__(self, nodes: np.ndarray, tris: np.ndarray, values: np.ndarray,
                 levels: np.ndarray) -> None:
        self.nodes, self.f, self.levels = nodes, values, levels
        self.n = len(nodes)
        self.P, self.Q = tris, np.roll(tris, -1, axis=1)  # sides P -> Q, counter-clockwise
        key = np.minimum(self.P, self.Q) * self.n + np.maximum(self.P, self.Q)
        edges, side = np.unique(key.ravel(), return_inverse=True)
        self.side_edge = side.reshape(-1, 3)
        self.ea, self.eb = edges // self.n, edges % self.n  # each mesh edge from its lower node
        self.n_ids = self.n + len(edges) * len(levels)

    def crossing_id(self, pair_tri: np.ndarray, level: np.ndarray) -> np.ndarray:
        """Name of the crossing of band edge ``level`` on each side of the given triangles."""
        return self.n + self.side_edge[pair_tri] * len(self.levels) + level

    def points(self, ids: np.ndarray) -> np.ndarray:
        """Positions of named points: nodes, or crossings computed along their mesh edge."""
        out = np.empty((len(ids), 2))
        node = ids < self.n
        out[node] = self.nodes[ids[node]]
        edge, level = np.divmod(ids[~node] - self.n, len(self.levels))
        a, b = self.ea[edge], self.eb[edge]
        t = (self.levels[level] - self.f[a]) / (self.f[b] - self.f[a])
        out[~node] = self.nodes[a] + t[:, None] * (self.nodes[b] - self.nodes[a])
        return out


def _pieces(cut: _Cut) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Every (triangle, band) piece: named corners (k, 9) in order, their count, the band."""
    f, levels = cut.f, cut.levels
    ft = f[cut.P]
    k_lo, k_hi = band_of(ft.min(axis=1), levels), band_of(ft.max(axis=1), levels)
    count = k_hi - k_lo + 1
    tri = np.repeat(np.arange(len(count)), count)
    band = np.repeat(k_lo, count) + np.arange(len(tri)) - np.repeat(np.cumsum(count) - count, count)
    fP, fQ = f[cut.P[tri]], f[cut.Q[tri]]
    a, c = levels[band][:, None], levels[band + 1][:, None]
    up = fQ > fP
    first = np.where(up, band[:, None], band[:, None] + 1)  # band edges met along P -> Q
    second = np.where(up, band[:, None] + 1, band[:, None])

    def between(level: np.ndarray) -> np.ndarray:
        v = levels[level]
        return ((fP < v) & (v < fQ)) | ((fQ < v) & (v < fP))

    ids = np.stack([cut.P[tri], cut.crossing_id(tri, first), cut.crossing_id(tri, second)], axis=2)
    valid = np.stack([(fP >= a) & (fP <= c), between(first), between(second)], axis=2)
    ids, valid = ids.reshape(len(tri), 9), valid.reshape(len(tri), 9)
    order = np.argsort(~valid, axis=1, kind="stable")
    ids = np.take_along_axis(ids, order, axis=1)
    n_corners = valid.sum(axis=1)
    keep = n_corners >= 3
    return ids[keep], n_corners[keep], band[keep]


def _outline_edges(ids: np.ndarray, n_corners: np.ndarray, band: np.ndarray,
                   n_ids: int) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """The pieces' sides that no other piece of the same band shares: (from, to, band)."""
    slot = np.arange(ids.shape[1])[None, :]
    nxt = np.where(slot + 1 < n_corners[:, None], slot + 1, 0)
    used = slot < n_corners[:, None]
    u, v = ids[used], np.take_along_axis(ids, nxt, axis=1)[used]
    b = np.broadcast_to(band[:, None], ids.shape)[used]
    lo, hi = np.minimum(u, v), np.maximum(u, v)
    if float(n_ids) ** 2 * (int(band.max(initial=0)) + 1) < 2.0**62:
        key = (b * n_ids + lo) * n_ids + hi
        _, inverse, counts = np.unique(key, return_inverse=True, return_counts=True)
    else:  # a very large mesh: rows, not one number
        _, inverse, counts = np.unique(np.column_stack([b, lo, hi]), axis=0, return_inverse=True,
                                       return_counts=True)
    alone = counts[inverse.ravel()] == 1
    return u[alone], v[alone], b[alone]


def _chain(u: np.ndarray, v: np.ndarray, band: np.ndarray,
           n_ids: int) -> tuple[np.ndarray, np.ndarray] | None:
    """Order of the outline edges ring after ring, and each one's ring (None: they do not close)."""
    out_key, in_key = band * n_ids + u, band * n_ids + v
    out_order = np.argsort(out_key, kind="stable")
    in_order = np.argsort(in_key, kind="stable")
    if not np.array_equal(out_key[out_order], in_key[in_order]):
        return None
    succ = np.empty(len(u), dtype=np.int64)
    succ[in_order] = out_order  # the edge that goes on from where each edge ends
    rounds = max(1, int(np.ceil(np.log2(max(len(u), 2)))) + 1)
    ring, jump = np.arange(len(u)), succ.copy()
    for _ in range(rounds):  # pointer doubling: each edge learns the least edge of its ring
        ring = np.minimum(ring, ring[jump])
        jump = jump[jump]
    pred = np.empty_like(succ)
    pred[succ] = np.arange(len(u))
    root = ring == np.arange(len(u))
    pred[root] = np.flatnonzero(root)
    rank = np.where(root, 0, 1)
    for _ in range(rounds):  # list ranking: steps from the ring's least edge
        rank = rank + rank[pred]
        pred = pred[pred]
    order = np.lexsort((rank, ring))
    return order, ring[order]


def band_rings(nodes: np.ndarray, tris: np.ndarray, values: np.ndarray,
               levels: np.ndarray) -> Rings:
    """The region of each band of a field linear on each triangle, as closed rings.

    Parameters
    ----------
    nodes : numpy.ndarray
        Node coordinates (n, 2).
    tris : numpy.ndarray
        Three-node triangles (t, 3).
    values : numpy.ndarray
        Nodal values (n,); those outside the levels are taken as the nearest level (the
        first and last bands reach to the ends of the scale).
    levels : sequence of float
        Band edges, increasing (b + 1,): band k lies between levels k and k + 1.

    Returns
    -------
    Rings
        Rings of each band's region (fill even-odd); a band absent from the field has none.
    """
    nodes = np.asarray(nodes, dtype=float)
    levels = np.asarray(levels, dtype=float)
    values = np.clip(np.asarray(values, dtype=float), levels[0], levels[-1])
    tris = _counter_clockwise(nodes, np.asarray(tris, dtype=np.int64))
    if len(tris) == 0:
        return Rings.join([])
    cut = _Cut(nodes, tris, values, levels)
    ids, n_corners, band = _pieces(cut)
    u, v, b = _outline_edges(ids, n_corners, band, cut.n_ids)
    chained = _chain(u, v, b, cut.n_ids)
    if chained is None:  # pieces that overlap (a folded mesh): draw every piece as it is
        flat = ids[np.arange(ids.shape[1])[None, :] < n_corners[:, None]]
        start = np.concatenate([[0], np.cumsum(n_corners)])
        return Rings(cut.points(flat), start, band)
    order, ring = chained
    u, b = u[order], b[order]
    first = np.flatnonzero(np.r_[True, ring[1:] != ring[:-1]])
    return Rings(cut.points(u), np.r_[first, len(u)], b[first])


def iso_segments(nodes: np.ndarray, tris: np.ndarray, values: np.ndarray,
                 level: float) -> np.ndarray:
    """Segments (k, 2, 2) of the line where a field linear on each triangle equals ``level``.

    Examples
    --------
    >>> nodes = np.array([[0.0, 0.0], [2.0, 0.0], [0.0, 2.0]])
    >>> iso_segments(nodes, np.array([[0, 1, 2]]), np.array([-1.0, 1.0, 1.0]), 0.0).tolist()
    [[[1.0, 0.0], [0.0, 1.0]]]
    """
    nodes = np.asarray(nodes, dtype=float)
    tris = np.asarray(tris, dtype=np.int64)
    f = np.asarray(values, dtype=float) - level
    a, b = tris, np.roll(tris, -1, axis=1)
    fa, fb = f[a], f[b]
    crosses = (fa < 0) != (fb < 0)
    two = crosses.sum(axis=1) == 2
    a, b, fa, fb, crosses = a[two], b[two], fa[two], fb[two], crosses[two]
    lo, hi = np.where(a < b, a, b), np.where(a < b, b, a)  # the same point from either side
    flo, fhi = f[lo], f[hi]
    t = np.divide(-flo, fhi - flo, out=np.zeros_like(flo), where=crosses)
    pts = nodes[lo] + t[..., None] * (nodes[hi] - nodes[lo])
    order = np.argsort(~crosses, axis=1, kind="stable")[:, :2]
    return np.take_along_axis(pts, order[..., None], axis=1)
