"""The index page's rows as compact data, for the script that lists them (assets/js/atlas-index.js).

A full atlas has thousands of pairs: written out as HTML rows the index weighs megabytes
and takes seconds to open.  The page carries instead one inline
``<script type="application/json" id="atlas-index-data">`` block (inline, because a
page opened from ``file://`` may not ``fetch`` a file beside it), and the script renders
one page of rows at a time, filtering and sorting on the data.

The block holds only what a row shows and what the filters read:

``components``
    ``[id, name, boiling point as printed, boiling point (sort key), search text]``
    once per component (names, CAS numbers, formulas and synonyms are not repeated for
    each of a component's pairs);
``rows``
    one list per pair, in the order of :data:`ROW_FIELDS`: components as indices into
    ``components``, behaviour, model and data quality as indices into their own lists,
    printed cells as text and sort keys as numbers (``null``: no value, sorted last).

Every text is the one the page printed before (the :class:`.index_view.IndexRow` and
:class:`.opinion.OpinionView` of each pair); the script sets it as text, never as markup.
"""

from __future__ import annotations

import json
import math
from collections.abc import Mapping, Set
from typing import Any

from markupsafe import Markup

from builder.site.behaviour import BEHAVIOURS
from builder.site.context import AtlasView
from builder.site.opinion import OpinionView
from builder.site.text import fmt

__all__ = ["PAIR_PAGE", "ROW_FIELDS", "index_data", "index_script"]

#: A pair's page, from its id (the page URL convention of :func:`.pages.page_url`).
PAIR_PAGE = ("pairs/", ".html")

#: The fields of one row, in order (the script reads them by position).
ROW_FIELDS = ("id", "component1", "component2", "behaviour", "azeotrope_T",
              "azeotrope_T_sort", "azeotrope_x1", "azeotrope_x1_sort", "alpha_range",
              "alpha_sort", "model", "quality", "predicted", "opinion", "opinion_sort",
              "opinion_differs")


def _key(value: float | None) -> float | None:
    """A sort key: rounded (a shorter file), ``None`` for a missing value."""
    if value is None or math.isnan(value):
        return None
    return round(value, 6)


def _indexer(values: list[str]) -> Any:
    where: dict[str, int] = {}

    def index(value: str) -> int:
        if value not in where:
            where[value] = len(values)
            values.append(value)
        return where[value]

    return index


def index_data(view: AtlasView, opinions: Mapping[str, OpinionView],
               predicted: Set[str]) -> dict[str, Any]:
    """The rows of the index page as plain data (see the module docstring)."""
    components: list[list[Any]] = []
    position: dict[str, int] = {}
    for c in view.components:
        position[c.id] = len(components)
        text = " ".join([c.id, c.name, c.cas, c.formula, *c.synonyms]).lower()
        components.append([c.id, c.name, fmt(c.boiling_value, 1, fixed=True),
                           _key(c.boiling_value), text])
    behaviours = [[k, v] for k, v in BEHAVIOURS.items()]
    behaviour_at = {k: i for i, (k, _label) in enumerate(behaviours)}
    models: list[str] = []
    qualities: list[str] = []
    model_at, quality_at = _indexer(models), _indexer(qualities)
    rows: list[list[Any]] = []
    for p in view.pairs:
        if p.url != f"{PAIR_PAGE[0]}{p.id}.md":
            raise ValueError(f"pair page {p.url!r} does not follow the page convention of "
                             f"the index data ({PAIR_PAGE[0]}<id>.md)")
        r = p.index
        if p.title != f"{p.c1.name} + {p.c2.name}":
            raise ValueError(f"pair title {p.title!r} is not its component names")
        op = opinions.get(p.id)
        rows.append([
            p.id, position[r.component_ids[0]], position[r.component_ids[1]],
            behaviour_at[r.behaviour], r.azeotrope_T, _key(r.azeotrope_T_sort),
            r.azeotrope_x1, _key(r.azeotrope_x1_sort), r.alpha_range, _key(r.alpha_sort),
            model_at(r.model), quality_at(r.quality), 1 if p.id in predicted else 0,
            op.short if op else "—", _key(op.dT_sort) if op else None,
            1 if op is not None and not op.agrees else 0])
    return {"fields": list(ROW_FIELDS), "page": list(PAIR_PAGE), "components": components,
            "behaviours": behaviours, "models": models, "qualities": qualities,
            "rows": rows}


#: Characters that could end the script element or open a comment inside it.
_SCRIPT_SAFE = str.maketrans({"<": "\\u003c", ">": "\\u003e", "&": "\\u0026",
                              "\u2028": "\\u2028", "\u2029": "\\u2029"})


def index_script(data: Mapping[str, Any]) -> Markup:
    """The inline ``<script type="application/json">`` block holding ``data``.

    JSON with ``<``, ``>`` and ``&`` escaped, so no catalogue text can close the element;
    on one line, so the Markdown engine passes it through as one raw-HTML block.
    """
    text = json.dumps(data, ensure_ascii=False, separators=(",", ":"), allow_nan=False)
    return Markup('<script type="application/json" id="atlas-index-data">'
                  f"{text.translate(_SCRIPT_SAFE)}</script>")
