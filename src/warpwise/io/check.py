"""The report of ``warpwise check``: what a drawing holds and everything wrong with it.

:func:`check_file` reads a drawing the way ``warpwise props`` does, but instead of stopping at
the first defect it collects all of them: open chains with their free ends and gaps, branch
points, self-crossing and crossing loops, duplicate and zero-length pieces, entities that could
not be used, a truncated file. :func:`format_report` prints the findings, and
:func:`warpwise.report.check_plot.plot_report` draws the outline with every defect marked.
The verdict (``CheckReport.ok``) is True exactly when the profile can be analysed with the same
options; when it is not, the report names the options that would make it analysable (other
parts, layers or joining tolerance, each tried: :mod:`warpwise.io.remedies`).

Examples
--------
>>> import ezdxf, tempfile, pathlib
>>> doc = ezdxf.new()
>>> msp = doc.modelspace()
>>> _ = msp.add_lwpolyline([(0, 0), (40, 0), (40, 20), (0, 20)])   # not closed
>>> path = pathlib.Path(tempfile.mkdtemp()) / "open.dxf"
>>> doc.saveas(path)
>>> report = check_file(path)
>>> report.ok, [d.kind for d in report.defects]
(False, ['open chain'])

"""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path

import numpy as np

from ..errors import ProfileError, UsageError
from ..geometry.profile import Profile
from . import is_dxf
from .chords import loop_points
from .defects import ERROR, Defect, fmt, plural
from .dxf import (
    DxfProfile,
    LayerSummary,
    lay_out,
    layer_material_table,
    profile_of_layout,
    read_drawing,
)
from .nesting import describe_part
from .options import ReadOptions
from .outline import read_outline, refuse_dxf_options
from .remedies import Remedy, find_remedies

#: Repairs made by ezdxf listed one by one in the report (the rest are counted).
REPAIRS_SHOWN = 5


@dataclass(frozen=True)
class PartSummary:
    """One connected part of the section.

    Attributes
    ----------
    number : int
        Part number as ``--part N`` takes it (largest area first).
    bounds : (float, float, float, float)
        (xmin, ymin, xmax, ymax), length unit.
    area : float
        Area, length unit squared.
    holes : int
        Number of holes.
    """

    number: int
    bounds: tuple[float, float, float, float]
    area: float
    holes: int


@dataclass(frozen=True, eq=False)
class CheckReport:
    """Findings of ``warpwise check`` for one file.

    Attributes
    ----------
    source : str
        File name.
    kind : str
        ``DXF drawing`` or ``coordinate outline``.
    version : str
        DXF version ($ACADVER), empty for outlines.
    entities, in_blocks, skipped : dict of str to int
        Entities by type: in model space, inside block references, left out as not geometry.
    repairs : tuple of str
        What ezdxf fixed while reading.
    unit : str
        Length unit of all coordinates below.
    unit_note : str
        Where the unit came from.
    join_tolerance : float or None
        Ends closer than this were joined, length unit.
    join_given : bool
        True when the joining tolerance was given (``--join-tolerance``).
    chord_tolerance : float or None
        Largest distance of a chord from its curve in the profile, length unit (None when the
        profile could not be built or has no curves).
    layers : tuple of LayerSummary
        Every layer with geometry.
    loops, holes, islands : int
        Closed loops, and how many of them are holes and islands (solid inside a hole).
    parts : tuple of PartSummary
        Connected parts, largest first.
    defects : tuple of Defect
        Everything wrong, errors and warnings.
    ok : bool
        True when the profile can be analysed with the options given.
    verdict : str
        ``analysable`` or the one-line reason it is not.
    outline : tuple of numpy.ndarray
        Loop polygons (for the plot), length unit.
    depth : tuple of int
        Nesting depth of each loop (even: solid boundary, odd: hole).
    open_paths : tuple of numpy.ndarray
        Open chains on the layers used (for the plot).
    ignored_paths : tuple of numpy.ndarray
        Open chains on layers left out (for the plot).
    remedies : tuple of Remedy
        When not analysable: options that make it analysable, each tried.
    """

    source: str
    kind: str
    version: str
    entities: dict[str, int]
    in_blocks: dict[str, int]
    skipped: dict[str, int]
    repairs: tuple[str, ...]
    unit: str
    unit_note: str
    join_tolerance: float | None
    chord_tolerance: float | None
    layers: tuple[LayerSummary, ...]
    loops: int
    holes: int
    islands: int
    parts: tuple[PartSummary, ...]
    defects: tuple[Defect, ...]
    ok: bool
    verdict: str
    outline: tuple[np.ndarray, ...] = ()
    depth: tuple[int, ...] = ()
    open_paths: tuple[np.ndarray, ...] = ()
    ignored_paths: tuple[np.ndarray, ...] = ()
    remedies: tuple[Remedy, ...] = ()
    join_given: bool = False

    @property
    def errors(self) -> tuple[Defect, ...]:
        """Defects that stop the analysis."""
        return tuple(d for d in self.defects if d.fatal)

    @property
    def warnings(self) -> tuple[Defect, ...]:
        """Defects that were repaired or left out."""
        return tuple(d for d in self.defects if not d.fatal)


