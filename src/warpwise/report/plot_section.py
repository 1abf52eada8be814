"""Pictures of the section itself: the outline with its axes and marks, and the warping function.

Every function returns a :class:`matplotlib.figure.Figure` built without pyplot (see
:mod:`warpwise.report.plot_files` to write or embed one).
"""

from __future__ import annotations

import numpy as np
from matplotlib.figure import Figure
from matplotlib.lines import Line2D
from matplotlib.patches import Patch, PathPatch
from matplotlib.path import Path as MplPath

from ..properties.analysis import SectionResult
from ..units import AREA, Converter, Dimension
from . import plot_parts as parts
from .picture_parts import material_names

# ----------------------------------------------------------------------------------------------
# drawing pieces of the outline

def _draw_fill(ax: object, result: SectionResult) -> list[Patch]:
    """Fill each region in its material colour; return one legend patch per material."""
    names = material_names(result)
    order = list(dict.fromkeys(names))
    colours = parts.MATERIAL_COLOURS
    for region, name in zip(result.profile.regions, names, strict=True):
        colour = colours[order.index(name) % len(colours)]
        ax.add_patch(PathPatch(parts.region_path(region), facecolor=colour, edgecolor="none", zorder=1))
    if len(order) == 1 and order[0] == "section":
        return [Patch(facecolor=colours[0], edgecolor=parts.EDGE_COLOUR, lw=0.8, label="material")]
    return [Patch(facecolor=colours[k % len(colours)], edgecolor=parts.EDGE_COLOUR, lw=0.8,
                  label=f"material: {name}") for k, name in enumerate(order)]


def _polyline_path(lines: np.ndarray) -> MplPath:
    """One compound path of many polylines (k, p, 2): small files, one drawing element."""
    k, p, _ = lines.shape
    codes = np.full((k, p), MplPath.LINETO, dtype=MplPath.code_type)
    codes[:, 0] = MplPath.MOVETO
    return MplPath(lines.reshape(-1, 2), codes.ravel())


def _draw_mesh(ax: object, result: SectionResult) -> Line2D:
    """Every element edge through its mid-side node, as one path."""
    mesh = result.mesh
    edges = parts.polylines(mesh.edges.nodes)
    ax.add_patch(PathPatch(_polyline_path(mesh.nodes[edges]), facecolor="none",
                           edgecolor=parts.MESH_COLOUR, lw=0.3, alpha=0.55, zorder=2))
    return Line2D([], [], color=parts.MESH_COLOUR, lw=0.8,
                  label=f"mesh: {mesh.n_elements} six-node triangles, {mesh.n_nodes} nodes")


def _mark_centroid(ax: object, result: SectionResult, show: Converter) -> list[Line2D]:
    xc, yc = result.geometric.centroid
    ax.plot([xc], [yc], marker="o", ms=7, mfc=parts.CENTROID_COLOUR, mec="white", mew=1.0, ls="none",
            zorder=8, gid="centroid")
    ax.annotate("C", (xc, yc), xytext=(6, 5), textcoords="offset points", color=parts.CENTROID_COLOUR,
                fontsize=10, fontweight="bold", zorder=9)
    handles = [Line2D([], [], marker="o", ms=7, mfc=parts.CENTROID_COLOUR, mec="white", ls="none",
                      label=f"C: centroid {parts.point_text(show, (xc, yc))}")]
    if result.composite:
        xe, ye = result.weighted.centroid
        ax.plot([xe], [ye], marker="o", ms=8, mfc="none", mec=parts.CENTROID_COLOUR, mew=1.4, ls="none",
                zorder=8, gid="elastic-centroid")
        handles.append(Line2D([], [], marker="o", ms=8, mfc="none", mec=parts.CENTROID_COLOUR, mew=1.4,
                              ls="none", label="modulus-weighted centroid "
                                               f"{parts.point_text(show, (xe, ye))}"))
    return handles


