"""An interrupted catalogue: its datasheet folder, its message, and no worker left behind.

The catalogue builds its pages in a hidden staging folder and moves them into place only when
every output is ready (README "Output files"), so a run that is interrupted (Ctrl-C, SIGINT)
leaves the visible files of an existing folder exactly as they were and says "no output
written" (the pages it finished wait in the hidden staging folder for a run that goes on); a run whose main
process is killed (SIGKILL) takes its worker processes with it. These cases run the command
in a subprocess with a time limit and, on Linux, a memory limit (a safety net only), signal
it once its first page is staged, then look at the folder and at the processes.

The profiles are small generated rectangles with a fine mesh (about a second each), so that
a run of eight on two workers is still busy when the first page lands.
"""

from __future__ import annotations

import os
import resource
import signal
import subprocess
import sys
import time
from pathlib import Path

import pytest

from conftest import ROOT
from warpwise.catalogue import usable_cpus, worker_count
from warpwise.cli import main
from warpwise.report.outputs import WRITTEN, interrupt_deferred

PROFILES = 8
#: Element size giving about a second of analysis per profile, mm.
SLOW_MESH = "0.3"
#: Longest wait for any step of a run, s (the whole run takes about 10 s on one CPU).
TIME_LIMIT = 120.0
#: Longest time the workers may outlive a killed parent, s (they are told by the kernel).
WORKER_GRACE = 5.0


def _limits():  # pragma: no cover - runs in the child
    resource.setrlimit(resource.RLIMIT_AS, (4 << 30, 4 << 30))


def profiles(folder: Path, n: int = PROFILES) -> Path:
    """``n`` rectangles 20+k by 8 mm in ``folder``."""
    folder.mkdir()
    for k in range(n):
        (folder / f"bar{k}.txt").write_text(f"units: mm\n0 0\n{20 + k} 0\n{20 + k} 8\n0 8\n")
    return folder


def old_catalogue(pages: Path) -> dict[str, bytes]:
    """An earlier catalogue in ``pages``: its files and their bytes."""
    pages.mkdir()
    (pages / "index.html").write_text("<html>old index</html>\n")
    (pages / "bar0-txt.html").write_text("<html>old page</html>\n")
    (pages / "notes.txt").write_text("the user's own file\n")
    return snapshot(pages)


def snapshot(folder: Path) -> dict[str, bytes]:
    """The files of a folder and their bytes (a folder in it: None)."""
    return {p.name: None if p.is_dir() else p.read_bytes() for p in sorted(folder.iterdir())}


def children(pid: int) -> list[int]:
    """Processes whose parent is ``pid`` (from /proc)."""
    found = []
    for entry in Path("/proc").iterdir():
        if entry.name.isdigit():
            try:
                fields = (entry / "stat").read_text().rsplit(")", 1)[1].split()
            except OSError:
                continue
            if int(fields[1]) == pid:
                found.append(int(entry.name))
    return found


def running(pids: list[int]) -> list[int]:
    """Those of ``pids`` still running (an ended one may stay a zombie until reaped)."""
    alive = []
    for pid in pids:
        try:
            state = Path(f"/proc/{pid}/stat").read_text().rsplit(")", 1)[1].split()[0]
        except OSError:
            continue
        if state not in ("Z", "X"):
            alive.append(pid)
    return alive


def start(tmp_path: Path, pages: Path) -> subprocess.Popen:
    env = dict(os.environ, PYTHONPATH=str(ROOT / "src"))
    return subprocess.Popen(
        [sys.executable, "-m", "warpwise.cli", "catalogue", str(tmp_path / "profiles"),
         "--html", str(pages), "--jobs", "2", "--mesh-size", SLOW_MESH],
        cwd=tmp_path, env=env, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True,
        preexec_fn=_limits if sys.platform.startswith("linux") else None)


def wait_first_page(proc: subprocess.Popen, where: Path) -> None:
    """Until the run has staged its first datasheet (hidden folder inside ``where``)."""
    deadline = time.monotonic() + TIME_LIMIT
    while not list(where.glob(".warpwise-partial/*.html")):
        assert proc.poll() is None, proc.communicate()
        assert time.monotonic() < deadline, "no page staged in time"
        time.sleep(0.05)


pytestmark = pytest.mark.skipif(not Path("/proc/self/stat").exists(),
                                reason="the process checks read /proc (Linux)")


def busy_run(tmp_path: Path):
    """A run over an old catalogue, busy with its first staged page: (process, pages, old
    files, worker processes)."""
    profiles(tmp_path / "profiles")
    pages = tmp_path / "pages"
    before = old_catalogue(pages)
    proc = start(tmp_path, pages)
    wait_first_page(proc, pages)
    workers = children(proc.pid)
    assert len(workers) == 2  # the pool of --jobs 2
    return proc, pages, before, workers


