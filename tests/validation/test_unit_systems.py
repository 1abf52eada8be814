"""Unit systems: materials, reported quantities and whole analyses against published factors.

Every factor is written out here as NIST Special Publication 811 (2008 edition), Guide for the
Use of the International System of Units, Appendix B.8 prints it. B.8 marks some factors exact
(the inch, the foot, the avoirdupois pound, standard gravity); the others are printed rounded
to seven significant digits, so a check that uses one of those is held to 1e-6 relative (the
rounding is at most 3.4e-7, for lb/ft 1.488 164). A check that only uses exact factors is held
to round-off.

The same section drawn in mm and in inches is analysed on the same mesh scaled (node
coordinates divided by 25.4), not on two fresh meshes: Triangle does not give a similar mesh
for scaled input (a 60 x 40 mm box with a 48 x 30 mm hole: 2632 nodes in mm, 2392 of the same
box in inches; measured). Its Steiner points and its in-circle decisions for the many
cocircular points of an evenly divided boundary depend on the last bits of the coordinates, so
two Delaunay choices that are equally valid in exact arithmetic go different ways, and the
refinement follows. On the same mesh scaled, the two analyses do the same arithmetic on
coordinates that differ by the rounding of a division, so they agree to round-off.
"""

import dataclasses
import math

import pytest

from warpwise.geometry.shapes import shape_from_spec
from warpwise.materials import BUILTIN, read_materials
from warpwise.mesh.core import Mesh
from warpwise.properties.analysis import analyse
from warpwise.report.quantities import QUANTITIES, unit_of
from warpwise.report.records import record_of
from warpwise.stress import torsion_stress
from warpwise.units import DENSITY, SYSTEMS, TWIST, TWIST_DEG

# --- published factors, SI per unit -------------------------------------------------------------
INCH = 2.54e-2  # NIST SP 811 (2008) B.8: inch -> m, exact
FOOT = 3.048e-1  # NIST SP 811 (2008) B.8: foot -> m, exact
POUND = 4.5359237e-1  # NIST SP 811 (2008) B.8: pound (avoirdupois) -> kg, exact
STANDARD_GRAVITY = 9.80665  # NIST SP 811 (2008) B.8: standard acceleration of gravity -> m/s2, exact
POUND_FORCE_ROUNDED = 4.448222  # NIST SP 811 (2008) B.8: pound-force -> N
PSI = 6.894757e3  # NIST SP 811 (2008) B.8: pound-force per square inch (psi) -> Pa
LBF_PER_FT2 = 4.788026e1  # NIST SP 811 (2008) B.8: pound-force per square foot -> Pa
LB_PER_FT3 = 1.601846e1  # NIST SP 811 (2008) B.8: pound per cubic foot -> kg/m3
LB_PER_IN3 = 2.767990e4  # NIST SP 811 (2008) B.8: pound per cubic inch -> kg/m3
LB_PER_FT = 1.488164  # NIST SP 811 (2008) B.8: pound per foot -> kg/m
# the pound-force is the pound under standard gravity: exact from the two exact factors above
# (NIST SP 811 (2008) B.8 prints it rounded, 4.448 222 E+00)
POUND_FORCE = POUND * STANDARD_GRAVITY

#: Rounded published factors (7 digits): their rounding is at most 3.4e-7 relative.
PUBLISHED = 1e-6
#: Exact factors, a few multiplications and divisions: round-off.
EXACT = 1e-12

# SI prefixes (exact; NIST SP 811 (2008) 4.3, Table 5): MPa = 1e6 Pa, kN/cm2 = 1e3 N / 1e-4 m2
#: Stress unit of each system in Pa, from the published factors.
STRESS_PA = {"mm": 1e6, "cm": 1e7, "m": 1.0, "in": PSI, "ft": LBF_PER_FT2}
#: Density unit of each system in kg/m3, from the published factors.
DENSITY_KG_M3 = {"mm": 1.0, "cm": 1.0, "m": 1.0, "in": LB_PER_IN3, "ft": LB_PER_FT3}

#: Length (m) and force (N) units of each system, exact factors only.
METRE = {"mm": 1e-3, "cm": 1e-2, "m": 1.0, "in": INCH, "ft": FOOT}
NEWTON = {"mm": 1.0, "cm": 1e3, "m": 1.0, "in": POUND_FORCE, "ft": POUND_FORCE}
#: Mass per length unit of each system in kg/m, exact (pound over foot).
KG_PER_M = {"mm": 1.0, "cm": 1.0, "m": 1.0, "in": POUND / FOOT, "ft": POUND / FOOT}
#: Metres per long length (a coating surface in m2/m or ft2/ft, a twist per metre or per foot).
LONG = {"mm": 1.0, "cm": 1.0, "m": 1.0, "in": FOOT, "ft": FOOT}


