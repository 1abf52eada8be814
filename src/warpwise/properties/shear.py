"""Shear functions, shear stresses from shear forces, shear areas and the elastic shear centre.

For shear forces Vx, Vy the bending stress varies along the bar, d(sigma_z)/dz = a x + b y
(centroidal x, y) with ``a = (Ix Vx - Ixy Vy) / D``, ``b = (Iy Vy - Ixy Vx) / D`` and
``D = Ix Iy - Ixy^2``. With sigma_x = sigma_y = tau_xy = 0 (Saint-Venant's semi-inverse
assumption, the flexure problem as in Pilkey 2002) the displacements give the shear stresses

    tau = grad(Theta) - h,  h = nu / (2 (1 + nu)) * (a (x^2 - y^2)/2 + b x y,  a x y + b (y^2 - x^2)/2)

where the shear function Theta solves laplace(Theta) = -(a x + b y) / (1 + nu) with
d(Theta)/dn = h . n on every boundary. In weak form (no boundary integral needed):

    K Theta = f,  f_i = int (grad N_i . h + N_i (a x + b y)) dA.

The stress field carries no torque about the elastic shear centre, which is therefore the point
where Vx, Vy act without twisting the bar. Shear deformation follows from the complementary
energy: int tau . tau dA = V^T C V, shear areas 1 / C, shear coefficients 1 / (A C).

Which field enters C. With nu > 0 the field holds, besides the flow that carries V, the shear
stresses of the anticlastic distortion: the bending stress changes along the bar, its lateral
Poisson strain curls each cross-section, and compatibility adds shear stresses that carry no
force. They grow with the width of the section across the force: a 100 x 10 rectangle sheared
across its thickness keeps kappa = 0.18 of its area with nu = 0.3, a 100 x 0.5 strip 0.0005,
where a beam shears with about 5/6. That energy belongs to the bending (the curling of the
section) and not to the shear angle of the beam axis. The shear stiffness a Timoshenko beam
needs is that of the flow carrying V alone, which is the flexure field with nu = 0 (Renton
1991, Int. J. Solids Struct. 27, generalised beam theory: the beam's shear stiffness does not
depend on Poisson's ratio; from memory). It gives 5/6 for every rectangle and 6/7 for the solid
circle, Cowper's (1966, J. Appl. Mech. 33) values at nu = 0, whose own Poisson refinement stays
within 2 % for such compact sections (10 (1 + nu) / (12 + 11 nu) = 0.850 for the rectangle at
nu = 0.3; from memory); Hutchinson's (2001, J. Appl. Mech. 68) depends on the width and stays
near 5/6 for compact sections (from memory). So As, kappa are from the nu = 0 field; the energy
value with the material's nu is kept (``kappa_x_poisson``, ``kappa_y_poisson``) and reports show
it beside when it differs by more than :data:`POISSON_SHEAR_SPREAD`. The shear stresses and the
elastic shear centre are those of the real material (the shear functions with its nu).

A section of several separate parts (``--all-parts``) bending as one needs longitudinal shear
between the parts, which nothing carries: the flexure problem has no solution on each part
alone (its load does not balance there). Its results are then not computed (nan, see
:func:`not_computed`); J, the Trefftz shear centre and Cw are (:mod:`.torsion`).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..fem.p2 import ElementValues, assemble_vector, gradient, integrate
from ..fem.solve import PinnedSolver
from ..materials import ElementMaterials
from ..mesh.core import Mesh
from .geometric import GeometricProperties

#: Poisson's ratio used for shear properties when no material is given (steel and aluminium
#: alloys lie at 0.30 and 0.33; common practice, no source).
DEFAULT_POISSON = 0.3

#: Relative difference of the Poisson-dependent shear coefficient from the beam's above which
#: reports show both (the issue's 20 %; common practice, no source).
POISSON_SHEAR_SPREAD = 0.2


@dataclass(frozen=True, eq=False)
class ShearProperties:
    """Shear functions and the properties derived from them (length unit L).

    Attributes
    ----------
    poisson : float
        Poisson's ratio used.
    theta_x, theta_y : numpy.ndarray
        Nodal shear functions for a unit Vx and a unit Vy through the shear centre, 1/L.
    shear_centre : tuple of float
        Elastic shear centre (where Vx, Vy cause no twist), drawing coordinates, L.
    flexibility : numpy.ndarray
        C (2, 2): int tau . tau dA per unit (Vx, Vy) of the flexure field with nu = 0 (the
        beam's shear flexibility, see the module notes), 1/L^2.
    As_x, As_y : float
        Shear areas of a Timoshenko beam for Vx and Vy alone, 1 / C_xx and 1 / C_yy, L^2.
    kappa_x, kappa_y : float
        Shear coefficients As / A.
    As_1, As_2 : float
        Shear areas for forces along principal axes 1 and 2, L^2.
    kappa_1, kappa_2 : float
        Shear coefficients along principal axes.
    residual : float
        Largest relative residual of the solves.
    flexibility_poisson : numpy.ndarray
        C (2, 2) of the field with the material's Poisson's ratio (anticlastic part included),
        1/L^2; equal to ``flexibility`` at nu = 0.
    kappa_x_poisson, kappa_y_poisson : float
        The energy shear coefficients of that field, 1 / (A C_xx), 1 / (A C_yy).
    """

    poisson: float
    theta_x: np.ndarray
    theta_y: np.ndarray
    shear_centre: tuple[float, float]
    flexibility: np.ndarray
    As_x: float
    As_y: float
    kappa_x: float
    kappa_y: float
    As_1: float
    As_2: float
    kappa_1: float
    kappa_2: float
    residual: float
    flexibility_poisson: np.ndarray
    kappa_x_poisson: float
    kappa_y_poisson: float


def split_field(xy: np.ndarray, a: float, b: float, c: np.ndarray | float) -> np.ndarray:
    """The field h of the shear-stress split at points (..., 2), centroidal coordinates, L^2 a.

    ``a``, ``b`` are the bending-stress gradient per unit length of bar (see
    :func:`bending_gradients`), 1/L^3 per unit force.

    ``c`` is nu / (2 (1 + nu)) for one material, nu G_ref / E_ref per element (broadcast over the
    trailing point axis) for a composite section.
    """
    x, y = xy[..., 0], xy[..., 1]
    c = np.asarray(c, dtype=float)
    if c.ndim == 1 and x.ndim == 2:
        c = c[:, None]
    hx = c * (a * 0.5 * (x * x - y * y) + b * x * y)
    hy = c * (a * x * y + b * 0.5 * (y * y - x * x))
    return np.stack([hx, hy], axis=-1)


def bending_gradients(geo: GeometricProperties) -> np.ndarray:
    """Rows: (a, b) of the bending-stress gradient for a unit Vx and a unit Vy, 1/L^4."""
    D = geo.Ix * geo.Iy - geo.Ixy**2
    return np.array([[geo.Ix, -geo.Ixy], [-geo.Ixy, geo.Iy]]) / D


def shear_loads(mesh: Mesh, evc: ElementValues, geo: GeometricProperties,
                mats: ElementMaterials, c: np.ndarray | float | None = None) -> np.ndarray:
    """Right-hand sides (n, 2) of the shear functions for a unit Vx and a unit Vy, 1/L.

    Parameters
    ----------
    mesh : Mesh
        The mesh.
    evc : ElementValues
        Basis values in centroidal coordinates.
    geo : GeometricProperties
        Geometric properties (Ix, Iy, Ixy), modulus-weighted for a composite section.
    mats : ElementMaterials
        Element material data (E, G ratios and the split coefficient c).
    c : numpy.ndarray or float, optional
        Split coefficient to use instead of ``mats.c`` (0 for the field with nu = 0).

    Notes
    -----
    f_i = int (G grad N_i . h + E N_i (a x + b y)) dA with the ratios G, E of each element.
    """
    wG = evc.dA * mats.G[:, None]
    wE = evc.dA * mats.E[:, None]
    c = mats.c if c is None else c
    split = bool(np.any(c))  # with nu = 0 the split field h is zero: no term of its own
    out = []
    for a, b in bending_gradients(geo):
        lin = a * evc.xy[..., 0] + b * evc.xy[..., 1]
        local = np.einsum("mq,qk->mk", wE * lin, evc.N)
        if split:
            local += np.einsum("mq,mqki,mqi->mk", wG, evc.grad, split_field(evc.xy, a, b, c))
        out.append(assemble_vector(mesh, local))
    return np.column_stack(out)


def not_computed(n_nodes: int, mats: ElementMaterials) -> ShearProperties:
    """Shear properties of a section of separate parts: every value nan (not computed).

    Parameters
    ----------
    n_nodes : int
        Number of mesh nodes (the shear functions are nan at each).
    mats : ElementMaterials
        Element material data (Poisson's ratio).
    """
    nan = float("nan")
    field = np.full(n_nodes, nan)
    nu = float(mats.nu[0]) if not mats.composite else nan
    return ShearProperties(poisson=nu, theta_x=field, theta_y=field, shear_centre=(nan, nan),
                           flexibility=np.full((2, 2), nan), As_x=nan, As_y=nan, kappa_x=nan,
                           kappa_y=nan, As_1=nan, As_2=nan, kappa_1=nan, kappa_2=nan, residual=0.0,
                           flexibility_poisson=np.full((2, 2), nan), kappa_x_poisson=nan,
                           kappa_y_poisson=nan)


def shear_properties(mesh: Mesh, evc: ElementValues, geo: GeometricProperties,
                     solver: PinnedSolver, mats: ElementMaterials) -> ShearProperties:
    """Solve both shear functions with the factorised stiffness and derive shear properties.

    Parameters
    ----------
    mesh : Mesh
        The mesh.
    evc : ElementValues
        Basis values in centroidal coordinates.
    geo : GeometricProperties
        Geometric properties (modulus-weighted for a composite section).
    solver : PinnedSolver
        The factorisation already used for the warping function.
    mats : ElementMaterials
        Element material data; for a composite section the shear areas are referred to G_ref.

    Returns
    -------
    ShearProperties
    """
    if solver.n_parts > 1:
        return not_computed(mesh.n_nodes, mats)
    loads = shear_loads(mesh, evc, geo, mats)
    poisson_free = not np.any(mats.c)
    if not poisson_free:  # the beam's field, nu = 0, from the same factorisation
        loads = np.column_stack([loads, shear_loads(mesh, evc, geo, mats, 0.0)])
    theta = solver.solve(loads)
    residual = max(solver.residual(theta[:, k], loads[:, k]) for k in range(loads.shape[1]))
    real = _stresses(mesh, evc, geo, mats, theta[:, :2], mats.c)
    C = _flexibility(evc, mats, real)
    # with nu = 0 the stress is G grad(Theta): its energy int G |grad Theta|^2 is Theta^T K Theta
    # (the same quadrature as the stiffness, so equal to round-off), one sparse product
    beam = theta[:, 2:]
    C0 = C if poisson_free else beam.T @ (solver.matrix @ beam)
    # the elastic shear centre from the real field (torque of its stresses)
    x, y = evc.xy[..., 0], evc.xy[..., 1]
    torque = [integrate(evc, x * s[..., 1] - y * s[..., 0]) for s in real]
    # a unit Vy at x = xs gives torque xs; a unit Vx at y = ys gives torque -ys
    centre = (geo.centroid[0] + torque[1], geo.centroid[1] - torque[0])
    alpha = np.radians(geo.alpha_deg)
    R = np.array([[np.cos(alpha), np.sin(alpha)], [-np.sin(alpha), np.cos(alpha)]])
    # a force along axis 1 has components R[0]; along axis 2, R[1]
    c11 = float(R[0] @ C0 @ R[0])
    c22 = float(R[1] @ C0 @ R[1])
    A = geo.A
    nu = float(mats.nu[0]) if not mats.composite else float("nan")
    return ShearProperties(
        poisson=nu, theta_x=theta[:, 0], theta_y=theta[:, 1],
        shear_centre=(float(centre[0]), float(centre[1])), flexibility=C0,
        As_x=1.0 / C0[0, 0], As_y=1.0 / C0[1, 1], kappa_x=1.0 / (A * C0[0, 0]),
        kappa_y=1.0 / (A * C0[1, 1]), As_1=1.0 / c11, As_2=1.0 / c22,
        kappa_1=1.0 / (A * c11), kappa_2=1.0 / (A * c22), residual=residual,
        flexibility_poisson=C, kappa_x_poisson=1.0 / (A * C[0, 0]),
        kappa_y_poisson=1.0 / (A * C[1, 1]),
    )


def _stresses(mesh: Mesh, evc: ElementValues, geo: GeometricProperties, mats: ElementMaterials,
              theta: np.ndarray, c: np.ndarray | float) -> list[np.ndarray]:
    """Shear stresses (m, q, 2) at the quadrature points of a unit Vx and a unit Vy, 1/L^2."""
    split = bool(np.any(c))  # with nu = 0 the split field is zero
    return [mats.G[:, None, None] * (gradient(mesh, evc, theta[:, k])
                                     - (split_field(evc.xy, a, b, c) if split else 0.0))
            for k, (a, b) in enumerate(bending_gradients(geo))]


def _flexibility(evc: ElementValues, mats: ElementMaterials,
                 stresses: list[np.ndarray]) -> np.ndarray:
    """C (2, 2) = int tau_i . tau_j / G dA of the unit-force fields, 1/L^2 (G referred)."""
    inv_g = 1.0 / mats.G
    return np.array([[integrate(evc, np.einsum("mqi,mqi->mq", si, sj), inv_g) for sj in stresses]
                     for si in stresses])
