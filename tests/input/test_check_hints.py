"""``warpwise check`` names the options that make a drawing analysable, and each one works.

Every suggestion is run as written through ``warpwise props`` and ``warpwise check``; the
profile it gives is checked against the exact area of the invented rectangles drawn (closed
form; polygons, so round-off: 1e-10).
"""

import json

import ezdxf
import pytest

from conftest import assert_one_line_error
from warpwise.io.check import check_file
from warpwise.io.remedies import MAX_JOIN_FRACTION


def rect(msp, x0, y0, x1, y1, layer="0"):
    msp.add_lwpolyline([(x0, y0), (x1, y0), (x1, y1), (x0, y1)], close=True,
                       dxfattribs={"layer": layer})


def save(tmp_path, name, build):
    doc = ezdxf.new()
    doc.header["$INSUNITS"] = 4
    build(doc.modelspace())
    path = tmp_path / name
    doc.saveas(path)
    return path


def gap_part(msp, gap=0.002):
    """A 50 x 30 rectangle of four lines, one end 'gap' short of its neighbour."""
    msp.add_line((0, 0), (50, 0))
    msp.add_line((50, gap), (50, 30))
    msp.add_line((50, 30), (0, 30))
    msp.add_line((0, 30), (0, 0))


def sheet(msp):
    """Two sections and a title block of two overlapping rectangles (an error in part 3)."""
    rect(msp, 0, 0, 30, 10, "SECTION")
    rect(msp, 50, 0, 60, 10, "SECTION")
    rect(msp, 100, 0, 140, 20, "TITLE")
    rect(msp, 120, 10, 160, 30, "TITLE")


def layer_mix(msp):
    """A 30 x 10 section with two overlapping note boxes drawn across it on another layer."""
    rect(msp, 0, 0, 30, 10, "SECTION")
    rect(msp, 5, 2, 15, 20, "NOTES")
    rect(msp, 10, 5, 25, 25, "NOTES")


def run_each(cli, path, report):
    """Run every suggestion through props and check; return the area each gives."""
    areas = {}
    for remedy in report.remedies:
        code, out, err = cli("props", path, *remedy.options, "--json")
        assert code == 0, (remedy.options, err)
        code_check, _, err_check = cli("check", path, *remedy.options)
        assert code_check == 0, (remedy.options, err_check)
        areas[remedy.options] = json.loads(out)["A"]
    return areas


def test_small_gap_suggests_a_joining_tolerance_that_closes_it(cli, tmp_path):
    path = save(tmp_path, "gap.dxf", gap_part)
    report = check_file(path)
    assert not report.ok
    # the gap is 0.002 mm (drawn); the suggestion is 1.5 times it rounded up to one digit
    assert [r.options for r in report.remedies] == [("--join-tolerance", "0.003")]
    areas = run_each(cli, path, report)
    assert areas[("--join-tolerance", "0.003")] == pytest.approx(1500.0, rel=1e-10)
    code, out, err = cli("check", path)
    assert code == 1
    assert "--join-tolerance 0.003  ends up to 0.003 mm apart joined" in out
    assert_one_line_error(code, err, "gap.dxf", "analysable with --join-tolerance 0.003")


def test_a_wide_gap_is_not_offered_for_joining(tmp_path):
    # 1 mm in a 58 mm drawing is an opening to draw shut, beyond MAX_JOIN_FRACTION
    assert 1.0 > MAX_JOIN_FRACTION * (50**2 + 30**2) ** 0.5
    report = check_file(save(tmp_path, "wide.dxf", lambda m: gap_part(m, 1.0)))
    assert not report.ok and report.remedies == ()


