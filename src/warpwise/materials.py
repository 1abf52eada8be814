"""Materials: elastic constants, strength and density, a small built-in table and TOML tables.

Units: a material's values are in the unit system named by :attr:`Material.system` (see
:mod:`warpwise.units`): the built-ins and every table as read are in the ``mm`` system, moduli and
strengths in MPa (N/mm^2), density in kg/m^3. A TOML table may state other units
(``stress_unit``, ``density_unit``); they are converted on reading. Where a material meets a
profile it is converted once into the profile's unit system (:meth:`Material.in_system`), so
E A comes out in the profile's force unit whatever the drawing's length unit.

The built-in values are generic nominal values for design with the sources named beside each;
they are no substitute for the values of the product standard or the supplier's certificate.

Examples
--------
>>> m = builtin_material("steel-S355")
>>> m.E, m.G, m.fy
(210000.0, 81000.0, 355.0)
"""

from __future__ import annotations

import sys
from collections.abc import Mapping
from dataclasses import dataclass, replace
from pathlib import Path

import numpy as np

from .errors import InputFileError, UsageError
from .textfiles import read_text
from .units import DENSITY, DENSITY_UNITS, STRESS, STRESS_UNITS, convert


def _toml():
    """The TOML parser (imported when a table is read, not at start-up)."""
    if sys.version_info >= (3, 11):
        import tomllib
    else:  # pragma: no cover - Python 3.10
        import tomli as tomllib
    return tomllib


@dataclass(frozen=True)
class Material:
    """An isotropic linear-elastic material.

    Attributes
    ----------
    name : str
        Name used in outlines (``material: NAME``), layer maps and reports.
    E : float
        Young's modulus, stress unit of ``system`` (MPa in the ``mm`` system).
    nu : float
        Poisson's ratio.
    G : float
        Shear modulus, the same unit (E / (2 (1 + nu)) unless given).
    fy : float or None
        Yield or 0.2% proof strength, the same unit.
    density : float or None
        Density, density unit of ``system`` (kg/m^3 in the ``mm`` system).
    source : str
        Where the values come from.
    system : str
        Unit system of the values, a key of :data:`warpwise.units.SYSTEMS`.
    note : str
        A remark for every report that uses it ("" for none): a user table's entry that
        replaces a built-in material says so (:func:`override_note`).
    """

    name: str
    E: float
    nu: float
    G: float
    fy: float | None = None
    density: float | None = None
    source: str = ""
    system: str = "mm"
    note: str = ""

    def in_system(self, system: str) -> Material:
        """The same material with its values in another unit system.

        Examples
        --------
        >>> m = builtin_material("steel-S355").in_system("cm")
        >>> m.E, m.fy, m.density, m.system
        (21000.0, 35.5, 7850.0, 'cm')
        """
        if system == self.system:
            return self

        def stress(v: float | None) -> float | None:
            return None if v is None else convert(v, STRESS, self.system, system)

        density = None if self.density is None else convert(self.density, DENSITY, self.system,
                                                            system)
        return replace(self, E=stress(self.E), G=stress(self.G), fy=stress(self.fy),
                       density=density, system=system)


#: Open interval of Poisson's ratios of an isotropic, stable elastic material (common practice,
#: no source: E > 0 and G > 0 with bulk modulus > 0), and its text in messages.
POISSON_RANGE = (-1.0, 0.5)
POISSON_RANGE_TEXT = "(-1, 0.5)"


def check_poisson(nu: float, what: str = "Poisson's ratio", *, file: str | None = None) -> float:
    """Return ``nu`` as a float when it lies in (-1, 0.5), else raise a UsageError.

    Parameters
    ----------
    nu : float
        Poisson's ratio (dimensionless).
    what : str
        How the value is named in the message.
    file : str, optional
        Source named in the message.

    Examples
    --------
    >>> check_poisson(0.3)
    0.3
    >>> check_poisson(0.5)
    Traceback (most recent call last):
    ...
    warpwise.errors.UsageError: Poisson's ratio must lie in (-1, 0.5), got 0.5
    """
    lo, hi = POISSON_RANGE
    if isinstance(nu, bool) or not isinstance(nu, (int, float, np.floating)) or not lo < nu < hi:
        raise UsageError(f"{what} must lie in {POISSON_RANGE_TEXT}, got {nu}", file=file)
    return float(nu)


