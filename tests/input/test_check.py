"""``warpwise check``: what a drawing holds, every defect with its place, the plot, exit codes.

The drawings are invented and written with ezdxf into the test's own folder.
"""

import ezdxf
import numpy as np
import pytest

from warpwise.errors import InputFileError
from warpwise.io.check import check_file, format_report
from warpwise.report.check_plot import plot_report

PNG_MAGIC = b"\x89PNG\r\n\x1a\n"


def save(doc, tmp_path, name):
    path = tmp_path / name
    doc.saveas(path)
    return path


def drawing(tmp_path, name, build, insunits=4):
    doc = ezdxf.new()
    doc.header["$INSUNITS"] = insunits
    build(doc.modelspace())
    return save(doc, tmp_path, name)


def good_plate(msp):
    msp.add_lwpolyline([(0, 0), (60, 0), (60, 40), (0, 40)], close=True, dxfattribs={"layer": "cut"})
    msp.add_circle((20, 20), 6, dxfattribs={"layer": "cut"})
    msp.add_circle((40, 20), 6, dxfattribs={"layer": "cut"})
    msp.add_text("A-A", dxfattribs={"layer": "text"})


def test_good_drawing_report_and_exit_code(cli, tmp_path):
    path = drawing(tmp_path, "plate.dxf", good_plate)
    report = check_file(path)
    assert report.ok and report.verdict == "analysable"
    assert report.entities == {"LWPOLYLINE": 1, "CIRCLE": 2, "TEXT": 1}
    assert report.skipped == {"TEXT": 1}
    assert (report.loops, report.holes, report.islands, len(report.parts)) == (3, 2, 0, 1)
    assert report.unit == "mm" and "$INSUNITS = 4" in report.unit_note
    assert report.chord_tolerance is not None and report.chord_tolerance > 0
    assert [layer.name for layer in report.layers] == ["cut"]
    code, out, err = cli("check", path)
    assert code == 0, err
    assert err == ""
    for words in ("entities: 2 CIRCLE, 1 LWPOLYLINE, 1 TEXT", "left out, not geometry: 1 TEXT",
                  "cut: 3 loops", "loops: 3 (1 outer loop, 2 holes, 0 islands)", "parts: 1",
                  "part 1: 60 x 40 mm at (0, 0)", "chord tolerance", "defects: 0 errors, 0 warnings",
                  "result: analysable"):
        assert words in out, words


def open_square(msp):
    msp.add_line((0, 0), (100, 0))
    msp.add_line((100, 0), (100, 100))
    msp.add_line((100, 100), (0, 100))
    msp.add_line((0, 100), (0, 0.01))


def test_open_chain_free_ends_and_gap(cli, tmp_path):
    path = drawing(tmp_path, "open.dxf", open_square)
    report = check_file(path)
    assert not report.ok
    [defect] = report.errors
    assert defect.kind == "open chain"
    # pytest.approx takes flat sequences only (pytest >= 9.2 refuses nested ones)
    ends = np.array(sorted(defect.where), dtype=float)
    np.testing.assert_allclose(ends, [(0.0, 0.0), (0.0, 0.01)], rtol=0, atol=1e-12)
    assert "0.01 away" in defect.message
    code, out, err = cli("check", path)
    assert code == 1
    assert "error: open chain on layer 0 (4 pieces" in out and "(0, 0.01)" in out
    assert len(err.splitlines()) == 1 and "Traceback" not in err


