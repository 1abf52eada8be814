"""Adaptive refinement towards a requested accuracy of J, and sharp against filleted corners.

The L-shape (legs 40, wall 8) has one re-entrant corner of 270 degrees, where the warping
function carries an r^(2/3) term and the shear stress grows as r^(-1/3) (the exponent pi /
alpha - 1; Timoshenko & Goodier, Theory of Elasticity, ch. 10, from memory, and Roark's
Formulas for Stress and Strain, torsion table notes on re-entrant corners and fillets, from
memory). Uniform refinement of the mesher's graded mesh converges towards the singular rate
(see test_torsion_bounds); adaptive refinement should reach a tight tolerance on J with fewer
nodes, and certify it by the guaranteed bracket J_low <= J <= J_up.

A sharp corner must be flagged, its stress reported separately and seen to grow without limit
under refinement; with an inside fillet the stress is finite and must converge.
"""

from functools import cache

import numpy as np
import pytest

from warpwise.geometry.corners import reentrant_corners
from warpwise.geometry.profile import Arc, profile_from_loops
from warpwise.geometry.shapes import tube
from warpwise.properties.adapt import refine_adaptively
from warpwise.properties.analysis import analyse
from warpwise.stress import torsion_stress

LEG, WALL = 40.0, 8.0
TORQUE, G = 1.0e5, 26_000.0  # N mm and MPa (tau does not depend on G)

L_SHAPE = profile_from_loops([[(0, 0), (LEG, 0), (LEG, WALL), (WALL, WALL), (WALL, LEG), (0, LEG)]],
                             source="sharp L 40 x 40 x 8")


def filleted_l(radius: float, step_deg: float = 2.0):
    """The L-shape with an inside fillet of ``radius`` (arc points every ``step_deg``).

    The arc is tangent to both inner faces, centre (t + r, t + r); the loop runs through it
    from angle 270 to 180 degrees, and the Arc record lets the mesh put its boundary nodes on
    the true circle.
    """
    n = int(round(90.0 / step_deg))
    cx = cy = WALL + radius
    ang = np.radians(270.0 - np.arange(n + 1) * 90.0 / n)
    arc = np.column_stack([cx + radius * np.cos(ang), cy + radius * np.sin(ang)])
    pts = np.vstack([[(0, 0), (LEG, 0), (LEG, WALL)], arc, [(WALL, LEG), (0, LEG)]])
    return profile_from_loops([pts], source=f"L with fillet r={radius:g}",
                              arcs=[Arc(cx, cy, radius, np.pi, np.pi / 2.0)])


FILLET = WALL / 2.0


@cache
def stressed(which: str, refine: float):
    """(result, torsion stress) of the sharp or the filleted L at one refinement (cached)."""
    profile = L_SHAPE if which == "sharp" else filleted_l(FILLET)
    res = analyse(profile, refine=refine)
    return res, torsion_stress(res, TORQUE, G)


#: Uniform refinement factors tried in turn (steps of 2^(1/4) in size).
UNIFORM = [2.0 ** (k / 4.0) for k in range(11)]


@pytest.fixture(scope="module")
def reference():
    """J of the L-shape to about 5e-7: the midpoint of a guaranteed bracket of width 9.8e-7.

    The bracket comes from an adaptive run to 1e-6 (7.6k nodes). Its two sides are the
    warping solution and the equilibrated-flux lower bound, whose bracketing is checked against
    closed forms in test_torsion_bounds; as an independent cross-check the value must also lie in the
    bracket of a different (uniform, refine 4, 8.7k nodes) mesh, 2.2e-5 wide.
    """
    run = refine_adaptively(L_SHAPE, 1e-6)
    t = run.result.torsion
    value, half = 0.5 * (t.J + t.J_low), 0.5 * (t.J - t.J_low) / t.J_low
    assert half < 5e-7
    other = analyse(L_SHAPE, refine=4.0, bounds=True).torsion
    assert other.J_low < value < other.J
    return value, half


@pytest.fixture(scope="module")
def uniform_sweep(reference):
    """(refine, nodes, true relative error of J) along UNIFORM, until below every TOLERANCES."""
    ref, _ = reference
    out = []
    for r in UNIFORM:
        res = analyse(L_SHAPE, refine=r)
        out.append((r, res.mesh.n_nodes, abs(res.torsion.J / ref - 1.0)))
        if out[-1][2] < min(TOLERANCES):
            break
    return out


