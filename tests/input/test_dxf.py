"""DXF import: entities, chaining, units, layers, parts, curves and broken drawings.

Every drawing is invented here and written with ezdxf into the test's own folder.
"""

import json
import math
import random

import ezdxf
import numpy as np
import pytest

from conftest import assert_one_line_error
from warpwise import analyse
from warpwise.errors import InputFileError, ProfileError, UsageError
from warpwise.geometry.profile import Arc
from warpwise.io import load_profile
from warpwise.io.chains import MAX_ARC_STEP, arcs_for_mesh, chain_pieces, line_piece
from warpwise.io.dxf import import_dxf, read_drawing, read_dxf


def save(doc, tmp_path, name):
    path = tmp_path / name
    doc.saveas(path)
    return path


def new(insunits=None):
    doc = ezdxf.new()
    if insunits is None:
        del doc.header["$INSUNITS"]  # ezdxf writes metres by default
    else:
        doc.header["$INSUNITS"] = insunits
    return doc, doc.modelspace()


# --- tubes: J against the closed form -------------------------------------------------------

D, d = 50.0, 40.0  # invented tube, mm
J_TUBE = math.pi * (D**4 - d**4) / 32  # closed form: J of a circular tube is its polar moment
A_TUBE = math.pi * (D**2 - d**2) / 4  # closed form


def tube_circles(tmp_path):
    doc, msp = new(4)
    msp.add_circle((10, 5), D / 2)
    msp.add_circle((10, 5), d / 2)
    return save(doc, tmp_path, "tube_circles.dxf")


def tube_bulges(tmp_path, old_style=False):
    doc, msp = new(4)
    for r in (D / 2, d / 2):
        pts = [(10 + r, 5, 1.0), (10 - r, 5, 1.0)]  # two half circles, bulge 1 each
        if old_style:
            msp.add_polyline2d(pts, format="xyb", close=True)
        else:
            msp.add_lwpolyline(pts, format="xyb", close=True)
    return save(doc, tmp_path, "tube_bulges.dxf")


@pytest.mark.parametrize("make", [tube_circles, tube_bulges,
                                  lambda p: tube_bulges(p, old_style=True)],
                         ids=["circles", "lwpolyline-bulges", "polyline-bulges"])
def test_tube_torsion_constant(tmp_path, make):
    profile = read_dxf(make(tmp_path))
    assert len(profile.regions) == 1 and len(profile.regions[0].holes) == 1
    res = analyse(profile)
    # the issue asks for 0.1%; with the boundary nodes on the true circles (curved element edges)
    # the measured error is below 1e-9, so 1e-6 still leaves room for changes in the mesher
    assert res.torsion.J == pytest.approx(J_TUBE, rel=1e-6)
    assert res.geometric.A == pytest.approx(A_TUBE, rel=1e-8)
    # the polygon itself (straight chords) is within the promised 1e-4 of the true area
    assert profile.area == pytest.approx(A_TUBE, rel=1e-4)


def test_tube_via_cli_json(cli, tmp_path):
    code, out, err = cli("props", tube_bulges(tmp_path), "--json")
    assert code == 0, err
    obj = json.loads(out)
    assert obj["units"] == {"length": "mm"}
    assert obj["J"] == pytest.approx(J_TUBE, rel=1e-6)  # closed form, reason as above
    assert any("chords at most" in n for n in obj["notes"])


# --- curves: area within 1e-4 at the default chord tolerance --------------------------------

def test_arc_bounded_area_and_tolerance_note(tmp_path):
    # invented: a 60 x 20 bar with half-round ends (r 10) and a 6 mm bore at each end centre
    doc, msp = new(4)
    msp.add_line((0, -10), (40, -10))
    msp.add_arc((40, 0), 10, -90, 90)
    msp.add_line((40, 10), (0, 10))
    msp.add_arc((0, 0), 10, 90, 270)
    msp.add_circle((0, 0), 3)
    msp.add_circle((40, 0), 3)
    result = import_dxf(save(doc, tmp_path, "link.dxf"))
    exact = 40 * 20 + math.pi * 100 - 2 * math.pi * 9  # closed form
    assert result.profile.area == pytest.approx(exact, rel=1e-4)  # the promise of the issue
    # chords always cut inwards on the outline and outwards on the holes; the exact bound is
    # the budget of 5e-5 the reader keeps
    assert abs(result.profile.area / exact - 1) <= 5e-5
    assert any(f"{result.chord_tolerance:.6g}" in n for n in result.profile.notes)
    # with curved element edges the mesh area is closer still (measured 2e-9)
    assert analyse(result.profile).geometric.A == pytest.approx(exact, rel=1e-8)