def rel(value, expected):
    return abs(value / expected - 1.0)


# --- materials ----------------------------------------------------------------------------------


@pytest.mark.parametrize("system", ["mm", "cm", "m", "in", "ft"])
@pytest.mark.parametrize("name", sorted(BUILTIN))
def test_builtin_material_in_every_system(name, system):
    m = BUILTIN[name]
    # the built-ins are stated in MPa and kg/m3 (the mm system)
    assert m.system == "mm"
    s = m.in_system(system)
    assert s.system == system and s.name == m.name and s.nu == m.nu
    for key in ("E", "G", "fy"):
        mpa = getattr(m, key)
        if mpa is None:
            assert getattr(s, key) is None, key
            continue
        expected = mpa * 1e6 / STRESS_PA[system]
        assert rel(getattr(s, key), expected) <= PUBLISHED, (key, getattr(s, key), expected)
    expected = m.density / DENSITY_KG_M3[system]
    assert rel(s.density, expected) <= PUBLISHED, (s.density, expected)


def test_steel_in_psi_and_pounds_per_cubic_inch():
    # 210 000 MPa / 6.894 757e-3 MPa/psi = 30 457 925 psi and 7850 kg/m3 / 27 679.90 = 0.2836
    # lb/in3 (by hand from the published factors), as printed to the nearest 1000 psi and to
    # four decimals
    s = BUILTIN["steel-S355"].in_system("in")
    assert round(s.E, -3) == 30458000.0
    assert round(s.density, 4) == 0.2836


def test_material_round_trip_through_every_system():
    # mm -> X -> mm uses one factor and its inverse: round-off
    for m in BUILTIN.values():
        for system in ("cm", "m", "in", "ft"):
            back = m.in_system(system).in_system("mm")
            for key in ("E", "G", "fy", "density"):
                a, b = getattr(m, key), getattr(back, key)
                assert (a is None and b is None) or rel(b, a) <= EXACT, (m.name, system, key)


def write_table(tmp_path, text):
    path = tmp_path / "materials.toml"
    path.write_text(text)
    return path


def test_table_in_psi_and_lb_per_cubic_inch(tmp_path):
    # an invented steel stated in US units
    path = write_table(tmp_path, 'stress_unit = "psi"\ndensity_unit = "lb/in3"\n\n'
                                 "[materials.us-steel]\nE = 29.0e6\nG = 11.2e6\nfy = 50000.0\n"
                                 "density = 0.284\n")
    m = read_materials(path)["us-steel"]
    assert m.system == "mm"
    for key, psi in (("E", 29.0e6), ("G", 11.2e6), ("fy", 50000.0)):
        assert rel(getattr(m, key), psi * PSI / 1e6) <= PUBLISHED, key
    assert rel(m.density, 0.284 * LB_PER_IN3) <= PUBLISHED
    # where the table meets an inch profile its own numbers come back (one exact factor there
    # and back: round-off)
    back = m.in_system("in")
    for key, psi in (("E", 29.0e6), ("G", 11.2e6), ("fy", 50000.0)):
        assert rel(getattr(back, key), psi) <= EXACT, key
    assert rel(back.density, 0.284) <= EXACT


def test_table_in_ksi_and_lb_per_cubic_foot(tmp_path):
    path = write_table(tmp_path, 'stress_unit = "ksi"\ndensity_unit = "lb/ft3"\n\n'
                                 "[materials.alloy]\nE = 10100.0\nnu = 0.33\nfy = 25.0\n"
                                 "density = 168.5\n")
    m = read_materials(path)["alloy"]
    # ksi = 1000 psi (SI-style prefix on the psi, common practice, no source)
    assert rel(m.E, 10100.0e3 * PSI / 1e6) <= PUBLISHED
    assert rel(m.fy, 25.0e3 * PSI / 1e6) <= PUBLISHED
    # G = E / (2 (1 + nu)) for an isotropic material (common practice, no source)
    assert rel(m.G, m.E / (2.0 * 1.33)) <= EXACT
    assert rel(m.density, 168.5 * LB_PER_FT3) <= PUBLISHED


