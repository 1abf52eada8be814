"""DXF block references: nesting, mirror, non-uniform scale, rotation, MINSERT arrays, cycles.

Every drawing is invented here and written with ezdxf into the test's own folder. The expected
geometry never comes from ezdxf's transforms: :func:`place` builds each reference's map from
the DXF definition of INSERT (common practice, no source: the DXF reference's INSERT group
codes; WCS point = insertion point + R(rotation) diag(xscale, yscale) (p - block base point),
MINSERT cells offset by R(rotation) (column * column spacing, row * row spacing), spacing not
scaled) and composes the levels by matrix products. Exact values come from shapely polygons of
the mapped corner points (area, centroid) with the vertex formula for second moments, or from
closed forms mapped by the affine map (an affine map x -> A x + b scales areas by |det A|,
keeps centroids and turns the central second-moment tensor J into |det A| A J A^T; a disk of
radius r has J = pi r^4 / 4 times the unit tensor, so its image is the ellipse of area pi a b
and, axis-parallel, I = pi a b^3 / 4).

Tolerances: sections of straight edges only are exact (the polygon is the section, and the
six-node elements integrate the quadratic integrands of A, Ix, Iy exactly), so they are checked
to 1e-9. Ellipses are drawn by chords within the chord tolerance the reader chooses so that the
chords change the area by at most CHORD_AREA_BUDGET (0.5e-4), so they are checked to 1e-4,
the accuracy warpwise promises; with a fine chord tolerance the area is checked against the
chord bound itself (at most 2/3 of the tolerance times the curve length), which a transform
wrong by more than round-off would fail.
"""

import math

import ezdxf
import numpy as np
import pytest
from shapely.geometry import Polygon
from shapely.geometry.polygon import orient

from warpwise import analyse
from warpwise.errors import InputFileError
from warpwise.geometry import EllipseArc
from warpwise.io import load_profile
from warpwise.io.dxf import MAX_BLOCK_DEPTH, import_dxf, read_drawing

# --- the expected geometry, independently of ezdxf ---------------------------------------------


def place(insert=(0.0, 0.0), rotation=0.0, sx=1.0, sy=1.0, base=(0.0, 0.0)):
    """3x3 affine map of one INSERT (extrusion +z): insert + R(rotation) diag(sx, sy) (p - base)."""
    c, s = math.cos(math.radians(rotation)), math.sin(math.radians(rotation))
    m = np.array([[c, -s, 0.0], [s, c, 0.0], [0.0, 0.0, 1.0]]) @ np.diag([sx, sy, 1.0])
    m = m @ np.array([[1.0, 0.0, -base[0]], [0.0, 1.0, -base[1]], [0.0, 0.0, 1.0]])
    m[:2, 2] += insert
    return m


def mapped(m, pts):
    pts = np.asarray(pts, dtype=float).reshape(-1, 2)
    return pts @ m[:2, :2].T + m[:2, 2]


