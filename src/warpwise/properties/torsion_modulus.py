"""The torsional section modulus Wt = T / tau_max of the Saint-Venant stress field.

With the warping function psi about the centroid, a torque T gives the shear stress
(G / G_ref) (T / J) (dpsi/dx - y, dpsi/dy + x) in each material (:mod:`warpwise.stress.recovery`
uses the same field, :func:`unit_torque_shear`). It is proportional to T, so the largest
resultant per unit torque, away from sharp re-entrant corners (where it is unbounded in
theory, :func:`corner_mask`), gives Wt = 1 / that: an extrusion catalogue's torsional
modulus, T = Wt tau_max.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from ..fem.p2 import nodal_gradient
from ..geometry.corners import Corner
from ..materials import ElementMaterials
from ..mesh.core import Mesh
from .torsion import TorsionProperties


@dataclass(frozen=True)
class TorsionModulus:
    """Torsional section modulus (drawing length unit L).

    Attributes
    ----------
    Wt : float
        T / tau_max, L^3 (tau_max away from sharp re-entrant corners).
    at : tuple of float
        Node of the largest stress, drawing coordinates, L.
    """

    Wt: float
    at: tuple[float, float]


def corner_mask(points: np.ndarray, corners: Sequence[Corner]) -> np.ndarray:
    """Mask of ``points`` (k, 2) outside every sharp corner's excluded disc, L.

    When no point is outside (a tiny section), all are kept.
    """
    keep = np.ones(len(points), bool)
    for c in corners:  # a few corners, each vectorised over the points
        keep &= np.hypot(points[:, 0] - c.x, points[:, 1] - c.y) > c.radius
    return keep if keep.any() else np.ones(len(points), bool)


def unit_torque_shear(mesh: Mesh, tor: TorsionProperties, mask: np.ndarray, nodes: np.ndarray,
                      local: np.ndarray) -> np.ndarray:
    """(tau_zx, tau_zy) (k, 2) of the reference material per unit torque at ``nodes``, 1/L^3.

    ``mask`` selects the elements the nodal gradient is averaged over (one material), ``local``
    the nodes' coordinates from the centroid the warping function refers to, L.
    """
    return shear_per_torque(nodal_gradient(mesh, tor.psi, mask)[nodes], local, tor.J)


def shear_per_torque(grad_psi: np.ndarray, local: np.ndarray, J: float) -> np.ndarray:
    """(tau_zx, tau_zy) (k, 2) per unit torque from the warping gradient at points, 1/L^3.

    tau_zx = (dpsi/dx - y) / J and tau_zy = (dpsi/dy + x) / J per unit torque, with ``local``
    (k, 2) the points' coordinates from the centroid psi refers to, L; ``J`` in L^4.
    """
    return np.column_stack([grad_psi[:, 0] - local[:, 1], grad_psi[:, 1] + local[:, 0]]) / J


def torsion_modulus(mesh: Mesh, tor: TorsionProperties, centroid: tuple[float, float],
                    mats: ElementMaterials, corners: Sequence[Corner]) -> TorsionModulus:
    """Wt = T / tau_max, the largest stress over the materials, away from sharp corners.

    Parameters
    ----------
    mesh : Mesh
        The mesh, L.
    tor : TorsionProperties
        Torsion results (psi about ``centroid``, J), L.
    centroid : tuple of float
        Centroid the warping function refers to (modulus-weighted for a composite), L.
    mats : ElementMaterials
        Materials per element (G / G_ref weights each material's stress).
    corners : sequence of Corner
        Sharp re-entrant corners with their excluded radii, L.

    Returns
    -------
    TorsionModulus
        Wt in L^3 and where the largest stress is.

    Examples
    --------
    >>> from warpwise.properties.analysis import analyse
    >>> from warpwise.geometry.shapes import circle
    >>> wt = analyse(circle(20.0)).torsion_modulus.Wt  # pi d^3 / 16 = 1570.796...
    >>> abs(wt / 1570.796327 - 1) < 1e-3
    True
    """
    local_all = mesh.nodes - np.array(centroid)
    top, at = -1.0, (0.0, 0.0)
    for gi in range(len(mats.names)):  # per material, each vectorised over its nodes
        mask = mats.group == gi
        # one material: every node (np.unique of the connectivity sorts it, a cost at 1M nodes)
        nodes = np.arange(mesh.n_nodes) if len(mats.names) == 1 else np.unique(mesh.elements[mask])
        tau = float(mats.G[np.flatnonzero(mask)[0]]) * np.hypot(
            *unit_torque_shear(mesh, tor, mask, nodes, local_all[nodes]).T)
        keep = corner_mask(mesh.nodes[nodes], corners)
        k = int(np.flatnonzero(keep)[np.argmax(tau[keep])])
        if tau[k] > top:
            top, at = float(tau[k]), (float(mesh.nodes[nodes[k], 0]), float(mesh.nodes[nodes[k], 1]))
    return TorsionModulus(1.0 / top, at)


__all__ = ["TorsionModulus", "corner_mask", "torsion_modulus", "unit_torque_shear"]
