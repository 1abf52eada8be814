"""Output paths: checked before any work, written whole, never over a link, a device or an input.

Every case is a small generated outline and asserts the exact outcome: the exit status, the one
line on stderr, and what is (or is not) on disk afterwards (README "Output files"). The
refusals run in this process (``main``); cases that need a real standard output (a pipe,
``/dev/stdout``, ``-``) run the command in a subprocess.

The area checked in the written tables is that of a 20 x 8 rectangle, A = b h = 160 mm2
(closed form; six-node triangles integrate a polygon's area exactly, common practice, no
source), so a table that is written at all is also the right table.
"""

from __future__ import annotations

import csv
import io
import os
import stat
import threading

import pytest

from conftest import assert_one_line_error
from warpwise.cli import main
from warpwise.errors import UsageError
from warpwise.report.outputs import atomic_write

BAR = "# 20 x 8 bar\nunits: mm\n0 0\n20 0\n20 8\n0 8\n"
#: Exact area of BAR, mm2 (closed form b h).
BAR_AREA = 160.0


@pytest.fixture
def bar(tmp_path):
    p = tmp_path / "bar.txt"
    p.write_text(BAR)
    return p


def run(capsys, *args):
    """The command in this process: (exit status, stdout, stderr)."""
    code = main([str(a) for a in args])
    out, err = capsys.readouterr()
    return code, out, err


def table_area(text):
    """The A column of the one row of a CSV property table, mm2."""
    rows = list(csv.DictReader(io.StringIO(text)))
    assert len(rows) == 1, text
    return float(rows[0]["A (mm2)"])


def leftovers(folder):
    """Temporary or staging files left in a folder."""
    return sorted(p.name for p in folder.iterdir() if p.name.startswith("."))


# ---------------------------------------------------------------------------------------------
# links, devices, pipes, standard output


def test_link_is_followed_and_kept(capsys, bar, tmp_path):
    real = tmp_path / "tables" / "real.csv"
    real.parent.mkdir()
    real.write_text("old\n")
    link = tmp_path / "link.csv"
    link.symlink_to(real)
    code, _, err = run(capsys, "props", bar, "--csv", link)
    assert code == 0, err
    assert link.is_symlink() and os.readlink(link) == str(real)  # the link is left as it was
    assert table_area(real.read_text()) == BAR_AREA  # its target holds the new table
    assert leftovers(tmp_path) == [] and leftovers(real.parent) == []  # temp file was beside it


def test_replaced_file_keeps_its_permissions(capsys, bar, tmp_path):
    out = tmp_path / "p.csv"
    out.write_text("old\n")
    out.chmod(0o640)
    code, _, err = run(capsys, "props", bar, "--csv", out)
    assert code == 0, err
    assert stat.S_IMODE(out.stat().st_mode) == 0o640
    assert table_area(out.read_text()) == BAR_AREA


def test_full_device_is_a_clean_error(cli, bar):
    if not os.path.exists("/dev/full"):
        pytest.skip("no /dev/full on this system")
    code, _, err = cli("props", bar, "--csv", "/dev/full")
    line = assert_one_line_error(code, err)
    assert code == 2
    assert line == "warpwise: error: /dev/full: cannot be written (No space left on device)"
    assert stat.S_ISCHR(os.stat("/dev/full").st_mode)  # still the device, not a plain file


def test_null_device_is_written_straight(capsys, bar):
    code, _, err = run(capsys, "props", bar, "--csv", os.devnull)
    assert (code, err) == (0, "")
    assert stat.S_ISCHR(os.stat(os.devnull).st_mode)


def test_named_pipe_is_written_straight(capsys, bar, tmp_path):
    fifo = tmp_path / "rows.fifo"
    os.mkfifo(fifo)
    got = []
    reader = threading.Thread(target=lambda: got.append(fifo.read_text()), daemon=True)
    reader.start()
    code, _, err = run(capsys, "props", bar, "--csv", fifo)
    reader.join(timeout=30)
    assert code == 0, err
    assert table_area(got[0]) == BAR_AREA
    assert stat.S_ISFIFO(os.stat(fifo).st_mode)  # still the pipe