def test_chord_tolerance_follows_mesh_size(tmp_path):
    path = tube_circles(tmp_path)
    coarse = import_dxf(path).chord_tolerance
    fine = import_dxf(path, mesh_size=0.1).chord_tolerance
    given = import_dxf(path, chord_tolerance=0.05)
    assert fine < coarse
    assert given.chord_tolerance == 0.05
    # the sagitta of the chords is what was asked: r (1 - cos(step / 2)) <= s
    outer = given.profile.regions[0].outer
    step = 2 * math.pi / len(outer)
    assert (D / 2) * (1 - math.cos(step / 2)) <= 0.05 + 1e-12
    assert step <= MAX_ARC_STEP + 1e-12


def test_full_and_partial_ellipse_and_spline(tmp_path):
    # invented: an elliptical plate 80 x 40 with a slot hole ended by two half ellipses
    doc, msp = new(4)
    msp.add_ellipse((0, 0), major_axis=(40, 0), ratio=0.5)
    msp.add_ellipse((-10, 0), major_axis=(0, 5), ratio=0.6, start_param=0, end_param=math.pi)
    msp.add_line((-10, -5), (10, -5))
    msp.add_ellipse((10, 0), major_axis=(0, 5), ratio=0.6, start_param=math.pi, end_param=2 * math.pi)
    msp.add_line((10, 5), (-10, 5))
    profile = read_dxf(save(doc, tmp_path, "ellipses.dxf"))
    # closed forms: ellipse pi a b; the slot is a 20 x 10 rectangle plus one full ellipse 3 x 5
    exact = math.pi * 40 * 20 - (20 * 10 + math.pi * 3 * 5)
    assert len(profile.regions[0].holes) == 1
    assert profile.area == pytest.approx(exact, rel=1e-4)  # the promise of the issue
    # a spline fitted through 32 points of a circle: its area is near pi r^2 (a loose check of
    # the curve reading, not of the fit; common practice, no source)
    doc, msp = new(4)
    t = np.linspace(0, 2 * math.pi, 33)
    msp.add_spline([(20 * math.cos(a), 20 * math.sin(a)) for a in t])
    profile = read_dxf(save(doc, tmp_path, "spline.dxf"))
    assert profile.area == pytest.approx(math.pi * 400, rel=1e-3)


# --- chaining: soup of lines and arcs -------------------------------------------------------

def plate_entities():
    """Invented plate: 100 x 60 rounded rectangle (r 8), a slot hole and a round hole."""
    lines = [((8, 0), (92, 0)), ((100, 8), (100, 52)), ((92, 60), (8, 60)), ((0, 52), (0, 8)),
             ((35, 24), (65, 24)), ((65, 36), (35, 36))]
    arcs = [((92, 8), 8, -90, 0), ((92, 52), 8, 0, 90), ((8, 52), 8, 90, 180), ((8, 8), 8, 180, 270),
            ((65, 30), 6, -90, 90), ((35, 30), 6, 90, 270)]
    circles = [((15, 30), 7)]
    return lines, arcs, circles


PLATE_AREA = (100 * 60 - (4 - math.pi) * 64) - (30 * 12 + math.pi * 36) - math.pi * 49  # closed form


def clean_plate(tmp_path):
    doc, msp = new(4)
    lines, arcs, circles = plate_entities()
    for a, b in lines:
        msp.add_line(a, b)
    for c, r, a0, a1 in arcs:
        msp.add_arc(c, r, a0, a1)
    for c, r in circles:
        msp.add_circle(c, r)
    return save(doc, tmp_path, "plate_clean.dxf")


