"""Command line: ``warpwise props``, ``warpwise stress`` and ``warpwise check``.

A thin shell over the Python API. Every user error ends as one line on stderr and a non-zero
exit code (1 for bad input or a failed analysis, 2 for a bad command line); no traceback is
shown unless ``WARPWISE_DEBUG=1`` is set.
"""

from __future__ import annotations

import argparse
import json
import os
import sys
import time
from collections.abc import Sequence
from dataclasses import replace
from pathlib import Path

from .catalogue import Outcome, RunOptions, collect_files, run_catalogue
from .errors import UsageError, WarpwiseError
from .fem.solve import METHODS
from .geometry.profile import LENGTH_UNITS, Profile
from .geometry.shapes import describe_shapes, shape_from_spec
from .io import load_profile
from .io.check import check_file, format_report
from .materials import BUILTIN, read_materials, resolve
from .properties.accuracy import ACCURACY_LEVELS, estimate_errors, refinement_for
from .properties.adapt import refine_adaptively
from .properties.analysis import SectionResult, analyse
from .properties.shear import DEFAULT_POISSON
from .report.check_plot import plot_report
from .report.files import atomic_write, csv_text, json_text
from .report.table import CAUTION, format_value, property_table
from .stress.combined import Loads, combined_stress
from .stress.recovery import shear_modulus, shear_stress

EXIT_INPUT = 1
EXIT_USAGE = 2
EXIT_INTERNAL = 3


class _Parser(argparse.ArgumentParser):
    """Argument parser whose errors are one line and a UsageError."""

    def error(self, message: str) -> None:  # noqa: D102
        raise UsageError(f"{self.prog}: {message} (see --help)")


def _float(text: str) -> float:
    try:
        v = float(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"not a number: {text!r}") from None
    if v != v or abs(v) == float("inf"):
        raise argparse.ArgumentTypeError(f"must be a finite number, got {text}")
    return v


def _positive_float(text: str) -> float:
    v = _float(text)
    if not v > 0:
        raise argparse.ArgumentTypeError(f"must be a positive number, got {text}")
    return v


def _positive_int(text: str) -> int:
    try:
        v = int(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"not a whole number: {text!r}") from None
    if v < 1:
        raise argparse.ArgumentTypeError(f"must be 1 or more, got {text}")
    return v


def _common(p: argparse.ArgumentParser) -> None:
    p.add_argument("--mesh-size", type=_positive_float, metavar="H",
                   help="largest element size in the drawing unit (default: chosen from the profile)")
    p.add_argument("--units", choices=sorted(LENGTH_UNITS),
                   help="length unit of the input coordinates (default: from the file, else mm)")
    _drawing_options(p)


def _drawing_options(p: argparse.ArgumentParser) -> None:
    """Options that choose what of a DXF drawing is the profile."""
    p.add_argument("--layer", action="append", metavar="NAME",
                   help="DXF: take the profile from this layer (repeat for several; default: every "
                        "layer with closed geometry)")
    which = p.add_mutually_exclusive_group()
    which.add_argument("--part", type=_positive_int, metavar="N",
                       help="DXF: analyse only part N of a drawing with several (numbers as listed "
                            "by 'warpwise check', largest area first)")
    which.add_argument("--all-parts", action="store_true",
                       help="DXF: analyse all separate parts together as one section")
    p.add_argument("--chord-tolerance", type=_positive_float, metavar="S",
                   help="DXF: largest distance between a curve and its chords, drawing unit "
                        "(default: tied to the mesh size)")


def _load_options(p: argparse.ArgumentParser) -> None:
    """Section forces, in consistent units (N and N*mm with mm)."""
    for flag, meta, text in (
            ("--torque", "T", "torque about the shear centre, force x length (N*mm with mm)"),
            ("--shear-x", "VX", "shear force along x through the shear centre (N with mm)"),
            ("--shear-y", "VY", "shear force along y through the shear centre (N with mm)"),
            ("--axial", "N", "axial force through the (modulus-weighted) centroid, tension positive"),
            ("--moment-x", "MX", "bending moment about the x axis, positive when it puts +y in tension"),
            ("--moment-y", "MY", "bending moment about the y axis, positive when it puts +x in tension")):
        p.add_argument(flag, type=_float, default=0.0, metavar=meta, help=text)


