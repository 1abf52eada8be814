"""One stress recovery for every load: composite shear forces, torque and combined loads agree.

The defect this guards: the shear-force stress of a composite section through
``shear_stress`` took Poisson's ratio from the (undefined, NaN) value of a composite section and
gave tau_max = nan, while the combined-load recovery gave finite values.
"""

import numpy as np
import pytest

from warpwise.fem.p2 import integrate, interpolate
from warpwise.geometry.profile import profile_from_loops
from warpwise.materials import builtin_material
from warpwise.properties.analysis import analyse
from warpwise.stress import Loads, combined_stress, recover, shear_stress, torsion_stress


@pytest.fixture(scope="module")
def composite():
    # steel section with an aluminium insert (our own test profile)
    outer = [(0, 0), (40, 0), (40, 30), (0, 30)]
    inner = [(10, 8), (30, 8), (30, 22), (10, 22)]
    prof = profile_from_loops([outer, inner], ["steel-S235", "aluminium-6063-T6"])
    mats = [builtin_material(r.material) for r in prof.regions]
    return analyse(prof, materials=mats)


def test_composite_shear_force_stress_is_finite_and_matches_combined(composite):
    s = shear_stress(composite, vx=0.0, vy=1000.0)
    assert np.isfinite(s.tau_max) and s.tau_max > 0
    c = combined_stress(composite, Loads(Vy=1000.0))
    # the same recovery: identical maxima (round-off only)
    assert s.tau_max == pytest.approx(max(m.tau_max for m in c.by_material), rel=1e-12)


def test_composite_shear_field_carries_the_force(composite):
    # equilibrium: the shear stresses of all materials, integrated over the section, give Vy
    # (nodal values interpolated with the P2 basis; measured 2e-5 relative at this mesh, the
    # nodal averaging at the interface; bound 1e-3). Statics, no source needed.
    res = composite
    fields = recover(res, Loads(Vy=1000.0))
    mesh, ev = res.mesh, res.basis
    total = 0.0
    for f in fields:
        zy = np.zeros(mesh.n_nodes)
        zy[f.nodes] = f.tau_zy
        mask = res.materials.group == f.group
        q = interpolate(mesh, ev, zy)
        total += integrate(ev, np.where(mask[:, None], q, 0.0))
    assert total == pytest.approx(1000.0, rel=1e-3)


def test_torsion_without_modulus_gives_no_twist():
    from warpwise.geometry.shapes import rectangle

    res = analyse(rectangle(20.0, 10.0))
    ts = torsion_stress(res, 1000.0)
    assert ts.twist_rate is None and ts.shear_modulus is None and ts.tau_max > 0
    assert torsion_stress(res, 1000.0, 80000.0).twist_rate == pytest.approx(
        1000.0 / (80000.0 * res.torsion.J), rel=1e-14)
