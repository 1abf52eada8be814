r"""Reader for the plain-text coordinate outline format.

One vertex per line as ``x, y`` (comma, semicolon or white space between the numbers, decimal
points); lines starting with ``#`` are comments; a blank line ends a loop (the first point need
not be repeated). Nesting is even-odd. ``material: NAME`` before a loop gives that loop (and the
following ones, until the next such line) a material; ``units: mm|cm|m|in|ft`` anywhere sets
the length unit. A UTF-8 byte-order mark and one line of column names ``x`` and ``y`` before
the first coordinates (as spreadsheets write them) are skipped with a note; decimal commas
(``1,5;2,5``) are refused, since a comma also separates the numbers. A number is an optional
sign, digits with an optional decimal point and an optional exponent (:data:`NUMBER`); nothing
else (``2_0``, ``inf``, ``0x10``) is read as one. The file may be UTF-8 (with or without a
byte-order mark) or UTF-16 with its byte-order mark (:func:`warpwise.textfiles.decode_text`).
Loops that form separate parts follow the one rule of every reader
(:func:`warpwise.io.nesting.choose_part`): one part, or ``--part N``, or ``--all-parts``.

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
>>> parse_outline("x;y\n0;0\n2;0\n2;1\n", source="sheet.csv").notes[0]
"line 1: column names 'x;y' skipped"
>>> parse_outline("0;0\n2,5;0\n", source="comma.csv")
Traceback (most recent call last):
...
warpwise.errors.InputFileError: comma.csv: line 2 has a decimal comma: '2,5;0' (write decimal points: 2.5 0)
>>> parse_outline("0 0\n2_0 0\n", source="under.txt")
Traceback (most recent call last):
...
warpwise.errors.InputFileError: under.txt: line 2 is not a pair of numbers: '2_0 0'

"""

from __future__ import annotations

import re
from dataclasses import replace
from pathlib import Path

import numpy as np

from ..errors import InputFileError, UsageError
from ..geometry.loops import signed_area
from ..geometry.profile import LENGTH_UNITS, Profile, default_element_size, profile_from_loops
from ..geometry.simplify import simplify_dense_loops
from ..textfiles import PLAIN
from .files import MAX_FILE_BYTES, check_assumed_size, decode_text, read_input
from .nesting import choose_part, nest_loops, parts_note, separate_parts_error
from .options import ReadOptions

