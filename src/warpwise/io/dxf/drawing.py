"""Step 1 of reading a DXF drawing: every curve of model space as a piece.

:func:`read_drawing` loads the file (:mod:`.document`), takes the length unit (:mod:`.units`)
and reads each model-space entity with the reader of its type (:mod:`.entities`, block
references expanded by :mod:`.blocks`) into a :class:`Drawing`: the pieces in the profile's
unit, what was counted, repaired and left out, and the entities that could not be used.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from pathlib import Path

from ...errors import InputFileError
from ..defects import ERROR, WARNING, Defect
from ..pieces import Piece
from ..progress import ProgressLine
from .blocks import count_expansion, refuse_large
from .collect import HatchBoundary, PieceCollector
from .document import TRUNCATED, load_document, why
from .entities import read_entity
from .units import Units, resolve_units


@dataclass(frozen=True, eq=False)
class Drawing:
    """The curves of a DXF drawing, in the profile's length unit.

    Attributes
    ----------
    source : str
        File name.
    pieces : tuple of Piece
        Every curve of model space (block references expanded).
    units : Units
        Length unit of the coordinates.
    version : str
        DXF version of the file ($ACADVER).
    entities : dict of str to int
        Model-space entities by type.
    in_blocks : dict of str to int
        Entities met inside block references, by type.
    skipped : dict of str to int
        Entities left out because they are not geometry (text, dimensions...), by type.
    repairs : tuple of str
        What ezdxf fixed while reading (its audit, and its recover mode when the strict reader
        failed).
    defects : tuple of Defect
        Entities that could not be used, and a truncated file.
    hatches : tuple of HatchBoundary
        The boundary of each hatch, as indices into ``pieces``.
    """

    source: str
    pieces: tuple[Piece, ...]
    units: Units
    version: str = ""
    entities: dict[str, int] = field(default_factory=dict)
    in_blocks: dict[str, int] = field(default_factory=dict)
    skipped: dict[str, int] = field(default_factory=dict)
    repairs: tuple[str, ...] = ()
    defects: tuple[Defect, ...] = ()
    hatches: tuple[HatchBoundary, ...] = ()

    @property
    def layers(self) -> tuple[str, ...]:
        """Layers that hold curves, sorted."""
        return tuple(sorted({p.layer for p in self.pieces}))

    @property
    def hatch_pieces(self) -> frozenset[int]:
        """Indices of the pieces that are hatch boundaries (not drawn lines)."""
        return frozenset(i for h in self.hatches for path in h.paths for i in path)


def read_drawing(path: str | Path, units: str | None = None, max_entities: int | None = None) -> Drawing:
    """Read the curves of a DXF drawing.

    Parameters
    ----------
    path : str or Path
        DXF file (text or binary).
    units : str, optional
        Length unit of the coordinates, overriding the header's ``$INSUNITS``.
    max_entities : int, optional
        Most entities the drawing may expand to, each copy of a block counted, and most pieces
        read (default :data:`~warpwise.io.dxf.collect.MAX_ENTITIES`); counted before any block
        reference is expanded.

    Returns
    -------
    Drawing
        Pieces in the profile's unit, entity counts, repairs and entity defects.

    Raises
    ------
    InputFileError
        Missing, empty, binary (not DXF), unreadable or truncated file, an unsupported unit, or
        a drawing that expands to more than ``max_entities`` entities.

    """
    name = str(path)
    doc, repairs, truncated, found = load_document(path)
    try:
        raw_units = doc.header.get("$INSUNITS", None)
        insunits = int(raw_units) if raw_units is not None else None
    except (TypeError, ValueError):
        insunits = None
    u = resolve_units(insunits, units, file=name)
    out = PieceCollector(name, u.factor, max_entities)
    try:
        msp = doc.modelspace()
        entities = list(msp)
    except Exception as exc:  # no usable model space
        raise InputFileError(f"has no readable model space ({why(exc)})", file=name) from None
    expansion = count_expansion(doc, entities)
    refuse_large(expansion, max_entities, name)  # before any reference is expanded
    out.progress = ProgressLine(f"reading {name}", expansion.entities, "entities")
    try:
        for e in entities:
            t = e.dxftype()
            handle = e.dxf.get("handle", None)
            label = f"{t} #{handle}" if handle else t
            read_entity(out, e, e.dxf.get("layer", "0") or "0", label)
    finally:
        out.progress.close()
    defects = list(expansion.defects) + list(out.defects)
    for t, n in sorted(out.unreadable.items()):
        defects.append(Defect("unreadable", f"{n} {t} entit{'y' if n == 1 else 'ies'} cannot be "
                              "turned into lines and arcs: left out (explode them in the CAD program "
                              "if they belong to the section)", (), WARNING))
    if truncated:
        defects.append(Defect("truncated", TRUNCATED, (), ERROR))
    version = str(doc.header.get("$ACADVER", "") or getattr(doc, "acad_release", ""))
    return Drawing(name, tuple(out.pieces), u, version, found,
                   dict(out.in_blocks), dict(out.skipped), repairs, tuple(defects), tuple(out.hatches))
