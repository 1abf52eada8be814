"""Output paths: checked before any work, written whole, never over an input, a link or a device.

The one place where warpwise writes a file (:func:`atomic_write`) and where the output paths
of a command are judged (:func:`check_outputs`):

- a regular file (or a new path) is written to a temporary file beside the real target (a
  symbolic link is followed, never replaced) and renamed over it when complete, so an existing
  output is never left half-written;
- a character device or a pipe (``/dev/null``, a named pipe) is written straight; a failure
  (``/dev/full``: no space left) is a one-line :class:`~warpwise.errors.UsageError`;
- ``-`` is standard output (so is a path that is the same file as standard output).

A folder of pages (a catalogue's datasheets) is built in a hidden staging folder
(:func:`staged_folder`) and moved into place at the end (:func:`publish_folder`); until
then an existing folder is left as it was.

Examples
--------
>>> check_outputs([Output("--csv", "-"), Output("--json", "-")])
Traceback (most recent call last):
...
warpwise.errors.UsageError: --csv and --json both write to standard output ('-'); give one of them a file name
"""

from __future__ import annotations

import os
import shutil
import signal
import stat
import sys
import tempfile
import threading
from collections.abc import Iterable, Iterator, Sequence
from contextlib import contextmanager, suppress
from dataclasses import dataclass
from pathlib import Path

from ..errors import UsageError

#: The output path that means standard output.
STDOUT = "-"
#: Outputs completed in this process by :func:`write_outputs`, in order (for a true message
#: when the command line is interrupted).
WRITTEN: list[str] = []


def is_stdout(path: str | Path) -> bool:
    """True for ``-`` and for a path that is the same file as this process's standard output."""
    if str(path) == STDOUT:
        return True
    try:
        return os.path.samestat(os.stat(path), os.fstat(sys.stdout.fileno()))
    except (OSError, ValueError, AttributeError):  # no such path; stdout closed or not a file
        return False


def _umask() -> int:
    """The process's umask (the permission bits new files and folders do not get)."""
    umask = os.umask(0)
    os.umask(umask)
    return umask


def _write_stdout(raw: bytes) -> None:
    """Bytes to standard output (after any text already buffered there)."""
    sys.stdout.flush()
    buffer = getattr(sys.stdout, "buffer", None)
    try:
        if buffer is None:  # a text stream without bytes underneath (a test's capture)
            sys.stdout.write(raw.decode("utf-8"))
        else:
            buffer.write(raw)
        sys.stdout.flush()
    except BrokenPipeError:
        raise
    except OSError as exc:
        raise UsageError(f"cannot write to standard output ({exc.strerror})") from None


def _write_straight(path: str | Path, real: str, raw: bytes) -> None:
    """Bytes straight to a character device or a pipe."""
    try:
        with open(real, "wb") as fh:  # the device's own file: no temporary file, no rename
            fh.write(raw)
    except BrokenPipeError:
        raise
    except OSError as exc:
        raise UsageError(f"cannot be written ({exc.strerror})", file=str(path)) from None


def atomic_write(path: str | Path, data: str | bytes) -> None:
    """Write ``data`` to ``path``: whole or not at all for a file; straight for a device or pipe.

    Parameters
    ----------
    path : str or Path
        Target: a file (a symbolic link is followed: its target is written, the link kept),
        a character device or pipe (written straight), or ``-`` for standard output.
    data : str or bytes
        Contents; text is written as UTF-8.

    Raises
    ------
    UsageError
        When the folder does not exist or cannot be written, the target is a folder or
        another kind of special file, or the write fails (a full disk or device); a file is
        then left as it was and no temporary file remains.

    """
    raw = data.encode("utf-8") if isinstance(data, str) else data
    if is_stdout(path):
        _write_stdout(raw)
        return
    real = os.path.realpath(path)
    try:
        st: os.stat_result | None = os.stat(real)
    except FileNotFoundError:
        st = None
    except OSError as exc:
        raise UsageError(f"cannot write here ({exc.strerror})", file=str(path)) from None
    if st is not None and (stat.S_ISCHR(st.st_mode) or stat.S_ISFIFO(st.st_mode)):
        _write_straight(path, real, raw)
        return
    if st is not None and not stat.S_ISREG(st.st_mode):
        kind = "a folder" if stat.S_ISDIR(st.st_mode) else "not a regular file, a device or a pipe"
        raise UsageError(f"cannot write over it: it is {kind}", file=str(path))
    folder = os.path.dirname(real)
    if not os.path.isdir(folder):
        raise UsageError(f"output folder {str(Path(path).parent)!r} does not exist", file=str(path))
    mode = stat.S_IMODE(st.st_mode) if st is not None else 0o666 & ~_umask()
    try:
        fd, tmp = tempfile.mkstemp(prefix=f".{os.path.basename(real)}.", suffix=".part", dir=folder)
    except OSError as exc:
        raise UsageError(f"cannot write here ({exc.strerror})", file=str(path)) from None
    try:
        with os.fdopen(fd, "wb") as fh:
            fh.write(raw)
            fh.flush()
            os.fsync(fh.fileno())
        os.chmod(tmp, mode)  # mkstemp makes the file private; keep the old file's permissions
        os.replace(tmp, real)
    except BaseException as exc:
        with suppress(OSError):
            os.unlink(tmp)
        if isinstance(exc, OSError):
            raise UsageError(f"cannot be written ({exc.strerror})", file=str(path)) from None
        raise


