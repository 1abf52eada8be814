"""DXF drawings to profiles (read with ezdxf).

Reading goes in three steps, each usable on its own:

1. :func:`read_drawing` reads the file with ezdxf (in its recover mode when the strict reader
   fails, so that damaged files load where they can), expands block references with their
   transforms and turns every curve of model space into a :class:`~warpwise.io.chains.Piece`:
   LINE, ARC, CIRCLE, ELLIPSE (full and partial), SPLINE, LWPOLYLINE and 2D POLYLINE (bulges
   become true arcs), flat 3D POLYLINE. Everything else (text, dimensions, hatches, points...)
   is counted and left out. Coordinates are converted to the profile's length unit here.
2. :func:`lay_out` joins the pieces of the chosen layers into closed loops within a joining
   tolerance tied to the drawing size, checks the loops and nests them even-odd into parts,
   listing every defect on the way.
3. :func:`build_profile` draws the loops of the chosen part(s) as polygons at a chord tolerance
   tied to the mesh size and validates them with :func:`warpwise.geometry.profile_from_loops`.

:func:`read_dxf` does all three. Layer names are kept per loop (``DxfProfile.loop_layers``);
they become region materials only when asked (``layer_materials``), so that by default a hole
drawn on another layer than its outline is still a hole.

Examples
--------
>>> import ezdxf, tempfile, pathlib
>>> doc = ezdxf.new()
>>> doc.header["$INSUNITS"] = 4
>>> msp = doc.modelspace()
>>> _ = msp.add_lwpolyline([(0, 0), (40, 0), (40, 20), (0, 20)], close=True)
>>> _ = msp.add_circle((20, 10), 5)
>>> path = pathlib.Path(tempfile.mkdtemp()) / "plate.dxf"
>>> doc.saveas(path)
>>> p = read_dxf(path)
>>> len(p.regions), len(p.regions[0].holes), p.units
(1, 1, 'mm')
>>> bool(abs(p.area - (800 - 25 * 3.141592653589793)) < 1e-4 * p.area)
True

"""

from __future__ import annotations

import logging
import math
from collections import Counter
from collections.abc import Callable, Iterable, Mapping, Sequence
from dataclasses import dataclass, field
from pathlib import Path

import numpy as np

from ..errors import InputFileError, ProfileError, UsageError
from ..geometry.loops import MAX_COORDINATE
from ..geometry.profile import LENGTH_UNITS, Profile, default_element_size, profile_from_loops
from .chains import (
    ERROR,
    WARNING,
    Chain,
    Defect,
    Part,
    Piece,
    arc_piece,
    arcs_for_mesh,
    bulge_arc,
    chain_by_layer,
    chord_error,
    fmt,
    fmt_point,
    line_piece,
    loop_defects,
    loop_points,
    nest_loops,
    polyline_piece,
)
from .outline import read_input

#: Joining tolerance as a fraction of the diagonal of the drawing's extent.
JOIN_TOLERANCE = 1e-5
#: Chord tolerance to start from, as a fraction of the mesh size.
CHORD_PER_MESH_SIZE = 0.01
#: Finest chord tolerance chosen, as a fraction of the mesh size (keeps the polygons finite).
MIN_CHORD_PER_MESH_SIZE = 1e-7
#: Relative area the chords of all curves may change (half of the 1e-4 promised, as margin for
#: curves flattened by ezdxf).
CHORD_AREA_BUDGET = 0.5e-4
#: Largest number of pieces read from one drawing.
MAX_PIECES = 200_000
#: Deepest nesting of block references followed.
MAX_BLOCK_DEPTH = 16
#: Largest number of parts named in a message.
PARTS_IN_MESSAGE = 10

#: $INSUNITS codes: (name, profile unit, factor to that unit); None where not supported.
INSUNITS: dict[int, tuple[str, tuple[str, float] | None]] = {
    1: ("inches", ("in", 1.0)), 2: ("feet", ("in", 12.0)), 3: ("miles", None),
    4: ("millimetres", ("mm", 1.0)), 5: ("centimetres", ("cm", 1.0)), 6: ("metres", ("m", 1.0)),
    7: ("kilometres", ("m", 1000.0)), 8: ("microinches", ("in", 1e-6)), 9: ("mils", ("in", 1e-3)),
    10: ("yards", ("in", 36.0)), 11: ("angstroms", ("mm", 1e-7)), 12: ("nanometres", ("mm", 1e-6)),
    13: ("micrometres", ("mm", 1e-3)), 14: ("decimetres", ("cm", 10.0)),
    15: ("decametres", ("m", 10.0)), 16: ("hectometres", ("m", 100.0)),
    17: ("gigametres", None), 18: ("astronomical units", None), 19: ("light years", None),
    20: ("parsecs", None),
}

#: Entities that hold geometry warpwise cannot read: left out with a warning.
_UNREADABLE = {"REGION", "3DSOLID", "BODY", "SURFACE", "MESH", "MLINE", "HELIX", "SOLID", "TRACE",
               "3DFACE", "XLINE", "RAY"}

_BINARY_SENTINEL = b"AutoCAD Binary DXF\r\n\x1a\x00"


# --------------------------------------------------------------------------------------------
# step 1: the drawing


