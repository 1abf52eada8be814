"""``warpwise member``: output in every form, units of the report, clean refusals."""

from __future__ import annotations

import csv
import io
import json

import pytest

from conftest import SAMPLES, assert_one_line_error
from warpwise.cli import main

CHANNEL = SAMPLES / "channel_thick_80x40.txt"
BASE = ["member", str(CHANNEL), "--accuracy", "draft", "--material", "steel-S235"]


def _run(capsys, *args):
    code = main([*BASE, *map(str, args)])
    out, err = capsys.readouterr()
    return code, out, err


def test_text_json_csv_and_plot(capsys, tmp_path):
    table, picture = tmp_path / "m.csv", tmp_path / "m.png"
    code, out, _ = _run(capsys, "--length", 2000, "--ends", "fixed,pinned", "--point-torque",
                        "5e4@800", "--distributed-torque", 10, "--csv", table, "--plot", picture)
    assert code == 0
    assert "torque 50000 N*mm at z = 800 mm" in out
    assert "bimoment -E Cw phi''" in out and "N*mm2" in out
    rows = list(csv.reader(io.StringIO(table.read_text())))
    assert rows[0] == ["z (mm)", "phi (rad)", "phi' (rad/mm)", "phi'' (rad/mm2)",
                       "phi''' (rad/mm3)", "T_sv (N*mm)", "T_w (N*mm)", "B (N*mm2)"]
    assert len(rows) == 1 + 11  # 11 stations, the load point at 800 mm one of them
    assert picture.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"
    code, out, _ = _run(capsys, "--length", 2000, "--ends", "fixed,pinned", "--point-torque",
                        "5e4@800", "--distributed-torque", 10, "--json")
    obj = json.loads(out)
    st = obj["stations"]
    # the supports: phi = 0 at both ends, phi' = 0 at the fixed end, B = 0 at the pinned end
    assert st["phi"][0] == 0.0 and st["phi"][-1] == 0.0
    assert st["phi1"][0] == 0.0 and st["B"][-1] == 0.0
    # equilibrium: the two end torques carry the applied 5e4 + 10 * 2000 (statics, common
    # practice, no source); T = T_sv + T_w, to the round-off of the exact solution
    T0 = st["T_sv"][0] + st["T_w"][0]
    TL = st["T_sv"][-1] + st["T_w"][-1]
    assert T0 - TL == pytest.approx(5e4 + 10 * 2000, rel=1e-10)
    assert obj["units"]["B"] == "N*mm2" and obj["units"]["phi2"] == "rad/mm2"


def test_report_units_take_the_loads(capsys):
    # the same member given in mm and in m: the same twist, B scaled by the unit factors
    # (N*mm2 = 1e-6 N*m2, exact decimal factors of warpwise.units)
    _, mm, _ = _run(capsys, "--length", 2000, "--ends", "fixed,fixed", "--point-torque",
                    "5e4@800", "--json")
    _, m, _ = _run(capsys, "--length", 2, "--ends", "fixed,fixed", "--point-torque", "50@0.8",
                   "--report-units", "m", "--json")
    a, b = json.loads(mm), json.loads(m)
    assert b["stations"]["phi"] == pytest.approx(a["stations"]["phi"], rel=1e-12, abs=1e-300)
    assert b["stations"]["B"] == pytest.approx([v * 1e-6 for v in a["stations"]["B"]], rel=1e-12)
    assert b["units"]["B"] == "N*m2"


@pytest.mark.parametrize("args, words", [
    (["--length", 2000, "--ends", "free,free", "--point-torque", "1@5"], ["mechanism"]),
    (["--length", 2000, "--ends", "fixed,hinged", "--point-torque", "1@5"], ["--ends"]),
    (["--length", 2000, "--ends", "fixed,free", "--point-torque", "1@2500"], ["outside"]),
    (["--length", 2000, "--ends", "fixed,free", "--point-torque", "1at5"], ["TORQUE@POSITION"]),
    (["--length", 2000, "--ends", "fixed,free"], ["a load"]),
    (["--length", 2000, "--ends", "fixed,free", "--point-torque", "1@5", "--plot", "x.txt"],
     [".png"]),
])
def test_refusals(capsys, args, words):
    code, out, err = _run(capsys, *args)
    assert code == 2 and out == ""
    assert_one_line_error(code, err, *words)


def test_material_needed(capsys):
    code = main(["member", str(CHANNEL), "--length", "10", "--ends", "fixed,free",
                 "--point-torque", "1@10"])
    _, err = capsys.readouterr()
    assert code == 2
    assert_one_line_error(code, err, "--material")


def test_one_section_printed_once(capsys):
    # fixed at both ends, torque at midspan: |B| and |T_w| are both largest at the supports and
    # at the load point, equal there (antisymmetric halves; Seaburg & Carter 1997, case of a
    # concentrated torque, from memory); the first along the member is taken for both, whatever
    # the round-off, so the text prints that section once; the JSON keeps one entry each
    args = ["--length", 2000, "--ends", "fixed,fixed", "--point-torque", "5e4@1000"]
    code, out, _ = _run(capsys, *args)
    assert code == 0
    assert out.count("where |B| and |T_w| are largest, z = 0 mm") == 1
    assert "where |B| is largest" not in out and "where |T_w| is largest" not in out
    assert out.count("where |T_sv| is largest") == 1
    code, out, _ = _run(capsys, *args, "--json")
    got = json.loads(out)["governing_sections"]
    assert [s["governs"] for s in got] == ["B", "T_w", "T_sv"]
    assert got[0]["z"] == got[1]["z"] == 0.0
