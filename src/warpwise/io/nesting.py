"""Loops judged and nested: every defect between loops listed, then even-odd parts.

:func:`loop_defects` lists loops that enclose no area, cross themselves, or cross or touch
another loop (all of them, each with its point, where the profile builder stops at the first);
:func:`nest_loops` groups loops by even-odd nesting into parts (solid regions with their holes)
and :func:`describe_part` puts a part in words for messages.
Both build on the loop checks of :mod:`warpwise.geometry.loops`.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np
import shapely
from shapely.geometry import LinearRing, Polygon

from ..geometry.loops import crossing_point, even_odd_nesting, meeting_pairs, meeting_point, signed_area
from .defects import ERROR, Defect, fmt, fmt_point


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
