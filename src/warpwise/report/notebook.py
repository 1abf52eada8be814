"""The view of a result in a notebook (Jupyter's ``_repr_html_``): its property table.

A block of HTML, not a page: the heading (profile, units, materials), the warnings, the grouped
property table of the datasheet (:func:`~warpwise.report.property_html.property_table_html`),
the reader's notes and the caution. Styles are scoped to the block's own class, so the notebook
around it keeps its look. All text is escaped.
"""

from __future__ import annotations

from html import escape

from ..units import Converter
from .property_html import property_table_html
from .records import Record, record_of
from .table import CAUTION, system_text

#: Class of the block; its styles apply inside it only.
BLOCK = "warpwise-result"

_STYLE = (
    f".{BLOCK} table{{border-collapse:collapse;font-size:0.9em}}"
    f".{BLOCK} th,.{BLOCK} td{{padding:1px 8px;text-align:left;vertical-align:top}}"
    f".{BLOCK} td.num{{text-align:right;font-variant-numeric:tabular-nums}}"
    f".{BLOCK} th.group{{padding-top:6px;border-bottom:1px solid #999}}"
    f".{BLOCK} .note{{font-size:0.85em;margin:2px 0}}"
)


def record_html(rec: Record, units: str | None = None) -> str:
    """The notebook view of a record, in the unit system of ``units`` (default its own).

    Parameters
    ----------
    rec : Record
        The profile's values.
    units : str, optional
        Length unit of the unit system to show (:data:`warpwise.units.SYSTEMS`).

    Returns
    -------
    str
        An HTML block.
    """
    show = Converter.of(rec.units, units)
    shown = rec.in_units(show.target)
    table, _ = property_table_html(shown.values, shown.errors, show, table_id=None)
    head = escape(shown.name or shown.source)
    meta = [f"units {escape(system_text(show.target))}"]
    if shown.materials:
        meta.append("material " + ", ".join(escape(m) for m in dict.fromkeys(shown.materials)))
    if shown.description:
        meta.insert(0, escape(shown.description))
    warn = "".join(f'<p class="note"><strong>Warning:</strong> {escape(w)}</p>'
                   for w in shown.warnings)
    notes = "".join(f'<p class="note">{escape(n)}</p>' for n in shown.remarks)
    return (f'<div class="{BLOCK}"><style>{_STYLE}</style>'
            f"<p><strong>{head}</strong> &middot; {' &middot; '.join(meta)} &middot; "
            f"{shown.nodes:,} nodes</p>{warn}{table}{notes}"
            f'<p class="note"><em>{escape(CAUTION)}</em></p></div>')


def result_html(result: object, units: str | None = None) -> str:
    """The notebook view of a :class:`~warpwise.properties.analysis.SectionResult`."""
    return record_html(record_of(result), units)  # type: ignore[arg-type]
