"""The results of several load cases: per case and material the extreme stresses and where.

Each case is one :func:`~warpwise.stress.combined.combined_stress` (a loop over a handful of
cases; each recovery is vectorised over the nodes). Signed normal extremes include every node
(the normal stress is bounded); shear and von Mises maxima leave out sharp re-entrant corners.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

from ..properties.analysis import SectionResult
from .combined import combined_stress
from .loads import Loads
from .points import NormalExtremes, normal_extremes


@dataclass(frozen=True)
class CaseResult:
    """The extreme stresses of one load case in one material (force unit F, length unit L).

    Attributes
    ----------
    case : str
        Case name.
    loads : Loads
        Its section forces, F and F*L.
    normal : NormalExtremes
        Most tensile and most compressive normal stress and their points, F/L^2 and L.
    tau_max, von_mises_max : float
        Largest shear and von Mises stress away from sharp corners, F/L^2.
    tau_at, von_mises_at : tuple of float
        Where they are, L.
    utilisation : float or None
        von_mises_max / fy (informative, not a code check; None without fy).
    """

    case: str
    loads: Loads
    normal: NormalExtremes
    tau_max: float
    tau_at: tuple[float, float]
    von_mises_max: float
    von_mises_at: tuple[float, float]
    utilisation: float | None


def case_results(result: SectionResult, names: Sequence[str], loads: Sequence[Loads],
                 G: float | None = None) -> list[CaseResult]:
    """One CaseResult per case and material, cases in order, materials in section order.

    Parameters
    ----------
    result : SectionResult
        The analysed section.
    names : sequence of str
        Case names.
    loads : sequence of Loads
        The cases' section forces, in the profile's unit system.
    G : float, optional
        Shear modulus of a geometry-only section, F/L^2 (see ``combined_stress``).
    """
    out = []
    for name, case in zip(names, loads, strict=True):
        c = combined_stress(result, case, G)
        for m, e in zip(c.by_material, normal_extremes(result, c), strict=True):
            out.append(CaseResult(name, case, e, m.tau_max, m.tau_at, m.von_mises_max, m.von_mises_at,
                                  m.utilisation))
    return out


__all__ = ["CaseResult", "case_results"]
