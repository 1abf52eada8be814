"""Parametric shapes: origins, recorded arcs, validation, symmetry, analysis and the spec parser.

Closed-form area properties are checked in tests/validation/test_shapes_closed_forms.py.
Dimensions are invented, of ordinary proportions (common practice, no source).
"""

from __future__ import annotations

import inspect
import math

import numpy as np
import pytest
import shapely

from warpwise.errors import ProfileError, UsageError
from warpwise.geometry.corners import reentrant_corners
from warpwise.geometry.shapes import (
    SHAPE_KINDS,
    SHAPES,
    angle,
    arc_segments,
    channel,
    channel_with_lips,
    circle,
    describe_shapes,
    hexagon,
    hollow_rectangle,
    i_beam,
    rectangle,
    shaft_with_keyway,
    shape_from_spec,
    tee,
    tube,
    z_shape,
)
from warpwise.geometry.symmetry import symmetry_axes
from warpwise.mesh.core import boundary_edges, build_mesh
from warpwise.properties.analysis import analyse

NAMES = ["rectangle", "circle", "tube", "hollow_rectangle", "i_beam", "channel", "angle", "tee",
         "z_shape", "channel_with_lips", "hexagon", "shaft_with_keyway"]

EXAMPLES = {name: SHAPE_KINDS[name].example for name in NAMES}


def test_registry_names_and_parameters_match_the_functions():
    assert list(SHAPES) == NAMES
    for name, kind in SHAPE_KINDS.items():
        assert SHAPES[name] is kind.function
        sig = inspect.signature(kind.function)
        dims = [p for p in sig.parameters if p not in ("units", "segments", "curved")]
        assert [p.name for p in kind.parameters] == dims, name
        for p in kind.parameters:
            # required in the spec exactly when the function has no default
            assert p.required == (sig.parameters[p.name].default is inspect.Parameter.empty), p
        assert shape_from_spec(kind.example).area > 0


# --------------------------------------------------------------------------- origins


@pytest.mark.parametrize("profile, bounds", [
    (rectangle(40.0, 20.0), (-20, -10, 20, 10)),
    (hollow_rectangle(100.0, 50.0, 4.0, 8.0), (-25, -50, 25, 50)),
    (i_beam(200.0, 100.0, 5.6, 8.5, 12.0), (-50, -100, 50, 100)),
    (channel(160.0, 65.0, 7.5, 10.5, 10.5), (0, -80, 65, 80)),
    (angle(80.0, 60.0, 8.0, 8.0, 4.0), (0, 0, 60, 80)),
    (tee(100.0, 120.0, 11.0, 12.0, 11.0), (-60, 0, 60, 100)),
    (z_shape(200.0, 75.0, 2.0, 3.0), (-74, -100, 74, 100)),  # flange tips b - t/2 from the web centre
    (channel_with_lips(150.0, 60.0, 18.0, 2.0, 3.0), (0, -75, 60, 75)),
    (hexagon(24.0), (-24 / math.sqrt(3), -12, 24 / math.sqrt(3), 12)),
    (shaft_with_keyway(40.0, 12.0, 5.0), (-20, -20, 20, math.sqrt(400 - 36))),
], ids=["rectangle", "hollow_rectangle", "i_beam", "channel", "angle", "tee", "z_shape",
        "channel_with_lips", "hexagon", "shaft_with_keyway"])
def test_origin_conventions(profile, bounds):
    # the polygon's bounds; where the extreme lies on an arc between two vertices (the shaft
    # with keyway at +-x) the polygon may fall short by its sagitta, 1e-4 of the size
    tol = 1e-4 if profile.arcs and "keyway" in profile.source else 1e-12
    assert np.allclose(profile.bounds, bounds, rtol=0, atol=tol * profile.size)