def _analysis_options(p: argparse.ArgumentParser) -> None:
    """Options of the analysis itself: accuracy, materials, solver."""
    p.add_argument("--accuracy", choices=list(ACCURACY_LEVELS), default="normal",
                   help="mesh fineness: draft (half the elements' density), normal, fine (double)")
    p.add_argument("--material", metavar="NAME",
                   help=f"material of the profile (or of regions without one); built in: "
                        f"{', '.join(BUILTIN)}")
    p.add_argument("--materials", metavar="FILE.toml",
                   help="table of your own materials ([materials.NAME] with E, nu or G, fy, density)")
    p.add_argument("--reference", metavar="NAME",
                   help="reference material of a composite section's transformed properties "
                        "(default: that of the first region)")
    p.add_argument("--solver", choices=list(METHODS), default="auto",
                   help="linear solver (default: chosen by size)")


def build_parser() -> argparse.ArgumentParser:
    """The argument parser of the ``warpwise`` command."""
    parser = _Parser(prog="warpwise", description=(
        "Section properties of bar and extrusion profiles by six-node finite elements. "
        + CAUTION))
    sub = parser.add_subparsers(dest="command", required=True, parser_class=_Parser)

    props = sub.add_parser("props", help="geometric, torsion and warping properties",
                           description="Print the property table of each profile.")
    props.add_argument("files", nargs="*", metavar="FILE", help="DXF drawing(s) or outline file(s)")
    props.add_argument("--shape", action="append", metavar="SPEC",
                       help="a parametric profile instead of a file, e.g. "
                            "'i_section:h=200,b=100,tw=5.6,tf=8.5,r=12' (repeatable; "
                            "'warpwise shapes' lists them)")
    props.add_argument("--json", action="store_true", help="print JSON instead of the table")
    props.add_argument("--csv", metavar="OUT", help="also write one CSV row per profile to OUT")
    props.add_argument("--poisson", type=_float, default=None, metavar="NU",
                       help=f"Poisson's ratio for the shear properties without a material "
                            f"(default {DEFAULT_POISSON})")
    props.add_argument("--estimate-errors", action="store_true",
                       help="estimate the error of J, Cw, shear centre, moduli and shear areas from "
                            "two finer meshes (Richardson extrapolation; about 7 times the work)")
    props.add_argument("--target-error", type=_positive_float, metavar="TOL",
                       help="refine the mesh adaptively until J is certainly within TOL (relative)")
    _common(props)
    _analysis_options(props)

    stress = sub.add_parser(
        "stress", help="shear stress and twist under a torque and shear forces",
        description="Shear stresses from a torque and shear forces (through the shear centre), "
                    "and the twist rate.")
    stress.add_argument("file", metavar="FILE", help="outline file")
    _load_options(stress)
    stress.add_argument("--shear-modulus", type=_positive_float, metavar="G",
                        help="shear modulus, force/length^2 (MPa with mm)")
    stress.add_argument("--youngs-modulus", type=_positive_float, metavar="E",
                        help="Young's modulus (with --poisson), force/length^2")
    stress.add_argument("--poisson", type=_float, metavar="NU",
                        help=f"Poisson's ratio (default {DEFAULT_POISSON} for the shear functions)")
    stress.add_argument("--json", action="store_true", help="print JSON instead of text")
    _common(stress)
    _analysis_options(stress)

    cat = sub.add_parser(
        "catalogue", help="a folder of profiles to one property table and datasheets",
        description="Analyse every profile (folders: their .dxf, .txt, .xy, .csv, .dat files) and "
                    "write one row per profile. A profile that fails is listed at the end and "
                    "does not stop the run; the exit code is then 1.")
    cat.add_argument("items", nargs="+", metavar="DIR_OR_FILE")
    cat.add_argument("--csv", metavar="OUT", help="property table, one row per profile")
    cat.add_argument("--json", metavar="OUT", help="the same as a JSON list")
    cat.add_argument("--html", metavar="DIR", help="an HTML datasheet per profile and an index page")
    cat.add_argument("--jobs", type=_positive_int, metavar="N",
                     help="worker processes (default: the number of CPUs; 1 runs in this process)")
    cat.add_argument("--table-units", choices=sorted(LENGTH_UNITS), default="mm",
                     help="length unit of the table (profiles in other units are converted; "
                          "default mm)")
    cat.add_argument("--estimate-errors", action="store_true",
                     help="estimate the errors of the main values (about 7 times the work)")
    cat.add_argument("--poisson", type=_float, default=None, metavar="NU",
                     help=f"Poisson's ratio without a material (default {DEFAULT_POISSON})")
    cat.add_argument("--mesh-size", type=_positive_float, metavar="H",
                     help="largest element size in the drawing unit")
    cat.add_argument("--units", choices=sorted(LENGTH_UNITS),
                     help="length unit of the inputs (default: from each file, else mm)")
    cat.add_argument("--layer", action="append", metavar="NAME", help="DXF: layer(s) to read")
    cat.add_argument("--all-parts", action="store_true",
                     help="DXF: take every part of a drawing as one section")
    _analysis_options(cat)

    plot = sub.add_parser("plot", help="draw the mesh, warping or stresses of a profile",
                          description="Draw a profile: its mesh and axes, the warping function, "
                                      "the torsion shear stress or the stresses of combined loads.")
    plot.add_argument("file", metavar="FILE", help="DXF drawing or outline file")
    plot.add_argument("--show", choices=("mesh", "warping", "torsion", "combined"), default="mesh")
    plot.add_argument("-o", "--output", required=True, metavar="OUT.png|OUT.svg")
    _load_options(plot)
    plot.add_argument("--shear-modulus", type=_positive_float, metavar="G")
    plot.add_argument("--poisson", type=_float, default=None, metavar="NU")
    _common(plot)
    _analysis_options(plot)

    sub.add_parser("shapes", help="list the parametric profiles for --shape",
                   description="List the parametric profiles and their parameters.")

    check = sub.add_parser(
        "check", help="what a drawing holds and everything wrong with it",
        description="List what was found in a drawing (entities, layers, loops, holes, parts, "
                    "units) and every defect with its coordinates. Exit code 0 only when the "
                    "profile can be analysed with the same options.")
    check.add_argument("file", metavar="FILE", help="DXF drawing or outline file")
    check.add_argument("--plot", metavar="OUT.png",
                       help="also draw the outline with every defect marked (.png, .pdf or .svg)")
    _common(check)
    return parser


