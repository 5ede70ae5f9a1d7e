"""Solvent screening: every partner of a component, side by side.

For each catalogued component, one row per other catalogued component: how the
two behave at the summary pressure (the behaviour class of the pair's summary
isobar), the azeotrope's temperature and composition written for *this*
component, the relative volatility of this component over the partner along the
bubble line, and whether the pair page rests on a fitted (catalogued) set or on
a prediction.  A combination without a page says why.

The rows are read from the pairs' entries (:mod:`.pair_entry`); nothing here computes
thermodynamics.  The component page prints
them as a sortable, filterable table (:file:`component.md.j2`), and the behaviour
matrix (:mod:`.matrix`) is drawn from the same rows.
"""

from __future__ import annotations

import math
from collections.abc import Callable, Mapping, Sequence
from dataclasses import dataclass

from builder.catalogue.loader import Catalogue
from builder.site.context import BEHAVIOURS, AtlasView, ComponentView, PairEntry
from builder.site.families import FAMILIES, family
from builder.site.text import fmt

__all__ = ["NOT_BUILT", "NO_PAGE", "PartnerRow", "Partners", "is_predicted", "partner_rows"]

#: The behaviour key of a combination that has no page (the reason is given beside it).
NO_PAGE = "no-page"

#: Why a combination has no page: ``(component id, component id) -> reason``.
Reason = Callable[[str, str], str]


#: The reason of a combination whose predicted page this build leaves out.
NOT_BUILT = "no fitted set; predicted pages are not part of this build"


def no_fitted_set(_c1: str, _c2: str) -> str:
    """The reason when the build makes pages for catalogued (fitted) sets only."""
    return NOT_BUILT


def is_predicted(pair: PairEntry, catalogue: Catalogue) -> bool:
    """Whether a pair page rests on a prediction (the pair is not a catalogue entry)."""
    return pair.id not in catalogue.pairs


@dataclass(frozen=True)
class PartnerRow:
    """One partner of a component, as its screening table shows it."""

    partner: ComponentView
    family: str  # key of FAMILIES
    family_label: str
    pair_url: str  # site-relative .md path of the pair page, "" when there is none
    pair_title: str
    behaviour: str  # key of BEHAVIOURS, or NO_PAGE
    behaviour_label: str
    azeotrope_T: str  # in the site's temperature unit, "—" when there is none
    azeotrope_T_sort: float
    azeotrope_x: str  # mole fraction of the component whose page this is
    azeotrope_x_sort: float
    alpha_range: str  # α of this component over the partner (smallest – largest)
    alpha_sort: float
    origin: str  # "fitted", "predicted" or "none"
    origin_label: str
    reason: str = ""  # why there is no page ("" when there is one)

    @property
    def has_page(self) -> bool:
        return bool(self.pair_url)


#: component id -> its partner rows (every other catalogued component).
Partners = Mapping[str, Sequence[PartnerRow]]


def _alpha_of(component_is_first: bool, pair: PairEntry) -> tuple[str, float]:
    if pair.alpha_summary is None:
        return "—", math.nan
    lo, hi = pair.alpha_summary
    if not component_is_first:  # α21 = 1 / α12
        lo, hi = 1.0 / hi, 1.0 / lo
    return f"{fmt(lo, 3)} – {fmt(hi, 3)}", lo


def partner_rows(view: AtlasView, catalogue: Catalogue,
                 reason: Reason = no_fitted_set) -> dict[str, tuple[PartnerRow, ...]]:
    """Every component's partner rows, partners ordered by family and boiling point."""
    by_ids: dict[frozenset[str], PairEntry] = {frozenset((p.c1.id, p.c2.id)): p
                                              for p in view.pairs}
    families = {c.id: family(catalogue.components[c.id]) for c in view.components}
    order = {key: i for i, key in enumerate(FAMILIES)}
    ordered = sorted(view.components,
                     key=lambda c: (order[families[c.id]], c.boiling_value, c.name))
    out: dict[str, tuple[PartnerRow, ...]] = {}
    for this in view.components:
        rows = []
        for other in ordered:
            if other.id == this.id:
                continue
            pair = by_ids.get(frozenset((this.id, other.id)))
            fam = families[other.id]
            if pair is None:
                rows.append(PartnerRow(
                    partner=other, family=fam, family_label=FAMILIES[fam], pair_url="",
                    pair_title=f"{this.name} + {other.name}", behaviour=NO_PAGE,
                    behaviour_label="no page: " + reason(this.id, other.id),
                    azeotrope_T="—", azeotrope_T_sort=math.nan, azeotrope_x="—",
                    azeotrope_x_sort=math.nan, alpha_range="—", alpha_sort=math.nan,
                    origin="none", origin_label="—", reason=reason(this.id, other.id)))
                continue
            first = pair.c1.id == this.id
            r = pair.index
            x = r.azeotrope_x1_sort
            if not first and math.isfinite(x):
                x = 1.0 - x
            alpha, alpha_sort = _alpha_of(first, pair)
            predicted = is_predicted(pair, catalogue)
            rows.append(PartnerRow(
                partner=other, family=fam, family_label=FAMILIES[fam], pair_url=pair.url,
                pair_title=pair.title, behaviour=r.behaviour,
                behaviour_label=BEHAVIOURS.get(r.behaviour, r.behaviour),
                azeotrope_T=r.azeotrope_T, azeotrope_T_sort=r.azeotrope_T_sort,
                azeotrope_x=fmt(x, 3) if math.isfinite(x) else "—", azeotrope_x_sort=x,
                alpha_range=alpha, alpha_sort=alpha_sort,
                origin="predicted" if predicted else "fitted",
                origin_label=f"{'predicted' if predicted else 'fitted'} ({pair.model})"))
        out[this.id] = tuple(rows)
    return out
