"""Loop checks and even-odd nesting: the one place where raw loops are judged.

A loop is a closed polygon given by its vertices (drawing unit, no closing repeat needed).
:func:`clean_loop` checks one loop (finite, at least three distinct points, some area, no
spike, no self-contact or crossing); :func:`check_no_crossings` checks that the loops of one
material neither cross nor touch; :func:`even_odd_solids` nests them even-odd (a loop inside
one other is a hole, inside a hole a new island). The profile builder uses these functions;
the DXF reader, which lists every defect instead of stopping at the first, builds on the same
parts: :func:`crossing_point` (where a loop crosses itself), :func:`meeting_pairs` and
:func:`meeting_point` (loops that cross or touch, and where) and :func:`even_odd_nesting`
(depth and parent of each loop).
"""

from __future__ import annotations

import re
from collections.abc import Sequence

import numpy as np
import shapely
from shapely.geometry import LinearRing, Point, Polygon
from shapely.validation import explain_validity

from ..errors import ProfileError

#: Largest coordinate magnitude accepted, in the drawing unit (beyond it double precision
#: cannot resolve a wall of ordinary thickness).
MAX_COORDINATE = 1.0e9

#: Smallest angle between the two edges at a vertex, radians (below: a spike or a crack).
MIN_VERTEX_ANGLE = 1e-3

#: Relative size (to the largest dimension) below which two vertices are the same point.
POINT_TOLERANCE = 1.0e-9

#: Smallest profile handled, across, in the drawing unit (below it the sixth powers of the
#: coordinates in the warping constant leave double precision).
MIN_SIZE = 1.0e-12


def check_points(points: object, what: str = "points", *, file: str | None = None) -> np.ndarray:
    """Return ``points`` as a float array of shape (n, 2), or raise a ProfileError.

    Parameters
    ----------
    points : array_like
        Coordinates, drawing length unit.
    what : str
        Name of the argument, used in the message.
    file : str, optional
        Source named in the message.

    Returns
    -------
    numpy.ndarray
        Array of shape (n, 2), dtype float64, all finite.

    Examples
    --------
    >>> check_points([[0, 0], [1, 0], [1, 1]]).shape
    (3, 2)
    >>> check_points([[0, 0, 0]])
    Traceback (most recent call last):
    ...
    warpwise.errors.ProfileError: points must have shape (n, 2), got (1, 3)

    """
    try:
        arr = np.asarray(points, dtype=float)
    except (TypeError, ValueError):
        raise ProfileError(f"{what} are not numbers", file=file) from None
    if arr.ndim != 2 or arr.shape[1] != 2:
        raise ProfileError(f"{what} must have shape (n, 2), got {arr.shape}", file=file)
    if not np.all(np.isfinite(arr)):
        i = int(np.flatnonzero(~np.all(np.isfinite(arr), axis=1))[0])
        raise ProfileError(f"{what} contain a non-finite coordinate (vertex {i + 1})", file=file)
    big = np.abs(arr).max(initial=0.0)
    if big > MAX_COORDINATE:
        raise ProfileError(
            f"{what}: a coordinate of {big:.3g} is beyond the limit of {MAX_COORDINATE:.0e}",
            file=file,
        )
    return arr


def signed_area(loop: np.ndarray) -> float:
    """Signed area of a closed polygon (shoelace), positive when counter-clockwise.

    Parameters
    ----------
    loop : numpy.ndarray
        Vertices (n, 2) without the closing repeat, drawing unit.

    Returns
    -------
    float
        Area in drawing unit squared.

    Examples
    --------
    >>> signed_area(np.array([[0.0, 0.0], [2.0, 0.0], [2.0, 1.0], [0.0, 1.0]]))
    2.0

    """
    x, y = loop[:, 0], loop[:, 1]
    return 0.5 * float(np.dot(x, np.roll(y, -1)) - np.dot(np.roll(x, -1), y))


_POINT_IN_TEXT = re.compile(r"\[\s*([-+0-9.eE]+)[\s,]+([-+0-9.eE]+)\s*\]")


def where_from_shapely(text: str) -> tuple[float, float] | None:
    """Pull the coordinates out of a shapely validity explanation."""
    m = _POINT_IN_TEXT.search(text)
    return (float(m.group(1)), float(m.group(2))) if m else None


