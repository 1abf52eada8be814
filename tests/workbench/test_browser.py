"""The workbench in a real headless Chromium driven by Selenium, against the real server.

The server is ``warpwise workbench`` itself in a subprocess on a free port; the browser is the
system's Chromium with the system's chromedriver (Debian ``chromium`` and ``chromium-driver``;
``.ci/run`` installs them), named explicitly so that Selenium Manager never downloads one. The
scenario: open the sample drawing with two parts, pick part 2, read J off the page and compare
it with ``warpwise props FILE --part 2 --json``; download the CSV; run a catalogue of three
samples and see every row. Screenshots go to ``test-artefacts/`` (common practice, no source).
"""

import csv
import json
import os
import re
import subprocess
import sys
import time
import urllib.request
from pathlib import Path

import pytest

from conftest import ROOT, SAMPLES, run_cli

CHROMEDRIVER = Path("/usr/bin/chromedriver")
CHROMIUM = Path("/usr/bin/chromium")
pytestmark = pytest.mark.skipif(
    not CHROMEDRIVER.exists() or not CHROMIUM.exists(),
    reason="needs Debian's chromium and chromium-driver (/usr/bin/chromedriver); .ci/run "
           "installs them when it can")
selenium = pytest.importorskip("selenium", reason="selenium is in the 'test' extra")

RAIL = SAMPLES / "rail_drawing_sheet_a4.dxf"
OTHERS = [SAMPLES / "key_bar_12x8.txt", SAMPLES / "channel_thick_80x40.txt"]
ARTEFACTS = ROOT / "test-artefacts"


@pytest.fixture(scope="module")
def server(tmp_path_factory):
    """``warpwise workbench --no-browser`` on a free port; its URL. When it is stopped, its
    private folder of uploads must be gone."""
    from warpwise.workbench.server import free_port

    port = free_port()
    temp = tmp_path_factory.mktemp("server-temp")
    env = dict(os.environ, PYTHONPATH=os.pathsep.join(sys.path), TMPDIR=str(temp))
    proc = subprocess.Popen([sys.executable, "-m", "warpwise.cli", "workbench", "--no-browser",
                             "--port", str(port)], env=env, stdout=subprocess.PIPE,
                            stderr=subprocess.STDOUT, text=True)
    url = f"http://127.0.0.1:{port}/"
    for _ in range(200):
        try:
            urllib.request.urlopen(url, timeout=1).close()
            break
        except OSError:
            if proc.poll() is not None:
                raise AssertionError(proc.stdout.read()) from None
            time.sleep(0.1)
    assert [p.name[:19] for p in temp.iterdir()] == ["warpwise-workbench-"]
    yield url
    proc.terminate()
    proc.wait(timeout=30)
    assert not any(p.name.startswith("warpwise-workbench-") for p in temp.iterdir())


@pytest.fixture(scope="module")
def browser(tmp_path_factory):
    from selenium import webdriver
    from selenium.webdriver.chrome.service import Service

    downloads = tmp_path_factory.mktemp("downloads")
    options = webdriver.ChromeOptions()
    options.binary_location = str(CHROMIUM)
    for arg in ("--headless=new", "--no-sandbox", "--disable-gpu", "--window-size=1280,1400",
                "--disable-dev-shm-usage", "--no-first-run"):
        options.add_argument(arg)
    options.add_experimental_option("prefs", {"download.default_directory": str(downloads),
                                              "download.prompt_for_download": False})
    options.set_capability("goog:loggingPrefs", {"browser": "ALL"})
    driver = webdriver.Chrome(service=Service(str(CHROMEDRIVER)), options=options)
    driver.downloads = downloads
    driver.implicitly_wait(0)
    yield driver
    driver.quit()


def wait_for(driver, css, timeout=120):
    from selenium.webdriver.common.by import By
    from selenium.webdriver.support import expected_conditions as ec
    from selenium.webdriver.support.ui import WebDriverWait

    return WebDriverWait(driver, timeout).until(ec.presence_of_element_located((By.CSS_SELECTOR, css)))


def page_number(text):
    """A number as the property table shows it (6 significant figures, powers of ten)."""
    text = text.replace("\u2212", "-").replace("\u202f", "")
    m = re.fullmatch(r"(-?[0-9.]+)(?:\u00d710(-?\d+))?", text)
    assert m, text
    return float(m.group(1)) * 10 ** int(m.group(2) or 0)


