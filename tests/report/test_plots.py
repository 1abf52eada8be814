"""Pictures: outline, warping, torsion and combined stresses (warpwise.report.plots)."""

import xml.etree.ElementTree as ET

import numpy as np
import pytest
from matplotlib.figure import Figure

from conftest import SAMPLES
from warpwise import analyse, profile_from_loops, torsion_stress
from warpwise.errors import UsageError
from warpwise.geometry.corners import reentrant_corners
from warpwise.geometry.shapes import rectangle
from warpwise.io import load_profile
from warpwise.materials import builtin_material
from warpwise.report import plots
from warpwise.stress import Loads, combined_stress

PNG_SIGNATURE = b"\x89PNG\r\n\x1a\n"


@pytest.fixture(scope="module")
def channel():
    """Symmetric about a horizontal axis (mono-symmetric), with fillets."""
    return analyse(load_profile(SAMPLES / "channel_thick_80x40.txt"))


@pytest.fixture(scope="module")
def angle():
    """Unequal-leg angle 60 x 40 x 6 with a chamfered root: no symmetry, inclined principal axes."""
    loop = [(0, 0), (40, 0), (40, 6), (9, 6), (6, 9), (6, 60), (0, 60)]
    return analyse(profile_from_loops([loop], source="angle_60x40x6.txt"))


@pytest.fixture(scope="module")
def ell():
    """Sharp-cornered L: one sharp re-entrant corner at (2, 2)."""
    return analyse(profile_from_loops([[(0, 0), (10, 0), (10, 2), (2, 2), (2, 10), (0, 10)]],
                                      source="ell.txt"))


@pytest.fixture(scope="module")
def composite():
    """Aluminium bar with a steel core insert, off centre (two materials)."""
    p = profile_from_loops([[(0, 0), (40, 0), (40, 30), (0, 30)],
                            [(22, 8), (34, 8), (34, 22), (22, 22)]],
                           ["aluminium-6060-T6", "steel-S235"], source="composite_bar.txt")
    return analyse(p, materials=[builtin_material(r.material) for r in p.regions])


def _all_gids(fig):
    out = set()
    for ax in fig.axes:
        for artist in ax.get_children():
            if artist.get_gid():
                out.add(artist.get_gid())
    return out


def _legend_text(fig):
    return " | ".join(t.get_text() for leg in fig.legends for t in leg.get_texts())


def _artist(fig, gid):
    return next(a for a in fig.axes[0].get_children() if a.get_gid() == gid)


def _check_files(fig, folder, stem):
    png, svg = folder / f"{stem}.png", folder / f"{stem}.svg"
    plots.save_figure(fig, png)
    plots.save_figure(fig, svg)
    data = png.read_bytes()
    assert data.startswith(PNG_SIGNATURE) and len(data) > 10_000
    root = ET.fromstring(svg.read_bytes())
    assert root.tag.endswith("svg")
    assert len(list(root.iter())) > 50
    assert not list(folder.glob("*.part"))


# ----------------------------------------------------------------------------------------------
# outline

@pytest.mark.parametrize("name", ["channel", "angle", "composite"])
def test_outline_marks_centroid_shear_centre_and_axes(name, request, tmp_path):
    r = request.getfixturevalue(name)
    fig = plots.figure_outline(r)
    assert isinstance(fig, Figure)
    assert {"centroid", "shear-centre", "axis-1", "axis-2"} <= _all_gids(fig)
    text = _legend_text(fig)
    for words in ("C: centroid", "S: shear centre", "axis 1 (major)", "axis 2 (minor)", "mesh:"):
        assert words in text
    ax = fig.axes[0]
    assert ax.get_xlabel() == f"x ({r.units})" and ax.get_ylabel() == f"y ({r.units})"
    assert ax.get_aspect() == 1.0
    # the marks sit where the analysis says
    assert np.allclose(_artist(fig, "centroid").get_xydata()[0], r.geometric.centroid)
    assert np.allclose(_artist(fig, "shear-centre").get_xydata()[0], r.torsion.shear_centre)
    c = np.array(r.geometric.centroid)
    a = np.radians(r.geometric.alpha_deg)
    for gid, direction in (("axis-1", (np.cos(a), np.sin(a))), ("axis-2", (-np.sin(a), np.cos(a)))):
        p0, p1 = _artist(fig, gid).get_xydata()
        d = (p1 - p0) / np.linalg.norm(p1 - p0)
        assert np.allclose(d, direction, atol=1e-9)  # drawn towards the positive direction
        # the line passes through the centroid
        assert abs(d[0] * (c - p0)[1] - d[1] * (c - p0)[0]) < 1e-9 * r.profile.size
    if name == "channel":
        _check_files(fig, tmp_path, "outline")


