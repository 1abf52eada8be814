"""Options that would make a drawing analysable, each tried before ``warpwise check`` names it.

When a drawing cannot be analysed with the options given, :func:`find_remedies` tries other
choices of what the profile is: a part (``--part N``) or all parts (``--all-parts``), a single
layer (``--layer NAME``), and a joining tolerance that closes the gaps of the open chains
(``--join-tolerance D``, from the gaps :func:`~warpwise.io.dxf.open_chain_defects` measured),
alone and combined, fewest changes first. Only choices that give a valid profile are returned,
so every suggestion works as written.
"""

from __future__ import annotations

import math
import shlex
from dataclasses import dataclass

from ..errors import ProfileError, UsageError
from .defects import fmt
from .dxf import Drawing, Layout, lay_out, profile_of_layout
from .nesting import describe_part
from .options import ReadOptions

#: Largest number of suggestions.
MAX_REMEDIES = 6
#: Largest number of choices tried.
MAX_TRIALS = 40
#: Parts tried one by one (largest first).
MAX_PARTS = 10
#: Layers tried one by one.
MAX_LAYERS = 8
#: Largest joining tolerance suggested, as a fraction of the diagonal of the drawing: wider
#: gaps are openings to draw shut, not drafting inaccuracy (common practice, no source).
MAX_JOIN_FRACTION = 1e-3
#: The joining tolerance suggested is this many times the widest gap, rounded up.
JOIN_MARGIN = 1.5


@dataclass(frozen=True)
class Remedy:
    """Options that make the drawing analysable.

    Attributes
    ----------
    options : tuple of str
        Command-line words, e.g. ``("--layer", "SECTION", "--part", "2")``; they replace the
        layer, part and joining choices given.
    what : str
        What they choose, in words.
    """

    options: tuple[str, ...]
    what: str

    @property
    def text(self) -> str:
        """The options as typed on a command line (quoted where needed)."""
        return " ".join(shlex.quote(w) for w in self.options)


def round_up(value: float) -> float:
    """``value`` rounded up to one significant digit.

    Examples
    --------
    >>> round_up(0.0024), round_up(0.003), round_up(17.0)
    (0.003, 0.003, 20.0)
    """
    scale = 10.0 ** math.floor(math.log10(value))
    return float(f"{math.ceil(value / scale - 1e-9) * scale:.1g}")


def closing_tolerance(layout: Layout, diagonal: float) -> float | None:
    """A joining tolerance that closes the gaps of the open chains, or None.

    None when there are no open chains, or when the widest gap exceeds
    :data:`MAX_JOIN_FRACTION` of the drawing's diagonal (drawing unit).
    """
    gaps = [d.size for d in layout.defects
            if d.kind == "open chain" and d.size is not None and math.isfinite(d.size)]
    if not gaps:
        return None
    tol = round_up(JOIN_MARGIN * max(gaps))
    return tol if layout.tolerance < tol <= MAX_JOIN_FRACTION * diagonal else None


def _diagonal(drawing: Drawing) -> float:
    """Diagonal of the extent of every piece of the drawing, drawing unit."""
    ends = [q for p in drawing.pieces for q in (p.start, p.end)]
    if not ends:
        return 0.0
    xs, ys = [q[0] for q in ends], [q[1] for q in ends]
    return math.hypot(max(xs) - min(xs), max(ys) - min(ys))


def _works(layout: Layout, options: ReadOptions, part: int | None, all_parts: bool) -> bool:
    """True when the choice gives a valid profile that is one connected piece of material.

    Separate pieces cannot be analysed as one section (the warping of each is free), so all
    parts together are suggested only when they are connected (bonded by shared edges).
    """
    try:
        built = profile_of_layout(layout, part=part, all_parts=all_parts,
                                  chord_tolerance=options.chord_tolerance,
                                  mesh_size=options.mesh_size,
                                  layer_materials=dict(options.layer_materials),
                                  other_layers_material=options.other_layers_material)
    except (ProfileError, UsageError):
        return False
    union = built.profile.geometry()
    return len(getattr(union, "geoms", [union])) == 1


