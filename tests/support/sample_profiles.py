"""Write the invented demo profiles of sample_sections/ (reproducible from exact dimensions).

Run: python scripts/make_samples.py [OUT_DIR]   (default: sample_sections/; the tests use these
definitions as the exact reference of every sample file)

All profiles are our own inventions for demonstration. Dimensions are in millimetres, except
the one drawing made in inches. Two kinds of file are written:

- coordinate outlines (``.txt``), the arcs already cut into short straight pieces;
- DXF drawings (``.dxf``, written with ezdxf), each using different entity types on purpose
  (polylines with bulges, old-style polylines, loose LINE/ARC pieces in shuffled order,
  CIRCLE, ELLIPSE, SPLINE, a polyline in a mirrored coordinate system, annotations on other
  layers), so that they exercise the DXF reader.

Every DXF profile is built from exact pieces (straight lines, circular arcs, elliptical arcs,
cubic B-splines). :func:`catalogue` returns, per file, the exact area and centroid of the true
(curved) outline computed from that construction, not from the drawing: polygon formulas for the
chords plus the closed-form circular (or elliptical) segment between each chord and its arc, and
Gauss quadrature of matching order, hence exact, for the polynomial spline pieces. The tests
compare the imported profiles against these values.

After writing, the script reads every DXF back with ezdxf, flattens it finely with ezdxf's own
path tools, rebuilds the loops with shapely and checks the area and centroid against the exact
values, so that a wrong bulge sign or arc direction cannot slip into the files.
"""

from __future__ import annotations

import logging
import math
import random
import sys
from collections.abc import Callable
from dataclasses import dataclass, field
from pathlib import Path

import ezdxf
import numpy as np
from scipy.interpolate import BSpline

ARC_SEGMENTS_PER_TURN = 96

#: Layer holding the profile geometry in every DXF sample.
PROFILE_LAYER = "profile"

#: $INSUNITS codes of the units used here.
INSUNITS = {"in": 1, "mm": 4}


# ----------------------------------------------------------------------------------------------
# coordinate outline samples (text)
# ----------------------------------------------------------------------------------------------

def arc(cx, cy, r, a0, a1, turn=ARC_SEGMENTS_PER_TURN):
    """Points on an arc from angle a0 to a1 (degrees), both ends included."""
    n = max(2, int(np.ceil(abs(a1 - a0) / 360.0 * turn)))
    t = np.radians(np.linspace(a0, a1, n + 1))
    return np.column_stack([cx + r * np.cos(t), cy + r * np.sin(t)])


def rounded_rectangle(w, h, r, cx=0.0, cy=0.0):
    """Counter-clockwise rounded rectangle centred on (cx, cy)."""
    x, y = w / 2 - r, h / 2 - r
    return np.vstack([arc(cx + x, cy - y, r, -90, 0), arc(cx + x, cy + y, r, 0, 90),
                      arc(cx - x, cy + y, r, 90, 180), arc(cx - x, cy - y, r, 180, 270)])


def write(path: Path, title: str, loops, materials=None) -> None:
    lines = [f"# {title}", "# invented demo profile (warpwise sample); dimensions in mm", "units: mm"]
    for k, loop in enumerate(loops):
        lines.append("")
        if materials:
            lines.append(f"material: {materials[k]}")
        lines += [f"{x:.6f}, {y:.6f}" for x, y in loop]
    path.write_text("\n".join(lines) + "\n")


def write_outlines(out: Path) -> None:
    # hollow oval handrail: 42 x 32 outer, 2.5 wall, corner radius 10 outside
    write(out / "handrail_hollow.txt", "hollow handrail 42 x 32 x 2.5",
          [rounded_rectangle(42, 32, 10), rounded_rectangle(37, 27, 7.5)[::-1]])
    # solid key bar 12 x 8 with 0.6 x 45 deg chamfers
    c, b, h = 0.6, 12.0, 8.0
    key = [(c, 0), (b - c, 0), (b, c), (b, h - c), (b - c, h), (c, h), (0, h - c), (0, c)]
    write(out / "key_bar_12x8.txt", "solid key bar 12 x 8, chamfer 0.6", [key])
    # thick channel 80 deep, 40 wide, web 6, flanges 8, root radius 5 (inside corners)
    H, B, tw, tf, r = 80.0, 40.0, 6.0, 8.0, 5.0
    pts = [(0, 0), (B, 0), (B, tf)]
    pts += list(arc(tw + r, tf + r, r, 270, 180))
    pts += list(arc(tw + r, H - tf - r, r, 180, 90))
    pts += [(B, H - tf), (B, H), (0, H)]
    write(out / "channel_thick_80x40.txt", "thick channel 80 x 40 x 6/8, root radius 5", [pts])
    # composite mullion: aluminium box 60 x 120 x 3 (outer radius 4, inner 1) with a steel
    # flat bar 6 x 80 bonded to the inside of one web
    box = rounded_rectangle(60, 120, 4, 30, 60)
    cavity = rounded_rectangle(54, 114, 1, 30, 60)[::-1]
    bar = [(3.0, 20.0), (9.0, 20.0), (9.0, 100.0), (3.0, 100.0)]
    write(out / "mullion_steel_reinforced.txt",
          "aluminium mullion 60 x 120 x 3 with a steel flat bar 6 x 80 bonded inside",
          [box, cavity, bar], ["aluminium-6063-T6", "aluminium-6063-T6", "steel-S355"])


# ----------------------------------------------------------------------------------------------
# exact pieces of an outline
# ----------------------------------------------------------------------------------------------
#
# Every piece knows its end points and the exact integrals, over the area between the piece and
# its chord (signed: positive when the piece lies to the right of the chord direction, so that
# a counter-clockwise loop gains area), of 1, x and y. A loop's integrals are the shoelace
# polygon of its chords plus these extras. For arcs the extra is the circular segment.

