"""Mirror symmetry: find a profile's symmetry axes, cut it, and mirror a mesh back.

A mirror-symmetric profile is meshed on one side of its axis (one quarter for two perpendicular
axes) and the mesh is mirrored, so the mesh itself is symmetric and so are the results: the
shear centre of a symmetric section lies on its axis and Ixy vanishes to round-off, instead
of to the discretisation error of an unsymmetric mesh.

Examples
--------
>>> from warpwise.geometry.shapes import rectangle
>>> [round(a.angle_deg) for a in symmetry_axes(rectangle(4.0, 2.0))]
[0, 90]
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
import shapely

from .loops import signed_area
from .profile import Profile, Region

#: Relative area (to the profile's area) within which a mirrored profile counts as the same.
SYMMETRY_TOLERANCE = 1e-9


@dataclass(frozen=True)
class Axis:
    """A mirror line through ``point`` at ``angle_deg`` from +x (drawing coordinates)."""

    point: tuple[float, float]
    angle_deg: float

    @property
    def normal(self) -> np.ndarray:
        """Unit normal of the line."""
        a = np.radians(self.angle_deg)
        return np.array([-np.sin(a), np.cos(a)])

    def distance(self, pts: np.ndarray) -> np.ndarray:
        """Signed distances (n,) of points (n, 2) from the line."""
        return (pts - np.asarray(self.point)) @ self.normal

    def mirror(self, pts: np.ndarray) -> np.ndarray:
        """Mirror images of points (n, 2)."""
        return pts - 2.0 * self.distance(pts)[:, None] * self.normal


def _mirror_geometry(geom: shapely.Geometry, axis: Axis) -> shapely.Geometry:
    return shapely.transform(geom, axis.mirror)


def _by_material(profile: Profile) -> dict[str | None, shapely.Geometry]:
    out: dict[str | None, list] = {}
    for r in profile.regions:
        out.setdefault(r.material, []).append(r.polygon)
    return {m: shapely.union_all(p) for m, p in out.items()}


def is_symmetric(profile: Profile, axis: Axis) -> bool:
    """True when mirroring about ``axis`` maps every material's region onto itself."""
    tol = SYMMETRY_TOLERANCE * profile.area
    for geom in _by_material(profile).values():
        if shapely.symmetric_difference(geom, _mirror_geometry(geom, axis)).area > tol:
            return False
    return True


def symmetry_axes(profile: Profile) -> list[Axis]:
    """Up to two perpendicular mirror axes of a profile (through its centroid).

    Candidates are the x and y directions and the principal directions of the area; the first
    symmetric candidate is kept, and a second one only if it is perpendicular to the first.
    """
    union = profile.geometry()
    c = union.centroid
    centre = (float(c.x), float(c.y))
    ix, iy, ixy = _polygon_moments(profile, centre)
    angles = [0.0, 90.0]
    if abs(ixy) > 1e-12 * (ix + iy):
        a = 0.5 * np.degrees(np.arctan2(-2.0 * ixy, ix - iy))
        angles += [a, a + 90.0]
    found: list[Axis] = []
    for ang in angles:
        axis = Axis(centre, float(ang))
        if found and abs(((ang - found[0].angle_deg) % 180.0) - 90.0) > 1e-9:
            continue
        if is_symmetric(profile, axis):
            found.append(axis)
        if len(found) == 2:
            break
    return found


def _polygon_moments(profile: Profile, centre: tuple[float, float]) -> tuple[float, float, float]:
    """Exact second moments (Ix, Iy, Ixy) of the polygons about ``centre`` (Green's theorem)."""
    ix = iy = ixy = 0.0
    for r in profile.regions:
        for loop in r.loops():
            p = loop - np.asarray(centre)
            x0, y0 = p[:, 0], p[:, 1]
            x1, y1 = np.roll(x0, -1), np.roll(y0, -1)
            cr = x0 * y1 - x1 * y0
            ix += float(np.sum(cr * (y0 * y0 + y0 * y1 + y1 * y1))) / 12.0
            iy += float(np.sum(cr * (x0 * x0 + x0 * x1 + x1 * x1))) / 12.0
            ixy += float(np.sum(cr * (x0 * y1 + 2 * x0 * y0 + 2 * x1 * y1 + x1 * y0))) / 24.0
    return ix, iy, ixy


def cut(profile: Profile, axes: list[Axis]) -> tuple[Profile, list[int]]:
    """The part of a profile on the positive side of every axis.

    Returns
    -------
    Profile
        The cut profile (not re-validated; vertices near an axis are snapped onto it).
    list of int
        For each region of the cut profile, the index of the region of ``profile`` it came from.
    """
    size = profile.size
    x0, y0, x1, y1 = profile.bounds
    big = 4.0 * size + abs(x0) + abs(y0) + abs(x1) + abs(y1)
    regions: list[Region] = []
    origin: list[int] = []
    for k, reg in enumerate(profile.regions):
        geom = reg.polygon
        for axis in axes:
            a = np.radians(axis.angle_deg)
            d = np.array([np.cos(a), np.sin(a)])
            p = np.asarray(axis.point)
            n = axis.normal
            half = shapely.Polygon([p - big * d, p + big * d, p + big * d + big * n, p - big * d + big * n])
            geom = geom.intersection(half)
        parts = getattr(geom, "geoms", [geom])
        for part in parts:
            if not isinstance(part, shapely.Polygon) or part.is_empty or part.area <= 0:
                continue

            def snap(loop: np.ndarray) -> np.ndarray:
                for axis in axes:
                    dist = axis.distance(loop)
                    near = np.abs(dist) < 1e-9 * size
                    loop = loop.copy()
                    loop[near] -= dist[near][:, None] * axis.normal
                return loop

            outer = snap(np.asarray(part.exterior.coords)[:-1])
            if signed_area(outer) < 0:
                outer = outer[::-1]
            holes = []
            for ring in part.interiors:
                h = snap(np.asarray(ring.coords)[:-1])
                holes.append(h[::-1] if signed_area(h) > 0 else h)
            regions.append(Region(outer, tuple(holes), reg.material))
            origin.append(k)
    return Profile(tuple(regions), profile.source, profile.units, profile.notes, profile.arcs,
                   profile.warnings), origin


def mirror_mesh(nodes: np.ndarray, elements: np.ndarray, region: np.ndarray, axis: Axis,
                tol: float) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Mirror a six-node mesh lying on one side of ``axis`` and join it along the axis.

    Nodes within ``tol`` of the axis are shared by both halves (their coordinates are kept),
    the mirrored elements are re-ordered to stay counter-clockwise.
    """
    on_axis = np.abs(axis.distance(nodes)) < tol
    n = len(nodes)
    new_index = np.where(on_axis, np.arange(n), -1)
    off = np.flatnonzero(~on_axis)
    new_index[off] = n + np.arange(len(off))
    mirrored = axis.mirror(nodes[off])
    elems_m = new_index[elements][:, [0, 2, 1, 5, 4, 3]]
    return (np.vstack([nodes, mirrored]), np.vstack([elements, elems_m]),
            np.concatenate([region, region]))
