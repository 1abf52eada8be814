"""Block references (INSERT, MINSERT): the entities of a block, placed by the composed transform.

:func:`block_entities` expands one model-space reference, at any depth of nesting, into
entities in the drawing's coordinates, each with the layer and the label it is read with: an
entity on layer 0 takes the layer of the reference it comes through, and its label names the
block, the reference and the blocks between.

Each level's transform is ezdxf's ``Insert.matrix44()`` (insertion point, block base point,
scale, rotation and extrusion), each cell of a MINSERT array one of ezdxf's ``multi_insert()``
references; the levels are composed into one matrix and every leaf entity is placed once by
it, exactly, whatever the mirror, non-uniform scale or shear (rotation between non-uniform
scales) of the composition:

- CIRCLE, ARC and ELLIPSE become an ELLIPSE (an ellipse arc) of the transformed centre and
  conjugate semi-diameters, brought to its principal axes; the ellipse reader reads one whose
  axes came out equal as a circle or a circular arc (under a similarity);
- LWPOLYLINE and 2D POLYLINE vertices are transformed; under a similarity a bulge keeps its
  value (its sign flips under a mirror), under any other transform each bulge arc becomes an
  ellipse arc and the straight segments lines;
- SPLINE control points are transformed (a fit-point spline first gets its control points in
  the block's coordinates, as its interpolation is not affine invariant);
- every other entity (LINE, 3D POLYLINE, text, hatches...) by its own ezdxf ``transform``.

A mirror (negative determinant) reverses the direction of the arcs, so each placed arc is
given counter-clockwise from its transformed end. References nested deeper than
:data:`MAX_BLOCK_DEPTH` are left out with a warning.

Before anything is placed, :func:`count_expansion` walks the block graph once (each block's
size memoised: its entities, each reference counted with the size of its block, times the rows
x columns of a MINSERT array), so that a drawing that expands to more than
:data:`MAX_ENTITIES` entities is refused before any memory is spent on it, and a block that
inserts itself, directly or through others, is an error naming the blocks of the cycle.
"""

from __future__ import annotations

import math
from collections.abc import Collection, Iterable, Iterator, Sequence
from dataclasses import dataclass, field

import numpy as np

from ...errors import InputFileError
from ..defects import ERROR, Defect
from ..pieces import bulge_arc
from .collect import MAX_ENTITIES, PieceCollector
from .document import why
from .splines import spline_tool

#: Deepest nesting of block references followed.
MAX_BLOCK_DEPTH = 16

#: Relative round-off below which two axes count as equal, or as perpendicular, or out of plane.
_ROUND_OFF = 1e-9

#: Flattest ellipse ezdxf keeps (axis ratio).
_MIN_RATIO = 1e-6


@dataclass(frozen=True)
class Expansion:
    """What the entities of a drawing expand to, counted before any reference is expanded.

    Attributes
    ----------
    entities : int
        Entities of model space plus every entity a block reference places, each copy counted:
        a reference counts one per cell (rows x columns of a MINSERT array) plus, per cell,
        the entities of its block, nested references counted the same way.
    cycles : tuple of tuple of str
        Each cycle of blocks met, from the block that inserts itself back to it, e.g.
        ``('A', 'B', 'A')``.
    """

    entities: int
    cycles: tuple[tuple[str, ...], ...] = ()

    @property
    def defects(self) -> tuple[Defect, ...]:
        """One error per cycle, naming its blocks."""
        out = []
        for cycle in self.cycles:
            through = (" through " + " -> ".join(repr(n) for n in cycle[1:])) if len(cycle) > 2 else ""
            out.append(Defect("block cycle", f"block {cycle[0]!r} inserts itself{through}, so its "
                              "references never end; remove the reference that closes the cycle",
                              (), ERROR))
        return tuple(out)


def reference_cells(ins: object) -> int:
    """The copies an INSERT places: 1, or the rows x columns ezdxf loops over for a MINSERT."""
    if ins.mcount <= 1:
        return 1
    return max(int(ins.dxf.row_count), 0) * max(int(ins.dxf.column_count), 0)


