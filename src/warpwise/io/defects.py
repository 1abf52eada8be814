"""Defects of a drawing and the way lengths and points are written in messages.

Every reader step lists what it finds wrong as a :class:`Defect` (an :data:`ERROR` stops the
analysis, a :data:`WARNING` says what was repaired or left out); :func:`fmt`, :func:`fmt_point`
and :func:`plural` write numbers, points and counts the same way in every message.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

#: Severity of a defect that stops the analysis.
ERROR = "error"
#: Severity of a defect that was repaired or left out (the profile is still analysable).
WARNING = "warning"


def fmt(value: float) -> str:
    """A length for messages: six significant digits, no trailing zeros.

    Examples
    --------
    >>> fmt(0.000123456789), fmt(100.0)
    ('0.000123457', '100')

    """
    return f"{value:.6g}"


def fmt_point(p: Sequence[float]) -> str:
    """A point for messages, ``(x, y)``."""
    return f"({fmt(p[0])}, {fmt(p[1])})"


@dataclass(frozen=True)
class Defect:
    """One thing wrong with a drawing.

    Attributes
    ----------
    kind : str
        Short name: ``open chain``, ``branch``, ``self-crossing``, ``crossing loops``,
        ``duplicate``, ``zero length``, ``too short``, ``no area``, ``unreadable``,
        ``not flat``, ``truncated``, ``drawing frame`` (a warning: left out).
    text : str
        What is wrong, one line, drawing unit.
    where : tuple of (float, float)
        Points to mark on a plot, drawing unit.
    severity : str
        :data:`ERROR` (the profile cannot be analysed) or :data:`WARNING` (repaired or left out).
    layer : str or None
        Layer the defect is on, when it belongs to one.
    anchor : bool
        True when the first point of ``where`` completes the text as `` at (x, y)``.
    layers : tuple of str
        For defects between two loops, the layer of each.
    size : float or None
        A length the defect measures, drawing unit: for an open chain, the largest distance
        from one of its free ends to the nearest other free end (a joining tolerance above it
        joins them).
    """

    kind: str
    text: str
    where: tuple[tuple[float, float], ...] = ()
    severity: str = ERROR
    layer: str | None = None
    anchor: bool = False
    layers: tuple[str, ...] = ()
    size: float | None = None

    @property
    def fatal(self) -> bool:
        """True when the defect stops the analysis."""
        return self.severity == ERROR

    @property
    def point(self) -> tuple[float, float] | None:
        """The point that completes the text, if any."""
        return self.where[0] if self.anchor and self.where else None

    @property
    def message(self) -> str:
        """The full one-line message, with the point."""
        p = self.point
        return self.text if p is None else f"{self.text} at {fmt_point(p)}"


def plural(n: int, word: str) -> str:
    """A count and its noun, with an ``s`` unless the count is one.

    Examples
    --------
    >>> plural(1, "hole"), plural(3, "open chain")
    ('1 hole', '3 open chains')

    """
    return f"{n} {word}{'' if n == 1 else 's'}"
