"""Stresses at given points and the signed extreme normal stresses of each material.

At a point the stress components come from the element holding it (:mod:`warpwise.fem.points`):
the normal stress from Navier's formula (linear, exact), the shear stresses from the gradients
of the P2 torsion and shear functions evaluated there, each with the coefficients of that
element's material (:func:`~warpwise.stress.recovery.recover` does the same at the nodes). A
point on an interface takes the material of the element found first.

The signed extremes are the most tensile and the most compressive nodal normal stress of each
material, with their nodes. The normal stress is bounded everywhere (it is linear in x and y),
so no sharp corner is left out of them.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike

from ..errors import UsageError
from ..fem.points import gradient_at, locate
from ..properties.analysis import SectionResult
from .combined import CombinedStress
from .loads import Loads
from .recovery import normal_stress, peak, shear_components


@dataclass(frozen=True, eq=False)
class PointStress:
    """Stress components at given points (force unit F, length unit L).

    Attributes
    ----------
    points : numpy.ndarray
        The points (p, 2), drawing coordinates, L.
    materials : tuple of str
        Material at each point ("" for a geometry-only section).
    sigma, tau_zx, tau_zy, tau, von_mises : numpy.ndarray
        Normal stress (tension positive), shear components, resultant shear and von Mises
        stress sqrt(sigma^2 + 3 tau^2) at each point (p,), F/L^2.
    """

    points: np.ndarray
    materials: tuple[str, ...]
    sigma: np.ndarray
    tau_zx: np.ndarray
    tau_zy: np.ndarray
    tau: np.ndarray
    von_mises: np.ndarray


def stress_at_points(result: SectionResult, loads: Loads, points: ArrayLike, *,
                     shown: ArrayLike | None = None) -> PointStress:
    """All stress components at ``points`` (p, 2) for section forces ``loads``.

    Parameters
    ----------
    result : SectionResult
        An analysed section.
    loads : Loads
        Section forces (F, F*L).
    points : array_like
        Points (p, 2), drawing coordinates, L.
    shown : array_like, optional
        The points as the user gave them (other units), for the message of a refusal.

    Raises
    ------
    UsageError
        A point outside the section, named as given.
    """
    loads.check()
    pts = np.asarray(points, dtype=float).reshape(-1, 2)
    at = locate(result.mesh, pts)
    if not at.inside.all():
        k = int(np.argmin(at.inside))
        x, y = np.asarray(pts if shown is None else shown, dtype=float).reshape(-1, 2)[k]
        raise UsageError(f"point ({x:g}, {y:g}) is outside the section")
    mats = result.materials
    e = at.element
    local = pts - np.array(result.weighted.centroid)
    sigma = mats.E[e] * normal_stress(result, loads, local)
    tau = mats.G[e][:, None] * shear_components(
        result, loads, local, mats.c[e], lambda f: gradient_at(result.mesh, f, at))
    t = np.hypot(tau[:, 0], tau[:, 1])
    return PointStress(pts, tuple(mats.names[g] for g in mats.group[e]), sigma, tau[:, 0],
                       tau[:, 1], t, np.sqrt(sigma**2 + 3.0 * t**2))


@dataclass(frozen=True)
class NormalExtremes:
    """The most tensile and the most compressive normal stress of one material.

    Attributes
    ----------
    material : str
        Material name ("" for a geometry-only section).
    tension, compression : float
        Largest and smallest (signed) nodal normal stress, F/L^2 (``tension`` is negative
        when the whole material is in compression, and ``compression`` positive when it is all
        in tension).
    tension_at, compression_at : tuple of float
        Their nodes, L.
    """

    material: str
    tension: float
    tension_at: tuple[float, float]
    compression: float
    compression_at: tuple[float, float]


def normal_extremes(result: SectionResult, c: CombinedStress) -> list[NormalExtremes]:
    """The signed extreme normal stresses of each material of ``c`` (see NormalExtremes)."""
    out = []
    for m in c.by_material:
        every = np.ones(len(m.nodes), bool)
        hi, hi_at = peak(result, m.sigma, m.nodes, keep=every)
        lo, lo_at = peak(result, -m.sigma, m.nodes, keep=every)
        out.append(NormalExtremes(m.material, hi, hi_at, -lo, lo_at))
    return out


__all__ = ["NormalExtremes", "PointStress", "normal_extremes", "stress_at_points"]
