"""Everything the atlas publishes about one pair, computed before anything is written.

:func:`compute_pair` turns a catalogue pair into a :class:`PairResults` (the typed,
versioned record of :mod:`.record`): for each published isobar and isotherm the
curve, which points are extrapolated, the azeotropes, the relative-volatility
summary and table, and the warnings a reader must see; the azeotrope traced against
pressure; then the reference checks of :mod:`.checks` attached.  Figures and pages
read these records; they never compute thermodynamics themselves.
"""

from __future__ import annotations

import dataclasses
import itertools
from dataclasses import replace

import numpy as np
from numpy.typing import NDArray

from builder.analysis import curves, dew_branches
from builder.analysis.azeotropes import search_grid
from builder.analysis.checks import check_pair
from builder.analysis.distillation import Split, quick_look, quick_look_compositions
from builder.analysis.point import system_for
from builder.analysis.record import (
    ATMOSPHERIC_PA,
    RESULTS_VERSION,
    Check,
    ConditionResult,
    PairResults,
)
from builder.analysis.trace import analyse, trace_azeotrope
from builder.analysis.volatility import ROUND_COMPOSITIONS, Volatility, volatility
from builder.catalogue.loader import Catalogue
from builder.catalogue.records import Component, PairRecord
from builder.thermo import equilibrium as eq
from builder.thermo.activity import Swapped

__all__ = ["RESULTS_VERSION", "Check", "ConditionResult", "PairResults", "compute_atlas",
           "compute_condition", "compute_pair", "swapped_pair"]


def _part(result: eq.EquilibriumResult, part: slice) -> eq.EquilibriumResult:
    """The points ``part`` of a solved set of bubble points (``phi`` is None for an ideal
    vapour)."""
    values = {f.name: getattr(result, f.name) for f in dataclasses.fields(eq.EquilibriumResult)}
    return eq.EquilibriumResult(**{k: None if v is None else v[part]
                                   for k, v in values.items()})  # type: ignore[arg-type]


def _extrapolated(pair: PairRecord, c1: Component, c2: Component,
                  T_K: NDArray[np.float64]) -> NDArray[np.bool_]:
    outside = (T_K < pair.T_min_K) | (T_K > pair.T_max_K)
    if pair.model_kind == "peng-robinson":  # φ–φ: the vapour-pressure correlations are unused
        return np.asarray(outside, dtype=bool)
    for component in (c1, c2):
        vp = component.vapour_pressure
        outside |= (T_K < vp.T_min_K) | (T_K > vp.T_max_K)
    return np.asarray(outside, dtype=bool)


def _light_component(c1: Component, c2: Component, P_Pa: float) -> int:
    T1 = float(c1.vapour_pressure.temperature_K(P_Pa))
    T2 = float(c2.vapour_pressure.temperature_K(P_Pa))
    return 1 if T1 <= T2 else 2


def _default_split(pair: PairRecord, light: int) -> Split:
    if pair.split_x1 is not None:
        return Split(*pair.split_x1)
    return Split(0.95, 0.05, 0.5) if light == 1 else Split(0.05, 0.95, 0.5)


