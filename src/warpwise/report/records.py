"""A plain record of one analysed profile: what every report (table rows, CSV, JSON) needs.

Records are small and picklable, so catalogue workers return them instead of the full result
(which holds the mesh and the factorised matrices).
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace

from ..geometry.corners import Corner
from ..properties.analysis import SectionResult, TargetStatus
from ..units import LENGTH, convert
from .quantities import QUANTITIES, shear_notes, values
from .table import corner_note


@dataclass(frozen=True)
class Record:
    """The reported values of one profile.

    Attributes
    ----------
    source : str
        File or description of the profile.
    units : str
        Unit system of the values (named by its length unit, :data:`warpwise.units.SYSTEMS`).
    values : dict of str to float
        Every quantity of :data:`~warpwise.report.quantities.QUANTITIES` (nan: not computed).
    errors : dict of str to float or None
        Estimated relative errors, when estimated.
    nodes, elements : int
        Mesh size.
    mesh_size : float
        Largest element size, length unit.
    notes : tuple of str
        Remarks of the reader (assumed units, repairs...).
    materials : tuple of str
        Material names ("" entries for geometry only).
    reference : str
        Reference material of the transformed section ("" for geometry only).
    extra : dict of str to float
        Further values of a caller's own.
    corners : tuple of Corner
        Sharp re-entrant corners (coordinates and radius in ``units``).
    warnings : tuple of str
        Doubts about the input that every report shows (see ``Profile.warnings``).
    name : str
        Name or part number given to the profile (a catalogue manifest's), "" for none.
    description : str
        Its description, "" for none.
    target : TargetStatus or None
        Target error, bound reached, steps and why the adaptive refinement stopped, when a
        target was asked for.
    material_notes : tuple of str
        Notes on the materials used (a user table replacing a built-in material).
    """

    source: str
    units: str
    values: dict[str, float]
    errors: dict[str, float] | None = None
    nodes: int = 0
    elements: int = 0
    mesh_size: float = 0.0
    notes: tuple[str, ...] = ()
    materials: tuple[str, ...] = ()
    reference: str = ""
    extra: dict[str, float] = field(default_factory=dict)
    corners: tuple[Corner, ...] = ()
    warnings: tuple[str, ...] = ()
    name: str = ""
    description: str = ""
    target: TargetStatus | None = None
    material_notes: tuple[str, ...] = ()

    @property
    def remarks(self) -> tuple[str, ...]:
        """Every note to print: reader's, materials', shear coefficients', target, corners.

        Corner notes are in ``units``; a target missed is one of the ``warnings`` instead.
        """
        target = (self.target.text,) if self.target is not None and self.target.met else ()
        return (*self.notes, *self.material_notes, *shear_notes(self.values), *target,
                *(corner_note(c, self.units) for c in self.corners))

    def _repr_html_(self) -> str:
        """Jupyter's view: the property table (:mod:`warpwise.report.notebook`)."""
        from .notebook import record_html

        return record_html(self)

    @property
    def target_missed(self) -> bool:
        """True when a target error was asked for and not met."""
        return self.target is not None and not self.target.met

    def in_units(self, length: str) -> Record:
        """The same record in the unit system of ``length`` (every value converted).

        Examples
        --------
        >>> r = Record("bar", "cm", {q.key: 1.0 for q in QUANTITIES})
        >>> r.in_units("mm").values["Ix"]
        10000.0
        """
        if length == self.units:
            return self
        out = {q.key: convert(self.values[q.key], q.dimension, self.units, length)
               for q in QUANTITIES}
        def scaled(v: float) -> float:
            return convert(v, LENGTH, self.units, length)

        corners = tuple(replace(c, x=scaled(c.x), y=scaled(c.y), radius=scaled(c.radius))
                        for c in self.corners)
        return replace(self, units=length, values=out, mesh_size=scaled(self.mesh_size),
                       corners=corners)


def record_of(result: SectionResult) -> Record:
    """The record of an analysed section."""
    m = result.materials
    missed = (result.target.text,) if result.target is not None and not result.target.met else ()
    return Record(
        source=result.profile.source, units=result.units, values=values(result),
        errors=None if result.errors is None else dict(result.errors),
        nodes=result.mesh.n_nodes, elements=result.mesh.n_elements, mesh_size=result.mesh.size,
        notes=tuple(result.profile.notes),
        materials=tuple(m.names) if m.E_ref is not None else (), reference=m.reference,
        corners=tuple(result.corners), target=result.target,
        warnings=(*result.profile.warnings, *missed),
        material_notes=tuple(dict.fromkeys(mat.note for mat in m.materials if mat.note)),
    )


#: Unit system of a report over profiles of several unit systems when none is chosen.
MIXED_DEFAULT = "mm"


def report_units(profile_units: list[str], chosen: str | None = None) -> str:
    """The unit system of a report over profiles: the chosen one, else the profiles' own.

    Parameters
    ----------
    profile_units : list of str
        Unit system of each profile.
    chosen : str, optional
        The reader's choice (``--report-units``).

    Returns
    -------
    str
        ``chosen`` if given; else the profiles' common system; for profiles in several systems
        :data:`MIXED_DEFAULT` (every header and row says its unit, and rows are converted).

    Examples
    --------
    >>> report_units(["in", "in"]), report_units(["in", "mm"]), report_units(["mm"], "cm")
    ('in', 'mm', 'cm')
    """
    if chosen is not None:
        return chosen
    found = set(profile_units)
    return found.pop() if len(found) == 1 else MIXED_DEFAULT
