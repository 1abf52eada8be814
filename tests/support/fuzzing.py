"""Fuzz the readers and the analysis with mutated copies of the sample profiles.

Run: python scripts/fuzz.py --cases 2000 --seed 1 --out fuzz-out

Each case takes one file of sample_sections/ (DXF drawings and coordinate outlines), mutates it
and feeds it to ``warpwise.io.load_profile`` and, when it loads, to ``analyse`` on a coarse mesh.
The only acceptable endings are a profile analysed with sane numbers or a ``WarpwiseError`` with
a one-line message. Anything else is a crash: another exception, a dead process, a case over the
time limit (a hang), a non-finite or impossible result, or (for the order-only shuffle) a profile
whose area differs from the unshuffled file's.

Mutations:

- ``truncate``: cut the file at a random offset;
- ``flip``: XOR a few random bytes with random masks;
- ``numbers``: replace a few numbers with extreme ones (nan, inf, 1e308, 1e-300, 0, -1e12...);
- ``shuffle_entities``: DXF, reorder the entities of the ENTITIES section, a POLYLINE or
  INSERT kept with its VERTEX/ATTRIB/SEQEND records (outline: reorder the loops): the same
  drawing, so it must give the same area;
- ``shuffle_groups``: DXF, reorder every 0-group of the ENTITIES section, compound entities torn
  apart (outline: reorder all lines): anything may come out, but cleanly;
- ``names``: the same file under a strange name (``$``, ``=``, ``+``, a leading ``-``, ``@``,
  quotes, spaces, unicode, a name of 200 characters; :data:`STRANGE_NAMES`);
- ``encodings``: the same text saved another way (UTF-8 with a byte-order mark, UTF-16 LE and
  BE with and without one, CRLF line ends, a latin-1 comment line; :data:`ENCODINGS`): read, or
  refused naming the encoding.

Every case runs in a forked child process so that a hang inside compiled code (the mesher),
which no signal handler can interrupt, is stopped at the time limit, a hard crash of an
extension module is caught and counted instead of ending the run, and (on Linux) a runaway
allocation stops at 2 GB more than the child started with. The first crashes are saved
under --out: the mutated file and a note with the mutation, the outcome and the traceback.
The exit code is 1 when there were crashes.
"""

from __future__ import annotations

import argparse
import logging
import math
import multiprocessing
import random
import re
import shutil
import sys
import time
import traceback
from collections import Counter
from dataclasses import dataclass
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
SAMPLES = ROOT / "sample_sections"

#: Mutations by name; each takes (data, rng) and returns the mutated bytes and a description.
MUTATIONS = ("truncate", "flip", "numbers", "shuffle_entities", "shuffle_groups", "names",
             "encodings")

#: File names (``{stem}`` the sample's, the ending kept) the names family gives a file.
STRANGE_NAMES = ("${stem}", "a=b {stem}", "+{stem}", "-{stem}", "@{stem}", "'{stem}'",
                 '"{stem}"', "with  spaces {stem} ", "ünïcødé — {stem}", "日本語 {stem}",
                 "{stem} 😀", "x" * 200 + "{stem}", "$(echo hi){stem}", "--part=2 {stem}")

#: Ways the encodings family saves a file's text.
ENCODINGS = ("utf-8-bom", "utf-16-le-bom", "utf-16-be-bom", "utf-16-le", "crlf", "latin-1-comment")

#: Numbers a mutated file may get in place of a coordinate.
EXTREME_NUMBERS = ("nan", "inf", "-inf", "1e308", "-1e308", "1e-300", "0", "-0", "1e12", "-1e12",
                   "1e9", "1e-9", "12345678901234567890", "1e", "--1", "0x10")

#: Relative difference of area allowed between a drawing and its reordered copy (the loops are the
#: same; only the joining order and so the floating-point sums may change).
SAME_AREA = 1e-9


def sample_files(folder: Path = SAMPLES) -> list[Path]:
    """The DXF drawings and outline files of the sample folder, sorted by name."""
    return sorted(p for p in folder.iterdir() if p.suffix.lower() in (".dxf", ".txt"))


# --------------------------------------------------------------------------------------------
# mutations (pure functions of the data and their parameters, so that tests can drive them)


def truncate(data: bytes, fraction: float) -> bytes:
    """The first ``fraction`` of the file."""
    return data[: int(len(data) * min(max(fraction, 0.0), 1.0))]


