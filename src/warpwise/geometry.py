"""Profiles: solid regions with holes, validated before anything is meshed.

A :class:`Profile` is one cross-section: one or more solid :class:`Region` objects, each a
counter-clockwise outer loop with clockwise holes and an optional material name. Regions never
overlap; a region of one material inside another is cut out of the outer one (an insert).

:func:`profile_from_loops` is the one place where raw loops (from a coordinate file, a DXF or
a parametric shape) become a profile: it checks every loop, nests them even-odd per material
and raises :class:`~warpwise.errors.ProfileError` naming the defect and where it is.

Examples
--------
>>> import numpy as np
>>> square = np.array([[0.0, 0.0], [10.0, 0.0], [10.0, 10.0], [0.0, 10.0]])
>>> hole = np.array([[3.0, 3.0], [7.0, 3.0], [7.0, 7.0], [3.0, 7.0]])
>>> p = profile_from_loops([square, hole])
>>> len(p.regions), len(p.regions[0].holes), p.area
(1, 1, 84.0)

"""

from __future__ import annotations

import re
from collections.abc import Sequence
from dataclasses import dataclass, field

import numpy as np
import shapely
from shapely.geometry import LinearRing, MultiPolygon, Point, Polygon
from shapely.validation import explain_validity

from .errors import ProfileError

#: Length units understood everywhere, with their size in millimetres.
LENGTH_UNITS: dict[str, float] = {"mm": 1.0, "cm": 10.0, "m": 1000.0, "in": 25.4}

#: Largest coordinate magnitude accepted, in the drawing unit (beyond it double precision
#: cannot resolve a wall of ordinary thickness).
MAX_COORDINATE = 1.0e9

#: Smallest angle between the two edges at a vertex, radians (below: a spike or a crack).
MIN_VERTEX_ANGLE = 1e-3

#: Relative size (to the largest dimension) below which two vertices are the same point.
POINT_TOLERANCE = 1.0e-9


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


@dataclass(frozen=True, eq=False)
class Region:
    """One solid region of a single material.

    Attributes
    ----------
    outer : numpy.ndarray
        Outer loop (n, 2), counter-clockwise, first point not repeated; drawing unit.
    holes : tuple of numpy.ndarray
        Hole loops, each (k, 2), clockwise.
    material : str or None
        Material name, or None for the profile's single material.

    """

    outer: np.ndarray
    holes: tuple[np.ndarray, ...] = ()
    material: str | None = None

    @property
    def polygon(self) -> Polygon:
        """The region as a shapely polygon."""
        return Polygon(self.outer, [h for h in self.holes])

    @property
    def area(self) -> float:
        """Area of the region, drawing unit squared."""
        return signed_area(self.outer) + sum(signed_area(h) for h in self.holes)

    def loops(self) -> tuple[np.ndarray, ...]:
        """Outer loop followed by the holes."""
        return (self.outer, *self.holes)


@dataclass(frozen=True)
class Arc:
    """A circular arc of the true outline, kept so that the mesh can follow the curve.

    The loops of a profile are polygons; an arc records where a run of their vertices lies on a
    circle, so that boundary nodes of the mesh can be placed on the circle itself.

    Attributes
    ----------
    cx, cy : float
        Centre, drawing unit.
    r : float
        Radius, drawing unit.
    start, sweep : float
        Start angle and counter-clockwise sweep (0 < sweep <= 2 pi), radians.
    """

    cx: float
    cy: float
    r: float
    start: float = 0.0
    sweep: float = 2.0 * np.pi

    def contains_angle(self, angle: np.ndarray, slack: float = 1e-9) -> np.ndarray:
        """True where an angle (radians) lies within the arc's sweep (inclusive)."""
        rel = np.mod(angle - self.start + slack, 2.0 * np.pi) - slack
        return rel <= self.sweep + slack

    def moved(self, rot: np.ndarray, off: np.ndarray, scale: float) -> Arc:
        """The arc after ``x -> rot @ x + off``, ``rot`` a rotation times ``scale``."""
        c = rot @ np.array([self.cx, self.cy]) + off
        turn = float(np.arctan2(rot[1, 0], rot[0, 0]))
        return Arc(float(c[0]), float(c[1]), self.r * scale, self.start + turn, self.sweep)


