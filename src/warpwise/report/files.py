"""Output files: CSV rows and JSON objects.

Every file is written by :func:`~warpwise.report.outputs.atomic_write` (imported here too):
whole or not at all, never over a link, a device or an input.
"""

from __future__ import annotations

import csv
import io
import json
import math
from dataclasses import dataclass
from typing import Any

from ..errors import AnalysisError, UsageError
from ..properties.accuracy import ERROR_KEYS
from ..properties.analysis import SectionResult
from ..units import MOMENT, system
from .outputs import atomic_write  # noqa: F401  (the one writer, also imported from here)
from .quantities import QUANTITIES, unit_of
from .records import Record, record_of, report_units

#: Columns of estimated relative errors, in this order, when any result has an estimate.


#: JSON keys of points: [x, y] arrays of two quantities (the CSV has the two columns).
JSON_POINTS = {"centroid": ("xc", "yc"), "shear_centre": ("xs", "ys"),
               "shear_centre_elastic": ("xse", "yse")}


def to_json_object(item: SectionResult | Record) -> dict[str, Any]:
    """JSON object of one result, keys as in the design contract, values in the length unit.

    Quantities that were not computed (nan) are left out.
    """
    rec = item if isinstance(item, Record) else record_of(item)
    v = rec.values
    u = system(rec.units)
    obj: dict[str, Any] = {"file": rec.source}
    obj.update({key: text for key, text in (("name", rec.name), ("description", rec.description))
                if text})
    obj["units"] = {"length": rec.units}
    if rec.materials:
        obj["units"].update({"force": u.force, "stress": u.stress, "moment": u.text(MOMENT),
                             "mass": u.linear_mass})
        obj["materials"] = list(rec.materials)
        obj["reference_material"] = rec.reference
    in_points = {k for pair in JSON_POINTS.values() for k in pair}
    for q in QUANTITIES:
        if q.key not in in_points and v[q.key] == v[q.key]:
            obj[q.key] = v[q.key]
    for name, (kx, ky) in JSON_POINTS.items():
        if v[kx] == v[kx]:  # a point not computed (nan) is left out too
            obj[name] = [v[kx], v[ky]]
    obj["mesh"] = {"nodes": rec.nodes, "elements": rec.elements, "size": rec.mesh_size}
    obj["notes"] = list(rec.remarks)
    obj["warnings"] = list(rec.warnings)
    if rec.errors is not None:
        obj["relative_error"] = dict(rec.errors)
    if rec.target is not None:
        t = rec.target
        obj["target"] = {"error": t.target, "reached": t.reached, "meshes": t.meshes,
                         "nodes": t.nodes, "stopped": t.stopped, "met": t.met}
    return obj


def json_text(items: list[SectionResult] | list[Record],
              extra: list[dict[str, Any]] | None = None) -> str:
    """JSON text: one object for one result, a list for several.

    ``extra`` holds one dict per item of further keys of a request (``about_axis``), values
    already in the item's units.
    """
    objs = [to_json_object(r) for r in items]
    for obj, more in zip(objs, extra or [{}] * len(objs), strict=True):
        obj.update(more)
    for obj in objs:
        standard_json(obj, file=obj["file"])  # names the profile of a non-finite value
    return standard_json(objs[0] if len(objs) == 1 else objs)


def standard_json(obj: Any, file: str | None = None) -> str:
    """Standard JSON text of ``obj`` (indented, a final newline): the one JSON writer.

    Parameters
    ----------
    obj : dict or list
        Plain data: dicts, lists, str, int, float, bool, None.
    file : str, optional
        Input named in the message of a refusal.

    Raises
    ------
    AnalysisError
        For a NaN or infinite number (standard JSON has none), naming where it is.

    Examples
    --------
    >>> print(standard_json({"A": 1.5}), end="")
    {
      "A": 1.5
    }
    >>> standard_json({"EA": float("inf")})  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    warpwise.errors.AnalysisError: EA is not a finite number (inf): check the inputs it comes ...
    """
    bad = _non_finite(obj)
    if bad is not None:
        where, value = bad
        raise AnalysisError(f"{where} is not a finite number ({value}): check the inputs it comes "
                            "from (material values, moduli, loads)", file=file)
    return json.dumps(obj, indent=2, allow_nan=False) + "\n"


def _non_finite(obj: Any, where: str = "") -> tuple[str, float] | None:
    """(key path, value) of the first NaN or infinite number in nested lists and dicts."""
    if isinstance(obj, float):
        return None if math.isfinite(obj) else (where or "a value", obj)
    items = obj.items() if isinstance(obj, dict) else enumerate(obj) if isinstance(obj, list) else ()
    for k, v in items:
        found = _non_finite(v, f"{where}[{k}]" if isinstance(k, int) else (f"{where}.{k}" if where else k))
        if found is not None:
            return found
    return None


#: First characters that make a spreadsheet read a cell as a formula (or a command).
FORMULA_STARTS = ("=", "+", "-", "@", "\t", "\r")


def csv_safe(text: str) -> str:
    """A text cell that no spreadsheet runs as a formula: a leading apostrophe where needed.

    Examples
    --------
    >>> csv_safe("=1+2.txt"), csv_safe("bar.txt"), csv_safe("-2+3.txt")
    ("'=1+2.txt", 'bar.txt', "'-2+3.txt")
    """
    return f"'{text}" if text.startswith(FORMULA_STARTS) else text


