"""The argument parser of the ``warpwise`` command and the options it hands to the library.

Each group of options is declared once and added to the commands that take it; the parsed
options become :class:`ReadOptions` (how files are read) and :class:`AnalysisOptions` (how
profiles are analysed) in one place each (:func:`read_options`, :func:`analysis_options`).
"""

from __future__ import annotations

import argparse

from ..errors import UsageError
from ..fem.solve import METHODS
from ..geometry.profile import LENGTH_UNITS
from ..io.options import MAX_ENTITIES, ReadOptions
from ..materials import BUILTIN, read_materials
from ..properties.accuracy import ACCURACY_LEVELS
from ..properties.run import AnalysisOptions
from ..properties.shear import DEFAULT_POISSON
from ..report.table import CAUTION
from ..units import SYSTEMS


class _Parser(argparse.ArgumentParser):
    """Argument parser whose errors are one line and a UsageError."""

    def error(self, message: str) -> None:  # noqa: D102
        raise UsageError(f"{self.prog}: {message} (see --help)")


def finite_float(text: str) -> float:
    """A finite number from the command line."""
    try:
        v = float(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"not a number: {text!r}") from None
    if v != v or abs(v) == float("inf"):
        raise argparse.ArgumentTypeError(f"must be a finite number, got {text}")
    return v


def positive_float(text: str) -> float:
    """A finite positive number from the command line."""
    v = finite_float(text)
    if not v > 0:
        raise argparse.ArgumentTypeError(f"must be a positive number, got {text}")
    return v


def numbers(count: int, names: str):
    """A parser of ``count`` comma-separated finite numbers (``names`` as in the message).

    Examples
    --------
    >>> numbers(2, "X,Y")("10,-2.5")
    (10.0, -2.5)
    """
    def parse(text: str) -> tuple[float, ...]:
        parts = text.split(",")
        if len(parts) != count:
            raise argparse.ArgumentTypeError(f"give {names} ({count} numbers separated by "
                                             f"commas), got {text!r}")
        return tuple(finite_float(p.strip()) for p in parts)
    return parse


def positive_int(text: str) -> int:
    """A whole number of at least 1 from the command line."""
    try:
        v = int(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"not a whole number: {text!r}") from None
    if v < 1:
        raise argparse.ArgumentTypeError(f"must be 1 or more, got {text}")
    return v


def layer_material(text: str) -> tuple[str, str]:
    """A ``LAYER=MATERIAL`` pair from the command line.

    Examples
    --------
    >>> layer_material("insert=steel-S235")
    ('insert', 'steel-S235')
    """
    layer, sep, material = text.partition("=")
    if not sep or not layer.strip() or not material.strip():
        raise argparse.ArgumentTypeError(f"give LAYER=MATERIAL, got {text!r}")
    return layer.strip(), material.strip()


def torque_at(text: str) -> tuple[float, float]:
    """A concentrated torque ``T@Z`` (torque, position from the end z = 0) from the command line.

    Examples
    --------
    >>> torque_at("2e6@1500")
    (2000000.0, 1500.0)
    """
    torque, sep, where = text.partition("@")
    if not sep:
        raise argparse.ArgumentTypeError(f"give TORQUE@POSITION, got {text!r}")
    return finite_float(torque.strip()), finite_float(where.strip())


def end_pair(text: str) -> tuple[str, str]:
    """The end conditions ``START,END`` of a member from the command line."""
    from ..member.solution import ENDS

    ends = tuple(e.strip() for e in text.split(","))
    if len(ends) != 2 or any(e not in ENDS for e in ends):
        raise argparse.ArgumentTypeError(
            f"give two of {', '.join(ENDS)} separated by a comma, got {text!r}")
    return ends


