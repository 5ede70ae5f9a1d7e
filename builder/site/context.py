"""Page views: the computed results turned into display-ready, plain data.

Nothing here computes thermodynamics: every number is read from
:mod:`builder.results` (and the catalogue records) and formatted in the units
of the site settings.  The results are one typed record
(:mod:`builder.analysis.record`) whose every field exists; a section is left out
where its field is ``None`` by its documented meaning (no liquid split, no quick
look on an isotherm, no azeotrope to trace).

The views hold plain strings and numbers, never markup: the templates escape
every value (:mod:`.text`).
"""

from __future__ import annotations

import math
from collections.abc import Iterable, Sequence
from dataclasses import dataclass, field

import numpy as np
from numpy.typing import NDArray

from builder.analysis.distillation import Split
from builder.analysis.results import ConditionResult, PairResults
from builder.catalogue.loader import QUALITIES, Catalogue
from builder.catalogue.records import Component, PairRecord, Source
from builder.site.settings import SiteSettings
from builder.site.text import file_slug, fmt, one_line, safe_id

__all__ = [
    "BEHAVIOURS",
    "AtlasView",
    "ComponentView",
    "ConditionView",
    "Display",
    "IndexRow",
    "PairView",
    "build_views",
]


#: Behaviour at the summary pressure, for the summary sentence and the index filter.
BEHAVIOURS = {
    "zeotropic": "zeotropic (no azeotrope)",
    "minimum-boiling": "minimum-boiling azeotrope",
    "maximum-boiling": "maximum-boiling azeotrope",
    "heterogeneous": "heterogeneous azeotrope (two liquids)",
    "liquid-split": "two liquid phases, no azeotrope",
    "several": "more than one azeotrope",
    "uncertain": "not settled (incomplete search)",
    "not-published": "no isobar at the summary pressure",
}

#: Isotherm azeotrope kinds in words.
_KIND_WORDS = {
    "minimum-boiling": "minimum-boiling azeotrope",
    "maximum-boiling": "maximum-boiling azeotrope",
    "maximum-pressure": "maximum-pressure azeotrope (minimum-boiling)",
    "minimum-pressure": "minimum-pressure azeotrope (maximum-boiling)",
}

#: Words in a hazard summary that say the component is not classified as hazardous.
_NOT_HAZARDOUS = ("no ghs", "not classified", "no hazard")


# ---------------------------------------------------------------------------
# Units on the pages
# ---------------------------------------------------------------------------


@dataclass(frozen=True)
class Display:
    """Temperatures and pressures in the units the settings ask for."""

    settings: SiteSettings

    @property
    def T_unit(self) -> str:
        return self.settings.temperature_symbol

    @property
    def P_unit(self) -> str:
        return self.settings.pressure_unit

    def T_value(self, T_K: float) -> float:
        return T_K - 273.15 if self.settings.temperature_unit == "C" else T_K

    def T_values(self, T_K: NDArray[np.float64]) -> NDArray[np.float64]:
        return np.asarray(self.T_value(T_K), dtype=float)  # type: ignore[arg-type]

    def P_value(self, P_Pa: float) -> float:
        return P_Pa / self.settings.pressure_factor

    def T(self, T_K: float | None, decimals: int = 1) -> str:
        if T_K is None or not math.isfinite(T_K):
            return "—"
        return f"{fmt(self.T_value(T_K), decimals, fixed=True)} {self.T_unit}"

    def P(self, P_Pa: float | None, digits: int = 4) -> str:
        if P_Pa is None or not math.isfinite(P_Pa):
            return "—"
        return f"{fmt(self.P_value(P_Pa), digits)} {self.P_unit}"

    def condition(self, result: ConditionResult) -> str:
        """``101.325 kPa`` for an isobar, ``50 °C`` for an isotherm (in the site's units)."""
        if result.kind == "isobar":
            return self.P(result.condition, 6)
        return f"{fmt(self.T_value(result.condition), 6)} {self.T_unit}"


# ---------------------------------------------------------------------------
# Views
# ---------------------------------------------------------------------------