def crossing_point(ring: LinearRing) -> tuple[float, float]:
    """A point where a ring that is not simple crosses or touches itself.

    Parameters
    ----------
    ring : shapely.LinearRing
        A closed ring for which ``ring.is_simple`` is False.

    Returns
    -------
    (float, float)
        The point shapely's validity explanation names, else a point of the ring's
        self-intersection.

    Examples
    --------
    >>> crossing_point(LinearRing([(0, 0), (2, 2), (2, 0), (0, 2)]))
    (1.0, 1.0)

    """
    where = where_from_shapely(explain_validity(Polygon(ring)))
    if where is None:
        crossing = shapely.intersection(ring, ring)
        where = tuple(np.asarray(crossing.representative_point().coords[0]))
    return where


def meeting_pairs(rings: Sequence[LinearRing], distance: float | None = None) -> list[tuple[int, int]]:
    """Pairs of rings that meet, each pair once (first index smaller), in index order.

    Parameters
    ----------
    rings : sequence of shapely.LinearRing
        Loop boundaries.
    distance : float, optional
        Rings closer than this count as meeting; default: only rings that intersect.

    Returns
    -------
    list of (int, int)

    """
    tree = shapely.STRtree(rings)
    if distance is None:
        left, right = tree.query(rings, predicate="intersects")
    else:
        left, right = tree.query(rings, predicate="dwithin", distance=distance)
    return [(int(i), int(j)) for i, j in zip(left, right, strict=True) if i < j]


def meeting_point(a: LinearRing, b: LinearRing) -> tuple[tuple[float, float], shapely.Geometry]:
    """Where two rings meet (or come closest), and what they share.

    Returns
    -------
    where : (float, float)
        A point of their intersection, or of the shortest line between them when they do not
        intersect.
    meet : shapely.Geometry
        Their intersection (empty when they only come close).

    """
    meet = a.intersection(b)
    line = meet if not meet.is_empty else shapely.shortest_line(a, b)
    return tuple(np.asarray(line.representative_point().coords[0])), meet


def clean_loop(points: object, index: int, *, file: str | None = None, scale: float = 1.0) -> np.ndarray:
    """Check one loop and return it without repeated or closing points.

    Parameters
    ----------
    points : array_like
        Vertices (n, 2), drawing unit; the first point may be repeated at the end.
    index : int
        One-based loop number, for messages.
    file : str, optional
        Source named in messages.
    scale : float
        Size of the whole drawing, used for the point tolerance, drawing unit.

    Returns
    -------
    numpy.ndarray
        Vertices (k, 2), k >= 3, no two consecutive vertices equal.

    Raises
    ------
    ProfileError
        Too few points, zero area, or a self-crossing loop (with the crossing point).

    """
    given = check_points(points, f"loop {index}", file=file)
    tol = POINT_TOLERANCE * max(scale, np.abs(given).max(initial=0.0), 1e-300)
    arr = given
    if len(arr):
        step = np.hypot(*np.diff(arr, axis=0, append=arr[:1]).T)  # hypot: no underflow
        arr = arr[step > tol]
    if len(arr) < 3:
        where = tuple(given[0]) if len(given) else None
        size = float(np.ptp(given, axis=0).max()) if len(given) else 0.0
        if len({tuple(p) for p in given.tolist()}) >= 3:
            raise ProfileError(f"loop {index} is {size:.3g} across, below the joining tolerance "
                               f"of {tol:.3g} ({POINT_TOLERANCE:g} of the profile's size): its "
                               f"{len(given)} points join into {len(arr)}", file=file, where=where)
        raise ProfileError(
            f"loop {index} has {len(arr)} distinct point(s); a loop needs at least 3",
            file=file, where=where,
        )
    centred = arr - arr.mean(axis=0)
    spread = np.linalg.svd(centred, compute_uv=False)
    if spread[1] <= 1e-9 * spread[0]:
        raise ProfileError(
            f"loop {index} encloses no area (all its points lie on one line)",
            file=file, where=tuple(arr[0]),
        )
    # a spike or crack (two edges meeting at almost zero angle) cannot be meshed sensibly
    e_back = np.roll(arr, 1, axis=0) - arr
    e_fwd = np.roll(arr, -1, axis=0) - arr
    cosang = np.einsum("ij,ij->i", e_back, e_fwd) / (
        np.linalg.norm(e_back, axis=1) * np.linalg.norm(e_fwd, axis=1))
    spikes = np.flatnonzero(cosang > np.cos(MIN_VERTEX_ANGLE))
    if len(spikes):
        k = int(spikes[0])
        raise ProfileError(f"loop {index} has a spike: two edges meet at less than "
                           f"{np.degrees(MIN_VERTEX_ANGLE):.2g} degrees", file=file,
                           where=(float(arr[k, 0]), float(arr[k, 1])))
    ring = LinearRing(arr)
    # a vertex closer to a non-adjacent edge than the point tolerance touches it (the mesher
    # cannot separate them)
    n = len(arr)
    segs = shapely.linestrings(np.stack([arr, np.roll(arr, -1, axis=0)], axis=1))
    vi, si = shapely.STRtree(segs).query(shapely.points(arr), predicate="dwithin", distance=tol)
    near = (si != vi) & (si != (vi - 1) % n)
    if near.any():
        k = int(vi[near][0])
        raise ProfileError(f"loop {index} touches itself (a vertex lies on another of its edges)",
                           file=file, where=(float(arr[k, 0]), float(arr[k, 1])))
    if not ring.is_simple:
        raise ProfileError(f"loop {index} crosses itself", file=file, where=crossing_point(ring))
    return arr


