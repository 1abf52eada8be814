"""Progress on a terminal: the bar every long step draws, and a line that shows it when needed.

:func:`bar` draws how far a count has come (the catalogue's progress and the reading of a big
drawing draw the same bar); :class:`ProgressLine` writes it on stderr, only when stderr is a
terminal and only once the step has taken longer than a few seconds, and clears it at the end.

Examples
--------
>>> bar(3, 10, width=10)
'[###.......]'
"""

from __future__ import annotations

import sys
import time
from typing import TextIO

#: Seconds a step runs before its progress line appears.
PROGRESS_DELAY = 2.0

#: Seconds between two updates of a progress line.
_REFRESH = 0.25


def bar(done: int, total: int, width: int = 30) -> str:
    """A bar of ``width`` characters, filled as far as ``done`` of ``total`` (counts).

    Examples
    --------
    >>> bar(0, 4, width=4), bar(4, 4, width=4), bar(9, 0, width=4)
    ('[....]', '[####]', '[####]')
    """
    fill = width if total <= 0 else int(width * min(max(done, 0), total) / total)
    return f"[{'#' * fill}{'.' * (width - fill)}]"


class ProgressLine:
    """One line on stderr telling how far a long step is: ``what: [###...] done/total unit``.

    Parameters
    ----------
    what : str
        The step, e.g. ``reading plate.dxf``.
    total : int
        The count the step goes to.
    unit : str
        What is counted, e.g. ``entities``.
    stream : text stream, optional
        Where the line goes (default ``sys.stderr``); nothing is written unless it is a
        terminal.
    delay : float
        Seconds before the line first appears (default :data:`PROGRESS_DELAY`).
    """

    def __init__(self, what: str, total: int, unit: str, stream: TextIO | None = None,
                 delay: float = PROGRESS_DELAY) -> None:
        self.stream = sys.stderr if stream is None else stream
        try:
            self.on = bool(self.stream.isatty())
        except (AttributeError, ValueError):  # no stream, or a closed one
            self.on = False
        self.what, self.total, self.unit = what, total, unit
        self.due = time.perf_counter() + delay
        self.width = 0  # characters of the line shown (0: none yet)

    def update(self, done: int) -> None:
        """Show ``done`` of the total, if the step has run long enough (cheap otherwise)."""
        if not self.on:
            return
        now = time.perf_counter()
        if now < self.due:
            return
        self.due = now + _REFRESH
        text = f"{self.what}: {bar(done, self.total)} {done:,}/{self.total:,} {self.unit}"
        self.stream.write("\r" + text.ljust(self.width))
        self.stream.flush()
        self.width = max(self.width, len(text))

    def close(self) -> None:
        """Clear the line, if one was shown."""
        if self.width:
            self.stream.write("\r" + " " * self.width + "\r")
            self.stream.flush()
            self.width = 0