def _materials_table(args: argparse.Namespace) -> dict:
    return read_materials(args.materials) if getattr(args, "materials", None) else {}


def _analyse_profile(profile: Profile, args: argparse.Namespace, *,
                     bounds: bool = True) -> SectionResult:
    """Analyse a profile with the command line's analysis options."""
    nu = DEFAULT_POISSON if args.poisson is None else args.poisson
    if not -1.0 < nu < 0.5:
        raise UsageError(f"Poisson's ratio must lie in (-1, 0.5), got {nu}")
    mats = resolve([r.material for r in profile.regions], _materials_table(args),
                   args.material, source=profile.source)
    if mats is not None and not any(r.material for r in profile.regions):
        mats = mats[0]
    refine = refinement_for(args.accuracy)
    kwargs = {"poisson": nu, "materials": mats, "reference": args.reference,
              "solver": args.solver}
    try:
        if getattr(args, "target_error", None):
            run = refine_adaptively(profile, args.target_error, args.mesh_size, poisson=nu)
            return analyse(profile, mesh=run.result.mesh, bounds=bounds, **kwargs)
        if getattr(args, "estimate_errors", False):
            est = estimate_errors(profile, args.mesh_size, refine=refine, poisson=nu, bounds=bounds)
            if mats is None:
                return est.result
            res = analyse(profile, args.mesh_size, refine=refine, bounds=bounds, **kwargs)
            return replace(res, errors=est.relative_error)
        return analyse(profile, args.mesh_size, refine=refine, bounds=bounds, **kwargs)
    except WarpwiseError as exc:
        raise exc.with_file(profile.source) from None


def _load(path: str, args: argparse.Namespace) -> Profile:
    return load_profile(path, units=args.units, layers=args.layer, part=getattr(args, "part", None),
                        all_parts=args.all_parts, chord_tolerance=getattr(args, "chord_tolerance", None),
                        mesh_size=args.mesh_size)


def _analyse_file(path: str, args: argparse.Namespace, *, bounds: bool = True) -> SectionResult:
    return _analyse_profile(_load(path, args), args, bounds=bounds)


