"""PDF datasheets: one A4 page per profile, the section to scale, key values, cautions.

Each page carries the profile's name (a manifest's part number, else the file name), its
description and material, the section drawn to a stated standard scale with its overall width
and height dimensioned and the centroid C and shear centre S marked, a table of the key values
in the report's units, and the cautions every datasheet carries. A catalogue's PDF is the pages
of its profiles in row order. Drawn with matplotlib's PDF backend (no pyplot, no screen).
"""

from __future__ import annotations

import io
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from ..geometry.loops import signed_area
from ..units import LENGTH, convert, system
from .html_parts import CAUTIONS
from .quantities import QUANTITY_BY_KEY, unit_of
from .records import Record
from .table import format_value

#: A4 portrait, inches.
PAGE = (8.27, 11.69)
#: The drawing box on the page: left, bottom, width, height, inches.
BOX = (0.9, 5.2, 6.5, 4.6)
#: Paper length per true length of the scales offered, largest first: the recommended scales
#: of technical drawings (ISO 5455, from memory).
SCALES = (10.0, 5.0, 2.0, 1.0, 1 / 2, 1 / 5, 1 / 10, 1 / 20, 1 / 50, 1 / 100, 1 / 200, 1 / 500,
          1 / 1000)
#: Fills of the materials of a composite section, in the order they first appear.
FILLS = ("#d9d9d9", "#8c8c8c", "#f2e3bf", "#bfd3e6", "#e6bfbf")
#: The values in a page's table, in order (those not computed are left out).
SHEET_KEYS = ("A", "mass", "width", "height", "Ix", "Iy", "I1", "I2", "alpha_deg", "rx", "ry",
              "Wel_x_top", "Wel_x_bottom", "Wel_y_right", "Wel_y_left", "Wpl_x", "Wpl_y", "J",
              "Wt", "Cw", "xs", "ys", "As_x", "As_y")
#: Longest label in the table of values (longer ones end in an ellipsis).
LABEL_CHARS = 46
#: Share of the drawing box the section may fill (room for the dimensions).
FILL = 0.78


@dataclass(frozen=True)
class SheetProfile:
    """What a page shows of one profile.

    Attributes
    ----------
    record : Record
        Its values, in the units the page shows.
    loops : tuple of Loop
        The closed loops of its outline: each region's outer boundary, then its holes.
    """

    record: Record
    loops: tuple[Loop, ...]


@dataclass(frozen=True)
class Loop:
    """One closed loop of a profile's outline.

    Attributes
    ----------
    region : int
        The region it bounds (its outer boundary comes first).
    material : str
        The region's material ("" for none given).
    points : numpy.ndarray
        Vertices (k, 2), drawing coordinates.
    """

    region: int
    material: str
    points: np.ndarray


def profile_loops(regions: Sequence) -> tuple[Loop, ...]:
    """The loops of a profile's regions (``Profile.regions``), drawing coordinates."""
    return tuple(Loop(k, r.material or "", np.asarray(p, float))
                 for k, r in enumerate(regions) for p in (r.outer, *r.holes))


def sheet_profile(record: Record, loops: Sequence[Loop], units: str | None) -> SheetProfile:
    """A page's profile in ``units`` (default the record's): values and loops converted."""
    shown = record.in_units(units or record.units)
    factor = convert(1.0, LENGTH, record.units, shown.units)
    return SheetProfile(shown, tuple(Loop(p.region, p.material, p.points * factor)
                                     for p in loops))


def paper_scale(extent: float, room: float) -> float:
    """The largest standard scale (paper per true length) at which ``extent`` fits ``room``.

    Examples
    --------
    >>> paper_scale(80.0, 120.0), paper_scale(400.0, 120.0), paper_scale(5.0, 120.0)
    (1.0, 0.2, 10.0)
    """
    for s in SCALES:
        if extent * s <= room:
            return s
    return SCALES[-1]


def scale_text(s: float) -> str:
    """``1:2``, ``5:1``... of a scale (paper per true length)."""
    return f"{s:g}:1" if s >= 1 else f"1:{1 / s:g}"


