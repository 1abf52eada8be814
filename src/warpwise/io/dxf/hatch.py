"""HATCH boundaries: the outline of a cut section, drawn as a hatch.

In a technical drawing a cut section is hatched (common practice, no source; ISO 128
conventions), and some drawings hold a section only as a hatch. :func:`read_hatch` reads each
boundary path of a HATCH as the entities it stands for, with the readers of
:mod:`.entities`, so that bulges, arcs, ellipses and splines are read in one place: a polyline
path as a closed LWPOLYLINE with its bulges (exact arcs), an edge path's edges as LINE, ARC,
ELLIPSE and SPLINE, all in the hatch's plane (its OCS and elevation). Paths around text (text
boxes, kept free of hatching) are left out. The pieces of each path are recorded in a
:class:`~.collect.HatchBoundary`.

:func:`hatch_loops` joins the pieces of each path into loops at the layout's joining
tolerance, keeping the paths the hatch style fills between; a hatch with a path that does not
close is left out with a warning, whole (a hatch without one of its holes would be another
section).
"""

from __future__ import annotations

from collections.abc import Iterator, Sequence
from dataclasses import dataclass, replace

import numpy as np
from shapely.geometry import Polygon

from ...geometry.loops import even_odd_nesting
from ..chains import chain_pieces
from ..chords import loop_points
from ..defects import WARNING, Defect, fmt_point
from ..pieces import Chain, Piece
from .collect import HatchBoundary, PieceCollector
from .document import why

#: Boundary path flag of a text box (DXF group code 92, bit 8).
TEXT_BOX = 8
#: Hatch style -> deepest even-odd nesting level of its own paths that bounds the filled area
#: (0 normal: every level; 1 outer: the outermost area; 2 ignore: inside the outermost paths).
STYLE_DEPTH = {0: None, 1: 1, 2: 0}


def _edge_entities(path: object, ocs: object, elev: float, ex: tuple) -> Iterator[object]:
    """The entities an edge path's edges stand for (ezdxf virtual entities, WCS where DXF has it)."""
    from ezdxf.entities import Arc, Ellipse, Line, Spline
    from ezdxf.entities.boundary_paths import EdgeType

    def wcs(p: Sequence[float], z: float = elev) -> tuple:
        return tuple(ocs.to_wcs((float(p[0]), float(p[1]), z)))

    for edge in path.edges:
        if edge.type == EdgeType.LINE:
            yield Line.new(dxfattribs={"start": wcs(edge.start), "end": wcs(edge.end)})
        elif edge.type == EdgeType.ARC:  # angles counter-clockwise in the OCS, as ARC has them
            yield Arc.new(dxfattribs={"center": (*edge.center, elev), "radius": edge.radius,
                                      "start_angle": edge.start_angle, "end_angle": edge.end_angle,
                                      "extrusion": ex})
        elif edge.type == EdgeType.ELLIPSE:
            yield Ellipse.new(dxfattribs={"center": wcs(edge.center), "major_axis": wcs(edge.major_axis, 0.0),
                                          "ratio": edge.ratio, "start_param": edge.start_param,
                                          "end_param": edge.end_param, "extrusion": ex})
        else:
            s = Spline.new(dxfattribs={"degree": int(edge.degree)})
            if edge.control_points:
                s.control_points = [wcs(p) for p in edge.control_points]
                s.knots = list(edge.knot_values)
                if edge.weights:
                    s.weights = list(edge.weights)
            else:
                s.fit_points = [wcs(p) for p in edge.fit_points]
                if edge.start_tangent is not None and edge.end_tangent is not None:
                    s.dxf.start_tangent = ocs.to_wcs((*edge.start_tangent, 0.0))
                    s.dxf.end_tangent = ocs.to_wcs((*edge.end_tangent, 0.0))
            yield s


def _path_entities(path: object, ocs: object, elev: float, ex: tuple) -> Iterator[tuple[object, str]]:
    """The entities one boundary path stands for, each with its name after the path's."""
    from ezdxf.entities import LWPolyline
    from ezdxf.entities.boundary_paths import PolylinePath

    if isinstance(path, PolylinePath):
        e = LWPolyline.new(dxfattribs={"elevation": elev, "extrusion": ex})
        verts = [(float(x), float(y), float(b)) for x, y, b in path.vertices]
        if verts and not path.is_closed:  # the boundary still closes, straight
            verts[-1] = (*verts[-1][:2], 0.0)
        e.set_points(verts, format="xyb")
        e.closed = True
        yield e, ""
    else:
        for j, v in enumerate(_edge_entities(path, ocs, elev, ex), start=1):
            yield v, f" edge {j} ({v.dxftype()})"


