"""The catalogue's XLSX workbook, opened with openpyxl: sheets, units row, numbers, text.

The workbook holds the same table as the CSV and JSON (one place builds the rows:
report.files.property_rows), with numbers stored as numbers. openpyxl writes 16 significant
digits ("%.16g", openpyxl/compat/strings.py; spreadsheets show 15), so each value equals the
JSON's (17 digits, Python's repr) to one unit in the 16th digit: bound 1e-15 relative. Text is
never a formula (OWASP, "CSV injection"; common practice).
"""

from __future__ import annotations

import json
import shutil

import pytest

from conftest import SAMPLES
from warpwise.cli import main
from warpwise.materials import builtin_material

openpyxl = pytest.importorskip("openpyxl")

FEW = ["key_bar_12x8.txt", "channel_thick_80x40.txt"]


@pytest.fixture
def run(tmp_path):
    folder = tmp_path / "profiles"
    folder.mkdir()
    for name in FEW:
        shutil.copy(SAMPLES / name, folder / name)
    shutil.copy(SAMPLES / FEW[0], folder / "=1+2.txt")  # a name a spreadsheet would run
    (folder / "bow_tie.txt").write_text("0 0\n1 1\n1 0\n0 1\n")
    book, js = tmp_path / "cat.xlsx", tmp_path / "cat.json"
    code = main(["catalogue", str(folder), "--xlsx", str(book), "--json", str(js), "--jobs", "1",
                 "--material", "aluminium-6063-T6"])
    assert code == 1  # the bow tie fails; the others are written
    return openpyxl.load_workbook(book), json.loads(js.read_text())


def test_sheets_and_units_row(run):
    book, _ = run
    assert book.sheetnames == ["properties", "failures", "materials"]
    props = book["properties"]
    names = [c.value for c in props[1]]
    units = [c.value for c in props[2]]
    assert units[names.index("A")] == "mm2" and units[names.index("J")] == "mm4"
    assert units[names.index("Cw")] == "mm6" and names[0] == "file"
    assert props.freeze_panes == "B3"  # header and file names stay in view


def test_numbers_are_numbers_equal_to_the_json(run):
    book, objs = run
    props = book["properties"]
    names = [c.value for c in props[1]]
    rows = {r[0]: r for r in props.iter_rows(min_row=3, values_only=True)}
    assert len(rows) == len(objs) == 3
    for obj in objs:
        row = rows[obj["file"]]
        for key in ("A", "Ix", "J", "Cw", "Wpl_x", "As_y"):
            cell = row[names.index(key)]
            assert isinstance(cell, float) and cell == pytest.approx(obj[key], rel=1e-15), key
        assert row[names.index("mesh nodes")] == obj["mesh"]["nodes"]


def test_text_is_never_a_formula(run):
    book, _ = run
    cells = [r[0] for r in book["properties"].iter_rows(min_row=3)]
    odd = [c for c in cells if c.value.endswith("=1+2.txt")]
    assert len(odd) == 1 and odd[0].data_type == "s"


def test_failures_and_materials(run):
    book, _ = run
    fails = list(book["failures"].iter_rows(min_row=3, values_only=True))
    assert len(fails) == 1 and fails[0][0].endswith("bow_tie.txt") and "crosses itself" in fails[0][1]
    mats = book["materials"]
    assert [c.value for c in mats[1]][:4] == ["material", "E", "G", "nu"]
    assert [c.value for c in mats[2]][:2] == ["text", "MPa"]
    rows = list(mats.iter_rows(min_row=3, values_only=True))
    ref = builtin_material("aluminium-6063-T6")
    assert rows[0][:4] == ("aluminium-6063-T6", ref.E, ref.G, ref.nu)
