"""Self-contained HTML datasheets and a catalogue index page.

A datasheet is one HTML5 file per profile: the outline with its principal axes, the property
table, the torsion stress picture, the warping picture, a glossary of every symbol shown, the
notes and the cautions. Styles and pictures (SVG) are inline; the page loads nothing from
anywhere (a content security policy forbids it) and runs no script, so it can be mailed,
archived or printed as it is.

The index page lists the profiles of a catalogue with links to their datasheets (relative
links, so the folder can be moved), their key values with units, and every profile that could
not be analysed with its error message.

Examples
--------
>>> datasheet_filename("profiles/Rail 40x45.dxf")
'Rail_40x45-dxf.html'
>>> unique_filenames(["a/box.txt", "b/box.txt", "box.dxf"])
['box-txt.html', 'box-txt-2.html', 'box-dxf.html']

"""

from __future__ import annotations

import re
from collections.abc import Sequence
from dataclasses import dataclass
from html import escape
from pathlib import Path

import numpy as np

from .. import __version__
from ..properties.analysis import SectionResult
from ..stress import Loads, combined_stress, torsion_stress
from .files import atomic_write
from .plots import figure_outline, figure_torsion, figure_warping, profile_name, svg_text
from .quantities import FORCE_UNITS, QUANTITIES, QUANTITY_BY_KEY, error_of, unit_of, values
from .records import Record
from .table import CAUTION, corner_note, format_value

#: Cautions printed on every datasheet, after :data:`warpwise.report.table.CAUTION`.
CAUTIONS = (
    CAUTION,
    "These values are not a design-code check: they are properties of the drawn geometry only. "
    "Effective sections, local buckling, net sections, holes for fasteners and tolerances are "
    "for the designer to apply on top, following the code's own definitions.",
    "Check that the outline is the section you mean (units, holes, fillets) and that the mesh "
    "is fine enough for the values you rely on (compare with a smaller mesh size).",
)

#: Key values shown in the catalogue index, in this order.
INDEX_KEYS = ("A", "Ix", "Iy", "I1", "I2", "alpha_deg", "J", "Cw", "xs", "ys")

_GREEK = {"alpha": "\u03b1", "beta": "\u03b2", "omega": "\u03c9", "nu": "\u03bd",
          "theta": "\u03b8", "tau": "\u03c4", "psi": "\u03c8", "sigma": "\u03c3", "kappa": "\u03ba"}

#: Symbols used in the pictures and the torsion summary (not in the property list).
PICTURE_SYMBOLS = (
    ("T", "torque about the bar axis", "applied load; the stresses scale with it", "moment"),
    ("G", "shear modulus", "of the material; the stress pattern does not depend on it", "stress"),
    ("tau", "resultant torsion shear stress", "sqrt(tau_zx^2 + tau_zy^2), "
     "tau_zx = (T/J)(dpsi/dx - y), tau_zy = (T/J)(dpsi/dy + x)", "stress"),
    ("theta", "twist rate", "T / (G J)", "twist"),
    ("omega", "warping function about the shear centre", "axial displacement w = theta omega; "
     "zero mean over the section", "area"),
)


# ----------------------------------------------------------------------------------------------
# small formatting helpers

def symbol_html(symbol: str) -> str:
    """A trade symbol with its subscript, as HTML.

    Examples
    --------
    >>> symbol_html("Wel,x+")
    'W<sub>el,x+</sub>'
    >>> symbol_html("beta_1"), symbol_html("EIx"), symbol_html("A")
    ('\u03b2<sub>1</sub>', 'EI<sub>x</sub>', 'A')

    """
    if "/" in symbol:
        return "/".join(symbol_html(part) for part in symbol.split("/"))
    if "_" in symbol:
        base, sub = symbol.split("_", 1)
        return f"{escape(_GREEK.get(base, base))}<sub>{escape(sub)}</sub>"
    if symbol in _GREEK:
        return _GREEK[symbol]
    m = re.fullmatch(r"([EG](?=[A-Z]))?([A-Za-z])(.*)", symbol)
    if m is None:
        return escape(symbol)
    prefix, base, sub = m.group(1) or "", m.group(2), m.group(3)
    return escape(prefix + base) + (f"<sub>{escape(sub)}</sub>" if sub else "")


