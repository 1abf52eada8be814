"""The datasheet pictures as SVG, drawn from the arrays in one pass (no plotting library).

Three pictures, each with the same information as the figures of :mod:`.plot_section` and
:mod:`.plot_stress` (which stay for picture files, ``--plot`` and ``warpwise plot``):

- :func:`outline_svg`: the section to scale, filled by material, with the centroid C, the
  shear centre S and the principal axes 1 and 2 (arrow heads on their positive directions);
- :func:`warping_svg`: filled contour bands of the warping function omega about the shear
  centre (a colour scale symmetric about zero, white at zero), its zero line, S;
- :func:`torsion_svg`: bands of the resultant torsion shear stress tau (each material from its
  own nodal values), stress-direction arrows, the largest value, sharp re-entrant corners
  with the circle left out of the maximum, S.

The bands are those of :func:`.svg_bands.band_rings` on the four straight sub-triangles of
every six-node element. The view always holds the whole outline and every mark (a shear
centre outside the outline widens it); the axes are labelled in the report's length unit; the
colour bar runs from the least to the largest value shown, written at its ends.

Examples
--------
>>> from warpwise import analyse
>>> from warpwise.geometry.shapes import rectangle
>>> outline_svg(analyse(rectangle(40.0, 20.0))).startswith("<svg")
True
"""

from __future__ import annotations

import textwrap
from collections.abc import Sequence
from html import escape

import numpy as np

from ..properties.analysis import SectionResult
from ..stress import TorsionStress
from ..units import AREA, LENGTH, MOMENT, STRESS, TWIST, Converter, Dimension
from . import picture_parts as pp
from . import svg_parts as sv
from .svg_bands import Rings, band_rings, iso_segments

#: Pixels per inch of picture width (the datasheet gives widths in inches).
PX_PER_INCH = 100.0


# ----------------------------------------------------------------------------------------------
# the frame of a picture

