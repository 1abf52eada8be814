"""Parametric profiles built from exact dimensions (drawing unit, mm by default).

Every function returns a validated :class:`~warpwise.geometry.Profile`. Straight edges are
exact; every circular arc (fillet, bend, corner radius, circle) is a polygon of chords whose
sagitta is at most :data:`ARC_SAGITTA` of the profile's largest dimension, *and* is recorded as
an :class:`~warpwise.geometry.Arc`, so that the mesh puts its boundary nodes on the true curve
(curved element edges) and the computed properties are those of the curved outline.

Origins (x to the right, y up):

==================  ===================================================================
shape               origin
==================  ===================================================================
rectangle           centroid (centre)
round_bar, tube     centre of the circle
rhs                 centroid (centre)
i_section           centroid (centre); web along y, flanges along x
channel             back of the web on x = 0, mid-depth on y = 0; flanges towards +x
lipped_channel      back of the web on x = 0, mid-depth on y = 0; flanges towards +x,
                    lips turned in towards y = 0
angle               heel (outer corner) at the origin; leg h along +y, leg b along +x
tee                 axis of symmetry on x = 0; foot of the stem on y = 0, flange on top
zed                 centroid (the centre of point symmetry); web along y, top flange
                    towards +x, bottom flange towards -x
hexagon             centre; two flats parallel to x (the across-flats size is along y)
keyed_shaft         centre of the shaft; keyway at the top (+y), centred on x = 0
==================  ===================================================================

Each function checks its dimensions and raises :class:`~warpwise.errors.ProfileError` with a
one-line message for a non-positive size or an impossible combination (a web wider than the
flange, a radius that does not fit...). :func:`shape_from_spec` builds a profile from a text
such as ``"i_section:h=200,b=100,tw=5.6,tf=8.5,r=12"``; :data:`SHAPES` maps the plain names to
the functions and :func:`describe_shapes` lists them with their parameters.

Examples
--------
>>> round(rectangle(20.0, 10.0).area, 9)
200.0
>>> p = shape_from_spec("i_section:h=200,b=100,tw=5.6,tf=8.5,r=12")
>>> p.source
'I-section h=200 b=100 tw=5.6 tf=8.5 r=12'
>>> len(p.arcs)  # one recorded arc per root fillet
4

"""

from __future__ import annotations

import math
from collections.abc import Callable, Sequence
from dataclasses import dataclass

import numpy as np

from ..errors import ProfileError, UsageError
from .profile import Arc, Profile, profile_from_loops

#: Largest chord sagitta of the polygon that approximates an arc, as a fraction of the
#: profile's largest dimension. The mesh follows the true arc, so this only sets how finely the
#: outline (and so the mesh along it) resolves the curve: the quadratic element edges through
#: three points of the circle miss a sliver of about r^2 a^5 / 30 per edge of half-angle a, in
#: total about (sweep) s^2 / 15 for a sagitta s whatever the radius: at most 1.4e-7 relative in
#: the area properties of the shapes tested (zed), 5e-8 for hot-rolled sections.
ARC_SAGITTA = 1.0e-4

#: Largest angle one chord of an arc may span, degrees. A concave fillet's tangent points then
#: turn by at most half of it, well under the 10 degrees beyond which
#: :func:`warpwise.geometry.corners.reentrant_corners` would take them for sharp corners.
ARC_MAX_STEP_DEG = 15.0


# --------------------------------------------------------------------------- validation


def _positive(**values: float) -> None:
    """Raise a ProfileError for any non-positive dimension."""
    for name, v in values.items():
        if not (np.isfinite(v) and v > 0):
            raise ProfileError(f"dimension {name} must be positive, got {v}")


def _number(label: str, name: str, value: object) -> float:
    """``value`` as a finite float, or a ProfileError naming the shape and parameter."""
    try:
        v = float(value)  # type: ignore[arg-type]
    except (TypeError, ValueError):
        raise ProfileError(f"{label}: {name} must be a number, got {value!r}") from None
    if not math.isfinite(v):
        raise ProfileError(f"{label}: {name} must be a finite number, got {value!r}")
    return v


def _lengths(label: str, **values: object) -> list[float]:
    """Check that every value is a positive length; return them as floats, in order."""
    out = []
    for name, value in values.items():
        v = _number(label, name, value)
        if v <= 0:
            raise ProfileError(f"{label}: {name} must be positive, got {v:g}")
        out.append(v)
    return out


def _radii(label: str, **values: object) -> list[float]:
    """Check that every value is a radius >= 0 (0 is a sharp corner); return them as floats."""
    out = []
    for name, value in values.items():
        v = _number(label, name, value)
        if v < 0:
            raise ProfileError(f"{label}: {name} must be zero or positive, got {v:g}")
        out.append(v)
    return out


def _require(ok: bool, label: str, message: str) -> None:
    """Raise ``ProfileError(f"{label}: {message}")`` unless ``ok``."""
    if not ok:
        raise ProfileError(f"{label}: {message}")


# --------------------------------------------------------------------------- outlines


