"""The outputs of ``warpwise props`` from analysed results: CSV, JSON and the HTML datasheet.

One place for the three texts, so that the command line and the workbench
(:mod:`warpwise.workbench`) write the very same files for the same results.
"""

from __future__ import annotations

from typing import TYPE_CHECKING

if TYPE_CHECKING:
    from ..properties.analysis import SectionResult
    from ..report.records import Record
    from .axis_output import AxisRequest


def props_csv(records: list[Record], units: str, axes: list[AxisRequest] | None = None) -> str:
    """The CSV rows of ``--csv``, in the one unit system ``units`` of the table."""
    from ..report.files import csv_text
    from .axis_output import axis_columns

    return csv_text(records, units=units, extra=axis_columns(axes or [], units))


def props_json(records: list[Record], report_units: str | None,
               axes: list[AxisRequest] | None = None) -> str:
    """The JSON of ``--json``: each record in the report's units (default its own)."""
    from ..report.files import json_text
    from .axis_output import axis_objects

    shown = [r.in_units(report_units or r.units) for r in records]
    return json_text(shown, extra=axis_objects(axes or [], report_units))


def props_datasheet(result: SectionResult, report_units: str | None,
                    axes: list[AxisRequest] | None = None, label: str | None = None) -> str:
    """The HTML datasheet of ``--html``: one profile, the nominal torque of its units."""
    from ..report.datasheet import datasheet_html
    from ..stress.shear import nominal_torsion

    shown_units = report_units or result.units
    return datasheet_html(result, torsion=nominal_torsion(result, shown_units),
                          nominal_torque=True, units=shown_units, label=label,
                          about_axis=axes[0][0] if axes else None)