def test_outline_of_composite_names_each_material(composite):
    fig = plots.figure_outline(composite, show_mesh=False)
    text = _legend_text(fig)
    assert "material: aluminium-6060-T6" in text and "material: steel-S235" in text
    assert "modulus-weighted centroid" in text and "mesh:" not in text
    assert "elastic-centroid" in _all_gids(fig)
    assert np.allclose(_artist(fig, "elastic-centroid").get_xydata()[0], composite.weighted.centroid)
    # the steel core pulls the modulus-weighted centroid towards it (+x), away from the area centroid
    assert composite.weighted.centroid[0] > composite.geometric.centroid[0] + 0.5


# ----------------------------------------------------------------------------------------------
# warping, torsion, combined

@pytest.mark.parametrize("name", ["channel", "angle", "composite"])
def test_warping_picture(name, request, tmp_path):
    r = request.getfixturevalue(name)
    fig = plots.figure_warping(r)
    assert {"warping-contours", "shear-centre"} <= _all_gids(fig)
    bar_label = fig.axes[-1].get_ylabel()
    assert "omega" in bar_label and f"({r.units}2)" in bar_label
    levels = _artist(fig, "warping-contours").levels
    # colour scale symmetric about zero and covering the field
    assert np.isclose(levels[0], -levels[-1])
    assert levels[-1] >= np.abs(r.torsion.omega).max() * (1 - 1e-12)
    if name == "angle":
        _check_files(fig, tmp_path, "warping")


@pytest.mark.parametrize("name", ["channel", "angle", "ell", "composite"])
def test_torsion_picture(name, request, tmp_path):
    r = request.getfixturevalue(name)
    fig = plots.figure_torsion(r, torsion_stress(r, 1000.0, 26000.0))
    gids = _all_gids(fig)
    assert {"stress-contours", "stress-arrows", "largest-stress"} <= gids
    assert "resultant shear stress tau (MPa)" == fig.axes[-1].get_ylabel()
    assert "largest shear stress" in _legend_text(fig)
    assert "twist rate theta" in fig.axes[0].get_title(loc="left")
    if name != "composite":
        ts = torsion_stress(r, 1000.0, 26000.0)
        assert np.allclose(_artist(fig, "largest-stress").get_xydata()[0], ts.tau_max_at)
        assert _artist(fig, "stress-contours").levels[-1] >= ts.tau_max * (1 - 1e-12)
    arrows = _artist(fig, "stress-arrows")
    assert 20 < len(arrows.U) < 1000  # subsampled, not one per node
    if name == "ell":
        assert "sharp-corners" in gids
        assert np.allclose(_artist(fig, "sharp-corners").get_xydata(), [[2.0, 2.0]])
        assert "sharp re-entrant corner" in _legend_text(fig)
        _check_files(fig, tmp_path, "torsion")
    else:
        assert ("sharp-corners" in gids) == bool(reentrant_corners(r.profile))
    if name == "channel":
        assert "sharp-corners" not in gids  # filleted: no sharp re-entrant corner


def test_torsion_picture_of_composite_uses_each_materials_stress(composite):
    from warpwise.stress import combined_stress

    fig = plots.figure_torsion(composite, torsion_stress(composite, 1000.0))
    cs = combined_stress(composite, Loads(T=1000.0))
    top = max(m.tau_max for m in cs.by_material)
    assert np.allclose(_artist(fig, "largest-stress").get_xydata()[0],
                       max(cs.by_material, key=lambda m: m.tau_max).von_mises_at)
    assert f"{top:.4g}" in _legend_text(fig)
    # steel (G 81000) carries higher shear stress than aluminium (G 27000) next to it
    steel = next(m for m in cs.by_material if m.material == "steel-S235")
    assert steel.tau_max == pytest.approx(top)


def test_torsion_needs_a_torque(channel):
    with pytest.raises(UsageError):
        plots.figure_torsion(channel, torsion_stress(channel, 0.0, 26000.0))


@pytest.mark.parametrize(("name", "quantity"), [("angle", "sigma"), ("composite", "sigma"),
                                              ("channel", "von_mises"), ("composite", "von_mises")])
