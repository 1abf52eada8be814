"""Command line: ``warpwise props``, ``stress``, ``catalogue``, ``plot``, ``check`` and ``shapes``.

A thin shell over the Python API: :mod:`.options` builds the parser and turns its options into
:class:`~warpwise.io.options.ReadOptions` and :class:`~warpwise.properties.run.AnalysisOptions`,
:mod:`.commands` runs each command, :mod:`.stress_output` prints stress results. Every user
error ends as one line on stderr and a non-zero exit code (1 for bad input or a failed
analysis, 2 for a bad command line); no traceback is shown unless ``WARPWISE_DEBUG=1`` is set.
"""

from .commands import EXIT_INPUT, EXIT_INTERNAL, EXIT_USAGE, main
from .options import build_parser

__all__ = ["EXIT_INPUT", "EXIT_INTERNAL", "EXIT_USAGE", "build_parser", "main"]
