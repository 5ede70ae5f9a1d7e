"""The second opinion on a fitted pair page, as display-ready text.

Reads a :class:`builder.analysis.second_opinion.SecondOpinion` (computed in the
build's "compare" stage) and writes what the page, the index and ``atlas.json``
show: the agreement line of the summary box, a warning when the behaviour
classes differ, the pressure-swing verdict naming its model(s) and the
predicted azeotrope trace.  Nothing here computes thermodynamics.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any

import numpy as np

from builder.analysis.second_opinion import CLASS_WORDS, SecondOpinion
from builder.site.context import Display, Row
from builder.site.text import fmt, one_line

__all__ = ["OpinionView", "fitted_events", "opinion_json", "opinion_view"]


@dataclass(frozen=True)
class OpinionView:
    model: str
    agreement: str  # the summary-box line
    short: str  # the index cell
    dT_sort: float  # largest bubble-temperature difference [K] (NaN: none)
    agrees: bool
    warning: str  # "" unless the behaviour classes differ
    verdict: str
    verdict_short: str  # its first sentence (the printed datasheet)
    trace: tuple[Row, ...]  # predicted azeotrope: P, x1, T in the site's units


def opinion_view(opinion: SecondOpinion, display: Display) -> OpinionView:
    """The page's view of one pair's second opinion."""
    if not opinion.available:
        return OpinionView(model="", agreement=one_line(f"no prediction: {opinion.reason}"),
                           short="no prediction", dT_sort=math.nan, agrees=True, warning="",
                           verdict="", verdict_short="", trace=())
    dT = opinion.max_dT_K
    agrees = opinion.classes_agree
    short = (f"ΔT ≤ {fmt(dT, 2)} K; " if math.isfinite(dT) else "") + (
        "same class" if agrees else "class differs")
    warning = "" if agrees else one_line(
        f"The predictive model ({opinion.model}) puts this pair in another class at "
        f"{display.P(opinion.P_Pa, 6)}: fitted {CLASS_WORDS[opinion.fitted_class]}, "
        f"predicted {CLASS_WORDS.get(opinion.predicted_class, opinion.predicted_class)}. "
        "Check the fitted set against measured data before relying on either.")
    rows: tuple[Row, ...] = ()
    if opinion.trace is not None:
        t = opinion.trace
        rows = tuple(Row(fmt(display.P_value(float(p)), 4), fmt(float(x), 4),
                         fmt(display.T_value(float(T)), 2, fixed=True))
                     for p, x, T in zip(t.P_Pa, t.x1, t.T_K, strict=True)
                     if np.isfinite(x))
    return OpinionView(model=opinion.model, agreement=one_line(opinion.agreement()),
                       short=short, dT_sort=dT, agrees=agrees, warning=warning,
                       verdict=one_line(opinion.verdict),
                       verdict_short=one_line(opinion.verdict.split(". ")[0]).rstrip(".") + "."
                       if opinion.verdict else "", trace=rows)


def fitted_events(events: tuple[str, ...]) -> tuple[str, ...]:
    """The fitted trace's events without its one-model pressure-swing hint (the verdict
    beside the second opinion replaces it)."""
    out = []
    for event in events:
        cut = event.find(" (pressure-sensitive:")
        out.append(event[:cut] + "." if cut >= 0 else event)
    return tuple(out)


def opinion_json(opinion: SecondOpinion) -> dict[str, Any]:
    """The second opinion in ``atlas.json`` (SI units)."""
    if not opinion.available:
        return {"model": None, "reason": opinion.reason}
    data: dict[str, Any] = {
        "model": opinion.model,
        "quality": "predicted",
        "P_Pa": opinion.P_Pa,
        "max_bubble_T_difference_K": opinion.max_dT_K,
        "x1_at_max_difference": opinion.x1_at_max,
        "fitted_behaviour": opinion.fitted_class,
        "predicted_behaviour": opinion.predicted_class,
        "behaviour_agrees": opinion.classes_agree,
        "pressure_swing_verdict": opinion.verdict,
    }
    if opinion.trace is not None:
        data["azeotrope_trace"] = {"P_Pa": opinion.trace.P_Pa, "x1": opinion.trace.x1,
                                   "T_K": opinion.trace.T_K}
    return data
