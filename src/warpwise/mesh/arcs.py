"""Boundary nodes onto the true arcs of the outline (curved, isoparametric element edges)."""

from __future__ import annotations

import numpy as np

from ..geometry.profile import Arc
from .edges import mesh_edges


def follow_arcs(nodes: np.ndarray, elements: np.ndarray, arcs: tuple[Arc, ...],
                region: np.ndarray | None = None) -> np.ndarray:
    """Move boundary nodes that approximate a circular arc onto the arc itself.

    Corner nodes of boundary edges lying on the arc's chords (no deeper inside the circle than
    the polygon's largest sagitta, and within the sweep) go radially onto the circle; the
    mid-side node of a boundary edge whose two corners went onto one arc goes onto the arc
    midway between them, so the element edge is curved (isoparametric). Other mid-side nodes
    are put back at the midpoints of their corners.

    Parameters
    ----------
    nodes : numpy.ndarray
        Node coordinates (n, 2), drawing unit.
    elements : numpy.ndarray
        Six-node connectivity (m, 6).
    arcs : tuple of Arc
        Arcs of the true outline.

    Returns
    -------
    numpy.ndarray
        New node coordinates (n, 2).
    """
    if not arcs:
        return nodes
    nodes = nodes.copy()
    edges = mesh_edges(elements, region)
    bnd = edges.nodes[edges.outline_and_interfaces]
    corners = np.unique(bnd[:, :2])
    owner = np.full(len(nodes), -1)
    for k, arc in enumerate(arcs):
        d = nodes[corners] - np.array([arc.cx, arc.cy])
        dist = np.hypot(d[:, 0], d[:, 1])
        ang = np.arctan2(d[:, 1], d[:, 0])
        within = arc.contains_angle(ang)
        # the polygon's own vertices lie on the circle; the widest angle between two of them
        # bounds how far inside the circle a node of the approximating chords can be
        # angles measured from the arc's start, so that a sweep across +-pi sorts correctly
        rel = np.mod(ang - arc.start + 1e-9, 2.0 * np.pi) - 1e-9
        on = np.sort(rel[within & (np.abs(dist - arc.r) < 1e-9 * arc.r)])
        if len(on) < 2:
            continue
        gap = np.diff(np.concatenate([on, [on[0] + 2 * np.pi]])) if arc.sweep >= 2 * np.pi - 1e-9 \
            else np.diff(on)
        sagitta = arc.r * (1.0 - np.cos(0.5 * min(float(gap.max()), np.pi)))
        hit = within & (dist > arc.r - 1.01 * sagitta - 1e-9 * arc.r) & (dist < arc.r * (1 + 1e-9))
        hit &= owner[corners] < 0
        idx = corners[hit]
        owner[idx] = k
        nodes[idx] = np.array([arc.cx, arc.cy]) + d[hit] * (arc.r / dist[hit])[:, None]
    # mid-side nodes: midpoints of their (possibly moved) corners
    for k, (i, j) in enumerate(((0, 1), (1, 2), (2, 0))):
        nodes[elements[:, 3 + k]] = 0.5 * (nodes[elements[:, i]] + nodes[elements[:, j]])
    done = np.zeros(len(bnd), bool)
    for arc in arcs:
        c = np.array([arc.cx, arc.cy])
        ra = np.hypot(*(nodes[bnd[:, 0]] - c).T)
        rb = np.hypot(*(nodes[bnd[:, 1]] - c).T)
        d = nodes[bnd[:, 2]] - c
        # both corners on this circle and the edge within the sweep: the edge follows the arc
        on = (np.abs(ra - arc.r) < 1e-9 * arc.r) & (np.abs(rb - arc.r) < 1e-9 * arc.r) & ~done
        on &= arc.contains_angle(np.arctan2(d[:, 1], d[:, 0]))
        e = bnd[on]
        done |= on
        if len(e) == 0:
            continue
        dist = np.hypot(*d[on].T)
        nodes[e[:, 2]] = c + d[on] * (arc.r / np.maximum(dist, 1e-300))[:, None]
    return nodes


