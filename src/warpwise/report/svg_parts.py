"""The pieces of the SVG pictures on a datasheet: frame, axes, marks, legend, colour bar, paths.

The pictures are SVG text written straight from the arrays of the analysis, without a
plotting library: the frame maps drawing coordinates to the picture (equal scale, y up), the
axes are labelled in the report's length unit, and paths of many points are formatted in one
numpy pass (in tenths of a pixel, inside a group scaled by 0.1). Every mark sits at its true
position and carries its drawing coordinates (``data-x``, ``data-y``, report units); the
colour bar carries the range of the field it shows (``data-min``, ``data-max``).

Examples
--------
>>> ticks(0.0, 17.0).tolist(), tick_text(0.30000000000000004, 0.1)
([0.0, 2.5, 5.0, 7.5, 10.0, 12.5, 15.0], '0.3')
>>> path_data(np.array([[0.0, 0.0], [1.0, 0.0], [0.0, 1.5]]), np.array([0, 3]))
'M0,0 10,0 0,15Z'
"""

from __future__ import annotations

import math
import textwrap
from collections.abc import Sequence
from html import escape

import numpy as np

from .picture_parts import EDGE_COLOUR, fmt

#: Fonts of the pictures (those of the page).
FONT = '"Segoe UI", "Helvetica Neue", Arial, "Liberation Sans", sans-serif'
#: Colour ramps, (position, colour) from the lowest to the highest value: signed fields
#: (warping, normal stress; white at zero) and magnitudes (shear stress, from zero).
SIGNED_RAMP = ((-1.0, "#23508a"), (-0.5, "#8bb0d3"), (0.0, "#f6f5f1"), (0.5, "#eaa27b"),
               (1.0, "#9c2727"))
MAGNITUDE_RAMP = ((0.0, "#fcf6d8"), (0.3, "#f7d67a"), (0.6, "#ea8f3d"), (0.85, "#c8462b"),
                  (1.0, "#8c1d22"))
#: Layout, pixels: axes margin at left, right margin without and with a colour bar, a line of
#: title, room for the x axis below the plot, a line of legend, the largest plot height.
LEFT, RIGHT, RIGHT_BAR = 64.0, 18.0, 128.0
TITLE_LINE, BELOW_PLOT, LEGEND_LINE, MAX_PLOT_HEIGHT = 17.0, 44.0, 18.0, 880.0
#: Colour of grid lines; of axis lines and tick labels; of the title.
GRID_COLOUR, AXIS_COLOUR, TITLE_COLOUR = "#d6dde3", "#56646f", "#33414d"


def num(v: float) -> str:
    """A pixel coordinate as text (two decimals at most)."""
    return f"{v:.2f}".rstrip("0").rstrip(".") or "0"


def ramp_colours(ramp: Sequence[tuple[float, str]], u: np.ndarray) -> list[str]:
    """Colours ``#rrggbb`` at positions ``u`` of a ramp (linear between its colours)."""
    at = np.array([p for p, _ in ramp])
    rgb = np.array([[int(c[k:k + 2], 16) for k in (1, 3, 5)] for _, c in ramp], dtype=float)
    u = np.clip(np.asarray(u, dtype=float), at[0], at[-1])
    mixed = np.column_stack([np.interp(u, at, rgb[:, k]) for k in range(3)])
    return [f"#{r:02x}{g:02x}{b:02x}" for r, g, b in np.rint(mixed).astype(int)]


def nice_step(span: float, count: int) -> float:
    """The smallest step of 1, 2, 2.5 or 5 times a power of ten giving at most ``count`` steps."""
    if not span > 0:
        return 1.0
    raw = span / count
    power = 10.0 ** math.floor(math.log10(raw))
    for m in (1.0, 2.0, 2.5, 5.0, 10.0):
        if m * power >= raw * (1 - 1e-9):
            return m * power
    return 10.0 * power


