"""The commands of ``warpwise``: each turns parsed options into library calls and output."""

from __future__ import annotations

import argparse
import os
import sys
from collections.abc import Sequence
from typing import TYPE_CHECKING

from ..errors import UsageError, WarpwiseError
from ..report import outputs
from ..report.outputs import STDOUT, Output, check_outputs, write_outputs
from .options import analysis_options, build_parser, read_options

if TYPE_CHECKING:
    from ..properties.analysis import SectionResult
    from ..report.records import Record
    from ..stress import Loads
    from .axis_output import AxisRequest

# Each command imports what it needs inside its function: ``warpwise props`` on an outline
# file never loads the DXF reader (ezdxf), the catalogue's process pool, the member solver
# (scipy.optimize), the stress recovery or matplotlib (tests/cli/test_start_up.py).

EXIT_INPUT = 1
EXIT_USAGE = 2
EXIT_INTERNAL = 3
#: A --target-error that the adaptive refinement did not reach (the results are written).
#: A catalogue where profiles also failed exits with EXIT_INPUT: a failure outranks a miss.
EXIT_TARGET = 4


def _analyse_file(path: str, args: argparse.Namespace, *, bounds: bool = True) -> SectionResult:
    """Read one file and analyse it with the command's options."""
    from ..properties.run import run_analysis

    return run_analysis(read_options(args).load(path), analysis_options(args, bounds=bounds))


def _loads(args: argparse.Namespace) -> Loads:
    """The loads as given, in the report's unit system."""
    from ..stress.loads import Loads

    return Loads(N=args.axial, Mx=args.moment_x, My=args.moment_y, Vx=args.shear_x,
                 Vy=args.shear_y, T=args.torque, B=args.bimoment)


def _given_modulus(args: argparse.Namespace) -> float | None:
    """G from --shear-modulus or --youngs-modulus with --poisson, report units (None: not given)."""
    if args.shear_modulus is None and getattr(args, "youngs_modulus", None) is None:
        return None
    from ..stress.loads import shear_modulus

    return shear_modulus(args.shear_modulus, getattr(args, "youngs_modulus", None), args.poisson)


def _in_profile_units(args: argparse.Namespace, result: SectionResult) -> tuple[Loads, float | None]:
    """Loads and the given G from the report's unit system into the profile's."""
    from ..materials import check_plausible
    from ..units import STRESS, convert

    given = args.report_units or result.units
    G = _given_modulus(args)
    if G is not None:
        check_plausible("G", convert(G, STRESS, given, "mm"), where="the shear modulus given")
        G = convert(G, STRESS, given, result.units)
    return _loads(args).converted(given, result.units), G


#: What a picture output takes instead of standard output.
PICTURE = "a file ending in .png, .pdf or .svg"


def _inputs(args: argparse.Namespace, files: Sequence[str]) -> list[str]:
    """Every file the command reads: its FILEs and a --materials table."""
    table = getattr(args, "materials", None)
    return [*files, *([table] if table else [])]


def _check_picture(option: str, path: str | None, args: argparse.Namespace,
                   files: Sequence[str]) -> None:
    """A picture output checked before any work: its path and its ending."""
    check_outputs([Output(option, path, to_stdout=False, what=PICTURE)], _inputs(args, files))
    if path is not None:
        from ..report.plot_files import figure_format

        figure_format(path)


