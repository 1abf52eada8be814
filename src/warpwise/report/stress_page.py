"""The HTML page of ``warpwise stress``: the JSON object of the stresses shown as one page.

One load (shear stresses, or combined stresses per material with the signed extremes and the
stresses at given points) or a load-case table: everything comes from the object the command
prints with ``--json`` (in the report's units), with a picture of the stresses where one is
drawn, a glossary of every symbol shown (:data:`warpwise.report.stress_terms.STRESS_TERMS`),
the notes and the cautions. Self-contained: styles and the picture inline, no script.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from html import escape
from typing import Any

from .html_parts import caution_box, footer, page, warning_box
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
from .stress_terms import CASE_LOADS, STRESS_TERM_BY_KEY
from .table import system_text

T = STRESS_TERM_BY_KEY

#: The keys of each block of the page, in order.
LOADS = ("torque", "shear_x", "shear_y", "axial", "moment_x", "moment_y", "bimoment")
SECTION = ("shear_modulus", "poisson", "J", "shear_centre", "Cw")
RESULTS = ("tau_max", "tau_max_at", "tau_max_torsion", "tau_max_shear", "sigma_w", "sigma_w_at",
           "von_mises_max", "von_mises_max_at", "twist_rate", "twist_rate_deg")
MATERIAL = ("sigma_max", "tau_max", "von_mises_max", "von_mises_at", "sigma_tension",
            "sigma_tension_at", "sigma_compression", "sigma_compression_at", "fy", "utilisation")
POINT = ("point", "sigma", "tau_zx", "tau_zy", "tau", "von_mises")
CASE = ("sigma_tension", "sigma_tension_at", "sigma_compression", "sigma_compression_at",
        "tau_max", "tau_max_at", "von_mises_max", "von_mises_max_at", "utilisation")


def _text(value: Any) -> str:
    return escape(value) if value else "section"


def _rows_table(items: Sequence[Mapping[str, Any]], keys: Sequence[str], shown: Shown,
                path: str, table_id: str, first: Sequence[str] = ("material",),
                sub: Mapping[str, str] | None = None) -> str:
    """A table of one row per item: text columns ``first``, then a number (or point) per key.

    ``sub`` gives the JSON path in an item of a column whose key is not the item's own.
    """
    present = [k for k in keys if any(it.get(k) is not None for it in items)]
    head = "".join(f'<th scope="col">{escape(T[k].meaning)}</th>' for k in first)
    head += "".join(head_cell(T[k], shown) if T[k].symbol else
                    f'<th scope="col" class="num">{escape(T[k].meaning)}<br>{shown.unit(T[k])}'
                    "</th>" for k in present)
    rows = []
    for n, it in enumerate(items):
        cells = "".join(f'<td data-key="{path}.{n}.{k}">{_text(it.get(k))}</td>' for k in first)
        for k in present:
            key = f"{path}.{n}.{(sub or {}).get(k, k)}"
            cells += point_cell(it[k], key) if isinstance(it.get(k), list) else num(it.get(k), key)
        rows.append(f"<tr>{cells}</tr>")
    return (f'<table id="{table_id}"><thead><tr>{head}</tr></thead><tbody>{"".join(rows)}'
            "</tbody></table>")


def _one_load(obj: Mapping[str, Any], shown: Shown, svg: str | None) -> list[str]:
    parts = [f'<section id="loads"><h2>Loads</h2>'
             f"{key_table(value_rows(obj, LOADS, T, shown), 'load-values')}</section>",
             f'<section id="section"><h2>Section</h2>'
             f"{key_table(value_rows(obj, SECTION, T, shown), 'section-values')}</section>",
             f'<section id="results"><h2>Results</h2>'
             f"{key_table(value_rows(obj, RESULTS, T, shown), 'result-values')}</section>",
             figure(svg, "stress-picture", "The stresses over the section under these loads.")]
    if "materials" in obj:
        parts.append('<section id="materials"><h2>Each material</h2>'
                     f"{_rows_table(obj['materials'], MATERIAL, shown, 'materials', 'material-values')}"
                     "</section>")
    if obj.get("at_points"):
        parts.append('<section id="points"><h2>At the given points</h2>'
                     f"{_rows_table(obj['at_points'], POINT, shown, 'at_points', 'point-values')}"
                     "</section>")
    return parts


def _cases(obj: Mapping[str, Any], shown: Shown) -> list[str]:
    rows = [{**{CASE_LOADS[k]: v for k, v in c["loads"].items()}, **c} for c in obj["cases"]]
    loads = [CASE_LOADS[k] for k in obj["cases"][0]["loads"]] if rows else []
    table = _rows_table(rows, [*loads, *CASE], shown, "cases", "case-values",
                        first=("case", "material"),
                        sub={term: f"loads.{key}" for key, term in CASE_LOADS.items()})
    return [f'<section id="cases"><h2>Load cases of {escape(obj["load_cases"])}</h2>{table}'
            "</section>"]


def stress_page(obj: Mapping[str, Any], *, svg: str | None = None) -> str:
    """The page of the stresses of one profile, from the JSON object of ``warpwise stress``.

    Parameters
    ----------
    obj : mapping
        The object ``warpwise stress --json`` prints (one load, or ``--load-cases``), values
        in the units of its ``units``.
    svg : str, optional
        A picture of the stresses, an inline ``<svg>``
        (:func:`warpwise.report.plot_files.svg_text`).

    Returns
    -------
    str
        A self-contained HTML5 page; every value with its unit, all text escaped.
    """
    units = obj["units"]["length"]
    shown = Shown.of(units)
    cases = "cases" in obj
    title = f"{'Load cases' if cases else 'Stresses'} in {obj['file']}"
    body = _cases(obj, shown) if cases else _one_load(obj, shown, svg)
    note = ["Shear forces and the torque act through the shear centre, the axial force "
            "through the (modulus-weighted) centroid.",
            "Largest shear and von Mises stresses are taken away from sharp re-entrant corners, "
            "where the elastic stress is singular."]
    parts = [header(title, [f"units {system_text(units)}"]), warning_box(obj.get("warnings", ())),
             *body, glossary(shown), notes(note), caution_box(), footer()]
    return page(f"{obj['file']}: stresses", "\n".join(p for p in parts if p))


__all__ = ["stress_page"]
