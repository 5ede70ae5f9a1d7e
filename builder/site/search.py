"""The site's search index: compact, written by the atlas rather than by the theme.

The theme's search plugin would index the whole text of every page, tables
included: megabytes for a few hundred pairs.  Every generated page is left
out of it (``search: exclude: true`` in its front matter) and this module
writes the index the theme's search reads instead, one entry per page:

* a pair: its title, both names, synonyms, CAS numbers (as printed and as
  the one-token search key ``cas67663`` that ``assets/js/atlas-search.js``
  rewrites a typed CAS number to), formulas, model and the one-sentence
  summary;
* a component: name, synonyms (also as the entry's tags, which the theme weighs like
  the title and shows under the result), CAS number and key, formula, boiling point,
  weighed :data:`COMPONENT_BOOST` times a pair's entry;
* the index, components, methods and catalogue pages: title and lead (the
  methods page with its section headings).

The format is the theme's (``{"config": ..., "docs": [{"location", "title",
"text"}]}``); ``config`` (language, separator, pipeline) is kept from the
index the plugin wrote, so the query parsing stays the theme's.  Both
``search/search_index.json`` (read over http) and ``search/search_index.js``
(the same, assigned to a global, read from file://) are written.
"""

from __future__ import annotations

import html
import json
import re
from pathlib import Path
from typing import Any

from builder.site.context import AtlasView
from builder.site.pages import page_url

__all__ = ["COMPONENT_BOOST", "search_documents", "write_search_index"]

#: How much more a component's page weighs in the search than a pair's.
COMPONENT_BOOST = 5.0

_HEADING = re.compile(r"^#{1,3}\s+(.+)$", re.MULTILINE)


def _entry(location: str, title: str, *parts: str, boost: float = 1.0,
           tags: tuple[str, ...] = ()) -> dict[str, Any]:
    """One entry; the theme inserts title, text and tags as HTML, so each is escaped."""
    text = " ".join(p for p in parts if p)
    entry: dict[str, Any] = {"location": location, "title": html.escape(title, quote=False),
                             "text": html.escape(text, quote=False)}
    if boost != 1.0:
        entry["boost"] = boost  # the theme's search weighs the whole entry by it
    if tags:
        entry["tags"] = [html.escape(tag, quote=False) for tag in tags]
    return entry


def search_documents(view: AtlasView, methods_markdown: str = "") -> list[dict[str, Any]]:
    """One search entry per page, in a fixed order (pages, components, pairs)."""
    docs = [
        _entry("index.html", view.settings.title, view.settings.description,
               f"{len(view.pairs)} pairs of {len(view.components)} components."),
        _entry("components/index.html", "Components",
               "Every component: CAS number, formula, boiling point, synonyms."),
        _entry("methods.html", "Methods", *(_HEADING.findall(methods_markdown))),
        _entry("catalogue.html", "Catalogue: checks and sources",
               "Every pair's reference checks and every source."),
    ]
    for c in view.components:
        # A component's own page comes before the pairs that name it (each pair of
        # chloroform names chloroform too): its entry weighs more; its synonyms are its
        # tags (shown under the result, and weighed like the title).
        docs.append(_entry(page_url(c.url), c.name, ", ".join(c.synonyms),
                           f"CAS {c.cas}", c.search_key, c.formula,
                           f"normal boiling point {c.boiling_point}.", boost=COMPONENT_BOOST,
                           tags=c.synonyms))
    for p in view.pairs:
        names = []
        for c in (p.c1, p.c2):
            names += [c.name, *c.synonyms, c.cas, c.search_key, c.formula]
        docs.append(_entry(page_url(p.url), p.title, " ".join(names), p.model, p.sentence))
    return docs


def write_search_index(site_dir: Path, docs: list[dict[str, Any]]) -> int:
    """Replace the theme's index in ``site_dir/search`` by ``docs``; the size in bytes."""
    folder = site_dir / "search"
    written = folder / "search_index.json"
    config: dict[str, Any] = {"lang": ["en"], "separator": r"[\s\-]+", "pipeline": []}
    if written.is_file():
        config = json.loads(written.read_text(encoding="utf-8")).get("config", config)
    folder.mkdir(parents=True, exist_ok=True)
    text = json.dumps({"config": config, "docs": docs}, ensure_ascii=False,
                      separators=(",", ":"))
    written.write_text(text, encoding="utf-8")
    (folder / "search_index.js").write_text(f"var __index = {text}", encoding="utf-8")
    return len(text.encode("utf-8"))
