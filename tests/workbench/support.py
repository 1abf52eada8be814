"""Shared helpers of the workbench tests."""

import re
import time

from conftest import SAMPLES

RAIL = SAMPLES / "rail_drawing_sheet_a4.dxf"  # two parts, six layers: a drawing with choices
KEY_BAR = SAMPLES / "key_bar_12x8.txt"
HEAT_SINK = SAMPLES / "heat_sink_stepped_fins.dxf"  # no length unit in the drawing
MULLION = SAMPLES / "mullion_steel_reinforced.txt"  # an outline with a steel insert


def upload(client, name, data, follow=True):
    """POST one file; the response (the file's page when it was taken)."""
    return client.post("/upload", files=[("files", (name, data))], follow_redirects=follow)


def upload_sample(client, path, name=None):
    """Upload a sample; (its id, the file page)."""
    r = upload(client, name or path.name, path.read_bytes())
    assert r.status_code == 200, r.text
    return str(r.url).rstrip("/").rsplit("/", 1)[1], r


def wait(client, url, timeout=120):
    """Poll a job's state until it is over; return the state."""
    end = time.monotonic() + timeout
    while time.monotonic() < end:
        state = client.get(url + "/state").json()
        if state["state"] in ("done", "failed", "cancelled"):
            return state["state"]
        time.sleep(0.1)
    raise AssertionError(f"{url} did not finish in {timeout} s")


def analyse(client, fid, **form):
    """Analyse an uploaded file with the form's choices; (job URL, job page text)."""
    r = client.post(f"/file/{fid}/analyse", data=form, follow_redirects=False)
    assert r.status_code == 303
    url = r.headers["location"]
    wait(client, url)
    return url, client.get(url).text


def cell(page, key):
    """The value cell of the property table's row ``key`` (HTML)."""
    m = re.search(rf'<tr data-key="{key}">.*?<td class="num">(.*?)</td>', page)
    assert m, f"no row {key} on the page"
    return m.group(1)
