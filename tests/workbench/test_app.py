"""The workbench through Starlette's test client: every route, and each result checked against
the library's (or the command line's) on the same input (common practice, no source)."""

import html
import json
import re
from dataclasses import replace

import pytest
from markupsafe import escape

from conftest import assert_one_line_error, run_cli
from warpwise.cli.props_output import props_datasheet
from warpwise.io import load_profile
from warpwise.io.check import check_file, format_report
from warpwise.io.options import ReadOptions
from warpwise.properties.run import AnalysisOptions, run_analysis
from warpwise.report.html_parts import number_html
from warpwise.report.records import record_of

from .support import HEAT_SINK, KEY_BAR, RAIL, analyse, cell, upload_sample


def library(path, name, read=None, **analysis):
    """The library's result for a file read and analysed with the given options, and its values."""
    profile = (read or ReadOptions()).load(path)
    result = run_analysis(replace(profile, source=name), AnalysisOptions(**analysis))
    return result, record_of(result).values


def test_home_page_says_the_limits(client):
    r = client.get("/")
    assert r.status_code == 200
    assert "Up to 50 files at once, 25 MB each and\n  100 MB in all" in r.text
    assert 'action="/upload"' in r.text and "/static/workbench.js" in r.text


def test_static_files_are_served(client):
    assert "function poll" in client.get("/static/workbench.js").text
    assert "@media print" in client.get("/static/workbench.css").text


def test_file_page_shows_what_check_reads(client):
    fid, page = upload_sample(client, RAIL)
    text = page.text
    report = check_file(RAIL)
    # the parts, the layers and the verdict as warpwise check finds them
    parts = re.search(r'<ol id="parts">(.*?)</ol>', text, re.S).group(1)
    assert parts.count("<li>part ") == len(report.parts) == 2
    assert "part 2 of 2 taken as the section" in text  # the reader's note
    for layer in report.layers:
        assert f'value="{html.escape(layer.name)}"' in text
    assert "Verdict: analysable" in text
    assert "<svg" in text  # the outline drawn to scale
    shown = format_report(report).replace(str(RAIL), RAIL.name)
    assert html.escape(shown, quote=False) in text
    assert f"/file/{fid}" in text and f'value="{fid}"' not in text


def test_layer_choice_reads_again_like_check(client):
    fid, _ = upload_sample(client, RAIL)
    page = client.get(f"/file/{fid}", params=[("layers_shown", "1"), ("layer", "profile")]).text
    expected = format_report(check_file(RAIL, layers=("profile",))).replace(str(RAIL), RAIL.name)
    assert html.escape(expected, quote=False) in page
    assert "frame: not chosen" in page


def test_part_choice_gives_the_librarys_J(client):
    fid, _ = upload_sample(client, RAIL)
    url, page = analyse(client, fid, part="2")
    _, ours = library(RAIL, RAIL.name, ReadOptions(part=2))
    assert cell(page, "J") == number_html(ours["J"])
    got = json.loads(client.get(url + "/download/json").text)
    assert got["J"] == ours["J"] and got["A"] == ours["A"] and got["file"] == RAIL.name
    # and the command line's JSON of the same choice
    code, out, err = run_cli("props", RAIL, "--part", "2", "--json")
    assert code == 0, err
    assert json.loads(out)["J"] == pytest.approx(got["J"], rel=1e-12)


def test_unit_choice_for_a_drawing_without_one(client):
    fid, page = upload_sample(client, HEAT_SINK)
    assert "millimetres assumed" in page.text
    url, _ = analyse(client, fid, units="in")
    got = json.loads(client.get(url + "/download/json").text)
    _, ours = library(HEAT_SINK, HEAT_SINK.name, ReadOptions(units="in"))
    assert got["units"]["length"] == "in" and got["A"] == ours["A"] and got["J"] == ours["J"]


