"""Text and JSON of ``warpwise stress``: computed stresses formatted, nothing computed here.

The stresses are computed in the profile's unit system; every number is converted here, with
:func:`warpwise.units.convert`, to the report's unit system and printed under that system's unit.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, replace

from ..geometry.corners import Corner
from ..properties.analysis import SectionResult
from ..report.files import standard_json
from ..report.quantities import SOLVED_ROUND_OFF
from ..report.table import CAUTION, corner_note, format_value
from ..stress import BIMOMENT, CombinedStress, ShearStress
from ..stress.points import NormalExtremes, PointStress
from ..units import FORCE, LENGTH, MOMENT, STRESS, TWIST, Converter, Dimension, twist_in_degrees
from .point_output import extreme_json, extreme_rows, point_json, point_rows


@dataclass(frozen=True)
class _View(Converter):
    """Values of one result in the report's unit system, and their unit texts."""

    tiny: float = 0.0  # a coordinate below this (profile units) is round-off of 0

    @classmethod
    def of_result(cls, result: SectionResult, units: str | None) -> _View:
        base = Converter.of(result.units, units)
        return cls(base.source, base.target, SOLVED_ROUND_OFF * result.profile.size)

    def point(self, xy) -> list[float]:
        return super().point([0.0 if abs(v) < self.tiny else v for v in xy])

    def twist_deg(self, rate: float | None) -> float | None:
        return None if rate is None else twist_in_degrees(self(rate, TWIST), self.target)

    def names(self) -> dict[str, str]:
        s = self.system
        return {"length": s.length, "force": s.force, "moment": s.text(MOMENT),
                "stress": s.stress, "twist_rate": s.text(TWIST),
                "twist_rate_deg": f"deg/{s.long_length}"}


def _corners(result: SectionResult, v: _View) -> list[Corner]:
    """The sharp re-entrant corners with location and excluded radius in the report's units."""
    return [replace(c, x=x, y=y, radius=v(c.radius, LENGTH))
            for c in result.corners for x, y in [v.point((c.x, c.y))]]


def _corner_lines(result: SectionResult, v: _View) -> list[str]:
    return [f"  note: {corner_note(c, v.target)}" for c in _corners(result, v)]


def _corner_json(result: SectionResult, v: _View) -> list[dict]:
    """Each sharp corner: where, its interior angle and the radius left out of the maxima."""
    return [{"at": [c.x, c.y], "angle_deg": c.angle_deg, "excluded_radius": c.radius}
            for c in _corners(result, v)]


def _row(width: int) -> Callable[[str, str, float, str], str]:
    def row(label: str, sym: str, v: float, unit: str) -> str:
        return f"  {label:<{width}} {sym:<9} {format_value(v):>14}  {unit}"
    return row


def _twist_rows(row, v: _View, rate: float | None) -> list[str]:
    if rate is None:
        return []
    return [row("twist rate T/(G J)", "theta", v(rate, TWIST), v.unit(TWIST)),
            row("twist rate, degrees", "theta", v.twist_deg(rate), f"deg/{v.system.long_length}")]


def shear_json(file: str, result: SectionResult, s: ShearStress, G: float | None,
               units: str | None = None) -> str:
    """JSON of the shear stresses from a torque and shear forces, in the report's units.

    ``G`` is in the profile's stress unit; ``units`` names the report's unit system (default
    the profile's).
    """
    v = _View.of_result(result, units)
    obj = {
        "file": file, "units": v.names(),
        "torque": v(s.torque, MOMENT), "shear_x": v(s.vx, FORCE), "shear_y": v(s.vy, FORCE),
        "shear_modulus": v(G, STRESS),
        "poisson": result.shear.poisson, "J": v(result.torsion.J, Dimension(4)),
        "shear_centre": v.point(result.torsion.shear_centre),
        "tau_max": v(s.tau_max, STRESS), "tau_max_at": v.point(s.tau_max_at),
        "tau_max_torsion": v(s.tau_max_torsion, STRESS),
        "tau_max_shear": v(s.tau_max_shear, STRESS),
        "twist_rate": v(s.twist_rate, TWIST), "twist_rate_deg": v.twist_deg(s.twist_rate),
        "corners": _corner_json(result, v),
        "warnings": list(result.profile.warnings),
    }
    return standard_json(obj, file=file)


def shear_text(file: str, result: SectionResult, s: ShearStress, G: float | None,
               units: str | None = None) -> str:
    """Readable table of the shear stresses from a torque and shear forces (see shear_json)."""
    v = _View.of_result(result, units)
    L, stress = v.system.length, v.unit(STRESS)
    row = _row(38)
    x, y = v.point(s.tau_max_at)
    xs, ys = v.point(result.torsion.shear_centre)
    lines = [f"Shear stresses in {file}  (units {L}, {v.unit(FORCE)}, {stress})",
             *[f"  WARNING: {w}" for w in result.profile.warnings],
             f"  loads act through the shear centre ({format_value(xs)}, {format_value(ys)}) {L}",
             row("torque", "T", v(s.torque, MOMENT), v.unit(MOMENT)),
             row("shear force along x", "Vx", v(s.vx, FORCE), v.unit(FORCE)),
             row("shear force along y", "Vy", v(s.vy, FORCE), v.unit(FORCE))]
    if G is not None:
        lines.append(row("shear modulus", "G", v(G, STRESS), stress))
    lines.append(row("torsion constant", "J", v(result.torsion.J, Dimension(4)), f"{L}4"))
    lines += _twist_rows(row, v, s.twist_rate)
    lines += [row("largest shear stress, torque alone", "tau_T", v(s.tau_max_torsion, STRESS), stress),
              row("largest shear stress, forces alone", "tau_V", v(s.tau_max_shear, STRESS), stress),
              row("largest combined shear stress", "tau_max", v(s.tau_max, STRESS), stress),
              f"    at ({format_value(x)}, {format_value(y)}) {L}", *_corner_lines(result, v),
              "", f"  {CAUTION}", ""]
    return "\n".join(lines)


