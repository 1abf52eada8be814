"""One call from a profile to all its section properties.

Mesh once, evaluate the basis once, assemble and factorise the stiffness matrix once, then
solve every right-hand side with the same factorisation.

Examples
--------
>>> from warpwise.geometry.shapes import rectangle
>>> res = analyse(rectangle(40.0, 20.0))
>>> round(res.geometric.A, 6)
800.0

"""

from __future__ import annotations

import time
import warnings
from collections.abc import Sequence
from dataclasses import dataclass, field, replace

import numpy as np

from ..errors import AnalysisError
from ..fem.p2 import ElementValues, element_values, integrate, stiffness_matrix
from ..fem.solve import PinnedSolver
from ..geometry.corners import Corner, reentrant_corners
from ..geometry.profile import Profile
from ..materials import ElementMaterials, Material, check_poisson, resolve
from ..mesh.core import MAX_ELEMENTS, Mesh, build_mesh
from .bounds import torsion_lower_bound
from .buckling import BucklingConstants, buckling_constants
from .geometric import GeometricProperties, geometric_properties
from .outline import Perimeters, perimeters
from .plastic import PlasticProperties, plastic_properties
from .shear import DEFAULT_POISSON, ShearProperties, shear_properties
from .torsion import TorsionProperties, cw_round_off, torsion_load, torsion_properties
from .torsion_modulus import TorsionModulus, torsion_modulus
from .wall import WallThickness, wall_thickness

#: Largest relative residual accepted from a linear solve before the result is refused.
MAX_RESIDUAL = 1e-8


#: Why an adaptive refinement stopped (:attr:`TargetStatus.stopped`), each with what it means.
REACHED, STEP_LIMIT, ELEMENT_BUDGET, ROUND_OFF_FLOOR = (
    "target reached", "step limit", "element budget", "round-off floor")
STOP_REASONS = {
    REACHED: "the guaranteed bound is within the target",
    STEP_LIMIT: "no more meshes are solved",
    ELEMENT_BUDGET: "the next mesh would have had more elements than allowed",
    ROUND_OFF_FLOOR: "the warping error indicator is at round-off, so refinement has nothing "
                     "left to steer by",
}


@dataclass(frozen=True)
class TargetStatus:
    """How adaptive refinement towards a requested error of J ended.

    Attributes
    ----------
    target : float
        Requested relative error of J (dimensionless).
    reached : float
        Guaranteed bound on the relative error of J on the final mesh, (J - J_low) / J_low.
    meshes : int
        Meshes solved (the first one included).
    stopped : str
        Why the refinement stopped, a key of :data:`STOP_REASONS`.
    nodes : int
        Nodes of the last mesh solved (0: not recorded).
    limit : int
        The element limit in force (0: not recorded), named when it stopped the refinement.
    """

    target: float
    reached: float
    meshes: int
    stopped: str
    nodes: int = 0
    limit: int = 0

    @property
    def met(self) -> bool:
        """True when the bound is within the target."""
        return self.reached <= self.target

    @property
    def text(self) -> str:
        """One line saying the target, the bound reached, the steps and why it stopped.

        Examples
        --------
        >>> TargetStatus(1e-12, 4.5e-9, 12, STEP_LIMIT).text  # doctest: +NORMALIZE_WHITESPACE
        'target error 1e-12 missed: J is certainly within 4.5e-09 after 12 meshes; stopped at
        the step limit: no more meshes are solved'
        """
        outcome = "met" if self.met else "missed"
        last = "" if not self.nodes else (f" of {self.nodes:,} nodes" if self.meshes == 1 else
                                          f", the last of {self.nodes:,} nodes")
        head = (f"target error {self.target:.3g} {outcome}: J is certainly within "
                f"{self.reached:.2g} after {self.meshes} mesh{'' if self.meshes == 1 else 'es'}"
                f"{last}")
        if self.met:
            return head
        why = STOP_REASONS[self.stopped]
        if self.stopped == ELEMENT_BUDGET and self.limit:
            why = (f"the next mesh would have had more than {self.limit:,} elements, the limit "
                   "(--max-elements N sets it; the default follows this machine's memory)")
        return f"{head}; stopped at the {self.stopped}: {why}"


