"""PDF datasheets rendered to PNG (pdftoppm, poppler; installed by .ci/run) and measured.

A page is A4 and the section on it is to the stated scale: the key bar sample (12 x 8 mm,
0.6 mm chamfers) at 10:1 must be 120 mm wide on paper, measured on the rendered picture to one
pixel at 200 dpi (0.13 mm). The standard scales are those of ISO 5455 (from memory).
"""

from __future__ import annotations

import shutil
import subprocess

import numpy as np
import pytest

from conftest import SAMPLES
from warpwise.cli import main
from warpwise.report.pdf_sheet import BOX, PAGE, paper_scale, scale_text

needs_poppler = pytest.mark.skipif(shutil.which("pdftoppm") is None,
                                   reason="pdftoppm (poppler-utils) is not installed")

KEY_BAR = SAMPLES / "key_bar_12x8.txt"
DPI = 200


def render(pdf, tmp_path, dpi=DPI):
    """Every page of ``pdf`` as a grey-level array (rows from the top), via pdftoppm."""
    import matplotlib.image as mpimg

    subprocess.run(["pdftoppm", "-r", str(dpi), "-gray", "-png", str(pdf), str(tmp_path / "pg")],
                   check=True)
    pages = [mpimg.imread(p) for p in sorted(tmp_path.glob("pg-*.png"))]
    return [p[..., 0] if p.ndim == 3 else p for p in pages]  # one grey channel


def test_scales():
    assert [scale_text(s) for s in (10.0, 1.0, 0.5, 0.02)] == ["10:1", "1:1", "1:2", "1:50"]
    assert paper_scale(12.0, 128.0) == 10.0 and paper_scale(130.0, 128.0) == 0.5


@needs_poppler
def test_page_is_a4_and_the_section_to_scale(tmp_path, capsys):
    pdf = tmp_path / "bar.pdf"
    assert main(["props", str(KEY_BAR), "--pdf", str(pdf)]) == 0
    capsys.readouterr()
    (page,) = render(pdf, tmp_path)
    assert page.shape == (round(PAGE[1] * DPI), round(PAGE[0] * DPI))  # A4 at 200 dpi
    # the section's fill (light grey) in the drawing box, the row through its middle
    left, bottom, width, height = BOX
    top = round((PAGE[1] - bottom - height) * DPI)
    box = page[top: top + round(height * DPI), round(left * DPI): round((left + width) * DPI)]
    grey = (box > 0.75) & (box < 0.92)  # the fill #d9d9d9 is 0.85
    rows = np.flatnonzero(grey.any(axis=1))
    mid = grey[rows[len(rows) // 2]]
    cols = np.flatnonzero(mid)
    measured = (cols[-1] - cols[0] + 1) / DPI * 25.4  # mm on paper, fill inside the edge line
    edge = 0.6 / 72 * 25.4  # the 0.6 pt outline covers half its width of fill on each side
    assert measured == pytest.approx(120.0 - edge, abs=2 * 25.4 / DPI)  # a pixel at each end


@needs_poppler
def test_catalogue_pdf_has_a_page_per_profile_in_row_order(tmp_path, capsys):
    folder = tmp_path / "profiles"
    folder.mkdir()
    names = ["key_bar_12x8.txt", "channel_thick_80x40.txt", "mullion_steel_reinforced.txt"]
    for n in names:
        shutil.copy(SAMPLES / n, folder / n)
    pdf = tmp_path / "cat.pdf"
    assert main(["catalogue", str(folder), "--pdf", str(pdf), "--jobs", "1"]) == 0
    capsys.readouterr()
    text = subprocess.run(["pdftotext", "-layout", str(pdf), "-"], check=True,
                          capture_output=True, text=True).stdout
    pages = text.split("\f")[: len(names)]
    assert len([p for p in text.split("\f") if p.strip()]) == len(names)
    assert [next(n for n in names if n in p) for p in pages] == sorted(names)
    for p in pages:
        assert "Results support, and never replace" in p  # the caution on every page
        assert "Saint-Venant torsion constant" in p
    assert "steel-S355" in pages[sorted(names).index("mullion_steel_reinforced.txt")]


@needs_poppler
def test_resumed_catalogue_keeps_the_outlines(tmp_path, monkeypatch, capsys):
    from warpwise.catalogue import analyse_one, run

    folder = tmp_path / "profiles"
    folder.mkdir()
    for n in ["key_bar_12x8.txt", "channel_thick_80x40.txt"]:
        shutil.copy(SAMPLES / n, folder / n)
    whole, pdf = tmp_path / "whole.pdf", tmp_path / "cat.pdf"
    assert main(["catalogue", str(folder), "--pdf", str(whole), "--jobs", "1"]) == 0
    seen = []

    def one(item, *args, **kwargs):
        if len(seen) == 1:
            raise KeyboardInterrupt
        seen.append(item)
        return analyse_one(item, *args, **kwargs)

    monkeypatch.setattr(run, "analyse_one", one)
    assert main(["catalogue", str(folder), "--pdf", str(pdf), "--jobs", "1"]) == 130
    monkeypatch.setattr(run, "analyse_one", analyse_one)
    assert main(["catalogue", str(folder), "--pdf", str(pdf), "--jobs", "1"]) == 0
    capsys.readouterr()
    # the page drawn from the journal's outline equals the page drawn from the analysis
    (tmp_path / "a").mkdir()
    (tmp_path / "b").mkdir()
    a, b = render(whole, tmp_path / "a", 60), render(pdf, tmp_path / "b", 60)
    assert len(a) == len(b) == 2
    assert all(np.array_equal(x, y) for x, y in zip(a, b, strict=True))
