"""Command line: ``warpwise props`` and ``warpwise stress``.

A thin shell over the Python API. Every user error ends as one line on stderr and a non-zero
exit code (1 for bad input or a failed analysis, 2 for a bad command line); no traceback is
shown unless ``WARPWISE_DEBUG=1`` is set.
"""

from __future__ import annotations

import argparse
import json
import os
import sys
from collections.abc import Sequence

from .analysis import SectionResult, analyse
from .errors import UsageError, WarpwiseError
from .geometry import LENGTH_UNITS
from .io import load_profile
from .report.files import atomic_write, csv_text, json_text
from .report.table import CAUTION, format_value, property_table
from .shear import DEFAULT_POISSON
from .stress import shear_modulus, shear_stress

EXIT_INPUT = 1
EXIT_USAGE = 2
EXIT_INTERNAL = 3


class _Parser(argparse.ArgumentParser):
    """Argument parser whose errors are one line and a UsageError."""

    def error(self, message: str) -> None:  # noqa: D102
        raise UsageError(f"{self.prog}: {message} (see --help)")


def _positive_float(text: str) -> float:
    try:
        v = float(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"not a number: {text!r}") from None
    if not v > 0 or v == float("inf"):
        raise argparse.ArgumentTypeError(f"must be a positive number, got {text}")
    return v


def _float(text: str) -> float:
    try:
        v = float(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"not a number: {text!r}") from None
    if v != v or abs(v) == float("inf"):
        raise argparse.ArgumentTypeError(f"must be a finite number, got {text}")
    return v


def _common(p: argparse.ArgumentParser) -> None:
    p.add_argument("--mesh-size", type=_positive_float, metavar="H",
                   help="largest element size in the drawing unit (default: chosen from the profile)")
    p.add_argument("--units", choices=sorted(LENGTH_UNITS),
                   help="length unit of the input coordinates (default: from the file, else mm)")


def build_parser() -> argparse.ArgumentParser:
    """The argument parser of the ``warpwise`` command."""
    parser = _Parser(prog="warpwise", description=(
        "Section properties of bar and extrusion profiles by six-node finite elements. "
        + CAUTION))
    sub = parser.add_subparsers(dest="command", required=True, parser_class=_Parser)

    props = sub.add_parser("props", help="geometric, torsion and warping properties",
                           description="Print the property table of each profile.")
    props.add_argument("files", nargs="+", metavar="FILE", help="outline file(s)")
    props.add_argument("--json", action="store_true", help="print JSON instead of the table")
    props.add_argument("--csv", metavar="OUT", help="also write one CSV row per profile to OUT")
    props.add_argument("--poisson", type=_float, default=DEFAULT_POISSON, metavar="NU",
                       help=f"Poisson's ratio for the shear properties (default {DEFAULT_POISSON})")
    _common(props)

    stress = sub.add_parser(
        "stress", help="shear stress and twist under a torque and shear forces",
        description="Shear stresses from a torque and shear forces (through the shear centre), "
                    "and the twist rate.")
    stress.add_argument("file", metavar="FILE", help="outline file")
    stress.add_argument("--torque", type=_float, default=0.0, metavar="T",
                        help="torque about the shear centre, force x length (N*mm with mm)")
    stress.add_argument("--shear-x", type=_float, default=0.0, metavar="VX",
                        help="shear force along x through the shear centre (N with mm)")
    stress.add_argument("--shear-y", type=_float, default=0.0, metavar="VY",
                        help="shear force along y through the shear centre (N with mm)")
    stress.add_argument("--shear-modulus", type=_positive_float, metavar="G",
                        help="shear modulus, force/length^2 (MPa with mm)")
    stress.add_argument("--youngs-modulus", type=_positive_float, metavar="E",
                        help="Young's modulus (with --poisson), force/length^2")
    stress.add_argument("--poisson", type=_float, metavar="NU",
                        help=f"Poisson's ratio (default {DEFAULT_POISSON} for the shear functions)")
    stress.add_argument("--json", action="store_true", help="print JSON instead of text")
    _common(stress)
    return parser


def _analyse_file(path: str, args: argparse.Namespace) -> SectionResult:
    profile = load_profile(path, units=args.units)
    nu = DEFAULT_POISSON if args.poisson is None else args.poisson
    if not -1.0 < nu < 0.5:
        raise UsageError(f"Poisson's ratio must lie in (-1, 0.5), got {nu}")
    try:
        return analyse(profile, args.mesh_size, poisson=nu)
    except WarpwiseError as exc:
        raise exc.with_file(path) from None


def force_units(length: str) -> tuple[str, str, str]:
    """Force, moment and stress unit names for a length unit (consistent units assumed)."""
    return {
        "mm": ("N", "N*mm", "MPa"), "cm": ("N", "N*cm", "N/cm2"),
        "m": ("N", "N*m", "Pa"), "in": ("lbf", "lbf*in", "psi"),
    }[length]


def run_props(args: argparse.Namespace) -> int:
    """``warpwise props``: table or JSON on stdout, optional CSV file."""
    results = [_analyse_file(f, args) for f in args.files]
    if args.csv:
        atomic_write(args.csv, csv_text(results))
    if args.json:
        sys.stdout.write(json_text(results))
    else:
        sys.stdout.write("\n".join(property_table(r) for r in results))
    return 0


def run_stress(args: argparse.Namespace) -> int:
    """``warpwise stress``: shear stresses for a torque and shear forces."""
    if args.torque == 0 and args.shear_x == 0 and args.shear_y == 0:
        raise UsageError("give a load: --torque, --shear-x and/or --shear-y")
    G = None
    if args.shear_modulus is not None or args.youngs_modulus is not None or args.torque != 0:
        G = shear_modulus(args.shear_modulus, args.youngs_modulus, args.poisson)
    result = _analyse_file(args.file, args)
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


def main(argv: Sequence[str] | None = None) -> int:
    """Entry point of the ``warpwise`` command; returns the exit code."""
    parser = build_parser()
    try:
        args = parser.parse_args(argv)
        handler = {"props": run_props, "stress": run_stress}[args.command]
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