def test_self_crossing_overlap_duplicate_zero_length(tmp_path):
    def build(msp):
        msp.add_lwpolyline([(0, 0), (10, 10), (10, 0), (0, 10)], close=True)  # bow-tie at (5, 5)
        msp.add_lwpolyline([(20, 0), (30, 0), (30, 10), (20, 10)], close=True)
        msp.add_lwpolyline([(25, 5), (35, 5), (35, 15), (25, 15)], close=True)  # overlaps the last
        msp.add_line((50, 0), (60, 0))
        msp.add_line((60, 0), (50, 0))  # a repeat, backwards
        msp.add_line((70, 70), (70, 70))  # zero length

    report = check_file(drawing(tmp_path, "bad.dxf", build))
    kinds = {d.kind: d for d in report.defects}
    assert kinds["self-crossing"].point == pytest.approx((5.0, 5.0))
    assert kinds["crossing loops"].fatal
    x, y = kinds["crossing loops"].point
    assert (x, y) in [pytest.approx(p) for p in [(30, 5), (25, 10)]]
    assert not kinds["duplicate"].fatal and kinds["duplicate"].where == ((55.0, 0.0),)
    assert not kinds["zero length"].fatal and kinds["zero length"].where == ((70.0, 70.0),)
    assert "open chain" in kinds  # the lone line 50..60 is open
    assert not report.ok
    text = format_report(report)
    assert "crosses itself at (5, 5)" in text and "repeats LINE" in text and "zero length" in text


def test_several_parts_are_listed_and_can_be_picked(cli, tmp_path):
    def build(msp):
        msp.add_lwpolyline([(0, 0), (30, 0), (30, 10), (0, 10)], close=True)
        msp.add_lwpolyline([(50, 0), (60, 0), (60, 10), (50, 10)], close=True)

    path = drawing(tmp_path, "two.dxf", build)
    report = check_file(path)
    assert not report.ok and "--part N" in report.verdict and not report.errors
    assert [(p.number, p.area) for p in report.parts] == [(1, 300.0), (2, 100.0)]
    assert check_file(path, part=2).ok and check_file(path, all_parts=True).ok
    code, out, _ = cli("check", path, "--part", "2")
    assert code == 0 and "result: analysable" in out


def test_plot_marks_defects(cli, tmp_path):
    path = drawing(tmp_path, "open.dxf", open_square)
    png = tmp_path / "defects.png"
    code, _, _ = cli("check", path, "--plot", png)
    assert code == 1  # not analysable, but the plot is the point of asking
    assert png.read_bytes().startswith(PNG_MAGIC)
    good = drawing(tmp_path, "plate.dxf", good_plate)
    svg = tmp_path / "plate.svg"
    plot_report(check_file(good), svg)
    assert b"<svg" in svg.read_bytes()[:500]
    with pytest.raises(Exception, match="png, .pdf or .svg"):
        plot_report(check_file(good), tmp_path / "plate.gif")


def test_unreadable_file_no_plot(cli, tmp_path):
    path = tmp_path / "empty.dxf"
    path.write_text("")
    png = tmp_path / "empty.png"
    code, out, err = cli("check", path, "--plot", png)
    assert code == 1 and out == "" and not png.exists()
    assert len(err.splitlines()) == 1 and "file is empty" in err
    with pytest.raises(InputFileError):
        check_file(path)


def test_truncated_file_is_a_defect(tmp_path):
    path = drawing(tmp_path, "plate.dxf", good_plate)
    data = path.read_bytes()
    cut = tmp_path / "cut.dxf"
    cut.write_bytes(data[: int(len(data) * 0.97)])
    report = check_file(cut)
    assert not report.ok
    assert any(d.kind == "truncated" and d.fatal for d in report.defects)


def test_outline_files_are_checked_too(cli, box_file, tmp_path):
    report = check_file(box_file)
    assert report.ok and report.kind == "coordinate outline"
    assert (report.loops, report.holes, len(report.parts)) == (2, 1, 1)
    bad = tmp_path / "bowtie.txt"
    bad.write_text("0 0\n10 10\n10 0\n0 10\n")
    report = check_file(bad)
    assert not report.ok and report.errors[0].point == pytest.approx((5.0, 5.0))
    code, out, err = cli("check", bad)
    assert code == 1 and "crosses itself" in out and len(err.splitlines()) == 1
    code, _, err = cli("check", box_file, "--layer", "0")
    assert code == 2 and "DXF drawings only" in err
