"""Unit systems: a length unit and the force, stress, moment and mass units that go with it.

A profile's numbers are in one unit system, named by its length unit (the drawing's); a report
may be written in another. Every conversion between systems goes through :func:`convert` with
the quantity's :class:`Dimension`, and every unit text through :meth:`UnitSystem.text`, so a
value is never printed under a unit it is not in.

=====  ======  ==========  =========  ========  =========  ============
key    length  force       stress     moment    density    mass/length
=====  ======  ==========  =========  ========  =========  ============
mm     mm      N           MPa        N*mm      kg/m3      kg/m
cm     cm      kN          kN/cm2     kN*cm     kg/m3      kg/m
m      m       N           Pa         N*m       kg/m3      kg/m
in     in      lbf         psi        lbf*in    lb/in3     lb/ft
ft     ft      lbf         lbf/ft2    lbf*ft    lb/ft3     lb/ft
=====  ======  ==========  =========  ========  =========  ============

Conversion factors: NIST Special Publication 811 (2008 edition), Guide for the Use of the
International System of Units, Appendix B.8 and B.9: the inch is 2.54e-2 m and the foot
3.048e-1 m exactly, the avoirdupois pound 4.5359237e-1 kg exactly, and the pound-force the
pound times the standard acceleration of gravity 9.80665 m/s^2 (exact; B.8 lists it rounded as
4.448 222 N).

Examples
--------
>>> round(convert(210000.0, STRESS, "mm", "in"))  # steel's E, MPa to psi
30457925
>>> SYSTEMS["cm"].text(Dimension(2, 1)), SYSTEMS["in"].text(MOMENT)
('kN*cm2', 'lbf*in')
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from .errors import UsageError

#: metre per inch, exact (NIST SP 811, B.8: inch -> metre 2.54 E-02)
INCH = 0.0254
#: metre per foot, exact (NIST SP 811, B.8: foot -> metre 3.048 E-01)
FOOT = 0.3048
#: kilogram per avoirdupois pound, exact (NIST SP 811, B.8: pound -> kilogram 4.535 923 7 E-01)
POUND = 0.45359237
#: standard acceleration of gravity, m/s^2, exact (NIST SP 811, B.8 footnote to kilogram-force)
STANDARD_GRAVITY = 9.80665
#: newton per pound-force: exactly POUND x STANDARD_GRAVITY = 4.448 221 615 260 5
#: (NIST SP 811, B.8: pound-force -> newton 4.448 222 E+00)
POUND_FORCE = POUND * STANDARD_GRAVITY


@dataclass(frozen=True)
class Dimension:
    """What a quantity measures: powers of length and force, or a kind with its own unit.

    Attributes
    ----------
    length, force : int
        Exponents of the length and the force unit (a stress is length -2, force 1).
    kind : str
        ``""`` for a plain power product; ``angle`` (degrees, not converted), ``twist``
        (radians per length: length -1), ``twist_deg`` (degrees per metre or per foot),
        ``twist_per_torque`` (degrees per metre or per foot, per moment unit of the system),
        ``surface`` (area per length: m2/m or ft2/ft, as a coated surface is stated),
        ``density`` and ``linear_mass`` (mass per volume and per length).
    """

    length: int = 0
    force: int = 0
    kind: str = ""


NUMBER = Dimension()
ANGLE = Dimension(kind="angle")
LENGTH = Dimension(1)
AREA = Dimension(2)
FORCE = Dimension(0, 1)
MOMENT = Dimension(1, 1)
STRESS = Dimension(-2, 1)
TWIST = Dimension(-1, 0, "twist")
TWIST_DEG = Dimension(kind="twist_deg")
TWIST_PER_TORQUE = Dimension(kind="twist_per_torque")
SURFACE = Dimension(kind="surface")
DENSITY = Dimension(kind="density")
LINEAR_MASS = Dimension(kind="linear_mass")


@dataclass(frozen=True)
class UnitSystem:
    """A consistent set of units named by its length unit.

    Attributes
    ----------
    length : str
        Length unit, also the key of the system in :data:`SYSTEMS`.
    millimetre : float
        Millimetres per length unit (1, 10, 1000, 25.4, 304.8: exact decimals, so that
        conversions between the metric systems are exact).
    force : str
        Force unit.
    newton : float
        Newtons per force unit.
    stress : str
        Name of the force / length^2 unit.
    density : str
        Density unit.
    kg_per_m3 : float
        kg/m^3 per density unit.
    linear_mass : str
        Mass per length unit (as tables print it: kg/m or lb/ft).
    kg_per_m : float
        kg/m per linear mass unit.
    long_length : str
        Length unit of a twist in degrees per length (m or ft).
    long_metre : float
        Metres per ``long_length``.
    """

    length: str
    millimetre: float
    force: str
    newton: float
    stress: str
    density: str
    kg_per_m3: float
    linear_mass: str
    kg_per_m: float
    long_length: str
    long_metre: float

    @property
    def metre(self) -> float:
        """Metres per length unit."""
        return self.millimetre / 1e3

    def text(self, dim: Dimension) -> str:
        """Unit text of a dimension in this system, e.g. ``mm4``, ``N*mm2``, ``MPa``, ``-``."""
        special = {"angle": "deg", "density": self.density, "linear_mass": self.linear_mass,
                   "twist": f"rad/{self.length}", "twist_deg": f"deg/{self.long_length}",
                   "twist_per_torque": f"deg/{self.long_length} per {self.force}*{self.length}",
                   "surface": f"{self.long_length}2/{self.long_length}"}
        if dim.kind:
            return special[dim.kind]
        lp, fp = dim.length, dim.force
        power = "" if lp == 1 else str(lp)
        if fp == 0:
            return "-" if lp == 0 else f"{self.length}{power}"
        if fp == 1 and lp == -2:
            return self.stress
        if fp == 1 and lp == 0:
            return self.force
        if fp == 1 and lp > 0:
            return f"{self.force}*{self.length}{power}"
        raise ValueError(f"no unit text for {dim}")

    def to_si(self, value: float, dim: Dimension) -> float:
        """``value`` in this system to SI (m, N, Pa, kg/m^3, kg/m, rad/m; degrees stay).

        A twist per torque goes to degrees per metre per N*m, a surface per length to m2/m.
        """
        if dim.kind == "density":
            return value * self.kg_per_m3
        if dim.kind == "linear_mass":
            return value * self.kg_per_m
        if dim.kind == "twist_deg":
            return value / self.long_metre
        if dim.kind == "twist_per_torque":
            return value / self.long_metre / (self.newton * self.metre)
        if dim.kind == "surface":
            return value * self.long_metre
        if dim.kind == "angle":
            return value
        return value * self.metre ** dim.length * self.newton ** dim.force

    def from_si(self, value: float, dim: Dimension) -> float:
        """An SI ``value`` (see :meth:`to_si`) in this system."""
        return value / self.to_si(1.0, dim)


def _system(length: str, millimetre: float, force: str, newton: float, stress: str,
            imperial: bool) -> UnitSystem:
    if imperial:
        volume = {"in": INCH, "ft": FOOT}[length] ** 3
        return UnitSystem(length, millimetre, force, newton, stress, f"lb/{length}3",
                          POUND / volume, "lb/ft", POUND / FOOT, "ft", FOOT)
    return UnitSystem(length, millimetre, force, newton, stress, "kg/m3", 1.0, "kg/m", 1.0, "m",
                      1.0)


#: The unit systems by length unit (see the module's table).
SYSTEMS: dict[str, UnitSystem] = {
    "mm": _system("mm", 1.0, "N", 1.0, "MPa", False),
    "cm": _system("cm", 10.0, "kN", 1e3, "kN/cm2", False),
    "m": _system("m", 1e3, "N", 1.0, "Pa", False),
    "in": _system("in", 25.4, "lbf", POUND_FORCE, "psi", True),
    "ft": _system("ft", 304.8, "lbf", POUND_FORCE, "lbf/ft2", True),
}

#: Millimetres per length unit of each system.
LENGTH_UNITS: dict[str, float] = {k: s.millimetre for k, s in SYSTEMS.items()}

#: Stress units a materials table may state, in Pa (NIST SP 811, B.8: psi 6.894 757 E+03 Pa is
#: lbf/in^2; ksi 1000 psi).
STRESS_UNITS: dict[str, float] = {
    "MPa": 1e6, "N/mm2": 1e6, "GPa": 1e9, "kN/cm2": 1e7, "N/cm2": 1e4, "Pa": 1.0,
    "psi": POUND_FORCE / INCH**2, "ksi": 1e3 * POUND_FORCE / INCH**2,
}
#: Density units a materials table may state, in kg/m^3 (NIST SP 811, B.8: lb/ft3
#: 1.601 846 E+01, lb/in3 2.767 990 E+04, g/cm3 1.0 E+03).
DENSITY_UNITS: dict[str, float] = {
    "kg/m3": 1.0, "g/cm3": 1e3, "lb/ft3": POUND / FOOT**3, "lb/in3": POUND / INCH**3,
}


def system(name: str) -> UnitSystem:
    """The unit system of a length unit (a key of :data:`SYSTEMS`).

    Raises
    ------
    UsageError
        For an unknown name (the message lists the known ones).
    """
    try:
        return SYSTEMS[name]
    except KeyError:
        raise UsageError(f"unknown unit system {name!r} (use one of {', '.join(SYSTEMS)})") from None


def convert(value: float, dim: Dimension, source: str, target: str) -> float:
    """A value of dimension ``dim`` from one unit system to another.

    Parameters
    ----------
    value : float
        The value in the ``source`` system.
    dim : Dimension
        What it measures.
    source, target : str
        Unit systems, keys of :data:`SYSTEMS`.

    Returns
    -------
    float
        The value in the ``target`` system (the same float when the systems agree).

    Examples
    --------
    >>> convert(1.0, Dimension(4), "cm", "mm")
    10000.0
    """
    if source == target or dim.kind == "angle" or dim == NUMBER:
        return value
    a, b = system(source), system(target)
    if dim.kind in ("density", "linear_mass", "twist_deg", "twist_per_torque", "surface"):
        return b.from_si(a.to_si(value, dim), dim)
    # powers of the larger unit over the smaller, then one division: exact between mm, cm, m
    num = den = 1.0
    for p, ua, ub in ((dim.length, a.millimetre, b.millimetre), (dim.force, a.newton, b.newton)):
        if p > 0:
            num, den = num * ua**p, den * ub**p
        elif p < 0:
            num, den = num * ub**-p, den * ua**-p
    return value * num / den


def twist_in_degrees(rate: float, units: str) -> float:
    """A twist rate in radians per length unit as degrees per metre (or per foot).

    Examples
    --------
    >>> round(twist_in_degrees(1e-3, "mm"), 6)  # 1 mrad/mm = 1 rad/m
    57.29578
    """
    s = system(units)
    return math.degrees(rate) / s.metre * s.long_metre


@dataclass(frozen=True)
class Converter:
    """Values of one profile's unit system shown in a report's unit system.

    Attributes
    ----------
    source : str
        Unit system the values are in (the profile's).
    target : str
        Unit system they are shown in (the report's).

    Examples
    --------
    >>> show = Converter("mm", "cm")
    >>> show(2.0e4, Dimension(4)), show.unit(Dimension(4)), show(None, LENGTH)
    (2.0, 'cm4', None)
    """

    source: str
    target: str

    @classmethod
    def of(cls, source: str, target: str | None) -> Converter:
        """A converter to ``target``, or to ``source`` itself when no target is chosen."""
        system(source)
        return cls(source, system(target or source).length)

    @property
    def system(self) -> UnitSystem:
        """The target unit system."""
        return system(self.target)

    def __call__(self, value, dim: Dimension):
        """``value`` (a float, an array or None) in the target system."""
        return None if value is None else convert(value, dim, self.source, self.target)

    def unit(self, dim: Dimension) -> str:
        """Unit text of ``dim`` in the target system."""
        return self.system.text(dim)

    def point(self, xy) -> list[float]:
        """A point (x, y) in the target length unit."""
        return [float(self(float(v), LENGTH)) for v in xy]
