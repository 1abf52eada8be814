"""Step 2 of reading a DXF drawing: loops, open chains, parts and every defect.

:func:`lay_out` joins the pieces of the chosen layers into closed loops within a joining
tolerance tied to the drawing size (:func:`~warpwise.io.chains.chain_by_layer`), adds the
hatch boundaries (:mod:`.hatch`; one that repeats a drawn loop marks it as hatched instead),
leaves out a drawing frame and its title block (:mod:`.sheet`), checks the loops
(:func:`~warpwise.io.nesting.loop_defects`) and nests them even-odd into parts
(:func:`~warpwise.io.nesting.nest_loops`), listing every defect on the way;
:func:`open_chain_defects` says where each open chain ends and how far the nearest other free
end is.
"""

from __future__ import annotations

import math
from collections import Counter
from collections.abc import Sequence
from dataclasses import dataclass, replace

import numpy as np
import shapely
from shapely.geometry import LineString

from ...errors import UsageError
from ..chains import chain_by_layer
from ..chords import loop_points
from ..defects import ERROR, WARNING, Defect, fmt, fmt_point, plural
from ..nesting import Part, loop_defects, nest_loops
from ..pieces import Chain, Piece
from .drawing import Drawing
from .hatch import hatch_loops
from .sheet import find_frames, match_hatches

#: Joining tolerance as a fraction of the diagonal of the drawing's extent.
JOIN_TOLERANCE = 1e-5
#: Kind of the warning for a drawing frame left out.
FRAME = "drawing frame"


@dataclass(frozen=True)
class LayerSummary:
    """What one layer holds.

    Attributes
    ----------
    name : str
        Layer name.
    loops : int
        Closed loops on it.
    open_chains : int
        Open chains on it.
    used : bool
        True when the layer is part of the profile.
    left_out : bool
        True when the layer was left out by default because it holds no closed geometry (a
        layer neither used nor left out was not chosen with ``--layer``).
    """

    name: str
    loops: int
    open_chains: int
    used: bool
    left_out: bool = False

    @property
    def holds(self) -> str:
        """Its loops and open chains in words, e.g. ``2 loops, 1 open chain`` (empty: none)."""
        bits = []
        if self.loops:
            bits.append(plural(self.loops, "loop"))
        if self.open_chains:
            bits.append(plural(self.open_chains, "open chain"))
        return ", ".join(bits)


@dataclass(frozen=True, eq=False)
class Loop:
    """A closed loop of the drawing.

    Attributes
    ----------
    chain : Chain
        Its pieces.
    points : numpy.ndarray
        Polygon (n, 2) at the joining tolerance (for nesting and checks), profile unit.
    layer : str
        Its layer.
    label : str
        Name in messages, e.g. ``loop 3 (CIRCLE #2F, layer Innen)``.
    depth : int
        Even-odd nesting depth: 0 outer, odd a hole, even an island.
    hatch : str
        The hatch whose filled area it bounds (its name in messages), empty when none: not
        hatched, or the boundary of a hole in a hatch.
    """

    chain: Chain
    points: np.ndarray
    layer: str
    label: str
    depth: int = 0
    hatch: str = ""


@dataclass(frozen=True, eq=False)
class Layout:
    """The loops, open chains, parts and defects of the chosen layers of a drawing.

    Attributes
    ----------
    drawing : Drawing
        The drawing.
    tolerance : float
        Joining tolerance, profile unit.
    layers : tuple of str
        Layers used.
    left_out : dict of str to int
        Layers left out because they hold no closed geometry, with their open chains.
    ignored : tuple of Chain
        The open chains of those layers.
    loops : tuple of Loop
        Closed loops.
    open_chains : tuple of Chain
        Open chains on the layers used.
    parts : tuple of Part
        Connected parts, largest first (indices into ``loops``).
    defects : tuple of Defect
        Every defect: the drawing's, then chaining, loops and open chains.
    """

    drawing: Drawing
    tolerance: float
    layers: tuple[str, ...]
    left_out: dict[str, int]
    ignored: tuple[Chain, ...]
    loops: tuple[Loop, ...]
    open_chains: tuple[Chain, ...]
    parts: tuple[Part, ...]
    defects: tuple[Defect, ...]

    @property
    def errors(self) -> tuple[Defect, ...]:
        """Defects that stop the analysis."""
        return tuple(d for d in self.defects if d.fatal)

    @property
    def hatched(self) -> tuple[int, ...]:
        """Indices of the parts whose material is hatched: the cut sections of the drawing."""
        return tuple(k for k, p in enumerate(self.parts)
                     if any(self.loops[i].hatch and self.loops[i].depth % 2 == 0 for i in p.loops))

    def layer_summaries(self) -> tuple[LayerSummary, ...]:
        """What each layer of the drawing holds, in the drawing's order of layers."""
        loops = Counter(lp.layer for lp in self.loops)
        opens = Counter(c.layer for c in self.open_chains)
        return tuple(LayerSummary(name, loops[name], opens[name] + self.left_out.get(name, 0),
                                  name in self.layers, name in self.left_out)
                     for name in self.drawing.layers)


