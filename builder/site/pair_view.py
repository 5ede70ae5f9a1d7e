"""The view of a pair page: summary, conditions, tables, model, checks, trace and warnings."""

from __future__ import annotations

import math
from collections.abc import Iterable
from dataclasses import dataclass

import numpy as np

from builder.analysis.distillation import Split
from builder.analysis.results import ConditionResult, PairResults
from builder.catalogue.loader import QUALITIES, Catalogue
from builder.catalogue.vapour import vapour_text
from builder.site.behaviour import KIND_WORDS, behaviour, summary_condition
from builder.site.component_view import ComponentView, source_text
from builder.site.display import NO_MATRIX, Display, Matrix, Row, alpha_range, matrix
from builder.site.index_view import IndexRow, index_row
from builder.site.settings import SiteSettings
from builder.site.text import file_slug, fmt, one_line, safe_id

__all__ = ["AzeotropeRow", "ConditionView", "PairView", "TableRow", "condition_slug", "pair_view"]


@dataclass(frozen=True)
class AzeotropeRow:
    kind: str
    x1: str
    T: str
    P: str
    heterogeneous: str


@dataclass(frozen=True)
class TableRow:
    x1: str
    y1: str
    T: str
    P: str
    gamma1: str
    gamma2: str
    alpha12: str
    converged: bool


@dataclass(frozen=True)
class ConditionView:
    kind: str  # isobar or isotherm
    slug: str  # file-name slug
    label: str  # 101.325 kPa / 50 °C
    diagram: str  # Txy / Pxy
    azeotropes: tuple[AzeotropeRow, ...]
    search_complete: bool
    alpha: tuple[Row, ...]
    grade: str
    grade_text: str
    table: tuple[TableRow, ...]
    three_phase: tuple[Row, ...]
    quicklook: tuple[Row, ...]
    warnings: tuple[str, ...]
    curve_csv: str  # site-relative paths
    table_csv: str


@dataclass(frozen=True)
class PairView:
    id: str
    url: str
    title: str
    c1: ComponentView
    c2: ComponentView
    sentence: str
    behaviour: str
    summary: tuple[Row, ...]
    summary_label: str  # condition the summary refers to
    conditions: tuple[ConditionView, ...]
    model: str
    model_kind: str
    vapour: str  # the vapour treatment, in words
    parameters: tuple[Row, ...]  # as published
    parameters_si: tuple[Row, ...]  # as used (dimensionless coefficients)
    validity: str
    source: str
    quality: str
    quality_text: str
    notes: str
    tags: tuple[str, ...]
    warnings: tuple[str, ...]
    checks: tuple[tuple[str, bool, str, str], ...]  # name, passed, detail, reference
    trace: tuple[Row, ...]
    trace_events: tuple[str, ...]
    recorded: tuple[Row, ...]
    hazards: tuple[tuple[str, str, str, bool], ...]  # name, text, source, hazardous
    index: IndexRow
    json_path: str
    volatility: Matrix = NO_MATRIX
    quicklook: Matrix = NO_MATRIX
    three_phase: Matrix = NO_MATRIX


def _sentence(results: PairResults, result: ConditionResult | None, display: Display,
              key: str) -> str:
    n1, n2 = one_line(results.component1.name), one_line(results.component2.name)
    if result is None:
        result = results.conditions[0] if results.conditions else None
        if result is None:
            return f"{n1} + {n2}: no condition is published."
        key = behaviour(result)
    where = f"at {display.condition(result)}"
    v = result.volatility
    if key == "zeotropic":
        if v.alpha_max < 1.0:
            # Component 2 is the lighter throughout: say its volatility over component 1
            # (α21 = 1/α12), so that the numbers read as the split they grade.
            return (f"{n1} and {n2} form no azeotrope {where}; the relative volatility of "
                    f"{n2} over {n1} (α21 = 1/α12) runs from {fmt(1.0 / v.alpha_max, 3)} "
                    f"to {fmt(1.0 / v.alpha_min, 3)}, {v.grade_text}.")
        return (f"{n1} and {n2} form no azeotrope {where}; α12 runs from "
                f"{fmt(v.alpha_min, 3)} to {fmt(v.alpha_max, 3)}, {v.grade_text}.")
    three = result.three_phase
    if key in ("heterogeneous", "liquid-split") and three is not None:
        T = display.T(three.T_K)
        xa, xb = fmt(three.x1_a, 3), fmt(three.x1_b, 3)
        if key == "heterogeneous":
            return (f"{n1} and {n2} split into two liquids (x1 = {xa} and {xb}) that boil "
                    f"together {where} at {T}: a heterogeneous azeotrope "
                    f"(vapour y1 = {fmt(three.y1, 3)}), which a decanter can cross.")
        return (f"{n1} and {n2} split into two liquids (x1 = {xa} and {xb}) that boil "
                f"together {where} at {T}; the vapour lies outside the liquid split, so "
                "there is no azeotrope.")
    if result.azeotropes:
        parts = [f"{KIND_WORDS.get(a.kind, a.kind)} (x1 = {fmt(a.x1, 3)}, {display.T(a.T_K)})"
                 for a in result.azeotropes]
        if len(parts) == 1:
            article = "an" if parts[0][0] in "aeiou" else "a"
            return (f"{n1} and {n2} form {article} {parts[0]} {where}: plain distillation "
                    "cannot cross it.")
        return (f"{n1} and {n2} form {len(parts)} azeotropes {where}: {'; '.join(parts)}. "
                "Plain distillation cannot cross them.")
    return (f"No azeotrope of {n1} and {n2} was found {where}, but the search did not cover "
            "the whole composition range.")


