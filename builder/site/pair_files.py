"""A pair's own site files -- its page, its downloads and its view -- from that pair's work
alone, so that the worker that computed the pair makes them.

A pair page (``pair.md.j2`` and the ``_macros.j2`` it imports), its CSV downloads
and its JSON file read the pair's results, its two components, the references it
cites, its figures, its second opinion and the site settings -- nothing of any
other pair: the page's links go to its two component pages, to its own figures
and downloads and to pages every build has (methods, ``atlas.json``).  So
:func:`pair_files` runs in the worker that computed and drew the pair
(:mod:`.work`), in parallel and cached with the pair's output, and :func:`pair_downloads`
is the one code path for the downloads in the worker and in the main process
(:mod:`.content`), which keeps only the pages and files that need the whole atlas
(index, components, matrix, lists, ``atlas.json``).

The component views built here list this pair alone among the components' pairs;
the pair page does not read that list, and the main process puts its own component
views into the pair's view (:func:`builder.site.context.build_views`).  The cache
key of a pair (:func:`.cache.pair_key`) includes the two templates
(:data:`builder.site.cache.PAIR_PAGE_TEMPLATES`).
"""

from __future__ import annotations

import functools
import json
from collections.abc import Sequence
from dataclasses import dataclass
from typing import Any

import jinja2

from builder.analysis.results import PairResults
from builder.analysis.second_opinion import SecondOpinion
from builder.catalogue.loader import Catalogue
from builder.site.component_view import component_view
from builder.site.data import condition_csvs, pair_json, plain
from builder.site.display import Display
from builder.site.figures import Figure
from builder.site.opinion import opinion_json, opinion_view
from builder.site.pages import environment, pair_page
from builder.site.pair_view import PairView, pair_view
from builder.site.settings import SiteSettings

__all__ = ["PairFiles", "pair_downloads", "pair_files"]


@dataclass(frozen=True)
class PairFiles:
    """What the worker makes of one pair for the site."""

    view: PairView  # its components list this pair alone (see the module's note)
    page: str  # the pair page's Markdown
    downloads: tuple[tuple[str, bytes], ...]  # (site-relative path, bytes): CSVs, JSON
    data: dict[str, Any]  # the pair's entry of atlas.json


def pair_downloads(results: PairResults, view: PairView, opinion: SecondOpinion | None,
                   settings: SiteSettings) -> tuple[tuple[tuple[str, bytes], ...],
                                                    dict[str, Any]]:
    """The pair's CSV files (curve and table of each condition) and its JSON file, and
    its entry of ``atlas.json``."""
    files: list[tuple[str, bytes]] = []
    for result, cv in zip(results.conditions, view.conditions, strict=True):
        curve, table = condition_csvs(results, result)
        files += [(cv.curve_csv, curve), (cv.table_csv, table)]
    data = pair_json(results, view, settings)
    if opinion is not None:
        data["second_opinion"] = opinion_json(opinion)
    text = json.dumps(plain(data), indent=1, ensure_ascii=False, allow_nan=False) + "\n"
    files.append((view.json_path, text.encode("utf-8")))
    return tuple(files), data


@functools.lru_cache(maxsize=1)
def _environment() -> jinja2.Environment:
    """One template environment per process (it keeps the compiled templates)."""
    return environment()


def pair_files(catalogue: Catalogue, results: PairResults, figures: Sequence[Figure],
               opinion: SecondOpinion | None, settings: SiteSettings,
               predicted: bool) -> PairFiles:
    """The page, downloads and view of ``results``' pair; ``catalogue`` holds the pair, its
    two components and the references (a worker's slice of the catalogue is enough)."""
    display = Display(settings)
    pair = results.pair
    components = {cid: component_view(catalogue, catalogue.components[cid], display, [pair])
                  for cid in sorted({pair.component1, pair.component2})}
    view = pair_view(catalogue, results, components, display, settings)
    page = pair_page(_environment(), view, figures,
                     opinion_view(opinion, display) if opinion is not None else None,
                     predicted, settings)
    downloads, data = pair_downloads(results, view, opinion, settings)
    return PairFiles(view, page, downloads, data)
