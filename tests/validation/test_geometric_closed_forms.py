"""Geometric section properties against closed forms.

On straight-sided triangles the degree-4 quadrature integrates 1, x, y, x^2, x y and y^2
exactly, so for a polygon the only error is round-off: the shapes here are checked to 1e-13
relative (measured: at most 7e-15; the allowance covers summation round-off, which grows with
the number of elements), at the default mesh and on a coarse one, since the result must not
depend on the mesh. The circle is the exception: its meshed outline has N vertices on the
circle joined by straight or by curved (quadratic) edges; it is compared both with the
domain actually meshed (to 1e-13) and with the circle (to the outline's own deficit).

Closed forms used (common practice, no source; any strength-of-materials text):
rectangle b h^3 / 12; triangle b h^3 / 36 with the product of inertia -b^2 h^2 / 72 for a right
triangle with its legs on +x and +y; parallel-axis theorem for the composite L; principal
moments and axis as the eigenvalues and eigenvectors of [[Ix, -Ixy], [-Ixy, Iy]], the tensor
whose quadratic form e^T M e is the second moment about an axis through the centroid along e.
"""

import numpy as np
import pytest

from warpwise.geometry.shapes import circle, polygon, rectangle
from warpwise.properties.analysis import analyse

RTOL = 1e-13


def close(value: float, exact: float, scale: float | None = None) -> bool:
    """True when value equals exact to RTOL of ``scale`` (default |exact|)."""
    ref = abs(exact) if scale is None else scale
    return abs(value - exact) <= RTOL * ref


def principal(Ix: float, Iy: float, Ixy: float) -> tuple[float, float, float]:
    """I1 >= I2 and the angle of axis 1 from +x in (-90, 90] degrees, by eigen-decomposition."""
    vals, vecs = np.linalg.eigh(np.array([[Ix, -Ixy], [-Ixy, Iy]]))
    e1 = vecs[:, 1]
    angle = float(np.degrees(np.arctan2(e1[1], e1[0])))
    while angle <= -90.0:
        angle += 180.0
    while angle > 90.0:
        angle -= 180.0
    return float(vals[1]), float(vals[0]), angle


def angle_difference(a: float, b: float) -> float:
    """Difference of two axis directions in degrees, modulo 180 (an axis has no sign)."""
    d = (a - b) % 180.0
    return min(d, 180.0 - d)


def extreme_fibres(vertices: np.ndarray, centroid: np.ndarray, alpha_deg: float) -> dict:
    """Extreme fibre distances from the polygon's vertices (the extremes lie at vertices)."""
    x, y = (vertices - centroid).T
    a = np.radians(alpha_deg)
    u = x * np.cos(a) + y * np.sin(a)  # along axis 1
    v = -x * np.sin(a) + y * np.cos(a)  # along axis 2
    return {"x_top": y.max(), "x_bottom": -y.min(), "y_right": x.max(), "y_left": -x.min(),
            "1_pos": v.max(), "1_neg": -v.min(), "2_pos": u.max(), "2_neg": -u.min()}


def check_all(res, vertices, A, centroid, Ix, Iy, Ixy, *, check_angle=True):
    """Compare every geometric property with the closed forms given."""
    g = res.geometric
    size = float(np.ptp(vertices, axis=0).max())
    assert close(g.A, A)
    assert close(g.centroid[0], centroid[0], size)
    assert close(g.centroid[1], centroid[1], size)
    Iscale = Ix + Iy
    assert close(g.Ix, Ix, Iscale)
    assert close(g.Iy, Iy, Iscale)
    assert close(g.Ixy, Ixy, Iscale)
    assert close(g.Ip, Ix + Iy)
    I1, I2, alpha = principal(Ix, Iy, Ixy)
    assert close(g.I1, I1, Iscale)
    assert close(g.I2, I2, Iscale)
    if check_angle:
        # round-off of 1e-13 in the moments moves the axis by about 1e-13 (I1 + I2) / (I1 - I2)
        # rad
        assert angle_difference(g.alpha_deg, alpha) < 1e-9
        assert -90.0 < g.alpha_deg <= 90.0
    # radii of gyration r = sqrt(I / A)
    assert close(g.rx, np.sqrt(Ix / A))
    assert close(g.ry, np.sqrt(Iy / A))
    assert close(g.r1, np.sqrt(I1 / A))
    assert close(g.r2, np.sqrt(I2 / A))
    # elastic section moduli I / c to the extreme fibres, c measured from the vertices
    fib = extreme_fibres(vertices, np.asarray(centroid), g.alpha_deg)
    moment = {"x": Ix, "y": Iy, "1": I1, "2": I2}
    for key, c in fib.items():
        assert close(g.fibres[key], c, size), key
        assert close(g.Wel[key], moment[key.split("_")[0]] / c), key
    for axis, (p, q) in {"x": ("x_top", "x_bottom"), "y": ("y_right", "y_left"),
                         "1": ("1_pos", "1_neg"), "2": ("2_pos", "2_neg")}.items():
        assert g.Wel[axis] == min(g.Wel[p], g.Wel[q])


