"""``props --html``: the datasheet of one profile, with the values about a given axis."""

from __future__ import annotations

import json
import re
from html.parser import HTMLParser

import pytest

from conftest import SAMPLES
from warpwise.cli import main
from warpwise.report.axis_output import AXIS_SYMBOLS

KEY_BAR = str(SAMPLES / "key_bar_12x8.txt")


class _Rows(HTMLParser):
    """Cells of every table row with a data-key, and the glossary's terms."""

    def __init__(self) -> None:
        super().__init__()
        self.rows: dict[str, list[list[str]]] = {}
        self.terms: list[str] = []
        self._row: list[str] | None = None
        self._key = ""
        self._in_dt = False

    def handle_starttag(self, tag, attrs):
        a = dict(attrs)
        if tag == "tr" and "data-key" in a:
            self._key, self._row = a["data-key"], []
        elif tag == "td" and self._row is not None:
            self._row.append("")
        elif tag == "dt":
            self._in_dt = True
            self.terms.append("")

    def handle_endtag(self, tag):
        if tag == "tr" and self._row is not None:
            self.rows.setdefault(self._key, []).append(self._row)
            self._row = None
        elif tag == "dt":
            self._in_dt = False

    def handle_data(self, data):
        if self._row is not None and self._row:
            self._row[-1] += data
        if self._in_dt:
            self.terms[-1] += data


def _number(text: str) -> float:
    return float(text.replace("\u2212", "-").replace("\u00d710", "e").replace(" ", ""))


def test_datasheet_with_axis_values_equal_to_the_json(tmp_path, capsys):
    page = tmp_path / "key bar <1>.html"
    args = [KEY_BAR, "--about-axis", "0,0,0", "--fibre", "0.6,0.8", "--report-units", "cm"]
    assert main(["props", *args, "--html", str(page)]) == 0
    capsys.readouterr()
    assert main(["props", *args, "--json"]) == 0
    a = json.loads(capsys.readouterr().out)["about_axis"]
    parsed = _Rows()
    parsed.feed(page.read_text(encoding="utf-8"))
    # every value as printed (6 significant figures, number_html) and in the page's units
    for key in ("I_axis", "I_across", "I_uv", "Ip_point"):
        (cells,) = parsed.rows[key]
        assert _number(cells[2]) == pytest.approx(a[key], rel=5e-6), key
        assert cells[3] == "cm4"
    (v_cells,) = parsed.rows["v"]
    (w_cells,) = parsed.rows["W_fibre"]
    assert _number(v_cells[2]) == pytest.approx(a["fibres"][0]["distance"], rel=5e-6)
    assert _number(w_cells[2]) == pytest.approx(a["fibres"][0]["W"], rel=5e-6)
    assert w_cells[3] == "cm3"
    # the glossary explains every symbol of the axis (subscripts shown as text)
    terms = {re.sub(r"\s", "", t) for t in parsed.terms}
    for sym, *_ in AXIS_SYMBOLS:
        assert sym.replace("_", "") in terms, sym
    assert "never replace" in page.read_text(encoding="utf-8")


def test_html_refusals(tmp_path, capsys):
    out = tmp_path / "two.html"
    code = main(["props", KEY_BAR, "--shape", "circle:d=20", "--html", str(out)])
    assert code == 2 and not out.exists()
    assert "one profile" in capsys.readouterr().err
    code = main(["props", KEY_BAR, "--html", KEY_BAR])  # an input: never overwritten
    assert code == 2
    assert "input" in capsys.readouterr().err
