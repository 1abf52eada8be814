"""A composite drawn by layers, analysed as a composite from the command line (--layer-material).

The invented drawing: a 40 x 20 aluminium bar (layer PROFILE) with a 20 x 10 steel insert
(layer INSERT) at its middle and a 4 x 4 hole (layer HOLES) to the left of it, all rectangles,
so the exact transformed-section values are closed forms of rectangles (Gere, Mechanics of
Materials, transformed sections, from memory). Six-node elements integrate these polygons'
area and second moments exactly, so the tolerance is round-off (1e-10).
"""

import json

import ezdxf
import pytest

from conftest import assert_one_line_error

E_ALU, E_STEEL = 70000.0, 210000.0  # EN 1999-1-1 and EN 1993-1-1 (the built-in table's sources)
ALU, STEEL = "aluminium-6063-T6", "steel-S235"
BAR = (0.0, 0.0, 40.0, 20.0)
INSERT = (10.0, 5.0, 30.0, 15.0)
HOLE = (3.0, 8.0, 7.0, 12.0)


def rect(msp, box, layer):
    x0, y0, x1, y1 = box
    msp.add_lwpolyline([(x0, y0), (x1, y0), (x1, y1), (x0, y1)], close=True,
                       dxfattribs={"layer": layer})


def area(box):
    return (box[2] - box[0]) * (box[3] - box[1])


def moments(box, yc):
    """A, first moment about x = 0 and Ix about y = yc of a rectangle (closed form)."""
    x0, y0, x1, y1 = box
    a = area(box)
    b, h = x1 - x0, y1 - y0
    return a, a * 0.5 * (x0 + x1), b * h**3 / 12 + a * (0.5 * (y0 + y1) - yc) ** 2


def exact():
    """EA, modulus-weighted centroid x and EIx of the bar: the sum over rectangles with signs."""
    parts = [(E_ALU, BAR, 1), (E_ALU, INSERT, -1), (E_ALU, HOLE, -1), (E_STEEL, INSERT, 1)]
    yc = 10.0  # every rectangle is centred on y = 10
    EA = sum(s * E * moments(b, yc)[0] for E, b, s in parts)
    xe = sum(s * E * moments(b, yc)[1] for E, b, s in parts) / EA
    EIx = sum(s * E * moments(b, yc)[2] for E, b, s in parts)
    return EA, xe, EIx


@pytest.fixture
def bar(tmp_path):
    doc = ezdxf.new()
    doc.header["$INSUNITS"] = 4
    msp = doc.modelspace()
    rect(msp, BAR, "PROFILE")
    rect(msp, INSERT, "INSERT")
    rect(msp, HOLE, "HOLES")
    msp.add_line((-5, 10), (45, 10), dxfattribs={"layer": "CENTRE"})  # a centre line: left out
    path = tmp_path / "bar_with_insert.dxf"
    doc.saveas(path)
    return path


def check_composite(obj):
    EA, xe, EIx = exact()
    assert obj["materials"] == [ALU, STEEL] and obj["reference_material"] == ALU
    # geometric area: the bar less the hole (the insert is material, not a hole)
    assert obj["A"] == pytest.approx(area(BAR) - area(HOLE), rel=1e-10)
    assert obj["EA"] == pytest.approx(EA, rel=1e-10)
    assert obj["xe"] == pytest.approx(xe, rel=1e-10)
    assert obj["EIx"] == pytest.approx(EIx, rel=1e-10)


def test_props_with_one_layer_named_and_the_rest_of_material(cli, bar):
    # the hole on its own layer stays a hole: layers without --layer-material are of --material
    code, out, err = cli("props", bar, "--layer-material", f"INSERT={STEEL}", "--material", ALU,
                         "--json")
    assert code == 0, err
    check_composite(json.loads(out))


def test_props_with_every_layer_named(cli, bar):
    code, out, err = cli("props", bar, "--layer-material", f"profile={ALU}", "--layer-material",
                         f"insert={STEEL}", "--layer-material", f"holes={ALU}", "--json")
    assert code == 0, err  # layer names are not case-sensitive
    check_composite(json.loads(out))


def test_stress_per_material_under_an_axial_force(cli, bar):
    code, out, err = cli("stress", bar, "--layer-material", f"INSERT={STEEL}", "--material", ALU,
                         "--axial", "10000", "--json")
    assert code == 0, err
    by_name = {m["material"]: m for m in json.loads(out)["materials"]}
    EA = exact()[0]
    # uniform strain N / EA, stress E N / EA in each material (transformed section, from memory)
    assert by_name[STEEL]["sigma_max"] == pytest.approx(E_STEEL * 1e4 / EA, rel=1e-9)
    assert by_name[ALU]["sigma_max"] == pytest.approx(E_ALU * 1e4 / EA, rel=1e-9)


def test_plot_catalogue_and_check_take_the_option(cli, bar, tmp_path):
    png = tmp_path / "mesh.png"
    code, _, err = cli("plot", bar, "--layer-material", f"INSERT={STEEL}", "--material", ALU,
                       "-o", png)
    assert code == 0, err
    assert png.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"
    table = tmp_path / "cat.json"
    code, _, err = cli("catalogue", bar, "--layer-material", f"INSERT={STEEL}", "--material", ALU,
                       "--json", table, "--jobs", "1")
    assert code == 0, err
    check_composite(json.loads(table.read_text()))
    code, out, err = cli("check", bar, "--layer-material", f"INSERT={STEEL}")
    assert code == 0, err
    assert "result: analysable" in out


def test_unknown_layer_is_refused_naming_the_layers_present(cli, bar):
    for extra in (("props", "--material", ALU), ("check",)):
        code, _, err = cli(extra[0], bar, "--layer-material", f"INSRT={STEEL}", *extra[1:])
        line = assert_one_line_error(code, err, "bar_with_insert.dxf", "--layer-material",
                                     "'INSRT'", "CENTRE", "HOLES", "INSERT", "PROFILE")
        assert code == 2, line


def test_a_layer_left_out_cannot_have_a_material(cli, bar):
    code, _, err = cli("props", bar, "--layer", "PROFILE", "--layer-material", f"INSERT={STEEL}",
                       "--material", ALU)
    assert code == 2
    assert_one_line_error(code, err, "layer 'INSERT'", "not part of the profile", "--layer")


def test_layers_without_a_material_need_material(cli, bar):
    code, _, err = cli("props", bar, "--layer-material", f"INSERT={STEEL}")
    assert code == 2
    assert_one_line_error(code, err, "bar_with_insert.dxf", "give --material")


@pytest.mark.parametrize("value", ["INSERT", "=steel", "INSERT="])
def test_malformed_pairs_are_usage_errors(cli, bar, value):
    code, _, err = cli("props", bar, "--layer-material", value)
    assert code == 2
    assert_one_line_error(code, err, "LAYER=MATERIAL")


def test_outline_files_refuse_the_option(cli, box_file):
    code, _, err = cli("props", box_file, "--layer-material", f"0={STEEL}")
    assert code == 2
    assert_one_line_error(code, err, "--layer-material applies to DXF drawings only")
