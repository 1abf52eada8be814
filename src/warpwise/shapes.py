"""Parametric profiles built from exact dimensions (drawing unit, mm by default).

Curved outlines are polygons with a given number of segments per full turn.

Examples
--------
>>> round(rectangle(20.0, 10.0).area, 9)
200.0

"""

from __future__ import annotations

import numpy as np

from .errors import ProfileError
from .geometry import Arc, Profile, profile_from_loops


def _positive(**values: float) -> None:
    """Raise a ProfileError for any non-positive dimension."""
    for name, v in values.items():
        if not (np.isfinite(v) and v > 0):
            raise ProfileError(f"dimension {name} must be positive, got {v}")


def rectangle(b: float, h: float, *, units: str = "mm") -> Profile:
    """Solid rectangle b x h centred on the origin.

    Parameters
    ----------
    b, h : float
        Width (along x) and height (along y), drawing unit.
    units : str
        Length unit.

    """
    _positive(b=b, h=h)
    pts = np.array([[-b / 2, -h / 2], [b / 2, -h / 2], [b / 2, h / 2], [-b / 2, h / 2]])
    return profile_from_loops([pts], source=f"rectangle b={b:g} h={h:g}", units=units)


def ellipse_points(a: float, b: float, segments: int, centre: tuple[float, float] = (0.0, 0.0)) -> np.ndarray:
    """Vertices of a polygon inscribed in the ellipse x^2/a^2 + y^2/b^2 = 1 (counter-clockwise)."""
    t = np.linspace(0.0, 2.0 * np.pi, segments, endpoint=False)
    return np.column_stack([centre[0] + a * np.cos(t), centre[1] + b * np.sin(t)])


def ellipse(a: float, b: float, *, segments: int = 256, units: str = "mm") -> Profile:
    """Solid ellipse with semi-axes a (along x) and b (along y), centred on the origin."""
    _positive(a=a, b=b)
    return profile_from_loops([ellipse_points(a, b, segments)],
                              source=f"ellipse a={a:g} b={b:g}", units=units)


def round_bar(d: float, *, segments: int = 256, units: str = "mm", curved: bool = True) -> Profile:
    """Solid round bar of diameter d centred on the origin.

    With ``curved`` the mesh's boundary nodes lie on the true circle (curved element edges);
    otherwise the section is the inscribed polygon of ``segments`` sides.
    """
    _positive(d=d)
    arcs = [Arc(0.0, 0.0, d / 2)] if curved else []
    return profile_from_loops([ellipse_points(d / 2, d / 2, segments)],
                              source=f"round bar d={d:g}", units=units, arcs=arcs)


def tube(d_outer: float, d_inner: float, *, segments: int = 256, units: str = "mm",
         curved: bool = True) -> Profile:
    """Circular tube with outer and inner diameters, centred on the origin (see round_bar)."""
    _positive(d_outer=d_outer, d_inner=d_inner)
    if d_inner >= d_outer:
        raise ProfileError(f"tube inner diameter {d_inner:g} must be less than outer {d_outer:g}")
    arcs = [Arc(0.0, 0.0, d_outer / 2), Arc(0.0, 0.0, d_inner / 2)] if curved else []
    return profile_from_loops(
        [ellipse_points(d_outer / 2, d_outer / 2, segments),
         ellipse_points(d_inner / 2, d_inner / 2, segments)],
        source=f"tube D={d_outer:g} d={d_inner:g}", units=units, arcs=arcs)


def polygon(points: object, *, units: str = "mm", name: str = "polygon") -> Profile:
    """Solid polygon from its vertices (any orientation), drawing unit."""
    return profile_from_loops([points], source=name, units=units)