@pytest.mark.parametrize("mesh_size", [None, 7.0])
def test_rectangle(mesh_size):
    # rectangle b x h (common practice): A = b h, Ix = b h^3 / 12, Iy = h b^3 / 12, Ixy = 0;
    # wider than tall, so the major axis 1 is the y axis (alpha = 90) and x_top = h / 2.
    b, h, shift = 40.0, 20.0, (3.0, -7.0)
    prof = rectangle(b, h).moved(shift=shift)
    res = analyse(prof, mesh_size)
    verts = prof.regions[0].outer
    check_all(res, verts, b * h, shift, b * h**3 / 12, h * b**3 / 12, 0.0)
    g = res.geometric
    assert abs(g.alpha_deg - 90.0) < 1e-9
    assert close(g.Wel["x"], b * h**2 / 6)  # b h^2 / 6 (common practice)
    assert close(g.Wel["y"], h * b**2 / 6)
    assert close(g.rx, h / np.sqrt(12.0))


@pytest.mark.parametrize("angle", [30.0, -65.0])
def test_rotated_rectangle_principal_axes(angle):
    # A rectangle b x h rotated by `angle` keeps I1 = h b^3 / 12 and I2 = b h^3 / 12 about its
    # own axes; Ix, Iy, Ixy follow by rotating the second-moment tensor, M = R M' R^T
    # (common practice). Axis 1 (major, along the rectangle's short direction) lies at
    # angle + 90 degrees, reported in (-90, 90].
    b, h = 40.0, 20.0
    prof = rectangle(b, h).moved(angle_deg=angle, shift=(11.0, 5.0))
    res = analyse(prof)
    c, s = np.cos(np.radians(angle)), np.sin(np.radians(angle))
    R = np.array([[c, -s], [s, c]])
    # tensor in the rectangle's own axes: [[Ix', -Ixy'], [-Ixy', Iy']] with Ixy' = 0
    M = R @ np.diag([b * h**3 / 12, h * b**3 / 12]) @ R.T
    Ix, Iy, Ixy = M[0, 0], M[1, 1], -M[0, 1]
    check_all(res, prof.regions[0].outer, b * h, (11.0, 5.0), Ix, Iy, Ixy)
    expected = angle + 90.0
    expected -= 180.0 if expected > 90.0 else 0.0
    assert abs(res.geometric.alpha_deg - expected) < 1e-9


@pytest.mark.parametrize("mesh_size", [None, 9.0])
def test_right_triangle(mesh_size):
    # right triangle with legs b along +x and h along +y from the right angle at (x0, y0)
    # (common practice): A = b h / 2, centroid at (x0 + b/3, y0 + h/3), Ix = b h^3 / 36,
    # Iy = h b^3 / 36, Ixy = -b^2 h^2 / 72 about the centroid.
    b, h, x0, y0 = 30.0, 18.0, -4.0, 2.5
    verts = np.array([[x0, y0], [x0 + b, y0], [x0, y0 + h]])
    res = analyse(polygon(verts), mesh_size)
    check_all(res, verts, b * h / 2, (x0 + b / 3, y0 + h / 3),
              b * h**3 / 36, h * b**3 / 36, -(b**2) * h**2 / 72)
    g = res.geometric
    assert close(g.fibres["x_top"], 2 * h / 3, h)
    assert close(g.fibres["x_bottom"], h / 3, h)


def test_equilateral_triangle():
    # equilateral triangle of side a (common practice): A = sqrt(3) a^2 / 4, centroid at a
    # third of the height, Ix = Iy = sqrt(3) a^4 / 96 (= b h^3 / 36 with h = sqrt(3) a / 2),
    # Ixy = 0; every centroidal axis is principal, so the angle is not checked.
    a = 30.0
    hgt = np.sqrt(3.0) * a / 2
    verts = np.array([[0.0, 0.0], [a, 0.0], [a / 2, hgt]])
    res = analyse(polygon(verts))
    I = np.sqrt(3.0) * a**4 / 96
    check_all(res, verts, np.sqrt(3.0) * a**2 / 4, (a / 2, hgt / 3), I, I, 0.0,
              check_angle=False)
    g = res.geometric
    assert close(g.I1, g.I2, I)
    assert close(g.fibres["x_top"], 2 * hgt / 3, a)
    assert close(g.Wel["x_bottom"], I / (hgt / 3))


