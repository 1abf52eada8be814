"""The ``--html`` pages of ``member`` and ``stress``: produced, self-contained, and every number
shown is the JSON value of the same run under its unit.

Each test runs the real command once with ``--json`` and ``--html`` (real analysis, no stored
results) and reads the page back with ``html.parser``: a cell's ``data-key`` names the JSON
path of the value it shows. The page prints 6 significant figures, so a shown number equals
the JSON value to half a unit in the sixth figure: relative 5e-6 (rounding, common practice,
no source); a zero is shown as 0 exactly.
"""

from __future__ import annotations

import json
import re
import shutil
from html.parser import HTMLParser

import pytest

from conftest import SAMPLES, assert_one_line_error
from warpwise.cli import main
from warpwise.member import TERM_BY_KEY
from warpwise.report.html_parts import unit_html
from warpwise.report.table import CAUTION

CHANNEL = SAMPLES / "channel_thick_80x40.txt"
MEMBER = ["member", "--accuracy", "draft", "--material", "steel-S235", "--length", "2000",
          "--ends", "fixed,pinned", "--point-torque", "5e4@800", "--distributed-torque", "10"]
#: Six significant figures shown (see the module docstring).
SHOWN = 5e-6


class _Page(HTMLParser):
    """Cells with a ``data-key``, glossary rows, symbols and the raw text of a page."""

    def __init__(self) -> None:
        super().__init__()
        self.cells: dict[str, str] = {}
        self.nulls: set[str] = set()
        self.heads: set[str] = set()
        self.glossary: dict[str, list[str]] = {}
        self.stack: list[tuple[str, str | None, list[str]]] = []
        self.in_glossary = False
        self.row: tuple[str, list[str]] | None = None
        self.cell_text: list[str] | None = None
        self.text: list[str] = []
        self.svg = 0

    def handle_starttag(self, tag, attrs):
        a = dict(attrs)
        if tag == "svg":
            self.svg += 1
        if tag == "table" and a.get("id") == "glossary":
            self.in_glossary = True
        if tag == "th" and "data-key" in a:
            self.heads.add(a["data-key"])
        if tag == "tr" and self.in_glossary and "data-key" in a:
            self.row = (a["data-key"], [])
        if tag == "td":
            self.cell_text = []
            self.stack.append((tag, a.get("data-key"), self.cell_text))
            if "data-null" in a:
                self.nulls.add(a["data-key"])

    def handle_endtag(self, tag):
        if tag == "svg":
            self.svg -= 1
        if tag == "table":
            self.in_glossary = False
        if tag == "td" and self.stack:
            _, key, text = self.stack.pop()
            joined = "".join(text).strip()
            if key is not None:
                self.cells[key] = joined
            if self.row is not None:
                self.row[1].append(joined)
        if tag == "tr" and self.row is not None:
            self.glossary[self.row[0]] = self.row[1]
            self.row = None

    def handle_data(self, data):
        if self.svg:
            return
        self.text.append(data)
        for _, _, text in self.stack:
            text.append(data)


def _read(path) -> _Page:
    p = _Page()
    p.feed(path.read_text(encoding="utf-8"))
    p.close()
    return p


def _number(text: str) -> float:
    """A number as the page shows it (minus sign, times ten to a power) back to a float."""
    t = text.replace("\u2212", "-").replace("\u202f\u00d7\u202f10", "e")
    return float(t)


def _numbers(text: str) -> list[float]:
    """The numbers of a cell: one, or the two of a point (x, y)."""
    t = text.replace("\u2212", "-").replace("\u202f\u00d7\u202f10", "e")
    return [float(x) for x in re.findall(r"-?[0-9.]+(?:e-?\d+)?", t)]


def _at(obj, path: str):
    for part in path.split("."):
        obj = obj[int(part)] if isinstance(obj, list) else obj[part]
    return obj


def _compare(page: _Page, obj) -> int:
    """Every number cell against its JSON value; returns how many values were compared."""
    count = 0
    for key, text in page.cells.items():
        value = _at(obj, key)
        if key in page.nulls:
            assert value is None, key
            continue
        if isinstance(value, str):
            assert value in text, key
            continue
        shown = _numbers(text)
        expected = value if isinstance(value, list) else [value]
        assert len(shown) == len(expected), (key, text)
        for s, e in zip(shown, expected, strict=True):
            assert s == pytest.approx(e, rel=SHOWN, abs=0.0), (key, text, e)
            count += 1
    return count


def _run(capsys, *args):
    code = main([*map(str, args)])
    out, err = capsys.readouterr()
    return code, out, err


def _self_contained(raw: str) -> None:
    assert raw.startswith("<!DOCTYPE html>")
    assert "Content-Security-Policy" in raw and "<script" not in raw.lower()
    assert not re.search(r"""(?:src|href)\s*=\s*["'](?!data:|#)""", raw), "loads from outside"