def _segment_unit(theta: float) -> tuple[float, float]:
    """Signed area of the segment of a unit circle cut off by a chord of angle theta, and the
    distance of its centroid from the centre (along the bisector of the arc)."""
    a = abs(theta)
    area = 0.5 * (a - math.sin(a))
    dist = 4.0 * math.sin(a / 2) ** 3 / (3.0 * (a - math.sin(a)))
    return math.copysign(area, theta), dist


@dataclass(frozen=True)
class Line:
    p: tuple[float, float]
    q: tuple[float, float]

    @property
    def start(self):
        return self.p

    @property
    def end(self):
        return self.q

    def extra(self):
        return 0.0, 0.0, 0.0

    def reversed(self):
        return Line(self.q, self.p)


@dataclass(frozen=True)
class CircularArc:
    """Arc of a circle: centre c, radius r, start angle a0 and signed sweep (radians, + = CCW)."""

    c: tuple[float, float]
    r: float
    a0: float
    sweep: float

    def point(self, a):
        return (self.c[0] + self.r * math.cos(a), self.c[1] + self.r * math.sin(a))

    @property
    def start(self):
        return self.point(self.a0)

    @property
    def end(self):
        return self.point(self.a0 + self.sweep)

    @property
    def full(self):
        return abs(abs(self.sweep) - 2 * math.pi) < 1e-12

    def extra(self):
        area, dist = _segment_unit(self.sweep)
        mid = self.a0 + self.sweep / 2
        gx = self.c[0] + self.r * dist * math.cos(mid)
        gy = self.c[1] + self.r * dist * math.sin(mid)
        s = area * self.r**2
        return s, s * gx, s * gy

    def reversed(self):
        return CircularArc(self.c, self.r, self.a0 + self.sweep, -self.sweep)


@dataclass(frozen=True)
class EllipticalArc:
    """Arc of an ellipse as in DXF: centre, major axis vector, minor/major ratio, start
    parameter t0 and signed parameter sweep; point(t) = c + cos t * major + sin t * minor."""

    c: tuple[float, float]
    major: tuple[float, float]
    ratio: float
    t0: float
    sweep: float

    @property
    def minor(self):
        return (-self.ratio * self.major[1], self.ratio * self.major[0])

    def point(self, t):
        (mx, my), (nx, ny) = self.major, self.minor
        return (self.c[0] + mx * math.cos(t) + nx * math.sin(t),
                self.c[1] + my * math.cos(t) + ny * math.sin(t))

    @property
    def start(self):
        return self.point(self.t0)

    @property
    def end(self):
        return self.point(self.t0 + self.sweep)

    def extra(self):
        # the ellipse is the affine image of the unit circle: areas scale by the determinant,
        # centroids map with the affine map itself
        (mx, my), (nx, ny) = self.major, self.minor
        det = mx * ny - my * nx
        area, dist = _segment_unit(self.sweep)
        g = self.point(self.t0 + self.sweep / 2)
        gx = self.c[0] + dist * (g[0] - self.c[0])
        gy = self.c[1] + dist * (g[1] - self.c[1])
        s = area * det
        return s, s * gx, s * gy

    def reversed(self):
        return EllipticalArc(self.c, self.major, self.ratio, self.t0 + self.sweep, -self.sweep)


@dataclass(frozen=True)
class SplineCurve:
    """Clamped polynomial B-spline (no weights): degree, knot vector, control points."""

    degree: int
    knots: tuple[float, ...]
    ctrl: tuple[tuple[float, float], ...]

    @property
    def start(self):
        return self.ctrl[0]

    @property
    def end(self):
        return self.ctrl[-1]

    def extra(self):
        # integrals of x dy - y dx (times 1/2, x/3, y/3) along the curve, by Gauss quadrature:
        # on each knot span the integrands are polynomials of degree <= 3p - 1, which an
        # n-point rule with 2n - 1 >= 3p - 1 integrates exactly
        curve = BSpline(np.array(self.knots, float), np.array(self.ctrl, float), self.degree)
        deriv = curve.derivative()
        xg, wg = np.polynomial.legendre.leggauss(2 * self.degree + 2)
        spans = np.unique(self.knots[self.degree:len(self.knots) - self.degree])
        area = mx = my = 0.0
        for u0, u1 in zip(spans[:-1], spans[1:], strict=True):
            u = 0.5 * (u1 - u0) * xg + 0.5 * (u1 + u0)
            w = 0.5 * (u1 - u0) * wg
            (x, y), (dx, dy) = curve(u).T, deriv(u).T
            cross = x * dy - y * dx
            area += 0.5 * np.dot(w, cross)
            mx += np.dot(w, x * cross) / 3.0
            my += np.dot(w, y * cross) / 3.0
        chord = _chord(self.start, self.end)
        return area - chord[0], mx - chord[1], my - chord[2]

    def reversed(self):
        t0, t1 = self.knots[0], self.knots[-1]
        return SplineCurve(self.degree, tuple(t0 + t1 - k for k in self.knots[::-1]), self.ctrl[::-1])


def _chord(p, q):
    """Integrals of 1, x, y contributed by the straight edge p -> q (shoelace and centroid)."""
    cross = p[0] * q[1] - q[0] * p[1]
    return 0.5 * cross, cross * (p[0] + q[0]) / 6.0, cross * (p[1] + q[1]) / 6.0


def loop_integrals(loop) -> tuple[float, float, float]:
    """Signed integrals of 1, x and y over the area a closed chain of pieces encloses."""
    total = np.zeros(3)
    for k, piece in enumerate(loop):
        nxt = loop[(k + 1) % len(loop)]
        gap = math.dist(piece.end, nxt.start)
        if gap > 1e-9:
            raise ValueError(f"pieces {k} and {k + 1} of a loop do not meet (gap {gap:.3g})")
        total += _chord(piece.start, piece.end)
        total += piece.extra()
    return tuple(total)


def reverse(loop):
    return [piece.reversed() for piece in loop[::-1]]


