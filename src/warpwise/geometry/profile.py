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

import math
from collections.abc import Sequence
from dataclasses import dataclass, field

import numpy as np
import shapely
from shapely.geometry import MultiPolygon, Polygon
from shapely.validation import explain_validity

from ..errors import ProfileError
from ..units import LENGTH_UNITS
from .curves import Arc, Curve, EllipseArc  # noqa: F401 (Arc, EllipseArc: re-exported here, their first home)
from .loops import (
    MIN_SIZE,
    check_no_crossings,
    check_points,
    clean_loop,
    even_odd_solids,
    signed_area,
    where_from_shapely,
)

#: Default largest element size as a fraction of sqrt(A) (J of a square within 2e-4 at this
#: size); the mesher's default and the DXF reader's default chord tolerance both follow it.
DEFAULT_SIZE_FACTOR = 0.125


def default_element_size(area: float) -> float:
    """Default largest element size for a section of ``area``, drawing unit.

    Examples
    --------
    >>> default_element_size(400.0)
    2.5
    """
    return DEFAULT_SIZE_FACTOR * math.sqrt(area)

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
    arcs : tuple of Curve
        Circular arcs (:class:`Arc`) and elliptical arcs (:class:`EllipseArc`) of the true
        outline (the loops are their polygon approximations).
    warnings : tuple of str
        Doubts about the input every report must show (an implausible size for an assumed
        unit...), one line each.
    """

    regions: tuple[Region, ...]
    source: str = "<profile>"
    units: str = "mm"
    notes: tuple[str, ...] = field(default=())
    arcs: tuple[Curve, ...] = field(default=())
    warnings: tuple[str, ...] = field(default=())

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

    def covers(self, points: Sequence[Sequence[float]] | np.ndarray) -> np.ndarray:
        """True for each point (k, 2) in or on the material, drawing unit.

        The polygon's edges count (to 1e-9 of the size), and the true arcs decide between
        their chords: the sliver between an arc bulging out of the material and its chords is
        material (an extreme fibre on a round face lies there), the sliver between the chords
        of a round hole or inside fillet and the true arc is not.
        """
        pts = np.asarray(points, dtype=float).reshape(-1, 2)
        geom = self.geometry()
        d = shapely.distance(geom, shapely.points(pts))
        ok = d <= 1e-9 * self.size
        boundary = geom.boundary
        for arc in self.arcs:
            m = arc.at(arc.start + 0.5 * arc.sweep)  # the true curve's middle
            out = m - np.array([arc.cx, arc.cy])
            out /= np.hypot(*out)
            # a step towards the centre past the chords (twice m's distance from them) lands in
            # the material when it lies inside the curve, in the hole when outside it
            step = 2.0 * boundary.distance(shapely.Point(*m)) + 1e-6 * min(arc.a, arc.b)
            inward = m - step * out
            rho = arc.rho(pts)
            swept = arc.contains_angle(arc.param(pts))
            if geom.covers(shapely.Point(*inward)):  # material inside the curve
                ok |= (rho <= 1.0 + 1e-9) & swept & (d <= 0.1 * min(arc.a, arc.b))
            else:  # material outside it (a round hole, an inside fillet)
                ok &= ~((rho < 1.0 - 1e-9) & swept)
        return ok

    def transformed(self, **kwargs: object) -> Profile:
        """Deprecated name of :meth:`moved` (kept for one release)."""
        import warnings

        warnings.warn("Profile.transformed is now Profile.moved", DeprecationWarning, stacklevel=2)
        return self.moved(**kwargs)  # type: ignore[arg-type]

    def moved(
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
        return Profile(regions, self.source, self.units, self.notes, arcs, self.warnings)


def _check_scale(scale: float, units: str, file: str | None) -> None:
    """Refuse a profile without extent, or smaller than :data:`~warpwise.geometry.loops.MIN_SIZE`."""
    if scale <= 0:
        raise ProfileError("the profile has no extent (all points coincide)", file=file)
    if scale < MIN_SIZE:
        raise ProfileError(f"the profile is {scale:.3g} {units} across, below the smallest size "
                           f"handled ({MIN_SIZE:g} {units}): its points cannot be told apart",
                           file=file)


def profile_from_loops(
    loops: Sequence[object],
    materials: Sequence[str | None] | None = None,
    *,
    source: str = "<profile>",
    units: str = "mm",
    notes: Sequence[str] = (),
    arcs: Sequence[Curve] = (),
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
    arcs : sequence of Curve
        Circular and elliptical arcs the loops approximate (for curved element edges).

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
    _check_scale(scale, units, file)
    cleaned = [clean_loop(a, k + 1, file=file, scale=scale) for k, a in enumerate(raw)]
    polys = [Polygon(a) for a in cleaned]
    labels = list(range(1, len(polys) + 1))
    check_no_crossings(polys, labels, file, materials)

    # even-odd nesting among loops of one material -> solid polygons per material
    by_material: dict[str | None, list[int]] = {}
    for k, m in enumerate(materials):
        by_material.setdefault(m, []).append(k)
    solids: list[tuple[str | None, Polygon]] = []
    for mat, idx in by_material.items():
        group = [polys[k] for k in idx]
        for a, holes in even_odd_solids(group):
            poly = Polygon(group[a].exterior.coords, [group[b].exterior.coords for b in holes])
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
                    file=file, where=where_from_shapely(text),
                )
            regions.append(region)
    if not regions:
        raise ProfileError("no solid region found", file=file)
    return Profile(tuple(regions), source, units, tuple(notes), tuple(arcs))
