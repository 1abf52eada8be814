"""Every cross-reference in a docstring names something that exists.

The defect this guards: a reader's docstring cited a function that did not exist. Each
``:func:``, ``:class:``, ``:mod:``, ``:data:``, ``:meth:`` or ``:attr:`` role with a full
``warpwise.`` path is resolved by importing the module and looking the rest up. Common
practice, no source (Sphinx's nitpicky mode does the same).
"""

from __future__ import annotations

import importlib
import re
from pathlib import Path

import pytest

SRC = Path(__file__).resolve().parents[1] / "src" / "warpwise"
ROLE = re.compile(r":(?:func|class|mod|data|meth|attr|exc):`~?\.?(\w+(?:\.\w+)*)`")


def _module_name(path: Path) -> str:
    parts = ["warpwise", *path.relative_to(SRC).with_suffix("").parts]
    return ".".join(parts[:-1] if parts[-1] == "__init__" else parts)


def _references() -> list[tuple[str, str]]:
    """(module, target) of every role; a short target is looked up in its own module."""
    out = []
    for path in sorted(SRC.rglob("*.py")):
        for target in ROLE.findall(path.read_text()):
            out.append((_module_name(path), target))
    return sorted(set(out))


def _resolve(where: str, target: str) -> bool:
    if not target.startswith("warpwise"):
        if _resolve_absolute(target) or _member_of_a_class(where, target):
            return True
        # a short name: from the citing module, or a module beside it in the package
        package = where if (SRC / Path(*where.split(".")[1:]) / "__init__.py").exists() \
            else where.rsplit(".", 1)[0]
        return any(_resolve(where, f"{base}.{target}") for base in (where, package, "warpwise"))
    return _lookup(target.split("."))


def _lookup(parts: list[str], *, attribute_needed: bool = False) -> bool:
    """Import the longest importable prefix of ``parts`` and look the rest up on it.

    A dataclass field documented as an attribute has no class attribute and counts too. With
    ``attribute_needed`` at least one part is an attribute (a bare short name is not taken for
    a top-level module).
    """
    for k in range(len(parts) - int(attribute_needed), 0, -1):
        try:
            obj = importlib.import_module(".".join(parts[:k]))
        except ImportError:
            continue
        try:
            for name in parts[k:]:
                obj = getattr(obj, name)
        except AttributeError:
            return len(parts) > k and parts[-1] in getattr(obj, "__dataclass_fields__", {})
        return True
    return False


def _resolve_absolute(target: str) -> bool:
    """A builtin or another library's name (``DeprecationWarning``, ``numpy.ndarray``)."""
    import builtins

    return hasattr(builtins, target) or _lookup(target.split("."), attribute_needed=True)


def _member_of_a_class(where: str, name: str) -> bool:
    """``:meth:`moved``` inside a class: a method, property or field of a class of the module."""
    module = importlib.import_module(where)
    for obj in vars(module).values():
        if isinstance(obj, type) and obj.__module__ == where and (
                hasattr(obj, name) or name in getattr(obj, "__dataclass_fields__", {})):
            return True
    return False


REFS = _references()


def test_there_are_references():
    assert len(REFS) > 20


@pytest.mark.parametrize("where,target", REFS, ids=[f"{w}:{t}" for w, t in REFS])
def test_reference_resolves(where, target):
    assert _resolve(where, target), f"{where} cites {target}, which does not exist"
