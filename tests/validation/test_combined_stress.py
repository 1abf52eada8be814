"""Stresses from combined loads (warpwise.combined) against hand formulas.

Normal stress: Navier's formula for unsymmetric bending plus axial force (Gere, Mechanics of
Materials, "bending of unsymmetric beams"; Timoshenko & Goodier, Theory of Elasticity, pure
bending of prismatic bars; both from memory), with the conventions of warpwise.combined:
Mx = int sigma y dA (positive puts +y fibres in tension), My = int sigma x dA (positive puts +x
in tension), so sigma = N / A + a x + b y with a = (My Ix - Mx Ixy) / D, b = (Mx Iy - My Ixy) / D,
D = Ix Iy - Ixy^2 about the centroid. The stress is linear, which the P2 nodal values hold
exactly, so on straight-sided shapes it is checked to 1e-12 of the largest stress (measured: at
most 2e-15).

Von Mises for one normal and one shear stress: sqrt(sigma^2 + 3 tau^2) (common practice, no
source). Torsion of a round bar tau = T r / J with J = pi d^4 / 32 (Gere, from memory); of a
concentric two-material bar tau = G_i T r / GJ (Gere, composite bars in torsion, from memory).
"""

import math

import numpy as np
import pytest

from warpwise.fem.p2 import integrate, interpolate
from warpwise.geometry.profile import Arc, profile_from_loops
from warpwise.geometry.shapes import circle, ellipse_points, rectangle
from warpwise.materials import builtin_material, make_material
from warpwise.properties.analysis import analyse
from warpwise.stress import Loads, combined_stress, shear_stress, torsion_stress

RTOL = 1e-12

# Unequal angle 100 x 60 x 8, heel at the origin, legs along +y and +x (Ixy != 0)
H, B, T = 100.0, 60.0, 8.0
ANGLE = np.array([[0, 0], [B, 0], [B, T], [T, T], [T, H], [0, H]], float)


def polygon_moments(P: np.ndarray) -> tuple[float, float, float, float, float, float]:
    """A, centroid and centroidal Ix, Iy, Ixy of a counter-clockwise polygon, by Green's theorem.

    Independent of warpwise (common practice, no source): with c_i = x_i y_{i+1} - x_{i+1} y_i,
    A = sum c / 2, xc = sum (x_i + x_{i+1}) c / (6 A), int y^2 = sum (y_i^2 + y_i y_{i+1} +
    y_{i+1}^2) c / 12, int x y = sum (x_i y_{i+1} + 2 x_i y_i + 2 x_{i+1} y_{i+1} + x_{i+1} y_i)
    c / 24, then the parallel-axis theorem.
    """
    x, y = P[:, 0], P[:, 1]
    xn, yn = np.roll(x, -1), np.roll(y, -1)
    c = x * yn - xn * y
    A = c.sum() / 2
    cx = ((x + xn) * c).sum() / (6 * A)
    cy = ((y + yn) * c).sum() / (6 * A)
    Ix = ((y * y + y * yn + yn * yn) * c).sum() / 12 - A * cy**2
    Iy = ((x * x + x * xn + xn * xn) * c).sum() / 12 - A * cx**2
    Ixy = ((x * yn + 2 * x * y + 2 * xn * yn + xn * y) * c).sum() / 24 - A * cx * cy
    return float(A), float(cx), float(cy), float(Ix), float(Iy), float(Ixy)


def navier(loads: Loads, xy: np.ndarray, A, cx, cy, Ix, Iy, Ixy) -> np.ndarray:
    """Navier's normal stress at points (n, 2), drawing coordinates."""
    x, y = xy[:, 0] - cx, xy[:, 1] - cy
    D = Ix * Iy - Ixy**2
    return (loads.N / A + (loads.My * Ix - loads.Mx * Ixy) / D * x
            + (loads.Mx * Iy - loads.My * Ixy) / D * y)


