"""``props --about-axis`` and ``--fibre``: the table, the JSON and the CSV, each with units.

Oracle: a solid 30 x 50 mm rectangle (our own test profile) about its base, I = b h^3 / 3 and
W to the top fibre b h^2 / 3 (closed forms, Gere & Timoshenko, Mechanics of Materials; from
memory). Finite-element moments of a polygon are exact up to round-off; the printed table has
six significant digits, the CSV ten.
"""

import csv
import io
import json

import pytest

from conftest import assert_one_line_error

B, H = 30.0, 50.0
I_BASE, W_TOP = B * H**3 / 3, B * H**2 / 3  # mm4, mm3


@pytest.fixture
def rect(tmp_path):
    p = tmp_path / "rect.txt"
    p.write_text(f"units: mm\n0 0\n{B} 0\n{B} {H}\n0 {H}\n")
    return str(p)


def test_table_shows_the_axis_group_with_units(cli, rect):
    code, out, err = cli("props", rect, "--accuracy", "draft", "--about-axis", "0,0,0",
                         "--fibre", "10,50")
    assert code == 0, err
    assert "About the axis through (0, 0) mm at 0 deg from +x" in out
    line = next(ln for ln in out.splitlines() if "second moment about the axis" in ln)
    assert line.split()[-1] == "mm4" and float(line.split()[-2]) == pytest.approx(I_BASE, rel=1e-6)
    line = next(ln for ln in out.splitlines() if "I_axis / |v|" in ln)
    assert line.split()[-1] == "mm3" and float(line.split()[-2]) == pytest.approx(W_TOP, rel=1e-6)
    assert out.rstrip().endswith("qualified engineer.")  # the caution stays last


def test_json_in_other_units_takes_the_point_in_those_units(cli, rect):
    # the point and fibre are given in cm (the report's system): the base is y = 0, the top
    # fibre 5 cm above it; values come back in cm4 and cm3 (1 cm = 10 mm, NIST SP 811)
    code, out, err = cli("props", rect, "--accuracy", "draft", "--json", "--report-units", "cm",
                         "--about-axis", "1.5,0,0", "--fibre", "1,5")
    assert code == 0, err
    a = json.loads(out)["about_axis"]
    assert a["point"] == [1.5, 0.0] and a["angle_deg"] == 0.0
    assert a["I_axis"] == pytest.approx(I_BASE / 1e4, rel=1e-10)
    assert a["fibres"][0]["distance"] == pytest.approx(5.0, rel=1e-12)
    assert a["fibres"][0]["W"] == pytest.approx(W_TOP / 1e3, rel=1e-10)
    # about the base's midpoint: Ip = b h^3 / 3 + h b^3 / 12 (parallel-axis theorem)
    assert a["Ip_point"] == pytest.approx((I_BASE + H * B**3 / 12) / 1e4, rel=1e-10)


def test_csv_has_the_axis_columns_after_the_properties(cli, rect):
    code, out, err = cli("props", rect, "--accuracy", "draft", "--csv", "-",
                         "--about-axis", "0,0,0", "--fibre", "0,50")
    assert code == 0, err
    row = next(csv.DictReader(io.StringIO(out)))
    assert float(row["I_axis (mm4)"]) == pytest.approx(I_BASE, rel=1e-9)
    assert float(row["fibre 1 W (mm3)"]) == pytest.approx(W_TOP, rel=1e-9)
    assert float(row["axis angle (deg)"]) == 0.0


def test_without_the_option_no_axis_columns(cli, rect):
    code, out, _ = cli("props", rect, "--accuracy", "draft", "--csv", "-")
    assert code == 0 and "I_axis" not in out


@pytest.mark.parametrize("args, words", [
    (("--about-axis", "0,0"), ("X0,Y0,ANGLE", "3 numbers")),
    (("--about-axis", "0,0,x"), ("not a number",)),
    (("--fibre", "1,2"), ("--fibre needs --about-axis",)),
    (("--about-axis", "0,0,0", "--fibre", "7,0"), ("fibre 1", "lies on the axis")),
])
def test_bad_requests_are_one_line_usage_errors(cli, rect, args, words):
    code, _, err = cli("props", rect, "--accuracy", "draft", *args)
    assert code == 2
    assert_one_line_error(code, err, *words)


def test_json_and_csv_name_each_value_alike(cli, rect, tmp_path):
    # one name per value (the README's): the JSON keys of about_axis are the CSV headers' names
    out_csv = tmp_path / "a.csv"
    code, out, _ = cli("props", rect, "--accuracy", "draft", "--about-axis", "0,0,0",
                       "--fibre", "10,50", "--json", "--csv", str(out_csv))
    assert code == 0
    obj = json.loads(out)
    a = obj["about_axis"] if isinstance(obj, dict) else obj[0]["about_axis"]
    header = out_csv.read_text().splitlines()[0]
    for key in ("I_axis", "I_across", "I_uv", "Ip_point"):
        assert key in a and f"{key} (mm4)" in header
