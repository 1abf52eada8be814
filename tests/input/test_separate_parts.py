"""One rule for separate parts in every reader: a coordinate outline as a DXF drawing.

A file of one part is that part; of several, --part N takes one (largest area first),
--all-parts takes them all as one section, and nothing else is accepted (the refusal names both
options). Regions of different materials that share an edge are one part (a bonded composite);
an island inside a hole is a part of its own. Areas are shoelace areas of the rectangles
written (closed form), exact to round-off (1e-12).
"""

import json

import ezdxf
import pytest

from conftest import assert_one_line_error
from warpwise.errors import ProfileError, UsageError
from warpwise.io import load_profile, parse_outline

BIG = [(0, 0), (30, 0), (30, 10), (0, 10)]      # 300 mm2
SMALL = [(50, 0), (60, 0), (60, 10), (50, 10)]  # 100 mm2

LISTING = ("2 separate parts (part 1: 30 x 10 mm at (0, 0), area 300 mm2; part 2: 10 x 10 mm at "
           "(50, 0), area 100 mm2)")


def outline(*loops, head="units: mm\n"):
    return head + "\n".join("\n".join(f"{x} {y}" for x, y in loop) + "\n" for loop in loops)


@pytest.fixture
def pair_txt(tmp_path):
    f = tmp_path / "pair.txt"
    f.write_text(outline(SMALL, BIG))  # the smaller written first: numbering is by area
    return f


@pytest.fixture
def pair_dxf(tmp_path):
    doc = ezdxf.new()
    doc.header["$INSUNITS"] = 4  # millimetres
    for loop in (SMALL, BIG):
        doc.modelspace().add_lwpolyline(loop, close=True)
    f = tmp_path / "pair.dxf"
    doc.saveas(f)
    return f


def test_outline_of_two_parts_is_refused_naming_both_options(pair_txt):
    with pytest.raises(ProfileError) as exc:
        load_profile(pair_txt)
    assert str(exc.value) == (f"{pair_txt}: the file holds {LISTING}; analyse one with --part N "
                              "(largest area first), or all as one section with --all-parts")


def test_drawing_of_the_same_parts_lists_them_the_same_way(pair_dxf):
    with pytest.raises(ProfileError) as exc:
        load_profile(pair_dxf)
    assert f"{pair_dxf}: the drawing holds {LISTING} and no hatch marks one as the section; " \
           "analyse one with --part N" in str(exc.value)
    assert str(exc.value).endswith("or all as one section with --all-parts")


@pytest.mark.parametrize("kind", ["txt", "dxf"])
def test_part_and_all_parts_choose_alike(kind, pair_txt, pair_dxf):
    f = pair_txt if kind == "txt" else pair_dxf
    one, two, both = (load_profile(f, part=1), load_profile(f, part=2),
                      load_profile(f, all_parts=True))
    assert (one.area, two.area, both.area) == (pytest.approx(300.0, rel=1e-12),
                                               pytest.approx(100.0, rel=1e-12),
                                               pytest.approx(400.0, rel=1e-12))
    assert "part 1 of 2" in one.notes and "part 2 of 2" in two.notes
    assert any(n.startswith("all 2 parts analysed as one section: J is the sum of the parts' J")
               for n in both.notes)
    holder = "file" if kind == "txt" else "drawing"
    with pytest.raises(UsageError) as exc:
        load_profile(f, part=3)
    assert str(exc.value) == f"{f}: part 3 does not exist: the {holder} has 2 parts"


def test_part_and_all_parts_together_are_a_usage_error(pair_txt, cli):
    code, out, err = cli("props", pair_txt, "--part", "1", "--all-parts")
    assert code == 2 and out == "" and "Traceback" not in err
    assert "not allowed with argument" in err  # argparse's mutually exclusive group


def test_command_line_refusal_and_choice(pair_txt, cli):
    code, out, err = cli("props", pair_txt)
    assert code == 1 and out == ""
    assert_one_line_error(code, err, f"{pair_txt}: the file holds {LISTING}", "--part N",
                          "--all-parts")
    code, out, err = cli("props", pair_txt, "--part", "2", "--json")
    assert code == 0 and json.loads(out)["A"] == pytest.approx(100.0, rel=1e-12)


def test_one_part_with_part_one_is_that_part(tmp_path):
    p = parse_outline(outline(BIG), source="one.txt", part=1)
    assert p.area == pytest.approx(300.0, rel=1e-12)
    with pytest.raises(UsageError) as exc:
        parse_outline(outline(BIG), source="one.txt", part=2)
    assert str(exc.value) == "one.txt: part 2 does not exist: the file has 1 part"


def test_bonded_materials_sharing_an_edge_are_one_part():
    # steel 30 x 10 beside a 10 x 10 insert of aluminium sharing the edge x = 30
    text = ("units: mm\nmaterial: steel-S235\n0 0\n30 0\n30 10\n0 10\n\n"
            "material: aluminium-6063-T6\n30 0\n40 0\n40 10\n30 10\n")
    p = parse_outline(text, source="bonded.txt")
    assert p.area == pytest.approx(400.0, rel=1e-12) and len(p.regions) == 2
    assert not any("parts" in n for n in p.notes)


def test_an_insert_inside_a_region_is_one_part():
    # an aluminium 10 x 4 insert inside a steel 30 x 10 bar (cut out of it): one piece
    text = ("units: mm\nmaterial: steel-S235\n0 0\n30 0\n30 10\n0 10\n\n"
            "material: aluminium-6063-T6\n10 3\n20 3\n20 7\n10 7\n")
    p = parse_outline(text, source="insert.txt")
    assert p.area == pytest.approx(300.0, rel=1e-12)


def test_separate_materials_apart_are_two_parts():
    text = ("units: mm\nmaterial: steel-S235\n0 0\n30 0\n30 10\n0 10\n\n"
            "material: aluminium-6063-T6\n50 0\n60 0\n60 10\n50 10\n")
    with pytest.raises(ProfileError) as exc:
        parse_outline(text, source="apart.txt")
    assert str(exc.value).startswith(f"apart.txt: the file holds {LISTING}")


def test_island_in_a_hole_is_a_separate_part():
    ring = [(0, 0), (30, 0), (30, 30), (0, 30)]
    hole = [(5, 5), (25, 5), (25, 25), (5, 25)]
    island = [(10, 10), (20, 10), (20, 20), (10, 20)]
    text = outline(ring, hole, island)
    with pytest.raises(ProfileError) as exc:
        parse_outline(text, source="nest.txt")
    assert ("the file holds 2 separate parts (part 1: 30 x 30 mm at (0, 0), area 500 mm2, 1 hole; "
            "part 2: 10 x 10 mm at (10, 10), area 100 mm2)") in str(exc.value)
    assert parse_outline(text, source="nest.txt", part=2).area == pytest.approx(100.0, rel=1e-12)
    assert parse_outline(text, source="nest.txt", all_parts=True).area == pytest.approx(
        600.0, rel=1e-12)


def test_check_of_an_outline_with_parts_reports_the_refusal(pair_txt, cli):
    code, out, err = cli("check", pair_txt)
    assert code == 1
    assert "the file holds 2 separate parts" in out + err
    code, out, err = cli("check", pair_txt, "--all-parts")
    assert code == 0 and "analysable" in out
