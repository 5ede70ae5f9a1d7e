"""Predicted pairs: every combination of catalogued components without a fitted set.

Each such combination gets a pair record with modified UNIFAC (Dortmund), or original
UNIFAC where Dortmund lacks groups or parameters (:func:`predicted_pairs`); the
combinations neither variant can predict are listed with the reason
(:func:`unpredictable_pairs`).  The records are ordinary :class:`PairRecord` objects
with ``quality == "predicted"``, so :func:`builder.analysis.results.compute_pair`
computes them like fitted pairs (azeotropes, liquid split, volatility, quick look) at
the summary pressure, 101.325 kPa.  Components are ordered by id within a pair.
"""

from __future__ import annotations

from dataclasses import dataclass
from itertools import combinations

from builder.catalogue.loader import Catalogue
from builder.catalogue.predictive import CannotPredict, predicted_pair
from builder.catalogue.records import PairRecord

__all__ = ["Unpredictable", "combinations_without_fitted_set", "predicted_pairs",
           "unpredictable_pairs"]


@dataclass(frozen=True)
class Unpredictable:
    """A combination of two components that neither UNIFAC variant can predict."""

    component1: str
    component2: str
    reasons: tuple[str, ...]


def combinations_without_fitted_set(catalogue: Catalogue) -> list[tuple[str, str]]:
    """Every pair of component ids (sorted within the pair) that has no fitted set."""
    ids = sorted(catalogue.components)
    return [(a, b) for a, b in combinations(ids, 2) if catalogue.pair_of(a, b) is None]


def _split(catalogue: Catalogue) -> tuple[dict[str, PairRecord], list[Unpredictable]]:
    found: dict[str, PairRecord] = {}
    failed: list[Unpredictable] = []
    for a, b in combinations_without_fitted_set(catalogue):
        try:
            record = predicted_pair(catalogue.components[a], catalogue.components[b])
        except CannotPredict as error:
            failed.append(Unpredictable(a, b, tuple(error.reasons)))
            continue
        found[record.id] = record
    return found, failed


def predicted_pairs(catalogue: Catalogue) -> dict[str, PairRecord]:
    """A predicted pair record for every combination without a fitted set, by id."""
    return _split(catalogue)[0]


def unpredictable_pairs(catalogue: Catalogue) -> list[Unpredictable]:
    """The combinations without a fitted set that cannot be predicted, with the reason."""
    return _split(catalogue)[1]
