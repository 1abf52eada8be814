"""What an adaptive run towards --target-error reached, why it stopped, and the exit status.

The bound checked is the guaranteed bracket of J (warping upper bound, equilibrated-flux or Prandtl
lower bound; its bracketing is checked against closed forms in tests/validation). Here the
outcome of the run is asserted exactly: which mesh stops it and with which reason.
"""

from __future__ import annotations

import csv
import io
import json
import re

import ezdxf
import pytest

from warpwise.cli import main
from warpwise.cli.commands import EXIT_INPUT, EXIT_TARGET
from warpwise.geometry import profile_from_loops
from warpwise.geometry.shapes import circle
from warpwise.mesh.core import build_mesh
from warpwise.properties.adapt import ROUND_OFF, refine_adaptively
from warpwise.properties.analysis import (
    ELEMENT_BUDGET,
    REACHED,
    ROUND_OFF_FLOOR,
    STEP_LIMIT,
    TargetStatus,
)
from warpwise.properties.run import AnalysisOptions, run_analysis
from warpwise.report.files import TARGET_COLUMNS

#: An invented 30 x 30 x 4 angle: a re-entrant corner, so refinement has work to do.
ANGLE = profile_from_loops([[(0, 0), (30, 0), (30, 4), (4, 4), (4, 30), (0, 30)]])

ROUND_OFF_TEXT = ("stopped at the round-off floor: the warping error indicator is at round-off, "
                  "so refinement has nothing left to steer by")


def _bounds(run):
    return [h[2] for h in run.history]


def test_target_reached_stops_at_the_first_mesh_within_it():
    # 5e-6: the default mesh of the angle is certainly within 1.7e-5 (measured), so a looser
    # target would stop at the first mesh; this one takes three (1.7e-5, 6.6e-6, 2.6e-6)
    run = refine_adaptively(ANGLE, 5e-6)
    s = run.status
    bounds = _bounds(run)
    assert s.stopped == REACHED and s.met
    assert s.meshes == len(run.history) > 1
    assert s.reached == run.estimate == bounds[-1] <= 5e-6
    assert all(b > 5e-6 for b in bounds[:-1])  # no earlier mesh was within the target
    t = run.result.torsion
    assert s.reached == (t.J - t.J_low) / t.J_low
    assert s.text == (f"target error 5e-06 met: J is certainly within {s.reached:.2g} after "
                      f"{s.meshes} meshes, the last of {run.result.mesh.n_nodes:,} nodes")


def test_step_limit_says_so_with_the_bound_reached():
    run = refine_adaptively(ANGLE, 1e-9, max_steps=3)
    s = run.status
    assert (s.meshes, s.stopped, s.met) == (3, STEP_LIMIT, False)
    assert s.reached == _bounds(run)[-1] > 1e-9
    assert run.result.mesh.n_nodes == run.history[-1][0]  # the result is the last mesh solved
    assert s.text == (f"target error 1e-09 missed: J is certainly within {s.reached:.2g} after 3 "
                      f"meshes, the last of {run.result.mesh.n_nodes:,} nodes; stopped at the step "
                      "limit: no more meshes are solved")


def test_element_budget_keeps_the_last_mesh_within_it():
    first = build_mesh(ANGLE).n_elements
    run = refine_adaptively(ANGLE, 1e-9, max_elements=first)  # any refinement adds elements
    s = run.status
    assert (s.meshes, s.stopped, s.met) == (1, ELEMENT_BUDGET, False)
    assert run.result.mesh.n_elements == first
    assert s.text.endswith(f"stopped at the element budget: the next mesh would have had more "
                           f"than {first:,} elements, the limit (--max-elements N sets it; the "
                           "default follows this machine's memory)")
    wider = refine_adaptively(ANGLE, 1e-9, max_elements=3 * first)
    assert wider.status.stopped == ELEMENT_BUDGET and 1 < wider.status.meshes < 12
    assert wider.result.mesh.n_elements <= 3 * first


def test_round_off_floor_on_a_round_bar():
    # the warping function of a solid round bar is zero (Saint-Venant's solution; common
    # practice, no source): the indicator is round-off, so refinement cannot be steered
    run = refine_adaptively(circle(20.0), 1e-12)
    s = run.status
    assert (s.meshes, s.stopped, s.met) == (1, ROUND_OFF_FLOOR, False)
    assert run.history[0][3] <= ROUND_OFF
    assert s.reached > 1e-12
    assert s.text.endswith(ROUND_OFF_TEXT)