def run_props(args: argparse.Namespace) -> int:
    """``warpwise props``: table or JSON on stdout (or the CSV, with ``--csv -``), optional CSV."""
    if not args.files and not args.shape:
        raise UsageError("give a FILE or a --shape")
    check_outputs([Output("--csv", args.csv), Output("--json", STDOUT if args.json else None),
                   Output("--html", args.html), Output("--pdf", args.pdf, to_stdout=False)],
                  _inputs(args, args.files))
    if args.html and len(args.files) + len(args.shape or ()) != 1:
        raise UsageError("--html writes the datasheet of one profile; for several use "
                         "'warpwise catalogue ... --html DIR'")
    from ..io.progress import Running
    from ..properties.run import run_analysis
    from ..report.records import record_of
    from ..report.table import property_table
    from .axis_output import axis_table
    from .page_output import prints_report
    from .props_output import props_csv, props_datasheet, props_json

    reading, options = read_options(args), analysis_options(args)
    profiles = [reading.load(f) for f in args.files]
    if args.shape:
        from ..geometry.shapes import shape_from_spec

        profiles += [shape_from_spec(spec, units=args.units or "mm") for spec in args.shape]
    results = []
    with Running("analysing") as running:
        for k, p in enumerate(profiles, 1):
            running.step(f"analysing {p.source} ({k} of {len(profiles)})")
            results.append(run_analysis(p, options))
    records = [record_of(r) for r in results]
    _warn(records)
    axes = _about_axis(args, results)
    table = props_csv(records, _table_units(records, args.report_units), axes) \
        if args.csv else ""
    shown = [r.in_units(args.report_units or r.units) for r in records]
    text = props_json(records, args.report_units, axes) if args.json else \
        "\n".join(axis_table(property_table(r), a, args.report_units)
                  for r, a in zip(shown, axes or [None] * len(shown), strict=True))
    sheet = props_datasheet(results[0], args.report_units, axes) if args.html else None
    pages = b""
    if args.pdf:
        from ..report.pdf_sheet import pdf_bytes, profile_loops, sheet_profile

        pages = pdf_bytes([sheet_profile(rec, profile_loops(res.profile.regions), args.report_units)
                           for rec, res in zip(records, results, strict=True)])
    if prints_report(args):  # the CSV or the page on standard output take its place
        sys.stdout.write(text)
    write_outputs([(args.csv, table), (args.html, sheet), (args.pdf, pages)])
    return _missed_exit(records)


def _about_axis(args: argparse.Namespace, results: list[SectionResult]) -> list[AxisRequest]:
    """``--about-axis`` (and ``--fibre``) of each result, in its profile's units ([] if not asked).

    The point and fibres are given in the report's unit system (each profile's own by default).
    """
    if args.about_axis is None:
        if args.fibre:
            raise UsageError("--fibre needs --about-axis (the axis its section modulus is about)")
        return []
    import numpy as np

    from ..properties.about_axis import axis_properties
    from ..units import Converter, system

    out = []
    for r in results:
        into = Converter(system(args.report_units or r.units).length, r.units)
        x0, y0, angle = args.about_axis
        fibres = [into.point(f) for f in args.fibre or ()]
        inside = r.profile.covers(fibres) if fibres else np.ones(0, bool)
        if not inside.all():
            x, y = (args.fibre or [])[int(np.argmin(inside))]
            raise UsageError(f"fibre ({x:g}, {y:g}) {into.source} is outside the section; a "
                                 "section modulus is to a point of the material (drawing "
                                 "coordinates in the report's length unit)", file=r.profile.source)
        out.append((axis_properties(r.weighted, into.point((x0, y0)), angle, fibres), r.units))
    return out


def _missed_exit(records: list[Record]) -> int:
    """EXIT_TARGET when any profile missed its target error, else 0."""
    return EXIT_TARGET if any(r.target_missed for r in records) else 0


def _warn(records: list[Record]) -> None:
    """Every doubt about the inputs, one line each on stderr; each material note once."""
    for rec in records:
        for w in rec.warnings:
            print(f"warpwise: warning: {rec.source}: {w}", file=sys.stderr)
    for note in dict.fromkeys(n for rec in records for n in rec.material_notes):
        print(f"warpwise: note: {note}", file=sys.stderr)


def _table_units(records: list[Record], chosen: str | None) -> str:
    """The one unit system of a table over several profiles, said on stderr when mixed."""
    from ..report.records import report_units

    units = report_units([r.units for r in records], chosen)
    found = sorted({r.units for r in records})
    if chosen is None and len(found) > 1:
        print(f"warpwise: note: the profiles are in {' and '.join(found)}; the table is in the "
              f"{units} system (choose with --report-units)", file=sys.stderr)
    return units