def first_uniform(sweep, tolerance):
    """Nodes of the first uniform mesh whose true error is below ``tolerance``."""
    for _, nodes, err in sweep:
        if err < tolerance:
            return nodes
    raise AssertionError(f"uniform refinement did not reach {tolerance} in {sweep}")


# Measured (reference J = 11724.42482; the stopping bound is the equilibrated-flux bracket).
# The default mesh (0.0625 sqrt(A), right-angled corners graded, sharp corners at 0.02 of the
# local size) already has 2.0e-5 at 3105 nodes, so a tolerance of 1e-4 (the loosest once
# asked here) is met by the first mesh and shows nothing about adaptivity; the tolerances are
# those the default mesh misses:
#   1e-5: adaptive 2 steps, 3741 nodes, true error 7.2e-6, bound 8.3e-6; uniform first below
#         1e-5 at refine 1.41, 5409 nodes (7.1e-6). Saving 1.45x.
#   5e-6: adaptive 3 steps, 4941 nodes, true 2.7e-6, bound 3.2e-6; uniform first below 5e-6 at
#         refine 1.68, 6927 nodes (4.8e-6). Saving 1.40x.
#   (With the earlier default, 0.125 sqrt(A), right angles ungraded, sharp corners at 0.05:
#   1e-4 in 3 steps, 1829 nodes against uniform 2265; 1e-5 in 5 steps, 3085 nodes against
#   6713. The stronger grading of the default mesh leaves adaptivity less to win.)
# The recovered-gradient indicator still steers the refinement: the flux bound's element
# indicators (whose sum is the bracket width) were tried in its place on the earlier default
# mesh and gave 1353 and 3717 nodes, 0.74x and 1.2x the adaptive counts then, and as mixed a
# picture on an angle, a hollow square, a rectangle and a thin box (0.77x ... 1.53x), so the
# switch was not made.
# Bounds: the reference's own uncertainty (5e-7) is allowed on top of the tolerance; saving
# asserted as measured minus a margin, 1.3x.
TOLERANCES = (1e-5, 5e-6)


@pytest.mark.parametrize("tolerance, saving", [(1e-5, 1.3), (5e-6, 1.3)])
def test_adaptive_beats_uniform(reference, uniform_sweep, tolerance, saving):
    ref, half = reference
    run = refine_adaptively(L_SHAPE, tolerance)
    J = run.result.torsion.J
    true = abs(J / ref - 1.0)
    assert run.estimate <= tolerance
    assert true <= tolerance + half, (true, run.history)
    # the guaranteed bound is honest: it covers the true error (J is the upper side)
    assert J >= ref * (1.0 - half) and true <= run.estimate + half
    nodes = run.result.mesh.n_nodes
    uniform = first_uniform(uniform_sweep, tolerance)
    assert uniform >= saving * nodes, (nodes, uniform, uniform_sweep)


# ---------------------------------------------------------------------------------------------
# sharp and filleted re-entrant corners

def corner_element_size(mesh):
    """Length of the shortest element edge that ends at the sharp corner (WALL, WALL)."""
    k = int(np.argmin(np.hypot(mesh.nodes[:, 0] - WALL, mesh.nodes[:, 1] - WALL)))
    tri = mesh.elements[np.any(mesh.elements[:, :3] == k, axis=1), :3]
    others = tri[tri != k]
    return float(np.hypot(*(mesh.nodes[others] - mesh.nodes[k]).T).min())