@dataclass
class _Frame:
    """A block whose size is being counted: its entities still to look at, the total so far."""

    key: str
    name: str
    todo: Iterator
    total: int = 0
    cells: int = 0  # cells of the reference being counted below this block


def _block_size(doc: object, name: str, sizes: dict[str, int], cycles: list[tuple[str, ...]]) -> int:
    """Entities one copy of block ``name`` places (memoised in ``sizes``; block names upper case).

    An iterative depth-first walk: a reference to a block on the current path closes a cycle,
    recorded in ``cycles`` and counted as the reference alone.
    """
    key = name.upper()
    if key in sizes:
        return sizes[key]
    blk = doc.blocks.get(name)
    if blk is None:
        return 0
    stack = [_Frame(key, blk.name, iter(blk))]
    on_path = {key: 0}
    while stack:
        f = stack[-1]
        for ent in f.todo:
            t = ent.dxftype()
            if t == "ATTDEF":
                continue
            if t != "INSERT":
                f.total += 1
                continue
            cells = reference_cells(ent)
            sub = str(ent.dxf.get("name", ""))
            k = sub.upper()
            inner = doc.blocks.get(sub) if k not in sizes and k not in on_path else None
            if inner is None:  # counted already, missing, or closing a cycle
                if k in on_path:
                    cycles.append((*(fr.name for fr in stack[on_path[k]:]), stack[on_path[k]].name))
                f.total += cells * (1 + sizes.get(k, 0))
                continue
            f.cells = cells
            on_path[k] = len(stack)
            stack.append(_Frame(k, inner.name, iter(inner)))
            break
        else:
            stack.pop()
            del on_path[f.key]
            sizes[f.key] = f.total
            if stack:
                stack[-1].total += stack[-1].cells * (1 + f.total)
    return sizes[key]


def count_expansion(doc: object, entities: Iterable) -> Expansion:
    """Count what the entities of a drawing expand to, without expanding any reference.

    Parameters
    ----------
    doc : ezdxf.document.Drawing
        The document (its block definitions).
    entities : iterable of ezdxf entities
        The entities of model space.

    Returns
    -------
    Expansion
        The count (every copy of every block counted) and the cycles of blocks met.

    """
    sizes: dict[str, int] = {}
    cycles: list[tuple[str, ...]] = []
    total = 0
    for e in entities:
        if e.dxftype() == "INSERT":
            total += reference_cells(e) * (1 + _block_size(doc, str(e.dxf.get("name", "")), sizes,
                                                           cycles))
        else:
            total += 1
    seen: set[frozenset[str]] = set()
    unique = []
    for c in cycles:  # one error per cycle, whichever block it was entered by
        if frozenset(n.upper() for n in c) not in seen:
            seen.add(frozenset(n.upper() for n in c))
            unique.append(c)
    return Expansion(total, tuple(unique))


def refuse_large(expansion: Expansion, limit: int | None, file: str) -> None:
    """Refuse a drawing that expands to more than ``limit`` entities (None: :data:`MAX_ENTITIES`).

    Raises
    ------
    InputFileError
        Naming the count and the option that lifts the limit.

    """
    limit = MAX_ENTITIES if limit is None else limit
    if expansion.entities > limit:
        raise InputFileError(f"the drawing expands to {expansion.entities:,} entities (each copy of "
                             f"a block counted), more than the limit of {limit:,}; "
                             "--max-entities N lifts the limit", file=file)


@dataclass
class _Walk:
    """One model-space reference being expanded."""

    out: PieceCollector
    top: str  # label of the model-space reference
    readable: Collection[str] | None  # types read as geometry (None: all)
    warned: set[str] = field(default_factory=set)

    def warn(self, key: str, text: str, layer: str) -> None:
        """A warning, once per expansion."""
        if key not in self.warned:
            self.warned.add(key)
            self.out.warn("unreadable", text, layer=layer)


