"""Closed loops from the loose pieces of a drawing, tolerant of small gaps.

A drawing gives pieces (lines, arcs, polylines, curves) in any order and direction, whose ends
meet only within some small gap. :func:`chain_pieces` joins pieces whose ends lie within a
joining tolerance into chains and tells closed loops from open chains, and reports branch
points, duplicate pieces and pieces too short to matter. :func:`chain_by_layer` does that per
layer first and then joins what is left across layers. :func:`loop_points` turns a chain into a
polygon at a chord tolerance, :func:`loop_defects` finds loops that cross themselves or each
other, and :func:`nest_loops` groups loops by even-odd nesting into parts (solid regions with
their holes).

Nothing here knows about DXF: a :class:`Piece` carries its end points, a sampling function and a
label for messages, so the same code serves any source of loose curves. :func:`line_piece`,
:func:`arc_piece` and :func:`polyline_piece` (with :func:`bulge_arc`) make the common pieces;
:func:`chord_error` tells how much the chords of a set of loops change its area, and
:func:`arcs_for_mesh` hands the arcs to the mesher's curved element edges.

Examples
--------
>>> import numpy as np
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

import math
from collections import Counter
from collections.abc import Callable, Sequence
from dataclasses import dataclass, field

import numpy as np
import shapely
from scipy.sparse import coo_matrix
from scipy.sparse.csgraph import connected_components
from scipy.spatial import cKDTree
from shapely.geometry import LinearRing, Polygon

from ..geometry.loops import crossing_point, even_odd_nesting, meeting_pairs, meeting_point, signed_area
from ..geometry.profile import Arc

#: Largest angle an arc chord may span, radians (at least 48 chords in a full circle), so that
#: an outline keeps its shape where the chord tolerance alone would allow long chords.
MAX_ARC_STEP = math.pi / 24

#: Severity of a defect that stops the analysis.
ERROR = "error"
#: Severity of a defect that was repaired or left out (the profile is still analysable).
WARNING = "warning"


def fmt(value: float) -> str:
    """A length for messages: six significant digits, no trailing zeros.

    Examples
    --------
    >>> fmt(0.000123456789), fmt(100.0)
    ('0.000123457', '100')

    """
    return f"{value:.6g}"


def fmt_point(p: Sequence[float]) -> str:
    """A point for messages, ``(x, y)``."""
    return f"({fmt(p[0])}, {fmt(p[1])})"


@dataclass(frozen=True)
class Defect:
    """One thing wrong with a drawing.

    Attributes
    ----------
    kind : str
        Short name: ``open chain``, ``branch``, ``self-crossing``, ``crossing loops``,
        ``duplicate``, ``zero length``, ``too short``, ``no area``, ``unreadable``,
        ``not flat``, ``truncated``.
    text : str
        What is wrong, one line, drawing unit.
    where : tuple of (float, float)
        Points to mark on a plot, drawing unit.
    severity : str
        :data:`ERROR` (the profile cannot be analysed) or :data:`WARNING` (repaired or left out).
    layer : str or None
        Layer the defect is on, when it belongs to one.
    anchor : bool
        True when the first point of ``where`` completes the text as `` at (x, y)``.
    layers : tuple of str
        For defects between two loops, the layer of each.
    """

    kind: str
    text: str
    where: tuple[tuple[float, float], ...] = ()
    severity: str = ERROR
    layer: str | None = None
    anchor: bool = False
    layers: tuple[str, ...] = ()

    @property
    def fatal(self) -> bool:
        """True when the defect stops the analysis."""
        return self.severity == ERROR

    @property
    def point(self) -> tuple[float, float] | None:
        """The point that completes the text, if any."""
        return self.where[0] if self.anchor and self.where else None

    @property
    def message(self) -> str:
        """The full one-line message, with the point."""
        p = self.point
        return self.text if p is None else f"{self.text} at {fmt_point(p)}"


@dataclass(frozen=True, eq=False)
class Piece:
    """One curve of a drawing, known by its ends and sampled on demand.

    Attributes
    ----------
    start, end : (float, float)
        End points, drawing unit (equal for a closed piece).
    probe : (float, float)
        A point on the piece away from its ends (to tell duplicates), drawing unit.
    length : float
        Length along the curve, drawing unit.
    sample : callable
        ``sample(chord_tolerance)`` returns points (n, 2) from ``start`` to ``end`` inclusive,
        no farther than the tolerance from the true curve; for a closed piece the first point
        is not repeated.
    curved_length : float
        Length of the curved part (arcs, ellipses, splines), drawing unit.
    chord_area : callable or None
        ``chord_area(chord_tolerance)`` is the signed area between the curve and the chords
        ``sample`` gives, positive where the curve lies to the right of its chords (so that a
        counter-clockwise loop gains it); None when not known (then at most 2/3 of the
        tolerance times ``curved_length``), drawing unit squared.
    arcs : tuple of Arc
        Circular arcs the piece runs along.
    closed : bool
        True for a piece closed on itself (a circle, a closed polyline).
    layer : str
        Layer name.
    label : str
        Name of the piece in messages, e.g. ``LINE #1F``.
    """

    start: tuple[float, float]
    end: tuple[float, float]
    probe: tuple[float, float]
    length: float
    sample: Callable[[float], np.ndarray]
    curved_length: float = 0.0
    chord_area: Callable[[float], float] | None = None
    arcs: tuple[Arc, ...] = ()
    closed: bool = False
    layer: str = "0"
    label: str = "piece"


@dataclass(frozen=True)
class Chain:
    """Pieces joined end to end.

    Attributes
    ----------
    steps : tuple of (int, bool)
        Index of each piece and whether it is run from its end to its start.
    closed : bool
        True for a closed loop.
    layer : str
        Layer of the chain: the layer holding most of its length.
    layers : tuple of str
        Every layer the chain takes pieces from.
    """

    steps: tuple[tuple[int, bool], ...]
    closed: bool
    layer: str = "0"
    layers: tuple[str, ...] = ()

    def ends(self, pieces: Sequence[Piece]) -> tuple[tuple[float, float], tuple[float, float]]:
        """First and last point of the chain, drawing unit."""
        i, rev = self.steps[0]
        j, rev_last = self.steps[-1]
        first = pieces[i].end if rev else pieces[i].start
        last = pieces[j].start if rev_last else pieces[j].end
        return first, last

    def labels(self, pieces: Sequence[Piece], most: int = 3) -> str:
        """The pieces of the chain for messages, at most ``most`` named."""
        names = [pieces[i].label for i, _ in self.steps]
        text = ", ".join(names[:most])
        if len(names) > most:
            text += f" and {len(names) - most} more"
        return text


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
    pairs = cKDTree(uniq).query_pairs(tol, output_type="ndarray")
    graph = coo_matrix((np.ones(len(pairs)), (pairs[:, 0], pairs[:, 1])), shape=(m, m))
    _, labels = connected_components(graph, directed=False)
    return labels[inverse.reshape(-1)].astype(np.int64)


def _repeats(keys: np.ndarray) -> np.ndarray:
    """For rows of integer keys, True where the row repeats an earlier row."""
    if len(keys) == 0:
        return np.zeros(0, bool)
    _, first = np.unique(keys, axis=0, return_index=True)
    rep = np.ones(len(keys), bool)
    rep[first] = False
    return rep


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
    closed = [i for i in keep if pieces[i].closed]
    open_ = [i for i in keep if not pieces[i].closed]

    def duplicate(i: int, j: int) -> None:
        defects.append(Defect(
            "duplicate", f"{pieces[j].label} on layer {pieces[j].layer} repeats {pieces[i].label} "
            f"at {fmt_point(pieces[j].probe)}: the repeat is left out",
            (pieces[j].probe,), WARNING, pieces[j].layer))

    # repeated closed pieces: same start and same probe point
    loops: list[Chain] = []
    if closed:
        starts = np.array([pieces[i].start for i in closed])
        probes = np.array([pieces[i].probe for i in closed])
        both = _clusters(np.vstack([starts, probes]), tol)
        keys = np.column_stack([both[:len(closed)], both[len(closed):]])
        rep = _repeats(keys)
        first_closed: dict[tuple[int, int], int] = {}
        for k, i in enumerate(closed):
            key = (int(keys[k, 0]), int(keys[k, 1]))
            if rep[k]:
                duplicate(first_closed[key], i)
            else:
                first_closed[key] = i
                layer, layers = _layer_of([(i, False)], pieces)
                loops.append(Chain(((i, False),), True, layer, layers))

    m = len(open_)
    ends = np.array([pieces[i].start for i in open_] + [pieces[i].end for i in open_]).reshape(-1, 2)
    label = _clusters(ends, tol)
    a, b = label[:m], label[m:]
    # repeated open pieces: the same pair of end points and the same probe point
    probe_label = _clusters(np.array([pieces[i].probe for i in open_]).reshape(-1, 2), tol)
    rep = _repeats(np.column_stack([np.minimum(a, b), np.maximum(a, b), probe_label]))
    alive = ~rep
    if rep.any():
        first_of: dict[tuple[int, int, int], int] = {}
        for k in range(m):
            key = (int(min(a[k], b[k])), int(max(a[k], b[k])), int(probe_label[k]))
            if not rep[k]:
                first_of.setdefault(key, k)
        for k in np.flatnonzero(rep):
            key = (int(min(a[k], b[k])), int(max(a[k], b[k])), int(probe_label[k]))
            duplicate(open_[first_of[key]], open_[k])
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
    return Chaining(tuple(loops), tuple(chains_open), tuple(defects), tol)


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


def loop_points(chain: Chain, pieces: Sequence[Piece], chord_tolerance: float) -> tuple[
        np.ndarray, tuple[Arc, ...]]:
    """The polygon of a chain at a chord tolerance, and the arcs it runs along.

    Parameters
    ----------
    chain : Chain
        A chain (closed or open).
    pieces : sequence of Piece
        The pieces the chain indexes.
    chord_tolerance : float
        Largest distance between a chord and its curve, drawing unit.

    Returns
    -------
    points : numpy.ndarray
        Vertices (n, 2), drawing unit; for a closed chain the first point is not repeated.
    arcs : tuple of Arc
        Circular arcs of the pieces.

    """
    parts: list[np.ndarray] = []
    arcs: list[Arc] = []
    for k, (i, rev) in enumerate(chain.steps):
        pts = np.asarray(pieces[i].sample(chord_tolerance), dtype=float)
        if pieces[i].closed:
            parts.append(pts)
        else:
            pts = pts[::-1] if rev else pts
            if k == 0:
                parts.append(pts)
            elif pieces[i].arcs and not pieces[chain.steps[k - 1][0]].arcs:
                # the joint goes where the arc ends, so the arc's vertices all lie on its circle
                parts[-1] = parts[-1][:-1]
                parts.append(pts)
            else:
                parts.append(pts[1:])
        arcs += pieces[i].arcs
    points = np.vstack(parts)
    if chain.closed and not (len(chain.steps) == 1 and pieces[chain.steps[0][0]].closed):
        first, last = chain.steps[0][0], chain.steps[-1][0]
        points = points[1:] if pieces[last].arcs and not pieces[first].arcs else points[:-1]
    return points, tuple(arcs)


def loop_defects(loops: Sequence[np.ndarray], labels: Sequence[str], layers: Sequence[str]) -> list[Defect]:
    """Loops that enclose no area, cross themselves, or cross or touch another loop.

    Parameters
    ----------
    loops : sequence of numpy.ndarray
        Closed polygons (n, 2), drawing unit.
    labels : sequence of str
        Name of each loop in messages.
    layers : sequence of str
        Layer of each loop.

    Returns
    -------
    list of Defect
        Errors, each with the point where it happens.

    """
    defects: list[Defect] = []
    rings = []
    for pts, name, layer in zip(loops, labels, layers, strict=True):
        ring = LinearRing(pts) if len(pts) >= 3 else None
        rings.append(ring)
        if ring is not None and not ring.is_simple:
            defects.append(Defect("self-crossing", f"{name} crosses itself", (crossing_point(ring),),
                                  ERROR, layer,
                                  anchor=True))
        elif ring is None or abs(signed_area(pts)) <= 1e-12 * max(np.ptp(pts, axis=0).max(), 1e-300) ** 2:
            defects.append(Defect("no area", f"{name} encloses no area", (tuple(pts[0]),),
                                  ERROR, layer, anchor=True))
            rings[-1] = None
    good = [k for k, r in enumerate(rings) if r is not None]
    if len(good) > 1:
        for u, v in meeting_pairs([rings[k] for k in good]):
            i, j = good[u], good[v]
            where, meet = meeting_point(rings[i], rings[j])
            how = "overlap" if meet.length > 0 else "cross or touch"
            defects.append(Defect("crossing loops", f"{labels[i]} and {labels[j]} {how}",
                                  (where,), ERROR, layers[i], anchor=True,
                                  layers=(layers[i], layers[j])))
    return defects


@dataclass(frozen=True)
class Part:
    """One connected piece of material: solid loops with their holes.

    Attributes
    ----------
    loops : tuple of int
        Indices of the loops of the part (each solid loop followed by its holes).
    area : float
        Area, drawing unit squared.
    bounds : (float, float, float, float)
        (xmin, ymin, xmax, ymax), drawing unit.
    holes : int
        Number of holes.
    """

    loops: tuple[int, ...]
    area: float
    bounds: tuple[float, float, float, float]
    holes: int


def nest_loops(loops: Sequence[np.ndarray], materials: Sequence[str | None] | None = None) -> tuple[
        np.ndarray, list[Part]]:
    """Even-odd nesting of loops and the parts they form.

    Parameters
    ----------
    loops : sequence of numpy.ndarray
        Closed polygons (n, 2), drawing unit, that do not cross.
    materials : sequence of (str or None), optional
        Material of each loop; nesting is even-odd among loops of one material and a solid of
        another material inside a solid is an insert (part of the same part).

    Returns
    -------
    depth : numpy.ndarray
        For each loop, how many loops of its material contain it (even: solid, odd: hole).
    parts : list of Part
        Connected pieces of material, largest area first.

    """
    n = len(loops)
    mats = [None] * n if materials is None else list(materials)
    polys = [Polygon(p) for p in loops]
    depth, parent = even_odd_nesting(polys, mats)
    if n == 0:
        return depth, []
    solids = []
    for i in np.flatnonzero(depth % 2 == 0):
        holes = [int(h) for h in np.flatnonzero(parent == i)]
        poly = Polygon(loops[i], [loops[h] for h in holes])
        solids.append(([int(i), *holes], poly))
    if len(set(mats)) > 1:
        union = shapely.union_all([s[1] for s in solids])
        comps = list(union.geoms) if hasattr(union, "geoms") else [union]
        members: list[list[int]] = [[] for _ in comps]
        for idx, poly in solids:
            probe = poly.representative_point()
            k = int(np.argmin([c.distance(probe) for c in comps]))
            members[k] += idx
        parts = [Part(tuple(m), float(c.area), tuple(c.bounds),
                      sum(1 for i in m if depth[i] % 2)) for c, m in zip(comps, members, strict=True) if m]
    else:
        parts = []
        for idx, poly in solids:
            pts = np.vstack([loops[i] for i in idx])
            box = (*pts.min(axis=0).tolist(), *pts.max(axis=0).tolist())
            parts.append(Part(tuple(idx), float(abs(poly.area)), box, len(idx) - 1))
    # largest first; areas equal to round-off go left to right, then bottom to top
    top = max((p.area for p in parts), default=0.0)
    parts.sort(key=lambda p: (-round(p.area / top, 6) if top > 0 else 0.0, round(p.bounds[0], 9),
                              round(p.bounds[1], 9)))
    return depth, parts


# ------------------------------------------------------------------------------------------
# pieces of common curves


def line_piece(p: np.ndarray, q: np.ndarray, layer: str = "0", label: str = "LINE") -> Piece:
    """A straight line from p to q (drawing unit) as a piece."""
    p, q = np.asarray(p, dtype=float), np.asarray(q, dtype=float)
    return Piece(tuple(p), tuple(q), tuple(0.5 * (p + q)), float(np.hypot(*(q - p))),
                 lambda s, p=p, q=q: np.array([p, q]), layer=layer, label=label)


def arc_piece(c: np.ndarray, r: float, t0: float, sweep: float, layer: str = "0", label: str = "ARC",
              closed: bool = False) -> Piece:
    """A circular arc as a piece.

    Parameters
    ----------
    c : numpy.ndarray
        Centre (2,), drawing unit.
    r : float
        Radius, drawing unit.
    t0 : float
        Angle of the start point, radians.
    sweep : float
        Signed sweep, radians, counter-clockwise positive; 2 pi with ``closed`` for a circle.
    layer, label : str
        For messages.
    closed : bool
        A full circle.

    Returns
    -------
    Piece
        Sampled with vertices on the circle, chords within the chord tolerance and spanning
        at most :data:`MAX_ARC_STEP`; a full circle gets a multiple of four chords.

    """
    c = np.asarray(c, dtype=float)
    start = c + r * np.array([math.cos(t0), math.sin(t0)])
    end = start if closed else c + r * np.array([math.cos(t0 + sweep), math.sin(t0 + sweep)])
    mid = c + r * np.array([math.cos(t0 + 0.5 * sweep), math.sin(t0 + 0.5 * sweep)])
    lo = t0 + min(sweep, 0.0)
    arc = Arc(float(c[0]), float(c[1]), float(r), float(math.fmod(lo, 2 * math.pi)), float(abs(sweep)))

    def chords(s: float) -> int:
        step = MAX_ARC_STEP if s >= r else min(MAX_ARC_STEP, 2.0 * math.acos(1.0 - s / r))
        n = max(1, math.ceil(abs(sweep) / step - 1e-9))
        return 4 * math.ceil(n / 4) if closed else n

    def sample(s: float) -> np.ndarray:
        n = chords(s)
        t = t0 + sweep * np.arange(n if closed else n + 1) / n
        pts = c + r * np.column_stack([np.cos(t), np.sin(t)])
        if not closed:
            pts[0], pts[-1] = start, end
        return pts

    def chord_area(s: float) -> float:
        n = chords(s)
        return math.copysign(0.5 * r * r * (abs(sweep) - n * math.sin(abs(sweep) / n)), sweep)

    length = abs(sweep) * r
    return Piece(tuple(start), tuple(end), tuple(mid), length, sample, curved_length=length,
                 chord_area=chord_area, arcs=(arc,), closed=closed, layer=layer, label=label)


def bulge_arc(p: np.ndarray, q: np.ndarray, bulge: float) -> tuple:
    """The arc of a polyline segment from p to q with a bulge (tan of a quarter of its angle).

    Parameters
    ----------
    p, q : numpy.ndarray
        End points (2,), drawing unit.
    bulge : float
        Bulge, positive for a counter-clockwise arc; 1 is a half circle.

    Returns
    -------
    tuple
        ``(centre, r, t0, sweep, p, q)``: centre (2,), radius, start angle and signed sweep
        (radians), as :func:`polyline_piece` takes it.

    Examples
    --------
    >>> c, r, t0, sweep, _, _ = bulge_arc(np.array([1.0, 0.0]), np.array([-1.0, 0.0]), 1.0)
    >>> bool(np.allclose(c, [0.0, 0.0])), r, bool(np.isclose(sweep, np.pi))
    (True, 1.0, True)

    """
    theta = 4.0 * math.atan(bulge)
    d = q - p
    chord = float(np.hypot(*d))
    normal = np.array([-d[1], d[0]]) / chord
    c = 0.5 * (p + q) + normal * (0.5 * chord / math.tan(0.5 * theta))
    r = 0.5 * chord / abs(math.sin(0.5 * theta))
    t0 = math.atan2(p[1] - c[1], p[0] - c[0])
    return c, r, t0, theta, p, q


def polyline_piece(segs: Sequence[tuple], closed: bool, layer: str, label: str) -> Piece:
    """A polyline of straight and arc segments as one piece.

    Parameters
    ----------
    segs : sequence of tuple
        ``("line", p, q)`` or ``("arc", centre, r, t0, sweep, p, q)``, drawing unit, radians.
    closed : bool
        True when the last segment ends at the first point.
    layer, label : str
        For messages.

    Returns
    -------
    Piece

    """
    parts: list = []
    arcs: list[Arc] = []
    length = curved = 0.0
    for s in segs:
        if s[0] == "line":
            parts.append(("line", s[1], s[2]))
            length += float(np.hypot(*(s[2] - s[1])))
        else:
            _, c, r, t0, sweep, p, q = s
            piece = arc_piece(c, r, t0, sweep)
            parts.append(("arc", piece, p, q))
            arcs += piece.arcs
            length += piece.length
            curved += piece.length
    first = segs[0][1] if segs[0][0] == "line" else segs[0][5]
    last_seg = segs[-1]
    last = last_seg[2] if last_seg[0] == "line" else last_seg[6]
    mid_seg = parts[len(parts) // 2]
    probe = 0.5 * (mid_seg[1] + mid_seg[2]) if mid_seg[0] == "line" else np.asarray(mid_seg[1].probe)

    def sample(s: float) -> np.ndarray:
        out = []
        for k, part in enumerate(parts):
            if part[0] == "line":
                pts = np.array([part[1], part[2]])
            else:
                pts = part[1].sample(s)
                pts[0], pts[-1] = part[2], part[3]
            out.append(pts if k == 0 else pts[1:])
        pts = np.vstack(out)
        return pts[:-1] if closed else pts

    def chord_area(s: float) -> float:
        return sum(part[1].chord_area(s) for part in parts if part[0] == "arc")

    return Piece(tuple(first), tuple(first if closed else last), tuple(probe), length, sample,
                 curved_length=curved, chord_area=chord_area, arcs=tuple(arcs), closed=closed,
                 layer=layer, label=label)


def chord_error(loops: Sequence[Chain], depths: Sequence[int], pieces: Sequence[Piece],
                chord_tolerance: float) -> float:
    """Relative change of area when the curves of closed chains are drawn as chords.

    Exact for circular arcs (the area of every circular segment cut off is known), an upper
    bound for other curves (at most 2/3 of the tolerance times their length).

    Parameters
    ----------
    loops : sequence of Chain
        The closed loops of the profile.
    depths : sequence of int
        Even-odd nesting depth of each loop (even: solid boundary, odd: hole).
    pieces : sequence of Piece
        The pieces the loops index.
    chord_tolerance : float
        Largest distance between a chord and its curve, drawing unit.

    Returns
    -------
    float
        abs(area of the polygons - true area) / true area (bound).

    """
    exact = poly = bound = 0.0
    for loop, depth in zip(loops, depths, strict=True):
        pts = loop_points(loop, pieces, chord_tolerance)[0]
        a = signed_area(pts)
        corr = 0.0
        for i, rev in loop.steps:
            pc = pieces[i]
            if pc.curved_length <= 0:
                continue
            if pc.chord_area is None:
                bound += 2.0 / 3.0 * chord_tolerance * pc.curved_length
            else:
                corr += -pc.chord_area(chord_tolerance) if rev else pc.chord_area(chord_tolerance)
        sign = -1.0 if depth % 2 else 1.0
        exact += sign * abs(a + corr)
        poly += sign * abs(a)
    return (abs(exact - poly) + bound) / abs(exact) if exact else math.inf


def arcs_for_mesh(arcs: Sequence[Arc], tol: float) -> tuple[Arc, ...]:
    """Arcs as the mesher's curved edges take them: the arcs of one full circle merged.

    Arcs of one circle (centre and radius within ``tol``) that together cover it become one
    full circle (a circle drawn as two bulges, or as arcs between the points where lines
    touch it); other arcs are kept as they are.

    Parameters
    ----------
    arcs : sequence of Arc
        Arcs of the outline (radians, counter-clockwise sweeps).
    tol : float
        Length within which two centres or radii are the same, drawing unit.

    Returns
    -------
    tuple of Arc

    Examples
    --------
    >>> import math
    >>> halves = [Arc(0.0, 0.0, 1.0, 0.0, math.pi), Arc(0.0, 0.0, 1.0, math.pi, math.pi)]
    >>> arcs_for_mesh(halves, 1e-9) == (Arc(0.0, 0.0, 1.0, 0.0, 2 * math.pi),)
    True
    >>> len(arcs_for_mesh([Arc(0.0, 0.0, 1.0, 3.0, 0.5)], 1e-9))
    1

    """
    two_pi = 2.0 * math.pi
    groups: dict[tuple[int, int, int], list[Arc]] = {}
    scale = max(tol, 1e-300)
    for a in arcs:
        key = (round(a.cx / scale), round(a.cy / scale), round(a.r / scale))
        groups.setdefault(key, []).append(a)
    out: list[Arc] = []
    for members in groups.values():
        full = [a for a in members if a.sweep >= two_pi - 1e-9]
        if full:
            out.append(Arc(full[0].cx, full[0].cy, full[0].r, 0.0, two_pi))
            continue
        # covered angle ranges, from the first arc's start
        base = members[0].start
        spans = sorted((math.fmod(a.start - base, two_pi) % two_pi, a.sweep) for a in members)
        reach, covered = 0.0, True
        for lo, sweep in spans:
            if lo > reach + 1e-9:
                covered = False
                break
            reach = max(reach, lo + sweep)
        if covered and reach >= two_pi - 1e-9:
            a = members[0]
            out.append(Arc(a.cx, a.cy, a.r, 0.0, two_pi))
            continue
        out += members
    return tuple(out)
