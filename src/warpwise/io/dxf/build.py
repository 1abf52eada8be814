"""Step 3 of reading a DXF drawing: the profile of the chosen part(s).

:func:`build_profile` takes the part asked for or, of several parts, the only hatched one (a cut
section is drawn hatched; common practice, no source), refuses a drawing that is still
ambiguous (naming the options that choose) or that has defects in the chosen geometry (the first
defect, with its point and how to choose layers or parts), draws the loops of the chosen
part(s) as polygons at a chord tolerance tied to the mesh size
(:func:`choose_chord_tolerance`) and validates them with
:func:`warpwise.geometry.profile_from_loops`, noting what was decided on the way.
"""

from __future__ import annotations

import math
from collections import Counter
from collections.abc import Mapping, Sequence
from dataclasses import dataclass

from ...errors import ProfileError
from ...geometry.profile import Profile, default_element_size, profile_from_loops
from ..chords import arcs_for_mesh, chord_error, loop_points
from ..defects import Defect, fmt
from ..files import check_assumed_size
from ..nesting import PARTS_IN_MESSAGE, Part, choose_part, describe_part, parts_note, separate_parts_error
from ..pieces import Piece
from .layout import FRAME, JOIN_TOLERANCE, Layout, Loop

#: Chord tolerance to start from, as a fraction of the mesh size.
CHORD_PER_MESH_SIZE = 0.01
#: Finest chord tolerance chosen, as a fraction of the mesh size (keeps the polygons finite).
MIN_CHORD_PER_MESH_SIZE = 1e-7
#: Relative area the chords of all curves may change (half of the 1e-4 promised, as margin for
#: curves flattened by ezdxf).
CHORD_AREA_BUDGET = 0.5e-4


class DrawingError(ProfileError):
    """A defect of a drawing: the message, the point where it is, then advice on what to do.

    Parameters
    ----------
    message : str
        What is wrong.
    file : str, optional
        The drawing.
    where : tuple of float, optional
        Where it is, profile unit.
    advice : str
        Text after the point, e.g. how to choose a layer.

    Examples
    --------
    >>> str(DrawingError("loop 2 crosses itself", file="a.dxf", where=(1.0, 2.0),
    ...                  advice="; run 'warpwise check a.dxf'"))
    "a.dxf: loop 2 crosses itself at (1, 2); run 'warpwise check a.dxf'"

    """

    def __init__(self, message: str, *, file: str | None = None,
                 where: tuple[float, float] | None = None, advice: str = "") -> None:
        self.advice = advice
        super().__init__(message, file=file, where=where)

    def __str__(self) -> str:
        return super().__str__() + self.advice


@dataclass(frozen=True, eq=False)
class DxfProfile:
    """A profile read from a drawing, with what was decided on the way.

    Attributes
    ----------
    profile : Profile
        The validated profile.
    loop_layers : tuple of str
        Layer of each loop given to :func:`~warpwise.geometry.profile_from_loops`, in order.
    chord_tolerance : float
        Largest distance between a chord and its curve, profile unit.
    join_tolerance : float
        Joining tolerance, profile unit.
    part : int or None
        The part chosen (1-based), None for all.
    """

    profile: Profile
    loop_layers: tuple[str, ...]
    chord_tolerance: float
    join_tolerance: float
    part: int | None = None


def _layers_text(layout: Layout) -> str:
    return ", ".join(f"{s.name} ({s.holds or 'no closed geometry'})" if s.used or s.left_out
                     else f"{s.name} (not chosen)" for s in layout.layer_summaries())


def choose_chord_tolerance(loops: Sequence[Loop], pieces: Sequence[Piece], mesh_size: float) -> float:
    """Chord tolerance tied to the mesh size, made finer until the area is right.

    Starts from :data:`CHORD_PER_MESH_SIZE` times the mesh size and shrinks it until the
    chords change the area by at most :data:`CHORD_AREA_BUDGET` (:func:`chord_error`), but not
    below :data:`MIN_CHORD_PER_MESH_SIZE` times the mesh size.

    Parameters
    ----------
    loops : sequence of Loop
        The loops of the profile.
    pieces : sequence of Piece
        The pieces the loops index.
    mesh_size : float
        Mesh size, drawing unit.

    Returns
    -------
    float
        Chord (sagitta) tolerance, drawing unit.

    """
    s = CHORD_PER_MESH_SIZE * mesh_size
    floor = MIN_CHORD_PER_MESH_SIZE * mesh_size
    chains, depths = [lp.chain for lp in loops], [lp.depth for lp in loops]
    for _ in range(40):
        err = chord_error(chains, depths, pieces, s)
        if err <= CHORD_AREA_BUDGET or s <= floor:
            break
        s = max(floor, s * (max(0.05, 0.8 * CHORD_AREA_BUDGET / err) if math.isfinite(err) else 0.1))
    return s


