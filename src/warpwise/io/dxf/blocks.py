"""Block references (INSERT): the entities of a block, placed by the reference's transform.

:func:`block_entities` expands one reference, a grid of them (MINSERT) included, into ezdxf's
virtual entities with the layer and the label each is read with: an entity on layer 0 takes the
layer of the reference, and its label names the block and the reference it came through.
References nested deeper than :data:`MAX_BLOCK_DEPTH` are left out with a warning.
"""

from __future__ import annotations

from collections.abc import Iterator

from .collect import PieceCollector

#: Deepest nesting of block references followed.
MAX_BLOCK_DEPTH = 16


def block_entities(out: PieceCollector, e: object, layer: str, label: str,
                   depth: int) -> Iterator[tuple[object, str, str]]:
    """The entities of a block reference, in the drawing's coordinates.

    Parameters
    ----------
    out : PieceCollector
        Counts the entities met in blocks; takes the warning for a reference nested too deep.
    e : ezdxf INSERT entity
        The reference.
    layer, label : str
        Layer and label of the reference.
    depth : int
        How many references it is met in (0 in model space).

    Yields
    ------
    (entity, layer, label)
        Each virtual entity with the layer and label to read it with.

    """
    name = e.dxf.get("name", "?")
    if depth >= MAX_BLOCK_DEPTH:
        out.warn("unreadable", f"{label} (block {name!r}) nests blocks more than "
                 f"{MAX_BLOCK_DEPTH} deep: left out", layer=layer)
        return
    grid = list(e.multi_insert()) if e.mcount > 1 else [e]
    for ins in grid:
        for v in ins.virtual_entities():
            t = v.dxftype()
            out.in_blocks[t] += 1
            sub_layer = v.dxf.get("layer", "0")
            if sub_layer == "0":  # entities on layer 0 take the layer of the reference
                sub_layer = layer
            where = label if depth == 0 else label.split(" in block ")[0]
            yield v, sub_layer, f"{t} in block {name!r} ({where})"
