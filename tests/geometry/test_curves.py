"""Recorded curves (circular and elliptical arcs): moving, mirroring, projecting, measuring."""

from __future__ import annotations

import math

import numpy as np
import pytest
from scipy.integrate import quad

from warpwise.geometry import Arc, EllipseArc

CURVES = [
    pytest.param(Arc(1.0, -2.0, 3.0, 2.5, 2.0), id="circular arc"),
    pytest.param(EllipseArc(1.0, -2.0, 4.0, 1.5, 0.4, -2.8, 2.2), id="elliptical arc"),
    pytest.param(EllipseArc(0.5, 0.0, 2.0, 3.0, -1.0), id="whole ellipse, b > a"),
]


def similarity(angle: float, scale: float, mirror: bool) -> np.ndarray:
    c, s = math.cos(angle), math.sin(angle)
    m = np.array([[c, -s], [s, c]]) * scale
    return m @ np.diag([1.0, -1.0]) if mirror else m


@pytest.mark.parametrize("curve", CURVES)
@pytest.mark.parametrize("mirror", [False, True], ids=["turned", "mirrored"])
def test_moved_curve_is_the_image_of_the_curve(curve, mirror):
    # the image of every point of the curve lies on the moved curve, within its sweep, and the
    # moved curve's own points come back onto the curve under the inverse map (common
    # practice, no source: the definition of the image of a point set)
    rot, off, scale = similarity(0.7, 1.8, mirror), np.array([3.0, -1.0]), 1.8
    moved = curve.moved(rot, off, scale)
    t = curve.start + curve.sweep * np.linspace(0.0, 1.0, 41)
    image = curve.at(t) @ rot.T + off
    assert np.allclose(moved.rho(image), 1.0, atol=1e-12)
    assert moved.contains_angle(moved.param(image)).all()
    back = (moved.at(moved.start + moved.sweep * np.linspace(0.0, 1.0, 41)) - off) @ np.linalg.inv(rot).T
    assert np.allclose(curve.rho(back), 1.0, atol=1e-12)
    assert curve.contains_angle(curve.param(back)).all()
    # the ends map onto the ends (as a set: a mirror runs the curve the other way round)
    ends = curve.at(np.array([curve.start, curve.start + curve.sweep])) @ rot.T + off
    new_ends = moved.at(np.array([moved.start, moved.start + moved.sweep]))
    if mirror:
        new_ends = new_ends[::-1]
    assert np.allclose(ends, new_ends, atol=1e-12)


@pytest.mark.parametrize("curve", CURVES)
def test_onto_keeps_the_parameter_and_lands_on_the_curve(curve):
    t = curve.start + curve.sweep * np.linspace(0.05, 0.95, 9)
    centre = np.array([curve.cx, curve.cy])
    inside = centre + 0.93 * (curve.at(t) - centre)  # on the chords' side of the curve
    moved = curve.onto(inside)
    assert np.allclose(moved, curve.at(t), atol=1e-12)
    assert np.allclose(curve.gap(inside), -0.07 * np.hypot(*(curve.at(t) - centre).T), atol=1e-12)


@pytest.mark.parametrize("curve", CURVES)
def test_farthest_points_against_a_dense_sampling(curve):
    # brute force: the largest height of 200001 points of the curve (independent of the
    # closed form; its error is the sampling step squared, below 1e-9 here)
    t = curve.start + curve.sweep * np.linspace(0.0, 1.0, 200001)
    pts = curve.at(t)
    for angle in np.linspace(0.0, 2 * np.pi, 13)[:-1]:
        d = np.array([math.cos(angle), math.sin(angle)])
        best = curve.farthest(d[None, :])
        inner = (pts @ d)[1:-1].max() > max(pts[0] @ d, pts[-1] @ d) + 1e-9
        if inner:  # the farthest point lies inside the sweep: found, and the largest
            assert len(best) == 1 and float(best[0] @ d) == pytest.approx((pts @ d).max(), abs=1e-8)
        elif len(best):  # at an end: found only within the slack of the sweep's ends
            assert float(best[0] @ d) == pytest.approx((pts @ d).max(), abs=1e-8)


@pytest.mark.parametrize("curve", CURVES)
def test_length_against_quadrature(curve):
    # ds = |d/dt (a cos t, b sin t)| dt, integrated numerically (scipy.integrate.quad)
    t0, t1 = curve.start + 0.1, curve.start + 0.9 * curve.sweep
    exact, _ = quad(lambda t: math.hypot(curve.a * math.sin(t), curve.b * math.cos(t)), t0, t1,
                    epsabs=0.0, epsrel=1e-13)
    assert float(curve.length(t0, t1)) == pytest.approx(exact, rel=1e-12)


@pytest.mark.parametrize("curve", CURVES)
def test_gap_is_the_distance_along_the_ray_from_the_centre(curve):
    # a point rho times the curve's point from the centre lies (rho - 1) |curve point - centre|
    # from it along that ray (common practice, no source); the centre itself is that whole
    # distance inside (it was once returned as 0, on the curve, and a sector's apex at the
    # centre of its arc was then no corner)
    c = np.array([curve.cx, curve.cy])
    t = curve.start + curve.sweep * np.array([0.0, 0.3, 0.7])
    on = curve.at(t)
    for rho in (0.0, 0.5, 1.0, 1.5):
        pts = c + rho * (on - c)
        reach = np.hypot(*(on - c).T)
        want = (rho - 1.0) * reach
        if rho == 0.0:  # the centre's parameter is 0 (its ray is the a-axis)
            want = -np.full(3, float(np.hypot(*(curve.at(np.array([0.0]))[0] - c))))
        assert np.allclose(curve.gap(pts), want, rtol=1e-12, atol=1e-12 * max(curve.a, curve.b))


def test_sector_apex_is_a_sharp_corner():
    # a 240 degree sector: the apex (the arc's centre) is a re-entrant corner of 240 degrees
    from warpwise.geometry.corners import reentrant_corners
    from warpwise.geometry.profile import profile_from_loops

    t = np.linspace(-2 * np.pi / 3, 2 * np.pi / 3, 101)
    loop = np.vstack([[0.0, 0.0], np.c_[20 * np.cos(t), 20 * np.sin(t)]])
    profile = profile_from_loops([loop], arcs=[Arc(0.0, 0.0, 20.0, -2 * np.pi / 3, 4 * np.pi / 3)])
    corners = reentrant_corners(profile, measure=False)
    assert [(c.x, c.y) for c in corners] == [(0.0, 0.0)]
    assert corners[0].angle_deg == pytest.approx(240.0, abs=1e-9)