def _azeotrope_rows(result: ConditionResult, display: Display) -> tuple[AzeotropeRow, ...]:
    return tuple(AzeotropeRow(kind=KIND_WORDS.get(a.kind, a.kind), x1=fmt(a.x1, 4),
                              T=fmt(display.T_value(a.T_K), 2, fixed=True),
                              P=fmt(display.P_value(a.P_Pa), 5),
                              heterogeneous="yes" if a.heterogeneous else "no")
                 for a in result.azeotropes)


def _three_phase_rows(result: ConditionResult, display: Display) -> tuple[Row, ...]:
    three = result.three_phase
    if three is None:
        return ()
    rows = [Row("Temperature", display.T(three.T_K, 2)),
            Row("Pressure", display.P(three.P_Pa, 5)),
            Row("Liquid compositions x1", f"{fmt(three.x1_a, 4)} and {fmt(three.x1_b, 4)}"),
            Row("Vapour y1", fmt(three.y1, 4))]
    rows.append(Row("Heterogeneous azeotrope", "yes (the vapour lies between the liquids)"
                    if three.heterogeneous_azeotrope
                    else "no (the vapour lies outside the liquid split)"))
    return tuple(rows)


def _quicklook_rows(result: ConditionResult) -> tuple[Row, ...]:
    look = result.quicklook
    if look is None:
        return ()
    rows: list[Row] = []
    top = look.top_component
    requested, split = look.requested, look.split

    def split_text(s: Split) -> str:
        return (f"distillate x1 = {fmt(s.distillate_x1, 3)}, bottoms x1 = "
                f"{fmt(s.bottoms_x1, 3)}, feed x1 = {fmt(s.feed_x1, 3)}")

    rows.append(Row("Split asked", split_text(requested)))
    limited = look.limited_by
    if split is not None and (limited or split != requested):
        rows.append(Row("Split computed", split_text(split)))
    if limited:
        rows.append(Row("Limited by", str(limited)))
    rows.append(Row("Overhead", f"component {top}"))
    for value, label in ((look.stages_min, "Minimum stages (total reflux, incl. reboiler)"),
                         (look.fenske_stages, "Fenske estimate (geometric-mean α)"),
                         (look.reflux_min, "Minimum reflux ratio (saturated-liquid feed)")):
        if value is not None:
            rows.append(Row(label, fmt(float(value), 3)))
    a_top, a_bottom = look.alpha_top, look.alpha_bottom
    if a_top is not None and a_bottom is not None:
        rows.append(Row("α at top and bottom", f"{fmt(a_top, 3)} and {fmt(a_bottom, 3)}"))
    pinch = look.pinch
    if pinch:
        at = look.pinch_x1
        rows.append(Row("Pinch", f"{pinch}" + (f" at x1 = {fmt(at, 3)}" if at is not None
                                                else "")))
    reason = look.reason
    if reason:
        rows.append(Row("Not computed", str(reason)))
    return tuple(rows)


def _table(result: ConditionResult, display: Display) -> tuple[TableRow, ...]:
    return tuple(TableRow(x1=fmt(r.x1, 2, fixed=True), y1=fmt(r.y1, 4, fixed=True)
                          if r.converged else "—",
                          T=fmt(display.T_value(r.T_K), 2, fixed=True) if r.converged else "—",
                          P=fmt(display.P_value(r.P_Pa), 5) if r.converged else "—",
                          gamma1=fmt(r.gamma1, 4), gamma2=fmt(r.gamma2, 4),
                          alpha12=fmt(r.alpha12, 4), converged=r.converged)
                 for r in result.volatility.table)


