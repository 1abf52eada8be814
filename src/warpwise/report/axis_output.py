"""The properties about a given axis (``props --about-axis``) as table rows, JSON and CSV cells.

The values are computed in the profile's unit system (:mod:`warpwise.properties.about_axis`);
every number is converted here to the report's system and shown under that system's unit.
They belong to the request, not to the profile: the table shows them in a group of their own,
the JSON in an ``about_axis`` object, the CSV in columns after the property columns.
"""

from __future__ import annotations

from typing import Any

from ..properties.about_axis import AxisProperties
from ..units import ANGLE, LENGTH, Converter, Dimension
from .table import format_value

SECOND_MOMENT, MODULUS = Dimension(4), Dimension(3)


def axis_rows(a: AxisProperties, v: Converter) -> list[str]:
    """Table lines of the properties about the given axis, in the report's units ``v``."""
    L = v.system.length
    x0, y0 = v.point(a.point)
    u4, u3 = v.unit(SECOND_MOMENT), v.unit(MODULUS)

    def row(label: str, sym: str, value: float, unit: str) -> str:
        return f"    {label:<50} {sym:<9} {format_value(value):>14}  {unit}"

    lines = ["", f"  About the axis through ({format_value(x0)}, {format_value(y0)}) {L} at "
                 f"{format_value(a.angle_deg)} deg from +x (u along it, v across it)",
             row("second moment about the axis", "I_axis", v(a.I_axis, SECOND_MOMENT), u4),
             row("second moment about the perpendicular axis", "I_across",
                 v(a.I_across, SECOND_MOMENT), u4),
             row("product moment in the axis' coordinates", "I_uv", v(a.I_product, SECOND_MOMENT), u4),
             row("polar second moment about the point", "Ip_point", v(a.Ip, SECOND_MOMENT), u4)]
    for fibre, d, w in zip(a.fibres, a.distances, a.moduli, strict=True):
        fx, fy = v.point(fibre)
        lines += [f"    fibre ({format_value(fx)}, {format_value(fy)}) {L}",
                  row("  distance from the axis (+ left of it)", "v", v(d, LENGTH), L),
                  row("  section modulus I_axis / |v|", "W_fibre", v(w, MODULUS), u3)]
    return lines


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
