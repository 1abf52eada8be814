"""Readers that turn files into validated profiles.

:func:`load_profile` chooses the reader by the file's ending with one look-up in
:data:`READERS`: ``.dxf`` (any case) is a DXF drawing (:mod:`warpwise.io.dxf`), anything else a
coordinate outline (:mod:`warpwise.io.outline`, :data:`DEFAULT_READER`). Every reader takes the
file and one :class:`~warpwise.io.options.ReadOptions`; the outline reader refuses the options
that apply to drawings only.

The DXF reader (and ezdxf with it) is loaded when a drawing is first read, or when one of its
names (``read_dxf``, ``read_drawing``, ``import_dxf``) is first asked of this package, so that
reading an outline file never pays for it.
"""

from __future__ import annotations

import importlib
from collections.abc import Mapping, Sequence
from pathlib import Path
from typing import Protocol

from ..geometry.profile import Profile
from .options import MAX_ENTITIES, ReadOptions
from .outline import parse_outline, read_outline, refuse_dxf_options

#: Names of the DXF reader offered here, loaded on first use (module ``__getattr__``).
_DXF_NAMES = ("import_dxf", "read_drawing", "read_dxf")


def __getattr__(name: str) -> object:
    """A name of the DXF reader (:mod:`warpwise.io.dxf`), which is imported on first use."""
    if name not in _DXF_NAMES:
        raise AttributeError(f"module {__name__!r} has no attribute {name!r}")
    value = getattr(importlib.import_module(".dxf", __name__), name)
    globals()[name] = value
    return value


class ProfileReader(Protocol):
    """What a reader of one kind of file takes and gives."""

    def __call__(self, path: str | Path, options: ReadOptions) -> Profile:
        """Read the file at ``path`` into a validated profile."""


def _dxf_reader(path: str | Path, options: ReadOptions) -> Profile:
    from .dxf import read_dxf

    return read_dxf(path, options.units, layers=options.layers or None, part=options.part,
                    all_parts=options.all_parts, chord_tolerance=options.chord_tolerance,
                    mesh_size=options.mesh_size, join_tolerance=options.join_tolerance,
                    layer_materials=dict(options.layer_materials),
                    other_layers_material=options.other_layers_material,
                    max_entities=options.max_entities)


def _outline_reader(path: str | Path, options: ReadOptions) -> Profile:
    refuse_dxf_options(path, options)
    return read_outline(path, options.units, part=options.part, all_parts=options.all_parts,
                        mesh_size=options.mesh_size)


#: File ending (lower case) -> the reader of such files.
READERS: dict[str, ProfileReader] = {".dxf": _dxf_reader}
#: The reader of a file whose ending is not in :data:`READERS`: a coordinate outline.
DEFAULT_READER: ProfileReader = _outline_reader


def reader_for(path: str | Path) -> ProfileReader:
    """The reader for a file, by its ending (not case-sensitive).

    Examples
    --------
    >>> reader_for("plate.DXF") is READERS[".dxf"], reader_for("bar.txt") is DEFAULT_READER
    (True, True)

    """
    return READERS.get(Path(path).suffix.lower(), DEFAULT_READER)


def is_dxf(path: str | Path) -> bool:
    """True when the file's ending says it is a DXF drawing."""
    return reader_for(path) is _dxf_reader


def load_profile(path: str | Path, units: str | None = None, *, layers: Sequence[str] | None = None,
                 part: int | None = None, all_parts: bool = False,
                 chord_tolerance: float | None = None, mesh_size: float | None = None,
                 join_tolerance: float | None = None,
                 layer_materials: Mapping[str, str] | None = None,
                 other_layers_material: str | None = None,
                 max_entities: int | None = None) -> Profile:
    """Read a profile from a file, choosing the reader by the file's ending.

    The arguments are the fields of :class:`~warpwise.io.options.ReadOptions`; the command
    line reads every file through the same options, so a file means the same here and there
    (units, parts, layers; the materials named in the file are resolved by
    :func:`warpwise.analyse` and :func:`warpwise.properties.run.run_analysis` alike).

    Parameters
    ----------
    path : str or Path
        A DXF drawing (``.dxf``) or a coordinate outline (any other ending).
    units : str, optional
        Length unit overriding the file's.
    layers : sequence of str, optional
        DXF only: the layers holding the profile (default every layer with closed geometry).
    part : int, optional
        Analyse this part (1-based, largest first) of a file with several separate parts.
    all_parts : bool
        Take every separate part of a file as one section.
    chord_tolerance : float, optional
        DXF only: largest distance between a chord and its curve, drawing unit (default tied
        to the mesh size).
    mesh_size : float, optional
        The mesh size the profile is for, drawing unit (sets the default chord tolerance).
    join_tolerance : float, optional
        DXF only: ends closer than this are one point, drawing unit (default 1e-5 of the
        drawing's diagonal).
    layer_materials : mapping of str to str, optional
        DXF only: material name by layer; the drawing becomes a composite by layers.
    other_layers_material : str, optional
        DXF only, with ``layer_materials``: material name of the loops on the other layers.
    max_entities : int, optional
        DXF only: most entities the drawing may expand to, each copy of a block counted
        (default 200,000, :data:`warpwise.io.options.MAX_ENTITIES`).

    Returns
    -------
    Profile

    Raises
    ------
    UsageError
        DXF-only options given for an outline file.

    """
    options = ReadOptions(units=units, layers=tuple(layers or ()), part=part, all_parts=all_parts,
                          chord_tolerance=chord_tolerance, mesh_size=mesh_size,
                          join_tolerance=join_tolerance, layer_materials=layer_materials or (),
                          other_layers_material=other_layers_material, max_entities=max_entities)
    return options.load(path)


__all__ = ["DEFAULT_READER", "MAX_ENTITIES", "READERS", "ProfileReader", "ReadOptions",
           "import_dxf", "is_dxf", "load_profile", "parse_outline", "read_drawing", "read_dxf",
           "read_outline", "reader_for"]
