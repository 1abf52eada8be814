"""Reports in a chosen unit system: datasheets, catalogue index, pictures; warnings; round-off.

The conversion factors are those of NIST SP 811 (2008), Appendix B.8 (inch 2.54e-2 m exact,
pound-force 4.448222 N); the values converted are the analysis' own, so the checks are of the
bookkeeping, to round-off.
"""

import json
import re

import numpy as np
import pytest

from conftest import assert_one_line_error
from warpwise import analyse
from warpwise.geometry.shapes import rectangle
from warpwise.io import load_profile
from warpwise.materials import builtin_material
from warpwise.report.catalogue_page import CatalogueEntry, index_html
from warpwise.report.datasheet import datasheet_html
from warpwise.report.plots import figure_outline, figure_torsion, figure_warping
from warpwise.report.quantities import values
from warpwise.report.records import record_of
from warpwise.stress import torsion_stress
from warpwise.units import LENGTH, MOMENT, Converter, convert

INCH_MM = 25.4  # NIST SP 811 (2008) B.8: inch -> metre 2.54e-2, exact


@pytest.fixture(scope="module")
def bar():
    """A 40 x 20 mm steel bar (invented demo section)."""
    return analyse(rectangle(40.0, 20.0), materials=builtin_material("steel-S355"))


def _cell(html: str, key: str) -> tuple[float, str]:
    """Value and unit text of one property row of a datasheet."""
    row = re.search(rf'<tr data-key="{key}">(.*?)</tr>', html).group(1)
    num = re.search(r'class="num">(.*?)</td>', row).group(1).replace("\u2212", "-")
    num = re.sub(r"\W*\u00d7\W*10<sup>(-?\d+)</sup>", r"e\1", num.replace("\u202f", ""))
    unit = re.sub(r"<sup>(\d)</sup>", r"\1", re.search(r'class="unit">(.*?)</td>', row).group(1))
    return float(num), unit


def test_datasheet_in_inches_from_a_mm_drawing(bar):
    unit_torque = convert(1.0, MOMENT, "in", "mm")  # 1 lbf*in in N*mm
    html = datasheet_html(bar, torsion=torsion_stress(bar, unit_torque), nominal_torque=True,
                          units="in")
    v = values(bar)
    ix, unit = _cell(html, "Ix")
    assert unit == "in4" and ix == pytest.approx(v["Ix"] / INCH_MM**4, rel=1e-5)  # 6 digits shown
    e, unit = _cell(html, "E_ref")
    # NIST SP 811 (2008) B.8: psi -> Pa 6.894757e3
    assert unit == "psi" and e == pytest.approx(210000.0e6 / 6.894757e3, rel=1e-5)
    assert "units in, lbf, psi, lb/ft" in html
    # the pictures are labelled in inches too, and no unit of the drawing is left on the page
    assert "y (in)" in html and "x (mm)" not in html
    assert not re.search(r"\bmm\d?\b|\bMPa\b|\bN\*mm", html)


def test_datasheet_refuses_a_nominal_torque_not_one_in_its_units(bar):
    with pytest.raises(Exception, match="nominal torque is 1 lbf\\*in"):
        datasheet_html(bar, torsion=torsion_stress(bar, 1.0), nominal_torque=True, units="in")


def test_catalogue_index_in_cm(bar):
    entry = CatalogueEntry("bar.txt", bar, "bar.html", None, None, None)
    html = index_html([entry], units="cm")
    assert "units cm, kN, kN/cm2, kg/m" in html
    # A = 800 mm2 = 8 cm2, exact polygon area (common practice, no source)
    assert re.search(r'class="num">8<', html)


