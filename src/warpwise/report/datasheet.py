"""The datasheet of one profile: a self-contained HTML5 page.

The page shows the outline with its principal axes, the property table, the torsion stress
picture and values, the warping picture, a glossary of every symbol shown, the notes and the
cautions. Styles and pictures (SVG, drawn from the arrays by :mod:`.plot_svg` without a
plotting library) are inline; the page loads nothing from anywhere (a content security policy
forbids it) and runs no script, so it can be mailed, archived or printed as it is. The torsion
stresses are computed by the caller (:func:`warpwise.stress.torsion_stress`) and passed in.
"""

from __future__ import annotations

from html import escape
from pathlib import Path

import numpy as np

from ..errors import UsageError
from ..properties.about_axis import AxisProperties
from ..properties.analysis import SectionResult
from ..stress import TorsionStress
from ..units import AREA, MOMENT, STRESS, TWIST, Converter, twist_in_degrees
from .axis_output import axis_html
from .files import atomic_write
from .html_parts import (
    caution_box,
    datasheet_filename,
    footer,
    number_html,
    page,
    safe_name,
    symbol_html,
    unit_html,
    warning_box,
)
from .picture_parts import profile_name
from .plot_svg import outline_svg, torsion_svg, warping_svg
from .property_html import property_table_html
from .quantities import QUANTITY_BY_KEY, shear_notes
from .records import Record, record_of
from .table import corner_note, system_text

#: Symbols used in the pictures and the torsion summary (not in the property list).
PICTURE_SYMBOLS = (
    ("T", "torque about the bar axis", "applied load; the stresses scale with it", MOMENT),
    ("G", "shear modulus", "of the material; the stress pattern does not depend on it", STRESS),
    ("tau", "resultant torsion shear stress", "sqrt(tau_zx^2 + tau_zy^2), "
     "tau_zx = (T/J)(dpsi/dx - y), tau_zy = (T/J)(dpsi/dy + x)", STRESS),
    ("theta", "twist rate", "T / (G J)", TWIST),
    ("omega", "warping function about the shear centre", "axial displacement w = theta omega; "
     "zero mean over the section", AREA),
)


def _key_values(v: dict[str, float], show: Converter) -> str:
    keys = [k for k in ("A", "Ix", "Iy", "I1", "I2", "alpha_deg", "J", "Cw", "xs", "ys", "mass")
            if np.isfinite(v[k])]
    rows = "".join(
        f'<tr><th scope="row">{escape(QUANTITY_BY_KEY[k].label)}</th>'
        f'<td class="sym">{symbol_html(QUANTITY_BY_KEY[k].symbol)}</td>'
        f'<td class="num">{number_html(v[k], 5)}</td>'
        f'<td class="unit">{unit_html(show.unit(QUANTITY_BY_KEY[k].dimension))}</td></tr>'
        for k in keys)
    return f'<table class="key" id="key-values"><tbody>{rows}</tbody></table>'


def _glossary(shown: list[str], show: Converter, more: str = "") -> str:
    items = []
    for key in shown:
        q = QUANTITY_BY_KEY[key]
        unit = unit_html(show.unit(q.dimension))
        items.append(f'<dt>{symbol_html(q.symbol)}</dt><dd>{escape(q.label)}: {escape(q.definition)} '
                     f'<span class="unit">[{unit}]</span></dd>')
    for sym, label, definition, dim in PICTURE_SYMBOLS:
        unit = unit_html(show.unit(dim))
        items.append(f"<dt>{symbol_html(sym)}</dt><dd>{escape(label)}: {escape(definition)} "
                     f'<span class="unit">[{unit}]</span></dd>')
    intro = ("<p>Coordinates x, y are those of the drawing; second moments are about centroidal "
             "axes parallel to x and y; axis 1 is the major and axis 2 the minor principal axis, "
             "at the angle \u03b1 from +x (counter-clockwise positive). "
             f"Units: {escape(system_text(show.target))}.</p>")
    return f'{intro}<dl class="glossary" id="glossary">{"".join(items)}{more}</dl>'


def _notes(result: SectionResult, rec: Record) -> list[str]:
    out = [escape(n) for n in (*rec.notes, *shear_notes(rec.values))]
    for c in rec.corners:
        note = corner_note(c, rec.units)
        out.append(escape(f"{note[:1].upper()}{note[1:]}."))
    out.append(f"Mesh: {rec.elements} six-node triangles, {rec.nodes} nodes, largest element size "
               f"{number_html(rec.mesh_size, 3)} {escape(rec.units)}.")
    if result.composite:
        out.append("Composite section: area, centroid, second and plastic moduli are of the bare "
                   "geometry; torsion, warping and shear values (J, Cw, shear centre, shear areas) "
                   "and the stiffnesses (EA, EI, GJ, ECw) are modulus-weighted, referred to "
                   f"{escape(result.materials.reference)}.")
    return out