def flip(data: bytes, spots: list[tuple[float, int]]) -> bytes:
    """XOR the byte at each relative position with its mask (1..255)."""
    if not data:
        return data
    out = bytearray(data)
    for where, mask in spots:
        k = min(int(where * len(out)), len(out) - 1)
        out[k] ^= mask & 0xFF or 1
    return bytes(out)


_NUMBER = re.compile(rb"(?<![\w.])[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?(?![\w.])")


def replace_numbers(data: bytes, picks: list[tuple[float, int]]) -> bytes:
    """Replace the numbers at relative ranks ``where`` by ``EXTREME_NUMBERS[k]``."""
    spans = [m.span() for m in _NUMBER.finditer(data)]
    if not spans:
        return data
    chosen = {}
    for where, k in picks:
        chosen[min(int(where * len(spans)), len(spans) - 1)] = EXTREME_NUMBERS[k % len(EXTREME_NUMBERS)]
    out, last = [], 0
    for i in sorted(chosen):
        a, b = spans[i]
        out += [data[last:a], chosen[i].encode()]
        last = b
    out.append(data[last:])
    return b"".join(out)


def _tag_lines(text: str) -> list[str]:
    return text.splitlines(keepends=True)


def _entities_range(lines: list[str]) -> tuple[int, int] | None:
    """Line indices (start, end) of the entity records inside the ENTITIES section."""
    for i in range(0, len(lines) - 3, 2):
        if lines[i].strip() == "0" and lines[i + 1].strip() == "SECTION" and \
                lines[i + 2].strip() == "2" and lines[i + 3].strip() == "ENTITIES":
            start = i + 4
            for j in range(start, len(lines) - 1, 2):
                if lines[j].strip() == "0" and lines[j + 1].strip() == "ENDSEC":
                    return start, j
            return None
    return None


def _dxf_blocks(lines: list[str], keep_compounds: bool) -> list[list[str]]:
    """Split entity records at their (0, TYPE) pairs; optionally keep VERTEX/SEQEND with parents."""
    blocks: list[list[str]] = []
    for i in range(0, len(lines) - 1, 2):
        pair = lines[i:i + 2]
        if pair[0].strip() == "0":
            kind = pair[1].strip().upper()
            if keep_compounds and blocks and kind in ("VERTEX", "SEQEND", "ATTRIB"):
                blocks[-1] += pair
            else:
                blocks.append(list(pair))
        elif blocks:
            blocks[-1] += pair
        else:
            blocks.append(list(pair))
    return blocks


def shuffle(data: bytes, seed: int, keep_compounds: bool, is_dxf: bool) -> bytes:
    """Reorder the entities of a text DXF, or the loops (lines) of an outline file."""
    rng = random.Random(seed)
    text = data.decode("latin-1")
    if is_dxf:
        lines = _tag_lines(text)
        span = _entities_range(lines)
        if span is None:
            return data
        a, b = span
        blocks = _dxf_blocks(lines[a:b], keep_compounds)
        rng.shuffle(blocks)
        return "".join(lines[:a] + [ln for blk in blocks for ln in blk] + lines[b:]).encode("latin-1")
    if not keep_compounds:  # every line
        lines = _tag_lines(text)
        rng.shuffle(lines)
        return "".join(lines).encode("latin-1")
    # loops: blocks separated by blank lines; the header (comments, units) stays first
    parts = re.split(r"(?:\r?\n[ \t]*){2,}", text.strip("\r\n"))
    head = [p for p in parts if not re.search(r"^\s*[-+.\d]", p, re.M)]
    loops = [p for p in parts if p not in head]
    rng.shuffle(loops)
    return ("\n\n".join(head + loops) + "\n").encode("latin-1")


def strange_name(name: str, k: int) -> str:
    """The file name ``name`` in the form ``STRANGE_NAMES[k]`` (ending kept, at most 250 bytes)."""
    stem, dot, ending = name.rpartition(".")
    new = STRANGE_NAMES[k % len(STRANGE_NAMES)].format(stem=stem or ending) + (dot + ending if dot else "")
    while len(new.encode()) > 250:
        new = new[1:]
    return new


def case_name(name: str, how: str) -> str:
    """The name a mutated copy of the file ``name`` is saved under, from the mutation's description."""
    if how.startswith("strange_name("):
        return strange_name(name, int(how.removeprefix("strange_name(").removesuffix(")")))
    return "case" + name[name.rfind("."):]