def force_units(length: str) -> tuple[str, str, str]:
    """Force, moment and stress unit names for a length unit (consistent units assumed)."""
    return {
        "mm": ("N", "N*mm", "MPa"), "cm": ("N", "N*cm", "N/cm2"),
        "m": ("N", "N*m", "Pa"), "in": ("lbf", "lbf*in", "psi"),
    }[length]


def run_props(args: argparse.Namespace) -> int:
    """``warpwise props``: table or JSON on stdout, optional CSV file."""
    if not args.files and not args.shape:
        raise UsageError("give a FILE or a --shape")
    profiles = [_load(f, args) for f in args.files]
    profiles += [shape_from_spec(spec, units=args.units or "mm") for spec in args.shape or ()]
    results = [_analyse_profile(p, args) for p in profiles]
    if args.csv:
        atomic_write(args.csv, csv_text(results))
    if args.json:
        sys.stdout.write(json_text(results))
    else:
        sys.stdout.write("\n".join(property_table(r) for r in results))
    return 0


def run_stress(args: argparse.Namespace) -> int:
    """``warpwise stress``: stresses for a torque, shear forces, axial force and moments."""
    if not any((args.torque, args.shear_x, args.shear_y, args.axial, args.moment_x, args.moment_y)):
        raise UsageError("give a load: --torque, --shear-x, --shear-y, --axial, --moment-x "
                         "and/or --moment-y")
    G = None
    if args.shear_modulus is not None or args.youngs_modulus is not None:
        G = shear_modulus(args.shear_modulus, args.youngs_modulus, args.poisson)
    result = _analyse_file(args.file, args, bounds=False)
    if G is None and result.materials.G_ref is not None:
        G = result.materials.G_ref
    if args.torque != 0 and G is None:
        raise UsageError("a torque needs a material: give --material, or the shear modulus G, "
                         "or E with Poisson's ratio")
    if result.composite or args.axial or args.moment_x or args.moment_y:
        return _print_combined(args, result, G)
    s = shear_stress(result, args.torque, args.shear_x, args.shear_y, G)
    L = result.units
    force, moment, stress_unit = force_units(L)
    if args.json:
        obj = {
            "file": args.file,
            "units": {"length": L, "force": force, "moment": moment, "stress": stress_unit},
            "torque": s.torque, "shear_x": s.vx, "shear_y": s.vy, "shear_modulus": G,
            "poisson": result.shear.poisson, "J": result.torsion.J,
            "shear_centre": list(result.torsion.shear_centre),
            "tau_max": s.tau_max, "tau_max_at": list(s.tau_max_at),
            "tau_max_torsion": s.tau_max_torsion, "tau_max_shear": s.tau_max_shear,
            "twist_rate": s.twist_rate,
        }
        sys.stdout.write(json.dumps(obj, indent=2) + "\n")
        return 0
    x, y = s.tau_max_at
    xs, ys = result.torsion.shear_centre

    def row(label: str, sym: str, v: float, unit: str) -> str:
        return f"  {label:<38} {sym:<9} {format_value(v):>14}  {unit}"

    lines = [f"Shear stresses in {args.file}  (length unit {L}; consistent units)",
             f"  loads act through the shear centre ({format_value(xs)}, {format_value(ys)}) {L}",
             row("torque", "T", s.torque, moment), row("shear force along x", "Vx", s.vx, force),
             row("shear force along y", "Vy", s.vy, force)]
    if G is not None:
        lines.append(row("shear modulus", "G", G, stress_unit))
    lines.append(row("torsion constant", "J", result.torsion.J, f"{L}4"))
    if s.twist_rate is not None:
        lines.append(row("twist rate T/(G J)", "theta", s.twist_rate, f"rad/{L}"))
    lines += [row("largest shear stress, torque alone", "tau_T", s.tau_max_torsion, stress_unit),
              row("largest shear stress, forces alone", "tau_V", s.tau_max_shear, stress_unit),
              row("largest combined shear stress", "tau_max", s.tau_max, stress_unit),
              f"    at ({format_value(x)}, {format_value(y)}) {L}", "", f"  {CAUTION}", ""]
    sys.stdout.write("\n".join(lines))
    return 0


