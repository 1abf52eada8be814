"""A catalogue run: every item analysed here, in a process pool or on any executor, with a journal."""

from __future__ import annotations

import os
from collections.abc import Callable, Sequence
from concurrent.futures import FIRST_COMPLETED, Executor, ProcessPoolExecutor, wait
from dataclasses import replace
from pathlib import Path

from ..properties.analysis import ELEMENT_BUDGET
from .items import Item, Outcome, RunOptions
from .workers import _stop_workers, _worker_start, analyse_one, worker_count


def _settings(item: Item, options: RunOptions, sheet: str | None, label: str | None) -> str:
    """What besides its content decides a profile's row and page (for the journal's key).

    The element limit is left out (a machine's default follows its free memory); an entry is
    taken only when its mesh is within the run's limit (:func:`_reusable`).
    """
    own = item.options or options
    own = replace(own, datasheet_dir=None, analysis=replace(own.analysis, max_elements=1))
    return repr((own, item.name, item.description, sheet, label, bool(options.datasheet_dir),
                 options.report_units))


def _reusable(entry: Outcome, options: RunOptions) -> bool:
    """Whether a journal's entry stands for this run: its mesh within the limit, its page there."""
    rec = entry.record
    if rec.elements > options.analysis.max_elements:
        return False
    if rec.target is not None and rec.target.stopped == ELEMENT_BUDGET:
        return False  # a refinement the limit stopped may go further now
    if options.outlines and entry.loops is None:
        return False
    if options.datasheet_dir:
        return entry.datasheet is not None and (Path(options.datasheet_dir) / entry.datasheet).is_file()
    return True


#: Profiles in flight per worker: enough to keep every worker busy, few enough that a big
#: catalogue's pending work does not pile up in memory.
IN_FLIGHT_PER_WORKER = 4
#: Profiles in flight on an executor of unknown size (a cluster).
IN_FLIGHT_CLUSTER = 1024


def run_catalogue(files: Sequence[str | Path | Item], options: RunOptions | None = None, *,
                  executor: Executor | None = None, jobs: int | None = None,
                  on_done: Callable[[Outcome, int, int], None] | None = None,
                  journal: str | Path | None = None) -> list[Outcome]:
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
    journal : str or Path, optional
        File each analysed profile is written to as it finishes (:mod:`warpwise.catalogue.journal`);
        profiles already in it with an unchanged key are taken from it, not analysed again.
        It stays when the run is interrupted; the caller removes it once its outputs are
        written.

    Returns
    -------
    list of Outcome
    """
    from .journal import JournalWriter, profile_key, read_journal

    options = options or RunOptions()
    items = [f if isinstance(f, Item) else Item(str(f)) for f in files]
    paths = [it.path for it in items]
    names: list[str | None] = [None] * len(paths)
    labels: list[str | None] = [None] * len(paths)
    if options.datasheet_dir:
        from ..report.html import relative_names, unique_filenames

        names, labels = list(unique_filenames(paths)), list(relative_names(paths))
    total = len(paths)
    outcomes: list[Outcome | None] = [None] * total
    done = 0
    keys: list[str | None] = [None] * total
    known: dict = {}
    writer = None
    if journal is not None:
        known = read_journal(Path(journal))
        keys = [profile_key(it.path, _settings(it, options, names[i], labels[i]))
                for i, it in enumerate(items)]
        writer = JournalWriter(Path(journal), len(known))

    def finished(i: int, out: Outcome, fresh: bool = True) -> None:
        nonlocal done
        outcomes[i] = out
        done += 1
        if fresh and writer is not None and out.ok and keys[i] is not None:
            writer.add(keys[i], out)
        if on_done is not None:
            on_done(out, done, total)

    try:
        todo = []
        for i in range(total):
            entry = known.get(keys[i]) if keys[i] else None
            if entry is not None and _reusable(entry, options):
                page = None if entry.datasheet is None else str(Path(options.datasheet_dir or "")
                                                                / entry.datasheet)
                finished(i, replace(entry, path=paths[i], datasheet=page), fresh=False)
            else:
                todo.append(i)
        _run_items(todo, items, options, names, labels, executor, jobs, finished)
    finally:
        if writer is not None:
            writer.close()
    return outcomes  # type: ignore[return-value]


def _run_items(todo: list[int], items: list[Item], options: RunOptions,
               names: list[str | None], labels: list[str | None], executor: Executor | None,
               jobs: int | None, finished: Callable[[int, Outcome], None]) -> None:
    """Analyse the items ``todo`` (indices) serially, in a process pool or on ``executor``."""
    if not todo:
        return
    workers = worker_count(jobs, len(todo))
    if executor is None and workers == 1:
        for i in todo:
            finished(i, analyse_one(items[i], options, names[i], labels[i]))
        return
    own = executor is None
    pool = executor if executor is not None else ProcessPoolExecutor(
        max_workers=workers, initializer=_worker_start, initargs=(os.getpid(),))
    window = workers * IN_FLIGHT_PER_WORKER if own else IN_FLIGHT_CLUSTER
    try:
        pending: dict = {}
        queue = iter(todo)
        for i in queue:
            pending[pool.submit(analyse_one, items[i], options, names[i], labels[i])] = i
            if len(pending) >= window:
                break
        while pending:
            ready, _ = wait(pending, return_when=FIRST_COMPLETED)
            for fut in ready:
                i = pending.pop(fut)
                try:
                    out = fut.result()
                except Exception as exc:  # the worker process itself died
                    out = Outcome(items[i].path, None,
                                  f"{items[i].path}: worker failed: {type(exc).__name__}: {exc}")
                finished(i, out)
                nxt = next(queue, None)
                if nxt is not None:
                    pending[pool.submit(analyse_one, items[nxt], options, names[nxt],
                                        labels[nxt])] = nxt
    except BaseException:
        if own:
            _stop_workers(pool)  # an interruption or a failing callback: no worker carries on
        raise
    if own:
        pool.shutdown(wait=True)
