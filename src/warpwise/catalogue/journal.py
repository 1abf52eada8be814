"""The journal of a catalogue run: finished profiles written as they finish, for resuming.

A catalogue run appends one line of JSON per finished profile to a journal file beside its
first output (``OUT.partial``, a name that never claims to be complete). When the run ends, its
outputs are written whole and the journal is removed. When it is interrupted, the journal stays,
and a run with the same outputs takes from it every profile whose key is unchanged: the key is a
SHA-256 of the file's content, the options it was read and analysed with, its name and
description, and the program's own source (a changed program analyses again). Only profiles that
were analysed are taken; failures are tried again.

The first line says what the file is; each further line holds the key and the outcome, its
record written field by field (nan as null) so that it reads back equal, float for float. A
line cut short by the interruption is ignored.
"""

from __future__ import annotations

import hashlib
import json
import math
import os
from dataclasses import asdict, fields, replace
from functools import lru_cache
from pathlib import Path
from typing import IO, Any

import numpy as np

from ..errors import UsageError
from ..geometry.corners import Corner
from ..properties.analysis import TargetStatus
from ..report.pdf_sheet import Loop
from ..report.records import Record
from .items import Outcome

#: First line of every journal (with the journal format's version).
HEADER = {"warpwise_journal": 1, "note": "an unfinished catalogue run; not a result"}
#: Ending of a journal's name, after its output's name.
ENDING = ".partial"
#: Journals that a run closed without removing them, with the profiles each holds (for the
#: message of an interrupted run).
KEPT: list[tuple[str, int]] = []


def journal_path(output: str | Path) -> Path:
    """The journal of a run whose first output is ``output`` (a file or a folder)."""
    real = Path(os.path.realpath(output))
    return real.with_name(real.name + ENDING)


@lru_cache(maxsize=1)
def program_fingerprint() -> str:
    """SHA-256 of the program's own source files (a changed program gives a new key)."""
    root = Path(__file__).resolve().parent
    h = hashlib.sha256()
    for f in sorted(root.rglob("*.py")):
        h.update(f.relative_to(root).as_posix().encode())
        h.update(f.read_bytes())
    return h.hexdigest()


def profile_key(path: str | Path, settings: str) -> str | None:
    """Key of a profile: its content with ``settings`` (its options, name...); None if unreadable."""
    try:
        data = Path(path).read_bytes()
    except OSError:
        return None
    h = hashlib.sha256(program_fingerprint().encode())
    h.update(hashlib.sha256(data).digest())
    h.update(settings.encode())
    return h.hexdigest()


def _plain(value: Any) -> Any:
    """A record's field as standard JSON (nan and infinities as null)."""
    if isinstance(value, float):
        return value if math.isfinite(value) else None
    if isinstance(value, dict):
        return {k: _plain(v) for k, v in value.items()}
    if isinstance(value, (list, tuple)):
        return [_plain(v) for v in value]
    return value


def _number(value: Any) -> float:
    return float("nan") if value is None else float(value)


def record_to_json(record: Record) -> dict[str, Any]:
    """A record as a standard-JSON object that :func:`record_from_json` reads back equal."""
    return _plain(asdict(record))


def record_from_json(obj: dict[str, Any]) -> Record:
    """The record written by :func:`record_to_json`."""
    known = {f.name for f in fields(Record)}
    obj = {k: v for k, v in obj.items() if k in known}
    out = Record(**obj)
    errors = None if out.errors is None else {k: _number(v) for k, v in out.errors.items()}
    target = None if out.target is None else TargetStatus(**{
        k: (_number(v) if k in ("target", "reached") else v) for k, v in obj["target"].items()})
    return replace(
        out, values={k: _number(v) for k, v in out.values.items()}, errors=errors,
        mesh_size=_number(out.mesh_size), notes=tuple(out.notes), materials=tuple(out.materials),
        extra={k: _number(v) for k, v in out.extra.items()},
        corners=tuple(Corner(**c) for c in obj.get("corners", ())),
        warnings=tuple(out.warnings), target=target,
        material_notes=tuple(out.material_notes))


def read_journal(path: Path) -> dict[str, Outcome]:
    """The finished profiles of a journal by key; an absent journal gives none.

    Each outcome's ``datasheet`` is its page's file name (in the run's staging folder).

    Raises
    ------
    UsageError
        When the file is not a journal of ours (it is then left alone).
    """
    if path.is_symlink() or (path.exists() and not path.is_file()):
        raise UsageError("is in the way of this run's journal and is not a plain file; move it, "
                         "or choose another output name", file=str(path))
    try:
        lines = path.read_text(encoding="utf-8").splitlines()
    except FileNotFoundError:
        return {}
    except (OSError, UnicodeDecodeError) as exc:
        raise UsageError(f"cannot read the journal of an earlier run ({exc})", file=str(path)) \
            from None
    try:
        head = json.loads(lines[0]) if lines else None
    except json.JSONDecodeError:
        head = None
    if head != HEADER:
        raise UsageError("is in the way of this run's journal and is not one; move it, or "
                         "choose another output name", file=str(path))
    out: dict[str, Outcome] = {}
    for line in lines[1:]:
        try:
            obj = json.loads(line)
            loops = obj.get("loops")
            out[obj["key"]] = Outcome(
                obj["path"], record_from_json(obj["record"]), None, float(obj["seconds"]),
                obj.get("datasheet"), obj.get("thumbnail"),
                None if loops is None else tuple(
                    Loop(int(p["region"]), str(p["material"]),
                         np.array(p["points"], float).reshape(-1, 2)) for p in loops))
        except (json.JSONDecodeError, KeyError, TypeError, ValueError):
            continue  # a line cut short by the interruption
    return out


class JournalWriter:
    """Appends finished profiles to a journal, one flushed line each.

    Parameters
    ----------
    path : Path
        The journal; created with its header line when absent or empty.
    held : int
        Profiles already in it (read by :func:`read_journal`).
    """

    def __init__(self, path: Path, held: int = 0) -> None:
        self.path = path
        self.held = held
        try:
            self._file: IO[str] = open(path, "a", encoding="utf-8")  # noqa: SIM115 (kept open)
        except OSError as exc:
            raise UsageError(f"cannot write the journal of this run ({exc.strerror})",
                             file=str(path)) from None
        if self._file.tell() == 0:
            self._write(HEADER)

    def _write(self, obj: dict[str, Any]) -> None:
        self._file.write(json.dumps(obj, allow_nan=False, ensure_ascii=False) + "\n")
        self._file.flush()

    def add(self, key: str, out: Outcome) -> None:
        """Write one analysed profile's outcome (its page by file name)."""
        self._write({"key": key, "path": out.path, "seconds": out.seconds,
                     "datasheet": None if out.datasheet is None else Path(out.datasheet).name,
                     "thumbnail": out.thumbnail, "record": record_to_json(out.record),
                     "loops": None if out.loops is None else [
                         {"region": p.region, "material": p.material, "points": p.points.tolist()}
                         for p in out.loops]})
        self.held += 1

    def close(self) -> None:
        """Close the file (the journal stays, and is listed in :data:`KEPT`)."""
        if not self._file.closed:
            self._file.close()
            if self.held:
                KEPT.append((str(self.path), self.held))