def test_keyway_and_flats():
    p = shaft_with_keyway(40.0, 12.0, 5.0)
    pts = p.regions[0].outer
    # keyway bottom at d/2 - k = 15, its corners at x = +-w/2
    bottom = pts[np.isclose(pts[:, 1], 15.0, atol=1e-12)]
    assert sorted(bottom[:, 0]) == pytest.approx([-6.0, 6.0], abs=1e-12)
    h = hexagon(24.0).regions[0].outer
    assert np.sum(np.isclose(h[:, 1], 12.0, atol=0)) == 2  # a flat at y = s/2


def test_sources_name_the_dimensions():
    assert i_beam(200, 100, 5.6, 8.5, 12).source == "I-beam h=200 b=100 tw=5.6 tf=8.5 r=12"
    assert angle(80, 60, 8, 8).source == "angle h=80 b=60 t=8 r=8"
    assert hollow_rectangle(100, 50, 4, 8, 5).source == "hollow rectangle h=100 b=50 t=4 ro=8 ri=5"
    assert shaft_with_keyway(40, 12, 5).source == "shaft with keyway d=40 w=12 k=5"


@pytest.mark.parametrize("name", NAMES)
def test_printed_label_is_the_spec_name(name):
    # one vocabulary: the label a profile's source begins with (the words before the
    # dimensions), spelled as a spec name, is the shape's own name
    words = shape_from_spec(EXAMPLES[name]).source.split(" ")
    label = " ".join(w for w in words if "=" not in w)
    assert label.lower().replace("-", "_").replace(" ", "_") == name


# --------------------------------------------------------------------------- recorded arcs


def arc_vertices(profile, arc):
    pts = np.vstack([loop for r in profile.regions for loop in r.loops()])
    d = pts - np.array([arc.cx, arc.cy])
    on = np.abs(np.hypot(d[:, 0], d[:, 1]) - arc.r) < 1e-9 * arc.r
    rel = np.mod(np.arctan2(d[on, 1], d[on, 0]) - arc.start + 1e-9, 2 * np.pi) - 1e-9
    return np.sort(rel[rel <= arc.sweep + 1e-9])


@pytest.mark.parametrize("name", NAMES)
def test_arcs_cover_their_polygon_runs(name):
    # each arc's sweep runs exactly from the first to the last polygon vertex on it, with
    # chords short enough for the sagitta rule, and every arc has at least two vertices on it
    p = shape_from_spec(EXAMPLES[name])
    for arc in p.arcs:
        rel = arc_vertices(p, arc)
        assert len(rel) >= 2
        if arc.sweep < 2 * np.pi - 1e-9:
            assert rel[0] == pytest.approx(0.0, abs=1e-9)
            assert rel[-1] == pytest.approx(arc.sweep, abs=1e-9)
            gaps = np.diff(rel)
        else:
            gaps = np.diff(np.append(rel, rel[0] + 2 * np.pi))
        sagitta = arc.r * (1 - np.cos(gaps.max() / 2))
        if name not in ("circle", "tube"):  # these keep their own segment count
            assert sagitta <= 1e-4 * p.size * (1 + 1e-9)
        assert gaps.max() <= np.radians(15.0) + 1e-12


@pytest.mark.parametrize("name, count, sweeps", [
    ("i_beam", 4, [90] * 4), ("channel", 2, [90] * 2), ("tee", 2, [90] * 2),
    ("angle", 3, [90] * 3), ("hollow_rectangle", 8, [90] * 8), ("z_shape", 4, [90] * 4),
    ("channel_with_lips", 8, [90] * 8), ("hexagon", 0, []),
])
def test_arc_count_and_sweep(name, count, sweeps):
    p = shape_from_spec(EXAMPLES[name])
    assert len(p.arcs) == count
    assert sorted(np.degrees([a.sweep for a in p.arcs])) == pytest.approx(sweeps, abs=1e-9)


def test_shaft_with_keyway_arc_sweep():
    d, w = 40.0, 12.0
    arc = shaft_with_keyway(d, w, 5.0).arcs[0]
    th0 = math.atan2(math.sqrt(d**2 / 4 - w**2 / 4), w / 2)
    assert arc.sweep == pytest.approx(math.pi + 2 * th0, abs=1e-12)
    assert arc.start == pytest.approx(math.pi - th0, abs=1e-12)


