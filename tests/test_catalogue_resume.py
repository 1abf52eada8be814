"""Resumable catalogue runs: the journal, an interrupted run going on, and a Dask cluster.

A run keeps each analysed profile in a journal beside its first output as it finishes; a run
interrupted after some profiles and given again analyses only the others, and its final table
is byte for byte the table of a run never interrupted (common practice, no source: a resumed
batch job must give the batch's result). The journal's records read back equal, float for
float (Python's float repr round-trips exactly, IEEE 754 double).
"""

from __future__ import annotations

import pytest

from conftest import SAMPLES, sample_folder
from warpwise import catalogue
from warpwise.catalogue import analyse_one, cluster, run
from warpwise.catalogue.journal import HEADER, journal_path, read_journal, record_from_json, record_to_json
from warpwise.cli import main
from warpwise.report.files import csv_text, json_text

FEW = ["key_bar_12x8.txt", "channel_thick_80x40.txt", "angle_thick_60x40x8.dxf",
       "handrail_hollow.txt"]


@pytest.fixture
def folder(tmp_path):
    return sample_folder(tmp_path / "profiles", FEW)


def counting(monkeypatch, stop_after: int | None = None) -> list[str]:
    """Count the profiles analysed (in this process: --jobs 1); Ctrl-C after ``stop_after``."""
    seen: list[str] = []

    def one(item, *args, **kwargs):
        if stop_after is not None and len(seen) == stop_after:
            raise KeyboardInterrupt
        seen.append(item.path)
        return analyse_one(item, *args, **kwargs)

    monkeypatch.setattr(run, "analyse_one", one)
    return seen


def test_records_read_back_equal():
    outs = [analyse_one(str(SAMPLES / n), catalogue.RunOptions()) for n in FEW]
    records = [o.record for o in outs]
    again = [record_from_json(record_to_json(r)) for r in records]
    assert csv_text(again, units="mm") == csv_text(records, units="mm")
    assert json_text(again) == json_text(records)


def test_interrupted_run_goes_on_and_ends_equal(folder, tmp_path, monkeypatch, capsys):
    whole = tmp_path / "whole.csv"
    assert main(["catalogue", str(folder), "--csv", str(whole), "--jobs", "1"]) == 0
    out = tmp_path / "cat.csv"
    seen = counting(monkeypatch, stop_after=2)
    assert main(["catalogue", str(folder), "--csv", str(out), "--jobs", "1"]) == 130
    err = capsys.readouterr().err
    kept = journal_path(out)
    assert f"2 analysed profiles kept in {kept}" in err.splitlines()[-1]
    assert not out.exists()  # nothing claims to be the table
    assert len(read_journal(kept)) == 2 and len(seen) == 2
    seen = counting(monkeypatch)
    assert main(["catalogue", str(folder), "--csv", str(out), "--jobs", "1"]) == 0
    assert len(seen) == len(FEW) - 2  # only the profiles the first run had not finished
    assert out.read_bytes() == whole.read_bytes()
    assert not kept.exists()  # the journal goes once the table is written


def test_changed_profile_and_fresh_are_analysed_again(folder, tmp_path, monkeypatch):
    out = tmp_path / "cat.csv"
    counting(monkeypatch, stop_after=3)
    assert main(["catalogue", str(folder), "--csv", str(out), "--jobs", "1"]) == 130
    # the first three (in path order) are kept; one of them changes: new content, a new key
    bar = folder / "channel_thick_80x40.txt"
    bar.write_text(bar.read_text() + "\n")
    seen = counting(monkeypatch, stop_after=None)
    assert main(["catalogue", str(folder), "--csv", str(out), "--jobs", "1"]) == 0
    assert sorted(seen) == [str(bar), str(folder / "key_bar_12x8.txt")]
    counting(monkeypatch, stop_after=2)
    assert main(["catalogue", str(folder), "--csv", str(out), "--jobs", "1"]) == 130
    seen = counting(monkeypatch)
    assert main(["catalogue", str(folder), "--csv", str(out), "--jobs", "1", "--fresh"]) == 0
    assert len(seen) == len(FEW)