def reencode(data: bytes, k: int, is_dxf: bool) -> bytes:
    """The text of ``data`` saved the way ``ENCODINGS[k]`` says (bytes that are not UTF-8 kept
    as they are where the way allows, replaced by ``?`` in UTF-16)."""
    way = ENCODINGS[k % len(ENCODINGS)]
    text = data.decode("utf-8", errors="surrogateescape")
    plain = text.encode("utf-8", errors="surrogateescape")
    if way == "crlf":
        return plain.replace(b"\r\n", b"\n").replace(b"\n", b"\r\n")
    if way == "latin-1-comment":
        comment = "999\nMa\xdf und \xe9\n" if is_dxf else "# Ma\xdf und \xe9\n"
        return comment.encode("latin-1") + plain
    if way == "utf-8-bom":
        return b"\xef\xbb\xbf" + plain
    codec, bom = {"utf-16-le-bom": ("utf-16-le", b"\xff\xfe"), "utf-16-be-bom": ("utf-16-be", b"\xfe\xff"),
                  "utf-16-le": ("utf-16-le", b"")}[way]
    return bom + text.encode(codec, errors="replace")


def mutate(data: bytes, name: str, kind: str, rng: random.Random) -> tuple[bytes, str]:
    """Apply mutation ``kind`` with parameters drawn from ``rng``; return data and description."""
    is_dxf = name.lower().endswith(".dxf")
    if kind == "truncate":
        f = rng.random()
        return truncate(data, f), f"truncate({f:.6f})"
    if kind == "flip":
        spots = [(rng.random(), rng.randrange(1, 256)) for _ in range(rng.randrange(1, 9))]
        return flip(data, spots), f"flip({[(round(w, 6), m) for w, m in spots]})"
    if kind == "numbers":
        picks = [(rng.random(), rng.randrange(len(EXTREME_NUMBERS))) for _ in range(rng.randrange(1, 4))]
        return replace_numbers(data, picks), f"replace_numbers({[(round(w, 6), k) for w, k in picks]})"
    if kind == "names":  # the data stay; the runner names the file with strange_name(name, k)
        k = rng.randrange(len(STRANGE_NAMES))
        return data, f"strange_name({k})"
    if kind == "encodings":
        k = rng.randrange(len(ENCODINGS))
        return reencode(data, k, is_dxf), f"reencode({ENCODINGS[k]!r})"
    seed = rng.randrange(2**32)
    keep = kind == "shuffle_entities"
    return shuffle(data, seed, keep, is_dxf), f"shuffle(seed={seed}, keep_compounds={keep})"


# --------------------------------------------------------------------------------------------
# one case, in a child process


@dataclass(frozen=True)
class Outcome:
    """How one case ended.

    Attributes
    ----------
    kind : str
        ``analysed``, ``repaired`` (analysed after ezdxf silently replaced unreadable values),
        ``clean`` (a WarpwiseError), ``crash`` or ``hang``.
    detail : str
        The numbers, the error message or the traceback.
    seconds : float
        Wall time of the case.
    area : float or None
        Area of the analysed profile.
    """

    kind: str
    detail: str
    seconds: float
    area: float | None = None


class _Repairs(logging.Handler):
    """Collects ezdxf's log records about values it replaced while recovering a file."""

    def __init__(self) -> None:
        super().__init__(logging.WARNING)
        self.records: list[str] = []

    def emit(self, record: logging.LogRecord) -> None:  # noqa: D102
        self.records.append(record.getMessage())


def preload() -> None:
    """Import everything a case needs, once, before children are forked (they then start fast)."""
    import ezdxf  # noqa: F401
    import ezdxf.recover  # noqa: F401

    import warpwise.io  # noqa: F401
    import warpwise.properties.analysis  # noqa: F401


def examine(path: str, mesh_factor: float = 0.25) -> tuple[str, str, float | None]:
    """Load and analyse one file in this process: (kind, detail, area).

    ``kind`` is ``analysed``, ``repaired`` (analysed, but ezdxf replaced unreadable values on the
    way and the profile does not say so), ``clean`` or ``crash``.
    """
    log = logging.getLogger("ezdxf")
    repairs = _Repairs()
    log.addHandler(repairs)
    log.propagate = False  # keep ezdxf's messages off the terminal; they are counted instead
    try:
        return _examine(path, mesh_factor, repairs.records)
    finally:
        log.removeHandler(repairs)
        log.propagate = True