def unit_html(unit: str) -> str:
    """A unit as HTML: powers raised, products with a middle dot.

    Examples
    --------
    >>> unit_html("mm4"), unit_html("N*mm2"), unit_html("-")
    ('mm<sup>4</sup>', 'N\u00b7mm<sup>2</sup>', '\u2013')

    """
    if unit in ("-", ""):
        return "\u2013"
    if unit == "deg":
        return "\u00b0"
    text = escape(unit).replace("*", "\u00b7")
    return re.sub(r"([A-Za-z])(\d+)", r"\1<sup>\2</sup>", text)


def number_html(v: float, digits: int = 6) -> str:
    """A number with ``digits`` significant figures; powers of ten written out.

    Examples
    --------
    >>> number_html(1.234567e7)
    '1.23457\u202f\u00d7\u202f10<sup>7</sup>'
    >>> number_html(-0.5)
    '\u22120.5'

    """
    text = format_value(float(v), digits)
    m = re.fullmatch(r"(-?[0-9.]+)e([+-])0*(\d+)", text)
    if m:
        sign = "\u2212" if m.group(2) == "-" else ""
        text = f"{m.group(1)}\u202f\u00d7\u202f10<sup>{sign}{m.group(3)}</sup>"
    return text.replace("-", "\u2212", 1) if text.startswith("-") else text


def _percent(err: float) -> str:
    pct = 100.0 * abs(err)
    if pct < 0.0001:
        return "&lt;\u202f0.0001\u202f%"
    return f"{pct:.2g}\u202f%"


def _unit_of_kind(kind: str, length: str) -> str:
    force, stress = FORCE_UNITS[length]
    return {"moment": f"{force}*{length}", "stress": stress, "twist": f"rad/{length}",
            "area": f"{length}2"}[kind]


# ----------------------------------------------------------------------------------------------
# file names

_UNSAFE = re.compile(r"[^A-Za-z0-9._-]+")
_RESERVED = {"con", "prn", "aux", "nul", *(f"com{k}" for k in range(1, 10)),
             *(f"lpt{k}" for k in range(1, 10)), "index"}


def datasheet_filename(source: str) -> str:
    """A safe file name for the datasheet of a profile read from ``source``.

    Folders are dropped, the file's ending is kept in the name (so ``box.txt`` and ``box.dxf``
    get different pages) and anything but letters, digits, ``.``, ``_`` and ``-`` becomes
    ``_``. Names that devices or the index page use get a trailing ``_``.

    Parameters
    ----------
    source : str
        The profile's source (file path or shape description).

    Returns
    -------
    str
        A name ending in ``.html``, at most 100 characters.

    Examples
    --------
    >>> datasheet_filename("../../etc/passwd"), datasheet_filename("<profile>")
    ('passwd.html', 'profile.html')
    >>> datasheet_filename("CON"), datasheet_filename("index")
    ('CON_.html', 'index_.html')

    """
    name = re.split(r"[\\/]", source.strip())[-1] if source else ""
    stem, dot, ext = name.rpartition(".")
    if not dot or not stem:
        stem, ext = name, ""
    stem = _UNSAFE.sub("_", stem).strip("._-")[:80] or "profile"
    ext = _UNSAFE.sub("_", ext).strip("._-")[:12]
    base = f"{stem}-{ext}" if ext else stem
    if base.lower() in _RESERVED:
        base += "_"
    return f"{base}.html"


def _safe_name(filename: str) -> str:
    """A given file name made safe: its last path component only, ending in .html."""
    name = _UNSAFE.sub("_", re.split(r"[\\/]", filename)[-1]).strip("._-")
    if not name.lower().endswith(".html"):
        name += ".html"
    return name if len(name) > 5 else "profile.html"


