"""The default element limit follows the machine's memory (mesh/budget.py)."""

from __future__ import annotations

import pytest

from warpwise.geometry.shapes import rectangle
from warpwise.mesh.budget import (
    BYTES_PER_ELEMENT,
    MEMORY_SHARE,
    MIN_DEFAULT,
    default_element_limit,
    element_limit_for,
)
from warpwise.mesh.sizing import MAX_ELEMENTS
from warpwise.properties.adapt import refine_adaptively
from warpwise.properties.analysis import ELEMENT_BUDGET
from warpwise.properties.run import AnalysisOptions


def test_limit_from_memory():
    # the rule (common practice, no source): a share of the memory at the measured peak per
    # element, between a floor and the fixed cap
    assert element_limit_for(10 * 10**9) == int(MEMORY_SHARE * 10 * 10**9 // BYTES_PER_ELEMENT)
    assert element_limit_for(10**15) == MAX_ELEMENTS
    assert element_limit_for(1) == MIN_DEFAULT
    assert element_limit_for(None) == MAX_ELEMENTS  # the system does not say: the cap


def test_options_default_to_the_machine_limit():
    assert AnalysisOptions().max_elements == default_element_limit()
    assert AnalysisOptions(max_elements=1234).max_elements == 1234


def test_refinement_stops_at_the_limit_and_says_so():
    # a 30 x 4 rectangle to 1e-12 cannot be reached within 3,000 elements: the refinement stops
    # before a mesh over the limit, never solving one, and names the limit and the last mesh
    run = refine_adaptively(rectangle(30.0, 4.0), 1e-12, max_elements=3000)
    s = run.status
    assert s.stopped == ELEMENT_BUDGET and not s.met
    assert run.result.mesh.n_elements <= 3000
    assert s.nodes == run.result.mesh.n_nodes
    assert f", the last of {s.nodes:,} nodes;" in s.text and "more than 3,000 elements" in s.text
    with pytest.raises(Exception, match="3,000"):
        refine_adaptively(rectangle(30.0, 4.0), 1e-3, mesh_size=0.1, max_elements=3000)