def soup_plate(tmp_path, gap=1e-6, seed=4):
    rng = random.Random(seed)
    doc, msp = new(4)
    lines, arcs, circles = plate_entities()

    def jiggle(p):
        return (p[0] + rng.uniform(-gap, gap), p[1] + rng.uniform(-gap, gap))

    items = []
    for a, b in lines:
        items.append(("line", (b, a) if rng.random() < 0.5 else (a, b)))
    for arc in arcs:
        items.append(("arc", arc))
    for c in circles:
        items.append(("circle", c))
    rng.shuffle(items)
    for k, (kind, data) in enumerate(items):
        if kind == "line":
            msp.add_line(jiggle(data[0]), jiggle(data[1]))
        elif kind == "circle":
            msp.add_circle(jiggle(data[0]), data[1])
        else:
            c, r, a0, a1 = data
            if k % 2:  # as an ARC (always counter-clockwise in DXF)
                msp.add_arc(jiggle(c), r, a0, a1)
            else:  # as a one-segment polyline run clockwise (negative bulge)
                p0 = (c[0] + r * math.cos(math.radians(a1)), c[1] + r * math.sin(math.radians(a1)))
                p1 = (c[0] + r * math.cos(math.radians(a0)), c[1] + r * math.sin(math.radians(a0)))
                bulge = -math.tan(math.radians(a1 - a0) / 4)
                msp.add_lwpolyline([(*jiggle(p0), bulge), (*jiggle(p1), 0.0)], format="xyb")
    return save(doc, tmp_path, "plate_soup.dxf")


def test_line_arc_soup_gives_the_clean_profile(tmp_path):
    clean = read_dxf(clean_plate(tmp_path))
    soup = read_dxf(soup_plate(tmp_path))
    for p in (clean, soup):
        assert len(p.regions) == 1 and len(p.regions[0].holes) == 2
    assert clean.area == pytest.approx(PLATE_AREA, rel=1e-4)  # closed form, the promise
    # 1e-6 gaps move the outline by at most ~1e-6 mm on a 400 mm perimeter: 1e-7 of the area
    assert soup.area == pytest.approx(clean.area, rel=1e-7)
    rc, rs = analyse(clean), analyse(soup)
    assert rs.geometric.A == pytest.approx(rc.geometric.A, rel=1e-7)
    assert rs.geometric.centroid == pytest.approx(rc.geometric.centroid, abs=1e-5)
    # both meshes differ (other vertex order); each J is within its discretisation error
    assert rs.torsion.J == pytest.approx(rc.torsion.J, rel=1e-5)


def test_gap_on_a_100_mm_part_is_an_open_chain(cli, tmp_path):
    doc, msp = new(4)
    msp.add_line((0, 0), (100, 0))
    msp.add_line((100, 0), (100, 100))
    msp.add_line((100, 100), (0, 100))
    msp.add_line((0, 100), (0, 0.01))  # 1e-2 short of closing
    path = save(doc, tmp_path, "gap.dxf")
    with pytest.raises(ProfileError) as info:
        read_dxf(path)
    text = str(info.value)
    assert "open chain" in text and "(0, 0.01)" in text and "(0, 0)" in text
    assert "0.01 away" in text
    code, out, err = cli("props", path)
    assert_one_line_error(code, err, "gap.dxf", "open chain", "(0, 0.01)")
    assert code == 1 and out == ""


def test_branch_point_is_reported(tmp_path):
    pieces = [line_piece((0, 0), (1, 0)), line_piece((1, 0), (1, 1)), line_piece((1, 1), (0, 0)),
              line_piece((1, 0), (2, 0))]
    res = chain_pieces(pieces, 1e-6)
    assert [d.kind for d in res.defects] == ["branch"]
    assert res.defects[0].where == ((1.0, 0.0),)
    assert len(res.loops) == 1 and len(res.open_chains) == 1


# --- units ---------------------------------------------------------------------------------

def bar(tmp_path, insunits, name="bar.dxf"):
    doc, msp = new(insunits)
    msp.add_lwpolyline([(0, 0), (4, 0), (4, 1), (0, 1)], close=True)
    return save(doc, tmp_path, name)