def test_table_without_units_is_in_mpa(tmp_path):
    path = write_table(tmp_path, "[materials.plain]\nE = 70000.0\nnu = 0.3\ndensity = 2700.0\n")
    m = read_materials(path)["plain"]
    assert (m.E, m.density, m.system) == (70000.0, 2700.0, "mm")


# --- unit texts ---------------------------------------------------------------------------------

#: What each reported quantity measures (written out here, not read from the code): a power of
#: length, an angle, a pure number, or a force-based unit.
KIND = {
    **dict.fromkeys(("xc", "yc", "rx", "ry", "r1", "r2", "xs", "ys", "beta_1", "beta_2",
                     "pna_y", "pna_x", "xse", "yse", "xe", "ye", "xs0", "ys0", "i0", "width",
                     "height", "c_top", "c_bottom", "c_right", "c_left", "perimeter_outer",
                     "perimeter_total", "t_min", "t_min_x", "t_min_y", "r_corner"), "L"),
    **dict.fromkeys(("A", "omega_max", "As_x", "As_y", "As_1", "As_2"), "L2"),
    **dict.fromkeys(("Wel_x_top", "Wel_x_bottom", "Wel_y_right", "Wel_y_left", "Wel_1_pos",
                     "Wel_1_neg", "Wel_2_pos", "Wel_2_neg", "Wpl_x", "Wpl_y", "Wpl_1", "Wpl_2",
                     "Wt"),
                    "L3"),
    **dict.fromkeys(("Ix", "Iy", "Ixy", "I1", "I2", "Ip", "J", "J_low"), "L4"),
    "Cw": "L6",
    "alpha_deg": "angle",
    **dict.fromkeys(("shape_x", "shape_y", "nu", "kappa_x", "kappa_y", "kappa_x_poisson",
                     "kappa_y_poisson"), "number"),
    "E_ref": "stress",
    "EA": "force",
    **dict.fromkeys(("EIx", "EIy", "EIxy", "EI1", "EI2", "GJ"), "FL2"),
    "ECw": "FL4",
    **dict.fromkeys(("Mpl_x", "Mpl_y"), "moment"),
    "mass": "mass",
    "surface": "surface",
    "twist_per_torque": "twist_per_torque",
}

#: The unit of each kind in each system, as the table of warpwise.units states it; the kinds in
#: the order of KINDS (L, L2, L3, L4, L6, angle, number, stress, force, FL2, FL4, moment, mass,
#: surface per length, twist in degrees per length per moment unit).
UNIT_TABLE = {
    "mm": ("mm", "mm2", "mm3", "mm4", "mm6", "deg", "-", "MPa", "N", "N*mm2", "N*mm4", "N*mm", "kg/m",
           "m2/m", "deg/m per N*mm"),
    "cm": ("cm", "cm2", "cm3", "cm4", "cm6", "deg", "-", "kN/cm2", "kN", "kN*cm2", "kN*cm4", "kN*cm",
           "kg/m", "m2/m", "deg/m per kN*cm"),
    "m": ("m", "m2", "m3", "m4", "m6", "deg", "-", "Pa", "N", "N*m2", "N*m4", "N*m", "kg/m",
          "m2/m", "deg/m per N*m"),
    "in": ("in", "in2", "in3", "in4", "in6", "deg", "-", "psi", "lbf", "lbf*in2", "lbf*in4", "lbf*in",
           "lb/ft", "ft2/ft", "deg/ft per lbf*in"),
    "ft": ("ft", "ft2", "ft3", "ft4", "ft6", "deg", "-", "lbf/ft2", "lbf", "lbf*ft2", "lbf*ft4",
           "lbf*ft", "lb/ft", "ft2/ft", "deg/ft per lbf*ft"),
}
KINDS = ("L", "L2", "L3", "L4", "L6", "angle", "number", "stress", "force", "FL2", "FL4", "moment",
         "mass", "surface", "twist_per_torque")


def test_every_quantity_has_a_kind_here():
    # a new quantity must be classified above before its unit text is trusted
    assert set(KIND) == {q.key for q in QUANTITIES}


@pytest.mark.parametrize("system", sorted(UNIT_TABLE))
def test_unit_text_of_every_quantity(system):
    units = dict(zip(KINDS, UNIT_TABLE[system], strict=True))
    wrong = {q.key: unit_of(q, system) for q in QUANTITIES if unit_of(q, system) != units[KIND[q.key]]}
    assert not wrong, wrong


