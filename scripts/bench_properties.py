"""Cost of the full property set against J alone, on the sample profiles and a larger mesh.

Run: python scripts/bench_properties.py
J alone = mesh + basis + assembly + factorisation + warping solve; the full set adds the shear
functions (two more solves with the same factorisation) and all post-processing.
"""

from __future__ import annotations

import time
from pathlib import Path

import numpy as np

from warpwise.fem.p2 import element_values, stiffness_matrix
from warpwise.fem.solve import PinnedSolver
from warpwise.io import load_profile
from warpwise.mesh.core import build_mesh
from warpwise.properties.analysis import analyse
from warpwise.properties.geometric import geometric_properties
from warpwise.properties.torsion import torsion_load, torsion_properties

ROOT = Path(__file__).resolve().parents[1]


def j_alone(profile, size=None):
    mesh = build_mesh(profile, size)
    x0, y0, x1, y1 = profile.bounds
    origin = np.array([0.5 * (x0 + x1), 0.5 * (y0 + y1)])
    ev = element_values(mesh, origin)
    geo, evc = geometric_properties(mesh, ev, origin)
    solver = PinnedSolver(stiffness_matrix(mesh, evc), 0)
    return torsion_properties(mesh, evc, geo, solver, torsion_load(mesh, evc)).J


def best_of(fn, repeat=5):
    times = []
    for _ in range(repeat):
        t = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t)
    return min(times)


def main():
    cases = [(p.name, load_profile(p), None) for p in sorted((ROOT / "sample_sections").glob("*"))
             if p.suffix in (".txt", ".dxf")]
    big = load_profile(ROOT / "sample_sections" / "channel_thick_80x40.txt")
    cases.append(("channel, fine mesh", big, 0.4))
    print(f"{'profile':<32} {'nodes':>8} {'J alone s':>10} {'full set s':>10} {'ratio':>6}")
    for name, prof, size in cases:
        n = build_mesh(prof, size).n_nodes
        tj = best_of(lambda p=prof, s=size: j_alone(p, s))
        tf = best_of(lambda p=prof, s=size: analyse(p, s))
        print(f"{name:<32} {n:>8} {tj:>10.4f} {tf:>10.4f} {tf / tj:>6.2f}")


if __name__ == "__main__":
    main()
