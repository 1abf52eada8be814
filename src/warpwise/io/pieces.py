"""The curves of a drawing as pieces, and pieces joined end to end as chains.

A :class:`Piece` carries its end points, a sampling function and a label for messages, so the
same code serves any source of loose curves; a :class:`Chain` lists pieces joined end to end.
:func:`line_piece`, :func:`arc_piece`, :func:`ellipse_piece`, :func:`polyline_piece` (with
:func:`bulge_arc`) and :func:`point_piece` make the common pieces.

Examples
--------
>>> half = arc_piece(np.array([0.0, 0.0]), 2.0, 0.0, np.pi)
>>> bool(np.allclose(half.end, (-2.0, 0.0))), half.arcs[0].r, len(half.sample(0.01)) - 1
(True, 2.0, 24)

"""

from __future__ import annotations

import math
from collections.abc import Callable, Sequence
from dataclasses import dataclass

import numpy as np

from ..geometry.curves import Arc, Curve, EllipseArc

#: Largest angle an arc chord may span, radians (at least 48 chords in a full circle), so that
#: an outline keeps its shape where the chord tolerance alone would allow long chords.
MAX_ARC_STEP = math.pi / 24


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
    arcs : tuple of Curve
        Circular and elliptical arcs the piece runs along.
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
    arcs: tuple[Curve, ...] = ()
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
    lo = t0 + min(sweep, 0.0)
    arc = Arc(float(c[0]), float(c[1]), float(r), float(math.fmod(lo, 2 * math.pi)), float(abs(sweep)))

    def at(t: np.ndarray) -> np.ndarray:
        return c + r * np.column_stack([np.cos(t), np.sin(t)])

    return _conic_piece(arc, at, t0, sweep, layer, label, closed)


def ellipse_piece(c: np.ndarray, u: np.ndarray, v: np.ndarray, t0: float, sweep: float,
                  layer: str = "0", label: str = "ELLIPSE", closed: bool = False) -> Piece:
    """An elliptical arc ``c + u cos t + v sin t`` from parameter t0 by a signed sweep, as a piece.

    Parameters
    ----------
    c : numpy.ndarray
        Centre (2,), drawing unit.
    u, v : numpy.ndarray
        Perpendicular semi-axes (2,), drawing unit; v is u turned counter-clockwise (a pair
        turned the other way is taken as the same ellipse run backwards).
    t0 : float
        Parameter of the start point, radians.
    sweep : float
        Signed parameter sweep, radians (positive from u towards v); 2 pi with ``closed`` for
        a whole ellipse.
    layer, label : str
        For messages.
    closed : bool
        A whole ellipse.

    Returns
    -------
    Piece
        Sampled like :func:`arc_piece`, vertices on the ellipse at equal parameter steps,
        with the :class:`~warpwise.geometry.EllipseArc` it runs along.

    Examples
    --------
    >>> e = ellipse_piece(np.zeros(2), np.array([2.0, 0.0]), np.array([0.0, 1.0]), 0.0, np.pi)
    >>> bool(np.allclose(e.end, (-2.0, 0.0))), e.arcs[0].a, e.arcs[0].b, round(e.length, 9)
    (True, 2.0, 1.0, 4.84422411)

    """
    c, u, v = (np.asarray(x, dtype=float) for x in (c, u, v))
    if u[0] * v[1] - u[1] * v[0] < 0:  # clockwise pair: the same points, parameter negated
        v, t0, sweep = -v, -t0, -sweep
    lo = t0 + min(sweep, 0.0)
    curve = EllipseArc(float(c[0]), float(c[1]), float(np.hypot(*u)), float(np.hypot(*v)),
                       float(math.atan2(u[1], u[0])), float(math.fmod(lo, 2 * math.pi)),
                       float(abs(sweep)))

    def at(t: np.ndarray) -> np.ndarray:
        return c + np.cos(t)[:, None] * u + np.sin(t)[:, None] * v

    return _conic_piece(curve, at, t0, sweep, layer, label, closed)


def _conic_piece(curve: Curve, at: Callable[[np.ndarray], np.ndarray], t0: float, sweep: float,
                 layer: str, label: str, closed: bool) -> Piece:
    """A piece along a circle or ellipse ``at(t)``, from parameter t0 by a signed sweep.

    Chords at equal parameter steps: in the curve's scaled frame (the unit circle) a step h
    has the sagitta 1 - cos(h / 2), at most max(a, b) times that in the drawing, and cuts off
    the segment a b (h - sin h) / 2 (an affine image of the circle's).
    """
    reach = max(curve.a, curve.b)
    start = at(np.array([t0]))[0]
    end = start if closed else at(np.array([t0 + sweep]))[0]
    mid = at(np.array([t0 + 0.5 * sweep]))[0]

    def chords(s: float) -> int:
        step = MAX_ARC_STEP if s >= reach else min(MAX_ARC_STEP, 2.0 * math.acos(1.0 - s / reach))
        n = max(1, math.ceil(abs(sweep) / step - 1e-9))
        return 4 * math.ceil(n / 4) if closed else n

    def sample(s: float) -> np.ndarray:
        n = chords(s)
        pts = at(t0 + sweep * np.arange(n if closed else n + 1) / n)
        if not closed:
            pts[0], pts[-1] = start, end
        return pts

    def chord_area(s: float) -> float:
        n = chords(s)
        return math.copysign(0.5 * curve.segment_area_factor * (abs(sweep) - n * math.sin(abs(sweep) / n)),
                             sweep)

    length = float(curve.length(curve.start, curve.start + curve.sweep))
    return Piece(tuple(start), tuple(end), tuple(mid), length, sample, curved_length=length,
                 chord_area=chord_area, arcs=(curve,), closed=closed, layer=layer, label=label)


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
    arcs: list[Curve] = []
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


def point_piece(p: Sequence[float], layer: str, label: str) -> Piece:
    """A curve that shrank to the point p (drawing unit): a piece of zero length."""
    p = tuple(p)
    return Piece(p, p, p, 0.0, lambda s, p=p: np.array([p]), layer=layer, label=label)
