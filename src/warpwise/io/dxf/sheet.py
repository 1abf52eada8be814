"""A drawing sheet: which loops are hatched, and the frame and title block around the views.

On a drawing sheet the section is one view among others, inside a frame with a title block.
Two conventions of technical drawing tell the section from the rest (common practice, no
source; ISO 128 for hatching, ISO 5457 and ISO 7200 for frames and title blocks):

- a cut section is hatched: :func:`match_hatches` finds the drawn loop each hatch boundary
  repeats (so that the section is read once, from its drawn outline, and is known as hatched);
- a frame is a rectangle around everything else, with the title block attached to its inside
  in a corner: :func:`find_frames` finds it, and the title block, so that they are left out
  before nesting (else the section becomes a hole of the frame and its cavities solid).

A rectangle along x and y around everything is taken as a frame only with evidence that it
is not the outline of a plate: a title block (at least :data:`TITLE_BLOCK_ITEMS` loops or lines
attached to two adjacent sides), a hatched loop inside it, or a loop inside one of its holes
(the frame would make the section a hole and its cavity solid). A hatched rectangle is never a
frame, nor one whose leaving out would turn a hatched loop into a hole.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np
import shapely
from scipy.sparse import coo_matrix
from scipy.sparse.csgraph import connected_components
from shapely.geometry import LinearRing, LineString, Polygon

from ...geometry.loops import even_odd_nesting

#: Largest distance between a hatch boundary and a drawn loop it repeats, as a fraction of the
#: loop's diagonal; at least :data:`HATCH_MATCH_JOINS` joining tolerances (both are drawn as
#: chords within the joining tolerance of their curves).
HATCH_MATCH = 1e-4
#: Smallest distance allowed for a repeat, in joining tolerances.
HATCH_MATCH_JOINS = 4.0
#: Frames looked for one inside the other (a trimmed-sheet border, then the frame itself).
MAX_FRAMES = 3
#: Fewest loops and lines a title block is made of.
TITLE_BLOCK_ITEMS = 2
#: Largest part of the frame's area a title block covers (its bounding box).
TITLE_BLOCK_AREA = 0.5


def _size(points: np.ndarray) -> float:
    return float(np.hypot(*np.ptp(points, axis=0)))


def match_hatches(drawn: Sequence[np.ndarray], hatch: Sequence[np.ndarray], tol: float, *,
                  earlier: bool = False) -> list[int]:
    """The drawn loop each hatch boundary repeats.

    Parameters
    ----------
    drawn : sequence of numpy.ndarray
        Polygons (n, 2) of the drawn loops, profile unit.
    hatch : sequence of numpy.ndarray
        Polygons (n, 2) of the hatch boundaries, profile unit.
    tol : float
        Joining tolerance, profile unit.
    earlier : bool
        ``drawn`` and ``hatch`` are the same loops: look for a repeat among the loops before
        each one.

    Returns
    -------
    list of int
        For each hatch boundary, the index of the first drawn loop within :data:`HATCH_MATCH`
        of it (Hausdorff distance), -1 for none.

    """
    out = [-1] * len(hatch)
    good = [k for k, p in enumerate(drawn) if len(p) >= 3]
    if not good or not hatch:
        return out
    rings = [LinearRing(drawn[k]) for k in good]
    tree = shapely.STRtree(rings)
    for h, pts in enumerate(hatch):
        if len(pts) < 3:
            continue
        ring = LinearRing(pts)
        limit = max(HATCH_MATCH * _size(pts), HATCH_MATCH_JOINS * tol)
        for j in sorted(int(j) for j in tree.query(ring, predicate="dwithin", distance=limit)):
            if earlier and good[j] >= h:
                break
            if shapely.hausdorff_distance(ring, rings[j], densify=0.25) <= limit:
                out[h] = good[j]
                break
    return out


@dataclass(frozen=True)
class Frame:
    """A drawing frame found on a sheet, with its title block.

    Attributes
    ----------
    loop : int
        Index of the frame's loop.
    loops : tuple of int
        Loops of the title block (attached to the frame).
    chains : tuple of int
        Open chains of the title block.
    size : (float, float)
        Width and height of the frame, profile unit.
    corner : (float, float)
        Its lower left corner, profile unit.
    evidence : str
        Why it is taken as a frame, in words.
    """

    loop: int
    loops: tuple[int, ...]
    chains: tuple[int, ...]
    size: tuple[float, float]
    corner: tuple[float, float]
    evidence: str


def _is_rectangle(points: np.ndarray) -> bool:
    """True for a simple polygon that fills its bounding box (a rectangle along x and y)."""
    if len(points) < 4:
        return False
    ring = LinearRing(points)
    if not ring.is_simple:
        return False
    poly = Polygon(ring)
    box = poly.envelope
    return abs(box.area - poly.area) <= 1e-6 * box.area


def _attached(frame: LinearRing, geoms: Sequence[shapely.Geometry], tol: float) -> np.ndarray:
    """Which geometries touch the frame, directly or through each other (boolean mask)."""
    n = len(geoms)
    tree = shapely.STRtree(list(geoms))
    left, right = tree.query(list(geoms), predicate="dwithin", distance=tol)
    touch = tree.query(frame, predicate="dwithin", distance=tol)
    # node n is the frame
    rows = np.concatenate([left, np.full(len(touch), n)])
    cols = np.concatenate([right, touch])
    graph = coo_matrix((np.ones(len(rows)), (rows, cols)), shape=(n + 1, n + 1))
    _, label = connected_components(graph, directed=False)
    return label[:n] == label[n]


def _title_block(frame: Polygon, parts: Sequence[shapely.Geometry], tol: float) -> bool:
    """True when the attached geometry looks like a title block: several items in a corner."""
    if len(parts) < TITLE_BLOCK_ITEMS:
        return False
    union = shapely.union_all(list(parts))
    x0, y0, x1, y1 = union.bounds
    if (x1 - x0) * (y1 - y0) > TITLE_BLOCK_AREA * frame.area:
        return False
    corners = np.asarray(frame.envelope.exterior.coords)[:4]
    sides = [LineString([corners[k], corners[(k + 1) % 4]]) for k in range(4)]
    near = [union.distance(s) <= tol for s in sides]
    return any(near[k] and near[(k + 1) % 4] for k in range(4))


def _evidence(k: int, rest: list[int], loops: Sequence[np.ndarray], hatched: Sequence[bool],
              title: bool) -> str:
    """Why the loop k around everything is a frame (empty: no evidence)."""
    if title:
        return "a title block is attached to it"
    if any(hatched[i] for i in rest):
        return "the hatched section lies inside it"
    if rest:
        depth, _ = even_odd_nesting([Polygon(loops[i]) for i in [k, *rest]])
        if int(depth.max()) >= 2:
            return "other loops lie inside the loops it encloses"
    return ""


def _frame_of(k: int, alive: list[int], lines: list[int], loops: Sequence[np.ndarray],
              chains: Sequence[np.ndarray], hatched: Sequence[bool], tol: float) -> Frame | None:
    """Loop k as a frame around the other loops and lines alive, or None when it is not one."""
    ring = LinearRing(loops[k])
    others = [i for i in alive if i != k]
    geoms = [LinearRing(loops[i]) for i in others] + [LineString(chains[j]) for j in lines]
    frame = Polygon(ring)
    if not bool(np.all(shapely.covers(frame.buffer(tol), geoms))):
        return None
    mask = _attached(ring, geoms, tol)
    if any(hatched[i] and m and ring.distance(g) <= tol
           for i, m, g in zip(others, mask, geoms, strict=False)):
        return None  # a hatched section touching the rectangle: it is not a frame around it
    title = _title_block(frame, [g for g, m in zip(geoms, mask, strict=True) if m], tol)
    if title:  # what lies in the title block's cells (text strokes, filled logos) belongs to it
        cells = shapely.union_all([Polygon(loops[i]) for i, m in zip(others, mask, strict=False) if m])
        mask |= np.asarray(shapely.covers(cells.buffer(tol), geoms), dtype=bool)
    rest = [i for i, m in zip(others, mask, strict=False) if not m]
    why = _evidence(k, rest, loops, hatched, title)
    if not rest or not why:
        return None
    x0, y0, x1, y1 = ring.bounds
    return Frame(k, tuple(i for i, m in zip(others, mask, strict=False) if m),
                 tuple(j for j, m in zip(lines, mask[len(others):], strict=True) if m),
                 (x1 - x0, y1 - y0), (x0, y0), why)


def find_frames(loops: Sequence[np.ndarray], straight: Sequence[bool], hatched: Sequence[bool],
                chains: Sequence[np.ndarray], tol: float) -> list[Frame]:
    """The drawing frames of a sheet (outermost first) and their title blocks.

    Parameters
    ----------
    loops : sequence of numpy.ndarray
        Polygons (n, 2) of the closed loops, profile unit.
    straight : sequence of bool
        For each loop, True when it is made of straight lines only.
    hatched : sequence of bool
        For each loop, True when it is hatched.
    chains : sequence of numpy.ndarray
        Points (n, 2) of the open chains, profile unit.
    tol : float
        Joining tolerance, profile unit.

    Returns
    -------
    list of Frame
        Empty when no loop is a frame.

    """
    alive = [k for k, p in enumerate(loops) if len(p) >= 3]
    lines = [k for k, p in enumerate(chains) if len(p) >= 2]
    frames: list[Frame] = []
    for _ in range(MAX_FRAMES):
        if len(alive) < 2:
            break
        k = max(alive, key=lambda i: abs(Polygon(loops[i]).area))
        if not straight[k] or hatched[k] or not _is_rectangle(loops[k]):
            break
        frame = _frame_of(k, alive, lines, loops, chains, hatched, tol)
        if frame is None:
            break
        frames.append(frame)
        gone = {k, *frame.loops}
        alive = [i for i in alive if i not in gone]
        lines = [j for j in lines if j not in set(frame.chains)]
    return _agreeing_with_hatches(frames, loops, hatched)


def _agreeing_with_hatches(frames: list[Frame], loops: Sequence[np.ndarray],
                           hatched: Sequence[bool]) -> list[Frame]:
    """The frames, innermost first given up, until every hatched loop left is solid.

    Leaving a loop out flips the even-odd nesting of everything inside it; a hatched loop that
    would become a hole says the loop left out was material, not a frame.
    """
    frames = list(frames)
    while frames:
        gone = {k for f in frames for k in (f.loop, *f.loops)}
        rest = [i for i, p in enumerate(loops) if i not in gone and len(p) >= 3]
        depth, _ = even_odd_nesting([Polygon(loops[i]) for i in rest])
        if all(d % 2 == 0 for i, d in zip(rest, depth, strict=True) if hatched[i]):
            break
        frames.pop()
    return frames
