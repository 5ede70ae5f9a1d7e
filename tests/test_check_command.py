"""``atlas check``: clean on the shipped catalogue, failing with file/entry/check on a bad set.

References: the recorded azeotrope tables in the pair files (each names its table) and
CoolProp / the chemicals package, as run by ``atlas check`` itself.
"""

from __future__ import annotations

import shutil
from pathlib import Path

import pytest

from builder.analysis import catalogue_checks
from builder.analysis.results import PairResults
from builder.catalogue.loader import DEFAULT_CATALOGUE, Catalogue
from builder.catalogue.records import PairRecord
from builder.commands.cli import main
from tests.conftest import ShippedResults


def test_shipped_catalogue_checks_clean(capsys: pytest.CaptureFixture[str], tmp_path: Path,
                                        monkeypatch: pytest.MonkeyPatch,
                                        shipped_results: ShippedResults) -> None:
    # The command computes every shipped pair; the session has them already (the same
    # compute_pair of the same files), so it takes them from there.
    def computed(catalogue: Catalogue, pair: PairRecord) -> PairResults:
        assert catalogue.root.resolve() == DEFAULT_CATALOGUE.resolve()
        return shipped_results[pair.id]

    monkeypatch.setattr(catalogue_checks, "compute_pair", computed)
    report = tmp_path / "checks.md"
    code = main(["check", "--report", str(report)])
    out = capsys.readouterr().out
    assert code == 0, out
    assert "FAIL" not in out
    text = report.read_text(encoding="utf-8")
    assert "## Azeotropes at 101.325 kPa against published tables" in text
    assert "## Sources" in text and "poling-2001" in text
    committed = DEFAULT_CATALOGUE.parent / "docs" / "catalogue.md"
    assert committed.read_text(encoding="utf-8") == text, (
        "docs/catalogue.md is out of date: run 'atlas check --report docs/catalogue.md'")


def test_a_wrong_parameter_set_fails_the_check(capsys: pytest.CaptureFixture[str],
                                               tmp_path: Path) -> None:
    root = tmp_path / "pairs"
    shutil.copytree(DEFAULT_CATALOGUE, root)
    pair = root / "binaries" / "ethanol--water.yaml"
    # A mistyped parameter: the azeotrope moves far from the handbook value.
    pair.write_text(pair.read_text(encoding="utf-8").replace("g21: 1241.7396 cal/mol",
                                                             "g21: 641.7396 cal/mol"),
                    encoding="utf-8")
    code = main(["--catalogue", str(root), "check", str(pair)])
    out = capsys.readouterr().out
    assert code == 1
    assert "FAIL pairs/binaries/ethanol--water.yaml: entry 'ethanol--water'" in out
    assert "azeotrope at 101.325 kPa" in out
