"""Boundary sizing: where the boundary points go before Triangle fills the interior.

Every boundary segment is split to a length tied to the local wall thickness measured across
the material (:func:`wall_thickness`), so a thin wall gets at least two elements through its
thickness; near sharp re-entrant corners, and near right-angled and obtuse convex ones, the
points are graded towards the corner.
"""

from __future__ import annotations

import numpy as np
import shapely

from ..errors import ProfileError
from ..geometry.profile import Profile, default_element_size
from ..geometry.rays import first_hits

#: Elements through the local wall thickness at the boundary (at least two).
ELEMENTS_ACROSS_WALL = 2.5
#: Element size at a sharp re-entrant corner, as a fraction of the local size there. Measured
#: on a 100 x 50 channel (web 5, flanges 8, sharp inside corners) against the midpoint of a
#: guaranteed bracket of half-width 3e-7, J at default / fine: 6.9e-5 / 1.02e-5 (0.05, 3009 /
#: 9103 nodes), 3.8e-5 / 7.8e-6 (0.02, 3211 / 9385), 3.3e-5 / 7.1e-6 (0.01, 3383 / 9477): 0.02
#: brings fine under 1e-5 for 3 % more nodes.
CORNER_SIZE_FACTOR = 0.02
#: Element size at a right-angled or obtuse convex corner (geometry.corners.OBTUSE_RANGE_DEG),
#: as a fraction of the largest size h. Measured at a mesh of 0.125 sqrt(A) against refine 8,
#: Cw of a 24 mm hexagon bar: -1.1e-3 (0.2), -7.2e-4 (0.15, 1189 nodes), -9.4e-4 (0.1),
#: +1.1e-2 ungraded; of a 24 mm octagon: +8.8e-3 (0.5), -2.3e-3 (0.3), -1.3e-3 (0.15),
#: -1.7e-3 (0.07), -1.6e-3 (0.03), +2.6e-2 ungraded (what is left there is the interior's
#: resolution, not the corners': DEFAULT_MESH_FRACTION).
OBTUSE_SIZE_FACTOR = 0.15
#: Growth of the element size with distance from a sharp re-entrant corner.
CORNER_GRADING = 0.3
#: Smallest element size asked for at a boundary, as a fraction of the largest size h.
MIN_SIZE_FRACTION = 1e-3
#: Largest number of boundary points before meshing is refused.
MAX_BOUNDARY_POINTS = 400_000
#: Largest number of elements a mesh may have before meshing is refused.
MAX_ELEMENTS = 4_000_000
#: Triangles of a graded mesh per boundary point, for the estimate before meshing (measured on
#: plates with many small polygonal holes: 6.4 to 6.5; scripts/bench_limits.py).
TRIANGLES_PER_BOUNDARY_POINT = 6.5


#: Largest element size of the default mesh as a fraction of
#: :func:`~warpwise.geometry.profile.default_element_size` (0.125 sqrt(A), which the readers'
#: chord tolerance and simplification follow): 0.0625 sqrt(A). Compact solid bars need it for
#: Cw, whose relative error is large because Cw is a small remainder there; measured against
#: refine 8 (convergence reference), default / fine, at 0.125 sqrt(A) and at 0.0625 sqrt(A)
#: (both with right-angled corners graded, sharp ones at 0.05): Cw of a 24 mm octagon
#: -1.3e-3 / -2.6e-4 and -1.1e-4 / -4.5e-6, a 24 mm hexagon -7.2e-4 / -7.4e-5 and +1.8e-5 /
#: +5.3e-6, a hexagonal nut (24 mm, 12 mm hole) -2.2e-4 / -3.4e-6 and +1.3e-5 / +8.4e-6; J at
#: fine of a 60 x 40 x 5 angle 1.9e-5 and 5.9e-6, of a 100 x 50 x 5 x 8 channel 2.6e-5 and
#: 8.0e-6. Thin walls are sized by their thickness (ELEMENTS_ACROSS_WALL), so thin-walled
#: profiles barely pay: +9.5 % nodes over the bundled samples, none on the multi-cell box, the
#: mullion with screw bosses, the purlin (the compact key bar and thick angle 2.4x and 2.8x).
DEFAULT_MESH_FRACTION = 0.5


def default_size(profile: Profile) -> float:
    """Default largest element size for a profile, 0.0625 sqrt(A), drawing unit.

    See :data:`DEFAULT_MESH_FRACTION`.
    """
    return DEFAULT_MESH_FRACTION * default_element_size(profile.area)


