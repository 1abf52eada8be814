"""Invariants of the section properties over random valid profiles (property-based, hypothesis).

Profiles: star-shaped polygons with random radii (simple by construction: one vertex per
direction, equally spaced), the same with a shrunk, shifted star as a hole, and the parametric
shapes of ``warpwise.shapes.SHAPES`` with every dimension of their example spec scaled by a
random factor in [0.7, 1.3] (combinations a shape refuses are skipped).

Checked, each against the fact named beside it:

- bounds and orderings that hold for the finite-element solution itself: J > 0, J <= Ix + Iy,
  Cw >= 0, I1 >= I2 and Mohr's circle invariants;
- rigid motions (rotation about the origin, then a shift): with the mesh moved alike the
  arithmetic is the same, so A, I1, I2, J, Cw agree to round-off and the centroid and shear
  centre move with the profile; with a fresh mesh of the moved profile A, I1, I2 and the
  centroid of a polygon still agree to round-off (the mesh covers the same polygon exactly and
  every integrand is a polynomial the quadrature integrates exactly; 3e-7 where the mesh follows
  arcs), J, Cw and the shear centre to the discretisation error (tolerances measured, see
  ``REMESH_*``);
- scaling by s (mesh scaled alike): A ~ s^2, I and J ~ s^4, Cw ~ s^6, points ~ s;
- a profile mirror-symmetric about a line parallel to x has its shear centre on that line and
  Ixy = 0 (round-off: the mesher meshes one half and mirrors it; to the discretisation error
  with an unsymmetric mesh);
- the torsion stresses recovered at the quadrature points carry exactly the applied torque and
  no net force.

Round-off tolerances (``ROUND_OFF``, ``SOLVE_ROUND_OFF``) sit 5 and 80 times above the worst
values measured over about a thousand random cases (2e-13 for the geometric sums, 1.2e-11 for
values from the warping solve), so that an error beyond round-off shows.
"""

import os

import numpy as np
import pytest
from hypothesis import HealthCheck, assume, given, settings
from hypothesis import strategies as st

from warpwise.errors import ProfileError
from warpwise.fem.p2 import gradient
from warpwise.geometry.profile import profile_from_loops
from warpwise.geometry.shapes import SHAPE_KINDS, shape_from_spec
from warpwise.mesh.core import Mesh, build_mesh
from warpwise.properties.analysis import analyse

# Few examples per test and the same ones every run in CI; WARPWISE_INVARIANT_EXAMPLES=N runs N
# random examples per test instead (a longer search, e.g. before a release).
_LONG = os.environ.get("WARPWISE_INVARIANT_EXAMPLES")
FAST = settings(max_examples=int(_LONG) if _LONG else 30, deadline=None, derandomize=not _LONG,
                database=None,
                suppress_health_check=[HealthCheck.too_slow, HealthCheck.filter_too_much])

#: Round-off bounds, relative. Geometric integrals are plain quadrature sums (measured worst
#: 2e-13). Values from the warping solve carry its round-off, eps times the condition number of
#: K, which is 1e6 or more for thin walls with many elements (measured worst 1.2e-11, Cw of a
#: Z-shape of t = 1.4 mm rotated by 1 degree); J = Ip - f.psi (section.py) also
#: loses digits to cancellation when J << Ip (J/Ip is 1e-4 for the Z-shape), so J's round-off is
#: taken relative to Ip.
ROUND_OFF = 1e-12
SOLVE_ROUND_OFF = 1e-9

# Re-meshed J, Cw and shear centre differ by the discretisation error of two different meshes.
# DESIGN.md's target puts each value within 0.1% of the converged one at the default mesh, so
# two meshes may differ by 0.2%. Measured over 300 random cases of these strategies (default
# mesh, random rotation and shift): J 5.9e-4 (a channel), shear centre 4.4e-5 of the size (a
# holed star). Cw misses the target for near-circular sections, whose Cw is small (the hexagon
# is 1.1% off at the default mesh, see test_hexagon_cw_meets_the_accuracy_target); its error is
# better bounded in absolute terms: measured at most 8e-6 Ip^2/A at the default mesh (hexagon),
# so two meshes differ by at most 2e-5 Ip^2/A. Ip^2/A <= int r^4 dA (Cauchy-Schwarz) is the
# size Cw would have if the warping were as large as r^2 everywhere.
REMESH_J = 2e-3
REMESH_CW = 2e-3
REMESH_CW_FLOOR = 2e-5
REMESH_POINT = 2e-3


