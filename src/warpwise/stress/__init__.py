"""Stresses under loads, recovered from the solved section (one recovery for every load).

:mod:`.loads` (section forces, shear modulus), :mod:`.recovery` (the nodal stresses of each
material and their maxima away from sharp corners), :mod:`.shear` (torque and shear forces),
:mod:`.combined` (all six section forces and a bimoment, with von Mises), :mod:`.warping`
(restrained-warping stresses).
"""

from .combined import CombinedStress, MaterialStress, combined_stress
from .loads import BIMOMENT, Loads, shear_modulus
from .recovery import MaterialField, recover
from .shear import (
    CornerStress,
    MaterialPeak,
    ShearStress,
    TorsionStress,
    nominal_torsion,
    shear_stress,
    torsion_stress,
)

__all__ = ["BIMOMENT", "CombinedStress", "CornerStress", "Loads", "MaterialField", "MaterialPeak",
           "MaterialStress", "ShearStress", "TorsionStress", "combined_stress", "recover", "shear_modulus",
           "nominal_torsion", "shear_stress", "torsion_stress"]
