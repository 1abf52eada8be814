"""DXF drawings to profiles (read with ezdxf).

Reading goes in three steps, each usable on its own:

1. :func:`read_drawing` (:mod:`.drawing`) reads the file with ezdxf (:mod:`.document`: in its
   recover mode when the strict reader fails, so that damaged files load where they can),
   expands block references with their transforms (:mod:`.blocks`) and turns every curve of
   model space into a :class:`~warpwise.io.pieces.Piece` (:mod:`.entities`, one reader per
   entity type): LINE, ARC, CIRCLE, ELLIPSE (full and partial), SPLINE, LWPOLYLINE and 2D
   POLYLINE (bulges become true arcs), flat 3D POLYLINE, and the boundary paths of HATCH
   (:mod:`.hatch`). Everything else (text, dimensions, points...) is counted and left out.
   Coordinates are converted to the profile's length unit here (:mod:`.units`).
2. :func:`lay_out` (:mod:`.layout`) joins the pieces of the chosen layers into closed loops
   within a joining tolerance tied to the drawing size, takes the hatch boundaries (one that
   repeats a drawn loop marks it as hatched, a cut section), leaves out a drawing frame and its
   title block (:mod:`.sheet`), checks the loops and nests them even-odd into parts, listing
   every defect on the way.
3. :func:`build_profile` (:mod:`.build`) takes the part asked for, else the only hatched part
   of several, draws the loops of the chosen part(s) as polygons at a chord tolerance tied to
   the mesh size and validates them with
   :func:`warpwise.geometry.profile_from_loops`.

:func:`read_dxf` does all three. Layer names are kept per loop (``DxfProfile.loop_layers``);
they become region materials only when asked (``layer_materials``: every layer its own, or a
mapping from layer to material name), so that by default a hole drawn on another layer than its
outline is still a hole.

Examples
--------
>>> import ezdxf, tempfile, pathlib
>>> doc = ezdxf.new()
>>> doc.header["$INSUNITS"] = 4
>>> msp = doc.modelspace()
>>> _ = msp.add_lwpolyline([(0, 0), (40, 0), (40, 20), (0, 20)], close=True)
>>> _ = msp.add_circle((20, 10), 5)
>>> path = pathlib.Path(tempfile.mkdtemp()) / "plate.dxf"
>>> doc.saveas(path)
>>> p = read_dxf(path)
>>> len(p.regions), len(p.regions[0].holes), p.units
(1, 1, 'mm')
>>> bool(abs(p.area - (800 - 25 * 3.141592653589793)) < 1e-4 * p.area)
True

"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from pathlib import Path

from ...errors import UsageError
from ...geometry.profile import Profile
from .blocks import MAX_BLOCK_DEPTH
from .build import (
    CHORD_AREA_BUDGET,
    CHORD_PER_MESH_SIZE,
    MIN_CHORD_PER_MESH_SIZE,
    PARTS_IN_MESSAGE,
    DrawingError,
    DxfProfile,
    build_profile,
    choose_chord_tolerance,
)
from .collect import MAX_ENTITIES
from .drawing import Drawing, read_drawing
from .layout import JOIN_TOLERANCE, LayerSummary, Layout, Loop, lay_out, open_chain_defects
from .units import INSUNITS, Units, resolve_units


def layer_material_table(layout: Layout, given: Mapping[str, str],
                         other: str | None = None) -> dict[str, str | None]:
    """Material name of every layer of a laid-out drawing, from the names given per layer.

    Parameters
    ----------
    layout : Layout
        The laid-out drawing.
    given : mapping of str to str
        Material name by layer (layer names are not case-sensitive).
    other : str, optional
        Material name of the layers not in ``given`` (None: the profile's one material,
        chosen at the analysis).

    Returns
    -------
    dict of str to (str or None)
        Every layer of the profile (``layout.layers``) to its material name.

    Raises
    ------
    UsageError
        For a layer that holds no geometry (naming the layers that do) or that is not part of
        the profile.

    """
    d = layout.drawing
    known = {name.lower(): name for name in d.layers}
    table: dict[str, str | None] = dict.fromkeys(layout.layers, other)
    for layer, material in given.items():
        name = known.get(layer.lower())
        if name is None:
            raise UsageError(f"--layer-material names layer {layer!r}, which holds no lines or "
                             f"curves (layers with geometry: {', '.join(d.layers) or 'none'})",
                             file=d.source)
        if name not in layout.layers:
            raise UsageError(f"--layer-material names layer {name!r}, which is not part of the "
                             f"profile (layers used: {', '.join(layout.layers) or 'none'}; "
                             "choose layers with --layer)", file=d.source)
        table[name] = material
    return table


def import_dxf(path: str | Path, units: str | None = None, *, layers: Sequence[str] | None = None,
               part: int | None = None, all_parts: bool = False, chord_tolerance: float | None = None,
               mesh_size: float | None = None, layer_materials: bool | Mapping[str, str] = False,
               join_tolerance: float | None = None, other_layers_material: str | None = None,
               max_entities: int | None = None) -> DxfProfile:
    """Read a DXF drawing into a profile, keeping the layers and tolerances used.

    Parameters are those of :func:`read_dxf`.

    Returns
    -------
    DxfProfile

    """
    layout = lay_out(read_drawing(path, units, max_entities), layers, tolerance=join_tolerance)
    return profile_of_layout(layout, part=part, all_parts=all_parts,
                             chord_tolerance=chord_tolerance, mesh_size=mesh_size,
                             layer_materials=layer_materials,
                             other_layers_material=other_layers_material)


def profile_of_layout(layout: Layout, *, part: int | None = None, all_parts: bool = False,
                      chord_tolerance: float | None = None, mesh_size: float | None = None,
                      layer_materials: bool | Mapping[str, str] = False,
                      other_layers_material: str | None = None) -> DxfProfile:
    """The profile of a laid-out drawing, with materials by layer when asked.

    :func:`build_profile` after :func:`layer_material_table` for a mapping; the parameters
    are those of :func:`read_dxf`.

    Returns
    -------
    DxfProfile

    """
    if isinstance(layer_materials, Mapping) and layer_materials:
        layer_materials = layer_material_table(layout, layer_materials, other_layers_material)
    return build_profile(layout, part=part, all_parts=all_parts, chord_tolerance=chord_tolerance,
                         mesh_size=mesh_size, layer_materials=layer_materials)


def read_dxf(path: str | Path, units: str | None = None, *, layers: Sequence[str] | None = None,
             part: int | None = None, all_parts: bool = False, chord_tolerance: float | None = None,
             mesh_size: float | None = None, layer_materials: bool | Mapping[str, str] = False,
             join_tolerance: float | None = None, other_layers_material: str | None = None,
             max_entities: int | None = None) -> Profile:
    """Read a DXF drawing into a validated profile.

    Parameters
    ----------
    path : str or Path
        DXF file.
    units : str, optional
        Length unit of the coordinates, overriding ``$INSUNITS`` (default: the header's unit,
        else millimetres with a note).
    layers : sequence of str, optional
        Layers holding the profile (default: every layer with closed geometry).
    part : int, optional
        Analyse only this part (1-based, largest first) of a drawing with several.
    all_parts : bool
        Take all parts together as one section.
    chord_tolerance : float, optional
        Chord (sagitta) tolerance for curves, profile unit; default tied to ``mesh_size``.
    mesh_size : float, optional
        Mesh size the profile is meant for, profile unit.
    layer_materials : bool or mapping
        True: each layer's name is the material of its loops. A mapping from layer to
        material name (layer names not case-sensitive): those layers' loops are of those
        materials, the other layers' of ``other_layers_material``. Loops of one material nest
        even-odd; a region inside one of another material is an insert.
    join_tolerance : float, optional
        Ends closer than this are one point, profile unit (default :data:`JOIN_TOLERANCE`
        times the diagonal of the drawing).
    other_layers_material : str, optional
        With a mapping ``layer_materials``: the material name of the layers not in it (None:
        the profile's one material, chosen at the analysis).
    max_entities : int, optional
        Most entities the drawing may expand to, each copy of a block counted, and most curves
        read (default :data:`MAX_ENTITIES`); a drawing beyond it is refused before it is
        expanded.

    Returns
    -------
    Profile

    Raises
    ------
    InputFileError
        For a file that cannot be read as a DXF drawing.
    ProfileError
        For a drawing that is not one valid section (with what was found and how to choose).
    UsageError
        For an unknown layer or part number, or a layer material on a layer the profile does
        not use.

    """
    return import_dxf(path, units, layers=layers, part=part, all_parts=all_parts,
                      chord_tolerance=chord_tolerance, mesh_size=mesh_size,
                      layer_materials=layer_materials, join_tolerance=join_tolerance,
                      other_layers_material=other_layers_material,
                      max_entities=max_entities).profile


__all__ = ["CHORD_AREA_BUDGET", "CHORD_PER_MESH_SIZE", "INSUNITS", "JOIN_TOLERANCE", "MAX_BLOCK_DEPTH",
           "MAX_ENTITIES", "MIN_CHORD_PER_MESH_SIZE", "PARTS_IN_MESSAGE", "Drawing", "DrawingError",
           "DxfProfile", "LayerSummary", "Layout", "Loop", "Units", "build_profile",
           "choose_chord_tolerance", "import_dxf", "lay_out", "layer_material_table",
           "open_chain_defects", "profile_of_layout", "read_drawing", "read_dxf", "resolve_units"]