def bulge_loop(vertices):
    """Pieces of a closed polyline given as (x, y, bulge) vertices (bulge as in DXF)."""
    pieces = []
    for k, (x, y, b) in enumerate(vertices):
        q = vertices[(k + 1) % len(vertices)][:2]
        if b == 0:
            pieces.append(Line((x, y), q))
            continue
        theta = 4.0 * math.atan(b)
        dx, dy = q[0] - x, q[1] - y
        chord = math.hypot(dx, dy)
        off = 0.5 / math.tan(theta / 2)   # centre offset to the left of the chord, per chord length
        cx, cy = 0.5 * (x + q[0]) - off * dy, 0.5 * (y + q[1]) + off * dx
        r = chord / (2.0 * abs(math.sin(theta / 2)))
        pieces.append(CircularArc((cx, cy), r, math.atan2(y - cy, x - cx), theta))
    return pieces


def bulge_vertices(loop):
    """(x, y, bulge) vertices of a loop made of lines and circular arcs."""
    out = []
    for piece in loop:
        if isinstance(piece, Line):
            out.append((*piece.start, 0.0))
        elif isinstance(piece, CircularArc):
            out.append((*piece.start, math.tan(piece.sweep / 4)))
        else:
            raise TypeError(f"a polyline cannot hold a {type(piece).__name__}")
    return out


def thick_path(points, t, r_inside):
    """Closed outline of a constant-thickness strip (cold-formed sheet) along a polyline.

    ``points`` is the sharp mid-thickness polyline; every corner is bent with inside radius
    ``r_inside``; the ends are cut square. Returns the loop and the mid-line length.
    """
    P = np.array(points, float)
    d = np.diff(P, axis=0)
    d /= np.linalg.norm(d, axis=1)[:, None]
    n = np.column_stack([-d[:, 1], d[:, 0]])            # left normals of the straight runs
    rm = r_inside + t / 2
    corners = []                                         # (tangent in, tangent out, centre, turn)
    for i in range(1, len(P) - 1):
        turn = math.atan2(d[i - 1, 0] * d[i, 1] - d[i - 1, 1] * d[i, 0], float(d[i - 1] @ d[i]))
        tan_len = rm * math.tan(abs(turn) / 2)
        t_in, t_out = P[i] - d[i - 1] * tan_len, P[i] + d[i] * tan_len
        corners.append((t_in, t_out, t_in + n[i - 1] * rm * math.copysign(1, turn), turn))
    length = sum(float(np.linalg.norm(c[0] - (corners[k - 1][1] if k else P[0])))
                 for k, c in enumerate(corners)) + float(np.linalg.norm(P[-1] - corners[-1][1]))
    length += sum(rm * abs(c[3]) for c in corners)

    def side(off):
        pieces, here = [], P[0] + n[0] * off
        for i, (t_in, t_out, centre, turn) in enumerate(corners):
            a = t_in + n[i] * off
            pieces.append(Line(tuple(here), tuple(a)))
            r = rm - off * math.copysign(1, turn)
            a0 = math.atan2(a[1] - centre[1], a[0] - centre[0])
            pieces.append(CircularArc(tuple(centre), r, a0, turn))
            here = t_out + n[i + 1] * off
        pieces.append(Line(tuple(here), tuple(P[-1] + n[-1] * off)))
        return pieces

    left, right = side(t / 2), side(-t / 2)
    loop = left + [Line(left[-1].end, right[-1].end)] + reverse(right) + [Line(right[0].start,
                                                                              left[0].start)]
    return loop, length


def rotated(loop, angle_deg, about=(0.0, 0.0), shift=(0.0, 0.0)):
    """The loop rotated counter-clockwise about a point, then shifted."""
    c, s = math.cos(math.radians(angle_deg)), math.sin(math.radians(angle_deg))

    def tr(p):
        x, y = p[0] - about[0], p[1] - about[1]
        return (c * x - s * y + about[0] + shift[0], s * x + c * y + about[1] + shift[1])

    def vec(v):
        return (c * v[0] - s * v[1], s * v[0] + c * v[1])

    out = []
    for piece in loop:
        if isinstance(piece, Line):
            out.append(Line(tr(piece.p), tr(piece.q)))
        elif isinstance(piece, CircularArc):
            out.append(CircularArc(tr(piece.c), piece.r, piece.a0 + math.radians(angle_deg),
                                   piece.sweep))
        elif isinstance(piece, EllipticalArc):
            out.append(EllipticalArc(tr(piece.c), vec(piece.major), piece.ratio, piece.t0, piece.sweep))
        else:
            out.append(SplineCurve(piece.degree, piece.knots, tuple(tr(p) for p in piece.ctrl)))
    return out


def circle(cx, cy, r):
    return [CircularArc((cx, cy), r, 0.0, 2 * math.pi)]


# ----------------------------------------------------------------------------------------------
# writing pieces as DXF entities
# ----------------------------------------------------------------------------------------------

def _deg(a):
    return math.degrees(a) % 360.0


def add_lwpolyline(msp, loop, *, layer=PROFILE_LAYER, closed=True, mirrored=False):
    """Write a loop of lines and arcs as one LWPOLYLINE with bulges.

    ``closed=False`` repeats the first vertex at the end instead of setting the closed flag.
    ``mirrored=True`` writes it in the object coordinate system of extrusion (0, 0, -1), as CAD
    programs do after a mirror: OCS x = -WCS x, and every bulge changes sign.
    """
    pts = bulge_vertices(loop)
    if mirrored:
        pts = [(-x, y, -b) for x, y, b in pts]
    if not closed:
        pts.append((*pts[0][:2], 0.0))
    attribs = {"layer": layer}
    if mirrored:
        attribs["extrusion"] = (0.0, 0.0, -1.0)
    return msp.add_lwpolyline(pts, format="xyb", close=closed, dxfattribs=attribs)


def add_polyline2d(msp, loop, *, layer=PROFILE_LAYER):
    """Write a loop of lines and arcs as one old-style 2D POLYLINE (VERTEX entities) with bulges."""
    return msp.add_polyline2d(bulge_vertices(loop), format="xyb", close=True,
                              dxfattribs={"layer": layer})