def node_at(result, nodes: np.ndarray, point) -> int:
    """Index into ``nodes`` of the mesh node at ``point`` (which must be a node)."""
    xy = result.mesh.nodes[nodes]
    k = int(np.argmin(np.hypot(*(xy - np.asarray(point)).T)))
    assert np.hypot(*(xy[k] - point)) < 1e-12 * H
    return k


@pytest.fixture(scope="module")
def angle_result():
    return analyse(profile_from_loops([ANGLE]), materials=builtin_material("aluminium-6082-T6"))


# ------------------------------------------------------------------ Navier, unsymmetric bending


def test_navier_unequal_angle(angle_result):
    res = angle_result
    L = Loads(N=12e3, Mx=3.0e6, My=-1.2e6)
    ms, = combined_stress(res, L).by_material
    assert ms.material == "aluminium-6082-T6"
    own = polygon_moments(ANGLE)
    g = res.geometric
    assert abs(g.Ixy) > 0.3 * g.Ix  # a truly unsymmetric case
    # (1) with the computed properties, at the six corners of the outline
    computed = (g.A, *g.centroid, g.Ix, g.Iy, g.Ixy)
    ref = navier(L, ANGLE, *computed)
    scale = np.abs(ref).max()
    for P, s in zip(ANGLE, ref, strict=True):
        assert abs(ms.sigma[node_at(res, ms.nodes, P)] - s) <= RTOL * scale
    # (2) with the polygon moments computed here independently, at every node
    xy = res.mesh.nodes[ms.nodes]
    assert np.abs(ms.sigma - navier(L, xy, *own)).max() <= RTOL * scale
    assert ms.sigma_max == pytest.approx(scale, rel=RTOL)  # the largest |sigma| is at a corner
    # (3) the stress resultants are the loads (sigma is linear: P2 integration is exact)
    full = np.full(res.mesh.n_nodes, np.nan)
    full[ms.nodes] = ms.sigma
    sq = interpolate(res.mesh, res.basis, full)
    x, y = res.basis.xy[..., 0], res.basis.xy[..., 1]
    assert integrate(res.basis, sq) == pytest.approx(L.N, rel=RTOL)
    assert integrate(res.basis, sq * y) == pytest.approx(L.Mx, rel=RTOL)
    assert integrate(res.basis, sq * x) == pytest.approx(L.My, rel=RTOL)


def test_navier_rotated_rectangle_principal_frame():
    # A b x h rectangle turned by phi: in its own axes (xi along b, eta along h, both
    # principal) the stress is N / A + m_xi xi / I_xi + m_eta eta / I_eta, with
    # (m_xi, m_eta) the components of (My, Mx) = int sigma (x, y) dA along xi and eta,
    # I_xi = h b^3 / 12, I_eta = b h^3 / 12 (Gere, bending about principal axes; from memory).
    # No warpwise property enters the reference.
    b, h, phi, shift = 30.0, 80.0, 25.0, np.array([4.0, -2.0])
    res = analyse(rectangle(b, h).moved(angle_deg=phi, shift=tuple(shift)))
    assert abs(res.geometric.Ixy) > 0.1 * res.geometric.Iy
    L = Loads(N=-5e3, Mx=2.0e6, My=0.7e6)
    ms, = combined_stress(res, L).by_material
    c, s = math.cos(math.radians(phi)), math.sin(math.radians(phi))
    e_xi, e_eta = np.array([c, s]), np.array([-s, c])
    m = np.array([L.My, L.Mx])
    local = res.mesh.nodes[ms.nodes] - shift
    ref = (L.N / (b * h) + (m @ e_xi) * (local @ e_xi) / (h * b**3 / 12)
           + (m @ e_eta) * (local @ e_eta) / (b * h**3 / 12))
    assert np.abs(ms.sigma - ref).max() <= RTOL * np.abs(ref).max()