def even_odd_nesting(polys: Sequence[Polygon], materials: Sequence[str | None] | None = None) -> tuple[
        np.ndarray, np.ndarray]:
    """Even-odd nesting depth of each loop and the loop it lies in directly.

    Parameters
    ----------
    polys : sequence of shapely.Polygon
        Loops that neither cross nor touch (see :func:`check_no_crossings`).
    materials : sequence of (str or None), optional
        Material of each loop; only loops of one material nest in each other.

    Returns
    -------
    depth : numpy.ndarray of int
        How many loops of its material contain each loop (even: solid boundary, odd: hole).
    parent : numpy.ndarray of int
        The loop one level up that contains each loop, -1 for none.

    Examples
    --------
    >>> sq = lambda a, b: Polygon([(a, a), (b, a), (b, b), (a, b)])
    >>> depth, parent = even_odd_nesting([sq(0, 10), sq(2, 8), sq(4, 6)])
    >>> depth.tolist(), parent.tolist()
    ([0, 1, 2], [-1, 0, 1])

    """
    n = len(polys)
    mats = [None] * n if materials is None else list(materials)
    depth = np.zeros(n, dtype=np.int64)
    parent = np.full(n, -1)
    if n == 0:
        return depth, parent
    # loops never cross or touch (checked before), so one vertex tells inside from outside
    probes = [Point(p.exterior.coords[0]) for p in polys]
    inner, outer = shapely.STRtree(polys).query(probes, predicate="within")
    same = np.array([mats[i] == mats[j] for i, j in zip(inner, outer, strict=True)], bool)
    if len(same):
        inner, outer = inner[same], outer[same]
    np.add.at(depth, inner, 1)
    for i, j in zip(inner, outer, strict=True):
        if depth[j] == depth[i] - 1:
            parent[i] = j
    return depth, parent


def nest_depths(polys: list[Polygon]) -> list[int]:
    """Return the nesting depth of each polygon (how many others contain it)."""
    return [int(d) for d in even_odd_nesting(polys)[0]]


def check_no_crossings(polys: list[Polygon], labels: list[int], file: str | None,
                        materials: Sequence[str | None]) -> None:
    """Raise when the boundaries of two loops of the same material cross or touch.

    Loops of different materials may share boundary (a bonded interface); whether their areas
    overlap is checked once the regions are built.
    """
    rings = [p.exterior for p in polys]
    size = max(max(np.ptp(np.asarray(r.coords), axis=0)) for r in rings)
    # closer than the point tolerance counts as touching (the mesher cannot separate them)
    for i, j in meeting_pairs(rings, POINT_TOLERANCE * size):
        if materials[i] == materials[j]:
            where, _ = meeting_point(rings[i], rings[j])
            raise ProfileError(
                f"loops {labels[i]} and {labels[j]} cross or touch", file=file, where=where
            )


def even_odd_solids(polys: Sequence[Polygon]) -> list[tuple[int, list[int]]]:
    """Nest loops even-odd: each solid as (index of its outer loop, indices of its holes).

    Parameters
    ----------
    polys : sequence of shapely.Polygon
        Loops that neither cross nor touch (see :func:`check_no_crossings`).

    Returns
    -------
    list of (int, list of int)
        Loops at even depth are outer boundaries; each gets the loops one level deeper that
        lie inside it as holes.

    Examples
    --------
    >>> sq = lambda a, b: Polygon([(a, a), (b, a), (b, b), (a, b)])
    >>> even_odd_solids([sq(0, 10), sq(2, 8), sq(4, 6)])
    [(0, [1]), (2, [])]
    """
    depth, parent = even_odd_nesting(polys)
    return [(int(a), [int(b) for b in np.flatnonzero(parent == a)])
            for a in np.flatnonzero(depth % 2 == 0)]
