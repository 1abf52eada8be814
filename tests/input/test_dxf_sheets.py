"""Drawing sheets as they come out of CAD: frames, title blocks, hatched sections, side views.

A cut section is hatched and a sheet has a frame with a title block (common practice, no
source; ISO 128, ISO 5457, ISO 7200 conventions). Every sheet here is our own invention, written
with ezdxf into the test's own folder. Each section is checked against its exact area and second
moments: a shapely polygon of the exact corner points, arcs drawn with their vertices on the
true circle or ellipse at :data:`FINE` chords per turn (the area the chords cut off is
(t - sin t) r^2 / 2 per chord of angle t: below 1e-8 of these sections), and the moments of
that polygon by Green's theorem over shapely's oriented rings.
"""

import math

import ezdxf
import numpy as np
import pytest
from shapely.geometry import Polygon
from shapely.geometry.polygon import orient

from conftest import assert_one_line_error
from warpwise import analyse
from warpwise.errors import ProfileError
from warpwise.io.check import check_file
from warpwise.io.dxf import CHORD_AREA_BUDGET, import_dxf, lay_out, read_drawing

#: Chords per full turn of the reference polygons' arcs.
FINE = 1 << 15
#: Relative accuracy of the analysis of a section with circular arcs: the mesh follows the true
#: arcs (curved elements), so area and moments are exact up to the quadrature of those elements;
#: measured at most 3.4e-9, where the reference polygon's own chords cut off up to 6e-9 of an arc's
#: sector (t^2 / 6 at t = 2 pi / FINE).
CURVED = 1e-8
#: A section of straight lines only is read exactly: round-off of sums over the elements
#: (measured below 1e-15).
STRAIGHT = 1e-9
#: The polygon the reader draws keeps the area within CHORD_AREA_BUDGET (0.5e-4) of the true
#: curves; the issue's acceptance bound is 1e-4.
POLYGON = CHORD_AREA_BUDGET


# --- exact references ---------------------------------------------------------------------------

def arc_points(cx, cy, r, a0, a1, ratio=1.0, rot=0.0):
    """Points on an arc of a circle (or an ellipse of axis ratio ``ratio`` turned by ``rot``) from
    parameter a0 to a1 (degrees), ends included, at FINE chords per turn."""
    n = max(2, math.ceil(abs(a1 - a0) / 360 * FINE))
    t = np.radians(np.linspace(a0, a1, n + 1))
    u, v = r * np.cos(t), ratio * r * np.sin(t)
    c, s = math.cos(math.radians(rot)), math.sin(math.radians(rot))
    return np.column_stack([cx + c * u - s * v, cy + s * u + c * v])


def moments(geom):
    """Area and second moments about the centroid (Ix, Iy, Ixy) of a shapely polygon, by Green's
    theorem over its rings (exact for straight edges)."""
    geom = orient(geom, 1.0)  # exterior counter-clockwise, holes clockwise
    sums = np.zeros(6)
    for ring in [geom.exterior, *geom.interiors]:
        p = np.asarray(ring.coords)[:-1]
        x0, y0 = p[:, 0], p[:, 1]
        x1, y1 = np.roll(x0, -1), np.roll(y0, -1)
        c = x0 * y1 - x1 * y0
        sums += [c.sum() / 2, (c * (x0 + x1)).sum() / 6, (c * (y0 + y1)).sum() / 6,
                 (c * (y0 * y0 + y0 * y1 + y1 * y1)).sum() / 12,
                 (c * (x0 * x0 + x0 * x1 + x1 * x1)).sum() / 12,
                 (c * (x0 * y1 + 2 * x0 * y0 + 2 * x1 * y1 + x1 * y0)).sum() / 24]
    a, sx, sy, ixx, iyy, ixy = sums
    xc, yc = sx / a, sy / a
    assert a == pytest.approx(geom.area, rel=1e-12)  # Green's theorem against shapely's own area
    return a, ixx - a * yc * yc, iyy - a * xc * xc, ixy - a * xc * yc


