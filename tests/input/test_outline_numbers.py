"""Numbers of a coordinate outline: a strict pattern, and loops too small to be told apart.

A number is an optional sign, digits with an optional decimal point, and an optional exponent
(the pattern of decimal literals in C and Python without their extras; common practice, no
source). Python's float() also takes ``2_0``, ``inf``, ``nan`` and digits of other scripts
(full-width, Arabic-Indic); each of those is refused with the line shown. Areas are
the shoelace area of the square written (closed form), exact to round-off (1e-12).
"""

import pytest

from conftest import assert_one_line_error
from warpwise.errors import InputFileError, ProfileError
from warpwise.io import parse_outline


def square(a: str) -> str:
    return f"0 0\n{a} 0\n{a} {a}\n0 {a}\n"


@pytest.mark.parametrize("word, value", [
    ("2", 2.0), ("2.", 2.0), ("2.50", 2.5), (".5", 0.5), ("+2", 2.0), ("2e1", 20.0),
    ("2E+1", 20.0), ("25e-1", 2.5), ("0.2e2", 20.0),
])
def test_numbers_of_the_pattern_are_read(word, value):
    p = parse_outline(square(word), source="sq.txt")
    assert p.area == pytest.approx(value * value, rel=1e-12)


@pytest.mark.parametrize("word", ["2_0", "inf", "-inf", "nan", "0x10", "1e", "e5", "1.2.3", "--1",
                                  "1d5", "２", "1e5_0", "infinity", "١"])
def test_other_words_are_not_numbers(word):
    with pytest.raises(InputFileError) as exc:
        parse_outline(square(word), source="sq.txt")
    assert str(exc.value) == f"sq.txt: line 2 is not a pair of numbers: '{word} 0'"


def test_an_overflowing_number_is_refused_as_non_finite():
    # 1e999 matches the pattern but is beyond double precision (IEEE 754: largest about 1.8e308)
    with pytest.raises(InputFileError) as exc:
        parse_outline(square("1e999"), source="sq.txt")
    assert str(exc.value) == "sq.txt: line 2 has a non-finite coordinate: '1e999 0'"


def test_underscore_number_on_the_command_line(tmp_path, cli):
    f = tmp_path / "under.txt"
    f.write_text("0 0\n2_0 0\n20 20\n0 20\n")
    code, out, err = cli("props", f)
    assert code == 1 and out == ""
    assert_one_line_error(code, err, f"{f}: line 2 is not a pair of numbers: '2_0 0'")


def test_a_vanishing_square_is_below_the_smallest_size():
    # 1e-300 is a normal double, but its square underflows (IEEE 754: smallest normal 2.2e-308)
    with pytest.raises(ProfileError) as exc:
        parse_outline(square("1e-300"), source="tiny.txt", units="m")
    assert str(exc.value) == ("tiny.txt: the profile is 1e-300 m across, below the smallest size "
                              "handled (1e-12 m): its points cannot be told apart")


def test_a_tiny_loop_in_a_large_profile_is_below_the_joining_tolerance():
    # points closer than 1e-9 of the profile's size are one point (geometry.loops.POINT_TOLERANCE)
    text = square("100") + "\n50 50\n50.00000000001 50\n50.00000000001 50.00000000001\n50 50.00000000001\n"
    with pytest.raises(ProfileError) as exc:
        parse_outline(text, source="speck.txt")
    assert str(exc.value) == ("speck.txt: loop 2 is 1e-11 across, below the joining tolerance of "
                              "1e-07 (1e-09 of the profile's size): its 4 points join into 0 at (50, 50)")


def test_a_small_square_above_the_limits_is_exact():
    # 1e-6 m across: far above the smallest size; shoelace area 1e-12 m2 (closed form)
    p = parse_outline(square("1e-6"), source="small.txt", units="m")
    assert p.area == pytest.approx(1e-12, rel=1e-12)


def test_a_loop_of_two_points_still_says_so():
    with pytest.raises(ProfileError) as exc:
        parse_outline("0 0\n10 0\n", source="two.txt")
    assert str(exc.value) == ("two.txt: loop 1 has 2 distinct point(s); a loop needs at least 3 "
                              "at (0, 0)")
