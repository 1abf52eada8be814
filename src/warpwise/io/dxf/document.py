"""A DXF file read with ezdxf: strict reader first, recover mode for damaged files.

:func:`load_document` refuses what is not a DXF drawing (empty, binary data, no leading
SECTION) with one clear line, reads text and binary DXF with ezdxf, falls back on ezdxf's
recover mode when the strict reader fails (keeping ezdxf's log off the user's stderr) and
refuses numbers that recover mode would only guess. A file that ends before the DXF
end-of-file marker is truncated: when ezdxf cannot read it, the refusal says so
(:data:`TRUNCATED`), not what ezdxf stumbled over at the cut. :func:`why` words an exception
for a message.
"""

from __future__ import annotations

import logging
import re
from collections import Counter
from pathlib import Path

from ...errors import InputFileError
from ..files import read_input, refuse_binary

_BINARY_SENTINEL = b"AutoCAD Binary DXF\r\n\x1a\x00"

#: What is wrong with a file that ends before the DXF end-of-file marker.
TRUNCATED = ("the file is truncated (it ends before the DXF end-of-file marker), so part of the "
             "drawing may be missing; save it again")


def ends_early(data: bytes) -> bool:
    r"""True when DXF data (text or binary) does not end with the end-of-file marker (0, EOF).

    Examples
    --------
    >>> ends_early(b"0\nSECTION\n2\nENTITIES\n0\nENDSEC\n0\nEOF\n"), ends_early(b"0\nSECTION\n2\nENT")
    (False, True)
    """
    return not data.rstrip(b" \t\r\n\x1a\x00").upper().endswith(b"EOF")


def check_text_dxf(data: bytes, name: str) -> None:
    """Refuse data that does not start like a DXF text file."""
    refuse_binary(data, name, "a DXF drawing", head=65536)
    head = data[:4096].removeprefix(b"\xef\xbb\xbf").decode("latin-1")
    tags = [ln.strip() for ln in head.replace("\r\n", "\n").replace("\r", "\n").split("\n")]
    # skip 999 comments; the first tag must be (0, SECTION)
    k = 0
    while k + 1 < len(tags) and tags[k] == "999":
        k += 2
    while k < len(tags) and not tags[k]:
        k += 1
    if k + 1 >= len(tags) or tags[k] != "0" or tags[k + 1].upper() != "SECTION":
        raise InputFileError("is not a DXF drawing (it does not begin with a DXF SECTION)", file=name)


def load_document(path: str | Path) -> tuple[object, tuple[str, ...], bool, dict[str, int]]:
    """Read a DXF file with ezdxf.

    Returns
    -------
    doc : ezdxf.document.Drawing
        The document.
    repairs : tuple of str
        What ezdxf repaired (its audit, and its recover mode when the strict reader failed).
    truncated : bool
        True when the file ends before the DXF end-of-file marker.
    found : dict of str to int
        Model-space entities by type as found in the file (before ezdxf's audit removed
        broken ones).

    Raises
    ------
    InputFileError
        What :func:`~warpwise.io.files.read_input` refuses, data that is not a DXF drawing,
        a file neither reader can read, an invalid number.

    """
    import ezdxf
    from ezdxf.audit import AuditError

    p = Path(path)
    name = str(path)
    data = read_input(path)
    truncated = ends_early(data)
    if data.startswith(_BINARY_SENTINEL):
        try:
            doc = ezdxf.readfile(p)
        except Exception as exc:  # ezdxf raises many kinds for a damaged binary file
            reason = TRUNCATED if truncated else f"({why(exc)})"
            raise InputFileError(f"binary DXF file cannot be read: {reason}", file=name) from None
        return doc, (), truncated, dict(Counter(e.dxftype() for e in doc.modelspace()))
    check_text_dxf(data, name)
    recovered: tuple[str, ...] = ()
    try:  # the strict reader is faster; recover mode takes what it rejects
        doc = ezdxf.readfile(p)
        found = Counter(e.dxftype() for e in doc.modelspace())  # before the audit removes any
        auditor = doc.audit()
    except Exception as strict:  # ezdxf raises many kinds for a damaged file
        try:
            doc, auditor = _recover(p, name)
        except InputFileError:
            if truncated:  # what ezdxf stumbled over is the cut
                raise InputFileError(f"cannot be read: {TRUNCATED}", file=name) from None
            raise
        recovered = (f"read in recover mode (the strict reader stopped: {why(strict)})",)
        found = Counter(e.dxftype() for e in doc.modelspace())
    repairs = recovered + tuple(str(getattr(f, "message", f))
                                for f in list(auditor.fixes) + list(auditor.errors)
                                # a block cycle is no repair (ezdxf changes nothing) but an
                                # error of the drawing, in our words (blocks.count_expansion)
                                if getattr(f, "code", None) != AuditError.INVALID_BLOCK_REFERENCE_CYCLE)
    if not states_insunits(data):
        # ezdxf fills in a default header ($INSUNITS = 6, metres) for a file without one: the
        # unit must come from what the file itself holds
        if doc.header.get("$INSUNITS") is not None:
            del doc.header["$INSUNITS"]
    return doc, repairs, truncated, dict(found)


