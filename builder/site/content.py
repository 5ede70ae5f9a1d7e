"""Generation: computed results to the site's source files, engine-independent.

:func:`site_content` renders the pages that read the whole atlas (index,
components, matrix, lists, ``atlas.json``) from one small entry per pair into a
:class:`SiteContent` -- site-relative paths to bytes -- beside each pair's own
files (page, downloads, figures: made by the worker that computed the pair), which
it holds as a :class:`Bundle` to be read when written; it copies nothing to disk.
Only when all of it exists does the assembler write it (:mod:`.assemble`).
:func:`generate` does the workers' part too, in this process.  Paths are checked as
they are added: every part is a safe slug, so no catalogue text can choose where a
file goes.
"""

from __future__ import annotations

import re
from collections.abc import Callable, Iterator, Mapping, Sequence
from dataclasses import dataclass, field

from builder.analysis.results import PairResults
from builder.analysis.second_opinion import SecondOpinion
from builder.catalogue.loader import Catalogue
from builder.site.context import AtlasView, build_views
from builder.site.data import atlas_json
from builder.site.figures import Figure, component_figure, pair_figures
from builder.site.pages import render_pages
from builder.site.pair_entry import PairEntry
from builder.site.pair_files import Files, PairFiles, pair_files
from builder.site.partners import is_predicted, partner_rows
from builder.site.predicted import PredictedSelection
from builder.site.predicted_figures import predicted_figure
from builder.site.settings import SiteSettings
from builder.site.text import UnsafeName
from builder.site.withheld import WithheldPair

__all__ = ["Bundle", "SiteContent", "generate", "site_content"]

#: A site-relative path: slug parts (a pair id may join two slugs by ``--``) and an extension.
_PATH = re.compile(r"^(?:[a-z0-9]+(?:-{1,2}[a-z0-9]+)*/)*[a-z0-9]+(?:-{1,2}[a-z0-9]+)*"
                   r"\.(?:md|svg|csv|json)$")


@dataclass(frozen=True)
class Bundle:
    """A pair's own files (page, downloads, figures), read only when they are written.

    ``key`` says what the files depend on (the pair's cache key): an assembly that
    wrote a bundle of the same key and paths before need not read it again.  An empty
    key is never taken as unchanged.
    """

    key: str
    paths: tuple[str, ...]
    read: Callable[[], Files]


@dataclass
class SiteContent:
    """The generated source of the site: ``{site-relative path: bytes}`` for the pages
    about the whole atlas, and each pair's own files as a :class:`Bundle`."""

    files: dict[str, bytes] = field(default_factory=dict)
    bundles: dict[str, Bundle] = field(default_factory=dict)
    stats: dict[str, int] = field(default_factory=dict)
    _paths: set[str] = field(default_factory=set, repr=False)

    def _claim(self, path: str) -> None:
        if not _PATH.match(path) or ".." in path.split("/"):
            raise UnsafeName(f"refusing to write an unsafe path: {path!r}")
        if path in self._paths:
            raise UnsafeName(f"two generated files would share the path {path!r}")
        self._paths.add(path)
        kind = path.rsplit(".", 1)[1]
        self.stats[kind] = self.stats.get(kind, 0) + 1

    def add(self, path: str, data: bytes | str) -> None:
        self._claim(path)
        self.files[path] = data.encode("utf-8") if isinstance(data, str) else data

    def add_bundle(self, name: str, bundle: Bundle) -> None:
        """A pair's files, to be read when the assembler writes them."""
        if name in self.bundles:
            raise UnsafeName(f"two bundles of files share the name {name!r}")
        for path in bundle.paths:
            self._claim(path)
        self.bundles[name] = bundle

    def __iter__(self) -> Iterator[tuple[str, bytes]]:
        return iter(sorted(self.files.items()))

    def __len__(self) -> int:
        return len(self._paths)


def generate(settings: SiteSettings, catalogue: Catalogue, atlas: Mapping[str, PairResults],
             pair_figs: Mapping[str, Sequence[Figure]] | None = None,
             comp_figs: Mapping[str, Figure] | None = None,
             opinions: Mapping[str, SecondOpinion] | None = None,
             selection: PredictedSelection | None = None,
             withheld: Sequence[WithheldPair] = ()) -> tuple[AtlasView, SiteContent]:
    """Every source file of the site from computed results, in this process (nothing is
    written): each pair's files as its worker makes them (:func:`.pair_files.pair_files`;
    figures not given are drawn here), then the atlas-wide pages (:func:`site_content`).
    The build makes the pairs' files in its workers instead (:mod:`.work`).

    ``opinions`` (:func:`builder.analysis.second_opinion.second_opinions`) adds the
    predictive model's second opinion to the fitted pairs' figures, pages and JSON;
    ``selection`` (:func:`.predicted.select_predicted`) says which pairs of ``atlas`` are
    predictions (they are not entries of ``catalogue``) and why the combinations without
    a page have none; ``withheld`` (:func:`.withheld.withheld_pairs`) the fitted pairs left
    out, each with a notice page.
    """
    opinions = opinions or {}
    made: dict[str, PairFiles] = {}
    for pid, results in atlas.items():
        predicted = pid not in catalogue.pairs
        figures = (pair_figs[pid] if pair_figs is not None else
                   predicted_figure(results, settings) if predicted else
                   pair_figures(results, settings, opinions.get(pid)))
        made[pid] = pair_files(catalogue, results, figures, opinions.get(pid), settings,
                               predicted)
    if comp_figs is None:
        comp_figs = {cid: component_figure(component, settings)
                     for cid, component in catalogue.components.items()}
    view, content = site_content(settings, catalogue, {pid: m.entry for pid, m in made.items()},
                                 comp_figs, selection=selection, withheld=withheld)
    for pid in sorted(made):
        for path, data in made[pid].files:
            content.add(path, data)
    return view, content


def site_content(settings: SiteSettings, catalogue: Catalogue,
                 entries: Mapping[str, PairEntry], comp_figs: Mapping[str, Figure],
                 selection: PredictedSelection | None = None,
                 withheld: Sequence[WithheldPair] = (),
                 bundles: Mapping[str, Bundle] | None = None) -> tuple[AtlasView, SiteContent]:
    """The pages and files that read the whole atlas, from the pairs' entries
    (:mod:`.pair_entry`), and the pairs' own files as ``bundles`` (pair id -> its files,
    read when written: :mod:`.assemble`).  Pairs of ``entries`` that are not entries of
    ``catalogue`` are predictions."""
    selection = selection or PredictedSelection()
    view = build_views(settings, catalogue, entries)
    predicted = frozenset(p.id for p in view.pairs if is_predicted(p, catalogue))
    content = SiteContent()
    for pid, bundle in sorted((bundles or {}).items()):
        content.add_bundle(pid, bundle)
    for cid in sorted(comp_figs):
        content.add(comp_figs[cid].path, comp_figs[cid].svg)
    content.add("atlas.json", atlas_json(view, catalogue))
    pages = render_pages(view, comp_figs, {},
                         partners=partner_rows(view, catalogue, _reason(selection, withheld)),
                         predicted=predicted, selection=selection, withheld=withheld)
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