def csv_header(length: str, named: bool = False) -> list[str]:
    """CSV column headers, each with its unit, e.g. ``A (mm2)``.

    ``named`` adds the columns of the names and descriptions given to the profiles.
    """
    return [c.header for c in _base_columns(length, named)]


@dataclass(frozen=True)
class Column:
    """One column of the property table.

    Attributes
    ----------
    name : str
        What it holds (``A``, ``file``, ``mesh nodes``...).
    unit : str
        Its unit (``mm2``, ``-``, ``count``, ``text``; "" where the header has none).
    kind : str
        How its cells are written: ``text``, ``number`` (ten significant digits in CSV),
        ``count``, ``error`` (three), ``short`` (three) or ``formatted`` (text as given).
    """

    name: str
    unit: str = ""
    kind: str = "number"

    @property
    def header(self) -> str:
        """The CSV header: the name with its unit in brackets (where it has one)."""
        return f"{self.name} ({self.unit})" if self.unit else self.name


def _base_columns(length: str, named: bool) -> list[Column]:
    """The columns every table has (and the names, when ``named``)."""
    names = [Column("name", "text", "text"), Column("description", "text", "text")] if named else []
    return [Column("file", "", "text"), *names, Column("length unit", "", "text"),
            *[Column(q.key, unit_of(q, length)) for q in QUANTITIES],
            Column("mesh nodes", "count", "count"), Column("mesh elements", "count", "count"),
            Column("warnings", "text", "text")]


#: Columns of an adaptive run's outcome, when any profile had a target error.
_TARGET = [Column("target error", "-", "short"), Column("error reached", "-", "short"),
           Column("meshes solved", "count", "count"), Column("stopped by", "text", "text")]
TARGET_COLUMNS = [c.header for c in _TARGET]


def property_rows(items: list[SectionResult] | list[Record], units: str | None = None,
                  extra: tuple[list[str], list[list[str]]] | None = None,
                  ) -> tuple[list[Column], list[list[Any]]]:
    """The property table: its columns and one row of raw cells per profile, in one unit.

    Cells are str (text), float (nan: not computed), int (counts) or None (empty); the
    ``extra`` columns keep their given text. See :func:`csv_text` for the parameters.

    Raises
    ------
    UsageError
        For no profile at all.
    AnalysisError
        For a value that is infinite (a sign of bad inputs).
    """
    recs = [r if isinstance(r, Record) else record_of(r) for r in items]
    if not recs:
        raise UsageError("no profile to write")
    length = report_units([r.units for r in recs], units)
    recs = [r.in_units(length) for r in recs]
    with_errors = any(r.errors is not None for r in recs)
    named = any(r.name or r.description for r in recs)
    columns = _base_columns(length, named)
    if with_errors:
        columns += [Column(f"{k} est. rel. error", "-", "error") for k in ERROR_KEYS]
    with_target = any(r.target is not None for r in recs)
    if with_target:
        columns += _TARGET
    if extra:
        columns += [Column(h, "", "formatted") for h in extra[0]]
    rows = []
    for i, r in enumerate(recs):
        v = r.values
        for q in QUANTITIES:
            if abs(v[q.key]) == math.inf:
                raise AnalysisError(f"{q.key} is not a finite number ({v[q.key]}): check the inputs "
                                    "it comes from (material values, moduli, loads)", file=r.source)
        names = [r.name, r.description] if named else []
        row = [r.source, *names, r.units, *[v[q.key] + 0.0 for q in QUANTITIES],
               r.nodes, r.elements, "; ".join(r.warnings)]
        if with_errors:
            row += [None if r.errors is None else r.errors[k] for k in ERROR_KEYS]
        if with_target:
            t = r.target
            row += [None] * 4 if t is None else [t.target, t.reached, t.meshes, t.stopped]
        rows.append(row + (extra[1][i] if extra else []))
    return columns, rows


#: CSV text of a cell by its column's kind (None: an empty cell).
_CSV_CELL = {"text": csv_safe, "formatted": str, "count": str,
             "number": lambda x: "" if x != x else f"{x:.10g}",
             "error": lambda x: f"{x:.2e}", "short": lambda x: f"{x:.3g}"}


def csv_text(items: list[SectionResult] | list[Record], units: str | None = None,
             extra: tuple[list[str], list[list[str]]] | None = None) -> str:
    """CSV text with one row per profile, in one length unit.

    Parameters
    ----------
    items : list of SectionResult or Record
        The profiles, in row order.
    units : str, optional
        Unit system of the table (see :func:`~warpwise.report.records.report_units` for the
        default); every row is converted to it.

    extra : (headers, rows), optional
        Columns of a request (``--about-axis``) after the others: their headers with units and
        one row of cells per item, already in the table's units.

    A name and a description column follow the file's when any profile has one.
    """
    columns, rows = property_rows(items, units, extra)
    buf = io.StringIO()
    w = csv.writer(buf, lineterminator="\n")
    w.writerow([c.header for c in columns])
    for row in rows:
        w.writerow(["" if x is None else _CSV_CELL[c.kind](x) for c, x in zip(columns, row,
                                                                                strict=True)])
    return buf.getvalue()
