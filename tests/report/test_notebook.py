"""The notebook view of a result (``_repr_html_``): the property table, escaped, in units.

What the view shows must be the record's values, formatted as the datasheet formats them, and
the caution must be there (common practice, no source: a view that drops or rounds differently
from the report would be a second, drifting report).
"""

from dataclasses import replace
from html.parser import HTMLParser

import pytest

from warpwise import analyse
from warpwise.geometry.shapes import rectangle
from warpwise.report.html_parts import number_html
from warpwise.report.notebook import record_html
from warpwise.report.records import record_of
from warpwise.report.table import CAUTION


class Rows(HTMLParser):
    """The value cell of each table row by its data-key."""

    def __init__(self):
        super().__init__()
        self.rows, self.key, self.cells, self.text = {}, None, [], None

    def handle_starttag(self, tag, attrs):
        if tag == "tr":
            self.key, self.cells = dict(attrs).get("data-key"), []
        elif tag == "td":
            self.text = ""

    def handle_data(self, data):
        if self.text is not None:
            self.text += data

    def handle_endtag(self, tag):
        if tag == "td":
            self.cells.append(self.text)
            self.text = None
        elif tag == "tr" and self.key:
            self.rows[self.key] = self.cells


@pytest.fixture(scope="module")
def result():
    return analyse(rectangle(40.0, 20.0))


def test_values_are_the_records(result):
    page = Rows()
    page.feed(result._repr_html_())
    v = record_of(result).values
    for key in ("A", "Ix", "J", "Cw", "As_y"):
        got = page.rows[key][2]
        want = Rows()
        want.feed(f"<table><tr data-key='x'><td>{number_html(v[key])}</td></tr></table>")
        assert got == want.rows["x"][0], key
    assert CAUTION in result._repr_html_()


def test_other_units_and_escaping(result):
    rec = record_of(result)
    odd = replace(rec, name="<b>HR-60</b> & co")
    html = odd._repr_html_()
    assert "&lt;b&gt;HR-60&lt;/b&gt; &amp; co" in html and "<b>HR-60" not in html
    page = Rows()
    page.feed(record_html(rec, "cm"))
    assert page.rows["A"][3].strip() == "cm2"
    assert float(page.rows["A"][2]) == pytest.approx(rec.values["A"] / 100, rel=1e-5)
