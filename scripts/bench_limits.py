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


def _drawing():
    import ezdxf

    doc = ezdxf.new()
    doc.header["$INSUNITS"] = 4  # mm
    return doc, doc.modelspace()


def _fan_out(folder: Path, name: str, levels: int, fan: int) -> list[str]:
    """Block k holds ``fan`` references of block k + 1; the last one line."""
    doc, msp = _drawing()
    for k in range(levels):
        blk = doc.blocks.new(f"LEVEL{k}")
        if k + 1 < levels:
            for j in range(fan):
                blk.add_blockref(f"LEVEL{k + 1}", (j, 0))
        else:
            blk.add_line((0, 0), (1, 0))
    msp.add_blockref("LEVEL0", (0, 0))
    doc.saveas(folder / name)
    return ["check", str(folder / name)]



def _minsert(folder: Path, name: str, rows: int, columns: int) -> list[str]:
    """A rows x columns MINSERT array of a one-line block; the props command on it."""
    doc, msp = _drawing()
    doc.blocks.new("CELL").add_line((0, 0), (1, 0))
    msp.add_blockref("CELL", (0, 0), dxfattribs={"row_count": rows, "column_count": columns,
                                                  "row_spacing": 2, "column_spacing": 2})
    doc.saveas(folder / name)
    return ["props", str(folder / name)]

@case
def minsert_million_copies(folder: Path) -> list[str]:
    """A 1000 x 1000 MINSERT array of a one-line block: refused before it is expanded."""
    return _minsert(folder, "minsert_million.dxf", 1000, 1000)


@case
def minsert_at_the_limit(folder: Path) -> list[str]:
    """A 250 x 400 MINSERT of a one-line block: 200,000 entities, the limit, read and joined."""
    return _minsert(folder, "minsert_limit.dxf", 250, 400)


@case
def nested_fan_out_30_levels(folder: Path) -> list[str]:
    """30 levels of blocks, two references each: 1.6e9 entities, refused after one count."""
    return _fan_out(folder, "fan_out.dxf", 30, 2)


@case
def nested_diamond_60_levels(folder: Path) -> list[str]:
    """60 levels, each block two references of the next: 1.7e18 entities, memoised count."""
    return _fan_out(folder, "diamond.dxf", 60, 2)


def _parabola_spline(folder: Path, name: str, n: int) -> Path:
    """y = 20 + x (100 - x) / 100 as a clamped cubic B-spline of n control points, closed below."""
    import numpy as np

    doc, msp = _drawing()
    knots = np.concatenate([[0.0] * 3, np.linspace(0.0, 100.0, n - 2), [100.0] * 3])
    a, b, c = knots[1:n + 1], knots[2:n + 2], knots[3:n + 3]
    x = (a + b + c) / 3  # blossoms of x and of 20 + x - x^2 / 100 (exact control points)
    y = 20 + x - (a * b + b * c + c * a) / 300
    msp.add_open_spline(np.column_stack([x, y, 0 * x]).tolist(), degree=3, knots=knots.tolist())
    msp.add_lwpolyline([(100, 20), (100, 0), (0, 0), (0, 20)])
    doc.saveas(folder / name)
    return folder / name


@case
def spline_100k_control_points(folder: Path) -> list[str]:
    """A SPLINE of 100,000 control points (ezdxf's flattening would take minutes)."""
    return ["props", str(_parabola_spline(folder, "spline_100k.dxf", 100_000)), "--accuracy", "draft"]


@case
def spline_20k_fit_points(folder: Path) -> list[str]:
    """A SPLINE of 20,000 fit points and no control points: refused before interpolation."""
    import numpy as np

    doc, msp = _drawing()
    x = np.linspace(0.0, 100.0, 20_000)
    msp.add_spline(fit_points=np.column_stack([x, 20 + x * (100 - x) / 100, 0 * x]).tolist())
    msp.add_lwpolyline([(100, 20), (100, 0), (0, 0), (0, 20)])
    doc.saveas(folder / "fit_20k.dxf")
    return ["props", str(folder / "fit_20k.dxf")]


# --- outlines, parts and meshes ------------------------------------------------------------------


def _loop_text(points) -> str:
    return "\n".join(f"{x:.9g} {y:.9g}" for x, y in points) + "\n"


def _circle(cx: float, cy: float, r: float, n: int):
    import numpy as np

    t = np.linspace(0.0, 2.0 * np.pi, n, endpoint=False)
    return np.column_stack([cx + r * np.cos(t), cy + r * np.sin(t)])


@case
def plate_with_10000_holes(folder: Path) -> list[str]:
    """A 1000 x 1000 mm plate with a 100 x 100 grid of 2 mm holes (12-gons)."""
    f = folder / "holes.txt"
    loops = [[(0, 0), (1000, 0), (1000, 1000), (0, 1000)]]
    loops += [_circle(5 + 10 * i, 5 + 10 * j, 1.0, 12) for i in range(100) for j in range(100)]
    f.write_text("units: mm\n" + "\n".join(_loop_text(lp) for lp in loops))
    return ["props", str(f)]


@case
def traced_outline_200000(folder: Path) -> list[str]:
    """A wavy disc of radius 100 mm traced with 200,000 vertices."""
    import numpy as np

    t = np.linspace(0.0, 2.0 * np.pi, 200_000, endpoint=False)
    r = 100.0 + 2.0 * np.sin(12 * t)
    f = folder / "traced.txt"
    f.write_text("units: mm\n" + _loop_text(np.column_stack([r * np.cos(t), r * np.sin(t)])))
    return ["props", str(f)]


@case
def separate_parts_200(folder: Path) -> list[str]:
    """200 separate 4 x 2 mm bars on a grid, taken as one section (one pin per part)."""
    f = folder / "bars.txt"
    loops = [[(10 * i, 10 * j), (10 * i + 4, 10 * j), (10 * i + 4, 10 * j + 2), (10 * i, 10 * j + 2)]
             for i in range(20) for j in range(10)]
    f.write_text("units: mm\n" + "\n".join(_loop_text(lp) for lp in loops))
    return ["props", str(f), "--all-parts"]


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
