"""A plain record of one analysed profile: what every report (table rows, CSV, JSON) needs.

Records are small and picklable, so catalogue workers return them instead of the full result
(which holds the mesh and the factorised matrices).
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace

from ..geometry.profile import LENGTH_UNITS
from ..properties.analysis import SectionResult
from .quantities import DEG, QUANTITIES, values
from .table import corner_note


@dataclass(frozen=True)
class Record:
    """The reported values of one profile.

    Attributes
    ----------
    source : str
        File or description of the profile.
    units : str
        Length unit of the values.
    values : dict of str to float
        Every quantity of :data:`~warpwise.report.quantities.QUANTITIES` (nan: not computed).
    errors : dict of str to float or None
        Estimated relative errors, when estimated.
    nodes, elements : int
        Mesh size.
    mesh_size : float
        Largest element size, length unit.
    notes : tuple of str
        Remarks (assumed units, sharp corners...).
    materials : tuple of str
        Material names ("" entries for geometry only).
    reference : str
        Reference material of the transformed section ("" for geometry only).
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

    def in_units(self, length: str) -> Record:
        """The same record with lengths converted to ``length`` (force unit unchanged).

        Examples
        --------
        >>> r = Record("bar", "cm", {q.key: 1.0 for q in QUANTITIES})
        >>> r.in_units("mm").values["Ix"]
        10000.0
        """
        if length == self.units:
            return self
        f = LENGTH_UNITS[self.units] / LENGTH_UNITS[length]
        out = {}
        for q in QUANTITIES:
            v = self.values[q.key]
            if q.kind == "stress":
                v = v * f**-2
            elif q.kind in ("force", "mass") or q.power in (0, DEG):
                pass
            else:
                v = v * f**q.power
            out[q.key] = v
        return replace(self, units=length, values=out, mesh_size=self.mesh_size * f)


def record_of(result: SectionResult) -> Record:
    """The record of an analysed section."""
    notes = [*result.profile.notes, *(corner_note(c, result.units) for c in result.corners)]
    m = result.materials
    return Record(
        source=result.profile.source, units=result.units, values=values(result),
        errors=None if result.errors is None else dict(result.errors),
        nodes=result.mesh.n_nodes, elements=result.mesh.n_elements, mesh_size=result.mesh.size,
        notes=tuple(notes), materials=tuple(m.names) if m.E_ref is not None else (),
        reference=m.reference,
    )
