"""Text and JSON of ``warpwise stress``: computed stresses formatted, nothing computed here."""

from __future__ import annotations

import json

from ..properties.analysis import SectionResult
from ..report.quantities import FORCE_UNITS
from ..report.table import CAUTION, corner_note, format_value
from ..stress import CombinedStress, ShearStress


def force_units(length: str) -> tuple[str, str, str]:
    """Force, moment and stress unit names for a length unit (consistent units assumed)."""
    force, stress = FORCE_UNITS[length]
    return force, f"{force}*{length}", stress


def _units(result: SectionResult) -> dict[str, str]:
    force, moment, stress = force_units(result.units)
    return {"length": result.units, "force": force, "moment": moment, "stress": stress}


def _row(width: int):
    def row(label: str, sym: str, v: float, unit: str) -> str:
        return f"  {label:<{width}} {sym:<9} {format_value(v):>14}  {unit}"
    return row


def shear_json(file: str, result: SectionResult, s: ShearStress, G: float | None) -> str:
    """JSON of the shear stresses from a torque and shear forces."""
    obj = {
        "file": file, "units": _units(result),
        "torque": s.torque, "shear_x": s.vx, "shear_y": s.vy, "shear_modulus": G,
        "poisson": result.shear.poisson, "J": result.torsion.J,
        "shear_centre": list(result.torsion.shear_centre),
        "tau_max": s.tau_max, "tau_max_at": list(s.tau_max_at),
        "tau_max_torsion": s.tau_max_torsion, "tau_max_shear": s.tau_max_shear,
        "twist_rate": s.twist_rate,
    }
    return json.dumps(obj, indent=2) + "\n"


def shear_text(file: str, result: SectionResult, s: ShearStress, G: float | None) -> str:
    """Readable table of the shear stresses from a torque and shear forces."""
    L = result.units
    force, moment, stress_unit = force_units(L)
    row = _row(38)
    x, y = s.tau_max_at
    xs, ys = result.torsion.shear_centre
    lines = [f"Shear stresses in {file}  (length unit {L}; consistent units)",
             f"  loads act through the shear centre ({format_value(xs)}, {format_value(ys)}) {L}",
             row("torque", "T", s.torque, moment), row("shear force along x", "Vx", s.vx, force),
             row("shear force along y", "Vy", s.vy, force)]
    if G is not None:
        lines.append(row("shear modulus", "G", G, stress_unit))
    lines.append(row("torsion constant", "J", result.torsion.J, f"{L}4"))
    if s.twist_rate is not None:
        lines.append(row("twist rate T/(G J)", "theta", s.twist_rate, f"rad/{L}"))
    lines += [row("largest shear stress, torque alone", "tau_T", s.tau_max_torsion, stress_unit),
              row("largest shear stress, forces alone", "tau_V", s.tau_max_shear, stress_unit),
              row("largest combined shear stress", "tau_max", s.tau_max, stress_unit),
              f"    at ({format_value(x)}, {format_value(y)}) {L}", "", f"  {CAUTION}", ""]
    return "\n".join(lines)


def combined_json(file: str, result: SectionResult, c: CombinedStress, G: float | None) -> str:
    """JSON of the stresses under combined loads, per material."""
    loads = c.loads
    top = max(c.by_material, key=lambda m: m.von_mises_max)
    obj = {
        "file": file, "units": _units(result),
        "torque": loads.T, "shear_x": loads.Vx, "shear_y": loads.Vy, "axial": loads.N,
        "moment_x": loads.Mx, "moment_y": loads.My, "shear_modulus": G, "J": result.torsion.J,
        "shear_centre": list(result.torsion.shear_centre),
        "tau_max": max(m.tau_max for m in c.by_material),
        "tau_max_at": list(max(c.by_material, key=lambda m: m.tau_max).von_mises_at),
        "twist_rate": c.twist_rate, "von_mises_max": top.von_mises_max,
        "von_mises_max_at": list(top.von_mises_at),
        "materials": [{"material": m.material, "sigma_max": m.sigma_max, "tau_max": m.tau_max,
                       "von_mises_max": m.von_mises_max, "von_mises_at": list(m.von_mises_at),
                       "fy": m.fy, "utilisation": m.utilisation} for m in c.by_material],
    }
    return json.dumps(obj, indent=2) + "\n"


def combined_text(file: str, result: SectionResult, c: CombinedStress) -> str:
    """Readable table of the stresses under combined loads, per material."""
    loads, L = c.loads, result.units
    force, moment, stress_unit = force_units(L)
    row = _row(40)
    xs, ys = result.torsion.shear_centre
    lines = [f"Stresses in {file}  (length unit {L}; consistent units)",
             f"  shear forces and torque act through the shear centre ({format_value(xs)}, "
             f"{format_value(ys)}) {L}; N through the centroid",
             row("axial force", "N", loads.N, force), row("moment about x", "Mx", loads.Mx, moment),
             row("moment about y", "My", loads.My, moment), row("shear force along x", "Vx", loads.Vx, force),
             row("shear force along y", "Vy", loads.Vy, force), row("torque", "T", loads.T, moment)]
    if c.twist_rate is not None:
        lines.append(row("twist rate T/(G J)", "theta", c.twist_rate, f"rad/{L}"))
    for m in c.by_material:
        lines += ["", f"  {m.material or 'section'}",
                  row("largest normal stress |sigma_z|", "sigma", m.sigma_max, stress_unit),
                  row("largest shear stress", "tau", m.tau_max, stress_unit),
                  row("largest von Mises stress", "sigma_vm", m.von_mises_max, stress_unit),
                  f"    at ({format_value(m.von_mises_at[0])}, {format_value(m.von_mises_at[1])}) {L}"]
        if m.utilisation is not None:
            lines.append(row("von Mises / fy (informative, not a code check)", "u", m.utilisation, "-"))
    lines += [f"  note: {corner_note(corner, L)}" for corner in result.corners]
    lines += ["", f"  {CAUTION}", ""]
    return "\n".join(lines)
