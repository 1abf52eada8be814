"""Stress recovery: torsion shear stresses and twist for a torque.

With the warping function psi about the centroid (x, y centroidal), Saint-Venant torsion gives
tau_zx = G theta (dpsi/dx - y), tau_zy = G theta (dpsi/dy + x) and T = G J theta, so the
stresses are (T / J)(dpsi/dx - y, dpsi/dy + x) whatever G is, and theta = T / (G J).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from .analysis import SectionResult
from .errors import UsageError
from .fem import nodal_gradient


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
        Largest resultant, force / L^2.
    tau_max_at : tuple of float
        Node where it occurs, drawing coordinates, L.

    """

    torque: float
    shear_modulus: float
    twist_rate: float
    tau_zx: np.ndarray
    tau_zy: np.ndarray
    tau: np.ndarray
    tau_max: float
    tau_max_at: tuple[float, float]


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


def torsion_stress(result: SectionResult, torque: float, G: float) -> TorsionStress:
    """Shear stresses and twist rate for a torque.

    Parameters
    ----------
    result : SectionResult
        An analysed section.
    torque : float
        Torque T, force x L (N*mm with mm).
    G : float
        Shear modulus, force / L^2 (MPa with mm).

    Returns
    -------
    TorsionStress

    """
    if not np.isfinite(torque):
        raise UsageError(f"torque must be a finite number, got {torque}")
    mesh, tor, geo = result.mesh, result.torsion, result.geometric
    local = mesh.nodes - np.array(geo.centroid)
    g = nodal_gradient(mesh, tor.psi)
    scale = torque / tor.J
    tzx = scale * (g[:, 0] - local[:, 1])
    tzy = scale * (g[:, 1] + local[:, 0])
    tau = np.hypot(tzx, tzy)
    k = int(np.argmax(tau))
    return TorsionStress(
        torque=float(torque), shear_modulus=float(G), twist_rate=float(torque / (G * tor.J)),
        tau_zx=tzx, tau_zy=tzy, tau=tau, tau_max=float(tau[k]),
        tau_max_at=(float(mesh.nodes[k, 0]), float(mesh.nodes[k, 1])),
    )