def arc_segments(r: float, sweep: float, size: float) -> int:
    """Number of chords for an arc of radius ``r`` and ``sweep`` radians in a profile of ``size``.

    Parameters
    ----------
    r : float
        Radius, drawing unit.
    sweep : float
        Angle the arc spans, radians (sign ignored).
    size : float
        Largest dimension of the profile, drawing unit.

    Returns
    -------
    int
        Chords such that the sagitta is at most ``ARC_SAGITTA * size`` and no chord spans more
        than :data:`ARC_MAX_STEP_DEG`.

    Examples
    --------
    >>> arc_segments(10.0, np.pi / 2, 200.0)  # sagitta limit 0.02 mm
    13
    >>> arc_segments(0.5, np.pi / 2, 200.0)  # angle limit, 15 degrees
    6

    """
    max_step = math.radians(ARC_MAX_STEP_DEG)
    ratio = ARC_SAGITTA * size / r
    step = max_step if ratio >= 1.0 else min(2.0 * math.acos(1.0 - ratio), max_step)
    return max(1, math.ceil(abs(sweep) / step - 1e-9))


def _arc_points(cx: float, cy: float, r: float, a0: float, turn: float, size: float,
                even: bool = False) -> tuple[np.ndarray, Arc]:
    """Points from angle ``a0`` through the signed angle ``turn`` on a circle, and its Arc."""
    m = arc_segments(r, turn, size)
    if even and m % 2:
        m += 1
    ang = a0 + turn * np.linspace(0.0, 1.0, m + 1)
    pts = np.column_stack([cx + r * np.cos(ang), cy + r * np.sin(ang)])
    start = a0 if turn > 0 else a0 + turn
    start = float(np.mod(start + np.pi, 2.0 * np.pi) - np.pi)
    return pts, Arc(float(cx), float(cy), float(r), start, float(abs(turn)))


def rounded_loop(corners: object, radii: Sequence[float], size: float,
                 label: str = "profile") -> tuple[np.ndarray, list[Arc]]:
    """Round the corners of a polygon with circular arcs tangent to both edges.

    Parameters
    ----------
    corners : array_like
        Vertices (n, 2) of the sharp-cornered polygon, counter-clockwise, drawing unit.
    radii : sequence of float
        Radius at each vertex (n,), drawing unit; 0 keeps the corner sharp. A left turn
        (convex corner) gets an arc centred inside the material, a right turn (re-entrant
        corner) a fillet centred outside it.
    size : float
        Largest dimension of the profile (sets the chord count), drawing unit.
    label : str
        Shape named in messages.

    Returns
    -------
    numpy.ndarray
        Vertices (k, 2) of the rounded outline, drawing unit.
    list of Arc
        One arc per rounded corner (centre, radius, counter-clockwise start and sweep).

    Raises
    ------
    ProfileError
        When the radii at the two ends of an edge need more than its length.

    Examples
    --------
    >>> pts, arcs = rounded_loop([[0, 0], [4, 0], [4, 2], [0, 2]], [0, 1, 0, 0], 4.0)
    >>> a = arcs[0]
    >>> (a.cx, a.cy, a.r, round(np.degrees(a.start)), round(np.degrees(a.sweep)))
    (3.0, 1.0, 1.0, -90, 90)

    """
    p = np.asarray(corners, dtype=float)
    n = len(p)
    r = np.asarray(radii, dtype=float)
    d_out = np.roll(p, -1, axis=0) - p
    length = np.hypot(d_out[:, 0], d_out[:, 1])
    u_out = d_out / length[:, None]
    u_in = np.roll(u_out, 1, axis=0)
    cross = u_in[:, 0] * u_out[:, 1] - u_in[:, 1] * u_out[:, 0]
    dot = np.einsum("ij,ij->i", u_in, u_out)
    turn = np.arctan2(cross, dot)  # left turn positive
    tangent = r * np.tan(0.5 * np.abs(turn))
    need = tangent + np.roll(tangent, -1)
    for k in np.flatnonzero(need > length * (1.0 + 1e-12)):
        a, b = p[k], p[(k + 1) % n]
        raise ProfileError(
            f"{label}: the corner radii at ({a[0]:g}, {a[1]:g}) and ({b[0]:g}, {b[1]:g}) need "
            f"{need[k]:g} of an edge {length[k]:g} long")
    pieces: list[np.ndarray] = []
    arcs: list[Arc] = []
    for k in range(n):
        if r[k] == 0 or abs(turn[k]) < 1e-12:
            pieces.append(p[k:k + 1])
            continue
        t1 = p[k] - u_in[k] * tangent[k]
        t2 = p[k] + u_out[k] * tangent[k]
        left = np.array([-u_in[k, 1], u_in[k, 0]]) * np.sign(turn[k])
        c = t1 + r[k] * left
        a0 = float(np.arctan2(t1[1] - c[1], t1[0] - c[0]))
        pts, arc = _arc_points(c[0], c[1], r[k], a0, float(turn[k]), size)
        pts[0], pts[-1] = t1, t2
        pieces.append(pts)
        arcs.append(arc)
    return np.vstack(pieces), arcs


def _build(loops: list[np.ndarray], arcs: list[Arc], source: str, units: str) -> Profile:
    """Validated profile from the loops of a shape."""
    return profile_from_loops(loops, source=source, units=units, arcs=arcs)


def _name(label: str, **values: float | None) -> str:
    """Source text such as ``'I-section h=200 b=100'`` (None values left out)."""
    parts = [f"{k}={v:g}" for k, v in values.items() if v is not None]
    return " ".join([label, *parts])


# --------------------------------------------------------------------------- solid shapes


