"""``atlas diff``: what a catalogue change does to the atlas, for real catalogue changes.

References: common practice (Raoult's law with two components boiling 22 K apart gives no
azeotrope; a higher vapour pressure of one component moves a minimum-boiling azeotrope
towards it and lowers its temperature); the shipped catalogue's own sets.
"""

from __future__ import annotations

import json
import shutil
import subprocess
from pathlib import Path

import pytest

from builder.analysis.catalogue_diff import diff_catalogues
from builder.catalogue.loader import DEFAULT_CATALOGUE
from builder.commands.cli import main


def _catalogue(root: Path) -> Path:
    shutil.copytree(DEFAULT_CATALOGUE / "references", root / "references")
    (root / "components").mkdir()
    (root / "binaries").mkdir()
    for cid in ("ethanol", "water", "pyridine"):
        shutil.copy(DEFAULT_CATALOGUE / "components" / f"{cid}.yaml", root / "components")
    for pid in ("ethanol--water", "water--pyridine"):
        shutil.copy(DEFAULT_CATALOGUE / "binaries" / f"{pid}.yaml", root / "binaries")
    return root


@pytest.fixture
def base(tmp_path: Path) -> Path:
    return _catalogue(tmp_path / "base" / "pairs")


@pytest.fixture
def head(tmp_path: Path) -> Path:
    return _catalogue(tmp_path / "head" / "pairs")


def _edit(path: Path, old: str, new: str) -> None:
    text = path.read_text(encoding="utf-8")
    assert old in text, f"{old!r} not in {path.name}"
    path.write_text(text.replace(old, new, 1), encoding="utf-8")


def _ideal(head: Path) -> None:
    path = head / "binaries" / "ethanol--water.yaml"
    _edit(path, "model: nrtl", "model: ideal")
    _edit(path, "quality: regressed", "quality: ideal")
    text = path.read_text(encoding="utf-8")
    start, end = text.index("  parameters:"), text.index("  T_range:")
    path.write_text(text[:start] + text[end:], encoding="utf-8")


def test_azeotrope_vanishes(base: Path, head: Path, capsys: pytest.CaptureFixture[str]) -> None:
    _ideal(head)
    diff = diff_catalogues(base, head)
    assert [p.pair for p in diff.pairs] == ["ethanol--water"]  # only the affected pair
    assert diff.unaffected == 1
    (pair,) = diff.pairs
    assert pair.status == "changed" and pair.reasons == ("pair file changed",)
    vanished = [c for c in pair.changes if c.detail == "the azeotrope vanishes"]
    assert {c.condition for c in vanished} >= {"isobar 101.325 kPa"}
    assert any(c.what == "behaviour" and c.after == "zeotropic" for c in pair.changes)
    assert any("azeotrope at 101.325 kPa" in name for name in pair.newly_failing)
    for flag in ("behaviour", "checks"):
        assert main(["diff", str(base), str(head), "--fail-on", flag]) == 1
    text = capsys.readouterr().out
    table, details = text.index("| pair | status"), text.index("### ethanol--water")
    assert table < details
    assert "minimum-boiling azeotrope → zeotropic" in text
    assert "the azeotrope vanishes" in text


def test_component_antoine_change_moves_the_azeotrope(base: Path, head: Path) -> None:
    # A higher A raises ethanol's vapour pressure by 10**0.02 = 4.7 %.
    _edit(head / "components" / "ethanol.yaml", "A: 5.33675", "A: 5.35675")
    diff = diff_catalogues(base, head)
    (pair,) = diff.pairs
    assert pair.pair == "ethanol--water" and "component ethanol changed" in pair.reasons
    moves = [c for c in pair.changes if c.what == "azeotrope"
             and c.condition == "isobar 101.325 kPa"]
    assert moves and moves[0].detail.startswith("the azeotrope moves by ΔT = -")
    assert not diff.behaviour_changed


def test_pair_removed(base: Path, head: Path, capsys: pytest.CaptureFixture[str]) -> None:
    (head / "binaries" / "water--pyridine.yaml").unlink()
    diff = diff_catalogues(base, head)
    (pair,) = diff.pairs
    assert pair.pair == "water--pyridine" and pair.status == "removed"
    assert diff.behaviour_changed and not diff.checks_fail
    assert main(["diff", str(base), str(head), "--json", "--fail-on", "checks"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["format"] == "vle-atlas-diff/1"
    assert data["pairs"][0]["status"] == "removed" and data["behaviour_changed"] is True


def test_broken_head_file_is_reported_not_raised(base: Path, head: Path) -> None:
    _edit(head / "binaries" / "ethanol--water.yaml", "alpha: 0.2937", "alpha: 7")
    diff = diff_catalogues(base, head)
    (pair,) = diff.pairs
    assert pair.after is not None and "activity.parameters.alpha" in pair.after.error
    assert diff.checks_fail and pair.newly_failing == ["does not load or compute"]


def test_git_revisions(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    repo = tmp_path / "repo"
    catalogue = _catalogue(repo / "pairs")
    git = ["git", "-C", str(repo), "-c", "user.name=t", "-c", "user.email=t@example.invalid"]
    subprocess.run([*git, "init", "-q"], check=True)
    subprocess.run([*git, "add", "-A"], check=True)
    subprocess.run([*git, "commit", "-qm", "catalogue"], check=True)
    assert main(["--catalogue", str(catalogue), "diff", "HEAD", "HEAD"]) == 0
    assert "0 pair(s) affected" in capsys.readouterr().out
    (catalogue / "binaries" / "water--pyridine.yaml").unlink()
    assert main(["--catalogue", str(catalogue), "diff", "HEAD", "--fail-on", "behaviour"]) == 1
    out = capsys.readouterr().out
    assert "HEAD → working tree" in out and "| water--pyridine | removed |" in out
    assert main(["--catalogue", str(catalogue), "diff", "no-such-revision"]) == 2
    assert "git archive" in capsys.readouterr().err