def test_other_options_are_analysed_again(folder, tmp_path, monkeypatch):
    out = tmp_path / "cat.csv"
    counting(monkeypatch, stop_after=2)
    assert main(["catalogue", str(folder), "--csv", str(out), "--jobs", "1"]) == 130
    seen = counting(monkeypatch)
    assert main(["catalogue", str(folder), "--csv", str(out), "--jobs", "1",
                 "--accuracy", "fine"]) == 0
    assert len(seen) == len(FEW)


def test_a_file_in_the_journals_place_is_refused(folder, tmp_path, capsys):
    out = tmp_path / "cat.csv"
    journal_path(out).write_text("the user's own notes\n")
    assert main(["catalogue", str(folder), "--csv", str(out), "--jobs", "1"]) == 2
    err = capsys.readouterr().err
    assert "cat.csv.partial: is in the way of this run's journal" in err
    assert journal_path(out).read_text() == "the user's own notes\n"
    assert not out.exists()


def test_a_line_cut_short_is_ignored(tmp_path):
    import json

    path = tmp_path / "t.csv.partial"
    rec = analyse_one(str(SAMPLES / FEW[0]), catalogue.RunOptions()).record
    line = json.dumps({"key": "k1", "path": "bar.txt", "seconds": 0.1, "datasheet": None, "thumbnail": None,
                       "record": record_to_json(rec)})
    path.write_text(json.dumps(HEADER) + "\n" + line + "\n" + line[:100])
    assert list(read_journal(path)) == ["k1"]


def test_interrupted_datasheets_go_on(folder, tmp_path, monkeypatch):
    pages = tmp_path / "pages"
    counting(monkeypatch, stop_after=2)
    assert main(["catalogue", str(folder), "--html", str(pages), "--jobs", "1"]) == 130
    assert not pages.exists()  # the folder appears whole or not at all
    seen = counting(monkeypatch)
    assert main(["catalogue", str(folder), "--html", str(pages), "--jobs", "1"]) == 0
    assert len(seen) == len(FEW) - 2
    names = sorted(p.name for p in pages.iterdir())
    assert names == sorted(["index.html", *(n.replace(".", "-") + ".html" for n in FEW)])
    index = (pages / "index.html").read_text()
    assert all(f'href="{n.replace(".", "-")}.html"' in index for n in FEW)
    assert sorted(p.name for p in tmp_path.iterdir()) == ["pages", "profiles"]


def test_cluster_from_the_command_line_gives_the_same_table(folder, tmp_path):
    pytest.importorskip("distributed", reason="Dask's distributed package is not installed")
    pool = tmp_path / "pool.csv"
    dask = tmp_path / "dask.csv"
    assert main(["catalogue", str(folder), "--csv", str(pool), "--jobs", "2"]) == 0
    # a real LocalCluster of two worker processes (--cluster local)
    assert main(["catalogue", str(folder), "--csv", str(dask), "--cluster", "local",
                 "--jobs", "2"]) == 0
    assert dask.read_bytes() == pool.read_bytes()


def test_unreachable_scheduler_is_one_line(folder, tmp_path, capsys, monkeypatch):
    pytest.importorskip("distributed", reason="Dask's distributed package is not installed")
    monkeypatch.setattr(cluster, "CLUSTER_TIMEOUT", 1.0)
    out = tmp_path / "cat.csv"
    code = main(["catalogue", str(folder), "--csv", str(out), "--cluster", "tcp://127.0.0.1:9"])
    err = capsys.readouterr().err
    assert code == 2
    assert "cannot reach the Dask scheduler at tcp://127.0.0.1:9" in err
    assert "Traceback" not in err and not out.exists()