def unique_filenames(sources: Sequence[str]) -> list[str]:
    """Datasheet file names for several sources, made unique by numbering repeats.

    Parameters
    ----------
    sources : sequence of str
        Profile sources, in catalogue order.

    Returns
    -------
    list of str
        One name per source; a repeat gets ``-2``, ``-3``... (compared without case, so the
        pages can share a folder on any file system).

    """
    seen: set[str] = set()
    out = []
    for src in sources:
        name = datasheet_filename(src)
        stem = name[:-5]
        k = 1
        while name.lower() in seen:
            k += 1
            name = f"{stem}-{k}.html"
        seen.add(name.lower())
        out.append(name)
    return out


# ----------------------------------------------------------------------------------------------
# page frame

_CSS = """
:root { --ink: #1f2a33; --muted: #56646f; --rule: #d5dce2; --band: #f2f5f7; --accent: #1d4f91;
        --warn: #8a4b00; --warn-bg: #fff6e5; }
* { box-sizing: border-box; }
html { font-family: "Segoe UI", "Helvetica Neue", Arial, "Liberation Sans", sans-serif;
       color: var(--ink); background: #fff; font-size: 15px; line-height: 1.45; }
body { margin: 0 auto; max-width: 1080px; padding: 28px 32px 40px; }
header { border-bottom: 3px solid var(--accent); padding-bottom: 10px; margin-bottom: 18px; }
h1 { font-size: 1.65rem; margin: 0 0 4px; letter-spacing: 0.01em; }
h2 { font-size: 1.2rem; margin: 30px 0 10px; padding-bottom: 4px; border-bottom: 1px solid var(--rule);
     color: var(--accent); }
.meta { margin: 0; color: var(--muted); font-size: 0.92rem; }
.meta span + span::before { content: " \\00b7  "; }
.overview { display: grid; grid-template-columns: minmax(0, 3fr) minmax(260px, 2fr); gap: 24px;
            align-items: start; }
.overview.stacked { grid-template-columns: 1fr; }
.overview.stacked figure { max-width: 860px; }
.overview.stacked > table, .overview.stacked > div { max-width: 620px; }
@media (max-width: 820px) { .overview { grid-template-columns: 1fr; } }
figure { margin: 0; break-inside: avoid; }
figure svg { display: block; width: 100%; height: auto; }
figure.picture svg { max-height: 960px; }
#warping-picture { max-width: 720px; }
sup, sub { line-height: 0; }
figcaption { font-size: 0.88rem; color: var(--muted); margin-top: 6px; }
table { border-collapse: collapse; width: 100%; font-size: 0.92rem; }
th, td { padding: 4px 8px; text-align: left; vertical-align: top; }
thead th { border-bottom: 2px solid var(--ink); font-weight: 600; white-space: nowrap; }
tbody th.group { background: var(--band); font-weight: 600; padding-top: 7px; color: var(--accent); }
tbody tr { border-bottom: 1px solid var(--rule); break-inside: avoid; }
td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
td.sym { white-space: nowrap; font-family: Georgia, "Times New Roman", serif; font-size: 1rem; }
td.unit { white-space: nowrap; }
.key td, .key th { padding: 5px 8px; }
.key th { font-weight: normal; color: var(--muted); }
dl.glossary { display: grid; grid-template-columns: max-content 1fr; gap: 4px 18px; margin: 0;
              font-size: 0.92rem; }
dl.glossary dt { font-family: Georgia, "Times New Roman", serif; font-size: 1rem; white-space: nowrap; }
dl.glossary dd { margin: 0; }
dl.glossary .unit { color: var(--muted); }
.notes li { margin-bottom: 3px; }
.caution { border-left: 4px solid var(--warn); background: var(--warn-bg); padding: 10px 16px;
           margin-top: 30px; break-inside: avoid; }
.caution h2 { border: 0; color: var(--warn); margin: 0 0 6px; padding: 0; }
.caution p { margin: 4px 0; }
footer { margin-top: 28px; color: var(--muted); font-size: 0.82rem; border-top: 1px solid var(--rule);
         padding-top: 8px; }
a { color: var(--accent); }
td.failed { color: var(--warn); }
svg.thumb { width: 56px; height: 40px; display: block; }
@media print {
  html { font-size: 11pt; }
  body { max-width: none; padding: 0; }
  h2 { break-after: avoid; }
  a { color: inherit; text-decoration: none; }
}
"""

