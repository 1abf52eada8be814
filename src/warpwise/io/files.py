r"""The checks every reader makes on its input file before it looks at the contents.

:func:`read_input` refuses a missing file, a folder, a file over :data:`MAX_FILE_BYTES`, one
that cannot be read and an empty one; :func:`refuse_binary` refuses data with NUL bytes where
a text file is expected.

Examples
--------
>>> refuse_binary(b"0 0\n1 0\n", "a.txt", "a text outline file")
>>> refuse_binary(b"\x00\x01", "a.txt", "a text outline file")
Traceback (most recent call last):
...
warpwise.errors.InputFileError: a.txt: is a binary file, not a text outline file

"""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

from ..errors import InputFileError
from ..geometry.profile import LENGTH_UNITS, Profile

#: Largest input file accepted, bytes.
MAX_FILE_BYTES = 50 * 1024 * 1024


def read_input(path: str | Path) -> bytes:
    """Bytes of an input file, after the checks every reader shares.

    Raises
    ------
    InputFileError
        Missing file, a folder, a file over :data:`MAX_FILE_BYTES`, unreadable or empty.
    """
    p = Path(path)
    name = str(path)
    if not p.exists():
        raise InputFileError("file not found", file=name)
    if p.is_dir():
        raise InputFileError("is a folder, not a file", file=name)
    size = p.stat().st_size
    if size > MAX_FILE_BYTES:
        raise InputFileError(
            f"file is {size / 1e6:.1f} MB, over the {MAX_FILE_BYTES / 1e6:.0f} MB limit", file=name)
    try:
        data = p.read_bytes()
    except OSError as exc:
        raise InputFileError(f"cannot be read ({exc.strerror})", file=name) from None
    if not data.strip():
        raise InputFileError("file is empty", file=name)
    return data


def refuse_binary(data: bytes, name: str, expected: str, head: int | None = None) -> None:
    """Refuse data holding a NUL byte (in its first ``head`` bytes, default anywhere).

    Parameters
    ----------
    data : bytes
        The file's contents.
    name : str
        File name, for the message.
    expected : str
        What the file should be, e.g. ``a DXF drawing``.
    head : int, optional
        Look only at this many bytes from the start.

    """
    if b"\x00" in (data if head is None else data[:head]):
        raise InputFileError(f"is a binary file, not {expected}", file=name)


#: Sizes (largest dimension, mm) outside which a section drawn without a unit is probably not
#: in millimetres: below 0.1 mm, above 10 m.
PLAUSIBLE_MM = (0.1, 10_000.0)


def check_assumed_size(profile: Profile) -> Profile:
    """The profile, with a warning when its size is implausible for the assumed millimetres.

    Call it only for a profile whose unit was assumed (neither the file nor ``--units`` gave
    one).

    Examples
    --------
    >>> from warpwise.geometry.shapes import rectangle
    >>> check_assumed_size(rectangle(0.05, 0.02)).warnings  # doctest: +NORMALIZE_WHITESPACE
    ('the section is 0.05 mm across, implausible for the assumed millimetres: give its unit
    with --units (mm, cm, m, in, ft)',)
    """
    lo, hi = PLAUSIBLE_MM
    size = profile.size
    if lo <= size <= hi:
        return profile
    text = (f"the section is {size:.6g} mm across, implausible for the assumed millimetres: "
            f"give its unit with --units ({', '.join(LENGTH_UNITS)})")
    return replace(profile, warnings=(*profile.warnings, text))
