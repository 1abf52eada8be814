"""Curves of the true outline: circular arcs and elliptical arcs, one interface for both.

The loops of a profile are polygons; a recorded curve says where a run of their vertices lies on
a circle or an ellipse, so that the mesh, the extreme fibres and the perimeter can use the curve
itself. Both kinds are ellipses ``c + R(rotation) (a cos t, b sin t)`` over a parameter range
``start <= t <= start + sweep`` (counter-clockwise); a circle is the case ``a = b = r``,
``rotation = 0``, where t is the polar angle. Every method of :class:`Curve` works in the
curve's *scaled frame*, ``u = diag(1/a, 1/b) R^T (p - c)``, where the curve is the unit
circle: lines stay lines there, so a chord of the ellipse is the image of a chord of the
circle and every argument made for circles carries over.

Examples
--------
>>> import math
>>> e = EllipseArc(0.0, 0.0, 2.0, 1.0)
>>> [float(v) for v in e.at(np.array([0.0, math.pi / 2]))[:, 1]]
[0.0, 1.0]
>>> round(float(e.length(0.0, 2 * math.pi)), 9)  # 4 a E(1 - b^2/a^2)
9.688448221
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

TWO_PI = 2.0 * math.pi


class Curve:
    """What a circular and an elliptical arc share (drawing unit L, radians).

    Subclasses provide the centre ``cx, cy``, the semi-axes ``a, b``, the ``rotation`` of the
    a-axis from +x and the parameter range ``start``, ``sweep`` (0 < sweep <= 2 pi).
    """

    cx: float
    cy: float
    a: float
    b: float
    rotation: float
    start: float
    sweep: float

    @property
    def full(self) -> bool:
        """True for a closed curve (sweep of a whole turn)."""
        return self.sweep >= TWO_PI - 1e-9

    def _axes(self) -> tuple[np.ndarray, np.ndarray]:
        """Unit vectors of the a-axis and the b-axis."""
        c, s = math.cos(self.rotation), math.sin(self.rotation)
        return np.array([c, s]), np.array([-s, c])

    def contains_angle(self, angle: np.ndarray, slack: float = 1e-9) -> np.ndarray:
        """True where a parameter (radians) lies within the sweep (inclusive)."""
        rel = np.mod(angle - self.start + slack, TWO_PI) - slack
        return rel <= self.sweep + slack

    def at(self, t: np.ndarray) -> np.ndarray:
        """Points (k, 2) of the curve at parameters t (k,), L."""
        t = np.asarray(t, dtype=float)
        e1, e2 = self._axes()
        return (np.array([self.cx, self.cy]) + (self.a * np.cos(t))[..., None] * e1
                + (self.b * np.sin(t))[..., None] * e2)

    def scaled(self, points: np.ndarray) -> np.ndarray:
        """Points (k, 2) in the scaled frame, where the curve is the unit circle (no unit)."""
        e1, e2 = self._axes()
        d = np.asarray(points, dtype=float) - np.array([self.cx, self.cy])
        return np.stack([d @ e1 / self.a, d @ e2 / self.b], axis=-1)

    def param(self, points: np.ndarray) -> np.ndarray:
        """Parameter of points (k, 2): their polar angle in the scaled frame, radians."""
        u = self.scaled(points)
        return np.arctan2(u[..., 1], u[..., 0])

    def rho(self, points: np.ndarray) -> np.ndarray:
        """Radius of points (k, 2) in the scaled frame: 1 on the curve, below 1 inside."""
        u = self.scaled(points)
        return np.hypot(u[..., 0], u[..., 1])

    def onto(self, points: np.ndarray) -> np.ndarray:
        """Points (k, 2) moved radially in the scaled frame onto the curve, L.

        The move keeps the parameter (the scaled frame's polar angle): it is closed-form and
        unique for every point but the centre, keeps the order of points along the curve, and
        leaves points already on the curve where they are. (The nearest point of an ellipse
        needs an iteration and is not unique for points deeper than the curvature radius
        b^2 / a at the ends of the major axis.)
        """
        return self.at(self.param(points))

    def gap(self, points: np.ndarray) -> np.ndarray:
        """Distance (k,) of points (k, 2) from where :meth:`onto` puts them, L, + outside."""
        # a point is rho times the curve's point of its parameter from the centre, so the gap
        # is (rho - 1) times that point's distance from the centre: no division, and the
        # centre itself is the full distance inside (it was once taken as on the curve)
        reach = self.at(self.param(points)) - np.array([self.cx, self.cy])
        return (self.rho(points) - 1.0) * np.hypot(reach[..., 0], reach[..., 1])

    def farthest(self, directions: np.ndarray) -> np.ndarray:
        """The points of the curve farthest along unit directions (k, 2), within the sweep, L.

        Along d the curve's height d . c + a (d . e1) cos t + b (d . e2) sin t is largest at
        tan t = b (d . e2) / (a (d . e1)); directions whose best point lies outside the sweep
        give none (the ends of a partial curve are vertices of the polygon).
        """
        e1, e2 = self._axes()
        d = np.asarray(directions, dtype=float)
        t = np.arctan2(self.b * (d @ e2), self.a * (d @ e1))
        return self.at(t)[self.contains_angle(t)]

    def length(self, t0: np.ndarray | float, t1: np.ndarray | float) -> np.ndarray:
        """Length of the curve between parameters t0 and t1 (t1 >= t0), L.

        A circle: r (t1 - t0). An ellipse: with a >= b, ds = a sqrt(1 - m sin^2(t + pi/2)) dt,
        m = 1 - b^2 / a^2, so the length is a difference of incomplete elliptic integrals of
        the second kind (Legendre's form, :func:`scipy.special.ellipeinc`).
        """
        t0, t1 = np.asarray(t0, dtype=float), np.asarray(t1, dtype=float)
        if self.a == self.b:
            return self.a * (t1 - t0)
        from scipy.special import ellipeinc  # loaded only for ellipses

        big, small, shift = (self.a, self.b, 0.5 * math.pi) if self.a > self.b else (
            self.b, self.a, 0.0)
        m = 1.0 - (small / big) ** 2
        return big * (ellipeinc(t1 + shift, m) - ellipeinc(t0 + shift, m))

    @property
    def segment_area_factor(self) -> float:
        """The product a b: a chord of parameter span h cuts off the area a b (h - sin h) / 2, L^2."""
        return self.a * self.b


def _placed(rot: np.ndarray) -> tuple[float, bool]:
    """Turn of a similarity ``rot`` (rotation, maybe a mirror, times a scale) and whether it mirrors."""
    mirror = float(np.linalg.det(rot)) < 0
    return float(np.arctan2(rot[1, 0], rot[0, 0])), mirror


@dataclass(frozen=True)
class Arc(Curve):
    """A circular arc of the true outline, kept so that the mesh can follow the curve.

    Attributes
    ----------
    cx, cy : float
        Centre, drawing unit.
    r : float
        Radius, drawing unit.
    start, sweep : float
        Start angle and counter-clockwise sweep (0 < sweep <= 2 pi), radians.
    """

    cx: float
    cy: float
    r: float
    start: float = 0.0
    sweep: float = TWO_PI

    @property
    def a(self) -> float:
        """The radius, L."""
        return self.r

    @property
    def b(self) -> float:
        """The radius, L."""
        return self.r

    @property
    def rotation(self) -> float:
        """0: the parameter of a circle is its polar angle."""
        return 0.0

    def moved(self, rot: np.ndarray, off: np.ndarray, scale: float) -> Arc:
        """The arc after ``x -> rot @ x + off``, ``rot`` a rotation (or mirror) times ``scale``.

        A mirror through the line at angle phi / 2 maps the angle t to phi - t, so the arc then
        starts at phi - (start + sweep).
        """
        c = rot @ np.array([self.cx, self.cy]) + off
        turn, mirror = _placed(rot)
        start = turn - self.start - self.sweep if mirror else self.start + turn
        return Arc(float(c[0]), float(c[1]), self.r * scale, start, self.sweep)


@dataclass(frozen=True)
class EllipseArc(Curve):
    """An elliptical arc (or a whole ellipse) of the true outline.

    The points are ``(cx, cy) + R(rotation) (a cos t, b sin t)`` for
    ``start <= t <= start + sweep``.

    Attributes
    ----------
    cx, cy : float
        Centre, drawing unit.
    a, b : float
        Semi-axes along the rotated x and y directions, drawing unit.
    rotation : float
        Angle from +x to the a-axis, radians.
    start, sweep : float
        Start parameter and counter-clockwise parameter sweep (0 < sweep <= 2 pi), radians.
    """

    cx: float
    cy: float
    a: float
    b: float
    rotation: float = 0.0
    start: float = 0.0
    sweep: float = TWO_PI

    def moved(self, rot: np.ndarray, off: np.ndarray, scale: float) -> EllipseArc:
        """The ellipse arc after ``x -> rot @ x + off``, ``rot`` a rotation (or mirror) times ``scale``.

        A mirror Q = R(phi) F (F flips y) maps R(theta) (a cos t, b sin t) to
        R(phi - theta) (a cos(-t), b sin(-t)): the rotation becomes phi - theta and the
        parameter range is negated.
        """
        c = rot @ np.array([self.cx, self.cy]) + off
        turn, mirror = _placed(rot)
        if mirror:
            return EllipseArc(float(c[0]), float(c[1]), self.a * scale, self.b * scale,
                              turn - self.rotation, -self.start - self.sweep, self.sweep)
        return EllipseArc(float(c[0]), float(c[1]), self.a * scale, self.b * scale,
                          self.rotation + turn, self.start, self.sweep)


__all__ = ["Arc", "Curve", "EllipseArc"]
