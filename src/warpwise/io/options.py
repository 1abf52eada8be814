"""How a file is read into a profile: the reading options every command and the catalogue share.

Examples
--------
>>> opts = ReadOptions(units="mm")
>>> opts.load("sample_sections/channel_thick_80x40.txt").units
'mm'
"""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path

from ..geometry.profile import Profile


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
        DXF: the part to analyse (1-based, largest first).
    all_parts : bool
        Take every part of a drawing as one section.
    chord_tolerance : float or None
        DXF: largest distance between a chord and its curve, drawing unit.
    mesh_size : float or None
        The mesh size the profile is for, drawing unit (sets the default chord tolerance).
    """

    units: str | None = None
    layers: tuple[str, ...] = ()
    part: int | None = None
    all_parts: bool = False
    chord_tolerance: float | None = None
    mesh_size: float | None = None

    def load(self, path: str | Path) -> Profile:
        """Read ``path`` into a validated profile with these options."""
        from . import load_profile

        return load_profile(path, self.units, layers=self.layers or None, part=self.part,
                            all_parts=self.all_parts, chord_tolerance=self.chord_tolerance,
                            mesh_size=self.mesh_size)
