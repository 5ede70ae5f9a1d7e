"""Withheld pairs: catalogued (fitted) pairs this build does not publish, and why.

A fitted pair is withheld when its parameter set fails its reference checks (the
checks of ``atlas check``; ``atlas build --allow-failed-checks`` publishes it with a
banner instead) or when its computation failed in this build (a
:class:`~.work.PairFailure`).  Its page is a notice that says so and why, never
numbers or figures, and the index lists it under "Withheld from this build".
Nothing here computes: the reasons are the located check failures and the failure
records the build collected.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass

from builder.catalogue.loader import Catalogue

__all__ = ["CHECKS", "COMPUTATION", "WithheldPair", "withheld_pairs"]

#: Why a pair is withheld: it fails its reference checks ...
CHECKS = "checks"
#: ... or its computation failed in this build.
COMPUTATION = "computation"


@dataclass(frozen=True)
class WithheldPair:
    """A fitted pair without a published page, as its notice and the index show it."""

    id: str
    url: str  # site-relative .md path of the notice (where the pair page would be)
    title: str  # "Component 1 + Component 2"
    components: tuple[tuple[str, str, str], ...]  # (id, name, .md path of its page)
    cause: str  # CHECKS or COMPUTATION
    reasons: tuple[str, ...]  # one line each

    @property
    def short(self) -> str:
        """The reason in a few words, for a list or a table cell."""
        if self.cause == COMPUTATION:
            return self.reasons[0]
        return f"fails {len(self.reasons)} reference check{'s' if len(self.reasons) > 1 else ''}"


def withheld_pairs(catalogue: Catalogue, failed_checks: Mapping[str, Sequence[str]],
                   failed_computation: Mapping[str, str]) -> tuple[WithheldPair, ...]:
    """The withheld pairs, by id: ``failed_checks`` (pair id -> located check failures,
    :func:`builder.analysis.catalogue_checks.failed_sets`) and ``failed_computation``
    (pair id -> :attr:`~.work.PairFailure.reason`) of the fitted pairs of ``catalogue``;
    a pair in both is withheld for its failed computation (its checks did not run)."""
    out = []
    for pid in sorted(set(failed_checks) | set(failed_computation)):
        pair = catalogue.pairs[pid]
        components = tuple((cid, catalogue.components[cid].name, f"components/{cid}.md")
                           for cid in (pair.component1, pair.component2))
        reasons: tuple[str, ...]
        if pid in failed_computation:
            cause, reasons = COMPUTATION, (failed_computation[pid],)
        else:
            cause, reasons = CHECKS, tuple(failed_checks[pid])
        out.append(WithheldPair(id=pid, url=f"pairs/{pid}.md",
                                title=" + ".join(name for _c, name, _u in components),
                                components=components, cause=cause, reasons=reasons))
    return tuple(out)
