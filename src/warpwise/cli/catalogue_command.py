"""``warpwise catalogue``: many profiles in parallel, the good rows written, failures listed."""

from __future__ import annotations

import argparse
import sys
import time
from pathlib import Path
from typing import TYPE_CHECKING

from ..errors import UsageError
from ..report.outputs import Output, check_outputs, staged_folder, write_outputs
from .commands import EXIT_INPUT, _inputs, _missed_exit, _table_units, _warn
from .options import analysis_options, read_options

if TYPE_CHECKING:
    from ..catalogue import Outcome


class _Progress:
    """Progress on stderr: a bar on a terminal, plain lines otherwise."""

    def __init__(self, total: int) -> None:
        self.total = total
        self.tty = sys.stderr.isatty()
        self.start = time.perf_counter()

    def __call__(self, out: Outcome, done: int, total: int) -> None:
        from ..io.progress import bar

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
            Output("--html", args.html, folder=True, to_stdout=False, what="a folder")]


def _jobs(asked: int | None, total: int) -> int:
    """Worker processes for ``total`` profiles, with a note when fewer than asked."""
    from ..catalogue import usable_cpus, worker_count

    jobs = worker_count(asked, total)
    if asked is not None and jobs < asked:
        cpus = usable_cpus()
        print(f"warpwise: note: --jobs {asked} capped to {jobs} ({total} profile"
              f"{'s' if total != 1 else ''}, {cpus} CPU{'s' if cpus != 1 else ''})", file=sys.stderr)
    return jobs


def run_catalogue_command(args: argparse.Namespace) -> int:
    """``warpwise catalogue``: every profile analysed; good rows written; failures listed.

    Every output path is checked before any analysis; the datasheets are built in a staging
    folder, and all outputs are written together at the end.
    """
    if not (args.csv or args.json or args.html):
        raise UsageError("say where the results go: --csv OUT, --json OUT and/or --html DIR")
    from dataclasses import replace

    from ..catalogue import RunOptions, catalogue_items, run_catalogue
    from ..report.files import csv_text, json_text

    wanted = _catalogue_outputs(args)
    check_outputs(wanted, _inputs(args, args.items))
    options = RunOptions(read=read_options(args), analysis=analysis_options(args))
    with staged_folder(args.html) as stage:
        if stage is not None:
            options = replace(options, datasheet_dir=str(stage), report_units=args.report_units)
        items = catalogue_items(args.items, options, exclude=[f for f in (args.csv, args.json) if f])
        check_outputs(wanted, [it.path for it in items])  # the drawings a manifest names
        jobs = _jobs(args.jobs, len(items))
        outcomes = run_catalogue(items, options, jobs=jobs, on_done=_Progress(len(items)))
        good = [o for o in outcomes if o.ok]
        bad = [o for o in outcomes if not o.ok]
        _warn([o.record for o in good])
        units = _table_units([o.record for o in good], args.report_units) if good else "mm"
        files = [(args.csv, csv_text([o.record for o in good], units=units) if args.csv else ""),
                 (args.json, json_text([o.record.in_units(units) for o in good]) if args.json
                  else "")] if good else []
        if stage is not None:
            from ..report.html import write_catalogue_index

            write_catalogue_index(outcomes, stage, units)
        seconds = sum(o.seconds for o in outcomes)
        print(f"{len(good)} of {len(outcomes)} profiles analysed ({seconds:.1f} s of analysis)",
              file=sys.stderr)
        for o in bad:
            print(f"warpwise: error: {o.error}", file=sys.stderr)
        write_outputs(files, [(stage, args.html)])
    return EXIT_INPUT if bad else _missed_exit([o.record for o in good])
