"""The grouped property table as HTML: the datasheet's and the notebook view's."""

from __future__ import annotations

from collections.abc import Mapping
from html import escape

from ..units import Converter
from .html_parts import number_html, percent, symbol_html, unit_html
from .quantities import QUANTITIES, error_of, table_shows


def property_table_html(v: Mapping[str, float], errors: Mapping[str, float] | None,
                        show: Converter, table_id: str | None = "property-table",
                        ) -> tuple[str, list[str]]:
    """The grouped property table (HTML) and the keys it shows.

    Parameters
    ----------
    v : mapping of str to float
        Every quantity's value (:func:`~warpwise.report.quantities.values`), in the units of
        ``show``.
    errors : mapping of str to float, optional
        Estimated relative errors (a column of them when given).
    show : Converter
        The unit system the values are in (for the unit column).
    table_id : str, optional
        The table's id attribute (None: none, where several tables share a document).
    """
    with_errors = errors is not None
    cols = 5 if with_errors else 4
    rows, shown, group = [], [], None
    for q in QUANTITIES:
        value = v[q.key]
        if not table_shows(v, q.key):
            continue
        if q.group != group:
            if group is not None:
                rows.append("</tbody>")
            group = q.group
            rows.append(f'<tbody><tr><th class="group" colspan="{cols}" scope="rowgroup">'
                        f"{escape(group)}</th></tr>")
        shown.append(q.key)
        cells = [f'<td class="sym">{symbol_html(q.symbol)}</td>', f"<td>{escape(q.label)}</td>",
                 f'<td class="num">{number_html(value)}</td>',
                 f'<td class="unit">{unit_html(show.unit(q.dimension))}</td>']
        if with_errors:
            err = error_of(errors, q.key)
            cells.append(f'<td class="num">{"" if err is None else percent(err)}</td>')
        rows.append(f'<tr data-key="{escape(q.key)}">{"".join(cells)}</tr>')
    if group is not None:
        rows.append("</tbody>")
    head = ["Symbol", "Property", "Value", "Unit"] + (["Estimated error"] if with_errors else [])
    numeric = ' class="num"'
    thead = "<thead><tr>" + "".join(
        f'<th scope="col"{numeric if h in ("Value", "Estimated error") else ""}>{h}</th>'
        for h in head) + "</tr></thead>"
    note = ""
    if with_errors:
        note = ('<p class="meta">Estimated error: relative error of the value shown (shear-centre '
                "coordinates: relative to the largest dimension of the profile), from the same "
                "analysis on two finer meshes.</p>")
    ident = "" if table_id is None else f' id="{escape(table_id)}"'
    table = f'<table class="properties"{ident}>{thead}{"".join(rows)}</table>{note}'
    return table, shown