class _Picture:
    """One picture being drawn: its frame, the report's units and what goes into it."""

    def __init__(self, result: SectionResult, units: str | None, title: str, width: float,
                 points: Sequence[Sequence[float]], margin: float, colour_bar: bool) -> None:
        self.result = result
        self.show = Converter.of(result.units, units)
        self.k = float(self.show(1.0, LENGTH))
        width_px = width * PX_PER_INCH
        self.title = [line for part in title.split("\n")
                      for line in textwrap.wrap(part, max(20, int((width_px - 20) / 7.4)))]
        x0, y0, x1, y1 = result.profile.bounds
        pts = np.array([[x0, y0], [x1, y1], *points], dtype=float)
        pad = margin * result.profile.size
        lo, hi = pts.min(axis=0) - pad, pts.max(axis=0) + pad
        self.frame = sv.Frame((lo[0], lo[1], hi[0], hi[1]), width_px,
                              title_lines=len(self.title), colour_bar=colour_bar)
        self.body: list[str] = []
        self.entries: list[tuple[str, str]] = []

    def scaled(self, d: str, attrs: str) -> None:
        """A path in tenths of a pixel (:func:`.svg_parts.path_data`)."""
        if d:
            self.body.append(f'<g transform="scale(0.1)"><path d="{d}" {attrs}/></g>')

    def svg(self, bar_height: float = 0.0) -> str:
        """The finished picture."""
        f = self.frame
        legend_top = f.bottom + sv.BELOW_PLOT + 4
        lines = sv.legend_lines(self.entries, f.width - f.left - 10)
        height = max(legend_top + len(lines) * sv.LEGEND_LINE,
                     f.top + bar_height + 12) + 4
        title = "".join(sv.text(10, 10 + sv.TITLE_LINE * (k + 0.75), line, size=13,
                                colour=sv.TITLE_COLOUR) for k, line in enumerate(self.title))
        w, h = sv.num(f.width), sv.num(height)
        x0, _, _, y1 = f.extent
        # the drawing coordinates of a pixel (x, y): x0 + (x - left) / scale, y1 - (y - top) / scale,
        # times k in the report's length unit (the workbench shows them under the pointer)
        frame = " ".join(f"{v:.12g}" for v in (x0, y1, f.left, f.top, f.scale, self.k))
        return (f'<svg xmlns="http://www.w3.org/2000/svg" width="{w}" height="{h}" '
                f'viewBox="0 0 {w} {h}" role="img" aria-label="{escape(" ".join(self.title))}" '
                f'data-frame="{frame}" data-unit="{escape(self.show.system.length)}" '
                f"font-family='{sv.FONT}'><rect width=\"{w}\" height=\"{h}\" fill=\"#ffffff\"/>"
                f'<g class="title">{title}</g>{sv.axes(f, self.k, self.show.system.length)}'
                f'{"".join(self.body)}{sv.legend(lines, f.left, legend_top)}</svg>')

    # the pieces every picture has -----------------------------------------------------------

    def outline(self, width: float = 1.1) -> None:
        """The outline of every region (so material interfaces too)."""
        loops = [np.asarray(loop, dtype=float) for r in self.result.profile.regions
                 for loop in r.loops()]
        self.scaled(_rings_data(self.frame, loops),
                    f'fill="none" stroke="{pp.EDGE_COLOUR}" stroke-width="{10 * width:g}" '
                    'stroke-linejoin="round"')

    def shear_centre(self) -> None:
        """S: the shear centre, and its legend line."""
        xs, ys = self.result.torsion.shear_centre
        self.body.append(sv.mark(self.frame, (xs, ys), sv.diamond(6, pp.SHEAR_CENTRE_COLOUR),
                                 "shear-centre", self.k, "S", (7, 15), pp.SHEAR_CENTRE_COLOUR))
        self.entries.append((sv.diamond(6, pp.SHEAR_CENTRE_COLOUR),
                             f"S: shear centre {pp.point_text(self.show, (xs, ys))}"))

    def bands(self, fields: list[tuple[np.ndarray, np.ndarray]], levels: np.ndarray,
              colours: Sequence[str], what: str = "") -> None:
        """Filled bands of nodal fields, each on its elements: (element mask, values (n,)).

        Each band says its range (``data-band``: ``what`` from ... to ..., the levels' units),
        for a reader that shows the value under the pointer.
        """
        mesh = self.result.mesh
        rings = Rings.join([band_rings(mesh.nodes, pp.sub_triangles(mesh.elements[mask]), z, levels)
                            for mask, z in fields])
        order = np.argsort(rings.band, kind="stable")  # ring after ring, band after band
        sizes = np.diff(rings.start)[order]
        start = np.concatenate([[0], np.cumsum(sizes)])
        take = np.arange(start[-1]) + np.repeat(rings.start[order] - start[:-1], sizes)
        px, start = sv.simplify_rings(self.frame.px(rings.points[take]), start)
        bands = rings.band[order]
        paths = []
        for band in np.unique(bands):
            first, last = np.searchsorted(bands, band), np.searchsorted(bands, band, side="right")
            d = sv.path_data(px[start[first]:start[last]], start[first:last + 1] - start[first])
            c = colours[int(band)]
            # a hairline of the band's own colour closes the seams between neighbouring bands
            lo, hi = levels[int(band)], levels[int(band) + 1]
            paths.append(f'<path d="{d}" fill="{c}" stroke="{c}" stroke-width="5" '
                         f'stroke-linejoin="round" data-band="{escape(what)} {pp.fmt(lo)} to '
                         f'{pp.fmt(hi)}"/>')
        self.body.append(f'<g class="bands" transform="scale(0.1)" fill-rule="evenodd">'
                         f'{"".join(paths)}</g>')


def _rings_data(frame: sv.Frame, loops: list[np.ndarray]) -> str:
    """Path data of closed loops of drawing points."""
    if not loops:
        return ""
    start = np.concatenate([[0], np.cumsum([len(p) for p in loops])])
    return sv.path_data(*sv.simplify_rings(frame.px(np.vstack(loops)), start, 0.05))


# ----------------------------------------------------------------------------------------------
# outline, centroid, shear centre, principal axes

def _principal_axes(result: SectionResult) -> list[tuple[str, np.ndarray, np.ndarray, np.ndarray]]:
    """(name, direction, start, end) of axes 1 and 2 through the centroid, across the mesh."""
    g = result.geometric
    c = np.array(g.centroid, dtype=float)
    a = np.radians(g.alpha_deg)
    rel = result.mesh.nodes - c
    pad = 0.07 * result.profile.size
    out = []
    for name, d in (("1", np.array([np.cos(a), np.sin(a)])), ("2", np.array([-np.sin(a), np.cos(a)]))):
        t = rel @ d
        out.append((name, d, c + (t.min() - pad) * d, c + (t.max() + pad) * d))
    return out


