"""DXF entities to pieces: one reader per entity type, chosen by :data:`READERS`.

LINE, ARC, CIRCLE, ELLIPSE (full and partial), SPLINE, LWPOLYLINE and 2D POLYLINE (bulges
become true arcs), flat 3D POLYLINE, block references (INSERT, through
:mod:`.blocks`) and hatch boundaries (HATCH, through :mod:`.hatch`) are read; entities in a
plane other than x-y are left out with a warning.
:func:`read_entity` looks the reader up by the entity's type name; an entity of any other type
(text, dimensions, points...) is counted and left out, those in :data:`UNREADABLE`
with a warning, and a damaged entity is left out with a warning that says why.
"""

from __future__ import annotations

import math
from collections.abc import Callable, Iterable

import numpy as np

from ...errors import InputFileError, UsageError
from ..pieces import Piece, point_piece
from .blocks import block_entities
from .collect import PieceCollector
from .document import why
from .hatch import read_hatch
from .splines import spline_points, spline_tool

#: Entities that hold geometry warpwise cannot read: left out with a warning.
UNREADABLE = {"REGION", "3DSOLID", "BODY", "SURFACE", "MESH", "MLINE", "HELIX", "SOLID", "TRACE",
              "3DFACE", "XLINE", "RAY"}

#: A reader: (collector, entity, layer, label, block depth) -> None; it adds pieces or warnings.
EntityReader = Callable[[PieceCollector, object, str, str, int], None]


def _flat(z: np.ndarray, xy: np.ndarray) -> bool:
    """True when the heights z of points xy are equal to round-off."""
    size = float(np.ptp(xy, axis=0).max()) if len(xy) > 1 else 0.0
    return float(np.ptp(z)) <= 1e-6 * max(size, float(np.abs(xy).max(initial=0.0)), 1e-12)


def _ocs(e: object) -> tuple[Callable[[Iterable], np.ndarray], float] | None:
    """WCS transform of the entity's OCS and the sign of its extrusion, or None if tilted."""
    ex = e.dxf.get("extrusion", (0.0, 0.0, 1.0))
    ex = np.asarray(tuple(ex), dtype=float)
    if ex.shape != (3,) or not np.all(np.isfinite(ex)) or np.linalg.norm(ex) == 0:
        ex = np.array([0.0, 0.0, 1.0])
    ex = ex / np.linalg.norm(ex)
    if abs(ex[0]) > 1e-9 or abs(ex[1]) > 1e-9:
        return None
    sign = 1.0 if ex[2] > 0 else -1.0

    def to_wcs(points: Iterable) -> np.ndarray:
        pts = np.asarray([tuple(p)[:3] for p in points], dtype=float).reshape(-1, 3)
        # arbitrary axis algorithm for extrusion (0, 0, -1): OCS x -> -WCS x, z -> -z
        return pts * np.array([sign, 1.0, sign])

    return to_wcs, sign


def read_line(out: PieceCollector, e: object, layer: str, label: str, depth: int = 0) -> None:
    """LINE."""
    pts = np.array([tuple(e.dxf.start), tuple(e.dxf.end)], dtype=float)
    if not _flat(pts[:, 2], pts[:, :2]):
        return out.tilted(label, layer)
    out.line(pts[0, :2], pts[1, :2], layer, label)


def _circle_of(e: object, to_wcs: Callable[[Iterable], np.ndarray]) -> tuple[np.ndarray, float, np.ndarray]:
    """Centre (OCS), radius and centre (WCS, x-y) of an ARC or CIRCLE."""
    c_ocs = np.asarray(tuple(e.dxf.center), dtype=float)
    r = float(e.dxf.radius)
    return c_ocs, r, to_wcs([c_ocs])[0, :2]


def read_circle(out: PieceCollector, e: object, layer: str, label: str, depth: int = 0) -> None:
    """CIRCLE."""
    ocs = _ocs(e)
    if ocs is None:
        return out.tilted(label, layer)
    _, r, c = _circle_of(e, ocs[0])
    out.arc(c, r, 0.0, 2 * math.pi, layer, label, closed=True)


