"""Catalogue runs: many profiles analysed, one row each, failures collected, never fatal.

:func:`run_catalogue` analyses files in any :class:`concurrent.futures.Executor` (a process pool
by default; pass a Dask ``distributed`` client's executor to spread a big catalogue over a
cluster) and returns one :class:`Outcome` per file in input order. A profile that fails gives an
outcome with its one-line error; the others are unaffected.

:func:`collect_files` finds the profile files of folders (searched recursively);
:func:`catalogue_items` also reads manifests (:func:`read_manifest`, a TOML file of our own
naming each drawing with how it is read, its material, name and description) into
:class:`Item` s, each with its own options.

Examples
--------
>>> from pathlib import Path
>>> files = collect_files([Path("sample_sections")])
>>> len(files) >= 8
True
"""

from __future__ import annotations

import ctypes
import os
import signal
import sys
import threading
import time
from collections.abc import Callable, Iterable, Sequence
from concurrent.futures import Executor, ProcessPoolExecutor
from dataclasses import dataclass, field, replace
from pathlib import Path

from .errors import InputFileError, UsageError, WarpwiseError
from .geometry.profile import LENGTH_UNITS
from .io.options import ReadOptions
from .properties.run import AnalysisOptions
from .textfiles import read_text

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover - Python 3.10
    import tomli as tomllib

#: File endings taken from a folder: DXF drawings and coordinate outlines.
PROFILE_ENDINGS = (".dxf", ".txt", ".xy", ".csv", ".dat")
#: File ending of a catalogue manifest.
MANIFEST_ENDING = ".toml"


@dataclass(frozen=True)
class RunOptions:
    """How each profile of a catalogue is read and analysed (the options of ``warpwise props``).

    Attributes
    ----------
    read : ReadOptions
        How each file is read (units, DXF layers, parts).
    analysis : AnalysisOptions
        How each profile is analysed (accuracy, materials, solver, estimates).
    datasheet_dir : str or None
        Folder for an HTML datasheet per profile (written by the worker).
    report_units : str or None
        Unit system of the datasheets (:data:`warpwise.units.SYSTEMS`); default each
        profile's own.
    """

    read: ReadOptions = field(default_factory=ReadOptions)
    analysis: AnalysisOptions = field(default_factory=AnalysisOptions)
    datasheet_dir: str | None = None
    report_units: str | None = None


@dataclass(frozen=True)
class Outcome:
    """The outcome of one profile of a catalogue.

    Attributes
    ----------
    path : str
        The file.
    record : Record or None
        Its values (None when it failed).
    error : str or None
        One-line error message when it failed.
    seconds : float
        Wall time of the analysis, s.
    datasheet : str or None
        Path of its HTML datasheet, when written.
    thumbnail : str or None
        Inline SVG of its outline, when datasheets are written.
    """

    path: str
    record: object | None = None
    error: str | None = None
    seconds: float = 0.0
    datasheet: str | None = None
    thumbnail: str | None = None

    @property
    def ok(self) -> bool:
        """True when the profile was analysed."""
        return self.error is None


def _profile_files(folder: Path) -> list[Path]:
    """Profile files in a folder and its subfolders, by path; hidden files and folders skipped."""
    found = []
    for f in folder.rglob("*"):
        rel = f.relative_to(folder).parts
        if f.is_file() and f.suffix.lower() in PROFILE_ENDINGS \
                and not any(part.startswith(".") for part in rel):
            found.append(f)
    return sorted(found, key=lambda f: f.relative_to(folder).parts)


def collect_files(items: Iterable[str | Path], exclude: Iterable[str | Path] = ()) -> list[Path]:
    """Files of a catalogue: each folder's profile files (recursively, by path), or the file.

    Parameters
    ----------
    items : iterable of str or Path
        Folders and files.
    exclude : iterable of str or Path
        Files not to take from folders (the run's own outputs).

    Raises
    ------
    UsageError
        For a path that does not exist or a folder without profile files.
    """
    skip = {Path(e).resolve() for e in exclude}
    out: list[Path] = []
    for item in items:
        p = Path(item)
        if p.is_dir():
            found = [f for f in _profile_files(p) if f.resolve() not in skip]
            if not found:
                raise UsageError(f"no profile files ({', '.join(PROFILE_ENDINGS)}) in the folder "
                                 "or its subfolders", file=str(p))
            out.extend(found)
        elif p.exists():
            out.append(p)
        else:
            raise UsageError("file or folder not found", file=str(p))
    return out