_CSP = "default-src 'none'; style-src 'unsafe-inline'; img-src data:"


def _page(title: str, body: str) -> str:
    return (
        "<!DOCTYPE html>\n"
        '<html lang="en">\n<head>\n<meta charset="utf-8">\n'
        '<meta name="viewport" content="width=device-width, initial-scale=1">\n'
        f'<meta http-equiv="Content-Security-Policy" content="{_CSP}">\n'
        f'<meta name="generator" content="warpwise {escape(__version__)}">\n'
        '<link rel="icon" href="data:,">\n'
        f"<title>{escape(title)}</title>\n<style>{_CSS}</style>\n</head>\n<body>\n{body}\n"
        "</body>\n</html>\n"
    )


def _footer() -> str:
    return (f"<footer>Computed with warpwise {escape(__version__)}: six-node triangle finite "
            "elements on the drawn outline (Saint-Venant warping, Trefftz shear centre). "
            "Values in the drawing's length unit.</footer>")


def _caution_box() -> str:
    paras = "".join(f"<p>{escape(c)}</p>" for c in CAUTIONS)
    return f'<section class="caution" id="cautions"><h2>Cautions</h2>{paras}</section>'


# ----------------------------------------------------------------------------------------------
# datasheet

def _property_rows(result: SectionResult, v: dict[str, float]) -> tuple[str, list[str]]:
    """The grouped property table and the keys shown."""
    with_errors = result.errors is not None
    cols = 5 if with_errors else 4
    rows, shown, group = [], [], None
    for q in QUANTITIES:
        value = v[q.key]
        if not np.isfinite(value):
            continue
        if q.group != group:
            if group is not None:
                rows.append("</tbody>")
            group = q.group
            rows.append(f'<tbody><tr><th class="group" colspan="{cols}" scope="rowgroup">'
                        f"{escape(group)}</th></tr>")
        shown.append(q.key)
        cells = [f'<td class="sym">{symbol_html(q.symbol)}</td>', f"<td>{escape(q.label)}</td>",
                 f'<td class="num">{number_html(value)}</td>',
                 f'<td class="unit">{unit_html(unit_of(q, result.units))}</td>']
        if with_errors:
            err = error_of(result, q.key)
            cells.append(f'<td class="num">{"" if err is None else _percent(err)}</td>')
        rows.append(f'<tr data-key="{escape(q.key)}">{"".join(cells)}</tr>')
    if group is not None:
        rows.append("</tbody>")
    head = ["Symbol", "Property", "Value", "Unit"] + (["Estimated error"] if with_errors else [])
    numeric = ' class="num"'
    thead = "<thead><tr>" + "".join(
        f'<th scope="col"{numeric if h in ("Value", "Estimated error") else ""}>{h}</th>'
        for h in head) + "</tr></thead>"
    note = ""
    if with_errors:
        note = ('<p class="meta">Estimated error: relative error of the value shown (shear-centre '
                "coordinates: relative to the largest dimension of the profile), from the same "
                "analysis on two finer meshes.</p>")
    table = f'<table class="properties" id="property-table">{thead}{"".join(rows)}</table>{note}'
    return table, shown


def _key_values(result: SectionResult, v: dict[str, float]) -> str:
    keys = [k for k in ("A", "Ix", "Iy", "I1", "I2", "alpha_deg", "J", "Cw", "xs", "ys", "mass")
            if np.isfinite(v[k])]
    rows = "".join(
        f'<tr><th scope="row">{escape(QUANTITY_BY_KEY[k].label)}</th>'
        f'<td class="sym">{symbol_html(QUANTITY_BY_KEY[k].symbol)}</td>'
        f'<td class="num">{number_html(v[k], 5)}</td>'
        f'<td class="unit">{unit_html(unit_of(QUANTITY_BY_KEY[k], result.units))}</td></tr>'
        for k in keys)
    return f'<table class="key" id="key-values"><tbody>{rows}</tbody></table>'