def condition_slug(result: ConditionResult) -> str:
    return file_slug(result.slug)


def _condition(pair_id: str, result: ConditionResult, display: Display) -> ConditionView:
    slug = condition_slug(result)
    v = result.volatility
    alpha = (
        Row("α12 at infinite dilution of 1 (x1 → 0)", fmt(v.alpha_infinite_dilution_1, 4)),
        Row("α12 at infinite dilution of 2 (x1 → 1)", fmt(v.alpha_infinite_dilution_2, 4)),
        Row("Smallest α12", f"{fmt(v.alpha_min, 4)} at x1 = {fmt(v.x1_at_min, 3)}"),
        Row("Largest α12", f"{fmt(v.alpha_max, 4)} at x1 = {fmt(v.x1_at_max, 3)}"),
        Row("Smallest light-over-heavy α", fmt(v.lighter_over_heavier_min, 4)),
        Row("Split", v.grade_text),
    )
    return ConditionView(
        kind=result.kind, slug=slug, label=display.condition(result),
        diagram="Txy" if result.kind == "isobar" else "Pxy",
        azeotropes=_azeotrope_rows(result, display),
        search_complete=result.azeotrope_search_complete, alpha=alpha,
        grade=v.grade, grade_text=v.grade_text, table=_table(result, display),
        three_phase=_three_phase_rows(result, display), quicklook=_quicklook_rows(result),
        warnings=tuple(one_line(w) for w in result.warnings),
        curve_csv=f"pairs/{pair_id}/{slug}-curve.csv",
        table_csv=f"pairs/{pair_id}/{slug}-table.csv")


def _trace_rows(results: PairResults, display: Display) -> tuple[tuple[Row, ...],
                                                                 tuple[str, ...]]:
    trace = results.trace
    if trace is None:
        return (), ()
    P = np.asarray(trace.P_Pa, dtype=float)
    x1 = np.asarray(trace.x1, dtype=float)
    T = np.asarray(trace.T_K, dtype=float)
    rows = tuple(Row(fmt(display.P_value(p), 4), fmt(x, 4),
                     fmt(display.T_value(t), 2, fixed=True))
                 for p, x, t in zip(P, x1, T, strict=False) if np.isfinite(x))
    events = tuple(one_line(e) for e in trace.events)
    shift = trace.shift_x1
    if math.isfinite(shift):
        sensitive = trace.pressure_sensitive
        events = (f"The azeotropic composition moves by {fmt(shift, 3)} in x1 over the "
                  "pressures traced" + (" (pressure-sensitive: pressure-swing distillation "
                                        "may be worth a look)." if sensitive else "."),
                  *events)
    return rows, events


def _warnings(results: PairResults, display: Display,
              conditions: Iterable[ConditionResult]) -> tuple[str, ...]:
    out = [one_line(w) for w in results.warnings]
    for result in conditions:
        out.extend(f"{display.condition(result)}: {one_line(w)}" for w in result.warnings)
    for check in results.checks:
        if not check.passed:
            out.append(f"Check failed: {one_line(check.name)}: {one_line(check.detail)}")
    quality = results.pair.quality
    # A predicted page says so in its banner, on screen and in print (pair.md.j2).
    if quality in ("unverified", "demo"):
        out.append(f"Parameter quality '{quality}': {QUALITIES.get(quality, '')}.")
    return tuple(out)


