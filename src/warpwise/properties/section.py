"""Section properties from the mesh: geometric, Saint-Venant torsion and warping.

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

from dataclasses import dataclass, field, replace

import numpy as np

from ..fem.p2 import ElementValues, assemble_vector, integrate, interpolate
from ..fem.solve import PinnedSolver
from ..mesh.core import Mesh


@dataclass(frozen=True)
class GeometricProperties:
    """Area properties of the section (drawing length unit L).

    Attributes
    ----------
    A : float
        Area, L^2.
    centroid : tuple of float
        Centroid (x, y) in drawing coordinates, L.
    Ix, Iy, Ixy : float
        Second moments about centroidal axes parallel to x and y: int y^2, int x^2, int x y; L^4.
    I1, I2 : float
        Principal second moments (major, minor), L^4.
    alpha_deg : float
        Angle from +x to principal axis 1, counter-clockwise, degrees, in (-90, 90].
    Ip : float
        Polar second moment about the centroid Ix + Iy, L^4.
    rx, ry, r1, r2 : float
        Radii of gyration sqrt(I/A), L.
    Wel : dict of str to float
        Elastic section moduli I / c to the extreme fibres, L^3. Keys ``x_top``, ``x_bottom``
        (about the x axis, fibre at largest and smallest y), ``y_right``, ``y_left``, ``1_pos``,
        ``1_neg``, ``2_pos``, ``2_neg`` (principal axes; ``pos`` is the side of +axis 2 for axis 1
        and of +axis 1 for axis 2), and the smaller of each pair: ``x``, ``y``, ``1``, ``2``.
    fibres : dict of str to float
        The extreme fibre distances c matching ``Wel``, L.

    """

    A: float
    centroid: tuple[float, float]
    Ix: float
    Iy: float
    Ixy: float
    I1: float
    I2: float
    alpha_deg: float
    Ip: float
    rx: float
    ry: float
    r1: float
    r2: float
    Wel: dict[str, float] = field(default_factory=dict)
    fibres: dict[str, float] = field(default_factory=dict)


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


def _moduli(
    nodes_local: np.ndarray, Ix: float, Iy: float, I1: float, I2: float, alpha: float
) -> tuple[dict[str, float], dict[str, float]]:
    """Elastic section moduli to the extreme fibres (nodes in centroidal coordinates)."""
    x, y = nodes_local[:, 0], nodes_local[:, 1]
    c, s = np.cos(alpha), np.sin(alpha)
    u = x * c + y * s  # along axis 1
    v = -x * s + y * c  # along axis 2
    fib = {
        "x_top": float(y.max()), "x_bottom": float(-y.min()),
        "y_right": float(x.max()), "y_left": float(-x.min()),
        "1_pos": float(v.max()), "1_neg": float(-v.min()),
        "2_pos": float(u.max()), "2_neg": float(-u.min()),
    }
    moment = {"x": Ix, "y": Iy, "1": I1, "2": I2}
    wel = {k: moment[k.split("_")[0]] / max(d, 1e-300) for k, d in fib.items()}
    for axis, (a, b) in {"x": ("x_top", "x_bottom"), "y": ("y_right", "y_left"),
                         "1": ("1_pos", "1_neg"), "2": ("2_pos", "2_neg")}.items():
        wel[axis] = min(wel[a], wel[b])
    return wel, fib


def geometric_properties(mesh: Mesh, ev: ElementValues, origin: np.ndarray,
                         weight: np.ndarray | None = None) -> tuple[GeometricProperties, ElementValues]:
    """Area, centroid, second moments, principal axes, moduli and radii of gyration.

    Parameters
    ----------
    mesh : Mesh
        The mesh.
    ev : ElementValues
        Basis values with coordinates relative to ``origin``.
    origin : numpy.ndarray
        The origin used for ``ev``, drawing coordinates, L.
    weight : numpy.ndarray, optional
        Element-wise modulus ratio E / E_ref (m,): the properties are then those of the
        transformed section (modulus-weighted, about the modulus-weighted centroid).

    Returns
    -------
    GeometricProperties
        The properties.
    ElementValues
        ``ev`` with coordinates shifted to the centroid.

    """
    x, y = ev.xy[..., 0], ev.xy[..., 1]
    one = np.ones_like(x)
    A = integrate(ev, one, weight)
    cx, cy = integrate(ev, x, weight) / A, integrate(ev, y, weight) / A
    evc = replace(ev, xy=ev.xy - np.array([cx, cy]))
    x, y = evc.xy[..., 0], evc.xy[..., 1]
    Ix, Iy = integrate(evc, y * y, weight), integrate(evc, x * x, weight)
    Ixy = integrate(evc, x * y, weight)
    if abs(Ixy) < 1e-13 * (Ix + Iy):  # round-off of a symmetric section
        Ixy = 0.0
    mean, half = 0.5 * (Ix + Iy), 0.5 * (Ix - Iy)
    rad = float(np.hypot(half, Ixy))
    I1, I2 = mean + rad, mean - rad
    alpha = 0.5 * float(np.arctan2(-2.0 * Ixy, Ix - Iy))
    if alpha <= -np.pi / 2 + 1e-15:
        alpha += np.pi
    centroid = (float(origin[0] + cx), float(origin[1] + cy))
    wel, fib = _moduli(mesh.nodes - np.array(centroid), Ix, Iy, I1, I2, alpha)
    props = GeometricProperties(
        A=A, centroid=centroid, Ix=Ix, Iy=Iy, Ixy=Ixy, I1=I1, I2=I2,
        alpha_deg=float(np.degrees(alpha)), Ip=Ix + Iy,
        rx=float(np.sqrt(Ix / A)), ry=float(np.sqrt(Iy / A)),
        r1=float(np.sqrt(I1 / A)), r2=float(np.sqrt(max(I2, 0.0) / A)),
        Wel=wel, fibres=fib,
    )
    return props, evc


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


__all__ = [
    "GeometricProperties", "TorsionProperties", "geometric_properties", "torsion_load",
    "torsion_properties", "zero_mean",
]