def build_profile(layout: Layout, *, part: int | None = None, all_parts: bool = False,
                  chord_tolerance: float | None = None, mesh_size: float | None = None,
                  layer_materials: bool | Mapping[str, str] = False) -> DxfProfile:
    """The profile of a laid-out drawing.

    Parameters
    ----------
    layout : Layout
        From :func:`~warpwise.io.dxf.layout.lay_out`.
    part : int, optional
        Analyse only this part (1-based, largest area first); default the only part, else the
        only hatched part.
    all_parts : bool
        Analyse every part together as one section.
    chord_tolerance : float, optional
        Largest distance between a chord and its curve, profile unit; default
        :func:`choose_chord_tolerance` for the profile and ``mesh_size``.
    mesh_size : float, optional
        Mesh size the profile will be analysed with, profile unit (sets the chord tolerance).
    layer_materials : bool or mapping
        True: each loop's layer name becomes its material (even-odd nesting per layer, a
        region inside one of another layer is an insert). A mapping from layer to material
        name does the same with renamed materials. Default False: one material.

    Returns
    -------
    DxfProfile

    Raises
    ------
    ProfileError
        No closed loop, any defect of the chosen geometry (open chain, crossing, branching,
        truncated file), or several parts when neither ``part`` nor ``all_parts`` is given
        and not exactly one of them is hatched.
    UsageError
        A part number out of range, or both ``part`` and ``all_parts``.

    """
    d = layout.drawing
    name = d.source
    hint = f"run 'warpwise check {name}' to list and plot them"
    layer_hint = (f"; to use only some layers give --layer NAME (layers: {_layers_text(layout)})"
                  if len(d.layers) > 1 else "")
    if not layout.loops:
        raise _no_loop_error(layout, layer_hint)
    parts = layout.parts
    choose_part(parts, part, all_parts, name, holder="drawing")  # refuses a part out of range
    number = part
    if part is None and not all_parts and len(parts) > 1 and len(layout.hatched) == 1:
        number = layout.hatched[0] + 1  # the one cut section of the sheet
    chosen = parts[number - 1] if number is not None else None
    errors = _errors_of_choice(layout, chosen, bool(layer_materials))
    if errors:
        first = errors[0]
        lead = f"{len(errors)} defects ({hint}); the first: " if len(errors) > 1 else ""
        if number is not None and part is None:
            lead = (f"the section (part {number} of {len(parts)}, the only hatched part) has "
                    + (lead or "a defect: "))
        raise DrawingError(f"{lead}{first.text}", file=name, where=first.point,
                           advice=layer_hint if first.layer else "")
    if number is None and not all_parts and len(parts) > 1:
        raise _several_parts_error(layout, layer_hint)
    picked = list(chosen.loops) if chosen is not None else [k for p in parts for k in p.loops]
    area = chosen.area if chosen is not None else sum(p.area for p in parts)
    curved = sum(d.pieces[i].curved_length for k in picked for i, _ in layout.loops[k].chain.steps)
    s = _chord_tolerance(layout, picked, curved, chord_tolerance, mesh_size, area)
    loops, arcs, layers = [], [], []
    for k in picked:
        pts, loop_arcs = loop_points(layout.loops[k].chain, d.pieces, s)
        loops.append(pts)
        arcs += loop_arcs
        layers.append(layout.loops[k].layer)
    materials = None
    if layer_materials:
        table = layer_materials if isinstance(layer_materials, Mapping) else {}
        materials = [table.get(name_, name_) for name_ in layers]
    notes = _notes(layout, number, part is None, s, curved, hint)
    notes += _hatch_notes(layout, picked)
    same = 1e-9 * layout.tolerance / JOIN_TOLERANCE  # centres and radii equal to round-off
    profile = profile_from_loops(loops, materials, source=name, units=d.units.unit, notes=notes,
                                 arcs=arcs_for_mesh(arcs, same))
    if d.units.origin == "assumed":
        profile = check_assumed_size(profile)
    return DxfProfile(profile, tuple(layers), float(s), layout.tolerance, number)