def _input_options(p: argparse.ArgumentParser) -> None:
    """Mesh size, input unit and what of a DXF drawing is the profile."""
    p.add_argument("--mesh-size", type=positive_float, metavar="H",
                   help="largest element size in the drawing unit (default: chosen from the profile)")
    p.add_argument("--max-elements", type=positive_int, metavar="N",
                   help="largest mesh any step may build, in elements (default: what 60 %% of "
                        "this machine's available memory holds at 15 kB per element, at most "
                        "4,000,000; the limit of boundary points, 400,000, scales with it)")
    p.add_argument("--units", choices=sorted(LENGTH_UNITS),
                   help="length unit of the input coordinates (default: from the file, else mm)")
    p.add_argument("--layer", action="append", metavar="NAME",
                   help="DXF: take the profile from this layer (repeat for several; default: every "
                        "layer with closed geometry)")
    p.add_argument("--layer-material", action="append", type=layer_material,
                   metavar="LAYER=MATERIAL",
                   help="DXF: the loops on LAYER are of MATERIAL (repeat for several layers; the "
                        "other layers are of --material): a composite drawn by layers")
    which = p.add_mutually_exclusive_group()
    which.add_argument("--part", type=positive_int, metavar="N",
                       help="analyse only part N of a drawing or outline file with several "
                            "separate parts (numbers as listed by 'warpwise check', largest "
                            "area first)")
    which.add_argument("--all-parts", action="store_true",
                       help="analyse all separate parts of a drawing or outline file together "
                            "as one section (J is the sum of the parts' J)")
    p.add_argument("--chord-tolerance", type=positive_float, metavar="S",
                   help="DXF: largest distance between a curve and its chords, drawing unit "
                        "(default: tied to the mesh size)")
    p.add_argument("--join-tolerance", type=positive_float, metavar="D",
                   help="DXF: join ends closer than D, drawing unit (default: 1e-5 of the "
                        "drawing's diagonal; 'warpwise check' suggests one for small gaps)")
    p.add_argument("--max-entities", type=positive_int, metavar="N",
                   help="DXF: read drawings of up to N entities, each copy of a block counted "
                        f"(default: {MAX_ENTITIES:,}; a larger drawing is refused before it is expanded)")


def _report_options(p: argparse.ArgumentParser, *, loads: bool = False) -> None:
    """The unit system of the outputs (and, with loads, of the loads and moduli given)."""
    said = "; loads and moduli on the command line are in it too" if loads else ""
    p.add_argument("--report-units", "--table-units", dest="report_units",
                   choices=list(SYSTEMS), metavar="{" + ",".join(SYSTEMS) + "}",
                   help="unit system of the report, named by its length unit: mm (N, MPa), "
                        "cm (kN, kN/cm2), m (N, Pa), in (lbf, psi), ft (lbf, lbf/ft2); default "
                        f"the drawing's (mm for several drawings in different units){said}")


def _load_options(p: argparse.ArgumentParser) -> None:
    """Section forces, in the report's unit system (N and N*mm with mm)."""
    for flag, meta, text in (
            ("--torque", "T", "torque about the shear centre, force x length (N*mm with mm)"),
            ("--shear-x", "VX", "shear force along x through the shear centre (N with mm)"),
            ("--shear-y", "VY", "shear force along y through the shear centre (N with mm)"),
            ("--axial", "N", "axial force through the (modulus-weighted) centroid, tension positive"),
            ("--moment-x", "MX", "bending moment about the x axis, positive when it puts +y in tension"),
            ("--moment-y", "MY", "bending moment about the y axis, positive when it puts +x in tension"),
            ("--bimoment", "B", "bimoment -E Cw phi'', force x length^2 (N*mm2 with mm): adds the "
                                "warping normal stress -B omega / Cw")):
        p.add_argument(flag, type=finite_float, default=0.0, metavar=meta, help=text)


def _analysis_options(p: argparse.ArgumentParser, *, estimate: bool = False) -> None:
    """Options of the analysis itself: accuracy, materials, solver, Poisson's ratio."""
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
    p.add_argument("--poisson", type=finite_float, default=None, metavar="NU",
                   help=f"Poisson's ratio for the shear properties without a material "
                        f"(default {DEFAULT_POISSON})")
    if estimate:
        p.add_argument("--estimate-errors", action="store_true",
                       help="estimate the error of J, Cw, shear centre, moduli and shear areas from "
                            "two finer meshes (Richardson extrapolation; about 7 times the work)")
        p.add_argument("--target-error", type=positive_float, metavar="TOL",
                       help="refine the mesh adaptively until J is certainly within TOL (relative)")


