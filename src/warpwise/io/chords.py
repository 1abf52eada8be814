"""Chains drawn as polygons: chords of the curves, the area they change, arcs for the mesher.

:func:`loop_points` turns a chain into a polygon at a chord tolerance (vertices on the true
curves, joints where arcs end); :func:`chord_error` tells how much the chords of a set of loops
change its area, and :func:`arcs_for_mesh` hands the arcs to the mesher's curved element edges.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import replace

import numpy as np

from ..geometry.curves import Arc, Curve, EllipseArc  # noqa: F401 (Arc: in the examples)
from ..geometry.loops import signed_area
from .pieces import Chain, Piece


def loop_points(chain: Chain, pieces: Sequence[Piece], chord_tolerance: float) -> tuple[
        np.ndarray, tuple[Curve, ...]]:
    """The polygon of a chain at a chord tolerance, and the arcs it runs along.

    Parameters
    ----------
    chain : Chain
        A chain (closed or open).
    pieces : sequence of Piece
        The pieces the chain indexes.
    chord_tolerance : float
        Largest distance between a chord and its curve, drawing unit.

    Returns
    -------
    points : numpy.ndarray
        Vertices (n, 2), drawing unit; for a closed chain the first point is not repeated.
    arcs : tuple of Curve
        Circular and elliptical arcs of the pieces.

    """
    parts: list[np.ndarray] = []
    arcs: list[Curve] = []
    for k, (i, rev) in enumerate(chain.steps):
        pts = np.asarray(pieces[i].sample(chord_tolerance), dtype=float)
        if pieces[i].closed:
            parts.append(pts)
        else:
            pts = pts[::-1] if rev else pts
            if k == 0:
                parts.append(pts)
            elif pieces[i].arcs and not pieces[chain.steps[k - 1][0]].arcs:
                # the joint goes where the arc ends, so the arc's vertices all lie on its circle
                parts[-1] = parts[-1][:-1]
                parts.append(pts)
            else:
                parts.append(pts[1:])
        arcs += pieces[i].arcs
    points = np.vstack(parts)
    if chain.closed and not (len(chain.steps) == 1 and pieces[chain.steps[0][0]].closed):
        first, last = chain.steps[0][0], chain.steps[-1][0]
        points = points[1:] if pieces[last].arcs and not pieces[first].arcs else points[:-1]
    return points, tuple(arcs)


def chord_error(loops: Sequence[Chain], depths: Sequence[int], pieces: Sequence[Piece],
                chord_tolerance: float) -> float:
    """Relative change of area when the curves of closed chains are drawn as chords.

    Exact for circular and elliptical arcs (the area of every segment cut off is known), an
    upper bound for other curves (at most 2/3 of the tolerance times their length).

    Parameters
    ----------
    loops : sequence of Chain
        The closed loops of the profile.
    depths : sequence of int
        Even-odd nesting depth of each loop (even: solid boundary, odd: hole).
    pieces : sequence of Piece
        The pieces the loops index.
    chord_tolerance : float
        Largest distance between a chord and its curve, drawing unit.

    Returns
    -------
    float
        abs(area of the polygons - true area) / true area (bound).

    """
    exact = poly = bound = 0.0
    for loop, depth in zip(loops, depths, strict=True):
        pts = loop_points(loop, pieces, chord_tolerance)[0]
        a = signed_area(pts)
        corr = 0.0
        for i, rev in loop.steps:
            pc = pieces[i]
            if pc.curved_length <= 0:
                continue
            if pc.chord_area is None:
                bound += 2.0 / 3.0 * chord_tolerance * pc.curved_length
            else:
                corr += -pc.chord_area(chord_tolerance) if rev else pc.chord_area(chord_tolerance)
        sign = -1.0 if depth % 2 else 1.0
        exact += sign * abs(a + corr)
        poly += sign * abs(a)
    return (abs(exact - poly) + bound) / abs(exact) if exact else math.inf


def arcs_for_mesh(arcs: Sequence[Curve], tol: float) -> tuple[Curve, ...]:
    """Arcs as the mesher's curved edges take them: the arcs of one whole circle or ellipse merged.

    Arcs of one circle or ellipse (centre, semi-axes and axis direction within ``tol``) that
    together cover it become one whole curve (a circle drawn as two bulges, an ellipse as two
    halves, or arcs between the points where lines touch it); other arcs are kept as they are.

    Parameters
    ----------
    arcs : sequence of Curve
        Arcs of the outline (radians, counter-clockwise sweeps).
    tol : float
        Length within which two centres or semi-axes are the same, drawing unit.

    Returns
    -------
    tuple of Curve

    Examples
    --------
    >>> import math
    >>> halves = [Arc(0.0, 0.0, 1.0, 0.0, math.pi), Arc(0.0, 0.0, 1.0, math.pi, math.pi)]
    >>> arcs_for_mesh(halves, 1e-9) == (Arc(0.0, 0.0, 1.0, 0.0, 2 * math.pi),)
    True
    >>> len(arcs_for_mesh([Arc(0.0, 0.0, 1.0, 3.0, 0.5)], 1e-9))
    1
    >>> turned = [EllipseArc(0.0, 0.0, 2.0, 1.0, 0.0, 0.0, math.pi),
    ...           EllipseArc(0.0, 0.0, 2.0, 1.0, math.pi, 0.0, math.pi)]  # the same ellipse
    >>> arcs_for_mesh(turned, 1e-9) == (EllipseArc(0.0, 0.0, 2.0, 1.0, 0.0, 0.0, 2 * math.pi),)
    True

    """
    two_pi = 2.0 * math.pi
    groups: dict[tuple[int, ...], list[Curve]] = {}
    scale = max(tol, 1e-300)
    for a in map(_one_form, arcs):
        key = (type(a).__name__, round(a.cx / scale), round(a.cy / scale), round(a.a / scale),
               round(a.b / scale), round(a.rotation * a.a / scale))
        groups.setdefault(key, []).append(a)
    out: list[Curve] = []
    for members in groups.values():
        full = [a for a in members if a.full]
        if full:
            out.append(replace(full[0], start=0.0, sweep=two_pi))
            continue
        # covered parameter ranges, from the first arc's start
        base = members[0].start
        spans = sorted((math.fmod(a.start - base, two_pi) % two_pi, a.sweep) for a in members)
        reach, covered = 0.0, True
        for lo, sweep in spans:
            if lo > reach + 1e-9:
                covered = False
                break
            reach = max(reach, lo + sweep)
        if covered and reach >= two_pi - 1e-9:
            out.append(replace(members[0], start=0.0, sweep=two_pi))
            continue
        out += members
    return tuple(out)


def _one_form(curve: Curve) -> Curve:
    """An ellipse arc written with its a-axis in [-pi/2, pi/2) from +x (the same points).

    Turning the a-axis by pi negates both semi-axis vectors, i.e. shifts the parameter by pi.
    """
    if not isinstance(curve, EllipseArc):
        return curve
    turns = math.floor((curve.rotation + 0.5 * math.pi) / math.pi)
    if turns == 0:
        return curve
    return replace(curve, rotation=curve.rotation - turns * math.pi,
                   start=math.fmod(curve.start + turns * math.pi, 2.0 * math.pi))