def test_sheet_with_several_parts_suggests_the_parts_that_work(cli, tmp_path):
    path = save(tmp_path, "sheet.dxf", sheet)
    report = check_file(path)
    assert not report.ok and len(report.parts) == 3
    options = [r.options for r in report.remedies]
    assert ("--part", "1") in options and ("--part", "2") in options
    assert ("--part", "3") not in options  # the title block's overlap stays an error
    # separate pieces are not one section: all parts together are not offered
    assert not any("--all-parts" in o for o in options)
    areas = run_each(cli, path, report)
    assert areas[("--part", "1")] == pytest.approx(300.0, rel=1e-10)
    assert areas[("--part", "2")] == pytest.approx(100.0, rel=1e-10)


def test_clean_sheet_of_parts_suggests_each_part(cli, tmp_path):
    def two(msp):
        rect(msp, 0, 0, 30, 10)
        rect(msp, 50, 0, 60, 10)

    path = save(tmp_path, "two.dxf", two)
    report = check_file(path)
    assert [r.options for r in report.remedies] == [("--part", "1"), ("--part", "2")]
    assert run_each(cli, path, report)[("--part", "2")] == pytest.approx(100.0, rel=1e-10)


def test_parts_bonded_by_layer_materials_are_offered_together(cli, tmp_path):
    # two 20 x 10 bars of two materials sharing the edge x = 20: one connected section
    def bonded(msp):
        rect(msp, 0, 0, 20, 10, "STEEL")
        rect(msp, 20, 0, 40, 10, "ALU")

    path = save(tmp_path, "bonded.dxf", bonded)
    given = ("--layer-material", "STEEL=steel-S235", "--layer-material", "ALU=aluminium-6063-T6")
    report = check_file(path, layer_materials={"STEEL": "steel-S235", "ALU": "aluminium-6063-T6"})
    assert ("--all-parts",) in [r.options for r in report.remedies]
    code, out, err = cli("props", path, *given, "--all-parts", "--json")
    assert code == 0, err
    # EA = E_steel A + E_alu A (EN 1993-1-1, EN 1999-1-1 moduli; rectangles, round-off)
    assert json.loads(out)["EA"] == pytest.approx((210000.0 + 70000.0) * 200.0, rel=1e-10)


def test_layer_mix_suggests_the_layer_of_the_section(cli, tmp_path):
    path = save(tmp_path, "mix.dxf", layer_mix)
    report = check_file(path)
    assert not report.ok
    assert report.remedies[0].options == ("--layer", "SECTION")
    assert run_each(cli, path, report)[("--layer", "SECTION")] == pytest.approx(300.0, rel=1e-10)


def test_gap_on_a_sheet_needs_two_options_together(cli, tmp_path):
    def build(msp):
        gap_part(msp)
        rect(msp, 100, 0, 110, 10)

    path = save(tmp_path, "gap_sheet.dxf", build)
    report = check_file(path)
    options = [r.options for r in report.remedies]
    # the closed square alone works; the gap part needs the tolerance and its part number
    assert ("--part", "1") in options
    assert ("--join-tolerance", "0.003", "--part", "1") in options
    areas = run_each(cli, path, report)
    assert areas[("--part", "1")] == pytest.approx(100.0, rel=1e-10)
    assert areas[("--join-tolerance", "0.003", "--part", "1")] == pytest.approx(1500.0, rel=1e-10)


def test_analysable_drawing_has_no_suggestions(tmp_path):
    report = check_file(save(tmp_path, "one.dxf", lambda m: rect(m, 0, 0, 30, 10)))
    assert report.ok and report.remedies == ()


def test_join_tolerance_given_is_used_and_reported(cli, tmp_path):
    path = save(tmp_path, "gap.dxf", gap_part)
    code, out, err = cli("check", path, "--join-tolerance", "0.01")
    assert code == 0, err
    assert "joining tolerance: 0.01 mm (ends closer than this are joined, given)" in out
    for bad in ("0", "-1", "nan"):
        code, _, err = cli("props", path, "--join-tolerance", bad)
        assert code == 2
        assert_one_line_error(code, err, "--join-tolerance")