def rectangle(b: float, h: float, *, units: str = "mm") -> Profile:
    """Solid rectangle b x h centred on the origin.

    Parameters
    ----------
    b, h : float
        Width (along x) and height (along y), drawing unit.
    units : str
        Length unit.

    Returns
    -------
    Profile
        Centroid at the origin.

    Examples
    --------
    >>> [float(v) for v in rectangle(20.0, 10.0).bounds]
    [-10.0, -5.0, 10.0, 5.0]

    """
    _positive(b=b, h=h)
    pts = np.array([[-b / 2, -h / 2], [b / 2, -h / 2], [b / 2, h / 2], [-b / 2, h / 2]])
    return profile_from_loops([pts], source=f"rectangle b={b:g} h={h:g}", units=units)


def ellipse_points(a: float, b: float, segments: int, centre: tuple[float, float] = (0.0, 0.0)) -> np.ndarray:
    """Vertices of a polygon inscribed in the ellipse x^2/a^2 + y^2/b^2 = 1 (counter-clockwise).

    Parameters
    ----------
    a, b : float
        Semi-axes along x and y, drawing unit.
    segments : int
        Number of vertices, at equal parameter steps starting on +x.
    centre : (float, float)
        Centre, drawing unit.

    Returns
    -------
    numpy.ndarray
        Vertices (segments, 2), drawing unit.

    """
    t = np.linspace(0.0, 2.0 * np.pi, segments, endpoint=False)
    return np.column_stack([centre[0] + a * np.cos(t), centre[1] + b * np.sin(t)])


def ellipse(a: float, b: float, *, segments: int = 256, units: str = "mm") -> Profile:
    """Solid ellipse with semi-axes a (along x) and b (along y), centred on the origin.

    Parameters
    ----------
    a, b : float
        Semi-axes, drawing unit.
    segments : int
        Vertices of the inscribed polygon (an ellipse is not a circle: the mesh keeps the
        polygon, with straight edges).
    units : str
        Length unit.

    Returns
    -------
    Profile

    """
    _positive(a=a, b=b)
    return profile_from_loops([ellipse_points(a, b, segments)],
                              source=f"ellipse a={a:g} b={b:g}", units=units)


def round_bar(d: float, *, segments: int = 256, units: str = "mm", curved: bool = True) -> Profile:
    """Solid round bar of diameter d centred on the origin.

    With ``curved`` the mesh's boundary nodes lie on the true circle (curved element edges);
    otherwise the section is the inscribed polygon of ``segments`` sides.

    Parameters
    ----------
    d : float
        Diameter, drawing unit.
    segments : int
        Vertices of the polygon of the outline.
    units : str
        Length unit.
    curved : bool
        Record the circle so that the mesh follows it.

    Returns
    -------
    Profile
        Centre at the origin.

    """
    _positive(d=d)
    arcs = [Arc(0.0, 0.0, d / 2)] if curved else []
    return profile_from_loops([ellipse_points(d / 2, d / 2, segments)],
                              source=f"round bar d={d:g}", units=units, arcs=arcs)


def tube(d_outer: float, d_inner: float, *, segments: int = 256, units: str = "mm",
         curved: bool = True) -> Profile:
    """Circular tube with outer and inner diameters, centred on the origin (see round_bar).

    Parameters
    ----------
    d_outer, d_inner : float
        Outer and inner diameters, drawing unit; ``d_inner < d_outer``.
    segments : int
        Vertices of each circle's polygon.
    units : str
        Length unit.
    curved : bool
        Record both circles so that the mesh follows them.

    Returns
    -------
    Profile
        Centre at the origin.

    """
    _positive(d_outer=d_outer, d_inner=d_inner)
    if d_inner >= d_outer:
        raise ProfileError(f"tube inner diameter {d_inner:g} must be less than outer {d_outer:g}")
    arcs = [Arc(0.0, 0.0, d_outer / 2), Arc(0.0, 0.0, d_inner / 2)] if curved else []
    return profile_from_loops(
        [ellipse_points(d_outer / 2, d_outer / 2, segments),
         ellipse_points(d_inner / 2, d_inner / 2, segments)],
        source=f"tube D={d_outer:g} d={d_inner:g}", units=units, arcs=arcs)


def polygon(points: object, *, units: str = "mm", name: str = "polygon") -> Profile:
    """Solid polygon from its vertices (any orientation), drawing unit.

    Parameters
    ----------
    points : array_like
        Vertices (n, 2), drawing unit.
    units : str
        Length unit.
    name : str
        Source named in messages.

    Returns
    -------
    Profile

    """
    return profile_from_loops([points], source=name, units=units)


def hexagon(s: float, *, units: str = "mm") -> Profile:
    """Regular hexagon bar of size ``s`` across flats, centred on the origin.

    Parameters
    ----------
    s : float
        Distance across flats, drawing unit. Two flats are parallel to x (at y = +-s/2); the
        corners on the x axis are s / sqrt(3) from the centre.
    units : str
        Length unit.

    Returns
    -------
    Profile
        Centre at the origin.

    Examples
    --------
    >>> round(hexagon(10.0).area, 9)  # sqrt(3) / 2 s^2
    86.602540378

    """
    label = "hexagon"
    (s,) = _lengths(label, s=s)
    a = s / math.sqrt(3.0)
    ang = np.radians(np.arange(0.0, 360.0, 60.0))
    pts = np.column_stack([a * np.cos(ang), a * np.sin(ang)])
    pts[[1, 2], 1] = s / 2  # exact flats
    pts[[4, 5], 1] = -s / 2
    pts[[0, 3], 1] = 0.0
    return _build([pts], [], _name(label, s=s), units)


