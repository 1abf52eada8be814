"""Boundary nodes onto the true curves of the outline (curved, isoparametric element edges)."""

from __future__ import annotations

import numpy as np

from ..geometry.curves import Curve
from .edges import mesh_edges


def follow_arcs(nodes: np.ndarray, elements: np.ndarray, arcs: tuple[Curve, ...],
                region: np.ndarray | None = None) -> np.ndarray:
    """Move boundary nodes that approximate a circular or elliptical arc onto the curve itself.

    Everything is judged in the curve's scaled frame (:mod:`warpwise.geometry.curves`), where
    it is the unit circle and its chords are chords of that circle. Corner nodes of boundary
    edges lying on the chords (no deeper inside than the polygon's largest sagitta there, and
    within the sweep) go radially (in that frame) onto the curve, keeping their parameter; the
    mid-side node of a boundary edge whose two corners went onto one curve goes onto the curve
    at the parameter midway between them (the chord's midpoint moved radially in that frame),
    so the element edge is curved (isoparametric). Other mid-side nodes are put back at the
    midpoints of their corners.

    Parameters
    ----------
    nodes : numpy.ndarray
        Node coordinates (n, 2), drawing unit.
    elements : numpy.ndarray
        Six-node connectivity (m, 6).
    arcs : tuple of Curve
        Circular and elliptical arcs of the true outline.
    region : numpy.ndarray, optional
        Region of each element (m,): edges between regions count as boundary (interfaces).

    Returns
    -------
    numpy.ndarray
        New node coordinates (n, 2), drawing unit.
    """
    if not arcs:
        return nodes
    nodes = nodes.copy()
    edges = mesh_edges(elements, region)
    bnd = edges.nodes[edges.outline_and_interfaces]
    corners = np.unique(bnd[:, :2])
    owner = np.full(len(nodes), -1)
    for k, arc in enumerate(arcs):  # a loop over the few recorded curves, not over nodes
        rho = arc.rho(nodes[corners])
        t = arc.param(nodes[corners])
        within = arc.contains_angle(t)
        # the polygon's own vertices lie on the curve; the widest parameter step between two of
        # them bounds how far inside (in the scaled frame) a node of the chords can be;
        # parameters measured from the arc's start, so that a sweep across +-pi sorts correctly
        rel = np.mod(t - arc.start + 1e-9, 2.0 * np.pi) - 1e-9
        on = np.sort(rel[within & (np.abs(rho - 1.0) < 1e-9)])
        if len(on) < 2:
            continue
        gap = np.diff(np.concatenate([on, [on[0] + 2 * np.pi]])) if arc.full else np.diff(on)
        sagitta = 1.0 - np.cos(0.5 * min(float(gap.max()), np.pi))
        hit = within & (rho > 1.0 - 1.01 * sagitta - 1e-9) & (rho < 1.0 + 1e-9)
        hit &= owner[corners] < 0
        idx = corners[hit]
        owner[idx] = k
        nodes[idx] = arc.at(t[hit])
    # mid-side nodes: midpoints of their (possibly moved) corners
    for k, (i, j) in enumerate(((0, 1), (1, 2), (2, 0))):
        nodes[elements[:, 3 + k]] = 0.5 * (nodes[elements[:, i]] + nodes[elements[:, j]])
    done = np.zeros(len(bnd), bool)
    for arc in arcs:
        ra, rb = arc.rho(nodes[bnd[:, 0]]), arc.rho(nodes[bnd[:, 1]])
        mid = nodes[bnd[:, 2]]
        # both corners on this curve and the edge within the sweep: the edge follows the curve
        on = (np.abs(ra - 1.0) < 1e-9) & (np.abs(rb - 1.0) < 1e-9) & ~done
        on &= arc.contains_angle(arc.param(mid))
        done |= on
        if on.any():
            nodes[bnd[on, 2]] = arc.onto(mid[on])
    return nodes
