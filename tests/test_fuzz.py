"""Mutated copies of the sample files through the readers and the analysis (hypothesis-driven).

Each example takes a file of sample_sections/ (DXF drawings and coordinate outlines), truncates
it, flips bytes, puts extreme numbers in, or reorders its DXF entities (outline: its loops or its
lines), and runs ``warpwise.io.load_profile`` and, when that succeeds, ``analyse`` on a coarse
mesh (mesh size sqrt(A)/4). The only acceptable endings: a profile analysed with finite, possible
numbers (A > 0, I1 >= I2 > 0, 0 < J <= Ip, Cw >= 0), or a ``WarpwiseError`` with a one-line
message. Another exception, a dead process or more than ``TIME_LIMIT`` seconds fails the test.
Reordering whole entities (a POLYLINE kept with its vertices) or whole loops changes nothing in
the drawing, so it must give the same area (README: pieces are joined in any order).

The mutations and the runner are those of ``scripts/fuzz.py`` (the long run, see
DEVELOPERS.md): every case runs in a forked child process, because a hang inside the mesher's
compiled code cannot be interrupted by a signal handler in this process, and a hard crash of an
extension module would otherwise end the test run.

In CI the same 40 examples run every time (about 15 s); WARPWISE_FUZZ_EXAMPLES=N runs N random
ones instead.
"""

import faulthandler
import functools
import json
import multiprocessing
import os
import signal
import time
from pathlib import Path

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

ROOT = Path(__file__).resolve().parents[1]
from support import fuzzing as fuzz  # noqa: E402 (the mutations, shared with scripts/fuzz.py)

SAMPLES = {p.name: p for p in fuzz.sample_files()}
NAMES = sorted(SAMPLES)
DXF_NAMES = [n for n in NAMES if n.lower().endswith(".dxf")]
TIME_LIMIT = 10.0  # seconds per case; the slowest sample takes 0.4 s at this mesh size

_LONG = os.environ.get("WARPWISE_FUZZ_EXAMPLES")
TOTAL = int(_LONG) if _LONG else 40


def share(fraction):
    return settings(max_examples=max(1, round(TOTAL * fraction)), deadline=None,
                    derandomize=not _LONG, database=None,
                    suppress_health_check=[HealthCheck.too_slow])


@pytest.fixture(scope="module")
def workdir(tmp_path_factory):
    return tmp_path_factory.mktemp("fuzz")


def run(workdir, name, data):
    path = workdir / name  # the sample's own name, so that messages and readers see its ending
    path.write_bytes(data)
    return fuzz.run_case(path, TIME_LIMIT)


def assert_clean(outcome):
    assert outcome.kind in ("analysed", "repaired", "clean"), f"{outcome.kind}: {outcome.detail}"
    assert outcome.seconds < TIME_LIMIT


@functools.cache
def baseline_area(name):
    o = fuzz.run_case(SAMPLES[name], TIME_LIMIT)
    assert o.kind == "analysed", o.detail  # every sample is a valid profile
    return o.area


def test_samples_are_found():
    assert len(DXF_NAMES) >= 5 and len(NAMES) > len(DXF_NAMES)


@share(0.3)
@given(st.sampled_from(NAMES), st.floats(0.0, 1.0))
def test_truncated_files(workdir, name, fraction):
    assert_clean(run(workdir, name, fuzz.truncate(SAMPLES[name].read_bytes(), fraction)))


@share(0.3)
@given(st.sampled_from(NAMES),
       st.lists(st.tuples(st.floats(0.0, 1.0), st.integers(1, 255)), min_size=1, max_size=8))
def test_flipped_bytes(workdir, name, spots):
    assert_clean(run(workdir, name, fuzz.flip(SAMPLES[name].read_bytes(), spots)))


@share(0.15)
@given(st.sampled_from(NAMES),
       st.lists(st.tuples(st.floats(0.0, 1.0), st.integers(0, len(fuzz.EXTREME_NUMBERS) - 1)),
                min_size=1, max_size=3))
def test_extreme_numbers(workdir, name, picks):
    assert_clean(run(workdir, name, fuzz.replace_numbers(SAMPLES[name].read_bytes(), picks)))


