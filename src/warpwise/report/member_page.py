"""The HTML page of ``warpwise member``: the JSON object of a member shown as one page.

Everything on the page comes from the member's JSON object (already in the report's units) and
the figure of phi and B along the member: inputs (file, length, ends, loads, stiffnesses), the
largest values and where, the stresses at the governing sections, the values at the stations,
a glossary of every symbol shown (:data:`warpwise.member.MEMBER_TERMS`), the notes and the
cautions. Self-contained: styles and the figure inline, no script, nothing loaded.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from html import escape
from typing import Any

from ..member import END_TEXT, QUANTITIES, TERM_BY_KEY
from .html_parts import caution_box, footer, page, symbol_html, unit_html, warning_box
from .result_parts import (
    Shown,
    figure,
    glossary,
    head_cell,
    header,
    key_table,
    notes,
    num,
    point_cell,
    value_rows,
)
from .table import system_text

#: The quantities of the station table, in their order.
ALONG = ("z", *dict(QUANTITIES))


def _inputs(obj: Mapping[str, Any], shown: Shown) -> str:
    ends = "".join(
        f'<tr><th scope="row">support at z = {where}</th><td class="sym"></td>'
        f'<td data-key="ends.{k}">{escape(end)} ({escape(END_TEXT.get(end, ""))})</td>'
        f'<td class="unit"></td></tr>'
        for k, (where, end) in enumerate(zip(("0", "L"), obj["ends"], strict=True)))
    rows = (value_rows(obj, ("length",), TERM_BY_KEY, shown) + ends
            + value_rows(obj, ("distributed_torque", "GJ", "ECw", "a"), TERM_BY_KEY, shown))
    torque, z = TERM_BY_KEY["torques"], TERM_BY_KEY["z"]
    torques = ""
    if obj["torques"]:
        body = "".join(f"<tr>{num(t['torque'], f'torques.{k}.torque')}"
                       f"{num(t['z'], f'torques.{k}.z')}</tr>"
                       for k, t in enumerate(obj["torques"]))
        # the torque column holds the torques only: their unit, as the JSON's units name it
        head = head_cell(torque, shown, obj["units"]["torque"]) + head_cell(z, shown)
        torques = (f'<h3 class="meta">Point torques</h3><table id="torques"><thead><tr>{head}'
                   f"</tr></thead><tbody>{body}</tbody></table>")
    return (f'<section id="inputs"><h2>Member and loads</h2>{key_table(rows, "member-values")}'
            f"{torques}</section>")


def _largest(obj: Mapping[str, Any], shown: Shown) -> str:
    z = TERM_BY_KEY["z"]
    rows = []
    for k, e in enumerate(obj["largest"]):
        t = TERM_BY_KEY[e["quantity"]]
        rows.append(f'<tr data-quantity="{escape(t.key)}"><td class="sym">{symbol_html(t.symbol)}'
                    f"</td><td>{escape(t.legend)}</td>{num(e['value'], f'largest.{k}.value')}"
                    f'<td class="unit">{shown.unit(t)}</td>{num(e["z"], f"largest.{k}.z")}'
                    f'<td class="unit">{shown.unit(z)}</td></tr>')
    head = ('<thead><tr><th scope="col">Symbol</th><th scope="col">Quantity</th>'
            '<th scope="col" class="num">Largest |value| (signed)</th><th scope="col">Unit</th>'
            '<th scope="col" class="num">at z</th><th scope="col">Unit</th></tr></thead>')
    return (f'<section id="largest"><h2>Largest values along the member</h2>'
            f'<table id="largest-values">{head}<tbody>{"".join(rows)}</tbody></table></section>')


#: Columns of the governing-section table: the values there, then each stress and its point.
_SECTION_VALUES = ("z", "B", "T_w", "T_sv")
_SECTION_STRESSES = ("sigma_w", "tau_w", "tau_sv")


def _governing(obj: Mapping[str, Any], shown: Shown) -> str:
    sections = obj["governing_sections"]
    if not sections:
        return ""
    cols = [TERM_BY_KEY[k] for k in (*_SECTION_VALUES, *_SECTION_STRESSES)]
    where = TERM_BY_KEY["sigma_w_at"]
    head = ('<th scope="col">Where largest</th>' + "".join(
        head_cell(t, shown) + (f'<th scope="col" class="num">at (x, y)<br>{shown.unit(where)}'
                               "</th>" if t.key in _SECTION_STRESSES else "") for t in cols))
    rows = []
    for k, s in enumerate(sections):
        cells = [f"<td>|{symbol_html(TERM_BY_KEY[s['governs']].symbol)}|</td>"]
        for t in cols:
            cells.append(num(s[t.key], f"governing_sections.{k}.{t.key}"))
            if t.key in _SECTION_STRESSES:
                cells.append(point_cell(s[f"{t.key}_at"], f"governing_sections.{k}.{t.key}_at"))
        rows.append(f'<tr data-governs="{escape(s["governs"])}">{"".join(cells)}</tr>')
    return ('<section id="governing"><h2>Stresses at the governing sections</h2>'
            '<p class="meta">The largest torsion stresses of the sections where |B|, |T_w| and '
            "|T_sv| are largest, away from sharp re-entrant corners; each at its own point of "
            "the section (they are not added).</p>"
            f'<table id="governing-sections"><thead><tr>{head}</tr></thead><tbody>'
            f'{"".join(rows)}</tbody></table></section>')


def _stations(obj: Mapping[str, Any], shown: Shown) -> str:
    st = obj["stations"]
    head = "".join(head_cell(TERM_BY_KEY[n], shown) for n in ALONG)
    rows = "".join("<tr>" + "".join(num(st[n][k], f"stations.{n}.{k}") for n in ALONG) + "</tr>"
                   for k in range(len(st["z"])))
    return ('<section id="stations"><h2>Values at the stations</h2>'
            f'<table id="station-values"><thead><tr>{head}</tr></thead><tbody>{rows}</tbody>'
            "</table></section>")


def _notes(obj: Mapping[str, Any]) -> list[str]:
    out = []
    if any(0.0 < t["z"] < obj["length"] for t in obj["torques"]):
        out.append("At a load point the station row holds the values just past it; phi''', "
                   "T_sv and T_w jump there.")
    if obj["saint_venant_only"]:
        out.append("Cw = 0: pure Saint-Venant torsion (no bimoment, no warping torque; the "
                   "warping end conditions have no effect).")
    out.append("Solved exactly (closed form between load points) for E Cw phi'''' - G J phi'' "
               "= m with the given supports.")
    return out


def member_page(obj: Mapping[str, Any], *, svg: str | None = None,
                warnings: Sequence[str] = ()) -> str:
    """The page of one member, from its JSON object.

    Parameters
    ----------
    obj : mapping
        The object ``warpwise member --json`` prints (values in the units of its ``units``).
    svg : str, optional
        The figure of phi and B along the member, an inline ``<svg>``
        (:func:`warpwise.report.plot_files.svg_text` of
        :func:`warpwise.report.plot_member.figure_member`).
    warnings : sequence of str
        Doubts about the input profile, shown in a box at the top.

    Returns
    -------
    str
        A self-contained HTML5 page; every value with its unit, all text escaped.
    """
    units = obj["units"]["length"]
    shown = Shown.of(units)
    title = f"Torsion of a member of {obj['file']}"
    parts = [header(title, [f"units {system_text(units)}", "torsion with restrained warping"]),
             warning_box(warnings), _inputs(obj, shown),
             figure(svg, "member-picture", "Angle of twist \u03c6 (rad) and bimoment B ("
                    f"{unit_html(obj['units']['B'])}) along the member; the dot marks the "
                    "largest |value| of each."),
             _largest(obj, shown), _governing(obj, shown), _stations(obj, shown),
             glossary(shown), notes(_notes(obj)), caution_box(), footer()]
    return page(f"{obj['file']}: torsion of a member", "\n".join(p for p in parts if p))


__all__ = ["member_page"]
