"""``props --about-axis``: the request's values joined to the table, the JSON and the CSV.

Each request comes as (AxisProperties, unit system of its profile); the values are converted
to the report's system by :mod:`warpwise.report.axis_output`.
"""

from __future__ import annotations

from typing import Any

from ..properties.about_axis import AxisProperties
from ..report.axis_output import axis_csv, axis_json, axis_rows
from ..units import Converter

#: The properties about the given axis of one profile, and the unit system they are in.
AxisRequest = tuple[AxisProperties, str]


def axis_table(table: str, request: AxisRequest | None, units: str | None) -> str:
    """A property table with the group of the given axis added before its closing caution.

    The rows are converted to ``units`` (the profile's when None).
    """
    if request is None:
        return table
    a, source = request
    head, sep, tail = table.rpartition("\n\n  ")
    return "\n".join([head, *axis_rows(a, Converter.of(source, units))]) + sep + tail


def axis_objects(requests: list[AxisRequest], units: str | None) -> list[dict[str, Any]] | None:
    """The ``about_axis`` JSON object of each profile (None without --about-axis)."""
    if not requests:
        return None
    return [{"about_axis": axis_json(a, Converter.of(source, units))} for a, source in requests]


def axis_columns(requests: list[AxisRequest], units: str) -> tuple[list[str], list[list[str]]] | None:
    """CSV headers and one row of cells per profile, in the table's ``units``."""
    if not requests:
        return None
    parts = [axis_csv(a, Converter.of(source, units)) for a, source in requests]
    return parts[0][0], [cells for _, cells in parts]
