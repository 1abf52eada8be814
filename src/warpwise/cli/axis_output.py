"""``props --about-axis``: the request's values joined to the table, the JSON and the CSV.

Each request comes as (AxisProperties, unit system of its profile); the values are converted
to the report's system by :mod:`warpwise.report.axis_output`.
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Any

from ..units import Converter

if TYPE_CHECKING:
    from ..properties.about_axis import AxisProperties

#: The properties about the given axis of one profile, and the unit system they are in.
AxisRequest = tuple["AxisProperties", str]

# the report's axis rows are imported when a request is there (props without --about-axis
# does not load them)


def axis_table(table: str, request: AxisRequest | None, units: str | None) -> str:
    """A property table with the group of the given axis added before its closing caution.

    The rows are converted to ``units`` (the profile's when None).
    """
    if request is None:
        return table
    from ..report.axis_output import axis_rows

    a, source = request
    head, sep, tail = table.rpartition("\n\n  ")
    return "\n".join([head, *axis_rows(a, Converter.of(source, units))]) + sep + tail


def axis_objects(requests: list[AxisRequest], units: str | None) -> list[dict[str, Any]] | None:
    """The ``about_axis`` JSON object of each profile (None without --about-axis)."""
    if not requests:
        return None
    from ..report.axis_output import axis_json

    return [{"about_axis": axis_json(a, Converter.of(source, units))} for a, source in requests]


def axis_columns(requests: list[AxisRequest], units: str) -> tuple[list[str], list[list[str]]] | None:
    """CSV headers and one row of cells per profile, in the table's ``units``."""
    if not requests:
        return None
    from ..report.axis_output import axis_csv

    parts = [axis_csv(a, Converter.of(source, units)) for a, source in requests]
    return parts[0][0], [cells for _, cells in parts]
