"""Page views: the computed results turned into display-ready, plain data.

:func:`build_views` gathers every page's view before anything is rendered:
component pages (:mod:`.component_view`), pair pages (:mod:`.pair_view`),
the index rows (:mod:`.index_view`), with the behaviour classification of
:mod:`.behaviour` and the unit formatting of :mod:`.display`.  Nothing here
computes thermodynamics: every number is read from the results (one typed
record, :mod:`builder.analysis.record`, whose every field exists; a section
is left out where its field is ``None`` by its documented meaning) and the
catalogue records.  The names below are re-exported for the rest of the site
package.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field, replace

from builder.analysis.results import PairResults
from builder.catalogue.loader import Catalogue
from builder.site.behaviour import BEHAVIOURS, behaviour, summary_condition
from builder.site.component_view import ComponentView, component_view
from builder.site.display import Display, Matrix, Row, matrix
from builder.site.index_view import IndexRow
from builder.site.pair_view import ConditionView, PairView, condition_slug, pair_view
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
    """Everything the pages need, computed and formatted before anything is written."""

    settings: SiteSettings
    pairs: tuple[PairView, ...]
    components: tuple[ComponentView, ...]
    references: tuple[tuple[str, str], ...]  # (id, citation)
    models: tuple[str, ...]
    behaviours: tuple[tuple[str, str], ...] = field(default=())


def build_views(settings: SiteSettings, catalogue: Catalogue,
                atlas: dict[str, PairResults],
                made: Mapping[str, PairView] | None = None) -> AtlasView:
    """Every page's data, from the catalogue and the computed results.

    ``made`` holds pair views the workers built (:mod:`.pair_files`): each gets this
    atlas's views of its two components (which list all their pairs); the other pair
    views are built here.
    """
    made = made or {}
    display = Display(settings)
    pairs = [atlas[pid].pair for pid in sorted(atlas)]
    components = {cid: component_view(catalogue, catalogue.components[cid], display, pairs)
                  for cid in sorted(catalogue.components)}
    pair_views = tuple(
        replace(made[pid], c1=components[made[pid].c1.id], c2=components[made[pid].c2.id])
        if pid in made else pair_view(catalogue, atlas[pid], components, display, settings)
        for pid in sorted(atlas))
    cited = sorted(catalogue.references.items())
    return AtlasView(
        settings=settings, pairs=pair_views,
        components=tuple(components.values()),
        references=tuple((rid, one_line(ref.citation())) for rid, ref in cited),
        models=tuple(sorted({r.pair.model.name for r in atlas.values()})),
        behaviours=tuple((k, v) for k, v in BEHAVIOURS.items()
                         if any(p.behaviour == k for p in pair_views)),
    )
