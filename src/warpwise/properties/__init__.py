"""Section properties: geometric, torsion and warping, shear, plastic, their bounds and errors.

:func:`analyse` (in :mod:`.analysis`) is the one call from a profile to every property.
"""

from .analysis import SectionResult, analyse

__all__ = ["SectionResult", "analyse"]