def run_check(args: argparse.Namespace) -> int:
    """``warpwise check``: the report on stdout; exit code 1 when not analysable."""
    report = check_file(args.file, units=args.units, layers=args.layer, part=args.part,
                        all_parts=args.all_parts, chord_tolerance=args.chord_tolerance,
                        mesh_size=args.mesh_size)
    if args.plot:
        plot_report(report, args.plot)
    sys.stdout.write(format_report(report))
    if not report.ok:
        print(f"warpwise: error: {report.verdict}", file=sys.stderr)
        return EXIT_INPUT
    return 0


def _print_combined(args: argparse.Namespace, result: SectionResult, G: float | None) -> int:
    """Combined-load stresses per material, as text or JSON."""
    loads = Loads(N=args.axial, Mx=args.moment_x, My=args.moment_y, Vx=args.shear_x,
                  Vy=args.shear_y, T=args.torque)
    c = combined_stress(result, loads, G)
    L = result.units
    force, moment, stress_unit = force_units(L)
    top = max(c.by_material, key=lambda m: m.von_mises_max)
    if args.json:
        obj = {
            "file": args.file, "units": {"length": L, "force": force, "moment": moment,
                                         "stress": stress_unit},
            "torque": loads.T, "shear_x": loads.Vx, "shear_y": loads.Vy, "axial": loads.N,
            "moment_x": loads.Mx, "moment_y": loads.My, "shear_modulus": G, "J": result.torsion.J,
            "shear_centre": list(result.torsion.shear_centre),
            "tau_max": max(m.tau_max for m in c.by_material),
            "tau_max_at": list(max(c.by_material, key=lambda m: m.tau_max).von_mises_at),
            "twist_rate": c.twist_rate, "von_mises_max": top.von_mises_max,
            "von_mises_max_at": list(top.von_mises_at),
            "materials": [{"material": m.material, "sigma_max": m.sigma_max, "tau_max": m.tau_max,
                           "von_mises_max": m.von_mises_max, "von_mises_at": list(m.von_mises_at),
                           "fy": m.fy, "utilisation": m.utilisation} for m in c.by_material],
        }
        sys.stdout.write(json.dumps(obj, indent=2) + "\n")
        return 0
    xs, ys = result.torsion.shear_centre

    def row(label: str, sym: str, v: float, unit: str) -> str:
        return f"  {label:<40} {sym:<9} {format_value(v):>14}  {unit}"

    lines = [f"Stresses in {args.file}  (length unit {L}; consistent units)",
             f"  shear forces and torque act through the shear centre ({format_value(xs)}, "
             f"{format_value(ys)}) {L}; N through the centroid",
             row("axial force", "N", loads.N, force), row("moment about x", "Mx", loads.Mx, moment),
             row("moment about y", "My", loads.My, moment), row("shear force along x", "Vx", loads.Vx, force),
             row("shear force along y", "Vy", loads.Vy, force), row("torque", "T", loads.T, moment)]
    if c.twist_rate is not None:
        lines.append(row("twist rate T/(G J)", "theta", c.twist_rate, f"rad/{L}"))
    for m in c.by_material:
        name = m.material or "section"
        lines += ["", f"  {name}",
                  row("largest normal stress |sigma_z|", "sigma", m.sigma_max, stress_unit),
                  row("largest shear stress", "tau", m.tau_max, stress_unit),
                  row("largest von Mises stress", "sigma_vm", m.von_mises_max, stress_unit),
                  f"    at ({format_value(m.von_mises_at[0])}, {format_value(m.von_mises_at[1])}) {L}"]
        if m.utilisation is not None:
            lines.append(row("von Mises / fy (informative, not a code check)", "u", m.utilisation, "-"))
    for x, y, r in c.excluded:
        lines.append(f"  note: sharp re-entrant corner at ({format_value(x)}, {format_value(y)}) left "
                     f"out within {format_value(r)} {L}: the stress there is mesh-dependent")
    lines += ["", f"  {CAUTION}", ""]
    sys.stdout.write("\n".join(lines))
    return 0


class _Progress:
    """Progress on stderr: a bar on a terminal, plain lines otherwise."""

    def __init__(self, total: int) -> None:
        self.total = total
        self.tty = sys.stderr.isatty()
        self.start = time.perf_counter()

    def __call__(self, out: Outcome, done: int, total: int) -> None:
        state = "ok" if out.ok else "failed"
        if self.tty:
            width = 30
            fill = int(width * done / max(total, 1))
            sys.stderr.write(f"\r[{'#' * fill}{'.' * (width - fill)}] {done}/{total} "
                             f"{Path(out.path).name[:40]:<40}")
            if done == total:
                sys.stderr.write("\n")
        else:
            sys.stderr.write(f"{done}/{total} {out.path}: {state} ({out.seconds:.2f} s)\n")
        sys.stderr.flush()