def block_entities(out: PieceCollector, e: object, layer: str, label: str, depth: int = 0,
                   readable: Collection[str] | None = None) -> Iterator[tuple[object, str, str]]:
    """The entities of a block reference, nested ones expanded, in the drawing's coordinates.

    Parameters
    ----------
    out : PieceCollector
        Counts the entities met in blocks; takes the warnings (a reference nested too deep,
        an entity that cannot be placed or is tilted).
    e : ezdxf INSERT entity
        The reference (a MINSERT array included).
    layer, label : str
        Layer and label of the reference.
    depth : int
        How many references it is met in (0 in model space).
    readable : collection of str, optional
        Entity types read as geometry (default: every type). An entity of another type that
        ezdxf cannot transform (a dimension under shear, say) is yielded as it stands in the
        block, to be counted and left out; one of these types is left out with a warning.

    Yields
    ------
    (entity, layer, label)
        Each leaf entity (never an INSERT), placed, with the layer and label to read it with.

    Notes
    -----
    The size of the expansion and the cycles of blocks are found before, by
    :func:`count_expansion`; here a reference that closes a cycle is only left out.

    """
    from ezdxf.math import Matrix44

    walk = _Walk(out, label, readable)
    yield from _expand(walk, e, Matrix44(), layer, (), depth)


def _where(walk: _Walk, path: Sequence[str]) -> str:
    """The model-space reference and the blocks it leads through, for labels."""
    return walk.top + (" via " + " > ".join(repr(n) for n in path) if path else "")


def _cells(ins: object) -> list:
    """The references of an INSERT: itself, or one per cell of a MINSERT array."""
    return [ins] if ins.mcount <= 1 else list(ins.multi_insert())


def _expand(walk: _Walk, ins: object, parent: object, layer: str, path: tuple[str, ...],
            depth: int) -> Iterator[tuple[object, str, str]]:
    """The leaf entities of one reference met through the blocks ``path``, ``parent`` above it."""
    name = ins.dxf.get("name", "?")
    where = _where(walk, path)
    if depth >= MAX_BLOCK_DEPTH:
        walk.warn(f"depth {name}", f"{where} (block {name!r}) nests blocks more than "
                  f"{MAX_BLOCK_DEPTH} deep: left out", layer)
        return
    blk = ins.block()
    if blk is None:
        walk.warn(f"missing {name}", f"{where} refers to block {name!r}, which the drawing does "
                  "not define: left out", layer)
        return
    if blk.name.upper() in (p.upper() for p in path):  # block names are case-insensitive
        return  # a cycle: an error of the drawing already (count_expansion)
    inner = (*path, blk.name)
    cells = _cells(ins)
    for k, cell in enumerate(cells):
        walk.out.tick()
        m = cell.matrix44() @ parent  # ezdxf matrices act on row vectors: inner level first
        at = where if len(cells) == 1 else f"{where}, cell {k + 1} of {len(cells)}"
        for ent in blk:
            t = ent.dxftype()
            if t == "ATTDEF":  # attribute definitions are not drawn
                continue
            walk.out.in_blocks[t] += 1
            sub_layer = ent.dxf.get("layer", "0") or "0"
            if sub_layer == "0":  # entities on layer 0 take the layer of the reference
                sub_layer = layer
            if t == "INSERT":
                yield from _expand(walk, ent, m, sub_layer, inner, depth + 1)
                continue
            sub_label = f"{t} in block {blk.name!r} ({at})"
            try:
                placed = _place(ent, m, walk.out.source, sub_label)
            except InputFileError:
                raise
            except Exception as exc:  # a damaged entity, or one ezdxf cannot transform
                if walk.readable is not None and t not in walk.readable:
                    yield ent, sub_layer, sub_label  # not geometry: only counted, where it stands
                    continue
                walk.out.warn("unreadable", f"{sub_label} on layer {sub_layer} cannot be placed "
                              f"({why(exc)}): left out", layer=sub_layer)
                continue
            if placed is None:
                walk.out.tilted(sub_label, sub_layer)
                continue
            for v in placed:
                yield v, sub_layer, sub_label


