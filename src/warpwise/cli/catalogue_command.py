"""``warpwise catalogue``: many profiles to one table and datasheets, resumable, on a cluster."""

from __future__ import annotations

import argparse
import sys
import time
from dataclasses import replace
from pathlib import Path

from ..catalogue import Outcome, RunOptions, catalogue_items, run_catalogue, usable_cpus, worker_count
from ..errors import UsageError
from ..io.progress import bar
from ..report.files import csv_text, json_text
from ..report.outputs import Output, check_outputs, staged_folder, write_outputs
from .commands import EXIT_INPUT, _inputs, _missed_exit, _table_units, _warn
from .options import analysis_options, read_options


def kept_note() -> str:
    """What an interrupted catalogue run kept for the next, or ''."""
    from ..catalogue.journal import KEPT

    if not KEPT:
        return ""
    path, count = KEPT[-1]
    return (f"; {count} analysed profile{'s' if count != 1 else ''} kept in {path}: the same "
            "command goes on from there (--fresh starts again)")


class _Progress:
    """Progress on stderr: a bar on a terminal, plain lines otherwise."""

    def __init__(self, total: int) -> None:
        self.total = total
        self.tty = sys.stderr.isatty()
        self.start = time.perf_counter()

    def __call__(self, out: Outcome, done: int, total: int) -> None:
        state = "ok" if out.ok else "failed"
        if self.tty:
            sys.stderr.write(f"\r{bar(done, total)} {done}/{total} {Path(out.path).name[:40]:<40}")
            if done == total:
                sys.stderr.write("\n")
        else:
            sys.stderr.write(f"{done}/{total} {out.path}: {state} ({out.seconds:.2f} s)\n")
        sys.stderr.flush()


def _catalogue_outputs(args: argparse.Namespace) -> list[Output]:
    """The outputs of a catalogue run."""
    return [Output("--csv", args.csv), Output("--json", args.json),
            Output("--xlsx", args.xlsx, to_stdout=False),
            Output("--pdf", args.pdf, to_stdout=False),
            Output("--html", args.html, folder=True, to_stdout=False, what="a folder")]


def _jobs(asked: int | None, total: int) -> int:
    """Worker processes for ``total`` profiles, with a note when fewer than asked."""
    jobs = worker_count(asked, total)
    if asked is not None and jobs < asked:
        cpus = usable_cpus()
        print(f"warpwise: note: --jobs {asked} capped to {jobs} ({total} profile"
              f"{'s' if total != 1 else ''}, {cpus} CPU{'s' if cpus != 1 else ''})", file=sys.stderr)
    return jobs


def _journal_of(args: argparse.Namespace, stage: Path | None) -> Path | None:
    """Where a catalogue run keeps its finished profiles (None: nowhere to keep them)."""
    from ..catalogue.journal import journal_path
    from ..report.outputs import is_stdout

    if stage is not None:
        return stage / JOURNAL_IN_STAGE
    first = next((f for f in (args.csv, args.json, args.xlsx, args.pdf) if f and not is_stdout(f)), None)
    return None if first is None else journal_path(first)


#: File name of the journal inside the kept staging folder of a run with --html.
JOURNAL_IN_STAGE = ".journal"


def _run_items(args: argparse.Namespace, items: list, options: RunOptions,
               journal: Path | None) -> list[Outcome]:
    """Run the catalogue here, in a process pool or on the cluster the options name."""
    if journal is not None and args.fresh:
        journal.unlink(missing_ok=True)
    if args.cluster is None:
        return run_catalogue(items, options, jobs=_jobs(args.jobs, len(items)),
                             on_done=_Progress(len(items)), journal=journal)
    from ..catalogue import LOCAL_CLUSTER, cluster_executor

    if args.html and args.cluster != LOCAL_CLUSTER:
        raise UsageError("--html with a remote --cluster: the workers write the datasheets to "
                         "this machine's disk; use --cluster local, or leave out --html")
    with cluster_executor(args.cluster, args.jobs) as executor:
        return run_catalogue(items, options, executor=executor, on_done=_Progress(len(items)),
                             journal=journal)


