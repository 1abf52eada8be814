"""Stresses of a member's torsion at its governing sections.

At the sections where |B|, |T_w| and |T_sv| are largest along the member
(:func:`warpwise.member.extremes`), the largest warping normal stress sigma_w = -B omega / Cw and
warping shear stress (T_w / Cw) grad chi of :mod:`.warping`, and the largest Saint-Venant shear
stress of T_sv (the torsion stress recovery of :mod:`.shear`), each with where it is. Maxima
leave out the singular neighbourhood of sharp re-entrant corners. The three stresses peak at
different points of the section and are not added here.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..member import Extreme, MemberTorsion
from ..properties.analysis import SectionResult
from .recovery import away_from_corners, peak
from .shear import torsion_stress
from .warping import warping_stress

#: The governing quantities, in report order.
GOVERNING = ("B", "T_w", "T_sv")


@dataclass(frozen=True)
class SectionStresses:
    """The largest torsion stresses at one governing section (force unit F, length unit L).

    Attributes
    ----------
    governs : str
        The quantity largest there: "B", "T_w" or "T_sv".
    z : float
        Position along the member, L.
    B, T_w, T_sv : float
        Bimoment (F*L^2), warping torque and Saint-Venant torque (F*L) there.
    sigma_w, tau_w, tau_sv : float or None
        Largest warping normal stress (signed), warping shear stress and Saint-Venant shear
        stress, F/L^2 (None for the warping stresses of a section without warping, Cw = 0).
    sigma_w_at, tau_w_at, tau_sv_at : tuple of float or None
        Where each is, L (None where the stress is not computed or T_sv is 0).
    """

    governs: str
    z: float
    B: float
    T_w: float
    T_sv: float
    sigma_w: float | None
    sigma_w_at: tuple[float, float] | None
    tau_w: float | None
    tau_w_at: tuple[float, float] | None
    tau_sv: float
    tau_sv_at: tuple[float, float] | None


def _signed_peak(result: SectionResult, values: np.ndarray) -> tuple[float, tuple[float, float]]:
    """The nodal value of largest magnitude (signed), away from sharp corners, and its node."""
    k = int(np.argmax(np.where(away_from_corners(result), np.abs(values), -1.0)))
    x, y = result.mesh.nodes[k]
    return float(values[k]), (float(x), float(y))


def governing_stresses(result: SectionResult, member: MemberTorsion,
                       top: list[Extreme]) -> list[SectionStresses]:
    """The torsion stresses at the sections of largest |B|, |T_w| and |T_sv|.

    Parameters
    ----------
    result : SectionResult
        The member's analysed section (E and G from its material).
    member : MemberTorsion
        The solved member.
    top : list of Extreme
        Its largest values (:func:`warpwise.member.extremes`).

    Returns
    -------
    list of SectionStresses
        One per governing quantity; without warping (Cw = 0) only the T_sv section.
    """
    where = {e.name: e for e in top}
    warping = not member.saint_venant_only
    out = []
    for name in GOVERNING if warping else ("T_sv",):
        e = where[name]
        at = member.actions(np.array([e.z]), e.side)
        B, T_w, T_sv = float(at.B[0]), float(at.T_w[0]), float(at.T_sv[0])
        sigma = tau_w = None
        sigma_at = tau_w_at = None
        if warping:
            w = warping_stress(result, B, T_w, member.ECw / result.torsion.Cw)
            sigma, sigma_at = _signed_peak(result, w.sigma)
            tau_w, tau_w_at = peak(result, w.tau)
        tau_sv, tau_sv_at = 0.0, None  # no Saint-Venant torque there (a fixed end)
        if T_sv != 0:
            s = torsion_stress(result, T_sv)
            tau_sv, tau_sv_at = s.tau_max, s.tau_max_at
        out.append(SectionStresses(name, e.z, B, T_w, T_sv, sigma, sigma_at, tau_w, tau_w_at,
                                   tau_sv, tau_sv_at))
    return out


__all__ = ["GOVERNING", "SectionStresses", "governing_stresses"]