@dataclass(frozen=True)
class Units:
    """The length unit of a drawing and where it came from.

    Attributes
    ----------
    unit : str
        Profile length unit, a key of :data:`warpwise.geometry.LENGTH_UNITS`.
    factor : float
        Drawing coordinates times this give lengths in ``unit``.
    origin : str
        ``option``, ``header`` or ``assumed``.
    note : str
        One line saying so.
    """

    unit: str
    factor: float
    origin: str
    note: str


def resolve_units(insunits: int | None, override: str | None, *, file: str | None = None) -> Units:
    """Length unit from ``--units`` or the drawing's ``$INSUNITS``, else millimetres.

    Parameters
    ----------
    insunits : int or None
        The header's ``$INSUNITS`` code (None when absent).
    override : str or None
        A unit given by the user; the coordinates are then taken as that unit as they are.
    file : str, optional
        Named in messages.

    Returns
    -------
    Units

    Examples
    --------
    >>> resolve_units(1, None).unit, resolve_units(1, "mm").unit, resolve_units(None, None).origin
    ('in', 'mm', 'assumed')
    >>> resolve_units(2, None).factor
    12.0

    """
    if override is not None:
        if override not in LENGTH_UNITS:
            raise UsageError(f"unknown length unit {override!r} (use {', '.join(LENGTH_UNITS)})")
        return Units(override, 1.0, "option", f"length unit {override}, as given by --units")
    if insunits in INSUNITS:
        name, target = INSUNITS[insunits]
        if target is None:
            raise InputFileError(
                f"the drawing's unit is {name} ($INSUNITS = {insunits}), which warpwise does not "
                f"use; give the unit of the coordinates with --units", file=file)
        unit, factor = target
        if factor == 1.0:
            note = f"length unit {unit}, from the drawing header ($INSUNITS = {insunits})"
        else:
            note = (f"drawing in {name} ($INSUNITS = {insunits}), converted to {unit} "
                    f"(x {factor:g})")
        return Units(unit, factor, "header", note)
    said = "says unitless ($INSUNITS = 0)" if insunits == 0 else (
        "does not say" if insunits is None else f"has an unknown $INSUNITS = {insunits}")
    return Units("mm", 1.0, "assumed", f"length unit not known (the drawing {said}): "
                                       "millimetres assumed")


@dataclass(frozen=True, eq=False)
class Drawing:
    """The curves of a DXF drawing, in the profile's length unit.

    Attributes
    ----------
    source : str
        File name.
    pieces : tuple of Piece
        Every curve of model space (block references expanded).
    units : Units
        Length unit of the coordinates.
    version : str
        DXF version of the file ($ACADVER).
    entities : dict of str to int
        Model-space entities by type.
    in_blocks : dict of str to int
        Entities met inside block references, by type.
    skipped : dict of str to int
        Entities left out because they are not geometry (text, dimensions...), by type.
    repairs : tuple of str
        What ezdxf fixed while reading (its audit, and its recover mode when the strict reader
        failed).
    defects : tuple of Defect
        Entities that could not be used, and a truncated file.
    """

    source: str
    pieces: tuple[Piece, ...]
    units: Units
    version: str = ""
    entities: dict[str, int] = field(default_factory=dict)
    in_blocks: dict[str, int] = field(default_factory=dict)
    skipped: dict[str, int] = field(default_factory=dict)
    repairs: tuple[str, ...] = ()
    defects: tuple[Defect, ...] = ()

    @property
    def layers(self) -> tuple[str, ...]:
        """Layers that hold curves, sorted."""
        return tuple(sorted({p.layer for p in self.pieces}))


def _check_text_dxf(data: bytes, name: str) -> None:
    """Refuse data that does not start like a DXF text file."""
    if b"\x00" in data[:65536]:
        raise InputFileError("is a binary file, not a DXF drawing", file=name)
    head = data[:4096].removeprefix(b"\xef\xbb\xbf").decode("latin-1")
    tags = [ln.strip() for ln in head.replace("\r\n", "\n").replace("\r", "\n").split("\n")]
    # skip 999 comments; the first tag must be (0, SECTION)
    k = 0
    while k + 1 < len(tags) and tags[k] == "999":
        k += 2
    while k < len(tags) and not tags[k]:
        k += 1
    if k + 1 >= len(tags) or tags[k] != "0" or tags[k + 1].upper() != "SECTION":
        raise InputFileError("is not a DXF drawing (it does not begin with a DXF SECTION)", file=name)