def entity_specs(loop, *, layer=PROFILE_LAYER):
    """One (kind, arguments) per piece, for writing the pieces as separate entities."""
    specs = []
    for piece in loop:
        if isinstance(piece, Line):
            specs.append(("LINE", piece.p, piece.q))
        elif isinstance(piece, CircularArc):
            if piece.full:
                specs.append(("CIRCLE", piece.c, piece.r))
            else:   # ARC always runs counter-clockwise from start to end angle
                a0, a1 = sorted((piece.a0, piece.a0 + piece.sweep))
                specs.append(("ARC", piece.c, piece.r, _deg(a0), _deg(a1)))
        elif isinstance(piece, EllipticalArc):
            t0, t1 = sorted((piece.t0, piece.t0 + piece.sweep))
            specs.append(("ELLIPSE", piece.c, piece.major, piece.ratio, t0, t1))
        else:
            specs.append(("SPLINE", piece.degree, piece.knots, piece.ctrl))
    return [(layer, spec) for spec in specs]


def add_entities(msp, specs, *, seed=None, flip=False):
    """Write entity specs; with a seed, in shuffled order, and (flip) half the lines reversed."""
    specs = list(specs)
    rng = random.Random(seed)
    if seed is not None:
        rng.shuffle(specs)
    for layer, spec in specs:
        kind, args, attribs = spec[0], spec[1:], {"layer": layer}
        if kind == "LINE":
            p, q = args
            if flip and rng.random() < 0.5:
                p, q = q, p
            msp.add_line(p, q, dxfattribs=attribs)
        elif kind == "ARC":
            c, r, a0, a1 = args
            msp.add_arc(c, r, a0, a1, dxfattribs=attribs)
        elif kind == "CIRCLE":
            c, r = args
            msp.add_circle(c, r, dxfattribs=attribs)
        elif kind == "ELLIPSE":
            c, major, ratio, t0, t1 = args
            msp.add_ellipse((*c, 0.0), (*major, 0.0), ratio, t0, t1, dxfattribs=attribs)
        elif kind == "SPLINE":
            degree, knots, ctrl = args
            msp.add_open_spline(ctrl, degree=degree, knots=knots, dxfattribs=attribs)


# ----------------------------------------------------------------------------------------------
# the catalogue
# ----------------------------------------------------------------------------------------------

@dataclass
class Sample:
    """One DXF sample: its exact loops and how it is drawn."""

    name: str                                  # file name
    title: str
    entities: tuple[str, ...]                  # entity types of the profile geometry
    solids: list                               # outer loops (lists of pieces)
    holes: list                                # hole loops
    draw: Callable                             # draw(msp) writes the entities
    units: str = "mm"
    dxfversion: str = "R2010"
    other_layers: tuple[str, ...] = ()         # layers holding annotations only
    setup: bool = False                        # load ezdxf's standard styles (dimension styles)
    notes: list[str] = field(default_factory=list)
    sheet: bool = False                        # a drawing sheet: frame, views, hatch on other layers

    def exact(self):
        """Exact area and centroid (x, y) of the true outline, drawing unit."""
        total = np.zeros(3)
        for loops, sign in ((self.solids, 1.0), (self.holes, -1.0)):
            for loop in loops:
                a, mx, my = loop_integrals(loop)
                total += sign * math.copysign(1.0, a) * np.array([a, mx, my])
        area, mx, my = total
        return float(area), (float(mx / area), float(my / area))


def mullion():
    """Tube mullion 50 x 80 x 2.5 with two screw bosses and a glazing leg (LWPOLYLINE bulges)."""
    W, H, t, R = 50.0, 80.0, 2.5, 4.0
    q = math.tan(math.pi / 8)                  # bulge of a quarter circle
    outer = bulge_loop([
        (R, 0, 0), (W - R, 0, q), (W, R, 0), (W, 70, 0), (68.5, 70, 1.0), (68.5, 73, 0),
        (W, 73, 0), (W, H - R, q), (W - R, H, 0), (R, H, q), (0, H - R, 0), (0, R, q)])
    # screw bosses: radius 4 round a 4.2 hole, centre 4.5 from the inner wall, on a neck 6 wide
    rb, xc, half_neck = 4.0, 25.0, 3.0
    yb, yt = t + 4.5, H - t - 4.5
    drop = math.sqrt(rb**2 - half_neck**2)
    # clockwise round the boss from one side of the neck to the other: 180 deg + twice the
    # angle of the joints below the boss centre (a sweep over 180 deg, so |bulge| > 1)
    over = math.tan(-(math.pi + 2 * math.atan2(drop, half_neck)) / 4)
    ri = R - t
    cavity = bulge_loop([
        (R, t, 0), (xc - half_neck, t, 0), (xc - half_neck, yb - drop, over),
        (xc + half_neck, yb - drop, 0), (xc + half_neck, t, 0), (W - R, t, q), (W - t, R, 0),
        (W - t, H - R, q), (W - R, H - t, 0), (xc + half_neck, H - t, 0),
        (xc + half_neck, yt + drop, over), (xc - half_neck, yt + drop, 0), (xc - half_neck, H - t, 0),
        (R, H - t, q), (t, H - R, 0), (t, R, q)])
    for piece in cavity:       # the bulged arcs must be the boss circles themselves
        if isinstance(piece, CircularArc) and piece.r > ri + 1e-9:
            assert abs(piece.r - rb) < 1e-12 and abs(piece.c[0] - xc) < 1e-12, piece
            assert min(abs(piece.c[1] - yb), abs(piece.c[1] - yt)) < 1e-12, piece
    holes = [bulge_loop([(xc - 2.1, y, 1.0), (xc + 2.1, y, 1.0)]) for y in (yb, yt)]

    def draw(msp):
        for loop in (outer, cavity, *holes):
            add_lwpolyline(msp, loop)

    return Sample("mullion_screw_bosses.dxf",
                  "tube mullion 50 x 80 x 2.5 with two screw bosses and a glazing leg",
                  ("LWPOLYLINE",), [outer], [cavity, *holes], draw,
                  notes=["closed LWPOLYLINEs with bulges: quarter, half and 263-degree arcs",
                         "screw holes drawn as two half-circle bulges"])


