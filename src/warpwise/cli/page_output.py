"""The ``--html`` pages of ``member`` and ``stress``: the objects their ``--json`` prints, as pages.

The page is built from the very JSON text the command prints with ``--json`` (read back into
plain data), so it shows the same numbers in the same units; the figure is drawn from the
solved results here, where the analysis is at hand.
"""

from __future__ import annotations

import argparse
import json

from ..report.outputs import STDOUT, Output, is_stdout


def page_outputs(args: argparse.Namespace) -> list[Output]:
    """The ``--html`` output of a command; ``-`` prints the page instead of the report.

    The page then takes standard output, so ``--json`` with ``--html -`` is refused as two
    outputs on standard output (:func:`warpwise.report.outputs.check_outputs`).
    """
    html = getattr(args, "html", None)
    out = [Output("--html", html, what="a file name ending in .html")]
    if html is not None and is_stdout(html) and args.json:
        out.append(Output("--json", STDOUT))
    return out


def prints_report(args: argparse.Namespace) -> bool:
    """Whether the text or JSON report goes to standard output (not when a page or CSV does)."""
    return not any(path and is_stdout(path) for path in (getattr(args, "html", None),
                                                          getattr(args, "csv", None)))


def member_html(json_text: str, figure, warnings: tuple[str, ...]) -> str:
    """The page of a member from its JSON text and the figure of phi and B (or None)."""
    from ..report.member_page import member_page
    from ..report.plot_files import svg_text

    svg = None if figure is None else svg_text(figure, "member-")
    return member_page(json.loads(json_text), svg=svg, warnings=warnings)


def stress_html(json_text: str, figure=None) -> str:
    """The page of the stresses from the JSON text of ``stress`` and a picture (or None)."""
    from ..report.plot_files import svg_text
    from ..report.stress_page import stress_page

    svg = None if figure is None else svg_text(figure, "stress-")
    return stress_page(json.loads(json_text), svg=svg)
