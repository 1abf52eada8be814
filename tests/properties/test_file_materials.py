"""What a file says means the same through the command line and the Python API.

The same file read by ``warpwise props --json`` and by ``analyse(load_profile(path))`` is the
same profile on the same mesh with the same materials, so EA, GJ and E_ref agree to round-off
of the JSON text (1e-12; common practice, no source).
"""

import json

import ezdxf
import pytest

import warpwise
from conftest import SAMPLES
from warpwise.errors import UsageError
from warpwise.io import load_profile, parse_outline

KEYS = ("E_ref", "EA", "GJ", "EIx", "A", "J")


def api_values(result):
    from warpwise.report.records import record_of

    return record_of(result).values


def test_outline_material_lines_mean_the_same_in_cli_and_api(cli):
    path = SAMPLES / "mullion_steel_reinforced.txt"  # material: lines for each loop
    code, out, err = cli("props", path, "--json")
    assert code == 0, err
    obj = json.loads(out)
    result = warpwise.analyse(load_profile(path))
    assert result.materials.names == tuple(obj["materials"])
    v = api_values(result)
    for key in KEYS:
        assert v[key] == pytest.approx(obj[key], rel=1e-12), key


def test_layer_materials_mean_the_same_in_cli_and_api(cli, tmp_path):
    doc = ezdxf.new()
    doc.header["$INSUNITS"] = 4
    msp = doc.modelspace()
    msp.add_lwpolyline([(0, 0), (40, 0), (40, 20), (0, 20)], close=True, dxfattribs={"layer": "A"})
    msp.add_lwpolyline([(10, 5), (30, 5), (30, 15), (10, 15)], close=True, dxfattribs={"layer": "B"})
    path = tmp_path / "two_layers.dxf"
    doc.saveas(path)
    code, out, err = cli("props", path, "--layer-material", "B=steel-S355", "--material",
                         "aluminium-6082-T6", "--json")
    assert code == 0, err
    obj = json.loads(out)
    profile = load_profile(path, layer_materials={"B": "steel-S355"},
                           other_layers_material="aluminium-6082-T6")
    v = api_values(warpwise.analyse(profile))
    for key in KEYS:
        assert v[key] == pytest.approx(obj[key], rel=1e-12), key


def test_api_refuses_a_material_name_it_does_not_know():
    # a name outside the built-in table is refused, not analysed as geometry only
    p = parse_outline("material: my-alloy\n0 0\n4 0\n4 2\n0 2\n", source="own.txt")
    with pytest.raises(UsageError, match="unknown material 'my-alloy'"):
        warpwise.analyse(p)


def test_geometry_only_without_names():
    p = parse_outline("0 0\n4 0\n4 2\n0 2\n", source="plain.txt")
    r = warpwise.analyse(p)
    assert r.materials.E_ref is None and not r.composite