@dataclass(frozen=True)
class Row:
    """A label and a value for a two-column table."""

    label: str
    value: str
    note: str = ""


@dataclass(frozen=True)
class Matrix:
    """A table of quantities (rows) by condition (columns)."""

    columns: tuple[str, ...]
    rows: tuple[tuple[str, tuple[str, ...]], ...]

    def __bool__(self) -> bool:
        return bool(self.rows)


def matrix(columns: Sequence[str], per_column: Sequence[Sequence[Row]]) -> Matrix:
    """Rows of several conditions side by side; a quantity one condition lacks shows "—"."""
    labels: list[str] = []
    for rows in per_column:
        for row in rows:
            if row.label not in labels:
                labels.append(row.label)
    values = [{row.label: row.value for row in rows} for rows in per_column]
    return Matrix(tuple(columns), tuple((label, tuple(v.get(label, "—") for v in values))
                                        for label in labels))


@dataclass(frozen=True)
class ComponentView:
    id: str
    url: str  # site-relative path of the page, e.g. components/ethanol.md
    name: str
    synonyms: tuple[str, ...]
    cas: str
    formula: str
    identity: tuple[Row, ...]
    constants: tuple[Row, ...]
    vapour_pressure: tuple[Row, ...]
    vp_T_range_K: tuple[float, float]
    hazard: str
    hazard_source: str
    hazardous: bool
    sources: tuple[Row, ...]
    pairs: tuple[tuple[str, str, str], ...]  # (url, title, other component)
    boiling_point: str
    boiling_value: float  # in the displayed unit, for sorting

    @property
    def search_key(self) -> str:
        """``cas67663`` for CAS 67-66-3: one search token (see assets/js/atlas-search.js)."""
        return "cas" + self.cas.replace("-", "")


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
    volatility: Matrix = Matrix((), ())
    quicklook: Matrix = Matrix((), ())
    three_phase: Matrix = Matrix((), ())


@dataclass(frozen=True)
class AtlasView:
    """Everything the pages need, computed and formatted before anything is written."""

    settings: SiteSettings
    pairs: tuple[PairView, ...]
    components: tuple[ComponentView, ...]
    references: tuple[tuple[str, str], ...]  # (id, citation)
    models: tuple[str, ...]
    behaviours: tuple[tuple[str, str], ...] = field(default=())


# ---------------------------------------------------------------------------
# Builders
# ---------------------------------------------------------------------------


def _hazardous(text: str) -> bool:
    lowered = text.casefold()
    return bool(text.strip()) and not any(lowered.startswith(w) for w in _NOT_HAZARDOUS)


def _source(catalogue: Catalogue, source: Source | None) -> str:
    return one_line(catalogue.source_text(source)) if source else ""


