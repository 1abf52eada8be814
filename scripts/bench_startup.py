"""Wall time of ``warpwise props`` on each sample profile, bytecode cache cold and warm.

    python scripts/bench_startup.py                 # every sample, 7 runs each, min and median
    python scripts/bench_startup.py --runs 15 sample_sections/key_bar_12x8.txt

Each run is a fresh ``warpwise props FILE`` process (the console script next to this Python,
else ``python -m warpwise.cli``), its output thrown away; the time is the wall time of the
whole process, start-up included. "cold": warpwise's own bytecode cache (``__pycache__`` under
the package) is removed and ``PYTHONDONTWRITEBYTECODE=1`` keeps it from being written, so every
run compiles warpwise's sources again (the libraries keep their installed bytecode). "warm":
the cache is written by a first run that is not timed, as on a developer's machine. The
minimum of the runs is the figure to compare (least disturbed by the rest of the machine).
The first row, "libraries alone", is a Python that only imports what every analysis needs
(numpy, scipy.sparse.linalg, shapely, meshpy): the floor of any ``props`` run on this machine
at this moment, so that the rows can be read on a busy machine too.
"""

from __future__ import annotations

import argparse
import os
import shutil
import statistics
import subprocess
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]


def command() -> list[str]:
    """The ``warpwise`` command of this Python."""
    script = Path(sys.executable).with_name("warpwise")
    return [str(script)] if script.exists() else [sys.executable, "-m", "warpwise.cli"]


def package_dir() -> Path:
    import warpwise

    return Path(warpwise.__file__).resolve().parent


def clear_cache() -> None:
    for cache in package_dir().rglob("__pycache__"):
        shutil.rmtree(cache, ignore_errors=True)


def once(args: list[str], env: dict[str, str]) -> float:
    start = time.perf_counter()
    proc = subprocess.run(args, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE, env=env,
                          stdin=subprocess.DEVNULL)
    seconds = time.perf_counter() - start
    if proc.returncode != 0:
        raise SystemExit(f"{' '.join(args)} failed: {proc.stderr.decode()[-500:]}")
    return seconds


#: What every analysis imports: the floor of a ``props`` run.
LIBRARIES = "import numpy, scipy.sparse.linalg, scipy.sparse.csgraph, shapely, meshpy.triangle"


def measure(path: Path | None, runs: int, cold: bool) -> list[float]:
    env = dict(os.environ)
    args = [sys.executable, "-c", LIBRARIES] if path is None else [*command(), "props", str(path)]
    if cold:
        clear_cache()
        env["PYTHONDONTWRITEBYTECODE"] = "1"
    else:
        env.pop("PYTHONDONTWRITEBYTECODE", None)
        once(args, env)  # writes the cache; not timed
    return [once(args, env) for _ in range(runs)]


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("files", nargs="*", type=Path,
                        default=sorted((ROOT / "sample_sections").glob("*.*")))
    parser.add_argument("--runs", type=int, default=7)
    args = parser.parse_args()
    print(f"warpwise props, {args.runs} runs each, wall time in seconds "
          f"({os.cpu_count()} CPUs, Python {sys.version.split()[0]})")
    print(f"{'profile':40s} {'cold min':>9s} {'cold med':>9s} {'warm min':>9s} {'warm med':>9s}")
    rows = []
    for path in [None, *args.files]:
        cold = measure(path, args.runs, cold=True)
        warm = measure(path, args.runs, cold=False)
        if path is not None:
            rows.append((min(cold), min(warm)))
        print(f"{path.name if path else 'libraries alone':40s} {min(cold):9.3f} "
              f"{statistics.median(cold):9.3f} {min(warm):9.3f} {statistics.median(warm):9.3f}",
              flush=True)
    if len(rows) > 1:
        print(f"{'median over the profiles':40s} {statistics.median(r[0] for r in rows):9.3f} "
              f"{'':9s} {statistics.median(r[1] for r in rows):9.3f}")


if __name__ == "__main__":
    main()