def read_hatch(out: PieceCollector, e: object, layer: str, label: str, depth: int = 0) -> None:
    """HATCH: each boundary path (text boxes left out) as the curves it is made of.

    Parameters
    ----------
    out : PieceCollector
        Takes the pieces and the :class:`~.collect.HatchBoundary` naming them.
    e : ezdxf HATCH entity
        The hatch.
    layer, label : str
        Its layer and its name in messages.
    depth : int
        How many block references it is met in (0 in model space).

    """
    from ezdxf.math import OCS

    from .entities import _ocs, read_entity

    if _ocs(e) is None:
        return out.tilted(label, layer)
    ex = tuple(e.dxf.get("extrusion", (0.0, 0.0, 1.0)))
    elev = float(tuple(e.dxf.get("elevation", (0.0, 0.0, 0.0)))[2])
    ocs = OCS(ex)
    paths = []
    for k, path in enumerate(e.paths, start=1):
        if int(path.path_type_flags) & TEXT_BOX:
            continue
        first = len(out.pieces)
        name = f"{label} boundary {k}"
        try:
            for v, suffix in _path_entities(path, ocs, elev, ex):
                read_entity(out, v, layer, name + suffix, depth)
        except Exception as exc:  # a damaged path: its curves are incomplete
            out.warn("unreadable", f"{name} on layer {layer} cannot be read ({why(exc)})", layer=layer)
        paths.append(tuple(range(first, len(out.pieces))))
    out.hatches.append(HatchBoundary(label, layer, int(e.dxf.get("hatch_style", 0) or 0), tuple(paths)))


@dataclass(frozen=True, eq=False)
class HatchLoop:
    """A closed boundary of a hatch, at the joining tolerance.

    Attributes
    ----------
    chain : Chain
        Its pieces (indices into the drawing's pieces).
    points : numpy.ndarray
        Polygon (n, 2), profile unit.
    hatch : str
        The hatch's name in messages.
    layer : str
        The hatch's layer.
    path : int
        Number of the boundary path (1-based).
    hole : bool
        True for a hole of the hatched area (odd even-odd depth among the hatch's own loops).
    """

    chain: Chain
    points: np.ndarray
    hatch: str
    layer: str
    path: int
    hole: bool = False

    @property
    def label(self) -> str:
        """Name in messages, e.g. ``boundary 1 of HATCH #2A``."""
        return f"boundary {self.path} of {self.hatch}"


def _path_loops(h: HatchBoundary, pieces: Sequence[Piece], tol: float) -> tuple[
        list[HatchLoop], Defect | None]:
    """The loops of a hatch's paths, or the warning that leaves the hatch out."""
    loops: list[HatchLoop] = []
    for k, idx in enumerate(h.paths, start=1):
        res = chain_pieces(pieces, tol, idx)
        errors = [d for d in res.defects if d.fatal]
        if res.open_chains or errors or not res.loops:
            if res.open_chains:
                a, b = res.open_chains[0].ends(pieces)
                why_ = f"does not close: it has free ends at {fmt_point(a)} and {fmt_point(b)}"
            elif errors:
                why_ = f"does not close: {errors[0].message}"
            else:
                why_ = "holds no curve that could be read"
            text = f"boundary {k} of {h.label} on layer {h.layer} {why_}: the hatch is left out"
            return [], Defect("unreadable", text, (), WARNING, h.layer)
        loops += [HatchLoop(c, loop_points(c, pieces, tol)[0], h.label, h.layer, k) for c in res.loops]
    return loops, None


def hatch_loops(hatches: Sequence[HatchBoundary], pieces: Sequence[Piece], tol: float) -> tuple[
        list[HatchLoop], list[Defect]]:
    """The boundaries of every hatch as closed loops, those its style fills between.

    Parameters
    ----------
    hatches : sequence of HatchBoundary
        The hatches of a drawing.
    pieces : sequence of Piece
        The drawing's pieces.
    tol : float
        Joining tolerance, profile unit.

    Returns
    -------
    loops : list of HatchLoop
        Loops of the hatches that close (those enclosing an area); for style 1 the paths of
        the outermost area, for style 2 the outermost paths only.
    defects : list of Defect
        One warning per hatch left out because a path does not close.

    """
    out: list[HatchLoop] = []
    defects: list[Defect] = []
    for h in hatches:
        loops, defect = _path_loops(h, pieces, tol)
        if defect is not None:
            defects.append(defect)
            continue
        deepest = STYLE_DEPTH.get(h.style)
        rings = [lp for lp in loops if len(lp.points) >= 3]
        depth, _ = even_odd_nesting([Polygon(lp.points) for lp in rings])
        out += [replace(lp, hole=bool(d % 2)) for lp, d in zip(rings, depth, strict=True)
                if deepest is None or d <= deepest]
    return out, defects
