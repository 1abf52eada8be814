"""The pieces every picture of a section shares: colours, axes, outline, marks and contour bands.

Fields on the six-node mesh are drawn by splitting every element into four straight
sub-triangles through its corner and mid-side nodes, so curved edges and the quadratic
variation inside an element both show. Nothing here computes a result: the pieces draw what
the analysis and the stress recovery found.
"""

from __future__ import annotations

import numpy as np
from matplotlib.figure import Figure
from matplotlib.lines import Line2D
from matplotlib.patches import PathPatch
from matplotlib.path import Path as MplPath
from matplotlib.text import Text
from matplotlib.ticker import FuncFormatter, MaxNLocator
from matplotlib.tri import Triangulation

from ..mesh.edges import mesh_edges
from ..properties.analysis import SectionResult
from ..units import LENGTH, Converter
from .picture_parts import (  # noqa: F401  (the shared colours and words, re-exported)
    AXIS1_COLOUR,
    AXIS2_COLOUR,
    BANDS,
    CENTROID_COLOUR,
    EDGE_COLOUR,
    MATERIAL_COLOURS,
    MESH_COLOUR,
    SHEAR_CENTRE_COLOUR,
    fmt,
    point_text,
    profile_name,
    sub_triangles,
)

#: Colour maps: warping and normal stress (signed, centred at zero), stress magnitudes.
SIGNED_MAP = "RdBu_r"
MAGNITUDE_MAP = "YlOrRd"
#: Figure width, inches.
WIDTH = 7.0


# ----------------------------------------------------------------------------------------------
# the mesh as drawn

def element_edges(elements: np.ndarray, boundary_only: bool = False,
                  region: np.ndarray | None = None) -> np.ndarray:
    """Unique element edges in drawing order (corner, mid-side node, corner).

    The edges are those of :func:`warpwise.mesh.edges.mesh_edges` (a mesh keeps them as
    :attr:`Mesh.edges`); this gives them as polylines through the mid-side node.

    Parameters
    ----------
    elements : numpy.ndarray
        Six-node connectivity (m, 6).
    boundary_only : bool
        Keep only the outline and, with ``region``, the material interfaces.
    region : numpy.ndarray, optional
        Region index (m,) of each element.

    Returns
    -------
    numpy.ndarray
        Node indices (k, 3) of each edge.

    Examples
    --------
    >>> two = np.array([[0, 1, 2, 4, 5, 6], [1, 3, 2, 7, 8, 5]])
    >>> len(element_edges(two)), len(element_edges(two, boundary_only=True))
    (5, 4)

    """
    edges = mesh_edges(elements, region)
    return polylines(edges.nodes[edges.outline_and_interfaces] if boundary_only else edges.nodes)


def polylines(edge_nodes: np.ndarray) -> np.ndarray:
    """Edges (corner a, corner b, mid-side node) reordered to run through the mid-side node."""
    return np.asarray(edge_nodes)[:, [0, 2, 1]]


def triangulation(result: SectionResult, mask: np.ndarray | None = None) -> Triangulation:
    """Linear triangulation of (some of) the mesh's six-node elements."""
    mesh = result.mesh
    elems = mesh.elements if mask is None else mesh.elements[mask]
    return Triangulation(mesh.nodes[:, 0], mesh.nodes[:, 1], sub_triangles(elems))


# ----------------------------------------------------------------------------------------------
# axes, title, legend

def new_figure(result: SectionResult, show: Converter | None = None) -> tuple[Figure, object]:
    """A figure with one equal-aspect axes (sized by :func:`finish`).

    The artists are drawn in the profile's coordinates; with ``show`` in another unit system
    the ticks are placed and labelled in its length unit.
    """
    show = show or Converter.of(result.units, None)
    fig = Figure(figsize=(WIDTH, WIDTH), layout="constrained")
    ax = fig.add_subplot()
    ax.set_aspect("equal")
    unit = show.system.length
    ax.set_xlabel(f"x ({unit})")
    ax.set_ylabel(f"y ({unit})")
    k = float(show(1.0, LENGTH))
    if k != 1.0:
        for axis in (ax.xaxis, ax.yaxis):
            axis.set_major_locator(_ScaledLocator(k))
            axis.set_major_formatter(FuncFormatter(lambda v, _pos: f"{v * k + 0.0:.6g}"))
    ax.grid(True, lw=0.4, color="#c9d1d8", alpha=0.8)
    ax.set_axisbelow(True)
    for side in ("top", "right"):
        ax.spines[side].set_visible(False)
    return fig, ax


