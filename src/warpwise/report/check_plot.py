"""The plot of ``warpwise check``: the outline of a drawing with every defect marked.

:func:`plot_report` draws a :class:`~warpwise.io.check.CheckReport` with matplotlib (Agg
backend) and writes it atomically as PNG, PDF or SVG; the numbers beside the marks are those of
the defects in the printed report (:func:`~warpwise.io.check.format_report`).
"""

from __future__ import annotations

import io
from pathlib import Path

import numpy as np

from ..io.check import CheckReport
from ..io.defects import ERROR, plural
from .outputs import atomic_write
from .plot_files import figure_format
from .plot_parts import plain_text


def plot_report(report: CheckReport, out: str | Path) -> None:
    """Draw the outline with every defect marked and write it to ``out`` (PNG, PDF or SVG).

    Solid boundaries are drawn dark blue, holes orange, open chains red, open chains on layers
    left out grey; errors are red crosses and warnings orange circles, numbered as in the
    report, and each part is labelled with its number.

    Parameters
    ----------
    report : CheckReport
        From :func:`~warpwise.io.check.check_file`.
    out : str or Path
        Image file; written atomically.

    Raises
    ------
    UsageError
        For an ending other than .png, .pdf or .svg, or a folder that cannot be written.

    """
    import matplotlib

    matplotlib.use("Agg")
    from matplotlib.figure import Figure

    fmt_name = figure_format(out)
    fig = Figure(figsize=(9, 7), dpi=120)
    ax = fig.add_subplot()
    for pts in report.ignored_paths:
        ax.plot(pts[:, 0], pts[:, 1], color="0.7", lw=0.6)
    for pts, d in zip(report.outline, report.depth, strict=True):
        closed = np.vstack([pts, pts[:1]])
        ax.plot(closed[:, 0], closed[:, 1], color="tab:orange" if d % 2 else "navy", lw=1.0)
    for pts in report.open_paths:
        ax.plot(pts[:, 0], pts[:, 1], color="red", lw=2.0)
    for p in report.parts:
        x0, y0, x1, y1 = p.bounds
        ax.annotate(f"part {p.number}", (x0, y1), fontsize=8, color="navy",
                    xytext=(2, 2), textcoords="offset points")
    for k, d in enumerate(report.defects, start=1):
        if not d.where:
            continue
        pts = np.asarray(d.where, dtype=float)
        error = d.severity == ERROR
        ax.plot(pts[:, 0], pts[:, 1], "x" if error else "o", ms=9 if error else 7, mew=2,
                mfc="none", color="red" if error else "darkorange")
        ax.annotate(str(k), tuple(pts[0]), fontsize=8, color="red" if error else "darkorange",
                    xytext=(4, 4), textcoords="offset points")
    ax.set_aspect("equal", adjustable="datalim")
    ax.set_xlabel(f"x ({report.unit})")
    ax.set_ylabel(f"y ({report.unit})")
    state = "analysable" if report.ok else "not analysable"
    ax.set_title(f"{Path(report.source).name}: {state}; {plural(len(report.errors), 'error')}, "
                 f"{plural(len(report.warnings), 'warning')} (numbers as in the report)", fontsize=9)
    ax.grid(True, lw=0.3, alpha=0.5)
    buf = io.BytesIO()
    plain_text(fig)
    fig.savefig(buf, format=fmt_name)
    atomic_write(out, buf.getvalue())


__all__ = ["plot_report"]
