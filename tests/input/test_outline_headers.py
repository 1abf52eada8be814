"""Coordinate files as spreadsheets write them: byte-order mark, a header line, decimal commas.

Areas are checked against the shoelace formula of the rectangle written (closed form); the
outline reader keeps the coordinates as written, so the area is exact to round-off (1e-12).
"""

import pytest

from conftest import assert_one_line_error
from warpwise.errors import InputFileError
from warpwise.io import parse_outline, read_outline

RECT = [(0.0, 0.0), (12.5, 0.0), (12.5, 4.5), (0.0, 4.5)]  # 12.5 x 4.5 = 56.25 (closed form)


def rows(sep, points=RECT, fmt="{:g}"):
    return [f"{fmt.format(x)}{sep}{fmt.format(y)}" for x, y in points]


@pytest.mark.parametrize("header", ["x;y", "x,y", "X Y", "x; y", "x\ty", "X , Y"])
def test_one_header_line_of_column_names_is_skipped_with_a_note(header):
    text = "\n".join([header, *rows(";")]) + "\n"
    p = parse_outline(text, source="sheet.csv")
    assert p.area == pytest.approx(56.25, rel=1e-12)
    assert f"line 1: column names {header.strip()!r} skipped" in p.notes


def test_header_after_comments_and_a_units_line():
    text = "# exported\nunits: cm\nx;y\n" + "\n".join(rows(";")) + "\n"
    p = parse_outline(text, source="sheet.csv")
    assert p.units == "cm" and p.area == pytest.approx(56.25, rel=1e-12)
    assert any("line 3: column names" in n for n in p.notes)


def test_byte_order_mark_and_crlf_from_a_spreadsheet(tmp_path):
    f = tmp_path / "export.csv"
    f.write_bytes(b"\xef\xbb\xbf" + ("\r\n".join(["x;y", *rows(";")]) + "\r\n").encode())
    p = read_outline(f)
    assert p.area == pytest.approx(56.25, rel=1e-12)
    assert "UTF-8 byte-order mark at the start of the file skipped" in p.notes
    assert any("column names 'x;y'" in n for n in p.notes)


def test_byte_order_mark_without_header(tmp_path):
    f = tmp_path / "bom.txt"
    f.write_bytes(b"\xef\xbb\xbf" + "\n".join(rows(" ")).encode())
    assert read_outline(f).area == pytest.approx(56.25, rel=1e-12)


@pytest.mark.parametrize("bom, name", [(b"\xff\xfe", "UTF-16 LE"), (b"\xfe\xff", "UTF-16 BE")])
def test_utf16_text_is_read_with_a_note(tmp_path, bom, name):
    f = tmp_path / "wide.txt"
    codec = "utf-16-le" if bom == b"\xff\xfe" else "utf-16-be"
    f.write_bytes(bom + "\n".join(rows(" ")).encode(codec))
    p = read_outline(f)
    assert p.area == pytest.approx(56.25, rel=1e-12)
    assert f"read as {name} text" in p.notes


@pytest.mark.parametrize("text, where", [
    ("x;y\n0;0\nx;y\n1;0\n1;1\n", "line 3"),          # a second header
    ("0;0\nx;y\n1;0\n1;1\n", "line 2"),               # a header after coordinates
])
def test_only_one_header_line_before_the_coordinates(text, where):
    with pytest.raises(InputFileError, match=f"{where} is not a pair of numbers"):
        parse_outline(text, source="t.csv")


@pytest.mark.parametrize("header", ["x_mm;y_mm", "X [in] Y [in]", "x y z", "easting northing"])
def test_other_headers_are_refused_with_the_rule(header):
    # a header naming units (or anything else) could mean a unit we would not apply: refused
    with pytest.raises(InputFileError, match="a header line may only name the columns x and y"):
        parse_outline(header + "\n0 0\n1 0\n1 1\n", source="t.csv")


@pytest.mark.parametrize("line, shown", [
    ("12,5;0", "12.5 0"), ("12,5 4,5", "12.5 4.5"), ("12,5\t4,5", "12.5 4.5"),
    ("0;4,5", "0 4.5"), ("12,5 ; 4,5", "12.5 4.5"),
])
def test_decimal_commas_are_refused_saying_so(line, shown):
    text = f"0;0\n{line}\n0;4\n"
    with pytest.raises(InputFileError) as info:
        parse_outline(text, source="komma.csv")
    assert str(info.value) == (f"komma.csv: line 2 has a decimal comma: {line!r} (write decimal "
                               f"points: {shown})")


def test_comma_separated_pairs_still_work():
    # 'x, y' and 'x,y' with decimal points: the comma separates the two numbers
    for sep in (", ", ",", " , "):
        p = parse_outline("\n".join(rows(sep, fmt="{:.2f}")), source="pairs.csv")
        assert p.area == pytest.approx(56.25, rel=1e-12), sep


def test_four_comma_separated_numbers_are_ambiguous_and_refused():
    # '1,5,2,5' is four numbers or two with decimal commas: neither is a vertex line
    with pytest.raises(InputFileError, match="if a comma is a decimal comma, write a decimal point"):
        parse_outline("0,0\n1,5,2,5\n0,1\n", source="t.csv")


def test_decimal_commas_through_the_command_line(cli, tmp_path):
    f = tmp_path / "komma.csv"
    f.write_text("x;y\n0;0\n12,5;0\n12,5;4,5\n0;4,5\n")
    code, out, err = cli("props", f)
    assert code == 1 and out == ""
    assert_one_line_error(code, err, "komma.csv", "line 3 has a decimal comma")