def test_sign_conventions():
    # positive Mx: +y fibres in tension; positive My: +x fibres in tension (combined.py)
    res = analyse(rectangle(20.0, 40.0))
    top = node_at(res, np.arange(res.mesh.n_nodes), (0.0, 20.0))
    right = node_at(res, np.arange(res.mesh.n_nodes), (10.0, 0.0))
    sx = combined_stress(res, Loads(Mx=1e5)).by_material[0].sigma
    sy = combined_stress(res, Loads(My=1e5)).by_material[0].sigma
    assert sx[top] == pytest.approx(1e5 * 20 / (20 * 40**3 / 12), rel=RTOL)
    assert sy[right] == pytest.approx(1e5 * 10 / (40 * 20**3 / 12), rel=RTOL)


# ------------------------------------------------------------------ von Mises, torsion, shear


def test_von_mises_identity_all_loads(angle_result):
    # every node, every load at once (the angle's re-entrant corner is left out of the maxima)
    res = angle_result
    L = Loads(N=1e4, Mx=2e6, My=-1e6, Vx=3e3, Vy=-5e3, T=2e5)
    cs = combined_stress(res, L)
    ms, = cs.by_material
    vm = np.sqrt(ms.sigma**2 + 3 * ms.tau**2)
    assert np.abs(ms.von_mises - vm).max() <= RTOL * vm.max()
    assert [(x, y) for x, y, _ in cs.excluded] == [(T, T)]
    r = cs.excluded[0][2]
    keep = np.hypot(*(res.mesh.nodes[ms.nodes] - (T, T)).T) > r
    assert ms.von_mises_max == vm[keep].max()
    assert ms.utilisation == ms.von_mises_max / ms.fy
    # the shear part is the one of warpwise.stress for the same loads
    G = builtin_material("aluminium-6082-T6").G
    ss = shear_stress(res, torque=L.T, vx=L.Vx, vy=L.Vy, G=G)
    assert np.abs(ss.tau[ms.nodes] - ms.tau).max() <= RTOL * ss.tau_max
    assert cs.twist_rate == pytest.approx(ss.twist_rate, rel=RTOL)


def test_circle_axial_force_and_torque():
    # sigma = N / A everywhere; tau = T r / J; at the surface vm = sqrt((N/A)^2 + 3 (T R / J)^2);
    # utilisation = vm / fy. The curved mesh is off the circle by 1.5e-9 (A 7.6e-10), hence 5e-9.
    d = 30.0
    steel = builtin_material("steel-S355")
    res = analyse(circle(d), materials=steel)
    L = Loads(N=80e3, T=400e3)
    cs = combined_stress(res, L)
    ms, = cs.by_material
    A, J = math.pi * d**2 / 4, math.pi * d**4 / 32
    sig, tau = L.N / A, L.T * (d / 2) / J
    vm = math.sqrt(sig**2 + 3 * tau**2)
    assert np.abs(ms.sigma / sig - 1).max() < 5e-9
    r = np.hypot(*res.mesh.nodes[ms.nodes].T)
    assert np.abs(ms.tau - L.T * r / J).max() < 5e-9 * tau
    assert ms.von_mises_max == pytest.approx(vm, rel=5e-9)
    assert math.hypot(*ms.von_mises_at) == pytest.approx(d / 2, rel=1e-12)
    assert ms.fy == 355.0
    assert ms.utilisation == pytest.approx(vm / 355.0, rel=5e-9)
    assert cs.twist_rate == pytest.approx(L.T / (steel.G * J), rel=5e-9)


def test_torsion_only_matches_torsion_stress(angle_result):
    res = angle_result
    G = 26000.0
    geometry_only = analyse(res.profile)
    cs = combined_stress(geometry_only, Loads(T=1e5), G=G)
    ms, = cs.by_material
    ts = torsion_stress(geometry_only, 1e5, G)
    assert np.abs(ts.tau[ms.nodes] - ms.tau).max() <= RTOL * ts.tau_max
    assert ms.tau_max == pytest.approx(ts.tau_max, rel=RTOL)
    assert cs.twist_rate == pytest.approx(ts.twist_rate, rel=RTOL)
    assert ms.sigma_max == 0.0 and ms.utilisation is None  # no normal stress, no fy
    # without a material and without G there is no twist rate, the stresses are the same
    bare = combined_stress(geometry_only, Loads(T=1e5))
    assert bare.twist_rate is None
    assert np.array_equal(bare.by_material[0].tau, ms.tau)