def _glossary(result: SectionResult, shown: list[str]) -> str:
    items = []
    for key in shown:
        q = QUANTITY_BY_KEY[key]
        unit = unit_html(unit_of(q, result.units))
        items.append(f'<dt>{symbol_html(q.symbol)}</dt><dd>{escape(q.label)}: {escape(q.definition)} '
                     f'<span class="unit">[{unit}]</span></dd>')
    for sym, label, definition, kind in PICTURE_SYMBOLS:
        unit = unit_html(_unit_of_kind(kind, result.units))
        items.append(f"<dt>{symbol_html(sym)}</dt><dd>{escape(label)}: {escape(definition)} "
                     f'<span class="unit">[{unit}]</span></dd>')
    intro = ("<p>Coordinates x, y are those of the drawing; second moments are about centroidal "
             "axes parallel to x and y; axis 1 is the major and axis 2 the minor principal axis, "
             "at the angle \u03b1 from +x (counter-clockwise positive). "
             f"Length unit L = {escape(result.units)}.</p>")
    return f'{intro}<dl class="glossary" id="glossary">{"".join(items)}</dl>'


def _notes(result: SectionResult) -> list[str]:
    out = [escape(n) for n in result.profile.notes]
    for c in result.corners:
        note = corner_note(c, result.units)
        out.append(escape(f"{note[:1].upper()}{note[1:]}."))
    m = result.mesh
    out.append(f"Mesh: {m.n_elements} six-node triangles, {m.n_nodes} nodes, largest element size "
               f"{number_html(m.size, 3)} {escape(result.units)}.")
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


def _torsion_section(result: SectionResult, torque: float | None, G: float | None) -> str:
    u = result.units
    force, stress = FORCE_UNITS[u]
    nominal = torque is None
    T = 1.0 if nominal else float(torque)
    G_known = G if G is not None else result.materials.G_ref
    G_used = G_known if G_known is not None else 1.0
    ts = torsion_stress(result, T, G_used)
    layout, width = _layout(result)
    fig = figure_torsion(result, T, G_known, width=width)
    svg = svg_text(fig, "torsion-")
    moment = unit_html(f"{force}*{u}")
    if nominal:
        caption = (f"Resultant shear stress \u03c4 for a nominal torque T = 1 {moment}. Stresses "
                   "scale in proportion to the torque: multiply by T in "
                   f"{moment} for another torque. The stress pattern does not depend on the "
                   "shear modulus.")
    else:
        caption = f"Resultant shear stress \u03c4 for the torque T = {number_html(T)} {moment}."
    caption += (" Arrows show the stress direction; the star marks the largest value away from "
                "sharp re-entrant corners.")
    if result.composite:
        cs = combined_stress(result, Loads(T=T), G)
        per = [(m.material, m.tau_max, m.von_mises_at) for m in cs.by_material]
        top, at = max(((t, a) for _, t, a in per), key=lambda ta: ta[0])
    else:
        per, top, at = [], ts.tau_max, ts.tau_max_at
    rows = [("Torque", "T", number_html(T), moment),
            ("Largest shear stress", "tau_max", number_html(top, 5), unit_html(stress)),
            ("Where (x, y)", "", f"({number_html(at[0], 5)}, {number_html(at[1], 5)})", unit_html(u)),
            ("Largest shear stress per unit torque", "tau_max/T", number_html(top / T, 5),
             f"{escape(u)}<sup>\u22123</sup>")]
    rows += [(f"Largest in {escape(name)}", "tau_max", number_html(t, 5), unit_html(stress))
             for name, t, _ in per]
    if G_known is not None:
        rows.append(("Shear modulus" + (" (reference material)" if result.composite else ""), "G",
                     number_html(G_known), unit_html(stress)))
        rows.append(("Twist rate", "theta", number_html(ts.twist_rate, 5), escape(f"rad/{u}")))
    for corner in ts.corners:
        c = corner.corner
        value = "" if result.composite else f"{number_html(corner.tau_at_corner, 4)} (mesh-dependent)"
        rows.append((f"At the sharp corner ({number_html(c.x, 5)}, {number_html(c.y, 5)})", "tau",
                     value or "mesh-dependent", "" if result.composite else unit_html(stress)))
    body = "".join(f'<tr><th scope="row">{label}</th><td class="sym">'
                   f'{symbol_html(sym) if sym else ""}</td><td class="num">{val}</td>'
                   f'<td class="unit">{unit}</td></tr>' for label, sym, val, unit in rows)
    return (f'<section id="torsion"><h2>Torsion shear stress</h2>'
            f'<div class="{layout}"><figure class="picture" id="torsion-picture">{svg}'
            f"<figcaption>{caption}</figcaption></figure>"
            f'<table class="key" id="torsion-values"><tbody>{body}</tbody></table></div></section>')