class Section:
    """Area, first and second moments (about the origin) summed over exact pieces."""

    def __init__(self):
        self.A, self.S, self.J = 0.0, np.zeros(2), np.zeros((2, 2))

    def add(self, a, centroid, j_central, sign=1.0):
        c = np.asarray(centroid, dtype=float)
        self.A += sign * a
        self.S += sign * a * c
        self.J += sign * (j_central + a * np.outer(c, c))

    def polygon(self, pts, sign=1.0):
        """A polygon of the given (already mapped) corner points."""
        poly = orient(Polygon(pts), 1.0)  # counter-clockwise
        x, y = np.asarray(poly.exterior.coords).T
        cross = x[:-1] * y[1:] - x[1:] * y[:-1]
        jxx = np.sum((x[:-1] ** 2 + x[:-1] * x[1:] + x[1:] ** 2) * cross) / 12  # int x^2
        jyy = np.sum((y[:-1] ** 2 + y[:-1] * y[1:] + y[1:] ** 2) * cross) / 12  # int y^2
        jxy = np.sum((x[:-1] * y[1:] + 2 * x[:-1] * y[:-1] + 2 * x[1:] * y[1:] + x[1:] * y[:-1])
                     * cross) / 24
        c = np.array(poly.centroid.coords[0])
        a = poly.area
        self.add(a, c, np.array([[jxx, jxy], [jxy, jyy]]) - a * np.outer(c, c), sign)

    def mapped_closed_form(self, m, a, centroid, j_central, sign=1.0):
        """A block-space shape of known area, centroid and central tensor, mapped by m."""
        A2 = m[:2, :2]
        det = abs(np.linalg.det(A2))
        self.add(det * a, mapped(m, centroid)[0], det * A2 @ j_central @ A2.T, sign)

    def disk(self, m, centre, r, sign=1.0):
        self.mapped_closed_form(m, math.pi * r * r, centre, math.pi * r**4 / 4 * np.eye(2), sign)

    @property
    def centroid(self):
        return self.S / self.A

    @property
    def central(self):
        """(Ix, Iy, Ixy) about centroidal axes parallel to x and y."""
        c = self.centroid
        j = self.J - self.A * np.outer(c, c)
        return j[1, 1], j[0, 0], j[0, 1]


#: Geometric properties of drawings whose curves are ellipses (circles in unequally scaled
#: blocks): the mesh follows the recorded ellipses with curved (isoparametric) edges, so what is
#: left is the sliver between each quadratic edge and the ellipse; measured at most 7.1e-9 here
#: (the circles' chords in a block span at most pi/24 of the parameter).
TOL_ELLIPSES = 2e-8


def check_against(result, exact, rel):
    g = result.geometric
    ix, iy, ixy = exact.central
    assert g.A == pytest.approx(exact.A, rel=rel)
    assert g.centroid == pytest.approx(tuple(exact.centroid), abs=rel * math.sqrt(exact.A))
    assert g.Ix == pytest.approx(ix, rel=rel)
    assert g.Iy == pytest.approx(iy, rel=rel)
    assert g.Ixy == pytest.approx(ixy, abs=rel * math.hypot(ix, iy))


def new_doc():
    doc = ezdxf.new()
    doc.header["$INSUNITS"] = 4  # mm
    return doc, doc.modelspace()


def save(doc, tmp_path, name):
    path = tmp_path / name
    doc.saveas(path)
    return path


def defects(path):
    return [d.text for d in read_drawing(path).defects]


# --- the case of the issue -------------------------------------------------------------------


def test_nested_mirror_and_scale_around_a_rotated_reference(tmp_path):
    doc, msp = new_doc()
    inner = doc.blocks.new("IN")
    inner.add_lwpolyline([(0, 0), (30, 0), (30, 20), (0, 20)], close=True)
    outer = doc.blocks.new("OUT")
    outer.add_blockref("IN", (0, 0), dxfattribs={"rotation": 90})
    msp.add_blockref("OUT", (0, 0), dxfattribs={"xscale": -1, "yscale": 1.5})
    path = save(doc, tmp_path, "issue.dxf")
    p = load_profile(path)
    # (x, y) -> turned 90 degrees (-y, x) -> scaled (y, 1.5 x): 30 x 20 becomes 20 x 45
    assert p.bounds == pytest.approx((0, 0, 20, 45), abs=1e-12)
    g = analyse(p).geometric
    assert g.A == pytest.approx(900.0, rel=1e-12)
    assert g.Ix == pytest.approx(20 * 45**3 / 12, rel=1e-9)  # closed form b h^3 / 12
    assert g.Iy == pytest.approx(45 * 20**3 / 12, rel=1e-9)


# --- three levels: L-shapes, holes, rings --------------------------------------------------

L_SHAPE = [(0, 0), (40, 0), (40, 8), (8, 8), (8, 30), (0, 30)]