def assert_section(profile, exact, rel):
    """The analysed area and second moments against the exact ones."""
    res = analyse(profile).geometric
    a, ix, iy, ixy = moments(exact)
    assert res.A == pytest.approx(a, rel=rel)
    assert res.Ix == pytest.approx(ix, rel=rel)
    assert res.Iy == pytest.approx(iy, rel=rel)
    assert res.Ixy == pytest.approx(ixy, abs=rel * math.sqrt(ix * iy))
    return res


# --- the invented profiles ------------------------------------------------------------------------

#: Hollow rail: 60 x 40 outside with 5 mm corner radii, a 50 x 30 cavity with sharp corners,
#: lower left corner at (40, 90).
RAIL_AT, RAIL_W, RAIL_H, RAIL_R, RAIL_T = (40.0, 90.0), 60.0, 40.0, 5.0, 5.0


def rail_outer(x0=RAIL_AT[0], y0=RAIL_AT[1]):
    """(x, y, bulge) of the rounded outside, counter-clockwise (bulge tan(90/4) per corner)."""
    w, h, r, b = RAIL_W, RAIL_H, RAIL_R, math.tan(math.pi / 8)
    return [(x0 + r, y0, 0), (x0 + w - r, y0, b), (x0 + w, y0 + r, 0), (x0 + w, y0 + h - r, b),
            (x0 + w - r, y0 + h, 0), (x0 + r, y0 + h, b), (x0, y0 + h - r, 0), (x0, y0 + r, b)]


def rail_inner(x0=RAIL_AT[0], y0=RAIL_AT[1]):
    t = RAIL_T
    return [(x0 + t, y0 + t), (x0 + RAIL_W - t, y0 + t), (x0 + RAIL_W - t, y0 + RAIL_H - t),
            (x0 + t, y0 + RAIL_H - t)]


def rail_exact(x0=RAIL_AT[0], y0=RAIL_AT[1]):
    w, h, r = RAIL_W, RAIL_H, RAIL_R
    corners = [(x0 + w - r, y0 + r, -90), (x0 + w - r, y0 + h - r, 0), (x0 + r, y0 + h - r, 90),
               (x0 + r, y0 + r, 180)]
    outer = np.vstack([arc_points(cx, cy, r, a, a + 90) for cx, cy, a in corners])
    return Polygon(outer, [rail_inner(x0, y0)])


def add_rail(msp, layer="contour", hatch_layer="hatch"):
    msp.add_lwpolyline(rail_outer(), format="xyb", close=True, dxfattribs={"layer": layer})
    msp.add_lwpolyline(rail_inner(), close=True, dxfattribs={"layer": layer})
    if hatch_layer:
        hatch = msp.add_hatch(dxfattribs={"layer": hatch_layer})
        hatch.set_pattern_fill("ANSI31", scale=0.5)
        hatch.paths.add_polyline_path(rail_outer(), is_closed=True)
        hatch.paths.add_polyline_path(rail_inner(), is_closed=True)


def new_sheet():
    doc = ezdxf.new(setup=True)
    doc.header["$INSUNITS"] = 4
    return doc, doc.modelspace()


