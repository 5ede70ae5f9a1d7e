"""``atlas diff``: compute the pairs a catalogue change touches, in both versions, and compare.

Only the affected pairs (:func:`builder.catalogue.revisions.affected_pairs`) are
loaded and computed, in the base and in the head catalogue.  A pair that does
not load, or whose computation fails, is summarised by its located error
messages rather than stopping the comparison.
"""

from __future__ import annotations

import warnings
from dataclasses import dataclass, field
from pathlib import Path

import numpy as np

from builder.analysis.compare import Change, PairSummary, compare, summarise
from builder.analysis.results import compute_pair
from builder.catalogue.loader import load_catalogue
from builder.catalogue.revisions import affected_pairs
from builder.errors import CatalogueError

__all__ = ["CatalogueDiff", "PairDiff", "diff_catalogues"]


@dataclass(frozen=True)
class PairDiff:
    pair: str
    status: str  # added, removed, changed, unchanged
    reasons: tuple[str, ...]
    changes: tuple[Change, ...]
    before: PairSummary | None
    after: PairSummary | None

    @property
    def behaviour_changed(self) -> bool:
        return any(c.behaviour for c in self.changes)

    @property
    def newly_failing(self) -> list[str]:
        """Checks that fail in the head but did not fail in the base (or a head that does
        not load)."""
        if self.after is None:
            return []
        if self.after.error:
            return ["does not load or compute"]
        old = self.before.checks if self.before is not None and not self.before.error else {}
        return [n for n in self.after.failed_checks if old.get(n) is not False]


@dataclass(frozen=True)
class CatalogueDiff:
    base: str
    head: str
    pairs: tuple[PairDiff, ...]
    unaffected: int
    base_problems: tuple[str, ...] = field(default=())
    head_problems: tuple[str, ...] = field(default=())

    @property
    def behaviour_changed(self) -> bool:
        return any(p.behaviour_changed for p in self.pairs)

    @property
    def checks_fail(self) -> bool:
        return any(p.newly_failing for p in self.pairs) or bool(self.head_problems)


def _summaries(root: Path, wanted: set[str]) -> tuple[dict[str, PairSummary], list[str]]:
    """Summaries of the wanted pairs present in ``root``; problems of other files."""
    problems: list[CatalogueError] = []
    present = {p.stem for p in (root / "binaries").glob("*.yaml")} & wanted
    if not present:
        return {}, []
    catalogue = load_catalogue(root, only=sorted(present), problems=problems)
    out: dict[str, PairSummary] = {}
    for pid in sorted(present):
        pair = catalogue.pairs.get(pid)
        if pair is None:
            own = [str(e) for e in problems if Path(e.file).stem == pid or e.entry == pid]
            uses = [str(e) for e in problems if e.file.startswith(
                str(Path(root.name) / "components"))]
            out[pid] = PairSummary(id=pid, error="; ".join(own or uses) or "does not load")
            continue
        try:
            with np.errstate(all="ignore"), warnings.catch_warnings():
                warnings.simplefilter("ignore", RuntimeWarning)
                out[pid] = summarise(compute_pair(catalogue, pair))
        except (ArithmeticError, ValueError) as error:
            out[pid] = PairSummary(id=pid, error=f"{pair.file}: entry {pid!r}: expected a pair "
                                   f"the solvers can compute; found {type(error).__name__}: "
                                   f"{error}")
    others = [str(e) for e in problems if Path(e.file).parent.name != "binaries"]
    return out, others


def diff_catalogues(base: Path, head: Path, base_label: str = "base",
                    head_label: str = "head") -> CatalogueDiff:
    """Compare two catalogue folders for a reader of the atlas."""
    affected = affected_pairs(base, head)
    before, base_problems = _summaries(base, set(affected))
    after, head_problems = _summaries(head, set(affected))
    total = ({p.stem for p in (base / "binaries").glob("*.yaml")}
             | {p.stem for p in (head / "binaries").glob("*.yaml")})
    pairs = []
    for pid, reasons in affected.items():
        b, a = before.get(pid), after.get(pid)
        changes = tuple(compare(b, a))
        status = ("added" if b is None else "removed" if a is None
                  else "changed" if changes else "unchanged")
        pairs.append(PairDiff(pid, status, tuple(reasons), changes, b, a))
    return CatalogueDiff(base_label, head_label, tuple(pairs), len(total - set(affected)),
                         tuple(dict.fromkeys(base_problems)), tuple(dict.fromkeys(head_problems)))
