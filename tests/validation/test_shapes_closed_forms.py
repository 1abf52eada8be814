"""Area properties of the parametric shapes against exact closed forms, fillets included.

Each shape's exact area properties (the true curved outline, not its polygon) are built here
from primitives whose integrals are exact (common practice, no source; any calculus text):
rectangles, annular circular sectors, fillet spandrels (a square minus a quarter disc) and
polygons (Green's theorem). The composition of hot-rolled sections, e.g.
A = 2 b tf + (h - 2 tf) tw + (4 - pi) r^2 for an I-beam, follows the steel design
handbooks, exact geometry; cold-formed sections are straight pieces plus quarter annuli
(bend of inside radius r, outside r + t, concentric).

The shapes' outlines are polygons with chord sagittas up to 1e-4 of the profile size, with the
arcs recorded, so the mesh puts boundary nodes on the true circles and its edges there are
quadratic curves through three points of the circle. What is left of the difference is the
quadratic's departure from the circle, a sliver of area about r^2 a^5 / 30 per edge of
half-angle a (the sagitta rule makes its total about (total sweep) s^2 / 15, s the sagitta,
whatever the radii), plus the quadrature of curved elements (the degree-4 rule is not exact on
them; measured negligible). The tests bound each error by that sliver, computed exactly for
every chord of the profile (chord_deficits), instead of by a fixed tolerance: the bound is
reached (ratio 1.0000 on the area) where the mesher keeps the polygon's chords as element
edges. Measured relative errors at the default mesh: 1.4e-7 at most (Z-shape), see TARGET.
The straight polygon itself is off by up to 3e-4 relative (the chords' sagitta): the tests
also check that the mesh is far closer to the curved closed form than the polygon is.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
import pytest

from warpwise.fem.p2 import element_values
from warpwise.geometry.profile import Arc, profile_from_loops
from warpwise.geometry.shapes import (
    angle,
    channel,
    channel_with_lips,
    circle,
    hexagon,
    hollow_rectangle,
    i_beam,
    rectangle,
    shaft_with_keyway,
    tee,
    tube,
    z_shape,
)
from warpwise.mesh.core import build_mesh
from warpwise.properties.geometric import geometric_properties

PI = math.pi


# --------------------------------------------------------------------------- exact primitives


@dataclass(frozen=True)
class Moments:
    """Integrals over a region about the drawing origin: 1, x, y, y^2, x^2, x y (dA)."""

    A: float
    Sx: float
    Sy: float
    Ixx: float
    Iyy: float
    Ixy: float

    def __add__(self, o: Moments) -> Moments:
        return Moments(*(a + b for a, b in zip(self.astuple(), o.astuple(), strict=True)))

    def __sub__(self, o: Moments) -> Moments:
        return Moments(*(a - b for a, b in zip(self.astuple(), o.astuple(), strict=True)))

    def astuple(self) -> tuple[float, ...]:
        return (self.A, self.Sx, self.Sy, self.Ixx, self.Iyy, self.Ixy)

    def centroidal(self) -> dict[str, float]:
        """A, centroid and second moments about centroidal axes (parallel-axis theorem)."""
        cx, cy = self.Sx / self.A, self.Sy / self.A
        return {"A": self.A, "cx": cx, "cy": cy, "Ix": self.Ixx - self.A * cy * cy,
                "Iy": self.Iyy - self.A * cx * cx, "Ixy": self.Ixy - self.A * cx * cy}


def total(*parts: Moments) -> Moments:
    out = parts[0]
    for p in parts[1:]:
        out = out + p
    return out


def rect(x0: float, x1: float, y0: float, y1: float) -> Moments:
    # rectangle [x0, x1] x [y0, y1]: the integrals of 1, x, y, y^2, x^2, x y factor into x and y
    w, h = x1 - x0, y1 - y0
    return Moments(w * h, h * (x1**2 - x0**2) / 2, w * (y1**2 - y0**2) / 2,
                   w * (y1**3 - y0**3) / 3, h * (x1**3 - x0**3) / 3,
                   (x1**2 - x0**2) * (y1**2 - y0**2) / 4)


def sector(cx: float, cy: float, r0: float, r1: float, t0: float, t1: float) -> Moments:
    # annular sector r0 <= rho <= r1, t0 <= theta <= t1 about (cx, cy), in polar coordinates:
    # int rho^(n+1) drho = (r1^(n+2) - r0^(n+2)) / (n + 2), then the angular integrals of
    # cos, sin, cos^2 = (1 + cos 2t)/2, sin^2 = (1 - cos 2t)/2 and sin cos = sin(2t)/2
    k1, k2, k3 = (r1**2 - r0**2) / 2, (r1**3 - r0**3) / 3, (r1**4 - r0**4) / 4
    dt = t1 - t0
    A = k1 * dt
    su = k2 * (math.sin(t1) - math.sin(t0))  # int u dA, u = rho cos(theta)
    sv = k2 * (math.cos(t0) - math.cos(t1))  # int v dA, v = rho sin(theta)
    s2 = (math.sin(2 * t1) - math.sin(2 * t0)) / 4
    uu, vv = k3 * (dt / 2 + s2), k3 * (dt / 2 - s2)
    uv = k3 * (math.sin(t1) ** 2 - math.sin(t0) ** 2) / 2
    return Moments(A, cx * A + su, cy * A + sv, cy * cy * A + 2 * cy * sv + vv,
                   cx * cx * A + 2 * cx * su + uu, cx * cy * A + cx * sv + cy * su + uv)


def spandrel(x: float, y: float, r: float, sx: int, sy: int) -> Moments:
    # fillet between two perpendicular faces meeting at the corner (x, y), lying in the
    # quadrant (sx, sy) from it: the r x r square minus the quarter disc centred at
    # (x + sx r, y + sy r) that faces the corner (area (1 - pi/4) r^2)
    square = rect(*sorted((x, x + sx * r)), *sorted((y, y + sy * r)))
    mid = math.atan2(-sy, -sx)
    return square - sector(x + sx * r, y + sy * r, 0.0, r, mid - PI / 4, mid + PI / 4)


def polygon_moments(pts: np.ndarray) -> Moments:
    # Green's theorem over a counter-clockwise polygon (exact for straight edges)
    x0, y0 = pts[:, 0], pts[:, 1]
    x1, y1 = np.roll(x0, -1), np.roll(y0, -1)
    c = x0 * y1 - x1 * y0
    return Moments(float(c.sum() / 2), float((c * (x0 + x1)).sum() / 6),
                   float((c * (y0 + y1)).sum() / 6),
                   float((c * (y0 * y0 + y0 * y1 + y1 * y1)).sum() / 12),
                   float((c * (x0 * x0 + x0 * x1 + x1 * x1)).sum() / 12),
                   float((c * (x0 * y1 + 2 * x0 * y0 + 2 * x1 * y1 + x1 * y0)).sum() / 24))


# --------------------------------------------------------------------------- exact shapes


def exact_i_beam(h, b, tw, tf, r):
    # steel design handbooks, exact geometry: two flanges, the web between them, four root
    # fillets (spandrels) in the corners between web and flanges
    v = h / 2 - tf
    parts = [rect(-b / 2, b / 2, v, h / 2), rect(-b / 2, b / 2, -h / 2, -v),
             rect(-tw / 2, tw / 2, -v, v)]
    parts += [spandrel(sx * tw / 2, sy * v, r, sx, -sy) for sx in (1, -1) for sy in (1, -1)]
    return total(*parts)


def exact_channel(h, b, tw, tf, r):
    # steel design handbooks, exact geometry; back of the web on x = 0
    v = h / 2 - tf
    return total(rect(0, b, v, h / 2), rect(0, b, -h / 2, -v), rect(0, tw, -v, v),
                 spandrel(tw, v, r, 1, -1), spandrel(tw, -v, r, 1, 1))


def exact_angle(h, b, t, r, r_toe):
    # steel design handbooks, exact geometry: two legs, the root fillet, less the two
    # spandrels the toe radii take off the leg ends; heel at the origin
    return total(rect(0, b, 0, t), rect(0, t, t, h), spandrel(t, t, r, 1, 1)) - total(
        spandrel(b, t, r_toe, -1, -1), spandrel(t, h, r_toe, -1, -1))


def exact_tee(h, b, tw, tf, r):
    # steel design handbooks, exact geometry; foot of the stem on y = 0
    v = h - tf
    return total(rect(-b / 2, b / 2, v, h), rect(-tw / 2, tw / 2, 0, v),
                 spandrel(tw / 2, v, r, 1, -1), spandrel(-tw / 2, v, r, -1, -1))


def rounded_rectangle(x, y, r):
    # rectangle [-x, x] x [-y, y] less the four corner spandrels outside the corner arcs
    return rect(-x, x, -y, y) - total(
        *[spandrel(sx * x, sy * y, r, -sx, -sy) for sx in (1, -1) for sy in (1, -1)])


def exact_hollow_rectangle(h, b, t, ro, ri):
    # steel design handbooks, exact geometry: outer rounded rectangle less the inner one
    return rounded_rectangle(b / 2, h / 2, ro) - rounded_rectangle(b / 2 - t, h / 2 - t, ri)


def exact_z_shape(h, b, t, r):
    # cold-formed Z-shape: flat pieces and two 90 degree bends (quarter annuli r .. r + t about
    # centres concentric with both faces); centre of the web at the origin. Plain (r = 0):
    # three rectangles with sharp corners
    u, y, f = t / 2, h / 2, b - t / 2
    if r == 0:
        return total(rect(-f, u, -y, -y + t), rect(-u, u, -y + t, y - t), rect(-u, f, y - t, y))
    o = r + t
    return total(rect(-f, -u - r, -y, -y + t), rect(-u, u, -y + o, y - o), rect(u + r, f, y - t, y),
                 sector(-u - r, -y + o, r, o, -PI / 2, 0.0),
                 sector(u + r, y - o, r, o, PI / 2, PI))


def exact_channel_with_lips(h, b, c, t, r):
    # cold-formed channel with lips: web, two flanges, two lips and four 90 degree bends
    # (quarter annuli r .. r + t); back of the web on x = 0, mid-depth on y = 0
    o, y = r + t, h / 2
    half = total(rect(o, b - o, -y, -y + t), rect(b - t, b, -y + o, -y + c),
                 sector(o, -y + o, r, o, PI, 1.5 * PI), sector(b - o, -y + o, r, o, 1.5 * PI, 2 * PI))
    top = total(rect(o, b - o, y - t, y), rect(b - t, b, y - c, y - o),
                sector(o, y - o, r, o, PI / 2, PI), sector(b - o, y - o, r, o, 0.0, PI / 2))
    return total(half, top, rect(0, t, -y + o, y - o))


def exact_shaft_with_keyway(d, w, k):
    # the disc less the keyway: the rectangle below the chord at the keyway's edges and the
    # circular segment above it (a sector less the triangle on the centre)
    R = d / 2
    yc = math.sqrt(R * R - w * w / 4)
    th0 = math.atan2(yc, w / 2)
    segment = sector(0, 0, 0, R, th0, PI - th0) - polygon_moments(
        np.array([[0.0, 0.0], [w / 2, yc], [-w / 2, yc]]))
    return sector(0, 0, 0, R, 0, 2 * PI) - rect(-w / 2, w / 2, R - k, yc) - segment


def exact_hexagon(s):
    # regular hexagon across flats s (common practice): A = sqrt(3)/2 s^2,
    # Ix = Iy = 5 sqrt(3) s^4 / 144, centred on the origin
    A, inertia = math.sqrt(3) / 2 * s**2, 5 * math.sqrt(3) * s**4 / 144
    return Moments(A, 0.0, 0.0, inertia, inertia, 0.0)


# (id, profile factory, exact moments). Dimensions are invented, of ordinary proportions.
CASES = [
    ("rectangle", lambda: rectangle(40.0, 20.0), lambda: rect(-20, 20, -10, 10)),
    ("circle", lambda: circle(30.0), lambda: sector(0, 0, 0, 15.0, 0, 2 * PI)),
    ("tube", lambda: tube(60.0, 50.0), lambda: sector(0, 0, 25.0, 30.0, 0, 2 * PI)),
    ("hollow_rectangle_cold", lambda: hollow_rectangle(100.0, 50.0, 4.0, 8.0),
     lambda: exact_hollow_rectangle(100, 50, 4, 8, 4)),
    ("hollow_rectangle_hot", lambda: hollow_rectangle(120.0, 80.0, 6.0, 9.0, 6.0),
     lambda: exact_hollow_rectangle(120, 80, 6, 9, 6)),
    ("i_beam", lambda: i_beam(200.0, 100.0, 5.6, 8.5, 12.0),
     lambda: exact_i_beam(200, 100, 5.6, 8.5, 12)),
    ("i_beam_wide", lambda: i_beam(160.0, 160.0, 8.0, 13.0, 15.0),
     lambda: exact_i_beam(160, 160, 8, 13, 15)),
    ("channel", lambda: channel(160.0, 65.0, 7.5, 10.5, 10.5),
     lambda: exact_channel(160, 65, 7.5, 10.5, 10.5)),
    ("angle", lambda: angle(80.0, 60.0, 8.0, 8.0, 4.0), lambda: exact_angle(80, 60, 8, 8, 4)),
    ("equal_angle", lambda: angle(50.0, 50.0, 5.0, 7.0, 3.5), lambda: exact_angle(50, 50, 5, 7, 3.5)),
    ("tee", lambda: tee(100.0, 100.0, 11.0, 11.0, 11.0), lambda: exact_tee(100, 100, 11, 11, 11)),
    ("z_shape", lambda: z_shape(200.0, 75.0, 2.0, 3.0), lambda: exact_z_shape(200, 75, 2, 3)),
    ("z_shape_plain", lambda: z_shape(150.0, 60.0, 5.0), lambda: exact_z_shape(150, 60, 5, 0)),
    ("channel_with_lips", lambda: channel_with_lips(150.0, 60.0, 18.0, 2.0, 3.0),
     lambda: exact_channel_with_lips(150, 60, 18, 2, 3)),
    ("hexagon", lambda: hexagon(24.0), lambda: exact_hexagon(24)),
    ("shaft_with_keyway", lambda: shaft_with_keyway(40.0, 12.0, 5.0),
     lambda: exact_shaft_with_keyway(40, 12, 5)),
]

#: Round-off allowance, relative to A, the profile size and Ix + Iy (measured on the polygon-only
#: shapes, rectangle, hexagon and plain Z-shape: at most 2e-15).
ROUND_OFF = 1e-13

#: Accuracy asked of the shapes at the default mesh, relative. Measured errors: at most 1.4e-7
#: (Z-shape: many bends in a thin section), 5e-8 for the hot-rolled shapes, 8e-10 for circles.
TARGET = 1e-6


def fe_geometric(profile):
    mesh = build_mesh(profile)
    x0, y0, x1, y1 = profile.bounds
    origin = np.array([0.5 * (x0 + x1), 0.5 * (y0 + y1)])
    geo, _ = geometric_properties(mesh, element_values(mesh, origin), origin)
    return geo


def polygon_of(profile):
    # the profile's straight polygon, exactly (Green's theorem over every loop)
    parts = [polygon_moments(loop) for reg in profile.regions for loop in reg.loops()]
    return total(*parts).centroidal()


def chord_deficits(profile, centre):
    """Bounds on what curved P2 edges can miss of the true arcs: (area, centroid, moments).

    Each chord of an arc's polygon spans 2a at the centre. The mesh edges along it (one, or
    several if the mesher splits the chord) are quadratics through three points of the circle;
    for one edge the area between arc and quadratic is exactly
    r^2 (a - sin(a) (1 + (1 - cos a) / 3)) (the sector r^2 a less the curved-edge area, see
    test_circle in test_geometric_closed_forms; about r^2 a^5 / 30), and splitting only
    makes it smaller. The sliver lies within rho = |midpoint of the arc - centre| + half the
    chord of the centre, so it moves the centroid by at most delta rho / A and any second moment
    by at most delta rho^2.
    """
    pts = np.vstack([loop for reg in profile.regions for loop in reg.loops()])
    dA = dS = dI = 0.0
    for arc in profile.arcs:
        d = pts - np.array([arc.cx, arc.cy])
        ang = np.arctan2(d[:, 1], d[:, 0])
        on = (np.abs(np.hypot(d[:, 0], d[:, 1]) - arc.r) < 1e-9 * arc.r) & arc.contains_angle(ang)
        rel = np.sort(np.mod(ang[on] - arc.start + 1e-9, 2 * PI) - 1e-9)
        if arc.sweep >= 2 * PI - 1e-9:
            rel = np.append(rel, rel[0] + 2 * PI)
        a = np.diff(rel) / 2
        mid = arc.start + rel[:-1] + a
        delta = arc.r**2 * (a - np.sin(a) * (1 + (1 - np.cos(a)) / 3))
        rho = np.hypot(arc.cx + arc.r * np.cos(mid) - centre[0],
                       arc.cy + arc.r * np.sin(mid) - centre[1]) + arc.r * np.sin(a)
        dA += float(delta.sum())
        dS += float((delta * rho).sum())
        dI += float((delta * rho**2).sum())
    return dA, dS, dI


@pytest.mark.parametrize("name, make, exact", CASES, ids=[c[0] for c in CASES])
def test_area_properties_match_curved_closed_forms(name, make, exact):
    profile = make()
    ex = exact().centroidal()
    geo = fe_geometric(profile)
    size, scale = profile.size, ex["Ix"] + ex["Iy"]
    dA, dS, dI = chord_deficits(profile, (ex["cx"], ex["cy"]))
    # measured: |A error| / dA = 1.0000 where the mesher keeps the polygon's chords (I, H,
    # channel, tee, circle), 0.01-0.5 where it splits them or convex and concave arcs
    # cancel; centroid errors at most 0.8, moment errors at most 0.98 of their bounds (I-beam)
    assert abs(geo.A - ex["A"]) <= 1.001 * dA + ROUND_OFF * ex["A"]
    assert abs(geo.centroid[0] - ex["cx"]) <= 1.001 * dS / ex["A"] + ROUND_OFF * size
    assert abs(geo.centroid[1] - ex["cy"]) <= 1.001 * dS / ex["A"] + ROUND_OFF * size
    for key in ("Ix", "Iy", "Ixy"):
        assert abs(getattr(geo, key) - ex[key]) <= 1.001 * dI + ROUND_OFF * scale, key
    # and the bounds themselves are within the target
    assert dA <= TARGET * ex["A"] and dI <= TARGET * scale
    if profile.arcs:
        # the straight polygon is far off the curved outline: following the arcs matters
        # (measured: at least 99 times the bound on A, equal angle, where convex toes and the
        # concave root nearly cancel; at least 510 times on Ix or Iy, channel with lips)
        poly = polygon_of(profile)
        assert abs(poly["A"] - ex["A"]) > 50 * dA
        assert max(abs(poly[k] - ex[k]) for k in ("Ix", "Iy")) > 100 * dI


@pytest.mark.parametrize("r", [1.0, 12.0])
def test_spandrel_closed_forms(r):
    # a root fillet (square r x r less the quarter disc on its far corner), steel design
    # handbooks, exact geometry, derived: A = (1 - pi/4) r^2; centroid (10 - 3 pi) r / (3 (4 - pi))
    # = 0.2234 r from each face, i.e. 2 r / (3 (4 - pi)) from the arc's centre along each axis;
    # second moment about a face r^4 (1 - 5 pi / 16) and product moment about the two faces
    # r^4 (19/24 - pi/4)
    m = spandrel(0.0, 0.0, r, 1, 1)
    c = m.centroidal()
    assert m.A == pytest.approx((1 - PI / 4) * r**2, rel=1e-14)
    e = (10 - 3 * PI) * r / (3 * (4 - PI))
    assert c["cx"] == pytest.approx(e, rel=1e-13) and c["cy"] == pytest.approx(e, rel=1e-13)
    assert r - e == pytest.approx(2 * r / (3 * (4 - PI)), rel=1e-13)
    assert m.Ixx == pytest.approx(r**4 * (1 - 5 * PI / 16), rel=1e-13)
    assert m.Iyy == pytest.approx(r**4 * (1 - 5 * PI / 16), rel=1e-13)
    assert m.Ixy == pytest.approx(r**4 * (19 / 24 - PI / 4), rel=1e-12)


@pytest.mark.parametrize("r", [1.0, 12.0])
def test_recorded_concave_arc_is_followed(r):
    # a fillet in the corner of two walls of thickness s: the square [-s, r]^2 less the quarter
    # disc about (r, r) (exact: rectangle less sector). Its concave arc runs clockwise along the
    # counter-clockwise outline and is recorded counter-clockwise, from 180 to 270 degrees.
    s, n = 3.0, 24
    t = np.linspace(0.0, PI / 2, n + 1)
    arc_pts = np.column_stack([r - r * np.sin(t), r - r * np.cos(t)])  # (r, 0) -> (0, r)
    loop = np.vstack([[[-s, -s], [r, -s]], arc_pts, [[-s, r]]])
    prof = profile_from_loops([loop], arcs=[Arc(r, r, r, PI, PI / 2)])
    ex = (rect(-s, r, -s, r) - sector(r, r, 0.0, r, PI, 1.5 * PI)).centroidal()
    geo = fe_geometric(prof)
    dA, dS, dI = chord_deficits(prof, (ex["cx"], ex["cy"]))
    scale = ex["Ix"] + ex["Iy"]
    assert abs(geo.A - ex["A"]) <= 1.001 * dA + ROUND_OFF * ex["A"]
    assert abs(geo.centroid[0] - ex["cx"]) <= 1.001 * dS / ex["A"] + ROUND_OFF * (r + s)
    for key in ("Ix", "Iy", "Ixy"):
        assert abs(getattr(geo, key) - ex[key]) <= 1.001 * dI + ROUND_OFF * scale, key
    assert dA < 1e-6 * ex["A"]
    # the straight polygon is short of the fillet by the chords' segments
    assert abs(polygon_of(prof)["A"] - ex["A"]) > 1000 * dA


def test_measured_errors():
    # not a check: prints the errors quoted in TARGET (pytest -s)
    for name, make, exact in CASES:
        profile = make()
        ex = exact().centroidal()
        geo = fe_geometric(profile)
        scale = ex["Ix"] + ex["Iy"]
        eI = max(abs(getattr(geo, k) - ex[k]) for k in ("Ix", "Iy", "Ixy")) / scale
        ec = max(abs(geo.centroid[0] - ex["cx"]), abs(geo.centroid[1] - ex["cy"])) / profile.size
        p = polygon_of(profile)
        print(f"{name:15s} A {abs(geo.A / ex['A'] - 1):.1e} c {ec:.1e} I {eI:.1e}   polygon A "
              f"{abs(p['A'] / ex['A'] - 1):.1e}")