def _place(e: object, m: object, file: str, label: str) -> list | None:
    """Entity e of a block placed by matrix m: new entities, or None if out of the x-y plane.

    ``file`` and ``label`` name it in a refusal (a spline too big to interpolate).
    """
    t = e.dxftype()
    if t in ("CIRCLE", "ARC"):
        return _one(_placed_conic(*_circle_conic(e), m))
    if t == "ELLIPSE":
        ct = e.construction_tool()
        span = float(ct.param_span)
        full = span >= 2 * math.pi - 1e-12 or span <= 1e-12
        t0 = float(ct.start_param)
        return _one(_placed_conic(_vec(ct.center), _vec(ct.major_axis), _vec(ct.minor_axis),
                                  t0, t0 + span, full, m))
    if t == "LWPOLYLINE":
        pts = np.asarray(e.get_points("xyb"), dtype=float).reshape(-1, 3)
        elev = float(e.dxf.get("elevation", 0.0) or 0.0)
        loc = np.column_stack([pts[:, :2], np.full(len(pts), elev)])
        return _placed_polyline(loc, pts[:, 2], bool(e.closed), _extrusion(e), m)
    if t == "POLYLINE" and not (e.is_3d_polyline or e.is_poly_face_mesh or e.is_polygon_mesh):
        verts = [v for v in e.vertices if not (int(v.dxf.get("flags", 0)) & 16)]
        loc = np.asarray([tuple(v.dxf.location) for v in verts], dtype=float).reshape(-1, 3)
        bulge = np.asarray([float(v.dxf.get("bulge", 0.0) or 0.0) for v in verts], dtype=float)
        return _placed_polyline(loc, bulge, bool(e.is_closed), _extrusion(e), m)
    if t == "SPLINE":
        from ezdxf.entities import Spline

        v = Spline.new(dxfattribs={"layer": e.dxf.get("layer", "0")})
        v.apply_construction_tool(spline_tool(e, file, label).transform(m))
        return [v]
    v = e.copy()
    v.transform(m)
    return [v]


def _one(v: object | None) -> list | None:
    return None if v is None else [v]


def _vec(p: object) -> np.ndarray:
    return np.asarray(tuple(p)[:3], dtype=float)


def _extrusion(e: object) -> tuple[float, float, float]:
    ex = tuple(e.dxf.get("extrusion", (0.0, 0.0, 1.0)))
    return ex if len(ex) == 3 and any(ex) and all(map(math.isfinite, ex)) else (0.0, 0.0, 1.0)


def _ocs_axes(extrusion: Sequence[float]) -> tuple:
    """WCS map of an OCS point (a function) and the OCS x and y axes in the WCS."""
    from ezdxf.math import OCS

    ocs = OCS(extrusion)
    return (lambda p: _vec(ocs.to_wcs(tuple(float(x) for x in p)))), _vec(ocs.ux), _vec(ocs.uy)


def _circle_conic(e: object) -> tuple:
    """CIRCLE or ARC as (centre, u, v, t0, t1, full): c + u cos t + v sin t, WCS, t0 <= t <= t1."""
    from ezdxf.math import arc_angle_span_deg

    to_wcs, ux, uy = _ocs_axes(_extrusion(e))
    r = float(e.dxf.radius)
    c = to_wcs(tuple(e.dxf.center))
    if e.dxftype() == "CIRCLE":
        return c, r * ux, r * uy, 0.0, 2 * math.pi, True
    a0, a1 = float(e.dxf.start_angle), float(e.dxf.end_angle)
    span = math.radians(arc_angle_span_deg(a0, a1))
    t0 = math.radians(a0)
    return c, r * ux, r * uy, t0, t0 + span, span >= 2 * math.pi - 1e-12