@pytest.mark.parametrize("mesh_size", [None, 12.0])
def test_unequal_angle(mesh_size):
    # L section, legs 100 (along y) and 60 (along x), thickness 10, corner at the origin; by
    # the parallel-axis theorem over two rectangles (common practice):
    #   60 x 10 at (30, 5) and 10 x 90 at (5, 55): A = 1500, centroid (15, 35),
    #   Ix = 545000 + 967500 = 1512500, Iy = 315000 + 97500 = 412500,
    #   Ixy = 600 (15)(-30) + 900 (-10)(20) = -450000.
    t = 10.0
    verts = np.array([[0, 0], [60, 0], [60, t], [t, t], [t, 100], [0, 100]], dtype=float)
    parts = [  # (width, height, centre x, centre y)
        (60.0, t, 30.0, t / 2), (t, 90.0, t / 2, t + 45.0)]
    A = sum(w * h for w, h, _, _ in parts)
    cx = sum(w * h * x for w, h, x, _ in parts) / A
    cy = sum(w * h * y for w, h, _, y in parts) / A
    Ix = sum(w * h**3 / 12 + w * h * (y - cy) ** 2 for w, h, _, y in parts)
    Iy = sum(h * w**3 / 12 + w * h * (x - cx) ** 2 for w, h, x, _ in parts)
    Ixy = sum(w * h * (x - cx) * (y - cy) for w, h, x, y in parts)
    assert (A, cx, cy, Ix, Iy, Ixy) == (1500.0, 15.0, 35.0, 1512500.0, 412500.0, -450000.0)
    res = analyse(polygon(verts), mesh_size)
    check_all(res, verts, A, (cx, cy), Ix, Iy, Ixy)
    # tan(2 alpha) = -2 Ixy / (Ix - Iy) = 0.9 / 1.1: alpha = 19.6447 degrees (axis 1 leans
    # towards the long leg), I1 = 962500 + sqrt(550000^2 + 450000^2)
    assert abs(res.geometric.alpha_deg - np.degrees(0.5 * np.arctan(9.0 / 11.0))) < 1e-9
    assert close(res.geometric.I1, 962500.0 + np.hypot(550000.0, 450000.0))


@pytest.mark.parametrize("curved", [True, False])
def test_circle(curved):
    # circle of diameter d (common practice): A = pi d^2 / 4, Ix = Iy = pi d^4 / 64,
    # W = pi d^3 / 32, r = d / 4. The mesh boundary has N = 512 vertices on the circle, with
    # N / 4 whole, so nodes sit at (0, +-R) and (+-R, 0) and the extreme fibres are exactly R.
    # Straight edges: the domain is the inscribed regular N-gon, A = (N/2) R^2 sin(t),
    # Ix = Iy = N R^4 sin(t) (2 + cos(t)) / 24 with t = 2 pi / N (sum over its N isosceles
    # triangles), short of the circle by t^2 / 6 and t^2 / 3 relative.
    # Curved edges: each edge is the quadratic through three points of the circle; by Green's
    # theorem along those edges (derived here, see curved_polygon_factors in
    # test_torsion_closed_forms) A = N R^2 sin(a) (1 + (1 - cos a) / 3) and
    # Ix = Iy = N R^4 sin(a) (208 + 31 cos a - 32 cos 2a + 3 cos 3a) / 840, a = pi / N, short
    # of the circle by a^4 / 30 and a^4 / 15 (4.7e-11 and 9.4e-11 here).
    # Measured: A, Ix against the meshed domain's values to 7e-15 (curved), 3e-15 (straight).
    d, N = 20.0, 512
    R = d / 2
    res = analyse(circle(d, segments=N, curved=curved))
    g = res.geometric
    if curved:
        a = np.pi / N
        A_mesh = N * R**2 * np.sin(a) * (1.0 + (1.0 - np.cos(a)) / 3.0)
        I_mesh = N * R**4 * np.sin(a) * (
            208.0 + 31.0 * np.cos(a) - 32.0 * np.cos(2 * a) + 3.0 * np.cos(3 * a)) / 840.0
        deficit_A, deficit_I = a**4 / 30, a**4 / 15
    else:
        t = 2.0 * np.pi / N
        A_mesh = N / 2 * R**2 * np.sin(t)
        I_mesh = N * R**4 * np.sin(t) * (2.0 + np.cos(t)) / 24
        deficit_A, deficit_I = t**2 / 6, t**2 / 3
    verts = res.profile.regions[0].outer
    check_all(res, verts, A_mesh, (0.0, 0.0), I_mesh, I_mesh, 0.0, check_angle=False)
    assert close(g.fibres["x_top"], R, R)
    assert close(g.Wel["x"], I_mesh / R)
    # against the circle itself, within the outline's own deficit (1e-13: round-off)
    A_c, I_c = np.pi * d**2 / 4, np.pi * d**4 / 64
    assert -deficit_A - RTOL <= g.A / A_c - 1 < 0
    assert -deficit_I - RTOL <= g.Ix / I_c - 1 < 0
    assert -deficit_I - RTOL <= g.Wel["x"] / (np.pi * d**3 / 32) - 1 < 0
    # r = sqrt(I / A): sqrt((1 - deficit_I) / (1 - deficit_A)) ~ 1 - (deficit_I - deficit_A) / 2
    assert -(deficit_I - deficit_A) / 2 - RTOL <= g.rx / (d / 4) - 1 < 0
