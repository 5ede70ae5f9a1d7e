"""A second opinion on a fitted pair: the predictive model beside the fitted set.

A fitted parameter set is regressed to data in a temperature range (often 1-atm
data), and the atlas uses it further: vacuum and pressure isobars, the azeotrope
traced against pressure.  The group-contribution prediction (modified UNIFAC
(Dortmund), original UNIFAC where Dortmund has no parameters:
:func:`builder.catalogue.predictive.default_prediction`) carries its own
temperature dependence and no fit to this pair, which makes it an independent
second opinion:

* at the summary pressure, the predicted bubble and dew lines beside the fitted
  ones, the largest bubble-temperature difference over the composition range
  ``max |T_bubble,fitted(x1) - T_bubble,predicted(x1)|`` [K] (over the points where
  both curves converged with one liquid), and whether the behaviour class
  (:func:`behaviour_class`) agrees;
* at the pair's other published isobars (vacuum, pressure), where the fitted set is
  extrapolated, the predicted isobar beside it;
* against pressure, the predicted azeotrope traced over the same pressures as the
  fitted one, and a pressure-swing verdict that names the model it rests on and
  says so when the two disagree.

Pure functions of the catalogue and computed results; nothing is drawn here.
"""

from __future__ import annotations

from dataclasses import dataclass, replace

import numpy as np
from numpy.typing import NDArray

from builder.analysis import curves, dew_branches
from builder.analysis.point import system_for
from builder.analysis.results import ConditionResult, PairResults, compute_condition
from builder.analysis.trace import AzeotropeTrace, analyse, trace_azeotrope
from builder.analysis.volatility import volatility
from builder.catalogue.loader import Catalogue
from builder.catalogue.predictive import CannotPredict, default_prediction
from builder.catalogue.records import PairRecord

__all__ = ["CLASS_WORDS", "SecondOpinion", "behaviour_class", "predicted_record",
           "second_opinion", "second_opinions"]

#: Behaviour classes at one pressure, in words.
CLASS_WORDS = {
    "zeotropic": "zeotropic",
    "minimum-boiling": "minimum-boiling azeotrope",
    "maximum-boiling": "maximum-boiling azeotrope",
    "heterogeneous": "heterogeneous azeotrope",
    "liquid-split": "two liquids, no azeotrope",
    "several": "more than one azeotrope",
    "uncertain": "not settled",
}

#: Two traces tell the same story when their composition shifts differ by less than
#: this (the atlas's azeotrope-composition check tolerance, 0.03 mole fraction).
SHIFT_TOLERANCE = 0.03
#: Pressures of the predicted azeotrope trace (fewer than the fitted trace's 17: the
#: group-contribution model costs several times more per evaluation).
TRACE_POINTS = 9


def behaviour_class(result: ConditionResult) -> str:
    """The behaviour class of one isobar (a key of :data:`CLASS_WORDS`).

    Two liquids whose vapour lies between them make a heterogeneous azeotrope;
    two liquids without one are a liquid split; otherwise the azeotropes found
    decide, and an incomplete search with none found is "uncertain".
    """
    three = result.three_phase
    if any(a.heterogeneous for a in result.azeotropes) or (
            three is not None and three.heterogeneous_azeotrope):
        return "heterogeneous"
    if three is not None and not result.azeotropes:
        return "liquid-split"
    if len(result.azeotropes) > 1:
        return "several"
    if len(result.azeotropes) == 1:
        kind = result.azeotropes[0].kind
        return {"maximum-pressure": "minimum-boiling",
                "minimum-pressure": "maximum-boiling"}.get(kind, kind)
    return "zeotropic" if result.azeotrope_search_complete else "uncertain"


@dataclass(frozen=True)
class SecondOpinion:
    """The predicted model's view of a fitted pair (``model == ""``: none possible)."""

    pair_id: str
    model: str  # e.g. "modified UNIFAC (Dortmund)"; "" when the pair cannot be predicted
    reason: str  # why there is no prediction ("" when there is one)
    P_Pa: float
    predicted: ConditionResult | None  # the predicted isobar at P_Pa
    max_dT_K: float  # largest bubble-temperature difference, fitted - predicted
    x1_at_max: float
    fitted_class: str
    predicted_class: str
    trace: AzeotropeTrace | None  # the predicted azeotrope against pressure
    verdict: str  # the pressure-swing verdict in words, naming the model(s)
    #: The predicted isobars at the pair's other published pressures (vacuum, pressure),
    #: where the fitted set is used outside the temperatures it was fitted at.
    other_isobars: tuple[ConditionResult, ...] = ()

    def isobar_at(self, P_Pa: float) -> ConditionResult | None:
        """The predicted isobar at ``P_Pa`` (the summary one or another published one)."""
        for result in (self.predicted, *self.other_isobars):
            if result is not None and abs(result.condition - P_Pa) < 1.0:
                return result
        return None

    @property
    def available(self) -> bool:
        return bool(self.model)

    @property
    def classes_agree(self) -> bool:
        return self.fitted_class == self.predicted_class

    def agreement(self) -> str:
        """One line for the summary box and the index."""
        if not self.available:
            return f"no prediction: {self.reason}"
        words = (f"{self.model}: bubble temperatures within {self.max_dT_K:.1f} K "
                 f"(largest at x1 = {self.x1_at_max:.2f})")
        if self.classes_agree:
            return f"{words}; same behaviour ({CLASS_WORDS[self.fitted_class]})"
        return (f"{words}; behaviour DIFFERS: fitted {CLASS_WORDS[self.fitted_class]}, "
                f"predicted {CLASS_WORDS[self.predicted_class]}")