@pytest.mark.parametrize("target", ["-", "/dev/stdout"])
def test_csv_to_standard_output(cli, bar, tmp_path, target):
    # stdout is a pipe here; the CSV takes the place of the table
    code, out, err = cli("props", bar, "--csv", target, cwd=tmp_path)
    assert code == 0, err
    assert table_area(out) == BAR_AREA
    assert sorted(p.name for p in tmp_path.iterdir()) == ["bar.txt"]  # no file named "-"


def test_catalogue_csv_to_standard_output(cli, bar, tmp_path):
    code, out, err = cli("catalogue", bar, "--csv", "-", "--jobs", "1", cwd=tmp_path)
    assert code == 0, err
    assert table_area(out) == BAR_AREA
    assert sorted(p.name for p in tmp_path.iterdir()) == ["bar.txt"]


def test_api_writes_straight_to_a_pipe_and_refuses_a_folder(tmp_path):
    fifo = tmp_path / "p.fifo"
    os.mkfifo(fifo)
    got = []
    reader = threading.Thread(target=lambda: got.append(fifo.read_bytes()), daemon=True)
    reader.start()
    atomic_write(fifo, b"abc")
    reader.join(timeout=30)
    assert got == [b"abc"]
    with pytest.raises(UsageError, match="cannot write over it: it is a folder"):
        atomic_write(tmp_path, "x")


# ---------------------------------------------------------------------------------------------
# refusals before any work: exit status 2, one line, nothing written


def refused(capsys, *args):
    """The one error line of a refused command (exit status 2, nothing on stdout)."""
    code, out, err = run(capsys, *args)
    line = assert_one_line_error(code, err)
    assert (code, out) == (2, "")
    return line


def test_two_outputs_on_standard_output(capsys, bar, tmp_path):
    assert refused(capsys, "props", bar, "--csv", "-", "--json") == (
        "warpwise: error: --csv and --json both write to standard output ('-'); give one of "
        "them a file name")
    assert refused(capsys, "catalogue", bar, "--csv", "-", "--json", "-") == (
        "warpwise: error: --csv and --json both write to standard output ('-'); give one of "
        "them a file name")


@pytest.mark.parametrize("command, option, what", [
    (["catalogue"], "--html", "a folder"),
    (["plot"], "-o", "a file ending in .png, .pdf or .svg"),
    (["check"], "--plot", "a file ending in .png, .pdf or .svg")])
def test_standard_output_refused_where_it_makes_no_sense(capsys, bar, tmp_path, command, option,
                                                         what):
    assert refused(capsys, *command, bar, option, "-") == (
        f"warpwise: error: {option} cannot write to standard output ('-'); give {what}")
    assert sorted(p.name for p in tmp_path.iterdir()) == ["bar.txt"]


def on_input(path, option="--csv"):
    """The refusal of an output on an input file."""
    return (f"warpwise: error: {path}: {option} names an input file; it would be overwritten "
            "(give another name)")


def test_output_on_an_input_refused(capsys, bar, tmp_path):
    other = tmp_path / "flat.txt"
    other.write_text(BAR)
    before = bar.read_bytes()
    assert refused(capsys, "catalogue", bar, other, "--csv", bar) == on_input(bar)
    assert refused(capsys, "plot", bar, "-o", bar) == on_input(bar, "-o")
    assert bar.read_bytes() == before


def test_output_on_an_input_through_a_link_or_a_hard_link(capsys, bar, tmp_path):
    soft, hard = tmp_path / "soft.csv", tmp_path / "hard.csv"
    soft.symlink_to(bar)
    os.link(bar, hard)
    for out in (soft, hard):
        assert refused(capsys, "props", bar, "--csv", out) == on_input(out)
    assert bar.read_text() == BAR


def test_output_on_the_materials_table_refused(capsys, bar, tmp_path):
    table = tmp_path / "mine.toml"
    table.write_text("[materials.mine]\nE = 70000\nnu = 0.3\n")
    assert refused(capsys, "props", bar, "--materials", table, "--csv", table) == on_input(table)
    assert table.read_text() == "[materials.mine]\nE = 70000\nnu = 0.3\n"


