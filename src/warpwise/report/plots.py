"""Pictures of a section: outline with axes, warping, torsion and combined-load stresses.

Every function returns a :class:`matplotlib.figure.Figure` built without pyplot, so no global
plotting state is touched and the functions are safe in scripts, servers and tests. Write a
figure with :func:`save_figure` (PNG, SVG or PDF, atomically) or embed it in a web page with
:func:`svg_text`.

Fields on the six-node mesh are drawn by splitting every element into four straight
sub-triangles through its corner and mid-side nodes, so curved edges and the quadratic
variation inside an element both show.

Examples
--------
>>> from warpwise import analyse
>>> from warpwise.geometry.shapes import rectangle
>>> fig = figure_outline(analyse(rectangle(40.0, 20.0)), show_mesh=False)
>>> svg_text(fig).startswith("<svg")
True

"""

from __future__ import annotations

import hashlib
import io
import re
from collections.abc import Mapping
from pathlib import Path

import numpy as np
from matplotlib import rc_context
from matplotlib.figure import Figure
from matplotlib.lines import Line2D
from matplotlib.patches import Circle, Patch, PathPatch
from matplotlib.path import Path as MplPath
from matplotlib.ticker import MaxNLocator
from matplotlib.tri import Triangulation

from ..errors import UsageError
from ..geometry.corners import exclusion_radius, reentrant_corners
from ..properties.analysis import SectionResult
from ..stress import Loads, combined_stress, torsion_stress
from .files import atomic_write
from .quantities import FORCE_UNITS

#: Fill colours of the materials (regions of the first material take the first colour).
MATERIAL_COLOURS = ("#a9c4dc", "#e2c48a", "#b4d6a6", "#d9aab0", "#c6b8dc", "#bfc7cf")
#: Colour of outlines and interfaces.
EDGE_COLOUR = "#24313c"
#: Colour of mesh edges.
MESH_COLOUR = "#4f6475"
#: Colour of the centroid marker and of principal axis 1; of axis 2; of the shear centre.
CENTROID_COLOUR = "#111111"
AXIS1_COLOUR = "#1d4f91"
AXIS2_COLOUR = "#b4541a"
SHEAR_CENTRE_COLOUR = "#c0182b"
#: Colour maps: warping and normal stress (signed, centred at zero), stress magnitudes.
SIGNED_MAP = "RdBu_r"
MAGNITUDE_MAP = "YlOrRd"
#: Number of colour bands in the contour pictures.
BANDS = 16
#: Figure width, inches.
WIDTH = 7.0
#: Raster resolution of PNG files, dots per inch.
PNG_DPI = 150
#: Formats :func:`save_figure` writes.
FORMATS = ("png", "svg", "pdf")


# ----------------------------------------------------------------------------------------------
# mesh helpers (vectorised over elements)

def sub_triangles(elements: np.ndarray) -> np.ndarray:
    """Split six-node triangles into four three-node triangles each.

    Parameters
    ----------
    elements : numpy.ndarray
        Connectivity (m, 6): corners counter-clockwise, then mid-side nodes of edges (0, 1),
        (1, 2), (2, 0).

    Returns
    -------
    numpy.ndarray
        Connectivity (4 m, 3), counter-clockwise: the three corner triangles, then the middle.

    Examples
    --------
    >>> sub_triangles(np.array([[0, 1, 2, 3, 4, 5]])).tolist()
    [[0, 3, 5], [3, 1, 4], [5, 4, 2], [3, 4, 5]]

    """
    e = np.asarray(elements)
    return e[:, [0, 3, 5, 3, 1, 4, 5, 4, 2, 3, 4, 5]].reshape(-1, 3)