def three_levels(tmp_path, holes, top_extrusion=False):
    """Model space > TOP > MID > L, each level mirrored or scaled unequally, turned, with base points.

    Returns the file, the exact section and the maps of the L, the MID and the TOP block.
    """
    doc, msp = new_doc()
    leaf = doc.blocks.new("L", base_point=(2, 1))
    leaf.add_lwpolyline(L_SHAPE, close=True)
    mid = doc.blocks.new("MID", base_point=(-3, 4))
    mid.add_blockref("L", (5, -3), dxfattribs={"rotation": 30, "xscale": 1, "yscale": -2})
    mid.add_lwpolyline([(60, -5), (80, -5), (80, 5), (60, 5)], close=True)
    if holes:
        leaf.add_circle((4, 20), 2)  # a hole in the L's long leg
        mid.add_circle((110, 0), 10)  # a ring beside the L
        mid.add_circle((110, 0), 6)
    top = doc.blocks.new("TOP", base_point=(1, -2))
    top.add_blockref("MID", (10, 20), dxfattribs={"rotation": -75, "xscale": -1.5, "yscale": 0.8})
    attribs = {"rotation": 15, "xscale": 0.7, "yscale": -1.1}
    if top_extrusion:
        attribs["extrusion"] = (0, 0, -1)  # the reference's own plane seen from below: x -> -x
    msp.add_blockref("TOP", (100, 50), dxfattribs=attribs)
    path = save(doc, tmp_path, "three.dxf")

    m_top = place((100, 50), 15, 0.7, -1.1, (1, -2))
    if top_extrusion:
        m_top = np.diag([-1.0, 1.0, 1.0]) @ m_top
    m_mid = m_top @ place((10, 20), -75, -1.5, 0.8, (-3, 4))
    m_leaf = m_mid @ place((5, -3), 30, 1, -2, (2, 1))
    exact = Section()
    exact.polygon(mapped(m_leaf, L_SHAPE))
    exact.polygon(mapped(m_mid, [(60, -5), (80, -5), (80, 5), (60, 5)]))
    if holes:
        exact.disk(m_leaf, (4, 20), 2, sign=-1)
        exact.disk(m_mid, (110, 0), 10)
        exact.disk(m_mid, (110, 0), 6, sign=-1)
    return path, exact, (m_leaf, m_mid, m_top)


@pytest.mark.parametrize("top_extrusion", [False, True], ids=["extrusion +z", "extrusion -z"])
def test_three_levels_of_straight_edges_are_exact(tmp_path, top_extrusion):
    path, exact, (m_leaf, m_mid, _) = three_levels(tmp_path, holes=False, top_extrusion=top_extrusion)
    p = load_profile(path, all_parts=True)
    assert len(p.regions) == 2
    # every corner lands where the composed maps put it
    corners = np.vstack([r.outer for r in p.regions])
    for q in np.vstack([mapped(m_leaf, L_SHAPE), mapped(m_mid, [(60, -5), (80, 5)])]):
        assert float(np.min(np.hypot(*(corners - q).T))) < 1e-9
    check_against(analyse(p), exact, 1e-9)


def test_three_levels_with_holes_and_rings(tmp_path):
    path, exact, (m_leaf, m_mid, _) = three_levels(tmp_path, holes=True)
    p = load_profile(path, all_parts=True)
    assert len(p.regions) == 3 and sorted(len(r.holes) for r in p.regions) == [0, 1, 1]
    # sheared circles are ellipses, recorded as such (the mesh follows them)
    assert len(p.arcs) == 3 and all(isinstance(q, EllipseArc) for q in p.arcs)
    check_against(analyse(p), exact, TOL_ELLIPSES)
    # with fine chords the area is within the chord bound of the exact one
    fine = import_dxf(path, all_parts=True, chord_tolerance=1e-5)
    s = fine.chord_tolerance
    length = sum(ellipse_perimeter(m, r) for m, r in ((m_leaf, 2), (m_mid, 10), (m_mid, 6)))
    assert abs(fine.profile.area - exact.A) <= 2 / 3 * s * length
    assert abs(fine.profile.area - exact.A) <= 1e-6 * exact.A