def _draw_axis(pic: _Picture, name: str, start: np.ndarray, end: np.ndarray, colour: str,
               dash: str) -> None:
    """One principal axis: the line, an arrow head on its positive end, its number."""
    p0, p1 = np.array(pic.frame.point(start)), np.array(pic.frame.point(end))
    d = (p1 - p0) / max(float(np.hypot(*(p1 - p0))), 1e-9)
    n = np.array([-d[1], d[0]])
    head = [p1, p1 - 10 * d + 4 * n, p1 - 10 * d - 4 * n]
    label = p1 + 13 * d
    dashes = f' stroke-dasharray="{dash}"' if dash else ""
    pts = " ".join(f"{sv.num(x)},{sv.num(y)}" for x, y in head)
    pic.body.append(
        f'<g class="principal-axis axis-{name}"><path d="M{sv.num(p0[0])} {sv.num(p0[1])}'
        f'L{sv.num(p1[0])} {sv.num(p1[1])}" stroke="{colour}" stroke-width="1.3"{dashes}/>'
        f'<polygon points="{pts}" fill="{colour}"/>'
        + sv.text(label[0], label[1] + 4, name, size=13, anchor="middle", colour=colour,
                  extra=' font-weight="bold"') + "</g>")


def outline_svg(result: SectionResult, *, width: float = 7.0, units: str | None = None) -> str:
    """The section to scale with its centroid, shear centre and principal axes, as SVG.

    Parameters
    ----------
    result : SectionResult
        An analysed section.
    width : float
        Picture width, inches (100 pixels each); the height follows the profile.
    units : str, optional
        Unit system the picture shows its values in (default the profile's).

    Returns
    -------
    str
        An ``<svg>`` element: the regions filled in their material colours, the outline,
        axes 1 (major, solid) and 2 (minor, dashed) through the centroid with arrow heads on
        their positive directions, C the centroid (and the modulus-weighted centroid of a
        composite section), S the shear centre; a legend names each with its values.
    """
    axes = _principal_axes(result)
    marks = [result.torsion.shear_centre, result.geometric.centroid, result.weighted.centroid]
    reach = [end + 0.06 * result.profile.size * d for _, d, _, end in axes]
    name = pp.profile_name(result)
    pic = _Picture(result, units, f"{name}: outline, centroid, shear centre and principal axes",
                   width, [*marks, *(s for *_, s, _ in axes), *reach], 0.04, colour_bar=False)
    names = pp.material_names(result)
    order = list(dict.fromkeys(names))
    colours = pp.MATERIAL_COLOURS
    for region, material in zip(result.profile.regions, names, strict=True):
        colour = colours[order.index(material) % len(colours)]
        d = _rings_data(pic.frame, [np.asarray(p, dtype=float) for p in region.loops()])
        pic.scaled(d, f'fill="{colour}" fill-rule="evenodd"')
    if len(order) == 1 and order[0] == "section":
        pic.entries.append((sv.swatch(colours[0]), "material"))
    else:
        pic.entries += [(sv.swatch(colours[k % len(colours)]), f"material: {m}")
                        for k, m in enumerate(order)]
    pic.outline()
    g, show = result.geometric, pic.show
    i4 = Dimension(4)
    texts = {"1": f"axis 1 (major), I1 = {pp.fmt(show(g.I1, i4))} {show.unit(i4)}, "
                  f"at alpha = {pp.fmt(g.alpha_deg)} deg",
             "2": f"axis 2 (minor), I2 = {pp.fmt(show(g.I2, i4))} {show.unit(i4)}"}
    for (axis, _, start, end), colour, dash in zip(axes, (pp.AXIS1_COLOUR, pp.AXIS2_COLOUR),
                                                   ("", "6 3"), strict=True):
        _draw_axis(pic, axis, start, end, colour, dash)
        pic.entries.append((sv.line_sample(colour, 1.4, dash), texts[axis]))
    pic.body.append(sv.mark(pic.frame, g.centroid, sv.circle(5, pp.CENTROID_COLOUR), "centroid",
                            pic.k, "C", (7, -6), pp.CENTROID_COLOUR))
    pic.entries.append((sv.circle(5, pp.CENTROID_COLOUR),
                        f"C: centroid {pp.point_text(show, g.centroid)}"))
    if result.composite:
        xe = result.weighted.centroid
        ring = sv.circle(6, "none", pp.CENTROID_COLOUR, 1.4)
        pic.body.append(sv.mark(pic.frame, xe, ring, "weighted-centroid", pic.k))
        pic.entries.append((ring, f"modulus-weighted centroid {pp.point_text(show, xe)}"))
    pic.shear_centre()
    return pic.svg()


