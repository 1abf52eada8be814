"""The one list of reported quantities: symbol, meaning, unit and where its value comes from.

Table, CSV, JSON and the glossary all read this list, so a quantity is named and explained in
one place. ``power`` is the exponent of the length unit L (0 for angles and counts).
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass
from typing import Any

import numpy as np

from ..properties.accuracy import ERROR_OF_QUANTITY
from ..properties.analysis import SectionResult
from ..properties.shear import POISSON_SHEAR_SPREAD
from ..units import (
    ANGLE,
    AREA,
    DENSITY,
    FORCE,
    LENGTH,
    LINEAR_MASS,
    STRESS,
    SURFACE,
    Dimension,
    system,
    twist_in_degrees,
)


@dataclass(frozen=True)
class Quantity:
    """One reported quantity.

    Attributes
    ----------
    key : str
        Name in JSON and the CSV header (with the unit).
    symbol : str
        Trade symbol shown in the table.
    label : str
        Plain-English name.
    power : int
        Exponent of the length unit (2 for an area, 4 for a second moment...); -1 for degrees.
    group : str
        Heading the quantity is shown under.
    definition : str
        Definition or formula, for the glossary.
    kind : str
        ``length`` (unit L^power), or a force-based unit: ``force`` (F), ``stiffness``
        (F L^power), ``moment`` (F L), ``stress`` (F/L^2), ``mass`` (mass per length, kg/m or
        lb/ft), ``twist_per_torque`` (deg/m per moment unit), ``surface`` (area per length,
        m2/m or ft2/ft); the units are those of the unit system (:mod:`warpwise.units`).

    """

    key: str
    symbol: str
    label: str
    power: int
    group: str
    definition: str
    kind: str = "length"

    @property
    def dimension(self) -> Dimension:
        """What the quantity measures, for unit texts and conversions (:mod:`warpwise.units`)."""
        if self.kind == "length":
            return ANGLE if self.power == DEG else Dimension(self.power)
        if self.kind == "force":
            return FORCE
        if self.kind == "stress":
            return STRESS
        if self.kind == "mass":
            return LINEAR_MASS
        if self.kind in ("twist_per_torque", "surface"):
            return Dimension(kind=self.kind)
        return Dimension(self.power, 1)  # stiffness and moment: force x length^power


DEG = -1  # marker: the unit is degrees

#: Every reported quantity under its heading, in the order shown: (key, symbol, label, power,
#: definition) and, for a force-based unit, the kind (see :class:`Quantity`).
_TABLE: dict[str, tuple[tuple, ...]] = {
    "Geometry": (
        ("A", "A", "area", 2, "integral of dA"),
        ("xc", "xc", "centroid, x", 1, "integral of x dA / A, drawing coordinates"),
        ("yc", "yc", "centroid, y", 1, "integral of y dA / A, drawing coordinates"),
    ),
    "Outline": (
        ("width", "b", "overall width", 1, "xmax - xmin, the true arcs and ellipses included"),
        ("height", "h", "overall height", 1, "ymax - ymin, the true arcs and ellipses included"),
        ("c_top", "c,y+", "extreme fibre above the centroid", 1, "ymax - yc"),
        ("c_bottom", "c,y-", "extreme fibre below the centroid", 1, "yc - ymin"),
        ("c_right", "c,x+", "extreme fibre right of the centroid", 1, "xmax - xc"),
        ("c_left", "c,x-", "extreme fibre left of the centroid", 1, "xc - xmin"),
        ("perimeter_outer", "P,out", "outer perimeter", 1,
         "length of the outer outline: exact on recorded arcs, the drawn sides elsewhere"),
        ("perimeter_total", "P", "total perimeter, holes included", 1,
         "outer perimeter plus the edges of the holes (material interfaces left out)"),
        ("surface", "S", "surface per length (coating)", 0,
         "total perimeter x 1 m (or 1 ft): m2/m (ft2/ft)", "surface"),
        ("t_min", "t,min", "minimum wall thickness", 1,
         "smallest distance across the material along the inward normal of its outline"),
        ("t_min_x", "x(t,min)", "position of the thinnest wall, x", 1,
         "middle of the thinnest crossing, drawing coordinates"),
        ("t_min_y", "y(t,min)", "position of the thinnest wall, y", 1, "as x(t,min)"),
    ),
    "Bending": (
        ("Ix", "Ix", "second moment about centroidal x axis", 4, "integral of y^2 dA, y from the centroid"),
        ("Iy", "Iy", "second moment about centroidal y axis", 4, "integral of x^2 dA, x from the centroid"),
        ("Ixy", "Ixy", "product moment", 4, "integral of x y dA about the centroid"),
        ("I1", "I1", "major principal second moment", 4, "(Ix + Iy)/2 + sqrt(((Ix - Iy)/2)^2 + Ixy^2)"),
        ("I2", "I2", "minor principal second moment", 4, "(Ix + Iy)/2 - sqrt(((Ix - Iy)/2)^2 + Ixy^2)"),
        ("alpha_deg", "alpha", "angle from +x to major axis 1", DEG,
         "0.5 atan2(-2 Ixy, Ix - Iy), counter-clockwise positive"),
        ("Ip", "Ip", "polar second moment about the centroid", 4, "Ix + Iy"),
        ("rx", "rx", "radius of gyration about x", 1, "sqrt(Ix / A)"),
        ("ry", "ry", "radius of gyration about y", 1, "sqrt(Iy / A)"),
        ("r1", "r1", "radius of gyration about axis 1", 1, "sqrt(I1 / A)"),
        ("r2", "r2", "radius of gyration about axis 2", 1, "sqrt(I2 / A)"),
        ("Wel_x_top", "Wel,x+", "elastic modulus about x, fibre at largest y", 3, "Ix / (ymax - yc)"),
        ("Wel_x_bottom", "Wel,x-", "elastic modulus about x, fibre at smallest y", 3, "Ix / (yc - ymin)"),
        ("Wel_y_right", "Wel,y+", "elastic modulus about y, fibre at largest x", 3, "Iy / (xmax - xc)"),
        ("Wel_y_left", "Wel,y-", "elastic modulus about y, fibre at smallest x", 3, "Iy / (xc - xmin)"),
        ("Wel_1_pos", "Wel,1+", "elastic modulus about axis 1, fibre on the +2 side", 3,
         "I1 / largest distance from axis 1 on the side of +axis 2"),
        ("Wel_1_neg", "Wel,1-", "elastic modulus about axis 1, fibre on the -2 side", 3,
         "I1 / largest distance from axis 1 on the side of -axis 2"),
        ("Wel_2_pos", "Wel,2+", "elastic modulus about axis 2, fibre on the +1 side", 3,
         "I2 / largest distance from axis 2 on the side of +axis 1"),
        ("Wel_2_neg", "Wel,2-", "elastic modulus about axis 2, fibre on the -1 side", 3,
         "I2 / largest distance from axis 2 on the side of -axis 1"),
    ),
    "Torsion and warping": (
        ("J", "J", "Saint-Venant torsion constant", 4,
         "Ix + Iy - integral of (y dpsi/dx - x dpsi/dy) dA; T = G J theta"),
        ("J_low", "J_low", "guaranteed lower bound on J", 4,
         "-int (2 sigma . (y, -x) + |sigma|^2 / c) dA, sigma the equilibrated flux of the "
         "warping stress (straight-sided meshes, c = G / G_ref); 2 int phi dA + 2 sum c_k A_k, "
         "Prandtl phi, on meshes with curved elements (one material); same mesh, "
         "J_low <= J(exact) <= J"),
        ("Wt", "Wt", "torsional section modulus", 3,
         "T / tau_max, tau_max of the Saint-Venant stress field away from sharp re-entrant corners"),
        ("r_corner", "r,corner", "radius left out around sharp re-entrant corners", 1,
         "half the material depth at the corner (its shortest crossing of the material, the "
         "wall thickness at a thin wall's inside corner), the largest over the corners; Wt and "
         "every largest stress are taken outside; not given without sharp corners"),
        ("xs", "xs", "shear centre, x", 1,
         "Trefftz: point about which the warping function is orthogonal to x and y"),
        ("ys", "ys", "shear centre, y", 1, "as xs, drawing coordinates"),
        ("Cw", "Cw", "warping constant", 6,
         "integral of omega^2 dA, omega the zero-mean warping function about the shear centre"),
        ("omega_max", "omega_max", "largest sectorial coordinate |omega|", 2,
         "max |omega| over the section; warping stress E omega theta'"),
        ("beta_1", "beta_1", "Wagner (mono-symmetry) constant, axis 1", 1,
         "integral of v (u^2 + v^2) dA / I1 - 2 v_s (u, v along axes 1, 2)"),
        ("beta_2", "beta_2", "Wagner (mono-symmetry) constant, axis 2", 1,
         "integral of u (u^2 + v^2) dA / I2 - 2 u_s"),
        ("xs0", "xs0", "shear centre from the centroid, x", 1,
         "xs - xc (the modulus-weighted xe for a composite section)"),
        ("ys0", "ys0", "shear centre from the centroid, y", 1, "ys - yc (ye for a composite)"),
        ("i0", "i0", "polar radius of gyration about the shear centre", 1,
         "sqrt((Ix + Iy) / A + xs0^2 + ys0^2), for torsional and flexural-torsional buckling"),
    ),
    "Plastic": (
        ("pna_y", "ypl", "height of the horizontal plastic neutral axis", 1,
         "y of the line parallel to x that halves the area"),
        ("pna_x", "xpl", "position of the vertical plastic neutral axis", 1,
         "x of the line parallel to y that halves the area"),
        ("Wpl_x", "Wpl,x", "plastic modulus, bending about x", 3, "integral of |y - ypl| dA"),
        ("Wpl_y", "Wpl,y", "plastic modulus, bending about y", 3, "integral of |x - xpl| dA"),
        ("Wpl_1", "Wpl,1", "plastic modulus, bending about axis 1", 3,
         "as Wpl,x with the neutral axis parallel to axis 1"),
        ("Wpl_2", "Wpl,2", "plastic modulus, bending about axis 2", 3,
         "as Wpl,x with the neutral axis parallel to axis 2"),
        ("shape_x", "Wpl/Wel,x", "shape factor about x", 0, "Wpl,x / min(Wel,x+, Wel,x-)"),
        ("shape_y", "Wpl/Wel,y", "shape factor about y", 0, "Wpl,y / min(Wel,y+, Wel,y-)"),
    ),
    "Shear": (
        ("nu", "nu", "Poisson's ratio used for shear", 0,
         "of the shear stresses, the elastic shear centre and kx,nu, ky,nu; from the material, "
         "else 0.3"),
        ("xse", "xse", "elastic shear centre, x", 1, "point where Vy causes no twist (shear functions)"),
        ("yse", "yse", "elastic shear centre, y", 1, "point where Vx causes no twist (shear functions)"),
        ("As_x", "As,x", "shear area for a force along x", 2,
         "Timoshenko beam shear area: 1 / integral of tau.tau dA for a unit Vx, tau the flexure "
         "field of Poisson's ratio 0 (the flow that carries V; Renton 1991)"),
        ("As_y", "As,y", "shear area for a force along y", 2,
         "as As,x for a unit Vy"),
        ("kappa_x", "kx", "shear coefficient along x", 0,
         "As,x / A (5/6 for a rectangle, 6/7 for a solid circle: Cowper 1966 at nu = 0)"),
        ("kappa_y", "ky", "shear coefficient along y", 0, "As,y / A"),
        ("As_1", "As,1", "shear area for a force along axis 1", 2,
         "as As,x for a unit force along axis 1"),
        ("As_2", "As,2", "shear area for a force along axis 2", 2,
         "as As,x for a unit force along axis 2"),
        ("kappa_x_poisson", "kx,nu", "energy shear coefficient with nu, along x", 0,
         "1 / (A integral of tau.tau dA) of the flexure field with nu: adds the shear stresses of "
         "the section's anticlastic curling in bending, which are no shear of the beam; falls "
         "with the width across the force (0.18 for a 100 x 10 rectangle sheared across its "
         "thickness at nu = 0.3); the table shows it where it differs from kx by over 20 %"),
        ("kappa_y_poisson", "ky,nu", "energy shear coefficient with nu, along y", 0,
         "as kx,nu for a unit Vy"),
    ),
    "Materials": (
        ("E_ref", "Eref", "Young's modulus of the reference material", 0,
         "transformed properties are referred to this material", "stress"),
        ("xe", "xe", "modulus-weighted centroid, x", 1, "integral of E x dA / EA"),
        ("ye", "ye", "modulus-weighted centroid, y", 1, "integral of E y dA / EA"),
        ("EA", "EA", "axial stiffness", 0, "integral of E dA", "force"),
        ("EIx", "EIx", "bending stiffness about the x axis", 2,
         "integral of E y^2 dA about the modulus-weighted centroid", "stiffness"),
        ("EIy", "EIy", "bending stiffness about the y axis", 2, "integral of E x^2 dA", "stiffness"),
        ("EIxy", "EIxy", "product stiffness", 2, "integral of E x y dA", "stiffness"),
        ("EI1", "EI1", "major principal bending stiffness", 2,
         "principal value of the E-weighted second moments", "stiffness"),
        ("EI2", "EI2", "minor principal bending stiffness", 2,
         "principal value of the E-weighted second moments", "stiffness"),
        ("GJ", "GJ", "torsional stiffness", 2, "G-weighted Saint-Venant torsion: T = GJ theta", "stiffness"),
        ("twist_per_torque", "theta/T", "twist per unit torque, degrees", 0,
         "1 / GJ in degrees per metre (per foot in the in and ft systems) per moment unit",
         "twist_per_torque"),
        ("ECw", "ECw", "warping stiffness", 4,
         "integral of E omega^2 dA, omega about the shear centre", "stiffness"),
        ("Mpl_x", "Mpl,x", "plastic moment about x", 1,
         "integral of fy |y - ypl| dA, ypl balancing fy over the section", "moment"),
        ("Mpl_y", "Mpl,y", "plastic moment about y", 1, "integral of fy |x - xpl| dA", "moment"),
        ("mass", "m", "mass per length", 0, "sum of density x area (per metre or per foot)", "mass"),
    ),
}

QUANTITIES: tuple[Quantity, ...] = tuple(
    Quantity(key, symbol, label, power, group, definition, *kind)
    for group, rows in _TABLE.items() for key, symbol, label, power, definition, *kind in rows
)

QUANTITY_BY_KEY = {q.key: q for q in QUANTITIES}


#: Quantities a table or datasheet shows only where they differ from the one named (by more
#: than :data:`~warpwise.properties.shear.POISSON_SHEAR_SPREAD`); CSV and JSON always hold them.
SHOWN_WHEN_DIFFERENT = {"kappa_x_poisson": "kappa_x", "kappa_y_poisson": "kappa_y"}


def differs(values: Mapping[str, float], key: str) -> bool:
    """True when a quantity of :data:`SHOWN_WHEN_DIFFERENT` differs enough to be shown.

    Examples
    --------
    >>> differs({"kappa_y": 0.833, "kappa_y_poisson": 0.179}, "kappa_y_poisson")
    True
    >>> differs({"kappa_y": 0.833, "kappa_y_poisson": 0.80}, "kappa_y_poisson")
    False
    """
    base = values[SHOWN_WHEN_DIFFERENT[key]]
    return bool(abs(values[key] / base - 1.0) > POISSON_SHEAR_SPREAD)


def table_shows(values: Mapping[str, float], key: str) -> bool:
    """True for a quantity a table or datasheet shows: computed, and not a near-copy of another."""
    if not np.isfinite(values[key]):
        return False
    return key not in SHOWN_WHEN_DIFFERENT or differs(values, key)


def shear_notes(values: Mapping[str, float]) -> tuple[str, ...]:
    """Why the energy shear coefficient with Poisson's ratio is shown beside the beam's.

    One note for each direction where :func:`differs`; none otherwise.
    """
    out = []
    for key, base in SHOWN_WHEN_DIFFERENT.items():
        if np.isfinite(values[key]) and differs(values, key):
            q, b = QUANTITY_BY_KEY[key], QUANTITY_BY_KEY[base]
            out.append(
                f"{q.symbol} = {values[key]:.3g} (the energy of the whole flexure field with "
                f"nu = {values['nu']:.3g}) against {b.symbol} = {values[base]:.3g}: the difference "
                "is the shear stress of the section's anticlastic curling under bending (Poisson's "
                f"ratio), which a wide section across the force has and which is no shear "
                f"deformation of the beam; a Timoshenko beam takes {b.symbol} and its shear area")
    return tuple(out)


def unit_of(q: Quantity, length: str) -> str:
    """Unit text of a quantity in the unit system of a length unit, e.g. ``mm4``, ``deg``."""
    return system(length).text(q.dimension)


def values(result: SectionResult) -> dict[str, float]:
    """Flat dictionary of every quantity in :data:`QUANTITIES` for one result.

    A quantity that was not computed (the bound on J without ``bounds``) is nan.
    """
    g, t = result.geometric, result.torsion
    out: dict[str, Any] = {
        "A": g.A, "xc": g.centroid[0], "yc": g.centroid[1],
        "Ix": g.Ix, "Iy": g.Iy, "Ixy": g.Ixy, "I1": g.I1, "I2": g.I2, "alpha_deg": g.alpha_deg,
        "Ip": g.Ip, "rx": g.rx, "ry": g.ry, "r1": g.r1, "r2": g.r2,
        "J": t.J, "xs": t.shear_centre[0], "ys": t.shear_centre[1], "Cw": t.Cw,
        "omega_max": t.omega_max, "beta_1": t.beta_1, "beta_2": t.beta_2,
        "J_low": float("nan") if t.J_low is None else t.J_low,
    }
    out.update(_outline_values(result))
    b, wt = result.buckling, result.torsion_modulus
    out.update({"xs0": b.xs0, "ys0": b.ys0, "i0": b.i0,
                "Wt": float("nan") if wt is None else wt.Wt,
                "r_corner": max((c.radius for c in result.corners), default=float("nan"))})
    sh = result.shear
    out.update({
        "nu": sh.poisson, "xse": sh.shear_centre[0], "yse": sh.shear_centre[1],
        "As_x": sh.As_x, "As_y": sh.As_y, "kappa_x": sh.kappa_x, "kappa_y": sh.kappa_y,
        "As_1": sh.As_1, "As_2": sh.As_2, "kappa_x_poisson": sh.kappa_x_poisson,
        "kappa_y_poisson": sh.kappa_y_poisson,
    })
    for k, v in g.Wel.items():
        if "_" in k:
            out[f"Wel_{k}"] = v
    nan = float("nan")
    pl = result.plastic
    out.update({"pna_y": nan, "pna_x": nan, "Wpl_x": nan, "Wpl_y": nan, "Wpl_1": nan,
                "Wpl_2": nan, "shape_x": nan, "shape_y": nan})
    if pl is not None:
        out.update({"pna_y": pl.pna_y, "pna_x": pl.pna_x, "Wpl_x": pl.Wpl_x, "Wpl_y": pl.Wpl_y,
                    "Wpl_1": pl.Wpl_1, "Wpl_2": pl.Wpl_2, "shape_x": pl.Wpl_x / g.Wel["x"],
                    "shape_y": pl.Wpl_y / g.Wel["y"]})
    out.update(_material_values(result))
    _zero_round_off(out, result.profile.size, result.cw_round_off)
    return {q.key: float(out[q.key]) for q in QUANTITIES}


#: Relative size below which a value that is zero by symmetry is round-off and printed as 0
#: (common practice, no source): 1e-12 of the section's size for exact integrals, 1e-9 for
#: values from the finite-element solves (their relative residual is checked to 1e-8).
EXACT_ROUND_OFF, SOLVED_ROUND_OFF = 1e-12, 1e-9


def _zero_round_off(out: dict[str, float], size: float, cw_tiny: float) -> None:
    """Set to 0 every value that is round-off relative to the section's size (in place).

    Coordinates against the size; product moments against the polar moments; omega against
    size^2 and Cw against ``cw_tiny`` (:attr:`SectionResult.cw_round_off`).
    """
    omega_tiny = EXACT_ROUND_OFF * size**2
    scale = {**dict.fromkeys(("xc", "yc", "xe", "ye", "pna_x", "pna_y", "t_min_x", "t_min_y"),
                             EXACT_ROUND_OFF * size),
             **dict.fromkeys(("xs", "ys", "xse", "yse", "beta_1", "beta_2", "xs0", "ys0"),
                             SOLVED_ROUND_OFF * size),
             "Ixy": EXACT_ROUND_OFF * abs(out["Ix"] + out["Iy"]),
             "EIxy": EXACT_ROUND_OFF * abs(out["EIx"] + out["EIy"]),
             "omega_max": omega_tiny, "Cw": cw_tiny,
             "ECw": cw_tiny * abs(out["E_ref"])}
    for key, tiny in scale.items():
        if abs(out[key]) < tiny:  # nan (not computed) stays nan
            out[key] = 0.0


def _outline_values(result: SectionResult) -> dict[str, float]:
    """Overall size, extreme fibres, perimeters, surface and thinnest wall (nan if not found)."""
    fib, nan = result.geometric.fibres, float("nan")
    out = {"c_top": fib["x_top"], "c_bottom": fib["x_bottom"], "c_right": fib["y_right"],
           "c_left": fib["y_left"]}
    out.update(width=out["c_left"] + out["c_right"], height=out["c_top"] + out["c_bottom"])
    p, w = result.perimeters, result.wall
    units = system(result.units)
    out.update({
        "perimeter_outer": nan if p is None else p.outer,
        "perimeter_total": nan if p is None else p.total,
        # the perimeter in metres is the surface in m2 per metre of length
        "surface": nan if p is None else units.from_si(units.to_si(p.total, LENGTH), SURFACE),
        "t_min": nan if w is None else w.t_min,
        "t_min_x": nan if w is None else w.at[0], "t_min_y": nan if w is None else w.at[1],
    })
    return out


def _material_values(result: SectionResult) -> dict[str, float]:
    """Modulus-weighted stiffnesses, plastic moments and mass (nan without a material)."""
    nan = float("nan")
    keys = ("E_ref", "xe", "ye", "EA", "EIx", "EIy", "EIxy", "EI1", "EI2", "GJ", "ECw",
            "Mpl_x", "Mpl_y", "mass", "twist_per_torque")
    m = result.materials
    if m.E_ref is None:
        return dict.fromkeys(keys, nan)
    t, tor, pl = result.weighted, result.torsion, result.plastic
    E, G = m.E_ref, m.G_ref
    units = system(result.units)
    regions = result.profile.regions
    mats = list(m.materials) if len(m.materials) == len(regions) else [m.materials[0]] * len(regions)
    if all(x.density is not None for x in mats):
        # areas of the meshed regions (curved edges included), not of the polygons; kg/m, then
        # the unit system's mass per length
        area = result.region_areas
        kg_per_m = sum(units.to_si(x.density, DENSITY) * units.to_si(a, AREA)
                       for x, a in zip(mats, area, strict=True))
        mass = units.from_si(float(kg_per_m), LINEAR_MASS)
    else:
        mass = nan
    return {
        "E_ref": E, "xe": t.centroid[0], "ye": t.centroid[1], "EA": E * t.A, "EIx": E * t.Ix,
        "EIy": E * t.Iy, "EIxy": E * t.Ixy, "EI1": E * t.I1, "EI2": E * t.I2, "GJ": G * tor.J,
        "ECw": E * tor.Cw,
        "Mpl_x": nan if pl is None or pl.Mpl_x is None else pl.Mpl_x,
        "Mpl_y": nan if pl is None or pl.Mpl_y is None else pl.Mpl_y, "mass": mass,
        # theta / T = 1 / GJ, rad/L per F L, as degrees per metre (foot) per F L
        "twist_per_torque": twist_in_degrees(1.0 / (G * tor.J), result.units),
    }


def error_of(errors: Mapping[str, float] | None, key: str) -> float | None:
    """Estimated relative error of a quantity from a result's ``errors``, or None."""
    if errors is None or key not in ERROR_OF_QUANTITY:
        return None
    return errors.get(ERROR_OF_QUANTITY[key])
