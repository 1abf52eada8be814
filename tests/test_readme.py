from pathlib import Path

from warpwise.report.quantities import QUANTITIES

README = (Path(__file__).resolve().parents[1] / "README.md").read_text()


def test_glossary_lists_every_quantity():
    # every reported quantity is explained in the README glossary (common practice, no source)
    missing = [q.key for q in QUANTITIES if f"`{q.key}`" not in README]
    assert not missing


def test_readme_opens_with_the_job_and_carries_the_caution():
    first = README.split("\n\n")[1]
    assert "engineers" in first
    assert "never replace" in README
