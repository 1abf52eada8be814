"""DXF drawings that could run away: huge MINSERT arrays, deep nesting with fan-out, huge splines,
cycles in unused blocks, files cut short.

Each case is a small generated drawing and asserts the exact outcome: the value read, or the
refusal and its words. The expansion of block references is counted before anything is built;
the counts are checked against closed forms (common practice, no source: the DXF reference's
MINSERT array places rows x columns copies of its block; block k holding f references of block
k + 1, the last holding one entity, gives s_(L-1) = 1 and s_k = f (1 + s_(k+1)), so the
reference in model space expands to 1 + s_0 = (f^L - 1) / (f - 1) + f^(L-1) entities).

The cases that would run away if the count were not made first run in a subprocess with a time
limit and a 2 GB memory limit, as a safety net only; their timings are measured by
``scripts/bench_limits.py``, not here.
"""

import math

import ezdxf
import numpy as np
import pytest

from support.limits import python_limited, warpwise_limited
from warpwise.errors import InputFileError, UsageError
from warpwise.io import ReadOptions, load_profile
from warpwise.io.dxf import CHORD_AREA_BUDGET, MAX_ENTITIES, read_drawing
from warpwise.io.dxf.blocks import Expansion, count_expansion
from warpwise.io.dxf.document import TRUNCATED
from warpwise.io.dxf.splines import MAX_FIT_POINTS
from warpwise.io.progress import ProgressLine

#: Address space of each subprocess (a refusal takes about 100 MB, scripts/bench_limits.py).
MEMORY_LIMIT = 2 * 1024**3
#: Seconds a subprocess may take (each takes 1-4 s, scripts/bench_limits.py).
TIME_LIMIT = 120


def limited(*args):
    """``python ARGS`` in a subprocess with the time and memory limits; (code, stdout, stderr)."""
    return python_limited(*args, memory=MEMORY_LIMIT, seconds=TIME_LIMIT)


def warpwise(*args):
    return warpwise_limited(*args, memory=MEMORY_LIMIT, seconds=TIME_LIMIT)


def new_doc():
    doc = ezdxf.new()
    doc.header["$INSUNITS"] = 4  # mm
    return doc, doc.modelspace()


def too_many(n, limit=MAX_ENTITIES):
    return (f"the drawing expands to {n:,} entities (each copy of a block counted), more than the "
            f"limit of {limit:,}; --max-entities N lifts the limit")


def fan_out(path, levels, fan):
    """Block k holds ``fan`` references of block k + 1; the last one line; one in model space."""
    doc, msp = new_doc()
    for k in range(levels):
        blk = doc.blocks.new(f"LEVEL{k}")
        if k + 1 < levels:
            for j in range(fan):
                blk.add_blockref(f"LEVEL{k + 1}", (j, 0))
        else:
            blk.add_line((0, 0), (1, 0))
    msp.add_blockref("LEVEL0", (0, 0))
    doc.saveas(path)
    return (fan**levels - 1) // (fan - 1) + fan ** (levels - 1)


def squares_array(path, rows, columns):
    """A MINSERT array of unit squares two apart: rows x columns separate parts."""
    doc, msp = new_doc()
    doc.blocks.new("SQUARE").add_lwpolyline([(0, 0), (1, 0), (1, 1), (0, 1)], close=True)
    msp.add_blockref("SQUARE", (0, 0), dxfattribs={
        "row_count": rows, "column_count": columns, "row_spacing": 2, "column_spacing": 2})
    doc.saveas(path)


# --- block references: counted before they are built --------------------------------------------


def test_a_million_copy_minsert_is_refused_before_it_is_expanded(tmp_path):
    doc, msp = new_doc()
    doc.blocks.new("CELL").add_line((0, 0), (1, 0))
    msp.add_blockref("CELL", (0, 0), dxfattribs={
        "row_count": 1000, "column_count": 1000, "row_spacing": 2, "column_spacing": 2})
    path = tmp_path / "million.dxf"
    doc.saveas(path)
    # 10^6 cells, each one reference and one line
    for command in ("props", "check"):
        code, out, err = warpwise(command, path)
        assert (code, out, err) == (1, "", f"warpwise: error: {path}: {too_many(2_000_000)}\n")