def predicted_record(pair: PairRecord, catalogue: Catalogue) -> PairRecord:
    """The pair with the predictive model in place of its fitted set.

    The prediction's temperature range is that of both vapour-pressure
    correlations (the group parameters carry their own temperature dependence).
    The vapour is the pair's own (virial, or the dimerising vapour of an acid
    pair, whose fitted set was regressed with it), so that the two opinions
    differ by their liquid models alone; a φ–φ pair (Peng–Robinson for both
    phases) gets the default γ–φ vapour instead, since the prediction is a
    liquid model.  Raises :class:`~builder.catalogue.predictive.CannotPredict` with the reason.
    """
    c1, c2 = catalogue.components[pair.component1], catalogue.components[pair.component2]
    model = default_prediction(c1, c2)
    lo = max(c1.vapour_pressure.T_min_K, c2.vapour_pressure.T_min_K)
    hi = min(c1.vapour_pressure.T_max_K, c2.vapour_pressure.T_max_K)
    vapour = None if pair.vapour is not None and pair.vapour.model == "peng-robinson" \
        else pair.vapour
    return replace(pair, model=model, model_kind=model.variant, quality="predicted",
                   published_parameters=dict(model.parameters_text()), T_min_K=lo,
                   T_max_K=max(hi, lo), recorded=None, split_x1=pair.split_x1,
                   vapour=vapour)


def _isobar(catalogue: Catalogue, record: PairRecord, P_Pa: float) -> ConditionResult:
    """One isobar of ``record``: curve, phases, azeotropes and volatility (no quick look)."""
    c1, c2 = catalogue.components[record.component1], catalogue.components[record.component2]
    system = system_for(record, catalogue)
    curve = curves.isobar(system, P_Pa)
    phases = analyse(system, record.model, True, P_Pa, curve)
    # Its dew branches beside a three-phase line drawn whole, as on the fitted curve.
    curve, phases, _ = dew_branches.refine(system, record.model, True, P_Pa, curve, phases)
    drawable = curve.converged & ~phases.inside_gap
    outside = np.zeros(curve.x1.shape, dtype=bool)
    for vp in (c1.vapour_pressure, c2.vapour_pressure):
        outside |= (curve.T_K < vp.T_min_K) | (curve.T_K > vp.T_max_K)
    vol = volatility(system, curve.x1, curve.alpha12, drawable, P_Pa=P_Pa, T_K=None,
                     has_azeotrope=bool(phases.azeotropes))
    return ConditionResult(kind="isobar", condition=P_Pa, curve=curve, drawable=drawable,
                           extrapolated=outside, azeotropes=phases.azeotropes,
                           azeotrope_search_complete=phases.complete, volatility=vol,
                           warnings=phases.warnings, liquid_stable=phases.liquid_stable,
                           three_phase=phases.three_phase, quicklook=None)


def _bubble_difference(fitted: ConditionResult, predicted: ConditionResult
                       ) -> tuple[float, float]:
    a, b = fitted.curve, predicted.curve
    # On the composition grid both share: without the points added beside a three-phase
    # line, which the other curve has not got.
    keep_a = ~dew_branches.added_points(a.x1, fitted.three_phase)
    keep_b = ~dew_branches.added_points(b.x1, predicted.three_phase)
    x_a, T_a, drawn_a = a.x1[keep_a], a.T_K[keep_a], fitted.drawable[keep_a]
    x_b, T_b, drawn_b = b.x1[keep_b], b.T_K[keep_b], predicted.drawable[keep_b]
    if x_a.shape != x_b.shape or not np.allclose(x_a, x_b):
        T_b = np.interp(x_a, x_b, T_b)
        ok = drawn_a & np.isfinite(T_b)
    else:
        ok = drawn_a & drawn_b
    diff: NDArray[np.float64] = np.abs(np.asarray(T_a, dtype=float) - T_b)
    diff = np.where(ok & np.isfinite(diff), diff, -1.0)
    if not (diff >= 0).any():
        return float("nan"), float("nan")
    i = int(np.argmax(diff))
    return float(diff[i]), float(x_a[i])


