"""Accuracy settings and error estimates by Richardson extrapolation on refined meshes.

An estimate solves the same profile on two further meshes, each with every local element size
divided by sqrt(2) once more (refinement factors r, r sqrt(2), 2 r), measures the observed
convergence rate of each quantity from the three values and extrapolates. The estimated error is
that of the value reported at the first mesh (the one shown in the table), relative to the
extrapolated value; coordinates (shear centre) are taken relative to the profile's size.

Under refinement the boundary is split with the interior (every drawn segment into about as
many pieces as the refinement factor), so a dense boundary is refined too. Where the outline
follows recorded arcs, the part of the error that the curved element edges owe to the true
curves is measured directly on each mesh (:mod:`warpwise.properties.geometry_error`) and
removed before extrapolating, so that the estimate includes it even where no boundary edge is
split (the draft setting, a boundary already finer than the mesh).

Examples
--------
>>> ACCURACY_LEVELS["normal"]
1.0
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, field, replace

import numpy as np

from ..errors import UsageError
from ..geometry.profile import Profile
from ..mesh.core import MAX_ELEMENTS, build_mesh
from .analysis import SectionResult, analyse
from .geometry_error import outline_corrections
from .shear import DEFAULT_POISSON

#: Refinement factor of each accuracy setting (divides every local element size).
ACCURACY_LEVELS: dict[str, float] = {"draft": 0.5, "normal": 1.0, "fine": 2.0}

#: Refinement ratio between the meshes of an error estimate.
STEP = float(np.sqrt(2.0))


def refinement_for(accuracy: str) -> float:
    """Refinement factor of an accuracy setting name (draft, normal, fine)."""
    try:
        return ACCURACY_LEVELS[accuracy]
    except KeyError:
        raise UsageError(f"unknown accuracy {accuracy!r} (use {', '.join(ACCURACY_LEVELS)})") from None


#: The values whose error is estimated (the one list): key in ``SectionResult.errors`` -> (how
#: to read the value off a result, the reported quantities it covers, whether it is a
#: coordinate, judged relative to the profile's size).
ESTIMATED: dict[str, tuple[Callable[[SectionResult], float], tuple[str, ...], bool]] = {
    "J": (lambda r: r.torsion.J, ("J",), False),
    "Cw": (lambda r: r.torsion.Cw, ("Cw",), False),
    "Wt": (lambda r: float("nan") if r.torsion_modulus is None else r.torsion_modulus.Wt,
           ("Wt",), False),
    "omega_max": (lambda r: r.torsion.omega_max, ("omega_max",), False),
    "xs": (lambda r: r.torsion.shear_centre[0], ("xs",), True),
    "ys": (lambda r: r.torsion.shear_centre[1], ("ys",), True),
    "Wel_x": (lambda r: r.geometric.Wel["x"], ("Wel_x_top", "Wel_x_bottom"), False),
    "Wel_y": (lambda r: r.geometric.Wel["y"], ("Wel_y_right", "Wel_y_left"), False),
    "Wel_1": (lambda r: r.geometric.Wel["1"], ("Wel_1_pos", "Wel_1_neg"), False),
    "Wel_2": (lambda r: r.geometric.Wel["2"], ("Wel_2_pos", "Wel_2_neg"), False),
    "As_x": (lambda r: r.shear.As_x, ("As_x",), False),
    "As_y": (lambda r: r.shear.As_y, ("As_y",), False),
}

#: Keys of the error estimates, in reporting order.
ERROR_KEYS: tuple[str, ...] = tuple(ESTIMATED)

#: Reported quantity key -> the error estimate that covers it.
ERROR_OF_QUANTITY: dict[str, str] = {q: k for k, (_, covered, _) in ESTIMATED.items()
                                     for q in covered}


#: Estimated value -> the second moment whose outline correction scales it (section moduli are
#: I / c with c taken from the true curves already).
_SCALED_BY = {"Wel_x": "Ix", "Wel_y": "Iy", "Wel_1": "I1", "Wel_2": "I2"}


def _quantities(r: SectionResult) -> dict[str, float]:
    """The values whose error is estimated, corrected to first order for the meshed outline.

    Where the outline follows recorded arcs, J, Cw, the shear centre and the section moduli
    get the first-order change from the curved element edges to the true curves
    (:func:`warpwise.properties.geometry_error.outline_corrections`), so that the estimate
    sees that part of the error however the boundary is refined; the shear areas and
    omega_max keep it in their refinement.
    """
    q = {key: float(read(r)) for key, (read, _, _) in ESTIMATED.items()}
    if not r.profile.arcs:
        return q
    d = outline_corrections(r)
    for key in ("J", "Cw", "xs", "ys"):
        q[key] += d[key]
    geo = r.geometric
    second = {"Ix": geo.Ix, "Iy": geo.Iy, "I1": geo.I1, "I2": geo.I2}
    for key, moment in _SCALED_BY.items():
        if second[moment] > 0:
            q[key] *= 1.0 + d[moment] / second[moment]
    return q


@dataclass(frozen=True, eq=False)
class ErrorEstimate:
    """Estimated errors of a result.

    Attributes
    ----------
    result : SectionResult
        The result at the requested accuracy (the reported values).
    relative_error : dict of str to float
        Estimated |error| of each reported value relative to the extrapolated value (for
        coordinates: relative to the profile's size).
    rate : dict of str to float
        Observed convergence rate per refinement of sizes, as the exponent p in error ~ h^p
        (nan where the values did not converge monotonically).
    extrapolated : dict of str to float
        Richardson-extrapolated values.
    nodes : tuple of int
        Node counts of the three meshes.
    """

    result: SectionResult
    relative_error: dict[str, float] = field(default_factory=dict)
    rate: dict[str, float] = field(default_factory=dict)
    extrapolated: dict[str, float] = field(default_factory=dict)
    nodes: tuple[int, ...] = ()


#: Slowest convergence rate (error ~ h^p) an integral value of the P2 solution can have: the
#: energy error at a crack-like re-entrant corner (360 degrees, singular exponent 1/2) falls as
#: h^(2 x 1/2) (Strang & Fix, An Analysis of the Finite Element Method, ch. 8, from memory). A
#: lower observed rate is a pre-asymptotic step (a middle mesh that gained little, as the
#: integer splits of a dense boundary give at sqrt(2)), not the tail; assuming it overstated a
#: slit tube's Cw error 3.6 times. Largest values (omega_max) and the stress-based Wt converge
#: pointwise and keep 0.5.
SLOWEST_RATE = 1.0
SLOWEST_POINTWISE_RATE = 0.5
#: Values judged pointwise.
POINTWISE = ("omega_max", "Wt")
#: Values whose estimate is the spread of the three meshes' values, never an extrapolation: the
#: largest |omega| moves between elements as the mesh changes, so its three values follow no
#: one power law (on rectangles 1:1, 2:1 and 5:1 at draft, normal and fine the spread was 0.62
#: to 1.09 of the true error against the series; Richardson's fit, 0.22 once).
SPREAD_ONLY = ("omega_max",)


def richardson(q1: float, q2: float, q3: float, ratio: float,
               slowest: float = SLOWEST_POINTWISE_RATE) -> tuple[float, float]:
    """Extrapolated value and observed rate from three values on meshes refined by ``ratio``.

    Parameters
    ----------
    q1, q2, q3 : float
        Values on the coarse, middle and fine mesh.
    ratio : float
        Size ratio between successive meshes (> 1).
    slowest : float
        Lowest rate assumed for the tail beyond the finest mesh (the observed rate is held
        between it and 8).

    Returns
    -------
    (float, float)
        Extrapolated value, and the observed rate p (nan when the differences change sign or
        vanish; the extrapolated value is then the finest value).

    Examples
    --------
    >>> q = [1.0 + h**4 for h in (1.0, 0.5, 0.25)]
    >>> value, p = richardson(*q, ratio=2.0)
    >>> round(value, 12), round(p, 9)
    (1.0, 4.0)
    """
    d1, d2 = q1 - q2, q2 - q3
    if d1 == 0 or d2 == 0 or np.sign(d1) != np.sign(d2):
        return q3, float("nan")
    p = float(np.log(d1 / d2) / np.log(ratio))
    p = min(max(p, slowest), 8.0)
    return q3 - d2 / (ratio**p - 1.0), p


def estimate_errors(profile: Profile, mesh_size: float | None = None, *, refine: float = 1.0,
                    poisson: float = DEFAULT_POISSON, bounds: bool = False,
                    solver: str = "auto", max_elements: int = MAX_ELEMENTS) -> ErrorEstimate:
    """Analyse a profile at ``refine`` and estimate the error of its main values.

    Parameters
    ----------
    profile : Profile
        The profile.
    mesh_size : float, optional
        Largest element size of the first mesh, drawing unit (default from the profile).
    refine : float
        Refinement factor of the first mesh (an accuracy setting).
    poisson : float
        Poisson's ratio for the shear properties.
    bounds : bool
        Also compute the guaranteed lower bound on J for the first mesh
        (:func:`warpwise.properties.bounds.torsion_lower_bound`).
    solver : str
        Linear solver (see :class:`warpwise.fem.solve.SPDFactor`).
    max_elements : int
        Largest mesh built, the finest one included (``--max-elements``).

    Returns
    -------
    ErrorEstimate
        The result at ``refine`` and the estimated errors; costs about 7 analyses
        (meshes with 1, 2 and 4 times the elements).
    """
    first = analyse(profile, mesh_size, refine=refine, poisson=poisson, bounds=bounds, solver=solver,
                    max_elements=max_elements)
    # the boundary is refined relative to the first mesh's own (at draft it keeps every drawn
    # segment whole, and the further meshes must still refine it)
    rest = [analyse(profile, mesh=build_mesh(profile, mesh_size, refine=refine * STEP**k,
                                             max_elements=max_elements,
                                             boundary_refine=max(refine, 1.0) * STEP**k),
                    poisson=poisson, solver=solver, max_elements=max_elements) for k in (1, 2)]
    qs = [_quantities(r) for r in (first, *rest)]
    reported = {key: float(read(first)) for key, (read, _, _) in ESTIMATED.items()}
    size = profile.size
    rel, rate, extra = {}, {}, {}
    for key in qs[0]:
        q1, q2, q3 = (q[key] for q in qs)
        value, p = richardson(q1, q2, q3, STEP,
                              SLOWEST_POINTWISE_RATE if key in POINTWISE else SLOWEST_RATE)
        shown = reported[key]  # the error is that of the value shown, outline part included
        if np.isnan(p) or key in SPREAD_ONLY:
            # not monotone: the spread of the three values is the honest statement
            err = max(abs(shown - q1), abs(shown - q2), abs(shown - q3))
        else:
            err = abs(shown - value)
        scale = size if ESTIMATED[key][2] else max(abs(value), 1e-300)
        if key == "Cw":
            # a warping constant near zero (closed and round sections) is judged against the
            # natural scale Ip * size^2 rather than against itself
            scale = max(scale, 1e-6 * first.geometric.Ip * size**2)
        elif key == "omega_max":
            # likewise omega_max, against the omega whose square over the area is that Cw
            # floor: 1e-3 size sqrt(Ip / A) (zero on a tube, where a mesh that is not quite
            # symmetric leaves 1e-10 size^2)
            geo = first.geometric
            scale = max(scale, 1e-3 * size * np.sqrt(geo.Ip / geo.A))
        rel[key], rate[key], extra[key] = err / scale, p, value
    first = replace(first, errors=rel)
    return ErrorEstimate(first, rel, rate, extra, tuple(r.mesh.n_nodes for r in (first, *rest)))