def _check_dxf(path: str | Path, o: ReadOptions) -> CheckReport:
    drawing = read_drawing(path, o.units, o.max_entities)
    layout = lay_out(drawing, o.layers or None, tolerance=o.join_tolerance)
    if o.layer_materials:  # a layer given a material that the profile lacks is a usage error
        layer_material_table(layout, dict(o.layer_materials), o.other_layers_material)
    built: DxfProfile | None = None
    remedies: tuple[Remedy, ...] = ()
    try:
        built = profile_of_layout(layout, part=o.part, all_parts=o.all_parts,
                                  chord_tolerance=o.chord_tolerance, mesh_size=o.mesh_size,
                                  layer_materials=dict(o.layer_materials),
                                  other_layers_material=o.other_layers_material)
        verdict = "analysable"
    except (ProfileError, UsageError) as exc:
        verdict = str(exc)
        remedies = find_remedies(drawing, o, layout)
    defects = list(layout.defects)
    depth = [lp.depth for lp in layout.loops]
    curved = built is not None and any(
        drawing.pieces[i].curved_length > 0 for lp in layout.loops for i, _ in lp.chain.steps)
    pieces = drawing.pieces
    return CheckReport(
        source=drawing.source, kind="DXF drawing", version=drawing.version,
        entities=drawing.entities, in_blocks=drawing.in_blocks, skipped=drawing.skipped,
        repairs=drawing.repairs, unit=drawing.units.unit, unit_note=drawing.units.note,
        join_tolerance=layout.tolerance,
        chord_tolerance=built.chord_tolerance if built is not None and curved else None,
        layers=layout.layer_summaries(), loops=len(layout.loops),
        holes=sum(1 for d in depth if d % 2), islands=sum(1 for d in depth if d and d % 2 == 0),
        parts=tuple(PartSummary(k + 1, p.bounds, p.area, p.holes) for k, p in enumerate(layout.parts)),
        defects=tuple(defects), ok=built is not None, verdict=verdict,
        outline=tuple(lp.points for lp in layout.loops), depth=tuple(depth),
        open_paths=tuple(loop_points(c, pieces, layout.tolerance)[0] for c in layout.open_chains),
        ignored_paths=tuple(loop_points(c, pieces, layout.tolerance)[0] for c in layout.ignored),
        remedies=remedies, join_given=o.join_tolerance is not None,
    )


def _check_outline(path: str | Path, o: ReadOptions) -> CheckReport:
    refuse_dxf_options(path, o)
    units = o.units
    profile: Profile | None = None
    try:
        profile = read_outline(path, units, part=o.part, all_parts=o.all_parts)
        verdict = "analysable"
        defects: tuple[Defect, ...] = ()
    except ProfileError as exc:
        verdict = str(exc)
        where = (exc.where,) if exc.where is not None else ()
        defects = (Defect("invalid outline", exc.message, where, ERROR, anchor=bool(where)),)
    regions = profile.regions if profile is not None else ()
    unit = profile.units if profile is not None else (units or "mm")
    loops = tuple(lp for r in regions for lp in r.loops())
    depth = tuple(d for r in regions for d in [0] + [1] * len(r.holes))
    parts = []
    if profile is not None:
        # a part is a connected piece of material: regions of different materials that share
        # an edge (a bonded insert) form one part
        union = profile.geometry()
        pieces = sorted(getattr(union, "geoms", [union]), key=lambda g: -g.area)
        for k, g in enumerate(pieces):
            parts.append(PartSummary(k + 1, tuple(float(v) for v in g.bounds), float(g.area),
                                     len(g.interiors)))
    note = next((n for n in (profile.notes if profile else ()) if "unit" in n), f"length unit {unit}")
    return CheckReport(
        source=str(path), kind="coordinate outline", version="", entities={}, in_blocks={},
        skipped={}, repairs=(), unit=unit, unit_note=note, join_tolerance=None, chord_tolerance=None,
        layers=(), loops=len(loops), holes=sum(len(r.holes) for r in regions), islands=0,
        parts=tuple(parts), defects=defects, ok=profile is not None, verdict=verdict,
        outline=loops, depth=depth)