def ellipse_perimeter(m, r):
    """Perimeter of the image of a circle of radius r (semi-axes from the singular values)."""
    a, b = np.linalg.svd(m[:2, :2], compute_uv=False) * r
    h = ((a - b) / (a + b)) ** 2  # Ramanujan's second approximation (relative error below 1e-9 here)
    return math.pi * (a + b) * (1 + 3 * h / (10 + math.sqrt(4 - 3 * h)))


# --- MINSERT -------------------------------------------------------------------------------------


def test_minsert_array_of_a_block_with_a_hole(tmp_path):
    doc, msp = new_doc()
    cell = doc.blocks.new("CELL", base_point=(6, 4))
    cell.add_lwpolyline([(0, 0), (12, 0), (12, 8), (0, 8)], close=True)
    cell.add_circle((6, 4), 2)
    array = doc.blocks.new("ARRAY")
    ref = array.add_blockref("CELL", (0, 0), dxfattribs={"rotation": 20, "xscale": 1.5, "yscale": 1.5})
    ref.grid(size=(2, 3), spacing=(20, 30))  # 2 rows 20 apart, 3 columns 30 apart
    msp.add_blockref("ARRAY", (200, 100), dxfattribs={"xscale": -1, "rotation": 90})
    path = save(doc, tmp_path, "minsert.dxf")

    m_array = place((200, 100), 90, -1, 1)
    cells = [m_array @ place(mapped(place(rotation=20), [(col * 30, row * 20)])[0], 20, 1.5, 1.5, (6, 4))
             for row in range(2) for col in range(3)]
    exact = Section()
    for m in cells:
        exact.polygon(mapped(m, [(0, 0), (12, 0), (12, 8), (0, 8)]))
        exact.disk(m, (6, 4), 2, sign=-1)
    assert exact.A == pytest.approx(6 * 1.5**2 * (96 - 4 * math.pi), rel=1e-14)

    result = import_dxf(path, all_parts=True)
    p = result.profile
    assert len(p.regions) == 6 and all(len(r.holes) == 1 for r in p.regions)
    # the circles stay circles: true centres and radii at the cells' centres
    centres = sorted((round(a.cx, 9), round(a.cy, 9)) for a in p.arcs)
    assert centres == sorted((round(x, 9), round(y, 9)) for x, y in (mapped(m, [(6, 4)])[0] for m in cells))
    assert all(a.r == pytest.approx(3.0, rel=1e-12) for a in p.arcs)
    assert read_drawing(path).in_blocks == {"INSERT": 1, "LWPOLYLINE": 6, "CIRCLE": 6}
    check_against(analyse(p), exact, 1e-4)
    # chords inside the six holes leave the polygon area above the exact one by at most the bound
    s = result.chord_tolerance
    assert 0 <= p.area - exact.A <= 2 / 3 * s * 6 * 2 * math.pi * 3


# --- arcs under a mirror ---------------------------------------------------------------------

R_D = 10.0


def d_shape_section():
    """The D of a 20 x 20 square and a half disc of radius 10 to its right: area, centroid, J."""
    a_rect, a_half = 400.0, math.pi * R_D**2 / 2
    c_half = 4 * R_D / (3 * math.pi)  # closed form: centroid of a half disc
    a = a_rect + a_half
    xc = (a_rect * -10 + a_half * c_half) / a
    # about the origin: rectangle [-20, 0] x [-10, 10]; half disc int x^2 = int y^2 = pi r^4 / 8
    jxx = 20 * 20**3 / 3 + math.pi * R_D**4 / 8
    jyy = 20 * 20**3 / 12 + math.pi * R_D**4 / 8
    return a, (xc, 0.0), np.array([[jxx - a * xc**2, 0.0], [0.0, jyy]])


