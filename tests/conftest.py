import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
SAMPLES = ROOT / "sample_sections"


def sample_folder(folder, names):
    """A folder ``folder`` holding copies of the named sample profiles."""
    import shutil

    folder.mkdir()
    for name in names:
        shutil.copy(SAMPLES / name, folder / name)
    return folder


def run_cli(*args, cwd=None):
    """Run the warpwise command in a subprocess; return (code, stdout, stderr)."""
    proc = subprocess.run([sys.executable, "-m", "warpwise.cli", *map(str, args)],
                          capture_output=True, text=True, cwd=cwd, timeout=120)
    return proc.returncode, proc.stdout, proc.stderr


def assert_one_line_error(code, err, *words):
    """A clean refusal: non-zero exit, one line on stderr holding every word, no traceback."""
    assert code != 0
    assert "Traceback" not in err
    lines = [ln for ln in err.splitlines() if ln.strip()]
    assert len(lines) == 1, err
    for w in words:
        assert w in lines[0], lines[0]
    return lines[0]


@pytest.fixture
def cli():
    return run_cli


@pytest.fixture
def box_file(tmp_path):
    p = tmp_path / "box.txt"
    p.write_text("# 20 x 8 box\nunits: mm\n0 0\n20 0\n20 8\n0 8\n\n5 2\n15 2\n15 6\n5 6\n")
    return p