# ----------------------------------------------------------------------------------------------
# warping function

def warping_svg(result: SectionResult, *, width: float = 7.0, units: str | None = None) -> str:
    """Filled contour bands of the warping function omega about the shear centre, as SVG.

    Parameters
    ----------
    result : SectionResult
        An analysed section.
    width : float
        Picture width, inches.
    units : str, optional
        Unit system the picture shows its values in (default the profile's).

    Returns
    -------
    str
        An ``<svg>`` element: bands of omega (zero mean, L^2; the axial displacement is
        w = theta omega for a twist rate theta) on a colour scale symmetric about zero, the
        line omega = 0 dotted, the shear centre S, a colour bar from the least to the largest
        omega. Warping displacement is towards +z where omega is positive.
    """
    show = Converter.of(result.units, units)
    omega = show(np.asarray(result.torsion.omega, dtype=float), AREA)
    lo, hi = float(omega.min()), float(omega.max())
    levels = sv.band_levels(lo, hi)
    m = max(abs(lo), abs(hi))
    mids = 0.5 * (levels[:-1] + levels[1:])
    colours = sv.ramp_colours(sv.SIGNED_RAMP, mids / m if m > 0 else np.zeros_like(mids))
    name = pp.profile_name(result)
    pic = _Picture(result, units, f"{name}: warping function omega\nabout the shear centre, "
                   "zero mean", width, [result.torsion.shear_centre], 0.06, colour_bar=True)
    mesh = result.mesh
    pic.bands([(np.ones(mesh.n_elements, dtype=bool), omega)], levels, colours,
              f"omega ({show.unit(AREA)})")
    if lo < 0 < hi:
        segs = iso_segments(mesh.nodes, pp.sub_triangles(mesh.elements), omega, 0.0)
        d = sv.path_data(pic.frame.px(segs.reshape(-1, 2)), np.arange(0, 2 * len(segs) + 1, 2),
                         closed=False)
        pic.scaled(d, f'class="zero-line" fill="none" stroke="{pp.EDGE_COLOUR}" stroke-width="7" '
                      'stroke-dasharray="12 18" stroke-linecap="round"')
    pic.outline()
    pic.shear_centre()
    area = show.unit(AREA)
    pic.entries.append((sv.line_sample(pp.EDGE_COLOUR, 0.8, "1.2 1.8"),
                        f"omega = 0; largest |omega| = {pp.fmt(show(result.torsion.omega_max, AREA))} "
                        f"{area}"))
    bar = sv.colour_bar(pic.frame, levels, colours, f"warping function omega ({area})", (lo, hi))
    pic.body.append(bar)
    return pic.svg(max(pic.frame.h, 160.0))


# ----------------------------------------------------------------------------------------------
# torsion shear stress

def _arrows(pic: _Picture, stress: TorsionStress) -> None:
    """Stress-direction arrows on a grid, lengths in proportion up to the largest stress."""
    result = pic.result
    pick = pp.arrow_nodes(result)
    u, v = stress.tau_zx[pick], stress.tau_zy[pick]
    top = stress.tau_max
    size = np.hypot(u, v)
    clip = np.minimum(1.0, top / np.maximum(size, 1e-300))  # corner values would swamp the rest
    step = result.profile.size / pp.ARROW_CELLS
    d = np.column_stack([u, -v]) * (clip * 0.85 * step * pic.frame.scale / max(top, 1e-300))[:, None]
    length = np.hypot(d[:, 0], d[:, 1])
    keep = length > 1.5
    p, d, length = pic.frame.px(result.mesh.nodes[pick])[keep], d[keep], length[keep]
    tail, tip = p - d / 2, p + d / 2
    along = d / length[:, None]
    across = np.column_stack([-along[:, 1], along[:, 0]])
    head = np.minimum(0.4 * length, 5.0)[:, None]
    left, right = tip - head * along + 0.55 * head * across, tip - head * along - 0.55 * head * across
    pts = np.stack([tail, tip, left, tip, right], axis=1).reshape(-1, 2)
    start = np.sort(np.concatenate([np.arange(0, len(pts), 5), np.arange(2, len(pts), 5), [len(pts)]]))
    pic.scaled(sv.path_data(pts, start, closed=False),
               f'class="stress-arrows" fill="none" stroke="{pp.ARROW_COLOUR}" stroke-width="9" '
               'stroke-linejoin="round" stroke-linecap="round"')


