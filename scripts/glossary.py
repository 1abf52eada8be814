"""Print the property glossary (Markdown) from the one list of reported quantities.

    python scripts/glossary.py > /tmp/glossary.md   # then paste into README.md

The key column is the CSV column (without its unit) and the JSON key; a coordinate is in JSON
the element of a point array (``centroid``, ``shear_centre``, ``shear_centre_elastic``).
tests/test_readme.py checks that the README lists every quantity.
"""

from warpwise.report.files import JSON_POINTS
from warpwise.report.quantities import QUANTITIES, unit_of


def _cell(text: str) -> str:
    """Text for a Markdown table cell (a pipe would end the cell)."""
    return text.replace("|", "\\|")


def main() -> None:
    """Print the glossary table, units of the mm system."""
    where = {k: f"{name}`[{i}]" for name, pair in JSON_POINTS.items() for i, k in enumerate(pair)}
    print("| symbol | key | meaning | definition | unit (mm system) |")
    print("|---|---|---|---|---|")
    for q in QUANTITIES:
        key = f"`{q.key}`" + (f" (JSON: `{where[q.key]})" if q.key in where else "")
        print(f"| {_cell(q.symbol)} | {key} | {_cell(q.label)} | {_cell(q.definition)} | "
              f"{unit_of(q, 'mm')} |")


if __name__ == "__main__":
    main()
