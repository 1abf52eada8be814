"""Rays cast against the boundary segments of a profile: the distance to the first one each meets.

The wall thickness seen from the boundary (the mesher's sizing) and the material depth seen
from a sharp corner (the stress report's exclusion radius) are both the first hit of many rays.
:func:`first_hits` casts them all at once against a tree of the segments, short first: a ray
that meets a segment within its current reach has found its first hit; the others reach four
times as far in the next round. Work and memory then grow with the rays times the segments near
them, not times every segment a ray across the whole profile would cross.

Examples
--------
>>> seg_a = np.array([[0.0, 1.0], [0.0, 5.0]])
>>> seg_b = np.array([[10.0, 1.0], [10.0, 5.0]])
>>> first_hits(seg_a, seg_b, np.array([[2.0, 0.0], [20.0, 0.0]]), np.array([[0.0, 1.0], [0.0, 1.0]]),
...            reach=100.0).tolist()
[1.0, inf]
"""

from __future__ import annotations

import numpy as np
import shapely

#: First reach of the rays, as a fraction of the longest reach (default).
FIRST_REACH = 1.0 / 16.0
#: Growth of the reach from one round to the next.
REACH_GROWTH = 4.0


def first_hits(seg_a: np.ndarray, seg_b: np.ndarray, origin: np.ndarray, direction: np.ndarray, *,
               reach: float, start: float = 0.0, t_min: float = 0.0,
               tree: shapely.STRtree | None = None, first: float = FIRST_REACH) -> np.ndarray:
    """Distance along each ray to the first boundary segment it meets, drawing unit.

    Parameters
    ----------
    seg_a, seg_b : numpy.ndarray
        End points (M, 2) of the segments.
    origin : numpy.ndarray
        Ray origins (k, 2).
    direction : numpy.ndarray
        Unit directions (k, 2).
    reach : float
        Longest distance looked along a ray.
    start : float
        The ray begins this far from its origin (a segment through the origin is not met).
    t_min : float
        Hits at distances up to this are ignored.
    tree : shapely.STRtree, optional
        A tree of the segments as line strings, when the caller has one.
    first : float
        Reach of the first round as a fraction of ``reach`` (smaller when most rays are
        expected to stop far short of ``reach``).

    Returns
    -------
    numpy.ndarray
        Distance t (k,) from the origin to the first hit beyond ``t_min``; inf where a ray
        meets nothing within ``reach``.
    """
    if tree is None:
        tree = shapely.STRtree(shapely.linestrings(np.stack([seg_a, seg_b], axis=1)))
    out = np.full(len(origin), np.inf)
    todo = np.arange(len(origin))
    length = reach * first
    while len(todo):
        length = min(length, reach)
        p, n = origin[todo], direction[todo]
        lines = shapely.linestrings(np.stack([p + start * n, p + length * n], axis=1))
        ray_i, seg_j = tree.query(lines, predicate="intersects")
        # ray p + t n against segment q + s e: the 2 x 2 system for t
        pp, nn = p[ray_i], n[ray_i]
        q, e = seg_a[seg_j], seg_b[seg_j] - seg_a[seg_j]
        det = nn[:, 0] * (-e[:, 1]) + e[:, 0] * nn[:, 1]
        ok = np.abs(det) > 1e-300
        w = q - pp
        t = np.where(ok, (w[:, 0] * (-e[:, 1]) + e[:, 0] * w[:, 1]) / np.where(ok, det, 1.0), np.inf)
        t = np.where(t > t_min, t, np.inf)
        best = np.full(len(todo), np.inf)
        np.minimum.at(best, ray_i, t)
        done = (best <= length) | (length >= reach)
        out[todo[done]] = best[done]
        todo = todo[~done]
        length *= REACH_GROWTH
    return out


__all__ = ["FIRST_REACH", "REACH_GROWTH", "first_hits"]