def add_frame_and_title_block(msp, layer="frame"):
    """A4 landscape: the trimmed sheet edge, the frame inside it, and a title block of
    overlapping rectangles in its lower right corner (they share edges with the frame and each
    other), with text and a solid-filled logo (a hatch, but not a section)."""
    msp.add_lwpolyline([(0, 0), (297, 0), (297, 210), (0, 210)], close=True, dxfattribs={"layer": layer})
    msp.add_lwpolyline([(20, 10), (287, 10), (287, 200), (20, 200)], close=True, dxfattribs={"layer": layer})
    cells = [(187, 10, 287, 46), (187, 10, 237, 28), (237, 10, 287, 28), (187, 28, 287, 46),
             (237, 28, 287, 37)]
    for x0, y0, x1, y1 in cells:
        msp.add_lwpolyline([(x0, y0), (x1, y0), (x1, y1), (x0, y1)], close=True,
                           dxfattribs={"layer": layer})
    for k, text in enumerate(("HOLLOW RAIL HR-60", "scale 1:1", "drawn: nobody", "sheet 1 of 1")):
        msp.add_text(text, height=3, dxfattribs={"layer": "text"}).set_placement((190, 13 + 9 * k))
    logo = msp.add_hatch(color=1, dxfattribs={"layer": layer})  # a filled triangle in a cell
    logo.paths.add_polyline_path([(277, 39), (284, 39), (280.5, 44)], is_closed=True)


def full_sheet(tmp_path, name="sheet.dxf"):
    """Frame, title block, a hatched section of the rail, its side view, centre lines,
    dimensions and text, each kind on its own layer as CAD templates have them."""
    doc, msp = new_sheet()
    add_frame_and_title_block(msp)
    add_rail(msp)
    # side view: the rail's length of 100 mm seen from the side, with the cavity as hidden lines
    msp.add_lwpolyline([(140, 90), (240, 90), (240, 130), (140, 130)], close=True,
                       dxfattribs={"layer": "contour"})
    for y in (95, 125):
        msp.add_line((140, y), (240, y), dxfattribs={"layer": "hidden", "linetype": "DASHED"})
    # centre lines through the section and along the side view
    cx, cy = RAIL_AT[0] + RAIL_W / 2, RAIL_AT[1] + RAIL_H / 2
    for p, q in (((cx - 36, cy), (cx + 36, cy)), ((cx, cy - 26), (cx, cy + 26)), ((134, 110), (246, 110))):
        msp.add_line(p, q, dxfattribs={"layer": "centre", "linetype": "CENTER"})
    for base, p1, p2, angle in (((0, 80), RAIL_AT, (RAIL_AT[0] + RAIL_W, RAIL_AT[1]), 0),
                                ((30, 0), RAIL_AT, (RAIL_AT[0], RAIL_AT[1] + RAIL_H), 90),
                                ((0, 140), (140, 130), (240, 130), 0)):
        msp.add_linear_dim(base=base, p1=p1, p2=p2, angle=angle, dxfattribs={"layer": "dims"}).render()
    msp.add_text("A-A", height=5, dxfattribs={"layer": "text"}).set_placement((60, 140))
    path = tmp_path / name
    doc.saveas(path)
    return path


# --- the full sheet -------------------------------------------------------------------------------

def test_full_sheet_gives_the_hatched_section_without_options(tmp_path, cli):
    path = full_sheet(tmp_path)
    result = import_dxf(path)
    p = result.profile
    assert len(p.regions) == 1 and len(p.regions[0].holes) == 1
    notes = " | ".join(p.notes)
    assert "taken as the drawing frame and left out" in notes
    assert "title block (6 loops" in notes  # 5 cells and the logo
    # the side view (100 x 40 mm) is the larger part, part 1; the hatched section is part 2
    assert "part 2 of 2 taken as the section: the only hatched part" in notes and result.part == 2
    assert_section(p, rail_exact(), CURVED)
    code, out, err = cli("props", path)
    assert code == 0, err
    assert "drawing frame" in out and "the only hatched part" in out


def test_full_sheet_check_lists_section_and_side_view(tmp_path):
    report = check_file(full_sheet(tmp_path))
    assert report.ok, report.verdict
    # the two frames and the title block are left out before nesting: two parts remain, the
    # side view (100 x 40 mm) and the section
    assert len(report.parts) == 2
    assert report.parts[0].area == pytest.approx(4000.0, rel=1e-12)  # exact: 100 x 40
    frames = [d for d in report.defects if d.kind == "drawing frame"]
    assert len(frames) == 2 and not report.errors
    assert "297 x 210 mm" in frames[0].text and "267 x 190 mm" in frames[1].text


