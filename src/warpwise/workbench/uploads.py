"""Uploaded files: kept under generated names in a private folder, removed at shutdown.

A name sent by the browser is only ever shown (escaped by the templates); the file itself is
stored as ``<id>.dxf`` or ``<id>.txt`` (the ending decides the reader, as on the command line:
``.dxf`` a drawing, anything else a coordinate outline) in a folder of mode 0700 that
:meth:`UploadStore.close` removes.
"""

from __future__ import annotations

import os
import secrets
import shutil
import tempfile
import threading
from dataclasses import dataclass
from pathlib import Path

from ..errors import InputFileError

#: Largest file taken, bytes (a drawing larger than this is refused with a message).
MAX_FILE_BYTES = 25 * 1024 * 1024
#: Most files in one upload (a folder counts each file), all of them together at most
#: MAX_UPLOAD_BYTES, and most files kept at once.
MAX_FILES_PER_UPLOAD = 50
MAX_UPLOAD_BYTES = 100 * 1024 * 1024
MAX_FILES_KEPT = 200
#: The files taken from a folder: the catalogue's profile files and materials tables (others
#: in the folder are passed over and counted).
FOLDER_ENDINGS = (".dxf", ".txt", ".xy", ".csv", ".dat", ".toml")
#: Longest name shown (longer ones are cut, for the page only).
MAX_NAME = 120


@dataclass(frozen=True)
class Upload:
    """One uploaded file.

    Attributes
    ----------
    id : str
        Generated identifier (URL-safe); also the stored file's stem.
    name : str
        The name the browser gave, for showing only.
    path : str
        Where it is stored (never built from ``name``).
    size : int
        Bytes.
    """

    id: str
    name: str
    path: str
    size: int


def display_name(sent: str | None) -> str:
    r"""The name shown for a file: the last part of what the browser sent, printable, cut short.

    Examples
    --------
    >>> display_name("../../etc/passwd")
    'passwd'
    >>> display_name("C:\\drawings\\rail.dxf")
    'rail.dxf'
    >>> display_name("")
    'unnamed file'
    """
    text = (sent or "").replace("\\", "/").rsplit("/", 1)[-1]
    text = "".join(c for c in text if c.isprintable()).strip()
    return text[:MAX_NAME] or "unnamed file"


def from_folder(sent: str | None) -> bool:
    """Whether a file sent with a folder is taken: a profile file or materials table, not hidden.

    Examples
    --------
    >>> from_folder("profiles/rail.DXF"), from_folder("profiles/.hidden.txt"), from_folder("a/b.png")
    (True, False, False)
    """
    parts = (sent or "").replace("\\", "/").split("/")
    return parts[-1].lower().endswith(FOLDER_ENDINGS) and not any(p.startswith(".") for p in parts)


def stored_ending(name: str) -> str:
    """The ending a file is stored with: ``.dxf`` for a drawing, else ``.txt`` (an outline).

    Examples
    --------
    >>> stored_ending("Rail.DXF"), stored_ending("bar.xy"), stored_ending("noending")
    ('.dxf', '.txt', '.txt')
    """
    return ".dxf" if name.lower().endswith(".dxf") else ".txt"


class UploadStore:
    """The uploaded files of one workbench, in a private temporary folder.

    Parameters
    ----------
    root : str, optional
        Parent of the private folder (default the system's temporary folder).
    """

    def __init__(self, root: str | None = None) -> None:
        self.folder = Path(tempfile.mkdtemp(prefix="warpwise-workbench-", dir=root))
        os.chmod(self.folder, 0o700)
        self._files: dict[str, Upload] = {}
        self._lock = threading.Lock()

    def add(self, sent_name: str | None, data: bytes) -> Upload:
        """Store one file; refuse an empty or oversized one, or one too many.

        Raises
        ------
        InputFileError
            With a one-line message naming the file.
        """
        name = display_name(sent_name)
        if not data:
            raise InputFileError("the file is empty", file=name)
        if len(data) > MAX_FILE_BYTES:
            raise InputFileError(f"the file is larger than the workbench takes "
                                 f"({MAX_FILE_BYTES // (1024 * 1024)} MB)", file=name)
        with self._lock:
            if len(self._files) >= MAX_FILES_KEPT:
                raise InputFileError(f"the workbench holds {MAX_FILES_KEPT} files at most; "
                                     "remove some first", file=name)
            ident = secrets.token_urlsafe(9)
            path = self.folder / f"{ident}{stored_ending(name)}"
            fd = os.open(path, os.O_WRONLY | os.O_CREAT | os.O_EXCL, 0o600)
            with os.fdopen(fd, "wb") as f:
                f.write(data)
            upload = Upload(ident, name, str(path), len(data))
            self._files[ident] = upload
        return upload

    def get(self, ident: str) -> Upload | None:
        """The upload of ``ident`` (None when there is none)."""
        with self._lock:
            return self._files.get(ident)

    def remove(self, ident: str) -> None:
        """Forget one upload and delete its file."""
        with self._lock:
            upload = self._files.pop(ident, None)
        if upload is not None:
            Path(upload.path).unlink(missing_ok=True)

    def all(self) -> list[Upload]:
        """Every upload, in the order they came."""
        with self._lock:
            return list(self._files.values())

    def scratch(self, suffix: str) -> str:
        """A new file name in the private folder for a worker's temporary output."""
        return str(self.folder / f"scratch-{secrets.token_urlsafe(9)}{suffix}")

    def close(self) -> None:
        """Remove the folder and everything in it."""
        with self._lock:
            self._files.clear()
        shutil.rmtree(self.folder, ignore_errors=True)
