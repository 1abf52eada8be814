"""Where the entity readers put what they find: pieces in the profile's unit, and defects.

A :class:`PieceCollector` takes drawing coordinates, converts them to the profile's length
unit and keeps every usable piece (a line, an arc, a polyline of lines and bulge arcs, any
other curve), leaving out with a warning what is not finite or beyond the coordinate limit. It
also counts the entities met inside block references and those left out, and records which
pieces are the boundary paths of each hatch (:class:`HatchBoundary`).
"""

from __future__ import annotations

from collections import Counter
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from ...errors import InputFileError
from ...geometry.loops import MAX_COORDINATE
from ..defects import WARNING, Defect, fmt_point
from ..options import MAX_ENTITIES
from ..pieces import (
    Piece,
    arc_piece,
    bulge_arc,
    ellipse_piece,
    line_piece,
    point_piece,
    polyline_piece,
)
from ..progress import ProgressLine


@dataclass(frozen=True)
class HatchBoundary:
    """The boundary of one HATCH: its paths as pieces of the drawing.

    Attributes
    ----------
    label : str
        Name of the hatch in messages, e.g. ``HATCH #2A``.
    layer : str
        Its layer.
    style : int
        DXF hatch style: 0 fills between every other boundary (even-odd), 1 only the outermost
        area, 2 everything inside the outermost boundaries.
    paths : tuple of tuple of int
        For each boundary path (text boxes left out), the indices of its pieces.
    """

    label: str
    layer: str
    style: int
    paths: tuple[tuple[int, ...], ...]


class PieceCollector:
    """Pieces and defects of one drawing, in the profile's unit.

    Parameters
    ----------
    source : str
        File name, for messages.
    factor : float
        Drawing coordinates times this give lengths in the profile's unit.
    limit : int, optional
        Most pieces kept (default :data:`MAX_ENTITIES`).
    """

    def __init__(self, source: str, factor: float, limit: int | None = None) -> None:
        self.source = source
        self.f = factor
        self.limit = MAX_ENTITIES if limit is None else limit
        self.pieces: list[Piece] = []
        self.defects: list[Defect] = []
        self.in_blocks: Counter[str] = Counter()
        self.skipped: Counter[str] = Counter()
        self.unreadable: Counter[str] = Counter()
        self.hatches: list[HatchBoundary] = []
        self.read = 0  # entities and MINSERT cells read so far
        self.progress: ProgressLine | None = None

    def tick(self) -> None:
        """Count one entity (or MINSERT cell) read, for the progress line."""
        self.read += 1
        if self.progress is not None and not self.read & 1023:
            self.progress.update(self.read)

    def warn(self, kind: str, text: str, where: Sequence[tuple[float, float]] = (),
             layer: str | None = None) -> None:
        """Record a warning: something repaired or left out."""
        self.defects.append(Defect(kind, text, tuple(where), WARNING, layer))

    def tilted(self, label: str, layer: str) -> None:
        """Leave out an entity that does not lie in the x-y plane."""
        self.warn("not flat", f"{label} on layer {layer} does not lie in the x-y plane: left out",
                  layer=layer)

    def add(self, piece: Piece) -> None:
        """Keep a piece (profile unit) unless a coordinate is not finite or beyond the limit."""
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
        if len(self.pieces) >= self.limit:
            raise InputFileError(f"the drawing has more than {self.limit:,} curves, the limit; "
                                 "--max-entities N lifts the limit", file=self.source)
        self.pieces.append(piece)

    def line(self, p: np.ndarray, q: np.ndarray, layer: str, label: str) -> None:
        """A straight line from p to q, drawing coordinates."""
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

    def ellipse(self, c: np.ndarray, u: np.ndarray, v: np.ndarray, t0: float, sweep: float,
                layer: str, label: str, closed: bool = False) -> None:
        """Ellipse arc c + u cos t + v sin t (drawing coordinates) from t0 by a signed sweep (radians)."""
        c, u, v = c * self.f, u * self.f, v * self.f
        size = max(float(np.hypot(*u)), float(np.hypot(*v)))
        if not (np.all(np.isfinite(np.concatenate([c, u, v]))) and size > 0
                and min(float(np.hypot(*u)), float(np.hypot(*v))) > 1e-12 * size):
            self.warn("unreadable", f"{label} on layer {layer} has no valid axes: left out",
                      layer=layer)
            return
        self.add(ellipse_piece(c, u, v, t0, sweep, layer, label, closed))

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
            self.add(point_piece(xy[0], layer, label))
            return
        self.add(polyline_piece(segs, closed, layer, label))