def _extent(pieces: Sequence[Piece]) -> float:
    if not pieces:
        return 0.0
    pts = np.array([q for p in pieces for q in (p.start, p.end, p.probe)])
    return float(np.hypot(*np.ptp(pts, axis=0)))


def _pick_layers(drawing: Drawing, layers: Sequence[str] | None) -> list[int]:
    if not layers:
        return list(range(len(drawing.pieces)))
    known = {name.lower(): name for name in drawing.layers}
    wanted = set()
    for name in layers:
        if name.lower() not in known:
            have = ", ".join(drawing.layers) or "none"
            raise UsageError(f"layer {name!r} holds no lines or curves (layers with geometry: {have})",
                             file=drawing.source)
        wanted.add(known[name.lower()])
    return [i for i, p in enumerate(drawing.pieces) if p.layer in wanted]


def lay_out(drawing: Drawing, layers: Sequence[str] | None = None, tolerance: float | None = None) -> Layout:
    """Join the pieces of the chosen layers into loops, nest them and list every defect.

    Hatch boundaries that repeat a drawn loop mark it as hatched; the others are loops of
    their own. A drawing frame and its title block (:func:`~.sheet.find_frames`) are left out,
    with a warning, before the loops are nested.

    Parameters
    ----------
    drawing : Drawing
        A drawing from :func:`~warpwise.io.dxf.drawing.read_drawing`.
    layers : sequence of str, optional
        Layers to use (names are not case-sensitive). Default: every layer that holds closed
        geometry; open chains on layers without any closed loop drawn are left out.
    tolerance : float, optional
        Joining tolerance, profile unit; default :data:`JOIN_TOLERANCE` times the diagonal of
        the extent of the chosen pieces.

    Returns
    -------
    Layout

    Raises
    ------
    UsageError
        For a layer name that holds no geometry.

    """
    chosen = _pick_layers(drawing, layers)
    pieces = drawing.pieces
    diag = _extent([pieces[i] for i in chosen])
    tol = JOIN_TOLERANCE * diag if tolerance is None else float(tolerance)
    tol = max(tol, 1e-12 * diag, 1e-300)
    hatch_pieces = drawing.hatch_pieces
    chaining = chain_by_layer(pieces, tol, [i for i in chosen if i not in hatch_pieces])
    names = {pieces[i].layer for i in chosen} if layers else None
    found, hatch_defects = _loops_of(drawing, chaining.loops, tol, names)
    open_chains = list(chaining.open_chains)
    left_out: dict[str, int] = {}
    ignored: list[Chain] = []
    used_layers = sorted(names) if names is not None else sorted({p.layer for p in pieces})
    chain_defects = list(chaining.defects)
    if not layers and found:
        closed_layers = {name for c in chaining.loops for name in c.layers}
        keep = []
        for c in open_chains:
            if closed_layers.intersection(c.layers):
                keep.append(c)
            else:
                ignored.append(c)
                for name in c.layers:
                    left_out[name] = left_out.get(name, 0) + 1
        open_chains = keep
        used_layers = sorted(closed_layers | {lp.layer for lp in found})
        chain_defects = [d for d in chain_defects if d.layer is None or d.layer in closed_layers]
    # what went wrong reading entities counts for the layers used (and for layers that kept
    # no curve at all, where nothing else would show it)
    defects = [d for d in drawing.defects
               if d.layer is None or d.layer in used_layers or d.layer not in drawing.layers]
    found, open_chains, frame_defects, chain_defects = _leave_out_frames(
        found, open_chains, chain_defects, pieces, tol, drawing.units.unit)
    defects += hatch_defects + frame_defects + chain_defects
    loops = [replace(lp, label=f"loop {k + 1} ({lp.label})") for k, lp in enumerate(found)]
    loop_pts = [lp.points for lp in loops]
    defects += loop_defects(loop_pts, [lp.label for lp in loops], [lp.layer for lp in loops])
    good = [k for k, p in enumerate(loop_pts) if len(p) >= 3]
    depth_good, parts_good = nest_loops([loop_pts[k] for k in good])
    depth = np.zeros(len(loop_pts), dtype=np.int64)
    depth[good] = depth_good
    parts = [Part(tuple(good[i] for i in p.loops), p.area, p.bounds, p.holes) for p in parts_good]
    loops = [replace(lp, depth=int(depth[k])) for k, lp in enumerate(loops)]
    defects += open_chain_defects(open_chains, pieces)
    return Layout(drawing, tol, tuple(used_layers), left_out, tuple(ignored), tuple(loops),
                  tuple(open_chains), tuple(parts), tuple(defects))


