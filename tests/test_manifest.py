"""Catalogue runs driven by a manifest, folders searched recursively, the options of props.

The profiles are invented rectangles (exact areas and second moments by closed form, b h^3 / 12;
polygons, so six-node elements give them to round-off: 1e-10) and copies of the samples.
"""

import csv
import io
import json
import re
import shutil

import ezdxf
import pytest

from conftest import SAMPLES, assert_one_line_error
from warpwise.catalogue import Item, catalogue_items, collect_files, read_manifest
from warpwise.cli.options import build_parser
from warpwise.errors import InputFileError


def rect(msp, x0, y0, x1, y1, layer="0"):
    msp.add_lwpolyline([(x0, y0), (x1, y0), (x1, y1), (x0, y1)], close=True,
                       dxfattribs={"layer": layer})


def save(path, build):
    doc = ezdxf.new()
    doc.header["$INSUNITS"] = 4
    build(doc.modelspace())
    path.parent.mkdir(parents=True, exist_ok=True)
    doc.saveas(path)
    return path


def sheet(msp):
    """A 30 x 10 and a 10 x 10 section on layer SECTION, a 20 x 20 frame box on layer FRAME."""
    rect(msp, 0, 0, 30, 10, "SECTION")
    rect(msp, 50, 0, 60, 10, "SECTION")
    rect(msp, 100, 0, 120, 20, "FRAME")


def insert_bar(msp):
    """40 x 20 aluminium bar (layer PROFILE) with a 20 x 10 steel insert (layer INSERT)."""
    rect(msp, 0, 0, 40, 20, "PROFILE")
    rect(msp, 10, 5, 30, 15, "INSERT")


MANIFEST = """\
# our own invented profiles
[[profile]]
file = "drawings/sheet.dxf"
name = "WW-2001"
description = "Small flat bar, 10 x 10"
part = 2
layers = ["SECTION"]

[[profile]]
file = "drawings/insert_bar.dxf"
name = "WW-2002"
description = "Bar with a steel insert"
material = "aluminium-6063-T6"
layer_materials = { INSERT = "steel-S235" }

[[profile]]
file = "key_bar_12x8.txt"
"""


@pytest.fixture
def catalogue(tmp_path):
    save(tmp_path / "drawings" / "sheet.dxf", sheet)
    save(tmp_path / "drawings" / "insert_bar.dxf", insert_bar)
    shutil.copy(SAMPLES / "key_bar_12x8.txt", tmp_path / "key_bar_12x8.txt")
    manifest = tmp_path / "profiles.toml"
    manifest.write_text(MANIFEST)
    return manifest


def test_manifest_drives_the_run_with_names_and_descriptions(cli, catalogue, tmp_path):
    out, js, html = tmp_path / "cat.csv", tmp_path / "cat.json", tmp_path / "html"
    code, _, err = cli("catalogue", catalogue, "--csv", out, "--json", js, "--html", html,
                       "--jobs", "1")
    assert code == 0, err
    rows = list(csv.DictReader(io.StringIO(out.read_text())))
    assert [r["name (text)"] for r in rows] == ["WW-2001", "WW-2002", ""]
    assert rows[1]["description (text)"] == "Bar with a steel insert"
    # part 2 of layer SECTION: the 10 x 10 bar; A = 100, Ix = 10 * 10^3 / 12 (closed form)
    assert float(rows[0]["A (mm2)"]) == pytest.approx(100.0, rel=1e-10)
    assert float(rows[0]["Ix (mm4)"]) == pytest.approx(1e4 / 12, rel=1e-10)
    # the insert bar as a composite: EA = E_alu (800 - 200) + E_steel 200 (EN 1999-1-1, EN 1993-1-1)
    assert float(rows[1]["EA (N)"]) == pytest.approx(70000.0 * 600 + 210000.0 * 200, rel=1e-10)
    objs = json.loads(js.read_text())
    assert objs[0]["name"] == "WW-2001" and objs[1]["description"] == "Bar with a steel insert"
    assert "name" not in objs[2] and "description" not in objs[2]
    index = (html / "index.html").read_text()
    assert ">WW-2001</a>" in index and "Small flat bar, 10 x 10" in index
    sheets = sorted(p.read_text() for p in html.glob("*.html") if p.name != "index.html")
    assert any("<h1>WW-2002: Bar with a steel insert</h1>" in s for s in sheets)


