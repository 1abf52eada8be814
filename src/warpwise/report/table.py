"""Readable property table for a terminal or a text report."""

from __future__ import annotations

from typing import TYPE_CHECKING

from ..geometry.corners import Corner
from ..units import system
from .quantities import QUANTITIES, error_of, table_shows, unit_of

if TYPE_CHECKING:
    from .records import Record

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


def corner_note(corner: Corner, length: str) -> str:
    """The note on a sharp re-entrant corner, in the one wording every report uses.

    Parameters
    ----------
    corner : Corner
        The corner: location and interior angle (degrees), and the radius left out of the
        stress maxima (length unit; 0 when not measured).
    length : str
        Length unit of the coordinates and the radius, e.g. ``mm``.

    Returns
    -------
    str
        One line of plain text, no final full stop.

    Examples
    --------
    >>> from warpwise.geometry.corners import Corner
    >>> corner_note(Corner(2.0, 2.0, 270.0, 0.2), "mm")  # doctest: +NORMALIZE_WHITESPACE
    'sharp re-entrant corner (270 deg) at (2, 2) mm: the stress there is mesh-dependent
    (unbounded in theory) and left out of the largest stress within 0.2 mm; give the fillet
    radius for a real value'

    """
    where = f"({format_value(corner.x)}, {format_value(corner.y)}) {length}"
    within = f" within {format_value(corner.radius)} {length}" if corner.radius > 0 else ""
    return (f"sharp re-entrant corner ({corner.angle_deg:.0f} deg) at {where}: the stress there "
            f"is mesh-dependent (unbounded in theory) and left out of the largest stress{within}; "
            "give the fillet radius for a real value")


def property_table(rec: Record) -> str:
    """The full property table of one profile as text, grouped, with symbols and units.

    Parameters
    ----------
    rec : Record
        The profile's values, in the unit system they are printed in (``rec.units``; see
        :meth:`~warpwise.report.records.Record.in_units`).

    With an error estimate, a last column gives the estimated relative error of each value
    (for shear-centre coordinates: relative to the profile's size).
    """
    v = rec.values
    unit = rec.units
    lines = [
        f"Section properties of {rec.source}",
        f"  unit system {system_text(unit)}; mesh of {rec.elements} six-node triangles, "
        f"{rec.nodes} nodes, largest element size {rec.mesh_size:.3g} {unit}",
    ]
    lines += [f"  WARNING: {w}" for w in rec.warnings]
    lines += [f"  note: {n}" for n in rec.remarks]
    group = None
    for q in QUANTITIES:
        if not table_shows(v, q.key):
            continue
        if q.group != group:
            group = q.group
            lines.append("")
            head = f"  {group}"
            if rec.errors is not None:
                head = f"{head:<82}est. rel. error"
            lines.append(head)
        row = f"    {q.label:<50} {q.symbol:<9} {format_value(v[q.key]):>14}  {unit_of(q, unit):<5}"
        err = error_of(rec.errors, q.key)
        if err is not None:
            row += f" {err:9.1e}"
        lines.append(row.rstrip())
    lines += ["", f"  {CAUTION}", ""]
    return "\n".join(lines)


def system_text(units: str) -> str:
    """One phrase naming a unit system's units, e.g. ``mm, N, MPa, kg/m``.

    Examples
    --------
    >>> system_text("in")
    'in, lbf, psi, lb/ft'
    """
    s = system(units)
    return f"{s.length}, {s.force}, {s.stress}, {s.linear_mass}"