def read_arc(out: PieceCollector, e: object, layer: str, label: str, depth: int = 0) -> None:
    """ARC (a full turn becomes a circle)."""
    from ezdxf.math import arc_angle_span_deg

    ocs = _ocs(e)
    if ocs is None:
        return out.tilted(label, layer)
    to_wcs, sign = ocs
    c_ocs, r, c = _circle_of(e, to_wcs)
    a0, a1 = float(e.dxf.start_angle), float(e.dxf.end_angle)
    span = math.radians(arc_angle_span_deg(a0, a1))
    p0 = to_wcs([c_ocs + r * np.array([math.cos(math.radians(a0)), math.sin(math.radians(a0)), 0])])[0]
    t0 = math.atan2(p0[1] - c[1], p0[0] - c[0])
    if span >= 2 * math.pi - 1e-12:
        return out.arc(c, r, t0, 2 * math.pi, layer, label, closed=True)
    out.arc(c, r, t0, sign * span, layer, label)


def read_ellipse(out: PieceCollector, e: object, layer: str, label: str, depth: int = 0) -> None:
    """ELLIPSE, full or partial (one with equal axes is a circle or an arc)."""
    ct = e.construction_tool()
    ex = np.asarray(tuple(ct.extrusion), dtype=float)
    major = np.asarray(tuple(ct.major_axis), dtype=float)
    if abs(ex[0]) > 1e-9 * np.linalg.norm(ex) or abs(ex[1]) > 1e-9 * np.linalg.norm(ex) or (
            abs(major[2]) > 1e-9 * np.linalg.norm(major)):
        return out.tilted(label, layer)
    sign = 1.0 if ex[2] > 0 else -1.0
    c = np.asarray(tuple(ct.center), dtype=float)[:2]
    span = float(ct.param_span)
    full = span >= 2 * math.pi - 1e-12 or span <= 1e-12
    if abs(float(ct.ratio) - 1.0) <= 1e-9:  # a circle drawn as an ellipse
        r = float(np.linalg.norm(major[:2]))
        p0 = np.asarray(tuple(ct.start_point), dtype=float)[:2]
        t0 = 0.0 if full else math.atan2(p0[1] - c[1], p0[0] - c[0])
        return out.arc(c, r, t0, 2 * math.pi if full else sign * span, layer, label, closed=full)
    u, v = major[:2], np.asarray(tuple(ct.minor_axis), dtype=float)[:2]
    t0 = float(ct.start_param)
    out.ellipse(c, u, v, t0, 2 * math.pi if full else span, layer, label, closed=full)