def datasheet_html(result: SectionResult, *, torque: float | None = None, G: float | None = None,
                   title: str | None = None, warping: bool = True) -> str:
    """A self-contained HTML5 datasheet of one analysed profile.

    Parameters
    ----------
    result : SectionResult
        The analysed section.
    torque : float, optional
        Torque for the stress picture, force x L (N*mm with mm); default a nominal unit torque
        (the caption says so: the stresses scale with the torque).
    G : float, optional
        Shear modulus, force / L^2, for the twist rate; default the material's, and without a
        material the twist rate is left out (the stress pattern does not depend on G).
    title : str, optional
        Heading; default the profile's file name.
    warping : bool
        Include the picture of the warping function.

    Returns
    -------
    str
        The page: heading with the profile and units, outline with principal axes and key
        values, the full property table (with estimated errors when the result has them),
        the torsion stress picture and values, the warping picture, a glossary of every
        symbol shown, notes and cautions. All text is escaped.

    """
    name = profile_name(result)
    heading = title or name
    u = result.units
    force, stress = FORCE_UNITS[u]
    v = values(result)
    meta = [f"Section properties of {escape(name)}",
            f"length {escape(u)}, force {escape(force)}, stress {escape(stress)}"]
    if result.materials.names and result.materials.names != ("",):
        meta.append("material" + ("s " if len(result.materials.names) > 1 else " ")
                    + ", ".join(escape(n) for n in result.materials.names))
    layout, width = _layout(result)
    outline = svg_text(figure_outline(result, show_mesh=False, width=width), "outline-")
    table, shown = _property_rows(result, v)
    parts = [
        f'<header><h1>{escape(heading)}</h1><p class="meta">'
        + "".join(f"<span>{m}</span>" for m in meta) + "</p></header>",
        f'<section id="overview"><h2>Outline and principal axes</h2><div class="{layout}">'
        f'<figure class="picture" id="outline-picture">{outline}<figcaption>The section to scale '
        f"in {escape(u)}: C centroid, S shear centre, principal axes 1 (major) and 2 (minor) "
        "through the centroid, arrow heads on their positive directions.</figcaption></figure>"
        f"<div><h3 class=\"meta\">Key values</h3>{_key_values(result, v)}</div></div></section>",
        f'<section id="properties"><h2>Section properties</h2>{table}</section>',
        _torsion_section(result, torque, G),
    ]
    if warping:
        svg = svg_text(figure_warping(result, width=7.0 if _wide(result) else 6.0), "warping-")
        parts.append(
            '<section id="warping"><h2>Warping</h2><figure class="picture" id="warping-picture">'
            f"{svg}<figcaption>Warping function \u03c9 about the shear centre (zero mean, "
            f"{unit_html(u + '2')}): under a twist rate \u03b8 the cross-section moves along the "
            "bar by w = \u03b8 \u03c9. Restraining it (end plates, welded ends) gives warping "
            f"stresses governed by C<sub>w</sub> = {number_html(v['Cw'], 5)} "
            f"{unit_html(u + '6')}.</figcaption></figure></section>")
    parts.append(f'<section id="symbols"><h2>Glossary of symbols</h2>{_glossary(result, shown)}</section>')
    notes = "".join(f"<li>{n}</li>" for n in _notes(result))
    parts.append(f'<section id="notes"><h2>Notes</h2><ul class="notes">{notes}</ul></section>')
    parts.append(_caution_box())
    parts.append(_footer())
    return _page(f"{heading}: section properties", "\n".join(parts))