def shot(driver, name):
    ARTEFACTS.mkdir(exist_ok=True)
    driver.save_screenshot(str(ARTEFACTS / name))


def no_console_errors(driver):
    bad = [e for e in driver.get_log("browser") if e["level"] == "SEVERE"]
    assert not bad, bad


def pointer_reads_the_drawing_coordinates(browser):
    """Over the shear-centre mark of the warping picture the page reads the mark's coordinates."""
    from selenium.webdriver.common.action_chains import ActionChains
    from selenium.webdriver.common.by import By

    svg = browser.find_element(By.CSS_SELECTOR, "#warping-picture svg")
    mark = svg.find_element(By.CSS_SELECTOR, "g.shear-centre")
    shape = mark.find_element(By.XPATH, "./*[1]")
    ActionChains(browser).move_to_element(shape).perform()
    text = browser.find_element(By.CSS_SELECTOR, "#warping-picture .pointer").text
    m = re.fullmatch(r"Pointer at x = (\S+), y = (\S+) mm(; .*)?\.", text)
    assert m, text
    scale = float(svg.get_attribute("data-frame").split()[4])  # pixels per mm
    tolerance = 3.0 / scale  # a few pixels of the picture
    assert float(m.group(1)) == pytest.approx(float(mark.get_attribute("data-x")), abs=tolerance)
    assert float(m.group(2)) == pytest.approx(float(mark.get_attribute("data-y")), abs=tolerance)


def test_open_pick_part_read_J_download_csv(server, browser):
    from selenium.webdriver.common.by import By
    from selenium.webdriver.support.ui import Select

    browser.get(server)
    browser.find_element(By.ID, "files").send_keys(str(RAIL))
    browser.find_element(By.ID, "open-button").click()
    wait_for(browser, "#parts")
    assert len(browser.find_elements(By.CSS_SELECTOR, "#parts li")) == 2
    Select(browser.find_element(By.ID, "part")).select_by_value("2")
    browser.find_element(By.ID, "analyse-button").click()
    cell = wait_for(browser, 'tr[data-key="J"] td.num')  # after the page's polling reloads
    shot(browser, "workbench-results.png")
    code, out, err = run_cli("props", RAIL, "--part", "2", "--json")
    assert code == 0, err
    J = json.loads(out)["J"]
    assert page_number(cell.text) == pytest.approx(J, rel=5e-6)  # six figures shown
    pointer_reads_the_drawing_coordinates(browser)
    browser.find_element(By.ID, "download-csv").click()
    target = browser.downloads / "rail_drawing_sheet_a4-dxf.csv"
    for _ in range(100):
        if target.exists():
            break
        time.sleep(0.1)
    rows = list(csv.DictReader(target.read_text(encoding="utf-8").splitlines()))
    assert len(rows) == 1 and rows[0]["file"] == RAIL.name
    assert float(rows[0]["J (mm4)"]) == pytest.approx(J, rel=1e-9)
    no_console_errors(browser)


def test_catalogue_shows_every_row(server, browser):
    from selenium.webdriver.common.by import By

    browser.get(server)
    browser.find_element(By.ID, "files").send_keys("\n".join(str(p) for p in OTHERS))
    browser.find_element(By.ID, "open-button").click()
    wait_for(browser, "#uploads")
    browser.get(server + "catalogue")
    browser.find_element(By.ID, "catalogue-button").click()
    wait_for(browser, '#catalogue[data-over="yes"]', timeout=180)
    shot(browser, "workbench-catalogue.png")
    rows = browser.find_elements(By.CSS_SELECTOR, "#catalogue-rows tbody tr")
    names = [r.find_elements(By.TAG_NAME, "td")[0].text for r in rows]
    assert sorted(names) == sorted([RAIL.name, *(p.name for p in OTHERS)])
    for row in rows:
        cells = [td.text for td in row.find_elements(By.TAG_NAME, "td")]
        code, out, err = run_cli("props", SAMPLES / cells[0], "--json")
        assert code == 0, err
        assert cells[1] == "done" and float(cells[4]) == pytest.approx(json.loads(out)["J"],
                                                                     rel=5e-6)
    no_console_errors(browser)
