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


class Running:
    """A line on stderr while one long step runs: ``what ... 12 s``, from a timer thread.

    For a step that reports no counts (an analysis): the line appears only when stderr is a
    terminal and the step has taken longer than ``delay`` seconds, shows the seconds spent,
    and is cleared when the step ends. Use as a context manager; :meth:`step` names the part
    being worked on.

    Parameters
    ----------
    what : str
        The step, e.g. ``analysing plate.dxf``.
    stream : text stream, optional
        Where the line goes (default ``sys.stderr``).
    delay : float
        Seconds before the line first appears (default :data:`PROGRESS_DELAY`).
    """

    def __init__(self, what: str, stream: TextIO | None = None,
                 delay: float = PROGRESS_DELAY) -> None:
        import threading

        self.line = ProgressLine(what, 0, "", stream=stream, delay=delay)
        self.what = what
        self.start = time.perf_counter()
        self._stop = threading.Event()
        self._lock = threading.Lock()
        self._thread = threading.Thread(target=self._run, daemon=True) if self.line.on else None

    def step(self, what: str) -> None:
        """Name the part of the work now running (shown on the next refresh)."""
        self.what = what

    def _run(self) -> None:
        line = self.line
        if self._stop.wait(max(0.0, line.due - time.perf_counter())):
            return
        while not self._stop.is_set():
            with self._lock:
                text = f"{self.what} ... {time.perf_counter() - self.start:.0f} s"
                line.stream.write("\r" + text.ljust(line.width))
                line.stream.flush()
                line.width = max(line.width, len(text))
            self._stop.wait(1.0)

    def __enter__(self) -> Running:
        if self._thread is not None:
            self._thread.start()
        return self

    def __exit__(self, *exc: object) -> None:
        self._stop.set()
        if self._thread is not None:
            self._thread.join()
        with self._lock:
            self.line.close()