def test_the_count_of_a_minsert_array_is_exact_at_the_limit(tmp_path):
    path = tmp_path / "squares.dxf"
    squares_array(path, 20, 30)  # 600 cells, each one reference and one polyline: 1,200
    with pytest.raises(InputFileError) as err:
        read_drawing(path, max_entities=1199)
    assert err.value.message == too_many(1200, 1199)
    assert len(read_drawing(path, max_entities=1200).pieces) == 600
    # straight edges only: the polygons are the section, exact to round-off
    assert load_profile(path, all_parts=True, max_entities=1200).area == pytest.approx(600.0, rel=1e-12)


def test_the_option_lifts_the_limit_from_the_command_line(tmp_path, cli):
    path = tmp_path / "squares.dxf"
    squares_array(path, 20, 30)
    code, out, err = cli("check", path, "--all-parts", "--max-entities", "1199")
    assert (code, out, err) == (1, "", f"warpwise: error: {path}: {too_many(1200, 1199)}\n")
    code, out, err = cli("check", path, "--all-parts", "--max-entities", "1200")
    assert code == 0, err
    assert "  parts: 600\n" in out and "  result: analysable\n" in out


def test_nesting_with_fan_out_is_counted_not_built(tmp_path):
    path = tmp_path / "fan_out.dxf"
    n = fan_out(path, 30, 2)
    assert n == 1_610_612_735
    code, out, err = warpwise("props", path)
    assert (code, out, err) == (1, "", f"warpwise: error: {path}: {too_many(n)}\n")


def test_each_block_is_counted_once_however_often_it_is_reached(tmp_path):
    # 60 levels of two references each reach the last block 2^59 times; counting without
    # remembering each block's size would not end
    path = tmp_path / "diamond.dxf"
    n = fan_out(path, 60, 2)
    assert n == 2**60 - 1 + 2**59
    code, out, err = warpwise("check", path)
    assert (code, out, err) == (1, "", f"warpwise: error: {path}: {too_many(n)}\n")


def test_count_of_a_minsert_inside_a_block(tmp_path):
    doc, msp = new_doc()
    inner = doc.blocks.new("INNER")
    inner.add_line((0, 0), (1, 0))
    inner.add_line((1, 0), (1, 1))
    outer = doc.blocks.new("OUTER")
    outer.add_circle((0, 0), 1)
    outer.add_blockref("INNER", (5, 0), dxfattribs={
        "row_count": 3, "column_count": 4, "row_spacing": 3, "column_spacing": 3})
    outer.add_attdef("TAG", (0, 0))  # an attribute definition is not drawn, not counted
    msp.add_line((0, 0), (-1, 0))
    msp.add_blockref("OUTER", (0, 0))
    # OUTER: the circle and 12 cells of (1 reference + 2 lines) = 37; model space: the line and
    # the reference with its 37
    assert count_expansion(doc, list(msp)) == Expansion(39, ())


def test_a_cycle_in_a_block_the_drawing_does_not_use_is_no_error(tmp_path):
    doc, msp = new_doc()
    loop = doc.blocks.new("UNUSED")
    loop.add_blockref("UNUSED", (1, 0))
    msp.add_lwpolyline([(0, 0), (40, 0), (40, 20), (0, 20)], close=True)
    path = tmp_path / "unused_cycle.dxf"
    doc.saveas(path)
    drawing = read_drawing(path)
    assert drawing.defects == () and drawing.repairs == ()
    assert load_profile(path).area == pytest.approx(800.0, rel=1e-12)


# --- the option ---------------------------------------------------------------------------------


def test_the_entity_limit_applies_to_drawings_only(box_file, cli):
    code, out, err = cli("props", box_file, "--max-entities", "10")
    assert (code, out, err) == (2, "", f"warpwise: error: {box_file}: --max-entities applies to DXF "
                                       "drawings only\n")