def make_material(name: str, E: float, nu: float | None = None, G: float | None = None,
                  fy: float | None = None, density: float | None = None, source: str = "",
                  where: str | None = None) -> Material:
    """Build a checked Material; G from E and nu when not given (MPa, kg/m^3).

    Raises
    ------
    UsageError
        For missing, out-of-range or implausible values, and for E, nu and G given together
        that disagree by more than :data:`G_AGREEMENT` (``where`` names the file or table).
    """
    def bad(msg: str) -> UsageError:
        return UsageError(f"material {name!r}: {msg}", file=where)

    for label, v in (("E", E), ("nu", nu), ("G", G), ("fy", fy), ("density", density)):
        if isinstance(v, bool) or (v is not None and not isinstance(v, (int, float, np.floating))):
            raise bad(f"{label} must be a number, got {v!r}")
        if v is not None and not np.isfinite(v):
            raise bad(f"{label} must be a finite number, got {v}")
    given_nu, given_G = nu, G
    try:
        E = float(E)
        nu = None if nu is None else float(nu)
        G = None if G is None else float(G)
        fy = None if fy is None else float(fy)
        density = None if density is None else float(density)
    except (TypeError, ValueError):
        raise bad("values must be numbers") from None
    if not E > 0 or E != E:
        raise bad(f"E must be positive, got {E}")
    if nu is None and G is None:
        raise bad("give Poisson's ratio nu or the shear modulus G")
    if G is None:
        check_poisson(nu, f"material {name!r}: Poisson's ratio", file=where)
        G = E / (2.0 * (1.0 + nu))
    elif nu is None:
        nu = E / (2.0 * G) - 1.0
    if not G > 0:
        raise bad(f"G must be positive, got {G}")
    if not POISSON_RANGE[0] < nu < POISSON_RANGE[1]:
        # the same range as check_poisson, said of the value that E and G imply
        raise bad(f"E and G give Poisson's ratio {nu:.3f}, outside {POISSON_RANGE_TEXT}")
    if fy is not None and not fy > 0:
        raise bad(f"fy must be positive, got {fy}")
    if density is not None and not density > 0:
        raise bad(f"density must be positive, got {density}")
    if given_nu is not None and given_G is not None:
        implied = E / (2.0 * (1.0 + given_nu))
        if abs(given_G - implied) > G_AGREEMENT * implied:
            raise bad(f"E = {E:g} MPa, nu = {given_nu:g} and G = {given_G:g} MPa contradict each "
                      f"other (E / (2 (1 + nu)) = {implied:.6g} MPa): give two of the three")
    for label, v in (("E", E), ("G", G), ("fy", fy), ("density", density)):
        check_plausible(label, v, where=f"material {name!r}", file=where)
    return Material(name, E, nu, G, fy, density, source)


#: Largest relative difference between a given G and E / (2 (1 + nu)) accepted (common practice,
#: no source: the rounding of tabulated values).
G_AGREEMENT = 0.01

#: Plausible ranges of material values of solids, (low, high, unit) (from memory: the softest
#: foams and gels near 1 kPa to diamond near 1.2e6 MPa for moduli; strengths of the strongest
#: wires below 2e4 MPa; densities from light foams near 1 kg/m^3 to osmium near 22600 kg/m^3).
PLAUSIBLE = {"E": (1e-3, 2e6, "MPa"), "G": (1e-3, 2e6, "MPa"), "fy": (1e-3, 2e4, "MPa"),
             "density": (1.0, 25000.0, "kg/m3")}


