"""Triangle (through meshpy): the three-node mesh of a profile part, and its six-node form."""

from __future__ import annotations

import numpy as np
import shapely
from meshpy import triangle

from ..errors import ProfileError, UsageError
from ..geometry.corners import obtuse_corners, reentrant_corners
from ..geometry.profile import Profile
from .edges import mesh_edges
from .sizing import (
    CORNER_GRADING,
    CORNER_SIZE_FACTOR,
    MAX_BOUNDARY_POINTS,
    MAX_ELEMENTS,
    MIN_SIZE_FRACTION,
    OBTUSE_SIZE_FACTOR,
    TRIANGLES_PER_BOUNDARY_POINT,
    check_boundary_budget,
    grade_to_corners,
    nearest_index,
    planar_graph,
    split_segments,
    wall_thickness,
)


def to_quadratic(nodes: np.ndarray, tris: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Add mid-side nodes to three-node triangles, vectorised over unique edges."""
    edges = mesh_edges(tris)
    a, b = edges.nodes[:, 0], edges.nodes[:, 1]
    mids = 0.5 * (nodes[a] + nodes[b])
    mid_idx = len(nodes) + edges.of_element
    return np.vstack([nodes, mids]), np.hstack([tris, mid_idx]).astype(np.int64)


def hole_seeds(part: Profile) -> list[np.ndarray]:
    """One point inside each hole that no other region fills (Triangle's hole markers)."""
    union = part.geometry()
    holes = []
    for reg in part.regions:
        for hole in reg.holes:
            empty = shapely.Polygon(hole).difference(union)
            if not empty.is_empty and empty.area > 0:
                holes.append(np.asarray(empty.representative_point().coords[0]))
    return holes


#: What to do about a mesh over the limits, for the messages.
_LIMIT_ADVICE = ("give curved outlines more vertices (a turn of under 10 degrees at a vertex is "
                 "no sharp corner) or draw them as arcs in a DXF, or analyse one part with --part N")


def check_mesh_budget(points: int, corners: int, part: Profile, full: Profile, h: float,
                      max_elements: int = MAX_ELEMENTS) -> None:
    """Refuse, before meshing, a boundary or a mesh over the limits.

    The limits are :data:`MAX_BOUNDARY_POINTS` and :data:`~warpwise.mesh.sizing.MAX_ELEMENTS`;
    the elements are estimated from the boundary points and the area at size ``h`` (drawing
    unit), over the whole profile when ``part`` is a mirrored half or quarter. ``max_elements``
    (``--max-elements``) replaces the element limit; above the default it lifts the boundary
    limit in proportion.

    Raises
    ------
    UsageError
        Naming the count, the limit, the sharp corners that asked for it and what helps.
    """
    graded = (f" graded towards {corners:,} sharp re-entrant corner{'s' if corners != 1 else ''}"
              if corners else "")
    # a larger element limit lifts the boundary limit with it; a smaller one leaves it (small
    # meshes have many boundary points per element)
    max_points = round(MAX_BOUNDARY_POINTS * max(1.0, max_elements / MAX_ELEMENTS))
    if points > max_points:
        raise UsageError(f"the boundary needs more than {max_points:,} points{graded} "
                         f"(the limit); {_LIMIT_ADVICE}; --max-elements N lifts the limit "
                         f"(now {max_elements:,} elements, {max_points:,} boundary points)",
                         file=full.source)
    copies = full.area / max(part.area, 1e-300)
    estimate = copies * (TRIANGLES_PER_BOUNDARY_POINT * points + part.area / (0.43 * h * h))
    if estimate > max_elements:
        raise UsageError(f"the mesh would need about {estimate:,.0f} elements ({points * copies:,.0f} "
                         f"boundary points{graded}), more than the limit of {max_elements:,}; "
                         f"{_LIMIT_ADVICE}; --max-elements N lifts the limit", file=full.source)


#: Area bounds below this (drawing unit squared) are handed to Triangle at a larger scale.
SMALL_AREA_BOUND = 1e-8


def _graded(pts: np.ndarray, sub: np.ndarray, corners: list, size: float, h: float,
            local: bool = True) -> tuple[np.ndarray, np.ndarray]:
    """Boundary points graded towards ``corners``.

    The size at each corner is ``size / h`` times the local size there (the length of the
    boundary segment starting nearest it: the wall thickness or h), or ``size`` itself when
    not ``local``; it grows by :data:`CORNER_GRADING` with distance.
    """
    cxy = np.array([(c.x, c.y) for c in corners])
    there = np.full(len(cxy), h)
    if local:
        near = nearest_index(pts[sub[:, 0]], cxy)  # the segment starting nearest each corner
        there = np.minimum(h, np.linalg.norm(pts[sub[near, 1]] - pts[sub[near, 0]], axis=1))
    return grade_to_corners(pts, sub, cxy, size / h * there, CORNER_GRADING)


def triangulate(part: Profile, full: Profile, h: float, min_angle: float, across: float,
                 refine_level: float = 1.0, max_elements: int = MAX_ELEMENTS,
                 boundary_pieces: float | None = None) -> tuple[
        np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
    """Three-node Triangle mesh of ``part``, boundary split by the wall thickness of ``full``.

    Every drawn segment is split into at least ``boundary_pieces`` pieces on average
    (:func:`~warpwise.mesh.sizing.piece_counts`; default ``refine_level``).
    """
    vertices, seg = planar_graph(part)
    fv, fseg = planar_graph(full)
    seg_a, seg_b = fv[fseg[:, 0]], fv[fseg[:, 1]]
    # two passes: split by the thickness at segment midpoints, then measure again on the pieces;
    # no element is asked to be smaller than MIN_SIZE_FRACTION of h (a wall thinning to nothing
    # would otherwise ask for endless boundary points)
    floor = MIN_SIZE_FRACTION * h
    reach = 1.01 * across * h  # a wall thicker than this gets elements of size h all the same
    t1 = np.maximum(wall_thickness(full, vertices[seg[:, 0]], vertices[seg[:, 1]], seg_a, seg_b,
                                   reach), floor * across)
    check_boundary_budget(vertices, seg, np.minimum(h, t1 / across), full)
    # under refinement every drawn segment is split at least by the refinement factor, so a
    # boundary denser than the target (arcs as chords) is refined with the interior
    pts, sub = split_segments(vertices, seg, np.minimum(h, t1 / across),
                              refine_level if boundary_pieces is None else boundary_pieces)
    t2 = np.maximum(wall_thickness(full, pts[sub[:, 0]], pts[sub[:, 1]], seg_a, seg_b, reach),
                    floor * across)
    check_boundary_budget(pts, sub, np.minimum(h, t2 / across), full)
    pts, sub = split_segments(pts, sub, np.minimum(h, t2 / across))
    corners = reentrant_corners(full, measure=False)
    obtuse = obtuse_corners(full)
    # the corner size shrinks faster than h under refinement (as h^2), which keeps the
    # convergence rate of J above the uniform-grading limit h^(4/3) of a 270 degree corner
    # an obtuse corner's size is a fraction of h (they matter in compact bars, where the local
    # size is h, and the nearest-segment search is left to the sharp corners)
    if obtuse:
        pts, sub = _graded(pts, sub, obtuse, OBTUSE_SIZE_FACTOR * h / refine_level, h, False)
    if corners:
        pts, sub = _graded(pts, sub, corners, CORNER_SIZE_FACTOR * h / refine_level, h)
    # the message names the sharp corners, whose grading can run away with the points (the
    # convex ones, right angles included, are graded to a fixed fraction of h)
    check_mesh_budget(len(pts), len(corners), part, full, h, max_elements)
    # Triangle is handed the area bound as text with 20 decimals, which rounds the bound of a
    # tiny profile (1e-9 mm across: 1.7e-21) to zero; below SMALL_AREA_BOUND mesh at a
    # power-of-two scale that makes h about 1 (exact in floating point) and scale the nodes
    # back (above it the bound keeps 12 digits and the mesh is left as Triangle makes it)
    scale = 1.0 if h * h >= SMALL_AREA_BOUND else float(2.0 ** -np.round(np.log2(h)))
    info = triangle.MeshInfo()
    info.set_points(pts * scale)
    info.set_facets(sub)
    holes = hole_seeds(part)
    if holes:
        info.set_holes([hole * scale for hole in holes])
    info.regions.resize(len(part.regions))
    for k, reg in enumerate(part.regions):
        x, y = np.asarray(reg.polygon.representative_point().coords[0]) * scale
        info.regions[k] = [float(x), float(y), float(k), 0.0]
    max_area = (h * scale) ** 2 * np.sqrt(3.0) / 4.0
    try:
        out = triangle.build(info, attributes=True, max_volume=max_area, min_angle=min_angle,
                             generate_neighbor_lists=False)
    except RuntimeError as exc:  # Triangle refuses degenerate input
        raise ProfileError(f"meshing failed ({exc})", file=full.source) from None
    nodes = np.asarray(out.points, dtype=float) / scale
    tris = np.asarray(out.elements, dtype=np.int64)
    if tris.size == 0:
        raise ProfileError("meshing produced no elements", file=full.source)
    region = np.asarray(out.element_attributes, dtype=float).reshape(-1).round().astype(np.int64)
    p = nodes[tris]
    cross = (p[:, 1, 0] - p[:, 0, 0]) * (p[:, 2, 1] - p[:, 0, 1]) - (
        p[:, 1, 1] - p[:, 0, 1]) * (p[:, 2, 0] - p[:, 0, 0])
    flip = cross < 0
    tris[flip] = tris[flip][:, [0, 2, 1]]
    # drop nodes Triangle left unused (duplicates it merged)
    used = np.zeros(len(nodes), bool)
    used[tris.ravel()] = True
    renumber = np.cumsum(used) - 1
    segs = np.asarray(out.facets, dtype=np.int64).reshape(-1, 2)
    return nodes[used], renumber[tris], renumber[segs], region