@dataclass(frozen=True)
class Item:
    """One profile of a catalogue: its file and, from a manifest, its own options and name.

    Attributes
    ----------
    path : str
        The file.
    options : RunOptions or None
        How it is read and analysed (None: the run's options).
    name : str
        Name or part number ("" : none; reports then show the file name).
    description : str
        What it is, in words.
    """

    path: str
    options: RunOptions | None = None
    name: str = ""
    description: str = ""

    @property
    def title(self) -> str | None:
        """Heading of its datasheet: name and description (None: none given)."""
        return ": ".join(t for t in (self.name, self.description) if t) or None


#: Keys of a manifest entry and the type of each value.
MANIFEST_KEYS: dict[str, type | tuple[type, ...]] = {
    "file": str, "name": str, "description": str, "part": int, "all_parts": bool,
    "layers": list, "layer_materials": dict, "material": str, "units": str,
    "join_tolerance": (int, float), "chord_tolerance": (int, float), "max_entities": int}


def _entry_item(entry: object, k: int, folder: Path, base: RunOptions, where: str) -> Item:
    """The item of manifest entry ``k`` (1-based): the run's options changed as it says."""
    def bad(text: str) -> InputFileError:
        return InputFileError(f"profile {k}: {text}", file=where)

    if not isinstance(entry, dict):
        raise bad("is not a table of keys")
    for key, value in entry.items():
        kind = MANIFEST_KEYS.get(key)
        if kind is None:
            raise bad(f"unknown key {key!r} (keys: {', '.join(MANIFEST_KEYS)})")
        if not isinstance(value, kind) or (kind is int and isinstance(value, bool)):
            raise bad(f"{key} has a value of the wrong kind: {value!r}")
    if "file" not in entry:
        raise bad("'file' is missing")
    names = entry.get("layers", [])
    table = entry.get("layer_materials", {})
    if not all(isinstance(n, str) for n in [*names, *table, *table.values()]):
        raise bad("layer and material names must be text")
    if entry.get("units", "mm") not in LENGTH_UNITS:
        raise bad(f"unknown unit {entry['units']!r} (use {', '.join(LENGTH_UNITS)})")
    read = {"units": entry.get("units"), "layers": tuple(names) or None,
            "join_tolerance": entry.get("join_tolerance"), "layer_materials": table or None,
            "chord_tolerance": entry.get("chord_tolerance"), "other_layers_material": entry.get("material"),
            "max_entities": entry.get("max_entities")}
    changes = {key: value for key, value in read.items() if value is not None}
    if "part" in entry or "all_parts" in entry:
        changes.update(part=entry.get("part"), all_parts=entry.get("all_parts", False))
    try:
        options = replace(base, read=replace(base.read, **changes))
        if "material" in entry:
            options = replace(options, analysis=replace(base.analysis, material=entry["material"]))
    except UsageError as exc:
        raise bad(exc.message) from None
    path = Path(entry["file"]).expanduser()
    return Item(str(path if path.is_absolute() else folder / path), options,
                entry.get("name", ""), entry.get("description", ""))


def read_manifest(path: str | Path, options: RunOptions | None = None) -> list[Item]:
    """The items of a catalogue manifest.

    A manifest is a TOML file with one ``[[profile]]`` table per drawing: ``file`` (required;
    relative to the manifest's folder), ``name`` (or part number), ``description``, and how
    it is read and analysed: ``part`` or ``all_parts``, ``layers``, ``layer_materials``
    (a table of layer = material name), ``material``, ``units``, ``join_tolerance``,
    ``chord_tolerance``, ``max_entities``. What an entry gives replaces the run's option for that drawing.

    Parameters
    ----------
    path : str or Path
        The manifest.
    options : RunOptions, optional
        The run's options (the command line's).

    Returns
    -------
    list of Item

    Raises
    ------
    InputFileError
        For a file that is not such a manifest (naming the entry and key at fault).
    """
    where = str(path)
    base = options or RunOptions()
    try:
        data = tomllib.loads(read_text(path, "a TOML manifest"))
    except (tomllib.TOMLDecodeError, UnicodeDecodeError) as exc:
        raise InputFileError(f"not a valid TOML manifest ({exc})", file=where) from None
    unknown = sorted(set(data) - {"profile"})
    if unknown:
        raise InputFileError(f"unknown top-level keys {unknown} (a manifest holds [[profile]] "
                             "tables)", file=where)
    entries = data.get("profile")
    if not isinstance(entries, list) or not entries:
        raise InputFileError("no [[profile]] tables found", file=where)
    folder = Path(path).parent
    return [_entry_item(e, k, folder, base, where) for k, e in enumerate(entries, start=1)]


