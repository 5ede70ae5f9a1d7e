"""Generation: computed results to the site's source files, in memory, engine-independent.

:func:`generate` renders every figure (SVG), download (CSV, JSON) and page
(Markdown) into a :class:`SiteContent` -- a mapping of site-relative paths to
bytes -- and copies nothing to disk.  Only when all of it exists does the
assembler write it (:mod:`.assemble`).  Paths are checked as they are added:
every part is a safe slug, so no catalogue text can choose where a file goes.
"""

from __future__ import annotations

import re
from collections.abc import Callable, Iterator, Mapping, Sequence
from dataclasses import dataclass, field
from typing import Any

from builder.analysis.results import PairResults
from builder.analysis.second_opinion import SecondOpinion
from builder.catalogue.loader import Catalogue
from builder.site.context import AtlasView, Display, build_views
from builder.site.data import atlas_json
from builder.site.figures import Figure, component_figure, pair_figures
from builder.site.opinion import opinion_view
from builder.site.pages import render_pages
from builder.site.pair_files import PairFiles, pair_downloads
from builder.site.partners import is_predicted, partner_rows
from builder.site.predicted import PredictedSelection
from builder.site.predicted_figures import predicted_figure
from builder.site.settings import SiteSettings
from builder.site.text import UnsafeName
from builder.site.withheld import WithheldPair

__all__ = ["SiteContent", "generate"]

#: A site-relative path: slug parts (a pair id may join two slugs by ``--``) and an extension.
_PATH = re.compile(r"^(?:[a-z0-9]+(?:-{1,2}[a-z0-9]+)*/)*[a-z0-9]+(?:-{1,2}[a-z0-9]+)*"
                   r"\.(?:md|svg|csv|json)$")


@dataclass
class SiteContent:
    """The generated source of the site: ``{site-relative path: bytes}``."""

    files: dict[str, bytes] = field(default_factory=dict)
    stats: dict[str, int] = field(default_factory=dict)

    def add(self, path: str, data: bytes | str) -> None:
        if not _PATH.match(path) or ".." in path.split("/"):
            raise UnsafeName(f"refusing to write an unsafe path: {path!r}")
        if path in self.files:
            raise UnsafeName(f"two generated files would share the path {path!r}")
        self.files[path] = data.encode("utf-8") if isinstance(data, str) else data
        kind = path.rsplit(".", 1)[1]
        self.stats[kind] = self.stats.get(kind, 0) + 1

    def __iter__(self) -> Iterator[tuple[str, bytes]]:
        return iter(sorted(self.files.items()))

    def __len__(self) -> int:
        return len(self.files)

    @property
    def size(self) -> int:
        return sum(len(v) for v in self.files.values())


def generate(settings: SiteSettings, catalogue: Catalogue, atlas: Mapping[str, PairResults],
             pair_figs: Mapping[str, Sequence[Figure]] | None = None,
             comp_figs: Mapping[str, Figure] | None = None,
             opinions: Mapping[str, SecondOpinion] | None = None,
             selection: PredictedSelection | None = None,
             withheld: Sequence[WithheldPair] = (),
             pair_files: Mapping[str, PairFiles] | None = None
             ) -> tuple[AtlasView, SiteContent]:
    """Every source file of the site, from the computed atlas and its figures (nothing is
    written).  Figures not given are drawn here, in this process (the build draws them
    through its executor, see :mod:`.work`).

    ``opinions`` (:func:`builder.analysis.second_opinion.second_opinions`) adds the
    predictive model's second opinion to the fitted pairs' figures, pages and JSON;
    ``selection`` (:func:`.predicted.select_predicted`) says which pairs of ``atlas`` are
    predictions and why the combinations without a page have none; ``withheld``
    (:func:`.withheld.withheld_pairs`) the fitted pairs left out, each with a notice page;
    ``pair_files`` the pages, downloads and views the workers made of the pairs
    (:mod:`.pair_files`): those of the other pairs are made here.
    """
    opinions = opinions or {}
    selection = selection or PredictedSelection()
    pair_files = pair_files or {}
    view = build_views(settings, catalogue, dict(atlas),
                       {pid: files.view for pid, files in pair_files.items()})
    predicted = frozenset(p.id for p in view.pairs if is_predicted(p, catalogue))
    if pair_figs is None:
        pair_figs = {pid: (predicted_figure(results, settings) if pid in predicted
                           else pair_figures(results, settings, opinions.get(pid)))
                     for pid, results in atlas.items()}
    if comp_figs is None:
        comp_figs = {cid: component_figure(component, settings)
                     for cid, component in catalogue.components.items()}
    content = SiteContent()
    pair_data: dict[str, dict[str, Any]] = {}
    for pv in view.pairs:
        made = pair_files.get(pv.id)
        downloads, pair_data[pv.id] = ((made.downloads, made.data) if made is not None else
                                       pair_downloads(atlas[pv.id], pv, opinions.get(pv.id),
                                                      settings))
        for path, data in downloads:
            content.add(path, data)
        for fig in pair_figs[pv.id]:
            content.add(fig.path, fig.svg)
    for cid in sorted(comp_figs):
        content.add(comp_figs[cid].path, comp_figs[cid].svg)
    content.add("atlas.json", atlas_json(view, catalogue, atlas, pair_data))
    display = Display(settings)
    pages = render_pages(view, pair_figs, comp_figs, {},
                         partners=partner_rows(view, catalogue, atlas,
                                               _reason(selection, withheld)),
                         opinions={pid: opinion_view(o, display) for pid, o in opinions.items()},
                         predicted=predicted, selection=selection, withheld=withheld,
                         rendered={pid: files.page for pid, files in pair_files.items()})
    for path, text in pages.items():
        content.add(path, text)
    return view, content


def _reason(selection: PredictedSelection,
            withheld: Sequence[WithheldPair]) -> Callable[[str, str], str]:
    """Why a combination has no pair page: withheld in this build, or the selection's reason."""
    by_components = {frozenset(c[0] for c in w.components): w for w in withheld}

    def reason(c1: str, c2: str) -> str:
        w = by_components.get(frozenset((c1, c2)))
        return f"withheld in this build: {w.short}" if w else selection.reason(c1, c2)

    return reason
