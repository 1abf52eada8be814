"""The length unit of a DXF decided from what the file itself holds.

A DXF without a HEADER section (only ENTITIES: the minimal form small exporters write) or with a
header that has no ``$INSUNITS`` says nothing about its unit; the DXF library fills in a default
header ($INSUNITS = 6, metres) for such a file, which must not be taken as the drawing's word.
The files here are written by hand, tag by tag (DXF reference: group code 9 names a header
variable, 70 an integer value; common practice, no source).
"""

import json

import pytest

from warpwise.io import load_profile
from warpwise.io.dxf.document import states_insunits

#: A 100 x 10 bar as four LINE entities (area 1000 in any unit).
_PTS = [(0, 0), (100, 0), (100, 10), (0, 10)]


def _lines() -> str:
    out = []
    for (x0, y0), (x1, y1) in zip(_PTS, _PTS[1:] + _PTS[:1], strict=True):
        out.append(f"0\nLINE\n8\n0\n10\n{x0}\n20\n{y0}\n30\n0\n11\n{x1}\n21\n{y1}\n31\n0\n")
    return "".join(out)


def _file(tmp_path, name: str, header: str | None) -> str:
    parts = []
    if header is not None:
        parts.append(f"0\nSECTION\n2\nHEADER\n{header}0\nENDSEC\n")
    parts.append(f"0\nSECTION\n2\nENTITIES\n{_lines()}0\nENDSEC\n0\nEOF\n")
    path = tmp_path / name
    path.write_text("".join(parts))
    return str(path)


VERSIONS = ("AC1009", "AC1012", "AC1014", "AC1015", "AC1018", "AC1021", "AC1024", "AC1027", "AC1032")


def test_no_header_at_all_is_millimetres_assumed(tmp_path):
    p = load_profile(_file(tmp_path, "entities_only.dxf", None))
    assert p.units == "mm"
    assert p.area == pytest.approx(1000.0, rel=1e-12)  # 100 x 10, exact polygon
    assert any("millimetres assumed" in n for n in p.notes)
    assert not any("INSUNITS = 6" in n for n in p.notes)


@pytest.mark.parametrize("version", VERSIONS)
def test_header_without_insunits_is_millimetres_assumed(tmp_path, version):
    p = load_profile(_file(tmp_path, f"{version}.dxf", f"9\n$ACADVER\n1\n{version}\n"))
    assert p.units == "mm" and any("millimetres assumed" in n for n in p.notes)


@pytest.mark.parametrize("code, unit", [(1, "in"), (4, "mm"), (5, "cm"), (6, "m"), (2, "ft")])
def test_a_stated_unit_is_taken(tmp_path, code, unit):
    header = f"9\n$ACADVER\n1\nAC1009\n9\n$INSUNITS\n70\n{code}\n"
    p = load_profile(_file(tmp_path, f"u{code}.dxf", header))
    assert p.units == unit and any(f"$INSUNITS = {code}" in n for n in p.notes)


def test_cli_says_assumed_for_a_headerless_file(cli, tmp_path):
    code, out, _ = cli("props", _file(tmp_path, "bare.dxf", None), "--json")
    obj = json.loads(out)
    assert code == 0 and obj["units"]["length"] == "mm"
    assert any("millimetres assumed" in n for n in obj["notes"])


def test_states_insunits_reads_only_the_header():
    # a $INSUNITS text in an entity (a TEXT's content) is not a header variable
    data = (b"0\nSECTION\n2\nENTITIES\n0\nTEXT\n8\n0\n1\n$INSUNITS\n0\nENDSEC\n0\nEOF\n")
    assert not states_insunits(data)
    with_bom = (b"\xef\xbb\xbf999\nwritten by a script\n"
                b"0\nSECTION\n2\nHEADER\n9\n$INSUNITS\n70\n4\n0\nENDSEC\n")
    assert states_insunits(with_bom)
    crlf = b"  0\r\nSECTION\r\n  2\r\nHEADER\r\n  9\r\n$INSUNITS\r\n 70\r\n     1\r\n  0\r\nENDSEC\r\n"
    assert states_insunits(crlf)
