"""What every page handler shares: the workbench of a request, things looked up or a 404."""

from __future__ import annotations

from collections.abc import Callable
from typing import Any

from starlette.requests import Request


class NotFoundError(Exception):
    """A file, job, catalogue or download the workbench does not have (a 404 page)."""


def bench(request: Request):
    """The :class:`~warpwise.workbench.app.Workbench` serving the request."""
    return request.app.state.bench


def found(request: Request, lookup: Callable[[str], Any], param: str, what: str) -> Any:
    """``lookup(path parameter)``, or a 404 page saying that there is no such ``what``."""
    thing = lookup(request.path_params[param])
    if thing is None:
        raise NotFoundError(f"no such {what} (the workbench forgets them when it stops)")
    return thing


def option_lists() -> dict:
    """The choices every form offers: units, report units, accuracy levels, materials."""
    from ..geometry.profile import LENGTH_UNITS
    from ..materials import BUILTIN
    from ..properties.accuracy import ACCURACY_LEVELS
    from ..units import SYSTEMS

    return {"length_units": sorted(LENGTH_UNITS), "systems": list(SYSTEMS),
            "accuracies": list(ACCURACY_LEVELS), "materials": list(BUILTIN)}


def tables(store) -> list:
    """The opened files that are materials tables (named ``.toml``)."""
    return [u for u in store.all() if u.name.lower().endswith(".toml")]


def chosen_table(store, form) -> tuple[str, str] | None:
    """The materials table a form chose (field ``materials_table``, an upload's id).

    Returns (where it is stored, its shown name), or None when none was chosen.
    """
    upload = store.get(str(form.get("materials_table") or ""))
    return None if upload is None else (upload.path, upload.name)
