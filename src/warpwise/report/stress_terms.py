"""The one list of what ``warpwise stress`` reports: key, symbol, meaning, definition and unit.

Every key of the stress JSON (loads and results, per material, at given points, per load case)
is here once, with the symbol the text output prints. The HTML page's glossary comes from this
list; the README tables and the text output are checked against it. Group ``section`` is
described in the README under "Stress results", group ``given`` under "A given axis, given
points and several load cases".

Examples
--------
>>> STRESS_TERM_BY_KEY["bimoment"].unit("cm"), STRESS_TERM_BY_KEY["loads"].unit("m")
('kN*cm2', 'N, N*m, N*m2')
"""

from __future__ import annotations

from ..member.terms import Term
from ..units import (
    FORCE,
    LENGTH,
    MOMENT,
    NUMBER,
    STRESS,
    TWIST,
    TWIST_DEG,
    Dimension,
)

_AWAY = "away from sharp re-entrant corners"


def _section(*args, **kw) -> Term:
    return Term(*args, **kw, group="section")


def _given(*args, **kw) -> Term:
    return Term(*args, **kw, group="given")


#: Everything the stress output reports, loads first, then the results.
STRESS_TERMS: tuple[Term, ...] = (
    _section("file", "", "the profile's file", "as given on the command line"),
    _section("units", "", "the unit of each kind of value",
             "`length`, `force`, `moment`, `stress`, `twist_rate`, `twist_rate_deg`"),
    _section("torque", "T", "torque", "about the shear-centre axis", MOMENT),
    _section("shear_x", "Vx", "shear force along x", "through the shear centre", FORCE),
    _section("shear_y", "Vy", "shear force along y", "through the shear centre", FORCE),
    _section("axial", "N", "axial force", "through the modulus-weighted centroid, tension "
             "positive", FORCE),
    _section("moment_x", "Mx", "moment about x", "about the centroidal x axis", MOMENT),
    _section("moment_y", "My", "moment about y", "about the centroidal y axis", MOMENT),
    _given("bimoment", "B", "bimoment", "as given (`--bimoment`, e.g. the B of `warpwise "
           "member`); B = -E Cw phi''", Dimension(2, 1)),
    _given("Cw", "Cw", "warping constant", "integral of omega^2 dA, omega about the shear "
           "centre", Dimension(6)),
    _given("sigma_w", "sigma_w", "largest warping normal stress",
           f"-B omega / Cw of largest magnitude (signed), {_AWAY}", STRESS,
           formula="-B omega/Cw"),
    _given("sigma_w_at", "", "where sigma_w is", "[x, y], drawing coordinates; null "
           "without a bimoment", LENGTH),
    _section("shear_modulus", "G", "shear modulus", "G used for the twist", STRESS),
    _section("poisson", "nu", "Poisson's ratio", "of the shear functions", NUMBER),
    _section("J", "J", "torsion constant", "Saint-Venant torsion constant of the section",
             Dimension(4)),
    _section("shear_centre", "", "shear centre", "[x, y], drawing coordinates", LENGTH),
    _section("tau_max", "tau_max", "largest shear stress",
             f"largest resultant shear stress sqrt(tau_zx^2 + tau_zy^2), {_AWAY}", STRESS),
    _section("tau_max_at", "", "where tau_max is", "[x, y], drawing coordinates", LENGTH),
    _section("corners", "", "sharp re-entrant corners",
             "each corner's `at` [x, y], `angle_deg` and `excluded_radius`, the disc (half the "
             "local wall thickness) left out of every largest stress", unit_text="{L}, deg, {L}"),
    _section("tau_max_torsion", "tau_T", "largest shear stress, torque alone",
             f"of the torque alone, {_AWAY}", STRESS),
    _section("tau_max_shear", "tau_V", "largest shear stress, forces alone",
             "of the shear forces alone", STRESS),
    _section("twist_rate", "theta", "twist rate", "T / (G J)", TWIST, formula="T/(G J)"),
    _section("twist_rate_deg", "theta", "twist rate, degrees",
             "T / (G J) in degrees per metre (per foot in the in and ft systems)", TWIST_DEG),
    _section("von_mises_max", "sigma_vm", "largest von Mises stress",
             f"sqrt(sigma_z^2 + 3 tau^2), {_AWAY}", STRESS),
    _section("von_mises_max_at", "", "where sigma_vm is", "[x, y], drawing coordinates",
             LENGTH),
    _section("warnings", "", "doubts about the input", "one text each"),
    _section("materials", "", "the results of each material",
             "list of `material`, `sigma_max`, `tau_max`, `von_mises_max`, `von_mises_at`, "
             "`fy`, `utilisation` and the signed extremes", unit_text="as each value"),
    _given("material", "", "the material", "its name; null (or empty) for a section without "
           "materials"),
    _given("sigma_max", "sigma", "largest normal stress |sigma_z|",
           "of the material (linear in x and y: no corner left out)", STRESS),
    _given("von_mises_at", "", "where the material's sigma_vm is", "[x, y]", LENGTH),
    _given("fy", "fy", "yield strength", "of the material; null when not known", STRESS),
    _given("utilisation", "u", "von Mises / fy",
           "sigma_vm / fy, informative, not a code check; null without fy", NUMBER),
    _given("sigma_tension", "sigma_t", "most tensile normal stress (signed)",
           "largest nodal sigma_z of the material (below zero when all of it is compressed)",
           STRESS),
    _given("sigma_tension_at", "", "where sigma_t is", "[x, y], a node", LENGTH),
    _given("sigma_compression", "sigma_c", "most compressive normal stress (signed)",
           "smallest nodal sigma_z of the material", STRESS),
    _given("sigma_compression_at", "", "where sigma_c is", "[x, y], a node", LENGTH),
    _given("at_points", "", "the stresses at the points of `--at`",
           "list of `point`, `material`, `sigma`, `tau_zx`, `tau_zy`, `tau`, `von_mises`",
           unit_text="{L}, {S}"),
    _given("point", "", "the point", "[x, y] as given", LENGTH),
    _given("sigma", "sigma_z", "normal stress", "N/A + bending, tension positive, in the "
           "element holding the point", STRESS),
    _given("tau_zx", "tau_zx", "shear stress along x", "torsion and shear together", STRESS),
    _given("tau_zy", "tau_zy", "shear stress along y", "torsion and shear together", STRESS),
    _given("tau", "tau", "resultant shear stress", "sqrt(tau_zx^2 + tau_zy^2)", STRESS),
    _given("von_mises", "sigma_vm", "von Mises stress", "sqrt(sigma_z^2 + 3 tau^2)", STRESS),
    _given("load_cases", "", "the load-case file", "as given to `--load-cases`"),
    _given("cases", "", "one result per case and material",
           "list of `case`, `material`, `loads`, the signed extremes, `tau_max`, "
           "`von_mises_max` (each with its point) and `utilisation`", unit_text="as each value"),
    _given("case", "", "the case's name", "the first column of its line"),
    _given("loads", "", "the case's loads", "`N`, `Vx`, `Vy` (force), `Mx`, `My`, `T` "
           "(moment) and `B` (bimoment), in the report's units", unit_text="{F}, {M}, {F}*{L}2"),
)

STRESS_TERM_BY_KEY = {t.key: t for t in STRESS_TERMS}

#: The loads of a load case (keys of its ``loads``) and the keys of the same loads above.
CASE_LOADS = {"N": "axial", "Mx": "moment_x", "My": "moment_y", "Vx": "shear_x",
              "Vy": "shear_y", "T": "torque", "B": "bimoment"}

__all__ = ["CASE_LOADS", "STRESS_TERMS", "STRESS_TERM_BY_KEY"]
