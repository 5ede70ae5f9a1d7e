"""A pair's behaviour at the summary pressure, as a key and in words (index filter, summary)."""

from __future__ import annotations

from builder.analysis.results import ConditionResult, PairResults
from builder.site.settings import SiteSettings

__all__ = ["BEHAVIOURS", "KIND_WORDS", "behaviour", "summary_condition"]


#: Behaviour at the summary pressure, for the summary sentence and the index filter.
BEHAVIOURS = {
    "zeotropic": "zeotropic (no azeotrope)",
    "minimum-boiling": "minimum-boiling azeotrope",
    "maximum-boiling": "maximum-boiling azeotrope",
    "heterogeneous": "heterogeneous azeotrope (two liquids)",
    "liquid-split": "two liquid phases, no azeotrope",
    "several": "more than one azeotrope",
    "uncertain": "not settled (incomplete search)",
    "not-published": "no isobar at the summary pressure",
}


#: Isotherm azeotrope kinds in words.
KIND_WORDS = {
    "minimum-boiling": "minimum-boiling azeotrope",
    "maximum-boiling": "maximum-boiling azeotrope",
    "maximum-pressure": "maximum-pressure azeotrope (minimum-boiling)",
    "minimum-pressure": "minimum-pressure azeotrope (maximum-boiling)",
}


def summary_condition(results: PairResults, settings: SiteSettings) -> ConditionResult | None:
    """The isobar at the summary pressure, if the pair publishes it."""
    for result in results.isobars:
        if abs(result.condition - settings.summary_pressure_Pa) < 1.0:
            return result
    return None


def behaviour(result: ConditionResult | None) -> str:
    """The behaviour key (see :data:`BEHAVIOURS`) of one isobar."""
    if result is None:
        return "not-published"
    three = result.three_phase
    azeotropes = result.azeotropes
    if three is not None:
        if three.heterogeneous_azeotrope or any(a.heterogeneous for a in azeotropes):
            return "heterogeneous"
        if not azeotropes:
            return "liquid-split"
    if any(a.heterogeneous for a in azeotropes):
        return "heterogeneous"
    if len(azeotropes) > 1:
        return "several"
    if len(azeotropes) == 1:
        kind = azeotropes[0].kind
        return {"maximum-pressure": "minimum-boiling",
                "minimum-pressure": "maximum-boiling"}.get(kind, kind)
    if not result.azeotrope_search_complete:
        return "uncertain"
    return "zeotropic"