@share(0.25)
@given(st.sampled_from(NAMES), st.integers(0, 2**32 - 1), st.booleans())
def test_shuffled_entities(workdir, name, seed, keep_compounds):
    data = fuzz.shuffle(SAMPLES[name].read_bytes(), seed, keep_compounds,
                        name.lower().endswith(".dxf"))
    outcome = run(workdir, name, data)
    assert_clean(outcome)
    if keep_compounds:
        # the same entities (or loops) in another order: the same profile. The loops are the
        # same points; only the order of floating-point sums may change (round-off).
        assert outcome.kind in ("analysed", "repaired"), outcome.detail
        ref = baseline_area(name)
        assert abs(outcome.area - ref) <= fuzz.SAME_AREA * ref


@share(0.1)
@given(st.sampled_from(NAMES), st.integers(0, len(fuzz.STRANGE_NAMES) - 1))
def test_strange_file_names(workdir, name, k):
    # the same sample under a strange name: it must read and analyse as under its own
    outcome = run(workdir, fuzz.strange_name(name, k), SAMPLES[name].read_bytes())
    assert_clean(outcome)
    assert outcome.kind in ("analysed", "repaired"), outcome.detail
    assert abs(outcome.area - baseline_area(name)) <= fuzz.SAME_AREA * baseline_area(name)


@share(0.1)
@given(st.sampled_from(NAMES), st.integers(0, len(fuzz.ENCODINGS) - 1))
def test_other_encodings(workdir, name, k):
    data = fuzz.reencode(SAMPLES[name].read_bytes(), k, name.lower().endswith(".dxf"))
    outcome = run(workdir, name, data)
    assert_clean(outcome)
    way = fuzz.ENCODINGS[k]
    if not name.lower().endswith(".dxf") and way != "utf-16-le":
        # outlines: every way but unmarked UTF-16 reads; a latin-1 byte is refused by name
        if way == "latin-1-comment":
            assert outcome.kind == "clean" and "is not UTF-8 text (byte 0xdf at offset 4, line 1)" \
                in outcome.detail
        else:
            assert outcome.kind == "analysed", outcome.detail
            assert abs(outcome.area - baseline_area(name)) <= fuzz.SAME_AREA * baseline_area(name)
    elif way == "utf-16-le" and not name.lower().endswith(".dxf"):
        assert "seems to be UTF-16 LE text without a byte-order mark" in outcome.detail


@pytest.mark.parametrize("k", range(len(fuzz.STRANGE_NAMES)))
def test_strange_names_on_the_command_line(cli, tmp_path, k):
    # ends in a result (exit 0) whatever the name; the name is shown as given
    f = tmp_path / fuzz.strange_name("bar.txt", k)
    f.write_text("units: mm\n0 0\n20 0\n20 8\n0 8\n")
    code, out, err = cli("props", f, "--json")
    assert code == 0 and "Traceback" not in err, err
    assert json.loads(out)["file"] == str(f)


def test_shuffle_really_reorders():
    # guard for the test above: the order-only shuffle changes the file but not its records
    name = "heat_sink_stepped_fins.dxf"  # LINE and ARC soup: 48 entities
    data = SAMPLES[name].read_bytes()
    mixed = fuzz.shuffle(data, 7, True, True)
    assert mixed != data
    assert sorted(mixed.splitlines()) == sorted(data.splitlines())


needs_fork = pytest.mark.skipif("fork" not in multiprocessing.get_all_start_methods(),
                                reason="the runner stops hangs only in a forked child")


@needs_fork
def test_runner_stops_a_hang(monkeypatch, tmp_path):
    # the runner's own guard: a case that never answers (as the mesher did on a sliver) comes
    # back as a hang at the time limit instead of blocking the run
    monkeypatch.setattr(fuzz, "_examine", lambda *args: time.sleep(60))
    (tmp_path / "any.txt").write_text("0 0\n1 0\n1 1\n")
    outcome = fuzz.run_case(tmp_path / "any.txt", time_limit=1.0)
    assert outcome.kind == "hang"
    assert outcome.seconds < 1.0 + 5.0


@needs_fork
def test_runner_reports_a_dead_process(monkeypatch, tmp_path):
    # a segmentation fault in an extension module (Triangle did that on near-touching loops)
    # is counted as a crash with its exit code, and the run goes on
    def die(*args):
        faulthandler.disable()  # pytest's traceback dump would only clutter the output
        os.kill(os.getpid(), signal.SIGSEGV)

    monkeypatch.setattr(fuzz, "_examine", die)
    (tmp_path / "any.txt").write_text("0 0\n1 0\n1 1\n")
    outcome = fuzz.run_case(tmp_path / "any.txt", time_limit=10.0)
    assert outcome.kind == "crash"
    assert f"exit code {-signal.SIGSEGV}" in outcome.detail
