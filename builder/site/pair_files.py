"""A pair's own site files -- its page, its downloads and its figures -- and its entry for
the atlas-wide pages, from that pair's work alone, so that the worker that computed the
pair makes them.

A pair page (``pair.md.j2`` and the ``_macros.j2`` it imports), its CSV downloads
and its JSON file read the pair's results, its two components, the references it
cites, its figures, its second opinion and the site settings -- nothing of any
other pair: the page's links go to its two component pages, to its own figures
and downloads and to pages every build has (methods, ``atlas.json``).  So
:func:`pair_files` runs in the worker that computed and drew the pair
(:mod:`.work`), in parallel and cached with the pair's output; the main process
(:mod:`.content`) makes only the pages and files that need the whole atlas (index,
components, matrix, lists, ``atlas.json``), from the pairs'
:class:`~.pair_entry.PairEntry` records.

The component views built here list this pair alone among the components' pairs;
the pair page does not read that list, and the main process puts its own component
views into the pair's entry (:func:`builder.site.context.build_views`).  The cache
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
from builder.site.pair_entry import PairEntry, pair_entry
from builder.site.pair_view import PairView, pair_view
from builder.site.settings import SiteSettings

__all__ = ["Files", "PairFiles", "page_view", "pair_downloads", "pair_files"]


#: Site files as ``(site-relative path, bytes)``.
Files = tuple[tuple[str, bytes], ...]


@dataclass(frozen=True)
class PairFiles:
    """What the worker makes of one pair for the site."""

    entry: PairEntry  # what the atlas-wide pages read of it (:mod:`.pair_entry`)
    files: Files  # its page (Markdown), downloads (CSV, JSON) and figures (SVG)

    @property
    def page(self) -> str:
        """The pair page's Markdown."""
        return dict(self.files)[self.entry.url].decode("utf-8")


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


def page_view(catalogue: Catalogue, results: PairResults, settings: SiteSettings) -> PairView:
    """The view of ``results``' pair page; its component views list this pair alone."""
    display = Display(settings)
    pair = results.pair
    components = {cid: component_view(catalogue, catalogue.components[cid], display, [pair])
                  for cid in sorted({pair.component1, pair.component2})}
    return pair_view(catalogue, results, components, display, settings)


def pair_files(catalogue: Catalogue, results: PairResults, figures: Sequence[Figure],
               opinion: SecondOpinion | None, settings: SiteSettings,
               predicted: bool) -> PairFiles:
    """The page, downloads, figures and entry of ``results``' pair; ``catalogue`` holds the
    pair's two components and the references (a worker's slice of the catalogue is
    enough)."""
    display = Display(settings)
    view = page_view(catalogue, results, settings)
    seen = opinion_view(opinion, display) if opinion is not None else None
    page = pair_page(_environment(), view, figures, seen, predicted, settings)
    downloads, data = pair_downloads(results, view, opinion, settings)
    files = ((view.url, page.encode("utf-8")), *downloads,
             *((fig.path, fig.svg) for fig in figures))
    entry = pair_entry(results, view, seen, data, tuple(path for path, _data in files),
                       settings)
    return PairFiles(entry, files)