@pytest.mark.parametrize("value", [0, 2.5, True])
def test_the_entity_limit_must_be_a_whole_number_of_1_or_more(value):
    with pytest.raises(UsageError) as err:
        ReadOptions(max_entities=value)
    assert err.value.message == ("the entity limit (--max-entities) must be a whole number, 1 or more, "
                                 f"got {value!r}")


def test_a_zero_entity_limit_is_a_usage_error(cli, box_file):
    code, out, err = cli("props", box_file, "--max-entities", "0")
    assert (code, out, err) == (2, "", "warpwise: error: warpwise props: argument --max-entities: "
                                       "must be 1 or more, got 0 (see --help)\n")


# --- splines --------------------------------------------------------------------------------------


def parabola_spline(path, n):
    """y = 20 + x (100 - x) / 100 on 0 <= x <= 100 as a clamped cubic B-spline of n control points,
    closed by three straight sides below; the area is 2000 + 10^4/6 = 11000/3 exactly.

    A polynomial curve of degree <= 3 is a cubic B-spline on any knot vector, its control
    points the blossoms of its coordinates at the knots (t_(i+1), t_(i+2), t_(i+3)) (common
    practice, no source: de Boor's blossoming; for t the blossom is (a + b + c) / 3, for t^2
    it is (ab + bc + ca) / 3).
    """
    doc, msp = new_doc()
    knots = np.concatenate([[0.0] * 3, np.linspace(0.0, 100.0, n - 2), [100.0] * 3])
    a, b, c = knots[1:n + 1], knots[2:n + 2], knots[3:n + 3]
    x = (a + b + c) / 3
    y = 20 + x - (a * b + b * c + c * a) / 300
    msp.add_open_spline(np.column_stack([x, y, 0 * x]).tolist(), degree=3, knots=knots.tolist())
    msp.add_lwpolyline([(100, 20), (100, 0), (0, 0), (0, 20)])
    doc.saveas(path)


def test_a_spline_of_200_control_points_is_drawn_within_the_chord_budget(tmp_path):
    path = tmp_path / "parabola.dxf"
    parabola_spline(path, 200)
    area = load_profile(path).area
    # chords under a curve that bends down lose area: below the exact area, by at most the
    # budget the reader chooses its chord tolerance for
    assert 11000 / 3 * (1 - CHORD_AREA_BUDGET) <= area < 11000 / 3


def test_a_spline_of_100000_control_points_answers(tmp_path):
    path = tmp_path / "parabola_100k.dxf"
    parabola_spline(path, 100_000)
    code, out, err = limited("-c", "import sys; from warpwise.io import load_profile; "
                             "print(repr(load_profile(sys.argv[1]).area))", path)
    assert code == 0, err
    assert 11000 / 3 * (1 - CHORD_AREA_BUDGET) <= float(out) < 11000 / 3


def test_a_rational_spline_circle_has_its_vertices_on_the_circle(tmp_path):
    # the nine-point NURBS circle: quadratic, corner weights sqrt(2)/2, knots 0 0 0 1 1 2 2 3 3
    # 4 4 4 (from memory: the standard rational quadratic circle)
    r = 10.0
    ctrl = [(r, 0), (r, r), (0, r), (-r, r), (-r, 0), (-r, -r), (0, -r), (r, -r), (r, 0)]
    w = [1, math.sqrt(0.5)] * 4 + [1]
    doc, msp = new_doc()
    msp.add_rational_spline([(x, y, 0) for x, y in ctrl], w, degree=2,
                            knots=[0, 0, 0, 1, 1, 2, 2, 3, 3, 4, 4, 4])
    path = tmp_path / "nurbs_circle.dxf"
    doc.saveas(path)
    pts = read_drawing(path).pieces[0].sample(1e-3)
    # on the circle to round-off; chords within the tolerance: sagitta r (1 - cos(pi / n)) <= 1e-3
    assert np.abs(np.hypot(*pts.T) - r) == pytest.approx(np.zeros(len(pts)), abs=1e-12)
    n = len(pts)
    assert r * (1 - math.cos(math.pi / n)) <= 1e-3
    area = load_profile(path).area  # an inscribed polygon: below pi r^2, within the budget
    assert math.pi * r * r * (1 - CHORD_AREA_BUDGET) <= area < math.pi * r * r