def ticks(lo: float, hi: float, count: int = 7) -> np.ndarray:
    """Round numbers from ``lo`` to ``hi`` (at most ``count`` + 1 of them)."""
    step = nice_step(hi - lo, count)
    first, last = math.ceil(lo / step - 1e-9), math.floor(hi / step + 1e-9)
    return np.arange(first, last + 1) * step


def tick_text(v: float, step: float) -> str:
    """A tick value as text, rounded to its step (no round-off digits, no minus zero)."""
    digits = max(0, -math.floor(math.log10(step) + 1e-9) + 1) if step > 0 else 6
    text = f"{round(v, digits):.{digits}f}".rstrip("0").rstrip(".") if digits else f"{v:.0f}"
    return "0" if text in ("-0", "") else text.replace("-", "\u2212")


def path_data(points: np.ndarray, start: np.ndarray, closed: bool = True) -> str:
    """SVG path data of polylines (rings when ``closed``) in tenths of a pixel.

    ``points`` (m, 2) holds every polyline's points in pixels, one after the other; ``start``
    (r + 1,) the index of each one's first point and, last, m. For a group scaled by 0.1.
    """
    if len(points) == 0:
        return ""
    q = np.rint(np.asarray(points, dtype=float) * 10.0).astype(np.int64)
    tok = np.char.add(np.char.add(q[:, 0].astype(str), ","), q[:, 1].astype(str))
    head = np.zeros(len(q), dtype=bool)
    head[start[:-1]] = True
    tok = np.where(head, np.char.add("M", tok), tok)
    if closed:
        tail = np.zeros(len(q), dtype=bool)
        tail[start[1:] - 1] = True
        tok = np.where(tail, np.char.add(tok, "Z"), tok)
    return " ".join(tok.tolist())


def simplify_rings(points: np.ndarray, start: np.ndarray, tolerance: float = 0.08,
                   passes: int = 4) -> tuple[np.ndarray, np.ndarray]:
    """Rings without the points that lie within ``tolerance`` (pixels) of their neighbours' chord.

    Band outlines cross every triangle they pass through, so a straight stretch of a band's
    edge holds a point per triangle; on the picture those points are in line. Every other
    point of a ring is looked at in each pass (so no two neighbours go in one pass; the first
    point stays), and a ring keeps at least three points.

    Examples
    --------
    >>> pts = np.array([[0.0, 0.0], [1.0, 0.0], [2.0, 0.001], [3.0, 0.0], [3.0, 2.0], [0.0, 2.0]])
    >>> p, s = simplify_rings(pts, np.array([0, 6]))
    >>> p.tolist(), s.tolist()
    ([[0.0, 0.0], [3.0, 0.0], [3.0, 2.0], [0.0, 2.0]], [0, 4])
    """
    points = np.asarray(points, dtype=float)
    ring = np.repeat(np.arange(len(start) - 1), np.diff(start))
    keep = np.ones(len(points), dtype=bool)
    for p in range(passes):
        idx = np.flatnonzero(keep)
        rid = ring[idx]
        first = np.r_[True, rid[1:] != rid[:-1]]
        last = np.r_[rid[1:] != rid[:-1], True]
        pos = np.arange(len(idx))
        ring_first = np.maximum.accumulate(np.where(first, pos, 0))
        ring_last = np.minimum.accumulate(np.where(last, pos, len(idx))[::-1])[::-1]
        a = points[idx[np.where(first, ring_last, pos - 1)]]
        c = points[idx[np.where(last, ring_first, pos + 1)]]
        ab, ac = points[idx] - a, c - a
        chord = np.maximum(np.hypot(ac[:, 0], ac[:, 1]), 1e-12)
        off = np.abs(ac[:, 0] * ab[:, 1] - ac[:, 1] * ab[:, 0]) / chord
        count = np.bincount(rid, minlength=len(start) - 1)
        drop = (off < tolerance) & (pos % 2 == p % 2) & (count[rid] >= 5) & ~first
        keep[idx[drop]] = False
    kept = np.bincount(ring[keep], minlength=len(start) - 1)
    return points[keep], np.concatenate([[0], np.cumsum(kept)])


