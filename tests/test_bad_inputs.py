"""A catalogue of bad input files through the command line, as engineers will feed them.

Every case runs ``python -m warpwise.cli props FILE --csv OUT`` in a subprocess with a time
limit (and, on Linux, a 2 GB memory limit) and must end with a non-zero exit code, exactly one
line on stderr naming the file and the defect (a keyword of it), no traceback, nothing on stdout
and no output file (nor a temporary one left beside it). For a few representative cases an
existing output file, with a good profile analysed first, must be left unchanged (atomic
writes, README "Errors in the input").

Inputs that look odd but are documented as valid are checked to be analysed correctly instead:
a real binary DXF (README: "text or binary DXF"), a DXF with a duplicated outline (README:
duplicates are left out with a warning) and a profile 1e-9 mm across (coordinates are
scale-free up to the coordinate limit, 1e9).

The command starts in about a second (imports), so the cases run concurrently, one per core.
"""

import json
import os
import subprocess
import sys
import time
from concurrent.futures import ThreadPoolExecutor
from dataclasses import dataclass

import ezdxf
import numpy as np
import pytest

from warpwise.io.outline import MAX_FILE_BYTES

SQUARE = "0 0\n10 0\n10 10\n0 10\n"
TIME_LIMIT = 60.0  # seconds per command (a normal one takes 1-3 s)


def _dxf(path, *polylines, fmt="asc", insunits=4):
    doc = ezdxf.new()
    doc.header["$INSUNITS"] = insunits
    msp = doc.modelspace()
    for points, closed in polylines:
        msp.add_lwpolyline(points, close=closed)
    doc.saveas(path, fmt=fmt)


def _good_dxf(path, fmt="asc"):
    _dxf(path, ([(0, 0), (40, 0), (40, 20), (0, 20)], True), fmt=fmt)


def _dxf_lines_with_gap(path):
    doc = ezdxf.new()
    msp = doc.modelspace()
    for a, b in (((0, 0), (40, 0)), ((40, 0), (40, 20)), ((40, 20), (0, 20)), ((0, 20), (0, 1))):
        msp.add_line(a, b)
    doc.saveas(path)


def _cut(fraction, fmt="asc"):
    def make(path):
        _good_dxf(path, fmt)
        data = path.read_bytes()
        path.write_bytes(data[: int(len(data) * fraction)])
    return make


def _random_bytes(printable):
    def make(path):
        rng = np.random.default_rng(8)
        if printable:  # no NUL byte: it must be told apart from a DXF by its content
            data = rng.integers(32, 127, 5000, dtype=np.uint8).tobytes()
        else:
            data = rng.integers(0, 256, 5000, dtype=np.uint8).tobytes()
        path.write_bytes(data)
    return make


def _sparse(path):
    # 60 MB of holes: the size is checked before anything is read
    with open(path, "wb") as fh:
        fh.truncate(60 * 1024 * 1024)
    assert path.stat().st_size > MAX_FILE_BYTES


def _dxf_nan(path):
    _good_dxf(path)
    text = path.read_text()
    start = text.index("\n 10\n", text.index("LWPOLYLINE")) + 5
    end = text.index("\n", start)
    path.write_text(text[:start] + "nan" + text[end:])


def _typo(closed):
    # the letter O for a zero in one coordinate: 40.0 -> 4O.0
    def make(path):
        _dxf(path, ([(0, 0), (40, 0), (40, 20), (0, 20)], closed))
        text = path.read_text()
        at = text.index("\n 10\n40.0\n", text.index("LWPOLYLINE")) + len("\n 10\n")
        path.write_text(text[:at] + "4O.0" + text[at + 4:])
    return make


@dataclass
class Case:
    """One bad input: how to make the file, the words its message must hold."""

    file: str
    make: object  # text of the file, or a function writing it to a path
    words: tuple[str, ...]
    args: tuple[str, ...] = ()
    code: int = 1
    names_file: bool = True
    timeout: float = TIME_LIMIT
    defect: str | None = None  # a known defect: the case is expected to fail (strict xfail)