@pytest.mark.parametrize("scale", [(-1, 1), (-1, 2), (1.5, -0.5)])
def test_mirrored_block_with_arcs(tmp_path, scale):
    doc, msp = new_doc()
    blk = doc.blocks.new("D")
    blk.add_lwpolyline([(0, 10), (-20, 10), (-20, -10), (0, -10)])  # open: the arc closes it
    blk.add_arc((0, 0), R_D, -90, 90)  # counter-clockwise through (10, 0)
    # the same D as one closed polyline, 60 to the right: a bulge of 1 is the half circle
    blk.add_lwpolyline([(60, 10, 0), (40, 10, 0), (40, -10, 0), (60, -10, 1)], format="xyb", close=True)
    blk.add_polyline2d([(60, 40, 0), (40, 40, 0), (40, 20, 0), (60, 20, 1)], format="xyb", close=True)
    sx, sy = scale
    msp.add_blockref("D", (50, 20), dxfattribs={"xscale": sx, "yscale": sy, "rotation": 30})
    path = save(doc, tmp_path, "mirrored_arcs.dxf")

    m = place((50, 20), 30, sx, sy)
    a, c, j = d_shape_section()
    exact = Section()
    for dx, dy in ((0, 0), (60, 0), (60, 30)):
        exact.mapped_closed_form(m, a, (c[0] + dx, c[1] + dy), j)
    result = import_dxf(path, all_parts=True)
    p = result.profile
    assert len(p.regions) == 3
    if sx * sx == sy * sy:  # a similarity keeps the arcs circular, with their true centres
        assert sorted((round(q.cx, 9), round(q.cy, 9), q.r) for q in p.arcs) == sorted(
            (round(x, 9), round(y, 9), R_D) for x, y in mapped(m, [(0, 0), (60, 0), (60, 30)]))
    else:  # the half circles become half ellipses, recorded as such
        assert len(p.arcs) == 3 and all(isinstance(q, EllipseArc) for q in p.arcs)
    # a wrong direction would take the other half of the circle (area 400 - 50 pi, or no loop)
    s = result.chord_tolerance
    arc_length = sum(ellipse_perimeter(m, R_D) / 2 for _ in range(3))
    assert abs(p.area - exact.A) <= 2 / 3 * s * arc_length
    check_against(analyse(p), exact, TOL_ELLIPSES)


def test_arc_drawn_from_below_in_a_scaled_block(tmp_path):
    doc, msp = new_doc()
    blk = doc.blocks.new("LEFT")
    # extrusion (0, 0, -1): OCS x is WCS -x, so this arc runs through (-10, 0), clockwise seen from +z
    blk.add_arc((0, 0), R_D, -90, 90, dxfattribs={"extrusion": (0, 0, -1)})
    blk.add_line((0, -10), (0, 10))
    msp.add_blockref("LEFT", (0, 0), dxfattribs={"xscale": 3, "yscale": -1, "rotation": 45})
    path = save(doc, tmp_path, "from_below.dxf")
    m = place((0, 0), 45, 3, -1)
    exact = Section()
    a_half = math.pi * R_D**2 / 2
    exact.mapped_closed_form(m, a_half, (-4 * R_D / (3 * math.pi), 0.0),
                             np.diag([math.pi * R_D**4 / 8 - a_half * (4 * R_D / (3 * math.pi)) ** 2,
                                      math.pi * R_D**4 / 8]))
    check_against(analyse(load_profile(path)), exact, TOL_ELLIPSES)


# --- circles become ellipses -----------------------------------------------------------------


