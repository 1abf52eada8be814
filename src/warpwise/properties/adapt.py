"""Adaptive refinement for the torsion constant and the warping constant.

Error indicator (recovered gradient): on each element, eta_e^2 = int |grad psi_h - G psi_h|^2 dA,
with G psi_h the nodal-averaged gradient interpolated by the element's shape functions. By
Galerkin orthogonality the error of J is exactly the energy norm of the warping error,
J_h - J = int |grad(psi - psi_h)|^2 dA, so sum(eta_e^2) / J estimates the relative error of J
directly; it steers the refinement: elements carrying the largest indicators (Doerfler marking,
together half of the total) get their size halved (area limit a quarter). Refinement stops when
the guaranteed bracket of J (warping upper bound, equilibrated-flux or stress-function lower bound, see
:mod:`warpwise.properties.bounds`) is narrower than the requested tolerance, so the relative error of J on
the meshed domain is certainly below it; or, short of it, after :data:`MAX_STEPS` meshes (step
limit), before a mesh over the element budget (element budget), or when the indicator is at
round-off and has nothing left to steer by (round-off floor). :class:`TargetStatus` says which.

Examples
--------
>>> from warpwise.geometry import profile_from_loops
>>> ell = profile_from_loops([[(0, 0), (30, 0), (30, 4), (4, 4), (4, 30), (0, 30)]])
>>> run = refine_adaptively(ell, 1e-3)
>>> bool(run.estimate <= 1e-3)
True
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from ..errors import UsageError
from ..fem.p2 import gradient, interpolate, nodal_gradient
from ..geometry.profile import Profile
from ..mesh.core import MAX_ELEMENTS, Mesh, build_mesh, refine_mesh
from .analysis import (
    ELEMENT_BUDGET,
    REACHED,
    ROUND_OFF_FLOOR,
    STEP_LIMIT,
    SectionResult,
    TargetStatus,
    analyse,
)
from .shear import DEFAULT_POISSON

#: Fraction of the total indicator that the marked elements carry (Doerfler marking).
MARKED_SHARE = 0.5
#: Largest number of refinement steps.
MAX_STEPS = 12
#: Relative warping error indicator below which it is round-off: J is a sum over the elements,
#: exact to a small multiple of machine epsilon, so an estimated error of J below 100 epsilon
#: cannot be told from round-off and gives refinement nothing to steer by (common practice, no
#: source; measured: a round bar, whose exact warping function is zero, gives 1e-31 to 1e-19;
#: a 30 x 30 x 4 angle still shows 1.2e-8 after 12 steps, 40k nodes).
ROUND_OFF = 100.0 * float(np.finfo(float).eps)


@dataclass(frozen=True, eq=False)
class AdaptiveRun:
    """Outcome of adaptive refinement.

    Attributes
    ----------
    result : SectionResult
        The result on the final mesh.
    estimate : float
        Guaranteed bound on the relative error of J on the final mesh, (J - J_low) / J_low.
    history : list of (int, float, float, float)
        (nodes, J, guaranteed bound, recovered-gradient estimate) for each step.
    status : TargetStatus or None
        The target, the bound reached, the steps and why the refinement stopped.
    """

    result: SectionResult
    estimate: float
    history: list[tuple[int, float, float, float]] = field(default_factory=list)
    status: TargetStatus | None = None


def warping_indicator(result: SectionResult) -> np.ndarray:
    """Recovered-gradient indicator eta_e^2 (m,) of the warping solution, L^4 per element."""
    mesh, ev = result.mesh, result.basis
    psi = result.torsion.psi
    g = nodal_gradient(mesh, psi)
    grad_h = gradient(mesh, ev, psi)
    smooth = np.stack([interpolate(mesh, ev, g[:, 0]), interpolate(mesh, ev, g[:, 1])], axis=-1)
    diff = grad_h - smooth
    return np.einsum("mq,mqi,mqi->m", ev.dA, diff, diff)


def refine_adaptively(profile: Profile, tolerance: float, mesh_size: float | None = None, *,
                      poisson: float = DEFAULT_POISSON, solver: str = "auto",
                      max_steps: int = MAX_STEPS, max_elements: int = MAX_ELEMENTS) -> AdaptiveRun:
    """Refine where the warping error is largest until J's estimated error meets ``tolerance``.

    Parameters
    ----------
    profile : Profile
        The profile.
    tolerance : float
        Requested relative error of J (and, through the same field, of Cw).
    mesh_size : float, optional
        Largest element size of the starting mesh, drawing unit.
    poisson : float
        Poisson's ratio for the shear properties.
    solver : str
        Linear solver (see :class:`warpwise.fem.solve.SPDFactor`).
    max_steps : int
        Most meshes solved (the first one included).
    max_elements : int
        Element budget: a refined mesh with more elements is not solved.

    Returns
    -------
    AdaptiveRun
        With ``status`` saying what was reached and why the refinement stopped.
    """
    if not (np.isfinite(tolerance) and 0 < tolerance < 1):
        raise UsageError(f"tolerance must lie in (0, 1), got {tolerance}")
    # the pre-mesh estimate is cautious (about twice the count): count the mesh built instead
    mesh = build_mesh(profile, mesh_size, max_elements=max(max_elements, MAX_ELEMENTS))
    if mesh.n_elements > max_elements:
        raise UsageError(f"the starting mesh has {mesh.n_elements:,} elements, more than the limit "
                         f"of {max_elements:,}; --max-elements N lifts the limit")
    history: list[tuple[int, float, float, float]] = []
    stopped = STEP_LIMIT
    for _ in range(max_steps):
        result = analyse(profile, mesh=mesh, poisson=poisson, bounds=True, solver=solver)
        eta2 = warping_indicator(result)
        J, J_low = result.torsion.J, result.torsion.J_low
        estimate = float((J - J_low) / J_low)
        indicated = float(eta2.sum() / J)
        history.append((mesh.n_nodes, J, estimate, indicated))
        if estimate <= tolerance:
            stopped = REACHED
            break
        if indicated <= ROUND_OFF:
            stopped = ROUND_OFF_FLOOR
            break
        if len(history) == max_steps:
            break
        finer = refine_mesh(mesh, _area_limits(mesh, eta2))
        if finer.n_elements > max_elements:
            stopped = ELEMENT_BUDGET
            break
        mesh = finer
    status = TargetStatus(float(tolerance), estimate, len(history), stopped,
                          nodes=history[-1][0], limit=max_elements)
    return AdaptiveRun(result, estimate, history, status)


def _area_limits(mesh: Mesh, eta2: np.ndarray) -> np.ndarray:
    """Area limits (t,) that halve the size of the marked elements (Doerfler marking), L^2."""
    t = len(mesh.triangulation.triangles)
    part = eta2[:t]  # the meshed part; mirrored copies carry the same values
    order = np.argsort(part)[::-1]
    share = np.cumsum(part[order]) / part.sum()
    marked = order[: int(np.searchsorted(share, MARKED_SHARE)) + 1]
    corners = mesh.nodes[mesh.elements[:t, :3]]
    d1, d2 = corners[:, 1] - corners[:, 0], corners[:, 2] - corners[:, 0]
    area = 0.5 * np.abs(d1[:, 0] * d2[:, 1] - d1[:, 1] * d2[:, 0])
    limit = np.full(t, -1.0)
    limit[marked] = 0.25 * area[marked]
    return limit
