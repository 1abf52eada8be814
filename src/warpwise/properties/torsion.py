"""Saint-Venant torsion and warping from the mesh: J, shear centre, Cw, Wagner constants.

All integrals are taken with coordinates relative to the centroid; reported points
(centroid, shear centre) are in drawing coordinates. Units follow the drawing's length unit L:
areas L^2, second moments and J in L^4, Cw in L^6.

The warping function psi solves, in weak form,
``K psi = f`` with ``K_ij = int grad N_i . grad N_j dA`` and
``f_i = int (y dN_i/dx - x dN_i/dy) dA``, which holds the Neumann condition
d(psi)/dn = y n_x - x n_y on every boundary without any boundary integral (div(y, -x) = 0).
Then ``J = Ix + Iy - psi^T K psi``.

A section of several separate parts (taken as one with ``--all-parts``) has a warping function
defined up to a constant on each part. J does not depend on the constants and is exactly the
sum of the parts' J (each part twists with its own warping). The constants are fixed by a zero
(modulus-weighted) mean on each part: each part, free to slide along the others, carries no
axial force from warping. The shear centre and Cw then take the parts as held in shape in their
plane (by end plates or diaphragms) and twisting about one axis, each part bending about its
own centroid as it swings round that axis (as the flanges of an I-section do, Cw = If h^2 / 2):
the Trefftz conditions use the sum of the parts' own second moments
(:func:`own_second_moments`); for one part all of this is the usual definition.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..fem.field_max import largest_magnitude
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
        Nodal warping function about the centroid, zero mean (on each part), L^2.
    shear_centre : tuple of float
        Shear centre (Trefftz definition) in drawing coordinates, L.
    Cw : float
        Warping constant int omega^2 dA, L^6.
    omega : numpy.ndarray
        Nodal warping function about the shear centre, zero mean on each part (sectorial
        coordinate), L^2.
    omega_max : float
        Largest |omega| over the section (every element's quadratic, not only the nodes), L^2.
    beta_1, beta_2 : float
        Mono-symmetry (Wagner) constants for bending about principal axes 1 and 2, L:
        beta_1 = int v (u^2 + v^2) dA / I1 - 2 v_s, beta_2 = int u (u^2 + v^2) dA / I2 - 2 u_s,
        with (u, v) centroidal coordinates along axes (1, 2) and (u_s, v_s) the shear centre.
    residual : float
        Backward error of the warping solve.
    J_low : float or None
        Guaranteed lower bound on J of the meshed domain (J itself is the upper bound), L^4;
        None when not computed.
    J_low_method : str or None
        How J_low was found: the equilibrated flux (straight-sided meshes) or the Prandtl stress
        function (meshes with curved elements); see :mod:`warpwise.properties.bounds`.
    J_low_indicator : numpy.ndarray or None
        With the equilibrated flux, the element indicators int_e |sigma - tau_h|^2 / c dA (m,),
        L^4, whose sum is J - J_low (where the width of the bracket comes from); None otherwise.
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
    J_low_method: str | None = None
    J_low_indicator: np.ndarray | None = None


def torsion_load(mesh: Mesh, evc: ElementValues, weight: np.ndarray | None = None) -> np.ndarray:
    """Right-hand side f_i = int c (y dN_i/dx - x dN_i/dy) dA, centroidal coordinates, L^3."""
    w = evc.dA if weight is None else evc.dA * weight[:, None]
    x, y = evc.xy[..., 0], evc.xy[..., 1]
    local = np.einsum("mq,mqk->mk", w * y, evc.grad[..., 0]) - np.einsum(
        "mq,mqk->mk", w * x, evc.grad[..., 1])
    return assemble_vector(mesh, local)


def zero_mean(mesh: Mesh, evc: ElementValues, nodal: np.ndarray, area: float,
              weight: np.ndarray | None = None, parts: np.ndarray | None = None) -> np.ndarray:
    """Shift a nodal field so that its (weighted) integral over the section is zero.

    With ``parts`` (the connected part of each node, the ``labels`` of
    :class:`~warpwise.fem.solve.PinnedSolver`), each part is shifted by its own constant
    so that the integral over each part is zero; ``area`` is then not used.
    """
    if parts is None or not len(parts) or parts.max() == 0:
        return nodal - integrate(evc, interpolate(mesh, evc, nodal), weight) / area
    w = evc.dA if weight is None else evc.dA * weight[:, None]
    part = parts[mesh.elements[:, 0]]
    sums = np.bincount(part, weights=np.einsum("mq,mq->m", w, interpolate(mesh, evc, nodal)))
    areas = np.bincount(part, weights=w.sum(axis=1))
    return nodal - (sums / areas)[parts]


def own_second_moments(mesh: Mesh, evc: ElementValues, parts: np.ndarray,
                       weight: np.ndarray | None = None) -> tuple[float, float, float]:
    """Sum over the parts of each part's second moments about its own centroid, L^4.

    Parameters
    ----------
    mesh : Mesh
        The mesh.
    evc : ElementValues
        Basis values in centroidal coordinates.
    parts : numpy.ndarray
        Connected part of each node (n,).
    weight : numpy.ndarray, optional
        Element modulus ratios (m,) of a composite section.

    Returns
    -------
    (float, float, float)
        (sum int (y - y_k)^2, sum int (x - x_k)^2, sum int (x - x_k)(y - y_k)) dA, the Ix, Iy,
        Ixy of the parts each about its own (weighted) centroid (x_k, y_k); for one part the
        centroidal Ix, Iy, Ixy.
    """
    w = evc.dA if weight is None else evc.dA * weight[:, None]
    part = parts[mesh.elements[:, 0]]
    x, y = evc.xy[..., 0], evc.xy[..., 1]

    def by_part(f: np.ndarray) -> np.ndarray:
        return np.bincount(part, weights=np.einsum("mq,mq->m", w, f))

    a, sx, sy = by_part(np.ones_like(x)), by_part(x), by_part(y)
    return (float(by_part(y * y).sum() - (sy * sy / a).sum()),
            float(by_part(x * x).sum() - (sx * sx / a).sum()),
            float(by_part(x * y).sum() - (sx * sy / a).sum()))


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
    parts = solver.labels if solver.n_parts > 1 else None
    psi = zero_mean(mesh, evc, psi, geo.A, wE, parts)
    x, y = evc.xy[..., 0], evc.xy[..., 1]
    Ip_G = integrate(evc, x * x + y * y, wG)
    J = Ip_G - float(psi @ load)
    psi_q = interpolate(mesh, evc, psi)
    I_psi_x, I_psi_y = integrate(evc, psi_q * x, wE), integrate(evc, psi_q * y, wE)
    # Trefftz: omega = psi - y0 x + x0 y (zero mean on each part) is orthogonal to x and y;
    # with several parts each part's own second moments count (see the module notes)
    Ix, Iy, Ixy = (geo.Ix, geo.Iy, geo.Ixy) if parts is None else own_second_moments(
        mesh, evc, parts, wE)
    det = Ix * Iy - Ixy**2
    x0 = (Ixy * I_psi_x - Iy * I_psi_y) / det
    y0 = (Ix * I_psi_x - Ixy * I_psi_y) / det
    local = mesh.nodes - np.array(geo.centroid)
    omega = psi - y0 * local[:, 0] + x0 * local[:, 1]
    omega = zero_mean(mesh, evc, omega, geo.A, wE, parts)
    Cw = integrate(evc, interpolate(mesh, evc, omega) ** 2, wE)
    centre = (geo.centroid[0] + x0, geo.centroid[1] + y0)
    beta_1, beta_2 = wagner_constants(evc, geo, (x0, y0), wE)
    return TorsionProperties(J=J, psi=psi, shear_centre=centre, Cw=Cw, omega=omega,
                             omega_max=abs(largest_magnitude(mesh, omega).value), beta_1=beta_1,
                             beta_2=beta_2, residual=residual)


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


__all__ = ["TorsionProperties", "cw_round_off", "own_second_moments", "torsion_load",
           "torsion_properties", "wagner_constants", "zero_mean"]
