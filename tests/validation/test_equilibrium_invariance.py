"""Equilibrium of the recovered stress fields, and invariance under rigid motions.

Equilibrium: the flexure shear stresses for shear forces Vx, Vy must add up to (Vx, Vy), and
the torsion stresses for a torque T must add up to no force and to the torque T (statics;
common practice, no source). On the mesh these hold to round-off for stresses at the
quadrature points, because the coordinate functions x and y lie in the P2 space (Galerkin
identities, derived beside each check), and to the discretisation error for the averaged nodal
stresses that the stress module reports.

Invariance: section properties are properties of the shape, so rotating and translating the
profile moves the shear centres with it and leaves J, Cw, I1, I2, A and the principal shear
coefficients unchanged (common practice, no source). With the mesh moved identically the
arithmetic is the same up to round-off; with a fresh mesh of the moved profile the values
agree to the discretisation error.

Profiles are unsymmetric on purpose (Ixy != 0, shear centre off the centroid in both
directions); the lipped channel is monosymmetric and the eccentric tube has curved edges.
"""

import numpy as np
import pytest

from warpwise.fem.p2 import gradient, interpolate
from warpwise.geometry.profile import Arc, profile_from_loops
from warpwise.geometry.shapes import ellipse_points
from warpwise.mesh.core import Mesh, build_mesh
from warpwise.properties.analysis import analyse
from warpwise.stress import shear_stress, torsion_stress


def solid(*loops, arcs=()):
    return profile_from_loops([np.asarray(loop, dtype=float) for loop in loops], arcs=arcs)


PROFILES = {
    "unequal angle": lambda: solid([(0, 0), (100, 0), (100, 8), (8, 8), (8, 60), (0, 60)]),
    "lipped channel": lambda: solid([(0, 0), (60, 0), (60, 20), (55, 20), (55, 5), (5, 5),
                                     (5, 95), (55, 95), (55, 80), (60, 80), (60, 100), (0, 100)]),
    "pentagon with hole": lambda: solid([(0, 0), (90, 0), (110, 40), (30, 70), (-10, 40)],
                                        [(20, 15), (50, 40), (60, 15)]),
    "eccentric tube": lambda: solid(ellipse_points(30.0, 30.0, 256),
                                    ellipse_points(10.0, 10.0, 128, (8.0, 5.0)),
                                    arcs=[Arc(0.0, 0.0, 30.0), Arc(8.0, 5.0, 10.0)]),
}
STRAIGHT = [name for name in PROFILES if name != "eccentric tube"]


def flexure_stress_at_points(res, vx, vy):
    """tau = grad(Theta) - h at the quadrature points (m, q, 2), per shear.py (Pilkey 2002)."""
    geo, ev, nu = res.geometric, res.basis, res.shear.poisson
    D = geo.Ix * geo.Iy - geo.Ixy**2
    a = (geo.Ix * vx - geo.Ixy * vy) / D
    b = (geo.Iy * vy - geo.Ixy * vx) / D
    x, y = ev.xy[..., 0], ev.xy[..., 1]
    c = nu / (2.0 * (1.0 + nu))
    h = np.stack([c * (a * 0.5 * (x * x - y * y) + b * x * y),
                  c * (a * x * y + b * 0.5 * (y * y - x * x))], axis=-1)
    return gradient(res.mesh, ev, vx * res.shear.theta_x + vy * res.shear.theta_y) - h


def resultants(res, zx, zy):
    """Force (Fx, Fy) and torque about the centroid of a stress field at the points."""
    ev = res.basis
    x, y = ev.xy[..., 0], ev.xy[..., 1]
    return (float(np.sum(ev.dA * zx)), float(np.sum(ev.dA * zy)),
            float(np.sum(ev.dA * (x * zy - y * zx))))


# ---------------------------------------------------------------------------------------------
# equilibrium