def test_sharp_corner_flagged_and_stress_grows():
    corners = reentrant_corners(L_SHAPE)
    assert [(c.x, c.y, round(c.angle_deg, 9)) for c in corners] == [(WALL, WALL, 270.0)]
    assert corners[0].exponent == pytest.approx(-1.0 / 3.0)
    at_corner, top, sizes = [], [], []
    for r in (1.0, 2.0, 4.0):
        res, st = stressed("sharp", r)
        assert len(st.corners) == 1
        c = st.corners[0]
        assert (c.corner.x, c.corner.y) == (WALL, WALL) and c.excluded_radius > 0
        # the reported maximum is taken outside the excluded disc
        assert np.hypot(st.tau_max_at[0] - WALL, st.tau_max_at[1] - WALL) > c.excluded_radius
        at_corner.append(c.tau_at_corner)
        top.append(st.tau_max)
        sizes.append(corner_element_size(res.mesh))
    # The nodal value at the corner follows h_corner^(-1/3), h_corner the size of the elements
    # touching the corner (the mesher shrinks it as h^2 under refinement). Measured growth
    # exponents log(tau ratio) / log(h_corner ratio) are printed on failure; bound 0.02
    # around the theoretical -1/3 (the deviation measured is below 0.005).
    p = np.diff(np.log(at_corner)) / np.diff(np.log(sizes))
    assert np.all(np.abs(p + 1.0 / 3.0) < 0.02), (p, at_corner)
    # The maximum reported away from the corner converges: 71.832, 71.911, 71.923 MPa. The
    # excluded disc is half the wall (4 mm, geometry/corners.py), and the maximum outside it is
    # on the outer face opposite the corner (8.00 to 8.02 mm from it), a smooth boundary where
    # the field is regular: 0.13 % spread measured, 0.5 % allowed. (With a tenth of the wall
    # it was the stress at the first nodes beyond 0.8 mm, inside the singular zone: 88.47,
    # 90.48, 90.00 MPa, moving with where those nodes fell.)
    assert (max(top) - min(top)) / min(top) < 0.005, top
    x, y = st.tau_max_at
    assert min(abs(x), abs(y)) < 1e-9  # on an outer face
    assert at_corner[-1] > 4.0 * max(top)


# Measured peak tau (MPa) of the L with fillet r = t / 2 = 4 at refine 0.5, 1, 2, 4, 8:
# 98.808, 99.048, 99.068, 99.074, 99.066 (nodes 823 ... 32.6k): successive changes 2.4e-3,
# 2.0e-4, 6.6e-5, -8.1e-5. The last two show a jitter of about 1e-4 from where the nodes fall
# on the fillet (the peak moves between neighbouring nodes on the arc). Bound between refine 2
# and 4: 5e-4 (the issue asked for 2%; the measured change is 300 times smaller), and the
# change from 1 to 2 must also be small (2e-4 measured, 5e-4 allowed). Roark's torsion table
# gives the fillet's concentration formula for an L-section (from memory, not used: its
# coefficients are not reliably remembered here); a finite, converging peak is the check.
def test_filleted_corner_peak_converges():
    radius = FILLET
    assert reentrant_corners(filleted_l(radius)) == []  # 2-degree steps: 182-degree vertices
    peaks = []
    for r in (1.0, 2.0, 4.0):
        _, st = stressed("fillet", r)
        assert st.corners == []
        peaks.append(st.tau_max)
        # the peak sits on the fillet (its node on the true circle, the mesh follows the arc)
        dist = np.hypot(st.tau_max_at[0] - (WALL + radius), st.tau_max_at[1] - (WALL + radius))
        assert dist == pytest.approx(radius, rel=1e-9)
    change = np.abs(np.diff(peaks)) / np.array(peaks[1:])
    assert np.all(change < 5e-4), (peaks, change)


def test_sharp_peak_exceeds_fillet_peak_at_same_refinement():
    # The fillet removes the singularity: at refine 4 the sharp corner's node carries 414 MPa,
    # the filleted section's peak is 99.07 MPa (common practice, no source: the reason fillets
    # are specified). Checked at one refinement (both results are those of the tests above).
    sharp = stressed("sharp", 4.0)[1].corners[0].tau_at_corner
    fillet = stressed("fillet", 4.0)[1].tau_max
    assert sharp > 4.0 * fillet


def test_arc_vertices_are_not_sharp_corners():
    # A tube of 32 segments per circle with curved element edges: the inner loop's vertices
    # have interior angles of 191.25 degrees on the material side, but they lie on a recorded
    # Arc, so the boundary is smooth (common practice, no source). Measured: 32 corners found;
    # the mesh is then graded towards all 32 (6472 nodes at refine 0.5 against 664 for the
    # same tube with 64 segments) and the stress report excludes 32 discs on the inner wall.
    # Fixed: vertices on a recorded arc are not corners.
    assert reentrant_corners(tube(40.0, 30.0, segments=32)) == []
