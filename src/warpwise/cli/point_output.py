"""Text and JSON of the signed extreme normal stresses and of the stresses at given points.

Values are in the profile's unit system; ``v`` (a Converter of the stress output) shows them in
the report's system under its units.
"""

from __future__ import annotations

from typing import Any

from ..report.table import format_value
from ..stress.points import NormalExtremes, PointStress
from ..units import STRESS, Converter


def extreme_rows(row, e: NormalExtremes, v: Converter) -> list[str]:
    """Rows of the most tensile and the most compressive normal stress of one material."""
    L, stress = v.system.length, v.unit(STRESS)
    out = []
    for label, sym, value, at in (("most tensile normal stress (signed)", "sigma_t", e.tension,
                                   e.tension_at),
                                  ("most compressive normal stress (signed)", "sigma_c",
                                   e.compression, e.compression_at)):
        x, y = v.point(at)
        out += [row(label, sym, v(value, STRESS), stress),
                f"    at ({format_value(x)}, {format_value(y)}) {L}"]
    return out


def extreme_json(e: NormalExtremes, v: Converter) -> dict[str, Any]:
    """JSON keys of the signed extremes of one material."""
    return {"sigma_tension": v(e.tension, STRESS), "sigma_tension_at": v.point(e.tension_at),
            "sigma_compression": v(e.compression, STRESS),
            "sigma_compression_at": v.point(e.compression_at)}


def point_rows(p: PointStress, v: Converter) -> list[str]:
    """A small table of every stress component at each given point."""
    L, stress = v.system.length, v.unit(STRESS)
    head = f"    {'x':>10} {'y':>10}  {'sigma_z':>12} {'tau_zx':>12} {'tau_zy':>12} " \
           f"{'tau':>12} {'sigma_vm':>12}  material"
    lines = ["", f"  Stresses at the given points ({L}; stresses in {stress})", head]
    for k in range(len(p.points)):
        x, y = v.point(p.points[k])
        vals = [v(float(a[k]), STRESS) for a in (p.sigma, p.tau_zx, p.tau_zy, p.tau, p.von_mises)]
        lines.append(f"    {format_value(x):>10} {format_value(y):>10}  "
                     + " ".join(f"{format_value(c):>12}" for c in vals)
                     + f"  {p.materials[k] or 'section'}")
    return lines


def point_json(p: PointStress, v: Converter) -> list[dict[str, Any]]:
    """JSON objects of the stresses at each given point."""
    return [{"point": v.point(p.points[k]), "material": p.materials[k],
             **{key: v(float(a[k]), STRESS) for key, a in (
                 ("sigma", p.sigma), ("tau_zx", p.tau_zx), ("tau_zy", p.tau_zy), ("tau", p.tau),
                 ("von_mises", p.von_mises))}} for k in range(len(p.points))]