def test_circle_in_a_block_scaled_2_1_is_an_ellipse(tmp_path):
    r = 5.0
    doc, msp = new_doc()
    blk = doc.blocks.new("C")
    blk.add_circle((0, 0), r)
    msp.add_blockref("C", (50, 30), dxfattribs={"xscale": 2, "yscale": 1})
    path = save(doc, tmp_path, "ellipse.dxf")
    drawing = read_drawing(path)
    (piece,) = drawing.pieces
    pts = piece.sample(1e-4)
    # every chord vertex on the ellipse of semi-axes 2 r and r about (50, 30)
    assert np.allclose(((pts[:, 0] - 50) / (2 * r)) ** 2 + ((pts[:, 1] - 30) / r) ** 2, 1.0, atol=1e-12)
    assert np.ptp(pts[:, 0]) == pytest.approx(4 * r, abs=1e-3) and np.ptp(pts[:, 1]) == pytest.approx(
        2 * r, abs=1e-3)
    p = load_profile(path)
    (e,) = p.arcs
    assert isinstance(e, EllipseArc) and e.full
    assert (e.cx, e.cy) == pytest.approx((50, 30), abs=1e-12) and (e.a, e.b) == pytest.approx((10, 5))
    g = analyse(p).geometric
    a, b = 2 * r, r
    assert g.A == pytest.approx(math.pi * a * b, rel=TOL_ELLIPSES)  # closed form pi a b
    assert g.Ix == pytest.approx(math.pi * a * b**3 / 4, rel=TOL_ELLIPSES)  # closed form pi a b^3 / 4
    assert g.Iy == pytest.approx(math.pi * a**3 * b / 4, rel=TOL_ELLIPSES)
    assert g.centroid == pytest.approx((50, 30), abs=1e-9)


def test_ellipse_in_a_sheared_block_stays_exact(tmp_path):
    doc, msp = new_doc()
    inner = doc.blocks.new("E")
    inner.add_ellipse((0, 0), major_axis=(8, 6), ratio=0.5)  # semi-axes 10 and 5, turned
    outer = doc.blocks.new("SHEAR")
    outer.add_blockref("E", (0, 0), dxfattribs={"rotation": 35})
    msp.add_blockref("SHEAR", (0, 0), dxfattribs={"xscale": 2, "yscale": -0.5})
    path = save(doc, tmp_path, "sheared_ellipse.dxf")
    # the ellipse is the image of the unit disk under A = [major, minor]
    major = np.array([8.0, 6.0])
    minor = 0.5 * np.array([-6.0, 8.0])
    m = place((0, 0), 0, 2, -0.5) @ place((0, 0), 35)
    m_disk = m @ np.array([[major[0], minor[0], 0], [major[1], minor[1], 0], [0, 0, 1]])
    exact = Section()
    exact.disk(m_disk, (0, 0), 1.0)
    check_against(analyse(load_profile(path)), exact, TOL_ELLIPSES)


def test_spline_control_points_and_fit_points_follow_the_transform(tmp_path):
    doc, msp = new_doc()
    blk = doc.blocks.new("S")
    fit = [(0, 0), (10, -2), (20, 3), (18, 12), (6, 14), (-2, 7), (0, 0)]
    blk.add_spline(fit)  # fit points only: control points come from ezdxf's interpolation
    ctrl = [(40, 0), (60, 0), (60, 15), (40, 15), (40, 0)]
    blk.add_open_spline(ctrl, degree=2)  # a closed B-spline of its control points
    mid = doc.blocks.new("MID")
    mid.add_blockref("S", (0, 0), dxfattribs={"rotation": 40, "xscale": 3, "yscale": 0.5})
    msp.add_blockref("MID", (5, 5), dxfattribs={"xscale": -1, "yscale": 1.2})
    path = save(doc, tmp_path, "splines.dxf")
    m = place((5, 5), 0, -1, 1.2) @ place((0, 0), 40, 3, 0.5)
    # the block-space curves (ezdxf's, the fit-point one interpolated in block space) drawn very
    # finely, mapped point by point: exact images to 1e-7 (an affine map keeps straight chords)
    curves = [Polygon(mapped(m, [(v.x, v.y) for v in s.construction_tool().flattening(1e-7)]))
              for s in blk.query("SPLINE")]
    result = import_dxf(path, all_parts=True, chord_tolerance=1e-5)
    got = sorted(result.profile.regions, key=lambda r: r.area)
    for region, curve in zip(got, sorted(curves, key=lambda c: c.area), strict=True):
        bound = 2 / 3 * result.chord_tolerance * curve.length + 1e-7 * curve.length
        assert abs(region.area - curve.area) <= bound
    # interpolating the transformed fit points instead gives a different curve: 19 % more area here


