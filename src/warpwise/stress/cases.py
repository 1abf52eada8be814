r"""Load-case files: several sets of section forces, one row per case.

The file is plain text, comma separated::

    # crane runway girder, our own invented cases
    units: mm
    case, N, Mx, My, Vx, Vy, T
    self weight, 0, 2.5e6, 0, 0, 4000, 0
    wind, -1500, 0, 8.0e5, 1200, 0, 3.0e4

Lines starting with ``#`` and blank lines are skipped. An optional ``units:`` line before the
header names the unit system of the loads (:data:`warpwise.units.SYSTEMS`: mm means N and N*mm);
without it the loads are in the report's unit system. The header is ``case`` and any of the
load names N, Mx, My, Vx, Vy, T, B (signs as in :class:`~warpwise.stress.loads.Loads`; a load
left out is zero). Each later line is one case: its name and one number per load column.

Examples
--------
>>> f = parse_load_cases("units: cm\ncase, Mx, Vy\nlift, 250, 12\n", source="a.csv")
>>> f.units, f.names, f.loads[0].Mx
('cm', ('lift',), 250.0)
>>> parse_load_cases("case, Mz\nx, 1\n", source="a.csv")
Traceback (most recent call last):
...
warpwise.errors.InputFileError: a.csv: line 1: unknown column 'Mz' (columns: case, N, Mx, My, Vx, Vy, T, B)
"""

from __future__ import annotations

from dataclasses import dataclass, fields
from pathlib import Path

import numpy as np

from ..errors import InputFileError
from ..io.outline import read_text
from ..units import SYSTEMS
from .loads import Loads

LOAD_COLUMNS = tuple(f.name for f in fields(Loads))


@dataclass(frozen=True)
class LoadCases:
    """Named load cases of one file.

    Attributes
    ----------
    source : str
        The file.
    units : str or None
        Unit system of the loads (None: the report's).
    names : tuple of str
        Case names, in file order.
    loads : tuple of Loads
        The section forces of each case (F, F*L of ``units``).
    """

    source: str
    units: str | None
    names: tuple[str, ...]
    loads: tuple[Loads, ...]


def _header(cells: list[str], number: int, source: str) -> list[str]:
    """The load columns of the header line (after ``case``)."""
    def refuse(what: str) -> InputFileError:
        return InputFileError(f"line {number}: {what}", file=source)

    if cells[0].lower() != "case":
        raise refuse(f"the header starts with 'case', got {cells[0]!r} "
                     f"(columns: case, {', '.join(LOAD_COLUMNS)})")
    for c in cells[1:]:
        if c not in LOAD_COLUMNS:
            raise refuse(f"unknown column {c!r} (columns: case, {', '.join(LOAD_COLUMNS)})")
    if len(set(cells[1:])) < len(cells) - 1:
        raise refuse("a load column is named twice")
    if len(cells) == 1:
        raise refuse(f"no load column (columns: case, {', '.join(LOAD_COLUMNS)})")
    return cells[1:]


def _case(cells: list[str], columns: list[str], number: int, source: str) -> Loads:
    """The loads of one case line."""
    if len(cells) != len(columns) + 1:
        raise InputFileError(f"line {number} has {len(cells)} cells, the header "
                             f"{len(columns) + 1}", file=source)
    values = {}
    for col, text in zip(columns, cells[1:], strict=True):
        try:
            v = float(text)
        except ValueError:
            v = float("nan")
        if not np.isfinite(v):
            raise InputFileError(f"line {number}: {col} is not a finite number: {text!r}",
                                 file=source)
        values[col] = v
    return Loads(**values)


def parse_load_cases(text: str, *, source: str = "<text>") -> LoadCases:
    """Load cases from the text of a load-case file (see the module notes).

    Raises
    ------
    InputFileError
        An unknown unit system or column, a cell that is not a number, a line of the wrong
        length, a case named twice or without a name, or no case at all; naming file and line.
    """
    units, columns, names, loads = None, None, [], []
    for number, raw in enumerate(text.splitlines(), start=1):
        line = raw.strip()
        if not line or line.startswith("#"):
            continue
        key, colon, rest = line.partition(":")
        if columns is None and colon and key.strip().lower() == "units":
            units = rest.strip()
            if units not in SYSTEMS:
                raise InputFileError(f"line {number}: unknown unit system {units!r} "
                                     f"(use {', '.join(SYSTEMS)})", file=source)
            continue
        cells = [c.strip() for c in line.split(",")]
        if columns is None:
            columns = _header(cells, number, source)
            continue
        if not cells[0] or cells[0] in names:
            what = "has no case name" if not cells[0] else f"repeats case {cells[0]!r}"
            raise InputFileError(f"line {number} {what}", file=source)
        names.append(cells[0])
        loads.append(_case(cells, columns, number, source))
    if not loads:
        raise InputFileError("no load case (a header 'case, N, Mx, ...' and one line per case)",
                             file=source)
    return LoadCases(source, units, tuple(names), tuple(loads))


def read_load_cases(path: str | Path) -> LoadCases:
    """Load cases from a load-case file (the project's text reader, then parse_load_cases)."""
    return parse_load_cases(read_text(path, kind="load-case"), source=str(path))


__all__ = ["LOAD_COLUMNS", "LoadCases", "parse_load_cases", "read_load_cases"]
