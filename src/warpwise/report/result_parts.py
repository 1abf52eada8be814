"""Pieces of the result pages of ``member`` and ``stress``: value rows, tables and a glossary.

The pages are built from the JSON objects those commands print (plain dicts, already in the
report's units); every value is shown with the unit of its key (:class:`warpwise.member.Term`)
and carries the path of its JSON key in ``data-key``, so a reader (or a test) can tell which
JSON value a cell shows.
"""

from __future__ import annotations

from collections.abc import Iterable, Mapping, Sequence
from dataclasses import dataclass
from html import escape
from typing import Any

from ..member import Term
from .html_parts import number_html, symbol_html, unit_html


@dataclass
class Shown:
    """The terms a page has shown so far (for its glossary), in the order first shown.

    Attributes
    ----------
    terms : dict
        Key to term.
    units : str
        The page's unit system (a length unit of :data:`warpwise.units.SYSTEMS`).
    """

    terms: dict[str, Term]
    units: str

    @classmethod
    def of(cls, units: str) -> Shown:
        """An empty record for a page in the unit system ``units``."""
        return cls({}, units)

    def unit(self, term: Term) -> str:
        """The unit of ``term`` as HTML, recording the term for the glossary."""
        if term.symbol:
            self.terms.setdefault(term.key, term)
        return unit_html(term.unit(self.units))


def num(value: Any, key: str, digits: int = 6) -> str:
    """A number cell (``data-key`` the JSON path); an en dash for null (not computed)."""
    if value is None:
        return f'<td class="num" data-key="{escape(key)}" data-null="">\u2013</td>'
    return f'<td class="num" data-key="{escape(key)}">{number_html(value, digits)}</td>'


def point_html(xy: Sequence[float] | None) -> str:
    """A point (x, y) as HTML, an en dash for none."""
    if xy is None:
        return "\u2013"
    return f"({number_html(xy[0])}, {number_html(xy[1])})"


def point_cell(xy: Sequence[float] | None, key: str) -> str:
    """A point cell with the JSON path of the point in ``data-key`` (en dash for none)."""
    null = ' data-null=""' if xy is None else ""
    return f'<td class="num" data-key="{escape(key)}"{null}>{point_html(xy)}</td>'


def value_rows(obj: Mapping[str, Any], keys: Iterable[str], terms: Mapping[str, Term],
               shown: Shown, prefix: str = "") -> str:
    """Rows (symbol, meaning, value, unit) of the keys of ``obj`` that hold a value.

    Parameters
    ----------
    obj : mapping
        A JSON object (report units).
    keys : iterable of str
        Keys to show, in order; a key absent or null in ``obj`` is left out, a key ending in
        ``_at`` (a point, a list) is shown as (x, y).
    terms : mapping
        Key to :class:`~warpwise.member.Term` (meaning, symbol and unit of each key).
    shown : Shown
        Records the terms shown, for the glossary.
    prefix : str
        JSON path of ``obj`` (``materials.0.``), for ``data-key``.
    """
    rows = []
    for key in keys:
        value = obj.get(key)
        if value is None:
            continue
        t = terms[key]
        if isinstance(value, list):
            cell = point_cell(value, prefix + key)
        else:
            cell = num(value, prefix + key)
        rows.append(f'<tr><th scope="row">{escape(t.meaning)}</th><td class="sym">'
                    f'{symbol_html(t.symbol) if t.symbol else ""}</td>{cell}'
                    f'<td class="unit">{shown.unit(t)}</td></tr>')
    return "".join(rows)


def key_table(rows: str, table_id: str) -> str:
    """A table of (label, symbol, value, unit) rows."""
    return f'<table class="key" id="{escape(table_id)}"><tbody>{rows}</tbody></table>'


def head_cell(term: Term, shown: Shown, unit: str | None = None) -> str:
    """A column head: the symbol over its unit (``unit``, a unit text, when not the term's)."""
    text = shown.unit(term)  # records the term for the glossary
    text = text if unit is None else unit_html(unit)
    return (f'<th scope="col" class="num" data-key="{escape(term.key)}">'
            f"{symbol_html(term.symbol)}<br>{text}</th>")


def glossary(shown: Shown) -> str:
    """The glossary of every symbol the page showed: symbol, meaning, definition, unit."""
    rows = "".join(
        f'<tr data-key="{escape(t.key)}"><td class="sym">{symbol_html(t.symbol)}</td>'
        f"<td>{escape(t.meaning)}</td><td>{escape(t.definition)}</td>"
        f'<td class="unit">{unit_html(t.unit(shown.units))}</td></tr>'
        for t in shown.terms.values())
    head = ('<thead><tr><th scope="col">Symbol</th><th scope="col">Meaning</th>'
            '<th scope="col">Definition</th><th scope="col">Unit</th></tr></thead>')
    return (f'<section id="symbols"><h2>Glossary of symbols</h2><table id="glossary">{head}'
            f"<tbody>{rows}</tbody></table></section>")


def notes(items: Iterable[str]) -> str:
    """A list of notes (plain text, escaped); empty text for none."""
    lines = "".join(f"<li>{escape(n)}</li>" for n in items)
    return f'<section id="notes"><h2>Notes</h2><ul class="notes">{lines}</ul></section>' \
        if lines else ""


def header(title: str, meta: Iterable[str]) -> str:
    """The page heading (``title`` and the ``meta`` line, plain text, escaped)."""
    spans = "".join(f"<span>{escape(m)}</span>" for m in meta)
    return f'<header><h1>{escape(title)}</h1><p class="meta">{spans}</p></header>'


def figure(svg: str | None, figure_id: str, caption: str) -> str:
    """A figure (inline SVG from :func:`warpwise.report.plot_files.svg_text`) with a caption.

    ``caption`` is HTML (escaped by the caller); no figure gives empty text.
    """
    if not svg:
        return ""
    return (f'<figure class="picture" id="{escape(figure_id)}">{svg}<figcaption>'
            f"{caption}</figcaption></figure>")


__all__ = ["Shown", "figure", "glossary", "head_cell", "header", "key_table", "notes", "num",
           "point_cell", "point_html", "value_rows"]
