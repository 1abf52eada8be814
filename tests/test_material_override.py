"""A materials table entry that redefines a built-in material is used, with a note saying so.

The note names the table and the built-in values it replaces; it is in the report's notes of
every profile that uses the material (table, JSON) and once on stderr.
"""

from __future__ import annotations

import json

from warpwise.cli import main
from warpwise.materials import BUILTIN, override_note, read_materials

#: The built-in S235 values the note must name: E, G of EN 1993-1-1:2005 3.2.6, fy of Table 3.1,
#: density 7850 (the built-in table's sources); nu = E / 2G - 1 = 0.296.
S235_NOTE = ("materials table {table} replaces the built-in material 'steel-S235' (E = 210000 MPa, "
             "G = 81000 MPa, nu = 0.296, fy = 235 MPa, density = 7850 kg/m3): the table's values "
             "are used")

TABLE = """\
[materials.steel-S235]
E = 200000
nu = 0.3
fy = 240
density = 7800

[materials.own-alloy]
E = 70000
nu = 0.33
"""


def _table(tmp_path):
    path = tmp_path / "own.toml"
    path.write_text(TABLE)
    return path


def test_the_redefining_entry_carries_the_note(tmp_path):
    path = _table(tmp_path)
    mats = read_materials(path)
    assert mats["steel-S235"].note == S235_NOTE.format(table=path)
    assert mats["steel-S235"].E == 200000.0  # the table's value is the one used
    assert mats["own-alloy"].note == ""  # a new name replaces nothing
    assert override_note(str(path), BUILTIN["steel-S235"]) == S235_NOTE.format(table=path)
    assert mats["steel-S235"].in_system("in").note == mats["steel-S235"].note


def test_props_notes_the_override_in_table_json_and_stderr(tmp_path, capsys):
    path = _table(tmp_path)
    note = S235_NOTE.format(table=path)
    args = ["props", "--shape", "rectangle:b=40,h=20", "--materials", str(path),
            "--material", "steel-S235"]
    assert main(args) == 0
    out, err = capsys.readouterr()
    assert f"  note: {note}\n" in out
    assert err == f"warpwise: note: {note}\n"
    assert main([*args, "--json"]) == 0
    obj = json.loads(capsys.readouterr().out)
    assert obj["notes"] == [note]
    # EA with the table's E: 200000 MPa x 800 mm2 (the rectangle's area is exact on the mesh)
    assert abs(obj["EA"] / 1.6e8 - 1.0) < 1e-12


def test_no_note_when_the_redefined_material_is_not_used(tmp_path, capsys):
    path = _table(tmp_path)
    assert main(["props", "--shape", "rectangle:b=40,h=20", "--materials", str(path),
                 "--material", "steel-S355", "--json"]) == 0
    out, err = capsys.readouterr()
    assert (json.loads(out)["notes"], err) == ([], "")


def test_catalogue_says_it_once_and_notes_each_profile(tmp_path, capsys):
    path = _table(tmp_path)
    note = S235_NOTE.format(table=path)
    folder = tmp_path / "profiles"
    folder.mkdir()
    for name, side in (("small.txt", 10), ("large.txt", 20)):
        (folder / name).write_text(f"units: mm\nmaterial: steel-S235\n0 0\n{side} 0\n{side} 5\n0 5\n")
    out_json = tmp_path / "c.json"
    assert main(["catalogue", str(folder), "--json", str(out_json), "--materials", str(path),
                 "--jobs", "1"]) == 0
    err = capsys.readouterr().err
    assert err.count(note) == 1 and f"warpwise: note: {note}\n" in err
    # (the 20 x 5 bar also has a note on its shear coefficients: only the material's counted)
    assert [[n for n in obj["notes"] if n.startswith("materials table")]
            for obj in json.loads(out_json.read_text())] == [[note], [note]]