def read_spline(out: PieceCollector, e: object, layer: str, label: str, depth: int = 0) -> None:
    """SPLINE (closed when its ends meet), drawn by :func:`~.splines.spline_points`."""
    ct = spline_tool(e, out.source, label)
    ctrl = np.asarray([tuple(v) for v in ct.control_points], dtype=float).reshape(-1, 3)
    if len(ctrl) < 2:
        raise ValueError("fewer than two control points")
    if not _flat(ctrl[:, 2], ctrl[:, :2]):
        return out.tilted(label, layer)
    f = out.f
    size = float(np.ptp(ctrl[:, :2], axis=0).max()) * f
    if not size > 0:
        return out.add(point_piece(ctrl[0, :2] * f, layer, label))

    def raw(s: float, ct=ct) -> np.ndarray:
        return spline_points(ct, max(s / f, 1e-12 * size / f)) * f

    pts = raw(1e-5 * size)
    full = bool(np.hypot(*(pts[-1] - pts[0])) <= 1e-9 * size)

    def sample(s: float) -> np.ndarray:
        p = raw(s)
        return p[:-1] if full else p

    length = float(np.sum(np.hypot(*np.diff(pts, axis=0).T)))
    out.add(Piece(tuple(pts[0]), tuple(pts[0] if full else pts[-1]), tuple(pts[len(pts) // 2]),
                  length, sample, curved_length=length, closed=full, layer=layer, label=label))


def read_lwpolyline(out: PieceCollector, e: object, layer: str, label: str, depth: int = 0) -> None:
    """LWPOLYLINE, with its bulges and elevation."""
    ocs = _ocs(e)
    if ocs is None:
        return out.tilted(label, layer)
    to_wcs, sign = ocs
    pts = np.asarray(e.get_points("xyb"), dtype=float).reshape(-1, 3)
    elev = float(e.dxf.get("elevation", 0.0) or 0.0)
    xyz = to_wcs(np.column_stack([pts[:, :2], np.full(len(pts), elev)]))
    out.polyline(xyz[:, :2], pts[:, 2], bool(e.closed), sign, layer, label)


def read_polyline(out: PieceCollector, e: object, layer: str, label: str, depth: int = 0) -> None:
    """POLYLINE: 2D with bulges, or a flat 3D one; a polyface or polygon mesh is left out."""
    if e.is_poly_face_mesh or e.is_polygon_mesh:
        out.skipped["POLYLINE (mesh)"] += 1
        out.unreadable["POLYLINE (mesh)"] += 1
        return
    verts = [v for v in e.vertices if not (int(v.dxf.get("flags", 0)) & 16)]
    loc = np.asarray([tuple(v.dxf.location) for v in verts], dtype=float).reshape(-1, 3)
    bulge = np.asarray([float(v.dxf.get("bulge", 0.0) or 0.0) for v in verts], dtype=float)
    if e.is_3d_polyline:
        if not _flat(loc[:, 2], loc[:, :2]):
            return out.tilted(label, layer)
        return out.polyline(loc[:, :2], np.zeros(len(loc)), bool(e.is_closed), 1.0, layer, label)
    ocs = _ocs(e)
    if ocs is None:
        return out.tilted(label, layer)
    to_wcs, sign = ocs
    xyz = to_wcs(loc)
    out.polyline(xyz[:, :2], bulge, bool(e.is_closed), sign, layer, label)


def read_insert(out: PieceCollector, e: object, layer: str, label: str, depth: int = 0) -> None:
    """INSERT: every entity of the block (nested ones too), placed by :mod:`.blocks`, then read."""
    for v, sub_layer, sub_label in block_entities(out, e, layer, label, depth, READERS):
        read_entity(out, v, sub_layer, sub_label, depth + 1)


#: DXF type name -> its reader; entities of any other type are counted and left out.
READERS: dict[str, EntityReader] = {
    "INSERT": read_insert,
    "LINE": read_line,
    "ARC": read_arc,
    "CIRCLE": read_circle,
    "ELLIPSE": read_ellipse,
    "SPLINE": read_spline,
    "LWPOLYLINE": read_lwpolyline,
    "POLYLINE": read_polyline,
    "HATCH": read_hatch,
}


def read_entity(out: PieceCollector, e: object, layer: str, label: str, depth: int = 0) -> None:
    """Read one entity with the reader of its type, into ``out``.

    Parameters
    ----------
    out : PieceCollector
        Takes the pieces, warnings and counts.
    e : ezdxf entity
        The entity.
    layer : str
        Its layer (inside a block: the reference's layer for entities on layer 0).
    label : str
        Its name in messages, e.g. ``LINE #1F``.
    depth : int
        How many block references it is met in (0 in model space).

    """
    out.tick()
    t = e.dxftype()
    read = READERS.get(t)
    if read is None:
        out.skipped[t] += 1
        if t in UNREADABLE:
            out.unreadable[t] += 1
        return
    try:
        read(out, e, layer, label, depth)
    except (InputFileError, UsageError):
        raise
    except Exception as exc:  # a damaged entity: leave it out and say so
        out.warn("unreadable", f"{label} on layer {layer} cannot be read ({why(exc)}): left out",
                 layer=layer)
