"""Cost of the full property set against J alone, on the sample profiles and a larger mesh.

Run: python scripts/bench_properties.py
J alone = mesh + basis + assembly + factorisation + warping solve; the full set adds the shear
functions (two more solves with the same factorisation) and all post-processing. Both are read
off the stage timings the analysis records (best of five runs), so the script repeats nothing
of the analysis.
"""

from __future__ import annotations

from pathlib import Path

from warpwise.io import load_profile
from warpwise.properties.analysis import analyse

ROOT = Path(__file__).resolve().parents[1]


#: Stages of the analysis that J alone needs (SectionResult.timings).
J_STAGES = ("mesh", "basis", "assembly", "factorise", "warping")


def main():
    cases = [(p.name, load_profile(p), None) for p in sorted((ROOT / "sample_sections").glob("*"))
             if p.suffix in (".txt", ".dxf")]
    big = load_profile(ROOT / "sample_sections" / "channel_thick_80x40.txt")
    cases.append(("channel, fine mesh", big, 0.4))
    print(f"{'profile':<32} {'nodes':>8} {'J alone s':>10} {'full set s':>10} {'ratio':>6}")
    for name, prof, size in cases:
        runs = [analyse(prof, size) for _ in range(5)]
        n = runs[0].mesh.n_nodes
        tj = min(sum(r.timings[k] for k in J_STAGES) for r in runs)
        tf = min(sum(r.timings.values()) for r in runs)
        print(f"{name:<32} {n:>8} {tj:>10.4f} {tf:>10.4f} {tf / tj:>6.2f}")


if __name__ == "__main__":
    main()
