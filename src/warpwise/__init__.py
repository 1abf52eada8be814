"""warpwise: true section properties of bar and extrusion profiles.

Geometric properties, Saint-Venant torsion constant, shear centre and warping constant of any
profile, by six-node triangle finite elements. The public API is re-exported here.

The packages follow the pipeline: :mod:`.io` (files to loops) -> :mod:`.geometry` (validated
profiles) -> :mod:`.mesh` -> :mod:`.fem` (element, assembly, solvers) -> :mod:`.properties`
(every section property) -> :mod:`.stress` (stresses under loads) -> :mod:`.report` (tables,
files, figures) -> :mod:`.catalogue` and :mod:`.cli`. Nothing downstream is imported upstream.
"""

from . import _moved
from .errors import AnalysisError, InputFileError, ProfileError, UsageError, WarpwiseError
from .geometry import LENGTH_UNITS, Profile, Region, profile_from_loops
from .mesh import Mesh, build_mesh
from .properties import SectionResult, analyse
from .stress import TorsionStress, shear_modulus, torsion_stress

_moved.install()

__version__ = "0.1.0"

__all__ = [
    "LENGTH_UNITS", "AnalysisError", "InputFileError", "Mesh", "Profile", "ProfileError",
    "Region", "SectionResult", "TorsionStress", "UsageError", "WarpwiseError", "analyse",
    "build_mesh", "profile_from_loops", "shear_modulus", "torsion_stress",
]
