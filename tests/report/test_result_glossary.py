"""One list of the member and stress outputs: the README tables, the JSON keys and the text
legends agree with it (common practice, no source: a term explained once, everywhere the same).

The lists are :data:`warpwise.member.MEMBER_TERMS` and
:data:`warpwise.report.stress_terms.STRESS_TERMS`; the JSON objects come from real runs.
"""

from __future__ import annotations

import json
import re

import pytest

from conftest import SAMPLES
from test_readme import _section, _table
from warpwise.cli import main
from warpwise.member import MEMBER_TERMS, QUANTITIES, TERM_BY_KEY
from warpwise.report.stress_terms import CASE_LOADS, STRESS_TERM_BY_KEY, STRESS_TERMS

CHANNEL = SAMPLES / "channel_thick_80x40.txt"


def _keys(cells: str) -> list[str]:
    return re.findall(r"`([^`]+)`", cells)


def _json(capsys, *args) -> dict:
    assert main([*map(str, args), "--accuracy", "draft", "--json"]) == 0
    return json.loads(capsys.readouterr().out)


def test_member_readme_table_is_the_list():
    rows = _table(_section("### Torsion of a member"), "| key | meaning | definition |")
    assert [_keys(r[0]) for r in rows] == [[t.key] for t in MEMBER_TERMS]
    for r, t in zip(rows, MEMBER_TERMS, strict=True):
        unescape = [c.replace("\\|", "|") for c in r]
        assert unescape[1:] == [t.meaning, t.definition, t.unit("mm")], t.key


def test_stress_readme_tables_are_the_list():
    given = _table(_section("### A given axis, given points and several load cases"),
                   "| key | meaning | definition |")
    terms = [t for t in STRESS_TERMS if t.group == "given"]
    assert [_keys(r[0]) for r in given] == [[t.key] for t in terms]
    for r, t in zip(given, terms, strict=True):
        assert [c.replace("\\|", "|") for c in r[1:]] == [t.meaning, t.definition, t.unit("mm")]
    # the table under "Stress results" names the others: together every key of the list, once
    results = _table(_section("### Stress results"), "| key | meaning | unit (mm system) |")
    named = {k for r in results for k in _keys(r[0])}
    assert named | {t.key for t in terms} == set(STRESS_TERM_BY_KEY)
    assert named <= {t.key for t in STRESS_TERMS if t.group == "section"} | {"materials"}


def test_member_json_keys_are_the_list(capsys):
    obj = _json(capsys, "member", CHANNEL, "--material", "steel-S235", "--length", 2000,
                "--ends", "fixed,pinned", "--point-torque", "5e4@800")
    assert list(obj) == [k for k in TERM_BY_KEY if k in obj]
    assert set(obj) <= set(TERM_BY_KEY)
    assert set(obj["stations"]) <= set(TERM_BY_KEY)
    for s in obj["governing_sections"]:
        assert set(s) <= set(TERM_BY_KEY)
    # the keys of the list items are named in the definition of their list
    for name in ("torques", "largest"):
        assert set(obj[name][0]) <= set(_keys(TERM_BY_KEY[name].definition)), name
    # every quantity's unit is the one the JSON names
    for key, unit in obj["units"].items():
        if key in TERM_BY_KEY:
            assert TERM_BY_KEY[key].unit("mm") == unit, key


def _all_keys(obj) -> set[str]:
    """Every key of a JSON object and its nested objects, the units object left out."""
    if isinstance(obj, list):
        return set().union(*map(_all_keys, obj)) if obj else set()
    if not isinstance(obj, dict):
        return set()
    return set(obj) | set().union(*(_all_keys(v) for k, v in obj.items() if k != "units"))


def test_stress_json_keys_are_the_list(capsys, tmp_path):
    combined = _json(capsys, "stress", CHANNEL, "--material", "steel-S235", "--moment-x", 2e5,
                     "--torque", 3e3, "--bimoment", 1e6, "--at", "40,72")
    shear = _json(capsys, "stress", CHANNEL, "--material", "steel-S235", "--torque", 3e3)
    cases = tmp_path / "c.csv"
    cases.write_text("case, N, Mx, My, Vx, Vy, T\none, 1, 2, 3, 4, 5, 6\n")
    table = _json(capsys, "stress", CHANNEL, "--material", "steel-S235", "--load-cases", cases)
    loads = set(table["cases"][0]["loads"])
    assert loads <= set(CASE_LOADS)
    for obj in (combined, shear, table):
        assert _all_keys(obj) - loads <= set(STRESS_TERM_BY_KEY), _all_keys(obj) - set(STRESS_TERM_BY_KEY)
    assert set(combined["materials"][0]) <= set(_keys(STRESS_TERM_BY_KEY["materials"].definition)) \
        | {"sigma_tension", "sigma_tension_at", "sigma_compression", "sigma_compression_at"}


def test_member_text_legends_come_from_the_list(capsys):
    assert main(["member", str(CHANNEL), "--accuracy", "draft", "--material", "steel-S235",
                 "--length", "2000", "--ends", "fixed,pinned", "--point-torque", "5e4@800"]) == 0
    out = capsys.readouterr().out
    for key, symbol in QUANTITIES:
        t = TERM_BY_KEY[key]
        assert symbol == t.symbol
        assert re.search(rf"^  {re.escape(t.legend)} +{re.escape(t.symbol)} ", out, re.M), key
    for key in ("sigma_w", "tau_w", "tau_sv"):
        t = TERM_BY_KEY[key]
        assert re.search(rf"^    {re.escape(t.legend)} +{re.escape(t.symbol)} ", out, re.M), key


@pytest.mark.parametrize("args", [
    ["--moment-x", "2e5", "--torque", "3e3", "--bimoment", "1e6", "--at", "40,72"],
    ["--torque", "3e3", "--shear-y", "100"],
])
def test_stress_text_symbols_are_in_the_list(capsys, args):
    # the text of stress (not made from the list) prints only symbols the list explains
    assert main(["stress", str(CHANNEL), "--accuracy", "draft", "--material", "steel-S235",
                 *args]) == 0
    out = capsys.readouterr().out
    symbols = {t.symbol for t in STRESS_TERMS if t.symbol}
    printed = set(re.findall(r"^  \S.*?  +(\S+) +-?[0-9][0-9.e+-]*  \S", out, re.M))
    assert printed and printed <= symbols, printed - symbols