def test_rows_are_byte_identical_with_one_and_two_jobs(cli, catalogue, tmp_path):
    outputs = {}
    for jobs in ("1", "2"):
        out, js = tmp_path / f"cat{jobs}.csv", tmp_path / f"cat{jobs}.json"
        code, _, err = cli("catalogue", catalogue, tmp_path / "drawings", "--csv", out, "--json",
                           js, "--jobs", jobs, "--part", "1")
        # every item reads with --part 1 (an outline of one part takes it too, one rule for parts)
        assert code == 0, err
        last = err.splitlines()[-1]
        assert last.startswith("5 of 5 profiles analysed (")  # then the wall time, which varies
        outputs[jobs] = (out.read_bytes(), js.read_bytes())
    assert outputs["1"] == outputs["2"]


def test_folders_are_searched_recursively_in_path_order(tmp_path):
    for rel in ("b/deep/z.txt", "a.txt", "b/c.dxf", ".hidden/x.txt", "b/.y.txt", "b/notes.md"):
        f = tmp_path / rel
        f.parent.mkdir(parents=True, exist_ok=True)
        f.write_text("0 0\n1 0\n1 1\n")
    found = [f.relative_to(tmp_path).as_posix() for f in collect_files([tmp_path])]
    assert found == ["a.txt", "b/c.dxf", "b/deep/z.txt"]
    assert collect_files([tmp_path], exclude=[tmp_path / "a.txt"])[0].name == "c.dxf"


def test_the_run_does_not_read_its_own_table_back(cli, tmp_path):
    shutil.copy(SAMPLES / "key_bar_12x8.txt", tmp_path / "key_bar_12x8.txt")
    out = tmp_path / "table.csv"
    for _ in range(2):
        code, _, err = cli("catalogue", tmp_path, "--csv", out, "--jobs", "1")
        assert code == 0, err
    assert len(out.read_text().splitlines()) == 2


def test_entry_options_replace_the_command_line_ones(catalogue):
    from warpwise.catalogue import RunOptions
    from warpwise.io.options import ReadOptions
    from warpwise.properties.run import AnalysisOptions

    base = RunOptions(read=ReadOptions(part=1, units="mm"),
                      analysis=AnalysisOptions(material="steel-S355", accuracy="draft"))
    items = read_manifest(catalogue, base)
    assert [i.name for i in items] == ["WW-2001", "WW-2002", ""]
    first, second, third = (i.options for i in items)
    assert first.read.part == 2 and first.read.layers == ("SECTION",) and first.read.units == "mm"
    assert second.read.part == 1 and second.analysis.material == "aluminium-6063-T6"
    assert second.read.layer_materials == (("INSERT", "steel-S235"),)
    assert second.read.other_layers_material == "aluminium-6063-T6"
    assert third == base and second.analysis.accuracy == "draft"
    assert items[2].path == str(catalogue.parent / "key_bar_12x8.txt")
    assert Item("a.dxf", name="N", description="D").title == "N: D"


@pytest.mark.parametrize("text, words", [
    ("[[profile]]\nfile = 'a.dxf'\ncolour = 'red'\n", "profile 1: unknown key 'colour'"),
    ("[[profile]]\nfile = 'a.dxf'\npart = 'two'\n", "profile 1: part has a value of the wrong kind"),
    ("[[profile]]\nfile = 'a.dxf'\nall_parts = 1\n", "all_parts has a value of the wrong kind"),
    ("[[profile]]\nname = 'x'\n", "profile 1: 'file' is missing"),
    ("[[profile]]\nfile = 'a.dxf'\nunits = 'furlong'\n", "unknown unit 'furlong'"),
    ("[[profile]]\nfile = 'a.dxf'\npart = 2\nall_parts = true\n", "not both"),
    ("[[profile]]\nfile = 'a.dxf'\njoin_tolerance = -1\n", "join tolerance must be a positive"),
    ("[[profile]]\nfile = 'a.dxf'\nlayer_materials = { A = 3 }\n", "must be text"),
    ("title = 'x'\n", "unknown top-level keys ['title']"),
    ("[other]\n", "unknown top-level keys"),
    ("[[profile]\n", "not a valid TOML manifest"),
])
def test_manifest_defects_are_one_line_errors(cli, tmp_path, text, words):
    manifest = tmp_path / "bad.toml"
    manifest.write_text(text)
    with pytest.raises(InputFileError, match=re.escape(words)):
        read_manifest(manifest)
    code, _, err = cli("catalogue", manifest, "--csv", tmp_path / "t.csv")
    assert code == 1
    assert_one_line_error(code, err, "bad.toml", words)
    assert not (tmp_path / "t.csv").exists()


