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


def _result_html(self: SectionResult) -> str:
    """Jupyter's view of a result: its property table (:mod:`warpwise.report.notebook`)."""
    from .report.notebook import result_html

    return result_html(self)


# attached here, at the top of the package: the view is made by .report, a later stage than the
# class it shows; imported when first shown, so importing warpwise stays light
SectionResult._repr_html_ = _result_html  # type: ignore[attr-defined]

__version__ = "0.1.0"

__all__ = [
    "LENGTH_UNITS", "AnalysisError", "InputFileError", "Mesh", "Profile", "ProfileError",
    "Region", "SectionResult", "TorsionStress", "UsageError", "WarpwiseError", "analyse",
    "build_mesh", "profile_from_loops", "shear_modulus", "torsion_stress",
]