@dataclass(frozen=True, eq=False)
class Profile:
    """A validated cross-section: non-overlapping solid regions with holes.

    Attributes
    ----------
    regions : tuple of Region
        The solid regions.
    source : str
        Where the profile came from (file name or shape description).
    units : str
        Length unit of the coordinates, a key of :data:`LENGTH_UNITS`.
    notes : tuple of str
        Remarks made while reading (assumed units, repaired gaps...).
    arcs : tuple of Arc
        Circular arcs of the true outline (the loops are their polygon approximations).
    """

    regions: tuple[Region, ...]
    source: str = "<profile>"
    units: str = "mm"
    notes: tuple[str, ...] = field(default=())
    arcs: tuple[Arc, ...] = field(default=())

    @property
    def area(self) -> float:
        """Total area, drawing unit squared."""
        return float(sum(r.area for r in self.regions))

    @property
    def bounds(self) -> tuple[float, float, float, float]:
        """(xmin, ymin, xmax, ymax) of all outer loops, drawing unit."""
        pts = np.vstack([r.outer for r in self.regions])
        return (*pts.min(axis=0), *pts.max(axis=0))

    @property
    def size(self) -> float:
        """Largest dimension of the bounding box, drawing unit."""
        x0, y0, x1, y1 = self.bounds
        return float(max(x1 - x0, y1 - y0))

    @property
    def materials(self) -> tuple[str | None, ...]:
        """Distinct material names, in order of first appearance."""
        return tuple(dict.fromkeys(r.material for r in self.regions))

    def geometry(self) -> Polygon | MultiPolygon:
        """Union of all regions (material outline, interfaces dissolved) as shapely geometry."""
        return shapely.union_all([r.polygon for r in self.regions])

    def transformed(
        self, *, angle_deg: float = 0.0, shift: tuple[float, float] = (0.0, 0.0), scale: float = 1.0
    ) -> Profile:
        """Return a copy rotated about the origin, then scaled, then shifted.

        Parameters
        ----------
        angle_deg : float
            Counter-clockwise rotation, degrees.
        shift : (float, float)
            Translation, drawing unit.
        scale : float
            Positive scale factor.

        """
        if not scale > 0:
            raise ProfileError("scale factor must be positive", file=self.source)
        c, s = np.cos(np.radians(angle_deg)), np.sin(np.radians(angle_deg))
        rot = np.array([[c, -s], [s, c]]) * scale
        off = np.asarray(shift, dtype=float)

        def move(loop: np.ndarray) -> np.ndarray:
            return loop @ rot.T + off

        regions = tuple(
            Region(move(r.outer), tuple(move(h) for h in r.holes), r.material)
            for r in self.regions
        )
        arcs = tuple(a.moved(rot, off, scale) for a in self.arcs)
        return Profile(regions, self.source, self.units, self.notes, arcs)


_POINT_IN_TEXT = re.compile(r"\[\s*([-+0-9.eE]+)[\s,]+([-+0-9.eE]+)\s*\]")


def _where_from_shapely(text: str) -> tuple[float, float] | None:
    """Pull the coordinates out of a shapely validity explanation."""
    m = _POINT_IN_TEXT.search(text)
    return (float(m.group(1)), float(m.group(2))) if m else None


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
    arr = check_points(points, f"loop {index}", file=file)
    tol = POINT_TOLERANCE * max(scale, np.abs(arr).max(initial=0.0), 1e-300)
    if len(arr):
        step = np.linalg.norm(np.diff(arr, axis=0, append=arr[:1]), axis=1)
        arr = arr[step > tol]
    if len(arr) < 3:
        where = tuple(arr[0]) if len(arr) else None
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
        where = _where_from_shapely(explain_validity(Polygon(arr)))
        if where is None:
            crossing = shapely.intersection(ring, ring)
            where = tuple(np.asarray(crossing.representative_point().coords[0]))
        raise ProfileError(f"loop {index} crosses itself", file=file, where=where)
    return arr


def _nest(polys: list[Polygon]) -> list[int]:
    """Return the nesting depth of each polygon (how many others contain it)."""
    # loops never cross or touch (checked before), so one vertex tells inside from outside
    probes = [Point(p.exterior.coords[0]) for p in polys]
    return [
        sum(1 for j, pj in enumerate(polys) if j != i and pj.contains(probes[i]))
        for i in range(len(polys))
    ]


def _check_no_crossings(polys: list[Polygon], labels: list[int], file: str | None,
                        materials: Sequence[str | None]) -> None:
    """Raise when the boundaries of two loops of the same material cross or touch.

    Loops of different materials may share boundary (a bonded interface); whether their areas
    overlap is checked once the regions are built.
    """
    rings = [p.exterior for p in polys]
    size = max(max(np.ptp(np.asarray(r.coords), axis=0)) for r in rings)
    tol = POINT_TOLERANCE * size
    tree = shapely.STRtree(rings)
    # closer than the point tolerance counts as touching (the mesher cannot separate them)
    left, right = tree.query(rings, predicate="dwithin", distance=tol)
    for i, j in zip(left, right, strict=True):
        if i < j and materials[i] == materials[j]:
            meet = polys[i].exterior.intersection(polys[j].exterior)
            if meet.is_empty:  # not touching, only closer than the tolerance
                meet = shapely.shortest_line(polys[i].exterior, polys[j].exterior)
            where = tuple(np.asarray(meet.representative_point().coords[0]))
            raise ProfileError(
                f"loops {labels[i]} and {labels[j]} cross or touch", file=file, where=where
            )