def test_downloads_are_the_commands_files(client):
    fid, _ = upload_sample(client, KEY_BAR)
    url, page = analyse(client, fid, report_units="cm")
    result, ours = library(KEY_BAR, KEY_BAR.name)
    csv = client.get(url + "/download/csv")
    assert csv.headers["content-disposition"] == 'attachment; filename="key_bar_12x8-txt.csv"'
    header, row = csv.text.splitlines()
    values = dict(zip(header.split(","), row.split(","), strict=True))
    assert float(values["J (cm4)"]) == pytest.approx(ours["J"] * 1e-4, rel=1e-9)
    sheet = client.get(url + "/download/html")
    assert sheet.headers["content-type"].startswith("text/html")
    assert sheet.text == props_datasheet(result, "cm")
    assert "mesh" in page and f"{record_of(result).nodes:,}" in page  # the mesh statistics
    assert "qualified engineer" in page  # the caution


def test_loads_give_the_stress_commands_peaks(client):
    fid, _ = upload_sample(client, RAIL)
    url, page = analyse(client, fid, part="2", torque="20000", shear_y="500",
                        material="aluminium-6063-T6")
    got = json.loads(client.get(url + "/download/stress.json").text)
    code, out, err = run_cli("stress", RAIL, "--part", "2", "--torque", "20000", "--shear-y",
                             "500", "--material", "aluminium-6063-T6", "--json")
    assert code == 0, err
    cli = json.loads(out)
    assert got["tau_max"] == pytest.approx(cli["tau_max"], rel=1e-12)
    assert got["tau_max_at"] == pytest.approx(cli["tau_max_at"], rel=1e-12)
    assert 'id="stress-report"' in page and "Shear stresses in rail_drawing_sheet_a4.dxf" in page


def test_combined_loads_give_the_normal_stress_extremes(client):
    fid, _ = upload_sample(client, KEY_BAR)
    url, page = analyse(client, fid, axial="1000", moment_x="5000")
    got = json.loads(client.get(url + "/download/stress.json").text)
    code, out, err = run_cli("stress", KEY_BAR, "--axial", "1000", "--moment-x", "5000", "--json")
    assert code == 0, err
    cli = json.loads(out)
    for key in cli:
        if key != "file" and isinstance(cli[key], float):
            assert got[key] == pytest.approx(cli[key], rel=1e-12), key
    assert 'id="stress-picture"' in page


@pytest.mark.parametrize("form, args", [
    ({"part": "7"}, ["--part", "7"]),
    ({"torque": "abc"}, ["--torque", "abc"]),
    ({"torque": "1000"}, ["--torque", "1000"]),  # no material, no G
    ({"material": "unobtainium"}, ["--material", "unobtainium"]),
], ids=["no such part", "not a number", "torque without G", "unknown material"])
def test_refused_choices_say_what_the_command_says(client, form, args):
    fid, _ = upload_sample(client, RAIL)
    _, page = analyse(client, fid, **form)
    command = "stress" if "torque" in form else "props"
    code, _, err = run_cli(command, RAIL, *args)
    line = assert_one_line_error(code, err).removeprefix("warpwise: error: ")
    shown = line.replace(str(RAIL), RAIL.name)
    assert f'<p class="refusal" id="refusal">{escape(shown)}</p>' in page
    assert "Traceback" not in page


def test_job_state_is_json(client):
    fid, _ = upload_sample(client, KEY_BAR)
    url, _ = analyse(client, fid)
    state = client.get(url + "/state").json()
    assert state["state"] == "done" and state["seconds"] >= 0


@pytest.mark.parametrize("path", ["/file/nope", "/job/nope", "/job/nope/state", "/catalogue/nope",
                                  "/no/such/page"])
def test_unknown_things_are_plain_404_pages(client, path):
    r = client.get(path)
    assert r.status_code == 404 and "Not found" in r.text and "Traceback" not in r.text


def test_unknown_download_is_404(client):
    fid, _ = upload_sample(client, KEY_BAR)
    url, _ = analyse(client, fid)
    assert client.get(url + "/download/exe").status_code == 404
    assert client.get(url + "/download/stress.txt").status_code == 404  # no load given


