"""Cost of the guaranteed bracket on J against one factorisation of the same matrix.

Run: python scripts/bench_bounds.py [--sizes 1.2 0.6 0.38] [--repeat 3] [--prandtl]

A 200 x 100 rectangle meshed at the given element sizes (about 100k, 400k and 1M nodes by
default). For each mesh: the full property set with the bracket (``analyse(bounds=True)``, its
stage timings summed: mesh, basis, assembly, factorisation, warping, bounds, shear, ...), the
bounds stage alone (the equilibrated flux on this straight-sided mesh), and one factorisation
of the same stiffness matrix by :class:`warpwise.fem.solve.PinnedSolver` (the method the
analysis picks). Ratios are to that one factorisation, and (last column) of the full set with
the bracket to the full set without it; best of ``--repeat`` runs each.
``--prandtl`` also times the Prandtl stress-function bound on the same mesh (a second
factorisation, what meshes with curved elements use).
"""

from __future__ import annotations

import argparse
import time

import numpy as np

from warpwise.fem.p2 import stiffness_matrix
from warpwise.fem.solve import PinnedSolver
from warpwise.geometry.shapes import rectangle
from warpwise.properties.analysis import analyse
from warpwise.properties.bounds import prandtl_lower_bound


def _best(fn, repeat):
    best, out = np.inf, None
    for _ in range(repeat):
        t = time.perf_counter()
        out = fn()
        best = min(best, time.perf_counter() - t)
    return best, out


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--sizes", type=float, nargs="+", default=[1.2, 0.6, 0.38])
    ap.add_argument("--repeat", type=int, default=3)
    ap.add_argument("--prandtl", action="store_true")
    args = ap.parse_args()
    prof = rectangle(200.0, 100.0)
    print(f"{'h':>5} {'nodes':>9} {'full+bracket s':>14} {'flux s':>7} {'factor s':>8} "
          f"{'full/factor':>11} {'flux/factor':>11} {'with/without':>12}"
          + (f" {'prandtl s':>9}" if args.prandtl else ""))
    for h in args.sizes:
        runs = [analyse(prof, h, bounds=True) for _ in range(args.repeat)]
        res = runs[-1]
        full = min(sum(r.timings.values()) for r in runs)
        flux = min(r.timings["bounds"] for r in runs)
        without = min(sum(analyse(prof, h).timings.values())
                      for _ in range(args.repeat))
        K = stiffness_matrix(res.mesh, res.basis)
        pin = int(np.argmin(np.sum((res.mesh.nodes - np.array(res.weighted.centroid)) ** 2, axis=1)))
        fac, _ = _best(lambda K=K, pin=pin: PinnedSolver(K, pin), args.repeat)
        line = (f"{h:>5.2f} {res.mesh.n_nodes:>9,} {full:>14.2f} {flux:>7.2f} {fac:>8.2f} "
                f"{full / fac:>11.2f} {flux / fac:>11.2f} {full / without:>12.2f}")
        if args.prandtl:
            tp, _ = _best(lambda K=K, r=res: prandtl_lower_bound(r.mesh, r.basis, K), 1)
            line += f" {tp:>9.2f}"
        print(line, flush=True)
        del runs, res, K


if __name__ == "__main__":
    main()