def test_side_view_is_still_a_part_to_pick(tmp_path):
    result = import_dxf(full_sheet(tmp_path), part=1)
    assert result.profile.area == pytest.approx(4000.0, rel=1e-12)  # exact: 100 x 40


# --- a frame on the section's own layer -----------------------------------------------------------

#: Closed channel: 50 x 30 outside, a 44 x 24 cavity (3 mm walls), at (35, 25) in a 120 x 80 frame.
BOX = Polygon([(35, 25), (85, 25), (85, 55), (35, 55)], [[(38, 28), (82, 28), (82, 52), (38, 52)]])


def frame_around_box(tmp_path):
    """The frame drawn with four LINEs, the box with two closed polylines, all on layer 0."""
    doc, msp = new_sheet()
    corners = [(0, 0), (120, 0), (120, 80), (0, 80)]
    for k in range(4):
        msp.add_line(corners[k], corners[(k + 1) % 4])
    for ring in (BOX.exterior, *BOX.interiors):
        msp.add_lwpolyline(list(ring.coords)[:-1], close=True)
    path = tmp_path / "framed_box.dxf"
    doc.saveas(path)
    return path


def test_frame_on_the_same_layer_does_not_flip_the_nesting(tmp_path, cli):
    path = frame_around_box(tmp_path)
    layout = lay_out(read_drawing(path))
    # without the frame: one part, the box with its cavity as the hole (not the cavity as an
    # island inside a frame with a box-shaped hole)
    assert len(layout.parts) == 1 and layout.parts[0].holes == 1
    p = import_dxf(path).profile
    assert any("taken as the drawing frame" in n and "other loops lie inside" in n for n in p.notes)
    assert p.area == pytest.approx(BOX.area, rel=STRAIGHT)  # shapely: 1500 - 1056 = 444 mm2
    assert_section(p, BOX, STRAIGHT)
    # the cavity is no part of its own any more
    code, _, err = cli("props", path, "--part", "2")
    assert code == 2 and "part 2 does not exist" in err


# --- sections drawn only as hatches ---------------------------------------------------------------

#: Slotted link: two 12 mm semicircles 40 mm apart joined by straight sides, a 5 mm bore at
#: the right-hand centre; every arc a bulge of 1 (a half circle).
SLOT_OUT = [(0, -12, 0), (40, -12, 1), (40, 12, 0), (0, 12, 1)]
SLOT_BORE = [(45, 0, 1), (35, 0, 1)]
SLOT = Polygon(np.vstack([arc_points(40, 0, 12, -90, 90), arc_points(0, 0, 12, 90, 270)]),
               [arc_points(40, 0, 5, 0, 360)[:-1]])


def hatch_only(tmp_path, name, fill, extrusion=(0, 0, 1)):
    doc, msp = new_sheet()
    hatch = msp.add_hatch(dxfattribs={"layer": "section", "extrusion": extrusion})
    hatch.set_pattern_fill("ANSI31")
    fill(hatch.paths)
    msp.add_text("B-B", dxfattribs={"layer": "text"}).set_placement((0, 20))
    path = tmp_path / name
    doc.saveas(path)
    return path


def test_hatch_with_bulge_paths_is_the_section(tmp_path):
    def fill(paths):
        paths.add_polyline_path(SLOT_OUT, is_closed=True)
        paths.add_polyline_path(SLOT_BORE, is_closed=True)

    p = import_dxf(hatch_only(tmp_path, "slot.dxf", fill)).profile
    assert len(p.regions) == 1 and len(p.regions[0].holes) == 1
    assert any("outline read from the boundary of HATCH" in n for n in p.notes)
    assert p.area == pytest.approx(SLOT.area, rel=POLYGON)  # measured 4.9e-5
    assert_section(p, SLOT, CURVED)


