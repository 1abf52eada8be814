"""The minimum wall thickness of a section and where it is.

From points sampled along every piece of the material outline (:mod:`.outline`: straight sides
and exact arcs), a ray is cast into the material along the inward normal; the distance to the
first side it meets is the thickness across the wall there, measured square to the side it
starts from. The smallest of these is the minimum wall thickness; the pieces of the thinnest
samples are then sampled again, finer. On walls of constant thickness (straight or concentric
circular faces) the value is exact; on a tapered wall it is exact to the sampling. Where two
sides meet at a convex corner sharper than a right angle, the material itself tapers to nothing
and the value is that found by the samples nearest the tip. A rounded convex corner (a toe, an
outer corner radius) is not a wall: a ray counts on such an arc only when it meets it square,
through its centre (the wall of a tube, the diameter of a disc), so that the rounding near the
end of a leg is not taken for a thin wall.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..geometry.profile import Profile
from .outline import Pieces, outline_pieces

#: Samples along the outline per largest dimension of the section (common practice, no
#: source: 1/400 of the size resolves every wall a mesh resolves), and on each piece refined.
SAMPLES_PER_SIZE, REFINED_SAMPLES, REFINED_PIECES = 400, 64, 8
#: A ray meets a convex arc square when it passes the centre within this fraction of the radius
#: (rays from arc samples are radial to round-off; common practice, no source).
SQUARE = 1e-7
#: Ray-side products evaluated per chunk (memory bound of the vectorised search).
CHUNK = 4_000_000


@dataclass(frozen=True)
class WallThickness:
    """The thinnest wall of a section, drawing unit L.

    Attributes
    ----------
    t_min : float
        Minimum wall thickness, L.
    at : tuple of float
        Middle of the thinnest crossing of the wall, drawing coordinates, L.
    """

    t_min: float
    at: tuple[float, float]


def _cross(u: np.ndarray, v: np.ndarray) -> np.ndarray:
    """Z component of the cross product of 2-vectors along the last axis."""
    return u[..., 0] * v[..., 1] - u[..., 1] * v[..., 0]


def _samples(p: Pieces, pieces: np.ndarray, counts: np.ndarray
             ) -> tuple[np.ndarray, np.ndarray]:
    """Points and inward normals at (i + 1/2)/k along each piece (k samples on a piece)."""
    piece = np.repeat(pieces, counts)
    first = np.repeat(np.cumsum(counts) - counts, counts)
    frac = (np.arange(len(piece)) - first + 0.5) / np.repeat(counts, counts)
    a, b = p.start[piece], p.end[piece]
    side = b - a
    left = np.stack([-side[:, 1], side[:, 0]], axis=1) / np.hypot(*side.T)[:, None]
    pts = a + frac[:, None] * side
    on_arc = p.arc[piece] >= 0
    if on_arc.any():
        c, r = p.centre[piece[on_arc]], p.radius[piece[on_arc]]
        # the point at that fraction of the arc's angle, the normal along the radius
        turn = p.turn[piece[on_arc]]
        a0 = a[on_arc] - c
        sense = np.sign(_cross(a0, b[on_arc] - c))
        ang = np.arctan2(a0[:, 1], a0[:, 0]) + sense * frac[on_arc] * turn
        radial = np.stack([np.cos(ang), np.sin(ang)], axis=1)
        pts[on_arc] = c + r[:, None] * radial
        # inward is the side of the chord's left normal
        left[on_arc] = radial * np.sign(np.sum(radial * left[on_arc], axis=1))[:, None]
    return pts, left


def _first_hits(p: Pieces, pts: np.ndarray, nrm: np.ndarray, eps: float) -> np.ndarray:
    """Distance from each point along its normal to the first piece met beyond ``eps``."""
    straight = p.arc < 0
    a, e = p.start[straight], (p.end - p.start)[straight]
    ca, cr = p.centre[~straight], p.radius[~straight]
    s0, s1 = p.start[~straight] - ca, p.end[~straight] - ca
    # material inside the circle: the chord's left normal points towards the centre
    chord = s1 - s0
    convex = (-chord[:, 1] * -(s0[:, 0] + s1[:, 0]) + chord[:, 0] * -(s0[:, 1] + s1[:, 1])) > 0
    lo = np.arctan2(s0[:, 1], s0[:, 0])
    span = np.mod(np.arctan2(s1[:, 1], s1[:, 0]) - lo, 2 * np.pi)
    backwards = span > np.pi  # the piece runs clockwise: measure from its end
    lo = np.where(backwards, lo + span, lo)
    span = np.where(backwards, 2 * np.pi - span, span)
    best = np.full(len(pts), np.inf)
    step = max(1, CHUNK // max(1, len(p.start)))
    for i in range(0, len(pts), step):  # chunks bound the memory, each is vectorised
        q, n = pts[i:i + step, None, :], nrm[i:i + step, None, :]
        d = a[None] - q
        den = _cross(n, e[None])
        with np.errstate(divide="ignore", invalid="ignore"):
            s = _cross(d, e[None]) / den
            u = _cross(d, n) / den
        s = np.where((np.abs(den) > 0) & (u >= -1e-12) & (u <= 1 + 1e-12) & (s > eps), s, np.inf)
        hit = s.min(axis=1, initial=np.inf)
        w = q - ca[None]
        B = np.sum(w * n, axis=2)
        disc = B**2 - (np.sum(w * w, axis=2) - cr[None] ** 2)
        root = np.sqrt(np.maximum(disc, 0.0))
        for sc in (-B - root, -B + root):
            hp = w + sc[..., None] * n
            rel = np.mod(np.arctan2(hp[..., 1], hp[..., 0]) - lo[None] + 1e-12, 2 * np.pi) - 1e-12
            ok = (disc >= 0) & (sc > eps) & (rel <= span[None] + 1e-12)
            ok &= ~convex[None] | (np.abs(_cross(n, w)) <= SQUARE * cr[None])
            hit = np.minimum(hit, np.where(ok, sc, np.inf).min(axis=1, initial=np.inf))
        best[i:i + step] = hit
    return best


def wall_thickness(profile: Profile) -> WallThickness:
    """The minimum wall thickness and the middle of the thinnest crossing.

    Parameters
    ----------
    profile : Profile
        The profile, drawing unit L.

    Returns
    -------
    WallThickness
        In L (see the module's text for how it is found and how exact it is).

    Examples
    --------
    >>> from warpwise.geometry.shapes import tube
    >>> round(wall_thickness(tube(40.0, 30.0)).t_min, 12)
    5.0
    """
    p = outline_pieces(profile)
    eps = 1e-9 * profile.size
    spacing = profile.size / SAMPLES_PER_SIZE
    counts = np.maximum(1, np.ceil(p.length / spacing).astype(int))
    pts, nrm = _samples(p, np.arange(len(p.start)), counts)
    dist = _first_hits(p, pts, nrm, eps)
    # the pieces of the thinnest samples again, finer
    order = np.argsort(dist)
    piece = np.repeat(np.arange(len(p.start)), counts)
    again = np.unique(piece[order[:REFINED_PIECES]])
    fine_pts, fine_nrm = _samples(p, again, np.full(len(again), REFINED_SAMPLES))
    pts, nrm = np.vstack([pts, fine_pts]), np.vstack([nrm, fine_nrm])
    dist = np.concatenate([dist, _first_hits(p, fine_pts, fine_nrm, eps)])
    k = int(np.argmin(dist))
    mid = pts[k] + 0.5 * dist[k] * nrm[k]
    return WallThickness(float(dist[k]), (float(mid[0]), float(mid[1])))


__all__ = ["WallThickness", "wall_thickness"]
