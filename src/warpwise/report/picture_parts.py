"""What every picture of a section shares, whatever draws it: colours, names and numbers.

The matplotlib figures (:mod:`.plot_parts`, for picture files) and the SVG pictures of the
datasheets (:mod:`.plot_svg`) take their colours and their words from here, so that both say
the same thing in the same way. Nothing here imports a plotting library.
"""

from __future__ import annotations

from pathlib import Path

import numpy as np

from ..properties.analysis import SectionResult
from ..units import Converter

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
#: Colour of the marks of sharp re-entrant corners; of the largest stress; of stress arrows.
CORNER_COLOUR = "#5b2a86"
PEAK_COLOUR = "#0b6e4f"
ARROW_COLOUR = "#1f2a33"
#: Number of colour bands in the contour pictures (about; the band edges are round numbers).
BANDS = 16
#: Cells across the profile of the grid of stress-direction arrows.
ARROW_CELLS = 24


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


def profile_name(result: SectionResult) -> str:
    """Short name of the analysed profile: the file name, or ``profile`` for a shape."""
    src = result.profile.source
    if src.startswith("<"):
        return "profile"
    return Path(src).name or src


def fmt(v: float) -> str:
    """A number for a legend or title: four significant figures, round-off shown as 0.

    Examples
    --------
    >>> fmt(1234.5678), fmt(-3e-14), fmt(0.000123456)
    ('1235', '0', '0.0001235')
    """
    return "0" if abs(v) < 5e-13 else f"{v:.4g}"


def point_text(show: Converter, xy: tuple[float, float]) -> str:
    """A point as legend text in ``show``'s length unit, e.g. ``(1.5, 0) mm``."""
    x, y = show.point(xy)
    return f"({fmt(x)}, {fmt(y)}) {show.system.length}"


def material_names(result: SectionResult) -> list[str]:
    """Name shown for each region's material ("section" for geometry only)."""
    regions = result.profile.regions
    mats = result.materials.materials
    if len(mats) == len(regions):
        return [m.name for m in mats]
    if len(mats) == 1:
        return [mats[0].name] * len(regions)
    return [r.material or "section" for r in regions]


def arrow_nodes(result: SectionResult, cells: int = ARROW_CELLS) -> np.ndarray:
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