def element_edges(elements: np.ndarray, boundary_only: bool = False,
                  region: np.ndarray | None = None) -> np.ndarray:
    """Unique element edges as node triples (corner, mid-side node, corner).

    Parameters
    ----------
    elements : numpy.ndarray
        Six-node connectivity (m, 6).
    boundary_only : bool
        Keep only edges of one element (the outline) and, with ``region``, edges between
        elements of different regions (material interfaces).
    region : numpy.ndarray, optional
        Region index (m,) of each element.

    Returns
    -------
    numpy.ndarray
        Node indices (k, 3) of each edge, in drawing order.

    Examples
    --------
    >>> two = np.array([[0, 1, 2, 4, 5, 6], [1, 3, 2, 7, 8, 5]])
    >>> len(element_edges(two)), len(element_edges(two, boundary_only=True))
    (5, 4)

    """
    e = np.asarray(elements)
    triples = e[:, [0, 3, 1, 1, 4, 2, 2, 5, 0]].reshape(-1, 3)
    key = np.sort(triples[:, [0, 2]], axis=1)
    _, first, inverse, counts = np.unique(key, axis=0, return_index=True, return_inverse=True,
                                          return_counts=True)
    if not boundary_only:
        return triples[first]
    keep = counts == 1
    if region is not None:
        owner = np.repeat(np.asarray(region), 3)
        lo = np.full(len(first), np.iinfo(np.int64).max)
        hi = np.full(len(first), -1)
        np.minimum.at(lo, inverse.reshape(-1), owner)
        np.maximum.at(hi, inverse.reshape(-1), owner)
        keep |= lo != hi
    return triples[first[keep]]


def _triangulation(result: SectionResult, mask: np.ndarray | None = None) -> Triangulation:
    """Linear triangulation of (some of) the mesh's six-node elements."""
    mesh = result.mesh
    elems = mesh.elements if mask is None else mesh.elements[mask]
    return Triangulation(mesh.nodes[:, 0], mesh.nodes[:, 1], sub_triangles(elems))


# ----------------------------------------------------------------------------------------------
# drawing pieces

def profile_name(result: SectionResult) -> str:
    """Short name of the analysed profile: the file name, or the shape description."""
    src = result.profile.source
    if src.startswith("<"):
        return "profile"
    return Path(src).name or src


def _stress_unit(result: SectionResult) -> str:
    return FORCE_UNITS[result.units][1]


def _new_figure(result: SectionResult) -> tuple[Figure, object]:
    """A figure with one equal-aspect axes in the drawing unit (sized by :func:`_finish`)."""
    fig = Figure(figsize=(WIDTH, WIDTH), layout="constrained")
    ax = fig.add_subplot()
    ax.set_aspect("equal")
    unit = result.units
    ax.set_xlabel(f"x ({unit})")
    ax.set_ylabel(f"y ({unit})")
    ax.grid(True, lw=0.4, color="#c9d1d8", alpha=0.8)
    ax.set_axisbelow(True)
    for side in ("top", "right"):
        ax.spines[side].set_visible(False)
    return fig, ax