def test_bend_arcs_are_concentric():
    # cold-formed bends: the inside radius r and the outside r + t share a centre
    p = channel_with_lips(150.0, 60.0, 18.0, 2.0, 3.0)
    centres = {}
    for a in p.arcs:
        centres.setdefault((round(a.cx, 9), round(a.cy, 9)), []).append(round(a.r, 9))
    assert len(centres) == 4 and all(sorted(r) == [3.0, 5.0] for r in centres.values())


@pytest.mark.parametrize("name", ["hollow_rectangle", "i_beam", "angle", "z_shape", "shaft_with_keyway"])
def test_mesh_boundary_nodes_lie_on_arcs_or_straight_edges(name):
    # every boundary node of the mesh (corner and mid-side) is on a recorded arc, within its
    # sweep, or on a straight edge of the outline that is not a chord of an arc
    p = shape_from_spec(EXAMPLES[name])
    mesh = build_mesh(p)
    nodes = mesh.nodes[np.unique(boundary_edges(mesh.elements))]
    on_arc = np.zeros(len(nodes), bool)
    for arc in p.arcs:
        d = nodes - np.array([arc.cx, arc.cy])
        on_arc |= (np.abs(np.hypot(d[:, 0], d[:, 1]) - arc.r) < 1e-9 * arc.r) & arc.contains_angle(
            np.arctan2(d[:, 1], d[:, 0]))
    straight = []
    for reg in p.regions:
        for loop in reg.loops():
            for a, b in zip(loop, np.roll(loop, -1, axis=0), strict=True):
                chord = any(all(ends_on_arc(arc, a, b)) for arc in p.arcs)
                if not chord:
                    straight.append(shapely.LineString([a, b]))
    lines = shapely.union_all(straight)
    dist = shapely.distance(shapely.points(nodes[~on_arc]), lines)
    assert on_arc.any()
    assert np.all(dist < 1e-9 * p.size)


def ends_on_arc(arc, a, b):
    """Whether each end of the edge (a, b) lies on the arc (both: the edge is a chord)."""
    out = []
    for q in (a, b):
        d = q - np.array([arc.cx, arc.cy])
        out.append(bool(abs(math.hypot(*d) - arc.r) < 1e-9 * arc.r
                        and arc.contains_angle(np.array(math.atan2(d[1], d[0])))))
    return out


# --------------------------------------------------------------------------- corners and symmetry


@pytest.mark.parametrize("profile, n", [
    (i_beam(200.0, 100.0, 5.6, 8.5, 12.0), 0), (i_beam(200.0, 100.0, 5.6, 8.5), 4),
    (channel(160.0, 65.0, 7.5, 10.5, 10.5), 0), (channel(160.0, 65.0, 7.5, 10.5), 2),
    (angle(80.0, 60.0, 8.0, 8.0, 4.0), 0), (angle(80.0, 60.0, 8.0), 1),
    (tee(100.0, 100.0, 11.0, 11.0, 11.0), 0), (tee(100.0, 100.0, 11.0, 11.0), 2),
    (z_shape(200.0, 75.0, 2.0, 3.0), 0), (z_shape(200.0, 75.0, 2.0), 2),
    (channel_with_lips(150.0, 60.0, 18.0, 2.0, 3.0), 0), (channel_with_lips(150.0, 60.0, 18.0, 2.0), 4),
    (hollow_rectangle(100.0, 50.0, 4.0, 8.0), 0), (hollow_rectangle(100.0, 50.0, 4.0, 4.0), 4),
    (hollow_rectangle(100.0, 50.0, 4.0), 4),
    (shaft_with_keyway(40.0, 12.0, 5.0), 2), (hexagon(24.0), 0),
])
def test_fillets_remove_sharp_reentrant_corners(profile, n):
    # vertices of a recorded fillet are not corners; with r = 0 (or ri = 0) the sharp
    # re-entrant corners remain and are found
    assert len(reentrant_corners(profile)) == n