def _wide(result: SectionResult) -> bool:
    """True for a profile much wider than tall: its pictures get the full page width."""
    x0, y0, x1, y1 = result.profile.bounds
    return (y1 - y0) < 0.8 * (x1 - x0)


def _layout(result: SectionResult) -> tuple[str, float]:
    """CSS class of a picture-beside-table block and the picture width, inches."""
    return ("overview stacked", 7.0) if _wide(result) else ("overview", 5.4)


def _torsion_rows(result: SectionResult, torsion: TorsionStress,
                  show: Converter) -> list[tuple[str, str, str, str]]:
    """(label, symbol, value, unit) rows of the torsion values, HTML, in ``show``'s units."""
    u, stress = show.system.length, unit_html(show.unit(STRESS))
    T, top = show(torsion.torque, MOMENT), show(torsion.tau_max, STRESS)
    at = show.point(torsion.tau_max_at)
    rows = [("Torque", "T", number_html(T), unit_html(show.unit(MOMENT))),
            ("Largest shear stress", "tau_max", number_html(top, 5), stress),
            ("Where (x, y)", "", f"({number_html(at[0], 5)}, {number_html(at[1], 5)})", unit_html(u)),
            ("Largest shear stress per unit torque", "tau_max/T", number_html(top / T, 5),
             f"{escape(u)}<sup>\u22123</sup>")]
    if result.composite:
        rows += [(f"Largest in {escape(p.material)}", "tau_max",
                  number_html(show(p.tau_max, STRESS), 5), stress) for p in torsion.peaks]
    if torsion.twist_rate is not None:
        theta = show(torsion.twist_rate, TWIST)
        rows.append(("Shear modulus" + (" (reference material)" if result.composite else ""), "G",
                     number_html(show(torsion.shear_modulus, STRESS)), stress))
        rows.append(("Twist rate", "theta", number_html(theta, 5), escape(show.unit(TWIST))))
        rows.append(("Twist rate, degrees", "theta",
                     number_html(twist_in_degrees(theta, show.target), 5),
                     escape(f"deg/{show.system.long_length}")))
    for corner in torsion.corners:
        cx, cy = show.point((corner.corner.x, corner.corner.y))
        value = "" if result.composite else \
            f"{number_html(show(corner.tau_at_corner, STRESS), 4)} (mesh-dependent)"
        rows.append((f"At the sharp corner ({number_html(cx, 5)}, {number_html(cy, 5)}) "
                     f"{escape(u)}", "tau", value or "mesh-dependent",
                     "" if result.composite else stress))
    return rows


def _torsion_section(result: SectionResult, torsion: TorsionStress, nominal_torque: bool,
                     show: Converter) -> str:
    layout, width = _layout(result)
    svg = torsion_svg(result, torsion, width=width, units=show.target)
    moment = unit_html(show.unit(MOMENT))
    T = number_html(show(torsion.torque, MOMENT))
    if nominal_torque:
        caption = (f"Resultant shear stress \u03c4 for a nominal torque T = {T} {moment}. Stresses "
                   "scale in proportion to the torque: multiply by T in "
                   f"{moment} for another torque. The stress pattern does not depend on the "
                   "shear modulus.")
    else:
        caption = f"Resultant shear stress \u03c4 for the torque T = {T} {moment}."
    caption += (" Arrows show the stress direction; the star marks the largest value away from "
                "sharp re-entrant corners.")
    body = "".join(f'<tr><th scope="row">{label}</th><td class="sym">'
                   f'{symbol_html(sym) if sym else ""}</td><td class="num">{val}</td>'
                   f'<td class="unit">{unit}</td></tr>'
                   for label, sym, val, unit in _torsion_rows(result, torsion, show))
    return (f'<section id="torsion"><h2>Torsion shear stress</h2>'
            f'<div class="{layout}"><figure class="picture" id="torsion-picture">{svg}'
            f"<figcaption>{caption}</figcaption></figure>"
            f'<table class="key" id="torsion-values"><tbody>{body}</tbody></table></div></section>')


