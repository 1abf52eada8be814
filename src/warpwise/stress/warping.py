"""Stresses of restrained warping at one section of a member: sigma_w and the warping shear.

With the warping displacement w = phi' omega (omega the warping function about the shear
centre, zero mean: :attr:`warpwise.properties.torsion.TorsionProperties.omega`), the warping normal stress is

    sigma_w = E omega phi'' = -B omega / Cw        (B = -E Cw phi'', the bimoment)

and axial equilibrium of the section, d(tau_zx)/dx + d(tau_zy)/dy = -d(sigma_w)/dz =
-E omega phi''' = omega T_w / Cw (T_w = -E Cw phi''' the warping torque), with no shear on the
free boundary, gives the secondary (warping) shear stress

    tau_w = (T_w / Cw) grad chi,   Laplace(chi) = omega,   d(chi)/dn = 0

(the finite-element method of Pilkey, Analysis and Design of Elastic Beams, 2002, restrained
warping). In weak form K chi = -f with f_i = int N_i omega dA and K the stiffness matrix of the
warping problem: the same factorisation solves it. The stress carries exactly the torque T_w
about the shear centre: int (x_s tau_zy - y_s tau_zx) dA = (T_w / Cw) int grad chi .
(-y_s, x_s) dA = (T_w / Cw) Cw. One material only (a composite's K is shear-modulus weighted).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..errors import UsageError
from ..fem.p2 import assemble_vector, interpolate, nodal_gradient
from ..properties.analysis import SectionResult


@dataclass(frozen=True, eq=False)
class WarpingStress:
    """Restrained-warping stresses at the nodes (force unit F, length unit L).

    Attributes
    ----------
    sigma : numpy.ndarray
        Warping normal stress sigma_w (n,), tension positive, F/L^2.
    tau_zx, tau_zy : numpy.ndarray
        Warping shear stress components (n,), F/L^2.
    """

    sigma: np.ndarray
    tau_zx: np.ndarray
    tau_zy: np.ndarray

    @property
    def tau(self) -> np.ndarray:
        """Resultant warping shear stress (n,), F/L^2."""
        return np.hypot(self.tau_zx, self.tau_zy)


def secondary_warping(result: SectionResult) -> np.ndarray:
    """The nodal function chi (n,) of Laplace(chi) = omega, d(chi)/dn = 0, L^4.

    Solved with the analysis's own factorisation (:attr:`SectionResult.solver`).
    """
    if result.composite:
        raise UsageError("warping shear stresses of a composite section are not computed",
                         file=result.profile.source)
    ev = result.basis
    omega_q = interpolate(result.mesh, ev, result.torsion.omega)
    f = assemble_vector(result.mesh, np.einsum("mq,mq,qk->mk", ev.dA, omega_q, ev.N))
    return result.solver.solve(-f)


def warping_normal_stress(result: SectionResult, B: float) -> np.ndarray:
    """Warping normal stress sigma_w = -B omega / Cw at the nodes (n,), F/L^2.

    Parameters
    ----------
    result : SectionResult
        The analysed section (one material, Cw > 0).
    B : float
        Bimoment -E Cw phi'', F*L^2.

    Raises
    ------
    UsageError
        For a composite section or a section without a warping constant (Cw = 0).
    """
    if result.composite:
        raise UsageError("warping stresses of a composite section are not computed",
                         file=result.profile.source)
    Cw = result.torsion.Cw
    if not Cw > result.cw_round_off:
        raise UsageError("the section has no warping constant (Cw = 0): no warping stresses",
                         file=result.profile.source)
    return -B * result.torsion.omega / Cw


def warping_stress(result: SectionResult, B: float, T_w: float, E: float) -> WarpingStress:
    """Warping normal and shear stresses of a bimoment and a warping torque.

    Parameters
    ----------
    result : SectionResult
        The analysed section (one material).
    B : float
        Bimoment -E Cw phi'', F*L^2.
    T_w : float
        Warping torque -E Cw phi''', F*L.
    E : float
        Young's modulus, F/L^2 (only to check the section has a warping stiffness).

    Returns
    -------
    WarpingStress
    """
    if not E > 0:
        raise UsageError(f"Young's modulus must be positive, got {E}", file=result.profile.source)
    sigma = warping_normal_stress(result, B)
    Cw = result.torsion.Cw
    grad = nodal_gradient(result.mesh, secondary_warping(result)) * (T_w / Cw)
    return WarpingStress(sigma=sigma, tau_zx=grad[:, 0], tau_zy=grad[:, 1])


__all__ = ["WarpingStress", "secondary_warping", "warping_normal_stress", "warping_stress"]
