"""The properties about a given axis (``props --about-axis``) as table rows, JSON and CSV cells.

The values are computed in the profile's unit system (:mod:`warpwise.properties.about_axis`);
every number is converted here to the report's system and shown under that system's unit.
They belong to the request, not to the profile: the table shows them in a group of their own,
the JSON in an ``about_axis`` object, the CSV in columns after the property columns.
"""

from __future__ import annotations

from html import escape
from typing import Any

from ..properties.about_axis import AxisProperties
from ..units import ANGLE, LENGTH, Converter, Dimension
from .html_parts import number_html, symbol_html, unit_html
from .table import format_value

SECOND_MOMENT, MODULUS = Dimension(4), Dimension(3)

#: The values about a given axis: symbol (the JSON key and CSV name), meaning, definition and
#: what each measures. Table rows, HTML rows and the glossary read this list.
AXIS_SYMBOLS: tuple[tuple[str, str, str, Dimension], ...] = (
    ("I_axis", "second moment about the axis", "integral of v^2 dA, v the distance from the "
     "given axis (parallel-axis theorem and Mohr's rotation of Ix, Iy, Ixy)", SECOND_MOMENT),
    ("I_across", "second moment about the perpendicular axis",
     "integral of u^2 dA, u along the given axis from its point", SECOND_MOMENT),
    ("I_uv", "product moment in the axis' coordinates", "integral of u v dA", SECOND_MOMENT),
    ("Ip_point", "polar second moment about the point", "I_axis + I_across", SECOND_MOMENT),
    ("v", "distance of a fibre from the axis", "positive to the left of the axis' direction",
     LENGTH),
    ("W_fibre", "section modulus to the fibre", "I_axis / |v|", MODULUS),
)


def axis_rows(a: AxisProperties, v: Converter) -> list[str]:
    """Table lines of the properties about the given axis, in the report's units ``v``."""
    L, u3 = v.system.length, v.unit(MODULUS)

    def row(label: str, sym: str, value: float, unit: str) -> str:
        return f"    {label:<50} {sym:<9} {format_value(value):>14}  {unit}"

    lines = ["", f"  {axis_heading(a, v)}"]
    lines += [row(label, sym, v(value, dim), v.unit(dim))
              for (sym, label, _, dim), value in zip(AXIS_SYMBOLS, _moments(a), strict=False)]
    for fibre, d, w in zip(a.fibres, a.distances, a.moduli, strict=True):
        fx, fy = v.point(fibre)
        lines += [f"    fibre ({format_value(fx)}, {format_value(fy)}) {L}",
                  row("  distance from the axis (+ left of it)", "v", v(d, LENGTH), L),
                  row("  section modulus I_axis / |v|", "W_fibre", v(w, MODULUS), u3)]
    return lines


def _moments(a: AxisProperties) -> tuple[float, float, float, float]:
    """I_axis, I_across, I_uv, Ip_point in the order of :data:`AXIS_SYMBOLS`, L^4."""
    return a.I_axis, a.I_across, a.I_product, a.Ip


def axis_heading(a: AxisProperties, v: Converter) -> str:
    """The line naming the axis, in the report's units ``v``."""
    x0, y0 = v.point(a.point)
    return (f"About the axis through ({format_value(x0)}, {format_value(y0)}) {v.system.length} "
            f"at {format_value(a.angle_deg)} deg from +x (u along it, v across it)")


def axis_html(a: AxisProperties, v: Converter) -> tuple[str, str]:
    """The datasheet section of the given axis, and its glossary entries (both HTML).

    Every value in the report's units ``v``, every symbol of :data:`AXIS_SYMBOLS` explained.
    """
    def row(sym: str, label: str, value: float, dim: Dimension) -> str:
        return (f'<tr data-key="{escape(sym)}"><td class="sym">{symbol_html(sym)}</td>'
                f"<td>{escape(label)}</td><td class=\"num\">{number_html(v(value, dim))}</td>"
                f'<td class="unit">{unit_html(v.unit(dim))}</td></tr>')

    rows = [row(sym, label, value, dim)
            for (sym, label, _, dim), value in zip(AXIS_SYMBOLS, _moments(a), strict=False)]
    L = v.system.length
    for fibre, d, w in zip(a.fibres, a.distances, a.moduli, strict=True):
        fx, fy = v.point(fibre)
        where = f"fibre ({format_value(fx)}, {format_value(fy)}) {L}"
        rows += [row("v", f"{where}: distance from the axis", d, LENGTH),
                 row("W_fibre", f"{where}: section modulus I_axis / |v|", w, MODULUS)]
    head = ('<thead><tr><th scope="col">Symbol</th><th scope="col">Property</th>'
            '<th scope="col" class="num">Value</th><th scope="col">Unit</th></tr></thead>')
    section = (f'<section id="about-axis"><h2>About a given axis</h2><p>{escape(axis_heading(a, v))}'
               f'.</p><table class="properties" id="axis-table">{head}<tbody>{"".join(rows)}'
               "</tbody></table></section>")
    used = [s for s in AXIS_SYMBOLS if s[0] in ("I_axis", "I_across", "I_uv", "Ip_point")
            or a.fibres]
    glossary = "".join(f"<dt>{symbol_html(sym)}</dt><dd>{escape(label)}: {escape(definition)} "
                       f'<span class="unit">[{unit_html(v.unit(dim))}]</span></dd>'
                       for sym, label, definition, dim in used)
    return section, glossary


def axis_json(a: AxisProperties, v: Converter) -> dict[str, Any]:
    """The ``about_axis`` JSON object, in the report's units ``v``."""
    return {"point": v.point(a.point), "angle_deg": a.angle_deg,
            "I_axis": v(a.I_axis, SECOND_MOMENT), "I_across": v(a.I_across, SECOND_MOMENT),
            "I_uv": v(a.I_product, SECOND_MOMENT), "Ip_point": v(a.Ip, SECOND_MOMENT),
            "fibres": [{"point": v.point(f), "distance": v(d, LENGTH), "W": v(w, MODULUS)}
                       for f, d, w in zip(a.fibres, a.distances, a.moduli, strict=True)]}


def axis_csv(a: AxisProperties, v: Converter) -> tuple[list[str], list[str]]:
    """CSV headers (with units) and cells of the properties about the given axis."""
    L, u4, u3 = v.system.length, v.unit(SECOND_MOMENT), v.unit(MODULUS)
    x0, y0 = v.point(a.point)
    head = [f"axis x0 ({L})", f"axis y0 ({L})", f"axis angle ({v.unit(ANGLE)})",
            f"I_axis ({u4})", f"I_across ({u4})", f"I_uv ({u4})", f"Ip_point ({u4})"]
    cells = [x0, y0, a.angle_deg, v(a.I_axis, SECOND_MOMENT), v(a.I_across, SECOND_MOMENT),
             v(a.I_product, SECOND_MOMENT), v(a.Ip, SECOND_MOMENT)]
    for k, (f, d, w) in enumerate(zip(a.fibres, a.distances, a.moduli, strict=True), start=1):
        head += [f"fibre {k} x ({L})", f"fibre {k} y ({L})", f"fibre {k} v ({L})",
                 f"fibre {k} W ({u3})"]
        cells += [*v.point(f), v(d, LENGTH), v(w, MODULUS)]
    return head, [f"{c + 0.0:.10g}" for c in cells]