CASES = {c.file: c for c in [
    # geometry
    Case("open_chain.dxf", lambda p: _dxf(p, ([(0, 0), (40, 0), (40, 20), (0, 20)], False)),
         ("open chain", "free ends")),
    Case("lines_with_gap.dxf", _dxf_lines_with_gap, ("open chain", "(0, 1)")),
    Case("bow_tie.txt", "0 0\n10 10\n10 0\n0 10\n", ("crosses itself", "(5, 5)")),
    Case("bow_tie.dxf", lambda p: _dxf(p, ([(0, 0), (40, 20), (40, 0), (0, 20)], True)),
         ("crosses itself", "(20, 10)")),
    Case("zero_area_sliver.txt", "0 0\n10 0\n20 0\n", ("no area",)),
    Case("zero_area_sliver.dxf", lambda p: _dxf(p, ([(0, 0), (10, 0), (20, 0)], True)),
         ("loop 1",)),
    # a sliver 2e4 times longer than thick, tip angles 5e-5 rad: refused in seconds (it once
    # split its boundary into 452,551 points and kept the mesher busy for minutes, >5 GB)
    Case("near_zero_area_sliver.txt", "0 0\n10 0\n20 1e-3\n", ("sliver",), timeout=20.0),
    Case("duplicate_loop.txt", SQUARE + "\n" + SQUARE, ("loops 1 and 2", "cross or touch")),
    Case("overlapping_loops.txt", SQUARE + "\n5 5\n15 5\n15 15\n5 15\n",
         ("loops 1 and 2", "cross or touch")),
    Case("overlapping_loops.dxf", lambda p: _dxf(p, ([(0, 0), (40, 0), (40, 20), (0, 20)], True),
                                                 ([(30, 10), (50, 10), (50, 30), (30, 30)], True)),
         ("loop 1", "loop 2", "cross or touch")),
    Case("overlapping_materials.txt",
         "material: steel\n" + SQUARE + "\nmaterial: alu\n5 5\n15 5\n15 15\n5 15\n",
         ("steel", "alu", "overlap")),
    Case("hole_touching_outer.txt", SQUARE + "\n0 3\n5 3\n5 7\n0 7\n", ("cross or touch",)),
    Case("hole_touching_outer.dxf",
         lambda p: _dxf(p, ([(0, 0), (40, 0), (40, 20), (0, 20)], True),
                        ([(0, 5), (10, 5), (10, 15), (0, 15)], True)),
         ("loop 1", "loop 2")),
    # a hole within round-off of the outer boundary touches it (the point tolerance is 1e-9 of
    # the size); found by scripts/fuzz.py (a sample coordinate replaced by 1e-300): Triangle
    # used to crash (segmentation fault) on the first and the second read "8 element(s) are
    # inverted"
    Case("hole_1e-300_from_outer.txt", SQUARE + "\n1 4\n9 4\n9 6\n1e-300 5\n", ("loops 1 and 2",)),
    Case("hole_1e-15_from_outer.txt", SQUARE + "\n1 4\n9 4\n9 6\n1e-15 5\n", ("loops 1 and 2",)),
    # the same within one loop: a vertex within round-off of the loop's own edge x = 0; found
    # by scripts/fuzz.py (a fillet vertex of channel_thick_80x40.txt moved to x = 1e-300)
    # fixed: a vertex within the point tolerance of another edge of its loop is refused
    # (it crashed Triangle with a segmentation fault before)
    Case("self_touch_1e-300.txt", "0 0\n10 8\n1e-300 9\n10 10\n0 10\n", ("loop 1", "touches"),
         timeout=20.0),
    # fixed: Triangle ran away (4 GB in 20 s) before
    Case("self_touch_1e-15.txt", "0 0\n10 8\n1e-15 9\n10 10\n0 10\n", ("loop 1", "touches"),
         timeout=20.0),
    Case("loop_of_two_points.txt", "0 0\n10 0\n", ("2 distinct point", "at least 3")),
    Case("loop_of_two_points.dxf", lambda p: _dxf(p, ([(0, 0), (40, 0)], True)), ("no area",)),
    # numbers
    Case("nan.txt", "0 0\n10 0\nnan 10\n0 10\n", ("line 3", "not a pair of numbers")),
    Case("inf.txt", "0 0\n10 0\n10 -inf\n0 10\n", ("line 3", "not a pair of numbers")),
    Case("nan.dxf", _dxf_nan, ("not a finite number",)),
    Case("coordinates_1e12.txt", "0 0\n1e12 0\n1e12 1e12\n0 1e12\n", ("1e+12", "limit")),
    Case("coordinates_1e12.dxf",
         lambda p: _dxf(p, ([(0, 0), (1e12, 0), (1e12, 1e12), (0, 1e12)], True)),
         ("1e+12", "beyond")),
    Case("words.txt", "0 0\n10 zero\n10 10\n", ("line 2", "not a pair of numbers")),
    # a coordinate 4O.0 (letter O): ezdxf's recover mode reads it as 4.0, which once gave a
    # silently different profile (A = 440 instead of 800) and its log lines on stderr
    Case("corrupt_number.dxf", _typo(closed=True), ("4O.0",)),
    Case("corrupt_number_open.dxf", _typo(closed=False), ("4O.0",)),
    Case("three_numbers.txt", "0 0 0\n10 0 0\n10 10 0\n", ("line 1", "not a pair of numbers")),
    # files
    Case("empty.txt", "", ("empty",)),
    Case("blank_lines.txt", "\n\n  \n\n", ("empty",)),
    Case("comments_only.txt", "# a profile\n# to come\n", ("no coordinates",)),
    Case("empty.dxf", "", ("empty",)),
    Case("truncated.dxf", _cut(0.6), ("truncated",)),
    Case("truncated_near_end.dxf", _cut(0.97), ("truncated",)),
    Case("random_bytes.dxf", _random_bytes(printable=False), ("binary",)),
    Case("random_text.dxf", _random_bytes(printable=True), ("not a dxf",)),
    Case("truncated_binary.dxf", _cut(0.5, fmt="bin"), ("binary dxf", "cannot be read")),
    Case("binary_dxf_named.txt", _cut(1.0, fmt="bin"), ("binary",)),
    Case("dxf_named.txt", _good_dxf, ("line 1", "not a pair of numbers")),
    Case("outline_named.dxf", SQUARE, ("not a dxf",)),
    Case("over_size_limit.txt", _sparse, ("mb", "limit"), timeout=20.0),
    Case("over_size_limit.dxf", _sparse, ("mb", "limit"), timeout=20.0),
    # units
    Case("units_furlong.txt", "units: furlong\n" + SQUARE, ("line 1", "furlong")),
    Case("units_option_furlong.txt", SQUARE, ("--units", "furlong"), args=("--units", "furlong"),
         code=2, names_file=False),
    Case("units_option_furlong.dxf", _good_dxf, ("--units", "furlong"),
         args=("--units", "furlong"), code=2, names_file=False),
    # two different units: lines (once the last one won silently)
    Case("units_twice.txt", "units: mm\nunits: in\n" + SQUARE, ("line 2", "units")),
]}

