"""Old import paths keep working for one release, with a deprecation warning naming the new one."""

import importlib
import sys

import pytest


@pytest.mark.parametrize("old,name", [
    ("warpwise.section", "geometric_properties"), ("warpwise.analysis", "analyse"),
    ("warpwise.shapes", "rectangle"), ("warpwise.solve", "PinnedSolver"),
    ("warpwise.combined", "Loads"), ("warpwise.corners", "reentrant_corners"),
])
def test_old_module_paths(old, name):
    sys.modules.pop(old, None)
    with pytest.warns(DeprecationWarning, match="has moved to"):
        mod = importlib.import_module(old)
    assert callable(getattr(mod, name))


def test_old_attribute_names():
    from warpwise.geometry.shapes import rectangle
    from warpwise.properties.analysis import analyse

    res = analyse(rectangle(10.0, 4.0))
    with pytest.warns(DeprecationWarning):
        assert res.values is res.basis
    with pytest.warns(DeprecationWarning):
        assert res.transformed is res.weighted
    with pytest.warns(DeprecationWarning):
        assert res.mesh.linear is res.mesh.triangulation
    with pytest.warns(DeprecationWarning):
        moved = res.profile.transformed(shift=(1.0, 0.0))
    assert moved.bounds[0] == pytest.approx(res.profile.bounds[0] + 1.0)