def test_output_on_a_drawing_named_by_a_manifest_refused(capsys, bar, tmp_path):
    manifest = tmp_path / "list.toml"
    manifest.write_text('[[profile]]\nfile = "bar.txt"\n')
    assert refused(capsys, "catalogue", manifest, "--csv", bar) == on_input(bar)
    assert bar.read_text() == BAR


def test_two_outputs_on_one_path_refused(capsys, bar, tmp_path):
    out = tmp_path / "x.out"
    assert refused(capsys, "catalogue", bar, "--csv", out, "--json", out) == (
        f"warpwise: error: {out}: --csv and --json name the same file; give each output its own")
    assert not out.exists()


def test_folder_where_a_file_is_wanted_refused(capsys, bar, tmp_path):
    folder = tmp_path / "tables"
    folder.mkdir()
    assert refused(capsys, "catalogue", bar, "--csv", folder) == (
        f"warpwise: error: {folder}: --csv names a folder; give a file name")
    assert refused(capsys, "plot", bar, "-o", folder) == (
        f"warpwise: error: {folder}: -o names a folder; give a file ending in .png, .pdf or .svg")
    assert list(folder.iterdir()) == []


def test_file_where_a_folder_is_wanted_refused(capsys, bar, tmp_path):
    page = tmp_path / "pages"
    page.write_text("not a folder\n")
    assert refused(capsys, "catalogue", bar, "--html", page) == (
        f"warpwise: error: {page}: --html names a file; give a folder")
    assert page.read_text() == "not a folder\n"


def test_missing_csv_folder_found_before_any_analysis(capsys, bar, tmp_path):
    # before: found only after the analysis, with the datasheets already written
    out, pages = tmp_path / "no such folder" / "p.csv", tmp_path / "pages"
    assert refused(capsys, "catalogue", bar, "--csv", out, "--html", pages) == (
        f"warpwise: error: {out}: --csv goes into the folder '{out.parent}', which does not "
        "exist")  # the one line: no progress line, so nothing was analysed
    assert sorted(p.name for p in tmp_path.iterdir()) == ["bar.txt"]  # no pages, no staging


def test_missing_html_parent_refused(capsys, bar, tmp_path):
    pages = tmp_path / "no such folder" / "pages"
    assert refused(capsys, "catalogue", bar, "--html", pages) == (
        f"warpwise: error: {pages}: --html goes into the folder '{pages.parent}', which does not "
        "exist")


def test_picture_ending_checked_before_the_analysis(capsys, bar, tmp_path):
    assert refused(capsys, "plot", bar, "-o", tmp_path / "m.gif") == (
        f"warpwise: error: {tmp_path / 'm.gif'}: a picture must be a .png, .pdf or .svg file")


@pytest.mark.skipif(os.geteuid() == 0, reason="root may write a read-only file or folder")
def test_read_only_file_and_folder_refused(capsys, bar, tmp_path):
    out = tmp_path / "p.csv"
    out.write_text("kept\n")
    out.chmod(0o444)
    assert refused(capsys, "props", bar, "--csv", out) == (
        f"warpwise: error: {out}: --csv names a read-only file; it is not replaced")
    locked = tmp_path / "locked"
    locked.mkdir()
    locked.chmod(0o555)
    assert refused(capsys, "props", bar, "--csv", locked / "p.csv") == (
        f"warpwise: error: {locked / 'p.csv'}: --csv goes into the folder '{locked}', which "
        "cannot be written (no permission)")
    assert out.read_text() == "kept\n"


def test_csv_inside_a_new_html_folder_is_written(capsys, bar, tmp_path):
    pages = tmp_path / "pages"
    code, _, err = run(capsys, "catalogue", bar, "--html", pages, "--csv", pages / "p.csv",
                       "--jobs", "1")
    assert code == 0, err
    assert sorted(p.name for p in pages.iterdir()) == ["bar-txt.html", "index.html", "p.csv"]
    assert table_area((pages / "p.csv").read_text()) == BAR_AREA