#: Cases also run with an existing output file and a good profile before the bad one.
KEEP_EXISTING = ["bow_tie.txt", "truncated.dxf", "random_bytes.dxf",
                 "over_size_limit.txt", "units_furlong.txt", "coordinates_1e12.dxf"]


def _write(case, path):
    if callable(case.make):
        case.make(path)
    else:
        path.write_text(case.make)


#: Address space allowed to each command (a normal one needs a few hundred MB; a runaway mesher
#: took 4 GB in 20 s), so that a defect cannot take the CI machine down with it.
MEMORY_LIMIT = 2 * 1024**3

# ``python -m warpwise.cli ARGS`` with the memory limit set first (Linux; elsewhere no limit)
_LIMITED = ("import resource, runpy, sys; limit = int(sys.argv.pop(1)); "
            "resource.setrlimit(resource.RLIMIT_AS, (limit, limit)); "
            "runpy.run_module('warpwise.cli', run_name='__main__', alter_sys=True)")


def _command(args):
    if sys.platform.startswith("linux"):
        return [sys.executable, "-c", _LIMITED, str(MEMORY_LIMIT), *map(str, args)]
    return [sys.executable, "-m", "warpwise.cli", *map(str, args)]


def _run(args, folder, timeout):
    start = time.perf_counter()
    # one thread each: the cases run side by side, and BLAS threads would only reserve memory
    env = dict(os.environ, OMP_NUM_THREADS="1", OPENBLAS_NUM_THREADS="1", MKL_NUM_THREADS="1")
    try:
        proc = subprocess.run(_command(args), cwd=folder,
                              capture_output=True, text=True, timeout=timeout, env=env)
        code, out, err = proc.returncode, proc.stdout, proc.stderr
    except subprocess.TimeoutExpired:
        code, out, err = None, "", f"timed out after {timeout:.0f} s"
    return {"code": code, "out": out, "err": err, "seconds": time.perf_counter() - start,
            "files": sorted(p.name for p in folder.iterdir())}