def _no_loop_error(layout: Layout, layer_hint: str) -> ProfileError:
    """The error for a drawing without a closed loop, with what it does hold."""
    d = layout.drawing
    if layout.errors:
        first = layout.errors[0]
        return DrawingError(f"no closed loop found; {first.text}", file=d.source, where=first.point,
                            advice=layer_hint)
    what = "no lines, arcs or curves found" if not d.pieces else "no closed loop found"
    skipped = ", ".join(f"{n} {t}" for t, n in sorted(d.skipped.items()))
    bad = [x for x in layout.defects if x.kind in ("unreadable", "not flat")]
    extra = [f"left out, not geometry: {skipped}"] if skipped else []
    if bad:
        extra.append(f"{len(bad)} entit{'y' if len(bad) == 1 else 'ies'} could not be used, "
                     f"the first: {bad[0].text}")
    found = sum(n for t, n in d.entities.items() if t not in d.skipped)
    if d.repairs and found and not d.pieces:
        extra.append(f"ezdxf removed or repaired {len(d.repairs)} broken item(s) while reading, "
                     f"the first: {d.repairs[0]}")
    return ProfileError(what + (f" ({'; '.join(extra)})" if extra else ""), file=d.source)


def _errors_of_choice(layout: Layout, chosen: Part | None, layer_materials: bool) -> list[Defect]:
    """The errors that stop the analysis of the chosen part (None: of the whole drawing)."""
    errors = list(layout.errors)
    if layer_materials:  # loops of two materials may share an edge; their areas are checked later
        errors = [e for e in errors if not (e.kind == "crossing loops" and len(set(e.layers)) > 1)]
    if chosen is not None and errors:
        from shapely.geometry import Point, Polygon

        outer = Polygon(layout.loops[chosen.loops[0]].points).buffer(layout.tolerance)
        errors = [e for e in errors if not e.where or any(outer.covers(Point(w)) for w in e.where)]
    return errors


def _chord_tolerance(layout: Layout, picked: Sequence[int], curved: float,
                     given: float | None, mesh_size: float | None, area: float) -> float:
    """The chord tolerance given, else one for the mesh size; the joining tolerance without curves."""
    if given is not None:
        s = float(given)
    elif curved > 0:
        h = mesh_size if mesh_size else default_element_size(area)
        s = choose_chord_tolerance([layout.loops[k] for k in picked], layout.drawing.pieces, h)
    else:
        s = layout.tolerance
    if not (s > 0 and math.isfinite(s)):
        s = layout.tolerance
    return s


def _several_parts_error(layout: Layout, layer_hint: str) -> ProfileError:
    """The error for a drawing of several parts where no single hatched part is the section."""
    d = layout.drawing
    parts, hatched = layout.parts, layout.hatched
    listing = f"numbered as 'warpwise check {d.source}' lists them"
    frame = ("; the drawing frame around them is left out"
             if any(x.kind == FRAME for x in layout.defects) else "")
    if len(hatched) > 1:
        which = "; ".join(describe_part(k + 1, parts[k].bounds, parts[k].area, d.units.unit)
                          for k in hatched[:PARTS_IN_MESSAGE])
        return ProfileError(
            f"the drawing holds {len(hatched)} hatched sections ({which}) among {len(parts)} parts"
            f"{frame}; analyse one with --part N ({listing}), or every part as one section with "
            "--all-parts", file=d.source)
    return separate_parts_error(parts, d.units.unit, d.source, holder="drawing", numbering=listing,
                                why=f" and no hatch marks one as the section{frame}", advice=layer_hint)


def _notes(layout: Layout, part: int | None, asked: bool, s: float, curved: float, hint: str) -> list[str]:
    """What was decided on the way, one line each, for the profile's notes."""
    d = layout.drawing
    notes = [d.units.note]
    if curved > 0:
        notes.append(f"curves drawn as chords at most {fmt(s)} {d.units.unit} from the true curve")
    if part is not None and asked:
        notes.append(f"part {part} of {len(layout.parts)} taken as the section: the only hatched part "
                     "(a cut section is drawn hatched); choose another with --part N")
    elif (taken := parts_note(part, len(layout.parts))) is not None:
        notes.append(taken)
    if d.skipped:
        notes.append("left out (not geometry): " + ", ".join(
            f"{n} {t}" for t, n in sorted(d.skipped.items())))
    if layout.left_out:
        notes.append("left out (no closed geometry): layer " + ", ".join(sorted(layout.left_out)))
    notes += [x.text for x in layout.defects if x.kind == FRAME]
    repaired = Counter(x.kind for x in layout.defects if not x.fatal and x.kind != FRAME)
    if repaired:
        notes.append("repaired: " + ", ".join(f"{n} {k}" for k, n in sorted(repaired.items()))
                     + f" ({hint})")
    return notes


def _hatch_notes(layout: Layout, picked: Sequence[int]) -> list[str]:
    """Which loops of the profile were read from hatch boundaries alone."""
    owner = {i: h.label for h in layout.drawing.hatches for path in h.paths for i in path}
    names = sorted({owner[i] for k in picked for i, _ in layout.loops[k].chain.steps if i in owner})
    if not names:
        return []
    return [f"outline read from the boundary of {', '.join(names)} (no lines are drawn along it)"]
