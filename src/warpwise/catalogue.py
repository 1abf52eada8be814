"""Catalogue runs: many profiles analysed, one row each, failures collected, never fatal.

:func:`run_catalogue` analyses files in any :class:`concurrent.futures.Executor` (a process pool
by default; pass a Dask ``distributed`` client's executor to spread a big catalogue over a
cluster) and returns one :class:`Outcome` per file in input order. A profile that fails gives an
outcome with its one-line error; the others are unaffected.

Examples
--------
>>> from pathlib import Path
>>> files = collect_files([Path("sample_sections")])
>>> len(files) >= 8
True
"""

from __future__ import annotations

import time
from collections.abc import Callable, Iterable, Sequence
from concurrent.futures import Executor, ProcessPoolExecutor
from dataclasses import dataclass, field
from pathlib import Path

from .errors import UsageError, WarpwiseError
from .io.options import ReadOptions
from .properties.run import AnalysisOptions

#: File endings taken from a folder: DXF drawings and coordinate outlines.
PROFILE_ENDINGS = (".dxf", ".txt", ".xy", ".csv", ".dat")


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


def collect_files(items: Iterable[str | Path]) -> list[Path]:
    """Files of a catalogue: each folder's profile files (sorted by name), then the files given.

    Raises
    ------
    UsageError
        For a path that does not exist or a folder without profile files.
    """
    out: list[Path] = []
    for item in items:
        p = Path(item)
        if p.is_dir():
            found = sorted(f for f in p.iterdir() if f.is_file() and f.suffix.lower() in PROFILE_ENDINGS)
            if not found:
                raise UsageError(f"no profile files ({', '.join(PROFILE_ENDINGS)}) in the folder",
                                 file=str(p))
            out.extend(found)
        elif p.exists():
            out.append(p)
        else:
            raise UsageError("file or folder not found", file=str(p))
    return out


def analyse_one(path: str, options: RunOptions, sheet_name: str | None = None) -> Outcome:
    """Read and analyse one file; every user-input error is caught into the outcome.

    This is the worker function of a catalogue (picklable, top level).
    """
    from .properties.run import run_analysis
    from .report.records import record_of

    start = time.perf_counter()
    try:
        result = run_analysis(options.read.load(path), options.analysis)
        sheet = thumb = None
        if options.datasheet_dir:
            from .report.html import thumbnail_svg, write_datasheet
            from .stress import torsion_stress
            from .units import MOMENT, convert

            shown = options.report_units or result.units
            unit_torque = convert(1.0, MOMENT, shown, result.units)  # 1 in the page's units
            sheet = str(write_datasheet(result, options.datasheet_dir,
                                        torsion=torsion_stress(result, unit_torque),
                                        nominal_torque=True, filename=sheet_name, units=shown))
            thumb = thumbnail_svg(result)
        return Outcome(path, record_of(result), None, time.perf_counter() - start, sheet, thumb)
    except WarpwiseError as exc:
        return Outcome(path, None, str(exc.with_file(path)), time.perf_counter() - start)
    except MemoryError:
        return Outcome(path, None, f"{path}: out of memory; give a larger --mesh-size",
                       time.perf_counter() - start)
    except Exception as exc:  # a bug must not stop the other profiles
        return Outcome(path, None, f"{path}: internal error: {type(exc).__name__}: {exc}",
                       time.perf_counter() - start)


def run_catalogue(files: Sequence[str | Path], options: RunOptions | None = None, *,
                  executor: Executor | None = None, jobs: int | None = None,
                  on_done: Callable[[Outcome, int, int], None] | None = None) -> list[Outcome]:
    """Analyse every file; return the outcomes in the order of ``files``.

    Parameters
    ----------
    files : sequence of str or Path
        Profile files.
    options : RunOptions, optional
        Reading and analysis options.
    executor : concurrent.futures.Executor, optional
        Where to run the work (any executor: a process pool, a thread pool, a Dask
        ``distributed.Client.get_executor()``). Default: a process pool of ``jobs`` workers,
        or serial in this process when ``jobs`` is 1.
    jobs : int, optional
        Worker processes of the default pool (default: the number of CPUs).
    on_done : callable, optional
        Called as ``on_done(outcome, done, total)`` as each profile finishes.

    Returns
    -------
    list of Outcome
    """
    options = options or RunOptions()
    paths = [str(f) for f in files]
    names: list[str | None] = [None] * len(paths)
    if options.datasheet_dir:
        from .report.html import unique_filenames

        names = list(unique_filenames(paths))
    total = len(paths)
    outcomes: list[Outcome | None] = [None] * total
    done = 0

    def finished(i: int, out: Outcome) -> None:
        nonlocal done
        outcomes[i] = out
        done += 1
        if on_done is not None:
            on_done(out, done, total)

    if executor is None and (jobs == 1 or total <= 1):
        for i, p in enumerate(paths):
            finished(i, analyse_one(p, options, names[i]))
        return outcomes  # type: ignore[return-value]
    own = executor is None
    pool = executor if executor is not None else ProcessPoolExecutor(max_workers=jobs)
    try:
        futures = {pool.submit(analyse_one, p, options, names[i]): i for i, p in enumerate(paths)}
        from concurrent.futures import as_completed

        for fut in as_completed(futures):
            i = futures[fut]
            try:
                out = fut.result()
            except Exception as exc:  # the worker process itself died
                out = Outcome(paths[i], None, f"{paths[i]}: worker failed: {type(exc).__name__}: {exc}")
            finished(i, out)
    finally:
        if own:
            pool.shutdown(wait=True, cancel_futures=True)
    return outcomes  # type: ignore[return-value]