def test_a_missing_drawing_is_a_failure_of_its_row(cli, tmp_path):
    shutil.copy(SAMPLES / "key_bar_12x8.txt", tmp_path / "key_bar_12x8.txt")
    manifest = tmp_path / "m.toml"
    manifest.write_text("[[profile]]\nfile = 'key_bar_12x8.txt'\n\n[[profile]]\nfile = 'gone.dxf'\n")
    out = tmp_path / "t.csv"
    code, _, err = cli("catalogue", manifest, "--csv", out, "--jobs", "1")
    assert code == 1 and "gone.dxf: file not found" in err
    assert len(out.read_text().splitlines()) == 2


def option_strings(command):
    sub = next(a for a in build_parser()._actions if a.dest == "command")
    return {s for a in sub.choices[command]._actions for s in a.option_strings}


def test_catalogue_takes_every_analysis_option_of_props():
    # what props has and the catalogue lacks: only its own inputs and outputs, and the
    # request of one axis in the drawing's coordinates (--about-axis, --fibre), which has no
    # meaning across the different drawings of a catalogue
    assert option_strings("props") - option_strings("catalogue") == {"--shape", "--about-axis",
                                                                     "--fibre"}


def test_catalogue_options_reach_the_analysis(cli, tmp_path):
    path = save(tmp_path / "sheet.dxf", sheet)
    out = tmp_path / "t.csv"
    code, _, err = cli("catalogue", path, "--layer", "SECTION", "--part", "2", "--csv", out,
                       "--target-error", "0.01", "--chord-tolerance", "0.01", "--jobs", "1")
    assert code == 0, err
    row = next(csv.DictReader(io.StringIO(out.read_text())))
    assert float(row["A (mm2)"]) == pytest.approx(100.0, rel=1e-10)
    code, props, err = cli("props", path, "--layer", "SECTION", "--part", "2", "--json",
                           "--target-error", "0.01")
    assert code == 0, err
    # the same adaptive run as props (common practice, no source)
    assert float(row["J (mm4)"]) == pytest.approx(json.loads(props)["J"], rel=1e-9)


def test_failure_messages_name_only_options_the_catalogue_has(cli, tmp_path):
    two = save(tmp_path / "two.dxf", lambda m: (rect(m, 0, 0, 30, 10), rect(m, 50, 0, 60, 10)))
    frame = save(tmp_path / "layers.dxf", sheet)
    composite = save(tmp_path / "insert.dxf", insert_bar)
    open_chain = tmp_path / "open.dxf"
    doc = ezdxf.new()
    doc.modelspace().add_lwpolyline([(0, 0), (40, 0), (40, 20), (0, 20)])
    doc.saveas(open_chain)
    manifest = tmp_path / "m.toml"
    manifest.write_text(f"[[profile]]\nfile = '{composite.name}'\n"
                        "layer_materials = { INSERT = 'steel-S235' }\n")
    code, _, err = cli("catalogue", two, frame, open_chain, manifest, "--csv", tmp_path / "t.csv",
                       "--jobs", "1")
    assert code == 1
    errors = [ln for ln in err.splitlines() if ln.startswith("warpwise: error:")]
    assert len(errors) == 4, err
    named = {f for ln in errors for f in re.findall(r"--[a-z][a-z-]*", ln)}
    assert {"--part", "--all-parts", "--material"} <= named
    assert named <= option_strings("catalogue"), named - option_strings("catalogue")


def test_items_keep_folders_files_and_manifests_in_order(catalogue, tmp_path):
    items = catalogue_items([tmp_path / "key_bar_12x8.txt", catalogue, tmp_path / "drawings"])
    assert [i.path.split("/")[-1] for i in items] == [
        "key_bar_12x8.txt", "sheet.dxf", "insert_bar.dxf", "key_bar_12x8.txt", "insert_bar.dxf",
        "sheet.dxf"]


def test_manifest_entry_lifts_the_entity_limit(tmp_path):
    from warpwise.catalogue import RunOptions
    from warpwise.io.options import ReadOptions

    manifest = tmp_path / "m.toml"
    manifest.write_text("[[profile]]\nfile = 'a.dxf'\nmax_entities = 500000\n")
    (item,) = read_manifest(manifest, RunOptions(read=ReadOptions()))
    assert item.options.read.max_entities == 500000
    manifest.write_text("[[profile]]\nfile = 'a.dxf'\nmax_entities = 0\n")
    with pytest.raises(InputFileError, match="profile 1: "):
        read_manifest(manifest)