def planar_graph(profile: Profile) -> tuple[np.ndarray, np.ndarray]:
    """Unique vertices and unique segments of all loops of all regions."""
    loops = [loop for r in profile.regions for loop in r.loops()]
    pts = np.vstack(loops)
    tol = 1e-9 * max(profile.size, 1e-300)
    key = np.round(pts / tol).astype(np.int64)
    _, first, inverse = np.unique(key, axis=0, return_index=True, return_inverse=True)
    inverse = inverse.reshape(-1)
    vertices = pts[first]
    segs = []
    start = 0
    for loop in loops:
        idx = inverse[start:start + len(loop)]
        segs.append(np.column_stack([idx, np.roll(idx, -1)]))
        start += len(loop)
    seg = np.sort(np.vstack(segs), axis=1)
    seg = seg[seg[:, 0] != seg[:, 1]]
    seg = np.unique(seg, axis=0)
    if len(profile.regions) > 1:
        seg = _split_at_t_junctions(vertices, seg, tol)
    return vertices, seg


def _split_at_t_junctions(p: np.ndarray, seg: np.ndarray, tol: float) -> np.ndarray:
    """Split segments at vertices lying inside them (regions meeting along part of an edge)."""
    for _ in range(50):
        lines = shapely.linestrings(np.stack([p[seg[:, 0]], p[seg[:, 1]]], axis=1))
        tree = shapely.STRtree(lines)
        vi, si = tree.query(shapely.points(p), predicate="dwithin", distance=tol)
        inner = (seg[si, 0] != vi) & (seg[si, 1] != vi)
        vi, si = vi[inner], si[inner]
        if len(si) == 0:
            break
        # one split per segment per pass: the vertex nearest the segment's first end
        d = np.linalg.norm(p[vi] - p[seg[si, 0]], axis=1)
        order = np.lexsort((d, si))
        si, vi = si[order], vi[order]
        first = np.r_[True, si[1:] != si[:-1]]
        si, vi = si[first], vi[first]
        keep = np.ones(len(seg), bool)
        keep[si] = False
        seg = np.vstack([seg[keep], np.column_stack([seg[si, 0], vi]),
                         np.column_stack([vi, seg[si, 1]])])
        seg = np.unique(np.sort(seg, axis=1), axis=0)
    return seg


def wall_thickness(profile: Profile, a: np.ndarray, b: np.ndarray, seg_a: np.ndarray,
                   seg_b: np.ndarray, reach: float | None = None) -> np.ndarray:
    """Local material thickness seen from the midpoints of segments (a, b).

    A ray leaves each midpoint along each normal that points into the material and stops at
    the first boundary segment it meets; the shortest such distance is the local thickness.

    Parameters
    ----------
    profile : Profile
        The profile (its union decides which side is material).
    a, b : numpy.ndarray
        End points (k, 2) of the segments to measure from, drawing unit.
    seg_a, seg_b : numpy.ndarray
        End points (M, 2) of all boundary segments, drawing unit.
    reach : float, optional
        Look no further than this (a thicker wall does not change the mesh), drawing unit;
        default twice the profile size.

    Returns
    -------
    numpy.ndarray
        Thickness (k,), drawing unit; ``reach`` where no wall is found within it.

    """
    size = profile.size
    mid = 0.5 * (a + b)
    d = b - a
    length = np.linalg.norm(d, axis=1)
    normal = np.column_stack([-d[:, 1], d[:, 0]]) / np.maximum(length, 1e-300)[:, None]
    union = profile.geometry()
    shapely.prepare(union)
    reach = 2.0 * size if reach is None else min(float(reach), 2.0 * size)
    thickness = np.full(len(a), reach)
    eps = 1e-7 * size
    tree = shapely.STRtree(shapely.linestrings(np.stack([seg_a, seg_b], axis=1)))
    for sign in (1.0, -1.0):
        nvec = sign * normal
        inside = shapely.contains_xy(union, mid[:, 0] + eps * nvec[:, 0], mid[:, 1] + eps * nvec[:, 1])
        rays = np.flatnonzero(inside)
        if rays.size == 0:
            continue
        best = first_hits(seg_a, seg_b, mid[rays], nvec[rays], reach=reach, start=eps,
                          t_min=2 * eps, tree=tree)
        thickness[rays] = np.minimum(thickness[rays], best)
    return thickness