def _placed_conic(c: np.ndarray, u: np.ndarray, v: np.ndarray, t0: float, t1: float, full: bool,
                  m: object) -> object | None:
    """The ELLIPSE of c + u cos t + v sin t (t0 <= t <= t1, WCS) placed by m, or None if tilted.

    The transformed conjugate semi-diameters u, v are turned to the principal axes: with
    tan 2 phi = 2 u.v / (u.u - v.v), p = u cos phi + v sin phi is the major semi-axis and
    q = -u sin phi + v cos phi the minor one, and the parameter shifts by phi. A mirror (u x v
    pointing down) negates v and the parameter, so that the ellipse runs counter-clockwise
    about +z from the placed arc's end to its start.
    """
    from ezdxf.entities import Ellipse

    c = _vec(m.transform(tuple(c)))
    u, v = _vec(m.transform_direction(tuple(u))), _vec(m.transform_direction(tuple(v)))
    size = max(float(np.linalg.norm(u)), float(np.linalg.norm(v)))
    if not size > 0:
        raise ValueError("the reference's scale shrinks it to a point")
    if abs(u[2]) > _ROUND_OFF * size or abs(v[2]) > _ROUND_OFF * size:
        return None
    u, v = u[:2], v[:2]
    if u[0] * v[1] - u[1] * v[0] < 0:  # mirrored: run the other way round
        v, t0, t1 = -v, -t1, -t0
    phi = 0.5 * math.atan2(2.0 * float(u @ v), float(u @ u - v @ v))
    p = u * math.cos(phi) + v * math.sin(phi)
    q = -u * math.sin(phi) + v * math.cos(phi)
    ratio = min(float(np.linalg.norm(q) / np.linalg.norm(p)), 1.0)
    if ratio < _MIN_RATIO:
        raise ValueError("the reference's scale squashes it flat")
    s0, s1 = (0.0, 2 * math.pi) if full else (t0 - phi, t1 - phi)
    return Ellipse.new(dxfattribs={"center": tuple(c), "major_axis": (p[0], p[1], 0.0),
                                   "ratio": ratio, "start_param": s0, "end_param": s1,
                                   "extrusion": (0.0, 0.0, 1.0)})


def _placed_polyline(loc: np.ndarray, bulges: np.ndarray, closed: bool,
                     extrusion: Sequence[float], m: object) -> list | None:
    """A 2D polyline (OCS vertices, bulges) placed by m: an LWPOLYLINE, or lines and ellipse arcs.

    Returns None when its plane is placed out of the x-y plane.
    """
    from ezdxf.entities import Line, LWPolyline

    to_wcs, ux, uy = _ocs_axes(extrusion)
    ax, ay = _vec(m.transform_direction(tuple(ux))), _vec(m.transform_direction(tuple(uy)))
    size = max(float(np.linalg.norm(ax)), float(np.linalg.norm(ay)))
    if size > 0 and (abs(ax[2]) > _ROUND_OFF * size or abs(ay[2]) > _ROUND_OFF * size):
        return None
    xyz = np.array([_vec(m.transform(tuple(to_wcs(p)))) for p in loc]).reshape(-1, 3)
    det = float(ax[0] * ay[1] - ax[1] * ay[0])
    similar = (abs(float(ax @ ax - ay @ ay)) <= _ROUND_OFF * size * size
               and abs(float(ax @ ay)) <= _ROUND_OFF * size * size)
    arcs = np.isfinite(bulges) & (np.abs(bulges) > 1e-12)
    if similar or not arcs.any():
        v = LWPolyline.new(dxfattribs={"elevation": float(xyz[0, 2]) if len(xyz) else 0.0,
                                       "extrusion": (0.0, 0.0, 1.0)})
        b = np.where(arcs, bulges, 0.0) * (-1.0 if det < 0 else 1.0)
        v.set_points([(x, y, bb) for (x, y), bb in zip(xyz[:, :2].tolist(), b.tolist(),
                                                        strict=True)], format="xyb")
        v.closed = closed
        return [v]
    out: list = []
    n = len(loc)
    for k in range(n if closed else n - 1):
        j = (k + 1) % n
        p, q = loc[k, :2], loc[j, :2]
        if arcs[k] and np.hypot(*(q - p)) > 0:
            c2, r, t0, sweep, _, _ = bulge_arc(p, q, float(bulges[k]))
            c = to_wcs((c2[0], c2[1], loc[k, 2]))
            lo, hi = (t0, t0 + sweep) if sweep > 0 else (t0 + sweep, t0)
            piece = _placed_conic(c, r * ux, r * uy, lo, hi, False, m)
        else:
            piece = Line.new(dxfattribs={"start": tuple(xyz[k]), "end": tuple(xyz[j])})
        out.append(piece)
    return out