@pytest.fixture(scope="module")
def runs(tmp_path_factory):
    """Every case run once with a fresh output path, the KEEP_EXISTING ones once more."""
    root = tmp_path_factory.mktemp("bad_inputs")
    jobs = {}
    for k, (name, case) in enumerate(CASES.items()):
        folder = root / f"case{k:02d}"
        folder.mkdir()
        _write(case, folder / name)
        jobs[name] = (["props", name, "--csv", "out.csv", *case.args], folder, case.timeout)
        if name in KEEP_EXISTING:
            keep = root / f"keep{k:02d}"
            keep.mkdir()
            _write(case, keep / name)
            (keep / "good.txt").write_text(SQUARE)
            (keep / "out.csv").write_text("old contents\n")
            jobs["keep:" + name] = (["props", "good.txt", name, "--csv", "out.csv", *case.args],
                                    keep, case.timeout)
    with ThreadPoolExecutor(max_workers=max(1, os.cpu_count() or 1)) as pool:
        futures = {key: pool.submit(_run, *job) for key, job in jobs.items()}
        return {key: f.result() | {"folder": jobs[key][1]} for key, f in futures.items()}


def _params(names):
    out = []
    for name in names:
        d = CASES[name].defect
        out.append(pytest.param(name, marks=pytest.mark.xfail(strict=True, reason="defect: " + d))
                   if d else name)
    return out


def assert_one_clean_line(r, case, name):
    assert r["code"] is not None, f"{name}: {r['err']}"
    assert r["code"] == case.code, (r["code"], r["err"])
    assert "Traceback" not in r["err"] and "internal error" not in r["err"], r["err"]
    lines = [ln for ln in r["err"].splitlines() if ln.strip()]
    assert len(lines) == 1, r["err"]
    line = lines[0]
    assert line.startswith("warpwise: error: "), line
    if case.names_file:
        assert name in line, line
    for word in case.words:
        assert word.lower() in line.lower(), f"{word!r} not in {line!r}"
    return line


@pytest.mark.parametrize("name", _params(CASES))
def test_refused_in_one_line_and_nothing_written(runs, name):
    case, r = CASES[name], runs[name]
    assert_one_clean_line(r, case, name)
    assert r["out"] == "", r["out"]
    # the input file only: no output, no temporary file beside it
    assert r["files"] == [name]


@pytest.mark.parametrize("name", _params(KEEP_EXISTING))
def test_existing_output_left_unchanged(runs, name):
    case, r = CASES[name], runs["keep:" + name]
    assert_one_clean_line(r, case, name)
    assert (r["folder"] / "out.csv").read_text() == "old contents\n"
    assert r["files"] == sorted(["good.txt", name, "out.csv"])


@pytest.mark.parametrize("name", ["over_size_limit.txt", "over_size_limit.dxf"])
def test_size_limit_is_checked_before_reading(runs, name):
    line = assert_one_clean_line(runs[name], CASES[name], name)
    assert "62.9 MB" in line  # 60 MiB, said in MB like the limit
    # refused from the size alone: as quick as any other refusal (start-up is 1-3 s)
    assert runs[name]["seconds"] < 10.0


# ---------------------------------------------------------------------------------------------
# odd but valid inputs: analysed, and correctly


def _props_json(tmp_path, name, *args):
    proc = subprocess.run([sys.executable, "-m", "warpwise.cli", "props", name, "--json", *args],
                          cwd=tmp_path, capture_output=True, text=True, timeout=TIME_LIMIT)
    assert proc.returncode == 0, proc.stderr
    assert "Traceback" not in proc.stderr
    return json.loads(proc.stdout)


