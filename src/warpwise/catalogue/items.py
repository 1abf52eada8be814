"""Catalogue inputs: run options, profile files of folders, manifests, items, outcomes."""

from __future__ import annotations

import sys
from collections.abc import Iterable
from dataclasses import dataclass, field, replace
from pathlib import Path

from ..errors import InputFileError, UsageError
from ..geometry.profile import LENGTH_UNITS
from ..io.options import ReadOptions
from ..properties.run import AnalysisOptions
from ..textfiles import read_text

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover - Python 3.10
    import tomli as tomllib

#: File endings taken from a folder: DXF drawings and coordinate outlines.
PROFILE_ENDINGS = (".dxf", ".txt", ".xy", ".csv", ".dat")
#: File ending of a catalogue manifest.
MANIFEST_ENDING = ".toml"


@dataclass(frozen=True)
class RunOptions:
    """How each profile of a catalogue is read and analysed (the options of ``warpwise props``).

    Attributes
    ----------
    read : ReadOptions
        How each file is read (units, DXF layers, parts).
    analysis : AnalysisOptions
        How each profile is analysed (accuracy, materials, solver, estimates).
    datasheet_dir : str or None
        Folder for an HTML datasheet per profile (written by the worker).
    outlines : bool
        Bring each profile's outline loops back with its outcome (for PDF pages).
    report_units : str or None
        Unit system of the datasheets (:data:`warpwise.units.SYSTEMS`); default each
        profile's own.
    """

    read: ReadOptions = field(default_factory=ReadOptions)
    analysis: AnalysisOptions = field(default_factory=AnalysisOptions)
    datasheet_dir: str | None = None
    report_units: str | None = None
    outlines: bool = False


@dataclass(frozen=True)
class Outcome:
    """The outcome of one profile of a catalogue.

    Attributes
    ----------
    path : str
        The file.
    record : Record or None
        Its values (None when it failed).
    error : str or None
        One-line error message when it failed.
    seconds : float
        Wall time of the analysis, s.
    datasheet : str or None
        Path of its HTML datasheet, when written.
    loops : tuple of numpy.ndarray or None
        Its outline's loops (outer boundaries and holes, drawing coordinates), when asked for.
    thumbnail : str or None
        Inline SVG of its outline, when datasheets are written.
    """

    path: str
    record: object | None = None
    error: str | None = None
    seconds: float = 0.0
    datasheet: str | None = None
    thumbnail: str | None = None
    loops: tuple | None = None

    @property
    def ok(self) -> bool:
        """True when the profile was analysed."""
        return self.error is None


def _profile_files(folder: Path) -> list[Path]:
    """Profile files in a folder and its subfolders, by path; hidden files and folders skipped."""
    found = []
    for f in folder.rglob("*"):
        rel = f.relative_to(folder).parts
        if f.is_file() and f.suffix.lower() in PROFILE_ENDINGS \
                and not any(part.startswith(".") for part in rel):
            found.append(f)
    return sorted(found, key=lambda f: f.relative_to(folder).parts)


def collect_files(items: Iterable[str | Path], exclude: Iterable[str | Path] = ()) -> list[Path]:
    """Files of a catalogue: each folder's profile files (recursively, by path), or the file.

    Parameters
    ----------
    items : iterable of str or Path
        Folders and files.
    exclude : iterable of str or Path
        Files not to take from folders (the run's own outputs).

    Raises
    ------
    UsageError
        For a path that does not exist or a folder without profile files.
    """
    skip = {Path(e).resolve() for e in exclude}
    out: list[Path] = []
    for item in items:
        p = Path(item)
        if p.is_dir():
            found = [f for f in _profile_files(p) if f.resolve() not in skip]
            if not found:
                raise UsageError(f"no profile files ({', '.join(PROFILE_ENDINGS)}) in the folder "
                                 "or its subfolders", file=str(p))
            out.extend(found)
        elif p.exists():
            out.append(p)
        else:
            raise UsageError("file or folder not found", file=str(p))
    return out


@dataclass(frozen=True)
class Item:
    """One profile of a catalogue: its file and, from a manifest, its own options and name.

    Attributes
    ----------
    path : str
        The file.
    options : RunOptions or None
        How it is read and analysed (None: the run's options).
    name : str
        Name or part number ("" : none; reports then show the file name).
    description : str
        What it is, in words.
    """

    path: str
    options: RunOptions | None = None
    name: str = ""
    description: str = ""

    @property
    def title(self) -> str | None:
        """Heading of its datasheet: name and description (None: none given)."""
        return ": ".join(t for t in (self.name, self.description) if t) or None


