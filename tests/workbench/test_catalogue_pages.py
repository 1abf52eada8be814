"""The catalogue pages: each profile a row with the library's J, failures with the catalogue
worker's error, the catalogue command's CSV (common practice, no source)."""

import json
import time

from conftest import SAMPLES
from warpwise.catalogue.items import RunOptions
from warpwise.catalogue.workers import analyse_one

from .support import KEY_BAR, upload_sample


def wait_catalogue(client, cid, timeout=180):
    end = time.monotonic() + timeout
    while time.monotonic() < end:
        state = json.loads(client.get(f"/catalogue/{cid}/state").text)
        if state["over"]:
            return state
        time.sleep(0.2)
    raise AssertionError("the catalogue did not finish")


def test_catalogue_of_three_files_one_bad(client, tmp_path):
    client.get("/")  # the form page, before: lists the files opened
    names = ["key_bar_12x8.txt", "channel_thick_80x40.txt"]
    ids = [upload_sample(client, SAMPLES / n)[0] for n in names]
    bad = tmp_path / "open.txt"
    bad.write_text("0 0\n10 0\n10 10\n0 10\n5 5\n12 -3\n")  # a bow-tie: refused
    from .support import upload

    upload(client, "open.txt", bad.read_bytes())
    bad_id = client.bench.store.all()[-1].id
    assert all(f'value="{i}"' in client.get("/catalogue").text for i in [*ids, bad_id])
    r = client.post("/catalogue", data={"file": [*ids, bad_id], "accuracy": "draft"},
                    follow_redirects=False)
    assert r.status_code == 303
    cid = r.headers["location"].rsplit("/", 1)[1]
    state = wait_catalogue(client, cid)
    rows = state["rows"]
    assert [row["name"] for row in rows] == [*names, "open.txt"]
    from warpwise.cli.options import analysis_options, build_parser, read_options

    args = build_parser("props").parse_args(["props", "x", "--accuracy=draft"])
    options = RunOptions(read=read_options(args), analysis=analysis_options(args))
    for row, name in zip(rows[:2], names, strict=True):
        ours = analyse_one(str(SAMPLES / name), options).record.values
        assert row["state"] == "done" and row["J"] == ours["J"] and row["A"] == ours["A"]
    expected = analyse_one(str(bad), options).error.replace(str(bad), "open.txt")
    assert rows[2]["state"] == "failed" and rows[2]["error"] == expected
    page = client.get(f"/catalogue/{cid}").text
    assert "2 of 3 profiles analysed." in page and "open.txt" in page
    csv = client.get(f"/catalogue/{cid}/download/csv")
    assert csv.headers["content-disposition"] == 'attachment; filename="catalogue.csv"'
    lines = csv.text.splitlines()
    assert len(lines) == 3 and lines[1].startswith("key_bar_12x8.txt,")
    got = json.loads(client.get(f"/catalogue/{cid}/download/json").text)
    assert [g["file"] for g in got] == names
    book_has_the_rows_and_the_failure(client, cid, names, expected)
    pdf = client.get(f"/catalogue/{cid}/download/pdf")
    assert pdf.content.startswith(b"%PDF") and pdf.headers["content-type"] == "application/pdf"


def book_has_the_rows_and_the_failure(client, cid, names, error):
    """The workbook download: the catalogue's sheets, a row per profile, the failure listed."""
    import io

    import openpyxl

    r = client.get(f"/catalogue/{cid}/download/xlsx")
    assert r.headers["content-disposition"] == 'attachment; filename="catalogue.xlsx"'
    book = openpyxl.load_workbook(io.BytesIO(r.content))
    assert book.sheetnames == ["properties", "failures", "materials"]
    rows = list(book["properties"].iter_rows(min_row=3, values_only=True))
    assert [row[0] for row in rows] == names
    failures = list(book["failures"].iter_rows(min_row=2, values_only=True))
    assert ("open.txt", error) in failures


def test_catalogue_without_files_is_refused(client):
    r = client.post("/catalogue", data={"accuracy": "draft"})
    assert r.status_code == 400 and "choose at least one opened file" in r.text


def test_catalogue_cancel(client):
    fid, _ = upload_sample(client, KEY_BAR)
    r = client.post("/catalogue", data={"file": [fid] * 3}, follow_redirects=False)
    cid = r.headers["location"].rsplit("/", 1)[1]
    r = client.post(f"/catalogue/{cid}/cancel")
    assert r.status_code == 200
    state = wait_catalogue(client, cid)
    assert state["over"] and all(row["state"] in ("done", "cancelled") for row in state["rows"])
