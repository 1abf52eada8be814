"""The one list of what ``warpwise member`` reports: key, symbol, meaning, definition and unit.

The text legends, the JSON keys, the HTML glossary and the README key table of a member all
come from, or are checked against, :data:`MEMBER_TERMS`. :class:`Term` is also the form of
the list of stress outputs (:mod:`warpwise.report.stress_terms`).

Examples
--------
>>> TERM_BY_KEY["B"].unit("mm"), TERM_BY_KEY["phi2"].unit("m"), TERM_BY_KEY["torques"].unit("mm")
('N*mm2', 'rad/m2', 'N*mm, mm')
>>> TERM_BY_KEY["T_w"].legend
"warping torque -E Cw phi'''"
"""

from __future__ import annotations

from dataclasses import dataclass

from ..units import FORCE, LENGTH, MOMENT, NUMBER, STRESS, Dimension, system


@dataclass(frozen=True)
class Term:
    """One reported key or quantity.

    Attributes
    ----------
    key : str
        Its key in the JSON object.
    symbol : str
        Symbol in the text, the CSV header and the HTML page ("" for a key without one:
        a file name, a list).
    meaning : str
        Plain-English name.
    definition : str
        Definition or formula, for the glossary and the README.
    dimension : Dimension or None
        What the value measures, for conversions (None: text, a flag or a list).
    unit_text : str
        The unit text when it is not that of ``dimension`` alone: a template with ``{L}``
        (length unit), ``{F}`` (force), ``{M}`` (moment) and ``{S}`` (stress), e.g.
        ``rad/{L}2`` or ``{M}, {L}`` for a torque with its position.
    formula : str
        A short formula the text output prints after the meaning ("" for none).
    group : str
        Where the key belongs (the stress list: which README table describes it).
    """

    key: str
    symbol: str
    meaning: str
    definition: str
    dimension: Dimension | None = None
    unit_text: str = ""
    formula: str = ""
    group: str = ""

    def unit(self, units: str) -> str:
        """The unit text in the unit system ``units`` (``-`` for a number or a text).

        Parameters
        ----------
        units : str
            A unit system's name (its length unit, :data:`warpwise.units.SYSTEMS`).
        """
        s = system(units)
        if self.unit_text:
            return self.unit_text.format(L=s.length, F=s.force, M=s.text(MOMENT), S=s.stress)
        return "-" if self.dimension is None else s.text(self.dimension)

    @property
    def legend(self) -> str:
        """The meaning with its short formula, as the text output prints it."""
        return f"{self.meaning} {self.formula}".strip()


#: Everything the member output reports, in the order of its JSON object.
MEMBER_TERMS: tuple[Term, ...] = (
    Term("file", "", "the profile's file", "as given on the command line"),
    Term("units", "", "the unit of each kind of value",
         "`length`, `force`, `torque`, `distributed_torque`, `GJ`, `ECw` and each quantity "
         "along the member by its key"),
    Term("length", "L", "length of the member", "from the end z = 0 to the end z = L", LENGTH),
    Term("ends", "", "the supports at z = 0 and at z = L",
         "each `fixed`, `pinned`, `free` or `warping-fixed`"),
    Term("torques", "T", "point torques",
         "list of `torque` (about the shear-centre axis) and its position `z`", MOMENT,
         "{M}, {L}"),
    Term("distributed_torque", "m", "distributed torque",
         "torque per length over the whole member", FORCE, "{M}/{L}"),
    Term("GJ", "GJ", "torsional stiffness", "G J; T_sv = GJ phi'", Dimension(2, 1)),
    Term("ECw", "ECw", "warping stiffness", "E Cw; B = -ECw phi''", Dimension(4, 1)),
    Term("saint_venant_only", "", "pure Saint-Venant torsion",
         "true when Cw = 0: no bimoment and no warping torque, the warping end conditions "
         "without effect"),
    Term("a", "a", "torsion bending length", "sqrt(ECw / GJ); null when Cw = 0", LENGTH),
    Term("stations", "", "the values at the stations",
         "one list per quantity `z`, `phi` ... `B`, one value per station (at a load point "
         "the value just past it)", unit_text="as each quantity"),
    Term("z", "z", "position along the member", "from the end z = 0", LENGTH),
    Term("phi", "phi", "angle of twist", "rotation of the section about the shear-centre axis",
         NUMBER, "rad"),
    Term("phi1", "phi'", "twist rate", "d phi / dz", Dimension(-1), "rad/{L}"),
    Term("phi2", "phi''", "second derivative of twist", "d2 phi / dz2", Dimension(-2),
         "rad/{L}2"),
    Term("phi3", "phi'''", "third derivative of twist",
         "d3 phi / dz3; jumps at a point torque", Dimension(-3), "rad/{L}3"),
    Term("T_sv", "T_sv", "Saint-Venant torque",
         "G J phi': the part of the torque carried by the shear flow of free warping", MOMENT,
         formula="G J phi'"),
    Term("T_w", "T_w", "warping torque",
         "-E Cw phi''': the part of the torque carried by restrained warping", MOMENT,
         formula="-E Cw phi'''"),
    Term("B", "B", "bimoment", "-E Cw phi''; the warping normal stress is -B omega / Cw",
         Dimension(2, 1), formula="-E Cw phi''"),
    Term("largest", "", "the largest |value| of each quantity",
         "list of `quantity` (a key above), its signed `value` of largest magnitude and where "
         "it is, `z`", unit_text="as the quantity, {L}"),
    Term("stress", "", "the unit of the stresses", "the unit's name", unit_text="{S}"),
    Term("governing_sections", "", "the stresses where |B|, |T_w| and |T_sv| are largest",
         "list of `governs`, `z`, `B`, `T_w`, `T_sv` and the three stresses below with their "
         "points", unit_text="as each value"),
    Term("governs", "", "the quantity largest at that section", "`B`, `T_w` or `T_sv`"),
    Term("sigma_w", "sigma_w", "warping normal stress",
         "-B omega / Cw, the signed value of largest magnitude over the section (away from "
         "sharp re-entrant corners); null when Cw = 0", STRESS, formula="-B omega/Cw"),
    Term("sigma_w_at", "", "where sigma_w is", "[x, y], drawing coordinates", LENGTH),
    Term("tau_w", "tau_w", "warping shear stress",
         "largest |(T_w / Cw) grad chi|, Laplace(chi) = omega; null when Cw = 0", STRESS),
    Term("tau_w_at", "", "where tau_w is", "[x, y], drawing coordinates", LENGTH),
    Term("tau_sv", "tau_sv", "Saint-Venant shear stress",
         "largest resultant shear stress of T_sv, away from sharp re-entrant corners", STRESS),
    Term("tau_sv_at", "", "where tau_sv is", "[x, y]; null where T_sv = 0", LENGTH),
)

TERM_BY_KEY = {t.key: t for t in MEMBER_TERMS}

#: The quantities along a member, in their report order: (key, symbol).
QUANTITIES = tuple((k, TERM_BY_KEY[k].symbol) for k in ("phi", "phi1", "phi2", "phi3", "T_sv",
                                                          "T_w", "B"))

__all__ = ["MEMBER_TERMS", "QUANTITIES", "TERM_BY_KEY", "Term"]
