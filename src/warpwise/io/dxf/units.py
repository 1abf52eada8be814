"""The length unit of a drawing: ``--units``, else the header's ``$INSUNITS``, else millimetres.

Coordinates are converted to one of the profile's length units
(:data:`warpwise.geometry.LENGTH_UNITS`) while the entities are read; :func:`resolve_units`
says which and by what factor.
"""

from __future__ import annotations

from dataclasses import dataclass

from ...errors import InputFileError, UsageError
from ...geometry.profile import LENGTH_UNITS

#: $INSUNITS codes: (name, profile unit, factor to that unit); None where not supported.
INSUNITS: dict[int, tuple[str, tuple[str, float] | None]] = {
    1: ("inches", ("in", 1.0)), 2: ("feet", ("ft", 1.0)), 3: ("miles", None),
    4: ("millimetres", ("mm", 1.0)), 5: ("centimetres", ("cm", 1.0)), 6: ("metres", ("m", 1.0)),
    7: ("kilometres", ("m", 1000.0)), 8: ("microinches", ("in", 1e-6)), 9: ("mils", ("in", 1e-3)),
    10: ("yards", ("ft", 3.0)), 11: ("angstroms", ("mm", 1e-7)), 12: ("nanometres", ("mm", 1e-6)),
    13: ("micrometres", ("mm", 1e-3)), 14: ("decimetres", ("cm", 10.0)),
    15: ("decametres", ("m", 10.0)), 16: ("hectometres", ("m", 100.0)),
    17: ("gigametres", None), 18: ("astronomical units", None), 19: ("light years", None),
    20: ("parsecs", None),
}

@dataclass(frozen=True)
class Units:
    """The length unit of a drawing and where it came from.

    Attributes
    ----------
    unit : str
        Profile length unit, a key of :data:`warpwise.geometry.LENGTH_UNITS`.
    factor : float
        Drawing coordinates times this give lengths in ``unit``.
    origin : str
        ``option``, ``header`` or ``assumed``.
    note : str
        One line saying so.
    """

    unit: str
    factor: float
    origin: str
    note: str


def resolve_units(insunits: int | None, override: str | None, *, file: str | None = None) -> Units:
    """Length unit from ``--units`` or the drawing's ``$INSUNITS``, else millimetres.

    Parameters
    ----------
    insunits : int or None
        The header's ``$INSUNITS`` code (None when absent).
    override : str or None
        A unit given by the user; the coordinates are then taken as that unit as they are.
    file : str, optional
        Named in messages.

    Returns
    -------
    Units

    Examples
    --------
    >>> resolve_units(1, None).unit, resolve_units(1, "mm").unit, resolve_units(None, None).origin
    ('in', 'mm', 'assumed')
    >>> resolve_units(10, None).unit, resolve_units(10, None).factor
    ('ft', 3.0)

    """
    if override is not None:
        if override not in LENGTH_UNITS:
            raise UsageError(f"unknown length unit {override!r} (use {', '.join(LENGTH_UNITS)})")
        return Units(override, 1.0, "option", f"length unit {override}, as given by --units")
    if insunits in INSUNITS:
        name, target = INSUNITS[insunits]
        if target is None:
            raise InputFileError(
                f"the drawing's unit is {name} ($INSUNITS = {insunits}), which warpwise does not "
                f"use; give the unit of the coordinates with --units", file=file)
        unit, factor = target
        if factor == 1.0:
            note = f"length unit {unit}, from the drawing header ($INSUNITS = {insunits})"
        else:
            note = (f"drawing in {name} ($INSUNITS = {insunits}), converted to {unit} "
                    f"(x {factor:g})")
        return Units(unit, factor, "header", note)
    said = "says unitless ($INSUNITS = 0)" if insunits == 0 else (
        "does not say" if insunits is None else f"has an unknown $INSUNITS = {insunits}")
    return Units("mm", 1.0, "assumed", f"length unit not known (the drawing {said}): "
                                       "millimetres assumed")
