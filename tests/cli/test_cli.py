import csv
import io
import json

import pytest

from conftest import SAMPLES, assert_one_line_error


def test_props_table(cli, box_file):
    code, out, err = cli("props", box_file)
    assert code == 0, err
    assert "torsion constant" in out and "J" in out and "mm4" in out
    assert "qualified engineer" in out


def test_props_json_contract(cli, box_file):
    code, out, _ = cli("props", box_file, "--json")
    assert code == 0
    obj = json.loads(out)
    for key in ("file", "units", "A", "centroid", "Ix", "Iy", "Ixy", "I1", "I2", "alpha_deg", "J",
                "shear_centre", "Cw", "mesh"):
        assert key in obj
    assert obj["units"] == {"length": "mm"}
    # exact polygon: A = 20*8 - 10*4 (common practice, no source)
    assert obj["A"] == pytest.approx(120.0, rel=1e-12)
    assert obj["centroid"] == pytest.approx([10.0, 4.0], abs=1e-12)
    assert obj["mesh"]["nodes"] > 0 and obj["mesh"]["elements"] > 0


def test_props_json_list_for_several(cli, box_file):
    code, out, _ = cli("props", box_file, box_file, "--json")
    assert code == 0
    assert isinstance(json.loads(out), list) and len(json.loads(out)) == 2


def test_props_csv(cli, box_file, tmp_path):
    out_csv = tmp_path / "p.csv"
    samples = sorted(SAMPLES.glob("*.txt"))
    code, _, err = cli("props", *samples, "--csv", out_csv)
    assert code == 0, err
    rows = list(csv.reader(io.StringIO(out_csv.read_text())))
    header, body = rows[0], rows[1:]
    assert len(body) == len(samples)
    # every numeric column names its unit
    for h in header[2:]:
        assert "(" in h and h.endswith(")"), h
    j_col = header.index("J (mm4)")
    code, out, _ = cli("props", samples[0], "--json")
    assert float(body[0][j_col]) == pytest.approx(json.loads(out)["J"], rel=1e-9)


def test_stress_json(cli, box_file):
    code, out, err = cli("stress", box_file, "--torque", "1000", "--shear-modulus", "26000",
                         "--json")
    assert code == 0, err
    obj = json.loads(out)
    assert obj["torque"] == 1000.0
    assert obj["tau_max"] > 0 and len(obj["tau_max_at"]) == 2
    # theta = T / (G J) by definition (common practice, no source)
    assert obj["twist_rate"] == pytest.approx(1000.0 / (26000.0 * obj["J"]), rel=1e-12)


def test_stress_from_e_and_nu(cli, box_file):
    code, out, _ = cli("stress", box_file, "--torque", "1000", "--youngs-modulus", "70000",
                       "--poisson", "0.25", "--json")
    assert code == 0
    assert json.loads(out)["shear_modulus"] == pytest.approx(28000.0)


BAD = {
    "open.txt": ("0 0\n1 0\n", "loop 1"),
    "bowtie.txt": ("0 0\n10 10\n10 0\n0 10\n", "crosses itself"),
    "empty.txt": ("", "empty"),
    "words.txt": ("0 0\n1 zero\n1 1\n", "line 2"),
    "overlap.txt": ("0 0\n4 0\n4 4\n0 4\n\n2 2\n6 2\n6 6\n2 6\n", "cross or touch"),
    "line.txt": ("0 0\n1 1\n2 2\n", "no area"),
}


@pytest.mark.parametrize("name", sorted(BAD))
def test_bad_input_one_line_no_output(cli, tmp_path, name):
    text, word = BAD[name]
    path = tmp_path / name
    path.write_text(text)
    out_csv = tmp_path / "out.csv"
    code, out, err = cli("props", path, "--csv", out_csv)
    assert_one_line_error(code, err, name, word)
    assert not out_csv.exists()


def test_missing_file(cli, tmp_path):
    code, out, err = cli("props", tmp_path / "nope.txt")
    assert_one_line_error(code, err, "nope.txt", "not found")


def test_torque_without_modulus(cli, box_file):
    code, out, err = cli("stress", box_file, "--torque", "10")
    assert_one_line_error(code, err, "material")


def test_bad_number_on_command_line(cli, box_file):
    code, out, err = cli("props", box_file, "--mesh-size", "-1")
    assert_one_line_error(code, err, "mesh-size")


def test_existing_csv_kept_when_a_file_fails(cli, box_file, tmp_path):
    out_csv = tmp_path / "keep.csv"
    out_csv.write_text("old\n")
    bad = tmp_path / "bad.txt"
    bad.write_text("0 0\n1 0\n")
    code, _, _ = cli("props", box_file, bad, "--csv", out_csv)
    assert code != 0
    assert out_csv.read_text() == "old\n"