@pytest.mark.parametrize("nu", [0.0, 0.3])
@pytest.mark.parametrize("name", list(PROFILES))
def test_flexure_stress_resultant(name, nu):
    # 1. At the quadrature points: the weak form int grad(Theta) . grad(v) = int grad(v) . h
    #    + int v (a x + b y) holds for every v of the P2 space, and v = x is one (exactly, on
    #    curved isoparametric elements too). It gives int (dTheta/dx - h_x) dA
    #    = int x (a x + b y) dA = a Iy + b Ixy = Vx; v = y gives Vy. Same quadrature on both
    #    sides, so round-off only: measured <= 1.3e-12 |V| (lipped channel); bound 1e-11 |V|.
    # 2. Nodal stresses (shear_stress) interpolated with the P2 basis: on straight
    #    elements the integral of a P2 field is A_e / 3 times the sum of its mid-side values,
    #    and the nodal gradient is averaged with element-area weights, so the averaged field
    #    integrates exactly like the element fields: measured <= 1.3e-12, bound 1e-11. On
    #    curved elements the Jacobian varies and this is only approximate: measured 1.1e-8
    #    (eccentric tube), bound 5e-8.
    # 3. The field has no torque about the reported elastic shear centre (its definition; this
    #    checks the drawing-coordinate bookkeeping): measured <= 2.5e-16 |V| size, bound 1e-11.
    profile = PROFILES[name]()
    res = analyse(profile, poisson=nu)
    ev, mesh, size = res.basis, res.mesh, profile.size
    centre = np.array(res.shear.shear_centre) - np.array(res.geometric.centroid)
    nodal_tol = 1e-11 if name in STRAIGHT else 5e-8
    for vx, vy in [(1.0, 0.0), (0.0, 1.0), (300.0, -700.0)]:
        V = np.hypot(vx, vy)
        tau = flexure_stress_at_points(res, vx, vy)
        fx, fy, torque = resultants(res, tau[..., 0], tau[..., 1])
        assert abs(fx - vx) < 1e-11 * V and abs(fy - vy) < 1e-11 * V
        assert abs(torque - (centre[0] * vy - centre[1] * vx)) < 1e-11 * V * size
        nodal = nodal_shear(res, vx, vy)
        fx, fy, _ = resultants(res, interpolate(mesh, ev, nodal[:, 0]),
                               interpolate(mesh, ev, nodal[:, 1]))
        assert abs(fx - vx) < nodal_tol * V and abs(fy - vy) < nodal_tol * V


@pytest.mark.parametrize("name", list(PROFILES))
def test_torsion_stress_resultant(name):
    # 1. At the quadrature points, tau = (T / J)(dpsi/dx - y, dpsi/dy + x): its torque about
    #    the centroid is (T / J)(Ip - psi^T f) with f the torsion load, and J = Ip - psi^T f
    #    (section.py), so it is T exactly; its force is (T / J) int grad(psi) dA, and the weak
    #    form with v = x, y gives int dpsi/dx = int y dA = 0, int dpsi/dy = -int x dA = 0
    #    (centroidal). Round-off only. The force is a sum of terms of size (T / J) Ip / size
    #    that cancel (J << Ip for thin walls), so it is measured against that scale F0.
    #    Measured: torque within 3.4e-13 T, force within 1.4e-12 F0 (lipped channel).
    #    Bounds 1e-11 T and 1e-10 F0.
    # 2. The nodal stresses of torsion_stress (averaged gradients), interpolated: on straight
    #    elements the force stays exact as for the flexure field (bound 1e-10 F0); on curved
    #    ones it is approximate (measured 1.2e-8 F0, bound 5e-8 F0). The torque carries the
    #    averaging error, largest near re-entrant corners: measured 1.9e-4 (angle), 1.5e-4
    #    (lipped channel), 2.5e-5 (pentagon), 7.2e-7 (tube) at the default mesh; bound 5e-4,
    #    half the 0.1 % accuracy target of the default mesh. It must fall when the mesh size is
    #    halved (measured factors 8.0, 3.4, 4.3, 16).
    profile = PROFILES[name]()
    T, G = 5.0e5, 26000.0
    size = profile.size
    errors = []
    for factor in (1.0, 0.5):
        h = None if factor == 1.0 else factor * build_mesh(profile).size
        res = analyse(profile, mesh_size=h)
        ev, mesh, tor = res.basis, res.mesh, res.torsion
        F0 = T / tor.J * res.geometric.Ip / size
        x, y = ev.xy[..., 0], ev.xy[..., 1]
        g = gradient(mesh, ev, tor.psi)
        fx, fy, torque = resultants(res, T / tor.J * (g[..., 0] - y), T / tor.J * (g[..., 1] + x))
        assert torque == pytest.approx(T, rel=1e-11)
        assert np.hypot(fx, fy) < 1e-10 * F0
        ts = torsion_stress(res, T, G)
        fx, fy, torque = resultants(res, interpolate(mesh, ev, ts.tau_zx),
                                    interpolate(mesh, ev, ts.tau_zy))
        assert np.hypot(fx, fy) < (1e-10 if name in STRAIGHT else 5e-8) * F0
        errors.append(abs(torque / T - 1.0))
    assert errors[0] < 5e-4
    assert errors[1] < errors[0]


