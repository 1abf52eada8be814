"""The property table as an XLSX workbook: numbers as numbers, units in a row of their own.

Three sheets, one per table: ``properties`` (the columns of the CSV, :func:`property_rows`,
with the quantity in the first row and its unit in the second), ``failures`` (each profile that
failed and its one-line error) and ``materials`` (every material the rows name, with its values
in the table's unit system). Text is stored as text, never as a formula, whatever its first
character; a value not computed is an empty cell.
"""

from __future__ import annotations

import io
from collections.abc import Sequence
from typing import Any

from ..materials import Material
from ..units import system
from .files import Column, property_rows
from .records import Record

#: Sheet names, in order.
SHEETS = ("properties", "failures", "materials")
#: Rows above the data of every sheet: the quantity, then its unit.
HEADER_ROWS = 2


def _put(sheet: Any, row: int, col: int, value: Any) -> None:
    """One cell: text as text (never a formula, no control characters), numbers as numbers."""
    from openpyxl.cell.cell import ILLEGAL_CHARACTERS_RE

    if isinstance(value, float) and value != value:
        return  # not computed: an empty cell
    if isinstance(value, str):
        cell = sheet.cell(row=row, column=col, value=ILLEGAL_CHARACTERS_RE.sub("?", value))
        cell.data_type = "s"  # "=1+2.txt" stays a name, not a formula
        return
    sheet.cell(row=row, column=col, value=value)


def _table(sheet: Any, columns: Sequence[Column], rows: Sequence[Sequence[Any]]) -> None:
    """Fill a sheet: names, units, then the rows; the header stays in view."""
    for j, c in enumerate(columns, start=1):
        _put(sheet, 1, j, c.name)
        _put(sheet, 2, j, c.unit)
        width = max(len(c.name), len(c.unit), 10)
        sheet.column_dimensions[sheet.cell(row=1, column=j).column_letter].width = min(width + 2, 60)
    for i, row in enumerate(rows, start=HEADER_ROWS + 1):
        for j, value in enumerate(row, start=1):
            _put(sheet, i, j, value)
    sheet.freeze_panes = sheet.cell(row=HEADER_ROWS + 1, column=2)


def material_rows(materials: Sequence[Material], length: str) -> tuple[list[Column], list[list[Any]]]:
    """Columns and rows of the materials sheet, values in the unit system of ``length``."""
    u = system(length)
    columns = [Column("material", "text", "text"), Column("E", u.stress), Column("G", u.stress),
               Column("nu", "-"), Column("fy", u.stress), Column("density", u.density),
               Column("source", "text", "text"), Column("note", "text", "text")]
    rows = []
    for m in materials:
        m = m.in_system(length)
        rows.append([m.name, m.E, m.G, m.nu, float("nan") if m.fy is None else m.fy,
                     float("nan") if m.density is None else m.density, m.source, m.note])
    return columns, rows


def workbook_bytes(records: Sequence[Record], failures: Sequence[tuple[str, str]],
                   materials: Sequence[Material], units: str | None = None) -> bytes:
    """The XLSX workbook of a catalogue.

    Parameters
    ----------
    records : sequence of Record
        The analysed profiles, in row order (at least one).
    failures : sequence of (str, str)
        File and one-line error of each profile that failed.
    materials : sequence of Material
        The materials the rows name (their values converted to the table's units).
    units : str, optional
        Unit system of the table (default as :func:`~warpwise.report.files.csv_text`).

    Returns
    -------
    bytes
        The workbook file.
    """
    from openpyxl import Workbook

    columns, rows = property_rows(list(records), units)
    length = rows[0][columns.index(next(c for c in columns if c.name == "length unit"))]
    book = Workbook()
    sheet = book.active
    sheet.title = SHEETS[0]
    _table(sheet, columns, rows)
    _table(book.create_sheet(SHEETS[1]),
           [Column("file", "", "text"), Column("error", "text", "text")],
           [list(f) for f in failures])
    _table(book.create_sheet(SHEETS[2]), *material_rows(materials, length))
    buf = io.BytesIO()
    book.save(buf)
    return buf.getvalue()