class _ScaledLocator(MaxNLocator):
    """Ticks at round numbers of coordinates scaled by ``k`` (another length unit)."""

    def __init__(self, k: float) -> None:
        super().__init__(nbins="auto", steps=[1, 2, 2.5, 5, 10])
        self.k = k

    def tick_values(self, vmin: float, vmax: float) -> np.ndarray:  # noqa: D102
        return super().tick_values(vmin * self.k, vmax * self.k) / self.k


def plain_text(fig: Figure) -> Figure:
    """Draw every text of a figure exactly as written: a ``$`` in a name is not mathematics.

    File, material, layer and profile names go into titles, legends and labels; matplotlib
    would read a pair of ``$`` in them as mathematics (and refuse a lone ``^`` between them).
    Every figure passes through here before it is drawn (:func:`finish`, the figure writers).

    Examples
    --------
    >>> fig = Figure()
    >>> title = fig.add_subplot().set_title("$x^$.txt")
    >>> plain_text(fig) is fig, title.get_parse_math()
    (True, False)
    """
    for text in fig.findobj(Text):
        text.set_parse_math(False)
    return fig


def finish(fig: Figure, ax: object, result: SectionResult, title: str, handles: list, *,
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
    plain_text(fig)
    fig.draw_without_rendering()
    fig.set_layout_engine("none")


# ----------------------------------------------------------------------------------------------
# outline and marks

def region_path(region: object) -> MplPath:
    """A compound path of one region: outer loop and its holes (non-zero fill)."""
    loops = [np.asarray(loop, dtype=float) for loop in region.loops()]
    verts = np.vstack([np.vstack([p, p[:1]]) for p in loops])
    codes = np.concatenate([
        np.r_[MplPath.MOVETO, np.full(len(p) - 1, MplPath.LINETO), MplPath.CLOSEPOLY]
        for p in loops
    ]).astype(MplPath.code_type)
    return MplPath(verts, codes)


def draw_boundary(ax: object, result: SectionResult, lw: float = 1.1, zorder: float = 4) -> None:
    """Outline of every region (so material interfaces too), one path per region."""
    for region in result.profile.regions:
        ax.add_patch(PathPatch(region_path(region), facecolor="none", edgecolor=EDGE_COLOUR,
                               lw=lw, joinstyle="round", zorder=zorder))


def mark_shear_centre(ax: object, result: SectionResult, show: Converter | None = None,
                      label_text: bool = True) -> Line2D:
    """Mark the shear centre S; return its legend entry (coordinates in ``show``'s unit)."""
    show = show or Converter.of(result.units, None)
    xs, ys = result.torsion.shear_centre
    ax.plot([xs], [ys], marker="D", ms=7, mfc=SHEAR_CENTRE_COLOUR, mec="white", mew=1.0,
            ls="none", zorder=8, gid="shear-centre")
    if label_text:
        ax.annotate("S", (xs, ys), xytext=(6, -12), textcoords="offset points",
                    color=SHEAR_CENTRE_COLOUR, fontsize=10, fontweight="bold", zorder=9)
    return Line2D([], [], marker="D", ms=7, mfc=SHEAR_CENTRE_COLOUR, mec="white", ls="none",
                  label=f"S: shear centre {point_text(show, (xs, ys))}")


# ----------------------------------------------------------------------------------------------
# contour bands

def contour_levels(lo: float, hi: float, signed: bool) -> np.ndarray:
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


def colour_bar(fig: Figure, ax: object, mappable: object, label: str) -> None:
    """A colour bar beside the axes, labelled with the quantity and its unit."""
    bar = fig.colorbar(mappable, ax=ax, shrink=0.85, pad=0.02, aspect=30)
    bar.set_label(label, fontsize=9)
    bar.ax.tick_params(labelsize=8)
