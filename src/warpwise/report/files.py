"""Output files: CSV rows and JSON objects.

Every file is written by :func:`~warpwise.report.outputs.atomic_write` (imported here too):
whole or not at all, never over a link, a device or an input.
"""

from __future__ import annotations

import csv
import io
import json
import math
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
    names = ["name (text)", "description (text)"] if named else []
    return ["file", *names, "length unit", *[f"{q.key} ({unit_of(q, length)})" for q in QUANTITIES],
            "mesh nodes (count)", "mesh elements (count)", "warnings (text)"]


#: Columns of an adaptive run's outcome, when any profile had a target error.
TARGET_COLUMNS = ["target error (-)", "error reached (-)", "meshes solved (count)",
                  "stopped by (text)"]


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
    recs = [r if isinstance(r, Record) else record_of(r) for r in items]
    if not recs:
        raise UsageError("no profile to write")
    length = report_units([r.units for r in recs], units)
    recs = [r.in_units(length) for r in recs]
    buf = io.StringIO()
    w = csv.writer(buf, lineterminator="\n")
    with_errors = any(r.errors is not None for r in recs)
    named = any(r.name or r.description for r in recs)
    header = csv_header(length, named)
    if with_errors:
        header += [f"{k} est. rel. error (-)" for k in ERROR_KEYS]
    with_target = any(r.target is not None for r in recs)
    if with_target:
        header += TARGET_COLUMNS
    w.writerow(header + (extra[0] if extra else []))
    for i, r in enumerate(recs):
        v = r.values
        for q in QUANTITIES:
            if abs(v[q.key]) == math.inf:
                raise AnalysisError(f"{q.key} is not a finite number ({v[q.key]}): check the inputs "
                                    "it comes from (material values, moduli, loads)", file=r.source)
        names = [csv_safe(r.name), csv_safe(r.description)] if named else []
        row = [csv_safe(r.source), *names, r.units,
               *["" if v[q.key] != v[q.key] else f"{v[q.key] + 0.0:.10g}" for q in QUANTITIES],
               r.nodes, r.elements, csv_safe("; ".join(r.warnings))]
        if with_errors:
            row += ["" if r.errors is None else f"{r.errors[k]:.2e}" for k in ERROR_KEYS]
        if with_target:
            t = r.target
            row += ["", "", "", ""] if t is None else \
                [f"{t.target:.3g}", f"{t.reached:.3g}", t.meshes, t.stopped]
        w.writerow(row + (extra[1][i] if extra else []))
    return buf.getvalue()