def heat_sink():
    """Stepped heat sink, 7 fins (loose LINE and ARC entities, shuffled, half reversed, DXF R12)."""
    B, tb, rc = 60.0, 6.0, 2.0                 # base width, base thickness, bottom corner radius
    tf, rtip, rroot = 2.0, 1.0, 1.5            # fin thickness, tip radius, root fillet radius
    xs = [4.5 + 8.5 * k for k in range(7)]
    hs = [18.0 + 2.0 * k for k in range(7)]   # fin heights above the base
    hp = math.pi / 2
    loop = [Line((rc, 0), (B - rc, 0)), CircularArc((B - rc, rc), rc, -hp, hp),
            Line((B, rc), (B, tb))]
    here = (B, tb)
    for x, h in zip(xs[::-1], hs[::-1], strict=True):
        loop.append(Line(here, (x + tf / 2 + rroot, tb)))
        loop.append(CircularArc((x + tf / 2 + rroot, tb + rroot), rroot, -hp, -hp))
        loop.append(Line((x + tf / 2, tb + rroot), (x + tf / 2, tb + h - rtip)))
        loop.append(CircularArc((x, tb + h - rtip), rtip, 0.0, math.pi))
        loop.append(Line((x - tf / 2, tb + h - rtip), (x - tf / 2, tb + rroot)))
        loop.append(CircularArc((x - tf / 2 - rroot, tb + rroot), rroot, 0.0, -hp))
        here = (x - tf / 2 - rroot, tb)
    loop += [Line(here, (0, tb)), Line((0, tb), (0, rc)), CircularArc((rc, rc), rc, math.pi, hp)]

    def draw(msp):
        add_entities(msp, entity_specs(loop), seed=7, flip=True)

    return Sample("heat_sink_stepped_fins.dxf", "stepped heat sink 60 wide, 7 fins 2 thick, 18 to 30 high",
                  ("LINE", "ARC"), [loop], [], draw, dxfversion="R12",
                  notes=["DXF R12 (no $INSUNITS: millimetres by default)",
                         "entities in shuffled order, about half the lines drawn end to start"])


def hollow_shaft_with_keyway():
    """Hollow shaft 40 with a 12 x 5 keyway (CIRCLE bore, ARC rim, LINE/ARC keyway)."""
    R, b, depth, rk, rbore = 20.0, 12.0, 5.0, 0.6, 8.0
    y_side = math.sqrt(R**2 - (b / 2) ** 2)
    yk = R - depth
    a_right = math.atan2(y_side, b / 2)
    hp = math.pi / 2
    rim = CircularArc((0.0, 0.0), R, math.pi - a_right, 2 * math.pi - (math.pi - 2 * a_right))
    outer = [rim,
             Line((b / 2, y_side), (b / 2, yk + rk)),
             CircularArc((b / 2 - rk, yk + rk), rk, 0.0, -hp),
             Line((b / 2 - rk, yk), (-b / 2 + rk, yk)),
             CircularArc((-b / 2 + rk, yk + rk), rk, -hp, -hp),
             Line((-b / 2, yk + rk), (-b / 2, y_side))]
    bore = circle(0.0, 0.0, rbore)

    def draw(msp):
        add_entities(msp, entity_specs(outer) + entity_specs(bore))

    return Sample("shaft_keyed_hollow_40.dxf", "hollow shaft 40 / 16 with keyway 12 x 5, corner radius 0.6",
                  ("ARC", "LINE", "CIRCLE"), [outer], [bore], draw,
                  notes=["rim ARC sweeps 325 degrees through the zero angle"])


def handrail():
    """The hollow handrail of handrail_hollow.txt, exact arcs (old-style POLYLINE with bulges)."""
    q = math.tan(math.pi / 8)

    def rounded(w, h, r):
        x, y = w / 2, h / 2
        return bulge_loop([(x - r, -y, q), (x, -y + r, 0), (x, y - r, q), (x - r, y, 0),
                           (-x + r, y, q), (-x, y - r, 0), (-x, -y + r, q), (-x + r, -y, 0)])

    outer, inner = rounded(42.0, 32.0, 10.0), rounded(37.0, 27.0, 7.5)

    def draw(msp):
        add_polyline2d(msp, outer)
        add_polyline2d(msp, reverse(inner))

    return Sample("handrail_hollow.dxf", "hollow handrail 42 x 32 x 2.5 (true arcs)",
                  ("POLYLINE",), [outer], [inner], draw,
                  notes=["2D POLYLINE with VERTEX entities; the hole drawn clockwise"])


def purlin():
    """Cold-formed lipped channel 150 x 62/55 x 18 x 2, inside bend radius 3."""
    D, B1, B2, L, t, ri = 150.0, 62.0, 55.0, 18.0, 2.0, 3.0
    h = t / 2
    mid = [(B2 - h, L), (B2 - h, h), (h, h), (h, D - h), (B1 - h, D - h), (B1 - h, D - L)]
    loop, length = thick_path(mid, t, ri)
    area, _ = Sample("", "", (), [loop], [], None).exact()
    assert abs(area - t * length) < 1e-9 * area, "strip area must be thickness times mid-line length"

    def draw(msp):
        add_lwpolyline(msp, loop, closed=False)

    return Sample("purlin_lipped_150.dxf",
                  "cold-formed lipped channel 150 x 62/55 x 18 x 2, inside radius 3",
                  ("LWPOLYLINE",), [loop], [], draw,
                  notes=["LWPOLYLINE not flagged closed: its last vertex repeats the first",
                         "area = thickness x mid-line length"])


