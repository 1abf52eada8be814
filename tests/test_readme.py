"""The README says what the program does: its glossary, unit systems, exit codes and examples.

Command blocks in the README that start with ``$`` are transcripts: each command is run in a
scratch folder (with ``sample_sections`` beside it, and the files of the README's blocks whose
first line is ``# file: NAME``), and every output line shown must appear in the command's output
(stdout and stderr); ``...`` stands for lines left out, a line ending in ``...`` for the start
of a line, and ``$ echo $?`` for the exit code of the command before.
"""

import os
import re
import shlex
import subprocess
import sys
from pathlib import Path

import pytest

from warpwise.cli import commands
from warpwise.report.quantities import QUANTITIES
from warpwise.units import DENSITY_UNITS, STRESS_UNITS, SYSTEMS

ROOT = Path(__file__).resolve().parents[1]
README = (ROOT / "README.md").read_text()
BLOCKS = re.findall(r"^```[a-z]*\n(.*?)^```", README, flags=re.S | re.M)
TRANSCRIPTS = [b for b in BLOCKS if b.startswith("$ ")]
FILES = {m.group(1): b for b in BLOCKS if (m := re.match(r"# file: (\S+)\n", b))}
JSON_ARRAYS = ("centroid", "shear_centre", "shear_centre_elastic")


def _prose(text: str) -> str:
    """``text`` with the inside of every code block blanked (same length: offsets hold)."""
    return re.sub(r"^```.*?^```", lambda m: re.sub(r"[^\n]", " ", m.group()), text,
                  flags=re.S | re.M)


def _section(heading: str) -> str:
    """The README text under a heading, up to the next heading of the same or a higher level."""
    level = heading.split()[0]
    start = README.index(heading + "\n") + len(heading)
    pattern = "^#{1," + str(len(level)) + "} "
    ends = [m.start() for m in re.finditer(pattern, _prose(README[start:]), flags=re.M)]
    return README[start:start + ends[0]] if ends else README[start:]


def _table(text: str, header: str) -> list[list[str]]:
    """Cells of the Markdown table that starts with ``header`` (escaped pipes kept in cells)."""
    lines = text[text.index(header):].split("\n")
    rows = []
    for line in lines[2:]:
        if not line.startswith("|"):
            break
        rows.append([c.strip() for c in re.split(r"(?<!\\)\|", line)[1:-1]])
    return rows


def test_glossary_lists_every_quantity():
    # every reported quantity is explained in the README glossary (common practice, no source)
    missing = [q.key for q in QUANTITIES if f"`{q.key}`" not in README]
    assert not missing


def test_readme_opens_with_the_job_and_carries_the_caution():
    first = README.split("\n\n")[1]
    assert "engineers" in first
    assert "never replace" in README


def test_glossary_rows_name_only_reported_quantities_in_order():
    # no orphaned rows: the table's rows are exactly the quantities, in their order, with the
    # JSON arrays named where JSON has no key of the quantity's own
    rows = _table(_section("## Property glossary"), "| symbol | key |")
    keys = [re.findall(r"`([^`]+)`", r[1]) for r in rows]
    assert [k[0] for k in keys] == [q.key for q in QUANTITIES]
    for k in keys:
        assert set(k[1:]) <= set(JSON_ARRAYS), k
    assert all(len(r) == 5 for r in rows)


def test_json_and_csv_keys_are_the_ones_written(tmp_path):
    # the glossary's claims about the JSON object and the CSV header, against a real run
    import csv
    import json

    from warpwise.geometry.shapes import shape_from_spec
    from warpwise.properties.run import AnalysisOptions, run_analysis
    from warpwise.report.files import csv_text, to_json_object

    result = run_analysis(shape_from_spec("rectangle:b=20,h=10"), AnalysisOptions())
    obj = to_json_object(result)
    for name in JSON_ARRAYS:
        assert len(obj[name]) == 2
    assert not {"xc", "yc", "xs", "ys", "xse", "yse"} & set(obj)
    assert {"file", "units", "mesh", "notes", "warnings"} <= set(obj)
    header = next(csv.reader([csv_text([result]).split("\n")[0]]))
    for column in ("file", "length unit", "A (mm2)", "xc (mm)", "xs (mm)", "mesh nodes (count)",
                   "mesh elements (count)", "warnings (text)"):
        assert column in header
    json.dumps(obj)


