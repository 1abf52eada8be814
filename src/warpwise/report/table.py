"""Readable property table for a terminal or a text report."""

from __future__ import annotations

from ..analysis import SectionResult
from .quantities import QUANTITIES, unit_of, values

CAUTION = ("Results support, and never replace, a check of the member to the applicable design "
           "code by a qualified engineer.")


def format_value(v: float, digits: int = 6) -> str:
    """A number with ``digits`` significant figures, plain notation where readable.

    Examples
    --------
    >>> format_value(1234.56789), format_value(1.5e-9), format_value(0.0)
    ('1234.57', '1.5e-09', '0')

    """
    if v == 0:
        return "0"
    text = f"{v:.{digits}g}"
    return text


def property_table(result: SectionResult) -> str:
    """The full property table of one result as text, grouped, with symbols and units."""
    v = values(result)
    unit = result.units
    lines = [
        f"Section properties of {result.profile.source}",
        f"  length unit {unit}; mesh of {result.mesh.n_elements} six-node triangles, "
        f"{result.mesh.n_nodes} nodes, element size {result.mesh.size:.3g} {unit}",
    ]
    lines += [f"  note: {n}" for n in result.profile.notes]
    group = None
    for q in QUANTITIES:
        if q.group != group:
            group = q.group
            lines.append("")
            lines.append(f"  {group}")
        lines.append(f"    {q.label:<50} {q.symbol:<8} {format_value(v[q.key]):>14}  "
                     f"{unit_of(q, unit)}")
    lines += ["", f"  {CAUTION}", ""]
    return "\n".join(lines)