def test_run_analysis_carries_the_status():
    res = run_analysis(circle(20.0), AnalysisOptions(target_error=1e-12))
    t = res.torsion
    assert res.target == TargetStatus(1e-12, (t.J - t.J_low) / t.J_low, 1, ROUND_OFF_FLOOR,
                                      res.mesh.n_nodes, AnalysisOptions().max_elements)
    assert run_analysis(circle(20.0)).target is None


def test_props_missed_target_exit_status_table_json_csv(capsys, tmp_path):
    out_csv = tmp_path / "t.csv"
    code = main(["props", "--shape", "circle:d=20", "--target-error", "1e-12", "--json",
                 "--csv", str(out_csv)])
    out, err = capsys.readouterr()
    assert code == EXIT_TARGET == 4
    target = json.loads(out)["target"]
    assert (target["error"], target["meshes"], target["stopped"], target["met"]) == \
        (1e-12, 1, ROUND_OFF_FLOOR, False)
    missed = (f"target error 1e-12 missed: J is certainly within {target['reached']:.2g} after "
              f"1 mesh of {target['nodes']:,} nodes; {ROUND_OFF_TEXT}")
    assert err == f"warpwise: warning: circle d=20: {missed}\n"
    assert json.loads(out)["warnings"] == [missed]
    row = next(csv.DictReader(io.StringIO(out_csv.read_text())))
    assert [row[c] for c in TARGET_COLUMNS] == \
        ["1e-12", f"{target['reached']:.3g}", "1", ROUND_OFF_FLOOR]
    assert row["warnings (text)"] == missed
    main(["props", "--shape", "circle:d=20", "--target-error", "1e-12"])
    assert f"  WARNING: {missed}\n" in capsys.readouterr().out


def test_props_target_met_exits_0_with_a_note(capsys):
    code = main(["props", "--shape", "circle:d=20", "--target-error", "0.001"])
    out, err = capsys.readouterr()
    assert (code, err) == (0, "")
    note = next(ln for ln in out.splitlines() if "target error" in ln)
    assert note.startswith("  note: target error 0.001 met: J is certainly within ")
    assert re.search(r" after 1 mesh of [0-9,]+ nodes$", note), note


@pytest.fixture
def round_bar_dxf(tmp_path):
    doc = ezdxf.new()
    doc.header["$INSUNITS"] = 4  # millimetres
    doc.modelspace().add_circle((0, 0), 10.0)
    path = tmp_path / "bar.dxf"
    doc.saveas(path)
    return path


def test_catalogue_missed_target_alone_exits_4(round_bar_dxf, tmp_path, capsys):
    out_csv = tmp_path / "c.csv"
    code = main(["catalogue", str(round_bar_dxf), "--csv", str(out_csv), "--jobs", "1",
                 "--target-error", "1e-12"])
    assert code == EXIT_TARGET
    row = next(csv.DictReader(io.StringIO(out_csv.read_text())))
    assert (row["meshes solved (count)"], row["stopped by (text)"]) == ("1", ROUND_OFF_FLOOR)
    assert ROUND_OFF_TEXT in capsys.readouterr().err


def test_catalogue_failure_outranks_a_missed_target(round_bar_dxf, tmp_path, capsys):
    # documented in the README's exit code table: a profile that failed gives 1 (input defect)
    bad = tmp_path / "two_points.txt"
    bad.write_text("0 0\n10 0\n")
    out_csv = tmp_path / "c.csv"
    code = main(["catalogue", str(round_bar_dxf), str(bad), "--csv", str(out_csv), "--jobs", "1",
                 "--target-error", "1e-12"])
    assert code == EXIT_INPUT
    rows = list(csv.DictReader(io.StringIO(out_csv.read_text())))
    assert [r["stopped by (text)"] for r in rows] == [ROUND_OFF_FLOOR]  # the good row is written
    err = capsys.readouterr().err
    assert ROUND_OFF_TEXT in err and f"warpwise: error: {bad}: " in err