def check_file(path: str | Path, options: ReadOptions | None = None, **choices: object) -> CheckReport:
    """Read a drawing or outline and report what it holds and every defect.

    Parameters
    ----------
    path : str or Path
        DXF drawing (``.dxf``) or coordinate outline.
    options : ReadOptions, optional
        How the file is read, as for the analysis (default: ``ReadOptions(**choices)``).
    **choices
        Fields of :class:`~warpwise.io.options.ReadOptions` (units, layers, part, all_parts,
        chord_tolerance, mesh_size, join_tolerance, layer_materials, max_entities) when
        ``options`` is not given.

    Returns
    -------
    CheckReport

    Raises
    ------
    InputFileError
        For a file that cannot be read at all (missing, empty, not DXF, corrupt).
    UsageError
        For an unknown layer, or DXF-only options on an outline.

    """
    if options is None:
        options = ReadOptions(**choices)  # type: ignore[arg-type]
    check = _check_dxf if is_dxf(path) else _check_outline
    return check(path, options)


def _counts(counts: dict[str, int]) -> str:
    return ", ".join(f"{n} {t}" for t, n in sorted(counts.items(), key=lambda kv: (-kv[1], kv[0])))


def format_report(report: CheckReport) -> str:
    """The report as text, one finding per line.

    Parameters
    ----------
    report : CheckReport
        From :func:`check_file`.

    Returns
    -------
    str
        Lines ending in a newline; coordinates in the report's length unit.

    """
    u = report.unit
    lines = [f"Check of {report.source}"]
    kind = report.kind + (f", version {report.version}" if report.version else "")
    if report.repairs:
        kind += f"; ezdxf made {plural(len(report.repairs), 'repair')} while reading"
    lines.append(f"  file: {kind}")
    for text in report.repairs[:REPAIRS_SHOWN]:
        lines.append(f"    repaired: {text}")
    if len(report.repairs) > REPAIRS_SHOWN:
        lines.append(f"    and {len(report.repairs) - REPAIRS_SHOWN} more repairs")
    lines.append(f"  units: {report.unit_note}")
    if report.entities:
        lines.append(f"  entities: {_counts(report.entities)}")
    if report.in_blocks:
        lines.append(f"  inside block references: {_counts(report.in_blocks)}")
    if report.skipped:
        lines.append(f"  left out, not geometry: {_counts(report.skipped)}")
    if report.join_tolerance is not None:
        given = ", given" if report.join_given else ""
        lines.append(f"  joining tolerance: {fmt(report.join_tolerance)} {u} (ends closer than this "
                     f"are joined{given})")
    if report.layers:
        lines.append("  layers:")
        for layer in report.layers:
            if layer.used:
                lines.append(f"    {layer.name}: {layer.holds or 'nothing closed'}")
            elif layer.left_out:
                lines.append(f"    {layer.name}: {layer.holds}  (left out: no closed geometry)")
            else:
                lines.append(f"    {layer.name}: not chosen")
    outers = report.loops - report.holes - report.islands
    lines.append(f"  loops: {report.loops} ({plural(outers, 'outer loop')}, "
                 f"{plural(report.holes, 'hole')}, {plural(report.islands, 'island')})")
    lines.append(f"  parts: {len(report.parts)}")
    for p in report.parts:
        lines.append(f"    {describe_part(p.number, p.bounds, p.area, u)}, {plural(p.holes, 'hole')}")
    if report.chord_tolerance is not None:
        lines.append(f"  chord tolerance: {fmt(report.chord_tolerance)} {u} (largest distance of a "
                     "chord from its curve)")
    n_err, n_warn = len(report.errors), len(report.warnings)
    lines.append(f"  defects: {plural(n_err, 'error')}, {plural(n_warn, 'warning')}")
    for k, d in enumerate(report.defects, start=1):
        lines.append(f"    {k}. {d.severity}: {d.message}")
    verdict = report.verdict.removeprefix(f"{report.source}: ")
    lines.append("  result: analysable" if report.ok else f"  result: not analysable: {verdict}")
    if report.remedies:
        lines.append("  analysable with (each tried; in place of any --layer, --part, --all-parts "
                     "and --join-tolerance given):")
        width = max(len(r.text) for r in report.remedies)
        lines += [f"    {r.text:<{width}}  {r.what}" for r in report.remedies]
    return "\n".join(lines) + "\n"


__all__ = ["CheckReport", "LayerSummary", "PartSummary", "Remedy", "check_file", "format_report"]
