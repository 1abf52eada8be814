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
        C (2, 2): int tau . tau dA per unit (Vx, Vy), 1/L^2.
    As_x, As_y : float
        Shear areas for Vx and Vy alone, 1 / C_xx and 1 / C_yy, L^2.
    kappa_x, kappa_y : float
        Shear coefficients As / A.
    As_1, As_2 : float
        Shear areas for forces along principal axes 1 and 2, L^2.
    kappa_1, kappa_2 : float
        Shear coefficients along principal axes.
    residual : float
        Largest relative residual of the two solves.
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
                mats: ElementMaterials) -> np.ndarray:
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

    Notes
    -----
    f_i = int (G grad N_i . h + E N_i (a x + b y)) dA with the ratios G, E of each element.
    """
    wG = evc.dA * mats.G[:, None]
    wE = evc.dA * mats.E[:, None]
    out = []
    for a, b in bending_gradients(geo):
        h = split_field(evc.xy, a, b, mats.c)
        lin = a * evc.xy[..., 0] + b * evc.xy[..., 1]
        local = np.einsum("mq,mqki,mqi->mk", wG, evc.grad, h) + np.einsum(
            "mq,qk->mk", wE * lin, evc.N)
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
                           kappa_y=nan, As_1=nan, As_2=nan, kappa_1=nan, kappa_2=nan, residual=0.0)


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
    theta = solver.solve(loads)
    residual = max(solver.residual(theta[:, k], loads[:, k]) for k in range(2))
    stresses = []
    for k, (a, b) in enumerate(bending_gradients(geo)):
        grad = gradient(mesh, evc, theta[:, k])
        stresses.append(mats.G[:, None, None] * (grad - split_field(evc.xy, a, b, mats.c)))
    inv_g = 1.0 / mats.G
    C = np.array([[integrate(evc, np.einsum("mqi,mqi->mq", si, sj), inv_g) for sj in stresses]
                  for si in stresses])
    x, y = evc.xy[..., 0], evc.xy[..., 1]
    torque = [integrate(evc, x * s[..., 1] - y * s[..., 0]) for s in stresses]
    # a unit Vy at x = xs gives torque xs; a unit Vx at y = ys gives torque -ys
    centre = (geo.centroid[0] + torque[1], geo.centroid[1] - torque[0])
    alpha = np.radians(geo.alpha_deg)
    R = np.array([[np.cos(alpha), np.sin(alpha)], [-np.sin(alpha), np.cos(alpha)]])
    # a force along axis 1 has components R[0]; along axis 2, R[1]
    c11 = float(R[0] @ C @ R[0])
    c22 = float(R[1] @ C @ R[1])
    A = geo.A
    nu = float(mats.nu[0]) if not mats.composite else float("nan")
    return ShearProperties(
        poisson=nu, theta_x=theta[:, 0], theta_y=theta[:, 1],
        shear_centre=(float(centre[0]), float(centre[1])), flexibility=C,
        As_x=1.0 / C[0, 0], As_y=1.0 / C[1, 1], kappa_x=1.0 / (A * C[0, 0]),
        kappa_y=1.0 / (A * C[1, 1]), As_1=1.0 / c11, As_2=1.0 / c22,
        kappa_1=1.0 / (A * c11), kappa_2=1.0 / (A * c22), residual=residual,
    )
