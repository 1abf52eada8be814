"""HTML datasheets and the catalogue index, loaded in a real headless Chromium.

Console messages: with ``--enable-logging=stderr --v=0`` Chromium writes every page console
message (console.error, uncaught exceptions, blocked or failed loads, content-security-policy
violations) to stderr as a ``CONSOLE`` line. Our pages run no script, so any such line is a
fault. The first test proves the method on a throwaway page with deliberate errors, so a
Chromium that stops logging fails the check instead of passing it silently.

The screenshots are kept in ``test-artefacts/`` at the repository root for a person to look at.
"""

import re
import shutil
import subprocess
from concurrent.futures import ThreadPoolExecutor
from pathlib import Path

import pytest

from conftest import ROOT, SAMPLES
from warpwise import analyse, torsion_stress
from warpwise.io import load_profile
from warpwise.report.html import CatalogueEntry, unique_filenames, write_datasheet, write_index

CHROMIUM = shutil.which("chromium") or ("/usr/bin/chromium" if Path("/usr/bin/chromium").exists()
                                        else None)
pytestmark = pytest.mark.skipif(
    CHROMIUM is None,
    reason="Chromium is not installed (Debian package 'chromium'; .ci/run installs it when it can)",
)

ARTEFACTS = ROOT / "test-artefacts"
CONSOLE = re.compile(r":CONSOLE[:(]")


def chromium(page, profile_dir, *extra):
    """Load a page in headless Chromium; return (stdout, console lines on stderr)."""
    args = [CHROMIUM, "--headless", "--no-sandbox", "--disable-gpu", "--disable-quic",
            "--no-first-run", "--disable-background-networking", "--disable-component-update",
            "--disable-sync", "--hide-scrollbars", f"--user-data-dir={profile_dir}",
            "--enable-logging=stderr", "--v=0", *extra, Path(page).resolve().as_uri()]
    proc = subprocess.run(args, capture_output=True, text=True, timeout=120,
                          stdin=subprocess.DEVNULL)
    assert proc.returncode == 0, proc.stderr[-2000:]
    return proc.stdout, [line for line in proc.stderr.splitlines() if CONSOLE.search(line)]


def run_all(jobs):
    """Run several Chromium loads at once (each its own profile folder)."""
    with ThreadPoolExecutor(max_workers=len(jobs)) as pool:
        futures = {name: pool.submit(chromium, *job) for name, job in jobs.items()}
        return {name: f.result() for name, f in futures.items()}


def png_ok(path, min_bytes=20_000):
    from PIL import Image

    data = Path(path).read_bytes()
    assert data.startswith(b"\x89PNG\r\n\x1a\n") and len(data) > min_bytes
    with Image.open(path) as im:
        assert im.size == (1200, 2000)
        lo, hi = im.convert("L").getextrema()
        assert hi - lo > 100  # not a blank page


@pytest.fixture(scope="module")
def pages(tmp_path_factory):
    """A datasheet of the channel sample and an index with it and one failed profile."""
    folder = tmp_path_factory.mktemp("catalogue")
    source = SAMPLES / "channel_thick_80x40.txt"
    result = analyse(load_profile(source))
    missing = "sample_sections/no_such_profile.txt"
    names = unique_filenames([str(source), missing])
    sheet = write_datasheet(result, folder, torsion=torsion_stress(result, 1.0), nominal_torque=True,
                            filename=names[0])
    entries = [CatalogueEntry(str(source), result, sheet.name),
               CatalogueEntry(missing, error="no_such_profile.txt: the file does not exist <&>")]
    index = write_index(entries, folder)
    bad = folder / "deliberate_errors.html"
    bad.write_text(
        '<!DOCTYPE html><html lang="en"><head><meta charset="utf-8"><title>t</title>'
        '<meta http-equiv="Content-Security-Policy" '
        'content="default-src \'none\'; img-src data:; script-src \'unsafe-inline\'">'
        '<link rel="icon" href="data:,"></head><body><p>x</p><img src="https://example.invalid/a.png">'
        '<script>console.error("deliberate console error"); notDefinedAnywhere();</script>'
        "</body></html>", encoding="utf-8")
    ARTEFACTS.mkdir(exist_ok=True)
    shots = {"sheet": ARTEFACTS / "datasheet_channel_thick_80x40.png",
             "index": ARTEFACTS / "catalogue_index.png"}
    for shot in shots.values():
        shot.unlink(missing_ok=True)
    window = "--window-size=1200,2000"
    jobs = {  # one load gives the DOM, the console lines and the screenshot
        "bad": (bad, folder / "p-bad", "--dump-dom"),
        "sheet": (sheet, folder / "p-sheet", "--dump-dom", f"--screenshot={shots['sheet']}", window),
        "index": (index, folder / "p-index", "--dump-dom", f"--screenshot={shots['index']}", window),
    }
    return {"folder": folder, "sheet": sheet, "index": index, "result": result, "shots": shots,
            "runs": run_all(jobs)}


def test_console_check_sees_deliberate_errors(pages):
    dom, console = pages["runs"]["bad"]
    text = "\n".join(console)
    assert "deliberate console error" in text
    assert "notDefinedAnywhere is not defined" in text
    assert "Content Security Policy" in text  # a blocked load shows too
    assert "<p>x</p>" in dom


