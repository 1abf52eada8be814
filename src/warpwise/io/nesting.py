"""Loops judged and nested: every defect between loops listed, then even-odd parts.

:func:`loop_defects` lists loops that enclose no area, cross themselves, or cross or touch
another loop (all of them, each with its point, where the profile builder stops at the first);
:func:`nest_loops` groups loops by even-odd nesting into parts (solid regions with their holes)
and :func:`describe_part` puts a part in words for messages.
Both build on the loop checks of :mod:`warpwise.geometry.loops`.

The one rule for separate parts, which every reader follows: a file of one part is that part;
of several, :func:`choose_part` takes the one asked for (``--part N``, largest area first) or
all of them as one section (``--all-parts``), and refuses otherwise with
:func:`separate_parts_error`, naming both options; :func:`parts_note` says what was taken.
Loops of different materials that share an edge (a bonded insert) are one part.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np
import shapely
from shapely.geometry import LinearRing, Polygon

from ..errors import ProfileError, UsageError
from ..geometry.loops import crossing_point, even_odd_nesting, meeting_pairs, meeting_point, signed_area
from .defects import ERROR, Defect, fmt, fmt_point, plural

#: Largest number of parts named in a message.
PARTS_IN_MESSAGE = 10


def loop_defects(loops: Sequence[np.ndarray], labels: Sequence[str], layers: Sequence[str]) -> list[Defect]:
    """Loops that enclose no area, cross themselves, or cross or touch another loop.

    Parameters
    ----------
    loops : sequence of numpy.ndarray
        Closed polygons (n, 2), drawing unit.
    labels : sequence of str
        Name of each loop in messages.
    layers : sequence of str
        Layer of each loop.

    Returns
    -------
    list of Defect
        Errors, each with the point where it happens.

    """
    defects: list[Defect] = []
    rings = []
    for pts, name, layer in zip(loops, labels, layers, strict=True):
        ring = LinearRing(pts) if len(pts) >= 3 else None
        rings.append(ring)
        if ring is not None and not ring.is_simple:
            defects.append(Defect("self-crossing", f"{name} crosses itself", (crossing_point(ring),),
                                  ERROR, layer,
                                  anchor=True))
        elif ring is None or abs(signed_area(pts)) <= 1e-12 * max(np.ptp(pts, axis=0).max(), 1e-300) ** 2:
            defects.append(Defect("no area", f"{name} encloses no area", (tuple(pts[0]),),
                                  ERROR, layer, anchor=True))
            rings[-1] = None
    good = [k for k, r in enumerate(rings) if r is not None]
    if len(good) > 1:
        for u, v in meeting_pairs([rings[k] for k in good]):
            i, j = good[u], good[v]
            where, meet = meeting_point(rings[i], rings[j])
            how = "overlap" if meet.length > 0 else "cross or touch"
            defects.append(Defect("crossing loops", f"{labels[i]} and {labels[j]} {how}",
                                  (where,), ERROR, layers[i], anchor=True,
                                  layers=(layers[i], layers[j])))
    return defects


@dataclass(frozen=True)
class Part:
    """One connected piece of material: solid loops with their holes.

    Attributes
    ----------
    loops : tuple of int
        Indices of the loops of the part (each solid loop followed by its holes).
    area : float
        Area, drawing unit squared.
    bounds : (float, float, float, float)
        (xmin, ymin, xmax, ymax), drawing unit.
    holes : int
        Number of holes.
    """

    loops: tuple[int, ...]
    area: float
    bounds: tuple[float, float, float, float]
    holes: int


def describe_part(number: int, bounds: Sequence[float], area: float, unit: str) -> str:
    """A part in words: its number, size, lower-left corner and area.

    Examples
    --------
    >>> describe_part(2, (10.0, 0.0, 30.0, 5.0), 100.0, "mm")
    'part 2: 20 x 5 mm at (10, 0), area 100 mm2'

    """
    x0, y0, x1, y1 = bounds
    return (f"part {number}: {fmt(x1 - x0)} x {fmt(y1 - y0)} {unit} at {fmt_point((x0, y0))}, "
            f"area {fmt(area)} {unit}2")


def nest_loops(loops: Sequence[np.ndarray], materials: Sequence[str | None] | None = None) -> tuple[
        np.ndarray, list[Part]]:
    """Even-odd nesting of loops and the parts they form.

    Parameters
    ----------
    loops : sequence of numpy.ndarray
        Closed polygons (n, 2), drawing unit, that do not cross.
    materials : sequence of (str or None), optional
        Material of each loop; nesting is even-odd among loops of one material and a solid of
        another material inside a solid is an insert (part of the same part).

    Returns
    -------
    depth : numpy.ndarray
        For each loop, how many loops of its material contain it (even: solid, odd: hole).
    parts : list of Part
        Connected pieces of material, largest area first.

    """
    n = len(loops)
    mats = [None] * n if materials is None else list(materials)
    polys = [Polygon(p) for p in loops]
    depth, parent = even_odd_nesting(polys, mats)
    if n == 0:
        return depth, []
    solids = []
    for i in np.flatnonzero(depth % 2 == 0):
        holes = [int(h) for h in np.flatnonzero(parent == i)]
        poly = Polygon(loops[i], [loops[h] for h in holes])
        solids.append(([int(i), *holes], poly))
    if len(set(mats)) > 1:
        union = shapely.union_all([s[1] for s in solids])
        comps = list(union.geoms) if hasattr(union, "geoms") else [union]
        members: list[list[int]] = [[] for _ in comps]
        for idx, poly in solids:
            probe = poly.representative_point()
            k = int(np.argmin([c.distance(probe) for c in comps]))
            members[k] += idx
        parts = [Part(tuple(m), float(c.area), tuple(c.bounds),
                      sum(1 for i in m if depth[i] % 2)) for c, m in zip(comps, members, strict=True) if m]
    else:
        parts = []
        for idx, poly in solids:
            pts = np.vstack([loops[i] for i in idx])
            box = (*pts.min(axis=0).tolist(), *pts.max(axis=0).tolist())
            parts.append(Part(tuple(idx), float(abs(poly.area)), box, len(idx) - 1))
    # largest first; areas equal to round-off go left to right, then bottom to top
    top = max((p.area for p in parts), default=0.0)
    parts.sort(key=lambda p: (-round(p.area / top, 6) if top > 0 else 0.0, round(p.bounds[0], 9),
                              round(p.bounds[1], 9)))
    return depth, parts


def parts_text(parts: Sequence[Part], unit: str) -> str:
    """The first :data:`PARTS_IN_MESSAGE` parts in words, then how many more.

    Examples
    --------
    >>> parts_text([Part((0,), 40.0, (0.0, 0.0, 10.0, 4.0), 0),
    ...             Part((1,), 4.0, (20.0, 0.0, 22.0, 2.0), 1)], "mm")
    'part 1: 10 x 4 mm at (0, 0), area 40 mm2; part 2: 2 x 2 mm at (20, 0), area 4 mm2, 1 hole'

    """
    items = []
    for k, p in enumerate(parts[:PARTS_IN_MESSAGE]):
        holes = f", {plural(p.holes, 'hole')}" if p.holes else ""
        items.append(describe_part(k + 1, p.bounds, p.area, unit) + holes)
    more = len(parts) - PARTS_IN_MESSAGE
    if more > 0:
        items.append(f"and {more} more")
    return "; ".join(items)


def separate_parts_error(parts: Sequence[Part], unit: str, source: str, *, holder: str = "file",
                         numbering: str = "largest area first", why: str = "",
                         advice: str = "") -> ProfileError:
    """The refusal of several separate parts when neither a part nor all parts were chosen.

    Parameters
    ----------
    parts : sequence of Part
        The parts, largest first.
    unit : str
        Length unit of the sizes named.
    source : str
        The file.
    holder : str
        What holds the parts (``file``, ``drawing``).
    numbering : str
        How the parts are numbered, for ``--part N``.
    why : str
        Appended after the list (why no part was taken by itself).
    advice : str
        Appended at the end (other options that help).

    Examples
    --------
    >>> two = [Part((0,), 40.0, (0.0, 0.0, 10.0, 4.0), 0), Part((1,), 4.0, (20.0, 0.0, 22.0, 2.0), 0)]
    >>> print(separate_parts_error(two, "mm", "bars.txt"))  # doctest: +NORMALIZE_WHITESPACE
    bars.txt: the file holds 2 separate parts (part 1: 10 x 4 mm at (0, 0), area 40 mm2;
    part 2: 2 x 2 mm at (20, 0), area 4 mm2); analyse one with --part N (largest area first),
    or all as one section with --all-parts

    """
    return ProfileError(
        f"the {holder} holds {len(parts)} separate parts ({parts_text(parts, unit)}){why}; "
        f"analyse one with --part N ({numbering}), or all as one section with --all-parts{advice}",
        file=source)


def choose_part(parts: Sequence[Part], part: int | None, all_parts: bool, source: str, *,
                holder: str = "file") -> Part | None:
    """The part asked for, None for all of them (or the only one); refuse a number out of range.

    Parameters
    ----------
    parts : sequence of Part
        The parts, largest first.
    part : int or None
        One-based part number asked for (``--part N``).
    all_parts : bool
        Every part as one section (``--all-parts``).
    source : str
        The file, for messages.
    holder : str
        What holds the parts, for messages.

    Returns
    -------
    Part or None
        The chosen part; None when every part is taken (``all_parts``, or only one part) or
        when several parts remain for the caller to refuse (see :func:`separate_parts_error`).

    Raises
    ------
    UsageError
        Both a part and all parts, or a part number that does not exist.

    """
    if part is not None and all_parts:
        raise UsageError("give either a part number (--part) or --all-parts, not both", file=source)
    if part is None:
        return None
    if not 1 <= part <= len(parts):
        raise UsageError(f"part {part} does not exist: the {holder} has {plural(len(parts), 'part')}",
                         file=source)
    return parts[part - 1]


def parts_note(number: int | None, count: int) -> str | None:
    """The note saying which parts were taken: ``part 2 of 3``, or all of several, or None.

    Examples
    --------
    >>> parts_note(2, 3), parts_note(None, 1)
    ('part 2 of 3', None)
    >>> print(parts_note(None, 3))  # doctest: +NORMALIZE_WHITESPACE
    all 3 parts analysed as one section: J is the sum of the parts' J; the shear centre and Cw
    take the parts as kept in shape in their plane (by end plates or diaphragms) and free to
    slide along each other; shear areas and the elastic shear centre are not computed (they need
    the parts joined along the bar)

    """
    if number is not None:
        return f"part {number} of {count}"
    if count < 2:
        return None
    return (f"all {count} parts analysed as one section: J is the sum of the parts' J; the shear "
            "centre and Cw take the parts as kept in shape in their plane (by end plates or "
            "diaphragms) and free to slide along each other; shear areas and the elastic shear "
            "centre are not computed (they need the parts joined along the bar)")
