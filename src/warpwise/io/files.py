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

from pathlib import Path

from ..errors import InputFileError

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