@dataclass(frozen=True)
class Output:
    """One output path of a command.

    Attributes
    ----------
    option : str
        The option that names it (``--csv``), for messages.
    path : str or None
        The path as given (None: not asked for; ``-``: standard output).
    folder : bool
        A folder of pages (``--html DIR``) rather than a file.
    to_stdout : bool
        Whether ``-`` (standard output) makes sense for it.
    what : str
        What it takes instead of ``-``, for the message refusing it.
    """

    option: str
    path: str | None
    folder: bool = False
    to_stdout: bool = True
    what: str = "a file name"


def _refuse(o: Output, text: str) -> UsageError:
    """The refusal of output ``o``: the path, the option and ``text`` (which follows it)."""
    return UsageError(f"{o.option} {text}", file=o.path)


def _check_writable_folder(o: Output, folder: str, shown: str) -> None:
    if not os.path.isdir(folder):
        raise _refuse(o, f"goes into the folder {shown!r}, which does not exist")
    if not os.access(folder, os.W_OK | os.X_OK):
        raise _refuse(o, f"goes into the folder {shown!r}, which cannot be written (no permission)")


def _check_file(o: Output, new_folders: set[str]) -> None:
    """A file output: not a folder, a writable device or file, in a writable folder."""
    real = os.path.realpath(o.path)
    if os.path.isdir(real):
        raise _refuse(o, f"names a folder; give {o.what}")
    if os.path.exists(real):
        mode = os.stat(real).st_mode
        if stat.S_ISCHR(mode) or stat.S_ISFIFO(mode):
            if not os.access(real, os.W_OK):
                raise _refuse(o, "names a device or pipe that cannot be written (no permission)")
            return
        if not stat.S_ISREG(mode):
            raise _refuse(o, "names something other than a file, a character device or a pipe")
        if not os.access(real, os.W_OK):
            raise _refuse(o, "names a read-only file; it is not replaced")
    folder = os.path.dirname(real)
    if folder not in new_folders:  # not a folder output that the command itself makes
        link = os.path.islink(o.path)
        _check_writable_folder(o, folder, folder if link else str(Path(o.path).parent))


def _check_folder(o: Output) -> None:
    """A folder output: an existing writable folder, or a new one in a writable folder."""
    real = os.path.realpath(o.path)
    if os.path.exists(real) and not os.path.isdir(real):
        raise _refuse(o, "names a file; give a folder")
    if os.path.isdir(real):
        if not os.access(real, os.W_OK | os.X_OK):
            raise _refuse(o, "names a folder that cannot be written (no permission)")
    else:
        _check_writable_folder(o, os.path.dirname(real), str(Path(o.path).parent))


def _same(a: str, b: str) -> bool:
    """Whether two paths name one file (resolved links, hard links)."""
    if os.path.realpath(a) == os.path.realpath(b):
        return True
    try:
        return os.path.samefile(a, b)
    except OSError:
        return False


def _check_distinct(given: Sequence[Output], inputs: Iterable[str | Path]) -> None:
    """No output on an input file, no two outputs on one path."""
    files = [o for o in given if not is_stdout(o.path)]
    for k, o in enumerate(files):
        for other in files[k + 1:]:
            if _same(o.path, other.path):
                raise _refuse(o, f"and {other.option} name the same file; give each output its own")
    for item in inputs:
        name = str(item)
        if name == STDOUT or os.path.isdir(name):  # an output folder may hold the inputs
            continue
        for o in files:
            if _same(o.path, name):
                raise _refuse(o, "names an input file; it would be overwritten (give another name)")


def check_outputs(outputs: Sequence[Output], inputs: Iterable[str | Path] = ()) -> None:
    """Check every output path of a command before any work: refuse what would go wrong.

    Parameters
    ----------
    outputs : sequence of Output
        The command's outputs (those with ``path`` None are not asked for and skipped).
    inputs : iterable of str or Path
        The files the command reads (folders are skipped).

    Raises
    ------
    UsageError
        For ``-`` where it makes no sense or given twice, a folder where a file is wanted (or
        a file where a folder is), a missing or read-only folder, a read-only file, an output
        on an input file or two outputs on one path.
    """
    given = [o for o in outputs if o.path is not None]
    to_stdout = [o for o in given if is_stdout(o.path)]
    for o in to_stdout:
        if not o.to_stdout:
            raise UsageError(f"{o.option} cannot write to standard output ('-'); give {o.what}")
    if len(to_stdout) > 1:
        a, b = to_stdout[:2]
        raise UsageError(f"{a.option} and {b.option} both write to standard output ('-'); give "
                         "one of them a file name")
    new_folders = {os.path.realpath(o.path) for o in given if o.folder
                   and not os.path.isdir(o.path)}
    for o in given:
        if o.folder:
            _check_folder(o)
        elif not is_stdout(o.path):
            _check_file(o, new_folders)
    _check_distinct(given, inputs)


