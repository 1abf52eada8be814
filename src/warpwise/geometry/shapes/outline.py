"""Outlines of the parametric shapes: arcs cut into chords, rounded corners, the finished profile.

Every circular arc (fillet, bend, corner radius, circle) becomes a polygon of chords whose
sagitta is at most :data:`ARC_SAGITTA` of the profile's largest dimension, *and* is recorded as
an :class:`~warpwise.geometry.Arc`, so that the mesh puts its boundary nodes on the true curve.
"""

from __future__ import annotations

import math
from collections.abc import Sequence

import numpy as np

from ...errors import ProfileError
from ..profile import Arc, Profile, profile_from_loops

#: Largest chord sagitta of the polygon that approximates an arc, as a fraction of the
#: profile's largest dimension. The mesh follows the true arc, so this only sets how finely the
#: outline (and so the mesh along it) resolves the curve: the quadratic element edges through
#: three points of the circle miss a sliver of about r^2 a^5 / 30 per edge of half-angle a, in
#: total about (sweep) s^2 / 15 for a sagitta s whatever the radius: at most 1.4e-7 relative in
#: the area properties of the shapes tested (Z-shape), 5e-8 for hot-rolled sections.
ARC_SAGITTA = 1.0e-4

#: Largest angle one chord of an arc may span, degrees. A concave fillet's tangent points then
#: turn by at most half of it, well under the 10 degrees beyond which
#: :func:`warpwise.geometry.corners.reentrant_corners` would take them for sharp corners.
ARC_MAX_STEP_DEG = 15.0


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


def arc_points(cx: float, cy: float, r: float, a0: float, turn: float, size: float,
               even: bool = False) -> tuple[np.ndarray, Arc]:
    """Points on a circle from angle ``a0`` through the signed angle ``turn``, and its Arc.

    Parameters
    ----------
    cx, cy : float
        Centre, drawing unit.
    r : float
        Radius, drawing unit.
    a0 : float
        Angle of the first point, radians from +x.
    turn : float
        Signed angle to the last point, radians (positive counter-clockwise).
    size : float
        Largest dimension of the profile (sets the chord count), drawing unit.
    even : bool
        Use an even number of chords.

    Returns
    -------
    numpy.ndarray
        Points (m + 1, 2) from the first to the last, drawing unit.
    Arc
        The arc, counter-clockwise from its start angle in [-pi, pi).

    """
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
        pts, arc = arc_points(c[0], c[1], r[k], a0, float(turn[k]), size)
        pts[0], pts[-1] = t1, t2
        pieces.append(pts)
        arcs.append(arc)
    return np.vstack(pieces), arcs


def shape_profile(label: str, loops: Sequence[object], arcs: Sequence[Arc], units: str,
                  **dimensions: float | None) -> Profile:
    """Validated profile of a shape, its source the label and the dimensions.

    Parameters
    ----------
    label : str
        Plain name of the shape, first word(s) of the source text.
    loops : sequence of array_like
        Loops (n, 2) of the outline, outer first, drawing unit.
    arcs : sequence of Arc
        Recorded arcs of the loops.
    units : str
        Length unit.
    **dimensions : float or None
        Dimensions for the source text, drawing unit; None values are left out.

    Returns
    -------
    Profile

    Examples
    --------
    >>> shape_profile("square", [[[0, 0], [2, 0], [2, 2], [0, 2]]], [], "mm", b=2, r=None).source
    'square b=2'

    """
    parts = [f"{k}={v:g}" for k, v in dimensions.items() if v is not None]
    return profile_from_loops(list(loops), source=" ".join([label, *parts]), units=units,
                              arcs=list(arcs))


def rounded_profile(label: str, corners: object, radii: Sequence[float], size: float, units: str,
                    **dimensions: float | None) -> Profile:
    """Profile of one polygon with rounded corners (see :func:`rounded_loop`).

    Parameters
    ----------
    label : str
        Plain name of the shape, in the source text and in messages.
    corners : array_like
        Vertices (n, 2) of the sharp-cornered polygon, counter-clockwise, drawing unit.
    radii : sequence of float
        Radius at each vertex (n,), drawing unit; 0 keeps the corner sharp.
    size : float
        Largest dimension of the profile (sets the chord count), drawing unit.
    units : str
        Length unit.
    **dimensions : float or None
        Dimensions for the source text, drawing unit; None values are left out.

    Returns
    -------
    Profile

    """
    loop, arcs = rounded_loop(corners, radii, size, label)
    return shape_profile(label, [loop], arcs, units, **dimensions)
