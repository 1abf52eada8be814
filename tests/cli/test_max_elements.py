"""--max-elements: the mesh limit is named in every refusal and lifts it (common practice, no
source: a refusal says what lifts it)."""

import json
import math

import pytest

from conftest import SAMPLES
from warpwise.errors import UsageError
from warpwise.properties.run import AnalysisOptions

KEY_BAR = SAMPLES / "key_bar_12x8.txt"


def plate_with_holes(tmp_path, n=12):
    """A 200 x 20 plate with n round holes (24-gons of radius 2), our own invention."""
    lines = ["0 0", "200 0", "200 20", "0 20", ""]
    for k in range(n):
        cx = 10 + 15 * k
        lines += [f"{cx + 2 * math.cos(t):.6f} {10 + 2 * math.sin(t):.6f}"
                  for t in (2 * math.pi * j / 24 for j in range(24))] + [""]
    path = tmp_path / "plate.txt"
    path.write_text("\n".join(lines))
    return path


def test_a_small_limit_refuses_and_names_the_option(cli):
    code, _, err = cli("props", KEY_BAR, "--max-elements", "50")
    assert code == 2
    assert "more than the limit of 50" in err and "--max-elements N lifts the limit" in err


def test_the_limit_refuses_before_meshing_and_lifts(cli, tmp_path):
    path = plate_with_holes(tmp_path)
    code, _, err = cli("props", path, "--max-elements", "1000")
    assert code == 2
    assert "more than the limit of 1,000" in err and "--max-elements N lifts" in err
    code, out, err = cli("props", path, "--max-elements", "100000", "--json")
    assert code == 0, err
    # closed form: 200 x 20 less 12 regular 24-gons of circumradius 2 (24/2 r^2 sin(2 pi/24))
    hole = 12 * 2**2 * math.sin(2 * math.pi / 24)
    # 1e-7: the hole vertices are written to 6 decimals, up to 5e-7 off each, so the area may be
    # off by about 5e-7 times the holes' perimeter (151 mm): 8e-5 mm2 = 2e-8 of A
    assert json.loads(out)["A"] == pytest.approx(4000 - 12 * hole, rel=1e-7)


def test_a_larger_limit_lifts_the_boundary_limit_in_proportion(monkeypatch):
    from warpwise.errors import UsageError as Refused
    from warpwise.geometry.profile import profile_from_loops
    from warpwise.mesh import triangulate
    from warpwise.mesh.core import build_mesh

    bar = profile_from_loops([[(0, 0), (30, 0), (30, 4), (4, 4), (4, 30), (0, 30)]])
    points = len(build_mesh(bar).triangulation.segments)
    monkeypatch.setattr(triangulate, "MAX_BOUNDARY_POINTS", points // 2)
    with pytest.raises(Refused, match="--max-elements N lifts the limit"):
        build_mesh(bar)
    # twice the default element limit: twice the boundary points, enough here
    assert build_mesh(bar, max_elements=2 * triangulate.MAX_ELEMENTS).n_elements > 0


def test_estimates_and_adaptive_runs_keep_within_it(cli):
    # the finer meshes of the estimate (4 times the elements) must fit too
    code, _, err = cli("props", KEY_BAR, "--max-elements", "400", "--estimate-errors")
    assert code == 2 and "more than the limit of 400" in err
    code, _, err = cli("props", KEY_BAR, "--max-elements", "5000", "--estimate-errors")
    assert code == 0, err


@pytest.mark.parametrize("value", [0, -3, 2.5, True])
def test_the_limit_is_a_positive_whole_number(value):
    with pytest.raises(UsageError, match="element limit must be a positive whole number"):
        AnalysisOptions(max_elements=value)
