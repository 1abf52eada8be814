"""The datasheet pictures (SVG written from the arrays): every mark and number where it belongs.

Each picture is read back as a person would: the tick labels of the axes give the map from
picture to drawing coordinates, and the marks found in the picture are mapped back and
compared with the computed values (common practice, no source). The colour bar must span the
field it shows, and the bands must cover exactly the meshed section.
"""

from __future__ import annotations

import re
import xml.etree.ElementTree as ET

import numpy as np
import pytest

from conftest import SAMPLES
from warpwise import analyse
from warpwise.geometry.shapes import rectangle
from warpwise.io import load_profile
from warpwise.report.datasheet import datasheet_html
from warpwise.report.picture_parts import fmt
from warpwise.report.plot_svg import outline_svg, torsion_svg, warping_svg
from warpwise.report.svg_parts import LEFT
from warpwise.stress import nominal_torsion, torsion_stress
from warpwise.units import AREA, LENGTH, STRESS, Converter

NS = {"s": "http://www.w3.org/2000/svg"}


@pytest.fixture(scope="module")
def channel():
    """A channel whose shear centre lies outside its outline (x < 0), with filleted corners."""
    return analyse(load_profile(SAMPLES / "channel_thick_80x40.txt"))


@pytest.fixture(scope="module")
def ell():
    """An invented L with one sharp re-entrant corner at (5, 5)."""
    from warpwise.geometry import profile_from_loops

    return analyse(profile_from_loops([[(0, 0), (40, 0), (40, 5), (5, 5), (5, 40), (0, 40)]]))


@pytest.fixture(scope="module")
def composite():
    return analyse(load_profile(SAMPLES / "mullion_steel_reinforced.txt"))


def parse(svg: str) -> ET.Element:
    """The picture as XML (it must be well formed)."""
    assert svg.startswith("<svg")
    return ET.fromstring(svg)


def number(text: str) -> float:
    return float(text.replace("\u2212", "-"))


def tick_map(root: ET.Element) -> tuple[np.ndarray, np.ndarray]:
    """Fit pixel = a * value + b on each axis from the tick labels: ((ax, bx), (ay, by))."""
    fits = []
    for axis, attr in (("x", "x"), ("y", "y")):
        ticks = root.findall(f".//s:text[@class='tick-{axis}']", NS)
        assert len(ticks) >= 3
        values = np.array([number(t.text) for t in ticks])
        assert np.allclose(values, [float(t.get("data-value")) for t in ticks], rtol=1e-9, atol=1e-9)
        px = np.array([float(t.get(attr)) for t in ticks])
        a, b = np.polyfit(values, px, 1)
        assert np.allclose(a * values + b, px, atol=0.02)  # the ticks are evenly placed
        fits.append((a, b))
    return np.array(fits)


def mark_at(root: ET.Element, name: str, fits: np.ndarray) -> tuple[float, float]:
    """Where a mark is, in drawing coordinates of the report's unit, read from the picture."""
    (g,) = root.findall(f".//s:g[@class='mark {name}']", NS)
    x, y = map(float, re.fullmatch(r"translate\(([-\d.]+) ([-\d.]+)\)", g.get("transform")).groups())
    (ax, bx), (ay, by) = fits
    return (x - bx) / ax, (y - by) / ay


@pytest.mark.parametrize("units", [None, "in"])
def test_marks_map_back_to_the_computed_points(channel, units):
    show = Converter.of(channel.units, units)
    torsion = nominal_torsion(channel, show.target)
    for svg in (outline_svg(channel, units=units), warping_svg(channel, units=units),
                torsion_svg(channel, torsion, units=units)):
        root = parse(svg)
        fits = tick_map(root)
        scale = fits[0][0]
        assert fits[1][0] == pytest.approx(-scale, rel=1e-4)  # equal scale, y up (0.01 px)
        xs, ys = mark_at(root, "shear-centre", fits)
        want = show.point(channel.torsion.shear_centre)
        assert (xs, ys) == pytest.approx(want, abs=0.03 / scale)  # within the pixel rounding
    root = parse(outline_svg(channel, units=units))
    fits = tick_map(root)
    assert mark_at(root, "centroid", fits) == pytest.approx(show.point(channel.geometric.centroid),
                                                            abs=0.03 / fits[0][0])
    root = parse(torsion_svg(channel, torsion, units=units))
    fits = tick_map(root)
    assert mark_at(root, "largest-stress", fits) == pytest.approx(show.point(torsion.tau_max_at),
                                                                  abs=0.03 / fits[0][0])


def test_a_shear_centre_outside_the_outline_is_in_view(channel):
    assert channel.torsion.shear_centre[0] < channel.profile.bounds[0] - 5  # well outside
    for svg in (outline_svg(channel), warping_svg(channel),
                torsion_svg(channel, torsion_stress(channel, 1.0))):
        root = parse(svg)
        _, _, width, height = map(float, root.get("viewBox").split())
        fits = tick_map(root)
        xs, ys = mark_at(root, "shear-centre", fits)
        px = fits[0][0] * xs + fits[0][1], fits[1][0] * ys + fits[1][1]
        assert LEFT < px[0] < width and 0 < px[1] < height  # inside the axes
        x0, _, x1, _ = channel.profile.bounds
        # and the whole outline is in view too
        assert LEFT < fits[0][0] * x0 + fits[0][1] < fits[0][0] * x1 + fits[0][1] < width


def colour_bar(root: ET.Element) -> tuple[float, float, list[str]]:
    (bar,) = root.findall(".//s:g[@class='colour-bar']", NS)
    ends = [t.text for t in bar.findall("s:text[@class='bar-end']", NS)]
    return float(bar.get("data-min")), float(bar.get("data-max")), ends