def write_datasheet(result: SectionResult, folder: str | Path, *, filename: str | None = None,
                    torque: float | None = None, G: float | None = None,
                    title: str | None = None) -> Path:
    """Write the datasheet of one profile into ``folder``, atomically.

    Parameters
    ----------
    result : SectionResult
        The analysed section.
    folder : str or Path
        An existing folder.
    filename : str, optional
        File name; default :func:`datasheet_filename` of the profile's source (use
        :func:`unique_filenames` for a catalogue). Only the name is used, never a path.
    torque, G, title
        As for :func:`datasheet_html`.

    Returns
    -------
    Path
        The file written.

    Raises
    ------
    UsageError
        When the folder does not exist or cannot be written.

    """
    name = _safe_name(filename) if filename else datasheet_filename(result.profile.source)
    path = Path(folder) / name
    atomic_write(path, datasheet_html(result, torque=torque, G=G, title=title))
    return path


# ----------------------------------------------------------------------------------------------
# catalogue index

@dataclass(frozen=True, eq=False)
class CatalogueEntry:
    """One profile of a catalogue.

    Attributes
    ----------
    source : str
        Where the profile came from (file name).
    result : SectionResult or None
        The analysis, or None when it failed.
    href : str or None
        Relative link to the datasheet (default :func:`datasheet_filename` of the source when
        there is a result).
    error : str or None
        Why the profile could not be analysed.
    record : Record or None
        The profile's values when the full result is not at hand (a catalogue worker's
        output); used when ``result`` is None.
    thumbnail : str or None
        Inline SVG of the outline to show with ``record``.
    """

    source: str
    result: SectionResult | None = None
    href: str | None = None
    error: str | None = None
    record: Record | None = None
    thumbnail: str | None = None


def thumbnail_svg(result: SectionResult) -> str:
    """A small inline SVG of the outline (even-odd filled loops)."""
    x0, y0, x1, y1 = result.profile.bounds
    size = max(x1 - x0, y1 - y0, 1e-300)
    paths = []
    for region in result.profile.regions:
        d = []
        for loop in region.loops():
            p = (np.asarray(loop) - [x0, y1]) * [1.0, -1.0] / size * 100.0
            d.append("M" + " L".join(f"{a:.2f},{b:.2f}" for a, b in p) + " Z")
        paths.append(f'<path d="{" ".join(d)}"/>')
    w, h = (x1 - x0) / size * 100.0, (y1 - y0) / size * 100.0
    return (f'<svg class="thumb" viewBox="-4 -4 {w + 8:.2f} {h + 8:.2f}" role="img" '
            f'aria-label="outline" fill="#a9c4dc" stroke="#24313c" stroke-width="2" '
            f'fill-rule="evenodd" vector-effect="non-scaling-stroke">{"".join(paths)}</svg>')