def test_inches_from_the_header_and_override(cli, tmp_path):
    path = bar(tmp_path, 1)
    code, out, _ = cli("props", path, "--json")
    obj = json.loads(out)
    assert code == 0 and obj["units"] == {"length": "in"}
    assert obj["A"] == pytest.approx(4.0, rel=1e-12)  # in2, exact polygon
    code, out, _ = cli("props", path, "--json", "--units", "mm")
    obj = json.loads(out)
    assert code == 0 and obj["units"] == {"length": "mm"} and obj["A"] == pytest.approx(4.0, rel=1e-12)


def test_unknown_units_assume_mm_once(tmp_path):
    for code in (None, 0):
        p = read_dxf(bar(tmp_path, code, f"bar{code}.dxf"))
        assert p.units == "mm"
        assert sum("millimetres assumed" in n for n in p.notes) == 1


def test_feet_stay_feet(tmp_path):
    p = read_dxf(bar(tmp_path, 2))
    assert p.units == "ft" and p.area == pytest.approx(4.0, rel=1e-12)


# --- layers, non-geometry, blocks -------------------------------------------------------------

def test_layers_default_pick_and_skipped_entities(cli, tmp_path):
    doc, msp = new(4)
    msp.add_lwpolyline([(0, 0), (50, 0), (50, 30), (0, 30)], close=True, dxfattribs={"layer": "outline"})
    msp.add_circle((15, 15), 5, dxfattribs={"layer": "holes"})
    msp.add_line((-10, 15), (60, 15), dxfattribs={"layer": "centre lines"})  # open: layer left out
    msp.add_text("PLATE", dxfattribs={"layer": "notes"}).set_placement((0, 40))
    msp.add_mtext("drawn by nobody", dxfattribs={"layer": "notes"})
    msp.add_point((1, 1))
    dim = msp.add_linear_dim(base=(0, -10), p1=(0, 0), p2=(50, 0), dxfattribs={"layer": "dims"})
    dim.render()
    hatch = msp.add_hatch(dxfattribs={"layer": "hatch"})
    hatch.paths.add_polyline_path([(0, 0), (50, 0), (50, 30), (0, 30)], is_closed=True)
    path = save(doc, tmp_path, "layers.dxf")

    result = import_dxf(path)
    p = result.profile
    assert len(p.regions) == 1 and len(p.regions[0].holes) == 1
    assert sorted(result.loop_layers) == ["holes", "outline"]
    assert p.materials == (None,)  # layers are kept beside, not as materials
    assert p.area == pytest.approx(1500 - math.pi * 25, rel=1e-4)  # closed form
    drawing = read_drawing(path)
    for kind in ("TEXT", "MTEXT", "POINT", "DIMENSION"):
        assert drawing.skipped.get(kind, 0) >= 1, drawing.skipped
    # the hatch is read (its boundary repeats the outline, so it marks it, tests/input/test_dxf_sheets.py)
    assert "HATCH" not in drawing.skipped and len(drawing.hatches) == 1
    assert any("centre lines" in n for n in p.notes)

    only_outline = read_dxf(path, layers=["outline"])
    assert len(only_outline.regions[0].holes) == 0
    assert read_dxf(path, layers=["OUTLINE", "holes"]).area == pytest.approx(p.area)  # any case
    with pytest.raises(UsageError, match="layer 'nothing'"):
        read_dxf(path, layers=["nothing"])
    code, _, err = cli("props", path, "--layer", "nothing")
    assert code == 2 and "Traceback" not in err
    code, out, _ = cli("props", path, "--layer", "outline", "--json")
    assert code == 0 and json.loads(out)["A"] == pytest.approx(1500.0, rel=1e-12)


def test_layer_materials_on_request(tmp_path):
    doc, msp = new(4)
    msp.add_lwpolyline([(0, 0), (40, 0), (40, 20), (0, 20)], close=True, dxfattribs={"layer": "alu"})
    msp.add_lwpolyline([(10, 5), (30, 5), (30, 15), (10, 15)], close=True, dxfattribs={"layer": "steel"})
    path = save(doc, tmp_path, "composite.dxf")
    assert len(read_dxf(path).regions[0].holes) == 1  # by default one material: a hole
    p = read_dxf(path, layer_materials=True)
    assert sorted(p.materials) == ["alu", "steel"]
    p = read_dxf(path, layer_materials={"alu": "AlMgSi0.5", "steel": "S235"})
    assert sorted(p.materials) == ["AlMgSi0.5", "S235"]