def test_combined_picture(name, quantity, request, tmp_path):
    r = request.getfixturevalue(name)
    loads = Loads(N=2000.0, Mx=1.0e5, My=-3.0e4, Vy=500.0, T=800.0)
    fig = plots.figure_combined(r, combined_stress(r, loads, 26000.0), quantity=quantity)
    assert {"stress-contours", "largest-stress"} <= _all_gids(fig)
    label = fig.axes[-1].get_ylabel()
    assert label.endswith("(MPa)")
    assert ("normal stress sigma_z" in label) == (quantity == "sigma")
    title = fig.axes[0].get_title(loc="left")
    assert "Mx = 1e+05 N*mm" in title and "T = 800 N*mm" in title
    text = _legend_text(fig)
    if quantity == "sigma":
        assert "neutral axis" in text
        assert np.isclose(_artist(fig, "stress-contours").levels[0],
                          -_artist(fig, "stress-contours").levels[-1])
    if name == "composite":
        assert "in steel-S235" in text and "in aluminium-6060-T6" in text
        if quantity == "von_mises":
            assert "of fy (informative, not a code check)" in text
    if name == "composite" and quantity == "sigma":
        _check_files(fig, tmp_path, "combined")


def test_combined_accepts_a_mapping_and_checks_input(channel):
    fig = plots.figure_combined(channel, combined_stress(channel, Loads.of({"Mx": 1.0e5})), quantity="tau")
    assert "resultant shear stress tau" in fig.axes[-1].get_ylabel()
    with pytest.raises(UsageError, match="unknown stress picture"):
        plots.figure_combined(channel, combined_stress(channel, Loads(Mx=1.0)), quantity="pressure")
    with pytest.raises(UsageError, match="no load"):
        plots.figure_combined(channel, combined_stress(channel, Loads()))
    with pytest.raises(UsageError, match="unknown load"):
        plots.figure_combined(channel, combined_stress(channel, Loads.of({"moment": 1.0})))


# ----------------------------------------------------------------------------------------------
# output and helpers

def test_svg_text_embeds_cleanly(channel):
    fig = plots.figure_outline(channel, show_mesh=False)
    a = plots.svg_text(fig, "first-")
    b = plots.svg_text(fig, "second-")
    assert a.startswith("<svg") and a.endswith("</svg>")
    assert "<?xml" not in a and "DOCTYPE" not in a and "<metadata" not in a
    assert "*{" not in a  # the drawing's page-wide style rule is not carried into a page
    root = ET.fromstring(a)
    ids = {el.get("id") for el in root.iter() if el.get("id")}
    assert ids and all(i.startswith("first-") for i in ids)
    refs = [el.get("{http://www.w3.org/1999/xlink}href") or el.get("href") for el in root.iter()]
    refs = [h[1:] for h in refs if h and h.startswith("#")]
    assert refs and set(refs) <= ids
    assert "url(#first-" in a or "clip-path" not in a
    ids_b = {el.get("id") for el in ET.fromstring(b).iter() if el.get("id")}
    assert not ids & ids_b
    assert plots.svg_text(fig) == plots.svg_text(fig)  # reproducible
    with pytest.raises(UsageError):
        plots.svg_text(fig, 'x" onload="alert(1)')


def test_save_figure_refuses_other_formats(channel, tmp_path):
    fig = plots.figure_outline(channel, show_mesh=False)
    with pytest.raises(UsageError, match="png"):
        plots.save_figure(fig, tmp_path / "outline.jpg")
    with pytest.raises(UsageError):
        plots.save_figure(fig, tmp_path / "no such folder" / "outline.png")
    assert list(tmp_path.iterdir()) == []


def test_sub_triangles_and_edges_cover_the_mesh():
    r = analyse(rectangle(30.0, 10.0), mesh_size=3.0)
    mesh = r.mesh
    tri = plots.sub_triangles(mesh.elements)
    p = mesh.nodes[tri]
    d1, d2 = p[:, 1] - p[:, 0], p[:, 2] - p[:, 0]
    area = 0.5 * (d1[:, 0] * d2[:, 1] - d1[:, 1] * d2[:, 0])
    assert np.all(area > 0)  # counter-clockwise
    assert area.sum() == pytest.approx(300.0, rel=1e-12)
    boundary = plots.element_edges(mesh.elements, boundary_only=True)
    length = np.linalg.norm(np.diff(mesh.nodes[boundary], axis=1), axis=2).sum()
    assert length == pytest.approx(80.0, rel=1e-12)
    everything = plots.element_edges(mesh.elements)
    # Euler: edges = elements + nodes(corners) - 1 for a simply connected mesh
    corners = len(np.unique(mesh.elements[:, :3]))
    assert len(everything) == mesh.n_elements + corners - 1