@pytest.mark.parametrize("name", STRAIGHT)
def test_combined_shear_stress_resultant(name):
    # stress.shear_stress adds the torsion field of T and the flexure field of Vx, Vy through
    # the elastic shear centre. Statics: force (Vx, Vy); torque about the centroid
    # T + (moment of V applied at the elastic centre). Force exact as in the two tests above
    # (bound 1e-11 |V| + 1e-10 F0); torque to the nodal-averaging error of the torsion part
    # (bound 5e-4 T, see above).
    profile = PROFILES[name]()
    res = analyse(profile)
    T, vx, vy, G = 2.0e5, 1500.0, -2500.0, 26000.0
    F0 = T / res.torsion.J * res.geometric.Ip / profile.size
    out = shear_stress(res, torque=T, vx=vx, vy=vy, G=G)
    mesh, ev = res.mesh, res.basis
    fx, fy, torque = resultants(res, interpolate(mesh, ev, out.tau_zx),
                                interpolate(mesh, ev, out.tau_zy))
    tol = 1e-11 * np.hypot(vx, vy) + 1e-10 * F0
    assert abs(fx - vx) < tol and abs(fy - vy) < tol
    centre = np.array(res.shear.shear_centre) - np.array(res.geometric.centroid)
    expected = T + centre[0] * vy - centre[1] * vx
    assert abs(torque - expected) < 5e-4 * T
    assert out.twist_rate == pytest.approx(T / (G * res.torsion.J), rel=1e-14)


# ---------------------------------------------------------------------------------------------
# invariance under rotation and translation

MOTIONS = [(30.0, (0.0, 0.0)), (137.0, (250.0, -80.0)), (-71.3, (1.0e4, 2.0e4)),
           (90.0, (0.0, 0.0)), (180.0, (5.0, 5.0))]
SCALARS = ("J", "Cw", "I1", "I2", "A", "kappa_1", "kappa_2", "omega_max")


def scalars(res):
    g, t, s = res.geometric, res.torsion, res.shear
    return {"J": t.J, "Cw": t.Cw, "I1": g.I1, "I2": g.I2, "A": g.A, "kappa_1": s.kappa_1,
            "kappa_2": s.kappa_2, "omega_max": t.omega_max}


def rotation(angle_deg):
    c, s = np.cos(np.radians(angle_deg)), np.sin(np.radians(angle_deg))
    return np.array([[c, -s], [s, c]])


def axis_1(res):
    a = np.radians(res.geometric.alpha_deg)
    return np.array([np.cos(a), np.sin(a)])


def moved_centres(base, R, shift):
    return (R @ np.array(base.torsion.shear_centre) + shift,
            R @ np.array(base.shear.shear_centre) + shift)