def text(x: float, y: float, words: str, *, size: float = 11.0, anchor: str = "start",
         colour: str = AXIS_COLOUR, extra: str = "") -> str:
    """One line of text at a pixel position (escaped)."""
    return (f'<text x="{num(x)}" y="{num(y)}" font-size="{size:g}" fill="{colour}" '
            f'text-anchor="{anchor}"{extra}>{escape(words)}</text>')


class Frame:
    """Where the drawing goes in the picture: equal scale, y up, axes at left and below.

    Parameters
    ----------
    extent : tuple of float
        Drawing coordinates (x0, y0, x1, y1) the plot shows.
    width : float
        Width of the picture, pixels.
    title_lines : int
        Lines of title above the plot.
    colour_bar : bool
        Leave room for a colour bar at the right.
    """

    def __init__(self, extent: tuple[float, float, float, float], width: float, *,
                 title_lines: int, colour_bar: bool) -> None:
        x0, y0, x1, y1 = extent
        self.extent = extent
        self.width = width
        self.left = LEFT
        self.top = 10.0 + TITLE_LINE * title_lines + 8.0
        room = width - LEFT - (RIGHT_BAR if colour_bar else RIGHT)
        dx, dy = max(x1 - x0, 1e-300), max(y1 - y0, 1e-300)
        self.scale = min(room / dx, MAX_PLOT_HEIGHT / dy)
        self.w, self.h = dx * self.scale, dy * self.scale

    def px(self, xy: np.ndarray) -> np.ndarray:
        """Pixel positions (m, 2) of drawing points (m, 2)."""
        xy = np.asarray(xy, dtype=float).reshape(-1, 2)
        x0, _, _, y1 = self.extent
        return np.column_stack([self.left + (xy[:, 0] - x0) * self.scale,
                                self.top + (y1 - xy[:, 1]) * self.scale])

    def point(self, xy: Sequence[float]) -> tuple[float, float]:
        """Pixel position of one drawing point."""
        x, y = self.px(np.asarray(xy, dtype=float))[0]
        return float(x), float(y)

    @property
    def bottom(self) -> float:
        """Pixel row below the plot."""
        return self.top + self.h


def axes(frame: Frame, k: float, unit: str) -> str:
    """Grid, tick labels and axis titles in the report's length unit (``k`` per drawing unit)."""
    x0, y0, x1, y1 = frame.extent
    out = ['<g class="axes">']
    grid, spine = [], []
    left, top, right, bottom = frame.left, frame.top, frame.left + frame.w, frame.bottom
    for axis, lo, hi in (("x", x0, x1), ("y", y0, y1)):
        values = ticks(lo * k, hi * k, 7 if axis == "x" else 8)
        step = nice_step((hi - lo) * k, 7 if axis == "x" else 8)
        for v in values:
            if axis == "x":
                p = frame.point((v / k, y0))[0]
                grid.append(f"M{num(p)} {num(top)}V{num(bottom)}")
                spine.append(f"M{num(p)} {num(bottom)}v4")
                out.append(text(p, bottom + 15, tick_text(v, step), anchor="middle",
                                extra=f' class="tick-x" data-value="{float(v)!r}"'))
            else:
                p = frame.point((x0, v / k))[1]
                grid.append(f"M{num(left)} {num(p)}H{num(right)}")
                spine.append(f"M{num(left)} {num(p)}h-4")
                out.append(text(left - 7, p, tick_text(v, step), anchor="end",
                                extra=f' class="tick-y" data-value="{float(v)!r}" '
                                      'dominant-baseline="central"'))
    out.insert(1, f'<path d="{" ".join(grid)}" stroke="{GRID_COLOUR}" stroke-width="0.6" fill="none"/>')
    out.append(f'<path d="M{num(left)} {num(top)}V{num(bottom)}H{num(right)} {" ".join(spine)}" '
               f'stroke="{AXIS_COLOUR}" stroke-width="0.8" fill="none"/>')
    out.append(text(left + frame.w / 2, bottom + 32, f"x ({unit})", size=11.5, anchor="middle"))
    out.append(text(0, 0, f"y ({unit})", size=11.5, anchor="middle",
                    extra=f' transform="translate(14 {num(top + frame.h / 2)}) rotate(-90)"'))
    out.append("</g>")
    return "".join(out)