_TAG_END = rb"[ \t]*\r?\n[ \t]*"
_HEADER_START = re.compile(rb"^[ \t]*0" + _TAG_END + rb"SECTION" + _TAG_END + rb"2" + _TAG_END
                           + rb"HEADER[ \t]*\r?\n", re.IGNORECASE)
_SECTION_END = re.compile(rb"\n[ \t]*0" + _TAG_END + rb"ENDSEC[ \t]*\r?\n", re.IGNORECASE)
_INSUNITS = re.compile(rb"\n[ \t]*9" + _TAG_END + rb"\$INSUNITS[ \t]*\r?\n", re.IGNORECASE)
_COMMENT = re.compile(rb"^(?:[ \t]*999[ \t]*\r?\n[^\n]*\n)*")


def states_insunits(data: bytes) -> bool:
    r"""True when a text DXF's own HEADER section (the first section) holds ``$INSUNITS``.

    Examples
    --------
    >>> states_insunits(b"0\nSECTION\n2\nHEADER\n9\n$INSUNITS\n70\n4\n0\nENDSEC\n")
    True
    >>> states_insunits(b"0\nSECTION\n2\nENTITIES\n0\nENDSEC\n0\nEOF\n")
    False
    """
    body = data.removeprefix(b"\xef\xbb\xbf")
    body = body[_COMMENT.match(body).end():]
    start = _HEADER_START.match(body)
    if start is None:
        return False
    end = _SECTION_END.search(body, start.end() - 1)
    header = body[start.end() - 1:end.start() + 1 if end else len(body)]
    return _INSUNITS.search(header) is not None


class _Collect(logging.Handler):
    """Keeps the messages of ezdxf's log records."""

    def __init__(self) -> None:
        super().__init__(level=logging.WARNING)
        self.heard: list[str] = []

    def emit(self, record: logging.LogRecord) -> None:  # noqa: D102
        self.heard.append(record.getMessage())


def _recover(p: Path, name: str) -> tuple[object, object]:
    """The document and auditor of ezdxf's recover mode; a guessed number is refused."""
    from ezdxf import recover

    log = logging.getLogger("ezdxf")
    handler = _Collect()
    keep = log.propagate
    log.addHandler(handler)
    log.propagate = False  # ezdxf's own lines must not reach the user's stderr
    try:
        doc, auditor = recover.readfile(p)
    except Exception as exc:  # recover mode gave up: the file is not a usable DXF
        raise InputFileError(f"is not a readable DXF drawing ({why(exc)})", file=name) from None
    finally:
        log.removeHandler(handler)
        log.propagate = keep
    bad_numbers = [m for m in handler.heard if "invalid floating point" in m or "invalid integer" in m]
    if bad_numbers:
        # a guessed coordinate would change the profile silently: refuse instead
        raise InputFileError(f"holds an invalid number ({' '.join(bad_numbers[0].split())[:120]})",
                             file=name) from None
    return doc, auditor


def why(exc: BaseException) -> str:
    """An exception in a few words for a message: its type and its text, shortened."""
    text = " ".join(str(exc).split())
    return f"{type(exc).__name__}: {text[:160]}" if text else type(exc).__name__