def piece_counts(n: int, per_segment: float) -> np.ndarray:
    """Whole numbers of pieces for ``n`` segments averaging ``per_segment`` (at least 1 each).

    The running count is rounded, so 2 gives 2 everywhere and sqrt(2) alternates 1 and 2
    (1.41 on average), and a refinement by any factor multiplies the boundary points by it.

    Examples
    --------
    >>> piece_counts(5, 1.5).tolist()
    [2, 1, 2, 1, 2]
    """
    if per_segment <= 1.0:
        return np.ones(n, dtype=np.int64)
    running = np.floor(per_segment * np.arange(n + 1) + 0.5).astype(np.int64)
    return np.maximum(np.diff(running), 1)


def split_segments(p: np.ndarray, seg: np.ndarray, target: np.ndarray,
                   at_least: float = 1.0) -> tuple[np.ndarray, np.ndarray]:
    """Split each segment into ceil(length/target) equal pieces; return points and segments.

    Parameters
    ----------
    p, seg : numpy.ndarray
        Points (p, 2), drawing unit, and segments (s, 2) between them.
    target : numpy.ndarray or float
        Largest piece length per segment, drawing unit.
    at_least : float
        Pieces per segment on average at the least (:func:`piece_counts`): the refinement
        factor, so that a boundary already denser than the target (arcs drawn as chords, a
        many-vertex polygon) is refined with the rest of the mesh.
    """
    a, b = p[seg[:, 0]], p[seg[:, 1]]
    length = np.linalg.norm(b - a, axis=1)
    pieces = np.maximum(piece_counts(len(seg), at_least),
                        np.ceil(length / target - 1e-9).astype(np.int64))
    n_new = pieces - 1
    owner = np.repeat(np.arange(len(seg)), n_new)
    offset = np.arange(n_new.sum()) - np.repeat(np.cumsum(n_new) - n_new, n_new)
    frac = (offset + 1) / pieces[owner]
    new_pts = a[owner] + frac[:, None] * (b - a)[owner]
    # chain of point indices per segment: a, new points..., b
    start = np.cumsum(pieces + 1) - (pieces + 1)
    chain = np.empty(int((pieces + 1).sum()), dtype=np.int64)
    chain[start] = seg[:, 0]
    chain[start + pieces] = seg[:, 1]
    chain[np.repeat(start, n_new) + 1 + offset] = len(p) + np.arange(len(new_pts))
    last = np.zeros(len(chain), bool)
    last[start + pieces] = True
    t = np.flatnonzero(~last)
    return np.vstack([p, new_pts]), np.column_stack([chain[t], chain[t + 1]])


#: Nearest corners looked at first for each point by :func:`corner_target` (more where needed).
CORNERS_NEAR = 8
#: Up to this many points are searched directly (:class:`DirectSearch`); more go into a k-d
#: tree (scipy.spatial, imported only then: loading it costs a tenth of a second).
DIRECT_SEARCH = 16
#: Query points measured at once by :class:`DirectSearch` (bounds its memory).
DIRECT_CHUNK = 32_768


class DirectSearch:
    """The nearest of a few points, by measuring every one (the query of a k-d tree, exact).

    Examples
    --------
    >>> d, i = DirectSearch(np.array([[0.0, 0.0], [10.0, 0.0]])).query(np.array([[4.0, 0.0]]), k=2)
    >>> d.tolist(), i.tolist()
    ([[4.0, 6.0]], [[0, 1]])
    """

    def __init__(self, points: np.ndarray) -> None:
        self.points = np.asarray(points, dtype=float)

    def query(self, x: np.ndarray, k: int = 1) -> tuple[np.ndarray, np.ndarray]:
        """Distances and indices of the ``k`` nearest points to each of ``x`` (m, 2), nearest first.

        Shapes (m,) for ``k`` = 1, else (m, k), as :meth:`scipy.spatial.cKDTree.query`.
        """
        x = np.asarray(x, dtype=float)
        k = min(k, len(self.points))
        dist, index = np.empty((len(x), k)), np.empty((len(x), k), dtype=np.intp)
        for start in range(0, len(x), DIRECT_CHUNK):  # a few chunks: memory, not a point loop
            part = x[start:start + DIRECT_CHUNK]
            dx = part[:, None, 0] - self.points[None, :, 0]
            dy = part[:, None, 1] - self.points[None, :, 1]
            d = np.sqrt(dx * dx + dy * dy)
            order = np.argsort(d, axis=1, kind="stable")[:, :k]
            index[start:start + len(part)] = order
            dist[start:start + len(part)] = np.take_along_axis(d, order, axis=1)
        return (dist[:, 0], index[:, 0]) if k == 1 else (dist, index)


def point_search(points: np.ndarray) -> object:
    """A nearest-point search over ``points`` (n, 2): direct for a few, a k-d tree for many."""
    if len(points) <= DIRECT_SEARCH:
        return DirectSearch(points)
    from scipy.spatial import cKDTree

    return cKDTree(points)