@dataclass(frozen=True, eq=False)
class SectionResult:
    """Everything computed for one profile.

    Attributes
    ----------
    profile : Profile
        The analysed profile.
    mesh : Mesh
        The mesh used.
    geometric : GeometricProperties
        Area properties of the geometry (unweighted).
    torsion : TorsionProperties
        Torsion and warping properties.
    shear : ShearProperties
        Shear functions, shear areas and the elastic shear centre.
    basis : ElementValues
        Shape functions, gradients and quadrature points in centroidal coordinates (about the
        modulus-weighted centroid for a composite section), for stress recovery.
    solver : PinnedSolver
        The factorised stiffness matrix (for further right-hand sides).
    weighted : GeometricProperties
        Modulus-weighted (transformed-section) properties referred to the reference material,
        about the modulus-weighted centroid; the same object as ``geometric`` for one material.
        Torsion and shear results are referred to this centroid.
    materials : ElementMaterials
        Material data per element.
    plastic : PlasticProperties or None
        Plastic moduli, neutral axes and moments.
    errors : dict of str to float or None
        Estimated relative errors of the main values (see :mod:`warpwise.properties.accuracy`),
        when an estimate was asked for.
    corners : tuple of Corner
        Sharp re-entrant corners of the outline with the radius left out of stress maxima.
    region_areas : tuple of float
        Meshed area of each region of ``profile.regions`` (curved edges included), L^2.
    timings : dict of str to float
        Wall time of each stage of the analysis, s (mesh, basis, assembly, factorise, warping,
        bounds, shear, plastic).
    target : TargetStatus or None
        How the adaptive refinement ended, when a target error was asked for.
    perimeters : Perimeters or None
        Outer and total perimeter of the material outline (exact on recorded arcs), L.
    wall : WallThickness or None
        Minimum wall thickness and where it is, L.
    torsion_modulus : TorsionModulus or None
        Wt = T / tau_max (away from sharp re-entrant corners), L^3.
    """

    profile: Profile
    mesh: Mesh
    geometric: GeometricProperties
    torsion: TorsionProperties
    shear: ShearProperties
    basis: ElementValues
    solver: PinnedSolver
    weighted: GeometricProperties
    materials: ElementMaterials
    plastic: PlasticProperties | None = None
    errors: dict[str, float] | None = None
    corners: tuple[Corner, ...] = ()
    region_areas: tuple[float, ...] = ()
    timings: dict[str, float] = field(default_factory=dict)
    target: TargetStatus | None = None
    perimeters: Perimeters | None = None
    wall: WallThickness | None = None
    torsion_modulus: TorsionModulus | None = None

    @property
    def composite(self) -> bool:
        """True for a section of more than one material."""
        return self.materials.composite

    @property
    def units(self) -> str:
        """Length unit of all results."""
        return self.profile.units

    @property
    def buckling(self) -> BucklingConstants:
        """Shear-centre offset and polar radius of gyration about the shear centre, L."""
        return buckling_constants(self.weighted, self.torsion)

    @property
    def cw_round_off(self) -> float:
        """Warping constant below which Cw is round-off of 0 (a circle, a tube), L^6."""
        return cw_round_off(self.profile.size, self.geometric.A)

    @property
    def values(self) -> ElementValues:
        """Deprecated name of :attr:`basis` (kept for one release)."""
        warnings.warn("SectionResult.values is now SectionResult.basis", DeprecationWarning,
                      stacklevel=2)
        return self.basis

    @property
    def transformed(self) -> GeometricProperties:
        """Deprecated name of :attr:`weighted` (kept for one release)."""
        warnings.warn("SectionResult.transformed is now SectionResult.weighted",
                      DeprecationWarning, stacklevel=2)
        return self.weighted