@pytest.mark.parametrize("name", list(PROFILES))
def test_invariance_with_moved_mesh(name):
    # Same mesh, moved with the profile: only round-off differs. Measured: shear centres within
    # 4.6e-13 of the size, J within 1.1e-10 (lipped channel, where J = Ip - psi^T f loses
    # about three digits to cancellation), all other scalars within 1.3e-12; bound 1e-9 (issue
    # acceptance). The Wagner constants refer to the principal axes, whose sense may flip
    # with the rotation (alpha is reported in (-90, 90]): with axis 1 reversed, both change
    # sign. Compared with that sign, within 1e-9 of the size.
    profile = PROFILES[name]()
    mesh = build_mesh(profile)
    base = analyse(profile, mesh=mesh)
    ref = scalars(base)
    size = profile.size
    for angle_deg, shift in MOTIONS:
        R, shift = rotation(angle_deg), np.asarray(shift)
        moved = Mesh(mesh.nodes @ R.T + shift, mesh.elements, mesh.region, mesh.size)
        res = analyse(profile.moved(angle_deg=angle_deg, shift=tuple(shift)), mesh=moved)
        trefftz, elastic = moved_centres(base, R, shift)
        assert np.hypot(*(np.array(res.torsion.shear_centre) - trefftz)) < 1e-9 * size
        assert np.hypot(*(np.array(res.shear.shear_centre) - elastic)) < 1e-9 * size
        got = scalars(res)
        for key in SCALARS:
            assert got[key] == pytest.approx(ref[key], rel=1e-9), key
        sense = float(np.sign(axis_1(res) @ (R @ axis_1(base))))
        assert abs(res.torsion.beta_1 - sense * base.torsion.beta_1) < 1e-9 * size
        assert abs(res.torsion.beta_2 - sense * base.torsion.beta_2) < 1e-9 * size


@pytest.mark.parametrize("name", list(PROFILES))
def test_invariance_with_new_mesh(name):
    # Fresh mesh of the moved profile (a different triangulation): the values agree to the
    # discretisation error of the default mesh. Measured largest differences over the motions:
    # shear centres 2.4e-5 of the size (pentagon), J 2.0e-4 (angle), Cw 6.6e-5 (tube),
    # kappa_1, kappa_2 2.1e-4 (pentagon). Each value is within the 0.1 % target of the default
    # mesh, so a difference of two could reach 2e-3; the bounds are set nearer the measured:
    # 1e-4 of the size for the centres, 5e-4 for J, Cw and kappa.
    # The area properties are integrated exactly on a polygon whatever the triangulation (and
    # the tube's boundary nodes are its polygon's vertices both times): A, I1, I2 measured
    # within 4e-13; bound 1e-11.
    profile = PROFILES[name]()
    base = analyse(profile)
    ref = scalars(base)
    size = profile.size
    bounds = {"J": 5e-4, "Cw": 5e-4, "kappa_1": 5e-4, "kappa_2": 5e-4, "A": 1e-11,
              "I1": 1e-11, "I2": 1e-11}
    for angle_deg, shift in MOTIONS:
        R, shift = rotation(angle_deg), np.asarray(shift)
        res = analyse(profile.moved(angle_deg=angle_deg, shift=tuple(shift)))
        trefftz, elastic = moved_centres(base, R, shift)
        assert np.hypot(*(np.array(res.torsion.shear_centre) - trefftz)) < 1e-4 * size
        assert np.hypot(*(np.array(res.shear.shear_centre) - elastic)) < 1e-4 * size
        got = scalars(res)
        for key, bound in bounds.items():
            assert got[key] == pytest.approx(ref[key], rel=bound), key


@pytest.mark.parametrize("angle_deg", [30.0, 137.0])
def test_rotated_symmetric_profile_keeps_centre_on_axis(angle_deg):
    # A mirror-symmetric profile turned to an oblique angle is still meshed by halves about
    # its (now inclined) axis, so both shear centres lie on the turned axis to round-off
    # (common practice, no source: the shear centre lies on every axis of symmetry).
    # Measured <= 2.0e-13 of the size; bound 1e-12.
    profile = PROFILES["lipped channel"]().moved(angle_deg=angle_deg, shift=(3.0, 4.0))
    res = analyse(profile)
    a = np.radians(angle_deg)
    normal = np.array([-np.sin(a), np.cos(a)])
    centroid = np.array(res.geometric.centroid)
    for centre in (res.torsion.shear_centre, res.shear.shear_centre):
        assert abs((np.array(centre) - centroid) @ normal) < 1e-12 * profile.size


def nodal_shear(res, vx, vy):
    """Nodal (tau_zx, tau_zy) (n, 2) of the public stress recovery for Vx, Vy."""
    s = shear_stress(res, 0.0, vx, vy)
    return np.column_stack([s.tau_zx, s.tau_zy])