def keyed_shaft(d: float, w: float, k: float, *, units: str = "mm") -> Profile:
    """Round shaft with a flat-bottomed keyway cut at the top.

    Parameters
    ----------
    d : float
        Shaft diameter, drawing unit.
    w : float
        Keyway width, drawing unit; ``w < d``.
    k : float
        Keyway depth on its centreline, from the shaft's circle down to the keyway bottom,
        drawing unit (the bottom is ``d - k`` from the opposite side of the shaft). The keyway
        must have side walls, ``k > d/2 - sqrt(d^2 - w^2)/2``, and its bottom corners must lie
        inside the shaft.
    units : str
        Length unit.

    Returns
    -------
    Profile
        Shaft centre at the origin, keyway centred on x = 0 at +y. The keyway's bottom corners
        are sharp.

    Examples
    --------
    >>> p = keyed_shaft(40.0, 12.0, 5.0)
    >>> round(float(p.bounds[3]), 6), len(p.arcs)  # top corners at sqrt(d^2 - w^2) / 2
    (19.078784, 1)

    """
    label = "keyed shaft"
    d, w, k = _lengths(label, d=d, w=w, k=k)
    R = d / 2
    _require(w < d, label, f"keyway width w={w:g} must be less than the diameter d={d:g}")
    yc = math.sqrt(R * R - w * w / 4)
    yb = R - k
    _require(yb < yc, label, f"keyway depth k={k:g} must exceed {R - yc:.6g}, the height of the "
             f"circle over the keyway width (the keyway would have no side walls)")
    _require(yb > -yc, label, f"keyway depth k={k:g} cuts through the shaft (it must be less "
             f"than {R + yc:.6g})")
    th0 = math.atan2(yc, w / 2)
    pts, arc = _arc_points(0.0, 0.0, R, math.pi - th0, math.pi + 2 * th0, d, even=True)
    pts[0] = (-w / 2, yc)
    pts[-1] = (w / 2, yc)
    loop = np.vstack([pts, [[w / 2, yb], [-w / 2, yb]]])
    return _build([loop], [arc], _name(label, d=d, w=w, k=k), units)


# --------------------------------------------------------------------------- hot-rolled style


def i_section(h: float, b: float, tw: float, tf: float, r: float = 0.0, *,
              units: str = "mm") -> Profile:
    """I or H section with parallel flanges and root fillets.

    Parameters
    ----------
    h : float
        Overall depth (along y), drawing unit.
    b : float
        Flange width (along x), drawing unit.
    tw : float
        Web thickness, drawing unit; ``tw < b``.
    tf : float
        Flange thickness, drawing unit; ``2 tf < h``.
    r : float
        Root radius between web and flanges, drawing unit (0: sharp corners);
        ``r <= (b - tw) / 2`` and ``2 r <= h - 2 tf``.
    units : str
        Length unit.

    Returns
    -------
    Profile
        Centroid at the origin, web along y.

    Examples
    --------
    >>> p = i_section(200.0, 100.0, 5.6, 8.5, 12.0)
    >>> round(p.area, 1)  # of the polygon; the arcs give 2 b tf + (h - 2 tf) tw + (4 - pi) r^2
    2849.4

    """
    label = "I-section"
    h, b, tw, tf = _lengths(label, h=h, b=b, tw=tw, tf=tf)
    (r,) = _radii(label, r=r)
    _require(tw < b, label, f"web thickness tw={tw:g} must be less than the flange width b={b:g}")
    _require(2 * tf < h, label, f"two flanges of tf={tf:g} do not fit in the depth h={h:g}")
    _require(r <= (b - tw) / 2, label,
             f"root radius r={r:g} is larger than the flange outstand (b - tw)/2 = {(b - tw) / 2:g}")
    _require(2 * r <= h - 2 * tf, label,
             f"root radius r={r:g} is larger than half the web depth between flanges, "
             f"(h - 2 tf)/2 = {(h - 2 * tf) / 2:g}")
    x, y, u, v = b / 2, h / 2, tw / 2, h / 2 - tf
    corners = [(-x, -y), (x, -y), (x, -v), (u, -v), (u, v), (x, v), (x, y), (-x, y), (-x, v),
               (-u, v), (-u, -v), (-x, -v)]
    radii = [0, 0, 0, r, r, 0, 0, 0, 0, r, r, 0]
    loop, arcs = rounded_loop(corners, radii, max(b, h), label)
    return _build([loop], arcs, _name(label, h=h, b=b, tw=tw, tf=tf, r=r), units)