_SPLIT = re.compile(r"[,;\s]+")
#: A comma between two digits: a decimal comma when the line is then two numbers.
_DECIMAL_COMMA = re.compile(r"(?<=\d),(?=\d)")
#: Column names accepted as the one header line (not case-sensitive).
HEADER_NAMES = ("x", "y")
#: A number: optional sign, digits with an optional decimal point, optional exponent.
NUMBER = re.compile(r"[+-]?(?:[0-9]+\.?[0-9]*|\.[0-9]+)(?:[eE][+-]?[0-9]+)?")


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
        Missing, unreadable, too large, empty or binary file, or bytes that are not UTF-8 or
        UTF-16 text (naming the encoding).

    """
    return _decoded(path, kind)[0]


def _decoded(path: str | Path, kind: str = "outline") -> tuple[str, str]:
    """The text of a file and the name of its encoding."""
    return decode_text(read_input(path), str(path), f"a text {kind} file")


def _numbers(line: str) -> tuple[float, float] | None:
    """The two numbers of a coordinate line, or None when it is not two numbers."""
    parts = [p for p in _SPLIT.split(line) if p]
    if len(parts) != 2 or not all(NUMBER.fullmatch(p) for p in parts):
        return None
    return float(parts[0]), float(parts[1])


def _refuse_line(line: str, number: int, source: str, first: bool) -> InputFileError:
    """The error for a line that is not a pair of numbers, saying what it seems to be."""
    dotted = _DECIMAL_COMMA.sub(".", line)
    pair = _numbers(dotted) if dotted != line else None
    if pair is not None:
        return InputFileError(f"line {number} has a decimal comma: {line!r} (write decimal "
                              f"points: {pair[0]:g} {pair[1]:g})", file=source)
    words = [p for p in _SPLIT.split(line) if p]
    if first and words and all(_numbers(f"{w} 0") is None for w in words):
        return InputFileError(f"line {number} is not a pair of numbers: {line!r} (a header line "
                              f"may only name the columns {' and '.join(HEADER_NAMES)}; give the "
                              "unit with a 'units:' line)", file=source)
    hint = " (if a comma is a decimal comma, write a decimal point)" if dotted != line else ""
    return InputFileError(f"line {number} is not a pair of numbers: {line!r}{hint}", file=source)


def _is_header(line: str) -> bool:
    """True for a line of the column names x and y (any case, any separator)."""
    return [p.lower() for p in _SPLIT.split(line) if p] == list(HEADER_NAMES)


def parse_outline(text: str, *, source: str = "<text>", units: str | None = None,
                  part: int | None = None, all_parts: bool = False,
                  encoding: str = PLAIN, mesh_size: float | None = None) -> Profile:
    """Parse outline text into a validated profile.

    Parameters
    ----------
    text : str
        Contents in the coordinate outline format.
    source : str
        Name used in messages.
    units : str, optional
        Length unit; overrides a ``units:`` line. Default mm.
    part : int, optional
        Of loops forming several separate parts, analyse this one (1-based, largest area
        first).
    all_parts : bool
        Analyse every separate part together as one section.
    encoding : str
        The encoding the text was read in (named in a note unless plain UTF-8).
    mesh_size : float, optional
        The mesh size the profile is for, drawing unit (default from the area): a traced loop
        of far more vertices than that size resolves is simplified under a tolerance well
        below it, with a note (:func:`warpwise.geometry.simplify.simplify_dense_loops`).

    Returns
    -------
    Profile

    Raises
    ------
    InputFileError
        A line that is not two numbers, an unknown directive or unit.
    ProfileError
        Invalid geometry (open, self-crossing, overlapping...), or several separate parts
        with neither ``part`` nor ``all_parts``.
    UsageError
        A part number that does not exist, or both ``part`` and ``all_parts``.

    """
    loops: list[np.ndarray] = []
    materials: list[str | None] = []
    current: list[tuple[float, float]] = []
    material: str | None = None
    file_units: str | None = None
    notes: list[str] = []
    if text.startswith("\ufeff"):
        text = text[1:]
        encoding = "UTF-8 with byte-order mark"
    if encoding == "UTF-8 with byte-order mark":
        notes.append("UTF-8 byte-order mark at the start of the file skipped")
    elif encoding != PLAIN:
        notes.append(f"read as {encoding} text")
    first = True  # no coordinate line read yet: one header line of column names may come

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
                file_units = _unit_line(value, number, source, file_units)
            else:
                raise InputFileError(f"line {number}: unknown directive {key!r}", file=source)
            continue
        if first and _is_header(line):
            notes.append(f"line {number}: column names {line!r} skipped")
            first = False
            continue
        current.append(_coordinate(line, number, source, first))
        first = False
    close()
    if not loops:
        raise InputFileError("no coordinates found", file=source)
    chosen = units or file_units or "mm"
    if not (units or file_units):
        notes.append("length unit not given: millimetres assumed")
    largest = max(abs(signed_area(lp)) for lp in loops)
    loops, simplified = simplify_dense_loops(loops, mesh_size or default_element_size(largest), chosen)
    notes += simplified
    if all(m is None for m in materials):
        materials = None
    elif any(m is None for m in materials):
        raise InputFileError("some loops have a material and some do not: give every loop one "
                             "(a 'material:' line before the first loop)", file=source)
    profile = _profile_of_parts(loops, materials, source, chosen, notes, part, all_parts)
    return profile if (units or file_units) else check_assumed_size(profile)


def _profile_of_parts(loops: list[np.ndarray], materials: list[str | None] | None, source: str,
                      units: str, notes: list[str], part: int | None, all_parts: bool) -> Profile:
    """The profile of the part asked for, or of all parts; refuse several without a choice."""
    choose_part((), None, all_parts and part is not None, source)  # both given: refused first
    profile = profile_from_loops(loops, materials, source=source, units=units, notes=notes)
    parts = nest_loops(loops, materials)[1]
    chosen = choose_part(parts, part, all_parts, source)
    if chosen is None and len(parts) > 1 and not all_parts:
        raise separate_parts_error(parts, units, source)
    note = parts_note(part, len(parts))
    if chosen is None or len(parts) == 1:
        return profile if note is None else replace(profile, notes=(*profile.notes, note))
    mats = None if materials is None else [materials[i] for i in chosen.loops]
    return profile_from_loops([loops[i] for i in chosen.loops], mats, source=source, units=units,
                              notes=[*notes, note])


def _unit_line(value: str, number: int, source: str, before: str | None) -> str:
    """The unit of a ``units:`` line, checked against the table and an earlier such line."""
    if value not in LENGTH_UNITS:
        raise InputFileError(f"line {number}: unknown unit {value!r} (use {', '.join(LENGTH_UNITS)})",
                             file=source)
    if before is not None and before != value:
        raise InputFileError(f"line {number}: a second 'units:' line ({value}) contradicts the "
                             f"first ({before})", file=source)
    return value


def _coordinate(line: str, number: int, source: str, first: bool) -> tuple[float, float]:
    """The point of a coordinate line (``first``: no coordinate line came before it)."""
    pair = _numbers(line)
    if pair is None:
        raise _refuse_line(line, number, source, first)
    if not (np.isfinite(pair[0]) and np.isfinite(pair[1])):
        raise InputFileError(f"line {number} has a non-finite coordinate: {line!r}", file=source)
    return pair


def read_outline(path: str | Path, units: str | None = None, *, part: int | None = None,
                 all_parts: bool = False, mesh_size: float | None = None) -> Profile:
    """Read a coordinate outline file into a validated profile.

    Parameters
    ----------
    path : str or Path
        Outline file.
    units : str, optional
        Length unit overriding the file's (default mm).
    part : int, optional
        Of several separate parts, analyse this one (1-based, largest area first).
    all_parts : bool
        Analyse every separate part together as one section.
    mesh_size : float, optional
        The mesh size the profile is for, drawing unit (see :func:`parse_outline`).

    Returns
    -------
    Profile

    """
    text, encoding = _decoded(path)
    return parse_outline(text, source=str(path), units=units, part=part, all_parts=all_parts,
                         encoding=encoding, mesh_size=mesh_size)


def refuse_dxf_options(path: str | Path, options: ReadOptions) -> None:
    """Refuse, for an outline file, the options that apply to DXF drawings only.

    Raises
    ------
    UsageError
        Naming the first such option given (:attr:`ReadOptions.dxf_only`).

    Examples
    --------
    >>> refuse_dxf_options("bar.txt", ReadOptions(layers=("SECTION",)))
    Traceback (most recent call last):
    ...
    warpwise.errors.UsageError: bar.txt: --layer applies to DXF drawings only

    """
    for flag, value in options.dxf_only:
        if value:
            raise UsageError(f"{flag} applies to DXF drawings only", file=str(path))


__all__ = ["MAX_FILE_BYTES", "parse_outline", "read_input", "read_outline", "read_text",
           "refuse_dxf_options"]