def test_ctrl_c_leaves_the_old_catalogue_and_no_worker(tmp_path):
    proc, pages, before, workers = busy_run(tmp_path)
    proc.send_signal(signal.SIGINT)
    _, err = proc.communicate(timeout=TIME_LIMIT)
    assert proc.returncode == 130
    last = err.splitlines()[-1]
    assert last.startswith("warpwise: interrupted; no output written; ")
    assert f"kept in {pages / '.warpwise-partial' / '.journal'}: the same command goes on" in last
    assert "Traceback" not in err
    # not one page of the new run in view, the old index intact; the finished pages and the
    # journal wait in the hidden staging folder for a run that goes on
    assert {n: b for n, b in snapshot(pages).items() if not n.startswith(".")} == before
    assert [p.name for p in pages.iterdir() if p.name.startswith(".")] == [".warpwise-partial"]
    assert sorted(p.name for p in tmp_path.iterdir()) == ["pages", "profiles"]
    assert running(workers) == []  # the run ended its workers before it returned


def test_killed_parent_takes_its_workers(tmp_path):
    proc, pages, before, workers = busy_run(tmp_path)
    proc.kill()
    proc.wait(timeout=TIME_LIMIT)  # not communicate: a surviving worker would hold the pipes
    proc.stdout.close()
    proc.stderr.close()
    deadline = time.monotonic() + WORKER_GRACE
    while running(workers) and time.monotonic() < deadline:
        time.sleep(0.05)
    assert running(workers) == []
    # the visible folder is the old catalogue; only the hidden staging folder is left over
    assert {n: b for n, b in snapshot(pages).items() if not n.startswith(".")} == before
    assert [p.name for p in pages.iterdir() if p.name.startswith(".")] == [".warpwise-partial"]


def test_finished_run_replaces_pages_and_keeps_other_files(tmp_path, capsys):
    folder = profiles(tmp_path / "profiles", n=2)
    pages = tmp_path / "pages"
    old_catalogue(pages)
    code = main(["catalogue", str(folder), "--html", str(pages), "--jobs", "1"])
    assert code == 0, capsys.readouterr().err
    assert sorted(snapshot(pages)) == ["bar0-txt.html", "bar1-txt.html", "index.html", "notes.txt"]
    assert (pages / "notes.txt").read_text() == "the user's own file\n"
    assert "old" not in (pages / "index.html").read_text()
    assert 'href="bar1-txt.html"' in (pages / "index.html").read_text()
    assert sorted(p.name for p in tmp_path.iterdir()) == ["pages", "profiles"]


def test_new_folder_appears_whole(tmp_path, capsys):
    folder = profiles(tmp_path / "profiles", n=2)
    pages = tmp_path / "pages"
    code = main(["catalogue", str(folder), "--html", str(pages), "--jobs", "1"])
    assert code == 0, capsys.readouterr().err
    assert sorted(snapshot(pages)) == ["bar0-txt.html", "bar1-txt.html", "index.html"]
    umask = os.umask(0)
    os.umask(umask)
    assert pages.stat().st_mode & 0o777 == 0o777 & ~umask  # not the staging folder's 0700
    assert sorted(p.name for p in tmp_path.iterdir()) == ["pages", "profiles"]


def test_interrupt_after_the_outputs_says_so(tmp_path, capsys, monkeypatch):
    from warpwise.cli import commands

    bar = profiles(tmp_path / "profiles", n=1) / "bar0.txt"
    out = tmp_path / "p.csv"
    real = commands.write_outputs

    def then_interrupted(*args, **kwargs):
        real(*args, **kwargs)
        raise KeyboardInterrupt

    monkeypatch.setattr(commands, "write_outputs", then_interrupted)
    assert main(["props", str(bar), "--csv", str(out)]) == 130
    assert capsys.readouterr().err.splitlines()[-1] == f"warpwise: interrupted; after writing {out}"
    assert out.read_text().startswith("file,")
    assert WRITTEN == [str(out)]


def test_ctrl_c_during_the_writes_is_held_until_they_are_done():
    done = []
    with pytest.raises(KeyboardInterrupt):
        with interrupt_deferred():
            os.kill(os.getpid(), signal.SIGINT)
            done.append("after the signal")  # the block goes on
    assert done == ["after the signal"]
    assert signal.getsignal(signal.SIGINT) is signal.default_int_handler  # handler restored


def test_jobs_capped_by_profiles_and_cpus(tmp_path, capsys):
    cpus = usable_cpus()
    # common practice, no source: no more workers than profiles or CPUs, at least one
    assert (worker_count(64, 3), worker_count(None, 100), worker_count(1, 100),
            worker_count(64, 0)) == (min(3, cpus), cpus, 1, 1)
    folder = profiles(tmp_path / "profiles", n=2)
    code = main(["catalogue", str(folder), "--csv", str(tmp_path / "p.csv"), "--jobs", "64"])
    err = capsys.readouterr().err
    assert code == 0, err
    jobs = min(2, cpus)
    assert err.splitlines()[0] == (f"warpwise: note: --jobs 64 capped to {jobs} (2 profiles, "
                                   f"{cpus} CPU{'s' if cpus != 1 else ''})")