def star_loop(radii, phase=0.0, centre=(0.0, 0.0)):
    """Vertices at equally spaced angles, one per radius: a simple, star-shaped polygon."""
    radii = np.asarray(radii, dtype=float)
    t = phase + 2.0 * np.pi * np.arange(len(radii)) / len(radii)
    return np.column_stack([centre[0] + radii * np.cos(t), centre[1] + radii * np.sin(t)])


def fractions(n, lo, hi):
    return st.lists(st.floats(lo, hi), min_size=n, max_size=n)


@st.composite
def stars(draw):
    n = draw(st.integers(5, 11))
    size = draw(st.floats(1.0, 100.0))
    radii = size * np.array(draw(fractions(n, 0.3, 1.0)))
    phase = draw(st.floats(0.0, 2.0 * np.pi))
    return profile_from_loops([star_loop(radii, phase)], source=f"star R={size:.4g} n={n}")


@st.composite
def holed_stars(draw):
    # With n >= 5 equally spaced vertices the outer star contains the disc of radius
    # 0.809 min(radii) (cos 36 deg; the distance from the centre to a chord between radii r1
    # and r2 is at least min(r1, r2) min(cos(dt/2), sin(dt))); the hole stays within 0.55 of
    # min(radii), so the wall is at least a quarter of the smallest radius.
    n, m = draw(st.integers(5, 11)), draw(st.integers(5, 9))
    size = draw(st.floats(1.0, 100.0))
    outer = size * np.array(draw(fractions(n, 0.6, 1.0)))
    rmin = float(outer.min())
    inner = 0.45 * rmin * np.array(draw(fractions(m, 0.4, 1.0)))
    off = 0.1 * rmin * np.array(draw(fractions(2, -1.0, 1.0))) / np.sqrt(2.0)
    loops = [star_loop(outer, draw(st.floats(0.0, 2 * np.pi))),
             star_loop(inner, draw(st.floats(0.0, 2 * np.pi)), tuple(off))]
    return profile_from_loops(loops, source=f"holed star R={size:.4g} n={n} m={m}")


def _example_values(kind):
    spec = kind.example.partition(":")[2]
    return {k: float(v) for k, v in (item.split("=") for item in spec.split(","))}


@st.composite
def parametric(draw):
    name = draw(st.sampled_from(sorted(SHAPE_KINDS)))
    kind = SHAPE_KINDS[name]
    values = {k: v * draw(st.floats(0.7, 1.3)) for k, v in _example_values(kind).items()}
    try:
        return kind.function(**values)
    except ProfileError:  # an impossible combination (a radius that does not fit...)
        assume(False)


profiles = st.one_of(stars(), holed_stars(), parametric())
motions = st.tuples(st.floats(0.0, 360.0), st.floats(-10.0, 10.0), st.floats(-10.0, 10.0))


def moved_mesh(mesh, angle_deg=0.0, shift=(0.0, 0.0), scale=1.0):
    """The mesh under the map of ``Profile.moved`` (rotate, scale, shift)."""
    c, s = np.cos(np.radians(angle_deg)), np.sin(np.radians(angle_deg))
    rot = np.array([[c, -s], [s, c]]) * scale
    return Mesh(mesh.nodes @ rot.T + np.asarray(shift, dtype=float), mesh.elements, mesh.region,
                mesh.size * scale)


def rotate(point, angle_deg, shift=(0.0, 0.0)):
    c, s = np.cos(np.radians(angle_deg)), np.sin(np.radians(angle_deg))
    return np.array([[c, -s], [s, c]]) @ np.asarray(point) + np.asarray(shift)


def cw_scale(res):
    """Ip^2 / A, the natural size of Cw (L^6)."""
    return res.geometric.Ip ** 2 / res.geometric.A