def test_mirrored_hatch_plane(tmp_path):
    # the same slot in a hatch whose plane faces -z: its OCS x runs along -x of the drawing, and
    # the mirror turns each arc the other way (bulges change sign)
    def fill(paths):
        paths.add_polyline_path([(-x, y, -b) for x, y, b in SLOT_OUT], is_closed=True)
        paths.add_polyline_path([(-x, y, -b) for x, y, b in SLOT_BORE], is_closed=True)

    p = import_dxf(hatch_only(tmp_path, "slot_mirrored.dxf", fill, extrusion=(0, 0, -1))).profile
    assert_section(p, SLOT, CURVED)


#: Arched block: a 60 x 20 rectangle under a half disc of radius 30 on its top edge, with an
#: elliptical hole (28 x 14, turned 30 degrees) centred at (30, 22).
ARCH = Polygon(np.vstack([[(0, 0), (60, 0)], arc_points(30, 20, 30, 0, 180)]),
               [arc_points(30, 22, 14, 0, 360, ratio=0.5, rot=30)[:-1]])


def test_hatch_with_edge_paths_lines_arcs_and_an_ellipse(tmp_path):
    c, s = math.cos(math.radians(30)), math.sin(math.radians(30))

    def fill(paths):
        # the outside run clockwise, the arc given counter-clockwise with the flag for clockwise
        edges = paths.add_edge_path()
        edges.add_line((0, 0), (0, 20))
        edges.add_arc((30, 20), 30, start_angle=0, end_angle=180, ccw=False)
        edges.add_line((60, 20), (60, 0))
        edges.add_line((60, 0), (0, 0))
        hole = paths.add_edge_path()
        hole.add_ellipse((30, 22), major_axis=(14 * c, 14 * s), ratio=0.5, start_angle=0, end_angle=360)

    p = import_dxf(hatch_only(tmp_path, "arch.dxf", fill)).profile
    assert len(p.regions) == 1 and len(p.regions[0].holes) == 1
    assert p.area == pytest.approx(ARCH.area, rel=POLYGON)  # measured 1.3e-5
    # the mesh follows circles, not ellipses: the elliptical hole stays drawn as chords, within
    # the chord budget (measured: area 1.1e-5, moments 2.4e-6 too large)
    assert_section(p, ARCH, POLYGON)


def test_hatch_with_a_spline_edge_against_ezdxf_geometry(tmp_path):
    # a spline edge: the reference is ezdxf's own flattening of the hatch, as a shapely polygon
    from ezdxf import path as ezpath

    def fill(paths):
        edges = paths.add_edge_path()
        edges.add_line((0, 0), (40, 0))
        edges.add_spline(control_points=[(40, 0), (55, 10), (25, 25), (40, 40)], degree=3)
        edges.add_line((40, 40), (0, 40))
        edges.add_line((0, 40), (0, 0))

    path = hatch_only(tmp_path, "spline.dxf", fill)
    hatch = ezdxf.readfile(path).modelspace().query("HATCH")[0]
    ring = np.array([(v.x, v.y) for v in next(ezpath.from_hatch(hatch)).flattening(1e-6)])
    exact = Polygon(ring)
    p = import_dxf(path).profile
    # both flatten the same B-spline: ezdxf at 1e-6 mm, warpwise within its chord budget
    assert p.area == pytest.approx(exact.area, rel=POLYGON)


def test_hatch_that_does_not_close_is_left_out_with_the_reason(tmp_path, cli):
    def fill(paths):
        edges = paths.add_edge_path()
        edges.add_line((0, 0), (40, 0))
        edges.add_line((40, 0), (40, 30))
        edges.add_line((40, 30), (0, 30))  # the last side is missing

    path = hatch_only(tmp_path, "open_hatch.dxf", fill)
    code, _, err = cli("props", path)
    line = assert_one_line_error(code, err, "open_hatch.dxf", "boundary 1 of HATCH",
                                 "does not close", "the hatch is left out")
    assert "(0, 0)" in line and "(0, 30)" in line  # its free ends