def _region_path(loops: Sequence[np.ndarray]):
    """A filled path of one region: the outer boundary counter-clockwise, the holes clockwise.

    The nonzero rule then leaves the holes open.
    """
    from matplotlib.path import Path as MplPath

    verts, codes = [], []
    for k, p in enumerate(loops):
        p = p if (signed_area(p) > 0) == (k == 0) else p[::-1]
        verts += [*p.tolist(), p[0].tolist()]
        codes += [MplPath.MOVETO] + [MplPath.LINETO] * (len(p) - 1) + [MplPath.CLOSEPOLY]
    return MplPath(verts, codes)


def _draw_section(fig, prof: SheetProfile) -> None:
    """The section to scale in the drawing box, with its overall dimensions and C and S."""
    from matplotlib.patches import PathPatch, Rectangle

    rec, v = prof.record, prof.record.values
    pts = np.vstack([p.points for p in prof.loops])
    marks = [(v["xc"], v["yc"], "C")] + ([(v["xs"], v["ys"], "S")] if np.isfinite(v["xs"]) else [])
    every = np.vstack([pts, [[x, y] for x, y, _ in marks]])
    lo, hi = every.min(axis=0), every.max(axis=0)
    mm = convert(1.0, LENGTH, rec.units, "mm")  # true mm per drawing unit
    left, bottom, width, height = BOX
    room = min(width / max(hi[0] - lo[0], 1e-300), height / max(hi[1] - lo[1], 1e-300))
    s = paper_scale(1.0, FILL * room * 25.4 / mm)  # paper mm per true mm
    ax = fig.add_axes((left / PAGE[0], bottom / PAGE[1], width / PAGE[0], height / PAGE[1]))
    per_inch = 25.4 / (s * mm)  # drawing units per paper inch
    cx, cy = 0.5 * (lo + hi)
    ax.set_xlim(cx - 0.5 * width * per_inch, cx + 0.5 * width * per_inch)
    ax.set_ylim(cy - 0.5 * height * per_inch, cy + 0.5 * height * per_inch)
    ax.set_aspect("equal")
    ax.axis("off")
    materials = list(dict.fromkeys(p.material for p in prof.loops))
    for region in dict.fromkeys(p.region for p in prof.loops):
        own = [p for p in prof.loops if p.region == region]
        fill = FILLS[materials.index(own[0].material) % len(FILLS)]
        ax.add_patch(PathPatch(_region_path([p.points for p in own]), facecolor=fill,
                               edgecolor="black", lw=0.6))
    if len(materials) > 1:
        for k, name in enumerate(materials):
            y = bottom + 0.15 + 0.2 * k
            fig.patches.append(Rectangle(((left + width - 1.9) / PAGE[0], y / PAGE[1]),
                                         0.25 / PAGE[0], 0.13 / PAGE[1], facecolor=FILLS[k % len(FILLS)],
                                         edgecolor="black", lw=0.5, transform=fig.transFigure))
            fig.text((left + width - 1.55) / PAGE[0], y / PAGE[1], name or "(no material)",
                     fontsize=7.5)
    for x, y, label in marks:
        ax.plot([x], [y], marker="+" if label == "C" else "x", color="black", ms=7, mew=1.0)
        up = label == "C"  # the two labels on opposite sides: C and S are often close
        ax.annotate(label, (x, y), xytext=(4, 4) if up else (-10, -11),
                    textcoords="offset points", fontsize=8)
    unit = rec.units
    gap = 0.25 * per_inch  # a quarter inch between the section and its dimension lines
    x0, x1 = pts[:, 0].min(), pts[:, 0].max()
    y0, y1 = pts[:, 1].min(), pts[:, 1].max()
    # the dimension lines measure the outline and lie outside everything drawn (a shear centre
    # outside the outline included)
    arrow = {"arrowstyle": "<->", "lw": 0.6, "shrinkA": 0, "shrinkB": 0}
    below, aside = lo[1] - gap, lo[0] - gap
    ax.plot([x0, x0, np.nan, x1, x1], [y0, below, np.nan, y0, below], color="black", lw=0.3)
    ax.plot([x0, aside, np.nan, x0, aside], [y0, y0, np.nan, y1, y1], color="black", lw=0.3)
    ax.annotate("", (x0, below), (x1, below), arrowprops=arrow)
    ax.text(0.5 * (x0 + x1), below, f"{format_value(x1 - x0, 5)} {unit}", ha="center",
            va="top", fontsize=8)
    ax.annotate("", (aside, y0), (aside, y1), arrowprops=arrow)
    ax.text(aside, 0.5 * (y0 + y1), f"{format_value(y1 - y0, 5)} {unit}", ha="right",
            va="center", rotation=90, fontsize=8)
    fig.text(left / PAGE[0], (bottom + height + 0.1) / PAGE[1],
             f"Section, scale {scale_text(s)} on A4 ({unit}); C centroid, S shear centre",
             fontsize=9)


