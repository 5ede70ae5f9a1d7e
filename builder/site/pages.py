"""Markdown pages from the jinja2 templates of ``site_templates/pages/``.

The environment escapes every value a template prints with :func:`.text.escape`
(HTML, attribute and Markdown syntax alike), so catalogue text reaches the
page as text only.  Code that means to insert markup builds it as
:class:`markupsafe.Markup` itself; templates have no ``|safe``.

Pages are written as Markdown with raw-HTML blocks for the summary box,
figures and tables (Markdown does not parse inside them).  The one thing the
pages assume of the static-site engine is the page-URL convention:
``pairs/x.md`` is published as ``pairs/x.html`` (:func:`page_url`).
"""

from __future__ import annotations

import math
import posixpath
from collections.abc import Mapping, Sequence, Set
from typing import Any

import jinja2
from markupsafe import Markup

from builder.site import TEMPLATES
from builder.site.context import (
    BEHAVIOURS,
    AtlasView,
    ComponentView,
    Display,
    PairEntry,
    PairView,
)
from builder.site.datasheet import datasheet
from builder.site.figures import Figure
from builder.site.index_data import index_data, index_script
from builder.site.matrix import behaviour_matrix, family_starts
from builder.site.opinion import OpinionView, fitted_events
from builder.site.partners import NO_PAGE, PartnerRow, Partners
from builder.site.predicted import PredictedSelection
from builder.site.text import escape, fmt
from builder.site.withheld import WithheldPair

__all__ = ["environment", "page_url", "pair_page", "render_pages"]


def page_url(path: str) -> str:
    """The published URL of a generated page (``pairs/x.md`` -> ``pairs/x.html``)."""
    return path[:-3] + ".html" if path.endswith(".md") else path


def _finalize(value: Any) -> Markup:
    return escape("" if value is None else value)


def environment() -> jinja2.Environment:
    env = jinja2.Environment(
        loader=jinja2.FileSystemLoader(str(TEMPLATES / "pages")),
        autoescape=True, finalize=_finalize, undefined=jinja2.StrictUndefined,
        trim_blocks=True, lstrip_blocks=True, keep_trailing_newline=True,
    )
    env.filters["fmt"] = fmt
    env.filters["count"] = _count
    env.filters["sortkey"] = _sortkey
    env.globals["nan"] = math.nan
    return env


def _count(value: int) -> str:
    """A count for reading, its thousands grouped as the index page's script groups them.

    >>> _count(3680), _count(88)
    ('3,680', '88')
    """
    return f"{value:,}"


def _sortkey(value: float) -> str:
    """A numeric sort key for table cells (missing values sort last)."""
    return "999999" if math.isnan(value) else f"{value:.6f}"


def _relative(here: str) -> Any:
    base = posixpath.dirname(here)

    def rel(target: str) -> Markup:
        url = posixpath.relpath(page_url(target), base or ".")
        return Markup(url)  # paths are made of safe slugs only (checked in .content)

    return rel


def render_pages(view: AtlasView, component_figures: Mapping[str, Figure],
                 methods_context: Mapping[str, Any], partners: Partners | None = None,
                 predicted: Set[str] = frozenset(),
                 selection: PredictedSelection | None = None,
                 withheld: Sequence[WithheldPair] = ()) -> dict[str, str]:
    """Every page that reads the whole atlas: ``{site-relative .md path: Markdown text}``
    (the pair pages are made with each pair's work, :mod:`.pair_files`).

    ``partners`` (:func:`.partners.partner_rows`) adds each component's partner table
    and the behaviour matrix page; ``predicted`` names the pairs whose pages rest on a
    prediction and ``selection`` adds the page listing the combinations that cannot be
    predicted; ``withheld`` (:mod:`.withheld`) the notice of each withheld fitted pair,
    listed in the index.  The index shows each fitted pair's second opinion from its entry.
    """
    env = environment()
    at = Display(view.settings).P(view.settings.summary_pressure_Pa, 6)
    pages: dict[str, str] = {}
    opinions = {p.id: p.opinion for p in view.pairs if p.opinion is not None}

    def render(template: str, path: str, **context: Any) -> None:
        pages[path] = env.get_template(template).render(
            site=view.settings, atlas=view, rel=_relative(path), here=path, **context)

    render("index.md.j2", "index.md", opinions=opinions, predicted=predicted,
           withheld=withheld,
           index_script=index_script(index_data(view, opinions, predicted)))
    render("components.md.j2", "components/index.md")
    render("methods.md.j2", "methods.md", **methods_context)
    render("catalogue.md.j2", "catalogue.md")
    for w in withheld:
        render("withheld.md.j2", w.url, w=w)
    for component in view.components:
        rows = (partners or {}).get(component.id, ())
        render("component.md.j2", component.url, c=component,
               figure=component_figures.get(component.id), pairs_of=_pairs_of(view, component),
               partners=rows, at=at, partner_behaviours=_behaviours(rows))
    if selection is not None:
        names = {c.id: c.name for c in view.components}
        render("unpredictable.md.j2", "unpredictable.md", selection=selection, names=names,
               predicted_count=len(predicted))
    if partners is not None:
        mx = behaviour_matrix(view, partners)
        render("matrix.md.j2", "matrix.md", mx=mx, at=at, starts=family_starts(mx.groups))
    return pages


def pair_page(env: jinja2.Environment, pair: PairView, figures: Sequence[Figure],
              op: OpinionView | None, is_predicted: bool, settings: Any) -> str:
    """One pair page: it reads this pair alone (see :mod:`.pair_page`), not the atlas."""
    return env.get_template("pair.md.j2").render(
        site=settings, rel=_relative(pair.url), here=pair.url, p=pair, sheet=datasheet(pair),
        figures=_grouped(figures), op=op, fitted_events=fitted_events(pair.trace_events),
        is_predicted=is_predicted)


def _behaviours(rows: Sequence[PartnerRow]) -> list[tuple[str, str]]:
    keys = {r.behaviour for r in rows}
    out = [(k, v) for k, v in BEHAVIOURS.items() if k in keys]
    return out + ([(NO_PAGE, "no page")] if NO_PAGE in keys else [])


def _grouped(figures: Sequence[Figure]) -> dict[str, Any]:
    by_slug = {f.slug: f for f in figures if f.group == "condition"}
    others = {f.group: f for f in figures if f.group != "condition"}
    return {"condition": by_slug, **others}


def _pairs_of(view: AtlasView, component: ComponentView) -> list[PairEntry]:
    return [p for p in view.pairs if component.id in (p.c1.id, p.c2.id)]
