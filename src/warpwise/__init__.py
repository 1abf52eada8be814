"""warpwise: true section properties of bar and extrusion profiles.

Geometric properties, Saint-Venant torsion constant, shear centre and warping constant of any
profile, by six-node triangle finite elements. The public API is re-exported here.

The packages follow the pipeline: :mod:`.io` (files to loops) -> :mod:`.geometry` (validated
profiles) -> :mod:`.mesh` -> :mod:`.fem` (element, assembly, solvers) -> :mod:`.properties`
(every section property) -> :mod:`.stress` (stresses under loads) -> :mod:`.report` (tables,
files, figures) -> :mod:`.catalogue` and :mod:`.cli`. Nothing downstream is imported upstream.

The re-exported names (but the result class, which gets its notebook view here) are loaded on
first use (a module-level ``__getattr__``), so that a command that needs only part of the
pipeline starts quickly.
"""

from __future__ import annotations

import importlib

from . import _moved
from .errors import AnalysisError, InputFileError, ProfileError, UsageError, WarpwiseError
from .properties.analysis import SectionResult

_moved.install()


def _result_html(self: SectionResult) -> str:
    """Jupyter's view of a result: its property table (:mod:`warpwise.report.notebook`)."""
    from .report.notebook import result_html

    return result_html(self)


# attached here, at the top of the package: the view is made by .report, a later stage than the
# class it shows; imported when first shown, so importing warpwise stays light. (The result
# class is needed for that, so the analysis is loaded with the package; every command analyses.)
SectionResult._repr_html_ = _result_html  # type: ignore[attr-defined]

__version__ = "0.1.0"

#: Public name -> the package that holds it (imported when the name is first used).
_LAZY = {
    "LENGTH_UNITS": "geometry", "Profile": "geometry", "Region": "geometry",
    "profile_from_loops": "geometry", "Mesh": "mesh", "build_mesh": "mesh",
    "analyse": "properties", "TorsionStress": "stress",
    "shear_modulus": "stress", "torsion_stress": "stress",
}

__all__ = [
    "LENGTH_UNITS", "AnalysisError", "InputFileError", "Mesh", "Profile", "ProfileError",
    "Region", "SectionResult", "TorsionStress", "UsageError", "WarpwiseError", "analyse",
    "build_mesh", "profile_from_loops", "shear_modulus", "torsion_stress",
]


def __getattr__(name: str) -> object:
    """A public name from the package that holds it, imported on first use."""
    home = _LAZY.get(name)
    if home is None:
        raise AttributeError(f"module {__name__!r} has no attribute {name!r}")
    value = getattr(importlib.import_module(f".{home}", __name__), name)
    globals()[name] = value
    return value


def __dir__() -> list[str]:
    return sorted(set(globals()) | set(__all__))