def test_block_references_with_transforms(tmp_path):
    doc, msp = new(4)
    blk = doc.blocks.new("PLATE")
    blk.add_lwpolyline([(0, 0), (20, 0), (20, 10), (0, 10)], close=True)  # layer 0: takes INSERT's
    blk.add_circle((5, 5), 2)
    inner = doc.blocks.new("NUT")
    inner.add_circle((0, 0), 1, dxfattribs={"layer": "own"})
    blk.add_blockref("NUT", (15, 5))
    msp.add_blockref("PLATE", (100, 50), dxfattribs={"xscale": 2, "yscale": -2, "rotation": 90,
                                                     "layer": "parts"})
    path = save(doc, tmp_path, "blocks.dxf")
    result = import_dxf(path)
    p = result.profile
    assert len(p.regions) == 1 and len(p.regions[0].holes) == 2
    # scaled by 2 (area x4), mirrored and turned: closed form area and bounding box
    assert p.area == pytest.approx(4 * (200 - math.pi * 4 - math.pi * 1), rel=1e-4)
    x0, y0, x1, y1 = p.bounds
    # (x, y) -> (2x, -2y), turned 90 degrees, moved by (100, 50)
    assert (x0, y0, x1, y1) == pytest.approx((100, 50, 120, 90), abs=1e-9)
    assert sorted(result.loop_layers) == ["own", "parts", "parts"]
    # the circles keep their true centres and radii (curved element edges need them)
    centres = sorted((round(a.cx, 9), round(a.cy, 9), round(a.r, 12)) for a in p.arcs)
    assert centres == [(110.0, 60.0, 4.0), (110.0, 80.0, 2.0)]


def test_flat_3d_polyline_accepted_tilted_left_out(tmp_path):
    doc, msp = new(4)
    msp.add_polyline3d([(0, 0, 0), (10, 0, 0), (10, 5, 0), (0, 5, 0)], close=True)
    msp.add_polyline3d([(20, 0, 0), (30, 0, 1), (30, 5, 2)], close=True)  # not flat
    path = save(doc, tmp_path, "poly3d.dxf")
    result = import_dxf(path)
    assert result.profile.area == pytest.approx(50.0, rel=1e-12)
    assert any(d.kind == "not flat" for d in read_drawing(path).defects)


def test_duplicates_and_zero_length_are_left_out(tmp_path):
    doc, msp = new(4)
    for a, b in [((0, 0), (10, 0)), ((10, 0), (10, 10)), ((10, 10), (0, 10)), ((0, 10), (0, 0))]:
        msp.add_line(a, b)
    msp.add_line((10, 0), (0, 0))  # a repeat, drawn backwards
    msp.add_line((5, 5), (5, 5))  # zero length
    msp.add_circle((5, 5), 2)
    msp.add_circle((5, 5), 2)  # a repeat
    result = import_dxf(save(doc, tmp_path, "dups.dxf"))
    assert result.profile.area == pytest.approx(100 - math.pi * 4, rel=1e-4)
    assert any(n.startswith("repaired: 2 duplicate, 1 zero length") for n in result.profile.notes)


# --- parts -----------------------------------------------------------------------------------

def two_parts(tmp_path):
    doc, msp = new(4)
    msp.add_lwpolyline([(0, 0), (30, 0), (30, 10), (0, 10)], close=True)
    msp.add_lwpolyline([(50, 0), (60, 0), (60, 10), (50, 10)], close=True)
    return save(doc, tmp_path, "two.dxf")


def test_several_parts_need_a_choice(cli, tmp_path):
    path = two_parts(tmp_path)
    with pytest.raises(ProfileError) as info:
        read_dxf(path)
    text = str(info.value)
    assert "2 separate parts" in text and "--part N" in text and "--all-parts" in text
    assert "part 1: 30 x 10 mm at (0, 0), area 300 mm2" in text
    assert "part 2: 10 x 10 mm at (50, 0), area 100 mm2" in text
    assert read_dxf(path, part=1).area == pytest.approx(300.0)
    assert read_dxf(path, part=2).area == pytest.approx(100.0)
    assert read_dxf(path, all_parts=True).area == pytest.approx(400.0)
    with pytest.raises(UsageError, match="part 3 does not exist"):
        read_dxf(path, part=3)
    code, _, err = cli("props", path)
    assert_one_line_error(code, err, "--part N")
    code, out, _ = cli("props", path, "--part", "2", "--json")
    assert code == 0 and json.loads(out)["A"] == pytest.approx(100.0)
    code, _, err = cli("props", path, "--part", "1", "--all-parts")
    assert code == 2 and "Traceback" not in err