def catalogue_items(items: Iterable[str | Path], options: RunOptions | None = None,
                    exclude: Iterable[str | Path] = ()) -> list[Item]:
    """Items of a catalogue run: manifests (``.toml``) read, folders searched, files taken.

    Parameters
    ----------
    items : iterable of str or Path
        Manifests, folders and files, in the order wanted.
    options : RunOptions, optional
        The run's options (manifest entries change them per drawing).
    exclude : iterable of str or Path
        Files not to take from folders (the run's own outputs).

    Returns
    -------
    list of Item
    """
    out: list[Item] = []
    for item in items:
        if Path(item).suffix.lower() == MANIFEST_ENDING and Path(item).is_file():
            out.extend(read_manifest(item, options))
        else:
            out.extend(Item(str(f), options) for f in collect_files([item], exclude))
    return out


def analyse_one(path: str | Item, options: RunOptions, sheet_name: str | None = None,
                label: str | None = None) -> Outcome:
    """Read and analyse one file; every user-input error is caught into the outcome.

    This is the worker function of a catalogue (picklable, top level). An :class:`Item` brings
    its own options (else ``options``), name and description; ``sheet_name`` and ``label`` are
    its datasheet's file name and the name it shows (default the file's own).
    """
    from .properties.run import run_analysis
    from .report.records import record_of

    item = path if isinstance(path, Item) else Item(str(path))
    path, options = item.path, item.options or options
    start = time.perf_counter()
    try:
        result = run_analysis(options.read.load(path), options.analysis)
        sheet = thumb = None
        if options.datasheet_dir:
            from .report.html import thumbnail_svg, write_datasheet
            from .stress import nominal_torsion

            shown = options.report_units or result.units
            sheet = str(write_datasheet(result, options.datasheet_dir,
                                        torsion=nominal_torsion(result, shown),
                                        nominal_torque=True, filename=sheet_name, units=shown,
                                        title=item.title, label=label))
            thumb = thumbnail_svg(result)
        record = replace(record_of(result), name=item.name, description=item.description)
        return Outcome(path, record, None, time.perf_counter() - start, sheet, thumb)
    except WarpwiseError as exc:
        return Outcome(path, None, str(exc.with_file(path)), time.perf_counter() - start)
    except MemoryError:
        return Outcome(path, None, f"{path}: out of memory; give a larger --mesh-size",
                       time.perf_counter() - start)
    except Exception as exc:  # a bug must not stop the other profiles
        return Outcome(path, None, f"{path}: internal error: {type(exc).__name__}: {exc}",
                       time.perf_counter() - start)


def usable_cpus() -> int:
    """CPUs this process may run on (its affinity where the system tells it), at least 1."""
    if hasattr(os, "sched_getaffinity"):
        return len(os.sched_getaffinity(0)) or 1
    return os.cpu_count() or 1


def worker_count(jobs: int | None, total: int) -> int:
    """Worker processes of a run: ``jobs`` (default the CPUs) capped by the profiles and CPUs.

    Examples
    --------
    >>> worker_count(64, 3) <= 3, worker_count(1, 100), worker_count(5, 0)
    (True, 1, 1)
    """
    cpus = usable_cpus()
    return max(1, min(jobs or cpus, total, cpus))


#: Seconds between looks at the parent when the system cannot tell a worker of its death.
PARENT_POLL = 0.5
#: prctl option of Linux: a signal to the process when its parent ends.
_PR_SET_PDEATHSIG = 1