def run_load_cases(args: argparse.Namespace) -> int:
    """``warpwise stress --load-cases FILE``: one results table over every case."""
    if any(_loads(args).__dict__.values()) or args.at:
        raise UsageError("--load-cases takes the loads from its file: give no load options "
                         "or --at with it")
    from ..report.records import record_of
    from ..stress.case_results import case_results
    from ..stress.cases import read_load_cases
    from ..stress.recovery import reference_shear_modulus
    from ..units import Converter
    from .case_output import cases_csv, cases_json, cases_text
    from .page_output import page_outputs, prints_report, stress_html

    check_outputs([Output("--csv", args.csv), *page_outputs(args)],
                  [*_inputs(args, [args.file]), args.load_cases])
    cases = read_load_cases(args.load_cases)
    _given_modulus(args)
    result = _analyse_file(args.file, args, bounds=False)
    _warn([record_of(result)])
    _, G = _in_profile_units(args, result)
    G = reference_shear_modulus(result, G)
    given = cases.units or args.report_units or result.units
    loads = [c.converted(given, result.units) for c in cases.loads]
    if G is None and any(c.T for c in loads):
        raise UsageError("a torque needs a material: give --material, or the shear modulus G, "
                         "or E with Poisson's ratio")
    rows = case_results(result, cases.names, loads, G)
    v = Converter.of(result.units, args.report_units)
    table = cases_csv(rows, v) if args.csv else ""
    obj = cases_json(args.file, args.load_cases, rows, v) if args.json or args.html else ""
    if prints_report(args):
        sys.stdout.write(obj if args.json else cases_text(args.file, args.load_cases, rows, v))
    write_outputs([(args.csv, table), (args.html, stress_html(obj) if args.html else "")])
    return 0


def run_stress(args: argparse.Namespace) -> int:
    """``warpwise stress``: stresses for a torque, shear forces, axial force and moments."""
    if args.load_cases:
        return run_load_cases(args)
    from ..report.records import record_of
    from .page_output import page_outputs, prints_report, stress_html

    if args.csv:
        raise UsageError("--csv writes the table of --load-cases: give a load-case file")
    if not any(_loads(args).__dict__.values()):
        raise UsageError("give a load: --torque, --shear-x, --shear-y, --axial, --moment-x, "
                         "--moment-y and/or --bimoment")
    _given_modulus(args)  # a bad modulus is refused before the analysis
    check_outputs(page_outputs(args), _inputs(args, [args.file]))
    result = _analyse_file(args.file, args, bounds=False)
    _warn([record_of(result)])
    obj, text, stress = stress_report(args, result, args.file)
    picture = _stress_figure(args, result, stress)
    if prints_report(args):
        sys.stdout.write(text)
    write_outputs([(args.html, stress_html(obj, picture) if args.html else "")])
    return 0


def stress_report(args: argparse.Namespace, result: SectionResult, file: str,
                  figure: bool = False):
    """The JSON and text of ``stress`` for an analysed result, and the stress to draw.

    The stress to draw is the combined stress, or the torsion stress of a torque when a
    picture is wanted (``--html``, or ``figure``), else None. Shared by the command and the
    workbench (:mod:`warpwise.workbench`).
    """
    from ..stress import combined_stress, shear_stress, torsion_stress
    from ..stress.points import normal_extremes, stress_at_points
    from ..stress.recovery import reference_shear_modulus
    from ..units import Converter, system
    from .stress_output import combined_json, combined_text, shear_json, shear_text

    loads, G = _in_profile_units(args, result)
    G = reference_shear_modulus(result, G)
    if loads.T != 0 and G is None:
        raise UsageError("a torque needs a material: give --material, or the shear modulus G, "
                         "or E with Poisson's ratio")
    units = args.report_units
    if result.composite or loads.N or loads.Mx or loads.My or loads.B or args.at:
        c = combined_stress(result, loads, G)
        into = Converter(system(units or result.units).length, result.units)
        at = stress_at_points(result, loads, [into.point(p) for p in args.at],
                              shown=args.at) if args.at else None
        extremes = normal_extremes(result, c)
        obj = combined_json(file, result, c, G, units, extremes, at)
        return obj, obj if args.json else combined_text(file, result, c, units, extremes, at), c
    s = shear_stress(result, loads.T, loads.Vx, loads.Vy, G)
    obj = shear_json(file, result, s, G, units)
    drawn = torsion_stress(result, loads.T, G) if (args.html or figure) and loads.T else None
    return obj, obj if args.json else shear_text(file, result, s, G, units), drawn