def _load_document(path: str | Path) -> tuple[object, tuple[str, ...], bool, dict[str, int]]:
    """Read a DXF file with ezdxf.

    Returns the document, the repairs made, whether the file is truncated and the model-space
    entities by type as found in the file (before ezdxf's audit removed broken ones).
    """
    import ezdxf
    from ezdxf import recover

    p = Path(path)
    name = str(path)
    data = read_input(p)
    if not data.strip():
        raise InputFileError("file is empty", file=name)
    if data.startswith(_BINARY_SENTINEL):
        try:
            doc = ezdxf.readfile(p)
        except Exception as exc:  # ezdxf raises many kinds for a damaged binary file
            raise InputFileError(f"binary DXF file cannot be read ({_why(exc)})", file=name) from None
        return doc, (), False, dict(Counter(e.dxftype() for e in doc.modelspace()))
    _check_text_dxf(data, name)
    truncated = not data.rstrip(b" \t\r\n\x1a\x00").upper().endswith(b"EOF")
    recovered = ()
    try:  # the strict reader is faster; recover mode takes what it rejects
        doc = ezdxf.readfile(p)
        found = Counter(e.dxftype() for e in doc.modelspace())  # before the audit removes any
        auditor = doc.audit()
    except Exception as strict:  # ezdxf raises many kinds for a damaged file
        log = logging.getLogger("ezdxf")
        heard: list[str] = []

        class _Collect(logging.Handler):
            def emit(self, record: logging.LogRecord) -> None:
                heard.append(record.getMessage())

        handler = _Collect(level=logging.WARNING)
        keep = log.propagate
        log.addHandler(handler)
        log.propagate = False  # ezdxf's own lines must not reach the user's stderr
        try:
            doc, auditor = recover.readfile(p)
        except Exception as exc:  # recover mode gave up: the file is not a usable DXF
            raise InputFileError(f"is not a readable DXF drawing ({_why(exc)})", file=name) from None
        finally:
            log.removeHandler(handler)
            log.propagate = keep
        bad_numbers = [m for m in heard if "invalid floating point" in m or "invalid integer" in m]
        if bad_numbers:
            # a guessed coordinate would change the profile silently: refuse instead
            raise InputFileError(f"holds an invalid number ({' '.join(bad_numbers[0].split())[:120]})",
                                 file=name) from None
        recovered = (f"read in recover mode (the strict reader stopped: {_why(strict)})",)
        found = Counter(e.dxftype() for e in doc.modelspace())
    repairs = recovered + tuple(str(getattr(f, "message", f))
                                for f in list(auditor.fixes) + list(auditor.errors))
    return doc, repairs, truncated, dict(found)


def _why(exc: BaseException) -> str:
    text = " ".join(str(exc).split())
    return f"{type(exc).__name__}: {text[:160]}" if text else type(exc).__name__


