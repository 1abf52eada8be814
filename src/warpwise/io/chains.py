"""Closed loops from the loose pieces of a drawing, tolerant of small gaps.

A drawing gives pieces (lines, arcs, polylines, curves) in any order and direction, whose ends
meet only within some small gap. :func:`chain_pieces` joins pieces whose ends lie within a
joining tolerance into chains and tells closed loops from open chains, and reports branch
points, duplicate pieces and pieces too short to matter. :func:`chain_by_layer` does that per
layer first and then joins what is left across layers.

Nothing here knows about DXF. The rest of the way from pieces to parts lives beside this
module and is re-exported here, where it was first written: :mod:`.pieces` (:class:`Piece`,
:class:`Chain` and the common pieces), :mod:`.chords` (:func:`loop_points`,
:func:`chord_error`, :func:`arcs_for_mesh`), :mod:`.nesting` (:func:`loop_defects`,
:func:`nest_loops`) and :mod:`.defects` (:class:`Defect` and the message formats).

Examples
--------
>>> import numpy as np
>>> from warpwise.geometry.loops import signed_area
>>> def line(a, b):
...     a, b = np.asarray(a, float), np.asarray(b, float)
...     return Piece(tuple(a), tuple(b), tuple((a + b) / 2), float(np.hypot(*(b - a))),
...                  lambda s, a=a, b=b: np.array([a, b]))
>>> sides = [line((0, 0), (4, 0)), line((4, 3), (4, 0)), line((4, 3), (0, 3)),
...          line((0, 3), (0, 1e-7))]
>>> result = chain_pieces(sides, tol=1e-5)
>>> len(result.loops), len(result.open_chains)
(1, 0)
>>> abs(signed_area(loop_points(result.loops[0], sides, 0.1)[0]))
12.0

"""

from __future__ import annotations

from collections import Counter
from collections.abc import Sequence
from dataclasses import dataclass, field

import numpy as np
from scipy.sparse import coo_matrix
from scipy.sparse.csgraph import connected_components

from .chords import arcs_for_mesh, chord_error, loop_points
from .defects import ERROR, WARNING, Defect, fmt, fmt_point
from .nesting import Part, loop_defects, nest_loops
from .pieces import MAX_ARC_STEP, Chain, Piece, arc_piece, bulge_arc, line_piece, polyline_piece


@dataclass(frozen=True)
class Chaining:
    """Result of joining pieces.

    Attributes
    ----------
    loops : tuple of Chain
        Closed loops.
    open_chains : tuple of Chain
        Chains that do not close.
    defects : tuple of Defect
        Branch points (errors), duplicate and too-short pieces (warnings: they are left out).
    tolerance : float
        Joining tolerance used, drawing unit.
    """

    loops: tuple[Chain, ...]
    open_chains: tuple[Chain, ...]
    defects: tuple[Defect, ...] = field(default=())
    tolerance: float = 0.0


#: Up to this many distinct piece ends are paired by measuring every pair; more through a k-d
#: tree (scipy.spatial, loaded only then: it costs start-up time for every drawing read).
DIRECT_PAIRS = 512


def close_pairs(points: np.ndarray, tol: float) -> np.ndarray:
    """Index pairs (i < j) (k, 2) of points at most ``tol`` apart.

    Examples
    --------
    >>> close_pairs(np.array([[0.0, 0.0], [0.5, 0.0], [3.0, 0.0], [3.0, 0.4]]), 0.5).tolist()
    [[0, 1], [2, 3]]
    """
    if len(points) > DIRECT_PAIRS:
        from scipy.spatial import cKDTree

        return cKDTree(points).query_pairs(tol, output_type="ndarray")
    i, j = np.triu_indices(len(points), k=1)
    d = points[i] - points[j]
    near = np.sqrt(d[:, 0] * d[:, 0] + d[:, 1] * d[:, 1]) <= tol
    return np.column_stack([i[near], j[near]]).astype(np.intp)


def _clusters(points: np.ndarray, tol: float) -> np.ndarray:
    """Label points so that points closer than ``tol`` (transitively) share a label."""
    n = len(points)
    if n == 0:
        return np.zeros(0, dtype=np.int64)
    # points equal to far below the tolerance are merged first, so that many copies of one
    # point do not make a quadratic number of pairs
    key = np.round(points / (1e-3 * tol)).astype(np.int64)
    _, first, inverse = np.unique(key, axis=0, return_index=True, return_inverse=True)
    uniq = points[first]
    m = len(uniq)
    pairs = close_pairs(uniq, tol)
    graph = coo_matrix((np.ones(len(pairs)), (pairs[:, 0], pairs[:, 1])), shape=(m, m))
    _, labels = connected_components(graph, directed=False)
    return labels[inverse.reshape(-1)].astype(np.int64)


