"""Solid bars and tubes: rectangle, polygon, ellipse, hollow ellipse, circle, tube, hexagon, keyed shaft."""

from __future__ import annotations

import math
from collections.abc import Sequence

import numpy as np

from ...errors import ProfileError
from ..curves import Arc, EllipseArc
from ..profile import Profile
from .dimensions import check_positive, check_sizes, require
from .outline import arc_points, shape_profile


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
    check_positive(b=b, h=h)
    pts = np.array([[-b / 2, -h / 2], [b / 2, -h / 2], [b / 2, h / 2], [-b / 2, h / 2]])
    return shape_profile("rectangle", [pts], [], units, b=b, h=h)


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
    return shape_profile(name, [points], [], units)


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


def ellipse(a: float, b: float, *, segments: int = 256, units: str = "mm",
            curved: bool = True) -> Profile:
    """Solid ellipse with semi-axes a (along x) and b (along y), centred on the origin.

    With ``curved`` the mesh's boundary nodes lie on the true ellipse (curved element edges);
    otherwise the section is the inscribed polygon of ``segments`` sides.

    Parameters
    ----------
    a, b : float
        Semi-axes, drawing unit.
    segments : int
        Vertices of the polygon of the outline, at equal parameter steps.
    units : str
        Length unit.
    curved : bool
        Record the ellipse so that the mesh follows it.

    Returns
    -------
    Profile

    Examples
    --------
    >>> e = ellipse(20.0, 10.0)
    >>> (e.arcs[0].a, e.arcs[0].b), len(ellipse(20.0, 10.0, curved=False).arcs)
    ((20.0, 10.0), 0)

    """
    check_positive(a=a, b=b)
    arcs = [EllipseArc(0.0, 0.0, float(a), float(b))] if curved else []
    return shape_profile("ellipse", [ellipse_points(a, b, segments)], arcs, units, a=a, b=b)


def hollow_ellipse(a: float, b: float, ai: float, bi: float, *, segments: int = 256,
                   units: str = "mm", curved: bool = True) -> Profile:
    """Hollow ellipse: outer semi-axes a (along x), b (along y), inner ai, bi, both centred on the origin.

    Parameters
    ----------
    a, b : float
        Outer semi-axes, drawing unit.
    ai, bi : float
        Inner semi-axes (ai < a, bi < b), drawing unit; ``ai = k a, bi = k b`` for the hollow
        ellipse of similar ellipses.
    segments : int
        Vertices of each polygon, at equal parameter steps.
    units : str
        Length unit.
    curved : bool
        Record the ellipses so that the mesh follows them.

    Returns
    -------
    Profile

    Examples
    --------
    >>> round(hollow_ellipse(20.0, 10.0, 14.0, 7.0, segments=1024).area / (np.pi * 200 * 0.51), 4)
    1.0

    """
    check_positive(a=a, b=b, ai=ai, bi=bi)
    require(ai < a and bi < b, "hollow ellipse", f"the inner ellipse (ai={ai:g}, bi={bi:g}) must lie "
            f"inside the outer one (a={a:g}, b={b:g})")
    loops = [ellipse_points(a, b, segments), ellipse_points(ai, bi, segments)]
    arcs = [EllipseArc(0.0, 0.0, float(a), float(b)), EllipseArc(0.0, 0.0, float(ai), float(bi))]
    return shape_profile("hollow ellipse", loops, arcs if curved else [], units, a=a, b=b,
                         ai=ai, bi=bi)


def _circles(diameters: Sequence[float], segments: int, curved: bool
             ) -> tuple[list[np.ndarray], list[Arc]]:
    """Loops of concentric circles about the origin and, with ``curved``, their arcs."""
    loops = [ellipse_points(d / 2, d / 2, segments) for d in diameters]
    arcs = [Arc(0.0, 0.0, d / 2) for d in diameters] if curved else []
    return loops, arcs


def circle(d: float, *, segments: int = 256, units: str = "mm", curved: bool = True) -> Profile:
    """Solid circle of diameter d centred on the origin.

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
    check_positive(d=d)
    loops, arcs = _circles([d], segments, curved)
    return shape_profile("circle", loops, arcs, units, d=d)


def tube(d_outer: float, d_inner: float, *, segments: int = 256, units: str = "mm",
         curved: bool = True) -> Profile:
    """Circular tube with outer and inner diameters, centred on the origin (see circle).

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
    check_positive(d_outer=d_outer, d_inner=d_inner)
    if d_inner >= d_outer:
        raise ProfileError(f"tube inner diameter {d_inner:g} must be less than outer {d_outer:g}")
    loops, arcs = _circles([d_outer, d_inner], segments, curved)
    return shape_profile("tube", loops, arcs, units, D=d_outer, d=d_inner)


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
    (s,) = check_sizes(label, dict(s=s))
    a = s / math.sqrt(3.0)
    ang = np.radians(np.arange(0.0, 360.0, 60.0))
    pts = np.column_stack([a * np.cos(ang), a * np.sin(ang)])
    pts[[1, 2], 1] = s / 2  # exact flats
    pts[[4, 5], 1] = -s / 2
    pts[[0, 3], 1] = 0.0
    return shape_profile(label, [pts], [], units, s=s)


def shaft_with_keyway(d: float, w: float, k: float, *, units: str = "mm") -> Profile:
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
    >>> p = shaft_with_keyway(40.0, 12.0, 5.0)
    >>> round(float(p.bounds[3]), 6), len(p.arcs)  # top corners at sqrt(d^2 - w^2) / 2
    (19.078784, 1)

    """
    label = "shaft with keyway"
    d, w, k = check_sizes(label, dict(d=d, w=w, k=k))
    R = d / 2
    require(w < d, label, f"keyway width w={w:g} must be less than the diameter d={d:g}")
    yc = math.sqrt(R * R - w * w / 4)
    yb = R - k
    require(yb < yc, label, f"keyway depth k={k:g} must exceed {R - yc:.6g}, the height of the "
            f"circle over the keyway width (the keyway would have no side walls)")
    require(yb > -yc, label, f"keyway depth k={k:g} cuts through the shaft (it must be less "
            f"than {R + yc:.6g})")
    th0 = math.atan2(yc, w / 2)
    pts, arc = arc_points(0.0, 0.0, R, math.pi - th0, math.pi + 2 * th0, d, even=True)
    pts[0] = (-w / 2, yc)
    pts[-1] = (w / 2, yc)
    loop = np.vstack([pts, [[w / 2, yb], [-w / 2, yb]]])
    return shape_profile(label, [loop], [arc], units, d=d, w=w, k=k)