def channel(h: float, b: float, tw: float, tf: float, r: float = 0.0, *,
            units: str = "mm") -> Profile:
    """Channel with parallel flanges and root fillets.

    Parameters
    ----------
    h : float
        Overall depth (along y), drawing unit.
    b : float
        Overall flange width, from the back of the web (along x), drawing unit; ``tw < b``.
    tw : float
        Web thickness, drawing unit.
    tf : float
        Flange thickness, drawing unit; ``2 tf < h``.
    r : float
        Root radius between web and flanges, drawing unit (0: sharp);
        ``r <= b - tw`` and ``2 r <= h - 2 tf``.
    units : str
        Length unit.

    Returns
    -------
    Profile
        Back of the web on x = 0, mid-depth on y = 0 (the axis of symmetry), flanges towards +x.

    """
    label = "channel"
    h, b, tw, tf = _lengths(label, h=h, b=b, tw=tw, tf=tf)
    (r,) = _radii(label, r=r)
    _require(tw < b, label, f"web thickness tw={tw:g} must be less than the flange width b={b:g}")
    _require(2 * tf < h, label, f"two flanges of tf={tf:g} do not fit in the depth h={h:g}")
    _require(r <= b - tw, label,
             f"root radius r={r:g} is larger than the flange outstand b - tw = {b - tw:g}")
    _require(2 * r <= h - 2 * tf, label,
             f"root radius r={r:g} is larger than half the web depth between flanges, "
             f"(h - 2 tf)/2 = {(h - 2 * tf) / 2:g}")
    y, v = h / 2, h / 2 - tf
    corners = [(0, -y), (b, -y), (b, -v), (tw, -v), (tw, v), (b, v), (b, y), (0, y)]
    radii = [0, 0, 0, r, r, 0, 0, 0]
    loop, arcs = rounded_loop(corners, radii, max(b, h), label)
    return _build([loop], arcs, _name(label, h=h, b=b, tw=tw, tf=tf, r=r), units)


def angle(h: float, b: float, t: float, r: float = 0.0, r_toe: float = 0.0, *,
          units: str = "mm") -> Profile:
    """Angle (L section) with a root radius and optional toe radii.

    Parameters
    ----------
    h : float
        Overall length of the leg along y, drawing unit.
    b : float
        Overall length of the leg along x, drawing unit.
    t : float
        Thickness of both legs, drawing unit; ``t < min(h, b)``.
    r : float
        Root radius at the inside corner, drawing unit (0: sharp).
    r_toe : float
        Radius at each toe, between the inside face of a leg and its end, drawing unit;
        ``r_toe <= t`` and ``r + r_toe <= min(h, b) - t``.
    units : str
        Length unit.

    Returns
    -------
    Profile
        Heel (outer corner, sharp) at the origin, legs along +x and +y.

    """
    label = "angle"
    h, b, t = _lengths(label, h=h, b=b, t=t)
    r, r_toe = _radii(label, r=r, r_toe=r_toe)
    _require(t < min(h, b), label, f"thickness t={t:g} must be less than both legs h={h:g}, b={b:g}")
    _require(r_toe <= t, label, f"toe radius r_toe={r_toe:g} must not exceed the thickness t={t:g}")
    leg = min(h, b) - t
    _require(r + r_toe <= leg, label,
             f"root radius r={r:g} and toe radius r_toe={r_toe:g} do not fit on the inside face "
             f"of the shorter leg ({leg:g} long)")
    corners = [(0, 0), (b, 0), (b, t), (t, t), (t, h), (0, h)]
    radii = [0, 0, r_toe, r, r_toe, 0]
    loop, arcs = rounded_loop(corners, radii, max(b, h), label)
    return _build([loop], arcs, _name(label, h=h, b=b, t=t, r=r, r_toe=r_toe or None), units)


def tee(h: float, b: float, tw: float, tf: float, r: float = 0.0, *, units: str = "mm") -> Profile:
    """Tee section with root fillets.

    Parameters
    ----------
    h : float
        Overall depth, flange included (along y), drawing unit.
    b : float
        Flange width (along x), drawing unit; ``tw < b``.
    tw : float
        Stem thickness, drawing unit.
    tf : float
        Flange thickness, drawing unit; ``tf < h``.
    r : float
        Root radius between stem and flange, drawing unit (0: sharp);
        ``r <= (b - tw)/2`` and ``r <= h - tf``.
    units : str
        Length unit.

    Returns
    -------
    Profile
        Axis of symmetry on x = 0, foot of the stem on y = 0, top of the flange at y = h.

    """
    label = "tee"
    h, b, tw, tf = _lengths(label, h=h, b=b, tw=tw, tf=tf)
    (r,) = _radii(label, r=r)
    _require(tw < b, label, f"stem thickness tw={tw:g} must be less than the flange width b={b:g}")
    _require(tf < h, label, f"flange thickness tf={tf:g} must be less than the depth h={h:g}")
    _require(r <= (b - tw) / 2, label,
             f"root radius r={r:g} is larger than the flange outstand (b - tw)/2 = {(b - tw) / 2:g}")
    _require(r <= h - tf, label, f"root radius r={r:g} is longer than the stem below the flange, "
             f"h - tf = {h - tf:g}")
    x, u, v = b / 2, tw / 2, h - tf
    corners = [(-u, 0), (u, 0), (u, v), (x, v), (x, h), (-x, h), (-x, v), (-u, v)]
    radii = [0, 0, r, 0, 0, 0, 0, r]
    loop, arcs = rounded_loop(corners, radii, max(b, h), label)
    return _build([loop], arcs, _name(label, h=h, b=b, tw=tw, tf=tf, r=r), units)


# --------------------------------------------------------------------------- constant-thickness


