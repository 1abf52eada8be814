"""Text, JSON and CSV of ``warpwise member``: a solved member formatted, nothing computed here.

The member is solved in the profile's unit system; every number is converted here, with
:class:`warpwise.units.Converter`, to the report's unit system and printed under its unit.
"""

from __future__ import annotations

import csv
import io
from dataclasses import dataclass, replace

import numpy as np

from ..member import END_TEXT, QUANTITIES, TERM_BY_KEY, Extreme, MemberActions, MemberTorsion
from ..report.files import standard_json
from ..report.table import CAUTION, format_value
from ..stress.member_stress import SectionStresses
from ..units import FORCE, MOMENT, STRESS, Converter, Dimension

#: Dimension of each quantity along a member (phi in rad: a number), from the one list.
DIMENSIONS = {n: TERM_BY_KEY[n].dimension for n in ("z", *dict(QUANTITIES))}

#: What each quantity is, for the table of maxima, from the one list.
MEANING = {n: TERM_BY_KEY[n].legend for n in dict(QUANTITIES)}


@dataclass(frozen=True)
class MemberView:
    """A solved member seen in the report's unit system."""

    show: Converter

    def unit(self, name: str) -> str:
        """Unit text of a quantity along the member."""
        return TERM_BY_KEY[name].unit(self.show.target)

    def __call__(self, value, name: str):
        """A value (or array) of quantity ``name`` in the report's units."""
        return self.show(value, DIMENSIONS[name])

    def units(self) -> dict[str, str]:
        """The unit of every quantity, for the JSON."""
        s = self.show.system
        return {"length": s.length, "force": s.force, "torque": s.text(MOMENT),
                **{name: self.unit(name) for name in ("distributed_torque", *dict(QUANTITIES),
                                                      "GJ", "ECw")}}


#: A value below this fraction of the largest |value| of its quantity along the member is
#: round-off of 0 (the solution is exact up to round-off; common practice, no source).
ROUND_OFF = 1e-12


def _cleaned(at: MemberActions, top: list[Extreme]) -> MemberActions:
    """The values with round-off of 0 (at supports, by symmetry) set to 0."""
    largest = {e.name: abs(e.value) for e in top}
    return MemberActions(z=at.z, **{n: np.where(np.abs(getattr(at, n)) < ROUND_OFF * largest[n],
                                                0.0, getattr(at, n)) for n, _ in QUANTITIES})


def _symbols() -> dict[str, str]:
    return {"z": "z", **dict(QUANTITIES)}


def _header(file: str, m: MemberTorsion, v: MemberView) -> list[str]:
    s, L = v.show.system, v.show.system.length
    torque, per = s.text(MOMENT), f"{s.text(MOMENT)}/{L}"
    lines = [f"Torsion of a member of {file}  (units {L}, {s.force}, {torque})",
             f"  length {format_value(v(m.length, 'z'))} {L}; end z = 0 {m.ends[0]} "
             f"({END_TEXT[m.ends[0]]}), end z = L {m.ends[1]} ({END_TEXT[m.ends[1]]})"]
    lines += [f"  torque {format_value(v.show(T, MOMENT))} {torque} at z = "
              f"{format_value(v(z, 'z'))} {L}" for T, z in m.loads.torques]
    if m.loads.distributed:
        lines.append(f"  distributed torque {format_value(v.show(m.loads.distributed, FORCE))} "
                     f"{per} over the whole length")
    lines += [f"  torsional stiffness GJ {format_value(v.show(m.GJ, Dimension(2, 1)))} "
              f"{s.text(Dimension(2, 1))}, warping stiffness ECw "
              f"{format_value(v.show(m.ECw, Dimension(4, 1)))} {s.text(Dimension(4, 1))}"]
    if m.saint_venant_only:
        lines.append("  note: Cw = 0: pure Saint-Venant torsion (no bimoment, no warping torque; "
                     "the warping end conditions have no effect)")
    else:
        lines.append(f"  torsion bending length a = sqrt(ECw / GJ) "
                     f"{format_value(v(m.a, 'z'))} {L} (L / a = {format_value(m.length / m.a)})")
    return lines


#: What governs each section of the stress table.
GOVERNS = {"B": "|B|", "T_w": "|T_w|", "T_sv": "|T_sv|"}


def _cleaned_sections(sections: list[SectionStresses], top: list[Extreme]) -> list[SectionStresses]:
    """B, T_w, T_sv that are round-off of 0 (:data:`ROUND_OFF`) set to 0 with their stress."""
    largest = {e.name: abs(e.value) for e in top}
    out = []
    for s in sections:
        change = {}
        for name, stress in (("B", "sigma_w"), ("T_w", "tau_w"), ("T_sv", "tau_sv")):
            if abs(getattr(s, name)) < ROUND_OFF * largest[name]:
                change |= {name: 0.0, f"{stress}_at": None,
                           stress: None if getattr(s, stress) is None else 0.0}
        out.append(replace(s, **change))
    return out