def nearest_index(points: np.ndarray, queries: np.ndarray) -> np.ndarray:
    """Index of the nearest of ``points`` (n, 2) to each of ``queries`` (m, 2).

    A few queries (sharp corners) are answered by measuring every point; many, or a point
    equally near to two (which the k-d tree breaks its own way), by a k-d tree.

    Examples
    --------
    >>> nearest_index(np.array([[0.0, 0.0], [5.0, 0.0], [9.0, 1.0]]), np.array([[8.0, 0.0]])).tolist()
    [2]
    """
    queries = np.asarray(queries, dtype=float)
    pts = np.asarray(points, dtype=float)
    if len(queries) <= DIRECT_SEARCH:
        out = np.empty(len(queries), dtype=np.intp)
        tied = False
        for q, (x, y) in enumerate(queries):  # at most DIRECT_SEARCH corners
            dx, dy = pts[:, 0] - x, pts[:, 1] - y
            d2 = dx * dx + dy * dy
            out[q] = int(np.argmin(d2))
            tied |= int(np.count_nonzero(d2 == d2[out[q]])) > 1
        if not tied:
            return out
    # many queries, or two points equally near (a point repeated where loops meet): the k-d
    # tree's own choice, so that every mesh is the one it always was
    from scipy.spatial import cKDTree

    return cKDTree(pts).query(queries)[1]


def corner_target(tree: object, h_corner: np.ndarray, grade: float, points: np.ndarray) -> np.ndarray:
    """Exact min over corners k of h_k + grade * |point - corner k| at each point, drawing unit.

    The nearest :data:`CORNERS_NEAR` corners (a k-d tree over the corners) give a candidate
    minimum m; a corner further than (m - min h) / grade cannot do better, so the points whose
    nearest corners do not reach that far are asked again with twice as many, until every
    minimum is exact. Memory and time grow with the points times a few corners, not times all.
    ``tree`` is :func:`point_search` of the corners (a k-d tree or, for a few, direct search).

    Examples
    --------
    >>> corners = np.array([[0.0, 0.0], [10.0, 0.0]])
    >>> corner_target(point_search(corners), np.array([1.0, 0.1]), 0.5, np.array([[4.0, 0.0]])).tolist()
    [3.0]
    """
    n_corners = len(h_corner)
    out = np.empty(len(points))
    todo = np.arange(len(points))
    k = min(CORNERS_NEAR, n_corners)
    h_min = float(h_corner.min())
    while len(todo):
        d, i = tree.query(points[todo], k=k)
        d, i = d.reshape(len(todo), -1), i.reshape(len(todo), -1)
        best = (h_corner[i] + grade * d).min(axis=1)
        exact = (k == n_corners) | (d[:, -1] * grade >= best - h_min)
        out[todo[exact]] = best[exact]
        todo = todo[~exact]
        k = min(2 * k, n_corners)
    return out


def grade_to_corners(pts: np.ndarray, sub: np.ndarray, corners: np.ndarray, h_corner: np.ndarray,
                      grade: float) -> tuple[np.ndarray, np.ndarray]:
    """Bisect boundary segments until each is shorter than h_c + grade * (distance to corner).

    Parameters
    ----------
    pts, sub : numpy.ndarray
        Boundary points (p, 2) and segments (s, 2).
    corners : numpy.ndarray
        Corner points (k, 2).
    h_corner : numpy.ndarray
        Element size wanted at each corner (k,).
    grade : float
        Growth of the size with distance from a corner.
    """
    if len(corners) == 0:
        return pts, sub
    tree = point_search(corners)
    for _ in range(60):
        if len(pts) > MAX_BOUNDARY_POINTS:
            break  # refused by the caller, naming the count reached
        a, b = pts[sub[:, 0]], pts[sub[:, 1]]
        mid = 0.5 * (a + b)
        target = corner_target(tree, h_corner, grade, mid)
        split = np.linalg.norm(b - a, axis=1) > target
        if not split.any():
            break
        new = len(pts) + np.arange(int(split.sum()))
        pts = np.vstack([pts, mid[split]])
        s = sub[split]
        sub = np.vstack([sub[~split], np.column_stack([s[:, 0], new]), np.column_stack([new, s[:, 1]])])
    return pts, sub


