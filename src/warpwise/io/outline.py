r"""Reader for the plain-text coordinate outline format.

One vertex per line as ``x, y`` (comma, semicolon or white space between the numbers); lines
starting with ``#`` are comments; a blank line ends a loop (the first point need not be
repeated). Nesting is even-odd. ``material: NAME`` before a loop gives that loop (and the
following ones, until the next such line) a material; ``units: mm|cm|m|in`` anywhere sets the
length unit.

Examples
--------
>>> text = "# a 10 x 4 bar with a hole\n0 0\n10 0\n10 4\n0 4\n\n4 1\n6 1\n6 3\n4 3\n"
>>> p = parse_outline(text, source="bar.txt")
>>> p.area, len(p.regions[0].holes)
(36.0, 1)
>>> parse_outline("0 0\n1 x\n", source="bad.txt")
Traceback (most recent call last):
...
warpwise.errors.InputFileError: bad.txt: line 2 is not a pair of numbers: '1 x'

"""

from __future__ import annotations

import re
from pathlib import Path

import numpy as np

from ..errors import InputFileError, UsageError
from ..geometry.profile import LENGTH_UNITS, Profile, profile_from_loops
from .files import MAX_FILE_BYTES, check_assumed_size, read_input, refuse_binary

_SPLIT = re.compile(r"[,;\s]+")


def read_text(path: str | Path, kind: str = "outline") -> str:
    """Read a text file with the size and encoding checks every reader shares.

    Parameters
    ----------
    path : str or Path
        File to read.
    kind : str
        What the file should be, for messages.

    Returns
    -------
    str
        The file's text.

    Raises
    ------
    InputFileError
        Missing, unreadable, too large, empty or binary file.

    """
    data = read_input(path)
    refuse_binary(data, str(path), f"a text {kind} file")
    return data.decode("utf-8", errors="replace")


def parse_outline(text: str, *, source: str = "<text>", units: str | None = None) -> Profile:
    """Parse outline text into a validated profile.

    Parameters
    ----------
    text : str
        Contents in the coordinate outline format.
    source : str
        Name used in messages.
    units : str, optional
        Length unit; overrides a ``units:`` line. Default mm.

    Returns
    -------
    Profile

    Raises
    ------
    InputFileError
        A line that is not two numbers, an unknown directive or unit.
    ProfileError
        Invalid geometry (open, self-crossing, overlapping...).

    """
    loops: list[np.ndarray] = []
    materials: list[str | None] = []
    current: list[tuple[float, float]] = []
    material: str | None = None
    file_units: str | None = None

    def close() -> None:
        if current:
            loops.append(np.array(current))
            materials.append(material)
            current.clear()

    for number, raw in enumerate(text.splitlines(), start=1):
        line = raw.strip()
        if line.startswith("#"):
            continue
        if not line:
            close()
            continue
        if ":" in line and line[0].isalpha():
            key, _, value = line.partition(":")
            key, value = key.strip().lower(), value.strip()
            close()
            if key == "material":
                if not value:
                    raise InputFileError(f"line {number}: material name is missing", file=source)
                material = value
            elif key == "units":
                if value not in LENGTH_UNITS:
                    raise InputFileError(
                        f"line {number}: unknown unit {value!r} (use {', '.join(LENGTH_UNITS)})",
                        file=source)
                if file_units is not None and file_units != value:
                    raise InputFileError(f"line {number}: a second 'units:' line ({value}) "
                                         f"contradicts the first ({file_units})", file=source)
                file_units = value
            else:
                raise InputFileError(f"line {number}: unknown directive {key!r}", file=source)
            continue
        parts = [p for p in _SPLIT.split(line) if p]
        try:
            if len(parts) != 2:
                raise ValueError
            x, y = float(parts[0]), float(parts[1])
        except ValueError:
            raise InputFileError(f"line {number} is not a pair of numbers: {line!r}",
                                 file=source) from None
        if not (np.isfinite(x) and np.isfinite(y)):
            raise InputFileError(f"line {number} has a non-finite coordinate: {line!r}",
                                 file=source)
        current.append((x, y))
    close()
    if not loops:
        raise InputFileError("no coordinates found", file=source)
    chosen = units or file_units or "mm"
    notes = () if (units or file_units) else ("length unit not given: millimetres assumed",)
    if all(m is None for m in materials):
        materials = None
    elif any(m is None for m in materials):
        raise InputFileError("some loops have a material and some do not: give every loop one "
                             "(a 'material:' line before the first loop)", file=source)
    profile = profile_from_loops(loops, materials, source=source, units=chosen, notes=notes)
    return profile if (units or file_units) else check_assumed_size(profile)


def read_outline(path: str | Path, units: str | None = None) -> Profile:
    """Read a coordinate outline file into a validated profile.

    Parameters
    ----------
    path : str or Path
        Outline file.
    units : str, optional
        Length unit overriding the file's (default mm).

    Returns
    -------
    Profile

    """
    return parse_outline(read_text(path), source=str(path), units=units)


def refuse_dxf_options(path: str | Path, *, layers: object = None, part: object = None,
                       chord_tolerance: object = None) -> None:
    """Refuse, for an outline file, the options that apply to DXF drawings only.

    Raises
    ------
    UsageError
        Naming the first such option given (``--layer``, ``--part`` or ``--chord-tolerance``).

    Examples
    --------
    >>> refuse_dxf_options("bar.txt", part=2)
    Traceback (most recent call last):
    ...
    warpwise.errors.UsageError: bar.txt: --part applies to DXF drawings only

    """
    for flag, value in (("--layer", layers), ("--part", part), ("--chord-tolerance", chord_tolerance)):
        if value:
            raise UsageError(f"{flag} applies to DXF drawings only", file=str(path))


__all__ = ["MAX_FILE_BYTES", "parse_outline", "read_input", "read_outline", "read_text",
           "refuse_dxf_options"]