def _loops_of(drawing: Drawing, chains: Sequence[Chain], tol: float,
              layers: set[str] | None) -> tuple[list[Loop], list[Defect]]:
    """The drawn loops, and the hatch boundaries no drawn loop repeats.

    A drawn loop that a hatch boundary repeats is marked hatched; a hatch boundary on the
    chosen layers that no drawn loop (nor an earlier hatch) repeats is a loop of its own.
    """
    pieces = drawing.pieces
    drawn = [loop_points(c, pieces, tol)[0] for c in chains]
    hatch, defects = hatch_loops(drawing.hatches, pieces, tol)
    repeats = match_hatches(drawn, [h.points for h in hatch], tol)
    marks: dict[int, str] = {}
    for h, j in zip(hatch, repeats, strict=True):
        if j >= 0 and not h.hole:
            marks.setdefault(j, h.hatch)
    loops = [Loop(c, drawn[k], c.layer, f"{c.labels(pieces, 2)}, layer {c.layer}",
                  hatch=marks.get(k, "")) for k, c in enumerate(chains)]
    own = [h for h, j in zip(hatch, repeats, strict=True)
           if j < 0 and (layers is None or h.layer in layers)]
    again = match_hatches([h.points for h in own], [h.points for h in own], tol, earlier=True)
    extra = [Loop(h.chain, h.points, h.layer, f"{h.label}, layer {h.layer}", hatch="" if h.hole else h.hatch)
             for h, j in zip(own, again, strict=True) if j < 0]
    return loops + extra, defects


def _leave_out_frames(loops: list[Loop], chains: list[Chain], chain_defects: list[Defect],
                      pieces: Sequence[Piece], tol: float, unit: str) -> tuple[
        list[Loop], list[Chain], list[Defect], list[Defect]]:
    """Loops and open chains without the drawing frames and title blocks.

    Also returns a warning for each frame, and the chaining defects that do not lie on what
    was left out.
    """
    straight = [all(pieces[i].curved_length == 0 for i, _ in lp.chain.steps) for lp in loops]
    chain_pts = [loop_points(c, pieces, tol)[0] for c in chains]
    frames = find_frames([lp.points for lp in loops], straight, [bool(lp.hatch) for lp in loops],
                         chain_pts, tol)
    if not frames:
        return loops, chains, [], chain_defects
    gone_loops = {k for f in frames for k in (f.loop, *f.loops)}
    gone_chains = {j for f in frames for j in f.chains}
    warnings = []
    for f in frames:
        lp = loops[f.loop]
        block = (f" with its title block ({plural(len(f.loops), 'loop')}, "
                 f"{plural(len(f.chains), 'open chain')})" if f.loops or f.chains else "")
        warnings.append(Defect(
            FRAME, f"the {fmt(f.size[0])} x {fmt(f.size[1])} {unit} rectangle at "
            f"{fmt_point(f.corner)} ({lp.label}) encloses all other geometry and {f.evidence}: it is "
            f"taken as the drawing frame and left out{block}", (f.corner,), WARNING, lp.layer))
    gone = shapely.union_all([LineString(np.vstack([loops[k].points, loops[k].points[:1]]))
                              for k in gone_loops] +
                             [LineString(chain_pts[j]) for j in gone_chains if len(chain_pts[j]) > 1])
    kept_defects = [d for d in chain_defects if not d.where or not all(
        shapely.dwithin(gone, shapely.points(np.asarray(d.where, dtype=float)), tol))]
    return ([lp for k, lp in enumerate(loops) if k not in gone_loops],
            [c for j, c in enumerate(chains) if j not in gone_chains], warnings, kept_defects)


def open_chain_defects(chains: Sequence[Chain], pieces: Sequence[Piece]) -> list[Defect]:
    """One error per open chain, with its free ends and the gap to the nearest other free end.

    Parameters
    ----------
    chains : sequence of Chain
        Open chains.
    pieces : sequence of Piece
        The pieces they index.

    Returns
    -------
    list of Defect

    """
    if not chains:
        return []
    from scipy.spatial import cKDTree  # here: open chains are rare, and scipy.spatial is slow to load

    ends = np.array([p for c in chains for p in c.ends(pieces)], dtype=float)
    # distance from each free end to the nearest other one (its own chain's other end included)
    dist, _ = cKDTree(ends).query(ends, k=2)
    nearest = dist[:, 1]
    out = []
    for k, c in enumerate(chains):
        gaps = [float(nearest[2 * k]), float(nearest[2 * k + 1])]
        a, b = c.ends(pieces)
        n = len(c.steps)
        what = f"{n} pieces: {c.labels(pieces, 2)}" if n > 1 else c.labels(pieces)
        gap = min(gaps)
        gap_text = f"; the nearest other free end is {fmt(gap)} away" if math.isfinite(gap) else ""
        layer = c.layer if len(c.layers) <= 1 else ", ".join(c.layers)
        out.append(Defect("open chain", f"open chain on layer {layer} ({what}) with free ends at "
                          f"{fmt_point(a)} and {fmt_point(b)}{gap_text}", (a, b), ERROR, c.layer,
                          size=max(gaps)))
    return out
