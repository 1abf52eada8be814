"""Text files as Windows editors save them: UTF-8 with a byte-order mark, UTF-16 LE and BE.

One reader (warpwise.textfiles.decode_text) serves the coordinate outlines, the materials
tables and the catalogue manifests; each case is a small generated file and asserts the exact
outcome. The byte-order marks and codecs are those of the Unicode Standard, sec. 23.8
("Specials", U+FEFF) and Python's codecs module. Areas are checked against the shoelace area
of the rectangle written (closed form; the reader keeps the coordinates as written, so the area
is exact to round-off, 1e-12).
"""

import pytest

from conftest import assert_one_line_error
from warpwise.catalogue import read_manifest
from warpwise.errors import InputFileError
from warpwise.io import read_outline
from warpwise.materials import read_materials
from warpwise.textfiles import decode_text

OUTLINE = "units: mm\nx;y\n0;0\n12.5;0\n12.5;4.5\n0;4.5\n"  # 12.5 x 4.5 = 56.25 (closed form)
TABLE = "[materials.grey-alloy]\nE = 70000.0\nnu = 0.33\ndensity = 2700.0\n# Dichte in kg/m³\n"
MANIFEST = "[[profile]]\nfile = 'bar.txt'\nname = 'WW-0017 Stäbchen'\n"

#: (BOM bytes, codec, the name warpwise gives it); the bytes are the Unicode Standard's
#: encodings of U+FEFF.
ENCODINGS = [(b"", "utf-8", "UTF-8"), (b"\xef\xbb\xbf", "utf-8", "UTF-8 with byte-order mark"),
             (b"\xff\xfe", "utf-16-le", "UTF-16 LE"), (b"\xfe\xff", "utf-16-be", "UTF-16 BE")]


def encoded(text: str, bom: bytes, codec: str, crlf: bool = False) -> bytes:
    return bom + (text.replace("\n", "\r\n") if crlf else text).encode(codec)


@pytest.mark.parametrize("crlf", [False, True], ids=["lf", "crlf"])
@pytest.mark.parametrize("bom, codec, name", ENCODINGS, ids=[e[2] for e in ENCODINGS])
def test_outline_in_every_encoding(tmp_path, bom, codec, name, crlf):
    f = tmp_path / "export.csv"
    f.write_bytes(encoded(OUTLINE, bom, codec, crlf))
    p = read_outline(f)
    assert p.area == pytest.approx(56.25, rel=1e-12) and p.units == "mm"
    encoding_notes = [n for n in p.notes if "byte-order" in n or n.startswith("read as")]
    expected = {"UTF-8": [], "UTF-8 with byte-order mark":
                ["UTF-8 byte-order mark at the start of the file skipped"]}.get(
                    name, [f"read as {name} text"])
    assert encoding_notes == expected


@pytest.mark.parametrize("bom, codec, name", ENCODINGS, ids=[e[2] for e in ENCODINGS])
def test_materials_table_in_every_encoding(tmp_path, bom, codec, name):
    f = tmp_path / "materials.toml"
    f.write_bytes(encoded(TABLE, bom, codec))
    m = read_materials(f)["grey-alloy"]
    # G = E / (2 (1 + nu)) for an isotropic material (common practice, no source)
    assert (m.E, m.nu, m.density) == (70000.0, 0.33, 2700.0)
    assert m.G == pytest.approx(70000.0 / 2.66, rel=1e-15)


@pytest.mark.parametrize("bom, codec, name", ENCODINGS, ids=[e[2] for e in ENCODINGS])
def test_manifest_in_every_encoding(tmp_path, bom, codec, name):
    f = tmp_path / "profiles.toml"
    f.write_bytes(encoded(MANIFEST, bom, codec))
    (item,) = read_manifest(f)
    assert item.name == "WW-0017 Stäbchen" and item.path == str(tmp_path / "bar.txt")


@pytest.mark.parametrize("data, message", [
    # latin-1 bytes (0xe9 is e-acute there) are not UTF-8: the byte and where it is are named
    (b"0 0\n1 0\n1 1\n# caf\xe9\n", "is not UTF-8 text (byte 0xe9 at offset 17, line 4): save it as UTF-8"),
    # a broken UTF-8 sequence after the byte-order mark: the offset counts the mark
    (b"\xef\xbb\xbf0 0\n\xc3(\n", "is not UTF-8 text (byte 0xc3 at offset 7, line 2): save it as UTF-8"),
    # an odd number of UTF-16 bytes leaves half a character at the end
    (b"\xff\xfe0\x00 \x000", "is not UTF-16 LE text (byte 0x30 at offset 6): save it as UTF-8"),
    # a lone high surrogate in UTF-16 BE
    (b"\xfe\xff\x000\xd8\x00\x00 ", "is not UTF-16 BE text (byte 0xd8 at offset 4): save it as UTF-8"),
    (b"\xff\xfe\x00\x000\x00\x00\x00", "is UTF-32 text: save it as UTF-8 or UTF-16"),
    (b"\x00\x00\xfe\xff\x00\x00\x000", "is UTF-32 text: save it as UTF-8 or UTF-16"),
    ("0 0\n1 0\n".encode("utf-16-le"), "seems to be UTF-16 LE text without a byte-order mark: save it "
                                       "as UTF-8 (or UTF-16 with a byte-order mark)"),
    ("0 0\n1 0\n".encode("utf-16-be"), "seems to be UTF-16 BE text without a byte-order mark: save it "
                                       "as UTF-8 (or UTF-16 with a byte-order mark)"),
    (b"\x89PNG\r\n\x1a\n\x00\x00\x00\rIHDR", "is a binary file, not a text outline file"),
    (b"\xff\xfe" + "0 0\n\x00\x01".encode("utf-16-le"), "is a binary file, not a text outline file"),
], ids=["latin-1", "utf8-bom-broken", "utf16-odd", "utf16-surrogate", "utf32-le", "utf32-be",
        "utf16le-unmarked", "utf16be-unmarked", "png", "utf16-nul"])
def test_unreadable_text_names_the_encoding(tmp_path, cli, data, message):
    f = tmp_path / "odd.txt"
    f.write_bytes(data)
    with pytest.raises(InputFileError) as exc:
        read_outline(f)
    assert str(exc.value) == f"{f}: {message}"
    code, out, err = cli("props", f)
    assert code == 1 and out == ""
    assert_one_line_error(code, err, f"warpwise: error: {f}: {message}")


def test_materials_table_not_utf8_names_byte_and_table(tmp_path):
    f = tmp_path / "materials.toml"
    f.write_bytes(b"[materials.grey]\nE = 70000.0\nnu = 0.3\n# W\xe4rme\n")
    with pytest.raises(InputFileError) as exc:
        read_materials(f)
    assert str(exc.value) == f"{f}: is not UTF-8 text (byte 0xe4 at offset 41, line 4): save it as UTF-8"


def test_decode_text_returns_the_encoding_name():
    # the four byte-order marks of the Unicode Standard, sec. 23.8, and no mark at all
    for bom, codec, name in ENCODINGS:
        assert decode_text(encoded("a\n", bom, codec), "t", "text") == ("a\n", name)