def solar_rail():
    """Mounting rail with a top T-slot, a closed chamber and a foot (one mirrored-OCS polyline)."""
    outer = bulge_loop([
        (-12, 0, 0), (40, 0, 0), (40, 45, 0), (27, 45, 0), (27, 41, 0), (35, 41, 0), (35, 34, 0),
        (5, 34, 0), (5, 41, 0), (13, 41, 0), (13, 45, 0), (0, 45, 0), (0, 3, 0), (-12, 3, 1.0)])
    q = math.tan(math.pi / 8)
    r = 2.0
    chamber = bulge_loop([(3 + r, 3, 0), (37 - r, 3, q), (37, 3 + r, 0), (37, 31 - r, q),
                          (37 - r, 31, 0), (3 + r, 31, q), (3, 31 - r, 0), (3, 3 + r, q)])

    def draw(msp):
        add_lwpolyline(msp, outer)
        add_lwpolyline(msp, chamber, mirrored=True)

    return Sample("rail_t_slot_40x45.dxf", "mounting rail 40 x 45 with top T-slot, chamber and foot",
                  ("LWPOLYLINE",), [outer], [chamber], draw,
                  notes=["the chamber LWPOLYLINE has extrusion (0, 0, -1): OCS x = -WCS x, bulges"
                         " reversed, as left by a mirror command"])


def thick_angle():
    """Unequal angle 60 x 40 x 8, root radius 7, toe radius 3.5, far from the origin, annotated."""
    H, B, t, r1, r2 = 60.0, 40.0, 8.0, 7.0, 3.5
    ox, oy = 2500.0, 1200.0
    hp = math.pi / 2

    def p(x, y):
        return (ox + x, oy + y)

    loop = [Line(p(0, 0), p(B, 0)), Line(p(B, 0), p(B, t - r2)),
            CircularArc(p(B - r2, t - r2), r2, 0.0, hp),
            Line(p(B - r2, t), p(t + r1, t)),
            CircularArc(p(t + r1, t + r1), r1, -hp, -hp),
            Line(p(t, t + r1), p(t, H - r2)),
            CircularArc(p(t - r2, H - r2), r2, 0.0, hp),
            Line(p(t - r2, H), p(0, H)), Line(p(0, H), p(0, 0))]

    def draw(msp):
        add_entities(msp, entity_specs(loop))
        doc = msp.doc
        doc.layers.add("dimensions", color=3)
        doc.layers.add("notes", color=2)
        dims = {"layer": "dimensions"}
        msp.add_linear_dim(base=p(-12, 0), p1=p(0, 0), p2=p(0, H), angle=90, dxfattribs=dims).render()
        msp.add_linear_dim(base=p(0, -12), p1=p(0, 0), p2=p(B, 0), dxfattribs=dims).render()
        msp.add_linear_dim(base=p(0, H + 8), p1=p(0, H), p2=p(t, H), dxfattribs=dims).render()
        msp.add_radius_dim(center=p(t + r1, t + r1), radius=r1, angle=225, dxfattribs=dims).render()
        msp.add_text("unequal angle 60 x 40 x 8", height=3.5,
                     dxfattribs={"layer": "notes", "insert": p(20, 50)})
        mtext = msp.add_mtext("invented sample profile\\Pdimensions in mm\\Proot radius 7, toe radius 3.5",
                              dxfattribs={"layer": "notes", "char_height": 2.5})
        mtext.set_location(p(20, 44))

    return Sample("angle_thick_60x40x8.dxf", "unequal angle 60 x 40 x 8, root radius 7, toe radius 3.5",
                  ("LINE", "ARC"), [loop], [], draw, other_layers=("dimensions", "notes"), setup=True,
                  notes=["drawn at (2500, 1200); DIMENSION, TEXT and MTEXT on layers "
                         "'dimensions' and 'notes'"])


def box_inches():
    """Three-cell box 4 x 2 in, wall 0.125, webs 0.09 (drawing in inches, $INSUNITS = 1)."""
    W, H, t, R, rc = 4.0, 2.0, 0.125, 0.1875, 0.0625
    q = math.tan(math.pi / 8)

    def rounded(x0, y0, x1, y1, r):
        return bulge_loop([(x0 + r, y0, 0), (x1 - r, y0, q), (x1, y0 + r, 0), (x1, y1 - r, q),
                           (x1 - r, y1, 0), (x0 + r, y1, q), (x0, y1 - r, 0), (x0, y0 + r, q)])

    outer = rounded(0.0, 0.0, W, H, R)
    cells = [rounded(x0, t, x1, H - t, rc) for x0, x1 in ((0.125, 1.625), (1.715, 2.915), (3.005, 3.875))]

    def draw(msp):
        for loop in (outer, *cells):
            add_lwpolyline(msp, loop)

    return Sample("box_three_cell_4x2in.dxf", "three-cell box 4 x 2 in, wall 0.125 in, webs 0.09 in",
                  ("LWPOLYLINE",), [outer], cells, draw, units="in",
                  notes=["$INSUNITS = 1 (inches); cells 1.5, 1.2 and 0.87 in wide"])


def strut_spline():
    """Streamlined strut 80 long, cambered, edges drawn as cubic SPLINEs, bolt hole CIRCLE."""
    knots = (0.0, 0.0, 0.0, 0.0, 1.0, 2.0, 3.0, 3.0, 3.0, 3.0)
    lower = SplineCurve(3, knots, ((0.0, 0.0), (0.0, -6.0), (10.0, -10.0), (35.0, -9.0), (60.0, -5.0),
                                   (80.0, -1.0)))
    upper = SplineCurve(3, (0.0, 0.0, 0.0, 0.0, 1.0, 1.5, 3.0, 3.0, 3.0, 3.0),
                        ((80.0, 1.0), (60.0, 9.0), (30.0, 14.0), (8.0, 13.0), (0.0, 7.0), (0.0, 0.0)))
    outer = [lower, Line((80.0, -1.0), (80.0, 1.0)), upper]
    hole = circle(22.0, 1.0, 3.0)

    def draw(msp):
        specs = entity_specs(outer) + entity_specs(hole)
        add_entities(msp, [specs[0], specs[2], specs[1], specs[3]])

    return Sample("strut_spline_80.dxf", "streamlined strut 80 x 23, spline edges, bolt hole 6",
                  ("SPLINE", "LINE", "CIRCLE"), [outer], [hole], draw,
                  notes=["two clamped cubic B-splines by control points (no fit points),"
                         " one with uneven knots; blunt tail 2 mm"])