# ----------------------------------------------------------------------------------------------
# marks (drawn about the origin, put in place with a translation)

def circle(r: float, fill: str, stroke: str = "#ffffff", width: float = 1.0) -> str:
    """A round mark."""
    return f'<circle r="{r:g}" fill="{fill}" stroke="{stroke}" stroke-width="{width:g}"/>'


def diamond(r: float, fill: str) -> str:
    """A diamond mark (the shear centre)."""
    return (f'<path d="M0 {-r:g}L{r:g} 0 0 {r:g}{-r:g} 0Z" fill="{fill}" stroke="#ffffff" '
            'stroke-width="1"/>')


def star(r: float, fill: str) -> str:
    """A five-pointed star (the largest value)."""
    a = np.pi / 2 + np.arange(10) * np.pi / 5
    rr = np.where(np.arange(10) % 2 == 0, r, 0.42 * r)
    pts = " ".join(f"{num(x)},{num(y)}" for x, y in zip(rr * np.cos(a), -rr * np.sin(a), strict=True))
    return f'<polygon points="{pts}" fill="{fill}" stroke="#ffffff" stroke-width="0.9"/>'


def cross(r: float, colour: str) -> str:
    """An X mark (a sharp re-entrant corner)."""
    return (f'<path d="M{-r:g} {-r:g}L{r:g} {r:g}M{-r:g} {r:g}L{r:g} {-r:g}" stroke="#ffffff" '
            f'stroke-width="4.2" stroke-linecap="round"/><path d="M{-r:g} {-r:g}L{r:g} {r:g}'
            f'M{-r:g} {r:g}L{r:g} {-r:g}" stroke="{colour}" stroke-width="2.4" stroke-linecap="round"/>')


def line_sample(colour: str, width: float = 1.4, dash: str = "") -> str:
    """A short line for the legend."""
    dashes = f' stroke-dasharray="{dash}"' if dash else ""
    return f'<path d="M-11 0H11" stroke="{colour}" stroke-width="{width:g}"{dashes}/>'


def swatch(colour: str) -> str:
    """A filled square for the legend (a material)."""
    return (f'<rect x="-8" y="-6" width="16" height="12" fill="{colour}" stroke="{EDGE_COLOUR}" '
            'stroke-width="0.8"/>')


def mark(frame: Frame, xy: Sequence[float], shape: str, name: str, k: float, label: str = "",
         label_at: tuple[float, float] = (7.0, -6.0), colour: str = EDGE_COLOUR) -> str:
    """A mark at a drawing point, with its class, its coordinates (report units) and a letter."""
    x, y = frame.point(xy)
    letter = text(label_at[0], label_at[1], label, size=13, colour=colour,
                  extra=' font-weight="bold"') if label else ""
    return (f'<g class="mark {name}" transform="translate({num(x)} {num(y)})" '
            f'data-x="{float(xy[0]) * k!r}" data-y="{float(xy[1]) * k!r}">{shape}{letter}</g>')


def legend_lines(entries: Sequence[tuple[str, str]], room: float) -> list[tuple[str, str]]:
    """Legend entries as lines of at most ``room`` pixels (a long entry goes on, unmarked)."""
    width = max(20, int((room - 30) / 6.4))  # characters of 11.5 px text
    out = []
    for shape, words in entries:
        for k, line in enumerate(textwrap.wrap(words, width) or [""]):
            out.append((shape if k == 0 else "", line))
    return out


def legend(lines: Sequence[tuple[str, str]], x: float, y: float) -> str:
    """Legend lines below the plot: (mark, words) each (:func:`legend_lines`)."""
    out = ['<g class="legend">']
    for row, (shape, words) in enumerate(lines):
        yy = y + row * LEGEND_LINE
        if shape:
            out.append(f'<g transform="translate({num(x + 12)} {num(yy)})">{shape}</g>')
        out.append(text(x + 30, yy, words, size=11.5, colour="#1f2a33",
                        extra=' dominant-baseline="central"'))
    out.append("</g>")
    return "".join(out)