def pair_view(catalogue: Catalogue, results: PairResults, components: dict[str, ComponentView],
          display: Display, settings: SiteSettings) -> PairView:
    pair = results.pair
    pid = safe_id(pair.id)
    c1, c2 = components[pair.component1], components[pair.component2]
    summary = summary_condition(results, settings)
    key = behaviour(summary)
    conditions = tuple(_condition(pid, r, display) for r in results.conditions)
    sentence = _sentence(results, summary, display, key)
    at = display.P(settings.summary_pressure_Pa, 6)
    rows = [
        Row("Behaviour", sentence),
        Row("Normal boiling points", f"{c1.name} {c1.boiling_point}; {c2.name} "
            f"{c2.boiling_point}"),
    ]
    if summary is not None:
        if summary.azeotropes:
            for a in summary.azeotropes:
                hetero = " (heterogeneous)" if a.heterogeneous else ""
                rows.append(Row(f"Azeotrope at {at}", f"{KIND_WORDS.get(a.kind, a.kind)}"
                                f"{hetero}, x1 = {fmt(a.x1, 3)}, {display.T(a.T_K)}"))
        elif summary.three_phase is not None:
            three = summary.three_phase
            rows.append(Row(f"Liquid split at {at}", f"two liquids x1 = "
                            f"{fmt(three.x1_a, 3)} and {fmt(three.x1_b, 3)} boil at "
                            f"{display.T(three.T_K)}"))
        else:
            rows.append(Row(f"Azeotrope at {at}", "none found" if
                            summary.azeotrope_search_complete else
                            "none found (search incomplete)"))
        v = summary.volatility
        inverse = (f"α21 = 1/α12 from {fmt(1.0 / v.alpha_max, 3)} to "
                   f"{fmt(1.0 / v.alpha_min, 3)}; " if v.alpha_max < 1.0 else "")
        rows.append(Row(f"Relative volatility α12 at {at}",
                        f"{alpha_range(summary)} ({inverse}{v.grade_text})"))
    else:
        rows.append(Row(f"At {at}", "not published for this pair; see the conditions below"))
    rows.append(Row("Model and data quality", f"{pair.model.name}; {pair.quality}: "
                    f"{QUALITIES.get(pair.quality, '')}"))
    failed = results.failed_checks
    checks_all = results.checks
    if checks_all:
        rows.append(Row("Reference checks", f"{len(checks_all) - len(failed)} of "
                        f"{len(checks_all)} passed"))
    parameters = tuple(Row(k, one_line(v)) for k, v in pair.published_parameters.items())
    parameters_si = tuple(Row(k, v) for k, v in pair.model.parameters_text().items())
    checks = tuple((one_line(c.name), c.passed, one_line(c.detail), one_line(c.reference))
                   for c in checks_all)
    trace, events = _trace_rows(results, display)
    recorded: list[Row] = []
    rec = pair.recorded
    if rec is not None:
        for rz in rec.azeotropes:
            recorded.append(Row(f"Azeotrope at {display.P(rz.P_Pa, 6)}",
                                f"{KIND_WORDS.get(rz.kind, rz.kind)}"
                                + (f", x1 = {fmt(rz.x1, 3)}" if rz.x1 is not None else "")
                                + (f", {display.T(rz.T_K)}" if rz.T_K is not None else ""),
                                source_text(catalogue, rz.source)))
        for P in rec.zeotropic_at_Pa:
            recorded.append(Row(f"No azeotrope at {display.P(P, 6)}", "recorded zeotropic",
                                source_text(catalogue, rec.source)))
        if rec.liquid_split is not None:
            recorded.append(Row("Liquid-liquid split", "recorded" if rec.liquid_split else
                                "none recorded", source_text(catalogue, rec.source)))
    hazards = tuple((c.name, c.hazard, c.hazard_source, c.hazardous) for c in (c1, c2))
    with_look = [c for c in conditions if c.quicklook]
    with_split = [c for c in conditions if c.three_phase]
    return PairView(
        id=pid, url=f"pairs/{pid}.md", title=f"{c1.name} + {c2.name}", c1=c1, c2=c2,
        sentence=sentence, behaviour=key, summary=tuple(rows),
        summary_label=at if summary is not None else "",
        conditions=conditions, model=pair.model.name, model_kind=pair.model_kind,
        vapour=vapour_text(results.conditions[0].curve.vapour_model if results.conditions
                           else ""),
        parameters=parameters, parameters_si=parameters_si,
        validity=f"{display.T(pair.T_min_K)} to {display.T(pair.T_max_K)} "
                 f"({fmt(pair.T_min_K, 5)} K to {fmt(pair.T_max_K, 5)} K)",
        source=source_text(catalogue, pair.source), quality=pair.quality,
        quality_text=QUALITIES.get(pair.quality, ""), notes=one_line(pair.notes),
        tags=tuple(pair.tags), warnings=_warnings(results, display, results.conditions),
        checks=checks, trace=trace, trace_events=events, recorded=tuple(recorded),
        hazards=hazards, index=index_row(results, c1, c2, summary, key, display),
        json_path=f"pairs/{pid}/{pid}.json",
        volatility=matrix([f"{c.diagram} {c.label}" for c in conditions],
                          [c.alpha for c in conditions]),
        quicklook=matrix([c.label for c in with_look], [c.quicklook for c in with_look]),
        three_phase=matrix([f"{c.diagram} {c.label}" for c in with_split],
                           [c.three_phase for c in with_split]))