def _condition(catalogue: Catalogue, pair: PairRecord, kind: str, value: float
               ) -> ConditionResult:
    system = system_for(pair, catalogue)
    c1 = catalogue.components[pair.component1]
    c2 = catalogue.components[pair.component2]
    isobar = kind == "isobar"
    table_points: eq.EquilibriumResult | None = None
    presolved: eq.EquilibriumResult | None = None
    if system.phi_phi:
        # φ–φ: the curve may end at a critical point or not exist (curves handles both).
        curve = curves.isobar(system, value) if isobar else curves.isotherm(system, value)
        if curve.no_two_phase:
            return _no_two_phase(kind, value, curve)
        phases = analyse(system, pair.model, isobar, value, curve)
    else:
        # The curve, the azeotrope search grid, the table's round compositions and (on an
        # isobar) the quick look's liquids for a split that crosses no azeotrope: one solve.
        parts = [curves.composition_grid(), search_grid(), ROUND_COMPOSITIONS]
        if isobar:
            parts.append(quick_look_compositions(
                _default_split(pair, _light_component(c1, c2, value))))
        solved = (eq.bubble_temperature if isobar else eq.bubble_pressure)(
            system, np.concatenate(parts), value)
        ends = np.cumsum([0] + [p.size for p in parts])
        curve_points, search_points, table_points, *rest = (
            _part(solved, slice(a, b)) for a, b in itertools.pairwise(ends))
        presolved = solved if rest else None
        curve = curves.from_bubble(kind, system, curve_points)
        phases = analyse(system, pair.model, isobar, value, curve, search_points)
    # Enough points on each one-liquid stretch beside a three-phase line for its dew branch.
    curve, phases, added = dew_branches.refine(system, pair.model, isobar, value, curve, phases)
    warnings = list(phases.warnings)
    found = phases.azeotropes
    three_phase = phases.three_phase
    liquid_stable = phases.liquid_stable
    drawable = curve.converged & ~phases.inside_gap
    extrapolated = _extrapolated(pair, c1, c2, curve.T_K)
    failed = int((~curve.converged).sum())
    if curve.critical is not None:
        c = curve.critical
        warnings = [w for w in warnings if "could not cover" not in w]
        warnings.append(f"the two-phase region ends at the mixture critical point (x1 = "
                        f"{c.x1:.3f}, {c.T_K:.2f} K, {c.P_Pa / 1e6:.4g} MPa); no curve beyond it")
        failed = int((~curve.converged & ~curves.beyond_critical(curve)).sum())
    if failed:
        warnings.append(f"{failed} of {curve.x1.size} points did not converge and are not drawn")
    if extrapolated.any():
        # Of the composition grid, as on a curve without added points (:mod:`.dew_branches`).
        share = extrapolated[~added].mean() or extrapolated.mean()
        warnings.append(f"{share:.0%} of the curve lies outside the validity range of a "
                        "correlation (drawn dashed)")
    for component in (c1, c2):
        T_max = float(np.nanmax(curve.T_K))
        if T_max >= component.critical_temperature_K and not system.phi_phi:
            warnings.append(f"{component.name} is above its critical temperature "
                            f"({component.critical_temperature_K:.1f} K) on part of this "
                            "curve: the modified Raoult's law does not apply there")
    summarised = drawable if curve.critical is None else drawable & (curve.x1 != curve.critical.x1)
    vol = volatility(system, curve.x1, curve.alpha12, summarised,
                     P_Pa=value if isobar else None, T_K=None if isobar else value,
                     has_azeotrope=bool(found), rows=table_points)
    look = None
    if isobar:
        light = _light_component(c1, c2, value)
        look = quick_look(system, value, found, three_phase, _default_split(pair, light), light,
                          presolved)
    return ConditionResult(kind=kind, condition=value, curve=curve, drawable=drawable,
                           extrapolated=extrapolated, azeotropes=tuple(found),
                           # Past a critical point there is no two-phase region to search.
                           azeotrope_search_complete=phases.complete or curve.critical is not None,
                           volatility=vol,
                           warnings=tuple(warnings), liquid_stable=liquid_stable,
                           three_phase=three_phase, quicklook=look)


def _no_two_phase(kind: str, value: float, curve: curves.Curve) -> ConditionResult:
    """A condition with no two-phase region: reported in words, nothing drawn."""
    none = np.zeros(curve.x1.shape, dtype=bool)
    nan = float("nan")
    vol = Volatility(alpha_infinite_dilution_1=nan, alpha_infinite_dilution_2=nan,
                     alpha_min=nan, x1_at_min=nan, alpha_max=nan, x1_at_max=nan,
                     lighter_over_heavier_min=nan, grade="no two-phase region",
                     grade_text=curve.no_two_phase, table=())
    return ConditionResult(kind=kind, condition=value, curve=curve, drawable=none,
                           extrapolated=none.copy(), azeotropes=(),
                           azeotrope_search_complete=True, volatility=vol,
                           warnings=(curve.no_two_phase,), liquid_stable=~none,
                           three_phase=None, quicklook=None)


#: UNIFAC subgroups that make a component a carboxylic acid (both variants' spelling).
_ACID_SUBGROUPS = frozenset({"COOH", "HCOOH"})


def _is_acid(component: Component) -> bool:
    groups = component.groups
    return groups is not None and any(
        name in _ACID_SUBGROUPS for variant in ("unifac", "dortmund")
        for name in (groups.of(variant) or {}))