def grip_ellipse():
    """Oval grip, elliptical outside, D-shaped bore (ELLIPSE, half ELLIPSE + LINE), turned 15 deg."""
    outer = [EllipticalArc((0.0, 0.0), (24.0, 0.0), 14.0 / 24.0, 0.0, 2 * math.pi)]
    bore = [EllipticalArc((0.0, -2.0), (18.0, 0.0), 8.0 / 18.0, 0.0, math.pi),
            Line((-18.0, -2.0), (18.0, -2.0))]
    outer, bore = (rotated(loop, 15.0, shift=(30.0, 20.0)) for loop in (outer, bore))

    def draw(msp):
        add_entities(msp, entity_specs(outer) + entity_specs(bore))

    return Sample("grip_oval_ellipse.dxf", "oval grip 48 x 28 with D-shaped bore, axis at 15 degrees",
                  ("ELLIPSE", "LINE"), [outer], [bore], draw,
                  notes=["full ELLIPSE outside; bore = half ELLIPSE (parameters 0 to pi) + LINE"])


def rail_sheet():
    """Hollow rail 60 x 40 x 5 on a whole A4 drawing sheet, as it leaves CAD.

    The sheet edge and frame, a title block of rectangles sharing edges (with text), the cut
    section hatched, a side view, hidden and centre lines, dimensions: warpwise must leave the
    frame out and take the hatched section (common practice, no source: a cut section is
    hatched, ISO 128).
    """
    x0, y0, w, h, r, t = 40.0, 90.0, 60.0, 40.0, 5.0, 5.0
    q = math.tan(math.pi / 8)
    outer = bulge_loop([(x0 + r, y0, 0), (x0 + w - r, y0, q), (x0 + w, y0 + r, 0),
                        (x0 + w, y0 + h - r, q), (x0 + w - r, y0 + h, 0), (x0 + r, y0 + h, q),
                        (x0, y0 + h - r, 0), (x0, y0 + r, q)])
    cavity = bulge_loop([(x0 + t, y0 + t, 0), (x0 + w - t, y0 + t, 0), (x0 + w - t, y0 + h - t, 0),
                         (x0 + t, y0 + h - t, 0)])

    def box(msp, x_0, y_0, x_1, y_1, layer):
        msp.add_lwpolyline([(x_0, y_0), (x_1, y_0), (x_1, y_1), (x_0, y_1)], close=True,
                           dxfattribs={"layer": layer})

    def draw(msp):
        doc = msp.doc
        for name, colour in (("frame", 7), ("hatch", 8), ("views", 7), ("hidden", 6), ("centre", 1),
                             ("dimensions", 3), ("notes", 2)):
            doc.layers.add(name, color=colour)
        box(msp, 0, 0, 297, 210, "frame")                 # the trimmed A4 sheet
        box(msp, 20, 10, 287, 200, "frame")               # the drawing frame
        for cell in ((187, 10, 287, 46), (187, 10, 237, 28), (237, 10, 287, 28), (187, 28, 287, 46)):
            box(msp, *cell, "frame")                      # the title block's cells
        for k, text in enumerate(("HOLLOW RAIL HR-60 (invented sample)", "scale 1:1",
                                  "dimensions in mm", "sheet 1 of 1")):
            msp.add_text(text, height=3, dxfattribs={"layer": "notes"}).set_placement((190, 13 + 9 * k))
        for loop in (outer, cavity):
            add_lwpolyline(msp, loop)
        hatch = msp.add_hatch(dxfattribs={"layer": "hatch"})
        hatch.set_pattern_fill("ANSI31", scale=0.5)
        for loop in (outer, cavity):
            hatch.paths.add_polyline_path(bulge_vertices(loop), is_closed=True)
        box(msp, 140, 90, 240, 130, "views")             # the side view, 100 long
        for y in (y0 + t, y0 + h - t):
            msp.add_line((140, y), (240, y), dxfattribs={"layer": "hidden"})
        cx, cy = x0 + w / 2, y0 + h / 2
        for a, b in (((cx - 36, cy), (cx + 36, cy)), ((cx, cy - 26), (cx, cy + 26)),
                     ((134, cy), (246, cy))):
            msp.add_line(a, b, dxfattribs={"layer": "centre"})
        dims = {"layer": "dimensions"}
        msp.add_linear_dim(base=(0, y0 - 10), p1=(x0, y0), p2=(x0 + w, y0), dxfattribs=dims).render()
        msp.add_linear_dim(base=(x0 - 10, 0), p1=(x0, y0), p2=(x0, y0 + h), angle=90,
                           dxfattribs=dims).render()
        msp.add_linear_dim(base=(0, 140), p1=(140, 130), p2=(240, 130), dxfattribs=dims).render()
        msp.add_text("A-A", height=5, dxfattribs={"layer": "notes"}).set_placement((60, 140))

    return Sample("rail_drawing_sheet_a4.dxf",
                  "hollow rail 60 x 40 x 5 on an A4 drawing sheet with frame, title block and side view",
                  ("LWPOLYLINE",), [outer], [cavity], draw,
                  other_layers=("frame", "hatch", "views", "hidden", "centre", "dimensions", "notes"),
                  setup=True, sheet=True,
                  notes=["a whole sheet: frame and title block (layer frame), the section hatched"
                         " (layer hatch), a side view 100 x 40 (layer views), hidden and centre"
                         " lines, dimensions and text"])


SAMPLES = (mullion, heat_sink, hollow_shaft_with_keyway, handrail, purlin, solar_rail, thick_angle,
           box_inches, strut_spline, grip_ellipse, rail_sheet)


def samples() -> list[Sample]:
    """All DXF samples, built from their exact construction."""
    return [make() for make in SAMPLES]


def catalogue() -> dict[str, dict]:
    """Exact properties of every DXF sample, by file name.

    Returns
    -------
    dict
        ``{file name: {"title", "units", "entities", "other_layers", "sheet", "A", "centroid",
        "regions", "holes", "notes"}}``; ``A`` and ``centroid`` are exact for the true curved
        outline, in the drawing's unit.
    """
    out = {}
    for s in samples():
        area, centroid = s.exact()
        out[s.name] = {"title": s.title, "units": s.units, "entities": s.entities,
                       "other_layers": s.other_layers, "sheet": s.sheet, "A": area, "centroid": centroid,
                       "regions": len(s.solids), "holes": len(s.holes), "notes": tuple(s.notes)}
    return out