def _finish(fig: Figure, ax: object, result: SectionResult, title: str, handles: list, *,
            ncols: int = 2, colour_bar: bool = False, margin: float = 0.06,
            width: float = WIDTH) -> None:
    """Set the limits, title and legend, and a figure height that fits the profile's shape."""
    x0, y0, x1, y1 = result.profile.bounds
    pad = margin * result.profile.size
    ax.set_xlim(x0 - pad, x1 + pad)
    ax.set_ylim(y0 - pad, y1 + pad)
    lines = title.count("\n") + 1
    ax.set_title(title, fontsize=10, loc="left", color="#33414d")
    fig.legend(handles=handles, loc="outside lower center", ncols=ncols, frameon=False,
               fontsize=8.5, handlelength=2.2, columnspacing=1.6)
    ratio = (y1 - y0 + 2 * pad) / (x1 - x0 + 2 * pad)
    plot_width = width - 0.9 - (1.3 if colour_bar else 0.0)
    rows = -(-len(handles) // ncols)
    height = plot_width * ratio + 0.75 + 0.22 * lines + 0.21 * rows + 0.15
    fig.set_size_inches(width, float(np.clip(height, 3.0, 12.0)))
    # lay out once and keep it: later draws (PNG, SVG, again) all show the same picture
    fig.draw_without_rendering()
    fig.set_layout_engine("none")


def _region_path(region: object) -> MplPath:
    """A compound path of one region: outer loop and its holes (non-zero fill)."""
    loops = [np.asarray(loop, dtype=float) for loop in region.loops()]
    verts = np.vstack([np.vstack([p, p[:1]]) for p in loops])
    codes = np.concatenate([
        np.r_[MplPath.MOVETO, np.full(len(p) - 1, MplPath.LINETO), MplPath.CLOSEPOLY]
        for p in loops
    ]).astype(MplPath.code_type)
    return MplPath(verts, codes)


def _material_names(result: SectionResult) -> list[str]:
    """Name shown for each region's material ("section" for geometry only)."""
    regions = result.profile.regions
    mats = result.materials.materials
    if len(mats) == len(regions):
        return [m.name for m in mats]
    if len(mats) == 1:
        return [mats[0].name] * len(regions)
    return [r.material or "section" for r in regions]


def _draw_fill(ax: object, result: SectionResult) -> list[Patch]:
    """Fill each region in its material colour; return one legend patch per material."""
    names = _material_names(result)
    order = list(dict.fromkeys(names))
    for region, name in zip(result.profile.regions, names, strict=True):
        colour = MATERIAL_COLOURS[order.index(name) % len(MATERIAL_COLOURS)]
        ax.add_patch(PathPatch(_region_path(region), facecolor=colour, edgecolor="none", zorder=1))
    if len(order) == 1 and order[0] == "section":
        return [Patch(facecolor=MATERIAL_COLOURS[0], edgecolor=EDGE_COLOUR, lw=0.8, label="material")]
    return [Patch(facecolor=MATERIAL_COLOURS[k % len(MATERIAL_COLOURS)], edgecolor=EDGE_COLOUR,
                  lw=0.8, label=f"material: {name}") for k, name in enumerate(order)]


def _draw_boundary(ax: object, result: SectionResult, lw: float = 1.1, zorder: float = 4) -> None:
    """Outline of every region (so material interfaces too), one path per region."""
    for region in result.profile.regions:
        ax.add_patch(PathPatch(_region_path(region), facecolor="none", edgecolor=EDGE_COLOUR,
                               lw=lw, joinstyle="round", zorder=zorder))


def _polyline_path(lines: np.ndarray) -> MplPath:
    """One compound path of many polylines (k, p, 2): small files, one drawing element."""
    k, p, _ = lines.shape
    codes = np.full((k, p), MplPath.LINETO, dtype=MplPath.code_type)
    codes[:, 0] = MplPath.MOVETO
    return MplPath(lines.reshape(-1, 2), codes.ravel())


def _draw_mesh(ax: object, result: SectionResult) -> Line2D:
    """Every element edge through its mid-side node, as one path."""
    mesh = result.mesh
    edges = element_edges(mesh.elements)
    ax.add_patch(PathPatch(_polyline_path(mesh.nodes[edges]), facecolor="none",
                           edgecolor=MESH_COLOUR, lw=0.3, alpha=0.55, zorder=2))
    return Line2D([], [], color=MESH_COLOUR, lw=0.8,
                  label=f"mesh: {mesh.n_elements} six-node triangles, {mesh.n_nodes} nodes")


def _fmt(v: float) -> str:
    return "0" if abs(v) < 5e-13 else f"{v:.4g}"


def _mark_shear_centre(ax: object, result: SectionResult, label_text: bool = True) -> Line2D:
    xs, ys = result.torsion.shear_centre
    ax.plot([xs], [ys], marker="D", ms=7, mfc=SHEAR_CENTRE_COLOUR, mec="white", mew=1.0,
            ls="none", zorder=8, gid="shear-centre")
    if label_text:
        ax.annotate("S", (xs, ys), xytext=(6, -12), textcoords="offset points",
                    color=SHEAR_CENTRE_COLOUR, fontsize=10, fontweight="bold", zorder=9)
    return Line2D([], [], marker="D", ms=7, mfc=SHEAR_CENTRE_COLOUR, mec="white", ls="none",
                  label=f"S: shear centre ({_fmt(xs)}, {_fmt(ys)}) {result.units}")


def _mark_centroid(ax: object, result: SectionResult) -> list[Line2D]:
    xc, yc = result.geometric.centroid
    ax.plot([xc], [yc], marker="o", ms=7, mfc=CENTROID_COLOUR, mec="white", mew=1.0, ls="none",
            zorder=8, gid="centroid")
    ax.annotate("C", (xc, yc), xytext=(6, 5), textcoords="offset points", color=CENTROID_COLOUR,
                fontsize=10, fontweight="bold", zorder=9)
    handles = [Line2D([], [], marker="o", ms=7, mfc=CENTROID_COLOUR, mec="white", ls="none",
                      label=f"C: centroid ({_fmt(xc)}, {_fmt(yc)}) {result.units}")]
    if result.composite:
        xe, ye = result.weighted.centroid
        ax.plot([xe], [ye], marker="o", ms=8, mfc="none", mec=CENTROID_COLOUR, mew=1.4, ls="none",
                zorder=8, gid="elastic-centroid")
        handles.append(Line2D([], [], marker="o", ms=8, mfc="none", mec=CENTROID_COLOUR, mew=1.4,
                              ls="none", label=f"modulus-weighted centroid ({_fmt(xe)}, {_fmt(ye)}) "
                                               f"{result.units}"))
    return handles


def _draw_principal_axes(ax: object, result: SectionResult) -> list[Line2D]:
    """Principal axes 1 (major) and 2 (minor) through the centroid, with arrow heads at +."""
    g = result.geometric
    c = np.array(g.centroid)
    a = np.radians(g.alpha_deg)
    rel = result.mesh.nodes - c
    pad = 0.07 * result.profile.size
    handles = []
    for name, direction, colour, style, label in (
        ("1", np.array([np.cos(a), np.sin(a)]), AXIS1_COLOUR, "-",
         f"axis 1 (major), I1 = {_fmt(g.I1)} {result.units}4, at alpha = {_fmt(g.alpha_deg)} deg"),
        ("2", np.array([-np.sin(a), np.cos(a)]), AXIS2_COLOUR, "--",
         f"axis 2 (minor), I2 = {_fmt(g.I2)} {result.units}4"),
    ):
        t = rel @ direction
        start, end = c + (t.min() - pad) * direction, c + (t.max() + pad) * direction
        ax.plot([start[0], end[0]], [start[1], end[1]], color=colour, lw=1.3, ls=style, zorder=6,
                gid=f"axis-{name}")
        ax.annotate("", xy=tuple(end), xytext=tuple(end - 0.5 * pad * direction),
                    arrowprops={"arrowstyle": "-|>", "color": colour, "lw": 1.3,
                                "mutation_scale": 14, "shrinkA": 0, "shrinkB": 0}, zorder=6)
        ax.annotate(name, tuple(end), xytext=tuple(10 * direction + np.array([0.0, -4.0])),
                    textcoords="offset points", color=colour, fontsize=11, fontweight="bold",
                    ha="center", zorder=9)
        handles.append(Line2D([], [], color=colour, lw=1.3, ls=style, label=label))
    return handles


# ----------------------------------------------------------------------------------------------
# public figures

def figure_outline(result: SectionResult, show_mesh: bool = True, *, width: float = WIDTH) -> Figure:
    """The section drawn to scale with its centroid, shear centre and principal axes.

    Parameters
    ----------
    result : SectionResult
        An analysed section.
    show_mesh : bool
        Also draw the mesh (every six-node element edge through its mid-side node, so
        curved edges show curved).
    width : float
        Figure width, inches (the height follows the profile's proportions).

    Returns
    -------
    matplotlib.figure.Figure
        Axes in the drawing's length unit L, equal scale; a legend names every mark:
        the materials, C the centroid (and the modulus-weighted centroid of a composite
        section), S the shear centre, principal axes 1 and 2 (arrow heads on their positive
        directions), and the mesh.

    """
    fig, ax = _new_figure(result)
    handles = _draw_fill(ax, result)
    if show_mesh:
        handles.append(_draw_mesh(ax, result))
    _draw_boundary(ax, result)
    handles += _draw_principal_axes(ax, result)
    handles += _mark_centroid(ax, result)
    handles.append(_mark_shear_centre(ax, result))
    _finish(fig, ax, result, f"{profile_name(result)}: outline, centroid, shear centre and "
            "principal axes", handles, margin=0.14, width=width)
    return fig


def _contour_levels(lo: float, hi: float, signed: bool) -> np.ndarray:
    """Band edges at round numbers covering lo to hi (symmetric about zero when signed)."""
    if signed:
        m = max(abs(lo), abs(hi))
        if not m > 0:
            return np.linspace(-1.0, 1.0, 3)
        half = MaxNLocator(nbins=BANDS // 2, steps=[1, 2, 2.5, 5, 10]).tick_values(0.0, m)
        half = half[half >= 0]
        return np.concatenate([-half[:0:-1], half])
    span = hi - lo
    if not span > 1e-9 * max(abs(hi), abs(lo)):
        half = 1e-3 * abs(hi) if hi else 1.0  # a constant (or zero) field: one band
        return np.array([lo - half, hi + half])
    return MaxNLocator(nbins=BANDS, steps=[1, 2, 2.5, 5, 10]).tick_values(lo, hi)


def _colour_bar(fig: Figure, ax: object, mappable: object, label: str) -> None:
    bar = fig.colorbar(mappable, ax=ax, shrink=0.85, pad=0.02, aspect=30)
    bar.set_label(label, fontsize=9)
    bar.ax.tick_params(labelsize=8)


def figure_warping(result: SectionResult, *, width: float = WIDTH) -> Figure:
    """Filled contours of the warping function omega about the shear centre.

    Parameters
    ----------
    result : SectionResult
        An analysed section.
    width : float
        Figure width, inches.

    Returns
    -------
    matplotlib.figure.Figure
        Contours of omega (zero mean, L^2; the axial displacement is w = theta omega for a
        twist rate theta), on a colour scale symmetric about zero, with the shear centre
        marked. Warping displacement is towards +z where omega is positive.

    """
    fig, ax = _new_figure(result)
    omega = np.asarray(result.torsion.omega, dtype=float)
    tri = _triangulation(result)
    levels = _contour_levels(float(omega.min()), float(omega.max()), signed=True)
    fill = ax.tricontourf(tri, omega, levels=levels, cmap=SIGNED_MAP, zorder=1)
    fill.set_gid("warping-contours")
    if np.ptp(omega) > 0:
        ax.tricontour(tri, omega, levels=[0.0], colors=EDGE_COLOUR, linewidths=0.6,
                      linestyles="dotted", zorder=3)
    _draw_boundary(ax, result)
    u = result.units
    handles = [_mark_shear_centre(ax, result),
               Line2D([], [], color=EDGE_COLOUR, lw=0.6, ls="dotted",
                      label=f"omega = 0; largest |omega| = {_fmt(result.torsion.omega_max)} {u}2")]
    _colour_bar(fig, ax, fill, f"warping function omega ({u}2)")
    _finish(fig, ax, result, f"{profile_name(result)}: warping function omega\n"
            "about the shear centre, zero mean", handles, colour_bar=True, width=width)
    return fig


def _node_shear_ratio(result: SectionResult) -> np.ndarray:
    """G / G_ref at each node (from any element meeting there)."""
    mesh = result.mesh
    out = np.ones(mesh.n_nodes)
    out[mesh.elements.ravel()] = np.repeat(np.asarray(result.materials.G, dtype=float), 6)
    return out


def _arrow_nodes(result: SectionResult, cells: int = 24) -> np.ndarray:
    """About one node per cell of a square grid over the profile: where arrows are drawn."""
    nodes = result.mesh.nodes
    x0, y0, _, _ = result.profile.bounds
    step = result.profile.size / cells
    cell = np.floor((nodes - np.array([x0, y0])) / step).astype(np.int64)
    centre = np.array([x0, y0]) + (cell + 0.5) * step
    dist = np.hypot(*(nodes - centre).T)
    order = np.lexsort((dist, cell[:, 1], cell[:, 0]))
    _, first = np.unique(cell[order], axis=0, return_index=True)
    return order[first]


def _draw_corners(ax: object, result: SectionResult) -> list[Line2D]:
    corners = reentrant_corners(result.profile)
    if not corners:
        return []
    xy = np.array([[c.x, c.y] for c in corners])
    for c in corners:
        ax.add_patch(Circle((c.x, c.y), exclusion_radius(result.profile, c), fill=False,
                            ec="#5b2a86", lw=0.8, ls="--", zorder=7))
    ax.plot(xy[:, 0], xy[:, 1], ls="none", marker="X", ms=8, mfc="#5b2a86", mec="white", mew=0.8,
            zorder=8, gid="sharp-corners")
    return [Line2D([], [], ls="none", marker="X", ms=8, mfc="#5b2a86", mec="white",
                   label=f"sharp re-entrant corner{'s' if len(corners) > 1 else ''} "
                         "(stress there depends on the mesh; dashed circle left out of the maximum)")]


def _draw_fields(ax: object, result: SectionResult, fields: list[tuple[np.ndarray, np.ndarray]],
                 levels: np.ndarray, cmap: str, extend: str) -> object:
    """Filled contours of per-material nodal fields (element mask, nodal values (n,))."""
    fill = None
    for mask, z in fields:
        fill = ax.tricontourf(_triangulation(result, mask), z, levels=levels, cmap=cmap,
                              extend=extend, zorder=1)
    return fill


def figure_torsion(result: SectionResult, torque: float, G: float | None = None, *,
                   width: float = WIDTH) -> Figure:
    """Contours of the resultant torsion shear stress, with arrows and the largest value.

    Parameters
    ----------
    result : SectionResult
        An analysed section.
    torque : float
        Torque T, force x L (N*mm with mm).
    G : float, optional
        Shear modulus, force / L^2, for the twist rate in the title; the reference material's
        when the section has materials. The stresses themselves do not depend on it.
    width : float
        Figure width, inches.

    Returns
    -------
    matplotlib.figure.Figure
        Bands of tau = |(tau_zx, tau_zy)| up to the largest value away from sharp re-entrant
        corners (higher values near those corners take the top colour), stress-direction
        arrows on a grid (lengths in proportion to tau), the largest value marked, and every
        sharp re-entrant corner marked with the circle left out of the maximum.

    """
    if not np.isfinite(torque) or torque == 0:
        raise UsageError(f"torque must be a finite non-zero number, got {torque}")
    mats = result.materials
    G_used = G if G is not None else (mats.G_ref if mats.G_ref is not None else 1.0)
    ts = torsion_stress(result, torque, G_used)
    n = result.mesh.n_nodes
    if result.composite:
        cs = combined_stress(result, Loads(T=torque), G)
        fields = []
        for gi, ms in enumerate(cs.by_material):
            z = np.zeros(n)
            z[ms.nodes] = ms.tau
            fields.append((mats.group == gi, z))
        best = max(cs.by_material, key=lambda m: m.tau_max)
        top, at = best.tau_max, best.von_mises_at
        ratio = _node_shear_ratio(result)
    else:
        fields = [(None, ts.tau)]
        top, at = ts.tau_max, ts.tau_max_at
        ratio = np.ones(n)
    fig, ax = _new_figure(result)
    levels = _contour_levels(0.0, top, signed=False)
    fill = _draw_fields(ax, result, fields, levels, MAGNITUDE_MAP, "max")
    fill.set_gid("stress-contours")
    _draw_boundary(ax, result)
    pick = _arrow_nodes(result)
    u, v = ts.tau_zx[pick] * ratio[pick], ts.tau_zy[pick] * ratio[pick]
    mag = np.hypot(u, v)
    clip = np.minimum(1.0, top / np.maximum(mag, 1e-300))  # corner values would swamp the rest
    step = result.profile.size / 24
    ax.quiver(result.mesh.nodes[pick, 0], result.mesh.nodes[pick, 1], u * clip, v * clip,
              angles="xy", scale_units="xy", scale=top / (0.85 * step), color="#1f2a33",
              width=0.0028, headwidth=4.0, headlength=4.5, headaxislength=4.0, pivot="mid",
              zorder=5, gid="stress-arrows")
    ax.plot([at[0]], [at[1]], marker="*", ms=15, mfc="#0b6e4f", mec="white", mew=0.9, ls="none",
            zorder=9, gid="largest-stress")
    stress = _stress_unit(result)
    force = FORCE_UNITS[result.units][0]
    handles = [
        Line2D([], [], marker="*", ms=13, mfc="#0b6e4f", mec="white", ls="none",
               label=f"largest shear stress {_fmt(top)} {stress} at ({_fmt(at[0])}, {_fmt(at[1])}) "
                     f"{result.units}"),
        Line2D([], [], marker=r"$\rightarrow$", ms=12, color="#1f2a33", ls="none",
               label="stress direction, length in proportion to the stress"),
    ]
    handles += _draw_corners(ax, result)
    handles.append(_mark_shear_centre(ax, result))
    _colour_bar(fig, ax, fill, f"resultant shear stress tau ({stress})")
    title = f"{profile_name(result)}: torsion shear stress for T = {_fmt(torque)} {force}*{result.units}"
    if G is not None or mats.G_ref is not None:
        title += f"\ntwist rate theta = {ts.twist_rate:.4g} rad/{result.units} (G = {_fmt(G_used)} {stress})"
    _finish(fig, ax, result, title, handles, ncols=1, colour_bar=True, width=width)
    return fig


#: Stress pictures :func:`figure_combined` draws: attribute of MaterialStress and axis label.
COMBINED_QUANTITIES = {
    "sigma": ("sigma", "normal stress sigma_z"),
    "tau": ("tau", "resultant shear stress tau"),
    "von_mises": ("von_mises", "von Mises stress"),
}


def _loads_text(loads: Loads, result: SectionResult) -> str:
    force = FORCE_UNITS[result.units][0]
    units = {"N": force, "Vx": force, "Vy": force, "Mx": f"{force}*{result.units}",
             "My": f"{force}*{result.units}", "T": f"{force}*{result.units}"}
    parts = [f"{k} = {_fmt(getattr(loads, k))} {units[k]}" for k in ("N", "Mx", "My", "Vx", "Vy", "T")
             if getattr(loads, k)]
    return ", ".join(parts)


def figure_combined(result: SectionResult, loads: Loads | Mapping[str, float], G: float | None = None,
                    quantity: str = "von_mises", *, width: float = WIDTH) -> Figure:
    """Stress contours for combined loads, each material on its own nodal values.

    Parameters
    ----------
    result : SectionResult
        An analysed section (with materials for a composite section).
    loads : Loads or mapping
        Section forces N, Mx, My, Vx, Vy (force, force x L) and T (force x L); see
        :mod:`warpwise.stress.combined` for signs. A mapping is turned into :class:`Loads`.
    G : float, optional
        Shear modulus of a geometry-only section, force / L^2 (only the twist rate uses it).
    quantity : str
        ``von_mises`` (default), ``sigma`` (normal stress sigma_z, tension positive, with the
        line of zero stress drawn) or ``tau`` (resultant shear stress).
    width : float
        Figure width, inches.

    Returns
    -------
    matplotlib.figure.Figure
        One colour scale for all materials, in the stress unit; the largest value of each
        material (away from sharp re-entrant corners for tau and von Mises) is marked.

    Raises
    ------
    UsageError
        For an unknown quantity or loads that are all zero or not finite.

    """
    if quantity not in COMBINED_QUANTITIES:
        raise UsageError(f"unknown stress picture {quantity!r} (use {', '.join(COMBINED_QUANTITIES)})")
    if not isinstance(loads, Loads):
        try:
            loads = Loads(**{k: float(v) for k, v in dict(loads).items()})
        except TypeError as exc:
            raise UsageError(f"loads: {exc}") from None
    cs = combined_stress(result, loads, G)
    attr, label = COMBINED_QUANTITIES[quantity]
    mats, n = result.materials, result.mesh.n_nodes
    signed = quantity == "sigma"
    fields, lo, hi = [], np.inf, -np.inf
    for gi, ms in enumerate(cs.by_material):
        z = np.zeros(n)
        vals = getattr(ms, attr)
        z[ms.nodes] = vals
        fields.append((mats.group == gi if result.composite else None, z))
        lo, hi = min(lo, float(vals.min())), max(hi, float(vals.max()))
    if signed:
        levels = _contour_levels(lo, hi, signed=True)
        extend = "neither"
    else:
        top = max(float(getattr(ms, f"{attr}_max")) for ms in cs.by_material)
        levels = _contour_levels(0.0, top, signed=False)
        extend = "max"
    fig, ax = _new_figure(result)
    fill = _draw_fields(ax, result, fields, levels, SIGNED_MAP if signed else MAGNITUDE_MAP, extend)
    fill.set_gid("stress-contours")
    handles = []
    if signed and lo < 0 < hi:
        for mask, z in fields:
            ax.tricontour(_triangulation(result, mask), z, levels=[0.0], colors=EDGE_COLOUR,
                          linewidths=1.0, linestyles="dashed", zorder=4)
        handles.append(Line2D([], [], color=EDGE_COLOUR, lw=1.0, ls="dashed",
                              label="zero normal stress (neutral axis)"))
    _draw_boundary(ax, result)
    stress = _stress_unit(result)
    nodes = result.mesh.nodes
    for ms in cs.by_material:
        vals = getattr(ms, attr)
        if quantity == "von_mises":
            at, value = ms.von_mises_at, ms.von_mises_max
        else:
            k = int(np.argmax(np.abs(vals)))
            at, value = tuple(nodes[ms.nodes[k]]), float(vals[k])
        ax.plot([at[0]], [at[1]], marker="*", ms=14, mfc="#0b6e4f", mec="white", mew=0.9, ls="none",
                zorder=9, gid="largest-stress")
        name = f" in {ms.material}" if ms.material else ""
        extra = ""
        if quantity == "von_mises" and ms.utilisation is not None:
            extra = f", {100 * ms.utilisation:.3g}% of fy (informative, not a code check)"
        handles.append(Line2D([], [], marker="*", ms=12, mfc="#0b6e4f", mec="white", ls="none",
                              label=f"largest {label}{name}: {_fmt(value)} {stress}{extra}"))
    handles += _draw_corners(ax, result) if quantity != "sigma" else []
    _colour_bar(fig, ax, fill, f"{label} ({stress})")
    _finish(fig, ax, result, f"{profile_name(result)}: {label}\nloads {_loads_text(loads, result)}",
            handles, ncols=1, colour_bar=True, width=width)
    return fig


# ----------------------------------------------------------------------------------------------
# output

def _render(fig: Figure, fmt: str) -> bytes:
    """Render a figure to bytes in a reproducible way (no dates, fixed SVG ids)."""
    metadata = {"png": {"Software": "warpwise"}, "svg": {"Date": None, "Creator": "warpwise"},
                "pdf": {"CreationDate": None, "Creator": "warpwise"}}[fmt]
    buf = io.BytesIO()
    with rc_context({"svg.hashsalt": "warpwise", "svg.fonttype": "path"}):
        fig.savefig(buf, format=fmt, dpi=PNG_DPI, bbox_inches="tight", pad_inches=0.08,
                    metadata=metadata, facecolor="white")
    return buf.getvalue()


def save_figure(fig: Figure, path: str | Path) -> None:
    """Write a figure to a PNG, SVG or PDF file (by its ending), atomically.

    Parameters
    ----------
    fig : matplotlib.figure.Figure
        From one of the ``figure_*`` functions.
    path : str or Path
        Target file ending in .png, .svg or .pdf; PNG at :data:`PNG_DPI` dots per inch.

    Raises
    ------
    UsageError
        For another ending or a folder that cannot be written (nothing is written).

    """
    fmt = Path(path).suffix.lower().lstrip(".")
    if fmt not in FORMATS:
        raise UsageError("a picture must be a .png, .svg or .pdf file", file=str(path))
    folder = Path(path).parent
    if not folder.is_dir():  # fail before the (slow) drawing
        raise UsageError(f"output folder {str(folder)!r} does not exist", file=str(path))
    atomic_write(path, _render(fig, fmt))


_PROLOG = re.compile(r"\A.*?(?=<svg[\s>])", re.S)
_METADATA = re.compile(r"<metadata>.*?</metadata>\s*", re.S)
_GLOBAL_STYLE = re.compile(r"<style type=\"text/css\">\*\{([^}]*)\}</style>")


def svg_text(fig: Figure, id_prefix: str | None = None) -> str:
    """The figure as an ``<svg>`` element for inline use in an HTML5 page.

    The XML prolog, document type and metadata are left out, the drawing's page-wide style
    rule is moved onto the root element (so it cannot restyle the page), and every id is
    given a prefix so that several pictures can share one page.

    Parameters
    ----------
    fig : matplotlib.figure.Figure
        The figure.
    id_prefix : str, optional
        Prefix of the ids; default one derived from the drawing's content.

    Returns
    -------
    str
        Text starting with ``<svg``, with a ``viewBox`` (scale it with CSS).

    """
    text = _render(fig, "svg").decode("utf-8")
    text = _PROLOG.sub("", text, count=1)
    text = _METADATA.sub("", text)
    rule = _GLOBAL_STYLE.search(text)
    if rule:
        text = text.replace(rule.group(0), "")
        style = " ".join(rule.group(1).split())
        text = text.replace("<svg ", f'<svg style="{style}" ', 1)
    if id_prefix is None:
        id_prefix = "w" + hashlib.sha1(text.encode("utf-8")).hexdigest()[:8] + "-"
    if not re.fullmatch(r"[A-Za-z][A-Za-z0-9_-]*", id_prefix):
        raise UsageError(f"an id prefix must be a letter then letters, digits, - or _, got {id_prefix!r}")
    text = re.sub(r'\bid="([^"]+)"', lambda m: f'id="{id_prefix}{m.group(1)}"', text)
    text = re.sub(r'(\b(?:xlink:)?href)="#([^"]+)"', lambda m: f'{m.group(1)}="#{id_prefix}{m.group(2)}"',
                  text)
    text = re.sub(r"url\(#([^)]+)\)", lambda m: f"url(#{id_prefix}{m.group(1)})", text)
    return text.strip()


__all__ = ["COMBINED_QUANTITIES", "FORMATS", "element_edges", "figure_combined", "figure_outline",
           "figure_torsion", "figure_warping", "profile_name", "save_figure", "sub_triangles",
           "svg_text"]
