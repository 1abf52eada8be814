"""Stresses under loads, recovered from the solved section (one recovery for every load)."""

from .recovery import ShearStress, TorsionStress, shear_modulus, shear_stress, torsion_stress

__all__ = ["ShearStress", "TorsionStress", "shear_modulus", "shear_stress", "torsion_stress"]