def test_shear_force_rectangle_without_poisson_effect():
    # Vy on a b x h rectangle: tau_zy = V (h^2 / 4 - y^2) / (2 I), the elementary VQ / (I b)
    # (Gere, from memory), is the exact flexure solution when nu = 0 (the correction of
    # Timoshenko & Goodier's rectangular cantilever is proportional to nu / (1 + nu); from
    # memory). The P2 field misses the cubic shear function by the nodal-gradient error:
    # measured 5.6e-3 of 1.5 V / A at the default mesh, 8.2e-4 with refine=2 (order h^2.8).
    b, h, V = 20.0, 60.0, 1.0e4
    res = analyse(rectangle(b, h), materials=make_material("nu0", 100000.0, 0.0), refine=2.0)
    ms, = combined_stress(res, Loads(Vy=V)).by_material
    y = res.mesh.nodes[ms.nodes][:, 1]
    ref = V / (2 * b * h**3 / 12) * (h * h / 4 - y * y)
    peak = 1.5 * V / (b * h)
    assert np.abs(ms.tau - ref).max() < 1.5e-3 * peak
    assert ms.tau_max == pytest.approx(peak, rel=1.5e-3)


# ------------------------------------------------------------------ composite sections


def test_bimetal_strain_plane_and_jump():
    # Same strain on both sides of a bonded interface, eps = N / EA + Mx (y - ye) / EIx +
    # My (x - xe) / EIy (transformed section, Gere from memory; EIxy = 0 here), so
    # sigma_i = E_i eps and sigma jumps by E2 / E1 across the interface.
    b, t1, t2 = 25.0, 1.5, 2.5
    m1 = make_material("m1", 200000.0, 0.3, fy=300.0)
    m2 = make_material("m2", 120000.0, 0.34, fy=250.0)
    lower = np.array([[0, 0], [b, 0], [b, t1], [0, t1]], float)
    upper = np.array([[0, t1], [b, t1], [b, t1 + t2], [0, t1 + t2]], float)
    prof = profile_from_loops([lower, upper], materials=["m1", "m2"])
    res = analyse(prof, materials=[{"m1": m1, "m2": m2}[r.material] for r in prof.regions])
    E1, E2 = m1.E, m2.E
    EA = E1 * b * t1 + E2 * b * t2
    ye = (E1 * b * t1 * t1 / 2 + E2 * b * t2 * (t1 + t2 / 2)) / EA
    EIx = (E1 * (b * t1**3 / 12 + b * t1 * (t1 / 2 - ye) ** 2)
           + E2 * (b * t2**3 / 12 + b * t2 * (t1 + t2 / 2 - ye) ** 2))
    EIy = (E1 * t1 + E2 * t2) * b**3 / 12
    L = Loads(N=5e3, Mx=20e3, My=-15e3)
    by = {m.material: m for m in combined_stress(res, L).by_material}
    assert set(by) == {"m1", "m2"}
    for name, mat in (("m1", m1), ("m2", m2)):
        ms = by[name]
        xy = res.mesh.nodes[ms.nodes]
        eps = L.N / EA + L.Mx * (xy[:, 1] - ye) / EIx + L.My * (xy[:, 0] - b / 2) / EIy
        assert np.abs(ms.sigma - mat.E * eps).max() <= RTOL * np.abs(mat.E * eps).max()
        # no shear load: von Mises is |sigma|, utilisation vm / fy of each material
        assert np.array_equal(ms.von_mises, np.abs(ms.sigma))
        assert ms.fy == mat.fy and ms.utilisation == ms.von_mises_max / mat.fy
    common, i1, i2 = np.intersect1d(by["m1"].nodes, by["m2"].nodes, return_indices=True)
    assert len(common) > 10
    assert np.allclose(res.mesh.nodes[common][:, 1], t1, rtol=0, atol=1e-12)
    s1, s2 = by["m1"].sigma[i1], by["m2"].sigma[i2]
    assert np.abs(s2 - E2 / E1 * s1).max() <= RTOL * np.abs(s1).max()


