"""Speed and memory of warpwise, measured (not asserted by tests).

    python scripts/bench.py compare [--size H]       # (a) warpwise vs scikit-fem + spsolve, same mesh
    python scripts/bench.py scaling [--max-nodes N]  # (b) 10k ... 1M nodes: times and peak memory
    python scripts/bench.py samples                  # (c) full property set per sample profile

Each scaling row runs in a fresh process so that its peak memory (ru_maxrss) is its own.
(a) and (b) use the torsion problem of a 100 x 100 square (J, shear centre, Cw).
"""

from __future__ import annotations

import argparse
import json
import resource
import subprocess
import sys
import time
from pathlib import Path

import numpy as np

HERE = Path(__file__).resolve().parent
ROOT = HERE.parent


def one(size: float) -> dict:
    """Stage times of the torsion set for one mesh size (this process), from the analysis itself."""
    from warpwise.geometry.shapes import rectangle
    from warpwise.properties.analysis import analyse

    res = analyse(rectangle(100.0, 100.0), size)
    t = res.timings
    peak_mb = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024.0
    return {"nodes": res.mesh.n_nodes, "elements": res.mesh.n_elements, "mesh": t["mesh"],
            "assembly": t["basis"] + t["assembly"], "factorise": t["factorise"],
            "solve_post": t["warping"], "total": sum(t.values()), "peak_mb": peak_mb,
            "solver": res.solver.method, "J": res.torsion.J,
            "shear_centre": list(res.torsion.shear_centre), "Cw": res.torsion.Cw}


def compare(size: float) -> None:
    """(a) The same P2 warping problem solved by warpwise and by scikit-fem + spsolve."""
    sys.path.insert(0, str(HERE))
    from bench_assembly import skfem_reference

    from warpwise.geometry.shapes import rectangle
    from warpwise.mesh.core import build_mesh

    mesh = build_mesh(rectangle(100.0, 100.0), size)
    w = one(size)
    ta, ts = skfem_reference(mesh)
    ours = w["assembly"] + w["factorise"] + w["solve_post"]
    theirs = ta + ts
    print(f"mesh: {mesh.n_nodes:,} nodes, {mesh.n_elements:,} six-node elements")
    print(f"warpwise   assembly {w['assembly']:7.2f} s  solve+post {w['factorise'] + w['solve_post']:7.2f} s"
          f"  total {ours:7.2f} s  (solver {w['solver']})")
    print(f"scikit-fem assembly {ta:7.2f} s  spsolve    {ts:7.2f} s  total {theirs:7.2f} s")
    print(f"ratio {theirs / ours:.2f}x")


def scaling(max_nodes: int) -> None:
    """(b) Scaling table from about 10k nodes up to ``max_nodes``, one process per row."""
    print(f"{'nodes':>10} {'elements':>10} {'mesh s':>8} {'assembly s':>10} {'factorise s':>11} "
          f"{'solve+post s':>12} {'total s':>8} {'peak MB':>8} {'B/node':>7} solver")
    # nodes ~ 2 * area / (0.43 h^2) for the 100 x 100 square
    for target in (10_000, 30_000, 100_000, 300_000, 1_000_000, 2_000_000):
        if target > max_nodes:
            break
        h = float(np.sqrt(7.3 * 1e4 / target))  # measured: nodes ~ 7.3 A / h^2
        out = subprocess.run([sys.executable, __file__, "_one", str(h)], capture_output=True,
                             text=True, check=True)
        r = json.loads(out.stdout.strip().splitlines()[-1])
        print(f"{r['nodes']:>10,} {r['elements']:>10,} {r['mesh']:>8.2f} {r['assembly']:>10.2f} "
              f"{r['factorise']:>11.2f} {r['solve_post']:>12.2f} {r['total']:>8.2f} "
              f"{r['peak_mb']:>8.0f} {r['peak_mb'] * 2**20 / r['nodes']:>7.0f} {r['solver']}")


def samples() -> None:
    """(c) Time of the full property set for each sample profile at default accuracy."""
    from warpwise.io import load_profile
    from warpwise.properties.analysis import analyse

    print(f"{'profile':<34} {'nodes':>7} {'read s':>7} {'analyse s':>9}")
    for p in sorted((ROOT / "sample_sections").iterdir()):
        t0 = time.perf_counter()
        prof = load_profile(p)
        t1 = time.perf_counter()
        r = analyse(prof, bounds=True)
        t2 = time.perf_counter()
        print(f"{p.name:<34} {r.mesh.n_nodes:>7} {t1 - t0:>7.3f} {t2 - t1:>9.3f}")


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    sub = ap.add_subparsers(dest="what", required=True)
    c = sub.add_parser("compare")
    c.add_argument("--size", type=float, default=0.49, help="mesh size (0.49: about 300k nodes)")
    s = sub.add_parser("scaling")
    s.add_argument("--max-nodes", type=int, default=1_000_000)
    sub.add_parser("samples")
    o = sub.add_parser("_one")
    o.add_argument("size", type=float)
    args = ap.parse_args()
    if args.what == "compare":
        compare(args.size)
    elif args.what == "scaling":
        scaling(args.max_nodes)
    elif args.what == "samples":
        samples()
    else:
        print(json.dumps(one(args.size)))


if __name__ == "__main__":
    main()