def _draw_principal_axes(ax: object, result: SectionResult, show: Converter) -> list[Line2D]:
    """Principal axes 1 (major) and 2 (minor) through the centroid, with arrow heads at +."""
    g = result.geometric
    c = np.array(g.centroid)
    a = np.radians(g.alpha_deg)
    rel = result.mesh.nodes - c
    pad = 0.07 * result.profile.size
    handles = []
    i4 = Dimension(4)
    for name, direction, colour, style, label in (
        ("1", np.array([np.cos(a), np.sin(a)]), parts.AXIS1_COLOUR, "-",
         f"axis 1 (major), I1 = {parts.fmt(show(g.I1, i4))} {show.unit(i4)}, "
         f"at alpha = {parts.fmt(g.alpha_deg)} deg"),
        ("2", np.array([-np.sin(a), np.cos(a)]), parts.AXIS2_COLOUR, "--",
         f"axis 2 (minor), I2 = {parts.fmt(show(g.I2, i4))} {show.unit(i4)}"),
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
# figures

def figure_outline(result: SectionResult, show_mesh: bool = True, *, width: float = parts.WIDTH,
                   units: str | None = None) -> Figure:
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
    units : str, optional
        Unit system the picture shows its values in (default the profile's).

    Returns
    -------
    matplotlib.figure.Figure
        Axes in the length unit of ``units``, equal scale; a legend names every mark:
        the materials, C the centroid (and the modulus-weighted centroid of a composite
        section), S the shear centre, principal axes 1 and 2 (arrow heads on their positive
        directions), and the mesh.

    """
    show = Converter.of(result.units, units)
    fig, ax = parts.new_figure(result, show)
    handles = _draw_fill(ax, result)
    if show_mesh:
        handles.append(_draw_mesh(ax, result))
    parts.draw_boundary(ax, result)
    handles += _draw_principal_axes(ax, result, show)
    handles += _mark_centroid(ax, result, show)
    handles.append(parts.mark_shear_centre(ax, result, show))
    title = f"{parts.profile_name(result)}: outline, centroid, shear centre and principal axes"
    parts.finish(fig, ax, result, title, handles, margin=0.14, width=width)
    return fig


def figure_warping(result: SectionResult, *, width: float = parts.WIDTH,
                   units: str | None = None) -> Figure:
    """Filled contours of the warping function omega about the shear centre.

    Parameters
    ----------
    result : SectionResult
        An analysed section.
    width : float
        Figure width, inches.
    units : str, optional
        Unit system the picture shows its values in (default the profile's).

    Returns
    -------
    matplotlib.figure.Figure
        Contours of omega (zero mean, L^2; the axial displacement is w = theta omega for a
        twist rate theta), on a colour scale symmetric about zero, with the shear centre
        marked. Warping displacement is towards +z where omega is positive.

    """
    show = Converter.of(result.units, units)
    fig, ax = parts.new_figure(result, show)
    omega = show(np.asarray(result.torsion.omega, dtype=float), AREA)
    tri = parts.triangulation(result)
    levels = parts.contour_levels(float(omega.min()), float(omega.max()), signed=True)
    fill = ax.tricontourf(tri, omega, levels=levels, cmap=parts.SIGNED_MAP, zorder=1)
    fill.set_gid("warping-contours")
    if np.ptp(omega) > 0:
        ax.tricontour(tri, omega, levels=[0.0], colors=parts.EDGE_COLOUR, linewidths=0.6,
                      linestyles="dotted", zorder=3)
    parts.draw_boundary(ax, result)
    area = show.unit(AREA)
    handles = [parts.mark_shear_centre(ax, result, show),
               Line2D([], [], color=parts.EDGE_COLOUR, lw=0.6, ls="dotted",
                      label=f"omega = 0; largest |omega| = "
                            f"{parts.fmt(show(result.torsion.omega_max, AREA))} {area}")]
    parts.colour_bar(fig, ax, fill, f"warping function omega ({area})")
    title = f"{parts.profile_name(result)}: warping function omega\nabout the shear centre, zero mean"
    parts.finish(fig, ax, result, title, handles, colour_bar=True, width=width)
    return fig
