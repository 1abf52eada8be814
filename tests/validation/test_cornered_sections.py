"""J at the default and the fine mesh on sections with sharp re-entrant corners or fillets.

At a sharp re-entrant corner the warping function carries an r^(2/3) term (Timoshenko &
Goodier, Theory of Elasticity, ch. 10, from memory), at a right-angled convex corner an
r^2 log r term, and a fillet needs its curvature resolved; the mesher grades towards all of
them. DESIGN.md's targets: 1e-3 at the default mesh, 1e-5 at ``--accuracy fine`` (refine 2).

No closed form exists for these sections. The reference is a certificate instead of a value:
the midpoint of a guaranteed bracket J_low <= J <= J_up (the minimum principles of potential
and complementary energy, e.g. Washizu, Variational Methods in Elasticity and Plasticity,
from memory; the bracket is checked against closed forms in test_torsion_bounds), narrowed by
adaptive refinement to a half-width under 5e-7 on meshes of its own. The exact J lies within
that half-width of the midpoint whatever the meshes, so the check does not rest on trusting a
fine mesh.
"""

from functools import cache

import pytest
from test_adaptive_and_corners import FILLET, L_SHAPE, filleted_l

from warpwise.geometry.shapes import angle, channel, i_beam
from warpwise.properties.adapt import refine_adaptively
from warpwise.properties.analysis import analyse

SECTIONS = {
    "sharp L 40x40x8": lambda: L_SHAPE,
    "L 40x40x8, inside fillet 4": lambda: filleted_l(FILLET),
    "sharp channel 100x50, web 5, flanges 8": lambda: channel(100.0, 50.0, 5.0, 8.0),
    "I 200x100, web 5.6, flanges 8.5, root fillets 12": lambda: i_beam(200.0, 100.0, 5.6, 8.5, 12.0),
    "sharp angle 60x40x5": lambda: angle(60.0, 40.0, 5.0),
    "angle 60x40x5, root fillet 6, toe fillets 3": lambda: angle(60.0, 40.0, 5.0, 6.0, 3.0),
}
#: Half-width of the reference brackets, relative.
HALF_WIDTH = 5e-7


@cache
def bracket_midpoint(name: str) -> float:
    """Midpoint of a guaranteed bracket on J of half-width under HALF_WIDTH."""
    t = refine_adaptively(SECTIONS[name](), 2.0 * HALF_WIDTH).result.torsion
    assert 0.5 * (t.J - t.J_low) / t.J_low < HALF_WIDTH
    return 0.5 * (t.J + t.J_low)


# Measured relative errors of J at default / fine (nodes), against brackets of half-width
# about 1e-7 (adaptive runs to 3e-7):
#   sharp L          2.0e-5 (3105) / 2.9e-6 (9299)
#   filleted L       1.3e-5 (2937) / 1.6e-6 (8971)
#   sharp channel    3.8e-5 (3211) / 7.8e-6 (9385)
#   I with fillets   4.6e-5 (4677) / 8.0e-6 (12837)
#   sharp angle      2.4e-5 (2797) / 5.5e-6 (8886)
#   filleted angle   1.5e-5 (2543) / 1.9e-6 (8127)
# (with the earlier default, 0.125 sqrt(A), right angles ungraded, corners at 0.05 of the local
# size: the channel 7.8e-4 / 8.0e-5, the I 7.6e-4 / 1.2e-4, the angle 6.4e-4 / 5.6e-5).
# Bounds: 1e-4 at default, twice the largest measured error and ten times inside the target;
# 1e-5 at fine, the target itself (the I's 8.0e-6 leaves no room for a tighter one), each plus
# the reference's half-width.
@pytest.mark.parametrize("refine, bound", [(1.0, 1e-4), (2.0, 1e-5)], ids=["default", "fine"])
@pytest.mark.parametrize("name", list(SECTIONS))
def test_J(name, refine, bound):
    res = analyse(SECTIONS[name](), refine=refine)
    assert abs(res.torsion.J / bracket_midpoint(name) - 1.0) < bound + HALF_WIDTH
