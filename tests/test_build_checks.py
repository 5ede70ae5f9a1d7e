"""``atlas build`` runs the checks of ``atlas check``: a failing set is withheld, or published
with a banner under ``--allow-failed-checks``.

Reference: the handbook azeotrope of ethanol-water (x1 about 0.89 at 101.325 kPa, catalogue
record); moving the record to x1 = 0.50 makes the set fail its check by construction.
"""

from __future__ import annotations

import shutil
from pathlib import Path

import pytest

from builder.catalogue.loader import DEFAULT_CATALOGUE
from builder.site.build import build_site
from tests.conftest import cache_sharing_work


@pytest.fixture(scope="module")
def failing_catalogue(tmp_path_factory: pytest.TempPathFactory) -> Path:
    root = tmp_path_factory.mktemp("gate") / "pairs"
    shutil.copytree(DEFAULT_CATALOGUE / "references", root / "references")
    (root / "components").mkdir()
    (root / "binaries").mkdir()
    for cid in ("ethanol", "water", "acetone", "chloroform"):
        shutil.copy(DEFAULT_CATALOGUE / "components" / f"{cid}.yaml", root / "components")
    for pid in ("ethanol--water", "acetone--chloroform"):
        shutil.copy(DEFAULT_CATALOGUE / "binaries" / f"{pid}.yaml", root / "binaries")
    path = root / "binaries" / "ethanol--water.yaml"
    text = path.read_text(encoding="utf-8")
    assert "x1: 0.893" in text
    path.write_text(text.replace("x1: 0.893", "x1: 0.500"), encoding="utf-8")
    return root


@pytest.fixture(scope="module")
def gate_work(tmp_path_factory: pytest.TempPathFactory) -> Path:
    """One store of computed work for both builds of the failing catalogue (the same pairs
    and settings): the second build takes the computed pairs from it."""
    return tmp_path_factory.mktemp("gate-work")


def test_build_withholds_a_set_that_fails_its_checks(failing_catalogue: Path, gate_work: Path,
                                                     tmp_path: Path) -> None:
    report = build_site(failing_catalogue, tmp_path / "site", workers=1,
                        cache_dir=cache_sharing_work(gate_work, tmp_path))
    assert list(report.withheld) == ["ethanol--water"]
    assert "azeotrope at 101.325 kPa" in report.withheld["ethanol--water"][0]
    assert "ethanol--water.yaml: entry 'ethanol--water'" in report.withheld["ethanol--water"][0]
    # Its page is a notice that says why, with no numbers; the index lists it.
    notice = (tmp_path / "site" / "pairs" / "ethanol--water.html").read_text(encoding="utf-8")
    assert "Withheld from this build: this parameter set fails 1 of its reference checks" in (
        notice)
    assert 'class="atlas-summary' not in notice and 'class="atlas-figure' not in notice
    index = (tmp_path / "site" / "index.html").read_text(encoding="utf-8")
    assert 'href="pairs/ethanol--water.html"' in index and "fails 1 reference check" in index
    assert (tmp_path / "site" / "pairs" / "acetone--chloroform.html").is_file()
    assert "Not published (failed checks" in report.summary()


def test_allow_failed_checks_publishes_with_a_banner(failing_catalogue: Path, gate_work: Path,
                                                     tmp_path: Path) -> None:
    report = build_site(failing_catalogue, tmp_path / "site", workers=1,
                        cache_dir=cache_sharing_work(gate_work, tmp_path), allow_failed_checks=True)
    assert list(report.published_failing) == ["ethanol--water"]
    page = (tmp_path / "site" / "pairs" / "ethanol--water.html").read_text(encoding="utf-8")
    assert "atlas-failed-checks" in page and "fails 1 of its reference checks" in page
    clean = (tmp_path / "site" / "pairs" / "acetone--chloroform.html").read_text("utf-8")
    assert "atlas-failed-checks" not in clean