def _moduli_options(p: argparse.ArgumentParser, *, youngs: bool = True) -> None:
    """The shear modulus (or E with Poisson's ratio) of a section without a material."""
    p.add_argument("--shear-modulus", type=positive_float, metavar="G",
                   help="shear modulus, force/length^2 of the report's units (MPa with mm)")
    if youngs:
        p.add_argument("--youngs-modulus", type=positive_float, metavar="E",
                       help="Young's modulus (with --poisson), force/length^2")


def _add_props(sub: argparse._SubParsersAction) -> None:
    p = sub.add_parser("props", help="geometric, torsion and warping properties",
                       description="Print the property table of each profile.")
    p.add_argument("files", nargs="*", metavar="FILE", help="DXF drawing(s) or outline file(s)")
    p.add_argument("--shape", action="append", metavar="SPEC",
                   help="a parametric profile instead of a file (repeatable; 'warpwise shapes' "
                        "lists them with their parameters)")
    p.add_argument("--json", action="store_true", help="print JSON instead of the table")
    p.add_argument("--csv", metavar="OUT", help="also write one CSV row per profile to OUT")
    p.add_argument("--about-axis", type=numbers(3, "X0,Y0,ANGLE"), metavar="X0,Y0,ANGLE",
                   help="also the second moments about the axis through the point (X0, Y0) "
                        "(drawing coordinates, the report's length unit) at ANGLE degrees from "
                        "+x, counter-clockwise, and the polar moment about the point (write "
                        "--about-axis=-5,0,0 for a first number below zero)")
    p.add_argument("--fibre", action="append", type=numbers(2, "X,Y"), metavar="X,Y",
                   help="with --about-axis: the section modulus about that axis to the fibre at "
                        "(X, Y) (repeatable)")
    p.add_argument("--html", metavar="OUT.html",
                   help="also write the HTML datasheet of the profile (one profile; with "
                        "--about-axis its values too) to OUT.html")
    p.add_argument("--pdf", metavar="OUT.pdf",
                   help="also write A4 PDF datasheets, one page per profile, to OUT.pdf")
    _report_options(p)
    _input_options(p)
    _analysis_options(p, estimate=True)


def _html_option(p: argparse.ArgumentParser) -> None:
    """``--html OUT.html``: the results of one command as one page."""
    p.add_argument("--html", metavar="OUT.html",
                   help="also write the results as one self-contained HTML page (- for "
                        "standard output, instead of the report)")


def _add_stress(sub: argparse._SubParsersAction) -> None:
    p = sub.add_parser(
        "stress", help="shear stress and twist under a torque and shear forces",
        description="Stresses from a torque, shear forces (through the shear centre), an axial "
                    "force and bending moments, and the twist rate.")
    p.add_argument("file", metavar="FILE", help="DXF drawing or outline file")
    _load_options(p)
    p.add_argument("--at", action="append", type=numbers(2, "X,Y"), metavar="X,Y", default=[],
                   help="also every stress component at the point (X, Y), drawing coordinates "
                        "in the report's length unit (repeatable; write --at=-5,2 for a first "
                        "number below zero)")
    p.add_argument("--load-cases", metavar="CASES.csv",
                   help="several load cases instead of the load options: a file with a header "
                        "'case, N, Mx, My, Vx, Vy, T' (any of the loads) and one line per case, "
                        "an optional 'units: SYSTEM' line first (default the report's units); "
                        "prints one results table")
    p.add_argument("--csv", metavar="OUT", help="with --load-cases: also write the results "
                                                "table as CSV to OUT (- for standard output)")
    _html_option(p)
    _moduli_options(p)
    _report_options(p, loads=True)
    p.add_argument("--json", action="store_true", help="print JSON instead of text")
    _input_options(p)
    _analysis_options(p)