def close(a, b, rtol, scale=None):
    """|a - b| <= rtol * scale (default max(|a|, |b|))."""
    ref = max(abs(a), abs(b)) if scale is None else scale
    return abs(a - b) <= rtol * ref


def max_moment(g, key):
    """Scale of a geometric quantity for a round-off comparison (I1 for any second moment)."""
    return g.A if key == "A" else g.I1


def near(p, q, atol):
    """Points p and q at most atol apart."""
    return float(np.hypot(*(np.asarray(p, dtype=float) - np.asarray(q, dtype=float)))) <= atol


# ---------------------------------------------------------------------------------------------
# bounds that hold for the discrete solution


def check_bounds(profile):
    res = analyse(profile)
    g, t = res.geometric, res.torsion
    # J = Ix + Iy - psi^T K psi (DESIGN.md, torsion) with K positive semi-definite: 0 < J <= Ip
    # for the finite-element psi too; equality only for a circle (psi = 0), hence round-off.
    assert t.J > 0
    assert t.J <= (g.Ix + g.Iy) * (1 + 1e-12)
    # Cw is a quadrature sum of omega^2 with positive weights: never negative.
    assert t.Cw >= 0
    # principal moments: ordering, and the invariants of Mohr's circle (trace and determinant
    # of the second-moment tensor; common practice, no source)
    assert g.I1 >= g.I2 > 0
    assert close(g.I1 + g.I2, g.Ix + g.Iy, ROUND_OFF)
    assert close(g.I1 * g.I2, g.Ix * g.Iy - g.Ixy ** 2, ROUND_OFF, scale=g.I1 ** 2)
    assert close(g.Ip, g.Ix + g.Iy, ROUND_OFF)
    if not profile.arcs:
        # straight-sided elements cover the polygon exactly: the area is the polygon's
        assert close(g.A, profile.area, ROUND_OFF)


@FAST
@given(profiles)
def test_bounds_and_principal_moments(profile):
    check_bounds(profile)


# ---------------------------------------------------------------------------------------------
# rigid motions


@FAST
@given(profiles, motions)
def test_rigid_motion_with_the_mesh_moved_alike(profile, motion):
    # Section properties are properties of the shape (common practice, no source). With the
    # same mesh moved, every integral is the same sum up to round-off.
    angle, sx, sy = motion
    shift = (sx * profile.size, sy * profile.size)
    a = analyse(profile)
    b = analyse(profile.moved(angle_deg=angle, shift=shift),
                mesh=moved_mesh(a.mesh, angle, shift))
    ga, gb, ta, tb = a.geometric, b.geometric, a.torsion, b.torsion
    for key in ("A", "I1", "I2", "Ip"):
        # I2 comes from I1 + I2 and the radius of Mohr's circle: round-off relative to I1
        assert close(getattr(ga, key), getattr(gb, key), ROUND_OFF, scale=max_moment(ga, key)), key
    assert close(ta.J, tb.J, SOLVE_ROUND_OFF, scale=ga.Ip)
    assert close(ta.Cw, tb.Cw, SOLVE_ROUND_OFF, scale=ta.Cw + SOLVE_ROUND_OFF * cw_scale(a))
    # points: round-off relative to the largest coordinate involved
    reach = profile.size + np.hypot(*shift)
    assert near(rotate(ga.centroid, angle, shift), gb.centroid, ROUND_OFF * reach)
    moved = rotate(ta.shear_centre, angle, shift)
    assert near(moved, tb.shear_centre, SOLVE_ROUND_OFF * reach)


