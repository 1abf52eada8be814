"""How a file is read into a profile: the reading options every command and the catalogue share.

:class:`ReadOptions` is the one carrier of these choices: :func:`warpwise.io.load_profile`
builds one from its arguments and every reader takes one, so the command line, the catalogue
and the Python API read a file the same way.

Examples
--------
>>> opts = ReadOptions(units="mm")
>>> opts.load("sample_sections/channel_thick_80x40.txt").units
'mm'
>>> ReadOptions(layer_materials={"insert": "steel-S235"}).layer_materials
(('insert', 'steel-S235'),)
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import dataclass
from pathlib import Path

from ..errors import UsageError
from ..geometry.profile import Profile

#: Most entities one drawing may hold, each copy of a block counted (and most pieces read from
#: it), unless the reader is given another limit (``--max-entities``). Kept here, with the
#: options, so that the command line can name it without loading the DXF reader.
MAX_ENTITIES = 200_000


@dataclass(frozen=True)
class ReadOptions:
    """Reading options (see :func:`warpwise.io.load_profile`).

    Attributes
    ----------
    units : str or None
        Length unit overriding the file's (None: from the file, else mm).
    layers : tuple of str
        DXF layers holding the profile (empty: every layer with closed geometry).
    part : int or None
        Of a file with several separate parts, the part to analyse (1-based, largest first).
    all_parts : bool
        Take every separate part of a file as one section.
    chord_tolerance : float or None
        DXF: largest distance between a chord and its curve, drawing unit.
    mesh_size : float or None
        The mesh size the profile is for, drawing unit (sets the default chord tolerance).
    join_tolerance : float or None
        DXF: ends closer than this are one point, drawing unit (None: 1e-5 of the diagonal of
        the drawing, :data:`warpwise.io.dxf.JOIN_TOLERANCE`).
    layer_materials : tuple of (str, str)
        DXF: (layer, material name) pairs; with any, the drawing is a composite by layers
        (a mapping is accepted and kept as pairs).
    other_layers_material : str or None
        DXF, with ``layer_materials``: the material name of the loops on the other layers
        (the command's ``--material``); None leaves it to the analysis, which then needs one.
    max_entities : int or None
        DXF: most entities a drawing may expand to, each copy of a block counted, and most
        curves read (None: :data:`MAX_ENTITIES`, 200,000); a drawing beyond it
        is refused before it is expanded.
    """

    units: str | None = None
    layers: tuple[str, ...] = ()
    part: int | None = None
    all_parts: bool = False
    chord_tolerance: float | None = None
    mesh_size: float | None = None
    join_tolerance: float | None = None
    layer_materials: tuple[tuple[str, str], ...] = ()
    other_layers_material: str | None = None
    max_entities: int | None = None

    def __post_init__(self) -> None:
        """Keep sequences as tuples and refuse choices that cannot be right."""
        object.__setattr__(self, "layers", tuple(self.layers or ()))
        pairs = self.layer_materials
        pairs = tuple(pairs.items()) if isinstance(pairs, Mapping) else tuple(map(tuple, pairs or ()))
        object.__setattr__(self, "layer_materials", pairs)
        if self.part is not None and self.all_parts:
            raise UsageError("give either a part number (--part) or --all-parts, not both")
        for name, value in (("join tolerance", self.join_tolerance),
                            ("chord tolerance", self.chord_tolerance)):
            if value is not None and not (math.isfinite(value) and value > 0):
                raise UsageError(f"{name} must be a positive number, got {value}")
        if self.max_entities is not None and not (
                isinstance(self.max_entities, int) and not isinstance(self.max_entities, bool)
                and self.max_entities > 0):
            raise UsageError("the entity limit (--max-entities) must be a whole number, 1 or more, "
                             f"got {self.max_entities!r}")
        layers = [layer.lower() for layer, _ in pairs]
        if len(set(layers)) != len(layers):
            raise UsageError("a layer is given a material twice (--layer-material)")

    @property
    def dxf_only(self) -> tuple[tuple[str, object], ...]:
        """The options that apply to DXF drawings only, with their values (flag, value)."""
        return (("--layer", self.layers), ("--chord-tolerance", self.chord_tolerance),
                ("--join-tolerance", self.join_tolerance),
                ("--layer-material", self.layer_materials),
                ("--max-entities", self.max_entities))

    def load(self, path: str | Path) -> Profile:
        """Read ``path`` into a validated profile with these options."""
        from . import reader_for

        return reader_for(path)(path, self)
