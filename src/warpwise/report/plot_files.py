"""Figure files: PNG, SVG and PDF written atomically and reproducibly, and SVG for a web page.

Examples
--------
>>> from warpwise import analyse
>>> from warpwise.geometry.shapes import rectangle
>>> from warpwise.report.plot_section import figure_outline
>>> svg_text(figure_outline(analyse(rectangle(40.0, 20.0)), show_mesh=False)).startswith("<svg")
True

"""

from __future__ import annotations

import hashlib
import io
import re
from pathlib import Path

from matplotlib import rc_context
from matplotlib.figure import Figure

from ..errors import UsageError
from .files import atomic_write
from .plot_parts import plain_text

#: Raster resolution of PNG files, dots per inch.
PNG_DPI = 150
#: Formats :func:`save_figure` writes.
FORMATS = ("png", "svg", "pdf")


def _render(fig: Figure, fmt: str) -> bytes:
    """Render a figure to bytes in a reproducible way (no dates, fixed SVG ids)."""
    metadata = {"png": {"Software": "warpwise"}, "svg": {"Date": None, "Creator": "warpwise"},
                "pdf": {"CreationDate": None, "Creator": "warpwise"}}[fmt]
    buf = io.BytesIO()
    plain_text(fig)
    with rc_context({"svg.hashsalt": "warpwise", "svg.fonttype": "path"}):
        fig.savefig(buf, format=fmt, dpi=PNG_DPI, bbox_inches="tight", pad_inches=0.08,
                    metadata=metadata, facecolor="white")
    return buf.getvalue()


def figure_format(path: str | Path) -> str:
    """The picture format of an output path by its ending: ``png``, ``svg`` or ``pdf``.

    Raises
    ------
    UsageError
        For another ending (nothing is drawn or written).
    """
    fmt = Path(path).suffix.lower().lstrip(".")
    if fmt not in FORMATS:
        raise UsageError("a picture must be a .png, .pdf or .svg file", file=str(path))
    return fmt


def save_figure(fig: Figure, path: str | Path) -> None:
    """Write a figure to a PNG, SVG or PDF file (by its ending), atomically.

    Parameters
    ----------
    fig : matplotlib.figure.Figure
        From one of the ``figure_*`` functions.
    path : str or Path
        Target file ending in .png, .svg or .pdf; PNG at :data:`PNG_DPI` dots per inch.

    Raises
    ------
    UsageError
        For another ending or a folder that cannot be written (nothing is written).

    """
    fmt = figure_format(path)
    folder = Path(path).parent
    if not folder.is_dir():  # fail before the (slow) drawing
        raise UsageError(f"output folder {str(folder)!r} does not exist", file=str(path))
    atomic_write(path, _render(fig, fmt))


_PROLOG = re.compile(r"\A.*?(?=<svg[\s>])", re.S)
_METADATA = re.compile(r"<metadata>.*?</metadata>\s*", re.S)
_GLOBAL_STYLE = re.compile(r"<style type=\"text/css\">\*\{([^}]*)\}</style>")


def svg_text(fig: Figure, id_prefix: str | None = None) -> str:
    """The figure as an ``<svg>`` element for inline use in an HTML5 page.

    The XML prolog, document type and metadata are left out, the drawing's page-wide style
    rule is moved onto the root element (so it cannot restyle the page), and every id is
    given a prefix so that several pictures can share one page.

    Parameters
    ----------
    fig : matplotlib.figure.Figure
        The figure.
    id_prefix : str, optional
        Prefix of the ids; default one derived from the drawing's content.

    Returns
    -------
    str
        Text starting with ``<svg``, with a ``viewBox`` (scale it with CSS).

    """
    text = _render(fig, "svg").decode("utf-8")
    text = _PROLOG.sub("", text, count=1)
    text = _METADATA.sub("", text)
    rule = _GLOBAL_STYLE.search(text)
    if rule:
        text = text.replace(rule.group(0), "")
        style = " ".join(rule.group(1).split())
        text = text.replace("<svg ", f'<svg style="{style}" ', 1)
    if id_prefix is None:
        id_prefix = "w" + hashlib.sha1(text.encode("utf-8")).hexdigest()[:8] + "-"
    if not re.fullmatch(r"[A-Za-z][A-Za-z0-9_-]*", id_prefix):
        raise UsageError(f"an id prefix must be a letter then letters, digits, - or _, got {id_prefix!r}")
    text = re.sub(r'\bid="([^"]+)"', lambda m: f'id="{id_prefix}{m.group(1)}"', text)
    text = re.sub(r'(\b(?:xlink:)?href)="#([^"]+)"', lambda m: f'{m.group(1)}="#{id_prefix}{m.group(2)}"',
                  text)
    text = re.sub(r"url\(#([^)]+)\)", lambda m: f"url(#{id_prefix}{m.group(1)})", text)
    return text.strip()