def _add_catalogue(sub: argparse._SubParsersAction) -> None:
    p = sub.add_parser(
        "catalogue", help="a folder of profiles to one property table and datasheets",
        description="Analyse every profile (folders and their subfolders: their .dxf, .txt, .xy, "
                    ".csv, .dat files; a .toml manifest: the drawings it lists, each with its "
                    "own options, name and description) and write one row per profile. The "
                    "options below apply to every profile; a manifest entry's keys replace them "
                    "for its drawing. A profile that fails is listed at the end and does not "
                    "stop the run; the exit code is then 1.")
    p.add_argument("items", nargs="+", metavar="DIR_FILE_OR_MANIFEST")
    p.add_argument("--csv", metavar="OUT", help="property table, one row per profile")
    p.add_argument("--json", metavar="OUT", help="the same as a JSON list")
    p.add_argument("--xlsx", metavar="OUT.xlsx",
                   help="the same as a workbook: sheets of properties (a row of units under the "
                        "header), failures and materials")
    p.add_argument("--html", metavar="DIR", help="an HTML datasheet per profile and an index page")
    p.add_argument("--pdf", metavar="OUT.pdf",
                   help="a PDF of A4 datasheets, one page per profile in row order")
    p.add_argument("--jobs", type=positive_int, metavar="N",
                   help="worker processes (default: the number of CPUs; 1 runs in this process)")
    p.add_argument("--cluster", metavar="ADDRESS",
                   help="run on a Dask cluster: its scheduler's address (tcp://HOST:8786), or "
                        "'local' for a cluster of --jobs worker processes on this machine")
    p.add_argument("--fresh", action="store_true",
                   help="analyse every profile again, ignoring what an interrupted run with the "
                        "same outputs left (OUT.partial)")
    _report_options(p)
    _input_options(p)
    _analysis_options(p, estimate=True)


def _add_plot(sub: argparse._SubParsersAction) -> None:
    p = sub.add_parser("plot", help="draw the mesh, warping or stresses of a profile",
                       description="Draw a profile: its mesh and axes, the warping function, "
                                   "the torsion shear stress or the stresses of combined loads.")
    p.add_argument("file", metavar="FILE", help="DXF drawing or outline file")
    p.add_argument("--show", choices=("mesh", "warping", "torsion", "combined"), default="mesh")
    p.add_argument("-o", "--output", required=True, metavar="OUT.png|OUT.svg")
    _load_options(p)
    _moduli_options(p, youngs=False)
    _report_options(p, loads=True)
    _input_options(p)
    _analysis_options(p)


def _add_member(sub: argparse._SubParsersAction) -> None:
    from ..member.solution import END_TEXT  # the member options only: props needs no member

    ends = "; ".join(f"{k}: {t}" for k, t in END_TEXT.items())
    p = sub.add_parser(
        "member", help="twist, bimoment and warping torque along a member (restrained warping)",
        description="Torsion of a member of the profile with restrained warping: the exact "
                    "solution of E Cw phi'''' - G J phi'' = m for the given supports and "
                    "torques, with phi, its derivatives, the Saint-Venant and warping torques "
                    "and the bimoment along the member. Lengths and torques are in the "
                    "report's unit system.")
    p.add_argument("file", metavar="FILE", help="DXF drawing or outline file")
    p.add_argument("--length", type=positive_float, required=True, metavar="L",
                   help="member length")
    p.add_argument("--ends", type=end_pair, required=True, metavar="START,END",
                   help=f"support at z = 0 and at z = L ({ends})")
    p.add_argument("--point-torque", type=torque_at, action="append", metavar="T@Z",
                   help="concentrated torque T (force x length) at distance Z from the end "
                        "z = 0 (repeat for several)")
    p.add_argument("--distributed-torque", type=finite_float, default=0.0, metavar="M",
                   help="uniform torque per length over the whole member (N*mm/mm with mm)")
    p.add_argument("--stations", type=positive_int, default=11, metavar="N",
                   help="evenly spaced stations printed, load points added (default 11)")
    p.add_argument("--json", action="store_true", help="print JSON instead of text")
    p.add_argument("--csv", metavar="OUT", help="also write the values at the stations to OUT")
    _html_option(p)
    p.add_argument("--plot", metavar="OUT.png",
                   help="also draw phi and the bimoment along the member (.png, .pdf or .svg)")
    _report_options(p, loads=True)
    _input_options(p)
    _analysis_options(p)


