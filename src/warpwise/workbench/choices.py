"""The choices made on the page, as the command line's options, parsed by the command's parser.

The page never interprets a choice itself: every field becomes the option of ``warpwise props``
(or ``warpwise stress``) that means the same, and the command's own parser
(:func:`warpwise.cli.options.build_parser`) reads them, so the checks and the one-line messages
are the command line's. Values go as ``--option=VALUE``, so that a value beginning with ``-``
(a layer named so) stays a value.
"""

from __future__ import annotations

import argparse
from collections.abc import Mapping, Sequence
from dataclasses import dataclass

#: The load fields of the page and the options of ``warpwise stress`` they stand for.
LOAD_FIELDS = {"torque": "--torque", "shear_x": "--shear-x", "shear_y": "--shear-y",
               "axial": "--axial", "moment_x": "--moment-x", "moment_y": "--moment-y"}


@dataclass(frozen=True)
class Choices:
    """What the page asked for, as command-line words.

    Attributes
    ----------
    read : tuple of str
        Options of how the file is read (``check`` takes them too).
    analysis : tuple of str
        Options of the analysis (shared by ``props`` and ``stress``).
    props : tuple of str
        Options of ``props`` only (error estimates).
    loads : tuple of str
        The load options of ``stress`` (empty: no load given).
    names : tuple of (str, str)
        Stored files the options name (a materials table) and the names the user knows them
        by, for the messages.
    """

    read: tuple[str, ...]
    analysis: tuple[str, ...] = ()
    props: tuple[str, ...] = ()
    loads: tuple[str, ...] = ()
    names: tuple[tuple[str, str], ...] = ()


def _one(form: Mapping[str, str], key: str) -> str:
    return str(form.get(key, "") or "").strip()


def form_choices(form: Mapping[str, str], layers: Sequence[str] = (),
                 chosen_layers: Sequence[str] = (), default_layers: Sequence[str] = (),
                 table: tuple[str, str] | None = None) -> Choices:
    """The options of a filled-in form.

    Parameters
    ----------
    form : mapping
        Single-valued fields: ``part`` (empty, ``all`` or a number), ``units``, ``material``,
        ``report_units``, ``accuracy``, ``estimate_errors``, ``shear_modulus``, the loads of
        :data:`LOAD_FIELDS` and ``material-K`` (the material of layer K of ``layers``).
    layers : sequence of str
        The drawing's layers, in the order the page listed them.
    chosen_layers : sequence of str
        The layers ticked.
    default_layers : sequence of str
        The layers the drawing is read from when none is named (no ``--layer`` when the ticked
        ones are exactly these).
    table : (str, str), optional
        A materials table chosen: where it is stored (generated, never the user's name) and
        its shown name.

    Examples
    --------
    >>> form_choices({"part": "2", "units": "in"}).read
    ('--part=2', '--units=in')
    >>> form_choices({"torque": "1000", "shear_modulus": "26000"}).loads
    ('--torque=1000', '--shear-modulus=26000')
    """
    read: list[str] = []
    part = _one(form, "part")
    if part == "all":
        read.append("--all-parts")
    elif part:
        read.append(f"--part={part}")
    if sorted(chosen_layers) != sorted(default_layers):
        read += [f"--layer={name}" for name in chosen_layers]
    if _one(form, "units"):
        read.append(f"--units={_one(form, 'units')}")
    for k, name in enumerate(layers):
        material = _one(form, f"material-{k}")
        if material:
            read.append(f"--layer-material={name}={material}")
    analysis = [f"--{option.replace('_', '-')}={_one(form, option)}"
                for option in ("material", "report_units", "accuracy") if _one(form, option)]
    if _one(form, "material_own"):  # a material of the user's table, by name
        analysis.append(f"--material={_one(form, 'material_own')}")
    if table is not None:
        analysis.append(f"--materials={table[0]}")
    props = ("--estimate-errors",) if _one(form, "estimate_errors") else ()
    loads = [f"{flag}={_one(form, key)}" for key, flag in LOAD_FIELDS.items() if _one(form, key)]
    if loads and _one(form, "shear_modulus"):
        loads.append(f"--shear-modulus={_one(form, 'shear_modulus')}")
    return Choices(tuple(read), tuple(analysis), props, tuple(loads),
                   (table,) if table else ())


def parsed(command: str, path: str, words: Sequence[str]) -> argparse.Namespace:
    """The options of ``warpwise COMMAND PATH WORDS...`` as its own parser reads them.

    Raises
    ------
    UsageError
        With the command line's one-line message.
    """
    from ..cli.options import build_parser

    return build_parser(command).parse_args([command, path, *words])
