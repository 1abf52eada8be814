"""The outline term of the error estimate: curved element edges measured against the true arcs.

Two kinds of check:

- closed forms where the only error is the outline's: a tube (psi = 0, so J is Ip of the
  meshed domain) and a circle, against pi (D^4 - d^4) / 32 and pi D^4 / 32 (Roark, torsion
  table, from memory) and the areas pi (D^2 - d^2) / 4;
- the shape derivatives themselves by finite differences (common practice, no source): the
  boundary nodes on one arc of a slit tube are pulled in by a small smooth amount delta g(theta)
  and the analysis repeated on the moved mesh; the change of J, Cw, the shear centre, A and Ix
  must match the first-order corrections computed on the moved mesh with the offsets delta g.
  Measured: ratios 1 - 7.4e-6 (J), 1 - 2.1e-6 (Cw), 1 + 9.2e-6 (xs), 1 + 3.1e-6 (A),
  1 + 1.3e-8 (Ix) at delta = 1e-4 of a 25 mm radius; what is left is second order in delta
  and the difference between the continuous and the discrete shape derivative, hence 1e-4.
"""

import numpy as np
import pytest

from warpwise.fem.p2 import shape_functions
from warpwise.geometry.profile import Arc, profile_from_loops
from warpwise.geometry.shapes import circle, rectangle, tube
from warpwise.mesh.core import Mesh
from warpwise.properties.analysis import analyse
from warpwise.properties.geometry_error import OutlineOffsets, outline_corrections, outline_offsets


@pytest.mark.parametrize("segments, refine", [(32, 0.5), (64, 1.0), (256, 1.0)])
def test_tube_outline_term_gives_the_true_tube(segments, refine):
    D, d = 40.0, 30.0
    res = analyse(tube(D, d, segments=segments), refine=refine)
    c = outline_corrections(res)
    J = np.pi * (D**4 - d**4) / 32.0  # Roark, hollow concentric circle (from memory)
    A = np.pi * (D**2 - d**2) / 4.0
    before = abs(res.torsion.J / J - 1.0)
    after = abs((res.torsion.J + c["J"]) / J - 1.0)
    # measured: 6.2e-6 -> 3.4e-10 (32 chords, draft), 3.9e-7 -> 5.5e-12, 1.5e-9 -> 7e-16; the
    # rest is second order in the offset, (pi / n)^8 or so
    assert before > 1e-9
    assert after < 1e-4 * before + 1e-14
    assert abs((res.geometric.A + c["A"]) / A - 1.0) < 1e-4 * abs(res.geometric.A / A - 1.0) + 1e-14
    assert abs((res.geometric.Ix + c["Ix"]) / (J / 2) - 1.0) < 1e-4 * before + 1e-14


def test_circle_outline_term():
    res = analyse(circle(20.0, segments=32))
    J = np.pi * 20.0**4 / 32.0  # Roark, solid circle (from memory)
    c = outline_corrections(res)
    # measured: -4.7e-6 -> 2.7e-10
    assert abs((res.torsion.J + c["J"]) / J - 1.0) < 1e-4 * abs(res.torsion.J / J - 1.0)


def test_no_arcs_no_term():
    c = outline_corrections(analyse(rectangle(20.0, 10.0)))
    assert set(c.values()) == {0.0}


def slit_tube(R: float, r: float, gap_deg: float, n: int):
    """A thick open ring: two concentric arcs joined by radial faces, the arcs recorded."""
    g = np.radians(gap_deg) / 2
    t = np.linspace(g, 2 * np.pi - g, n)
    loop = np.vstack([np.c_[R * np.cos(t), R * np.sin(t)],
                      np.c_[r * np.cos(t[::-1]), r * np.sin(t[::-1])]])
    arcs = [Arc(0.0, 0.0, R, g, 2 * np.pi - 2 * g), Arc(0.0, 0.0, r, g, 2 * np.pi - 2 * g)]
    return profile_from_loops([loop], source="slit tube", units="mm", arcs=arcs)


def test_shape_derivatives_by_finite_differences():
    R, delta = 25.0, 1e-4
    profile = slit_tube(R, 15.0, 20.0, 400)
    base = analyse(profile, refine=2.0)
    mesh = base.mesh
    off = outline_offsets(mesh, profile.arcs)

    def g(theta):
        return 1.0 + 0.5 * np.cos(2 * theta) + 0.3 * np.sin(theta)

    # pull the nodes on the outer arc in by delta g(theta): the true outline is then the mesh's
    bnd = np.unique(mesh.edges.nodes[mesh.edges.boundary].ravel())
    on = bnd[np.abs(np.hypot(*mesh.nodes[bnd].T) - R) < 1e-9 * R]
    nodes = mesh.nodes.copy()
    theta = np.arctan2(nodes[on, 1], nodes[on, 0])
    nodes[on] *= ((R - delta * g(theta)) / R)[:, None]
    moved = analyse(profile, mesh=Mesh(nodes, mesh.elements, mesh.region, mesh.size, None))
    # the same Gauss points on the moved edges; the offset back to the circle is radial there
    N, _ = shape_functions(off.ref)
    xy = np.einsum("pk,pki->pi", N, nodes[mesh.elements[off.element]])
    outer = np.abs(np.hypot(*off.xy.T) - R) < 1e-3
    offset = np.where(outer, R - np.hypot(*xy.T), 0.0)
    c = outline_corrections(moved, OutlineOffsets(off.element, off.ref, xy, off.weight, offset))
    pairs = {"J": (base.torsion.J, moved.torsion.J), "Cw": (base.torsion.Cw, moved.torsion.Cw),
             "xs": (base.torsion.shear_centre[0], moved.torsion.shear_centre[0]),
             "A": (base.geometric.A, moved.geometric.A), "Ix": (base.geometric.Ix, moved.geometric.Ix)}
    for key, (before, after) in pairs.items():
        assert c[key] == pytest.approx(before - after, rel=1e-4), key