def _drop_stale_pages(stage: Path, outcomes: list[Outcome]) -> None:
    """Remove the pages of an earlier run in a kept staging folder that this run has not made."""
    mine = {Path(o.datasheet).name for o in outcomes if o.datasheet}
    for page in stage.iterdir():
        if page.is_file() and page.name not in mine and page.name != JOURNAL_IN_STAGE:
            page.unlink()


def workbook_of(good: list[Outcome], bad: list[Outcome], options: RunOptions, units: str) -> bytes:
    """The XLSX workbook of a run: properties, failures and the materials the rows name."""
    from ..materials import resolve
    from ..report.workbook import workbook_bytes

    records = [o.record for o in good]
    names = sorted({n for r in records for n in r.materials if n})
    materials = resolve(list(names), options.analysis.materials) if names else []
    return workbook_bytes(records, [(o.path, o.error or "") for o in bad], materials or [], units)


def pdf_pages(good: list[Outcome], units: str | None) -> bytes:
    """The PDF datasheets of a run, one page per analysed profile (in its own units by default)."""
    from ..report.pdf_sheet import pdf_bytes, sheet_profile

    return pdf_bytes([sheet_profile(o.record, o.loops or (), units) for o in good])


def run_catalogue_command(args: argparse.Namespace) -> int:
    """``warpwise catalogue``: every profile analysed; good rows written; failures listed.

    Every output path is checked before any analysis; the datasheets are built in a staging
    folder, and all outputs are written together at the end. Each analysed profile is kept in
    a journal as it finishes (:mod:`warpwise.catalogue.journal`), so that an interrupted run goes on
    where it stopped when the same command is given again.
    """
    from ..catalogue.journal import KEPT

    if not (args.csv or args.json or args.xlsx or args.pdf or args.html):
        raise UsageError("say where the results go: --csv OUT, --json OUT, --xlsx OUT.xlsx, "
                         "--pdf OUT.pdf and/or --html DIR")
    wanted = _catalogue_outputs(args)
    check_outputs(wanted, _inputs(args, args.items))
    options = RunOptions(read=read_options(args), analysis=analysis_options(args),
                         outlines=bool(args.pdf))
    KEPT.clear()
    with staged_folder(args.html, keep=True) as stage:
        if stage is not None:
            options = replace(options, datasheet_dir=str(stage), report_units=args.report_units)
        items = catalogue_items(args.items, options,
                                exclude=[f for f in (args.csv, args.json, args.xlsx, args.pdf)
                                         if f])
        check_outputs(wanted, [it.path for it in items])  # the drawings a manifest names
        journal = _journal_of(args, stage)
        outcomes = _run_items(args, items, options, journal)
        good = [o for o in outcomes if o.ok]
        bad = [o for o in outcomes if not o.ok]
        _warn([o.record for o in good])
        units = _table_units([o.record for o in good], args.report_units) if good else "mm"
        files = [(args.csv, csv_text([o.record for o in good], units=units) if args.csv else ""),
                 (args.json, json_text([o.record.in_units(units) for o in good]) if args.json
                  else ""),
                 (args.xlsx, workbook_of(good, bad, options, units) if args.xlsx else b""),
                 (args.pdf, pdf_pages(good, args.report_units) if args.pdf else b"")] \
            if good else []
        if stage is not None:
            from ..report.html import write_catalogue_index

            _drop_stale_pages(stage, outcomes)
            write_catalogue_index(outcomes, stage, units)
        seconds = sum(o.seconds for o in outcomes)
        print(f"{len(good)} of {len(outcomes)} profiles analysed ({seconds:.1f} s of analysis)",
              file=sys.stderr)
        for o in bad:
            print(f"warpwise: error: {o.error}", file=sys.stderr)
        if journal is not None:
            KEPT.clear()
            journal.unlink(missing_ok=True)  # the outputs below are the run's result
        write_outputs(files, [(stage, args.html)])
    return EXIT_INPUT if bad else _missed_exit([o.record for o in good])
