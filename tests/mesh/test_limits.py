"""The boundary point limit holds after grading towards sharp corners too.

The defect this guards: after corner grading, the number of boundary points was compared with
the element limit (4,000,000) instead of the boundary point limit. Common practice, no source.
"""

import pytest

from warpwise.errors import UsageError
from warpwise.geometry.profile import profile_from_loops
from warpwise.mesh import triangulate
from warpwise.mesh.core import build_mesh

L_SHAPE = profile_from_loops([[(0, 0), (30, 0), (30, 4), (4, 4), (4, 30), (0, 30)]])


def test_corner_grading_respects_the_boundary_point_limit(monkeypatch):
    plain = build_mesh(L_SHAPE)  # within every limit
    graded = len(plain.triangulation.segments)
    # a limit below what corner grading adds, above what the plain split needs (the budget check
    # before grading uses its own copy of the limit and is left alone here)
    monkeypatch.setattr(triangulate, "MAX_BOUNDARY_POINTS", graded // 2)
    with pytest.raises(UsageError) as exc:
        build_mesh(L_SHAPE)
    assert str(exc.value) == (
        f"<profile>: the boundary needs more than {graded // 2:,} points graded towards 1 sharp "
        "re-entrant corner (the limit); give curved outlines more vertices (a turn of under 10 degrees at a "
        "vertex is no sharp corner) or draw them as arcs in a DXF, or analyse one part with --part N; "
        f"--max-elements N lifts the limit (now 4,000,000 elements, {graded // 2:,} boundary points)")
