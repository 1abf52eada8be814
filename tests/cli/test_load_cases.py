"""``stress --load-cases``, ``--at`` and the signed extremes on the command line.

Oracle: a solid 40 x 60 mm rectangle (our own test profile, centroid (20, 30)): sigma = N / A
and sigma = +-6 M / (b h^2) at the extreme fibres (Navier's formula, Gere & Timoshenko,
Mechanics of Materials; from memory). The normal stress is linear, so the finite-element values
are exact up to round-off; the CSV has ten significant digits (bound 1e-9).
"""

import csv
import io
import json

import pytest

from conftest import assert_one_line_error

B, H = 40.0, 60.0
A, W = B * H, B * H**2 / 6  # mm2, mm3


@pytest.fixture
def rect(tmp_path):
    p = tmp_path / "rect.txt"
    p.write_text(f"units: mm\n0 0\n{B} 0\n{B} {H}\n0 {H}\n")
    return str(p)


def _cases(tmp_path, text, name="cases.csv"):
    p = tmp_path / name
    p.write_text(text)
    return str(p)


def test_csv_and_json_of_two_cases_against_navier(cli, rect, tmp_path):
    f = _cases(tmp_path, "# invented cases\nunits: mm\ncase, N, Mx\npull, 12000, 0\n"
                         "bend, 0, 3.6e6\n")
    code, out, err = cli("stress", rect, "--load-cases", f, "--accuracy", "draft", "--csv", "-")
    assert code == 0, err
    rows = list(csv.DictReader(io.StringIO(out)))
    assert [r["case (text)"] for r in rows] == ["pull", "bend"]
    pull, bend = rows
    assert float(pull["sigma_t (MPa)"]) == pytest.approx(12000 / A, rel=1e-9)
    assert float(pull["sigma_c (MPa)"]) == pytest.approx(12000 / A, rel=1e-9)  # all in tension
    assert float(bend["sigma_t (MPa)"]) == pytest.approx(3.6e6 / W, rel=1e-9)
    assert float(bend["sigma_t y (mm)"]) == pytest.approx(H, abs=1e-9)  # Mx > 0: +y in tension
    assert float(bend["sigma_c (MPa)"]) == pytest.approx(-3.6e6 / W, rel=1e-9)
    assert float(bend["sigma_c y (mm)"]) == pytest.approx(0.0, abs=1e-9)
    assert bend["utilisation (-)"] == ""  # no material, no fy
    code, out, err = cli("stress", rect, "--load-cases", f, "--accuracy", "draft", "--json",
                         "--report-units", "cm")
    assert code == 0, err
    obj = json.loads(out)
    assert obj["units"]["stress"] == "kN/cm2"
    # 1 MPa = 0.1 kN/cm2 (NIST SP 811); the loads stated in mm are shown in kN and kN*cm
    assert obj["cases"][1]["sigma_tension"] == pytest.approx(0.1 * 3.6e6 / W, rel=1e-9)
    assert obj["cases"][1]["loads"]["Mx"] == pytest.approx(360.0, rel=1e-12)
    assert obj["cases"][1]["sigma_tension_at"][1] == pytest.approx(H / 10, abs=1e-9)


def test_text_table_names_units_and_cases(cli, rect, tmp_path):
    f = _cases(tmp_path, "case, My\nside, -1.6e6\n")
    code, out, err = cli("stress", rect, "--load-cases", f, "--accuracy", "draft",
                         "--material", "steel-S235")
    assert code == 0, err
    assert "(units mm, N, MPa)" in out and "stresses in MPa, points in mm" in out
    line = next(ln for ln in out.splitlines() if ln.strip().startswith("side"))
    # My < 0 puts -x (x = 0) in tension: 1.6e6 / (h b^2 / 6)
    assert float(line.split()[2]) == pytest.approx(1.6e6 / (H * B**2 / 6), rel=1e-5)
    assert "(0, " in line.split("steel-S235")[1]


@pytest.mark.parametrize("text, words", [
    ("case, N, Mq\na, 1, 2\n", ("line 1", "unknown column 'Mq'")),
    ("case, N\na, 1\nb, lots\n", ("line 3", "N is not a finite number", "'lots'")),
    ("case, N\na, 1, 2\n", ("line 2 has 3 cells",)),
    ("case, N\na, 1\na, 2\n", ("line 3 repeats case 'a'",)),
    ("# nothing\ncase, N\n", ("no load case",)),
    ("units: furlong\ncase, N\na, 1\n", ("line 1", "unknown unit system 'furlong'")),
    ("name, N\na, 1\n", ("line 1", "starts with 'case'")),
])
def test_defects_of_the_file_are_one_line_errors(cli, rect, tmp_path, text, words):
    f = _cases(tmp_path, text)
    code, _, err = cli("stress", rect, "--load-cases", f, "--accuracy", "draft")
    assert code == 1
    assert_one_line_error(code, err, "cases.csv", *words)


def test_load_options_with_a_case_file_are_refused(cli, rect, tmp_path):
    f = _cases(tmp_path, "case, N\na, 1\n")
    code, _, err = cli("stress", rect, "--load-cases", f, "--axial", "5")
    assert code == 2 and assert_one_line_error(code, err, "--load-cases")


def test_at_points_and_signed_extremes_in_json(cli, rect):
    # Mx = 3.6e6 N*mm: sigma = Mx (y - 30) / Ix at (10, 45), Ix = b h^3 / 12
    code, out, err = cli("stress", rect, "--moment-x", "3.6e6", "--at", "10,45", "--json",
                         "--accuracy", "draft")
    assert code == 0, err
    obj = json.loads(out)
    (p,) = obj["at_points"]
    assert p["point"] == [10.0, 45.0]
    assert p["sigma"] == pytest.approx(3.6e6 * 15 / (B * H**3 / 12), rel=1e-9)
    m = obj["materials"][0]
    assert m["sigma_tension"] == pytest.approx(3.6e6 / W, rel=1e-9)
    assert m["sigma_compression"] == pytest.approx(-3.6e6 / W, rel=1e-9)


def test_point_outside_is_a_usage_error(cli, rect):
    code, _, err = cli("stress", rect, "--moment-x", "1", "--at", "50,10", "--accuracy", "draft")
    assert code == 2 and assert_one_line_error(code, err, "point (50, 10) is outside the section")