def _direction(trace: AzeotropeTrace | None) -> tuple[float, str]:
    """Composition shift over the traced range and which way it moves with falling pressure."""
    if trace is None:
        return 0.0, ""
    ok = np.isfinite(trace.x1)
    if ok.sum() < 2:
        return trace.shift_x1, ""
    x = trace.x1[ok]
    low, high = float(x[0]), float(x[-1])  # pressures ascend
    if abs(low - high) < 0.01:
        return trace.shift_x1, "hardly moves"
    return trace.shift_x1, ("moves toward component 1 under vacuum" if low > high
                            else "moves toward component 2 under vacuum")


def _verdict(results: PairResults, fitted_name: str, model: str,
             predicted: AzeotropeTrace | None, predicted_has_azeotrope: bool) -> str:
    fitted = results.trace
    if fitted is None and predicted is None:
        return ""
    parts = []
    f_shift, f_dir = _direction(fitted)
    p_shift, p_dir = _direction(predicted)
    if fitted is not None:
        parts.append(f"fitted {fitted_name} (parameters fitted between "
                     f"{results.pair.T_min_K - 273.15:.0f} and "
                     f"{results.pair.T_max_K - 273.15:.0f} °C, extrapolated beyond): the "
                     f"azeotrope {f_dir or 'is followed'}, shift {f_shift:.3f} in x1"
                     + ("; " + "; ".join(fitted.events) if fitted.events else ""))
    if predicted is not None:
        parts.append(f"{model} (temperature-dependent group parameters): the azeotrope "
                     f"{p_dir or 'is followed'}, shift {p_shift:.3f} in x1"
                     + ("; " + "; ".join(predicted.events) if predicted.events else ""))
    elif fitted is not None:
        parts.append(f"{model}: " + ("the azeotrope could not be followed" if
                                     predicted_has_azeotrope else
                                     "no azeotrope at the summary pressure"))
    f_sens = bool(fitted is not None and fitted.pressure_sensitive)
    p_sens = bool(predicted is not None and predicted.pressure_sensitive)
    if fitted is not None and predicted is not None and f_sens == p_sens and (
            abs(f_shift - p_shift) < SHIFT_TOLERANCE) and (f_dir == p_dir or not f_sens):
        verdict = ("Both models find the azeotrope pressure-sensitive: pressure-swing "
                   "distillation may be worth a look" if f_sens else
                   "Both models find the azeotrope nearly insensitive to pressure: "
                   "pressure swing is unlikely to help")
    elif fitted is not None and predicted is not None:
        verdict = ("The models disagree on how the azeotrope moves with pressure: no "
                   "confident pressure-swing verdict; measured data at the pressures of "
                   "interest decide")
    else:
        verdict = ("Only one model has an azeotrope here: no confident pressure-swing "
                   "verdict")
    return verdict + ". " + ". ".join(p[0].upper() + p[1:] for p in parts) + "."


def second_opinion(catalogue: Catalogue, results: PairResults,
                   P_Pa: float = 101325.0) -> SecondOpinion:
    """The predictive model's view of ``results`` at ``P_Pa`` and against pressure."""
    pair = results.pair
    fitted = next((r for r in results.isobars if abs(r.condition - P_Pa) < 1.0), None)
    if fitted is None:
        fitted = compute_condition(catalogue, pair, "isobar", P_Pa)
    fitted_class = behaviour_class(fitted)
    try:
        record = predicted_record(pair, catalogue)
    except CannotPredict as error:
        reason = "; ".join(error.reasons)
        return SecondOpinion(pair.id, "", reason, P_Pa, None, float("nan"), float("nan"),
                             fitted_class, "", None, "")
    predicted = _isobar(catalogue, record, P_Pa)
    dT, x_at = _bubble_difference(fitted, predicted)
    trace = None
    same = [a for a in predicted.azeotropes if not a.heterogeneous] or list(
        predicted.azeotropes)
    if same:
        system = system_for(record, catalogue)
        # The same pressures as the fitted trace, and no temperature limit of its own.
        trace = trace_azeotrope(system, record.model, same[0], (0.0, float("inf")),
                                points=TRACE_POINTS)
    model = record.model.name
    verdict = _verdict(results, pair.model.name, model, trace, bool(same))
    others = tuple(_isobar(catalogue, record, r.condition) for r in results.isobars
                   if abs(r.condition - P_Pa) >= 1.0)
    return SecondOpinion(pair.id, model, "", P_Pa, predicted, dT, x_at, fitted_class,
                         behaviour_class(predicted), trace, verdict, others)


def second_opinions(catalogue: Catalogue, atlas: dict[str, PairResults],
                    P_Pa: float = 101325.0) -> dict[str, SecondOpinion]:
    """The second opinion of every catalogued (fitted) pair of ``atlas``."""
    return {pid: second_opinion(catalogue, results, P_Pa)
            for pid, results in sorted(atlas.items()) if pid in catalogue.pairs}