# --- layers ---------------------------------------------------------------------------------------


def test_layer_0_takes_the_layer_of_the_reference_it_comes_through(tmp_path):
    doc, msp = new_doc()
    leaf = doc.blocks.new("LEAF")
    leaf.add_lwpolyline([(0, 0), (10, 0), (10, 10), (0, 10)], close=True)  # layer 0
    leaf.add_circle((5, 5), 2, dxfattribs={"layer": "own"})
    mid = doc.blocks.new("MID")
    mid.add_blockref("LEAF", (0, 0))  # layer 0: takes the outer reference's layer
    mid.add_blockref("LEAF", (20, 0), dxfattribs={"layer": "inner"})
    msp.add_blockref("MID", (0, 0), dxfattribs={"layer": "parts", "xscale": 1, "yscale": 2})
    result = import_dxf(save(doc, tmp_path, "layers.dxf"), all_parts=True)
    assert sorted(result.loop_layers) == ["inner", "own", "own", "parts"]


# --- tilted references ---------------------------------------------------------------------------


def test_a_reference_turned_out_of_the_plane_is_left_out_with_a_warning(tmp_path):
    doc, msp = new_doc()
    blk = doc.blocks.new("B")
    blk.add_lwpolyline([(0, 0), (10, 0), (10, 10), (0, 10)], close=True)
    blk.add_circle((5, 5), 2)
    blk.add_line((0, 0), (10, 10))
    msp.add_blockref("B", (0, 0), dxfattribs={"extrusion": (0, 1, 0)})
    msp.add_lwpolyline([(30, 0), (40, 0), (40, 10), (30, 10)], close=True)
    path = save(doc, tmp_path, "tilted.dxf")
    texts = defects(path)
    assert sum("does not lie in the x-y plane" in t for t in texts) == 3, texts
    assert load_profile(path).area == pytest.approx(100.0, rel=1e-12)


# --- cycles, depth, bombs ------------------------------------------------------------------------


CYCLE_TAIL = ", so its references never end; remove the reference that closes the cycle"


@pytest.mark.parametrize("mutual", [False, True], ids=["itself", "through another block"])
def test_a_block_that_inserts_itself_is_an_error_naming_the_cycle(tmp_path, mutual, cli):
    # a block that inserts itself has no finite expansion (common practice, no source: a DXF
    # block definition must not reference itself); reading it to a depth limit would make up
    # parts that are not in the drawing, so the drawing is refused, not "repaired"
    doc, msp = new_doc()
    a = doc.blocks.new("A")
    a.add_lwpolyline([(0, 0), (10, 0), (10, 10), (0, 10)], close=True)
    if mutual:
        b = doc.blocks.new("B")
        b.add_blockref("A", (50, 0))
        a.add_blockref("B", (0, 50))
    else:
        a.add_blockref("A", (20, 0))
        a.add_blockref("A", (0, 20))
    msp.add_blockref("A", (0, 0))
    path = save(doc, tmp_path, "cycle.dxf")
    text = "block 'A' inserts itself" + (" through 'B' -> 'A'" if mutual else "") + CYCLE_TAIL
    drawing = read_drawing(path)
    assert [(d.kind, d.severity, d.text) for d in drawing.defects] == [("block cycle", "error", text)]
    assert len(drawing.pieces) == 1  # the first pass through A only: nothing made up
    code, out, err = cli("props", path)
    assert code == 1 and out == ""
    assert err.strip() == f"warpwise: error: {path}: {text}"
    code, out, err = cli("check", path)
    assert code == 1
    assert "repaired" not in out  # ezdxf changes nothing; no repair is claimed
    assert f"  defects: 1 error, 0 warnings\n    1. error: {text}\n" in out
    assert f"  result: not analysable: {text}\n" in out


