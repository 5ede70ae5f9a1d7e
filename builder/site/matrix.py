"""The behaviour matrix: every component against every other, at the summary pressure.

One table, components grouped by chemical family (:mod:`.families`) and by normal
boiling point within a family; each cell is the behaviour class of the pair
(the partner rows of :mod:`.partners`), linked to the pair page.  The design is
the atlas's own and reads without colour: every class has its own symbol (the
same marks as the index), the background tint only repeats it, a fitted set is
outlined and a prediction is not, and a combination without a page shows a cross
and says why in its tooltip.  The page stays light at 80 x 80 components: CSS
classes only, no inline styles, no script needed to read it.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

from builder.site.context import BEHAVIOURS, AtlasView, ComponentView
from builder.site.families import FAMILIES
from builder.site.partners import NO_PAGE, NOT_BUILT, Partners

__all__ = ["MARKS", "BehaviourMatrix", "MatrixCell", "behaviour_matrix", "family_starts"]

#: Behaviour key -> (CSS class suffix, symbol, legend text).  The atlas's own marks:
#: a triangle pointing to the boiling-point extreme of an azeotrope (down: minimum,
#: up: maximum), half-filled circles for two liquids, an open circle for none.
MARKS: dict[str, tuple[str, str, str]] = {
    "zeotropic": ("z", "○", BEHAVIOURS["zeotropic"]),
    "minimum-boiling": ("mn", "▼", BEHAVIOURS["minimum-boiling"]),
    "maximum-boiling": ("mx", "▲", BEHAVIOURS["maximum-boiling"]),
    "heterogeneous": ("ht", "◐", BEHAVIOURS["heterogeneous"]),
    "liquid-split": ("ls", "◑", BEHAVIOURS["liquid-split"]),
    "several": ("sv", "◆", BEHAVIOURS["several"]),
    "uncertain": ("un", "?", BEHAVIOURS["uncertain"]),
    "not-published": ("np", "–", BEHAVIOURS["not-published"]),
    NO_PAGE: ("no", "×", "no page: not part of this build, or cannot be predicted (point "
              "at the cell for the reason)"),
}


@dataclass(frozen=True)
class MatrixCell:
    css: str  # class list
    symbol: str
    url: str  # site-relative .md path of the pair page, "" when there is none
    title: str  # the pair and its class in words (tooltip)


@dataclass(frozen=True)
class MatrixRow:
    component: ComponentView
    family: str  # key of FAMILIES
    family_label: str
    cells: tuple[MatrixCell, ...]


@dataclass(frozen=True)
class BehaviourMatrix:
    columns: tuple[ComponentView, ...]
    groups: tuple[tuple[str, int], ...]  # (family heading, number of components) in order
    rows: tuple[MatrixRow, ...]
    legend: tuple[tuple[str, str, str], ...]  # (css class, symbol, meaning)
    counts: tuple[tuple[str, int], ...]  # (meaning, number of combinations)


def _order(view: AtlasView, partners: Partners) -> list[tuple[str, ComponentView]]:
    """Components in family order (the order of any component's partner list)."""
    families: dict[str, str] = {}
    for rows in partners.values():
        for row in rows:
            families[row.partner.id] = row.family
    order = {key: i for i, key in enumerate(FAMILIES)}
    comps = sorted(view.components, key=lambda c: (order[families.get(c.id, "other")],
                                                   c.boiling_value, c.name))
    return [(families.get(c.id, "other"), c) for c in comps]


def behaviour_matrix(view: AtlasView, partners: Partners) -> BehaviourMatrix:
    """The matrix of every component pair's behaviour class, grouped by family."""
    ordered = _order(view, partners)
    groups: list[tuple[str, int]] = []
    for fam, _c in ordered:
        if groups and groups[-1][0] == FAMILIES[fam]:
            groups[-1] = (groups[-1][0], groups[-1][1] + 1)
        else:
            groups.append((FAMILIES[fam], 1))
    starts = set(family_starts(groups))
    counts: dict[str, int] = {}
    rows = []
    for fam, this in ordered:
        by_partner = {r.partner.id: r for r in partners.get(this.id, ())}
        cells: list[MatrixCell] = []
        for j, (_f, other) in enumerate(ordered):
            edge = " e" if j in starts else ""
            if other.id == this.id:
                cells.append(MatrixCell(css="s" + edge, symbol="", url="", title=""))
                continue
            row = by_partner.get(other.id)
            key = row.behaviour if row is not None else NO_PAGE
            css, symbol, _text = MARKS.get(key, MARKS["uncertain"])
            origin = row.origin if row is not None else "none"
            fitted = " f" if origin == "fitted" else ""
            # The row and column name the pair and the symbol its class: only a cell that
            # cannot be predicted carries words (why), which keeps an 80 x 80 page light.
            title = (row.behaviour_label if row is not None and not row.has_page
                     and row.reason != NOT_BUILT else "")
            cells.append(MatrixCell(css=f"m{css}{fitted}{edge}", symbol=symbol,
                                    url=row.pair_url if row is not None else "", title=title))
            if this.id < other.id:
                counts[key] = counts.get(key, 0) + 1
        rows.append(MatrixRow(component=this, family=fam, family_label=FAMILIES[fam],
                              cells=tuple(cells)))
    legend = tuple((f"m{css}", symbol, text) for key, (css, symbol, text) in MARKS.items())
    return BehaviourMatrix(
        columns=tuple(c for _f, c in ordered), groups=tuple(groups), rows=tuple(rows),
        legend=legend,
        counts=tuple((MARKS[k][2], counts[k]) for k in MARKS if counts.get(k)))


def family_starts(groups: Sequence[tuple[str, int]]) -> list[int]:
    """Index of the first component of each family (for tests and templates)."""
    out, i = [], 0
    for _label, n in groups:
        out.append(i)
        i += n
    return out
