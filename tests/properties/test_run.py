"""The one entry from options to a result, shared by every command, the catalogue and scripts."""

import pytest

from warpwise.catalogue import RunOptions, analyse_one
from warpwise.cli import main
from warpwise.errors import UsageError
from warpwise.fem import solve as solve_module
from warpwise.geometry.shapes import rectangle
from warpwise.io.options import ReadOptions
from warpwise.properties.analysis import analyse
from warpwise.properties.run import AnalysisOptions, run_analysis

SAMPLE = "sample_sections/channel_thick_80x40.txt"


def test_poisson_out_of_range_is_a_usage_error():
    # a value the user gave is a usage error (exit 2), not a failed analysis
    with pytest.raises(UsageError):
        analyse(rectangle(10.0, 5.0), poisson=0.7)
    with pytest.raises(UsageError):
        AnalysisOptions(poisson=-1.5)


def test_catalogue_keeps_error_estimates_with_a_material():
    out = analyse_one(SAMPLE, RunOptions(analysis=AnalysisOptions(
        estimate_errors=True, material="steel-S235", accuracy="draft")))
    assert out.ok, out.error
    assert out.record.errors is not None and out.record.errors["J"] > 0


def test_one_material_collapse_is_the_same_everywhere():
    prof = ReadOptions().load(SAMPLE)
    res = run_analysis(prof, AnalysisOptions(material="steel-S235"))
    assert not res.composite and res.materials.names == ("steel-S235",)
    assert res.materials.E_ref == pytest.approx(210000.0)


def test_catalogue_solver_option_reaches_the_solver(tmp_path, monkeypatch):
    used = []
    real = solve_module.SPDFactor.__init__

    def spy(self, matrix, method="auto"):
        used.append(method)
        real(self, matrix, method)

    monkeypatch.setattr(solve_module.SPDFactor, "__init__", spy)
    code = main(["catalogue", SAMPLE, "--csv", str(tmp_path / "t.csv"), "--jobs", "1",
                 "--solver", "amg"])
    assert code == 0
    assert used and set(used) == {"amg"}


def test_bad_poisson_on_the_catalogue_is_refused_before_work(tmp_path, capsys):
    code = main(["catalogue", SAMPLE, "--csv", str(tmp_path / "t.csv"), "--poisson", "0.7"])
    assert code == 2
    assert not (tmp_path / "t.csv").exists()
    assert "Poisson's ratio must lie in (-1, 0.5)" in capsys.readouterr().err


def test_timings_are_reported():
    res = analyse(rectangle(10.0, 5.0), bounds=True)
    assert {"mesh", "basis", "assembly", "factorise", "warping", "bounds", "shear",
            "plastic"} <= set(res.timings)
    assert all(t >= 0 for t in res.timings.values())


def test_error_estimate_keys_are_declared_once():
    # the estimate, the CSV columns and the table's error column read one list
    from warpwise.properties.accuracy import ERROR_KEYS, ERROR_OF_QUANTITY, estimate_errors
    from warpwise.report.files import csv_text
    from warpwise.report.quantities import QUANTITY_BY_KEY

    est = estimate_errors(rectangle(20.0, 10.0), refine=0.5)
    assert tuple(est.relative_error) == ERROR_KEYS
    header = csv_text([est.result]).splitlines()[0].split(",")
    assert [h.split(" est.")[0] for h in header if "est. rel. error" in h] == list(ERROR_KEYS)
    assert set(ERROR_OF_QUANTITY) <= set(QUANTITY_BY_KEY)
