"""Predicted pair pages: which combinations without a fitted set the build includes.

The predicted pair records and the list of combinations that cannot be predicted
come from :mod:`builder.analysis.predicted`; the site setting ``predicted_pairs``
(:mod:`.settings`) chooses how many of them become pages, because the full atlas
is thousands of pages: ``none``, ``all``, or a list of component ids (every
combination among those components; a quick preview or a test).  A combination
that has no page says why (:func:`reasons`): it cannot be predicted (the
reason of the prediction), or predicted pages of it are not part of this build.
"""

from __future__ import annotations

from dataclasses import dataclass, field

from builder.analysis.predicted import Unpredictable, combinations_without_fitted_set
from builder.catalogue.loader import Catalogue
from builder.catalogue.predictive import CannotPredict, predicted_pair
from builder.catalogue.records import PairRecord
from builder.site.partners import NOT_BUILT

__all__ = ["ALL", "NOT_BUILT", "PredictedSelection", "select_predicted"]

#: The ``predicted_pairs`` value that includes every combination.
ALL = "all"



@dataclass(frozen=True)
class PredictedSelection:
    """The predicted pairs a build publishes and the combinations that cannot be predicted."""

    records: dict[str, PairRecord] = field(default_factory=dict)
    unpredictable: tuple[Unpredictable, ...] = ()
    scope: str = "none"  # "none", "all" or the component ids, in words
    #: Listed component ids this catalogue does not hold (skipped; the build says so).
    not_in_catalogue: tuple[str, ...] = ()

    def reason(self, c1: str, c2: str) -> str:
        """Why the combination of ``c1`` and ``c2`` has no page."""
        key = tuple(sorted((c1, c2)))
        for u in self.unpredictable:
            if (u.component1, u.component2) == key:
                return "cannot be predicted: " + "; ".join(u.reasons)
        return NOT_BUILT


def select_predicted(catalogue: Catalogue, components: tuple[str, ...]) -> PredictedSelection:
    """The predicted pairs among ``components`` (``("all",)``: every component).

    A listed id the catalogue does not hold is skipped and named in
    ``not_in_catalogue`` (the list selects among the catalogue's components, and a
    catalogue built in part -- a preview, a test -- holds only some of them).
    """
    if not components:
        return PredictedSelection()
    every = components == (ALL,)
    chosen = set(catalogue.components) if every else set(components)
    unknown = tuple(sorted(chosen - set(catalogue.components)))
    chosen -= set(unknown)
    records: dict[str, PairRecord] = {}
    failed: list[Unpredictable] = []
    for a, b in combinations_without_fitted_set(catalogue):
        if a not in chosen or b not in chosen:
            continue
        try:
            record = predicted_pair(catalogue.components[a], catalogue.components[b])
        except CannotPredict as error:
            failed.append(Unpredictable(a, b, tuple(error.reasons)))
            continue
        records[record.id] = record
    return PredictedSelection(records=records, unpredictable=tuple(failed),
                              scope=ALL if every else ", ".join(sorted(chosen)),
                              not_in_catalogue=unknown)
