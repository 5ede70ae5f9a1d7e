"""Page views: the computed results turned into display-ready, plain data.

:func:`build_views` gathers the view of the atlas-wide pages before anything is
rendered: component pages (:mod:`.component_view`) and one entry per pair
(:mod:`.pair_entry`: its index row, :mod:`.index_view`, and what the other pages
list), with the behaviour classification of :mod:`.behaviour` and the unit
formatting of :mod:`.display`; a pair's own page is made from its view
(:mod:`.pair_view`) in the worker that computed it (:mod:`.pair_files`).  Nothing here
computes thermodynamics: every number is read from the results (one typed
record, :mod:`builder.analysis.record`, whose every field exists; a section
is left out where its field is ``None`` by its documented meaning) and the
catalogue records.  The names below are re-exported for the rest of the site
package.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field, replace

from builder.catalogue.loader import Catalogue
from builder.site.behaviour import BEHAVIOURS, behaviour, summary_condition
from builder.site.component_view import ComponentView, component_view
from builder.site.display import Display, Matrix, Row, matrix
from builder.site.index_view import IndexRow
from builder.site.pair_entry import PairEntry
from builder.site.pair_view import ConditionView, PairView, condition_slug
from builder.site.settings import SiteSettings
from builder.site.text import one_line

__all__ = [
    "BEHAVIOURS",
    "AtlasView",
    "ComponentView",
    "ConditionView",
    "Display",
    "IndexRow",
    "Matrix",
    "PairEntry",
    "PairView",
    "Row",
    "behaviour",
    "build_views",
    "condition_slug",
    "matrix",
    "summary_condition",
]


@dataclass(frozen=True)
class AtlasView:
    """Everything the atlas-wide pages need, computed and formatted before anything is
    written: one :class:`~.pair_entry.PairEntry` per pair (its own page is made apart,
    :mod:`.pair_files`), every component's view, the references and models."""

    settings: SiteSettings
    pairs: tuple[PairEntry, ...]
    components: tuple[ComponentView, ...]
    references: tuple[tuple[str, str], ...]  # (id, citation)
    models: tuple[str, ...]
    behaviours: tuple[tuple[str, str], ...] = field(default=())


def build_views(settings: SiteSettings, catalogue: Catalogue,
                entries: Mapping[str, PairEntry]) -> AtlasView:
    """The atlas-wide view, from the catalogue and the pairs' entries.

    Each entry gets this atlas's views of its two components (which list all their
    pairs) in place of the worker's (which list that pair alone).
    """
    display = Display(settings)
    ordered = [entries[pid] for pid in sorted(entries)]
    components = {cid: component_view(catalogue, catalogue.components[cid], display, ordered)
                  for cid in sorted(catalogue.components)}
    pairs = tuple(replace(e, c1=components[e.c1.id], c2=components[e.c2.id]) for e in ordered)
    cited = sorted(catalogue.references.items())
    return AtlasView(
        settings=settings, pairs=pairs,
        components=tuple(components.values()),
        references=tuple((rid, one_line(ref.citation())) for rid, ref in cited),
        models=tuple(sorted({e.model_name for e in ordered})),
        behaviours=tuple((k, v) for k, v in BEHAVIOURS.items()
                         if any(p.behaviour == k for p in pairs)),
    )