def check_boundary_budget(pts: np.ndarray, seg: np.ndarray, target: np.ndarray,
                           full: Profile) -> None:
    """Refuse a boundary that would need more than MAX_BOUNDARY_POINTS points (a sliver)."""
    lengths = np.linalg.norm(pts[seg[:, 1]] - pts[seg[:, 0]], axis=1)
    needed = int(np.sum(np.ceil(lengths / target)))
    if needed > MAX_BOUNDARY_POINTS:
        thin = int(np.argmin(target))
        where = tuple(0.5 * (pts[seg[thin, 0]] + pts[seg[thin, 1]]))
        raise ProfileError(f"a wall thins to almost nothing (the mesh would need {needed:,} "
                           "boundary points); is the outline a sliver?", file=full.source,
                           where=where)


#: Element size at a small concave arc (a groove, a notch, a keyway's corner fillet: material
#: outside its circle and deep behind it), as a fraction of its radius, and the growth of the
#: size with distance from the arc. The warping of such a feature decays within a few radii of
#: it (a groove of radius a in a shaft: psi = -b y (1 + a^2 / r^2), Timoshenko & Goodier), so a
#: mesh graded from the feature's own size resolves it where the profile's size h does not.
#: Measured on a 40 mm shaft with a 2 mm groove against that closed form, Cw at the default
#: mesh and at fine: -6.9e-4 and -2.3e-4 ungraded (2779 and 9571 nodes), -4.2e-5 and -8.8e-6
#: graded (3917 and 11297); the bundled samples (fin roots, a keyway) get 20 % more nodes.
GROOVE_SIZE_FACTOR = 0.15
GROOVE_GRADING = 0.15
#: Concave arcs smaller than this many element sizes h get the grading (larger ones are meshed
#: finely enough by h and the wall thickness) ...
GROOVE_RADIUS_LIMIT = 2.0
#: ... and only where the material behind the arc is deeper than this many radii: a fillet
#: between two walls is as deep as the walls are thick and is meshed by their thickness
#: (without this rule, at a size of 0.1 r, the bundled samples took 80 % more nodes).
GROOVE_DEPTH_RATIO = 4.0


def groove_sizes(profile: Profile, h: float, refine: float) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Centres (k, 2), radii (k,) and sizes at the arc (k,) of the small concave circular arcs.

    A recorded circular arc is concave when the material lies outside its circle (its centre,
    just inside the arc, is not material); only arcs of radius below GROOVE_RADIUS_LIMIT h
    with material deeper than GROOVE_DEPTH_RATIO radii behind their middle count. Sizes in
    drawing units: GROOVE_SIZE_FACTOR times the radius over ``refine``.
    """
    arcs = [a for a in profile.arcs if a.a == a.b and a.a < GROOVE_RADIUS_LIMIT * h]
    if not arcs:
        return np.zeros((0, 2)), np.zeros(0), np.zeros(0)
    mid = np.array([a.at(np.array([a.start + 0.5 * a.sweep]))[0] for a in arcs])
    centre = np.array([(a.cx, a.cy) for a in arcs])
    radius = np.array([a.a for a in arcs])
    # a point just inside the circle at the arc's middle: material there means a convex arc
    probe = mid + 1e-3 * (centre - mid)
    concave = ~profile.covers(probe)
    # the depth of material behind the arc's middle: a ray away from the centre, started
    # beyond the polygon's chords (which lie inside the circle), to the next boundary
    out = (mid - centre) / radius[:, None]
    fv, fseg = planar_graph(profile)
    depth = first_hits(fv[fseg[:, 0]], fv[fseg[:, 1]], mid, out,
                       reach=1.01 * GROOVE_DEPTH_RATIO * float(radius.max()),
                       start=1e-6 * profile.size, t_min=1e-6 * profile.size)
    keep = concave & (depth > GROOVE_DEPTH_RATIO * radius)
    return centre[keep], radius[keep], GROOVE_SIZE_FACTOR * radius[keep] / refine


def groove_area_limits(points: np.ndarray, triangles: np.ndarray, centre: np.ndarray,
                       radius: np.ndarray, size: np.ndarray, h: float) -> np.ndarray:
    """Largest area (t,) of each triangle graded from small concave arcs, drawing unit squared.

    The size at a triangle's centroid is min over the arcs of size_k + GROOVE_GRADING times its
    distance from arc k's circle; -1 (no limit) where that is not below h.
    """
    cen = points[triangles].mean(axis=1)
    d = np.hypot(cen[:, None, 0] - centre[None, :, 0], cen[:, None, 1] - centre[None, :, 1])
    want = (size[None, :] + GROOVE_GRADING * np.abs(d - radius[None, :])).min(axis=1)
    area = np.sqrt(3.0) / 4.0 * want * want
    return np.where(want < h, area, -1.0)
