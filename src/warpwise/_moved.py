"""Import paths of modules that moved into the pipeline packages, kept for one release.

``import warpwise.section`` and the like still work: the old name becomes a module that looks
each attribute up in the new modules and warns once with a :class:`DeprecationWarning` that
names the new place. Removed in the release after 0.2.
"""

from __future__ import annotations

import importlib
import importlib.machinery
import sys
import types
import warnings

#: Old module -> the modules that now hold its names, in lookup order.
MOVED: dict[str, tuple[str, ...]] = {
    "warpwise.shapes": ("warpwise.geometry.shapes",),
    "warpwise.corners": ("warpwise.geometry.corners",),
    "warpwise.symmetry": ("warpwise.geometry.symmetry",),
    "warpwise.check": ("warpwise.io.check", "warpwise.report.check_plot"),
    "warpwise.solve": ("warpwise.fem.solve",),
    "warpwise.section": ("warpwise.properties.geometric", "warpwise.properties.torsion"),
    "warpwise.shear": ("warpwise.properties.shear",),
    "warpwise.bounds": ("warpwise.properties.bounds",),
    "warpwise.plastic": ("warpwise.properties.plastic",),
    "warpwise.analysis": ("warpwise.properties.analysis",),
    "warpwise.accuracy": ("warpwise.properties.accuracy",),
    "warpwise.adapt": ("warpwise.properties.adapt",),
    "warpwise.combined": ("warpwise.stress.combined", "warpwise.stress.loads"),
}


class _MovedModules:
    """Finder and loader of the old module names in :data:`MOVED`.

    The finder and loader protocols of :mod:`importlib` are met by the methods alone, so the
    abstract base classes (and ``importlib.abc``, which costs start-up time) are not needed.
    """

    def find_spec(self, fullname: str, path: object = None,
                  target: object = None) -> importlib.machinery.ModuleSpec | None:  # noqa: D102
        if fullname not in MOVED:
            return None
        return importlib.machinery.ModuleSpec(fullname, self)

    def create_module(self, spec: importlib.machinery.ModuleSpec) -> None:  # noqa: D102
        return None

    def exec_module(self, module: types.ModuleType) -> None:  # noqa: D102
        targets = MOVED[module.__name__]
        warnings.warn(f"{module.__name__} has moved to {', '.join(targets)}; the old name goes "
                      "in the next release", DeprecationWarning, stacklevel=2)
        homes = [importlib.import_module(t) for t in targets]

        def lookup(name: str) -> object:
            for home in homes:
                if hasattr(home, name):
                    return getattr(home, name)
            raise AttributeError(f"module {module.__name__!r} has no attribute {name!r}")

        module.__getattr__ = lookup  # type: ignore[attr-defined]
        module.__all__ = sorted({n for h in homes for n in getattr(h, "__all__", dir(h))
                                 if not n.startswith("_")})


def install() -> None:
    """Put the finder of moved module names on :data:`sys.meta_path` (once)."""
    if not any(isinstance(f, _MovedModules) for f in sys.meta_path):
        sys.meta_path.append(_MovedModules())
