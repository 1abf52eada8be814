"""The torsional section modulus Wt = T / tau_max and the twist per unit torque.

Both come from the one torsion stress recovery (:func:`.shear.torsion_stress`): the stress field
is proportional to the torque, so one unit torque gives tau_max per unit torque, and
Wt = 1 / that (an extrusion catalogue's torsional modulus: T = Wt tau_max). The largest stress
is the one found away from sharp re-entrant corners (where it is unbounded in theory).
"""

from __future__ import annotations

from dataclasses import dataclass

from ..properties.analysis import SectionResult
from ..units import twist_in_degrees
from .recovery import reference_shear_modulus
from .shear import torsion_stress


@dataclass(frozen=True)
class TorsionModulus:
    """Torsional section modulus and twist per unit torque.

    Attributes
    ----------
    Wt : float
        T / tau_max, L^3 (tau_max away from sharp re-entrant corners).
    at : tuple of float
        Node of the largest stress, drawing coordinates, L.
    twist_per_torque : float or None
        theta / T = 1 / (G J) in degrees per metre (per foot in the in and ft systems) per
        moment unit of the system (N*mm with mm); None without a shear modulus.
    """

    Wt: float
    at: tuple[float, float]
    twist_per_torque: float | None


def torsion_modulus(result: SectionResult) -> TorsionModulus:
    """Wt = T / tau_max and theta / T of an analysed section.

    Parameters
    ----------
    result : SectionResult
        An analysed section (length unit L).

    Returns
    -------
    TorsionModulus
        Wt in L^3; theta / T in degrees per metre (or foot) per force x L, when the section has
        a material.

    Examples
    --------
    >>> from warpwise.properties.analysis import analyse
    >>> from warpwise.geometry.shapes import circle
    >>> wt = torsion_modulus(analyse(circle(20.0))).Wt  # pi d^3 / 16 = 1570.796...
    >>> abs(wt / 1570.796327 - 1) < 1e-3
    True
    """
    unit = torsion_stress(result, 1.0)
    G = reference_shear_modulus(result)
    per_torque = None if G is None else twist_in_degrees(1.0 / (G * result.torsion.J),
                                                          result.units)
    return TorsionModulus(1.0 / unit.tau_max, unit.tau_max_at, per_torque)


__all__ = ["TorsionModulus", "torsion_modulus"]
