"""Analysis options to a result: the one entry every command, the catalogue and the scripts use.

:class:`AnalysisOptions` holds what a user chooses about the analysis (accuracy, mesh size,
materials, reference material, solver, bounds, error estimates, adaptive target) and
:func:`run_analysis` turns a profile and those options into a :class:`SectionResult`:
materials are resolved from the profile's own region names, a user table and a default
material; a profile without material names gets its one material for the whole section; the
error estimate or the adaptive refinement runs when asked for.

Examples
--------
>>> from warpwise.geometry.shapes import rectangle
>>> res = run_analysis(rectangle(40.0, 20.0), AnalysisOptions(material="steel-S235"))
>>> res.materials.names
('steel-S235',)
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field, replace

import numpy as np

from ..errors import UsageError, WarpwiseError
from ..fem.solve import METHODS
from ..geometry.profile import Profile
from ..materials import Material, check_poisson, resolve
from ..mesh.budget import default_element_limit
from .accuracy import estimate_errors, refinement_for
from .adapt import refine_adaptively
from .analysis import SectionResult, analyse
from .shear import DEFAULT_POISSON


@dataclass(frozen=True)
class AnalysisOptions:
    """How a profile is analysed.

    Attributes
    ----------
    mesh_size : float or None
        Largest element size, drawing unit (None: chosen from the profile).
    accuracy : str
        ``draft``, ``normal`` or ``fine`` (see :data:`~warpwise.properties.accuracy.ACCURACY_LEVELS`).
    poisson : float or None
        Poisson's ratio without a material (None: :data:`DEFAULT_POISSON`).
    material : str or None
        Material of regions without one (built-in name or a name of ``materials``).
    materials : mapping of str to Material
        The user's materials table.
    reference : str or None
        Reference material of a composite section.
    solver : str
        Linear solver (``auto``, ``superlu``, ``pardiso``, ``amg``).
    bounds : bool
        Also compute the guaranteed lower bound on J.
    estimate_errors : bool
        Estimate the errors of the main values (about 7 times the work).
    target_error : float or None
        Refine adaptively until J is certainly within this relative error.
    max_elements : int
        Largest mesh any step builds (``--max-elements``; default this machine's limit from
        its memory, :func:`~warpwise.mesh.budget.default_element_limit`, at most
        :data:`~warpwise.mesh.sizing.MAX_ELEMENTS`); the boundary-point limit scales with it.
    """

    mesh_size: float | None = None
    accuracy: str = "normal"
    poisson: float | None = None
    material: str | None = None
    materials: Mapping[str, Material] = field(default_factory=dict)
    reference: str | None = None
    solver: str = "auto"
    bounds: bool = True
    estimate_errors: bool = False
    target_error: float | None = None
    max_elements: int = field(default_factory=default_element_limit)

    def __post_init__(self) -> None:
        """Refuse options that cannot be right before any work is done."""
        self.nu  # noqa: B018 (checks Poisson's ratio)
        self.refine  # noqa: B018 (checks the accuracy name)
        if self.solver not in METHODS:
            raise UsageError(f"unknown solver {self.solver!r} (use {', '.join(METHODS)})")
        if self.target_error is not None and not 0 < self.target_error < 1:
            raise UsageError(f"target error must lie in (0, 1), got {self.target_error}")
        if isinstance(self.max_elements, bool) or not isinstance(self.max_elements, int) \
                or self.max_elements < 1:
            raise UsageError(f"the element limit must be a positive whole number, got {self.max_elements!r}")
        if self.mesh_size is not None and not (np.isfinite(self.mesh_size) and self.mesh_size > 0):
            raise UsageError(f"mesh size must be a positive number, got {self.mesh_size}")

    @property
    def nu(self) -> float:
        """Poisson's ratio without a material, checked (dimensionless)."""
        return check_poisson(DEFAULT_POISSON if self.poisson is None else self.poisson)

    @property
    def refine(self) -> float:
        """Mesh refinement factor of the accuracy setting."""
        return refinement_for(self.accuracy)


def profile_materials(profile: Profile, options: AnalysisOptions) -> Material | list[Material] | None:
    """The materials of a profile under ``options``: None, one for all, or one per region.

    A profile whose regions carry no material name gets the one default material (or none);
    named regions get theirs from the user table or the built-in one.
    """
    mats = resolve([r.material for r in profile.regions], options.materials, options.material,
                   source=profile.source)
    if mats is not None and not any(r.material for r in profile.regions):
        return mats[0]
    return mats


def geometry_only(profile: Profile) -> Profile:
    """The profile without material names: for the runs that judge the mesh, not the materials.

    Examples
    --------
    >>> from warpwise.geometry import profile_from_loops
    >>> p = profile_from_loops([[(0, 0), (4, 0), (4, 2)]], ["steel-S235"])
    >>> p.materials, geometry_only(p).materials
    (('steel-S235',), (None,))
    """
    if not any(profile.materials):
        return profile
    return replace(profile, regions=tuple(replace(r, material=None) for r in profile.regions))


def run_analysis(profile: Profile, options: AnalysisOptions | None = None) -> SectionResult:
    """Analyse a profile with the given options.

    Parameters
    ----------
    profile : Profile
        A validated profile.
    options : AnalysisOptions, optional
        The analysis options (default: :class:`AnalysisOptions` ()).

    Returns
    -------
    SectionResult
        With ``errors`` set when an estimate was asked for, ``target`` when a target error was.

    Raises
    ------
    WarpwiseError
        Any defect, with the profile's source as the file.
    """
    options = options or AnalysisOptions()
    try:
        nu, refine = options.nu, options.refine
        mats = profile_materials(profile, options)
        kwargs = {"poisson": nu, "materials": mats, "reference": options.reference,
                  "solver": options.solver, "bounds": options.bounds,
                  "max_elements": options.max_elements}
        if options.target_error:
            run = refine_adaptively(geometry_only(profile), options.target_error,
                                    options.mesh_size, poisson=nu, solver=options.solver,
                                    max_elements=options.max_elements)
            return replace(analyse(profile, mesh=run.result.mesh, **kwargs), target=run.status)
        if options.estimate_errors:
            est = estimate_errors(geometry_only(profile), options.mesh_size, refine=refine,
                                  poisson=nu, bounds=options.bounds, solver=options.solver,
                                  max_elements=options.max_elements)
            if mats is None:
                return est.result
            res = analyse(profile, options.mesh_size, refine=refine, **kwargs)
            return replace(res, errors=est.relative_error)
        return analyse(profile, options.mesh_size, refine=refine, **kwargs)
    except WarpwiseError as exc:
        raise exc.with_file(profile.source) from None