#: Keys of a manifest entry and the type of each value.
MANIFEST_KEYS: dict[str, type | tuple[type, ...]] = {
    "file": str, "name": str, "description": str, "part": int, "all_parts": bool,
    "layers": list, "layer_materials": dict, "material": str, "units": str,
    "join_tolerance": (int, float), "chord_tolerance": (int, float), "max_entities": int}


def _entry_item(entry: object, k: int, folder: Path, base: RunOptions, where: str) -> Item:
    """The item of manifest entry ``k`` (1-based): the run's options changed as it says."""
    def bad(text: str) -> InputFileError:
        return InputFileError(f"profile {k}: {text}", file=where)

    if not isinstance(entry, dict):
        raise bad("is not a table of keys")
    for key, value in entry.items():
        kind = MANIFEST_KEYS.get(key)
        if kind is None:
            raise bad(f"unknown key {key!r} (keys: {', '.join(MANIFEST_KEYS)})")
        if not isinstance(value, kind) or (kind is int and isinstance(value, bool)):
            raise bad(f"{key} has a value of the wrong kind: {value!r}")
    if "file" not in entry:
        raise bad("'file' is missing")
    names = entry.get("layers", [])
    table = entry.get("layer_materials", {})
    if not all(isinstance(n, str) for n in [*names, *table, *table.values()]):
        raise bad("layer and material names must be text")
    if entry.get("units", "mm") not in LENGTH_UNITS:
        raise bad(f"unknown unit {entry['units']!r} (use {', '.join(LENGTH_UNITS)})")
    read = {"units": entry.get("units"), "layers": tuple(names) or None,
            "join_tolerance": entry.get("join_tolerance"), "layer_materials": table or None,
            "chord_tolerance": entry.get("chord_tolerance"), "other_layers_material": entry.get("material"),
            "max_entities": entry.get("max_entities")}
    changes = {key: value for key, value in read.items() if value is not None}
    if "part" in entry or "all_parts" in entry:
        changes.update(part=entry.get("part"), all_parts=entry.get("all_parts", False))
    try:
        options = replace(base, read=replace(base.read, **changes))
        if "material" in entry:
            options = replace(options, analysis=replace(base.analysis, material=entry["material"]))
    except UsageError as exc:
        raise bad(exc.message) from None
    path = Path(entry["file"]).expanduser()
    return Item(str(path if path.is_absolute() else folder / path), options,
                entry.get("name", ""), entry.get("description", ""))


def read_manifest(path: str | Path, options: RunOptions | None = None) -> list[Item]:
    """The items of a catalogue manifest.

    A manifest is a TOML file with one ``[[profile]]`` table per drawing: ``file`` (required;
    relative to the manifest's folder), ``name`` (or part number), ``description``, and how
    it is read and analysed: ``part`` or ``all_parts``, ``layers``, ``layer_materials``
    (a table of layer = material name), ``material``, ``units``, ``join_tolerance``,
    ``chord_tolerance``, ``max_entities``. What an entry gives replaces the run's option for that drawing.

    Parameters
    ----------
    path : str or Path
        The manifest.
    options : RunOptions, optional
        The run's options (the command line's).

    Returns
    -------
    list of Item

    Raises
    ------
    InputFileError
        For a file that is not such a manifest (naming the entry and key at fault).
    """
    where = str(path)
    base = options or RunOptions()
    try:
        data = tomllib.loads(read_text(path, "a TOML manifest"))
    except (tomllib.TOMLDecodeError, UnicodeDecodeError) as exc:
        raise InputFileError(f"not a valid TOML manifest ({exc})", file=where) from None
    unknown = sorted(set(data) - {"profile"})
    if unknown:
        raise InputFileError(f"unknown top-level keys {unknown} (a manifest holds [[profile]] "
                             "tables)", file=where)
    entries = data.get("profile")
    if not isinstance(entries, list) or not entries:
        raise InputFileError("no [[profile]] tables found", file=where)
    folder = Path(path).parent
    return [_entry_item(e, k, folder, base, where) for k, e in enumerate(entries, start=1)]


def catalogue_items(items: Iterable[str | Path], options: RunOptions | None = None,
                    exclude: Iterable[str | Path] = ()) -> list[Item]:
    """Items of a catalogue run: manifests (``.toml``) read, folders searched, files taken.

    Parameters
    ----------
    items : iterable of str or Path
        Manifests, folders and files, in the order wanted.
    options : RunOptions, optional
        The run's options (manifest entries change them per drawing).
    exclude : iterable of str or Path
        Files not to take from folders (the run's own outputs).

    Returns
    -------
    list of Item
    """
    out: list[Item] = []
    for item in items:
        if Path(item).suffix.lower() == MANIFEST_ENDING and Path(item).is_file():
            out.extend(read_manifest(item, options))
        else:
            out.extend(Item(str(f), options) for f in collect_files([item], exclude))
    return out