def rhs(h: float, b: float, t: float, ro: float = 0.0, ri: float | None = None, *,
        units: str = "mm") -> Profile:
    """Rectangular (or square) hollow section with rounded corners.

    Parameters
    ----------
    h : float
        Overall depth (along y), drawing unit.
    b : float
        Overall width (along x), drawing unit.
    t : float
        Wall thickness, drawing unit; ``2 t < min(h, b)``.
    ro : float
        Outer corner radius, drawing unit (0: sharp); ``2 ro <= min(h, b)``.
    ri : float, optional
        Inner corner radius, drawing unit; default ``max(ro - t, 0)`` (concentric with the
        outer corner). At least ``ro - t`` (the corner is not thinner than the wall) and
        ``2 ri <= min(h, b) - 2 t``.
    units : str
        Length unit.

    Returns
    -------
    Profile
        Centroid at the origin.

    Examples
    --------
    >>> p = rhs(100.0, 50.0, 4.0, ro=8.0)
    >>> [round(a.r, 9) for a in p.arcs][:2], len(p.arcs)
    ([8.0, 8.0], 8)

    """
    label = "RHS"
    h, b, t = _lengths(label, h=h, b=b, t=t)
    (ro,) = _radii(label, ro=ro)
    given = ri is not None
    ri = max(ro - t, 0.0) if ri is None else _radii(label, ri=ri)[0]
    small = min(h, b)
    _require(2 * t < small, label, f"two walls of t={t:g} do not fit in the width {small:g}")
    _require(2 * ro <= small, label, f"outer corner radius ro={ro:g} is more than half the "
             f"smaller side ({small / 2:g})")
    _require(ri >= ro - t - 1e-12 * small, label,
             f"inner corner radius ri={ri:g} must be at least ro - t = {ro - t:g} (the corner "
             f"would be thinner than the wall)")
    _require(2 * ri <= small - 2 * t, label, f"inner corner radius ri={ri:g} is more than half "
             f"the smaller inner side ({(small - 2 * t) / 2:g})")
    x, y = b / 2, h / 2
    outer, arcs_o = rounded_loop([(-x, -y), (x, -y), (x, y), (-x, y)], [ro] * 4, max(b, h), label)
    u, v = x - t, y - t
    inner, arcs_i = rounded_loop([(-u, -v), (u, -v), (u, v), (-u, v)], [ri] * 4, max(b, h), label)
    name = _name(label, h=h, b=b, t=t, ro=ro, ri=ri if given else None)
    return _build([outer, inner], arcs_o + arcs_i, name, units)


def zed(h: float, b: float, t: float, r: float = 0.0, *, units: str = "mm") -> Profile:
    """Zed section of constant thickness with equal flanges, cold-formed (bent) or plain.

    Parameters
    ----------
    h : float
        Overall depth (along y), drawing unit.
    b : float
        Overall flange width, from the outer face of the web to the flange tip, drawing unit.
    t : float
        Thickness, drawing unit.
    r : float
        Inside bend radius, drawing unit; the outside radius is ``r + t`` (concentric).
        0 gives a plain zed with sharp corners inside and out. ``r + t <= b`` and
        ``2 (r + t) <= h``.
    units : str
        Length unit.

    Returns
    -------
    Profile
        Centroid (the centre of point symmetry) at the origin; web centred on x = 0, top
        flange towards +x, bottom flange towards -x.

    """
    label = "zed"
    h, b, t = _lengths(label, h=h, b=b, t=t)
    (r,) = _radii(label, r=r)
    _require(t < b, label, f"thickness t={t:g} must be less than the flange width b={b:g}")
    _require(2 * t < h, label, f"two flanges of t={t:g} do not fit in the depth h={h:g}")
    _require(r + t <= b, label,
             f"bend radius r={r:g} plus thickness t={t:g} is more than the flange width b={b:g}")
    _require(2 * (r + t) <= h, label,
             f"two bends of outside radius r + t = {r + t:g} do not fit in the depth h={h:g}")
    u, y = t / 2, h / 2
    f = b - t / 2  # flange tip from the web centre line
    corners = [(-f, -y), (u, -y), (u, y - t), (f, y - t), (f, y), (-u, y), (-u, -y + t), (-f, -y + t)]
    o = r + t if r > 0 else 0.0
    radii = [0, o, r, 0, 0, o, r, 0]
    loop, arcs = rounded_loop(corners, radii, max(b, h), label)
    return _build([loop], arcs, _name(label, h=h, b=b, t=t, r=r), units)


def lipped_channel(h: float, b: float, c: float, t: float, r: float = 0.0, *,
                   units: str = "mm") -> Profile:
    """Cold-formed lipped channel (C section) of constant thickness.

    Parameters
    ----------
    h : float
        Overall depth (along y), drawing unit.
    b : float
        Overall flange width, from the back of the web, drawing unit.
    c : float
        Overall lip length, from the outer face of the flange to the lip tip, drawing unit;
        ``r + t <= c`` and ``2 c < h`` (the lips must not meet).
    t : float
        Thickness, drawing unit.
    r : float
        Inside radius of the four bends, drawing unit (outside radius ``r + t``, concentric);
        0 gives sharp corners inside and out. ``2 (r + t) <= b`` and ``2 (r + t) <= h``.
    units : str
        Length unit.

    Returns
    -------
    Profile
        Back of the web on x = 0, mid-depth on y = 0 (the axis of symmetry), flanges towards
        +x, lips turned in towards y = 0.

    """
    label = "lipped channel"
    h, b, c, t = _lengths(label, h=h, b=b, c=c, t=t)
    (r,) = _radii(label, r=r)
    o = r + t
    _require(2 * c < h, label, f"lip length c={c:g} must be less than half the depth h={h:g} "
             f"(the lips would meet)")
    _require(o <= c, label, f"lip length c={c:g} is shorter than the bend, r + t = {o:g}")
    _require(2 * o <= b, label,
             f"flange width b={b:g} is less than two bends, 2 (r + t) = {2 * o:g}")
    _require(2 * o <= h, label, f"depth h={h:g} is less than two bends, 2 (r + t) = {2 * o:g}")
    y = h / 2
    corners = [(0, -y), (b, -y), (b, -y + c), (b - t, -y + c), (b - t, -y + t), (t, -y + t),
               (t, y - t), (b - t, y - t), (b - t, y - c), (b, y - c), (b, y), (0, y)]
    ro = o if r > 0 else 0.0
    radii = [ro, ro, 0, 0, r, r, r, r, 0, 0, ro, ro]
    loop, arcs = rounded_loop(corners, radii, max(b, h), label)
    return _build([loop], arcs, _name(label, h=h, b=b, c=c, t=t, r=r), units)