def check_plausible(label: str, value: float | None, *, where: str = "",
                    file: str | None = None) -> None:
    """Refuse a material value outside :data:`PLAUSIBLE` (None passes).

    Parameters
    ----------
    label : str
        ``E``, ``G`` or ``fy`` (value in MPa) or ``density`` (kg/m^3).
    value : float or None
        The value.
    where : str
        What it belongs to, for the message.
    file : str, optional
        Source named in the message.

    Examples
    --------
    >>> check_plausible("E", 210000.0)
    >>> check_plausible("E", 1e308, where="material 'x'")
    Traceback (most recent call last):
    ...
    warpwise.errors.UsageError: material 'x': E = 1e+308 MPa is outside the plausible range 0.001 to 2e+06 MPa
    """
    if value is None:
        return
    lo, hi, unit = PLAUSIBLE[label]
    if not lo <= value <= hi:
        lead = f"{where}: " if where else ""
        raise UsageError(f"{lead}{label} = {value:g} {unit} is outside the plausible range "
                         f"{lo:g} to {hi:g} {unit}", file=file)


_EN1999 = "EN 1999-1-1:2007, 3.2.5 (E, G, nu, density) and Table 3.2b (f0.2, extrusions, from memory)"
_EN1993 = "EN 1993-1-1:2005, 3.2.6 (E, G, nu) and Table 3.1 (fy, t <= 40 mm); density 7850"

#: Built-in generic materials (name -> Material). Strengths are nominal minimum values for thin
#: extruded or rolled products; check the product standard for the actual thickness range.
BUILTIN: dict[str, Material] = {m.name: m for m in (
    make_material("aluminium-6060-T6", 70000.0, G=27000.0, fy=140.0, density=2700.0,
                  source=_EN1999 + ", t <= 3 mm"),
    make_material("aluminium-6063-T6", 70000.0, G=27000.0, fy=170.0, density=2700.0,
                  source=_EN1999 + ", t <= 10 mm"),
    make_material("aluminium-6082-T6", 70000.0, G=27000.0, fy=250.0, density=2700.0,
                  source=_EN1999 + ", t <= 5 mm"),
    make_material("steel-S235", 210000.0, G=81000.0, fy=235.0, density=7850.0, source=_EN1993),
    make_material("steel-S355", 210000.0, G=81000.0, fy=355.0, density=7850.0, source=_EN1993),
    make_material("stainless-1.4301", 200000.0, nu=0.3, fy=210.0, density=7900.0,
                  source="EN 1993-1-4:2006, 2.1 (E, from memory) and Table 2.1 (hot-rolled "
                         "plate, from memory); density 7900 (EN 10088-1, from memory)"),
    make_material("polyamide-PA66-GF25", 4500.0, nu=0.35, fy=None, density=1300.0,
                  source="typical value for glass-fibre polyamide thermal-break strips, dry "
                         "(from memory; take the supplier's value)"),
)}


def builtin_material(name: str) -> Material:
    """A built-in material by name.

    Raises
    ------
    UsageError
        For an unknown name (the message lists the known ones).
    """
    try:
        return BUILTIN[name]
    except KeyError:
        raise UsageError(f"unknown material {name!r} (built in: {', '.join(BUILTIN)}; "
                         "or give a table with --materials FILE.toml)") from None