def acid_vapour_warnings(c1: Component, c2: Component, vapour_model: str) -> tuple[str, ...]:
    """A warning for each carboxylic acid of a pair whose vapour is not treated as
    dimerising (no dimerisation constants in the catalogue): near its boiling point an
    acid's vapour is mostly dimers, so an ideal-gas or virial vapour misjudges its
    volatility and can show an azeotrope that does not exist (common practice)."""
    if vapour_model in ("associating", "peng-robinson"):
        return ()
    return tuple(f"{c.name} is a carboxylic acid, whose vapour dimerises; the catalogue has no "
                 f"dimerisation constants for it, so this page takes its vapour as "
                 f"{vapour_model}: its volatility and any azeotrope with it are uncertain"
                 for c in (c1, c2) if _is_acid(c))


def predicted_split_warnings(pair: PairRecord,
                             conditions: tuple[ConditionResult, ...]) -> tuple[str, ...]:
    """A warning when a predicted pair (no fitted set) shows two liquids: the group
    contribution's parameters were fitted to vapour-liquid data, and they place liquid-liquid
    splits poorly -- too wide, too narrow, or where the liquids mix (common practice)."""
    if pair.quality != "predicted" or all(bool(np.all(c.liquid_stable)) for c in conditions):
        return ()
    return ("Two liquids are predicted here: group-contribution parameters fitted to "
            "vapour-liquid data often misjudge liquid-liquid splits, and can show one where "
            "the liquids mix; check mutual solubilities against measured data.",)


def compute_pair(catalogue: Catalogue, pair: PairRecord) -> PairResults:
    """Compute every published condition of ``pair``, the azeotrope's movement with
    pressure and the reference checks."""
    isobars = tuple(_condition(catalogue, pair, "isobar", P) for P in pair.isobars_Pa)
    isotherms = tuple(_condition(catalogue, pair, "isotherm", T) for T in pair.isotherms_K)
    trace = None
    reference = next((c for c in isobars if abs(c.condition - ATMOSPHERIC_PA) < 1.0),
                     isobars[0] if isobars else None)
    if reference is not None and reference.azeotropes:
        trace = trace_azeotrope(system_for(pair, catalogue), pair.model,
                                reference.azeotropes[0], (pair.T_min_K, pair.T_max_K))
    c1, c2 = catalogue.components[pair.component1], catalogue.components[pair.component2]
    first = (isobars + isotherms)[0] if isobars or isotherms else None
    warnings = acid_vapour_warnings(c1, c2, first.curve.vapour_model) if first else ()
    warnings += predicted_split_warnings(pair, isobars + isotherms)
    computed = PairResults(
        pair=pair, component1=c1, component2=c2, isobars=isobars, isotherms=isotherms,
        warnings=warnings, trace=trace, checks=(),
    )
    return replace(computed, checks=check_pair(computed))


def swapped_pair(pair: PairRecord) -> PairRecord:
    """The same pair with its components in the other order (1 <-> 2)."""
    split = pair.split_x1
    return replace(pair, component1=pair.component2, component2=pair.component1,
                   model=Swapped(pair.model),
                   split_x1=None if split is None else (1 - split[0], 1 - split[1],
                                                        1 - split[2]))


def compute_condition(catalogue: Catalogue, pair: PairRecord, kind: str, value: float,
                      swapped: bool = False,
                      split_x1: tuple[float, float, float] | None = None) -> ConditionResult:
    """One isobar (``value`` in Pa) or isotherm (K), optionally in the reversed order and
    with a quick-look split (distillate, bottoms, feed; fractions of the first component
    in the order used)."""
    if kind not in ("isobar", "isotherm"):
        raise ValueError(f"kind must be 'isobar' or 'isotherm', found {kind!r}")
    record = swapped_pair(pair) if swapped else pair
    if split_x1 is not None:
        record = replace(record, split_x1=split_x1)
    return _condition(catalogue, record, kind, value)


def compute_atlas(catalogue: Catalogue) -> dict[str, PairResults]:
    """Compute every pair of the catalogue (the whole atlas), in id order."""
    return {pid: compute_pair(catalogue, catalogue.pairs[pid]) for pid in sorted(catalogue.pairs)}