def _examine(path: str, mesh_factor: float, repairs: list[str]) -> tuple[str, str, float | None]:
    from warpwise.errors import WarpwiseError
    from warpwise.io import load_profile
    from warpwise.properties.analysis import analyse

    def clean(exc: WarpwiseError) -> tuple[str, str, None]:
        text = str(exc)
        if "\n" in text or not text.strip():
            return "crash", f"{type(exc).__name__} with a message that is not one line: {text!r}", None
        return "clean", f"{type(exc).__name__}: {text}", None

    try:
        profile = load_profile(path)
        area = float(profile.area)
        res = analyse(profile, mesh_factor * math.sqrt(area) if area > 0 else None)
    except WarpwiseError as exc:
        return clean(exc)
    except Exception:  # anything else is a defect: report it with its traceback
        return "crash", traceback.format_exc(), None
    g, t = res.geometric, res.torsion
    values = {"A": g.A, "Ix": g.Ix, "Iy": g.Iy, "I1": g.I1, "I2": g.I2, "J": t.J, "Cw": t.Cw,
              "xs": t.shear_centre[0], "ys": t.shear_centre[1]}
    text = " ".join(f"{k}={v:.6g}" for k, v in values.items())
    if not all(math.isfinite(v) for v in values.values()):
        return "crash", f"non-finite result: {text}", None
    if not (g.A > 0 and g.I1 >= g.I2 > 0 and 0 < t.J <= g.Ip * (1 + 1e-9) and t.Cw >= 0):
        return "crash", f"impossible result: {text}", None
    replaced = [r for r in repairs if "recovered invalid" in r]
    if replaced and not any("recover" in n or "repair" in n for n in profile.notes):
        return "repaired", f"{text}; ezdxf replaced values unnoticed: {replaced[0]}", float(g.A)
    return "analysed", text, float(g.A)


#: Memory a case may add to what the forked child starts with, bytes (a runaway mesher took
#: 4 GB in 20 s); over it the case fails (MemoryError, or the mesher ends the child).
MEMORY_BUDGET = 2 * 1024**3


def _limit_memory(budget: int) -> None:
    """Cap this process's address space at its current size plus ``budget`` (Linux only)."""
    try:
        import resource

        with open("/proc/self/status") as fh:
            kb = next(int(line.split()[1]) for line in fh if line.startswith("VmSize:"))
        limit = kb * 1024 + budget
        resource.setrlimit(resource.RLIMIT_AS, (limit, limit))
    except (ImportError, OSError, StopIteration, ValueError):
        pass


def _child(conn, path: str, mesh_factor: float) -> None:
    _limit_memory(MEMORY_BUDGET)
    try:
        conn.send(examine(path, mesh_factor))
    except BaseException as exc:  # even a MemoryError should come back as a report
        try:
            conn.send(("crash", f"{type(exc).__name__}: {exc}", None))
        except Exception:
            pass
    finally:
        conn.close()


def run_case(path: str | Path, time_limit: float = 10.0, mesh_factor: float = 0.25) -> Outcome:
    """Examine one file in a forked child process, stopped after ``time_limit`` seconds.

    Without ``fork`` (Windows) the case runs in this process and a hang is only detected after
    the fact.
    """
    preload()
    start = time.perf_counter()
    if "fork" not in multiprocessing.get_all_start_methods():
        kind, detail, area = examine(str(path), mesh_factor)
        seconds = time.perf_counter() - start
        if seconds > time_limit:
            return Outcome("hang", f"took {seconds:.1f} s ({detail[:200]})", seconds)
        return Outcome(kind, detail, seconds, area)
    ctx = multiprocessing.get_context("fork")
    receive, send = ctx.Pipe(duplex=False)
    proc = ctx.Process(target=_child, args=(send, str(path), mesh_factor), daemon=True)
    proc.start()
    send.close()
    result = None
    if receive.poll(time_limit):
        try:
            result = receive.recv()
        except EOFError:  # the child died before it could answer
            result = None
        proc.join(5.0)
    else:
        proc.kill()
        proc.join()
        receive.close()
        seconds = time.perf_counter() - start
        return Outcome("hang", f"no answer within {time_limit:g} s", seconds)
    receive.close()
    if proc.is_alive():
        proc.kill()
        proc.join()
    seconds = time.perf_counter() - start
    if result is None:
        return Outcome("crash", f"the process died (exit code {proc.exitcode})", seconds)
    kind, detail, area = result
    return Outcome(kind, detail, seconds, area)


