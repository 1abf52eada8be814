"""Wall time of the README's main job, with and without the HTML datasheets.

    python scripts/bench_main_job.py            # 3 runs of each case, min and median
    python scripts/bench_main_job.py --runs 5

The job is the README quick start, ``warpwise catalogue sample_sections --csv OUT`` with and
without ``--html DIR``, each with ``--jobs 1`` and with the default workers (one per CPU),
written into a temporary folder, warpwise's bytecode cache warm. The ratio is the time with
datasheets over the time of the CSV alone (the target: at most 1.5).
"""

from __future__ import annotations

import argparse
import os
import statistics
import tempfile
from pathlib import Path

from bench_startup import command, once  # scripts/ is on the path when this is run

ROOT = Path(__file__).resolve().parents[1]


def run(html: bool, jobs: int | None) -> float:
    """Seconds of one run of the job, written into a temporary folder."""
    with tempfile.TemporaryDirectory() as tmp:
        args = [*command(), "catalogue", str(ROOT / "sample_sections"), "--csv",
                str(Path(tmp) / "sample_properties.csv")]
        if html:
            args += ["--html", str(Path(tmp) / "sample_datasheets")]
        if jobs is not None:
            args += ["--jobs", str(jobs)]
        env = {k: v for k, v in os.environ.items() if k != "PYTHONDONTWRITEBYTECODE"}
        return once(args, env)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--runs", type=int, default=3)
    args = parser.parse_args()
    run(False, 1)  # the bytecode cache written, files in the disk cache; not timed
    print(f"warpwise catalogue sample_sections, {args.runs} runs each, wall time in seconds "
          f"({os.cpu_count()} CPUs)")
    print(f"{'workers':10s} {'CSV min':>8s} {'CSV med':>8s} {'+HTML min':>10s} {'+HTML med':>10s} "
          f"{'ratio':>6s}")
    for jobs in (1, None):
        csv = [run(False, jobs) for _ in range(args.runs)]
        html = [run(True, jobs) for _ in range(args.runs)]
        print(f"{'--jobs 1' if jobs == 1 else 'default':10s} {min(csv):8.2f} "
              f"{statistics.median(csv):8.2f} {min(html):10.2f} {statistics.median(html):10.2f} "
              f"{min(html) / min(csv):6.2f}", flush=True)


if __name__ == "__main__":
    main()