def test_datasheet_loads_cleanly_with_table_and_pictures(pages):
    dom, console = pages["runs"]["sheet"]
    assert console == []
    assert dom.lstrip().lower().startswith("<!doctype html>")
    assert '<h1>channel_thick_80x40.txt</h1>' in dom
    assert 'id="property-table"' in dom
    for key in ("A", "Ix", "Iy", "I1", "J", "Cw", "xs", "Wpl_x", "As_x"):
        assert f'data-key="{key}"' in dom
    assert 'data-key="J_low"' not in dom  # not computed: left out, not shown as nan
    assert not re.search(r">\s*nan\b", re.sub(r"<svg.*?</svg>", "", dom, flags=re.S), re.I)
    for picture in ("outline-picture", "torsion-picture", "warping-picture"):
        block = re.search(rf'id="{picture}">(.*?)</figure>', dom, re.S)
        assert block and "<svg" in block.group(1) and "<path" in block.group(1)
    assert dom.count("<svg") == 3
    ids = re.findall(r'\bid="([^"]+)"', dom)
    assert len(ids) == len(set(ids))  # several pictures, no clashing ids
    assert "nominal torque T = 1 N\u00b7mm" in dom
    assert 'id="glossary"' in dom and "Saint-Venant torsion constant" in dom
    assert "never replace" in dom and "not a design-code check" in dom
    assert "http://" not in re.sub(r"<svg.*?</svg>", "", dom, flags=re.S)
    assert "https://" not in dom and "<script" not in dom


def test_index_links_to_datasheet_and_lists_failures(pages):
    dom, console = pages["runs"]["index"]
    assert console == []
    assert 'id="catalogue-table"' in dom
    href = re.search(r'<a href="([^"]+)">channel_thick_80x40.txt</a>', dom).group(1)
    assert "/" not in href and (pages["folder"] / href).is_file()
    assert href == pages["sheet"].name
    failures = re.search(r'id="failure-table">(.*?)</table>', dom, re.S).group(1)
    assert "no_such_profile.txt" in failures
    assert "the file does not exist &lt;&amp;&gt;" in failures  # escaped, not markup
    assert "mm<sup>4</sup>" in dom  # units in the headings
    assert "never replace" in dom


def test_screenshots_are_written(pages):
    png_ok(pages["shots"]["sheet"])
    png_ok(pages["shots"]["index"], min_bytes=5_000)


# ----------------------------------------------------------------------------------------------
# printing and the index's fit (Chromium's own layout, read by a probe script in a copy of the
# page: the pages themselves run no script and forbid it)

PRINTED = ["purlin_lipped_150.dxf", "mullion_steel_reinforced.txt", "mullion_screw_bosses.dxf",
           "rail_drawing_sheet_a4.dxf"]


def _probed(page, script):
    """A copy of ``page`` without its content security policy and with ``script`` at the end."""
    text = re.sub(r'<meta http-equiv="Content-Security-Policy"[^>]*>', "", page.read_text())
    copy = page.with_name("probe-" + page.name)
    copy.write_text(text.replace("</body>", f"<script>{script}</script></body>"))
    return copy


@pytest.mark.skipif(shutil.which("pdfinfo") is None, reason="pdfinfo (poppler-utils) is missing")
def test_datasheets_print_on_two_pages(tmp_path):
    # the print stylesheet puts the outline, key values and every property on page 1 and the
    # pictures, glossary, notes and cautions on page 2 (A4); these samples are the longest:
    # a composite (more rows), twelve sharp corners (a note and a stress line each), a drawing
    jobs = {}
    for name in PRINTED:
        result = analyse(load_profile(SAMPLES / name))
        sheet = write_datasheet(result, tmp_path, torsion=torsion_stress(result, 1.0),
                                nominal_torque=True)
        pdf = tmp_path / f"{name}.pdf"
        jobs[name] = (sheet, tmp_path / f"p-{name}", f"--print-to-pdf={pdf}",
                      "--no-pdf-header-footer")
    run_all(jobs)
    for name in PRINTED:
        info = subprocess.run(["pdfinfo", str(tmp_path / f"{name}.pdf")], capture_output=True,
                              text=True, check=True).stdout
        pages = int(re.search(r"Pages:\s+(\d+)", info).group(1))
        assert pages <= 2, (name, pages)
        assert "595.2 x 841.9" in info or "594.96 x 841.92" in info  # A4 in points


def test_index_fits_1400_px_and_keeps_its_header_in_view(tmp_path):
    # forty rows with long names and descriptions; the probe scrolls down and reads where the
    # header is and whether the page is wider than the window
    result = analyse(load_profile(SAMPLES / "channel_thick_80x40.txt"))
    from dataclasses import replace as _replace

    from warpwise.report.records import record_of

    entries = []
    for k in range(40):
        rec = _replace(record_of(result), name=f"EXT-{k:03d}-LONGPARTNUMBER-WITH-SUFFIX",
                       description="extruded channel, anodised, long description " * 2)
        entries.append(CatalogueEntry(f"lib/series_{k}/channel_thick_80x40.txt", result,
                                      f"p{k}.html", record=rec))
    index = write_index(entries, tmp_path)
    probe = _probed(index, "window.scrollTo(0, 1500);"
                           "var th = document.querySelector('#catalogue-table thead th');"
                           "document.title = [document.documentElement.scrollWidth,"
                           " document.documentElement.clientWidth, window.scrollY,"
                           " Math.round(th.getBoundingClientRect().top)].join(' ');")
    dom, _ = chromium(probe, tmp_path / "p-probe", "--dump-dom", "--window-size=1400,900")
    wide, window, scrolled, header_top = map(int, re.search(r"<title>([^<]*)</title>", dom)
                                              .group(1).split())
    assert scrolled > 0  # the page did scroll
    assert wide <= window  # nothing wider than the window
    assert header_top == 0  # the header row stays at the top