class _Clock:
    """Wall time of named stages, s."""

    def __init__(self) -> None:
        self.times: dict[str, float] = {}
        self._last = time.perf_counter()

    def lap(self, stage: str) -> None:
        now = time.perf_counter()
        self.times[stage] = self.times.get(stage, 0.0) + now - self._last
        self._last = now


def element_materials(profile: Profile, mesh: Mesh, poisson: float,
                      materials: Material | Sequence[Material] | None,
                      reference: str | None) -> ElementMaterials:
    """Material data per element: one material (or none) for all, or one per region.

    Parameters
    ----------
    profile : Profile
        The profile (its regions).
    mesh : Mesh
        The mesh (its element regions).
    poisson : float
        Poisson's ratio without a material (dimensionless).
    materials : Material or sequence of Material, optional
        One material for the whole profile, or one per region.
    reference : str, optional
        Reference material of a composite section.

    Returns
    -------
    ElementMaterials

    Raises
    ------
    UsageError
        Without ``materials``, for a region material name that is not built in.
    """
    if materials is None:  # what the profile names (an outline's material: lines, DXF layers)
        materials = resolve(list(profile.materials), source=profile.source)
    if materials is None:
        return ElementMaterials.single(mesh.n_elements, poisson, None)
    # the one place a material meets a profile: its values into the profile's unit system
    if isinstance(materials, Material):
        return ElementMaterials.single(mesh.n_elements, poisson,
                                       materials.in_system(profile.units))
    if len(materials) != len(profile.regions):
        raise AnalysisError(f"{len(materials)} materials given for {len(profile.regions)} "
                            "regions", file=profile.source)
    return ElementMaterials.from_regions(
        mesh.region, [m.in_system(profile.units) for m in materials], reference)


def _region_strengths(profile: Profile, mats: ElementMaterials) -> list[float | None] | None:
    """Yield strength of each region's material, the profile's stress unit (None without materials)."""
    if not mats.materials:
        return None
    region_mats = (list(mats.materials) if len(mats.materials) == len(profile.regions)
                   else [mats.materials[0]] * len(profile.regions))
    return [m.fy for m in region_mats]


def _check_torsion(tor: TorsionProperties, polar: float, source: str) -> None:
    """Refuse a warping solve that failed its residual or gives J outside (0, Ip]."""
    if not tor.residual < MAX_RESIDUAL:
        raise AnalysisError(f"warping solve residual {tor.residual:.2e} is too large", file=source)
    if not 0 < tor.J <= polar * (1 + 1e-9):
        raise AnalysisError(f"torsion constant J = {tor.J:.6g} is outside (0, Ix + Iy]",
                            file=source)