def _choices(layout: Layout) -> list[tuple[int | None, bool]]:
    """Part choices of a layout: each part, then all parts together."""
    n = len(layout.parts)
    return [(k, False) for k in range(1, min(n, MAX_PARTS) + 1)] + ([(None, True)] if n > 1 else [])


def _remedy(layout: Layout, changed: dict[str, object]) -> Remedy:
    """The options and words of one change of choices."""
    words: list[str] = []
    what: list[str] = []
    unit = layout.drawing.units.unit
    if "tol" in changed:
        words += ["--join-tolerance", fmt(changed["tol"])]
        what.append(f"ends up to {fmt(changed['tol'])} {unit} apart joined")
    if "layers" in changed:
        for name in changed["layers"]:
            words += ["--layer", name]
        what.append(f"layer {', '.join(changed['layers'])} only")
    if "part" in changed:
        part, all_parts = changed["part"]
        if all_parts:
            words.append("--all-parts")
            what.append(f"all {len(layout.parts)} parts as one section")
        else:
            p = layout.parts[part - 1]
            words += ["--part", str(part)]
            what.append(describe_part(part, p.bounds, p.area, unit))
    return Remedy(tuple(words), "; ".join(what))


def _lay_out(drawing: Drawing, layers: tuple[str, ...], tol: float | None) -> Layout | None:
    try:
        return lay_out(drawing, layers or None, tolerance=tol)
    except UsageError:
        return None


def find_remedies(drawing: Drawing, options: ReadOptions, layout: Layout) -> tuple[Remedy, ...]:
    """Choices of parts, layers and joining tolerance that make the drawing analysable.

    Parameters
    ----------
    drawing : Drawing
        The drawing.
    options : ReadOptions
        The options given (their other choices, such as the unit and chord tolerance, stay).
    layout : Layout
        The drawing laid out with the options given.

    Returns
    -------
    tuple of Remedy
        At most :data:`MAX_REMEDIES`, fewest changes first; each was tried and gives a valid
        profile. A choice that only adds to one already found is left out.
    """
    tols: list[float | None] = [options.join_tolerance]
    closing = closing_tolerance(layout, _diagonal(drawing))
    if closing is not None:
        tols.append(closing)
    layer_sets: list[tuple[str, ...]] = [options.layers]
    if len(drawing.layers) > 1:
        with_loops = [s.name for s in lay_out(drawing).layer_summaries() if s.loops]
        layer_sets += [(name,) for name in with_loops[:MAX_LAYERS] if (name,) != options.layers]
    given = (options.part, options.all_parts)
    candidates = []
    for t, tol in enumerate(tols):
        for s, layers in enumerate(layer_sets):
            lay = layout if t == s == 0 else _lay_out(drawing, layers, tol)
            if lay is None:
                continue
            for choice in [given, *(c for c in _choices(lay) if c != given)]:
                changed = {k: v for k, v, on in (("tol", tol, t > 0), ("layers", layers, s > 0),
                                                 ("part", choice, choice != given)) if on}
                if changed:
                    candidates.append((changed, lay, choice))
    candidates.sort(key=lambda c: len(c[0]))  # stable: fewest changes first, then as listed
    found: list[tuple[set[tuple[str, object]], Remedy]] = []
    trials = 0
    for changed, lay, choice in candidates:
        # a part is known by its place, not its number (numbers change with the layout)
        key = {(k, _part_key(lay, v) if k == "part" else v) for k, v in changed.items()}
        if any(f <= key for f, _ in found):
            continue  # only adds to a remedy already found
        if trials == MAX_TRIALS or len(found) == MAX_REMEDIES:
            break
        trials += 1
        if _works(lay, options, *choice):
            found.append((key, _remedy(lay, changed)))
    return tuple(r for _, r in found)


def _part_key(layout: Layout, choice: object) -> object:
    """What a part choice picks: the part's bounds, or all parts."""
    part, all_parts = choice  # type: ignore[misc]
    if all_parts or part is None:
        return "all"
    return tuple(float(f"{v:.9g}") for v in layout.parts[part - 1].bounds)  # round-off aside