def test_unit_text_examples():
    by_key = {q.key: q for q in QUANTITIES}
    assert unit_of(by_key["Ix"], "cm") == "cm4"
    assert unit_of(by_key["EIx"], "cm") == "kN*cm2"
    assert unit_of(by_key["E_ref"], "in") == "psi"
    assert unit_of(by_key["mass"], "in") == "lb/ft"
    assert unit_of(by_key["Cw"], "m") == "m6"


@pytest.mark.parametrize("system,density,twist,twist_deg", [
    ("mm", "kg/m3", "rad/mm", "deg/m"), ("cm", "kg/m3", "rad/cm", "deg/m"),
    ("m", "kg/m3", "rad/m", "deg/m"), ("in", "lb/in3", "rad/in", "deg/ft"),
    ("ft", "lb/ft3", "rad/ft", "deg/ft")])
def test_density_and_twist_unit_texts(system, density, twist, twist_deg):
    s = SYSTEMS[system]
    assert (s.text(DENSITY), s.text(TWIST), s.text(TWIST_DEG)) == (density, twist, twist_deg)


# --- records ------------------------------------------------------------------------------------


def si_factor(kind, system):
    """SI value of one unit of a kind in a system (m, N, Pa, kg/m), exact factors only."""
    L, F = METRE[system], NEWTON[system]
    return {"L": L, "L2": L**2, "L3": L**3, "L4": L**4, "L6": L**6, "angle": 1.0, "number": 1.0,
            "stress": F / L**2, "force": F, "FL2": F * L**2, "FL4": F * L**4, "moment": F * L,
            "mass": KG_PER_M[system],
            # surface per length: the metre (foot) of the system's long length; a twist per
            # torque in degrees per long length per F L
            "surface": LONG[system], "twist_per_torque": 1.0 / (LONG[system] * F * L)}[kind]


@pytest.fixture(scope="module")
def steel_angle():
    # an invented unequal angle with root and toe radii; no symmetry, so every quantity is
    # non-trivial
    p = shape_from_spec("angle:h=80,b=60,t=8,r=8,r_toe=4")
    return analyse(p, materials=BUILTIN["steel-S355"], bounds=True)


def close_or_both_nan(a, b, rtol, scale):
    if a != a or b != b:
        return a != a and b != b
    return abs(a - b) <= rtol * scale


def value_scale(rec, key):
    """Size of a value for a round-off comparison: a coordinate relative to the section size."""
    if KIND[key] == "L":
        return rec.values["rx"] + rec.values["ry"] + abs(rec.values[key])
    return abs(rec.values[key])


@pytest.mark.parametrize("system", ["cm", "m", "in", "ft"])
def test_record_round_trip(steel_angle, system):
    rec = record_of(steel_angle)
    assert rec.units == "mm"
    there = rec.in_units(system)
    assert there.units == system
    back = there.in_units("mm")
    assert back.units == "mm"
    for key, v in rec.values.items():
        # one factor and its inverse: round-off
        assert close_or_both_nan(back.values[key], v, EXACT, value_scale(rec, key)), key
    assert rel(back.mesh_size, rec.mesh_size) <= EXACT


@pytest.mark.parametrize("system", ["cm", "m", "in", "ft"])
def test_record_in_units_against_the_published_factors(steel_angle, system):
    rec = record_of(steel_angle)
    out = rec.in_units(system)
    for key, v in rec.values.items():
        ratio = si_factor(KIND[key], "mm") / si_factor(KIND[key], system)
        hand = v * ratio
        # exact factors, a product of a few: round-off
        assert close_or_both_nan(out.values[key], hand, EXACT, value_scale(rec, key) * ratio), (
            key, out.values[key], hand)
    # and with the rounded published factors for the force-based units of the US systems
    if system == "in":
        assert rel(out.values["E_ref"], rec.values["E_ref"] * 1e6 / PSI) <= PUBLISHED
        assert rel(out.values["EA"], rec.values["EA"] / POUND_FORCE_ROUNDED) <= PUBLISHED
        assert rel(out.values["mass"], rec.values["mass"] / LB_PER_FT) <= PUBLISHED
    if system == "ft":
        assert rel(out.values["E_ref"], rec.values["E_ref"] * 1e6 / LBF_PER_FT2) <= PUBLISHED


# --- the same section in mm and in inches -------------------------------------------------------


