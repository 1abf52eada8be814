"""The catalogue index page: each profile with a link to its datasheet and its key values.

Links are relative, so the folder can be moved; profiles that could not be analysed are listed
with their error message.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from html import escape
from pathlib import Path

import numpy as np

from ..properties.analysis import SectionResult
from .files import atomic_write
from .html_parts import (
    caution_box,
    datasheet_filename,
    footer,
    number_html,
    page,
    relative_names,
    safe_name,
    symbol_html,
    unit_html,
)
from .picture_parts import profile_name
from .quantities import QUANTITY_BY_KEY, unit_of
from .records import Record, record_of
from .table import system_text

#: Key values shown in the catalogue index, in this order.
INDEX_KEYS = ("A", "Ix", "Iy", "I1", "I2", "alpha_deg", "J", "Cw", "xs", "ys")


@dataclass(frozen=True, eq=False)
class CatalogueEntry:
    """One profile of a catalogue.

    Attributes
    ----------
    source : str
        Where the profile came from (file name).
    result : SectionResult or None
        The analysis, or None when it failed.
    href : str or None
        Relative link to the datasheet (default :func:`datasheet_filename` of the source when
        there is a result).
    error : str or None
        Why the profile could not be analysed.
    record : Record or None
        The profile's values when the full result is not at hand (a catalogue worker's
        output); used when ``result`` is None.
    thumbnail : str or None
        Inline SVG of the outline to show with ``record``.
    """

    source: str
    result: SectionResult | None = None
    href: str | None = None
    error: str | None = None
    record: Record | None = None
    thumbnail: str | None = None


def thumbnail_svg(result: SectionResult) -> str:
    """A small inline SVG of the outline (even-odd filled loops)."""
    x0, y0, x1, y1 = result.profile.bounds
    size = max(x1 - x0, y1 - y0, 1e-300)
    paths = []
    for region in result.profile.regions:
        d = []
        for loop in region.loops():
            p = (np.asarray(loop) - [x0, y1]) * [1.0, -1.0] / size * 100.0
            d.append("M" + " L".join(f"{a:.2f},{b:.2f}" for a, b in p) + " Z")
        paths.append(f'<path d="{" ".join(d)}"/>')
    w, h = (x1 - x0) / size * 100.0, (y1 - y0) / size * 100.0
    return (f'<svg class="thumb" viewBox="-4 -4 {w + 8:.2f} {h + 8:.2f}" role="img" '
            f'aria-label="outline" fill="#a9c4dc" stroke="#24313c" stroke-width="2" '
            f'fill-rule="evenodd" vector-effect="non-scaling-stroke">{"".join(paths)}</svg>')


def index_html(entries: Sequence[CatalogueEntry], *, title: str = "Section catalogue",
               units: str | None = None) -> str:
    """A catalogue page: each profile with a link to its datasheet and its key values.

    Parameters
    ----------
    entries : sequence of CatalogueEntry
        The profiles, in the order shown; failed ones (no result) are listed with their
        error message.
    title : str
        Heading of the page.
    units : str, optional
        Unit system of every row (:data:`warpwise.units.SYSTEMS`); default each profile's own.

    Returns
    -------
    str
        Self-contained HTML5 page. When all rows share one unit system the units are in
        the column headings, otherwise beside every value.

    """
    done = [e for e in entries if e.result is not None or e.record is not None]
    failed = [e for e in entries if e.result is None and e.record is None]
    records = [record_of(e.result) if e.result is not None else e.record for e in done]
    records = [rec.in_units(units or rec.units) for rec in records]
    found = {rec.units for rec in records}
    common = found.pop() if len(found) == 1 else None
    qs = [QUANTITY_BY_KEY[k] for k in INDEX_KEYS]
    head = ['<th scope="col"></th>', '<th scope="col">Profile</th>']
    for q in qs:
        unit = f" ({unit_html(unit_of(q, common))})" if common else ""
        head.append(f'<th scope="col" title="{escape(q.label)}">{symbol_html(q.symbol)}{unit}</th>')
    rows = []
    label = dict(zip(map(id, entries), relative_names([e.source for e in entries]), strict=True))
    for e, rec in zip(done, records, strict=True):
        r = e.result
        v, length = rec.values, rec.units
        name = rec.name or (profile_name(r) if e.source.startswith("<") and r is not None
                            else label[id(e)])
        thumb = thumbnail_svg(r) if r is not None else (e.thumbnail or "")
        href = e.href if e.href is not None else datasheet_filename(e.source)
        about = f'<br><span class="meta">{escape(rec.description)}</span>' if rec.description else ""
        cells = [f"<td>{thumb}</td>",
                 f'<td><a href="{escape(href, quote=True)}">{escape(name)}</a>{about}</td>']
        for q in qs:
            unit = "" if common else f"\u202f{unit_html(unit_of(q, length))}"
            cells.append(f'<td class="num">{number_html(v[q.key], 5)}{unit}</td>'
                         if np.isfinite(v[q.key]) else '<td class="num"></td>')
        rows.append(f"<tr>{''.join(cells)}</tr>")
    table = (f'<table class="properties" id="catalogue-table"><thead><tr>{"".join(head)}</tr></thead>'
             f'<tbody>{"".join(rows)}</tbody></table>') if done else "<p>No profile was analysed.</p>"
    summary = [f"{len(entries)} profile{'s' if len(entries) != 1 else ''}",
               f"{len(done)} analysed"]
    if failed:
        summary.append(f"{len(failed)} not analysed")
    if common:
        summary.append(f"units {escape(system_text(common))}")
    parts = [f'<header><h1>{escape(title)}</h1><p class="meta">'
             + "".join(f"<span>{s}</span>" for s in summary) + "</p></header>",
             f'<section id="profiles"><h2>Profiles</h2>{table}'
             '<p class="meta">Each name links to the full datasheet. Second moments are about '
             "centroidal axes parallel to x and y; xs, ys is the shear centre in drawing "
             "coordinates.</p></section>"]
    doubts = [(e, rec) for e, rec in zip(done, records, strict=True) if rec.warnings]
    if doubts:
        items = "".join(f'<tr><td>{escape(e.source)}</td><td class="failed">'
                        f'{escape("; ".join(rec.warnings))}</td></tr>' for e, rec in doubts)
        parts.append('<section id="warnings"><h2>Profiles with warnings</h2>'
                     '<table class="properties" id="warning-table"><thead><tr><th scope="col">'
                     'File</th><th scope="col">Warning</th></tr></thead>'
                     f"<tbody>{items}</tbody></table></section>")
    if failed:
        items = "".join(f'<tr><td>{escape(e.source)}</td><td class="failed">'
                        f'{escape(e.error or "not analysed")}</td></tr>' for e in failed)
        parts.append('<section id="failures"><h2>Profiles not analysed</h2>'
                     '<table class="properties" id="failure-table"><thead><tr><th scope="col">'
                     'File</th><th scope="col">Reason</th></tr></thead>'
                     f"<tbody>{items}</tbody></table></section>")
    parts.append(caution_box())
    parts.append(footer())
    return page(title, "\n".join(parts))


def write_index(entries: Sequence[CatalogueEntry], folder: str | Path, *,
                filename: str = "index.html", title: str = "Section catalogue",
                units: str | None = None) -> Path:
    """Write the catalogue index page into ``folder``, atomically.

    Parameters
    ----------
    entries : sequence of CatalogueEntry
        The profiles (see :func:`index_html`).
    folder : str or Path
        An existing folder (the datasheets' folder, so that the relative links work).
    filename : str
        File name of the page.
    title : str
        Heading of the page.
    units : str, optional
        As for :func:`index_html`.

    Returns
    -------
    Path
        The file written.

    """
    path = Path(folder) / safe_name(filename)
    atomic_write(path, index_html(entries, title=title, units=units))
    return path


def write_catalogue_index(outcomes: Sequence[object], folder: str | Path,
                          units: str | None = None) -> Path:
    """Index page of a catalogue run from its outcomes (see :mod:`warpwise.catalogue`).

    ``units`` is the unit system of the rows (default each profile's own).
    """
    entries = [CatalogueEntry(o.path, None, None if o.datasheet is None else Path(o.datasheet).name,
                              o.error, o.record, o.thumbnail) for o in outcomes]
    return write_index(entries, folder, units=units)
