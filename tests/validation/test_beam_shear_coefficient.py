"""The shear coefficient of a Timoshenko beam: the flexure field with Poisson's ratio 0.

Definition (properties/shear.py): As = 1 / int tau . tau dA for a unit force, tau the flexure
field of nu = 0, which carries the force and nothing else (Renton 1991, Int. J. Solids Struct.
27, from memory). The energy value of the field with the material's nu is reported beside it
(kappa_x_poisson, kappa_y_poisson) and falls without bound as the section widens across the
force (the anticlastic shear stresses of bending).
"""

import json

import numpy as np
import pytest
from test_shear_centre_warping import i_beam_outline, run

from warpwise.cli import main
from warpwise.geometry.shapes import rectangle
from warpwise.properties.analysis import analyse

B_, H = 100.0, 200.0  # I-section: flange width, distance of the flange mid-lines


@pytest.mark.parametrize(("b", "h", "fraction", "bound"), [
    (100.0, 10.0, 8, 1.5e-5),
    (100.0, 0.5, 4, 3e-4),
])
def test_wide_rectangle_shears_with_five_sixths(b, h, fraction, bound):
    # At nu = 0 the flexure stress of a rectangle of any width is the parabola
    # tau = 3 V / (2 A) (1 - 4 y^2 / h^2) (Timoshenko & Goodier, ch. 12, from memory), whose
    # energy gives kappa = 5/6 (Cowper 1966, J. Appl. Mech. 33, at nu = 0). The beam's
    # coefficient across the thickness is that whatever the material's nu (0.3 here), where the
    # issue found 0.179 (100 x 10) and 0.00047 (100 x 0.5). Mesh h / 8 and h / 4 through the
    # thickness: measured 9.8e-6 and 2.4e-4 above 5/6 (the cubic shear function is not in the
    # P2 space; its energy error falls as h^4, see test_shear_coefficients); bounds 1.5 x.
    # Positive: at nu = 0 the discrete energy is a minimum-energy approximation from below.
    res = analyse(rectangle(b, h), poisson=0.3, mesh_size=h / fraction)
    s = res.shear
    assert 0.0 < s.kappa_y / (5.0 / 6.0) - 1.0 < bound
    assert s.As_y == pytest.approx(5.0 / 6.0 * b * h, rel=bound)
    # along the width the parabola is resolved by many elements (measured < 1e-7)
    assert s.kappa_x == pytest.approx(5.0 / 6.0, rel=1e-6)
    # the Poisson value across the thickness: far below (measured 0.179 and 0.00047, a fact of
    # this field, no outside source: only its order is asserted), along the width the same
    assert s.kappa_y_poisson < 0.25 * s.kappa_y
    assert s.kappa_x_poisson == pytest.approx(s.kappa_x, rel=1e-6)


def test_beam_coefficient_does_not_depend_on_poisson():
    # the beam's shear areas are those of nu = 0 for every material (definition); same mesh,
    # so equal to the round-off of the solves (relative residual checked to 1e-8; measured
    # 1e-15)
    prof = i_beam_outline(B_, H, 10.0, 6.0)
    a, b = run(prof, poisson=0.0).shear, run(prof, poisson=0.45).shear
    for key in ("As_x", "As_y", "As_1", "As_2"):
        assert getattr(b, key) == pytest.approx(getattr(a, key), rel=1e-10)
    assert a.kappa_x_poisson == pytest.approx(a.kappa_x, rel=1e-12)  # nu = 0: one field


def thin_walled_shear_area(b, h, tf, tw):
    """As for Vy of a thin-walled I from the shear flow q = V S / I (thin-walled theory).

    Flanges b x tf at mid-lines y = +-h/2, web of thickness tw over the height h between them,
    I = tw h^3 / 12 + 2 b tf (h/2)^2; C = int q^2 / t ds for a unit V, As = 1 / C (the
    complementary energy of the shear flow, e.g. Pilkey 2002, from memory). The polynomials
    are integrated exactly.
    """
    inertia = tw * h**3 / 12.0 + 2.0 * b * tf * (h / 2.0) ** 2
    flanges = 4.0 * (h * tf / (2.0 * inertia)) ** 2 / tf * (b / 2.0) ** 3 / 3.0
    y = np.polynomial.Polynomial([0.0, 1.0])
    q = h * tf * b / (2.0 * inertia) + tw * (h * h / 4.0 - y * y) / (2.0 * inertia)
    web = ((q * q).integ()(h / 2.0) - (q * q).integ()(-h / 2.0)) / tw
    return 1.0 / (flanges + web)


def test_thin_i_shear_area_approaches_the_shear_flow_value():
    # nu = 0.3: the beam's As,y of a thin I approaches the thin-walled shear-flow value as
    # t/b -> 0. Measured for t/b = 0.2, 0.1, 0.05, 0.025: +5.6e-2, +2.5e-2, +1.1e-2, +5.5e-3
    # (first order in t/b: the flanges' own shear across their thickness and the junctions,
    # left out by the thin-walled theory). Bounds: falling at every step, slope > 0.9, final
    # below 7e-3. The Poisson part is negligible here (measured below 5e-6): the flanges are
    # not wide across the force.
    diffs = []
    for tb in (0.2, 0.1, 0.05, 0.025):
        tf = tb * B_
        s = run(i_beam_outline(B_, H, tf, 0.6 * tf)).shear
        diffs.append(s.As_y / thin_walled_shear_area(B_, H, tf, 0.6 * tf) - 1.0)
        assert abs(s.kappa_y_poisson / s.kappa_y - 1.0) < 1e-5
    d = np.abs(diffs)
    assert np.all(np.diff(d) < 0.0), d
    assert np.polyfit(np.log([0.2, 0.1, 0.05, 0.025]), np.log(d), 1)[0] > 0.9, d
    assert d[-1] < 7e-3, d


def test_reports_show_both_where_they_differ(tmp_path, capsys):
    # the 20 % rule: the table shows ky,nu with a note only where it differs; CSV and
    # JSON always hold both (a stable set of columns)
    wide, square = tmp_path / "wide.txt", tmp_path / "square.txt"
    wide.write_text("units: mm\n0, 0\n100, 0\n100, 10\n0, 10\n")
    square.write_text("units: mm\n0, 0\n20, 0\n20, 20\n0, 20\n")
    assert main(["props", str(wide), "--poisson", "0.3"]) == 0
    text = capsys.readouterr().out
    assert "ky,nu" in text and "kx,nu" not in text
    assert "note: ky,nu = 0.179" in text and "Timoshenko beam takes ky" in text
    assert main(["props", str(square), "--poisson", "0.3"]) == 0
    text = capsys.readouterr().out
    assert ",nu" not in text
    assert main(["props", str(square), "--poisson", "0.3", "--json"]) == 0
    obj = json.loads(capsys.readouterr().out)
    # square at nu = 0.3: Poisson value 0.78 against 5/6 (measured, within 20 %)
    assert 0.7 < obj["kappa_y_poisson"] < obj["kappa_y"]
    assert not any("ky,nu" in n for n in obj["notes"])