def test_member_page_shows_the_json(capsys, tmp_path):
    out = tmp_path / "member.html"
    code, text, err = _run(capsys, *MEMBER[:1], CHANNEL, *MEMBER[1:], "--json", "--html", out)
    assert code == 0, err
    obj = json.loads(text)
    raw = out.read_text(encoding="utf-8")
    _self_contained(raw)
    page = _read(out)
    compared = _compare(page, obj)
    # every station value, both numbers of each largest value, every governing-section value
    n = len(obj["stations"]["z"])
    assert {f"stations.{q}.{k}" for q in obj["stations"] for k in range(n)} <= set(page.cells)
    assert compared >= 8 * n + 2 * 7 + len(obj["governing_sections"]) * 7
    k = [e["quantity"] for e in obj["largest"]].index("B")
    B = obj["largest"][k]["value"]
    assert _number(page.cells[f"largest.{k}.value"]) == pytest.approx(B, rel=SHOWN)
    g = [s["governs"] for s in obj["governing_sections"]].index("B")
    sigma = obj["governing_sections"][g]["sigma_w"]
    assert _number(page.cells[f"governing_sections.{g}.sigma_w"]) == pytest.approx(sigma, rel=SHOWN)
    assert raw.count("<svg") == 1  # the figure of phi and B
    # the glossary: a row per symbol shown, each unit that of the JSON's units
    assert {h.split(".")[0] for h in page.heads} <= set(page.glossary)
    for key, (_symbol, meaning, definition, unit) in page.glossary.items():
        assert meaning == TERM_BY_KEY[key].meaning and definition
        if key in obj["units"]:
            assert unit == re.sub(r"<[^>]+>", "", unit_html(obj["units"][key])), key
    for key in ("B", "sigma_w", "tau_sv", "phi", "GJ", "ECw", "length"):
        assert key in page.glossary, key
    body = " ".join(page.text)
    assert CAUTION in body and "N·mm" in body and "MPa" in body


def test_stress_page_of_combined_loads_with_points(capsys, tmp_path):
    out = tmp_path / "stress.html"
    code, text, err = _run(capsys, "stress", CHANNEL, "--accuracy", "draft", "--material",
                           "steel-S235", "--moment-x", "2e5", "--torque", "3e3", "--bimoment",
                           "1e6", "--at", "40,72", "--json", "--html", out)
    assert code == 0, err
    obj = json.loads(text)
    page = _read(out)
    _self_contained(out.read_text(encoding="utf-8"))
    compared = _compare(page, obj)
    assert compared >= 30
    for key in ("bimoment", "sigma_w", "sigma_w_at", "von_mises_max", "materials.0.sigma_tension",
                "materials.0.sigma_compression", "at_points.0.sigma", "at_points.0.von_mises"):
        assert key in page.cells, key
    for key in ("bimoment", "sigma_w", "sigma_tension", "sigma_compression", "tau_zx", "sigma",
                "utilisation"):
        assert key in page.glossary, key
    assert page.glossary["bimoment"][3] == "N·mm2"
    assert "<svg" in out.read_text(encoding="utf-8")


def test_stress_page_of_load_cases_and_escaped_names(capsys, tmp_path):
    name = tmp_path / "ch<b>&\"x'.txt"
    shutil.copy(CHANNEL, name)
    cases = tmp_path / "cases.csv"
    cases.write_text("# invented cases\nunits: mm\ncase, N, Mx, T\n<i>wind</i> & 'gust', -1500, "
                     "0, 3000\nself weight, 0, 2e5, 0\n")
    out = tmp_path / "cases.html"
    code, text, err = _run(capsys, "stress", name, "--accuracy", "draft", "--material",
                           "steel-S235", "--load-cases", cases, "--json", "--html", out)
    assert code == 0, err
    obj = json.loads(text)
    raw = out.read_text(encoding="utf-8")
    assert "<b>&" not in raw and "<i>wind" not in raw  # escaped, not markup
    page = _read(out)
    assert f"Load cases in {name}" in page.text
    assert _compare(page, obj) >= 2 * 15
    assert page.cells["cases.0.case"] == "<i>wind</i> & 'gust'"
    assert _number(page.cells["cases.0.loads.N"]) == -1500.0


def test_shear_page_and_page_on_standard_output(capsys, tmp_path):
    args = ["stress", SAMPLES / "key_bar_12x8.txt", "--accuracy", "draft", "--torque", "1000",
            "--shear-modulus", "81000"]
    code, text, err = _run(capsys, *args, "--json")
    assert code == 0, err
    obj = json.loads(text)
    code, text, err = _run(capsys, *args, "--html", "-")
    assert code == 0, err
    assert text.startswith("<!DOCTYPE html>") and "Shear stresses in" not in text  # instead
    path = tmp_path / "p.html"
    path.write_text(text, encoding="utf-8")
    page = _read(path)
    assert _compare(page, obj) >= 8
    for key in ("torque", "J", "tau_max", "tau_max_torsion", "twist_rate", "twist_rate_deg"):
        assert key in page.cells and key in page.glossary, key
    assert page.glossary["twist_rate_deg"][3] == "deg/m"


@pytest.mark.parametrize("html, words", [
    ("{tmp}/missing/out.html", ["--html", "does not exist"]),
    ("{tmp}", ["--html", "names a folder"]),
    ("{input}", ["--html", "input file"]),
    ("-", ["--html", "--json", "standard output"]),
])
@pytest.mark.parametrize("command", ["member", "stress", "cases"])
def test_bad_page_paths_are_refused_before_any_work(capsys, tmp_path, html, words, command):
    source = tmp_path / "in.txt"
    shutil.copy(CHANNEL, source)
    target = html.format(tmp=tmp_path, input=source)
    if command == "member":
        args = [*MEMBER[:1], source, *MEMBER[1:]]
    elif command == "stress":
        args = ["stress", source, "--torque", "1e3", "--material", "steel-S235"]
    else:
        cases = tmp_path / "c.csv"
        cases.write_text("case, T\none, 1000\n")
        args = ["stress", source, "--load-cases", cases, "--material", "steel-S235"]
    before = sorted(p.name for p in tmp_path.iterdir())
    code, out, err = _run(capsys, *args, "--json", "--html", target)
    assert code == 2 and out == ""
    assert_one_line_error(code, err, *words)
    assert sorted(p.name for p in tmp_path.iterdir()) == before  # nothing written
    assert source.read_bytes() == CHANNEL.read_bytes()