def test_concentric_bar_torque_jump():
    # tau_i = G_i theta r, theta = T / GJ, GJ = G_s J_s + G_c J_c (Gere, from memory);
    # tau jumps by G_s / G_c at the interface. Curved edges: 1.5e-9 measured, hence 5e-9.
    D, d, n = 40.0, 24.0, 256
    sleeve = make_material("sleeve", 70000.0, 0.33, fy=160.0)
    core = make_material("core", 210000.0, 0.3, fy=355.0)
    prof = profile_from_loops([ellipse_points(D / 2, D / 2, n), ellipse_points(d / 2, d / 2, n)],
                              materials=["sleeve", "core"],
                              arcs=[Arc(0.0, 0.0, D / 2), Arc(0.0, 0.0, d / 2)])
    mats = {"sleeve": sleeve, "core": core}
    res = analyse(prof, materials=[mats[r.material] for r in prof.regions])
    GJ = sleeve.G * math.pi * (D**4 - d**4) / 32 + core.G * math.pi * d**4 / 32
    Tq = 1.0e6
    cs = combined_stress(res, Loads(T=Tq))
    assert cs.twist_rate == pytest.approx(Tq / GJ, rel=5e-9)
    by = {m.material: m for m in cs.by_material}
    for name, mat in mats.items():
        ms = by[name]
        ref = mat.G * Tq * np.hypot(*res.mesh.nodes[ms.nodes].T) / GJ
        assert np.abs(ms.tau - ref).max() < 5e-9 * ref.max()
        # pure shear: vm = sqrt(3) tau; utilisation vm / fy of the material
        assert ms.utilisation == pytest.approx(math.sqrt(3) * ref.max() / mat.fy, rel=5e-9)
    common, i1, i2 = np.intersect1d(by["core"].nodes, by["sleeve"].nodes, return_indices=True)
    assert len(common) == n * 2  # the interface's corner and mid-side nodes
    ratio = by["sleeve"].tau[i2] / by["core"].tau[i1]
    assert np.abs(ratio - sleeve.G / core.G).max() < 1e-13


def test_largest_shear_stress_is_reported_where_it_is(tmp_path, capsys):
    # Regression: the JSON's tau_max_at was the von Mises location. A 40 x 20 bar with My and
    # T: von Mises is largest on the short faces x = 0, 40 (bending), the torsion shear stress at
    # the middle of the long sides (x = 20, y = 0 or 20; Timoshenko & Goodier, torsion of a
    # rectangle, from memory), so the two points differ. tau_max_at must be the node of the
    # largest nodal tau (the same node as the torsion-only report, to round-off).
    import json

    from warpwise.cli import main

    path = tmp_path / "bar.txt"
    path.write_text("units: mm\n0, 0\n40, 0\n40, 20\n0, 20\n")
    assert main(["stress", str(path), "--material", "aluminium-6082-T6", "--torque", "1e5",
                 "--moment-y", "1e6", "--json"]) == 0
    obj = json.loads(capsys.readouterr().out)
    x, y = obj["tau_max_at"]
    assert x == pytest.approx(20.0, abs=1e-9) and min(y, 20.0 - y) == pytest.approx(0.0, abs=1e-9)
    assert obj["von_mises_max_at"][0] in (pytest.approx(0.0, abs=1e-9), pytest.approx(40.0))
    assert main(["stress", str(path), "--material", "aluminium-6082-T6", "--torque", "1e5",
                 "--json"]) == 0
    alone = json.loads(capsys.readouterr().out)
    assert obj["tau_max"] == pytest.approx(alone["tau_max"], rel=1e-12)
