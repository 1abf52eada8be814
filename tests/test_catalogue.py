import csv
import io
import json
from concurrent.futures import ProcessPoolExecutor, ThreadPoolExecutor

import pytest

from conftest import SAMPLES, sample_folder
from warpwise.catalogue import RunOptions, analyse_one, collect_files, run_catalogue
from warpwise.report.files import csv_text

FEW = ["key_bar_12x8.txt", "channel_thick_80x40.txt", "angle_thick_60x40x8.dxf"]


@pytest.fixture
def folder(tmp_path):
    d = sample_folder(tmp_path / "profiles", FEW)
    (d / "broken.txt").write_text("0 0\n10 0\n10 10\n")  # only a triangle... valid
    (d / "open.dxf").write_text("0\nSECTION\n2\nENTITIES\n0\nLINE\n8\n0\n10\n0\n20\n0\n11\n5\n21\n0\n"
                                "0\nENDSEC\n0\nEOF\n")
    return d


def test_catalogue_rows_equal_single_runs_and_failures_listed(cli, folder, tmp_path):
    out = tmp_path / "cat.csv"
    js = tmp_path / "cat.json"
    code, _, err = cli("catalogue", folder, "--csv", out, "--json", js, "--jobs", "2")
    assert code == 1  # the open drawing fails, the rest are written
    assert "open.dxf" in err and "4 of 5 profiles analysed" in err
    assert "Traceback" not in err
    rows = list(csv.DictReader(io.StringIO(out.read_text())))
    assert len(rows) == 4
    by_file = {r["file"].split("/")[-1]: r for r in rows}
    assert set(by_file) == {*FEW, "broken.txt"}
    # each row carries the same values as a single-profile run (common practice, no source)
    code, single, _ = cli("props", folder / "channel_thick_80x40.txt", "--json")
    obj = json.loads(single)
    row = by_file["channel_thick_80x40.txt"]
    for key, unit in (("J", "mm4"), ("Cw", "mm6"), ("Ix", "mm4"), ("A", "mm2")):
        assert float(row[f"{key} ({unit})"]) == pytest.approx(obj[key], rel=1e-9)
    assert len(json.loads(js.read_text())) == 4


def test_parallel_and_serial_tables_identical():
    files = [SAMPLES / n for n in FEW]
    serial = csv_text([o.record for o in run_catalogue(files, jobs=1)], units="mm")
    with ProcessPoolExecutor(max_workers=2) as pool:
        parallel = csv_text([o.record for o in run_catalogue(files, executor=pool)], units="mm")
    with ThreadPoolExecutor(max_workers=2) as pool:
        threads = csv_text([o.record for o in run_catalogue(files, executor=pool)], units="mm")
    assert serial == parallel == threads


def test_dask_local_cluster():
    distributed = pytest.importorskip("distributed", reason="dask[distributed] is not installed")
    files = [SAMPLES / n for n in FEW[:2]]
    with distributed.LocalCluster(n_workers=1, threads_per_worker=1, processes=False) as cluster, \
            distributed.Client(cluster) as client:
        outs = run_catalogue(files, executor=client.get_executor())
    assert [o.ok for o in outs] == [True, True]
    assert csv_text([o.record for o in outs], units="mm") == csv_text(
        [o.record for o in run_catalogue(files, jobs=1)], units="mm")


def test_exception_mid_run_leaves_no_output(tmp_path, monkeypatch):
    # an interruption (here: an exception from the progress callback, as Ctrl-C would raise)
    # must not leave a partial CSV behind
    from warpwise.cli import catalogue_command
    from warpwise.cli import commands as cli_module

    out = tmp_path / "never.csv"

    def boom(*args, **kwargs):
        raise KeyboardInterrupt

    monkeypatch.setattr(catalogue_command, "run_catalogue", boom)
    code = cli_module.main(["catalogue", str(SAMPLES), "--csv", str(out)])
    assert code == 130
    assert not out.exists()
    assert not list(tmp_path.glob(".never.csv.*"))


def test_one_failure_is_an_outcome_not_an_exception(tmp_path):
    bad = tmp_path / "bad.txt"
    bad.write_text("0 0\n1 1\n2 0\n0 1\n")  # a bow-tie
    out = analyse_one(str(bad), RunOptions())
    assert not out.ok and "crosses itself" in out.error and out.record is None


def test_collect_files(tmp_path):
    with pytest.raises(Exception, match="not found"):
        collect_files([tmp_path / "nope"])
    with pytest.raises(Exception, match="no profile files"):
        collect_files([tmp_path])
    assert len(collect_files([SAMPLES])) >= 8


def test_html_datasheets_and_index(cli, tmp_path):
    html = tmp_path / "html"
    code, _, err = cli("catalogue", SAMPLES / FEW[0], SAMPLES / FEW[1], "--html", html,
                       "--jobs", "1")
    assert code == 0, err
    pages = sorted(p.name for p in html.glob("*.html"))
    assert "index.html" in pages and len(pages) == 3
    index = (html / "index.html").read_text()
    assert "key_bar_12x8" in index and "<svg" in index


def test_plot_and_shapes_commands(cli, tmp_path):
    png = tmp_path / "m.png"
    code, _, err = cli("plot", SAMPLES / "key_bar_12x8.txt", "--show", "torsion", "--torque", "100",
                       "-o", png)
    assert code == 0, err
    assert png.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"
    code, out, _ = cli("shapes")
    assert code == 0 and "i_beam" in out


def test_props_shape_and_material(cli):
    code, out, err = cli("props", "--shape", "rectangle:b=20,h=10", "--material", "steel-S355",
                         "--json")
    assert code == 0, err
    obj = json.loads(out)
    # rectangle b h^3 / 12 and E A (exact geometry; E from EN 1993-1-1)
    assert obj["Ix"] == pytest.approx(20 * 10**3 / 12, rel=1e-12)
    assert obj["EA"] == pytest.approx(210000.0 * 200.0, rel=1e-12)
    assert obj["Wpl_x"] == pytest.approx(20 * 10**2 / 4, rel=1e-12)


def test_stress_combined_json(cli):
    code, out, err = cli("stress", "--help")
    assert code == 0
    code, out, err = cli("stress", SAMPLES / "key_bar_12x8.txt", "--axial", "1000", "--moment-x",
                         "2000", "--material", "steel-S355", "--json")
    assert code == 0, err
    obj = json.loads(out)
    assert obj["von_mises_max"] > 0 and obj["materials"][0]["utilisation"] > 0