def test_headings_are_not_repeated():
    headings = re.findall(r"^#{1,4} .+$", _prose(README), flags=re.M)
    assert len(headings) == len(set(headings)), headings
    assert headings.count("### From Python") == 1


def test_unit_systems_and_material_units_are_all_described():
    units = _section("### Units")
    rows = _table(units, "| system |")
    assert [r[0].strip("`") for r in rows] == list(SYSTEMS)
    for r in rows:
        s = SYSTEMS[r[0].strip("`")]
        assert r[1:4] == [s.length, s.force, s.stress]
        assert r[6:8] == [s.density, s.linear_mass]
    for name in (*STRESS_UNITS, *DENSITY_UNITS):
        assert f"`{name}`" in units, name
    assert "NIST Special Publication 811 (2008" in units
    for option in ("--report-units", "--table-units", "--units"):
        assert option in units


def test_exit_codes_are_those_of_the_program():
    rows = _table(_section("### Exit codes"), "| code |")
    codes = {int(r[0]): r[1] for r in rows}
    assert set(codes) == {0, commands.EXIT_INPUT, commands.EXIT_USAGE, commands.EXIT_INTERNAL,
                          commands.EXIT_TARGET, 130}
    assert "input file" in codes[commands.EXIT_INPUT]
    assert "command line" in codes[commands.EXIT_USAGE]
    assert "torque without a material" in codes[commands.EXIT_USAGE]
    assert "internal" in codes[commands.EXIT_INTERNAL]
    assert "--target-error" in codes[commands.EXIT_TARGET]
    assert "exits with 1" in codes[commands.EXIT_TARGET]  # a failure outranks a missed target
    assert "interrupted" in codes[130]


def _expected(block: str) -> list[tuple[str, list[str]]]:
    """(command, lines shown after it) for each ``$`` line of a transcript."""
    steps: list[tuple[str, list[str]]] = []
    for line in block.rstrip("\n").split("\n"):
        if line.startswith("$ "):
            steps.append((line[2:], []))
        else:
            steps[-1][1].append(line)
    return steps


def _shown_in(line: str, output: list[str]) -> bool:
    if line.endswith("..."):
        return any(o.startswith(line[:-3]) for o in output)
    return line in output


@pytest.mark.parametrize("block", TRANSCRIPTS, ids=[b.split("\n")[0][2:60] for b in TRANSCRIPTS])
def test_readme_transcript(block, tmp_path):
    (tmp_path / "sample_sections").symlink_to(ROOT / "sample_sections")
    for name, text in FILES.items():
        (tmp_path / name).write_text(text)
    env = {**os.environ, "COLUMNS": "80",
           "PATH": f"{Path(sys.executable).parent}{os.pathsep}{os.environ.get('PATH', '')}"}
    env.pop("WARPWISE_DEBUG", None)
    last = None
    for command, shown in _expected(block):
        if command == "echo $?":
            assert shown == [str(last.returncode)], (last.args, last.stderr)
            continue
        if last is not None:
            assert last.returncode == 0, (last.args, last.stderr)
        last = subprocess.run(shlex.split(command), cwd=tmp_path, env=env, capture_output=True,
                              text=True, timeout=300)
        output = [s.rstrip() for s in (last.stdout + "\n" + last.stderr).split("\n")]
        missing = [s for s in shown if s.strip() and s != "..." and not _shown_in(s.rstrip(), output)]
        assert not missing, f"{command}: lines not in the output: {missing}\n{last.stdout}{last.stderr}"
    if _expected(block)[-1][0] != "echo $?":
        assert last.returncode == 0, (last.args, last.stderr)