@pytest.mark.parametrize("name, angles", [
    ("rectangle", [0, 90]), ("circle", [0, 90]), ("tube", [0, 90]), ("hollow_rectangle", [0, 90]),
    ("i_beam", [0, 90]), ("hexagon", [0, 90]), ("channel", [0]), ("channel_with_lips", [0]),
    ("tee", [90]), ("shaft_with_keyway", [90]), ("angle", []), ("z_shape", []),
])
def test_symmetry_axes(name, angles):
    axes = symmetry_axes(shape_from_spec(EXAMPLES[name]))
    assert [round(a.angle_deg) for a in axes] == angles


def test_equal_angle_is_symmetric_about_its_diagonal():
    axes = symmetry_axes(angle(50.0, 50.0, 5.0, 7.0, 3.5))
    assert len(axes) == 1 and round(axes[0].angle_deg) % 180 in (45, 135)


# --------------------------------------------------------------------------- analysis


@pytest.fixture(scope="module")
def results():
    return {name: analyse(shape_from_spec(EXAMPLES[name])) for name in NAMES}


@pytest.mark.parametrize("name", NAMES)
def test_analyse_runs(results, name):
    res = results[name]
    assert 0 < res.torsion.J <= res.geometric.Ip * (1 + 1e-9)  # J = Ip for circles
    assert res.torsion.Cw >= 0
    assert res.mesh.n_nodes < 10_000  # the default mesh stays small


@pytest.mark.parametrize("name", ["rectangle", "circle", "tube", "hollow_rectangle", "i_beam",
                                  "hexagon", "channel", "channel_with_lips", "tee",
                                  "shaft_with_keyway"])
def test_shear_centre_on_the_symmetry_axes(results, name):
    # the mesher mirrors symmetric profiles, so the shear centre is on each axis to round-off
    # (measured at most 4e-13 of the size, channel with lips)
    res = results[name]
    p = res.profile
    xs, ys = res.torsion.shear_centre
    xc, yc = res.geometric.centroid
    for axis in symmetry_axes(p):
        off = xs - xc if round(axis.angle_deg) == 90 else ys - yc
        assert abs(off) < 1e-11 * p.size, axis
    if name in ("channel", "channel_with_lips"):
        assert xs < 0  # behind the web, on the side away from the flanges


def test_equal_angle_shear_centre_on_the_diagonal():
    res = analyse(angle(50.0, 50.0, 5.0, 7.0, 3.5))
    xs, ys = res.torsion.shear_centre
    assert abs(xs - ys) < 1e-9 * 50.0
    assert abs(res.geometric.centroid[0] - res.geometric.centroid[1]) < 1e-12 * 50.0


def test_z_shape_shear_centre_at_its_centre_of_point_symmetry(results):
    # a Z-shape has no mirror axis (the mesh is not symmetric), so this is to the discretisation
    # error: measured 3e-6 mm in a 200 mm section (1.4e-8 of the size)
    res = results["z_shape"]
    assert np.hypot(*res.torsion.shear_centre) < 1e-6 * res.profile.size
    assert np.hypot(*res.geometric.centroid) < 1e-12 * res.profile.size
    assert res.geometric.Ixy != 0.0


# --------------------------------------------------------------------------- validation