# --- choosing among parts -------------------------------------------------------------------------

def two_sheets(tmp_path, hatch_both):
    doc, msp = new_sheet()
    add_rail(msp)
    msp.add_lwpolyline([(150, 90), (190, 90), (190, 130), (150, 130)], close=True,
                       dxfattribs={"layer": "contour"})
    if hatch_both:
        h = msp.add_hatch(dxfattribs={"layer": "hatch"})
        h.paths.add_polyline_path([(150, 90), (190, 90), (190, 130), (150, 130)], is_closed=True)
    path = tmp_path / ("two_hatched.dxf" if hatch_both else "one_hatched.dxf")
    doc.saveas(path)
    return path


def test_two_hatched_sections_are_refused_naming_the_option(tmp_path, cli):
    path = two_sheets(tmp_path, hatch_both=True)
    code, _, err = cli("props", path)
    line = assert_one_line_error(code, err, "two_hatched.dxf", "2 hatched sections", "--part N",
                                 f"warpwise check {path}", "--all-parts")
    assert "part 1: 40 x 40 mm at (150, 90)" in line and "part 2: 60 x 40 mm at (40, 90)" in line
    with pytest.raises(ProfileError, match="2 hatched sections"):
        import_dxf(path)
    # the part chosen by number is analysed
    assert import_dxf(path, part=2).profile.area == pytest.approx(rail_exact().area, rel=POLYGON)
    assert import_dxf(path, part=1).profile.area == pytest.approx(1600.0, rel=STRAIGHT)


def test_one_hatched_part_is_the_section(tmp_path):
    result = import_dxf(two_sheets(tmp_path, hatch_both=False))
    assert result.part == 2
    assert_section(result.profile, rail_exact(), CURVED)


def test_several_parts_without_hatch_name_part_and_layer(tmp_path, cli):
    doc, msp = new_sheet()
    add_rail(msp, hatch_layer=None)
    msp.add_lwpolyline([(150, 90), (190, 90), (190, 130), (150, 130)], close=True,
                       dxfattribs={"layer": "view"})
    path = tmp_path / "no_hatch.dxf"
    doc.saveas(path)
    code, _, err = cli("props", path)
    assert_one_line_error(code, err, "2 separate parts", "no hatch marks one as the section",
                          "--part N", "warpwise check", "--all-parts", "--layer NAME",
                          "contour (2 loops)", "view (1 loop)")


# --- rectangles that are sections, not frames -----------------------------------------------------

def drawn(tmp_path, name, build):
    doc, msp = new_sheet()
    build(msp)
    path = tmp_path / name
    doc.saveas(path)
    return path


def test_rectangular_tube_and_plate_are_not_frames(tmp_path):
    # nothing says frame: no title block, no hatch inside, nothing inside a hole
    tube = drawn(tmp_path, "tube.dxf", lambda m: [
        m.add_lwpolyline([(0, 0), (80, 0), (80, 60), (0, 60)], close=True),
        m.add_lwpolyline([(4, 4), (76, 4), (76, 56), (4, 56)], close=True)])
    exact = Polygon([(0, 0), (80, 0), (80, 60), (0, 60)], [[(4, 4), (76, 4), (76, 56), (4, 56)]])
    assert import_dxf(tube).profile.area == pytest.approx(exact.area, rel=STRAIGHT)
    plate = drawn(tmp_path, "plate.dxf", lambda m: [
        m.add_lwpolyline([(0, 0), (80, 0), (80, 60), (0, 60)], close=True),
        m.add_circle((20, 30), 6), m.add_circle((60, 30), 6)])
    p = import_dxf(plate).profile
    assert len(p.regions[0].holes) == 2 and not any("frame" in n for n in p.notes)


