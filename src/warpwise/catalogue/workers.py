"""The worker side of a catalogue: one profile analysed, worker processes tied to their parent."""

from __future__ import annotations

import ctypes
import os
import signal
import sys
import threading
import time
from concurrent.futures import ProcessPoolExecutor
from dataclasses import replace

from ..errors import WarpwiseError
from .items import Item, Outcome, RunOptions


def analyse_one(path: str | Item, options: RunOptions, sheet_name: str | None = None,
                label: str | None = None) -> Outcome:
    """Read and analyse one file; every user-input error is caught into the outcome.

    This is the worker function of a catalogue (picklable, top level). An :class:`Item` brings
    its own options (else ``options``), name and description; ``sheet_name`` and ``label`` are
    its datasheet's file name and the name it shows (default the file's own).
    """
    from ..properties.run import run_analysis
    from ..report.records import record_of

    item = path if isinstance(path, Item) else Item(str(path))
    path, options = item.path, item.options or options
    start = time.perf_counter()
    try:
        result = run_analysis(options.read.load(path), options.analysis)
        sheet = thumb = None
        if options.datasheet_dir:
            from ..report.html import thumbnail_svg, write_datasheet
            from ..stress import nominal_torsion

            shown = options.report_units or result.units
            sheet = str(write_datasheet(result, options.datasheet_dir,
                                        torsion=nominal_torsion(result, shown),
                                        nominal_torque=True, filename=sheet_name, units=shown,
                                        title=item.title, label=label))
            thumb = thumbnail_svg(result)
        record = replace(record_of(result), name=item.name, description=item.description)
        loops = None
        if options.outlines:
            from ..report.pdf_sheet import profile_loops

            loops = profile_loops(result.profile.regions)
        return Outcome(path, record, None, time.perf_counter() - start, sheet, thumb, loops)
    except WarpwiseError as exc:
        return Outcome(path, None, str(exc.with_file(path)), time.perf_counter() - start)
    except MemoryError:
        return Outcome(path, None, f"{path}: out of memory; give a larger --mesh-size",
                       time.perf_counter() - start)
    except Exception as exc:  # a bug must not stop the other profiles
        return Outcome(path, None, f"{path}: internal error: {type(exc).__name__}: {exc}",
                       time.perf_counter() - start)


def usable_cpus() -> int:
    """CPUs this process may run on (its affinity where the system tells it), at least 1."""
    if hasattr(os, "sched_getaffinity"):
        return len(os.sched_getaffinity(0)) or 1
    return os.cpu_count() or 1


def worker_count(jobs: int | None, total: int) -> int:
    """Worker processes of a run: ``jobs`` (default the CPUs) capped by the profiles and CPUs.

    Examples
    --------
    >>> worker_count(64, 3) <= 3, worker_count(1, 100), worker_count(5, 0)
    (True, 1, 1)
    """
    cpus = usable_cpus()
    return max(1, min(jobs or cpus, total, cpus))


#: Seconds between looks at the parent when the system cannot tell a worker of its death.
PARENT_POLL = 0.5
#: prctl option of Linux: a signal to the process when its parent ends.
_PR_SET_PDEATHSIG = 1


def _parent_gone(parent: int) -> bool:
    """Whether the process ``parent`` (this worker's creator) has ended."""
    if os.getppid() == parent:
        return False
    try:
        os.kill(parent, 0)  # POSIX only: a check, no signal is sent
    except ProcessLookupError:
        return True
    except OSError:
        return False
    return False


def _worker_start(parent: int) -> None:
    """Start of each worker process: it ends when its parent ends; Ctrl-C is the parent's."""
    signal.signal(signal.SIGINT, signal.SIG_IGN)  # the parent stops the workers itself
    told = False
    if sys.platform.startswith("linux"):
        try:
            told = ctypes.CDLL(None, use_errno=True).prctl(_PR_SET_PDEATHSIG, signal.SIGKILL) == 0
        except (OSError, AttributeError):
            told = False
    if _parent_gone(parent):  # it ended before the worker could ask to be told
        os._exit(1)
    if not told:
        start = os.getppid()

        def watch() -> None:
            while os.getppid() == start:
                time.sleep(PARENT_POLL)
            os._exit(1)

        threading.Thread(target=watch, name="warpwise-parent-watch", daemon=True).start()


def _stop_workers(pool: ProcessPoolExecutor) -> None:
    """End the worker processes of an interrupted run now, not after their current profile."""
    for process in list((getattr(pool, "_processes", None) or {}).values()):
        process.terminate()
    pool.shutdown(wait=True, cancel_futures=True)
