"""A pair's row in the index table: boiling points, behaviour, azeotrope, α range, model."""

from __future__ import annotations

from dataclasses import dataclass

from builder.analysis.results import ConditionResult, PairResults
from builder.site.behaviour import BEHAVIOURS
from builder.site.component_view import ComponentView
from builder.site.display import Display, alpha_range
from builder.site.text import fmt, safe_id

__all__ = ["IndexRow", "index_row"]


@dataclass(frozen=True)
class IndexRow:
    pair_id: str
    url: str
    title: str
    component_ids: tuple[str, str]
    names: tuple[str, str]
    boiling: tuple[str, str]
    boiling_sort: tuple[float, float]
    behaviour: str
    behaviour_label: str
    azeotrope_T: str
    azeotrope_T_sort: float
    azeotrope_x1: str
    azeotrope_x1_sort: float
    alpha_range: str
    alpha_sort: float
    model: str
    quality: str


def index_row(results: PairResults, c1: ComponentView, c2: ComponentView,
               summary: ConditionResult | None, key: str, display: Display) -> IndexRow:
    pid = safe_id(results.pair.id)
    az = summary.azeotropes[0] if summary is not None and summary.azeotropes else None
    three = summary.three_phase if summary is not None else None
    hetero = three if key == "heterogeneous" else None
    az_T = az.T_K if az is not None else (hetero.T_K if hetero is not None else None)
    az_x = az.x1 if az is not None else (hetero.y1 if hetero is not None else None)
    nan = float("nan")
    return IndexRow(
        pair_id=pid, url=f"pairs/{pid}.md", title=f"{c1.name} + {c2.name}",
        component_ids=(c1.id, c2.id), names=(c1.name, c2.name),
        boiling=(fmt(c1.boiling_value, 1, fixed=True), fmt(c2.boiling_value, 1, fixed=True)),
        boiling_sort=(display.T_value(results.component1.normal_boiling_point_K),
                      display.T_value(results.component2.normal_boiling_point_K)),
        behaviour=key, behaviour_label=BEHAVIOURS[key],
        azeotrope_T=fmt(display.T_value(az_T), 1, fixed=True) if az_T is not None else "—",
        azeotrope_T_sort=display.T_value(az_T) if az_T is not None else nan,
        azeotrope_x1=fmt(az_x, 3) if az_x is not None else "—",
        azeotrope_x1_sort=az_x if az_x is not None else nan,
        alpha_range=alpha_range(summary) if summary is not None else "—",
        alpha_sort=summary.volatility.alpha_min if summary is not None else nan,
        model=results.pair.model.name, quality=results.pair.quality)
