"""Quality meshes of six-node triangles (Triangle, through meshpy).

The mesh follows the profile's features: every boundary segment is split to a length tied to
the local wall thickness measured across the material, so a thin wall gets at least two
elements through its thickness, and Triangle grades the interior from there (minimum angle
30 degrees). Mid-side nodes are added afterwards, vectorised over the unique edges.

Examples
--------
>>> from warpwise.geometry.shapes import rectangle
>>> m = build_mesh(rectangle(20.0, 10.0), size=2.0)
>>> m.elements.shape[1], bool(abs(m.area - 200.0) < 1e-9)
(6, True)

"""

from __future__ import annotations

from dataclasses import dataclass
from functools import cached_property

import numpy as np
import shapely
from meshpy import triangle

from ..errors import UsageError
from ..geometry.profile import Profile
from ..geometry.symmetry import cut, mirror_mesh, symmetry_axes
from .arcs import follow_arcs
from .edges import Edges, mesh_edges
from .sizing import (
    ELEMENTS_ACROSS_WALL,
    MAX_ELEMENTS,
    default_size,
    groove_area_limits,
    groove_sizes,
)
from .triangulate import hole_seeds, to_quadratic, triangulate


@dataclass(frozen=True, eq=False)
class Triangulation:
    """The three-node Triangle mesh of the meshed part of a profile, kept for refinement.

    Attributes
    ----------
    points : numpy.ndarray
        Vertices (p, 2), drawing unit.
    triangles : numpy.ndarray
        Counter-clockwise triangles (t, 3).
    segments : numpy.ndarray
        Boundary and interface segments (s, 2).
    part : Profile
        The meshed part (the whole profile, or one half or quarter of a symmetric one).
    origin : tuple of int
        For each region of ``part``, the index of the profile region it belongs to.
    axes : tuple
        Mirror axes applied after meshing the part.
    profile : Profile
        The whole profile.
    """

    points: np.ndarray
    triangles: np.ndarray
    segments: np.ndarray
    part: Profile
    origin: tuple[int, ...]
    axes: tuple
    profile: Profile


@dataclass(frozen=True, eq=False)
class Mesh:
    """A mesh of six-node triangles.

    Attributes
    ----------
    nodes : numpy.ndarray
        Node coordinates (n, 2), drawing unit.
    elements : numpy.ndarray
        Connectivity (m, 6) int64: three corners counter-clockwise, then the mid-side nodes of
        edges (0, 1), (1, 2), (2, 0).
    region : numpy.ndarray
        Index (m,) into ``Profile.regions`` of the region each element belongs to.
    size : float
        Target element size used, drawing unit.
    triangulation : Triangulation or None
        The three-node triangulation the mesh was made from (for local refinement).

    """

    nodes: np.ndarray
    elements: np.ndarray
    region: np.ndarray
    size: float
    triangulation: Triangulation | None = None

    @cached_property
    def edges(self) -> Edges:
        """Unique edges, element-to-edge map, boundary and interface edges (derived once)."""
        return mesh_edges(self.elements, self.region)

    @property
    def linear(self) -> Triangulation | None:
        """Deprecated name of :attr:`triangulation` (kept for one release)."""
        import warnings

        warnings.warn("Mesh.linear is now Mesh.triangulation", DeprecationWarning, stacklevel=2)
        return self.triangulation

    @property
    def n_nodes(self) -> int:
        """Number of nodes."""
        return int(self.nodes.shape[0])

    @property
    def n_elements(self) -> int:
        """Number of elements."""
        return int(self.elements.shape[0])

    @property
    def area(self) -> float:
        """Sum of the straight-sided element areas (corners only), drawing unit squared."""
        p = self.nodes[self.elements[:, :3]]
        d1, d2 = p[:, 1] - p[:, 0], p[:, 2] - p[:, 0]
        return float(0.5 * np.sum(d1[:, 0] * d2[:, 1] - d1[:, 1] * d2[:, 0]))


def boundary_edges(elements: np.ndarray, region: np.ndarray | None = None) -> np.ndarray:
    """Boundary edges of a six-node mesh as rows (corner a, corner b, mid-side node).

    With ``region`` (element region indices), edges between two regions are included once.
    See :func:`warpwise.mesh.edges.mesh_edges`; :attr:`Mesh.edges` keeps them for a mesh.
    """
    edges = mesh_edges(elements, region)
    return edges.nodes[edges.outline_and_interfaces]


