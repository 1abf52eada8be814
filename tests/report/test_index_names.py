"""Profiles in a catalogue's pages can be told apart: names, headings and page file names.

Profiles of one file name from different folders are shown by their path relative to the
common folder of all inputs (index and datasheet heading); page file names are unique
(without case) and a name that had to be cut or changed, or that two profiles would share,
carries 8 hex digits of the SHA-1 of the profile's full relative path instead of a number
that could be read as another profile's (common practice, no source).
"""

from __future__ import annotations

import hashlib
import re

from warpwise.cli import main
from warpwise.report.html import relative_names, unique_filenames


def _sha(label: str) -> str:
    return hashlib.sha1(label.encode("utf-8")).hexdigest()[:8]


def _box(path, width):
    path.parent.mkdir(parents=True, exist_ok=True)
    path.write_text(f"units: mm\n0 0\n{width} 0\n{width} 8\n0 8\n")
    return path


def test_same_name_in_two_folders_shown_by_relative_path(tmp_path):
    lib = tmp_path / "lib"
    sources = [str(_box(lib / "a" / "box.txt", 20)), str(_box(lib / "b" / "box.txt", 30)),
               str(_box(lib / "rail.txt", 10))]
    assert relative_names(sources) == ["a/box.txt", "b/box.txt", "rail.txt"]
    assert unique_filenames(sources) == ["a_box-txt.html", "b_box-txt.html", "rail-txt.html"]
    out = tmp_path / "sheets"
    assert main(["catalogue", str(lib), "--html", str(out), "--jobs", "1"]) == 0
    index = (out / "index.html").read_text()
    links = dict(re.findall(r'<a href="([^"]+)">([^<]+)</a>', index))
    assert links == {"a_box-txt.html": "a/box.txt", "b_box-txt.html": "b/box.txt",
                     "rail-txt.html": "rail.txt"}
    for page, label in links.items():
        sheet = (out / page).read_text()
        assert f"<h1>{label}</h1>" in sheet
        assert f"<span>Section properties of {label}</span>" in sheet
    # each page is its own profile's: areas 20 x 8 and 30 x 8 (exact for a rectangle)
    assert ">160<" in (out / "a_box-txt.html").read_text()
    assert ">240<" in (out / "b_box-txt.html").read_text()


def test_unique_names_stay_plain():
    assert relative_names(["lib/a/box.txt", "lib/b/rail.txt"]) == ["box.txt", "rail.txt"]
    assert unique_filenames(["lib/a/box.txt", "lib/b/rail.txt"]) == ["box-txt.html", "rail-txt.html"]


def test_names_cut_at_80_characters_get_the_hash_of_the_full_path():
    head = "p" * 85
    sources = [f"lib/{head}_left.txt", f"lib/{head}_right.txt"]
    names = unique_filenames(sources)
    assert names == [f"{'p' * 80}-txt-{_sha(head + '_left.txt')}.html",
                     f"{'p' * 80}-txt-{_sha(head + '_right.txt')}.html"]
    assert names[0] != names[1]


def test_no_page_name_suggests_another_profile():
    # "box.txt" and a file named "box-txt" would both be box-txt.html; neither keeps it
    assert unique_filenames(["box.txt", "box-txt"]) == \
        [f"box-txt-{_sha('box.txt')}.html", f"box-txt-{_sha('box-txt')}.html"]
    # the same without case: the pages may share a folder on a case-blind file system
    assert unique_filenames(["Box.txt", "box.TXT"]) == \
        [f"Box-txt-{_sha('Box.txt')}.html", f"box-TXT-{_sha('box.TXT')}.html"]
    # a changed character: $x^$.txt is not the page of x.txt
    assert unique_filenames(["$x^$.txt", "x.txt"]) == [f"x-txt-{_sha('$x^$.txt')}.html", "x-txt.html"]


def test_one_file_twice_gets_two_pages():
    # a manifest may list two parts of one drawing
    assert unique_filenames(["lib/rail.dxf", "lib/rail.dxf"]) == \
        [f"rail-dxf-{_sha('rail.dxf')}.html", f"rail-dxf-{_sha('rail.dxf#2')}.html"]