def profile_from_loops(
    loops: Sequence[object],
    materials: Sequence[str | None] | None = None,
    *,
    source: str = "<profile>",
    units: str = "mm",
    notes: Sequence[str] = (),
    arcs: Sequence[Arc] = (),
) -> Profile:
    """Build a validated profile from closed loops.

    Loops of the same material nest even-odd: a loop inside one other is a hole, a loop
    inside a hole is a new solid island. A region of another material lying inside a region
    is an insert: it is cut out of the outer region, which keeps its material elsewhere.

    Parameters
    ----------
    loops : sequence of array_like
        Closed loops, each (n, 2), drawing unit, any orientation.
    materials : sequence of (str or None), optional
        Material of each loop; default all None (one material).
    source : str
        File or description named in messages.
    units : str
        Length unit, a key of :data:`LENGTH_UNITS`.
    notes : sequence of str
        Remarks carried into the profile.
    arcs : sequence of Arc
        Circular arcs the loops approximate (for curved element edges).

    Returns
    -------
    Profile

    Raises
    ------
    ProfileError
        For an empty profile, a bad loop, crossing loops, overlapping regions or an
        unknown unit.

    Examples
    --------
    >>> outer = [[0, 0], [4, 0], [4, 4], [0, 4]]
    >>> profile_from_loops([outer, [[1, 1], [5, 1], [5, 2], [1, 2]]])
    Traceback (most recent call last):
    ...
    warpwise.errors.ProfileError: loops 1 and 2 cross or touch at (4, 2)

    """
    file = None if source.startswith("<") else source
    if units not in LENGTH_UNITS:
        raise ProfileError(
            f"unknown length unit {units!r} (use one of {', '.join(LENGTH_UNITS)})", file=file
        )
    if len(loops) == 0:
        raise ProfileError("no closed loop found: the profile is empty", file=file)
    if materials is None:
        materials = [None] * len(loops)
    if len(materials) != len(loops):
        raise ProfileError("one material per loop is needed", file=file)
    raw = [check_points(p, f"loop {k + 1}", file=file) for k, p in enumerate(loops)]
    extent = max((float(np.abs(a).max(initial=0.0)) for a in raw), default=0.0)
    spans = [float(np.ptp(a, axis=0).max()) if len(a) else 0.0 for a in raw]
    scale = max(max(spans, default=0.0), extent * 1e-3)
    if scale <= 0:
        raise ProfileError("the profile has no extent (all points coincide)", file=file)
    cleaned = [clean_loop(a, k + 1, file=file, scale=scale) for k, a in enumerate(raw)]
    polys = [Polygon(a) for a in cleaned]
    labels = list(range(1, len(polys) + 1))
    _check_no_crossings(polys, labels, file, materials)

    # even-odd nesting among loops of one material -> solid polygons per material
    by_material: dict[str | None, list[int]] = {}
    for k, m in enumerate(materials):
        by_material.setdefault(m, []).append(k)
    solids: list[tuple[str | None, Polygon]] = []
    for mat, idx in by_material.items():
        group = [polys[k] for k in idx]
        depth = _nest(group)
        for a, pa in enumerate(group):
            if depth[a] % 2:
                continue
            holes = [
                group[b] for b in range(len(group))
                if depth[b] == depth[a] + 1 and pa.contains(Point(group[b].exterior.coords[0]))
            ]
            poly = Polygon(pa.exterior.coords, [h.exterior.coords for h in holes])
            solids.append((mat, poly))

    # regions of different materials: an insert replaces the outer material
    regions: list[Region] = []
    if len(by_material) > 1:
        cut = []
        for a, (ma, pa) in enumerate(solids):
            for b, (mb, pb) in enumerate(solids):
                if a == b or ma == mb:
                    continue
                if pa.contains(pb):
                    pa = pa.difference(pb)
                elif pa.overlaps(pb) and pa.intersection(pb).area > 1e-12 * scale**2:
                    where = tuple(np.asarray(pa.intersection(pb).representative_point().coords[0]))
                    raise ProfileError(
                        f"regions of materials {ma!r} and {mb!r} overlap", file=file, where=where
                    )
            cut.append((ma, pa))
        solids = cut
    for mat, poly in solids:
        parts = list(poly.geoms) if hasattr(poly, "geoms") else [poly]
        for part in parts:
            if part.is_empty or part.area <= 0:
                continue
            outer = np.asarray(part.exterior.coords)[:-1]
            if signed_area(outer) < 0:
                outer = outer[::-1]
            holes = []
            for ring in part.interiors:
                h = np.asarray(ring.coords)[:-1]
                holes.append(h[::-1] if signed_area(h) > 0 else h)
            region = Region(outer, tuple(holes), mat)
            if not region.polygon.is_valid:
                text = explain_validity(region.polygon)
                raise ProfileError(
                    f"invalid region ({text.split('[')[0].strip().lower()})",
                    file=file, where=_where_from_shapely(text),
                )
            regions.append(region)
    if not regions:
        raise ProfileError("no solid region found", file=file)
    return Profile(tuple(regions), source, units, tuple(notes), tuple(arcs))
