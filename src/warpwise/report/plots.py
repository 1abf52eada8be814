"""Pictures of a section: outline with axes, warping, torsion and combined-load stresses.

Every figure function returns a :class:`matplotlib.figure.Figure` built without pyplot, so no
global plotting state is touched and the functions are safe in scripts, servers and tests.
The pictures live in :mod:`.plot_section` (the section itself), :mod:`.plot_stress` (recovered
stresses, passed in by the caller) and :mod:`.plot_files` (PNG, SVG, PDF files and inline SVG);
:mod:`.plot_parts` holds what they share. This module gathers the public names.
"""

from __future__ import annotations

from .plot_files import FORMATS, PNG_DPI, save_figure, svg_text
from .plot_parts import (
    AXIS1_COLOUR,
    AXIS2_COLOUR,
    BANDS,
    CENTROID_COLOUR,
    EDGE_COLOUR,
    MAGNITUDE_MAP,
    MATERIAL_COLOURS,
    MESH_COLOUR,
    SHEAR_CENTRE_COLOUR,
    SIGNED_MAP,
    WIDTH,
    element_edges,
    profile_name,
    sub_triangles,
)
from .plot_section import figure_outline, figure_warping
from .plot_stress import COMBINED_QUANTITIES, figure_combined, figure_torsion

__all__ = [
    # figures of the section and of its stresses
    "figure_outline", "figure_warping", "figure_torsion", "figure_combined", "COMBINED_QUANTITIES",
    # figure files
    "save_figure", "svg_text", "FORMATS", "PNG_DPI",
    # what the figures share
    "profile_name", "sub_triangles", "element_edges", "WIDTH", "BANDS", "MATERIAL_COLOURS",
    "EDGE_COLOUR", "MESH_COLOUR", "CENTROID_COLOUR", "AXIS1_COLOUR", "AXIS2_COLOUR",
    "SHEAR_CENTRE_COLOUR", "SIGNED_MAP", "MAGNITUDE_MAP",
]