def analyse(profile: Profile, mesh_size: float | None = None, *, mesh: Mesh | None = None,
            poisson: float = DEFAULT_POISSON, bounds: bool = False,
            refine: float = 1.0, solver: str = "auto",
            materials: Material | Sequence[Material] | None = None,
            reference: str | None = None, max_elements: int = MAX_ELEMENTS) -> SectionResult:
    """Mesh a profile and compute its geometric, torsion and warping properties.

    Parameters
    ----------
    profile : Profile
        A validated profile.
    mesh_size : float, optional
        Largest element size, drawing unit; default chosen from the profile.
    mesh : Mesh, optional
        A ready mesh to use instead of meshing.
    poisson : float
        Poisson's ratio for the shear functions when no material is given (only shear areas
        and the elastic shear centre depend on it).
    materials : Material or sequence of Material, optional
        One material for the whole profile, or one per region (``profile.regions``). Default:
        the materials the profile's regions name, from the built-in table (a file's
        ``material:`` lines, a drawing's layer materials), as the command line reads them;
        geometry only when they name none. Use
        :func:`~warpwise.properties.run.run_analysis` for materials of your own table.
    reference : str, optional
        Reference material of the transformed section (default: that of the first region).
    refine : float
        Mesh refinement factor (see :func:`warpwise.mesh.build_mesh`).
    solver : str
        Linear solver: ``auto``, ``superlu``, ``pardiso`` or ``amg`` (see
        :class:`warpwise.fem.solve.SPDFactor`).
    bounds : bool
        Also compute a guaranteed lower bound on J (``torsion.J_low``; J itself is the upper
        bound): from the equilibrated flux on straight-sided meshes (any materials), from the
        Prandtl stress function on meshes with curved elements (one material only; none for a
        composite section there). See :func:`warpwise.properties.bounds.torsion_lower_bound`.
    max_elements : int
        Largest mesh built (``--max-elements``; see :func:`warpwise.mesh.build_mesh`).

    Returns
    -------
    SectionResult

    Raises
    ------
    UsageError
        For a Poisson's ratio outside (-1, 0.5), or (without ``materials``) a region material
        name that is not built in.
    AnalysisError
        When the solve fails its residual check or J falls outside (0, Ix + Iy].

    """
    clock = _Clock()
    check_poisson(poisson, file=profile.source)
    if mesh is None:
        mesh = build_mesh(profile, mesh_size, refine=refine, max_elements=max_elements)
    clock.lap("mesh")
    mats = element_materials(profile, mesh, poisson, materials, reference)
    x0, y0, x1, y1 = profile.bounds
    origin = np.array([0.5 * (x0 + x1), 0.5 * (y0 + y1)])
    try:
        ev = element_values(mesh, origin)
    except ValueError as exc:
        raise AnalysisError(str(exc), file=profile.source) from None
    geo, evc = geometric_properties(mesh, ev, origin, arcs=profile.arcs)
    wE = wG = None
    weighted = geo
    if mats.composite:
        wE, wG = mats.E, mats.G
        weighted, evc = geometric_properties(mesh, ev, origin, wE, arcs=profile.arcs)
    areas = np.bincount(mesh.region, weights=evc.dA.sum(axis=1), minlength=len(profile.regions))
    clock.lap("basis")
    K = stiffness_matrix(mesh, evc, wG)
    clock.lap("assembly")
    # pin the node nearest the centroid: any node works, this one keeps round-off small
    pin = int(np.argmin(np.sum((mesh.nodes - np.array(weighted.centroid)) ** 2, axis=1)))
    factor = PinnedSolver(K, pin, solver)
    clock.lap("factorise")
    tor = torsion_properties(mesh, evc, weighted, factor, torsion_load(mesh, evc, wG), wE, wG)
    _check_torsion(tor, integrate(evc, evc.xy[..., 0] ** 2 + evc.xy[..., 1] ** 2, wG),
                   profile.source)
    clock.lap("warping")
    if bounds:
        J_low, how, eta2 = torsion_lower_bound(mesh, evc, weighted.centroid, tor.psi, K, wG,
                                               solver)
        if J_low is not None:
            if not J_low <= tor.J * (1 + 1e-9):
                raise AnalysisError(f"torsion bounds are inconsistent (J_low {J_low:.6g} > J "
                                    f"{tor.J:.6g})", file=profile.source)
            tor = replace(tor, J_low=J_low, J_low_method=how, J_low_indicator=eta2)
        clock.lap("bounds")
    shear = shear_properties(mesh, evc, weighted, factor, mats)
    if not shear.residual < MAX_RESIDUAL:
        raise AnalysisError(f"shear function solve residual {shear.residual:.2e} is too large",
                            file=profile.source)
    clock.lap("shear")
    plastic = plastic_properties(profile, geo.alpha_deg, _region_strengths(profile, mats))
    corners = tuple(reentrant_corners(profile))
    clock.lap("plastic")
    wt = torsion_modulus(mesh, tor, weighted.centroid, mats, corners)
    outline, wall = perimeters(profile), wall_thickness(profile)
    clock.lap("outline")
    return SectionResult(profile, mesh, geo, tor, shear, evc, factor, weighted, mats, plastic,
                         corners=corners, region_areas=tuple(float(a) for a in areas),
                         timings=clock.times, perimeters=outline, wall=wall,
                         torsion_modulus=wt)
