"""Traced outlines: loops with far more vertices than the mesh can use, simplified with a bound.

A loop traced from a scan or exported from a spline can carry hundreds of thousands of vertices
a few micrometres apart; the mesh would keep every one as a boundary node (a million elements
for a disc). :func:`simplify_dense_loops` takes a loop of more than :data:`DENSE_VERTICES`
vertices whose vertices lie closer together than :data:`DENSE_SPACING` of the mesh size and
drops the vertices
that lie within a tolerance of the chord through their neighbours (Douglas-Peucker, shapely),
no vertex moving more than :data:`SIMPLIFY_PER_MESH_SIZE` of the mesh size; the tolerance is
halved until the area of the loop changes by less than :data:`SIMPLIFY_AREA_BUDGET`. What was
done is said in a note. Loops of fewer vertices are never touched.

Examples
--------
>>> t = np.linspace(0.0, 2.0 * np.pi, 50_000, endpoint=False)
>>> disc = np.column_stack([np.cos(t), np.sin(t)]) * 100.0
>>> (out,), notes = simplify_dense_loops([disc], mesh_size=20.0)
>>> len(out) < 2_000, notes[0].startswith("loop 1 simplified from 50,000 to")
(True, True)
"""

from __future__ import annotations

from collections.abc import Sequence

import numpy as np
import shapely

from .loops import signed_area

#: Vertices above which a loop is looked at for simplification.
DENSE_VERTICES = 10_000
#: Largest distance a vertex may move, as a fraction of the mesh size.
SIMPLIFY_PER_MESH_SIZE = 1e-4
#: Vertex spacing (median) below which a dense loop is simplified, as a fraction of the mesh
#: size: a hundred vertices or more along one element edge.
DENSE_SPACING = 1e-2
#: Largest relative change of a loop's area (the DXF chords' budget, half of the 1e-4 promised).
SIMPLIFY_AREA_BUDGET = 0.5e-4


def _simplified(loop: np.ndarray, tolerance: float) -> np.ndarray:
    """The loop simplified at ``tolerance`` (rings kept valid), without the closing repeat."""
    ring = shapely.simplify(shapely.linearrings(loop), tolerance, preserve_topology=True)
    return np.asarray(shapely.get_coordinates(ring))[:-1]


def simplify_dense_loops(loops: Sequence[np.ndarray], mesh_size: float,
                         unit: str = "") -> tuple[list[np.ndarray], list[str]]:
    """Loops with their dense traced ones simplified, and a note for each simplified loop.

    Parameters
    ----------
    loops : sequence of numpy.ndarray
        Closed loops (n, 2), drawing unit.
    mesh_size : float
        The mesh size the profile is for, drawing unit.
    unit : str
        Length unit named in the notes.

    Returns
    -------
    loops : list of numpy.ndarray
        The loops, each dense one simplified.
    notes : list of str
        What was simplified, by how much at most, and the change of area.
    """
    out, notes = [], []
    for k, loop in enumerate(loops, start=1):
        loop = np.asarray(loop, dtype=float)
        if len(loop) <= DENSE_VERTICES or not (mesh_size > 0 and np.isfinite(mesh_size)):
            out.append(loop)
            continue
        spacing = float(np.median(np.hypot(*np.diff(loop, axis=0).T)))
        if spacing >= DENSE_SPACING * mesh_size:  # the mesh can use these vertices: leave them
            out.append(loop)
            continue
        tol = SIMPLIFY_PER_MESH_SIZE * mesh_size
        area = abs(signed_area(loop))
        for _ in range(20):
            simple = _simplified(loop, tol)
            change = abs(abs(signed_area(simple)) - area) / max(area, 1e-300)
            if len(simple) >= 3 and change <= SIMPLIFY_AREA_BUDGET:
                break
            tol *= 0.5
        else:
            out.append(loop)
            continue
        out.append(simple)
        notes.append(f"loop {k} simplified from {len(loop):,} to {len(simple):,} vertices, the "
                     f"outline moved at most {tol:.3g}{' ' + unit if unit else ''} "
                     f"({tol / mesh_size:.2g} of the mesh size): area changed by {change:.1e} "
                     "of the loop's")
    return out, notes


__all__ = ["DENSE_SPACING", "DENSE_VERTICES", "SIMPLIFY_AREA_BUDGET", "SIMPLIFY_PER_MESH_SIZE",
           "simplify_dense_loops"]