def _title_block(fig, rec: Record) -> None:
    """Name, description, material, file and units at the top of the page."""
    top = PAGE[1] - 0.7
    name = rec.name or rec.source.replace("\\", "/").rsplit("/", 1)[-1]
    fig.text(0.9 / PAGE[0], top / PAGE[1], name, fontsize=16, weight="bold")
    lines = [rec.description] if rec.description else []
    if rec.materials:
        mats = ", ".join(dict.fromkeys(m for m in rec.materials if m))
        ref = f"; values refer to {rec.reference}" if len(set(rec.materials)) > 1 else ""
        lines.append(f"material: {mats}{ref}")
    u = system(rec.units)
    lines.append(f"file: {rec.source}")
    lines.append(f"units: {u.length}, {u.force}, {u.stress}")
    for k, text in enumerate(lines):
        fig.text(0.9 / PAGE[0], (top - 0.3 - 0.22 * k) / PAGE[1], text, fontsize=9)


def _values_table(fig, rec: Record) -> None:
    """The key values in two columns: label, symbol, value, unit."""
    v = rec.values
    keys = [k for k in SHEET_KEYS if np.isfinite(v[k])]
    half = (len(keys) + 1) // 2
    fig.text(0.9 / PAGE[0], 4.85 / PAGE[1], "Key values", fontsize=11, weight="bold")
    for n, key in enumerate(keys):
        q = QUANTITY_BY_KEY[key]
        col, row = divmod(n, half)
        x = (0.6 + 3.75 * col) / PAGE[0]
        y = (4.55 - 0.2 * row) / PAGE[1]
        label = q.label if len(q.label) <= LABEL_CHARS else q.label[:LABEL_CHARS - 1] + "\u2026"
        fig.text(x, y, label, fontsize=6.5)
        fig.text(x + 2.3 / PAGE[0], y, q.symbol, fontsize=6.5)
        fig.text(x + 3.2 / PAGE[0], y, format_value(v[key], 5), fontsize=6.5, ha="right")
        fig.text(x + 3.25 / PAGE[0], y, unit_of(q, rec.units), fontsize=6.5)


def _cautions(fig, page: int, pages: int) -> None:
    """The cautions and the page footer."""
    import textwrap

    from .. import __version__

    y = 1.75
    for text in CAUTIONS:
        for line in textwrap.wrap(text, 120):
            fig.text(0.9 / PAGE[0], y / PAGE[1], line, fontsize=6.5)
            y -= 0.13
        y -= 0.06
    fig.text(0.9 / PAGE[0], 0.45 / PAGE[1], f"warpwise {__version__}", fontsize=6.5)
    fig.text((PAGE[0] - 0.9) / PAGE[0], 0.45 / PAGE[1], f"page {page} of {pages}", fontsize=6.5,
             ha="right")


def pdf_bytes(profiles: Sequence[SheetProfile]) -> bytes:
    """A PDF of one A4 page per profile, in order.

    Parameters
    ----------
    profiles : sequence of SheetProfile
        The pages' profiles (values and loops in the units each page shows).

    Returns
    -------
    bytes
        The PDF file.
    """
    from matplotlib.backends.backend_pdf import PdfPages
    from matplotlib.figure import Figure

    buf = io.BytesIO()
    with PdfPages(buf, metadata={"Creator": "warpwise", "CreationDate": None}) as pdf:
        for k, prof in enumerate(profiles, 1):
            fig = Figure(figsize=PAGE)
            _title_block(fig, prof.record)
            _draw_section(fig, prof)
            _values_table(fig, prof.record)
            _cautions(fig, k, len(profiles))
            pdf.savefig(fig)
    return buf.getvalue()
