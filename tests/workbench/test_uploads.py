"""Bad uploads and hostile names through the test client: one-line refusals on the page, the
files kept under generated names in a private folder, removed at shutdown (common practice,
no source)."""

import os
import stat
from pathlib import Path

import pytest
from markupsafe import escape

from conftest import assert_one_line_error, run_cli
from warpwise.workbench import app as app_module
from warpwise.workbench import uploads

from .support import KEY_BAR, upload

HOSTILE = "../../etc/<img src=x onerror=alert(1)>.txt"


def test_empty_file_is_refused(client):
    r = upload(client, "empty.txt", b"")
    assert r.status_code == 400
    assert "<li class=\"refusal\">empty.txt: the file is empty</li>" in r.text


def test_no_file_is_refused(client):
    r = client.post("/upload", data={"other": "1"})
    assert r.status_code == 400 and "no file was sent" in r.text


def test_oversized_file_is_refused(client, monkeypatch):
    monkeypatch.setattr(uploads, "MAX_FILE_BYTES", 1000)
    monkeypatch.setattr(app_module, "MAX_FILE_BYTES", 1000)
    r = upload(client, "big.txt", b"0 0\n" * 400)
    assert r.status_code == 400
    assert "big.txt: the file is larger than the workbench takes" in r.text
    assert not any(u.name == "big.txt" for u in client.bench.store.all())


def test_too_large_a_request_is_refused_before_reading(client, monkeypatch):
    monkeypatch.setattr(app_module, "MAX_UPLOAD_BYTES", 10)
    r = upload(client, "big.txt", b"0 0\n" * 400_000)
    assert r.status_code == 413 and "larger than the workbench takes (0 MB in all)" in r.text


def test_a_folder_gives_its_profile_files_only(client):
    before = len(client.bench.store.all())
    files = [("folder", ("profiles/key_bar.txt", KEY_BAR.read_bytes())),
             ("folder", ("profiles/sub/photo.png", b"\x89PNG....")),
             ("folder", ("profiles/.hidden/old.txt", KEY_BAR.read_bytes())),
             ("folder", ("profiles/alloys.toml", b"[materials.a]\nE = 70000\nnu = 0.3\n"))]
    r = client.post("/upload", files=files)
    added = client.bench.store.all()[before:]
    assert [u.name for u in added] == ["key_bar.txt", "alloys.toml"]
    assert "2 files of the folder passed over" in r.text


def test_too_many_files_are_refused(client):
    files = [("files", (f"bar{k}.txt", KEY_BAR.read_bytes()))
             for k in range(uploads.MAX_FILES_PER_UPLOAD + 1)]
    before = len(client.bench.store.all())
    r = client.post("/upload", files=files)
    assert r.status_code == 400 and "the upload was refused" in r.text
    assert len(client.bench.store.all()) == before


def test_binary_file_gets_the_commands_message(client, tmp_path):
    data = bytes(range(256)) * 8
    r = upload(client, "junk.dxf", data)
    assert r.status_code == 200
    (tmp_path / "junk.dxf").write_bytes(data)
    code, _, err = run_cli("check", "junk.dxf", cwd=tmp_path)
    line = assert_one_line_error(code, err).removeprefix("warpwise: error: ")
    assert f'<p class="refusal" id="refusal">{escape(line)}</p>' in r.text
    assert "Traceback" not in r.text


def test_hostile_name_is_shown_escaped_and_never_used_as_a_path(client):
    r = upload(client, HOSTILE, KEY_BAR.read_bytes())
    assert r.status_code == 200
    stored = client.bench.store.all()[-1]
    assert stored.name == "<img src=x onerror=alert(1)>.txt"  # the last part of the name only
    assert Path(stored.path).parent == client.bench.store.folder
    assert Path(stored.path).name == f"{stored.id}.txt"
    assert "<img src=x" not in r.text
    assert str(escape(stored.name)) in r.text
    jid = client.post(f"/file/{stored.id}/analyse", follow_redirects=False).headers["location"]
    from .support import wait

    assert wait(client, jid) == "done"
    d = client.get(jid + "/download/csv").headers["content-disposition"]
    assert d == 'attachment; filename="img_src_x_onerror_alert_1-txt.csv"'


def test_private_folder_removed_at_shutdown():
    from starlette.testclient import TestClient

    from warpwise.workbench.app import create_app

    app = create_app()
    folder = app.state.bench.store.folder
    with TestClient(app) as c:
        assert stat.S_IMODE(os.stat(folder).st_mode) == 0o700
        upload(c, "bar.txt", KEY_BAR.read_bytes())
        stored = app.state.bench.store.all()[0]
        assert stat.S_IMODE(os.stat(stored.path).st_mode) == 0o600
    assert not folder.exists()


@pytest.mark.parametrize("sent, shown", [("a/b/c.dxf", "c.dxf"), ("..", ".."), ("\x00\x07", "unnamed file"),
                                         ("x" * 300, "x" * uploads.MAX_NAME)])
def test_display_names(sent, shown):
    assert uploads.display_name(sent) == shown


def test_a_post_from_another_site_is_refused(client):
    before = len(client.bench.store.all())
    r = client.post("/upload", files=[("files", ("bar.txt", KEY_BAR.read_bytes()))],
                    headers={"Origin": "http://elsewhere.example"})
    assert r.status_code == 403 and r.text == "a request from another web site is refused"
    assert len(client.bench.store.all()) == before
    same = client.post("/upload", files=[("files", ("bar.txt", KEY_BAR.read_bytes()))],
                       headers={"Origin": "http://testserver"})
    assert same.status_code == 200


def test_other_host_names_are_refused_when_bound_to_this_computer():
    from starlette.testclient import TestClient

    from warpwise.workbench.app import create_app

    app = create_app(hosts=["127.0.0.1", "localhost"])
    with TestClient(app, base_url="http://127.0.0.1:8765") as c:
        assert c.get("/").status_code == 200
        r = c.get("/", headers={"Host": "attacker.example:8765"})
        assert r.status_code == 403 and "answers to 127.0.0.1, localhost only" in r.text