# ----------------------------------------------------------------------------------------------
# colour scale

def band_levels(lo: float, hi: float) -> np.ndarray:
    """Band edges: the field's range ``lo`` to ``hi``, cut at round numbers in between."""
    if not hi - lo > 1e-12 * max(abs(lo), abs(hi), 1e-300):
        half = 1e-3 * abs(hi) if hi else 1.0  # a constant (or zero) field: one band
        return np.array([lo - half, hi + half])
    inner = ticks(lo, hi, 16)
    keep = (inner > lo + 0.02 * (hi - lo) / 16) & (inner < hi - 0.02 * (hi - lo) / 16)
    return np.concatenate([[lo], inner[keep], [hi]])


def colour_bar(frame: Frame, levels: np.ndarray, colours: Sequence[str], label: str,
               field: tuple[float, float], above: float | None = None) -> str:
    """A colour bar at the right of the plot: bands, round values, the ends, the quantity.

    ``field`` is the (least, largest) value shown, written at the ends; ``above`` the largest
    value of the field when it goes beyond the top of the scale (drawn as a point on top).
    """
    lo, hi = float(levels[0]), float(levels[-1])
    x, top = frame.left + frame.w + 16.0, frame.top
    height = max(frame.h, 160.0)

    def y(v: float) -> float:
        return top + height * (hi - v) / (hi - lo)

    rects = "".join(f'<rect x="{num(x)}" y="{num(y(b))}" width="14" height="{num(y(a) - y(b) + 0.3)}" '
                    f'fill="{c}"/>' for a, b, c in zip(levels[:-1], levels[1:], colours, strict=True))
    out = [f'<g class="colour-bar" data-min="{float(field[0])!r}" data-max="{float(field[1])!r}">', rects,
           f'<rect x="{num(x)}" y="{num(top)}" width="14" height="{num(height)}" fill="none" '
           f'stroke="{AXIS_COLOUR}" stroke-width="0.8"/>']
    if above is not None:
        out.append(f'<path class="beyond" d="M{num(x)} {num(top)}l7 -10 7 10Z" fill="{colours[-1]}" '
                   f'stroke="{AXIS_COLOUR}" stroke-width="0.8" data-max="{float(above)!r}"/>')
    inner = levels[1:-1]
    step = nice_step(hi - lo, 16)
    if len(inner) > 7:
        every = int(np.ceil(len(inner) / 7))
        inner = inner[np.abs(np.round(inner / step)) % every == 0]
    if field[0] == field[1]:  # a constant field: its one value, mid-bar
        labels = [((lo + hi) / 2, fmt(field[0]).replace("-", "\u2212"), "bar-end")]
    else:
        labels = [(v, tick_text(v, step), "bar-tick") for v in inner
                  if abs(y(v) - y(lo)) > 12 and abs(y(v) - y(hi)) > 12]
        big = max(abs(field[0]), abs(field[1]))
        labels += [(v, fmt(f if abs(f) > 1e-9 * big else 0.0).replace("-", "\u2212"), "bar-end")
                   for v, f in ((lo, field[0]), (hi, field[1]))]  # round-off of zero shown as 0
    for v, words, kind in labels:
        yy = y(v)
        out.append(f'<path d="M{num(x + 14)} {num(yy)}h4" stroke="{AXIS_COLOUR}" stroke-width="0.8"/>')
        out.append(text(x + 21, yy, words, size=10.5,
                        extra=f' class="{kind}" dominant-baseline="central"'))
    widest = max(len(w) for _, w, _ in labels)
    out.append(text(0, 0, label, size=11.5, anchor="middle",
                    extra=f' transform="translate({num(x + 30 + 6.3 * widest)} '
                          f'{num(top + height / 2)}) rotate(90)"'))
    out.append("</g>")
    return "".join(out)