def _stress_figure(args: argparse.Namespace, result: SectionResult, stress):
    """The picture of the stresses on the ``--html`` page (None when no page or no stress)."""
    if not args.html or stress is None:
        return None
    from ..report.plots import figure_combined, figure_torsion

    draw = figure_torsion if hasattr(stress, "torque") else figure_combined
    return draw(result, stress, units=args.report_units)


def run_check(args: argparse.Namespace) -> int:
    """``warpwise check``: the report on stdout; exit code 1 when not analysable."""
    from ..io.check import check_file, format_report

    _check_picture("--plot", args.plot, args, [args.file])
    report = check_file(args.file, read_options(args))
    if args.plot:
        from ..report.check_plot import plot_report

        plot_report(report, args.plot)
    sys.stdout.write(format_report(report))
    if not report.ok:
        fix = f"; analysable with {report.remedies[0].text}" if report.remedies else ""
        more = f" (or {len(report.remedies) - 1} more choices in the report)" \
            if len(report.remedies) > 1 else ""
        print(f"warpwise: error: {report.verdict}{fix}{more}", file=sys.stderr)
        return EXIT_INPUT
    return 0


def run_catalogue_command(args: argparse.Namespace) -> int:
    """``warpwise catalogue`` (:mod:`.catalogue_command`, loaded for that command only)."""
    from .catalogue_command import run_catalogue_command as run

    return run(args)


def run_plot(args: argparse.Namespace) -> int:
    """``warpwise plot``: one picture of a profile."""
    from ..report.plots import (
        figure_combined,
        figure_outline,
        figure_torsion,
        figure_warping,
        save_figure,
    )
    from ..stress import combined_stress, torsion_stress
    from ..stress.loads import Loads

    _check_picture("-o", args.output, args, [args.file])
    result = _analyse_file(args.file, args, bounds=False)
    loads, G = _in_profile_units(args, result)
    if args.show == "mesh":
        fig = figure_outline(result, show_mesh=True, units=args.report_units)
    elif args.show == "warping":
        fig = figure_warping(result, units=args.report_units)
    elif args.show == "torsion":
        torque = loads.T if loads.T else Loads(T=1.0).converted(
            args.report_units or result.units, result.units).T
        fig = figure_torsion(result, torsion_stress(result, torque, G), units=args.report_units)
    else:
        fig = figure_combined(result, combined_stress(result, loads, G),
                              units=args.report_units)
    save_figure(fig, args.output)
    return 0


