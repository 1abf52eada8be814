"""Boundary nodes of meshed ellipses on the true ellipse, mid-side nodes at the parameter midway."""

from __future__ import annotations

import numpy as np
import pytest

from warpwise.geometry.shapes import ellipse, hollow_ellipse
from warpwise.mesh.core import build_mesh
from warpwise.mesh.edges import mesh_edges


@pytest.mark.parametrize("profile, size", [
    pytest.param(lambda: ellipse(20.0, 10.0).moved(angle_deg=35.0, shift=(3.0, -1.0)), None,
                 id="turned ellipse, default mesh"),
    # a 16-gon meshed finer than its chords: the nodes the mesher puts on the chords go onto
    # the ellipse as well (radially in the scaled frame)
    pytest.param(lambda: ellipse(20.0, 10.0, segments=16), 1.0, id="16-gon, chords split"),
    pytest.param(lambda: hollow_ellipse(20.0, 10.0, 14.0, 7.0), None, id="hollow ellipse"),
])
def test_boundary_nodes_on_the_ellipses(profile, size):
    # common practice, no source: the definition of an isoparametric edge through three points
    # of the curve, the middle one at the parameter midway
    p = profile()
    mesh = build_mesh(p, size)
    edges = mesh_edges(mesh.elements)
    bnd = edges.nodes[edges.outline_and_interfaces]
    rho = np.stack([c.rho(mesh.nodes[bnd]) for c in p.arcs])  # (curves, edges, 3)
    on = np.abs(rho - 1.0) < 1e-12
    # every boundary node (corners and mid-side) lies on one of the ellipses
    assert on.any(axis=0).all()
    for k, c in enumerate(p.arcs):
        e = bnd[on[k].all(axis=1)]
        t0, t1, tm = (c.param(mesh.nodes[e[:, i]]) for i in range(3))
        step = np.mod(t1 - t0 + np.pi, 2 * np.pi) - np.pi
        assert np.abs(np.mod(tm - (t0 + 0.5 * step) + np.pi, 2 * np.pi) - np.pi).max() < 1e-12
        if size is not None:  # split chords: the parameter steps are not all equal
            assert np.ptp(np.abs(step)) > 1e-3
