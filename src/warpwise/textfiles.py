r"""Input files read as bytes with the checks every reader shares, and text decoded by one rule.

:func:`read_input` refuses a missing file, a folder, a file over :data:`MAX_FILE_BYTES`, one
that cannot be read and an empty one; :func:`refuse_binary` refuses data with NUL bytes where
a text file is expected; :func:`decode_text` decodes UTF-8 (with or without a byte-order mark)
and UTF-16 (little- or big-endian, with its byte-order mark), as Windows editors save text, and
names the encoding when the bytes are not such text; :func:`read_text` is the three in one, for
the coordinate outlines, the materials tables and the catalogue manifests alike.

This module sits below every stage (it needs only the errors), so the materials tables, which
rank below the readers, use it too.

Examples
--------
>>> refuse_binary(b"0 0\n1 0\n", "a.txt", "a text outline file")
>>> refuse_binary(b"\x00\x01", "a.txt", "a text outline file")
Traceback (most recent call last):
...
warpwise.errors.InputFileError: a.txt: is a binary file, not a text outline file
>>> decode_text("units: mm\n".encode("utf-16"), "a.txt", "a text outline file")
('units: mm\n', 'UTF-16 LE')
>>> decode_text(b"\xef\xbb\xbfunits: mm\n", "a.txt", "a text outline file")
('units: mm\n', 'UTF-8 with byte-order mark')
>>> decode_text(b"# Stahl S235 gr\xf6\xdfer\n", "a.txt", "a text outline file")
Traceback (most recent call last):
...
warpwise.errors.InputFileError: a.txt: is not UTF-8 text (byte 0xf6 at offset 15, line 1): save it as UTF-8

"""

from __future__ import annotations

from pathlib import Path

from .errors import InputFileError

#: Largest input file accepted, bytes.
MAX_FILE_BYTES = 50 * 1024 * 1024

#: Byte-order marks read, longest first (UTF-32's starts like UTF-16 LE's): mark -> (codec,
#: name in notes and messages); a codec of None is an encoding refused by its name.
BYTE_ORDER_MARKS = ((b"\xff\xfe\x00\x00", None, "UTF-32"), (b"\x00\x00\xfe\xff", None, "UTF-32"),
                    (b"\xef\xbb\xbf", "utf-8", "UTF-8 with byte-order mark"),
                    (b"\xff\xfe", "utf-16-le", "UTF-16 LE"), (b"\xfe\xff", "utf-16-be", "UTF-16 BE"))
#: The name of text without a byte-order mark.
PLAIN = "UTF-8"


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


def _unmarked_utf16(data: bytes) -> str | None:
    """'UTF-16 LE'/'UTF-16 BE' when the bytes look like such text without a byte-order mark."""
    head = data[:4096]
    if len(head) < 4 or len(head) % 2:
        return None
    even, odd = head[0::2], head[1::2]
    if odd.count(0) == len(odd) and even.count(0) == 0:
        return "UTF-16 LE"
    if even.count(0) == len(even) and odd.count(0) == 0:
        return "UTF-16 BE"
    return None


def decode_text(data: bytes, name: str, expected: str) -> tuple[str, str]:
    """The text of a file's bytes and the name of its encoding.

    Parameters
    ----------
    data : bytes
        The file's contents.
    name : str
        File name, for messages.
    expected : str
        What the file should be, e.g. ``a text outline file``.

    Returns
    -------
    text : str
        The text, without its byte-order mark.
    encoding : str
        ``UTF-8``, ``UTF-8 with byte-order mark``, ``UTF-16 LE`` or ``UTF-16 BE``.

    Raises
    ------
    InputFileError
        UTF-32 text, UTF-16 text without a byte-order mark, bytes that are not valid in their
        encoding (naming the encoding, the byte and its offset), or a binary file.

    """
    codec, encoding, body = "utf-8", PLAIN, data
    for mark, mark_codec, mark_name in BYTE_ORDER_MARKS:
        if data.startswith(mark):
            if mark_codec is None:
                raise InputFileError(f"is {mark_name} text: save it as UTF-8 or UTF-16",
                                     file=name)
            codec, encoding, body = mark_codec, mark_name, data[len(mark):]
            break
    if codec == "utf-8":
        wide = _unmarked_utf16(body)
        if wide is not None:
            raise InputFileError(f"seems to be {wide} text without a byte-order mark: save it as "
                                 "UTF-8 (or UTF-16 with a byte-order mark)", file=name)
        refuse_binary(body, name, expected)
    try:
        text = body.decode(codec)
    except UnicodeDecodeError as exc:
        line = body[:exc.start].count(b"\n") + 1 if codec == "utf-8" else None
        where = f"offset {exc.start + len(data) - len(body)}" + (f", line {line}" if line else "")
        raise InputFileError(f"is not {encoding.removesuffix(' with byte-order mark')} text "
                             f"(byte 0x{body[exc.start]:02x} at {where}): save it as UTF-8",
                             file=name) from None
    if codec != "utf-8" and "\x00" in text:
        raise InputFileError(f"is a binary file, not {expected}", file=name)
    return text, encoding


def read_text(path: str | Path, expected: str) -> str:
    """The text of an input file (:func:`read_input`, then :func:`decode_text`).

    Parameters
    ----------
    path : str or Path
        File to read.
    expected : str
        What the file should be, for messages, e.g. ``a TOML materials table``.

    Returns
    -------
    str
        The file's text, without a byte-order mark.

    """
    return decode_text(read_input(path), str(path), expected)[0]


__all__ = ["BYTE_ORDER_MARKS", "MAX_FILE_BYTES", "PLAIN", "decode_text", "read_input",
           "read_text", "refuse_binary"]