# --------------------------------------------------------------------------- registry and specs


@dataclass(frozen=True)
class ShapeParameter:
    """One parameter of a parametric shape.

    Attributes
    ----------
    name : str
        Keyword of the shape function and of the spec text.
    meaning : str
        What it is, in plain words.
    default : float or None
        Default value (a length in the drawing unit), or None when it must be given; for
        ``rhs`` ``ri`` the default is computed (see :func:`rhs`).
    required : bool
        True when the spec must give it.
    """

    name: str
    meaning: str
    default: float | None = None
    required: bool = True


@dataclass(frozen=True)
class ShapeKind:
    """A parametric shape of :data:`SHAPES`.

    Attributes
    ----------
    name : str
        Plain name used in specs.
    function : callable
        Builds the Profile from the parameters (lengths, drawing unit) and ``units``.
    summary : str
        What the shape is.
    origin : str
        Where the shape sits relative to the origin.
    parameters : tuple of ShapeParameter
        Parameters in the function's order.
    example : str
        A valid spec.
    """

    name: str
    function: Callable[..., Profile]
    summary: str
    origin: str
    parameters: tuple[ShapeParameter, ...]
    example: str


def _p(name: str, meaning: str, default: float | None = None, required: bool | None = None
       ) -> ShapeParameter:
    return ShapeParameter(name, meaning, default, default is None if required is None else required)


_KINDS: tuple[ShapeKind, ...] = (
    ShapeKind("rectangle", rectangle, "solid rectangle", "centroid at the origin",
              (_p("b", "width along x"), _p("h", "height along y")), "rectangle:b=40,h=20"),
    ShapeKind("round_bar", round_bar, "solid round bar", "centre at the origin",
              (_p("d", "diameter"),), "round_bar:d=30"),
    ShapeKind("tube", tube, "circular tube", "centre at the origin",
              (_p("d_outer", "outer diameter"), _p("d_inner", "inner diameter")),
              "tube:d_outer=60,d_inner=50"),
    ShapeKind("rhs", rhs, "rectangular hollow section with rounded corners",
              "centroid at the origin",
              (_p("h", "overall depth along y"), _p("b", "overall width along x"),
               _p("t", "wall thickness"), _p("ro", "outer corner radius", 0.0),
               _p("ri", "inner corner radius (default max(ro - t, 0))", None, False)),
              "rhs:h=100,b=50,t=4,ro=8"),
    ShapeKind("i_section", i_section, "I or H section with root fillets",
              "centroid at the origin",
              (_p("h", "overall depth"), _p("b", "flange width"), _p("tw", "web thickness"),
               _p("tf", "flange thickness"), _p("r", "root radius", 0.0)),
              "i_section:h=200,b=100,tw=5.6,tf=8.5,r=12"),
    ShapeKind("channel", channel, "channel with parallel flanges and root fillets",
              "back of web on x = 0, mid-depth on y = 0, flanges towards +x",
              (_p("h", "overall depth"), _p("b", "overall flange width"),
               _p("tw", "web thickness"), _p("tf", "flange thickness"),
               _p("r", "root radius", 0.0)),
              "channel:h=160,b=65,tw=7.5,tf=10.5,r=10.5"),
    ShapeKind("angle", angle, "angle with root radius and toe radii",
              "heel at the origin, legs along +x and +y",
              (_p("h", "leg along y"), _p("b", "leg along x"), _p("t", "thickness"),
               _p("r", "root radius", 0.0), _p("r_toe", "toe radius", 0.0)),
              "angle:h=80,b=60,t=8,r=8,r_toe=4"),
    ShapeKind("tee", tee, "tee with root fillets",
              "axis on x = 0, foot of the stem on y = 0, flange on top",
              (_p("h", "overall depth"), _p("b", "flange width"), _p("tw", "stem thickness"),
               _p("tf", "flange thickness"), _p("r", "root radius", 0.0)),
              "tee:h=100,b=100,tw=11,tf=11,r=11"),
    ShapeKind("zed", zed, "zed of constant thickness, bent (r > 0) or plain",
              "centroid at the origin, top flange towards +x",
              (_p("h", "overall depth"), _p("b", "overall flange width"), _p("t", "thickness"),
               _p("r", "inside bend radius", 0.0)),
              "zed:h=200,b=75,t=2,r=3"),
    ShapeKind("lipped_channel", lipped_channel, "cold-formed lipped channel",
              "back of web on x = 0, mid-depth on y = 0, flanges towards +x",
              (_p("h", "overall depth"), _p("b", "overall flange width"),
               _p("c", "overall lip length"), _p("t", "thickness"),
               _p("r", "inside bend radius", 0.0)),
              "lipped_channel:h=150,b=60,c=18,t=2,r=3"),
    ShapeKind("hexagon", hexagon, "regular hexagon bar", "centre at the origin, flats parallel to x",
              (_p("s", "size across flats"),), "hexagon:s=24"),
    ShapeKind("keyed_shaft", keyed_shaft, "round shaft with a keyway",
              "shaft centre at the origin, keyway at +y",
              (_p("d", "shaft diameter"), _p("w", "keyway width"),
               _p("k", "keyway depth from the circle on the centreline")),
              "keyed_shaft:d=40,w=12,k=5"),
)