def _repeat_of(keys: np.ndarray) -> list[tuple[int, int]]:
    """For rows of integer keys, (row, first row with the same key) of each row that repeats."""
    first: dict[tuple[int, ...], int] = {}
    out = []
    for k, row in enumerate(keys.tolist()):
        key = tuple(row)
        if key in first:
            out.append((k, first[key]))
        else:
            first[key] = k
    return out


def _layer_of(steps: Sequence[tuple[int, bool]], pieces: Sequence[Piece]) -> tuple[str, tuple[str, ...]]:
    weight: Counter[str] = Counter()
    for i, _ in steps:
        weight[pieces[i].layer] += pieces[i].length
    layers = tuple(sorted(weight))
    return weight.most_common(1)[0][0], layers


def chain_pieces(pieces: Sequence[Piece], tol: float, index: Sequence[int] | None = None) -> Chaining:
    """Join pieces whose ends lie within ``tol`` into closed loops and open chains.

    Parameters
    ----------
    pieces : sequence of Piece
        All pieces; chain indices refer to this sequence.
    tol : float
        Joining tolerance, drawing unit: ends closer than this are one point.
    index : sequence of int, optional
        The pieces to use (default all).

    Returns
    -------
    Chaining
        Loops, open chains and defects. Pieces shorter than ``tol`` and repeats of a piece are
        left out (reported as warnings); a point where more than two ends meet is an error.

    """
    idx = list(range(len(pieces))) if index is None else list(index)
    defects: list[Defect] = []
    keep = _drop_short(pieces, idx, tol, defects)
    loops = _closed_loops(pieces, [i for i in keep if pieces[i].closed], tol, defects)
    more, open_chains = _join_open(pieces, [i for i in keep if not pieces[i].closed], tol, defects)
    return Chaining(tuple(loops + more), tuple(open_chains), tuple(defects), tol)


def _drop_short(pieces: Sequence[Piece], idx: Sequence[int], tol: float, defects: list[Defect]) -> list[int]:
    """The pieces longer than the joining tolerance; the others are listed as warnings."""
    keep: list[int] = []
    for i in idx:
        p = pieces[i]
        if p.length <= tol:
            kind = "zero length" if p.length <= 1e-6 * tol else "too short"
            what = "has zero length" if kind == "zero length" else (
                f"is {fmt(p.length)} long, shorter than the joining tolerance {fmt(tol)}")
            defects.append(Defect(kind, f"{p.label} on layer {p.layer} {what} at "
                                  f"{fmt_point(p.start)}: left out", (p.start,), WARNING, p.layer))
        else:
            keep.append(i)
    return keep


def _duplicate(pieces: Sequence[Piece], i: int, j: int) -> Defect:
    """The warning for piece j, a repeat of piece i."""
    return Defect("duplicate", f"{pieces[j].label} on layer {pieces[j].layer} repeats {pieces[i].label} "
                  f"at {fmt_point(pieces[j].probe)}: the repeat is left out",
                  (pieces[j].probe,), WARNING, pieces[j].layer)


def _closed_loops(pieces: Sequence[Piece], closed: list[int], tol: float,
                  defects: list[Defect]) -> list[Chain]:
    """Each closed piece as a loop; a repeat (same start and same probe point) is left out."""
    if not closed:
        return []
    starts = np.array([pieces[i].start for i in closed])
    probes = np.array([pieces[i].probe for i in closed])
    both = _clusters(np.vstack([starts, probes]), tol)
    repeats = dict(_repeat_of(np.column_stack([both[:len(closed)], both[len(closed):]])))
    loops: list[Chain] = []
    for k, i in enumerate(closed):
        if k in repeats:
            defects.append(_duplicate(pieces, closed[repeats[k]], i))
        else:
            layer, layers = _layer_of([(i, False)], pieces)
            loops.append(Chain(((i, False),), True, layer, layers))
    return loops