def test_load_profile_refuses_dxf_options_for_outlines(box_file):
    with pytest.raises(UsageError, match="--layer applies to DXF"):
        load_profile(box_file, layers=["0"])
    # --part and --all-parts apply to outline files too (one rule for separate parts)
    assert load_profile(box_file, part=1).area == load_profile(box_file).area
    with pytest.raises(UsageError, match="part 2 does not exist: the file has 1 part$"):
        load_profile(box_file, part=2)


# --- broken drawings --------------------------------------------------------------------------

def broken_files(tmp_path):
    files = {}
    doc, msp = new(4)
    msp.add_lwpolyline([(0, 0), (40, 0), (40, 20), (0, 20)])  # open
    files["open"] = save(doc, tmp_path, "open.dxf")
    doc, msp = new(4)
    msp.add_lwpolyline([(0, 0), (10, 10), (10, 0), (0, 10)], close=True)  # bow-tie
    files["bow-tie"] = save(doc, tmp_path, "bowtie.dxf")
    (tmp_path / "empty.dxf").write_text("")
    files["empty"] = tmp_path / "empty.dxf"
    whole = tube_circles(tmp_path).read_bytes()
    (tmp_path / "truncated.dxf").write_bytes(whole[: int(len(whole) * 0.97)])
    files["truncated"] = tmp_path / "truncated.dxf"
    (tmp_path / "random.dxf").write_bytes(random.Random(1).randbytes(5000))
    files["random"] = tmp_path / "random.dxf"
    png = b"\x89PNG\r\n\x1a\n\x00\x00\x00\rIHDR" + bytes(200)
    (tmp_path / "picture.dxf").write_bytes(png)
    files["binary"] = tmp_path / "picture.dxf"
    (tmp_path / "words.dxf").write_text("this is a letter, not a drawing\n")
    files["text"] = tmp_path / "words.dxf"
    return files


EXPECTED = {"open": "open chain", "bow-tie": "crosses itself at (5, 5)", "empty": "file is empty",
            "truncated": "truncated", "random": "not a DXF drawing", "binary": "binary file",
            "text": "not a DXF drawing"}


@pytest.mark.parametrize("kind", sorted(EXPECTED))
def test_broken_drawings_one_clear_line(cli, tmp_path, kind):
    path = broken_files(tmp_path)[kind]
    out_csv = tmp_path / "out.csv"
    code, out, err = cli("props", path, "--csv", out_csv)
    line = assert_one_line_error(code, err, path.name, EXPECTED[kind])
    assert code == 1 and out == "" and not out_csv.exists(), line
    with pytest.raises((InputFileError, ProfileError)):
        read_dxf(path)


def test_binary_dxf_is_read(tmp_path):
    doc, msp = new(4)
    msp.add_lwpolyline([(0, 0), (40, 0), (40, 20), (0, 20)], close=True)
    path = tmp_path / "binary.dxf"
    doc.saveas(path, fmt="bin")
    assert read_dxf(path).area == pytest.approx(800.0)


def test_missing_file(tmp_path):
    with pytest.raises(InputFileError, match="file not found"):
        read_dxf(tmp_path / "nothing.dxf")


# --- arcs handed to the mesher ---------------------------------------------------------------

def test_arcs_for_mesh_merges_full_circles():
    halves = [Arc(1.0, 2.0, 3.0, 0.5, math.pi), Arc(1.0, 2.0, 3.0, 0.5 + math.pi, math.pi)]
    assert arcs_for_mesh(halves, 1e-9) == (Arc(1.0, 2.0, 3.0, 0.0, 2 * math.pi),)
    part = [Arc(0.0, 0.0, 1.0, math.radians(170), math.radians(20))]
    assert arcs_for_mesh(part, 1e-9) == tuple(part)