#: The parametric shapes by plain name, each a function returning a Profile.
SHAPES: dict[str, Callable[..., Profile]] = {kind.name: kind.function for kind in _KINDS}

#: Name, parameters, origin and an example spec of each shape in :data:`SHAPES`.
SHAPE_KINDS: dict[str, ShapeKind] = {kind.name: kind for kind in _KINDS}


def shape_from_spec(spec: str, units: str = "mm") -> Profile:
    """Build a parametric profile from a text ``NAME:PARAM=VALUE,PARAM=VALUE,...``.

    Parameters
    ----------
    spec : str
        Shape name (a key of :data:`SHAPES`; case, spaces and ``-`` for ``_`` are forgiven)
        and its parameters, lengths in the drawing unit.
    units : str
        Length unit of the values and of the profile (mm, cm, m or in).

    Returns
    -------
    Profile

    Raises
    ------
    UsageError
        For an empty spec, an unknown shape or parameter, a value that is not a finite
        number, a parameter given twice or a missing one.
    ProfileError
        For a dimension that is not positive or an impossible combination.

    Examples
    --------
    >>> shape_from_spec("rhs: h=100, b=50, t=4, ro=8").source
    'RHS h=100 b=50 t=4 ro=8'
    >>> shape_from_spec("i_section:h=200,b=100,tw=5.6")
    Traceback (most recent call last):
    ...
    warpwise.errors.UsageError: shape i_section: missing parameter tf (flange thickness)
    >>> shape_from_spec("box:h=1")  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    warpwise.errors.UsageError: unknown shape 'box' (shapes: rectangle, round_bar, tube, rhs, ...)

    """
    if not isinstance(spec, str) or not spec.strip():
        raise UsageError("empty shape spec: give NAME:PARAM=VALUE,... (e.g. rectangle:b=40,h=20)")
    name, _, rest = spec.partition(":")
    key = name.strip().lower().replace("-", "_").replace(" ", "_")
    kind = SHAPE_KINDS.get(key)
    if kind is None:
        raise UsageError(f"unknown shape {name.strip()!r} (shapes: {', '.join(SHAPES)})")
    params = {p.name: p for p in kind.parameters}
    values: dict[str, float] = {}
    items = [item.strip() for item in rest.split(",")] if rest.strip() else []
    for item in items:
        if not item:
            raise UsageError(f"shape {key}: empty item in {spec.strip()!r} (a doubled comma?)")
        pname, eq, text = item.partition("=")
        pname = pname.strip()
        if not eq or not pname:
            raise UsageError(f"shape {key}: {item!r} is not PARAM=VALUE")
        if pname not in params:
            raise UsageError(f"shape {key}: unknown parameter {pname!r} "
                             f"(parameters: {', '.join(params)})")
        if pname in values:
            raise UsageError(f"shape {key}: parameter {pname} is given twice")
        try:
            v = float(text)
        except ValueError:
            raise UsageError(f"shape {key}: {pname}={text.strip()!r} is not a number") from None
        if not math.isfinite(v):
            raise UsageError(f"shape {key}: {pname}={text.strip()} is not a finite number")
        values[pname] = v
    missing = [p for p in kind.parameters if p.required and p.name not in values]
    if missing:
        what = ", ".join(f"{p.name} ({p.meaning})" for p in missing)
        plural = "s" if len(missing) > 1 else ""
        raise UsageError(f"shape {key}: missing parameter{plural} {what}")
    return kind.function(**values, units=units)


def describe_shapes(units: str = "mm") -> str:
    """A plain-text list of the parametric shapes and their parameters, for ``--help``.

    Parameters
    ----------
    units : str
        Length unit shown beside each parameter (the drawing unit the values are in).

    Returns
    -------
    str
        Several lines, ending with a newline.

    Examples
    --------
    >>> for line in describe_shapes().splitlines()[2:7]:
    ...     print(line)
      rectangle: solid rectangle
          origin   centroid at the origin
          b        width along x, mm
          h        height along y, mm
          example  rectangle:b=40,h=20

    """
    lines = [f"Parametric shapes, NAME:PARAM=VALUE,... (all values are lengths in {units}):", ""]
    for kind in _KINDS:
        lines.append(f"  {kind.name}: {kind.summary}")
        lines.append(f"      {'origin':<8} {kind.origin}")
        for p in kind.parameters:
            note = "" if p.required else (f", default {p.default:g}" if p.default is not None
                                          else ", optional")
            lines.append(f"      {p.name:<8} {p.meaning}, {units}{note}")
        lines.append(f"      {'example':<8} {kind.example}")
    return "\n".join(lines) + "\n"
