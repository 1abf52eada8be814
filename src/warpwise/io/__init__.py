"""Readers that turn files into validated profiles."""

from __future__ import annotations

from pathlib import Path

from ..geometry import Profile
from .outline import parse_outline, read_outline


def load_profile(path: str | Path, units: str | None = None) -> Profile:
    """Read a profile from a file, choosing the reader by the file's ending.

    Parameters
    ----------
    path : str or Path
        A coordinate outline (any ending but ``.dxf``).
    units : str, optional
        Length unit overriding the file's.

    Returns
    -------
    Profile

    """
    return read_outline(path, units)


__all__ = ["load_profile", "parse_outline", "read_outline"]
