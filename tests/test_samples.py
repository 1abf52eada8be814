"""The sample catalogue: files in step with their generator, and read back exactly.

Every DXF sample in sample_sections/ is built by scripts/make_samples.py from exact pieces
(lines, circular and elliptical arcs, polynomial B-splines); its ``catalogue()`` gives the
exact area and centroid of each true outline. The DXF reader must reproduce them.
"""

import importlib.util
import json
import math
from pathlib import Path

import ezdxf
import numpy as np
import pytest

from warpwise.io import load_profile

ROOT = Path(__file__).resolve().parents[1]
SAMPLES = ROOT / "sample_sections"


from support import sample_profiles as make_samples  # noqa: E402 (the exact sample definitions)

CATALOGUE = make_samples.catalogue()
DXF_NAMES = sorted(CATALOGUE)

HAVE_DXF_READER = importlib.util.find_spec("warpwise.io.dxf") is not None
needs_reader = pytest.mark.skipif(not HAVE_DXF_READER,
                                  reason="the DXF reader (warpwise.io.dxf) is not part of this build yet")

# Tolerances of the DXF reader at its default setting. It cuts arcs, ellipses and splines into
# chords with a sagitta chosen so that all chords together cut off at most 5e-5 of the area
# (its CHORD_AREA_BUDGET; the requirement is 1e-4). Measured on these samples: area errors
# from 2e-7 (angle, convex and concave arcs cancel) to 4.2e-5 (heat sink); since cancellation
# cannot be counted on, the budget itself, 5e-5, is the tightest honest relative tolerance.
AREA_RTOL = 5e-5
# The chord-cut area (at most AREA_RTOL * A) moves the centroid by at most AREA_RTOL times the
# bounding-box diagonal. Measured: at most 3.3e-5 of the diagonal (heat sink).
CENTROID_RTOL = AREA_RTOL
# With an explicit chord tolerance s the polygon stays within a band of width s along the
# curves, so |dA| <= s * perimeter; a fine s shows the reader and the construction agree far
# beyond the default chord error (measured at s = 1e-7 * size: |dA|/A <= 3.7e-7).
FINE_CHORD = 1e-7

# Entities that carry no profile geometry and may sit on the annotation layers.
ANNOTATION_TYPES = {"TEXT", "MTEXT", "DIMENSION"}
# What the other layers of a drawing sheet may hold besides: frame, title block, views, lines,
# the section's hatch.
SHEET_TYPES = ANNOTATION_TYPES | {"LWPOLYLINE", "LINE", "HATCH"}


# ----------------------------------------------------------------------------------------------
# the files and their generator
# ----------------------------------------------------------------------------------------------

def test_catalogue_lists_every_dxf_file():
    on_disk = sorted(p.name for p in SAMPLES.glob("*.dxf"))
    assert on_disk == DXF_NAMES
    assert len(DXF_NAMES) >= 8
    for outline in ("handrail_hollow.txt", "key_bar_12x8.txt", "channel_thick_80x40.txt"):
        assert (SAMPLES / outline).is_file()


def _value(v):
    if hasattr(v, "tolist"):            # numpy arrays and scalars
        v = v.tolist()
    if isinstance(v, float):
        return round(v, 9)
    if isinstance(v, (tuple, list)) or hasattr(v, "xyz"):
        return tuple(_value(x) for x in v)
    return v


def _signature(path):
    """Entities of a drawing with their geometry, independent of handles and library version."""
    doc = ezdxf.readfile(path)
    out = [("$INSUNITS", doc.header.get("$INSUNITS")), ("version", doc.dxfversion)]
    for e in doc.modelspace():
        attribs = e.dxfattribs(drop={"handle", "owner"})
        item = [e.dxftype(), tuple(sorted((k, _value(v)) for k, v in attribs.items()))]
        if e.dxftype() == "LWPOLYLINE":
            item.append(_value(list(e.get_points("xyb"))))
        elif e.dxftype() == "POLYLINE":
            item.append(_value([(*v.dxf.location, v.dxf.bulge) for v in e.vertices]))
        elif e.dxftype() == "SPLINE":
            item.append(_value(list(e.control_points)) + _value(list(e.knots)))
        elif e.dxftype() == "MTEXT":
            item.append(e.text)
        out.append(tuple(item))
    return out


def test_files_are_those_the_generator_writes(tmp_path):
    make_samples.main(tmp_path, verify=False)
    written = sorted(p.name for p in tmp_path.iterdir())
    assert written == sorted(p.name for p in SAMPLES.iterdir() if p.suffix in (".txt", ".dxf"))
    for name in written:
        if name.endswith(".txt"):
            assert (tmp_path / name).read_text() == (SAMPLES / name).read_text(), name
        else:
            assert _signature(tmp_path / name) == _signature(SAMPLES / name), (
                f"{name} differs from what scripts/make_samples.py writes: run it again")


def test_files_agree_with_their_construction_under_ezdxf():
    # ezdxf's own reading, flattened to 1e-7 and chained independently of warpwise
    make_samples.check(SAMPLES)


