import numpy as np
import pytest

from warpwise.errors import InputFileError, ProfileError
from warpwise.io import parse_outline, read_outline


def test_separators_and_comments():
    text = "# c\n0,0\n4;0\n4\t3\n0 3\n"
    p = parse_outline(text)
    assert p.area == pytest.approx(12.0, rel=1e-14)


def test_closing_point_repeated_is_fine():
    p = parse_outline("0 0\n4 0\n4 3\n0 3\n0 0\n")
    assert len(p.regions[0].outer) == 4


def test_even_odd_nesting_island_in_hole():
    def sq(s):
        return "\n".join(f"{x * s} {y * s}" for x, y in [(-1, -1), (1, -1), (1, 1), (-1, 1)])
    text = "\n\n".join([sq(10), sq(6), sq(3)])
    # the island does not touch the ring around it: a separate part, as in a drawing
    with pytest.raises(ProfileError, match="the file holds 2 separate parts"):
        parse_outline(text)
    p = parse_outline(text, all_parts=True)
    assert len(p.regions) == 2
    # even-odd: 400 - 144 + 36 (common practice, no source)
    assert p.area == pytest.approx(400 - 144 + 36, rel=1e-14)


def test_units_line_and_override():
    text = "units: cm\n0 0\n1 0\n1 1\n0 1\n"
    assert parse_outline(text).units == "cm"
    assert parse_outline(text, units="in").units == "in"
    assert parse_outline("0 0\n1 0\n1 1\n").notes


def test_unknown_unit():
    with pytest.raises(InputFileError, match="unknown unit"):
        parse_outline("units: furlong\n0 0\n1 0\n1 1\n")


def test_material_lines():
    text = "material: steel\n0 0\n10 0\n10 10\n0 10\n\nmaterial: alu\n2 2\n4 2\n4 4\n2 4\n"
    p = parse_outline(text)
    assert set(p.materials) == {"steel", "alu"}
    steel = [r for r in p.regions if r.material == "steel"][0]
    assert len(steel.holes) == 1  # the insert is cut out of the outer material
    assert p.area == pytest.approx(100.0, rel=1e-14)


def test_hole_touching_outer_boundary():
    text = "0 0\n10 0\n10 10\n0 10\n\n0 2\n4 2\n4 4\n0 4\n"
    with pytest.raises(ProfileError, match="cross or touch"):
        parse_outline(text)


def test_nan_rejected():
    # nan is not a number of the strict pattern; 1e999 is one, but overflows
    with pytest.raises(InputFileError, match=r"^<text>: line 2 is not a pair of numbers: 'nan 1'$"):
        parse_outline("0 0\nnan 1\n1 1\n", source="<text>")
    with pytest.raises(InputFileError, match="line 2 has a non-finite coordinate: '1e999 1'"):
        parse_outline("0 0\n1e999 1\n1 1\n")


def test_binary_file(tmp_path):
    p = tmp_path / "b.txt"
    p.write_bytes(b"\x00\x01\x02garbage")
    with pytest.raises(InputFileError, match="binary"):
        read_outline(p)


def test_crossing_point_located():
    with pytest.raises(ProfileError) as info:
        parse_outline("0 0\n10 10\n10 0\n0 10\n", source="bow.txt")
    assert info.value.where == pytest.approx((5.0, 5.0))
    assert np.isfinite(info.value.where).all()
