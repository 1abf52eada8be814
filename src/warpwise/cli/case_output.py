"""Text, CSV and JSON of the load-case table (``stress --load-cases``): formats, computes nothing.

The results are in the profile's unit system; ``v`` shows them in the report's, each value under
its unit (the table's header names them, each CSV column carries its unit).
"""

from __future__ import annotations

import csv
import io
from typing import Any

from ..report.files import csv_safe, standard_json
from ..report.table import CAUTION, format_value
from ..stress import BIMOMENT
from ..stress.case_results import CaseResult
from ..units import FORCE, MOMENT, STRESS, Converter

#: (key, dimension) of the loads in the order of the load-case file.
LOAD_KEYS = (("N", FORCE), ("Mx", MOMENT), ("My", MOMENT), ("Vx", FORCE), ("Vy", FORCE),
             ("T", MOMENT), ("B", BIMOMENT))


def _cells(r: CaseResult, v: Converter) -> list[tuple[str, Any]]:
    """(column head with unit, value) of one row, in the report's units."""
    L, s = v.system.length, v.unit(STRESS)
    out: list[tuple[str, Any]] = [(f"{k} ({v.unit(d)})", v(getattr(r.loads, k), d))
                                  for k, d in LOAD_KEYS]
    for head, value, at in (("sigma_t", r.normal.tension, r.normal.tension_at),
                            ("sigma_c", r.normal.compression, r.normal.compression_at),
                            ("tau_max", r.tau_max, r.tau_at),
                            ("sigma_vm", r.von_mises_max, r.von_mises_at)):
        x, y = v.point(at)
        out += [(f"{head} ({s})", v(value, STRESS)), (f"{head} x ({L})", x),
                (f"{head} y ({L})", y)]
    return out + [("utilisation (-)", r.utilisation)]


def cases_text(file: str, cases_file: str, rows: list[CaseResult], v: Converter) -> str:
    """The readable load-case table: one line per case and material."""
    L, s = v.system.length, v.unit(STRESS)
    lines = [f"Load cases of {cases_file} on {file}  (units {L}, {v.unit(FORCE)}, {s})",
             "  sigma_t most tensile and sigma_c most compressive normal stress (signed), tau_max "
             "largest shear, sigma_vm largest von Mises stress, each at (x, y); u = sigma_vm / fy "
             "(informative, not a code check)",
             f"  {'case':<16} {'material':<14} {'sigma_t':>11} {'at':<18} {'sigma_c':>11} "
             f"{'at':<18} {'tau_max':>11} {'sigma_vm':>11} {'at':<18} {'u':>7}"]
    for r in rows:
        def at(p: tuple[float, float]) -> str:
            x, y = v.point(p)
            return f"({format_value(x, 4)}, {format_value(y, 4)})"
        u = "-" if r.utilisation is None else f"{r.utilisation:.3f}"
        lines.append(f"  {r.case:<16} {r.normal.material or 'section':<14} "
                     f"{format_value(v(r.normal.tension, STRESS)):>11} {at(r.normal.tension_at):<18} "
                     f"{format_value(v(r.normal.compression, STRESS)):>11} "
                     f"{at(r.normal.compression_at):<18} {format_value(v(r.tau_max, STRESS)):>11} "
                     f"{format_value(v(r.von_mises_max, STRESS)):>11} {at(r.von_mises_at):<18} {u:>7}")
    lines += [f"  stresses in {s}, points in {L}", "", f"  {CAUTION}", ""]
    return "\n".join(lines)


def cases_csv(rows: list[CaseResult], v: Converter) -> str:
    """CSV of the load-case table: one row per case and material, each column with its unit."""
    buf = io.StringIO()
    w = csv.writer(buf, lineterminator="\n")
    w.writerow(["case (text)", "material (text)", *[h for h, _ in _cells(rows[0], v)]])
    for r in rows:
        w.writerow([csv_safe(r.case), csv_safe(r.normal.material),
                    *["" if c is None else f"{c + 0.0:.10g}" for _, c in _cells(r, v)]])
    return buf.getvalue()


def cases_json(file: str, cases_file: str, rows: list[CaseResult], v: Converter) -> str:
    """JSON of the load-case table: the units and one object per case and material."""
    def one(r: CaseResult) -> dict[str, Any]:
        return {"case": r.case, "material": r.normal.material,
                "loads": {k: v(getattr(r.loads, k), d) for k, d in LOAD_KEYS},
                "sigma_tension": v(r.normal.tension, STRESS),
                "sigma_tension_at": v.point(r.normal.tension_at),
                "sigma_compression": v(r.normal.compression, STRESS),
                "sigma_compression_at": v.point(r.normal.compression_at),
                "tau_max": v(r.tau_max, STRESS), "tau_max_at": v.point(r.tau_at),
                "von_mises_max": v(r.von_mises_max, STRESS),
                "von_mises_max_at": v.point(r.von_mises_at), "utilisation": r.utilisation}
    s = v.system
    obj = {"file": file, "load_cases": cases_file,
           "units": {"length": s.length, "force": s.force, "moment": s.text(MOMENT),
                     "stress": s.stress},
           "cases": [one(r) for r in rows]}
    return standard_json(obj, file=file)