def check_remeshed(profile, angle, shift):
    a = analyse(profile)
    b = analyse(profile.moved(angle_deg=angle, shift=shift))
    ga, gb, ta, tb = a.geometric, b.geometric, a.torsion, b.torsion
    # A, I1, I2 of a polygon: straight-sided elements integrate x^2, x y, y^2 exactly, so any
    # mesh of the polygon gives the same sums up to round-off. Where the mesh follows arcs, the
    # quadratic edges through three points of each circle miss a sliver of the curve, at most
    # 1.4e-7 of the area properties (shapes.ARC_SAGITTA), and two meshes may split the arcs
    # differently (a symmetric profile is cut on its axis): 3e-7 apart at most.
    tol = ROUND_OFF if not profile.arcs else 3e-7
    for key in ("A", "I1", "I2"):
        assert close(getattr(ga, key), getattr(gb, key), tol, scale=max_moment(ga, key)), key
    reach = profile.size + np.hypot(*shift)
    moved = rotate(ga.centroid, angle, shift)
    assert near(moved, gb.centroid, ROUND_OFF * reach + (tol - ROUND_OFF) * profile.size)
    # J, Cw, shear centre: discretisation error of two meshes (see REMESH_*)
    assert close(ta.J, tb.J, REMESH_J)
    assert abs(ta.Cw - tb.Cw) <= REMESH_CW * max(ta.Cw, tb.Cw) + REMESH_CW_FLOOR * cw_scale(a)
    moved = rotate(ta.shear_centre, angle, shift)
    assert near(moved, tb.shear_centre, REMESH_POINT * profile.size)


@FAST
@given(profiles, motions)
def test_rigid_motion_remeshed(profile, motion):
    angle, sx, sy = motion
    check_remeshed(profile, angle, (sx * profile.size, sy * profile.size))


@pytest.mark.parametrize("name", sorted(SHAPE_KINDS))
def test_every_shape_kind(name):
    # the random search favours some shapes; here every one of SHAPES is seen once (its
    # example spec), for the bounds and a re-meshed rigid motion
    profile = shape_from_spec(SHAPE_KINDS[name].example)
    check_bounds(profile)
    check_remeshed(profile, 33.0, (3.0 * profile.size, -2.0 * profile.size))


# ---------------------------------------------------------------------------------------------
# scaling


@FAST
@given(profiles, st.floats(-3.0, 3.0))
def test_scaling_with_the_mesh_scaled_alike(profile, log_s):
    # Dimensions: A ~ L^2, I and J ~ L^4, Cw ~ L^6, points ~ L (common practice, no source).
    s = 10.0 ** log_s
    a = analyse(profile)
    b = analyse(profile.moved(scale=s), mesh=moved_mesh(a.mesh, scale=s))
    ga, gb, ta, tb = a.geometric, b.geometric, a.torsion, b.torsion
    assert close(gb.A, s ** 2 * ga.A, ROUND_OFF)
    for key in ("Ix", "Iy", "I1", "I2", "Ip"):
        assert close(getattr(gb, key), s ** 4 * getattr(ga, key), ROUND_OFF,
                     scale=s ** 4 * max_moment(ga, key)), key
    assert close(gb.Ixy, s ** 4 * ga.Ixy, ROUND_OFF, scale=s ** 4 * ga.Ip)
    assert close(tb.J, s ** 4 * ta.J, SOLVE_ROUND_OFF, scale=s ** 4 * ga.Ip)
    assert close(tb.Cw, s ** 6 * ta.Cw, SOLVE_ROUND_OFF,
                 scale=s ** 6 * (ta.Cw + SOLVE_ROUND_OFF * cw_scale(a)))
    assert near(s * np.asarray(ga.centroid), gb.centroid, ROUND_OFF * s * profile.size)
    moved = s * np.asarray(ta.shear_centre)
    assert near(moved, tb.shear_centre, SOLVE_ROUND_OFF * s * profile.size)


# ---------------------------------------------------------------------------------------------
# mirror symmetry


@st.composite
def symmetric_stars(draw):
    """A star symmetric about the x axis: the vertices below it mirror those above exactly."""
    half = draw(st.integers(2, 5))  # vertices at 0, dt, ..., on or above the axis
    size = draw(st.floats(1.0, 100.0))
    odd = draw(st.booleans())  # odd number of vertices: none at angle pi
    n = 2 * half - 1 if odd else 2 * half
    r = size * np.array(draw(fractions(half + 1, 0.3, 1.0)))
    t = 2.0 * np.pi * np.arange(half + 1) / n
    upper = np.column_stack([r * np.cos(t), r * np.sin(t)])[: half if odd else half + 1]
    upper[0, 1] = 0.0
    if not odd:
        upper[-1, 1] = 0.0
    lower = upper[1 : half][::-1] * np.array([1.0, -1.0])
    x_off = size * draw(st.floats(-5.0, 5.0))
    loop = np.vstack([upper, lower]) + np.array([x_off, 0.0])
    return profile_from_loops([loop], source=f"symmetric star R={size:.4g} n={n}")


