"""Readers that turn files into validated profiles.

:func:`load_profile` chooses the reader by the file's ending: ``.dxf`` (any case) is a DXF
drawing (:mod:`warpwise.io.dxf`), anything else a coordinate outline
(:mod:`warpwise.io.outline`).
"""

from __future__ import annotations

from collections.abc import Sequence
from pathlib import Path

from ..errors import UsageError
from ..geometry.profile import Profile
from .dxf import import_dxf, read_drawing, read_dxf
from .outline import parse_outline, read_outline


def is_dxf(path: str | Path) -> bool:
    """True when the file's ending says it is a DXF drawing."""
    return Path(path).suffix.lower() == ".dxf"


def load_profile(path: str | Path, units: str | None = None, *, layers: Sequence[str] | None = None,
                 part: int | None = None, all_parts: bool = False,
                 chord_tolerance: float | None = None, mesh_size: float | None = None) -> Profile:
    """Read a profile from a file, choosing the reader by the file's ending.

    Parameters
    ----------
    path : str or Path
        A DXF drawing (``.dxf``) or a coordinate outline (any other ending).
    units : str, optional
        Length unit overriding the file's.
    layers : sequence of str, optional
        DXF only: the layers holding the profile (default every layer with closed geometry).
    part : int, optional
        DXF only: analyse this part (1-based, largest first) of a drawing with several.
    all_parts : bool
        Take every part of a drawing as one section (outline files always do).
    chord_tolerance : float, optional
        DXF only: largest distance between a chord and its curve, drawing unit (default tied
        to the mesh size).
    mesh_size : float, optional
        The mesh size the profile is for, drawing unit (sets the default chord tolerance).

    Returns
    -------
    Profile

    Raises
    ------
    UsageError
        DXF-only options given for an outline file.

    """
    if is_dxf(path):
        return read_dxf(path, units, layers=layers, part=part, all_parts=all_parts,
                        chord_tolerance=chord_tolerance, mesh_size=mesh_size)
    for flag, value in (("--layer", layers), ("--part", part), ("--chord-tolerance", chord_tolerance)):
        if value:
            raise UsageError(f"{flag} applies to DXF drawings only", file=str(path))
    return read_outline(path, units)


__all__ = ["import_dxf", "is_dxf", "load_profile", "parse_outline", "read_drawing", "read_dxf",
           "read_outline"]
