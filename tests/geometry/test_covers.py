"""Which points are material: Profile.covers (used to refuse a fibre outside the section)."""

from __future__ import annotations

import numpy as np

from warpwise.cli import main
from warpwise.geometry.shapes import circle, rectangle, tube


def test_polygon_edges_and_outside():
    # a 40 x 20 rectangle centred on the origin: inside, on an edge, on a corner, outside
    # (plain geometry, common practice, no source)
    r = rectangle(40.0, 20.0)
    got = r.covers([(0, 0), (20, 0), (20, 10), (20.001, 0), (0, -10.0001)])
    assert got.tolist() == [True, True, True, False, False]


def test_true_arc_counts_and_holes_do_not():
    # A tube of outside diameter 40 and inside 28 drawn with 16 chords per circle: the outer
    # circle's points between the chords' corners (up to r (1 - cos(pi/16)) = 0.38 outside the
    # polygon) are material, a point just outside the true circle is not; the hole's sliver
    # (inside the true hole, outside its inscribed polygon) is not material either.
    t = tube(40.0, 28.0, segments=16)
    half = np.pi / 16  # the middle of the first chord of a polygon with a vertex at angle 0
    outer = [(20 * np.cos(half), 20 * np.sin(half)), (20.001 * np.cos(half), 20.001 * np.sin(half))]
    # just inside the true hole near the middle of a chord of the inner polygon: not material
    hole = [(13.999 * np.cos(half), 13.999 * np.sin(half)), (0.0, 0.0)]
    wall = [(17.0, 0.0)]
    got = t.covers([*outer, *hole, *wall])
    assert got.tolist() == [True, False, False, False, True]
    assert circle(20.0).covers([(0.0, 10.0), (0.0, 10.001)]).tolist() == [True, False]


def test_fibre_outside_is_refused(tmp_path, capsys):
    path = tmp_path / "bar.txt"
    path.write_text("units: mm\n0, 0\n40, 0\n40, 20\n0, 20\n")
    code = main(["props", str(path), "--about-axis", "0,0,0", "--fibre", "20,30"])
    out, err = capsys.readouterr()
    assert code == 2 and out == ""
    assert err.count("\n") == 1 and str(path) in err and "fibre (20, 30) mm is outside" in err
    # in the report's units: 2 cm is 20 mm, inside; 3 cm is outside
    assert main(["props", str(path), "--report-units", "cm", "--about-axis", "0,0,0", "--fibre",
                 "2,2"]) == 0
    capsys.readouterr()
    assert main(["props", str(path), "--report-units", "cm", "--about-axis", "0,0,0", "--fibre",
                 "2,3"]) == 2
    assert "fibre (2, 3) cm is outside" in capsys.readouterr().err


def test_arc_middle_on_a_chord_middle():
    # the same tube turned by half a chord: the arcs' middles now fall on chord middles of
    # both polygons, which must not change which side is material
    t = tube(40.0, 28.0, segments=16).moved(angle_deg=180.0 / 16)
    half = np.pi / 16
    pts = [(19.99 * np.cos(2 * half), 19.99 * np.sin(2 * half)),
           (13.999 * np.cos(2 * half), 13.999 * np.sin(2 * half)), (17.0 * np.cos(half), 17.0 * np.sin(half))]
    assert t.covers(pts).tolist() == [True, False, True]
