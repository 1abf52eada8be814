"""SPLINE curves: their construction, and their points within a distance, vectorised.

ezdxf's own flattening subdivides point by point in Python (tens of microseconds a point, 16
points at least per knot span), which takes minutes for a spline of 100,000 control points.
:func:`spline_points` evaluates every point at once with scipy's B-splines: per knot span a
bound on the second derivative spreads the chords (a chord over a parameter step d lies within
max|C''| d^2 / 8 of the curve), knots where the curve may turn a corner are kept, then every
chord whose midpoint on the curve is farther than the tolerance is halved until none is (the
test ezdxf's flattening makes).

:func:`spline_tool` is ezdxf's construction tool of the entity, but a spline given by fit
points only is interpolated by ezdxf with a dense matrix (n x n for n fit points): above
:data:`MAX_FIT_POINTS` it is refused before that memory is taken.
"""

from __future__ import annotations

import numpy as np

from ...errors import InputFileError

#: Most fit points of a SPLINE without control points (ezdxf interpolates them with an n x n
#: matrix held as Python lists: 2,000 fit points take about 130 MB and a second).
MAX_FIT_POINTS = 2_000

#: Most rounds of halving the chords that are still too far from the curve.
_MAX_ROUNDS = 40


def spline_tool(e: object, file: str, label: str) -> object:
    """The ezdxf B-spline of a SPLINE entity (``e.construction_tool()``), refusing a huge one.

    Parameters
    ----------
    e : ezdxf SPLINE entity
        The spline.
    file, label : str
        File name and entity label, for the message.

    Returns
    -------
    ezdxf.math.BSpline

    Raises
    ------
    InputFileError
        For a spline of more than :data:`MAX_FIT_POINTS` fit points and no control points.

    """
    n = e.fit_point_count()
    if not e.control_point_count() and n > MAX_FIT_POINTS:
        raise InputFileError(
            f"{label} is given by {n:,} fit points and no control points, more than the "
            f"{MAX_FIT_POINTS:,} that are interpolated (an n x n matrix, at least "
            f"{n * n * 8 / 1e6:,.0f} MB here); save the spline with its control points in the "
            "CAD program", file=file)
    return e.construction_tool()


def _evaluators(ct: object) -> tuple:
    """(curve, second derivative) of an ezdxf B-spline as vectorised functions of t (x-y)."""
    from scipy.interpolate import BSpline

    p = int(ct.degree)
    t = np.asarray(ct.knots(), dtype=float)
    c = np.asarray([tuple(v)[:2] for v in ct.control_points], dtype=float).reshape(-1, 2)
    if not ct.is_rational:
        num = BSpline(t, c, p)
        # derivatives by span (scipy evaluates them piecewise, across repeated knots too)
        return num, lambda u: num(u, nu=2) if p >= 2 else np.zeros((len(u), 2))
    w = np.asarray(ct.weights(), dtype=float)
    num, den = BSpline(t, c * w[:, None], p), BSpline(t, w, p)

    def curve(u: np.ndarray) -> np.ndarray:
        return num(u) / den(u)[:, None]

    def second(u: np.ndarray) -> np.ndarray:
        wu, w1 = den(u)[:, None], den(u, nu=1)[:, None]
        cu = num(u) / wu
        c1 = (num(u, nu=1) - cu * w1) / wu
        if p < 2:
            return -2.0 * c1 * w1 / wu
        return (num(u, nu=2) - 2.0 * c1 * w1 - cu * den(u, nu=2)[:, None]) / wu

    return curve, second


def _chord_distance(a: np.ndarray, b: np.ndarray, m: np.ndarray) -> np.ndarray:
    """Distance of points m from the chords a-b (from a where a chord has no length)."""
    d = b - a
    n = np.hypot(d[:, 0], d[:, 1])
    cross = np.abs(d[:, 0] * (m[:, 1] - a[:, 1]) - d[:, 1] * (m[:, 0] - a[:, 0]))
    with np.errstate(invalid="ignore", divide="ignore"):
        return np.where(n > 0, cross / np.where(n > 0, n, 1.0), np.hypot(*(m - a).T))


def spline_points(ct: object, tolerance: float) -> np.ndarray:
    """Points on a B-spline from its start to its end, no chord farther than ``tolerance`` from it.

    Parameters
    ----------
    ct : ezdxf.math.BSpline
        The spline (its x and y are used), drawing unit.
    tolerance : float
        Largest distance between a chord's midpoint on the curve and the chord, drawing unit.

    Returns
    -------
    numpy.ndarray
        Points (n, 2), drawing unit, over the spline's parameter range [t_p, t_n] (degree p,
        n control points).

    """
    curve, second = _evaluators(ct)
    p = int(ct.degree)
    knots = np.asarray(ct.knots(), dtype=float)
    lo, hi = knots[p], knots[len(knots) - p - 1]
    ends, mult = np.unique(np.clip(knots, lo, hi), return_counts=True)
    if len(ends) < 2:
        return curve(np.array([lo]))
    h = np.diff(ends)
    # |C''| sampled per span, just inside its ends (exact bound up to cubics)
    q = np.linspace(1e-9, 1.0 - 1e-9, 2 * p + 2)
    u = (ends[:-1, None] + h[:, None] * q[None, :]).ravel()
    m = np.nan_to_num(np.hypot(*second(u).T)).reshape(len(h), -1).max(axis=1)
    # chords spread evenly in the measure sqrt(max|C''| / (8 tol)) dt: one unit per chord
    need = np.concatenate([[0.0], np.cumsum(h * np.sqrt(m / (8.0 * tolerance)))])
    params = [np.interp(np.linspace(0.0, need[-1], int(np.ceil(need[-1])) + 1), need, ends)]
    corners = ends[1:-1][mult[1:-1] >= p]  # the curve may turn a corner at these knots
    params = np.unique(np.concatenate([params[0], corners, [lo, hi]]))
    pts = curve(params)
    for _ in range(_MAX_ROUNDS):
        mid = 0.5 * (params[:-1] + params[1:])
        mp = curve(mid)
        far = np.flatnonzero(_chord_distance(pts[:-1], pts[1:], mp) > tolerance)
        if not len(far):
            break
        params = np.insert(params, far + 1, mid[far])
        pts = np.insert(pts, far + 1, mp[far], axis=0)
    return pts