@pytest.mark.parametrize("make, message", [
    (lambda: i_beam(200, 100, 0, 8.5, 12), "I-beam: tw must be positive, got 0"),
    (lambda: i_beam(200, 100, -5, 8.5), "I-beam: tw must be positive, got -5"),
    (lambda: i_beam(200, 100, 100, 8.5), "web thickness tw=100 must be less than the flange width"),
    (lambda: i_beam(200, 100, 5.6, 100), "two flanges of tf=100 do not fit in the depth h=200"),
    (lambda: i_beam(200, 100, 5.6, 8.5, 50), "root radius r=50 is larger than the flange outstand"),
    (lambda: i_beam(200, 300, 5.6, 80, 30), "larger than half the web depth"),
    (lambda: i_beam(200, 100, 5.6, 8.5, -1), "r must be zero or positive, got -1"),
    (lambda: i_beam(200, 100, 5.6, float("nan")), "tf must be a finite number"),
    (lambda: i_beam("a", 100, 5.6, 8.5), "h must be a number, got 'a'"),
    (lambda: channel(160, 7, 7.5, 10.5), "web thickness tw=7.5 must be less than the flange width b=7"),
    (lambda: channel(160, 65, 7.5, 10.5, 60), "root radius r=60 is larger than the flange outstand"),
    (lambda: angle(80, 60, 60), "thickness t=60 must be less than both legs"),
    (lambda: angle(80, 60, 8, 8, 9), "toe radius r_toe=9 must not exceed the thickness t=8"),
    (lambda: angle(80, 60, 8, 48, 5), "do not fit on the inside face of the shorter leg (52 long)"),
    (lambda: tee(100, 100, 100, 11), "stem thickness tw=100 must be less than the flange width"),
    (lambda: tee(100, 100, 11, 100), "flange thickness tf=100 must be less than the depth h=100"),
    (lambda: tee(30, 100, 11, 20, 15), "root radius r=15 is longer than the stem below the flange"),
    (lambda: hollow_rectangle(100, 50, 25), "two walls of t=25 do not fit in the width 50"),
    (lambda: hollow_rectangle(100, 50, 4, 30),
     "outer corner radius ro=30 is more than half the smaller side"),
    (lambda: hollow_rectangle(100, 50, 4, 12, 2), "inner corner radius ri=2 must be at least ro - t = 8"),
    (lambda: hollow_rectangle(100, 50, 4, 12, 22), "inner corner radius ri=22 is more than half the smaller"),
    (lambda: z_shape(200, 75, 2, 80), "is more than the flange width b=75"),
    (lambda: z_shape(20, 75, 2, 9), "two bends of outside radius r + t = 11 do not fit in the depth"),
    (lambda: channel_with_lips(150, 60, 80, 2, 3), "lip length c=80 must be less than half the depth"),
    (lambda: channel_with_lips(150, 60, 4, 2, 3), "lip length c=4 is shorter than the bend, r + t = 5"),
    (lambda: channel_with_lips(150, 8, 18, 2, 3), "flange width b=8 is less than two bends"),
    (lambda: hexagon(0), "hexagon: s must be positive, got 0"),
    (lambda: shaft_with_keyway(40, 45, 5), "keyway width w=45 must be less than the diameter d=40"),
    (lambda: shaft_with_keyway(40, 12, 0.5), "keyway depth k=0.5 must exceed 0.921"),
    (lambda: shaft_with_keyway(40, 12, 39.5), "keyway depth k=39.5 cuts through the shaft"),
    (lambda: tube(20, 30), "tube inner diameter 30 must be less than outer 20"),
    (lambda: circle(-1), "dimension d must be positive"),
])
def test_invalid_dimensions(make, message):
    with pytest.raises(ProfileError) as info:
        make()
    text = str(info.value)
    assert message in text
    assert "\n" not in text


def test_limits_are_inclusive():
    # a fillet that uses the whole outstand or web, and a lip that is all bend, are valid
    assert i_beam(200, 100, 6, 10, 47).area > 0
    assert channel(100, 50, 6, 10, 40).area > 0
    assert channel_with_lips(150, 60, 5, 2, 3).area > 0
    assert z_shape(200, 5, 2, 3).area > 0


def test_existing_signatures():
    # circle and tube keep their keywords (segment count, straight polygon)
    assert len(circle(20.0, segments=64, curved=False).arcs) == 0
    assert len(tube(20.0, 10.0, segments=64).regions[0].outer) == 64
    assert rectangle(4.0, 2.0, units="in").units == "in"


def test_arc_segments():
    # sagitta 1e-4 of the size: r (1 - cos(step / 2)) <= 1e-4 size (common practice, no source)
    n = arc_segments(12.0, np.pi / 2, 200.0)
    step = np.pi / 2 / n
    assert 12.0 * (1 - np.cos(step / 2)) <= 0.02 < 12.0 * (1 - np.cos(np.pi / 2 / (n - 1) / 2))
    assert arc_segments(1e-3, 2 * np.pi, 200.0) == 24  # 15 degree cap
    assert arc_segments(5.0, 1e-6, 200.0) == 1