class _Reader:
    """Turns DXF entities into pieces in the profile's unit."""

    def __init__(self, source: str, factor: float) -> None:
        self.source = source
        self.f = factor
        self.pieces: list[Piece] = []
        self.defects: list[Defect] = []
        self.in_blocks: Counter[str] = Counter()
        self.skipped: Counter[str] = Counter()
        self.unreadable: Counter[str] = Counter()

    # -- helpers ---------------------------------------------------------------------------

    def warn(self, kind: str, text: str, where: Sequence[tuple[float, float]] = (),
             layer: str | None = None) -> None:
        self.defects.append(Defect(kind, text, tuple(where), WARNING, layer))

    def add(self, piece: Piece) -> None:
        ends = np.array([piece.start, piece.end, piece.probe], dtype=float)
        if not (np.all(np.isfinite(ends)) and np.isfinite(piece.length)):
            self.warn("unreadable", f"{piece.label} on layer {piece.layer} has a coordinate that is "
                      "not a finite number: left out", layer=piece.layer)
            return
        if float(np.abs(ends).max()) > MAX_COORDINATE:
            self.warn("unreadable", f"{piece.label} on layer {piece.layer} reaches a coordinate of "
                      f"{float(np.abs(ends).max()):.3g}, beyond {MAX_COORDINATE:.0e}: left out",
                      layer=piece.layer)
            return
        if len(self.pieces) >= MAX_PIECES:
            raise InputFileError(f"the drawing has more than {MAX_PIECES:,} curves; "
                                 "this is not a section drawing", file=self.source)
        self.pieces.append(piece)

    @staticmethod
    def _flat(z: np.ndarray, xy: np.ndarray) -> bool:
        size = float(np.ptp(xy, axis=0).max()) if len(xy) > 1 else 0.0
        return float(np.ptp(z)) <= 1e-6 * max(size, float(np.abs(xy).max(initial=0.0)), 1e-12)

    def _ocs(self, e: object) -> tuple[Callable[[Iterable], np.ndarray], float] | None:
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

    def _tilted(self, label: str, layer: str) -> None:
        self.warn("not flat", f"{label} on layer {layer} does not lie in the x-y plane: left out",
                  layer=layer)

    # -- piece builders --------------------------------------------------------------------

    def line(self, p: np.ndarray, q: np.ndarray, layer: str, label: str) -> None:
        self.add(line_piece(p * self.f, q * self.f, layer, label))

    def arc(self, c: np.ndarray, r: float, t0: float, sweep: float, layer: str, label: str,
            closed: bool = False) -> None:
        """Arc of centre c, radius r from angle t0 (radians) by a signed sweep (CCW positive)."""
        c, r = c * self.f, r * self.f
        if not (np.all(np.isfinite(c)) and np.isfinite(r) and r > 0):
            self.warn("unreadable", f"{label} on layer {layer} has no valid radius: left out",
                      layer=layer)
            return
        self.add(arc_piece(c, r, t0, sweep, layer, label, closed))

    def polyline(self, xy: np.ndarray, bulges: np.ndarray, closed: bool, sign: float, layer: str,
                 label: str) -> None:
        """A polyline of WCS vertices (n, 2); bulges as in the file, flipped by ``sign``."""
        xy = xy * self.f
        n = len(xy)
        if n == 0:
            return
        size = float(np.ptp(xy, axis=0).max()) if n > 1 else 0.0
        tiny = 1e-9 * max(size, float(np.abs(xy).max(initial=0.0)), 1e-300)
        count = n if closed else n - 1
        segs: list[tuple] = []
        all_zero = size <= tiny  # then the whole polyline is reported as one zero-length piece
        for k in range(count):
            p, q = xy[k], xy[(k + 1) % n]
            if np.hypot(*(q - p)) <= tiny:
                if not (closed and k == count - 1) and not all_zero:  # a repeated closing vertex
                    self.warn("zero length", f"{label} on layer {layer} has a zero-length segment "
                              f"at {fmt_point(p)}: left out", (tuple(p),), layer)
                continue
            b = float(bulges[k]) * sign
            if abs(b) > 1e-12 and np.isfinite(b):
                segs.append(("arc", *bulge_arc(p, q, b)))
            else:
                segs.append(("line", p, q))
        if not segs:
            p = tuple(xy[0])
            self.add(Piece(p, p, p, 0.0, lambda s, p=p: np.array([p]), layer=layer, label=label))
            return
        self.add(polyline_piece(segs, closed, layer, label))

    # -- entities --------------------------------------------------------------------------

    def entity(self, e: object, layer: str, label: str, depth: int) -> None:
        t = e.dxftype()
        try:
            if t == "INSERT":
                self.insert(e, layer, label, depth)
            elif t == "LINE":
                pts = np.array([tuple(e.dxf.start), tuple(e.dxf.end)], dtype=float)
                if not self._flat(pts[:, 2], pts[:, :2]):
                    return self._tilted(label, layer)
                self.line(pts[0, :2], pts[1, :2], layer, label)
            elif t in ("ARC", "CIRCLE"):
                self.circular(e, t, layer, label)
            elif t == "ELLIPSE":
                self.ellipse(e, layer, label)
            elif t == "SPLINE":
                self.spline(e, layer, label)
            elif t == "LWPOLYLINE":
                ocs = self._ocs(e)
                if ocs is None:
                    return self._tilted(label, layer)
                to_wcs, sign = ocs
                pts = np.asarray(e.get_points("xyb"), dtype=float).reshape(-1, 3)
                elev = float(e.dxf.get("elevation", 0.0) or 0.0)
                xyz = to_wcs(np.column_stack([pts[:, :2], np.full(len(pts), elev)]))
                self.polyline(xyz[:, :2], pts[:, 2], bool(e.closed), sign, layer, label)
            elif t == "POLYLINE":
                self.old_polyline(e, layer, label)
            else:
                self.skipped[t] += 1
                if t in _UNREADABLE:
                    self.unreadable[t] += 1
        except (InputFileError, UsageError):
            raise
        except Exception as exc:  # a damaged entity: leave it out and say so
            self.warn("unreadable", f"{label} on layer {layer} cannot be read ({_why(exc)}): left out",
                      layer=layer)

    def circular(self, e: object, t: str, layer: str, label: str) -> None:
        ocs = self._ocs(e)
        if ocs is None:
            return self._tilted(label, layer)
        to_wcs, sign = ocs
        c_ocs = np.asarray(tuple(e.dxf.center), dtype=float)
        r = float(e.dxf.radius)
        c = to_wcs([c_ocs])[0, :2]
        if t == "CIRCLE":
            return self.arc(c, r, 0.0, 2 * math.pi, layer, label, closed=True)
        from ezdxf.math import arc_angle_span_deg

        a0, a1 = float(e.dxf.start_angle), float(e.dxf.end_angle)
        span = math.radians(arc_angle_span_deg(a0, a1))
        p0 = to_wcs([c_ocs + r * np.array([math.cos(math.radians(a0)), math.sin(math.radians(a0)), 0])])[0]
        t0 = math.atan2(p0[1] - c[1], p0[0] - c[0])
        if span >= 2 * math.pi - 1e-12:
            return self.arc(c, r, t0, 2 * math.pi, layer, label, closed=True)
        self.arc(c, r, t0, sign * span, layer, label)

    def ellipse(self, e: object, layer: str, label: str) -> None:
        ct = e.construction_tool()
        ex = np.asarray(tuple(ct.extrusion), dtype=float)
        major = np.asarray(tuple(ct.major_axis), dtype=float)
        if abs(ex[0]) > 1e-9 * np.linalg.norm(ex) or abs(ex[1]) > 1e-9 * np.linalg.norm(ex) or (
                abs(major[2]) > 1e-9 * np.linalg.norm(major)):
            return self._tilted(label, layer)
        sign = 1.0 if ex[2] > 0 else -1.0
        c = np.asarray(tuple(ct.center), dtype=float)[:2]
        span = float(ct.param_span)
        full = span >= 2 * math.pi - 1e-12 or span <= 1e-12
        if abs(float(ct.ratio) - 1.0) <= 1e-9:  # a circle drawn as an ellipse
            r = float(np.linalg.norm(major[:2]))
            p0 = np.asarray(tuple(ct.start_point), dtype=float)[:2]
            t0 = 0.0 if full else math.atan2(p0[1] - c[1], p0[0] - c[0])
            return self.arc(c, r, t0, 2 * math.pi if full else sign * span, layer, label, closed=full)
        f = self.f
        size = float(np.linalg.norm(major)) * f

        def sample(s: float, ct=ct) -> np.ndarray:
            tol = max(s / f, 1e-12 * size / f)
            pts = np.array([(v.x, v.y) for v in ct.flattening(tol, segments=16)]) * f
            return pts[:-1] if full else pts

        pts = sample(1e-5 * size)
        start, end = tuple(pts[0]), tuple(pts[0] if full else pts[-1])
        probe = tuple(pts[len(pts) // 2])
        length = float(np.sum(np.hypot(*np.diff(np.vstack([pts, pts[:1]]) if full else pts, axis=0).T)))
        self.add(Piece(start, end, probe, length, sample, curved_length=length, closed=full,
                       layer=layer, label=label))

    def spline(self, e: object, layer: str, label: str) -> None:
        ct = e.construction_tool()
        ctrl = np.asarray([tuple(v) for v in ct.control_points], dtype=float).reshape(-1, 3)
        if len(ctrl) < 2:
            raise ValueError("fewer than two control points")
        if not self._flat(ctrl[:, 2], ctrl[:, :2]):
            return self._tilted(label, layer)
        f = self.f
        size = float(np.ptp(ctrl[:, :2], axis=0).max()) * f
        if not size > 0:
            p = tuple(ctrl[0, :2] * f)
            self.add(Piece(p, p, p, 0.0, lambda s, p=p: np.array([p]), layer=layer, label=label))
            return

        def raw(s: float, ct=ct) -> np.ndarray:
            tol = max(s / f, 1e-12 * size / f)
            return np.array([(v.x, v.y) for v in ct.flattening(tol, segments=16)]) * f

        pts = raw(1e-5 * size)
        full = bool(np.hypot(*(pts[-1] - pts[0])) <= 1e-9 * size)

        def sample(s: float) -> np.ndarray:
            p = raw(s)
            return p[:-1] if full else p

        length = float(np.sum(np.hypot(*np.diff(pts, axis=0).T)))
        self.add(Piece(tuple(pts[0]), tuple(pts[0] if full else pts[-1]), tuple(pts[len(pts) // 2]),
                       length, sample, curved_length=length, closed=full, layer=layer, label=label))

    def old_polyline(self, e: object, layer: str, label: str) -> None:
        if e.is_poly_face_mesh or e.is_polygon_mesh:
            self.skipped["POLYLINE (mesh)"] += 1
            self.unreadable["POLYLINE (mesh)"] += 1
            return
        verts = [v for v in e.vertices if not (int(v.dxf.get("flags", 0)) & 16)]
        loc = np.asarray([tuple(v.dxf.location) for v in verts], dtype=float).reshape(-1, 3)
        bulge = np.asarray([float(v.dxf.get("bulge", 0.0) or 0.0) for v in verts], dtype=float)
        if e.is_3d_polyline:
            if not self._flat(loc[:, 2], loc[:, :2]):
                return self._tilted(label, layer)
            return self.polyline(loc[:, :2], np.zeros(len(loc)), bool(e.is_closed), 1.0, layer, label)
        ocs = self._ocs(e)
        if ocs is None:
            return self._tilted(label, layer)
        to_wcs, sign = ocs
        xyz = to_wcs(loc)
        self.polyline(xyz[:, :2], bulge, bool(e.is_closed), sign, layer, label)

    def insert(self, e: object, layer: str, label: str, depth: int) -> None:
        name = e.dxf.get("name", "?")
        if depth >= MAX_BLOCK_DEPTH:
            self.warn("unreadable", f"{label} (block {name!r}) nests blocks more than "
                      f"{MAX_BLOCK_DEPTH} deep: left out", layer=layer)
            return
        grid = list(e.multi_insert()) if e.mcount > 1 else [e]
        for ins in grid:
            for v in ins.virtual_entities():
                t = v.dxftype()
                self.in_blocks[t] += 1
                sub_layer = v.dxf.get("layer", "0")
                if sub_layer == "0":  # entities on layer 0 take the layer of the reference
                    sub_layer = layer
                where = label if depth == 0 else label.split(" in block ")[0]
                self.entity(v, sub_layer, f"{t} in block {name!r} ({where})", depth + 1)


def read_drawing(path: str | Path, units: str | None = None) -> Drawing:
    """Read the curves of a DXF drawing.

    Parameters
    ----------
    path : str or Path
        DXF file (text or binary).
    units : str, optional
        Length unit of the coordinates, overriding the header's ``$INSUNITS``.

    Returns
    -------
    Drawing
        Pieces in the profile's unit, entity counts, repairs and entity defects.

    Raises
    ------
    InputFileError
        Missing, empty, binary (not DXF), unreadable file, or an unsupported unit.

    """
    name = str(path)
    doc, repairs, truncated, found = _load_document(path)
    try:
        raw_units = doc.header.get("$INSUNITS", None)
        insunits = int(raw_units) if raw_units is not None else None
    except (TypeError, ValueError):
        insunits = None
    u = resolve_units(insunits, units, file=name)
    reader = _Reader(name, u.factor)
    try:
        msp = doc.modelspace()
        entities = list(msp)
    except Exception as exc:  # no usable model space
        raise InputFileError(f"has no readable model space ({_why(exc)})", file=name) from None
    for e in entities:
        t = e.dxftype()
        handle = e.dxf.get("handle", None)
        label = f"{t} #{handle}" if handle else t
        reader.entity(e, e.dxf.get("layer", "0") or "0", label, 0)
    defects = list(reader.defects)
    for t, n in sorted(reader.unreadable.items()):
        defects.append(Defect("unreadable", f"{n} {t} entit{'y' if n == 1 else 'ies'} cannot be "
                              "turned into lines and arcs: left out (explode them in the CAD program "
                              "if they belong to the section)", (), WARNING))
    if truncated:
        defects.append(Defect("truncated", "the file is truncated (it ends before the DXF end-of-file "
                              "marker), so part of the drawing may be missing; save it again",
                              (), ERROR))
    version = str(doc.header.get("$ACADVER", "") or getattr(doc, "acad_release", ""))
    return Drawing(name, tuple(reader.pieces), u, version, found,
                   dict(reader.in_blocks), dict(reader.skipped), repairs, tuple(defects))


# --------------------------------------------------------------------------------------------
# step 2: loops, defects and parts


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
    """

    chain: Chain
    points: np.ndarray
    layer: str
    label: str
    depth: int = 0


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

    Parameters
    ----------
    drawing : Drawing
        A drawing from :func:`read_drawing`.
    layers : sequence of str, optional
        Layers to use (names are not case-sensitive). Default: every layer that holds closed
        geometry; open chains on layers without any closed loop are left out.
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
    chaining = chain_by_layer(pieces, tol, chosen)
    open_chains = list(chaining.open_chains)
    left_out: dict[str, int] = {}
    ignored: list[Chain] = []
    used_layers = sorted({pieces[i].layer for i in chosen})
    chain_defects = list(chaining.defects)
    if not layers and chaining.loops:
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
        used_layers = sorted(closed_layers)
        chain_defects = [d for d in chain_defects if d.layer is None or d.layer in closed_layers]
    # what went wrong reading entities counts for the layers used (and for layers that kept
    # no curve at all, where nothing else would show it)
    defects = [d for d in drawing.defects
               if d.layer is None or d.layer in used_layers or d.layer not in drawing.layers]
    defects += chain_defects

    loop_pts = [loop_points(c, pieces, tol)[0] for c in chaining.loops]
    labels = []
    for k, c in enumerate(chaining.loops):
        labels.append(f"loop {k + 1} ({c.labels(pieces, 2)}, layer {c.layer})")
    loop_errs = loop_defects(loop_pts, labels, [c.layer for c in chaining.loops])
    defects += loop_errs
    good = [k for k, p in enumerate(loop_pts) if len(p) >= 3]
    depth_good, parts_good = nest_loops([loop_pts[k] for k in good])
    depth = np.zeros(len(loop_pts), dtype=np.int64)
    depth[good] = depth_good
    parts = [Part(tuple(good[i] for i in p.loops), p.area, p.bounds, p.holes) for p in parts_good]
    loops = tuple(Loop(c, loop_pts[k], c.layer, labels[k], int(depth[k]))
                  for k, c in enumerate(chaining.loops))
    defects += open_chain_defects(open_chains, pieces)
    return Layout(drawing, tol, tuple(used_layers), left_out, tuple(ignored), loops, tuple(open_chains),
                  tuple(parts), tuple(defects))


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
    from scipy.spatial import cKDTree

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
                          f"{fmt_point(a)} and {fmt_point(b)}{gap_text}", (a, b), ERROR, c.layer))
    return out


# --------------------------------------------------------------------------------------------
# step 3: the profile


class DrawingError(ProfileError):
    """A defect of a drawing: the message, the point where it is, then advice on what to do.

    Parameters
    ----------
    message : str
        What is wrong.
    file : str, optional
        The drawing.
    where : tuple of float, optional
        Where it is, profile unit.
    advice : str
        Text after the point, e.g. how to choose a layer.

    Examples
    --------
    >>> str(DrawingError("loop 2 crosses itself", file="a.dxf", where=(1.0, 2.0),
    ...                  advice="; run 'warpwise check a.dxf'"))
    "a.dxf: loop 2 crosses itself at (1, 2); run 'warpwise check a.dxf'"

    """

    def __init__(self, message: str, *, file: str | None = None,
                 where: tuple[float, float] | None = None, advice: str = "") -> None:
        self.advice = advice
        super().__init__(message, file=file, where=where)

    def __str__(self) -> str:
        return super().__str__() + self.advice


@dataclass(frozen=True, eq=False)
class DxfProfile:
    """A profile read from a drawing, with what was decided on the way.

    Attributes
    ----------
    profile : Profile
        The validated profile.
    loop_layers : tuple of str
        Layer of each loop given to :func:`~warpwise.geometry.profile_from_loops`, in order.
    chord_tolerance : float
        Largest distance between a chord and its curve, profile unit.
    join_tolerance : float
        Joining tolerance, profile unit.
    part : int or None
        The part chosen (1-based), None for all.
    """

    profile: Profile
    loop_layers: tuple[str, ...]
    chord_tolerance: float
    join_tolerance: float
    part: int | None = None


def _parts_text(layout: Layout) -> str:
    unit = layout.drawing.units.unit
    items = []
    for k, p in enumerate(layout.parts[:PARTS_IN_MESSAGE]):
        x0, y0, x1, y1 = p.bounds
        holes = f", {p.holes} hole{'s' if p.holes != 1 else ''}" if p.holes else ""
        items.append(f"part {k + 1}: {fmt(x1 - x0)} x {fmt(y1 - y0)} {unit} at {fmt_point((x0, y0))}, "
                     f"area {fmt(p.area)} {unit}2{holes}")
    more = len(layout.parts) - PARTS_IN_MESSAGE
    if more > 0:
        items.append(f"and {more} more")
    return "; ".join(items)


def _layers_text(layout: Layout) -> str:
    counts: Counter[str] = Counter(lp.layer for lp in layout.loops)
    opens: Counter[str] = Counter(c.layer for c in layout.open_chains)
    items = []
    for name in layout.drawing.layers:
        bits = []
        if counts[name]:
            bits.append(f"{counts[name]} loop{'s' if counts[name] != 1 else ''}")
        n_open = opens[name] + layout.left_out.get(name, 0)
        if n_open:
            bits.append(f"{n_open} open chain{'s' if n_open != 1 else ''}")
        used = name in layout.layers or name in layout.left_out
        items.append(f"{name} ({', '.join(bits) or 'no closed geometry'})" if used
                     else f"{name} (not chosen)")
    return ", ".join(items)


def choose_chord_tolerance(loops: Sequence[Loop], pieces: Sequence[Piece], mesh_size: float) -> float:
    """Chord tolerance tied to the mesh size, made finer until the area is right.

    Starts from :data:`CHORD_PER_MESH_SIZE` times the mesh size and shrinks it until the
    chords change the area by at most :data:`CHORD_AREA_BUDGET` (:func:`chord_error`), but not
    below :data:`MIN_CHORD_PER_MESH_SIZE` times the mesh size.

    Parameters
    ----------
    loops : sequence of Loop
        The loops of the profile.
    pieces : sequence of Piece
        The pieces the loops index.
    mesh_size : float
        Mesh size, drawing unit.

    Returns
    -------
    float
        Chord (sagitta) tolerance, drawing unit.

    """
    s = CHORD_PER_MESH_SIZE * mesh_size
    floor = MIN_CHORD_PER_MESH_SIZE * mesh_size
    chains, depths = [lp.chain for lp in loops], [lp.depth for lp in loops]
    for _ in range(40):
        err = chord_error(chains, depths, pieces, s)
        if err <= CHORD_AREA_BUDGET or s <= floor:
            break
        s = max(floor, s * (max(0.05, 0.8 * CHORD_AREA_BUDGET / err) if math.isfinite(err) else 0.1))
    return s


def build_profile(layout: Layout, *, part: int | None = None, all_parts: bool = False,
                  chord_tolerance: float | None = None, mesh_size: float | None = None,
                  layer_materials: bool | Mapping[str, str] = False) -> DxfProfile:
    """The profile of a laid-out drawing.

    Parameters
    ----------
    layout : Layout
        From :func:`lay_out`.
    part : int, optional
        Analyse only this part (1-based, largest area first).
    all_parts : bool
        Analyse every part together as one section.
    chord_tolerance : float, optional
        Largest distance between a chord and its curve, profile unit; default
        :func:`chord_tolerance_for` the profile and ``mesh_size``.
    mesh_size : float, optional
        Mesh size the profile will be analysed with, profile unit (sets the chord tolerance).
    layer_materials : bool or mapping
        True: each loop's layer name becomes its material (even-odd nesting per layer, a
        region inside one of another layer is an insert). A mapping from layer to material
        name does the same with renamed materials. Default False: one material.

    Returns
    -------
    DxfProfile

    Raises
    ------
    ProfileError
        No closed loop, any defect of the chosen geometry (open chain, crossing, branching,
        truncated file), or several parts when neither ``part`` nor ``all_parts`` is given.
    UsageError
        A part number out of range, or both ``part`` and ``all_parts``.

    """
    d = layout.drawing
    name = d.source
    unit = d.units.unit
    if part is not None and all_parts:
        raise UsageError("give either a part number or all parts, not both")
    hint = f"run 'warpwise check {name}' to list and plot them"
    several_layers = len(d.layers) > 1
    layer_hint = (f"; to use only some layers give --layer NAME (layers: {_layers_text(layout)})"
                  if several_layers else "")
    if not layout.loops:
        if layout.errors:
            first = layout.errors[0]
            raise DrawingError(f"no closed loop found; {first.text}", file=name, where=first.point,
                               advice=layer_hint)
        what = "no lines, arcs or curves found" if not d.pieces else "no closed loop found"
        skipped = ", ".join(f"{n} {t}" for t, n in sorted(d.skipped.items()))
        bad = [x for x in d.defects if x.kind in ("unreadable", "not flat")]
        extra = [f"left out, not geometry: {skipped}"] if skipped else []
        if bad:
            extra.append(f"{len(bad)} entit{'y' if len(bad) == 1 else 'ies'} could not be used, "
                         f"the first: {bad[0].text}")
        found = sum(n for t, n in d.entities.items() if t not in d.skipped)
        if d.repairs and found and not d.pieces:
            extra.append(f"ezdxf removed or repaired {len(d.repairs)} broken item(s) while reading, "
                         f"the first: {d.repairs[0]}")
        raise ProfileError(what + (f" ({'; '.join(extra)})" if extra else ""), file=name)
    parts = layout.parts
    if part is not None:
        if not 1 <= part <= len(parts):
            raise UsageError(f"part {part} does not exist: the drawing has {len(parts)} "
                             f"part{'s' if len(parts) != 1 else ''}", file=name)
        chosen = parts[part - 1]
    errors = list(layout.errors)
    if layer_materials:  # loops of two materials may share an edge; their areas are checked later
        errors = [e for e in errors if not (e.kind == "crossing loops" and len(set(e.layers)) > 1)]
    if part is not None and errors:
        from shapely.geometry import Point, Polygon

        outer = Polygon(layout.loops[chosen.loops[0]].points).buffer(layout.tolerance)
        errors = [e for e in errors if not e.where or any(outer.covers(Point(w)) for w in e.where)]
    if errors:
        first = errors[0]
        lead = f"{len(errors)} defects ({hint}); the first: " if len(errors) > 1 else ""
        raise DrawingError(f"{lead}{first.text}", file=name, where=first.point,
                           advice=layer_hint if first.layer else "")
    if part is None and not all_parts and len(parts) > 1:
        raise ProfileError(
            f"the drawing holds {len(parts)} separate parts ({_parts_text(layout)}); analyse one "
            "with --part N, or all as one section with --all-parts", file=name)
    picked = list(chosen.loops) if part is not None else [
        k for p in parts for k in p.loops]
    area = chosen.area if part is not None else sum(p.area for p in parts)
    pieces = d.pieces
    curved = sum(pieces[i].curved_length for k in picked for i, _ in layout.loops[k].chain.steps)
    if chord_tolerance is not None:
        s = float(chord_tolerance)
    elif curved > 0:
        h = mesh_size if mesh_size else default_element_size(area)
        s = choose_chord_tolerance([layout.loops[k] for k in picked], pieces, h)
    else:
        s = layout.tolerance
    if not (s > 0 and math.isfinite(s)):
        s = layout.tolerance
    loops, arcs, layers = [], [], []
    for k in picked:
        pts, loop_arcs = loop_points(layout.loops[k].chain, pieces, s)
        loops.append(pts)
        arcs += loop_arcs
        layers.append(layout.loops[k].layer)
    materials = None
    if layer_materials:
        table = layer_materials if isinstance(layer_materials, Mapping) else {}
        materials = [table.get(name_, name_) for name_ in layers]
    notes = [d.units.note]
    if curved > 0:
        notes.append(f"curves drawn as chords at most {fmt(s)} {unit} from the true curve")
    if part is not None:
        notes.append(f"part {part} of {len(parts)}")
    elif len(parts) > 1:
        notes.append(f"all {len(parts)} parts analysed as one section")
    if d.skipped:
        notes.append("left out (not geometry): " + ", ".join(
            f"{n} {t}" for t, n in sorted(d.skipped.items())))
    if layout.left_out:
        notes.append("left out (no closed geometry): layer " + ", ".join(sorted(layout.left_out)))
    repaired = Counter(x.kind for x in layout.defects if not x.fatal)
    if repaired:
        notes.append("repaired: " + ", ".join(f"{n} {k}" for k, n in sorted(repaired.items()))
                     + f" ({hint})")
    same = 1e-9 * layout.tolerance / JOIN_TOLERANCE  # centres and radii equal to round-off
    profile = profile_from_loops(loops, materials, source=name, units=unit, notes=notes,
                                 arcs=arcs_for_mesh(arcs, same))
    return DxfProfile(profile, tuple(layers), float(s), layout.tolerance, part)


def import_dxf(path: str | Path, units: str | None = None, *, layers: Sequence[str] | None = None,
               part: int | None = None, all_parts: bool = False, chord_tolerance: float | None = None,
               mesh_size: float | None = None,
               layer_materials: bool | Mapping[str, str] = False) -> DxfProfile:
    """Read a DXF drawing into a profile, keeping the layers and tolerances used.

    Parameters are those of :func:`read_dxf`.

    Returns
    -------
    DxfProfile

    """
    layout = lay_out(read_drawing(path, units), layers)
    return build_profile(layout, part=part, all_parts=all_parts, chord_tolerance=chord_tolerance,
                         mesh_size=mesh_size, layer_materials=layer_materials)


def read_dxf(path: str | Path, units: str | None = None, *, layers: Sequence[str] | None = None,
             part: int | None = None, all_parts: bool = False, chord_tolerance: float | None = None,
             mesh_size: float | None = None, layer_materials: bool | Mapping[str, str] = False) -> Profile:
    """Read a DXF drawing into a validated profile.

    Parameters
    ----------
    path : str or Path
        DXF file.
    units : str, optional
        Length unit of the coordinates, overriding ``$INSUNITS`` (default: the header's unit,
        else millimetres with a note).
    layers : sequence of str, optional
        Layers holding the profile (default: every layer with closed geometry).
    part : int, optional
        Analyse only this part (1-based, largest first) of a drawing with several.
    all_parts : bool
        Take all parts together as one section.
    chord_tolerance : float, optional
        Chord (sagitta) tolerance for curves, profile unit; default tied to ``mesh_size``.
    mesh_size : float, optional
        Mesh size the profile is meant for, profile unit.
    layer_materials : bool or mapping
        Make layer names (or their mapped names) the region materials.

    Returns
    -------
    Profile

    Raises
    ------
    InputFileError
        For a file that cannot be read as a DXF drawing.
    ProfileError
        For a drawing that is not one valid section (with what was found and how to choose).
    UsageError
        For an unknown layer or part number.

    """
    return import_dxf(path, units, layers=layers, part=part, all_parts=all_parts,
                      chord_tolerance=chord_tolerance, mesh_size=mesh_size,
                      layer_materials=layer_materials).profile