def read_materials(path: str | Path) -> dict[str, Material]:
    """Read a TOML materials table: ``[materials.NAME]`` with E, nu or G, fy, density.

    The table's units are MPa and kg/m^3 unless it states others at the top:
    ``stress_unit`` (a key of :data:`warpwise.units.STRESS_UNITS`, e.g. ``"psi"`` or ``"GPa"``)
    and ``density_unit`` (a key of :data:`warpwise.units.DENSITY_UNITS`, e.g. ``"lb/in3"``).
    The values are converted to the ``mm`` system (MPa, kg/m^3) on reading.

    Parameters
    ----------
    path : str or Path
        TOML file.

    Returns
    -------
    dict of str to Material
        Every material, values in the ``mm`` system.
    """
    p = Path(path)
    if not p.is_file():
        raise InputFileError("materials file not found", file=str(path))
    tomllib = _toml()
    try:
        data = tomllib.loads(read_text(p, "a TOML materials table"))
    except (tomllib.TOMLDecodeError, UnicodeDecodeError) as exc:
        raise InputFileError(f"not a valid TOML materials table ({exc})", file=str(path)) from None
    stress_factor, density_factor = _table_units(data, str(path))
    table = data.get("materials")
    if not isinstance(table, dict) or not table:
        raise InputFileError("no [materials.NAME] tables found", file=str(path))
    out = {}
    for name, v in table.items():
        if not isinstance(v, dict):
            raise InputFileError(f"[materials.{name}] must be a table", file=str(path))
        unknown = set(v) - {"E", "nu", "G", "fy", "density", "source"}
        if unknown:
            raise InputFileError(f"[materials.{name}] has unknown keys {sorted(unknown)}",
                                 file=str(path))
        if "E" not in v:
            raise InputFileError(f"[materials.{name}] needs E", file=str(path))
        scaled = {k: _scaled(v.get(k), stress_factor) for k in ("E", "G", "fy")}
        try:
            out[name] = make_material(name, scaled["E"], v.get("nu"), scaled["G"], scaled["fy"],
                                      _scaled(v.get("density"), density_factor),
                                      str(v.get("source", str(path))), where=str(path))
        except UsageError as exc:  # a bad value in a file is a defect of the file (exit 1)
            raise InputFileError(exc.message, file=str(path)) from None
        if name in BUILTIN:
            out[name] = replace(out[name], note=override_note(str(path), BUILTIN[name]))
    return out


def override_note(table: str, builtin: Material) -> str:
    """The note on a table entry that replaces a built-in material, naming the values replaced.

    Examples
    --------
    >>> override_note("own.toml", BUILTIN["steel-S235"])  # doctest: +NORMALIZE_WHITESPACE
    "materials table own.toml replaces the built-in material 'steel-S235' (E = 210000 MPa,
    G = 81000 MPa, nu = 0.296, fy = 235 MPa, density = 7850 kg/m3): the table's values are used"
    """
    m = builtin
    given = [f"E = {m.E:g} MPa", f"G = {m.G:g} MPa", f"nu = {m.nu:.3g}"]
    given += [] if m.fy is None else [f"fy = {m.fy:g} MPa"]
    given += [] if m.density is None else [f"density = {m.density:g} kg/m3"]
    return (f"materials table {table} replaces the built-in material {m.name!r} "
            f"({', '.join(given)}): the table's values are used")


def _scaled(value: object, factor: float) -> object:
    """A table value times a unit factor; anything but a number is left for the checks."""
    if factor == 1.0 or isinstance(value, bool) or not isinstance(value, (int, float)):
        return value
    return value * factor


def _table_units(data: dict, where: str) -> tuple[float, float]:
    """Factors from a table's stated stress and density units to MPa and kg/m^3."""
    unknown = set(data) - {"materials", "stress_unit", "density_unit"}
    if unknown:
        raise InputFileError(f"unknown top-level keys {sorted(unknown)} (use stress_unit, "
                             "density_unit and [materials.NAME] tables)", file=where)
    stress = data.get("stress_unit", "MPa")
    density = data.get("density_unit", "kg/m3")
    if stress not in STRESS_UNITS:
        raise InputFileError(f"unknown stress_unit {stress!r} (use one of "
                             f"{', '.join(STRESS_UNITS)})", file=where)
    if density not in DENSITY_UNITS:
        raise InputFileError(f"unknown density_unit {density!r} (use one of "
                             f"{', '.join(DENSITY_UNITS)})", file=where)
    return STRESS_UNITS[stress] / STRESS_UNITS["MPa"], DENSITY_UNITS[density]