def _stress_lines(v: MemberView, sections: list[SectionStresses]) -> list[str]:
    """The largest torsion stresses at the governing sections, in the report's units."""
    show, L = v.show, v.show.system.length
    stress = show.unit(STRESS)

    def where(xy) -> str:
        if xy is None:
            return ""
        x, y = show.point(xy)
        return f" at ({format_value(x)}, {format_value(y)}) {L}"

    lines = ["", "  largest stresses at the governing sections (away from sharp corners; each "
                 "at its own point)"]
    merged: list[tuple[list[str], SectionStresses]] = []
    for s in sections:  # sections of several largest values at one z are printed once
        same = next((m for m in merged if m[1] == replace(s, governs=m[1].governs)), None)
        if same is None:
            merged.append(([GOVERNS[s.governs]], s))
        else:
            same[0].append(GOVERNS[s.governs])
    for names, s in merged:
        what = " and ".join(names) + (" are" if len(names) > 1 else " is")
        lines.append(f"  where {what} largest, z = {format_value(v(s.z, 'z'))} "
                     f"{L}: B {format_value(v(s.B, 'B'))} {v.unit('B')}, T_w "
                     f"{format_value(v(s.T_w, 'T_w'))} {v.unit('T_w')}, T_sv "
                     f"{format_value(v(s.T_sv, 'T_sv'))} {v.unit('T_sv')}")
        for key, val, xy in (("sigma_w", s.sigma_w, s.sigma_w_at),
                             ("tau_w", s.tau_w, s.tau_w_at), ("tau_sv", s.tau_sv, s.tau_sv_at)):
            if val is not None:
                term = TERM_BY_KEY[key]
                lines.append(f"    {term.legend:<34} {term.symbol:<7} "
                             f"{format_value(show(val, STRESS)):>14}  "
                             f"{stress}{where(xy)}")
    return lines


def _stress_json(v: MemberView, sections: list[SectionStresses]) -> list[dict]:
    show = v.show

    def point(xy):
        return None if xy is None else show.point(xy)

    return [{"governs": s.governs, "z": v(s.z, "z"), "B": v(s.B, "B"), "T_w": v(s.T_w, "T_w"),
             "T_sv": v(s.T_sv, "T_sv"), "sigma_w": show(s.sigma_w, STRESS),
             "sigma_w_at": point(s.sigma_w_at), "tau_w": show(s.tau_w, STRESS),
             "tau_w_at": point(s.tau_w_at), "tau_sv": show(s.tau_sv, STRESS),
             "tau_sv_at": point(s.tau_sv_at)} for s in sections]


def member_text(file: str, m: MemberTorsion, at: MemberActions, top: list[Extreme],
                units: str | None, source: str,
                sections: list[SectionStresses] | None = None) -> str:
    """Readable report of a member: the loads, values at stations, the largest values."""
    v = MemberView(Converter.of(source, units))
    names = ["z", *[n for n, _ in QUANTITIES]]
    sym = _symbols()
    at = _cleaned(at, top)
    lines = _header(file, m, v) + ["", "  " + " ".join(f"{sym[n]:>12}" for n in names),
                                   "  " + " ".join(f"{v.unit(n):>12}" for n in names)]
    for k in range(len(at.z)):  # one row per station (a handful)
        lines.append("  " + " ".join(f"{format_value(v(getattr(at, n)[k], n)):>12}"
                                     for n in names))
    if len(m.starts) > 2:
        lines.append("  at a load point the row holds the values just past it; phi''', T_sv "
                     "and T_w jump there")
    lines += ["", "  largest values along the member"]
    for e in top:
        lines.append(f"  {MEANING[e.name]:<34} {sym[e.name]:<7} "
                     f"{format_value(v(e.value, e.name)):>14}  {v.unit(e.name):<9} at z = "
                     f"{format_value(v(e.z, 'z'))} {v.unit('z')}")
    lines += _stress_lines(v, _cleaned_sections(sections or [], top))
    lines += ["", f"  {CAUTION}", ""]
    return "\n".join(lines)


def member_json(file: str, m: MemberTorsion, at: MemberActions, top: list[Extreme],
                units: str | None, source: str,
                sections: list[SectionStresses] | None = None) -> str:
    """JSON of a member (see :func:`member_text`), in the report's units."""
    v = MemberView(Converter.of(source, units))
    names = ["z", *[n for n, _ in QUANTITIES]]
    at = _cleaned(at, top)
    obj = {"file": file, "units": v.units(), "length": v(m.length, "z"), "ends": list(m.ends),
           "torques": [{"torque": v.show(T, MOMENT), "z": v(z, "z")} for T, z in m.loads.torques],
           "distributed_torque": v.show(m.loads.distributed, FORCE),
           "GJ": v.show(m.GJ, Dimension(2, 1)), "ECw": v.show(m.ECw, Dimension(4, 1)),
           "saint_venant_only": m.saint_venant_only,
           "a": None if m.saint_venant_only else v(m.a, "z"),
           "stations": {n: [float(x) for x in v(getattr(at, n), n)] for n in names},
           "largest": [{"quantity": e.name, "value": v(e.value, e.name), "z": v(e.z, "z")}
                       for e in top],
           "stress": v.show.unit(STRESS),
           "governing_sections": _stress_json(v, _cleaned_sections(sections or [], top))}
    return standard_json(obj, file=file)


def member_csv(at: MemberActions, top: list[Extreme], units: str | None, source: str) -> str:
    """CSV of the values at the stations, one row per station, units in the header."""
    v = MemberView(Converter.of(source, units))
    at = _cleaned(at, top)
    names = ["z", *[n for n, _ in QUANTITIES]]
    sym = _symbols()
    out = io.StringIO()
    w = csv.writer(out, lineterminator="\n")
    w.writerow([f"{sym[n]} ({v.unit(n)})" for n in names])
    for k in range(len(at.z)):
        w.writerow([repr(float(v(getattr(at, n)[k], n))) for n in names])
    return out.getvalue()


__all__ = ["DIMENSIONS", "MEANING", "MemberView", "member_csv", "member_json", "member_text"]
