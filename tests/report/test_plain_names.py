"""Names in figures are plain text: a ``$`` in a file or material name is drawn as written.

matplotlib reads text between two ``$`` as mathematics (and refuses ``$x^$``); every figure
warpwise draws must show the name exactly (common practice, no source). The figures are
written with text as glyph outlines (``svg.fonttype`` path): a ``$`` drawn as a character
leaves the ``$`` glyph of DejaVu Sans in the SVG (mathematics would swallow it), and matplotlib
writes each text's string in a comment before its glyphs. The datasheet pictures are SVG
written by warpwise itself, with each name as the text of a ``<text>`` element.
"""

from __future__ import annotations

import re

import pytest
from matplotlib.font_manager import findfont, get_font
from matplotlib.text import Text

from warpwise.cli import main
from warpwise.io import load_profile
from warpwise.materials import read_materials
from warpwise.properties.run import AnalysisOptions, run_analysis
from warpwise.report.plot_section import figure_outline, figure_warping
from warpwise.report.plot_stress import figure_combined, figure_torsion
from warpwise.stress import Loads, combined_stress, torsion_stress

FILE_NAME = "$x^$.txt"
MATERIAL = "$alloy^x$"
#: Id of the "$" glyph in the SVG (font and glyph index in hex; a datasheet prefixes the id).
DOLLAR_GLYPH = f'DejaVuSans-{get_font(findfont("DejaVu Sans")).get_char_index(ord("$")):x}"'

#: An invented bimetal strip 20 x 8: the lower 5 mm in the oddly named alloy.
STRIP = f"""units: mm
material: {MATERIAL}
0 0
20 0
20 5
0 5

material: steel-S235
0 5
20 5
20 8
0 8
"""


@pytest.fixture
def strip(tmp_path):
    path = tmp_path / FILE_NAME
    path.write_text(STRIP)
    table = tmp_path / "odd.toml"
    table.write_text(f'[materials."{MATERIAL}"]\nE = 70000\nnu = 0.33\n')
    return path, table


def _texts(fig):
    return {t.get_text(): t.get_parse_math() for t in fig.findobj(Text) if t.get_text()}


def test_api_figures_hold_the_names_as_plain_text(strip):
    path, table = strip
    res = run_analysis(load_profile(path), AnalysisOptions(materials=read_materials(table)))
    figures = [figure_outline(res), figure_warping(res),
               figure_torsion(res, torsion_stress(res, 1000.0, 80000.0)),
               figure_combined(res, combined_stress(res, Loads(N=100.0, T=1000.0), 80000.0))]
    for fig in figures:
        texts = _texts(fig)
        assert not any(texts.values())  # no text of any figure is read as mathematics
        assert any(t.startswith(f"{FILE_NAME}: ") for t in texts)  # the title names the file
    assert f"material: {MATERIAL}" in _texts(figures[0])  # the legend names the material
    assert f"largest von Mises stress in {MATERIAL}: " in " ".join(_texts(figures[3]))


@pytest.mark.parametrize("show", ["mesh", "warping", "torsion", "combined"])
def test_plot_command_writes_the_names_as_drawn(strip, tmp_path, show):
    path, table = strip
    out = tmp_path / f"{show}.svg"
    code = main(["plot", str(path), "--materials", str(table), "--show", show, "--torque", "1000",
                 "--axial", "100", "-o", str(out)])
    assert code == 0
    svg = out.read_text()
    assert DOLLAR_GLYPH in svg
    assert f"<!-- {FILE_NAME}: " in svg
    if show == "mesh":
        assert f"<!-- material: {MATERIAL} -->" in svg


def test_check_plot_writes_the_file_name_as_drawn(strip, tmp_path, capsys):
    path, _ = strip
    out = tmp_path / "check.svg"
    assert main(["check", str(path), "--plot", str(out)]) == 0
    svg = out.read_text()
    assert DOLLAR_GLYPH in svg
    assert f"<!-- {FILE_NAME}: analysable; 0 errors, 0 warnings (numbers as in the report) -->" in svg
    assert "analysable" in capsys.readouterr().out


def test_datasheet_draws_the_names(strip, tmp_path):
    path, table = strip
    html_dir = tmp_path / "sheets"
    assert main(["catalogue", str(path), "--materials", str(table), "--html", str(html_dir),
                 "--jobs", "1"]) == 0
    pages = sorted(p.name for p in html_dir.glob("*.html"))
    assert len(pages) == 2 and "index.html" in pages
    sheet = (html_dir / next(p for p in pages if p != "index.html")).read_text()
    # the datasheet pictures are SVG written by warpwise (no plotting library): every name is
    # a text element holding the name exactly as written
    texts = re.findall(r"<text\b[^>]*>([^<]*)</text>", sheet)
    assert f"material: {MATERIAL}" in texts  # the outline's legend
    assert sum(t.startswith(f"{FILE_NAME}: ") for t in texts) == 3  # each picture's title