def combined_json(file: str, result: SectionResult, c: CombinedStress, G: float | None,
                  units: str | None = None, extremes: list[NormalExtremes] | None = None,
                  at: PointStress | None = None) -> str:
    """JSON of the stresses under combined loads, per material, in the report's units.

    ``extremes`` (one per material) adds the signed extreme normal stresses to each material,
    ``at`` the stresses at given points (``at_points``).
    """
    v = _View.of_result(result, units)
    loads = c.loads
    top = max(c.by_material, key=lambda m: m.von_mises_max)
    obj = {
        "file": file, "units": v.names(),
        "torque": v(loads.T, MOMENT), "shear_x": v(loads.Vx, FORCE), "shear_y": v(loads.Vy, FORCE),
        "axial": v(loads.N, FORCE), "moment_x": v(loads.Mx, MOMENT), "moment_y": v(loads.My, MOMENT),
        "bimoment": v(loads.B, BIMOMENT), "Cw": v(result.torsion.Cw, Dimension(6)),
        "sigma_w": v(c.sigma_w, STRESS),
        "sigma_w_at": None if c.sigma_w_at is None else v.point(c.sigma_w_at),
        "shear_modulus": v(G, STRESS), "J": v(result.torsion.J, Dimension(4)),
        "shear_centre": v.point(result.torsion.shear_centre),
        "tau_max": v(max(m.tau_max for m in c.by_material), STRESS),
        "tau_max_at": v.point(max(c.by_material, key=lambda m: m.tau_max).tau_at),
        "twist_rate": v(c.twist_rate, TWIST), "twist_rate_deg": v.twist_deg(c.twist_rate),
        "von_mises_max": v(top.von_mises_max, STRESS),
        "von_mises_max_at": v.point(top.von_mises_at),
        "materials": [{"material": m.material, "sigma_max": v(m.sigma_max, STRESS),
                       "tau_max": v(m.tau_max, STRESS), "von_mises_max": v(m.von_mises_max, STRESS),
                       "von_mises_at": v.point(m.von_mises_at), "fy": v(m.fy, STRESS),
                       "utilisation": m.utilisation} for m in c.by_material],
        "corners": _corner_json(result, v),
        "warnings": list(result.profile.warnings),
    }
    for mat, e in zip(obj["materials"], extremes or (), strict=False):
        mat.update(extreme_json(e, v))
    if at is not None:
        obj["at_points"] = point_json(at, v)
    return standard_json(obj, file=file)


def combined_text(file: str, result: SectionResult, c: CombinedStress,
                  units: str | None = None, extremes: list[NormalExtremes] | None = None,
                  at: PointStress | None = None) -> str:
    """Readable table of the stresses under combined loads, per material (see combined_json)."""
    v = _View.of_result(result, units)
    loads, L = c.loads, v.system.length
    force, moment, stress = v.unit(FORCE), v.unit(MOMENT), v.unit(STRESS)
    row = _row(40)
    xs, ys = v.point(result.torsion.shear_centre)
    lines = [f"Stresses in {file}  (units {L}, {force}, {stress})",
             *[f"  WARNING: {w}" for w in result.profile.warnings],
             f"  shear forces and torque act through the shear centre ({format_value(xs)}, "
             f"{format_value(ys)}) {L}; N through the centroid",
             row("axial force", "N", v(loads.N, FORCE), force),
             row("moment about x", "Mx", v(loads.Mx, MOMENT), moment),
             row("moment about y", "My", v(loads.My, MOMENT), moment),
             row("shear force along x", "Vx", v(loads.Vx, FORCE), force),
             row("shear force along y", "Vy", v(loads.Vy, FORCE), force),
             row("torque", "T", v(loads.T, MOMENT), moment)]
    if loads.B:
        x, y = v.point(c.sigma_w_at)
        lines += [row("bimoment", "B", v(loads.B, BIMOMENT), v.unit(BIMOMENT)),
                  row("warping constant", "Cw", v(result.torsion.Cw, Dimension(6)), f"{L}6"),
                  row("largest warping stress -B omega/Cw", "sigma_w", v(c.sigma_w, STRESS),
                      stress), f"    at ({format_value(x)}, {format_value(y)}) {L}"]
    lines += _twist_rows(row, v, c.twist_rate)
    for k, m in enumerate(c.by_material):
        x, y = v.point(m.von_mises_at)
        lines += ["", f"  {m.material or 'section'}",
                  row("largest normal stress |sigma_z|", "sigma", v(m.sigma_max, STRESS), stress),
                  row("largest shear stress", "tau", v(m.tau_max, STRESS), stress),
                  row("largest von Mises stress", "sigma_vm", v(m.von_mises_max, STRESS), stress),
                  f"    at ({format_value(x)}, {format_value(y)}) {L}"]
        lines += extreme_rows(row, extremes[k], v) if extremes else []
        if m.utilisation is not None:
            lines.append(row("von Mises / fy (informative, not a code check)", "u", m.utilisation, "-"))
    lines += _corner_lines(result, v)
    lines += point_rows(at, v) if at is not None else []
    lines += ["", f"  {CAUTION}", ""]
    return "\n".join(lines)
