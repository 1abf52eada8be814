"""Time and memory of the inputs that could run away: each case in its own process.

Run: python scripts/bench_limits.py [CASE ...]

Every case is a small generated input that expands into big work (a million-copy MINSERT, a
spline of 100,000 control points, a plate with 10,000 holes, a traced outline of 200,000
vertices, ...). Each runs in a subprocess; the script prints its wall time, its peak resident
memory and how it ended (a result or a refusal). The tests check the outcomes; the timings live
here, not in the tests.
"""

from __future__ import annotations

import subprocess
import sys
import tempfile
import time
from collections.abc import Callable
from pathlib import Path

#: Each case: name -> function(folder) returning the command-line words of a warpwise run.
CASES: dict[str, Callable[[Path], list[str]]] = {}


def case(fn: Callable[[Path], list[str]]) -> Callable[[Path], list[str]]:
    """Register a case under its function name."""
    CASES[fn.__name__] = fn
    return fn


# --- drawings (DXF) -----------------------------------------------------------------------------


# --- outlines, parts and meshes ------------------------------------------------------------------


#: The child process: the warpwise command, then its own peak resident memory on stderr.
CHILD = ("import atexit, resource, sys\n"
         "atexit.register(lambda: print('peak KiB', resource.getrusage(resource.RUSAGE_SELF).ru_maxrss,"
         " file=sys.stderr))\n"
         "from warpwise.cli import main\n"
         "sys.exit(main(sys.argv[1:]))\n")


def run(name: str, folder: Path) -> None:
    """Run one case in a subprocess; print wall time, peak memory and the last line it wrote."""
    words = CASES[name](folder)
    start = time.perf_counter()
    proc = subprocess.run([sys.executable, "-c", CHILD, *words], capture_output=True, text=True)
    wall = time.perf_counter() - start
    lines = proc.stderr.strip().splitlines()
    peak = int(lines.pop().split()[-1]) / 1024 if lines and lines[-1].startswith("peak KiB") else float("nan")
    last = (lines or proc.stdout.strip().splitlines() or [""])[-1]
    print(f"{name:<32} exit {proc.returncode:>3}  {wall:7.2f} s  peak {peak:8.0f} MiB  {last[:90]}")


def main(argv: list[str]) -> None:
    names = argv or list(CASES)
    with tempfile.TemporaryDirectory() as tmp:
        for name in names:
            run(name, Path(tmp))


if __name__ == "__main__":
    main(sys.argv[1:])
