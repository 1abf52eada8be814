"""Dimension checks of the parametric shapes: each failure is a one-line ProfileError.

The shape functions check every dimension before building anything: a length must be a finite
positive number, a radius a finite number >= 0 (0 is a sharp corner), and a combination that
cannot be drawn (a web wider than the flange, a radius that does not fit...) is refused with a
message that names the shape and the dimensions involved.
"""

from __future__ import annotations

import math
from collections.abc import Mapping

import numpy as np

from ...errors import ProfileError


def check_positive(**values: float) -> None:
    """Refuse any dimension that is not a finite positive number (message without a shape name).

    Parameters
    ----------
    **values : float
        Dimensions by name, drawing unit.

    Raises
    ------
    ProfileError
        ``dimension NAME must be positive, got VALUE`` for the first one that is not.

    Examples
    --------
    >>> check_positive(b=2.0, h=-1.0)
    Traceback (most recent call last):
    ...
    warpwise.errors.ProfileError: dimension h must be positive, got -1.0

    """
    for name, v in values.items():
        if not (np.isfinite(v) and v > 0):
            raise ProfileError(f"dimension {name} must be positive, got {v}")


def _number(label: str, name: str, value: object) -> float:
    """``value`` as a finite float, or a ProfileError naming the shape and the parameter."""
    try:
        v = float(value)  # type: ignore[arg-type]
    except (TypeError, ValueError):
        raise ProfileError(f"{label}: {name} must be a number, got {value!r}") from None
    if not math.isfinite(v):
        raise ProfileError(f"{label}: {name} must be a finite number, got {value!r}")
    return v


def check_sizes(label: str, lengths: Mapping[str, object],
                radii: Mapping[str, object] | None = None) -> list[float]:
    """Check lengths (positive) and radii (zero or positive, 0 a sharp corner) of a shape.

    Parameters
    ----------
    label : str
        Shape named in messages.
    lengths : mapping of str to object
        Lengths by parameter name, drawing unit; each must be a finite number > 0.
    radii : mapping of str to object, optional
        Radii by parameter name, drawing unit; each must be a finite number >= 0.

    Returns
    -------
    list of float
        The lengths, then the radii, in the order given, drawing unit.

    Raises
    ------
    ProfileError
        For the first value that is not a number, not finite, or out of its range.

    Examples
    --------
    >>> check_sizes("angle", {"h": 80, "b": "60"}, {"r": 0})
    [80.0, 60.0, 0.0]
    >>> check_sizes("hexagon", {"s": 0})
    Traceback (most recent call last):
    ...
    warpwise.errors.ProfileError: hexagon: s must be positive, got 0
    >>> check_sizes("tee", {"h": 100}, {"r": -1})
    Traceback (most recent call last):
    ...
    warpwise.errors.ProfileError: tee: r must be zero or positive, got -1

    """
    out = []
    for zero_allowed, values in ((False, lengths), (True, radii or {})):
        for name, value in values.items():
            v = _number(label, name, value)
            if v < 0 or (v == 0 and not zero_allowed):
                need = "zero or positive" if zero_allowed else "positive"
                raise ProfileError(f"{label}: {name} must be {need}, got {v:g}")
            out.append(v)
    return out


def require(ok: bool, label: str, message: str) -> None:
    """Raise ``ProfileError(f"{label}: {message}")`` unless ``ok``.

    Parameters
    ----------
    ok : bool
        The condition the dimensions must meet.
    label : str
        Shape named in the message.
    message : str
        What is wrong, with the dimensions involved (drawing unit).

    Raises
    ------
    ProfileError
        When ``ok`` is false.

    """
    if not ok:
        raise ProfileError(f"{label}: {message}")