def _corners(pic: _Picture) -> None:
    """Every sharp re-entrant corner: an X and the circle left out of the stress maxima."""
    corners = pic.result.corners
    if not corners:
        return
    for c in corners:
        x, y = pic.frame.point((c.x, c.y))
        pic.body.append(f'<circle cx="{sv.num(x)}" cy="{sv.num(y)}" r="{sv.num(c.radius * pic.frame.scale)}" '
                        f'fill="none" stroke="{pp.CORNER_COLOUR}" stroke-width="0.8" '
                        'stroke-dasharray="4 3"/>')
        pic.body.append(sv.mark(pic.frame, (c.x, c.y), sv.cross(4, pp.CORNER_COLOUR), "sharp-corner", pic.k))
    plural = "s" if len(corners) > 1 else ""
    pic.entries.append((sv.cross(4, pp.CORNER_COLOUR),
                        f"sharp re-entrant corner{plural} (stress there depends on the mesh; "
                        "dashed circle left out of the maximum)"))


def torsion_svg(result: SectionResult, stress: TorsionStress, *, width: float = 7.0,
                units: str | None = None) -> str:
    """Bands of the resultant torsion shear stress, with arrows and the largest value, as SVG.

    Parameters
    ----------
    result : SectionResult
        An analysed section.
    stress : TorsionStress
        Its torsion stresses, from :func:`warpwise.stress.torsion_stress`; the title gives
        the twist rate when it is known.
    width : float
        Picture width, inches.
    units : str, optional
        Unit system the picture shows its values in (default the profile's).

    Returns
    -------
    str
        An ``<svg>`` element: bands of tau = |(tau_zx, tau_zy)| (each material from its own
        nodal values) from the least value up to the largest away from sharp re-entrant
        corners (higher values near those corners take the top colour, and the colour bar
        shows a point above), stress-direction arrows on a grid (lengths in proportion to
        tau), the largest value marked with a star, every sharp re-entrant corner with the
        circle left out of the maximum, the shear centre S.
    """
    show = Converter.of(result.units, units)
    top = float(show(stress.tau_max, STRESS))
    mesh = result.mesh
    fields = []
    for f in stress.by_material:
        z = np.zeros(mesh.n_nodes)
        z[f.nodes] = show(f.tau, STRESS)
        mask = result.materials.group == f.group if result.composite else \
            np.ones(mesh.n_elements, dtype=bool)
        fields.append((mask, z, z[f.nodes]))
    lo = min(float(v.min()) for *_, v in fields)
    most = max(float(v.max()) for *_, v in fields)
    hi = top if top > lo else most
    levels = sv.band_levels(lo, hi)
    mids = 0.5 * (levels[:-1] + levels[1:])
    colours = sv.ramp_colours(sv.MAGNITUDE_RAMP, mids / levels[-1] if levels[-1] > 0 else mids * 0)
    unit = show.unit(STRESS)
    title = (f"{pp.profile_name(result)}: torsion shear stress for "
             f"T = {pp.fmt(show(stress.torque, MOMENT))} {show.unit(MOMENT)}")
    if stress.twist_rate is not None:
        title += (f"\ntwist rate theta = {show(stress.twist_rate, TWIST):.4g} {show.unit(TWIST)} "
                  f"(G = {pp.fmt(show(stress.shear_modulus, STRESS))} {unit})")
    pic = _Picture(result, units, title, width, [result.torsion.shear_centre, stress.tau_max_at],
                   0.06, colour_bar=True)
    pic.bands([(mask, z) for mask, z, _ in fields], levels, colours, f"tau ({unit})")
    pic.outline()
    _arrows(pic, stress)
    _corners(pic)
    peak = sv.star(9, pp.PEAK_COLOUR)
    pic.body.append(sv.mark(pic.frame, stress.tau_max_at, peak, "largest-stress", pic.k))
    pic.entries.insert(0, (sv.star(8, pp.PEAK_COLOUR), f"largest shear stress {pp.fmt(top)} {unit} "
                                                      f"at {pp.point_text(show, stress.tau_max_at)}"))
    pic.entries.insert(1, ('<path d="M-11 0H9M5 -3L10 0 5 3" fill="none" stroke="#1f2a33" '
                           'stroke-width="1.2"/>', "stress direction, length in proportion to the stress"))
    pic.shear_centre()
    above = most if most > hi * (1 + 1e-9) else None
    pic.body.append(sv.colour_bar(pic.frame, levels, colours, f"resultant shear stress tau ({unit})",
                                  (lo, hi), above))
    return pic.svg(max(pic.frame.h, 160.0))