def test_a_fit_point_spline_too_big_to_interpolate_is_refused(tmp_path):
    x = np.linspace(0.0, 100.0, MAX_FIT_POINTS + 1)
    doc, msp = new_doc()
    spline = msp.add_spline(fit_points=np.column_stack([x, 20 + x * (100 - x) / 100, 0 * x]).tolist())
    msp.add_lwpolyline([(100, 20), (100, 0), (0, 0), (0, 20)])
    blk = doc.blocks.new("CURVE")
    blk.add_spline(fit_points=np.column_stack([x, 0 * x + 1, 0 * x]).tolist())
    path = tmp_path / "fit_points.dxf"
    doc.saveas(path)
    # 2,001^2 numbers of 8 bytes: 32 MB
    words = ("is given by 2,001 fit points and no control points, more than the 2,000 that are "
             "interpolated (an n x n matrix, at least 32 MB here); save the spline with its "
             "control points in the CAD program")
    with pytest.raises(InputFileError) as err:
        read_drawing(path)
    assert err.value.message == f"SPLINE #{spline.dxf.handle} {words}"
    doc.modelspace().delete_entity(spline)
    doc.modelspace().add_blockref("CURVE", (0, 0))
    doc.saveas(path)
    with pytest.raises(InputFileError) as err:
        read_drawing(path)
    assert err.value.message.startswith("SPLINE in block 'CURVE' (INSERT #")
    assert err.value.message.endswith(words)


# --- files cut short ------------------------------------------------------------------------------


def _box(path, fmt):
    doc, msp = new_doc()
    msp.add_lwpolyline([(0, 0), (40, 0), (40, 20), (0, 20)], close=True)
    doc.saveas(path, fmt=fmt)
    return path.read_bytes()


def _cut(data, where):
    if where == "inside a group code":  # ezdxf itself said "Invalid group code"
        return data[:data.index(b"\n  0\n", len(data) // 2) + 3]
    if where == "inside the polyline":
        return data[:data.index(b"LWPOLYLINE") + 40]
    return data[:data.rindex(b"EOF")]  # "before the end-of-file marker"


@pytest.mark.parametrize(("fmt", "where", "said"), [
    ("asc", "inside a group code", f"cannot be read: {TRUNCATED}"),
    ("asc", "inside the polyline", f"no closed loop found; {TRUNCATED}"),
    ("asc", "before the end-of-file marker", TRUNCATED),
    ("bin", "inside the polyline", f"binary DXF file cannot be read: {TRUNCATED}"),
    # read by ezdxf without its marker, and analysed without a word before
    ("bin", "before the end-of-file marker", f"binary DXF file cannot be read: {TRUNCATED}"),
])
def test_a_file_cut_short_is_called_truncated(tmp_path, cli, fmt, where, said):
    path = tmp_path / "cut.dxf"
    path.write_bytes(_cut(_box(path, fmt), where))
    for command in ("props", "check"):
        code, _, err = cli(command, path)
        assert (code, err) == (1, f"warpwise: error: {path}: {said}\n")


# --- progress -----------------------------------------------------------------------------------


class _Terminal:
    def __init__(self, tty):
        self.tty, self.text = tty, ""

    def isatty(self):
        return self.tty

    def write(self, s):
        self.text += s

    def flush(self):
        pass


def test_the_progress_line_shows_on_a_terminal_only_and_is_cleared():
    term, pipe = _Terminal(True), _Terminal(False)
    for stream in (term, pipe):
        line = ProgressLine("reading big.dxf", 200_000, "entities", stream=stream, delay=0.0)
        line.update(50_000)
        line.close()
    shown = "reading big.dxf: [#######.......................] 50,000/200,000 entities"
    assert term.text == "\r" + shown + "\r" + " " * len(shown) + "\r"
    assert pipe.text == ""


def test_no_progress_line_before_the_delay():
    term = _Terminal(True)
    line = ProgressLine("reading big.dxf", 10, "entities", stream=term, delay=3600.0)
    line.update(5)
    line.close()
    assert term.text == ""