def datasheet_html(result: SectionResult, *, torsion: TorsionStress, nominal_torque: bool = False,
                   title: str | None = None, warping: bool = True, units: str | None = None,
                   label: str | None = None, about_axis: AxisProperties | None = None) -> str:
    """A self-contained HTML5 datasheet of one analysed profile.

    Parameters
    ----------
    result : SectionResult
        The analysed section.
    torsion : TorsionStress
        Its torsion stresses for the torque to show (in the profile's units, N*mm with mm),
        from :func:`warpwise.stress.torsion_stress`; the twist rate and shear modulus are
        shown when known.
    nominal_torque : bool
        The torque is the nominal T = 1 force x L of the page's units (no torque was given):
        the caption says so and that the stresses scale with the torque.
    title : str, optional
        Heading; default ``label``.
    warping : bool
        Include the picture of the warping function.
    units : str, optional
        Unit system of the page (:data:`warpwise.units.SYSTEMS`); default the profile's.
    label : str, optional
        The profile's name in the heading and the line below it; default its file name (a
        catalogue gives :func:`~warpwise.report.html_parts.relative_names`).
    about_axis : AxisProperties, optional
        Properties about a given axis (in the profile's units), shown after the property
        table with their glossary entries.

    Returns
    -------
    str
        The page: heading with the profile and units, outline with principal axes and key
        values, the full property table (with estimated errors when the result has them),
        the torsion stress picture and values, the warping picture, a glossary of every
        symbol shown, notes and cautions. All text is escaped.

    Raises
    ------
    UsageError
        For a nominal torque other than 1 (in the page's units).

    """
    show = Converter.of(result.units, units)
    if nominal_torque and not np.isclose(show(torsion.torque, MOMENT), 1.0, rtol=1e-12, atol=0):
        raise UsageError(f"a nominal torque is 1 {show.unit(MOMENT)}, got "
                         f"{show(torsion.torque, MOMENT)}")
    name = label or profile_name(result)
    heading = title or name
    u = show.target
    rec = record_of(result).in_units(u)
    v = rec.values
    meta = [f"Section properties of {escape(name)}", f"units {escape(system_text(u))}"]
    if result.materials.names and result.materials.names != ("",):
        meta.append("material" + ("s " if len(result.materials.names) > 1 else " ")
                    + ", ".join(escape(n) for n in result.materials.names))
    layout, width = _layout(result)
    outline = outline_svg(result, width=width, units=u)
    table, shown = property_table_html(v, result.errors, show)
    parts = [
        f'<header><h1>{escape(heading)}</h1><p class="meta">'
        + "".join(f"<span>{m}</span>" for m in meta) + "</p></header>",
        warning_box(rec.warnings),
        f'<section id="overview"><h2>Outline and principal axes</h2><div class="{layout}">'
        f'<figure class="picture" id="outline-picture">{outline}<figcaption>The section to scale '
        f"in {escape(u)}: C centroid, S shear centre, principal axes 1 (major) and 2 (minor) "
        "through the centroid, arrow heads on their positive directions.</figcaption></figure>"
        f"<div><h3 class=\"meta\">Key values</h3>{_key_values(v, show)}</div></div></section>",
        f'<section id="properties"><h2>Section properties</h2>{table}</section>',
    ]
    axis_section, axis_glossary = axis_html(about_axis, show) if about_axis else ("", "")
    parts += [axis_section, _torsion_section(result, torsion, nominal_torque, show)]
    if warping:
        svg = warping_svg(result, width=7.0 if _wide(result) else 6.0, units=u)
        parts.append(
            '<section id="warping"><h2>Warping</h2><figure class="picture" id="warping-picture">'
            f"{svg}<figcaption>Warping function \u03c9 about the shear centre (zero mean, "
            f"{unit_html(u + '2')}): under a twist rate \u03b8 the cross-section moves along the "
            "bar by w = \u03b8 \u03c9. Restraining it (end plates, welded ends) gives warping "
            f"stresses governed by C<sub>w</sub> = {number_html(v['Cw'], 5)} "
            f"{unit_html(u + '6')}.</figcaption></figure></section>")
    parts.append(f'<section id="symbols"><h2>Glossary of symbols</h2>'
                 f'{_glossary(shown, show, axis_glossary)}</section>')
    notes = "".join(f"<li>{n}</li>" for n in _notes(result, rec))
    parts.append(f'<section id="notes"><h2>Notes</h2><ul class="notes">{notes}</ul></section>')
    parts.append(caution_box())
    parts.append(footer())
    return page(f"{heading}: section properties", "\n".join(parts))


def write_datasheet(result: SectionResult, folder: str | Path, *, torsion: TorsionStress,
                    nominal_torque: bool = False, filename: str | None = None,
                    title: str | None = None, units: str | None = None,
                    label: str | None = None) -> Path:
    """Write the datasheet of one profile into ``folder``, atomically.

    Parameters
    ----------
    result : SectionResult
        The analysed section.
    folder : str or Path
        An existing folder.
    torsion, nominal_torque
        As for :func:`datasheet_html`.
    filename : str, optional
        File name; default :func:`datasheet_filename` of the profile's source (use
        :func:`~warpwise.report.html_parts.unique_filenames` for a catalogue). Only the name
        is used, never a path.
    title, units, label : str, optional
        As for :func:`datasheet_html`.

    Returns
    -------
    Path
        The file written.

    Raises
    ------
    UsageError
        When the folder does not exist or cannot be written, or as :func:`datasheet_html`.

    """
    name = safe_name(filename) if filename else datasheet_filename(result.profile.source)
    path = Path(folder) / name
    atomic_write(path, datasheet_html(result, torsion=torsion, nominal_torque=nominal_torque,
                                      title=title, units=units, label=label))
    return path