def _join_open(pieces: Sequence[Piece], open_: list[int], tol: float,
               defects: list[Defect]) -> tuple[list[Chain], list[Chain]]:
    """Join the open pieces end to end: (closed loops, open chains); branch points are errors."""
    m = len(open_)
    ends = np.array([pieces[i].start for i in open_] + [pieces[i].end for i in open_]).reshape(-1, 2)
    label = _clusters(ends, tol)
    a, b = label[:m], label[m:]
    # repeated open pieces: the same pair of end points and the same probe point
    probe_label = _clusters(np.array([pieces[i].probe for i in open_]).reshape(-1, 2), tol)
    alive = np.ones(m, bool)
    for k, first in _repeat_of(np.column_stack([np.minimum(a, b), np.maximum(a, b), probe_label])):
        defects.append(_duplicate(pieces, open_[first], open_[k]))
        alive[k] = False
    edges = np.flatnonzero(alive)
    n_nodes = int(label.max()) + 1 if m else 0
    degree = np.bincount(np.concatenate([a[edges], b[edges]]), minlength=n_nodes)
    node_xy = np.zeros((n_nodes, 2))
    if m:
        np.add.at(node_xy, label, ends)
        node_xy /= np.maximum(np.bincount(label, minlength=n_nodes), 1)[:, None]
    incident: list[list[tuple[int, int]]] = [[] for _ in range(n_nodes)]
    for k in edges:
        incident[a[k]].append((int(k), 0))
        incident[b[k]].append((int(k), 1))
    visited = np.zeros(m, bool)

    def walk(edge: int, side: int) -> tuple[list[tuple[int, bool]], int, int]:
        first = int(a[edge] if side == 0 else b[edge])
        steps = []
        while True:
            visited[edge] = True
            steps.append((open_[edge], side == 1))
            node = int(b[edge] if side == 0 else a[edge])
            if degree[node] != 2:
                return steps, first, node
            nxt = [(e, s) for e, s in incident[node] if not visited[e]]
            if not nxt:
                return steps, first, node
            edge, side = nxt[0]

    loops: list[Chain] = []
    chains_open: list[Chain] = []

    def add(steps: list[tuple[int, bool]], first: int, last: int) -> None:
        layer, layers = _layer_of(steps, pieces)
        if first == last:
            loops.append(Chain(tuple(steps), True, layer, layers))
        else:
            chains_open.append(Chain(tuple(steps), False, layer, layers))

    for node in np.flatnonzero((degree != 2) & (degree > 0)):
        if degree[node] > 2:
            layers = sorted({pieces[open_[e]].layer for e, _ in incident[node]})
            defects.append(Defect(
                "branch", f"the outline on layer {', '.join(layers)} branches: {degree[node]} ends "
                "meet in one point", (tuple(node_xy[node]),), ERROR, layers[0], anchor=True))
        for e, s in incident[node]:
            if not visited[e]:
                add(*walk(e, s))
    for e in edges:
        if not visited[e]:
            add(*walk(int(e), 0))
    return loops, chains_open


def chain_by_layer(pieces: Sequence[Piece], tol: float, index: Sequence[int] | None = None) -> Chaining:
    """Join pieces within each layer first, then what is left open across layers.

    Parameters
    ----------
    pieces : sequence of Piece
        All pieces; chain indices refer to this sequence.
    tol : float
        Joining tolerance, drawing unit.
    index : sequence of int, optional
        The pieces to use (default all).

    Returns
    -------
    Chaining
        As :func:`chain_pieces`; a loop made of pieces from several layers belongs to the layer
        holding most of its length and lists all of them in ``Chain.layers``.

    """
    idx = list(range(len(pieces))) if index is None else list(index)
    by_layer: dict[str, list[int]] = {}
    for i in idx:
        by_layer.setdefault(pieces[i].layer, []).append(i)
    if len(by_layer) <= 1:
        return chain_pieces(pieces, tol, idx)
    loops: list[Chain] = []
    defects: list[Defect] = []
    left: list[int] = []
    for layer in sorted(by_layer):
        res = chain_pieces(pieces, tol, by_layer[layer])
        loops += res.loops
        defects += res.defects
        left += [i for c in res.open_chains for i, _ in c.steps]
    res = chain_pieces(pieces, tol, left)
    # a branch point already reported within one layer is not reported again
    seen = np.array([d.where[0] for d in defects if d.kind == "branch"]).reshape(-1, 2)
    for d in res.defects:
        if d.kind == "branch" and len(seen) and np.min(np.hypot(*(seen - d.where[0]).T)) <= tol:
            continue
        defects.append(d)
    return Chaining(tuple(loops) + res.loops, res.open_chains, tuple(defects), tol)


__all__ = ["ERROR", "MAX_ARC_STEP", "WARNING", "Chain", "Chaining", "Defect", "Part", "Piece", "arc_piece",
           "arcs_for_mesh", "bulge_arc", "chain_by_layer", "chain_pieces", "chord_error", "fmt", "fmt_point",
           "line_piece", "loop_defects", "loop_points", "nest_loops", "polyline_piece"]