def test_pictures_follow_the_report_units(bar):
    stress = torsion_stress(bar, 1000.0)
    for fig in (figure_outline(bar, units="in"), figure_warping(bar, units="cm"),
                figure_torsion(bar, stress, units="m")):
        ax = fig.axes[0]
        unit = ax.get_xlabel()[3:-1]
        assert ax.get_ylabel() == f"y ({unit})"
        k = convert(1.0, LENGTH, "mm", unit)
        ticks = ax.get_xticks()
        labels = [t.get_text() for t in ax.get_xticklabels()]
        # every tick label is the tick's drawing coordinate in the report's length unit
        for t, text in zip(ticks, labels, strict=True):
            assert float(text.replace("\u2212", "-")) == pytest.approx(t * k, rel=1e-5, abs=1e-9)
    legend = " ".join(t.get_text() for t in figure_torsion(bar, stress, units="m").legends[0].texts)
    assert " Pa at " in legend and ") m" in legend


def test_converter_between_systems():
    show = Converter.of("in", "mm")
    assert show(1.0, MOMENT) == pytest.approx(4.448222 * 25.4, rel=1e-6)  # NIST SP 811 B.8 lbf
    assert show.point((1.0, 2.0)) == [25.4, 50.8]
    assert Converter.of("cm", None).target == "cm"


def test_round_off_prints_as_zero():
    # a centred rectangle: centroid, product moment and plastic axes are zero by symmetry
    # (common practice, no source); the solve leaves round-off, which reports show as 0
    r = analyse(rectangle(40.0, 20.0).moved(shift=(1e-14, -1e-14)))
    v = values(r)
    for key in ("xc", "yc", "Ixy", "pna_x", "pna_y", "xs", "ys"):
        assert v[key] == 0.0, key
    assert v["Ix"] > 0 and v["Cw"] > 0  # real values are left alone


def test_assumed_mm_of_implausible_size_is_a_warning_everywhere(cli, tmp_path):
    tiny = tmp_path / "tiny.txt"
    tiny.write_text("0 0\n0.05 0\n0.05 0.02\n0 0.02\n")  # a 50 x 20 mm plate drawn in metres
    code, out, err = cli("props", tiny, "--json")
    assert code == 0
    obj = json.loads(out)
    assert len(obj["warnings"]) == 1 and "0.05 mm across" in obj["warnings"][0]
    assert "--units" in obj["warnings"][0] and "warning" in err and "0.05 mm" in err
    code, out, err = cli("props", tiny, "--csv", tmp_path / "t.csv")
    assert "WARNING: the section is 0.05 mm across" in out
    assert "0.05 mm across" in (tmp_path / "t.csv").read_text()
    # a unit given: no doubt left
    code, out, err = cli("props", tiny, "--json", "--units", "m")
    assert json.loads(out)["warnings"] == [] and "warning" not in err


def test_assumed_mm_of_implausible_size_in_a_dxf(tmp_path):
    import ezdxf

    doc = ezdxf.new()
    doc.header["$INSUNITS"] = 0  # unitless: millimetres assumed
    doc.modelspace().add_lwpolyline([(0, 0), (20000, 0), (20000, 500), (0, 500)], close=True)
    path = tmp_path / "huge.dxf"
    doc.saveas(path)
    p = load_profile(path)
    assert p.units == "mm" and len(p.warnings) == 1 and "20000 mm across" in p.warnings[0]
    assert record_of(analyse(p, mesh_size=200.0)).warnings == p.warnings


def test_unknown_report_units_are_refused(cli, box_file):
    code, _, err = cli("props", box_file, "--report-units", "furlong")
    assert_one_line_error(code, err, "--report-units", "furlong")
    assert code == 2


def test_corner_notes_follow_the_record(tmp_path):
    ell = tmp_path / "ell.txt"
    ell.write_text("0 0\n40 0\n40 5\n5 5\n5 40\n0 40\n")
    rec = record_of(analyse(load_profile(ell)))
    assert any("at (5, 5) mm" in n for n in rec.remarks)
    inch = rec.in_units("in")
    note = [n for n in inch.remarks if "re-entrant" in n][0]
    x = float(re.search(r"at \(([-\d.e]+),", note).group(1))
    assert x == pytest.approx(5 / INCH_MM, rel=1e-5) and ") in" in note
    assert np.isclose(inch.mesh_size, rec.mesh_size / INCH_MM, rtol=1e-12)
