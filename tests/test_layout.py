"""The layout rules of DEVELOPERS.md, checked on the source tree (common practice, no source).

- no module over 500 lines and no function over 80 lines of code (docstrings, comments and
  blank lines not counted) under src/;
- data flows one way through the pipeline packages: a stage imports nothing from a later one
  (io reads files into profiles and knows nothing of meshes, elements or properties);
- the report layer formats computed results: from the analysis and stress packages it imports
  result types (classes) only, never a function that computes.
"""

from __future__ import annotations

import ast
from pathlib import Path

import pytest

SRC = Path(__file__).resolve().parents[1] / "src" / "warpwise"
MODULES = sorted(SRC.rglob("*.py"))

#: Pipeline rank of each top-level part; a module may import only from equal or lower ranks.
RANK = {"errors": 0, "units": 0, "_moved": 0, "textfiles": 0, "geometry": 1, "materials": 1, "io": 2,
        "mesh": 3, "fem": 4, "properties": 5, "member": 5.5, "stress": 6, "report": 7, "catalogue": 8,
        "cli": 9, "workbench": 9, "__init__": 10, "__main__": 10}


def _part(path: Path) -> str:
    rel = path.relative_to(SRC)
    return rel.parts[0].removesuffix(".py")


def _imports(path: Path) -> list[tuple[str, list[str], int]]:
    """(absolute module, imported names, line) of every warpwise import in a module."""
    tree = ast.parse(path.read_text())
    pkg = ["warpwise", *path.relative_to(SRC).with_suffix("").parts]
    if pkg[-1] == "__init__":
        pkg = pkg[:-1]
    else:
        pkg = pkg[:-1]
    out = []
    for node in ast.walk(tree):
        if isinstance(node, ast.ImportFrom):
            if node.level:
                base = pkg[: len(pkg) - node.level + 1]
                mod = ".".join(base + ([node.module] if node.module else []))
            else:
                mod = node.module or ""
            if mod.startswith("warpwise"):
                out.append((mod, [a.name for a in node.names], node.lineno))
        elif isinstance(node, ast.Import):
            out += [(a.name, [], node.lineno) for a in node.names if a.name.startswith("warpwise")]
    return out


def _code_lines(node: ast.AST, lines: list[str]) -> int:
    """Lines of code of a function: no docstring, comment or blank line."""
    skip = set()
    body = getattr(node, "body", [])
    if body and isinstance(body[0], ast.Expr) and isinstance(getattr(body[0], "value", None),
                                                             ast.Constant) \
            and isinstance(body[0].value.value, str):
        skip.update(range(body[0].lineno, body[0].end_lineno + 1))
    count = 0
    for n in range(node.lineno, node.end_lineno + 1):
        text = lines[n - 1].strip()
        if n in skip or not text or text.startswith("#"):
            continue
        count += 1
    return count


@pytest.mark.parametrize("path", MODULES, ids=lambda p: str(p.relative_to(SRC)))
def test_module_and_function_sizes(path):
    lines = path.read_text().splitlines()
    assert len(lines) <= 500, f"{path.name} has {len(lines)} lines (limit 500)"
    tree = ast.parse("\n".join(lines))
    long = [f"{n.name} ({_code_lines(n, lines)} lines)" for n in ast.walk(tree)
            if isinstance(n, ast.FunctionDef | ast.AsyncFunctionDef) and _code_lines(n, lines) > 80]
    assert not long, f"functions over 80 lines of code in {path.name}: {', '.join(long)}"


@pytest.mark.parametrize("path", MODULES, ids=lambda p: str(p.relative_to(SRC)))
def test_no_import_from_a_later_stage(path):
    here = RANK[_part(path)]
    bad = []
    for mod, _names, line in _imports(path):
        parts = mod.split(".")
        if len(parts) < 2:
            continue  # the package itself (the version string)
        if RANK[parts[1]] > here:
            bad.append(f"line {line}: {mod}")
    assert not bad, f"{path.relative_to(SRC)} imports from a later stage: {'; '.join(bad)}"


@pytest.mark.parametrize("path", sorted((SRC / "report").rglob("*.py")), ids=lambda p: p.name)
def test_report_calls_no_analysis(path):
    bad = [f"line {line}: {mod}.{name}" for mod, names, line in _imports(path)
           if mod.split(".")[1:2] in (["properties"], ["stress"])
           for name in names if not name[:1].isupper()]
    assert not bad, f"report/{path.name} imports computing functions: {'; '.join(bad)}"
