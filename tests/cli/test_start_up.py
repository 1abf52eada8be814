"""What a command loads: each command imports only what its work needs (start-up time).

Not a timing test (times depend on the machine; ``scripts/bench_startup.py`` measures them):
the command runs in a fresh interpreter as ``python -X importtime -m warpwise.cli ...`` and
the test reads the names of every module it imported from the import-time lines on stderr.
A plain outline file must not pay for the DXF reader (ezdxf), the pictures (matplotlib), the
optimiser of the member maxima (scipy.optimize), the k-d tree (scipy.spatial, for a handful
of sharp corners) or the catalogue's process pool; the datasheet pictures are drawn without
matplotlib.
"""

from __future__ import annotations

import os
import re
import subprocess
import sys

import pytest

from conftest import SAMPLES

KEY_BAR = SAMPLES / "key_bar_12x8.txt"  # no sharp re-entrant corner
CHANNEL = SAMPLES / "channel_thick_80x40.txt"  # filleted corners
DRAWING = SAMPLES / "rail_t_slot_40x45.dxf"
PLAIN_DRAWING = SAMPLES / "angle_thick_60x40x8.dxf"  # no sharp corner

#: Never loaded by ``props`` on an outline file without pictures.
NOT_FOR_AN_OUTLINE = ("ezdxf", "matplotlib", "scipy.optimize", "scipy.spatial",
                      "concurrent.futures.process", "warpwise.io.dxf", "warpwise.catalogue",
                      "warpwise.stress", "warpwise.member", "warpwise.report.plots",
                      "warpwise.report.plot_parts", "warpwise.workbench", "starlette",
                      "uvicorn", "jinja2")

_IMPORT_LINE = re.compile(r"^import time:\s+\d+ \|\s+\d+ \|( *)(\S+)\s*$")


def loaded(*args, cwd=None) -> set[str]:
    """Every module a ``warpwise`` command imports (from ``-X importtime``), after it succeeded."""
    env = {k: v for k, v in os.environ.items() if k != "PYTHONPROFILEIMPORTTIME"}
    proc = subprocess.run([sys.executable, "-X", "importtime", "-m", "warpwise.cli",
                           *map(str, args)], capture_output=True, text=True, env=env, cwd=cwd,
                          stdin=subprocess.DEVNULL, timeout=300)
    lines = proc.stderr.splitlines()
    names = {m.group(2) for m in map(_IMPORT_LINE.match, lines) if m}
    others = [line for line in lines if not line.startswith("import time:")]
    assert proc.returncode == 0, "\n".join(others[-20:])
    assert "warpwise.cli.commands" in names  # the import-time lines were read
    return names


def under(names: set[str], package: str) -> list[str]:
    """The modules of ``package`` (itself and its submodules) among ``names``."""
    return sorted(n for n in names if n == package or n.startswith(package + "."))


@pytest.fixture
def tee(tmp_path):
    """An invented T with two sharp re-entrant corners."""
    path = tmp_path / "tee.txt"
    path.write_text("0 0\n6 0\n6 30\n20 30\n20 36\n-14 36\n-14 30\n0 30\n")
    return path


@pytest.fixture
def bar(tmp_path):
    """An invented 30 x 10 flat bar."""
    path = tmp_path / "bar.txt"
    path.write_text("0 0\n30 0\n30 10\n0 10\n")
    return path


# (the key bar's obtuse chamfer corners are graded from h, with no nearest-point search)
@pytest.mark.parametrize("outline", ["bar", "key-bar", "filleted", "sharp-corners"])
def test_props_on_an_outline_loads_only_the_analysis(outline, tee, bar):
    outline = {"bar": bar, "key-bar": KEY_BAR, "filleted": CHANNEL, "sharp-corners": tee}[outline]
    names = loaded("props", outline)
    assert "warpwise.properties.analysis" in names and "meshpy" in names
    for package in NOT_FOR_AN_OUTLINE:
        assert not under(names, package), f"props on {outline.name} imported {under(names, package)}"


def test_props_json_and_csv_of_an_outline_load_no_more(tmp_path):
    names = loaded("props", CHANNEL, "--json", "--csv", tmp_path / "c.csv")
    for package in NOT_FOR_AN_OUTLINE:
        assert not under(names, package), package


def test_props_on_a_drawing_loads_the_dxf_reader_only(tmp_path):
    names = loaded("props", DRAWING)
    assert "ezdxf" in names and "warpwise.io.dxf" in names
    for package in ("matplotlib", "scipy.optimize", "concurrent.futures.process",
                    "warpwise.catalogue", "warpwise.report.plots"):
        assert not under(names, package), package


def test_reading_a_drawing_needs_no_k_d_tree():
    # the ends of the drawing's pieces are paired directly (a few dozen of them)
    names = loaded("props", PLAIN_DRAWING)
    assert "ezdxf" in names and not under(names, "scipy.spatial")


def test_datasheet_pictures_are_drawn_without_matplotlib(tmp_path):
    page = tmp_path / "key_bar.html"
    names = loaded("props", KEY_BAR, "--html", page)
    assert page.read_text(encoding="utf-8").count("<svg") == 3
    assert "warpwise.report.plot_svg" in names
    for package in ("matplotlib", "scipy.optimize", "ezdxf"):
        assert not under(names, package), package


def test_catalogue_datasheets_are_drawn_without_matplotlib(tmp_path):
    out = tmp_path / "sheets"
    names = loaded("catalogue", KEY_BAR, CHANNEL, "--html", out, "--csv", tmp_path / "p.csv",
                   "--jobs", "1")
    assert (out / "index.html").is_file() and len(list(out.glob("*.html"))) == 3
    for package in ("matplotlib", "scipy.optimize", "ezdxf"):
        assert not under(names, package), package


def test_a_picture_file_still_uses_matplotlib(tmp_path):
    picture = tmp_path / "mesh.png"
    names = loaded("plot", KEY_BAR, "--show", "mesh", "-o", picture)
    assert picture.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n" and "matplotlib" in names


def test_the_member_command_loads_its_optimiser():
    names = loaded("member", KEY_BAR, "--length", "500", "--ends", "fixed,free",
                   "--point-torque", "1000@500", "--material", "steel-S235")
    assert "scipy.optimize" in names