def run_member(args: argparse.Namespace) -> int:
    """``warpwise member``: torsion with restrained warping along a member."""
    import numpy as np

    from ..member import MemberLoads, check_member, extremes, solve_member, stations
    from ..report.records import record_of
    from ..stress.member_stress import governing_stresses
    from ..units import FORCE, LENGTH, MOMENT, convert
    from .member_output import member_csv, member_json, member_text
    from .page_output import member_html, page_outputs, prints_report

    if not args.point_torque and not args.distributed_torque:
        raise UsageError("give a load: --point-torque T@Z and/or --distributed-torque M")
    check_member(args.length, args.ends, MemberLoads(tuple(args.point_torque or ()),
                                                     args.distributed_torque))
    check_outputs([Output("--csv", args.csv), *page_outputs(args),
                   Output("--plot", args.plot, to_stdout=False, what=PICTURE)],
                  _inputs(args, [args.file]))
    _check_picture("--plot", args.plot, args, [args.file])
    if not args.material and not args.layer_material:
        raise UsageError("a member needs E and G: give --material (built in, or with "
                         "--materials FILE.toml)")
    result = _analyse_file(args.file, args, bounds=False)
    record = record_of(result)
    _warn([record])
    given = args.report_units or result.units
    length = convert(args.length, LENGTH, given, result.units)
    torques = tuple((convert(T, MOMENT, given, result.units),
                     convert(z, LENGTH, given, result.units)) for T, z in args.point_torque or ())
    loads = MemberLoads(torques, convert(args.distributed_torque, FORCE, given, result.units))
    member = solve_member(length, record.values["GJ"], record.values["ECw"], args.ends, loads)
    at = member.actions(stations(member, args.stations))
    top = extremes(member)
    sections = governing_stresses(result, member, top)
    shown = (args.file, member, at, top, args.report_units, result.units, sections)
    obj = member_json(*shown) if args.json or args.html else ""
    text = obj if args.json else member_text(*shown)
    figure = None
    if args.plot or args.html:
        from ..report.plot_files import save_figure
        from ..report.plot_member import figure_member

        along = member.actions(np.union1d(np.linspace(0.0, member.length, 801), member.starts))
        figure = figure_member(along, args.file, args.report_units, result.units)
        if args.plot:
            save_figure(figure, args.plot)
    if prints_report(args):
        sys.stdout.write(text)
    write_outputs([(args.csv, member_csv(at, top, args.report_units, result.units)
                    if args.csv else ""),
                   (args.html, member_html(obj, figure, record.warnings) if args.html else "")])
    return 0


def run_shapes(args: argparse.Namespace) -> int:
    """``warpwise shapes``: the parametric profiles and their parameters."""
    from ..geometry.shapes import describe_shapes

    sys.stdout.write(describe_shapes() + "\n")
    return 0


def run_workbench(args: argparse.Namespace) -> int:
    """``warpwise workbench``: serve the workbench until Ctrl-C (:mod:`warpwise.workbench`)."""
    if not 0 <= args.port <= 65535:
        raise UsageError(f"--port must be 0 to 65535, got {args.port}")
    try:
        from ..workbench.server import ServeOptions, serve
    except ImportError as exc:
        raise UsageError(f"the workbench needs {exc.name}: install warpwise with its "
                         "dependencies (pip install -e .)") from None
    serve(ServeOptions(args.address, args.port, not args.no_browser, args.workers))
    return 0


COMMANDS = {"props": run_props, "stress": run_stress, "check": run_check,
            "catalogue": run_catalogue_command, "plot": run_plot, "shapes": run_shapes,
            "member": run_member, "workbench": run_workbench}


def main(argv: Sequence[str] | None = None) -> int:
    """Entry point of the ``warpwise`` command; returns the exit code."""
    argv = sys.argv[1:] if argv is None else [str(a) for a in argv]
    parser = build_parser(argv[0] if argv else None)
    outputs.WRITTEN.clear()
    try:
        args = parser.parse_args(argv)
        return COMMANDS[args.command](args)
    except UsageError as exc:
        print(f"warpwise: error: {exc}", file=sys.stderr)
        return EXIT_USAGE
    except WarpwiseError as exc:
        print(f"warpwise: error: {exc}", file=sys.stderr)
        return EXIT_INPUT
    except KeyboardInterrupt:
        from .catalogue_command import kept_note

        done = f"after writing {', '.join(outputs.WRITTEN)}" if outputs.WRITTEN else \
            "no output written"
        print(f"warpwise: interrupted; {done}{kept_note()}", file=sys.stderr)
        return 130
    except BrokenPipeError:
        return 0
    except Exception as exc:  # a bug: one line unless debugging
        if os.environ.get("WARPWISE_DEBUG"):
            raise
        print(f"warpwise: internal error: {type(exc).__name__}: {exc} "
              "(set WARPWISE_DEBUG=1 for details)", file=sys.stderr)
        return EXIT_INTERNAL