def in_inches(profile):
    """The profile drawn in inches: every coordinate divided by 25.4, units "in"."""
    return dataclasses.replace(profile.moved(scale=1.0 / 25.4), units="in")


def mesh_in_inches(mesh):
    """The same mesh with its coordinates divided by 25.4 (connectivity and regions kept)."""
    return Mesh(mesh.nodes / 25.4, mesh.elements, mesh.region, mesh.size / 25.4)


@pytest.mark.parametrize("spec,material", [
    ("angle:h=80,b=60,t=8,r=8,r_toe=4", "steel-S355"),
    ("channel:h=160,b=65,tw=7.5,tf=10.5,r=10.5", "aluminium-6082-T6"),
])
def test_same_section_in_mm_and_in_inches(spec, material):
    mat = BUILTIN[material]
    p_mm = shape_from_spec(spec)
    a = analyse(p_mm, materials=mat)
    p_in = in_inches(p_mm)
    # the inch drawing's own coordinates are the mm ones over 25.4 (inch = 25.4 mm exactly,
    # NIST SP 811 (2008) B.8)
    assert p_in.bounds == pytest.approx(tuple(v / 25.4 for v in p_mm.bounds), rel=EXACT)
    b = analyse(p_in, mesh=mesh_in_inches(a.mesh), materials=mat)
    assert b.units == "in"
    ra, rb = record_of(a), record_of(b)
    rb_mm = rb.in_units("mm")
    Ip = ra.values["Ip"]
    for key in ("E_ref", "EA", "EIx", "EIy", "Mpl_x", "Mpl_y", "mass", "ECw"):
        # the same arithmetic on coordinates that differ by the rounding of a division:
        # round-off (measured at most 7e-14)
        assert rel(rb_mm.values[key], ra.values[key]) <= EXACT, (key, rb_mm.values[key],
                                                                  ra.values[key])
        # and the inch values against a hand conversion with the exact factors
        hand = ra.values[key] * si_factor(KIND[key], "mm") / si_factor(KIND[key], "in")
        assert rel(rb.values[key], hand) <= EXACT, key
    # GJ = G (Ip - int (y dpsi/dx - x dpsi/dy) dA): J loses digits to that cancellation when
    # J << Ip (J/Ip is 0.007 for the channel), so its round-off is relative to G Ip (measured
    # 3e-14 of G Ip, 4e-12 of GJ)
    G = ra.values["GJ"] / ra.values["J"]
    assert abs(rb_mm.values["GJ"] - ra.values["GJ"]) <= EXACT * G * Ip
    # the twist rate T / (G J) for the same torque: 1 kN*m in N*mm, and in lbf*in with the
    # exact pound-force
    T_mm = 1e6
    T_in = T_mm / (POUND_FORCE * 25.4)
    twist_mm = torsion_stress(a, T_mm).twist_rate  # rad/mm
    twist_in = torsion_stress(b, T_in).twist_rate  # rad/in
    assert abs(twist_in / 25.4 - twist_mm) <= EXACT * twist_mm * Ip / ra.values["J"]
    # mass per length does not depend on the unit system: kg/m from lb/ft (exact pound, foot)
    assert rel(rb.values["mass"] * POUND / FOOT, ra.values["mass"]) <= EXACT
    # the mass itself: density x area (common practice, no source), 7850 or 2700 kg/m3
    assert rel(ra.values["mass"], mat.density * ra.values["A"] * 1e-6) <= EXACT
    # and the steel's E in psi on the inch drawing, against the rounded published psi
    assert rel(rb.values["E_ref"], mat.E * 1e6 / PSI) <= PUBLISHED


def test_twist_in_degrees_per_metre_and_per_foot(steel_angle):
    from warpwise.units import twist_in_degrees

    theta = torsion_stress(steel_angle, 1e6).twist_rate  # rad/mm
    # rad/mm -> deg/m: x 180/pi x 1000 (common practice, no source)
    assert rel(twist_in_degrees(theta, "mm"), math.degrees(theta) * 1e3) <= EXACT
    # the same twist in rad/in, then deg/ft: 12 in to the foot (NIST SP 811 (2008) B.8: foot
    # 3.048 E-01 m, inch 2.54 E-02 m, exact)
    theta_in = theta * 25.4
    assert rel(twist_in_degrees(theta_in, "in"), math.degrees(theta) * 1e3 * FOOT) <= EXACT
    assert rel(twist_in_degrees(theta_in, "in"), math.degrees(theta_in) * FOOT / INCH) <= EXACT