def build_mesh(profile: Profile, size: float | None = None, *, refine: float = 1.0,
               min_angle: float = 30.0, use_symmetry: bool = True,
               max_elements: int = MAX_ELEMENTS, boundary_refine: float | None = None) -> Mesh:
    """Mesh a profile into six-node triangles.

    Parameters
    ----------
    profile : Profile
        A validated profile.
    size : float, optional
        Largest element size, drawing unit. Default :func:`default_size`. Near thin walls the
        local size is smaller (the wall thickness over 2.5).
    refine : float
        Divides every local size (the largest size, the size across walls and at corners);
        2 halves all elements, 0.5 doubles them.
    min_angle : float
        Smallest angle of any triangle, degrees (Triangle's quality bound).
    use_symmetry : bool
        Mesh one half (or quarter) of a mirror-symmetric profile and mirror it, so that the
        mesh and the results are symmetric to round-off.
    max_elements : int
        Largest number of elements (``--max-elements``); the boundary-point limit scales with
        it. Default :data:`MAX_ELEMENTS`.
    boundary_refine : float, optional
        Pieces each drawn boundary segment is split into at the least, on average (a dense
        boundary, arcs drawn as chords, is refined by it too). Default ``refine``, and no split
        below 1; an error estimate refines a draft mesh's boundary relative to itself.

    Returns
    -------
    Mesh

    Raises
    ------
    UsageError
        For a non-positive size or a mesh that would exceed :data:`MAX_ELEMENTS`.
    """
    h = default_size(profile) if size is None else float(size)
    if not np.isfinite(h) or h <= 0:
        raise UsageError(f"mesh size must be a positive number, got {size!r}", file=None)
    if not (np.isfinite(refine) and refine > 0):
        raise UsageError(f"refinement factor must be a positive number, got {refine!r}")
    h /= refine
    estimate = profile.area / (0.43 * h * h)
    if estimate > max_elements:
        raise UsageError(
            f"mesh size {h:.4g} would give about {estimate:.3g} elements, more than the limit "
            f"of {max_elements:,}; choose a larger --mesh-size (--max-elements N lifts the limit)",
            file=profile.source,
        )
    axes = symmetry_axes(profile) if use_symmetry else []
    if axes:
        part, origin = cut(profile, axes)
    else:
        part, origin = profile, list(range(len(profile.regions)))
    nodes, tris, segs, region = triangulate(part, profile, h, min_angle,
                                             ELEMENTS_ACROSS_WALL * refine, refine, max_elements,
                                             refine if boundary_refine is None else boundary_refine)
    tri = Triangulation(nodes, tris, segs, part, tuple(origin), tuple(axes), profile)
    mesh = _quadratic_mesh(tri, region, h)
    centre, radius, at_arc = groove_sizes(profile, h, refine)
    if len(centre):
        # grooves and notches smaller than the mesh: graded from their own radius
        limits = groove_area_limits(tri.points, tri.triangles, centre, radius, at_arc, h)
        if (limits > 0).any():
            mesh = refine_mesh(mesh, limits, min_angle=min_angle)
    return mesh


def _quadratic_mesh(tri: Triangulation, region: np.ndarray, h: float) -> Mesh:
    """Six-node mesh of the whole profile from the part's triangulation (mirror, follow arcs)."""
    profile = tri.profile
    nodes6, elems6 = to_quadratic(tri.points, tri.triangles)
    region = np.asarray(tri.origin, dtype=np.int64)[region]
    for axis in tri.axes:
        nodes6, elems6, region = mirror_mesh(nodes6, elems6, region, axis, 1e-9 * profile.size)
    nodes6 = follow_arcs(nodes6, elems6, profile.arcs, region)
    return Mesh(nodes6, elems6, region, h, tri)


def _segments_of(tris: np.ndarray, region: np.ndarray) -> np.ndarray:
    """Boundary edges and edges between regions of a three-node triangulation."""
    return boundary_edges(tris, region)[:, :2]


def refine_mesh(mesh: Mesh, max_area: np.ndarray, *, min_angle: float = 30.0) -> Mesh:
    """Refine a mesh locally: each triangle of the meshed part gets an area limit.

    Parameters
    ----------
    mesh : Mesh
        A mesh made by :func:`build_mesh`.
    max_area : numpy.ndarray
        Largest area (t,) allowed in each triangle of ``mesh.triangulation`` (the first t elements of
        the mesh; mirrored copies follow them), drawing unit squared; a value <= 0 sets none.
    min_angle : float
        Smallest angle, degrees.

    Returns
    -------
    Mesh
        The refined six-node mesh, mirrored and on the arcs like the original.
    """
    tri = mesh.triangulation
    if tri is None:
        raise UsageError("this mesh was not made by build_mesh and cannot be refined")
    info = triangle.MeshInfo()
    info.set_points(tri.points)
    info.set_facets(tri.segments)
    info.elements.resize(len(tri.triangles))
    # meshpy has no bulk setter for elements: its own set_points loops the same way
    for i, t in enumerate(tri.triangles.tolist()):
        info.elements[i] = t
    info.element_volumes.setup()
    for i, a in enumerate(np.where(max_area > 0, max_area, -1.0).tolist()):
        info.element_volumes[i] = a
    holes = hole_seeds(tri.part)
    if holes:
        info.set_holes(holes)
    out = triangle.refine(info, min_angle=min_angle)
    nodes = np.asarray(out.points, dtype=float)
    tris = np.asarray(out.elements, dtype=np.int64)
    # region of each new triangle: the part region holding its centroid
    cen = nodes[tris].mean(axis=1)
    region = np.zeros(len(tris), dtype=np.int64)
    for k, reg in enumerate(tri.part.regions):
        region[shapely.contains_xy(reg.polygon, cen[:, 0], cen[:, 1])] = k
    segs = _segments_of(tris, region)
    new = Triangulation(nodes, tris, segs, tri.part, tri.origin, tri.axes, tri.profile)
    return _quadratic_mesh(new, region, mesh.size)
