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

from ..errors import InputFileError
from ..geometry.profile import LENGTH_UNITS, Profile, profile_from_loops

#: Largest input file accepted, bytes.
MAX_FILE_BYTES = 50 * 1024 * 1024

_SPLIT = re.compile(r"[,;\s]+")


def read_input(path: str | Path) -> bytes:
    """Bytes of an input file, after the checks every reader shares.

    Raises
    ------
    InputFileError
        Missing file, a folder, a file over :data:`MAX_FILE_BYTES`, or unreadable.
    """
    p = Path(path)
    name = str(path)
    if not p.exists():
        raise InputFileError("file not found", file=name)
    if p.is_dir():
        raise InputFileError("is a folder, not a file", file=name)
    size = p.stat().st_size
    if size > MAX_FILE_BYTES:
        raise InputFileError(
            f"file is {size / 1e6:.1f} MB, over the {MAX_FILE_BYTES / 1e6:.0f} MB limit", file=name)
    try:
        return p.read_bytes()
    except OSError as exc:
        raise InputFileError(f"cannot be read ({exc.strerror})", file=name) from None


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
    name = str(path)
    data = read_input(path)
    if not data.strip():
        raise InputFileError("file is empty", file=name)
    if b"\x00" in data:
        raise InputFileError(f"is a binary file, not a text {kind} file", file=name)
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
    return profile_from_loops(loops, materials, source=source, units=chosen, notes=notes)


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