def index_html(entries: Sequence[CatalogueEntry], *, title: str = "Section catalogue") -> str:
    """A catalogue page: each profile with a link to its datasheet and its key values.

    Parameters
    ----------
    entries : sequence of CatalogueEntry
        The profiles, in the order shown; failed ones (no result) are listed with their
        error message.
    title : str
        Heading of the page.

    Returns
    -------
    str
        Self-contained HTML5 page. When all profiles share one length unit the units are in
        the column headings, otherwise beside every value.

    """
    done = [e for e in entries if e.result is not None or e.record is not None]
    failed = [e for e in entries if e.result is None and e.record is None]
    units = {(e.result.units if e.result is not None else e.record.units) for e in done}
    common = units.pop() if len(units) == 1 else None
    qs = [QUANTITY_BY_KEY[k] for k in INDEX_KEYS]
    head = ['<th scope="col"></th>', '<th scope="col">Profile</th>']
    for q in qs:
        unit = f" ({unit_html(unit_of(q, common))})" if common else ""
        head.append(f'<th scope="col" title="{escape(q.label)}">{symbol_html(q.symbol)}{unit}</th>')
    rows = []
    for e in done:
        r = e.result
        v = values(r) if r is not None else e.record.values
        length = r.units if r is not None else e.record.units
        name = profile_name(r) if r is not None else (Path(e.source).name or e.source)
        thumb = thumbnail_svg(r) if r is not None else (e.thumbnail or "")
        href = e.href if e.href is not None else datasheet_filename(e.source)
        cells = [f"<td>{thumb}</td>",
                 f'<td><a href="{escape(href, quote=True)}">{escape(name)}</a></td>']
        for q in qs:
            unit = "" if common else f"\u202f{unit_html(unit_of(q, length))}"
            cells.append(f'<td class="num">{number_html(v[q.key], 5)}{unit}</td>'
                         if np.isfinite(v[q.key]) else '<td class="num"></td>')
        rows.append(f"<tr>{''.join(cells)}</tr>")
    table = (f'<table class="properties" id="catalogue-table"><thead><tr>{"".join(head)}</tr></thead>'
             f'<tbody>{"".join(rows)}</tbody></table>') if done else "<p>No profile was analysed.</p>"
    summary = [f"{len(entries)} profile{'s' if len(entries) != 1 else ''}",
               f"{len(done)} analysed"]
    if failed:
        summary.append(f"{len(failed)} not analysed")
    if common:
        summary.append(f"length unit {escape(common)}")
    parts = [f'<header><h1>{escape(title)}</h1><p class="meta">'
             + "".join(f"<span>{s}</span>" for s in summary) + "</p></header>",
             f'<section id="profiles"><h2>Profiles</h2>{table}'
             '<p class="meta">Each name links to the full datasheet. Second moments are about '
             "centroidal axes parallel to x and y; xs, ys is the shear centre in drawing "
             "coordinates.</p></section>"]
    if failed:
        items = "".join(f'<tr><td>{escape(e.source)}</td><td class="failed">'
                        f'{escape(e.error or "not analysed")}</td></tr>' for e in failed)
        parts.append('<section id="failures"><h2>Profiles not analysed</h2>'
                     '<table class="properties" id="failure-table"><thead><tr><th scope="col">'
                     'File</th><th scope="col">Reason</th></tr></thead>'
                     f"<tbody>{items}</tbody></table></section>")
    parts.append(_caution_box())
    parts.append(_footer())
    return _page(title, "\n".join(parts))


def write_index(entries: Sequence[CatalogueEntry], folder: str | Path, *,
                filename: str = "index.html", title: str = "Section catalogue") -> Path:
    """Write the catalogue index page into ``folder``, atomically.

    Parameters
    ----------
    entries : sequence of CatalogueEntry
        The profiles (see :func:`index_html`).
    folder : str or Path
        An existing folder (the datasheets' folder, so that the relative links work).
    filename : str
        File name of the page.
    title : str
        Heading of the page.

    Returns
    -------
    Path
        The file written.

    """
    path = Path(folder) / _safe_name(filename)
    atomic_write(path, index_html(entries, title=title))
    return path


def write_catalogue_index(outcomes: Sequence[object], folder: str | Path) -> Path:
    """Index page of a catalogue run from its outcomes (see :mod:`warpwise.catalogue`)."""
    entries = [CatalogueEntry(o.path, None, None if o.datasheet is None else Path(o.datasheet).name,
                              o.error, o.record, o.thumbnail) for o in outcomes]
    return write_index(entries, folder)


__all__ = ["CAUTIONS", "CatalogueEntry", "datasheet_filename", "datasheet_html", "index_html",
           "number_html", "symbol_html", "thumbnail_svg", "unique_filenames", "unit_html",
           "write_catalogue_index", "write_datasheet", "write_index"]
