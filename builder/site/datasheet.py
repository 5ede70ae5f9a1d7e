"""The printed datasheet of a pair: what one A4 or Letter page carries to a meeting.

A pair page prints as one sheet (the print stylesheet of
``site_templates/assets/css/atlas.css`` hides everything else): the summary
box, the Txy diagram at the summary pressure and the xy diagram, the
azeotropes of every condition, the relative volatility and the distillation
quick look at the summary pressure, the page's warnings and the caution with
the hazard notes.  This module picks those parts out of a
:class:`~.context.PairView`; it reads views only and formats nothing new.
"""

from __future__ import annotations

from dataclasses import dataclass

from builder.site.context import ConditionView, PairView, Row

__all__ = ["Datasheet", "datasheet"]

#: The α rows of a condition shown on the sheet (labels as :mod:`.context` writes them).
_ALPHA_LABELS = ("α12 at infinite dilution of 1 (x1 → 0)",
                 "α12 at infinite dilution of 2 (x1 → 1)", "Smallest α12", "Largest α12")


@dataclass(frozen=True)
class Datasheet:
    """The parts of one pair page that print on its one-page datasheet."""

    condition: ConditionView | None  # the summary isobar (else the first condition)
    figure_slug: str  # the slug of its phase diagram ("" if none)
    alpha: tuple[Row, ...]
    quicklook: tuple[Row, ...]
    url: str  # the page's own address in the atlas, printed in the footer


def _summary_condition(pair: PairView) -> ConditionView | None:
    for c in pair.conditions:
        if c.kind == "isobar" and pair.summary_label and c.label == pair.summary_label:
            return c
    return pair.conditions[0] if pair.conditions else None


def datasheet(pair: PairView) -> Datasheet:
    """The datasheet parts of ``pair`` (a pair publishing no condition has only its summary)."""
    c = _summary_condition(pair)
    alpha = tuple(r for r in c.alpha if r.label in _ALPHA_LABELS) if c is not None else ()
    return Datasheet(condition=c, figure_slug=c.slug if c is not None else "", alpha=alpha,
                     quicklook=c.quicklook if c is not None else (),
                     url=pair.url[:-3] + ".html" if pair.url.endswith(".md") else pair.url)
