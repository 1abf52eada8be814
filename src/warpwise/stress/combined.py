"""Stresses from combined loads: axial force, bending moments, shear forces and torque.

The loads and their signs are those of :class:`~warpwise.stress.loads.Loads`; the stresses of
each material come from :func:`~warpwise.stress.recovery.recover` (Navier normal stress on the
transformed section, torsion and shear-function shear scaled by G / G_ref). Von Mises:
sqrt(sigma^2 + 3 tau^2). Maxima leave out the singular neighbourhood of sharp re-entrant
corners, as the torsion report does. A bimoment B adds the warping normal stress
sigma_w = -B omega / Cw of :func:`~warpwise.stress.warping.warping_normal_stress` (one material,
Cw > 0). The utilisation von Mises / fy is informative only: it is
not a design-code check.
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace

import numpy as np

from ..properties.analysis import SectionResult
from .loads import Loads
from .recovery import MaterialField, away_from_corners, peak, recover
from .warping import warping_normal_stress


@dataclass(frozen=True, eq=False)
class MaterialStress:
    """Stresses in one material at its nodes.

    Attributes
    ----------
    material : str
        Material name ("" for a geometry-only section).
    nodes : numpy.ndarray
        Node indices of this material's elements.
    sigma, tau, von_mises : numpy.ndarray
        Normal stress, resultant shear stress and von Mises stress at those nodes, F/L^2.
    sigma_max, tau_max, von_mises_max : float
        Largest |sigma|, tau and von Mises away from sharp re-entrant corners, F/L^2.
    von_mises_at : tuple of float
        Where the largest von Mises stress is, L.
    fy : float or None
        Yield strength, F/L^2.
    utilisation : float or None
        von_mises_max / fy (informative, not a code check).
    field : MaterialField
        The recovered stress components at ``nodes``.
    tau_at : tuple of float
        Where the largest shear stress ``tau_max`` is, L.
    """

    material: str
    nodes: np.ndarray
    sigma: np.ndarray
    tau: np.ndarray
    von_mises: np.ndarray
    sigma_max: float
    tau_max: float
    von_mises_max: float
    von_mises_at: tuple[float, float]
    fy: float | None
    utilisation: float | None
    field: MaterialField | None = None
    tau_at: tuple[float, float] = (float("nan"), float("nan"))


@dataclass(frozen=True, eq=False)
class CombinedStress:
    """Stresses of a section under combined loads.

    Attributes
    ----------
    loads : Loads
        The loads.
    by_material : list of MaterialStress
        One entry per material.
    twist_rate : float or None
        T / (G_ref J), radians per L (None without a shear modulus).
    excluded : list of tuple
        Sharp re-entrant corners (x, y, radius) left out of the maxima.
    sigma_w : float or None
        The warping normal stress of the bimoment of largest magnitude, signed, F/L^2 (None
        without a bimoment).
    sigma_w_at : tuple of float or None
        Where it is, L.
    """

    loads: Loads
    by_material: list[MaterialStress] = field(default_factory=list)
    twist_rate: float | None = None
    excluded: list[tuple[float, float, float]] = field(default_factory=list)
    sigma_w: float | None = None
    sigma_w_at: tuple[float, float] | None = None


def combined_stress(result: SectionResult, loads: Loads, G: float | None = None) -> CombinedStress:
    """Normal, shear and von Mises stresses per material for combined loads.

    Parameters
    ----------
    result : SectionResult
        An analysed section (with materials for a composite section).
    loads : Loads
        Section forces.
    G : float, optional
        Shear modulus of a geometry-only section, F/L^2, for the twist rate; with materials
        the reference material's G is used.

    Returns
    -------
    CombinedStress
    """
    mats = result.materials
    # with materials the reference material's G, else the one given (geometry only)
    G_ref = mats.G_ref if mats.G_ref is not None else G
    twist = None if G_ref is None else loads.T / (G_ref * result.torsion.J)
    out = []
    warping = warping_normal_stress(result, loads.B) if loads.B else None
    for f in recover(result, loads):
        if warping is not None:
            f = replace(f, sigma=f.sigma + warping[f.nodes])
        keep = away_from_corners(result, f.nodes)
        sig, tau, vm = f.sigma, f.tau, f.von_mises
        vmax, at = peak(result, vm, f.nodes, keep=keep)
        tmax, tau_at = peak(result, tau, f.nodes, keep=keep)
        mat = next((m for m in mats.materials if m.name == f.material), None)
        fy = None if mat is None else mat.fy
        out.append(MaterialStress(
            material=f.material, nodes=f.nodes, sigma=sig, tau=tau, von_mises=vm,
            sigma_max=float(np.abs(sig[keep]).max()), tau_max=tmax,
            von_mises_max=vmax, von_mises_at=at, fy=fy,
            utilisation=None if fy is None else vmax / fy, field=f, tau_at=tau_at))
    excluded = [(c.x, c.y, c.radius) for c in result.corners]
    if warping is None:
        return CombinedStress(loads, out, twist, excluded)
    k = int(np.argmax(np.where(away_from_corners(result), np.abs(warping), -1.0)))
    x, y = result.mesh.nodes[k]
    return CombinedStress(loads, out, twist, excluded, float(warping[k]), (float(x), float(y)))