def _parent_gone(parent: int) -> bool:
    """Whether the process ``parent`` (this worker's creator) has ended."""
    if os.getppid() == parent:
        return False
    try:
        os.kill(parent, 0)  # POSIX only: a check, no signal is sent
    except ProcessLookupError:
        return True
    except OSError:
        return False
    return False


def _worker_start(parent: int) -> None:
    """Start of each worker process: it ends when its parent ends; Ctrl-C is the parent's."""
    signal.signal(signal.SIGINT, signal.SIG_IGN)  # the parent stops the workers itself
    told = False
    if sys.platform.startswith("linux"):
        try:
            told = ctypes.CDLL(None, use_errno=True).prctl(_PR_SET_PDEATHSIG, signal.SIGKILL) == 0
        except (OSError, AttributeError):
            told = False
    if _parent_gone(parent):  # it ended before the worker could ask to be told
        os._exit(1)
    if not told:
        start = os.getppid()

        def watch() -> None:
            while os.getppid() == start:
                time.sleep(PARENT_POLL)
            os._exit(1)

        threading.Thread(target=watch, name="warpwise-parent-watch", daemon=True).start()


def _stop_workers(pool: ProcessPoolExecutor) -> None:
    """End the worker processes of an interrupted run now, not after their current profile."""
    for process in list((getattr(pool, "_processes", None) or {}).values()):
        process.terminate()
    pool.shutdown(wait=True, cancel_futures=True)


def run_catalogue(files: Sequence[str | Path | Item], options: RunOptions | None = None, *,
                  executor: Executor | None = None, jobs: int | None = None,
                  on_done: Callable[[Outcome, int, int], None] | None = None) -> list[Outcome]:
    """Analyse every file; return the outcomes in the order of ``files``.

    Parameters
    ----------
    files : sequence of str, Path or Item
        Profile files, or items with their own options and names (:func:`catalogue_items`).
    options : RunOptions, optional
        Reading and analysis options (of the files and of items without their own).
    executor : concurrent.futures.Executor, optional
        Where to run the work (any executor: a process pool, a thread pool, a Dask
        ``distributed.Client.get_executor()``). Default: a process pool of ``jobs`` workers,
        or serial in this process when ``jobs`` is 1.
    jobs : int, optional
        Worker processes of the default pool (default: the number of CPUs), capped by the
        profiles and the CPUs (:func:`worker_count`). They end when this process ends and
        when the run is interrupted.
    on_done : callable, optional
        Called as ``on_done(outcome, done, total)`` as each profile finishes.

    Returns
    -------
    list of Outcome
    """
    options = options or RunOptions()
    items = [f if isinstance(f, Item) else Item(str(f)) for f in files]
    paths = [it.path for it in items]
    names: list[str | None] = [None] * len(paths)
    labels: list[str | None] = [None] * len(paths)
    if options.datasheet_dir:
        from .report.html import relative_names, unique_filenames

        names, labels = list(unique_filenames(paths)), list(relative_names(paths))
    total = len(paths)
    outcomes: list[Outcome | None] = [None] * total
    done = 0

    def finished(i: int, out: Outcome) -> None:
        nonlocal done
        outcomes[i] = out
        done += 1
        if on_done is not None:
            on_done(out, done, total)

    if executor is None and worker_count(jobs, total) == 1:
        for i, it in enumerate(items):
            finished(i, analyse_one(it, options, names[i], labels[i]))
        return outcomes  # type: ignore[return-value]
    own = executor is None
    pool = executor if executor is not None else ProcessPoolExecutor(
        max_workers=worker_count(jobs, total), initializer=_worker_start, initargs=(os.getpid(),))
    try:
        futures = {pool.submit(analyse_one, it, options, names[i], labels[i]): i
                   for i, it in enumerate(items)}
        from concurrent.futures import as_completed

        for fut in as_completed(futures):
            i = futures[fut]
            try:
                out = fut.result()
            except Exception as exc:  # the worker process itself died
                out = Outcome(paths[i], None, f"{paths[i]}: worker failed: {type(exc).__name__}: {exc}")
            finished(i, out)
    except BaseException:
        if own:
            _stop_workers(pool)  # an interruption or a failing callback: no worker carries on
        raise
    if own:
        pool.shutdown(wait=True)
    return outcomes  # type: ignore[return-value]