def test_hatched_rectangle_is_never_a_frame(tmp_path):
    def build(m):
        outer = [(0, 0), (80, 0), (80, 60), (0, 60)]
        window = [(20, 15), (60, 15), (60, 45), (20, 45)]
        m.add_lwpolyline(outer, close=True)
        m.add_lwpolyline(window, close=True)
        m.add_circle((40, 30), 8)  # a bar inside the window: an island
        h = m.add_hatch()
        h.paths.add_polyline_path(outer, is_closed=True)
        h.paths.add_polyline_path(window, is_closed=True)

    layout = lay_out(read_drawing(drawn(tmp_path, "hatched_plate.dxf", build)))
    assert not [d for d in layout.defects if d.kind == "drawing frame"]
    assert len(layout.parts) == 2 and layout.hatched == (0,)  # the plate with its window


def test_frame_is_kept_when_leaving_it_out_would_make_the_hatch_a_hole(tmp_path):
    # a plate with a round window holding a hatched bar: the hatch says the bar is the section;
    # leaving the plate out as a frame would make the window solid and the bar its hole
    def build(m):
        m.add_lwpolyline([(0, 0), (80, 0), (80, 60), (0, 60)], close=True)
        m.add_circle((40, 30), 20)
        m.add_circle((40, 30), 8)
        m.add_hatch().paths.add_polyline_path([(48, 30, 1), (32, 30, 1)], is_closed=True)

    result = import_dxf(drawn(tmp_path, "window.dxf", build))
    assert not any("frame" in n for n in result.profile.notes)
    assert result.profile.area == pytest.approx(math.pi * 64, rel=POLYGON)  # closed form: the bar


def test_layers_of_a_sheet(tmp_path):
    path = full_sheet(tmp_path)
    # the contour layer alone: no frame; the hatch (on a layer not chosen) still marks the section
    result = import_dxf(path, layers=["contour"])
    assert result.part == 2 and not any("frame" in n for n in result.profile.notes)
    assert result.profile.area == pytest.approx(rail_exact().area, rel=POLYGON)
    # the hatch layer alone: the section read from the hatch's bulge paths
    p = import_dxf(path, layers=["hatch"]).profile
    assert any("outline read from the boundary of HATCH" in n for n in p.notes)
    assert_section(p, rail_exact(), CURVED)


RECT = [(0, 0), (50, 0), (50, 30), (0, 30)]


@pytest.mark.parametrize(("style", "loops"), [(0, 3), (1, 2), (2, 1)])
def test_hatch_style_decides_its_holes(tmp_path, style, loops):
    # DXF hatch styles: 0 fills between every other boundary, 1 the outermost area only (the
    # hole stays a hole, the island in it is not filled), 2 everything inside the outermost
    def fill(paths):
        paths.add_polyline_path(RECT, is_closed=True)
        paths.add_polyline_path([(15, 15, 1), (35, 15, 1)], is_closed=True)  # a 10 mm hole
        paths.add_polyline_path([(20, 15, 1), (30, 15, 1)], is_closed=True)  # a 5 mm island in it
        paths.add_polyline_path([(2, 2), (8, 2), (8, 5), (2, 5)], is_closed=True, flags=8)  # text box

    doc, msp = new_sheet()
    hatch = msp.add_hatch(dxfattribs={"hatch_style": style})
    fill(hatch.paths)
    path = tmp_path / f"style{style}.dxf"
    doc.saveas(path)
    layout = lay_out(read_drawing(path))
    assert len(layout.loops) == loops  # the text box is never a loop
    solids = sum(1 for lp in layout.loops if lp.depth % 2 == 0)
    assert solids == (2 if style == 0 else 1)
    # closed forms: 1500 - pi 10^2 (+ pi 5^2 for the island of style 0); 1500 for style 2
    exact = {0: 1500 - math.pi * 100 + math.pi * 25, 1: 1500 - math.pi * 100, 2: 1500.0}[style]
    assert sum(p.area for p in layout.parts) == pytest.approx(exact, rel=POLYGON)
