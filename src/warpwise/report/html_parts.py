"""Pieces every HTML page shares: symbols, units, numbers, file names and the page frame.

Symbols, units and numbers are written as HTML; file names are made safe; the frame holds the
styles, the content security policy, the cautions and the footer. The pages are
self-contained: styles inline, no script, nothing loaded from anywhere.

Examples
--------
>>> datasheet_filename("profiles/Rail 40x45.dxf")
'Rail_40x45-dxf.html'
>>> unique_filenames(["a/box.txt", "b/box.txt", "box.dxf"])
['a_box-txt.html', 'b_box-txt.html', 'box-dxf.html']

"""

from __future__ import annotations

import hashlib
import os
import re
from collections import Counter
from collections.abc import Sequence
from html import escape
from pathlib import Path

from .. import __version__
from .table import CAUTION, format_value

#: Cautions printed on every datasheet, after :data:`warpwise.report.table.CAUTION`.
CAUTIONS = (
    CAUTION,
    "These values are not a design-code check: they are properties of the drawn geometry only. "
    "Effective sections, local buckling, net sections, holes for fasteners and tolerances are "
    "for the designer to apply on top, following the code's own definitions.",
    "Check that the outline is the section you mean (units, holes, fillets) and that the mesh "
    "is fine enough for the values you rely on (compare with a smaller mesh size).",
)