def _component(catalogue: Catalogue, component: Component, display: Display,
               pairs: Sequence[PairRecord]) -> ComponentView:
    cid = safe_id(component.id)
    vp = component.vapour_pressure
    identity = (
        Row("Name", component.name),
        Row("Synonyms", ", ".join(component.synonyms) or "—"),
        Row("CAS number", component.cas),
        Row("Formula", component.formula),
        Row("Molar mass", f"{fmt(component.molar_mass_kg_per_mol * 1e3, 6)} g/mol"),
    )
    constants = (
        Row("Normal boiling point", display.T(component.normal_boiling_point_K, 2),
            f"{fmt(component.normal_boiling_point_K, 5)} K"),
        Row("Critical temperature", display.T(component.critical_temperature_K, 1),
            f"{fmt(component.critical_temperature_K, 5)} K"),
        Row("Critical pressure", display.P(component.critical_pressure_Pa),
            f"{fmt(component.critical_pressure_Pa / 1e6, 5)} MPa"),
        Row("Acentric factor ω", fmt(component.acentric_factor, 4)),
        Row("Liquid molar volume", f"{fmt(component.liquid_molar_volume_m3_per_mol * 1e6, 5)}"
            " cm³/mol"),
    )
    uq: tuple[Row, ...] = ()
    if component.uniquac_r is not None and component.uniquac_q is not None:
        uq = (Row("UNIQUAC r, q", f"{fmt(component.uniquac_r, 5)}, "
                  f"{fmt(component.uniquac_q, 5)}"),)
    vp_rows = (
        Row("Equation (SI)", vp.equation()),
        Row("Validity range", f"{display.T(vp.T_min_K, 1)} to {display.T(vp.T_max_K, 1)}",
            f"{fmt(vp.T_min_K, 5)} K to {fmt(vp.T_max_K, 5)} K"),
        Row("Source", _source(catalogue, component.vapour_pressure_source)),
    )
    sources = tuple(Row(name.replace("_", " ").capitalize(), _source(catalogue, src))
                    for name, src in sorted(component.constants_sources.items()))
    if component.uniquac_source is not None:
        sources += (Row("UNIQUAC r, q", _source(catalogue, component.uniquac_source)),)
    member = []
    for pair in pairs:
        if component.id in (pair.component1, pair.component2):
            other_id = pair.component2 if pair.component1 == component.id else pair.component1
            other = catalogue.components[other_id]
            member.append((f"pairs/{safe_id(pair.id)}.md", _pair_title(catalogue, pair),
                           other.name))
    return ComponentView(
        id=cid, url=f"components/{cid}.md", name=one_line(component.name),
        synonyms=tuple(component.synonyms), cas=component.cas, formula=component.formula,
        identity=identity, constants=constants + uq, vapour_pressure=vp_rows,
        vp_T_range_K=(vp.T_min_K, vp.T_max_K),
        hazard=one_line(component.hazard), hazard_source=_source(catalogue,
                                                                  component.hazard_source),
        hazardous=_hazardous(component.hazard), sources=sources, pairs=tuple(member),
        boiling_point=display.T(component.normal_boiling_point_K, 1),
        boiling_value=display.T_value(component.normal_boiling_point_K))


def _pair_title(catalogue: Catalogue, pair: PairRecord) -> str:
    c1 = catalogue.components[pair.component1]
    c2 = catalogue.components[pair.component2]
    return f"{one_line(c1.name)} + {one_line(c2.name)}"


def summary_condition(results: PairResults, settings: SiteSettings) -> ConditionResult | None:
    """The isobar at the summary pressure, if the pair publishes it."""
    for result in results.isobars:
        if abs(result.condition - settings.summary_pressure_Pa) < 1.0:
            return result
    return None


def behaviour(result: ConditionResult | None) -> str:
    """The behaviour key (see :data:`BEHAVIOURS`) of one isobar."""
    if result is None:
        return "not-published"
    three = result.three_phase
    azeotropes = result.azeotropes
    if three is not None:
        if three.heterogeneous_azeotrope or any(a.heterogeneous for a in azeotropes):
            return "heterogeneous"
        if not azeotropes:
            return "liquid-split"
    if any(a.heterogeneous for a in azeotropes):
        return "heterogeneous"
    if len(azeotropes) > 1:
        return "several"
    if len(azeotropes) == 1:
        kind = azeotropes[0].kind
        return {"maximum-pressure": "minimum-boiling",
                "minimum-pressure": "maximum-boiling"}.get(kind, kind)
    if not result.azeotrope_search_complete:
        return "uncertain"
    return "zeotropic"


