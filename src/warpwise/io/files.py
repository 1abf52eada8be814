r"""The checks every reader makes on its input file before it looks at the contents.

:func:`read_input` refuses a missing file, a folder, a file over :data:`MAX_FILE_BYTES`, one
that cannot be read and an empty one; :func:`refuse_binary` refuses data with NUL bytes where
a text file is expected; :func:`decode_text` reads UTF-8 and UTF-16 text. The three live in
:mod:`warpwise.textfiles` (below every stage, so the materials tables use them too) and are
re-exported here; :func:`check_assumed_size` is the readers' own.

"""

from __future__ import annotations

from dataclasses import replace

from ..geometry.profile import LENGTH_UNITS, Profile
from ..textfiles import MAX_FILE_BYTES, decode_text, read_input, read_text, refuse_binary

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


__all__ = ["MAX_FILE_BYTES", "check_assumed_size", "decode_text", "read_input", "read_text",
           "refuse_binary"]
