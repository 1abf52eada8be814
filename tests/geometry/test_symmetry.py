import numpy as np
import pytest
from scipy.spatial import cKDTree

from warpwise.geometry.profile import profile_from_loops
from warpwise.geometry.shapes import rectangle
from warpwise.geometry.symmetry import symmetry_axes
from warpwise.mesh.core import build_mesh
from warpwise.properties.analysis import analyse


def equal_angle(b=50.0, t=5.0):
    return profile_from_loops([[(0, 0), (b, 0), (b, t), (t, t), (t, b), (0, b)]])


def test_axes_found():
    assert len(symmetry_axes(rectangle(4.0, 2.0))) == 2
    axes = symmetry_axes(equal_angle())
    assert len(axes) == 1 and axes[0].angle_deg % 180 == pytest.approx(45.0)
    unequal = profile_from_loops([[(0, 0), (60, 0), (60, 5), (5, 5), (5, 40), (0, 40)]])
    assert symmetry_axes(unequal) == []


def test_mesh_is_mirror_symmetric():
    prof = equal_angle()
    m = build_mesh(prof)
    axis = symmetry_axes(prof)[0]
    images = axis.mirror(m.nodes)
    dist, _ = cKDTree(m.nodes).query(images)
    assert dist.max() < 1e-12 * prof.size
    assert m.area == pytest.approx(prof.area, rel=1e-12)


def test_symmetric_results_to_round_off():
    # a section symmetric about an axis has its shear centre on that axis and, for two axes,
    # at the centroid (common practice, no source)
    r = analyse(rectangle(30.0, 12.0))
    assert r.geometric.Ixy == 0.0
    assert np.allclose(r.torsion.shear_centre, r.geometric.centroid, atol=1e-12 * 30)
    prof = equal_angle()
    r = analyse(prof)
    xs, ys = r.torsion.shear_centre
    assert abs(xs - ys) < 1e-12 * prof.size
    assert abs(r.shear.shear_centre[0] - r.shear.shear_centre[1]) < 1e-12 * prof.size


def test_symmetry_off_gives_same_values_within_discretisation():
    prof = equal_angle()
    a = analyse(prof)
    b = analyse(prof, mesh=build_mesh(prof, use_symmetry=False))
    # two different meshes of the same size: J agrees to the discretisation error (~1e-4 here)
    assert b.torsion.J == pytest.approx(a.torsion.J, rel=2e-3)