def test_a_cycle_entered_twice_is_one_error(tmp_path):
    # two model-space references into the same two-block cycle, and the cycle entered from B
    # as well as from A: the error is about the cycle, once
    doc, msp = new_doc()
    a, b = doc.blocks.new("A"), doc.blocks.new("B")
    a.add_line((0, 0), (1, 0))
    a.add_blockref("B", (0, 5))
    b.add_blockref("A", (5, 0))
    msp.add_blockref("A", (0, 0))
    msp.add_blockref("B", (0, 0))
    path = save(doc, tmp_path, "twice.dxf")
    assert [d.text for d in read_drawing(path).defects] == [
        "block 'A' inserts itself through 'B' -> 'A'" + CYCLE_TAIL]


@pytest.mark.parametrize("levels", [MAX_BLOCK_DEPTH, MAX_BLOCK_DEPTH + 1])
def test_nesting_deeper_than_the_limit_is_left_out_with_a_warning(tmp_path, levels):
    doc, msp = new_doc()
    for k in range(levels):
        blk = doc.blocks.new(f"B{k}")
        if k + 1 < levels:
            blk.add_blockref(f"B{k + 1}", (1, 0), dxfattribs={"rotation": 10})
        else:
            blk.add_lwpolyline([(0, 0), (10, 0), (10, 10), (0, 10)], close=True)
    msp.add_blockref("B0", (0, 0))
    path = save(doc, tmp_path, "deep.dxf")
    deep = [t for t in defects(path) if f"more than {MAX_BLOCK_DEPTH} deep" in t]
    if levels == MAX_BLOCK_DEPTH:  # the leaf sits inside MAX_BLOCK_DEPTH references
        assert not deep and load_profile(path).area == pytest.approx(100.0, rel=1e-12)
    else:
        assert len(deep) == 1, deep


def test_a_reference_bomb_is_refused_within_seconds(tmp_path):
    doc, msp = new_doc()
    for k in range(8):  # ten references per level, eight levels: 10^7 lines
        blk = doc.blocks.new(f"B{k}")
        if k < 7:
            for j in range(10):
                blk.add_blockref(f"B{k + 1}", (j, 0))
        else:
            blk.add_line((0, 0), (1, 0))
    msp.add_blockref("B0", (0, 0))
    path = save(doc, tmp_path, "bomb.dxf")
    # counted before any is placed: block k holds ten references of block k + 1, each one entity
    # plus the entities of its block, so s7 = 1, s_k = 10 (1 + s_(k+1)), s0 = 21,111,110, and
    # the model-space reference adds itself: 21,111,111
    with pytest.raises(InputFileError) as err:
        read_drawing(path)
    assert err.value.message == ("the drawing expands to 21,111,111 entities (each copy of a block "
                                 "counted), more than the limit of 200,000; --max-entities N lifts "
                                 "the limit")


def test_text_and_dimensions_in_a_sheared_block_are_counted_without_warnings(tmp_path):
    doc, msp = new_doc()
    blk = doc.blocks.new("SHEET")
    blk.add_lwpolyline([(0, 0), (40, 0), (40, 20), (0, 20)], close=True)
    blk.add_text("PLATE").set_placement((0, 25))
    blk.add_mtext("drawn by nobody")
    blk.add_linear_dim(base=(0, -10), p1=(0, 0), p2=(40, 0)).render()  # ezdxf cannot shear it
    blk.add_attdef("PART", (0, 30))
    mid = doc.blocks.new("MID")
    mid.add_blockref("SHEET", (0, 0), dxfattribs={"rotation": 33})
    msp.add_blockref("MID", (0, 0), dxfattribs={"xscale": 2, "yscale": -0.7})
    path = save(doc, tmp_path, "sheet.dxf")
    drawing = read_drawing(path)
    assert drawing.defects == ()
    assert {t: drawing.skipped[t] for t in ("TEXT", "MTEXT", "DIMENSION")} == {
        "TEXT": 1, "MTEXT": 1, "DIMENSION": 1}
    assert load_profile(path).area == pytest.approx(800 * 2 * 0.7, rel=1e-12)