@FAST
@given(symmetric_stars())
def test_mirror_symmetric_shear_centre_on_the_axis(profile):
    # A section symmetric about an axis has its shear centre and centroid on that axis and no
    # product of inertia about it (common practice, no source).
    res = analyse(profile)
    # the mesher meshes one half and mirrors it, so this holds to round-off
    assert close(res.torsion.shear_centre[1], 0.0, SOLVE_ROUND_OFF, scale=profile.size)
    assert close(res.geometric.centroid[1], 0.0, ROUND_OFF, scale=profile.size)
    assert close(res.geometric.Ixy, 0.0, ROUND_OFF, scale=res.geometric.Ip)
    # on an unsymmetric mesh of the same profile: to the discretisation error (DESIGN.md target,
    # 0.1% of the largest dimension at the default mesh); the centroid still to round-off
    plain = analyse(profile, mesh=build_mesh(profile, use_symmetry=False))
    assert close(plain.torsion.shear_centre[1], 0.0, 1e-3, scale=profile.size)
    assert close(plain.geometric.centroid[1], 0.0, ROUND_OFF, scale=profile.size)


# ---------------------------------------------------------------------------------------------
# torsion stresses carry the torque


@FAST
@given(profiles, st.floats(-1e6, 1e6).filter(lambda t: abs(t) > 1e-3))
def test_torsion_stress_resultant_is_the_torque(profile, torque):
    # Statics (common practice, no source): the shear stresses of pure torsion add up to the
    # torque and to no force. With tau = (T/J)(dpsi/dx - y, dpsi/dy + x) (stress.py, centroidal
    # x, y) at the quadrature points, int (x tau_zy - y tau_zx) dA = (T/J)(Ip - f.psi) where
    # f.psi = int (y dpsi/dx - x dpsi/dy) dA is the same quadrature sum that section.py uses
    # for J = Ip - f.psi: the torque is T to round-off (on straight-sided elements the integrand
    # has degree 2, within the degree-4 rule, so the sum is also the exact integral). The force
    # (T/J) int (dpsi/dx - y) dA is zero by the weak form tested with v = x and v = y (both in
    # the P2 space) and int x dA = int y dA = 0: zero up to the solve's backward error. Both
    # sums cancel terms of size (T/J) Ip, so their round-off is relative to that.
    res = analyse(profile)
    ev, J = res.basis, res.torsion.J
    g = gradient(res.mesh, ev, res.torsion.psi)
    x, y = ev.xy[..., 0], ev.xy[..., 1]
    tzx = torque / J * (g[..., 0] - y)
    tzy = torque / J * (g[..., 1] + x)
    T = float(np.sum(ev.dA * (x * tzy - y * tzx)))
    scale = abs(torque) * res.geometric.Ip / J
    assert close(T, torque, ROUND_OFF, scale=scale)
    # a force F at a lever arm of the size would be a torque F * size
    fx, fy = float(np.sum(ev.dA * tzx)), float(np.sum(ev.dA * tzy))
    assert close(np.hypot(fx, fy) * profile.size, 0.0, SOLVE_ROUND_OFF, scale=scale)


# ---------------------------------------------------------------------------------------------
# found while measuring the re-meshing tolerance (a defect until the obtuse corners were graded)


def test_hexagon_cw_meets_the_accuracy_target():
    from warpwise.geometry.shapes import hexagon

    p = hexagon(24.0)
    # DESIGN.md target: Cw within 0.1% of the converged value at the default mesh; reference
    # from refine=8. Measured -7.2e-4 with the mesh graded towards the 120 degree corners
    # (+1.1e-2 on a uniform mesh: the warping function goes as r^1.5 there)
    coarse, fine = analyse(p).torsion.Cw, analyse(p, refine=8).torsion.Cw
    assert abs(coarse / fine - 1) <= 1e-3