# --------------------------------------------------------------------------------------------
# the run


def main(argv: list[str] | None = None) -> int:  # noqa: D103
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("--cases", type=int, default=200, help="number of mutated files (default 200)")
    ap.add_argument("--seed", type=int, default=1, help="random seed (default 1)")
    ap.add_argument("--out", default="fuzz-out", help="folder for crash reproductions")
    ap.add_argument("--keep", type=int, default=10, help="crash reproductions saved (default 10)")
    ap.add_argument("--time-limit", type=float, default=10.0, help="seconds per case (default 10)")
    ap.add_argument("--mesh-factor", type=float, default=0.25,
                    help="mesh size as a fraction of sqrt(area) (default 0.25, coarse)")
    ap.add_argument("--samples", type=Path, default=SAMPLES, help="folder of files to mutate")
    args = ap.parse_args(argv)

    files = sample_files(args.samples)
    if not files:
        print(f"no .dxf or .txt files in {args.samples}", file=sys.stderr)
        return 2
    rng = random.Random(args.seed)
    out = Path(args.out)
    work = out / "work"
    work.mkdir(parents=True, exist_ok=True)

    # the unmutated files: baseline areas for the order-only shuffle
    base: dict[str, float | None] = {}
    for f in files:
        o = run_case(f, args.time_limit, args.mesh_factor)
        base[f.name] = o.area
        print(f"baseline {f.name}: {o.kind} ({o.seconds:.2f} s)")

    counts: Counter[str] = Counter()
    by_mutation: Counter[tuple[str, str]] = Counter()
    crashes = 0
    slowest = (0.0, "")
    t0 = time.perf_counter()
    for case in range(1, args.cases + 1):
        src = rng.choice(files)
        kind = rng.choice(MUTATIONS)
        data, how = mutate(src.read_bytes(), src.name, kind, rng)
        target = work / case_name(src.name, how)
        target.write_bytes(data)
        o = run_case(target, args.time_limit, args.mesh_factor)
        verdict = o.kind
        detail = o.detail
        if kind == "shuffle_entities" and base.get(src.name) and (
                o.area is None or abs(o.area - base[src.name]) > SAME_AREA * base[src.name]):
            verdict = "crash"
            detail = (f"reordering the entities changed the result: area {base[src.name]!r} -> "
                      f"{o.area!r} ({o.kind}: {o.detail})")
        counts[verdict] += 1
        by_mutation[(kind, verdict)] += 1
        if o.seconds > slowest[0]:
            slowest = (o.seconds, f"{src.name} {how}")
        if verdict in ("crash", "hang"):
            crashes += 1
            if crashes <= args.keep:
                stem = f"crash_{crashes:03d}_{src.stem}_{kind}"
                (out / f"{stem}{src.suffix}").write_bytes(data)
                (out / f"{stem}.report.txt").write_text(
                    f"sample: {src.name}\nmutation: {how}\nseed: {args.seed}, case {case}\n"
                    f"outcome: {verdict} after {o.seconds:.2f} s\n\n{detail}\n")
            print(f"case {case}: {verdict.upper()} {src.name} {how}: {detail.strip().splitlines()[-1]}")
        if case % 100 == 0:
            print(f"... {case} cases, {dict(counts)}, {time.perf_counter() - t0:.0f} s")
    shutil.rmtree(work)

    print()
    print(f"cases tried   {args.cases}")
    print(f"clean errors  {counts['clean']}")
    print(f"analysed      {counts['analysed'] + counts['repaired']}")
    print(f"  of which after values were replaced unnoticed (ezdxf recover mode): "
          f"{counts['repaired']}")
    print(f"crashes       {counts['crash'] + counts['hang']}  (of which hangs over "
          f"{args.time_limit:g} s: {counts['hang']})")
    print(f"slowest case  {slowest[0]:.2f} s  ({slowest[1]})")
    print(f"time          {time.perf_counter() - t0:.0f} s")
    print("by mutation:")
    for m in MUTATIONS:
        row = {v: by_mutation[(m, v)] for v in ("analysed", "repaired", "clean", "crash", "hang")}
        print(f"  {m:<17} " + "  ".join(f"{k} {n}" for k, n in row.items()))
    if crashes:
        print(f"first {min(crashes, args.keep)} reproductions saved in {out}/")
    return 1 if crashes else 0


if __name__ == "__main__":
    sys.exit(main())