def run_catalogue_command(args: argparse.Namespace) -> int:
    """``warpwise catalogue``: every profile analysed; good rows written; failures listed."""
    if not (args.csv or args.json or args.html):
        raise UsageError("say where the results go: --csv OUT, --json OUT and/or --html DIR")
    files = collect_files(args.items)
    refine = refinement_for(args.accuracy)
    options = RunOptions(
        units=args.units, mesh_size=args.mesh_size, refine=refine, estimate=args.estimate_errors,
        poisson=DEFAULT_POISSON if args.poisson is None else args.poisson,
        material=args.material, materials=_materials_table(args), reference=args.reference,
        layers=tuple(args.layer or ()), all_parts=args.all_parts, datasheet_dir=None)
    if args.html:
        Path(args.html).mkdir(parents=True, exist_ok=True)
        options = replace(options, datasheet_dir=args.html)
    outcomes = run_catalogue(files, options, jobs=args.jobs, on_done=_Progress(len(files)))
    good = [o for o in outcomes if o.ok]
    bad = [o for o in outcomes if not o.ok]
    if good and args.csv:
        atomic_write(args.csv, csv_text([o.record for o in good], units=args.table_units))
    if good and args.json:
        atomic_write(args.json, json_text([o.record.in_units(args.table_units) for o in good]))
    if args.html:
        from .report.html import write_catalogue_index

        write_catalogue_index(outcomes, args.html)
    seconds = sum(o.seconds for o in outcomes)
    print(f"{len(good)} of {len(outcomes)} profiles analysed ({seconds:.1f} s of analysis)",
          file=sys.stderr)
    for o in bad:
        print(f"warpwise: error: {o.error}", file=sys.stderr)
    return EXIT_INPUT if bad else 0


def run_plot(args: argparse.Namespace) -> int:
    """``warpwise plot``: one picture of a profile."""
    from .report.plots import (
        figure_combined,
        figure_outline,
        figure_torsion,
        figure_warping,
        save_figure,
    )

    result = _analyse_file(args.file, args, bounds=False)
    G = args.shear_modulus or result.materials.G_ref or 1.0
    if args.show == "mesh":
        fig = figure_outline(result, show_mesh=True)
    elif args.show == "warping":
        fig = figure_warping(result)
    elif args.show == "torsion":
        fig = figure_torsion(result, args.torque or 1.0, G)
    else:
        loads = Loads(N=args.axial, Mx=args.moment_x, My=args.moment_y, Vx=args.shear_x,
                      Vy=args.shear_y, T=args.torque)
        fig = figure_combined(result, loads, G)
    save_figure(fig, args.output)
    return 0


def run_shapes(args: argparse.Namespace) -> int:
    """``warpwise shapes``: the parametric profiles and their parameters."""
    sys.stdout.write(describe_shapes() + "\n")
    return 0


def main(argv: Sequence[str] | None = None) -> int:
    """Entry point of the ``warpwise`` command; returns the exit code."""
    parser = build_parser()
    try:
        args = parser.parse_args(argv)
        handler = {"props": run_props, "stress": run_stress, "check": run_check,
                   "catalogue": run_catalogue_command, "plot": run_plot,
                   "shapes": run_shapes}[args.command]
        return handler(args)
    except UsageError as exc:
        print(f"warpwise: error: {exc}", file=sys.stderr)
        return EXIT_USAGE
    except WarpwiseError as exc:
        print(f"warpwise: error: {exc}", file=sys.stderr)
        return EXIT_INPUT
    except KeyboardInterrupt:
        print("warpwise: interrupted; no output written", file=sys.stderr)
        return 130
    except BrokenPipeError:
        return 0
    except Exception as exc:  # a bug: one line unless debugging
        if os.environ.get("WARPWISE_DEBUG"):
            raise
        print(f"warpwise: internal error: {type(exc).__name__}: {exc} "
              "(set WARPWISE_DEBUG=1 for details)", file=sys.stderr)
        return EXIT_INTERNAL


if __name__ == "__main__":
    sys.exit(main())
