"""The work of the workbench, run in the worker processes: reading, analysing, stresses.

Each task is a top-level function of plain arguments (picklable) returning a plain dataclass
of texts and numbers for the page. Every step is the command line's: the options are parsed
by its parser (:mod:`.choices`), the file read by :meth:`warpwise.io.options.ReadOptions.load`, the profile
analysed by :func:`~warpwise.properties.run.run_analysis`, and the outputs written by the
functions ``props`` and ``stress`` write them with. A :class:`~warpwise.errors.WarpwiseError`
comes back as :class:`Refusal` with its one-line message, the stored file's name replaced by
the name the user knows.
"""

from __future__ import annotations

from dataclasses import dataclass, replace
from pathlib import Path

from ..errors import WarpwiseError
from .choices import Choices, parsed


@dataclass(frozen=True)
class Refusal:
    """A file or a choice refused: the one line the command line would print."""

    message: str


@dataclass(frozen=True)
class LayerView:
    """One layer of a drawing as the check found it."""

    name: str
    holds: str
    used: bool
    left_out: bool


@dataclass(frozen=True)
class Inspection:
    """What was read from a file (``warpwise check``) and the choices it offers."""

    name: str
    kind: str
    unit_note: str
    layers: tuple[LayerView, ...]
    parts: tuple[str, ...]
    defects: tuple[tuple[str, str], ...]
    ok: bool
    verdict: str
    remedies: tuple[str, ...]
    report: str
    svg: str
    regions: tuple[str, ...] = ()
    notes: tuple[str, ...] = ()


@dataclass(frozen=True)
class Analysis:
    """The results of one profile, rendered for the page and the downloads."""

    name: str
    units: str
    table: str
    pictures: tuple[tuple[str, str, str], ...]
    warnings: tuple[str, ...]
    notes: tuple[str, ...]
    mesh: tuple[tuple[str, str], ...]
    values: dict[str, float]
    csv: str
    json: str
    datasheet: str
    stress: str = ""
    stress_json: str = ""
    stress_svg: str = ""


def _refusal(exc: WarpwiseError, path: str, name: str, choices: Choices) -> Refusal:
    """The one line of an error, as the command line prints it, under the user's names."""
    text = str(exc)
    for stored, shown in choices.names:
        text = _shown(text, stored, shown)
    return Refusal(_shown(text, path, name))


def _shown(text: str, path: str, name: str) -> str:
    """A message with the stored file's path (and its file name) replaced by the user's name."""
    return text.replace(path, name).replace(Path(path).name, name)


def inspect_upload(path: str, name: str, choices: Choices, picture: str) -> Inspection | Refusal:
    """Check a file as ``warpwise check`` does, with its outline drawn to scale (SVG).

    ``picture`` is a scratch file name in the private folder for the drawing.
    """
    from ..cli.options import read_options
    from ..io.check import check_file, format_report
    from ..io.defects import plural
    from ..io.nesting import describe_part
    from ..report.check_plot import plot_report

    try:
        reading = read_options(parsed("check", path, choices.read))
        report = check_file(path, reading)
        plot_report(replace(report, source=name), picture)
        svg = Path(picture).read_text(encoding="utf-8")
        regions, notes = _regions(reading.load(path), report.unit) if report.ok else ((), ())
    except WarpwiseError as exc:
        return _refusal(exc, path, name, choices)
    finally:
        Path(picture).unlink(missing_ok=True)
    layers = tuple(LayerView(layer.name, layer.holds, layer.used, layer.left_out)
                   for layer in report.layers)
    parts = tuple(f"{describe_part(p.number, p.bounds, p.area, report.unit)}, "
                  f"{plural(p.holes, 'hole')}" for p in report.parts)
    return Inspection(name, report.kind, report.unit_note, layers, parts,
                      tuple((d.severity, _shown(d.message, path, name)) for d in report.defects),
                      report.ok, _shown(report.verdict, path, name),
                      tuple(r.text for r in report.remedies),
                      _shown(format_report(report), path, name), svg, regions,
                      tuple(_shown(n, path, name) for n in notes))


def _regions(profile, unit: str) -> tuple[tuple[str, ...], tuple[str, ...]]:
    """The regions of the profile as read (material, area, holes) and the reader's notes."""
    from ..io.defects import plural

    regions = tuple(f"region {k}: {r.material or 'the material of the profile'}, area "
                    f"{r.area:.6g} {unit}2, {plural(len(r.holes), 'hole')}"
                    for k, r in enumerate(profile.regions, 1))
    return regions, (*profile.notes, *profile.warnings)