def _alpha_range(result: ConditionResult) -> str:
    v = result.volatility
    return f"{fmt(v.alpha_min, 3)} – {fmt(v.alpha_max, 3)}"


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
        parts = [f"{_KIND_WORDS.get(a.kind, a.kind)} (x1 = {fmt(a.x1, 3)}, {display.T(a.T_K)})"
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
    return tuple(AzeotropeRow(kind=_KIND_WORDS.get(a.kind, a.kind), x1=fmt(a.x1, 4),
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
    if quality in ("unverified", "demo", "predicted"):
        out.append(f"Parameter quality '{quality}': {QUALITIES.get(quality, '')}.")
    return tuple(out)


def _index_row(results: PairResults, c1: ComponentView, c2: ComponentView,
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
        alpha_range=_alpha_range(summary) if summary is not None else "—",
        alpha_sort=summary.volatility.alpha_min if summary is not None else nan,
        model=results.pair.model.name, quality=results.pair.quality)


def _pair(catalogue: Catalogue, results: PairResults, components: dict[str, ComponentView],
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
                rows.append(Row(f"Azeotrope at {at}", f"{_KIND_WORDS.get(a.kind, a.kind)}"
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
        rows.append(Row(f"Relative volatility α12 at {at}",
                        f"{_alpha_range(summary)} ({summary.volatility.grade_text})"))
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
                                f"{_KIND_WORDS.get(rz.kind, rz.kind)}"
                                + (f", x1 = {fmt(rz.x1, 3)}" if rz.x1 is not None else "")
                                + (f", {display.T(rz.T_K)}" if rz.T_K is not None else ""),
                                _source(catalogue, rz.source)))
        for P in rec.zeotropic_at_Pa:
            recorded.append(Row(f"No azeotrope at {display.P(P, 6)}", "recorded zeotropic",
                                _source(catalogue, rec.source)))
        if rec.liquid_split is not None:
            recorded.append(Row("Liquid-liquid split", "recorded" if rec.liquid_split else
                                "none recorded", _source(catalogue, rec.source)))
    hazards = tuple((c.name, c.hazard, c.hazard_source, c.hazardous) for c in (c1, c2))
    with_look = [c for c in conditions if c.quicklook]
    with_split = [c for c in conditions if c.three_phase]
    return PairView(
        id=pid, url=f"pairs/{pid}.md", title=f"{c1.name} + {c2.name}", c1=c1, c2=c2,
        sentence=sentence, behaviour=key, summary=tuple(rows),
        summary_label=at if summary is not None else "",
        conditions=conditions, model=pair.model.name, model_kind=pair.model_kind,
        parameters=parameters, parameters_si=parameters_si,
        validity=f"{display.T(pair.T_min_K)} to {display.T(pair.T_max_K)} "
                 f"({fmt(pair.T_min_K, 5)} K to {fmt(pair.T_max_K, 5)} K)",
        source=_source(catalogue, pair.source), quality=pair.quality,
        quality_text=QUALITIES.get(pair.quality, ""), notes=one_line(pair.notes),
        tags=tuple(pair.tags), warnings=_warnings(results, display, results.conditions),
        checks=checks, trace=trace, trace_events=events, recorded=tuple(recorded),
        hazards=hazards, index=_index_row(results, c1, c2, summary, key, display),
        json_path=f"pairs/{pid}/{pid}.json",
        volatility=matrix([f"{c.diagram} {c.label}" for c in conditions],
                          [c.alpha for c in conditions]),
        quicklook=matrix([c.label for c in with_look], [c.quicklook for c in with_look]),
        three_phase=matrix([f"{c.diagram} {c.label}" for c in with_split],
                           [c.three_phase for c in with_split]))


def build_views(settings: SiteSettings, catalogue: Catalogue,
                atlas: dict[str, PairResults]) -> AtlasView:
    """Every page's data, from the catalogue and the computed results."""
    display = Display(settings)
    pairs = [atlas[pid].pair for pid in sorted(atlas)]
    components = {cid: _component(catalogue, catalogue.components[cid], display, pairs)
                  for cid in sorted(catalogue.components)}
    pair_views = tuple(_pair(catalogue, atlas[pid], components, display, settings)
                       for pid in sorted(atlas))
    cited = sorted(catalogue.references.items())
    return AtlasView(
        settings=settings, pairs=pair_views,
        components=tuple(components.values()),
        references=tuple((rid, one_line(ref.citation())) for rid, ref in cited),
        models=tuple(sorted({r.pair.model.name for r in atlas.values()})),
        behaviours=tuple((k, v) for k, v in BEHAVIOURS.items()
                         if any(p.behaviour == k for p in pair_views)),
    )
