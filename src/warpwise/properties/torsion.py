"""Saint-Venant torsion and warping from the mesh: J, shear centre, Cw, Wagner constants.

All integrals are taken with coordinates relative to the centroid; reported points
(centroid, shear centre) are in drawing coordinates. Units follow the drawing's length unit L:
areas L^2, second moments and J in L^4, Cw in L^6.

The warping function psi solves, in weak form,
``K psi = f`` with ``K_ij = int grad N_i . grad N_j dA`` and
``f_i = int (y dN_i/dx - x dN_i/dy) dA``, which holds the Neumann condition
d(psi)/dn = y n_x - x n_y on every boundary without any boundary integral (div(y, -x) = 0).
Then ``J = Ix + Iy - psi^T K psi``.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..fem.p2 import ElementValues, assemble_vector, integrate, interpolate
from ..fem.solve import PinnedSolver
from ..mesh.core import Mesh
from .geometric import GeometricProperties


def cw_round_off(size: float, area: float) -> float:
    """Warping constant below which Cw is round-off of 0 (a circle, a tube), L^6.

    The square of omega's round-off 1e-12 size^2 over the area (common practice, no source).

    Parameters
    ----------
    size : float
        The section's size, L.
    area : float
        Its area, L^2.
    """
    return (1e-12 * size**2) ** 2 * area


@dataclass(frozen=True, eq=False)
class TorsionProperties:
    """Saint-Venant torsion and warping results.

    Attributes
    ----------
    J : float
        Torsion constant, L^4.
    psi : numpy.ndarray
        Nodal warping function about the centroid, zero mean, L^2.
    shear_centre : tuple of float
        Shear centre (Trefftz definition) in drawing coordinates, L.
    Cw : float
        Warping constant int omega^2 dA, L^6.
    omega : numpy.ndarray
        Nodal warping function about the shear centre, zero mean (sectorial coordinate), L^2.
    omega_max : float
        Largest |omega| over the nodes, L^2.
    beta_1, beta_2 : float
        Mono-symmetry (Wagner) constants for bending about principal axes 1 and 2, L:
        beta_1 = int v (u^2 + v^2) dA / I1 - 2 v_s, beta_2 = int u (u^2 + v^2) dA / I2 - 2 u_s,
        with (u, v) centroidal coordinates along axes (1, 2) and (u_s, v_s) the shear centre.
    residual : float
        Backward error of the warping solve.
    J_low : float or None
        Guaranteed lower bound on J of the meshed domain from the Prandtl stress function
        (J itself is the upper bound), L^4; None when not computed.
    """

    J: float
    psi: np.ndarray
    shear_centre: tuple[float, float]
    Cw: float
    omega: np.ndarray
    omega_max: float
    beta_1: float
    beta_2: float
    residual: float
    J_low: float | None = None


def torsion_load(mesh: Mesh, evc: ElementValues, weight: np.ndarray | None = None) -> np.ndarray:
    """Right-hand side f_i = int c (y dN_i/dx - x dN_i/dy) dA, centroidal coordinates, L^3."""
    w = evc.dA if weight is None else evc.dA * weight[:, None]
    x, y = evc.xy[..., 0], evc.xy[..., 1]
    local = np.einsum("mq,mqk->mk", w * y, evc.grad[..., 0]) - np.einsum(
        "mq,mqk->mk", w * x, evc.grad[..., 1])
    return assemble_vector(mesh, local)


def zero_mean(mesh: Mesh, evc: ElementValues, nodal: np.ndarray, area: float,
              weight: np.ndarray | None = None) -> np.ndarray:
    """Shift a nodal field so that its (weighted) integral over the section is zero."""
    return nodal - integrate(evc, interpolate(mesh, evc, nodal), weight) / area


def torsion_properties(
    mesh: Mesh, evc: ElementValues, geo: GeometricProperties, solver: PinnedSolver,
    load: np.ndarray, wE: np.ndarray | None = None, wG: np.ndarray | None = None,
) -> TorsionProperties:
    """J, warping function, Trefftz shear centre and warping constant.

    Parameters
    ----------
    mesh : Mesh
        The mesh.
    evc : ElementValues
        Basis values in centroidal coordinates.
    geo : GeometricProperties
        Geometric properties of the same mesh (modulus-weighted for a composite section).
    solver : PinnedSolver
        Factorised stiffness matrix (shear-modulus weighted for a composite section).
    load : numpy.ndarray
        Torsion right-hand side from :func:`torsion_load`.
    wE, wG : numpy.ndarray, optional
        Element modulus ratios E / E_ref and G / G_ref (m,) of a composite section; J is then
        GJ / G_ref and Cw is int E omega^2 dA / E_ref, omega orthogonal to E, E x and E y.

    Returns
    -------
    TorsionProperties
    """
    psi = solver.solve(load)
    residual = solver.residual(psi, load)
    psi = zero_mean(mesh, evc, psi, geo.A, wE)
    x, y = evc.xy[..., 0], evc.xy[..., 1]
    Ip_G = integrate(evc, x * x + y * y, wG)
    J = Ip_G - float(psi @ load)
    psi_q = interpolate(mesh, evc, psi)
    I_psi_x, I_psi_y = integrate(evc, psi_q * x, wE), integrate(evc, psi_q * y, wE)
    # Trefftz: omega = psi - y0 x + x0 y is orthogonal to x and y
    det = geo.Ix * geo.Iy - geo.Ixy**2
    x0 = (geo.Ixy * I_psi_x - geo.Iy * I_psi_y) / det
    y0 = (geo.Ix * I_psi_x - geo.Ixy * I_psi_y) / det
    local = mesh.nodes - np.array(geo.centroid)
    omega = psi - y0 * local[:, 0] + x0 * local[:, 1]
    omega = zero_mean(mesh, evc, omega, geo.A, wE)
    Cw = integrate(evc, interpolate(mesh, evc, omega) ** 2, wE)
    centre = (geo.centroid[0] + x0, geo.centroid[1] + y0)
    beta_1, beta_2 = wagner_constants(evc, geo, (x0, y0), wE)
    return TorsionProperties(J=J, psi=psi, shear_centre=centre, Cw=Cw, omega=omega,
                             omega_max=float(np.abs(omega).max()), beta_1=beta_1, beta_2=beta_2,
                             residual=residual)


def wagner_constants(evc: ElementValues, geo: GeometricProperties,
                     centre: tuple[float, float], wE: np.ndarray | None = None) -> tuple[float, float]:
    """Mono-symmetry (Wagner) constants about principal axes 1 and 2, L.

    Parameters
    ----------
    evc : ElementValues
        Basis values in centroidal coordinates.
    geo : GeometricProperties
        Geometric properties (principal axes).
    centre : (float, float)
        Shear centre relative to the centroid, L.
    wE : numpy.ndarray, optional
        Element modulus ratios of a composite section (m,).

    Returns
    -------
    (float, float)
        beta_1 and beta_2 as defined in :class:`TorsionProperties`; zero for a doubly
        symmetric section.
    """
    a = np.radians(geo.alpha_deg)
    c, s = np.cos(a), np.sin(a)
    x, y = evc.xy[..., 0], evc.xy[..., 1]
    u, v = x * c + y * s, -x * s + y * c
    us, vs = centre[0] * c + centre[1] * s, -centre[0] * s + centre[1] * c
    r2 = u * u + v * v
    beta_1 = integrate(evc, v * r2, wE) / geo.I1 - 2.0 * vs
    beta_2 = integrate(evc, u * r2, wE) / geo.I2 - 2.0 * us
    return float(beta_1), float(beta_2)


__all__ = ["TorsionProperties", "cw_round_off", "torsion_load", "torsion_properties", "wagner_constants",
           "zero_mean"]
