"""Shear stresses and twist for a torque and shear forces through the shear centre.

With the warping function psi about the centroid (x, y centroidal), Saint-Venant torsion gives
tau_zx = G theta (dpsi/dx - y), tau_zy = G theta (dpsi/dy + x) and T = G J theta, so the
stresses are (T / J)(dpsi/dx - y, dpsi/dy + x) whatever G is, and theta = T / (G J). Shear
forces add the shear-function field. Both are recovered by :mod:`.recovery`, per material.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..errors import UsageError
from ..geometry.corners import Corner
from ..properties.analysis import SectionResult
from .loads import NEEDS_MATERIAL, Loads
from .recovery import MaterialField, envelope, peak, recover, reference_shear_modulus


@dataclass(frozen=True)
class CornerStress:
    """Stress found at a sharp re-entrant corner, where the exact stress is unbounded.

    Attributes
    ----------
    corner : Corner
        The corner (location, interior angle, excluded radius).
    tau_at_corner : float
        Resultant shear stress at the corner node on this mesh, force / L^2; it grows without
        limit under refinement (as h^exponent). A fillet radius is needed for a real value.
    excluded_radius : float
        Radius around the corner left out of ``tau_max``, L.
    """

    corner: Corner
    tau_at_corner: float
    excluded_radius: float


@dataclass(frozen=True)
class MaterialPeak:
    """The largest shear stress of one material, away from sharp re-entrant corners.

    Attributes
    ----------
    material : str
        Material name ("" for a geometry-only section).
    tau_max : float
        Largest resultant shear stress in that material, force / L^2.
    at : tuple of float
        Node where it occurs, drawing coordinates, L.
    """

    material: str
    tau_max: float
    at: tuple[float, float]


@dataclass(frozen=True, eq=False)
class TorsionStress:
    """Shear stresses from a torque, at every node.

    Attributes
    ----------
    torque : float
        Applied torque T, force x L.
    shear_modulus : float or None
        G used for the twist, force / L^2 (None: not known, geometry only).
    twist_rate : float or None
        theta = T / (G J), radians per L (None without a shear modulus).
    tau_zx, tau_zy, tau : numpy.ndarray
        Stress components and resultant magnitude at the nodes (n,), force / L^2; at a node
        shared by two materials the larger magnitude is kept.
    tau_max : float
        Largest resultant away from sharp re-entrant corners, force / L^2.
    tau_max_at : tuple of float
        Node where it occurs, drawing coordinates, L.
    corners : list of CornerStress
        Sharp re-entrant corners: location and the (mesh-dependent) stress there.
    by_material : list of MaterialField
        The stresses of each material at its own nodes.
    peaks : list of MaterialPeak
        The largest stress of each material (one entry for a single material).
    """

    torque: float
    shear_modulus: float | None
    twist_rate: float | None
    tau_zx: np.ndarray
    tau_zy: np.ndarray
    tau: np.ndarray
    tau_max: float
    tau_max_at: tuple[float, float]
    corners: list[CornerStress]
    by_material: list[MaterialField]
    peaks: list[MaterialPeak]


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
    twist_rate : float or None
        T / (G J), radians per L; None when no shear modulus was given.
    corners : list of CornerStress
        Sharp re-entrant corners and the combined stress found there.
    by_material : list of MaterialField
        The combined stresses of each material at its own nodes.
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
    by_material: list[MaterialField]


def _nodal(result: SectionResult, loads: Loads) -> tuple[list[MaterialField], np.ndarray,
                                                         np.ndarray, np.ndarray]:
    """Per-material fields and their nodal envelope (tau_zx, tau_zy, tau)."""
    fields = recover(result, loads)
    tzx, tzy = envelope(fields, result.mesh.n_nodes)
    return fields, tzx, tzy, np.hypot(tzx, tzy)


def _corner_values(result: SectionResult, tau: np.ndarray) -> list[CornerStress]:
    """The stress at the node nearest each sharp re-entrant corner."""
    nodes = result.mesh.nodes
    return [CornerStress(c, float(tau[int(np.argmin(np.hypot(nodes[:, 0] - c.x,
                                                             nodes[:, 1] - c.y)))]), c.radius)
            for c in result.corners]


def _peaks(result: SectionResult, fields: list[MaterialField]) -> list[MaterialPeak]:
    """The largest resultant shear stress of each material."""
    return [MaterialPeak(f.material, *peak(result, f.tau, f.nodes)) for f in fields]


def _twist(result: SectionResult, torque: float, G: float | None) -> float | None:
    """T / (G J), radians per L, or None without a shear modulus."""
    return None if G is None else float(torque / (G * result.torsion.J))


def nominal_torsion(result: SectionResult, units: str | None = None) -> TorsionStress:
    """Torsion stresses of a datasheet's nominal torque: 1 in the page's moment unit.

    ``units`` is the page's unit system (default the profile's); the stresses are in the
    profile's units (F/L^2), for ``datasheet_html(..., nominal_torque=True)``.
    """
    from ..units import MOMENT, convert

    return torsion_stress(result, convert(1.0, MOMENT, units or result.units, result.units))


def torsion_stress(result: SectionResult, torque: float, G: float | None = None) -> TorsionStress:
    """Shear stresses and twist rate for a torque.

    Parameters
    ----------
    result : SectionResult
        An analysed section.
    torque : float
        Torque T, force x L (N*mm with mm), finite and not zero.
    G : float, optional
        Shear modulus for the twist rate, force / L^2 (MPa with mm); default that of the
        reference material, when the section has materials. The stresses do not depend on it.

    Returns
    -------
    TorsionStress
    """
    if not np.isfinite(torque):
        raise UsageError(f"torque must be a finite number, got {torque}")
    G = reference_shear_modulus(result, G)
    fields, tzx, tzy, tau = _nodal(result, Loads(T=torque))
    top, at = peak(result, tau)
    return TorsionStress(
        torque=float(torque), shear_modulus=None if G is None else float(G),
        twist_rate=_twist(result, torque, G), tau_zx=tzx, tau_zy=tzy, tau=tau, tau_max=top,
        tau_max_at=at, corners=_corner_values(result, tau), by_material=fields,
        peaks=_peaks(result, fields),
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
        Shear modulus, force / L^2; needed for a non-zero torque (twist rate) unless the
        section has materials.

    Returns
    -------
    ShearStress

    Raises
    ------
    UsageError
        A torque without a shear modulus or material, or non-finite loads.
    """
    for name, v in (("torque", torque), ("shear force x", vx), ("shear force y", vy)):
        if not np.isfinite(v):
            raise UsageError(f"{name} must be a finite number, got {v}")
    G = reference_shear_modulus(result, G)
    if torque != 0.0 and G is None:
        raise UsageError(NEEDS_MATERIAL)
    fields, zx, zy, tau = _nodal(result, Loads(Vx=vx, Vy=vy, T=torque))
    tau_t = peak(result, _nodal(result, Loads(T=torque))[3])[0] if torque else 0.0
    tau_v = peak(result, _nodal(result, Loads(Vx=vx, Vy=vy))[3])[0] if (vx or vy) else 0.0
    top, at = peak(result, tau)
    return ShearStress(
        torque=float(torque), vx=float(vx), vy=float(vy), tau_zx=zx, tau_zy=zy, tau=tau,
        tau_max=top, tau_max_at=at, tau_max_torsion=float(tau_t), tau_max_shear=float(tau_v),
        twist_rate=_twist(result, torque, G), corners=_corner_values(result, tau),
        by_material=fields,
    )
