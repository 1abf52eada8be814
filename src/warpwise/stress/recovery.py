"""Stress recovery: the one place where solved fields become stresses at the nodes.

For loads (N, Mx, My, Vx, Vy, T, see :mod:`.loads`) the stresses of each material are
recovered at the nodes of that material's elements, so that a stress that jumps at a material
interface is not averaged across it:

- normal stress (Navier, transformed section, E_ref): sigma_z = (E / E_ref) (N / A* + a x + b y)
  with a = (My Ix* - Mx Ixy*) / D*, b = (Mx Iy* - My Ixy*) / D*, D* = Ix* Iy* - Ixy*^2 about the
  modulus-weighted centroid;
- torsion shear (Saint-Venant): (G / G_ref) (T / J) (dpsi/dx - y, dpsi/dy + x), whatever G_ref
  is; the twist rate is T / (G_ref J);
- shear-force shear: (G / G_ref) (grad Theta - h) with the shear functions Theta and the split
  field h of :mod:`warpwise.properties.shear`, each material with its own coefficient.

Maxima leave out the singular neighbourhood of sharp re-entrant corners (the radius of each
corner found by the analysis, :attr:`SectionResult.corners`).
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass

import numpy as np

from ..errors import UsageError
from ..fem.p2 import nodal_gradient
from ..properties.analysis import SectionResult
from ..properties.shear import bending_gradients, split_field
from ..properties.torsion_modulus import corner_mask, shear_per_torque
from .loads import Loads


@dataclass(frozen=True, eq=False)
class MaterialField:
    """Stresses in one material, at the nodes of its elements (force unit F, length unit L).

    Attributes
    ----------
    material : str
        Material name ("" for a geometry-only section).
    group : int
        Index of the material in ``result.materials.names``.
    nodes : numpy.ndarray
        Node indices (k,) of this material's elements.
    sigma : numpy.ndarray
        Normal stress sigma_z (k,), tension positive, F/L^2.
    tau_zx, tau_zy : numpy.ndarray
        Shear stress components (k,), F/L^2.
    """

    material: str
    group: int
    nodes: np.ndarray
    sigma: np.ndarray
    tau_zx: np.ndarray
    tau_zy: np.ndarray

    @property
    def tau(self) -> np.ndarray:
        """Resultant shear stress (k,), F/L^2."""
        return np.hypot(self.tau_zx, self.tau_zy)

    @property
    def von_mises(self) -> np.ndarray:
        """Von Mises stress sqrt(sigma^2 + 3 tau^2) (k,), F/L^2."""
        return np.sqrt(self.sigma**2 + 3.0 * (self.tau_zx**2 + self.tau_zy**2))


def normal_stress(result: SectionResult, loads: Loads, local: np.ndarray) -> np.ndarray:
    """sigma_z of the reference material at points ``local`` (k, 2) (centroidal, L), F/L^2."""
    tr = result.weighted
    if not (loads.N or loads.Mx or loads.My):
        return np.zeros(len(local))
    D = tr.Ix * tr.Iy - tr.Ixy**2
    a = (loads.My * tr.Ix - loads.Mx * tr.Ixy) / D
    b = (loads.Mx * tr.Iy - loads.My * tr.Ixy) / D
    return loads.N / tr.A + a * local[:, 0] + b * local[:, 1]


def shear_components(result: SectionResult, loads: Loads, local: np.ndarray, c: np.ndarray | float,
                     gradient_of: Callable[[np.ndarray], np.ndarray]) -> np.ndarray:
    """(tau_zx, tau_zy) (k, 2) of the reference material from T, Vx, Vy at points ``local``.

    ``local`` (k, 2) are centroidal coordinates, L; ``c`` the shear-split coefficient there;
    ``gradient_of`` gives the gradient (k, 2) of a nodal field at the same points. F/L^2.
    """
    out = np.zeros((len(local), 2))
    if loads.T:
        out += loads.T * shear_per_torque(gradient_of(result.torsion.psi), local, result.torsion.J)
    if loads.Vx or loads.Vy:
        if result.solver.n_parts > 1:
            raise UsageError(f"shear forces on {result.solver.n_parts} separate parts taken as one "
                             "section are not computed (the parts would need joining along the "
                             "bar): analyse one part with --part N", file=result.profile.source)
        theta = loads.Vx * result.shear.theta_x + loads.Vy * result.shear.theta_y
        a, b = np.array([loads.Vx, loads.Vy]) @ bending_gradients(result.weighted)
        out += gradient_of(theta) - split_field(local, a, b, c)
    return out


def _shear_vector(result: SectionResult, loads: Loads, mask: np.ndarray, nodes: np.ndarray,
                  local: np.ndarray, c: float) -> np.ndarray:
    """(tau_zx, tau_zy) (k, 2) of the reference material from T, Vx, Vy at ``nodes``, F/L^2."""
    return shear_components(result, loads, local, c,
                            lambda f: nodal_gradient(result.mesh, f, mask)[nodes])


def recover(result: SectionResult, loads: Loads) -> list[MaterialField]:
    """Nodal stresses of every material for section forces ``loads``.

    Parameters
    ----------
    result : SectionResult
        An analysed section.
    loads : Loads
        Section forces (checked: finite, not all zero).

    Returns
    -------
    list of MaterialField
        One per material, in the order of ``result.materials.names``.
    """
    loads.check()
    mesh, mats = result.mesh, result.materials
    local_all = mesh.nodes - np.array(result.weighted.centroid)
    out = []
    for gi, name in enumerate(mats.names):
        mask = mats.group == gi
        nodes = np.unique(mesh.elements[mask])
        local = local_all[nodes]
        first = int(np.flatnonzero(mask)[0])
        wE, wG, c = float(mats.E[first]), float(mats.G[first]), float(mats.c[first])
        tau = wG * _shear_vector(result, loads, mask, nodes, local, c)
        out.append(MaterialField(name, gi, nodes, wE * normal_stress(result, loads, local),
                                 tau[:, 0], tau[:, 1]))
    return out


def envelope(fields: list[MaterialField], n_nodes: int) -> tuple[np.ndarray, np.ndarray]:
    """Nodal shear components (n,) over all materials; at a shared node the larger |tau| wins."""
    tzx, tzy = np.zeros(n_nodes), np.zeros(n_nodes)
    for f in fields:
        bigger = f.tau > np.hypot(tzx[f.nodes], tzy[f.nodes])
        tzx[f.nodes[bigger]] = f.tau_zx[bigger]
        tzy[f.nodes[bigger]] = f.tau_zy[bigger]
    return tzx, tzy


def away_from_corners(result: SectionResult, nodes: np.ndarray | None = None) -> np.ndarray:
    """Mask of ``nodes`` (default all) outside every sharp corner's excluded disc.

    When no node is outside (a tiny section), all are kept.
    """
    xy = result.mesh.nodes if nodes is None else result.mesh.nodes[nodes]
    return corner_mask(xy, result.corners)


def peak(result: SectionResult, values: np.ndarray, nodes: np.ndarray | None = None, *,
         keep: np.ndarray | None = None) -> tuple[float, tuple[float, float]]:
    """Largest of nodal ``values`` away from sharp corners, and the node where it is.

    Parameters
    ----------
    result : SectionResult
        The analysed section.
    values : numpy.ndarray
        Values at ``nodes`` (or at every node), any unit.
    nodes : numpy.ndarray, optional
        Node indices the values belong to (default all nodes).
    keep : numpy.ndarray, optional
        Precomputed :func:`away_from_corners` mask of ``nodes``.

    Returns
    -------
    (float, (float, float))
        The largest value and its node's coordinates, L.
    """
    keep = away_from_corners(result, nodes) if keep is None else keep
    k = int(np.flatnonzero(keep)[np.argmax(values[keep])])
    node = k if nodes is None else int(nodes[k])
    x, y = result.mesh.nodes[node]
    return float(values[k]), (float(x), float(y))


def reference_shear_modulus(result: SectionResult, G: float | None = None) -> float | None:
    """The shear modulus that turns a torque into a twist: ``G`` if given, else G_ref.

    Returns None when neither is known (geometry only): stresses need no modulus, a twist does.
    """
    return G if G is not None else result.materials.G_ref