def test_remove_deletes_the_file(client):
    fid, _ = upload_sample(client, KEY_BAR)
    path = client.bench.store.get(fid).path
    r = client.post(f"/file/{fid}/remove")
    assert r.status_code == 200 and client.bench.store.get(fid) is None
    assert not __import__("os").path.exists(path)
    assert client.get(f"/file/{fid}").status_code == 404


def test_same_input_as_load_profile(client):
    """The page reads the file as load_profile does: the area of the analysis is the file's."""
    fid, _ = upload_sample(client, KEY_BAR)
    url, page = analyse(client, fid)
    assert cell(page, "A") == number_html(load_profile(KEY_BAR).area)


TABLE = b"""[materials.our-alloy]
E = 69000
nu = 0.33
fy = 150
"""


def test_own_materials_table_as_the_command_reads_it(client, tmp_path):
    from warpwise.materials import read_materials

    from .support import upload

    upload(client, "alloys.toml", TABLE)
    table = client.bench.store.all()[-1]
    fid, _ = upload_sample(client, KEY_BAR)
    assert f'<option value="{table.id}">alloys.toml</option>' in client.get(f"/file/{fid}").text
    url, _ = analyse(client, fid, materials_table=table.id, material_own="our-alloy")
    got = json.loads(client.get(url + "/download/json").text)
    (tmp_path / "alloys.toml").write_bytes(TABLE)
    _, ours = library(KEY_BAR, KEY_BAR.name, material="our-alloy",
                      materials=read_materials(tmp_path / "alloys.toml"))
    assert got["EA"] == ours["EA"] and got["Mpl_x"] == ours["Mpl_x"]


def test_bad_materials_table_gets_the_commands_message(client, tmp_path):
    from .support import upload

    bad = b"[materials.x]\nE = -5\n"
    upload(client, "bad.toml", bad)
    table = client.bench.store.all()[-1]
    fid, _ = upload_sample(client, KEY_BAR)
    _, page = analyse(client, fid, materials_table=table.id, material_own="x")
    (tmp_path / "bad.toml").write_bytes(bad)
    code, _, err = run_cli("props", KEY_BAR, "--materials", "bad.toml", "--material", "x",
                           cwd=tmp_path)
    line = assert_one_line_error(code, err).removeprefix("warpwise: error: ")
    assert f'<p class="refusal" id="refusal">{escape(line)}</p>' in page
    assert table.path not in page


def test_regions_and_materials_as_read(client):
    from .support import MULLION

    _, page = upload_sample(client, MULLION)
    profile = load_profile(MULLION)
    assert page.text.count("<li>region ") == len(profile.regions) == 2
    for k, region in enumerate(profile.regions, 1):
        assert f"<li>region {k}: {region.material}, area {region.area:.6g} mm2" in page.text


def test_error_estimates_on_request_are_the_librarys(client):
    fid, _ = upload_sample(client, KEY_BAR)
    _, page = analyse(client, fid, estimate_errors="1", accuracy="draft")
    result, _ = library(KEY_BAR, KEY_BAR.name, estimate_errors=True, accuracy="draft")
    from warpwise.report.html_parts import percent
    from warpwise.report.quantities import error_of

    assert "Estimated error" in page
    row = re.search(r'<tr data-key="J">(.*?)</tr>', page).group(1)
    assert row.endswith(f'<td class="num">{percent(error_of(result.errors, "J"))}</td>')
    assert cell(page, "J_low") == number_html(record_of(result).values["J_low"])  # the bracket


def test_unknown_layer_is_refused_like_check_and_the_choices_stay(client):
    fid, _ = upload_sample(client, RAIL)
    page = client.get(f"/file/{fid}", params=[("layers_shown", "1"), ("layer", "nosuch")]).text
    code, _, err = run_cli("check", RAIL, "--layer", "nosuch")
    line = assert_one_line_error(code, err).removeprefix("warpwise: error: ")
    assert f'<p class="refusal" id="refusal">{escape(line.replace(str(RAIL), RAIL.name))}</p>' in page
    assert 'value="profile"' in page and '<option value="2"' in page  # still offered