def square_torsion_constant(a):
    """J of a solid square of side a (Timoshenko & Goodier, rectangle series, b/a = 1)."""
    n = np.arange(1, 200, 2)
    return a ** 4 / 3.0 * (1.0 - 192.0 / np.pi ** 5 * np.sum(np.tanh(n * np.pi / 2.0) / n ** 5))


def test_binary_dxf_is_read_like_the_text_one(tmp_path):
    _good_dxf(tmp_path / "text.dxf")
    _good_dxf(tmp_path / "binary.dxf", fmt="bin")
    assert (tmp_path / "binary.dxf").read_bytes().startswith(b"AutoCAD Binary DXF")
    text = _props_json(tmp_path, "text.dxf")
    binary = _props_json(tmp_path, "binary.dxf")
    # the same drawing: the same numbers (same geometry, same mesh)
    for key in ("A", "Ix", "Iy", "J", "Cw"):
        assert binary[key] == text[key], key
    assert binary["A"] == pytest.approx(800.0, rel=1e-12)  # 40 x 20 (common practice, no source)


def test_duplicated_outline_in_a_dxf_is_left_out_once(tmp_path):
    # README: duplicate pieces are left out with a warning
    outline = ([(0, 0), (40, 0), (40, 20), (0, 20)], True)
    _dxf(tmp_path / "dup.dxf", outline, outline)
    _dxf(tmp_path / "one.dxf", outline)
    dup, one = _props_json(tmp_path, "dup.dxf"), _props_json(tmp_path, "one.dxf")
    assert dup["A"] == pytest.approx(800.0, rel=1e-12)
    assert dup["J"] == one["J"]
    assert any("duplicate" in note for note in dup["notes"])


# a hole of the handrail's shape, one vertex at y = 0 (the section's plastic neutral axis)
HOLED = ("18.071068 -13.071068\n11 16\n-18.071068 13.071068\n-19.660254 -11\n-11 -16\n\n"
         "-11.978946 {y}\n-18.5 -6\n-11 13.5\n11 -13.5\n")


def test_cad_round_off_in_a_coordinate_is_analysed(tmp_path):
    # found by scripts/fuzz.py: a vertex at y = 6.1e-17 (cos 90 deg in floating point, common in
    # CAD exports) once made the plastic moduli's clipping raise GEOSException (internal error)
    (tmp_path / "exact.txt").write_text(HOLED.format(y="0"))
    (tmp_path / "round_off.txt").write_text(HOLED.format(y="6.123233995736766e-17"))
    exact = _props_json(tmp_path, "exact.txt")
    round_off = _props_json(tmp_path, "round_off.txt")
    # a vertex moved by 6e-17 changes the area by less than 1e-17 of it: round-off
    assert round_off["A"] == pytest.approx(exact["A"], rel=1e-12)


@pytest.mark.parametrize("name", ["tiny.txt", "tiny.dxf"])
def test_profile_of_1e_9_mm_is_analysed_at_its_scale(tmp_path, name):
    # 1e-9 mm is far below any real section, but nothing in the method depends on the scale
    # (tolerances are relative to the profile's size): a square of side a = 1e-9 gets A = a^2,
    # I = a^4 / 12 and J = 0.1406 a^4 like any square. Tolerances: the area and second moments
    # are exact for a polygon (round-off); J within the 0.1% accuracy target at the default
    # mesh (DESIGN.md).
    a = 1e-9
    if name.endswith(".txt"):
        (tmp_path / name).write_text(f"0 0\n{a} 0\n{a} {a}\n0 {a}\n")
    else:
        _dxf(tmp_path / name, ([(0, 0), (a, 0), (a, a), (0, a)], True))
    obj = _props_json(tmp_path, name)
    assert obj["units"]["length"] == "mm"
    assert obj["A"] == pytest.approx(a * a, rel=1e-12)
    assert obj["Ix"] == pytest.approx(a ** 4 / 12.0, rel=1e-12)
    assert obj["Iy"] == pytest.approx(a ** 4 / 12.0, rel=1e-12)
    assert obj["J"] == pytest.approx(square_torsion_constant(a), rel=1e-3)
    assert obj["shear_centre"] == pytest.approx([a / 2, a / 2], abs=1e-12 * a)