def _pictures(result, units: str) -> tuple[tuple[str, str, str], ...]:
    """The datasheet's SVG pictures: (id, caption, svg)."""
    from ..report.plot_svg import outline_svg, torsion_svg, warping_svg
    from ..stress.shear import nominal_torsion

    return (("outline", "The section to scale: C centroid, S shear centre, principal axes 1 "
             "and 2.", outline_svg(result, units=units)),
            ("warping", "Warping function about the shear centre (zero mean).",
             warping_svg(result, units=units)),
            ("torsion", "Torsion shear stress under the nominal torque of 1 force x length "
             "(the stresses scale with the torque).",
             torsion_svg(result, nominal_torsion(result, units), units=units)))


def _mesh_rows(result, rec) -> tuple[tuple[str, str], ...]:
    """The mesh statistics shown under the results."""
    from ..report.table import format_value

    return (("nodes", f"{rec.nodes:,}"), ("six-node elements", f"{rec.elements:,}"),
            ("element size", f"{format_value(rec.mesh_size)} {result.units}"))


def analyse_upload(path: str, name: str, choices: Choices) -> Analysis | Refusal:
    """Read and analyse a file as ``warpwise props`` does (and ``stress`` for the loads)."""
    from ..cli.options import analysis_options, read_options
    from ..cli.props_output import props_csv, props_datasheet, props_json
    from ..properties.run import run_analysis
    from ..report.property_html import property_table_html
    from ..report.records import record_of, report_units
    from ..units import Converter

    try:
        args = parsed("props", path, [*choices.read, *choices.analysis, *choices.props])
        stress_args = parsed("stress", path, [*choices.read, *choices.analysis, *choices.loads]) \
            if choices.loads else None
        profile = replace(read_options(args).load(path), source=name)
        result = run_analysis(profile, analysis_options(args))
        rec = record_of(result)
        units = args.report_units or result.units
        shown = rec.in_units(units)
        table, _ = property_table_html(shown.values, result.errors,
                                       Converter.of(result.units, units))
        stress = _stress(stress_args, result, name) if stress_args else ("", "", "")
        return Analysis(
            name, units, table, _pictures(result, units), rec.warnings, rec.material_notes,
            _mesh_rows(result, rec), dict(shown.values),
            props_csv([rec], report_units([rec.units], args.report_units)),
            props_json([rec], args.report_units), props_datasheet(result, args.report_units),
            *stress)
    except WarpwiseError as exc:
        return _refusal(exc, path, name, choices)
    except MemoryError:
        return Refusal(f"{name}: out of memory; choose a coarser accuracy")


def _stress(args, result, name: str) -> tuple[str, str, str]:
    """The text and JSON of ``stress`` for the loads given, and its picture (SVG or empty)."""
    from ..cli.commands import stress_report

    obj, text, drawn = stress_report(args, result, name, figure=True)
    svg = ""
    if drawn is not None:
        from ..report.plot_svg import torsion_svg

        if hasattr(drawn, "torque"):
            svg = torsion_svg(result, drawn, units=args.report_units or result.units)
        else:
            from ..report.plot_files import svg_text
            from ..report.plots import figure_combined

            svg = svg_text(figure_combined(result, drawn, units=args.report_units), "stress-")
    return text, obj, svg


def run_options(choices: Choices):
    """The catalogue's run options of the page's choices, parsed as the command parses them.

    The outlines are kept with each outcome, for the PDF pages.
    """
    from ..catalogue.items import RunOptions
    from ..cli.options import analysis_options, read_options

    args = parsed("catalogue", "files", [*choices.read, *choices.analysis])
    return RunOptions(read=read_options(args), analysis=analysis_options(args), outlines=True)


def catalogue_one(path: str, name: str, choices: Choices):
    """One profile of a catalogue: the catalogue's own worker, the names the user knows.

    Returns the :class:`~warpwise.catalogue.items.Outcome` of
    :func:`~warpwise.catalogue.workers.analyse_one`, its record and error under ``name``.
    """
    from ..catalogue.workers import analyse_one

    try:
        options = run_options(choices)
    except WarpwiseError as exc:
        from ..catalogue.items import Outcome

        return Outcome(name, None, _refusal(exc, path, name, choices).message, 0.0)
    out = analyse_one(path, options)
    record = replace(out.record, source=name) if out.record is not None else None
    error = _shown(out.error, path, name) if out.error else None
    return replace(out, path=name, record=record, error=error)
