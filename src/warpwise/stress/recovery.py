"""Stress recovery: torsion shear stresses and twist for a torque.

With the warping function psi about the centroid (x, y centroidal), Saint-Venant torsion gives
tau_zx = G theta (dpsi/dx - y), tau_zy = G theta (dpsi/dy + x) and T = G J theta, so the
stresses are (T / J)(dpsi/dx - y, dpsi/dy + x) whatever G is, and theta = T / (G J).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..errors import UsageError
from ..fem.p2 import nodal_gradient
from ..geometry.corners import Corner, exclusion_radius, reentrant_corners
from ..properties.analysis import SectionResult


@dataclass(frozen=True, eq=False)
class TorsionStress:
    """Shear stresses from a torque, at every node.

    Attributes
    ----------
    torque : float
        Applied torque T, force x L.
    shear_modulus : float
        G, force / L^2.
    twist_rate : float
        theta = T / (G J), radians per L.
    tau_zx, tau_zy, tau : numpy.ndarray
        Stress components and resultant magnitude at the nodes (n,), force / L^2.
    tau_max : float
        Largest resultant away from sharp re-entrant corners, force / L^2.
    tau_max_at : tuple of float
        Node where it occurs, drawing coordinates, L.
    corners : list of CornerStress
        Sharp re-entrant corners: location and the (mesh-dependent) stress there.
    """

    torque: float
    shear_modulus: float
    twist_rate: float
    tau_zx: np.ndarray
    tau_zy: np.ndarray
    tau: np.ndarray
    tau_max: float
    tau_max_at: tuple[float, float]
    corners: list[CornerStress]


@dataclass(frozen=True)
class CornerStress:
    """Stress found at a sharp re-entrant corner, where the exact stress is unbounded.

    Attributes
    ----------
    corner : Corner
        The corner (location, interior angle).
    tau_at_corner : float
        Resultant shear stress at the corner node on this mesh, force / L^2; it grows without
        limit under refinement (as h^exponent). A fillet radius is needed for a real value.
    excluded_radius : float
        Radius around the corner left out of ``tau_max``, L.
    """

    corner: Corner
    tau_at_corner: float
    excluded_radius: float


def peak_stress(result: SectionResult, tau: np.ndarray) -> tuple[float, tuple[float, float],
                                                                  list[CornerStress]]:
    """Largest nodal stress away from sharp re-entrant corners, where, and the corner values.

    Parameters
    ----------
    result : SectionResult
        The analysed section.
    tau : numpy.ndarray
        Nodal stress resultant (n,), force / L^2.

    Returns
    -------
    tau_max : float
        Largest value outside the corners' exclusion radii.
    at : (float, float)
        Its node, L.
    corners : list of CornerStress
        One entry per sharp re-entrant corner.
    """
    nodes = result.mesh.nodes
    keep = np.ones(len(nodes), bool)
    found = []
    for c in reentrant_corners(result.profile):
        r = exclusion_radius(result.profile, c)
        dist = np.hypot(nodes[:, 0] - c.x, nodes[:, 1] - c.y)
        keep &= dist > r
        found.append(CornerStress(c, float(tau[int(np.argmin(dist))]), r))
    if not keep.any():
        keep[:] = True
    idx = np.flatnonzero(keep)
    k = int(idx[np.argmax(tau[idx])])
    return float(tau[k]), (float(nodes[k, 0]), float(nodes[k, 1])), found


def shear_modulus(
    shear_modulus: float | None = None, youngs_modulus: float | None = None,
    poisson: float | None = None,
) -> float:
    """Shear modulus G, given directly or as E / (2 (1 + nu)).

    Parameters
    ----------
    shear_modulus : float, optional
        G, force / L^2 (MPa with mm and N).
    youngs_modulus : float, optional
        E, same unit as G.
    poisson : float, optional
        Poisson's ratio nu, in (-1, 0.5).

    Returns
    -------
    float
        G.

    Examples
    --------
    >>> shear_modulus(youngs_modulus=70000.0, poisson=0.33)  # doctest: +ELLIPSIS
    26315.78...
    >>> shear_modulus()
    Traceback (most recent call last):
    ...
    warpwise.errors.UsageError: a torque needs a material: give the shear modulus G, or E with Poisson's ratio

    """
    if shear_modulus is not None:
        if youngs_modulus is not None:
            raise UsageError("give either G or E with Poisson's ratio, not both")
        if not (np.isfinite(shear_modulus) and shear_modulus > 0):
            raise UsageError(f"shear modulus must be positive, got {shear_modulus}")
        return float(shear_modulus)
    if youngs_modulus is None or poisson is None:
        raise UsageError(
            "a torque needs a material: give the shear modulus G, or E with Poisson's ratio")
    if not (np.isfinite(youngs_modulus) and youngs_modulus > 0):
        raise UsageError(f"Young's modulus must be positive, got {youngs_modulus}")
    if not -1.0 < poisson < 0.5:
        raise UsageError(f"Poisson's ratio must lie in (-1, 0.5), got {poisson}")
    return float(youngs_modulus) / (2.0 * (1.0 + float(poisson)))


@dataclass(frozen=True, eq=False)
class ShearStress:
    """Shear stresses from a torque and shear forces through the shear centre, at every node.

    Attributes
    ----------
    torque, vx, vy : float
        Loads: torque (force x L) and shear forces (force).
    tau_zx, tau_zy, tau : numpy.ndarray
        Combined stress components and resultant at the nodes (n,), force / L^2.
    tau_max : float
        Largest resultant, force / L^2.
    tau_max_at : tuple of float
        Node where it occurs, L.
    tau_max_torsion, tau_max_shear : float
        Largest resultant of the torsion part alone and of the shear-force part alone (both
        away from sharp re-entrant corners).
    corners : list of CornerStress
        Sharp re-entrant corners and the combined stress found there.
    twist_rate : float or None
        T / (G J), radians per L; None when no shear modulus was given.
    """

    torque: float
    vx: float
    vy: float
    tau_zx: np.ndarray
    tau_zy: np.ndarray
    tau: np.ndarray
    tau_max: float
    tau_max_at: tuple[float, float]
    tau_max_torsion: float
    tau_max_shear: float
    twist_rate: float | None
    corners: list[CornerStress]


def torsion_stress(result: SectionResult, torque: float, G: float) -> TorsionStress:
    """Shear stresses and twist rate for a torque.

    Parameters
    ----------
    result : SectionResult
        An analysed section.
    torque : float
        Torque T, force x L (N*mm with mm).
    G : float
        Shear modulus, force / L^2 (MPa with mm); for a composite section that of the
        reference material.

    Returns
    -------
    TorsionStress

    """
    if not np.isfinite(torque):
        raise UsageError(f"torque must be a finite number, got {torque}")
    mesh, tor, geo = result.mesh, result.torsion, result.weighted
    local = mesh.nodes - np.array(geo.centroid)
    scale = torque / tor.J
    mats = result.materials
    if not mats.composite:
        g = nodal_gradient(mesh, tor.psi)
        tzx = scale * (g[:, 0] - local[:, 1])
        tzy = scale * (g[:, 1] + local[:, 0])
    else:
        # each material's stress from its own elements (the stress jumps at an interface);
        # at a node shared by two materials the larger magnitude is kept
        tzx = np.zeros(mesh.n_nodes)
        tzy = np.zeros(mesh.n_nodes)
        for gi in range(len(mats.names)):
            mask = mats.group == gi
            nodes = np.unique(mesh.elements[mask])
            g = nodal_gradient(mesh, tor.psi, mask)[nodes]
            w = scale * float(mats.G[mask][0])
            zx = w * (g[:, 0] - local[nodes, 1])
            zy = w * (g[:, 1] + local[nodes, 0])
            bigger = np.hypot(zx, zy) > np.hypot(tzx[nodes], tzy[nodes])
            tzx[nodes[bigger]] = zx[bigger]
            tzy[nodes[bigger]] = zy[bigger]
    tau = np.hypot(tzx, tzy)
    top, at, corners = peak_stress(result, tau)
    return TorsionStress(
        torque=float(torque), shear_modulus=float(G), twist_rate=float(torque / (G * tor.J)),
        tau_zx=tzx, tau_zy=tzy, tau=tau, tau_max=top, tau_max_at=at, corners=corners,
    )


def shear_stress(result: SectionResult, torque: float = 0.0, vx: float = 0.0, vy: float = 0.0,
                 G: float | None = None) -> ShearStress:
    """Combined shear stresses from a torque and shear forces acting through the shear centre.

    Shear forces acting elsewhere add a torque V times their lever arm about the elastic shear
    centre (``result.shear.shear_centre``); include it in ``torque``.

    Parameters
    ----------
    result : SectionResult
        An analysed section.
    torque : float
        Torque T, force x L.
    vx, vy : float
        Shear forces along x and y, force unit.
    G : float, optional
        Shear modulus, force / L^2; needed for a non-zero torque (twist rate).

    Returns
    -------
    ShearStress

    Raises
    ------
    UsageError
        A torque without a shear modulus, or non-finite loads.
    """
    from ..properties.shear import shear_stress_at_nodes

    for name, v in (("torque", torque), ("shear force x", vx), ("shear force y", vy)):
        if not np.isfinite(v):
            raise UsageError(f"{name} must be a finite number, got {v}")
    n = result.mesh.n_nodes
    t_zx, t_zy = np.zeros(n), np.zeros(n)
    tau_t = 0.0
    twist = None
    if torque != 0.0:
        if G is None:
            raise UsageError("a torque needs a material: give the shear modulus G, or E with "
                             "Poisson's ratio")
        ts = torsion_stress(result, torque, G)
        t_zx, t_zy, tau_t, twist = ts.tau_zx, ts.tau_zy, ts.tau_max, ts.twist_rate
    elif G is not None:
        twist = 0.0
    v = shear_stress_at_nodes(result.mesh, result.weighted, result.shear, vx, vy)
    tau_v = peak_stress(result, np.hypot(v[:, 0], v[:, 1]))[0]
    zx, zy = t_zx + v[:, 0], t_zy + v[:, 1]
    tau = np.hypot(zx, zy)
    top, at, corners = peak_stress(result, tau)
    return ShearStress(
        torque=float(torque), vx=float(vx), vy=float(vy), tau_zx=zx, tau_zy=zy, tau=tau,
        tau_max=top, tau_max_at=at, tau_max_torsion=float(tau_t), tau_max_shear=tau_v,
        twist_rate=twist, corners=corners,
    )
