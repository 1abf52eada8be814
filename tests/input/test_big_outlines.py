"""Big outlines: a traced loop of 200,000 vertices is simplified with a note; a plate with 10,000
small polygonal holes is refused naming the counts. Each runs the command in a subprocess with a
time limit and a memory limit as a safety net only (the timings are measured by
scripts/bench_limits.py, not here).

The wavy disc r = 100 + 2 sin(12 t) has the area pi (100^2 + 2^2 / 2) (the polar area integral
1/2 int r^2 dt; closed form). Its 200,000-vertex polygon differs from it by the chords (4.6e-9
relative); the simplified loop may change the area by at most 0.5e-4 (the stated budget).
"""

import json
import math
import re

import numpy as np
import pytest

from support.limits import warpwise_limited
from warpwise.geometry.simplify import simplify_dense_loops
from warpwise.io import parse_outline

#: Safety nets of the child processes: seconds and bytes of address space.
TIME_LIMIT = 300
MEMORY_LIMIT = 3 * 1024**3


def run_limited(*args):
    return warpwise_limited(*args, memory=MEMORY_LIMIT, seconds=TIME_LIMIT)


def loop_text(points):
    return "\n".join(f"{x:.9g} {y:.9g}" for x, y in points) + "\n"


def wavy_disc(n):
    t = np.linspace(0.0, 2.0 * np.pi, n, endpoint=False)
    r = 100.0 + 2.0 * np.sin(12 * t)
    return np.column_stack([r * np.cos(t), r * np.sin(t)])


WAVY_AREA = math.pi * (100.0**2 + 2.0**2 / 2)  # closed form


def test_traced_outline_of_200000_vertices_is_simplified_with_a_note(tmp_path):
    f = tmp_path / "traced.txt"
    f.write_text("units: mm\n" + loop_text(wavy_disc(200_000)))
    code, out, err = run_limited("props", f, "--json")
    assert code == 0, err
    d = json.loads(out)
    (note,) = [n for n in d["notes"] if "simplified" in n]
    assert note.startswith("loop 1 simplified from 200,000 to ")
    assert "the outline moved at most 0.00222 mm (0.0001 of the mesh size)" in note
    assert d["A"] == pytest.approx(WAVY_AREA, rel=0.5e-4)  # the stated area budget


def test_plate_with_10000_holes_is_refused_naming_the_counts(tmp_path):
    f = tmp_path / "holes.txt"
    t = np.linspace(0.0, 2.0 * np.pi, 12, endpoint=False)
    hole = np.column_stack([np.cos(t), np.sin(t)])
    loops = [loop_text([(0, 0), (1000, 0), (1000, 1000), (0, 1000)])]
    loops += [loop_text(hole + (5 + 10 * i, 5 + 10 * j)) for i in range(100) for j in range(100)]
    f.write_text("units: mm\n" + "\n".join(loops))
    code, out, err = run_limited("props", f)
    assert code == 2 and out == "" and "Traceback" not in err
    # a regular 12-gon turns 30 degrees at each vertex: 210 degrees of material, a sharp corner
    # the element limit named is this machine's default (mesh/budget.py), read by that process
    head, limit = err.strip().rsplit(" (now ", 1)
    assert head == (
        f"warpwise: error: {f}: the boundary needs more than 400,000 points graded towards "
        "120,000 sharp re-entrant corners (the limit); give curved outlines more vertices (a turn "
        "of under 10 degrees at a vertex is no sharp corner) or draw them as arcs in a DXF, or "
        "analyse one part with --part N; --max-elements N lifts the limit")
    assert re.fullmatch(r"[0-9,]+ elements, 400,000 boundary points\)", limit), limit


def test_dense_loop_below_the_vertex_count_is_left_alone():
    # 9,000 vertices: not a traced loop by the rule (over 10,000), kept exactly
    disc = wavy_disc(9_000)
    (out,), notes = simplify_dense_loops([disc], mesh_size=22.0)
    assert notes == [] and np.array_equal(out, disc)


def test_many_vertices_far_apart_are_left_alone():
    # 20,000 vertices of a disc of radius 1e5: spaced 31 units, over 1/100 of a mesh size of 100
    t = np.linspace(0.0, 2.0 * np.pi, 20_000, endpoint=False)
    disc = 1e5 * np.column_stack([np.cos(t), np.sin(t)])
    (out,), notes = simplify_dense_loops([disc], mesh_size=100.0)
    assert notes == [] and np.array_equal(out, disc)


def test_simplified_loop_keeps_the_area_and_says_so():
    p = parse_outline("units: mm\n" + loop_text(wavy_disc(50_000)), source="traced.txt")
    (note,) = [n for n in p.notes if "simplified" in n]
    assert note.startswith("loop 1 simplified from 50,000 to ")
    assert p.area == pytest.approx(WAVY_AREA, rel=0.5e-4)
