"""Catalogue throughput: profiles per second per worker, and the cost of a Dask scheduler.

Run: python scripts/bench_catalogue.py [N]

N profiles (default 40) are generated from the parametric library, cycling through hollow
rectangles (holes, rounded corners), I-beams and channels with root fillets, thin cold-formed
lipped channels, tubes and keyed shafts, each with its dimensions varied, and written as
coordinate outline files. The catalogue then runs over them

* serially in this process (1 worker) and in a process pool of 2 workers,
* on a Dask LocalCluster of 2 worker processes (``--cluster local``), when Dask's
  ``distributed`` is installed,

and the script prints the wall time, profiles per second, profiles per second per worker and,
for the cluster, the scheduler's overhead per profile (its wall time minus the pool's, per
profile). Finally it extrapolates to 10,000 profiles on 100 workers from the measured time per
profile per worker plus the scheduler's overhead per profile (a scheduler hands out tasks one
after another, so its overhead does not divide by the workers).
"""

from __future__ import annotations

import sys
import tempfile
import time
from pathlib import Path

from warpwise.catalogue import RunOptions, run_catalogue
from warpwise.geometry.shapes import shape_from_spec

#: Spec templates of the generated profiles, k = 0, 1, 2, ... varies the dimensions.
SPECS = (
    "hollow_rectangle:h={60 + k},b={40 + k / 2},t={2 + k % 3},ro={4 + k % 4}",
    "i_beam:h={120 + 2 * k},b={60 + k},tw={4 + k % 3},tf={6 + k % 4},r={6 + k % 5}",
    "channel:h={100 + k},b={45 + k / 2},tw={5 + k % 3},tf={7 + k % 3},r={5 + k % 4}",
    "channel_with_lips:h={150 + k},b={60 + k / 2},c={15 + k % 5},t={1.5 + (k % 4) / 4},r=3",
    "tube:d_outer={40 + k},d_inner={34 + k}",
    "shaft_with_keyway:d={30 + k},w={8 + k % 3},k={4 + k % 2}",
)


def outline_text(spec: str) -> str:
    """A coordinate outline file of the profile ``spec`` (its loops as vertices, mm)."""
    prof = shape_from_spec(spec)
    lines = [f"# generated for the benchmark: {spec}", "units: mm"]
    for region in prof.regions:
        for loop in (region.outer, *region.holes):
            lines.append("")
            lines += [f"{x:.6f}, {y:.6f}" for x, y in loop]
    return "\n".join(lines) + "\n"


def generate(folder: Path, n: int) -> list[Path]:
    """Write ``n`` generated profiles into ``folder``."""
    files = []
    for i in range(n):
        k = i // len(SPECS)
        template = SPECS[i % len(SPECS)]
        spec = eval(f'f"{template}"', {}, {"k": k})  # noqa: S307 (our own templates)
        path = folder / f"p{i:05d}.txt"
        path.write_text(outline_text(spec))
        files.append(path)
    return files


def timed(label: str, files: list[Path], workers: int, **kwargs) -> float:
    """Run the catalogue, print its throughput; returns the wall time, s."""
    start = time.perf_counter()
    outs = run_catalogue(files, RunOptions(), **kwargs)
    wall = time.perf_counter() - start
    failed = sum(not o.ok for o in outs)
    rate = len(files) / wall
    print(f"{label:<28} {wall:8.2f} s {rate:8.2f} profiles/s {rate / workers:8.2f} per worker"
          + (f"  ({failed} failed)" if failed else ""))
    return wall


def main() -> None:
    n = int(sys.argv[1]) if len(sys.argv) > 1 else 40
    with tempfile.TemporaryDirectory() as tmp:
        files = generate(Path(tmp), n)
        print(f"{n} profiles generated from {len(SPECS)} parametric shapes")
        one = timed("serial, 1 worker", files, 1, jobs=1)
        two = timed("process pool, 2 workers", files, 2, jobs=2)
        try:
            from warpwise.catalogue import cluster_executor

            with cluster_executor("local", 2) as executor:
                timed("LocalCluster warm-up", files[:4], 2, executor=executor)
                dask = timed("LocalCluster, 2 workers", files, 2, executor=executor)
        except ImportError:
            dask = None
        overhead = 0.0 if dask is None else max(dask - two, 0.0) / n
        if dask is not None:
            print(f"scheduler overhead: {overhead * 1e3:.1f} ms per profile")
        per_profile = one / n  # seconds of one worker per profile
        extrapolated = 10_000 * per_profile / 100 + 10_000 * overhead
        print(f"10,000 profiles on 100 workers: about {extrapolated / 60:.1f} min "
              f"({per_profile:.3f} s per profile per worker, "
              f"{overhead * 1e3:.1f} ms scheduler overhead each)")


if __name__ == "__main__":
    main()