_GREEK = {"alpha": "\u03b1", "beta": "\u03b2", "omega": "\u03c9", "nu": "\u03bd",
          "theta": "\u03b8", "tau": "\u03c4", "psi": "\u03c8", "sigma": "\u03c3", "kappa": "\u03ba",
          "phi": "\u03c6"}


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
    >>> symbol_html("phi''"), symbol_html("T_sv")
    ('\u03c6\u2032\u2032', 'T<sub>sv</sub>')

    """
    primes = len(symbol) - len(symbol.rstrip("'"))
    if primes and symbol.rstrip("'"):
        return symbol_html(symbol.rstrip("'")) + "\u2032" * primes
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


def percent(err: float) -> str:
    """A relative error as a percentage, HTML."""
    pct = 100.0 * abs(err)
    if pct < 0.0001:
        return "&lt;\u202f0.0001\u202f%"
    return f"{pct:.2g}\u202f%"



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


def safe_name(filename: str) -> str:
    """A given file name made safe: its last path component only, ending in .html."""
    name = _UNSAFE.sub("_", re.split(r"[\\/]", filename)[-1]).strip("._-")
    if not name.lower().endswith(".html"):
        name += ".html"
    return name if len(name) > 5 else "profile.html"


def relative_names(sources: Sequence[str]) -> list[str]:
    """How each profile is named on pages that show several: file name, or path where needed.

    Parameters
    ----------
    sources : sequence of str
        Profile sources (file paths as given, or shape descriptions), in catalogue order.

    Returns
    -------
    list of str
        Each file's name; when two files share a name (compared without case), every file's
        path relative to the common folder of all the files, with ``/`` between folders.
        Sources that are not files (empty, ``<...>``) are kept as they are.

    Examples
    --------
    >>> relative_names(["lib/a/box.txt", "lib/b/box.txt", "lib/rail.dxf"])
    ['a/box.txt', 'b/box.txt', 'rail.dxf']
    >>> relative_names(["lib/a/box.txt", "lib/rail.dxf"])
    ['box.txt', 'rail.dxf']
    """
    files = [k for k, src in enumerate(sources) if _is_path(src)]
    names = [Path(sources[k]).name.lower() for k in files]
    out = list(sources)
    if len(set(names)) == len(names):
        for k in files:
            out[k] = Path(sources[k]).name
        return out
    full = [os.path.abspath(sources[k]) for k in files]
    common = os.path.commonpath([os.path.dirname(f) for f in full])
    for k, f in zip(files, full, strict=True):
        out[k] = Path(os.path.relpath(f, common)).as_posix()
    return out


def _is_path(source: str) -> bool:
    """True for a source that names a file (not empty, not a ``<...>`` description)."""
    return bool(source.strip()) and not source.startswith("<")


#: Longest page name stem taken from a profile's name, characters.
STEM_LENGTH = 80


def _page_stem(label: str) -> tuple[str, bool]:
    """Page name (no ``.html``) of a relative path or name, and whether it was altered.

    Folders are joined with ``_``; anything but letters, digits, ``.``, ``_``, ``-`` becomes
    ``_``; a stem longer than :data:`STEM_LENGTH` is cut. ``altered`` says the name no longer
    reads as the profile's own (replaced characters, a cut).
    """
    *folders, name = re.split(r"[\\/]", label.strip())
    stem, dot, ext = name.rpartition(".")
    if not dot or not stem:
        stem, ext = name, ""
    pieces = [*folders, stem]
    joined = "_".join(p for p in (_UNSAFE.sub("_", p).strip("._-") for p in pieces) if p)
    cut = joined[:STEM_LENGTH] or "profile"
    safe_ext = _UNSAFE.sub("_", ext).strip("._-")[:12]
    altered = cut != "_".join(pieces) or safe_ext != ext
    base = f"{cut}-{safe_ext}" if safe_ext else cut
    return (f"{base}_" if base.lower() in _RESERVED else base), altered


def unique_filenames(sources: Sequence[str]) -> list[str]:
    """Datasheet file names for several sources: unique, and none suggests another profile.

    Parameters
    ----------
    sources : sequence of str
        Profile sources, in catalogue order.

    Returns
    -------
    list of str
        One name per source, from its :func:`relative_names` label. A name that had to be
        altered (characters replaced, cut at :data:`STEM_LENGTH`), or that two profiles
        would share unaltered (compared without case, so the pages can share a folder on any
        file system), ends in ``-`` and 8 hex digits of the SHA-1 of the full label.

    Examples
    --------
    >>> unique_filenames(["lib/a/box.txt", "lib/b/box.txt", "lib/box.dxf"])
    ['a_box-txt.html', 'b_box-txt.html', 'box-dxf.html']
    >>> unique_filenames(["box.txt", "box-txt"])
    ['box-txt-e8703642.html', 'box-txt-615fa866.html']
    """
    labels = relative_names(sources)
    stems = [_page_stem(label) for label in labels]
    shared = Counter(stem.lower() for stem, altered in stems if not altered)
    out = [f"{stem}-{_short_hash(label)}" if altered or shared[stem.lower()] > 1 else stem
           for label, (stem, altered) in zip(labels, stems, strict=True)]
    seen: set[str] = set()
    for k, name in enumerate(out):  # the same label twice (a manifest's parts of one file)
        repeat = 1
        while name.lower() in seen:
            repeat += 1
            name = f"{stems[k][0]}-{_short_hash(f'{labels[k]}#{repeat}')}"
        seen.add(name.lower())
        out[k] = name
    return [f"{name}.html" for name in out]


def _short_hash(text: str) -> str:
    """8 hex digits of the SHA-1 of a text."""
    return hashlib.sha1(text.encode("utf-8")).hexdigest()[:8]


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
/* the catalogue index: wider than a datasheet, denser, its header in view while scrolling */
body:has(#catalogue-table) { max-width: 1380px; padding-left: 16px; padding-right: 16px; }
#catalogue-table { font-size: 0.8rem; }
#catalogue-table th, #catalogue-table td { padding: 3px 5px; }
#catalogue-table thead th { position: sticky; top: 0; z-index: 1; background: #fff;
                            box-shadow: inset 0 -2px 0 var(--ink); white-space: normal; }
#catalogue-table td:nth-child(2) { overflow-wrap: anywhere; min-width: 9em; }
@page { size: A4; margin: 10mm 11mm; }
@media print {
  /* a datasheet on two A4 pages: the outline, key values and every property on the first;
     the stress and warping pictures, the glossary, notes and cautions on the second */
  html { font-size: 7.4pt; line-height: 1.22; }
  body { max-width: none; padding: 0; }
  header { padding-bottom: 3px; margin-bottom: 5px; border-bottom-width: 2px; }
  h1 { font-size: 13pt; margin: 0; }
  h2 { font-size: 8.5pt; margin: 5px 0 3px; padding-bottom: 1px; break-after: avoid; }
  a { color: inherit; text-decoration: none; }
  .overview, .overview.stacked { grid-template-columns: minmax(0, 1fr) minmax(0, 1fr); gap: 5mm; }
  .overview.stacked figure, .overview.stacked > table, .overview.stacked > div { max-width: none; }
  figure.picture svg, #warping-picture svg { max-height: 54mm; width: auto; max-width: 100%; }
  #warping-picture { max-width: none; }
  figcaption { font-size: 6.5pt; margin-top: 1px; }
  th, td, .key td, .key th { padding: 0.5px 4px; }
  td.sym { font-size: 7.4pt; }
  #properties { column-count: 2; column-gap: 6mm; }
  #property-table { font-size: 6.9pt; }
  #property-table td, #property-table th { padding: 0 3px; line-height: 1.18; }
  #properties h2 { column-span: all; }
  #properties p.meta { column-span: all; }
  #torsion { break-before: page; }
  #torsion .overview figure.picture svg { max-height: 36mm; }
  #warping figure.picture svg { max-height: 30mm; }
  dl.glossary { display: block; column-count: 4; column-gap: 4mm; font-size: 5.6pt;
                line-height: 1.1; }
  dl.glossary dt { display: inline; font-size: 6pt; font-weight: 600; }
  dl.glossary dt::after { content: " "; }
  dl.glossary dd { display: inline; margin: 0; }
  dl.glossary dd::after { content: "\\A"; white-space: pre; }
  .notes { font-size: 6pt; margin: 0; padding-left: 12px; line-height: 1.15; column-count: 2;
           column-gap: 6mm; }
  #torsion-values { font-size: 6.4pt; }
  #torsion-values td, #torsion-values th { padding: 0 3px; }
  .notes li { margin-bottom: 0; }
  .caution { margin-top: 4px; padding: 2px 8px; font-size: 6.2pt; }
  .caution h2 { font-size: 7pt; margin: 0; }
  .caution p { margin: 1px 0; }
  footer { margin-top: 5px; padding-top: 2px; font-size: 6.4pt; }
}
"""

_CSP = "default-src 'none'; style-src 'unsafe-inline'; img-src data:"


def page(title: str, body: str) -> str:
    """A complete HTML5 page: frame, styles and ``body`` (already HTML)."""
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


def footer() -> str:
    """The footer every page ends with: program, version and method."""
    return (f"<footer>Computed with warpwise {escape(__version__)}: six-node triangle finite "
            "elements on the drawn outline (Saint-Venant warping, Trefftz shear centre). "
            "Every value is shown with its unit.</footer>")


def warning_box(warnings: Sequence[str]) -> str:
    """A box of doubts about the input (empty text when there are none)."""
    if not warnings:
        return ""
    paras = "".join(f"<p>{escape(w)}</p>" for w in warnings)
    return f'<section class="caution" id="warnings"><h2>Warning</h2>{paras}</section>'


def caution_box() -> str:
    """The box of :data:`CAUTIONS`."""
    paras = "".join(f"<p>{escape(c)}</p>" for c in CAUTIONS)
    return f'<section class="caution" id="cautions"><h2>Cautions</h2>{paras}</section>'
