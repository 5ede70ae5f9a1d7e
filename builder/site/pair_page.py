"""One pair page's Markdown from that pair's work alone, so that a worker can render it.

A pair page (``pair.md.j2`` and the ``_macros.j2`` it imports) reads the pair's
view (its results, its two components, the references it cites), its figures,
its second opinion and the site settings -- nothing of any other pair: the links
it holds go to its two component pages, to its own figures and downloads and to
pages every build has (methods, ``atlas.json``).  So :func:`pair_markdown` runs
in the worker that computed and drew the pair (:mod:`.work`), in parallel and
cached with the pair's output, and gives the same text the main process would:
the main process keeps only the pages that need the whole atlas (index,
components, matrix, lists).  The component views built here list this pair
alone among the components' pairs; the pair page does not read that list.

The cache key of a pair (:func:`.cache.pair_key`) includes the two templates,
:data:`builder.site.cache.PAIR_PAGE_TEMPLATES`.
"""

from __future__ import annotations

import functools
from collections.abc import Sequence

import jinja2

from builder.analysis.results import PairResults
from builder.analysis.second_opinion import SecondOpinion
from builder.catalogue.loader import Catalogue
from builder.site.component_view import component_view
from builder.site.display import Display
from builder.site.figures import Figure
from builder.site.opinion import opinion_view
from builder.site.pages import environment, pair_page
from builder.site.pair_view import pair_view
from builder.site.settings import SiteSettings

__all__ = ["pair_markdown"]


@functools.lru_cache(maxsize=1)
def _environment() -> jinja2.Environment:
    """One template environment per process (it keeps the compiled templates)."""
    return environment()


def pair_markdown(catalogue: Catalogue, results: PairResults, figures: Sequence[Figure],
                  opinion: SecondOpinion | None, settings: SiteSettings,
                  predicted: bool) -> str:
    """The Markdown of the page of ``results``' pair; ``catalogue`` holds the pair, its two
    components and the references (a worker's slice of the catalogue is enough)."""
    display = Display(settings)
    pair = results.pair
    components = {cid: component_view(catalogue, catalogue.components[cid], display, [pair])
                  for cid in sorted({pair.component1, pair.component2})}
    view = pair_view(catalogue, results, components, display, settings)
    return pair_page(_environment(), view, figures,
                     opinion_view(opinion, display) if opinion is not None else None,
                     predicted, settings)
