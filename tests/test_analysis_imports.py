"""The analysis layer has no import cycle: the result record, the checks and the
computation import one another in one direction only (record <- checks <- results).

Reference: the project's own layout rule (one job per module, no import cycles).
"""

from __future__ import annotations

import ast
from pathlib import Path

ANALYSIS = Path(__file__).resolve().parent.parent / "builder" / "analysis"


def _imports(module: str) -> set[str]:
    tree = ast.parse((ANALYSIS / f"{module}.py").read_text(encoding="utf-8"))
    found: set[str] = set()
    for node in ast.walk(tree):
        if isinstance(node, ast.ImportFrom) and node.module:
            found.add(node.module)
        elif isinstance(node, ast.Import):
            found.update(alias.name for alias in node.names)
    return found


def test_checks_and_results_do_not_import_each_other() -> None:
    assert "builder.analysis.results" not in _imports("checks")
    assert "builder.analysis.checks" in _imports("results")


def test_the_record_imports_neither_checks_nor_results() -> None:
    imported = _imports("record")
    assert not imported & {"builder.analysis.checks", "builder.analysis.results"}
