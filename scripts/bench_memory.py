"""Peak resident memory of the analysis, stage by stage, per mesh node.

Run: python scripts/bench_memory.py [SIZE ...]

A 200 x 100 rectangle meshed at each element size (default 1.0, 0.6 and 0.4: about 150k,
400k and 900k nodes) is analysed in this process while a thread samples the resident size
every 2 ms; the peak during each stage of the analysis (the stages of SectionResult.timings)
is printed above the resident size before the analysis, per node (each size in its own
process). The PARDISO factor's own
share is read from MKL (iparm 16 and 17: permanent and factorisation memory). Finally five
analyses in a row show whether memory comes back between them (a long-lived catalogue worker).
"""

from __future__ import annotations

import gc
import os
import subprocess
import sys
import threading
import time

import warpwise.properties.analysis as analysis
from warpwise.fem.solve import SPDFactor
from warpwise.geometry.shapes import rectangle

PAGE = os.sysconf("SC_PAGE_SIZE")


def rss() -> int:
    """Resident size of this process, bytes."""
    with open("/proc/self/statm") as f:
        return int(f.read().split()[1]) * PAGE


class Sampler:
    """Highest resident size since the last reset, sampled every 2 ms by a thread."""

    def __init__(self) -> None:
        self.peak = rss()
        threading.Thread(target=self._run, daemon=True).start()

    def _run(self) -> None:
        while True:
            self.peak = max(self.peak, rss())
            time.sleep(0.002)

    def reset(self) -> int:
        peak, self.peak = max(self.peak, rss()), rss()
        return peak


def stages(size: float, sampler: Sampler) -> None:
    """Print the peak above the start per node for each stage of one analysis."""
    log: list[tuple[str, int]] = []
    lap = analysis._Clock.lap

    def logged(clock, stage):
        log.append((stage, sampler.reset()))
        lap(clock, stage)

    pardiso: list[tuple[int, int]] = []
    init = SPDFactor.__init__

    def noted(self, matrix, method="auto"):
        init(self, matrix, method)
        if self.method == "pardiso":
            ip = self._pardiso._lib.iparm
            pardiso.append((int(ip[15]), int(ip[16])))

    gc.collect()
    base = rss()
    sampler.reset()
    analysis._Clock.lap, SPDFactor.__init__ = logged, noted
    try:
        result = analysis.analyse(rectangle(200.0, 100.0), size)
    finally:
        analysis._Clock.lap, SPDFactor.__init__ = lap, init
    n = result.mesh.n_nodes
    print(f"size {size}: {n} nodes, {len(result.mesh.elements)} elements")
    for stage, peak in log:
        print(f"  {stage:<10} peak {(peak - base) / 2**20:8.0f} MB  {(peak - base) / n:6.0f} B/node")
    for perm, fact in pardiso:
        print(f"  PARDISO factor (MKL's count) {(perm + fact) / 1024:8.0f} MB  "
              f"{(perm + fact) * 1024 / n:6.0f} B/node")


def repeated(size: float, times: int = 5) -> None:
    """Resident size after each of several analyses in a row (memory must come back)."""
    sizes = []
    for _ in range(times):
        analysis.analyse(rectangle(200.0, 100.0), size)
        gc.collect()
        sizes.append(rss() / 2**20)
    print("after each of", times, "analyses at size", size, ":",
          " ".join(f"{s:.0f}" for s in sizes), "MB")


def main() -> None:
    if sys.argv[1:2] == ["--one"]:  # one size in this process
        stages(float(sys.argv[2]), Sampler())
        return
    sizes = sys.argv[1:] or ["1.0", "0.6", "0.4"]
    for size in sizes:  # each in a fresh process: freed memory is not always returned to the OS
        subprocess.run([sys.executable, __file__, "--one", size], check=True)
    repeated(float(sizes[0]))


if __name__ == "__main__":
    main()
