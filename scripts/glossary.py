"""Print the property glossary (Markdown) from the one list of reported quantities.

    python scripts/glossary.py > /tmp/glossary.md   # then paste into README.md

tests/test_readme.py checks that the README lists every quantity.
"""

from warpwise.report.quantities import QUANTITIES, unit_of


def main() -> None:
    print("| symbol | JSON / CSV key | meaning | definition | unit (with mm) |")
    print("|---|---|---|---|---|")
    for q in QUANTITIES:
        print(f"| {q.symbol} | `{q.key}` | {q.label} | {q.definition} | {unit_of(q, 'mm')} |")


if __name__ == "__main__":
    main()