def test_warping_colour_bar_spans_the_field(channel):
    for units in (None, "cm"):
        omega = Converter.of(channel.units, units)(np.asarray(channel.torsion.omega), AREA)
        lo, hi, ends = colour_bar(parse(warping_svg(channel, units=units)))
        assert lo == omega.min() and hi == omega.max()
        assert ends == [fmt(omega.min()).replace("-", "\u2212"), fmt(omega.max())]
        assert lo < 0 < hi


def test_torsion_colour_bar_spans_the_field(channel, ell):
    stress = torsion_stress(channel, 1.0)
    tau = np.concatenate([m.tau for m in stress.by_material])
    lo, hi, _ = colour_bar(parse(torsion_svg(channel, stress)))
    assert not channel.corners and hi == pytest.approx(tau.max(), rel=1e-12) and lo == tau.min()
    # with a sharp corner the scale stops at the largest stress away from it; the field goes on
    stress = torsion_stress(ell, 1.0)
    tau = np.concatenate([m.tau for m in stress.by_material])
    root = parse(torsion_svg(ell, stress))
    lo, hi, _ = colour_bar(root)
    assert lo == tau.min() and hi == stress.tau_max < tau.max()
    (beyond,) = root.findall(".//s:path[@class='beyond']", NS)
    assert float(beyond.get("data-max")) == tau.max()
    (corner,) = root.findall(".//s:g[@class='mark sharp-corner']", NS)
    assert (float(corner.get("data-x")), float(corner.get("data-y"))) == (5.0, 5.0)


def ring_areas(d: str) -> float:
    """Signed area of the rings of a path (tenths of pixels), pixels^2."""
    total = 0.0
    for ring in re.findall(r"M([^MZ]*)Z", d):
        p = np.array([[float(v) for v in xy.split(",")] for xy in ring.split()]) / 10.0
        total += 0.5 * np.sum(p[:, 0] * np.roll(p[:, 1], -1) - np.roll(p[:, 0], -1) * p[:, 1])
    return total


@pytest.mark.parametrize("which", ["warping", "torsion"])
@pytest.mark.parametrize("name", ["channel", "ell", "composite"])
def test_the_bands_cover_the_meshed_section(name, which, request):
    result = request.getfixturevalue(name)
    svg = warping_svg(result) if which == "warping" else \
        torsion_svg(result, torsion_stress(result, 1.0))
    root = parse(svg)
    fits = tick_map(root)
    (bands,) = root.findall(".//s:g[@class='bands']", NS)
    areas = [ring_areas(p.get("d")) for p in bands.findall("s:path", NS)]
    nodes, e = result.mesh.nodes, result.mesh.elements
    # the meshed area: the four straight sub-triangles of every element (common practice)
    corners = nodes[e[:, [0, 3, 5, 3, 1, 4, 5, 4, 2, 3, 4, 5]].reshape(-1, 3)]
    u, v = corners[:, 1] - corners[:, 0], corners[:, 2] - corners[:, 0]
    meshed = 0.5 * np.sum(u[:, 0] * v[:, 1] - u[:, 1] * v[:, 0])
    k = float(Converter.of(result.units, None)(1.0, LENGTH))
    # y down in the picture: rings counter-clockwise in the drawing have negative area there
    assert -sum(areas) == pytest.approx(meshed * (fits[0][0] * k) ** 2, rel=2e-3)
    assert len(areas) >= 5  # several bands


def test_pictures_are_self_contained_and_escaped(tmp_path):
    path = tmp_path / "bar <&> 'x'.txt"
    path.write_text("0 0\n30 0\n30 10\n0 10\n")
    result = analyse(load_profile(path))
    torsion = torsion_stress(result, 1.0)
    for svg in (outline_svg(result), warping_svg(result), torsion_svg(result, torsion)):
        root = parse(svg)  # well-formed XML although the name holds < & >
        title = " ".join(t.text for t in root.findall(".//s:g[@class='title']/s:text", NS))
        assert title.startswith("bar <&> 'x'.txt: ")
        for bad in (" id=", "<style", "href", "url(", "<script", "<image"):
            assert bad not in svg
    page = datasheet_html(result, torsion=torsion)
    assert page.count("<svg") == 3 and "&lt;&amp;&gt;" in page


def test_the_legends_give_the_values(channel):
    show = Converter.of(channel.units, None)
    legend = [t.text for t in parse(outline_svg(channel)).findall(".//s:g[@class='legend']/s:text", NS)]
    xs, ys = channel.torsion.shear_centre
    assert f"S: shear centre ({fmt(xs)}, {fmt(ys)}) mm" in legend
    assert any(t.startswith("axis 1 (major), I1 = ") for t in legend)
    stress = torsion_stress(channel, 1.0)
    root = parse(torsion_svg(channel, stress))
    legend = [t.text for t in root.findall(".//s:g[@class='legend']/s:text", NS)]
    assert f"largest shear stress {fmt(show(stress.tau_max, STRESS))} MPa" in legend[0]


def test_a_round_bar_has_one_warping_band():
    from warpwise.geometry.shapes import circle

    result = analyse(circle(20.0))
    lo, hi, ends = colour_bar(parse(warping_svg(result)))
    assert abs(lo) < 1e-6 and abs(hi) < 1e-6  # omega is zero up to round-off on a circle
    assert len(ends) in (1, 2)


def test_a_rectangle_picture_is_small():
    result = analyse(rectangle(40.0, 20.0))
    sizes = [len(outline_svg(result)), len(warping_svg(result)),
             len(torsion_svg(result, torsion_stress(result, 1.0)))]
    assert max(sizes) < 150_000, sizes