def _add_shapes(sub: argparse._SubParsersAction) -> None:
    sub.add_parser("shapes", help="list the parametric profiles for --shape",
                   description="List the parametric profiles and their parameters.")


def _add_workbench(sub: argparse._SubParsersAction) -> None:
    p = sub.add_parser(
        "workbench", help="the whole job on a local web page, opened in the browser",
        description="Start the workbench, a web page served on this computer: open drawings, "
                    "see what was read, choose parts, layers, units and materials, get the "
                    "properties, stresses and datasheets, run a catalogue. Ctrl-C stops it and "
                    "deletes the files opened.")
    p.add_argument("--address", default="127.0.0.1", metavar="HOST",
                   help="address to serve on (default 127.0.0.1: this computer only; the "
                        "workbench has no log-in)")
    p.add_argument("--port", type=int, default=8765, metavar="N",
                   help="port (default 8765; 0 picks a free one)")
    p.add_argument("--workers", type=positive_int, default=1, metavar="N",
                   help="analyses at the same time, each in its own process (default 1)")
    p.add_argument("--no-browser", action="store_true", help="do not open the browser")


def _add_check(sub: argparse._SubParsersAction) -> None:
    check = sub.add_parser(
        "check", help="what a drawing holds and everything wrong with it",
        description="List what was found in a drawing (entities, layers, loops, holes, parts, "
                    "units) and every defect with its coordinates. Exit code 0 only when the "
                    "profile can be analysed with the same options.")
    check.add_argument("file", metavar="FILE", help="DXF drawing or outline file")
    check.add_argument("--plot", metavar="OUT.png",
                       help="also draw the outline with every defect marked (.png, .pdf or .svg)")
    _input_options(check)


#: Each command's subparser, in the order ``warpwise --help`` lists them.
_COMMAND_PARSERS = {"props": _add_props, "stress": _add_stress, "catalogue": _add_catalogue,
                    "plot": _add_plot, "member": _add_member, "shapes": _add_shapes,
                    "check": _add_check, "workbench": _add_workbench}


def build_parser(command: str | None = None) -> argparse.ArgumentParser:
    """The argument parser of the ``warpwise`` command.

    With ``command`` (the first word of the command line, when it names a command) only that
    command's options are built: they are all a run of it can parse, and building the other
    commands' hundred options would be start-up time spent for nothing.
    """
    parser = _Parser(prog="warpwise", description=(
        "Section properties of bar and extrusion profiles by six-node finite elements. "
        + CAUTION))
    sub = parser.add_subparsers(dest="command", required=True, parser_class=_Parser)
    for name, add in _COMMAND_PARSERS.items():
        if command is None or command not in _COMMAND_PARSERS or command == name:
            add(sub)
    return parser


def read_options(args: argparse.Namespace) -> ReadOptions:
    """How the command's files are read."""
    return ReadOptions(units=args.units, layers=tuple(args.layer or ()), part=args.part,
                       all_parts=args.all_parts, chord_tolerance=args.chord_tolerance,
                       mesh_size=args.mesh_size, join_tolerance=args.join_tolerance,
                       layer_materials=tuple(args.layer_material or ()),
                       other_layers_material=getattr(args, "material", None),
                       max_entities=args.max_entities)


def analysis_options(args: argparse.Namespace, *, bounds: bool = True) -> AnalysisOptions:
    """How the command's profiles are analysed (every command with analysis options)."""
    return AnalysisOptions(
        mesh_size=args.mesh_size, accuracy=args.accuracy, poisson=args.poisson,
        material=args.material,
        materials=read_materials(args.materials) if args.materials else {},
        reference=args.reference, solver=args.solver, bounds=bounds,
        estimate_errors=getattr(args, "estimate_errors", False),
        target_error=getattr(args, "target_error", None),
        **({"max_elements": args.max_elements} if getattr(args, "max_elements", None) else {}))