def write_dxf(sample: Sample, out: Path) -> Path:
    """Write one sample drawing (the same bytes on every run: fixed time stamps and ids)."""
    fixed = ezdxf.options.write_fixed_meta_data_for_testing
    ezdxf.options.write_fixed_meta_data_for_testing = True
    try:
        return _write_dxf(sample, out)
    finally:
        ezdxf.options.write_fixed_meta_data_for_testing = fixed


def _write_dxf(sample: Sample, out: Path) -> Path:
    quiet = logging.getLogger("ezdxf")
    level = quiet.level
    quiet.setLevel(logging.ERROR)      # for R12, ezdxf.new() warns that $INSUNITS has no place
    try:
        doc = ezdxf.new(sample.dxfversion, setup=sample.setup)
    finally:
        quiet.setLevel(level)
    doc.layers.add(PROFILE_LAYER, color=7)
    if sample.dxfversion != "R12":
        doc.header["$INSUNITS"] = INSUNITS[sample.units]
        doc.header["$MEASUREMENT"] = 0 if sample.units == "in" else 1
        doc.header.custom_vars.append("title", sample.title)
        doc.header.custom_vars.append("source", "invented warpwise sample (scripts/make_samples.py)")
    sample.draw(doc.modelspace())
    if sample.dxfversion != "R12":
        # ezdxf adds the CLASS records of the entity types in use in set order, which changes
        # with Python's string hashing: add them now and sort them, so every run writes the
        # same bytes
        doc.classes.add_required_classes(doc.dxfversion)
        doc.classes.classes = dict(sorted(doc.classes.classes.items()))
    path = out / sample.name
    doc.saveas(path)
    return path


# ----------------------------------------------------------------------------------------------
# independent check of the written files (ezdxf flattening + shapely)
# ----------------------------------------------------------------------------------------------

def chain(pieces: list[np.ndarray], tol: float) -> list[np.ndarray]:
    """Join open polylines end to end (reversing where needed) into closed loops."""
    loops, free = [], [p for p in pieces]
    while free:
        loop = [free.pop(0)]
        while math.dist(loop[-1][-1], loop[0][0]) > tol:
            end = loop[-1][-1]
            for k, p in enumerate(free):
                if math.dist(p[0], end) <= tol:
                    loop.append(free.pop(k))
                    break
                if math.dist(p[-1], end) <= tol:
                    loop.append(free.pop(k)[::-1])
                    break
            else:
                raise ValueError(f"open chain ending at {tuple(end)}")
        loops.append(np.vstack([p[:-1] for p in loop]))
    return loops


def flattened_properties(path: Path, layer: str = PROFILE_LAYER, distance: float = 1e-7):
    """Area and centroid of a written DXF from ezdxf's own fine flattening of its entities.

    The entities on ``layer`` (polylines exploded into lines and arcs) are flattened with chord
    error ``distance`` (drawing unit), chained end to end into loops and combined even-odd.
    """
    from shapely import Point, Polygon

    # entity.flattening() follows true arcs (ezdxf's path tools would first turn arcs into
    # cubic Bezier curves, which are off by up to 2.7e-4 of the radius)
    doc = ezdxf.readfile(path)
    simple = []
    for e in doc.modelspace().query(f'*[layer=="{layer}"]'):
        simple += list(e.virtual_entities()) if e.dxftype() in ("LWPOLYLINE", "POLYLINE") else [e]
    pieces = []
    for e in simple:
        if e.dxftype() == "LINE":
            pieces.append(np.array([[e.dxf.start.x, e.dxf.start.y], [e.dxf.end.x, e.dxf.end.y]]))
        else:
            pieces.append(np.array([(v.x, v.y) for v in e.flattening(distance)]))
    ends = np.vstack(pieces)
    size = float(np.ptp(ends, axis=0).max())
    rings = [Polygon(loop) for loop in chain(pieces, 1e-9 * size)]
    area = mx = my = 0.0
    for i, ring in enumerate(rings):
        if not ring.is_valid:
            raise ValueError(f"{path.name}: loop {i + 1} crosses itself")
        probe = Point(ring.exterior.coords[0])
        depth = sum(1 for j, other in enumerate(rings) if j != i and other.contains(probe))
        sign = -1.0 if depth % 2 else 1.0
        c = ring.centroid
        area += sign * ring.area
        mx += sign * ring.area * c.x
        my += sign * ring.area * c.y
    return area, (mx / area, my / area), len(rings)


def check(out: Path) -> None:
    """Compare each written DXF's fine flattening with the exact values; raise on a mismatch."""
    for s in samples():
        area, (xc, yc) = s.exact()
        fa, (fx, fy), nloops = flattened_properties(out / s.name)
        size = math.sqrt(area)
        rel = abs(fa - area) / area
        shift = math.hypot(fx - xc, fy - yc) / size
        ok = rel < 1e-6 and shift < 1e-6 and nloops == len(s.solids) + len(s.holes)
        print(f"{'ok ' if ok else 'BAD'} {s.name:32s} A = {area:.10g} {s.units}2  "
              f"centroid = ({xc:.6f}, {yc:.6f})  flattened: dA/A = {rel:.1e}, "
              f"d(centroid)/sqrt(A) = {shift:.1e}, loops = {nloops}")
        if not ok:
            raise SystemExit(f"{s.name}: the written drawing does not match its construction")


def main(out: Path, verify: bool = True) -> None:
    out.mkdir(parents=True, exist_ok=True)
    write_outlines(out)
    for s in samples():
        write_dxf(s, out)
    if verify:
        check(out)


if __name__ == "__main__":
    main(Path(sys.argv[1]) if len(sys.argv) > 1 else Path(__file__).resolve().parents[2] / "sample_sections")
