"""Stresses from combined loads: axial force, bending moments, shear forces and torque.

Loads (any subset), in consistent units (N, N*mm with mm):

- N: axial force, positive in tension, through the modulus-weighted centroid;
- Mx: bending moment about the x axis, positive when it puts fibres at +y in tension;
- My: bending moment about the y axis, positive when it puts fibres at +x in tension;
- Vx, Vy: shear forces through the elastic shear centre;
- T: torque about the shear centre.

Normal stress (Navier, unsymmetric bending, transformed section with E_ref):
sigma_z = (E / E_ref) (N / A* + a x + b y), with a = (My Ix* - Mx Ixy*) / D*,
b = (Mx Iy* - My Ixy*) / D*, D* = Ix* Iy* - Ixy*^2 about the modulus-weighted centroid.
Shear stress: the torsion field plus the shear-function field (see :mod:`warpwise.properties.shear`),
each scaled by G / G_ref of the element's material. Von Mises: sqrt(sigma^2 + 3 tau^2).

Stresses are recovered at the nodes separately for each material (so that a stress that jumps
at an interface is not averaged across it). Maxima leave out the singular neighbourhood of sharp
re-entrant corners, as the torsion report does. The utilisation von Mises / fy is informative
only: it is not a design-code check.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from ..errors import UsageError
from ..fem.p2 import nodal_gradient
from ..geometry.corners import exclusion_radius, reentrant_corners
from ..properties.analysis import SectionResult
from ..properties.shear import _h_field, _unit_loads


@dataclass(frozen=True)
class Loads:
    """Section forces (force unit F, length unit L).

    Attributes
    ----------
    N : float
        Axial force, F, tension positive.
    Mx, My : float
        Bending moments, F*L (see the module notes for signs).
    Vx, Vy : float
        Shear forces through the shear centre, F.
    T : float
        Torque, F*L.
    """

    N: float = 0.0
    Mx: float = 0.0
    My: float = 0.0
    Vx: float = 0.0
    Vy: float = 0.0
    T: float = 0.0

    def check(self) -> None:
        """Raise a UsageError for a non-finite load or no load at all."""
        for name in ("N", "Mx", "My", "Vx", "Vy", "T"):
            v = getattr(self, name)
            if not np.isfinite(v):
                raise UsageError(f"load {name} must be a finite number, got {v}")
        if not any(getattr(self, n) for n in ("N", "Mx", "My", "Vx", "Vy", "T")):
            raise UsageError("no load given (N, Mx, My, Vx, Vy or T)")


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
    """

    loads: Loads
    by_material: list[MaterialStress] = field(default_factory=list)
    twist_rate: float | None = None
    excluded: list[tuple[float, float, float]] = field(default_factory=list)


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
    loads.check()
    mesh, tr, mats = result.mesh, result.weighted, result.materials
    local = mesh.nodes - np.array(tr.centroid)
    x, y = local[:, 0], local[:, 1]
    D = tr.Ix * tr.Iy - tr.Ixy**2
    a = (loads.My * tr.Ix - loads.Mx * tr.Ixy) / D
    b = (loads.Mx * tr.Iy - loads.My * tr.Ixy) / D
    sigma_ref = loads.N / tr.A + a * x + b * y
    theta = loads.Vx * result.shear.theta_x + loads.Vy * result.shear.theta_y
    ab = loads.Vx * _unit_loads(tr)[0] + loads.Vy * _unit_loads(tr)[1]
    corners = [(c.x, c.y, exclusion_radius(result.profile, c))
               for c in reentrant_corners(result.profile)]
    keep = np.ones(mesh.n_nodes, bool)
    for cx, cy, r in corners:
        keep &= np.hypot(mesh.nodes[:, 0] - cx, mesh.nodes[:, 1] - cy) > r
    G_ref = mats.G_ref if mats.G_ref is not None else G
    twist = None if G_ref is None else loads.T / (G_ref * result.torsion.J)
    out = []
    region_mats = list(mats.materials)
    for gi, name in enumerate(mats.names):
        mask = mats.group == gi
        nodes = np.unique(mesh.elements[mask])
        wE = float(mats.E[mask][0])
        wG = float(mats.G[mask][0])
        c = float(mats.c[mask][0])
        sig = wE * sigma_ref[nodes]
        tau_vec = np.zeros((len(nodes), 2))
        if loads.T:
            g = nodal_gradient(mesh, result.torsion.psi, mask)[nodes]
            tau_vec += (loads.T / result.torsion.J) * np.column_stack([g[:, 0] - y[nodes],
                                                                       g[:, 1] + x[nodes]])
        if loads.Vx or loads.Vy:
            g = nodal_gradient(mesh, theta, mask)[nodes]
            tau_vec += g - _h_field(local[nodes], ab[0], ab[1], c)
        tau_vec *= wG
        tau = np.hypot(tau_vec[:, 0], tau_vec[:, 1])
        vm = np.sqrt(sig**2 + 3.0 * tau**2)
        ok = keep[nodes] if keep[nodes].any() else np.ones(len(nodes), bool)
        k = int(np.flatnonzero(ok)[np.argmax(vm[ok])])
        mat = next((m for m in region_mats if m.name == name), None)
        fy = None if mat is None else mat.fy
        vmax = float(vm[k])
        out.append(MaterialStress(
            material=name, nodes=nodes, sigma=sig, tau=tau, von_mises=vm,
            sigma_max=float(np.abs(sig[ok]).max()), tau_max=float(tau[ok].max()),
            von_mises_max=vmax, von_mises_at=(float(mesh.nodes[nodes[k], 0]),
                                              float(mesh.nodes[nodes[k], 1])),
            fy=fy, utilisation=None if fy is None else vmax / fy))
    return CombinedStress(loads, out, twist, corners)