#: Name of the kept staging folder of a resumable run inside an existing target folder.
KEPT_STAGE = ".warpwise-partial"


def stage_path(target: str | Path) -> Path:
    """The staging folder a resumable run keeps for ``target``.

    Inside ``target`` when it is a folder (so the pages move on one file system), else beside it
    (``.NAME.partial``).
    """
    real = Path(os.path.realpath(target))
    return real / KEPT_STAGE if real.is_dir() else real.parent / f".{real.name}.partial"


@contextmanager
def staged_folder(target: str | Path | None, keep: bool = False) -> Iterator[Path | None]:
    """A hidden staging folder for the pages of the folder ``target``, removed at the end.

    Inside ``target`` when it exists, else beside it; :func:`publish_folder` moves the pages
    into place. Whatever is left (an interruption, an error) is removed when the block ends,
    unless ``keep``: the folder is then :func:`stage_path` (the same for every run), an earlier
    run's pages in it are kept for a run that resumes, and an interruption leaves it.
    ``target`` None yields None.
    """
    if target is None:
        yield None
        return
    real = Path(os.path.realpath(target))
    try:
        if keep:
            stage = stage_path(target)
            stage.mkdir(mode=0o700, exist_ok=True)
            if stage.is_symlink() or not stage.is_dir():
                raise UsageError("is in the way of the staging folder of this run",
                                 file=str(stage))
        else:
            stage = Path(tempfile.mkdtemp(prefix=".warpwise-partial-", dir=real) if real.is_dir()
                         else tempfile.mkdtemp(prefix=f".{real.name}.partial-", dir=real.parent))
    except OSError as exc:
        raise UsageError(f"cannot write here ({exc.strerror})", file=str(target)) from None
    try:
        yield stage
    except BaseException:
        if not keep or not any(stage.iterdir()):  # a kept stage is kept with something in it
            shutil.rmtree(stage, ignore_errors=True)
        raise
    shutil.rmtree(stage, ignore_errors=True)


def publish_folder(stage: Path, target: str | Path, last: str = "index.html") -> None:
    """Move the pages of a staging folder into ``target``: the whole folder, or page by page.

    A new ``target`` is the staging folder renamed (one step). Into an existing folder each
    page replaces its namesake atomically, ``last`` (the index) after all the others, so every
    link of the index on disk leads to a page; other files there are left alone.
    """
    real = Path(os.path.realpath(target))
    try:
        if not real.exists():
            os.chmod(stage, 0o777 & ~_umask())  # mkdtemp makes it private
            os.rename(stage, real)
            return
        pages = sorted(stage.iterdir(), key=lambda p: (p.name == last, p.name))
        for page in pages:
            os.replace(page, real / page.name)
    except OSError as exc:
        raise UsageError(f"cannot write the pages here ({exc.strerror})", file=str(target)) from None


@contextmanager
def interrupt_deferred() -> Iterator[None]:
    """Hold Ctrl-C (SIGINT) until the block ends, then raise it: a set of outputs lands whole.

    Only in the main thread (elsewhere the block runs as it is).
    """
    if threading.current_thread() is not threading.main_thread():
        yield
        return
    caught: list[int] = []
    previous = signal.signal(signal.SIGINT, lambda signum, frame: caught.append(signum))
    try:
        yield
    finally:
        signal.signal(signal.SIGINT, previous if previous is not None else signal.SIG_DFL)
    if caught:
        raise KeyboardInterrupt


def write_outputs(files: Sequence[tuple[str | None, str | bytes]],
                  folders: Sequence[tuple[Path | None, str | None]] = ()) -> None:
    """Write a command's outputs in one step that Ctrl-C does not cut, recording each in WRITTEN.

    Parameters
    ----------
    files : sequence of (path, data)
        Files (or ``-``) and their contents, in order (path None: skipped).
    folders : sequence of (staging folder, target)
        Folders of pages to move into place first (either None: skipped).
    """
    with interrupt_deferred():
        for stage, target in folders:
            if stage is not None and target is not None:
                publish_folder(stage, target)
                WRITTEN.append(str(target))
        for path, data in files:
            if path is not None:
                atomic_write(path, data)
                WRITTEN.append("standard output" if is_stdout(path) else str(path))