def resolve(names: list[str | None], table: Mapping[str, Material] | None = None,
            default: str | None = None, source: str | None = None) -> list[Material] | None:
    """Materials for region material names, from a user table or the built-in one.

    Parameters
    ----------
    names : list of (str or None)
        Material name of each region (None: the profile's single material).
    table : mapping, optional
        User materials by name (searched first).
    default : str, optional
        Material for regions without a name (``--material``).
    source : str, optional
        File named in messages.

    Returns
    -------
    list of Material, or None when no material is known at all (geometry only).
    """
    if all(n is None for n in names) and default is None:
        return None
    out = []
    for n in names:
        key = n if n is not None else default
        if key is None:
            raise UsageError("some regions have no material; give --material NAME", file=source)
        if table and key in table:
            out.append(table[key])
        else:
            out.append(builtin_material(key))
    return out


@dataclass(frozen=True, eq=False)
class ElementMaterials:
    """Material data per element, relative to a reference material.

    Attributes
    ----------
    E, G : numpy.ndarray
        Element moduli over the reference E_ref and G_ref (m,); ones for one material.
    c : numpy.ndarray
        Coefficient of the shear-function split per element, nu G_ref / E_ref (m,); for one
        material nu / (2 (1 + nu)).
    nu : numpy.ndarray
        Poisson's ratio per element (m,).
    E_ref, G_ref : float or None
        Reference moduli in the materials' unit system (the profile's, once they meet a
        profile); None for geometry only (no material given).
    materials : tuple of Material
        The material of each region (empty for geometry only), values in one unit system.
    group : numpy.ndarray
        Index (m,) of each element's material in ``names``.
    names : tuple of str
        Distinct material names in ``group`` order ("" for geometry only).
    reference : str
        Name of the reference material ("" for geometry only).
    """

    E: np.ndarray
    G: np.ndarray
    c: np.ndarray
    nu: np.ndarray
    E_ref: float | None
    G_ref: float | None
    materials: tuple[Material, ...]
    group: np.ndarray
    names: tuple[str, ...]
    reference: str

    @property
    def composite(self) -> bool:
        """True when the elements do not all share one material."""
        return len(self.names) > 1

    @classmethod
    def single(cls, n_elements: int, nu: float, material: Material | None = None) -> ElementMaterials:
        """One material (or geometry only with Poisson's ratio ``nu``) for every element."""
        if material is not None:
            nu = material.nu
        ones = np.ones(n_elements)
        return cls(ones, ones, np.full(n_elements, nu / (2.0 * (1.0 + nu))), np.full(n_elements, nu),
                   None if material is None else material.E,
                   None if material is None else material.G,
                   () if material is None else (material,), np.zeros(n_elements, dtype=np.int64),
                   ("" if material is None else material.name,),
                   "" if material is None else material.name)

    @classmethod
    def from_regions(cls, region: np.ndarray, materials: list[Material],
                     reference: str | None = None) -> ElementMaterials:
        """Per-element data from the region index of each element and each region's material.

        Parameters
        ----------
        region : numpy.ndarray
            Region index (m,) of each element.
        materials : list of Material
            Material of each region.
        reference : str, optional
            Reference material name; default the material of the first region.
        """
        systems = {m.system for m in materials}
        if len(systems) > 1:
            raise ValueError(f"materials in different unit systems {sorted(systems)}")
        names = tuple(dict.fromkeys(m.name for m in materials))
        by_name: dict[str, Material] = {}
        for m in materials:
            if m.name in by_name and by_name[m.name] != m:
                raise UsageError(f"two different materials are both named {m.name!r}")
            by_name[m.name] = m
        ref = by_name[names[0]] if reference is None else by_name.get(reference)
        if ref is None:
            ref = builtin_material(reference).in_system(materials[0].system)
        region_group = np.array([names.index(m.name) for m in materials], dtype=np.int64)
        group = region_group[region]
        mats = [by_name[n] for n in names]
        E = np.array([m.E for m in mats])[group] / ref.E
        G = np.array([m.G for m in mats])[group] / ref.G
        nu = np.array([m.nu for m in mats])[group]
        return cls(E, G, nu * ref.G / ref.E, nu, ref.E, ref.G, tuple(materials), group, names,
                   ref.name)