# --------------------------------------------------------------------------- spec parser


@pytest.mark.parametrize("spec, expected", [
    ("i_beam:h=200,b=100,tw=5.6,tf=8.5,r=12", i_beam(200, 100, 5.6, 8.5, 12)),
    ("I-Beam: h = 200, b = 100, tw = 5.6, tf = 8.5", i_beam(200, 100, 5.6, 8.5)),
    ("hollow_rectangle:h=100,b=50,t=4,ro=8,ri=5", hollow_rectangle(100, 50, 4, 8, 5)),
    ("angle:h=80,b=60,t=8,r=8,r_toe=4", angle(80, 60, 8, 8, 4)),
    ("tube:d_outer=60,d_inner=50", tube(60, 50)),
    ("shaft with keyway:d=40,w=12,k=5", shaft_with_keyway(40, 12, 5)),
    ("hexagon:s=2.4e1", hexagon(24)),
])
def test_good_specs(spec, expected):
    p = shape_from_spec(spec)
    assert p.source == expected.source
    assert p.area == expected.area
    assert p.arcs == expected.arcs
    assert p.units == "mm"


def test_spec_units():
    p = shape_from_spec("rectangle:b=4,h=2", units="in")
    assert p.units == "in" and p.area == 8.0
    with pytest.raises(ProfileError, match="unknown length unit 'yd'"):
        shape_from_spec("rectangle:b=4,h=2", units="yd")


@pytest.mark.parametrize("spec, error, message", [
    ("", UsageError, "empty shape spec"),
    ("   ", UsageError, "empty shape spec"),
    ("box:h=1,b=2", UsageError, "unknown shape 'box' (shapes: rectangle, circle"),
    ("i_beam:h=200,b=100,tw=5.6", UsageError, "missing parameter tf (flange thickness)"),
    ("i_beam", UsageError, "missing parameters h (overall depth), b (flange width)"),
    ("i_beam:h=200,b=100,tw=5.6,tf=8.5,d=3", UsageError,
     "shape i_beam: unknown parameter 'd' (parameters: h, b, tw, tf, r)"),
    ("i_beam:h=200,b=100,tw=5.6,tf=8.5,h=3", UsageError, "parameter h is given twice"),
    ("i_beam:h=200,b=ten,tw=5.6,tf=8.5", UsageError, "shape i_beam: b='ten' is not a number"),
    ("i_beam:h=200,b=,tw=5.6,tf=8.5", UsageError, "b='' is not a number"),
    ("i_beam:h=200,b=inf,tw=5.6,tf=8.5", UsageError, "b=inf is not a finite number"),
    ("i_beam:h=200,b=100,,tw=5.6,tf=8.5", UsageError, "empty item"),
    ("i_beam:h=200,b 100,tw=5.6,tf=8.5", UsageError, "'b 100' is not PARAM=VALUE"),
    ("i_beam:h=200,b=100,tw=5.6,tf=8.5,r=60", ProfileError, "root radius r=60 is larger"),
    ("rectangle:b=-4,h=2", ProfileError, "dimension b must be positive"),
])
def test_bad_specs(spec, error, message):
    with pytest.raises(error) as info:
        shape_from_spec(spec)
    assert message in str(info.value)
    assert "\n" not in str(info.value)


def test_describe_shapes_lists_every_shape_and_parameter():
    text = describe_shapes()
    for name, kind in SHAPE_KINDS.items():
        assert f"  {name}: {kind.summary}\n      origin   {kind.origin}\n" in text
        assert f"      example  {kind.example}\n" in text
        for p in kind.parameters:
            assert f"      {p.name:<8} {p.meaning}, mm" in text
    assert "ri       inner corner radius (default max(ro - t, 0)), mm, optional" in text
    assert "r        root radius, mm, default 0" in text
    assert ", in" in describe_shapes(units="in")
    assert all(len(line) <= 100 for line in text.splitlines())