@pytest.mark.parametrize("name", DXF_NAMES)
def test_entity_types_are_as_described(name):
    entry = CATALOGUE[name]
    doc = ezdxf.readfile(SAMPLES / name)
    msp = doc.modelspace()
    kinds = {e.dxftype() for e in msp.query(f'*[layer=="{make_samples.PROFILE_LAYER}"]')}
    assert kinds == set(entry["entities"])
    others = {e.dxf.layer for e in msp} - {make_samples.PROFILE_LAYER}
    assert others == set(entry["other_layers"])
    for layer in others:
        allowed = SHEET_TYPES if entry["sheet"] else ANNOTATION_TYPES
        assert {e.dxftype() for e in msp.query(f'*[layer=="{layer}"]')} <= allowed
    if doc.dxfversion > "AC1009":       # R12 has no $INSUNITS
        assert doc.header["$INSUNITS"] == make_samples.INSUNITS[entry["units"]]


def test_exact_values_by_hand():
    # two entries checked against plain closed forms
    handrail = CATALOGUE["handrail_hollow.dxf"]
    outer = 42 * 32 - (4 - math.pi) * 10**2
    inner = 37 * 27 - (4 - math.pi) * 7.5**2
    assert handrail["A"] == pytest.approx(outer - inner, rel=1e-14)
    grip = CATALOGUE["grip_oval_ellipse.dxf"]
    assert grip["A"] == pytest.approx(math.pi * 24 * 14 - math.pi * 18 * 8 / 2, rel=1e-14)


# ----------------------------------------------------------------------------------------------
# the DXF reader against the exact values
# ----------------------------------------------------------------------------------------------

def _properties(profile):
    """Area and centroid of an imported profile from its polygons."""
    ox, oy = profile.regions[0].outer[0]     # work near the profile: one sample lies far out
    area = mx = my = 0.0
    for region in profile.regions:
        for loop in region.loops():
            x, y = loop[:, 0] - ox, loop[:, 1] - oy
            xn, yn = [v[1:].tolist() + v[:1].tolist() for v in (x, y)]
            for x0, y0, x1, y1 in zip(x, y, xn, yn, strict=True):
                cross = x0 * y1 - x1 * y0
                area += cross / 2
                mx += cross * (x0 + x1) / 6
                my += cross * (y0 + y1) / 6
    return area, (ox + mx / area, oy + my / area)


def _diagonal(profile):
    x0, y0, x1, y1 = profile.bounds
    return math.hypot(x1 - x0, y1 - y0)


@needs_reader
@pytest.mark.parametrize("name", DXF_NAMES)
def test_dxf_reader_gives_exact_area_and_centroid(name):
    entry = CATALOGUE[name]
    profile = load_profile(SAMPLES / name)
    area, (xc, yc) = _properties(profile)
    assert profile.area == pytest.approx(area, rel=1e-9)
    assert area == pytest.approx(entry["A"], rel=AREA_RTOL)
    ex, ey = entry["centroid"]
    assert math.hypot(xc - ex, yc - ey) <= CENTROID_RTOL * _diagonal(profile)
    assert profile.units == entry["units"]
    assert len(profile.regions) == entry["regions"]
    assert sum(len(r.holes) for r in profile.regions) == entry["holes"]


@needs_reader
@pytest.mark.parametrize("name", DXF_NAMES)
def test_dxf_reader_converges_to_exact_values(name):
    entry = CATALOGUE[name]
    chord = FINE_CHORD * load_profile(SAMPLES / name).size
    profile = load_profile(SAMPLES / name, chord_tolerance=chord)
    area, (xc, yc) = _properties(profile)
    perimeter = sum(np.sum(np.hypot(*np.diff(loop, axis=0, append=loop[:1]).T))
                    for region in profile.regions for loop in region.loops())
    band = chord * perimeter
    assert abs(area - entry["A"]) <= band
    ex, ey = entry["centroid"]
    assert math.hypot(xc - ex, yc - ey) <= 2 * band * _diagonal(profile) / entry["A"]


@needs_reader
def test_props_runs_on_every_sample(cli):
    files = sorted(SAMPLES.iterdir())
    code, out, err = cli("props", *files, "--json")
    assert code == 0, err
    results = json.loads(out)
    assert len(results) == len(files)
    for result in results:
        name = Path(result["file"]).name
        if name in CATALOGUE:
            assert result["A"] == pytest.approx(CATALOGUE[name]["A"], rel=AREA_RTOL)
            assert result["units"]["length"] == CATALOGUE[name]["units"]


@needs_reader
@pytest.mark.parametrize("name", sorted(p.name for p in SAMPLES.iterdir()))
def test_check_finds_nothing_wrong(name):
    check_file = pytest.importorskip("warpwise.check").check_file
    report = check_file(SAMPLES / name)
    assert report.ok, report.verdict
    entry = CATALOGUE.get(name)
    if entry and entry["sheet"]:
        # the sheet edge and the frame with its title block are left out, and named; the side
        # view stays a second part, the hatched section is taken
        assert [d.kind for d in report.defects] == ["drawing frame", "drawing frame"]
        assert all(d.severity == "warning" for d in report.defects)
        assert len(report.parts) == 2 and report.parts[0].area == pytest.approx(4000.0, rel=1e-12)
        return
    assert report.defects == ()
    assert len(report.parts) == 1
    if entry:
        assert report.holes == entry["holes"]
        assert report.unit == entry["units"]
        assert set(report.skipped) <= ANNOTATION_TYPES
