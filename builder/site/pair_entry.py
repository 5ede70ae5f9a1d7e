"""One pair as the pages about the whole atlas read it: a small record made in the worker.

A pair's own page, downloads and figures are made in the worker that computed
the pair (:mod:`.pair_files`, :mod:`.work`) and go to the site as they are.  The
pages that read every pair -- the index, the component pages with their partner
tables, the behaviour matrix, the catalogue page, the search index and
``atlas.json`` -- need a few lines of each: its title, names, behaviour, index
row, α range, second-opinion cell, checks and its ``atlas.json`` entry.  The
worker writes those into a :class:`PairEntry`, and the build holds one entry per
pair instead of the pair's results, figures and files: a few kilobytes instead of
hundreds, so that the main process of a build of thousands of pairs stays small
and a rebuild after one edit reads one small record per unchanged pair.

The attribute names are those of :class:`~.pair_view.PairView` for what both hold,
so a template that lists pairs reads either.
"""

from __future__ import annotations

import json
from dataclasses import dataclass
from typing import Any

from builder.analysis.results import PairResults
from builder.site.behaviour import summary_condition
from builder.site.component_view import ComponentView
from builder.site.data import plain
from builder.site.index_view import IndexRow
from builder.site.opinion import OpinionView
from builder.site.pair_view import PairView
from builder.site.settings import SiteSettings

__all__ = ["PairEntry", "entry_json", "pair_entry"]


@dataclass(frozen=True)
class PairEntry:
    """What the atlas-wide pages read of one pair (see the module's note)."""

    id: str
    url: str  # site-relative .md path of the pair page
    title: str
    component1: str  # catalogue ids, in the pair's order
    component2: str
    #: The pair's two component views; the worker's list this pair alone among the
    #: components' pairs, and the build puts the atlas's own views in their place.
    c1: ComponentView
    c2: ComponentView
    sentence: str
    behaviour: str
    summary_label: str
    model: str  # as the page names it (with its vapour treatment)
    model_name: str  # the catalogue's model name, e.g. "NRTL"
    checks: tuple[tuple[str, bool, str, str], ...]  # name, passed, detail, reference
    failed_checks: tuple[tuple[str, str], ...]  # name, detail
    index: IndexRow
    #: Smallest and largest α12 along the bubble line at the summary pressure (None when
    #: the pair has no isobar there).
    alpha_summary: tuple[float, float] | None
    opinion: OpinionView | None  # the second opinion beside a fitted set
    json: str  # the pair's entry of atlas.json, compact JSON text
    files: tuple[str, ...]  # the site-relative paths of the pair's own files


def entry_json(data: dict[str, Any]) -> str:
    """A pair's ``atlas.json`` entry as one line of compact JSON (SI, NaN as null)."""
    return json.dumps(plain(data), ensure_ascii=False, allow_nan=False,
                      separators=(",", ":"))


def pair_entry(results: PairResults, view: PairView, opinion: OpinionView | None,
               data: dict[str, Any], files: tuple[str, ...],
               settings: SiteSettings) -> PairEntry:
    """The entry of ``results``' pair, from the view and ``atlas.json`` data its page was
    made from; ``files`` are the paths of its page, downloads and figures."""
    summary = summary_condition(results, settings)
    alpha = ((summary.volatility.alpha_min, summary.volatility.alpha_max)
             if summary is not None else None)
    return PairEntry(
        id=view.id, url=view.url, title=view.title, component1=results.pair.component1,
        component2=results.pair.component2, c1=view.c1, c2=view.c2, sentence=view.sentence,
        behaviour=view.behaviour, summary_label=view.summary_label, model=view.model,
        model_name=results.pair.model.name, checks=view.checks,
        failed_checks=tuple((c.name, c.detail) for c in results.failed_checks),
        index=view.index, alpha_summary=alpha, opinion=opinion, json=entry_json(data),
        files=files)
