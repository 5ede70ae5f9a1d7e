"""What a catalogue change does to the atlas, pair by pair, for a reader.

:func:`summarise` reduces one pair's computed results to what a reader sees at
each published condition: the behaviour class, the azeotropes (kind,
temperature, composition), whether the liquid splits, the relative-volatility
range, the quick-look stage count, plus the pair's validity range, data quality
and reference-check results.  :func:`compare` lists the differences between two
summaries (``None`` for a pair that is absent or does not load).

Thresholds below which a number is reported unchanged (common practice: well
below what the figures and tables show): 0.05 K and 0.002 mole fraction for an
azeotrope, 1 % for a relative volatility, 0.05 theoretical stages.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

from builder.analysis.results import PairResults

__all__ = ["Change", "ConditionSummary", "PairSummary", "compare", "summarise"]

AZEOTROPE_DT_K = 0.05
AZEOTROPE_DX = 0.002
ALPHA_RELATIVE = 0.01
STAGES = 0.05


@dataclass(frozen=True)
class AzeotropeSummary:
    kind: str
    T_K: float
    x1: float
    heterogeneous: bool


@dataclass(frozen=True)
class ConditionSummary:
    """What a reader sees at one published condition."""

    condition: str  # "isobar 101.325 kPa" or "isotherm 70 °C"
    behaviour: str
    azeotropes: tuple[AzeotropeSummary, ...]
    liquid_split: bool
    alpha_min: float | None
    alpha_max: float | None
    stages_min: float | None
    converged: bool


@dataclass(frozen=True)
class PairSummary:
    """One pair as the atlas publishes it (or why it is not published)."""

    id: str
    model: str = ""
    quality: str = ""
    T_range_K: tuple[float, float] | None = None
    source: str = ""
    conditions: dict[str, ConditionSummary] = field(default_factory=dict)
    checks: dict[str, bool] = field(default_factory=dict)
    error: str = ""  # not loaded or not computed: the located message(s)

    @property
    def failed_checks(self) -> list[str]:
        return [name for name, passed in self.checks.items() if not passed]


@dataclass(frozen=True)
class Change:
    """One difference a reader would notice."""

    what: str  # behaviour, azeotrope, liquid split, volatility, stages, validity, checks, ...
    condition: str  # "" for the whole pair
    before: str
    after: str
    behaviour: bool = False  # a change of behaviour (what `--fail-on behaviour` counts)
    detail: str = ""


def _finite(value: float | None) -> float | None:
    return None if value is None or not math.isfinite(value) else float(value)


def _behaviour(azeotropes: tuple[AzeotropeSummary, ...], split: bool, complete: bool) -> str:
    if any(a.heterogeneous for a in azeotropes):
        return "heterogeneous azeotrope"
    if len(azeotropes) > 1:
        return "several azeotropes"
    if azeotropes:
        kind = {"maximum-pressure": "minimum-boiling",
                "minimum-pressure": "maximum-boiling"}.get(azeotropes[0].kind,
                                                           azeotropes[0].kind)
        return f"{kind} azeotrope"
    if split:
        return "liquid split, no azeotrope"
    return "zeotropic" if complete else "uncertain (search incomplete)"


def summarise(results: PairResults) -> PairSummary:
    """The reader-visible summary of one computed pair."""
    conditions: dict[str, ConditionSummary] = {}
    for result in results.conditions:
        label = f"{result.kind} {result.label}"
        azeotropes = tuple(AzeotropeSummary(a.kind, float(a.T_K), float(a.x1),
                                            bool(a.heterogeneous)) for a in result.azeotropes)
        stable = result.liquid_stable
        split = result.three_phase is not None or (stable is not None and not bool(stable.all()))
        look = result.quicklook
        conditions[label] = ConditionSummary(
            condition=label,
            behaviour=_behaviour(azeotropes, split, result.azeotrope_search_complete),
            azeotropes=azeotropes, liquid_split=split,
            alpha_min=_finite(result.volatility.alpha_min),
            alpha_max=_finite(result.volatility.alpha_max),
            stages_min=_finite(look.stages_min) if look is not None else None,
            converged=bool(result.curve.converged.all()),
        )
    pair = results.pair
    return PairSummary(
        id=pair.id, model=pair.model_kind, quality=pair.quality,
        T_range_K=(pair.T_min_K, pair.T_max_K),
        source=f"{pair.source.ref}: {pair.source.where}",
        conditions=conditions, checks={c.name: c.passed for c in results.checks})


def _fmt(value: float | None, spec: str = ".3g") -> str:
    return "—" if value is None else format(value, spec)


def _azeotrope_text(a: AzeotropeSummary) -> str:
    return (f"{a.kind}{' (heterogeneous)' if a.heterogeneous else ''} at x1 = {a.x1:.3f}, "
            f"{a.T_K - 273.15:.2f} °C")


def _compare_condition(label: str, b: ConditionSummary, a: ConditionSummary) -> list[Change]:
    out: list[Change] = []
    if b.behaviour != a.behaviour:
        out.append(Change("behaviour", label, b.behaviour, a.behaviour, behaviour=True))
    unmatched = list(a.azeotropes)
    for old in b.azeotropes:
        match = min((n for n in unmatched if n.kind == old.kind),
                    key=lambda n: abs(n.x1 - old.x1), default=None)
        if match is None:
            out.append(Change("azeotrope", label, _azeotrope_text(old), "none",
                              behaviour=True, detail="the azeotrope vanishes"))
            continue
        unmatched.remove(match)
        dT, dx = match.T_K - old.T_K, match.x1 - old.x1
        if abs(dT) > AZEOTROPE_DT_K or abs(dx) > AZEOTROPE_DX:
            out.append(Change("azeotrope", label, _azeotrope_text(old), _azeotrope_text(match),
                              detail=f"the azeotrope moves by ΔT = {dT:+.2f} K, "
                                     f"Δx1 = {dx:+.3f}"))
    for new in unmatched:
        out.append(Change("azeotrope", label, "none", _azeotrope_text(new), behaviour=True,
                          detail="an azeotrope appears"))
    if b.liquid_split != a.liquid_split:
        out.append(Change("liquid split", label, "yes" if b.liquid_split else "no",
                          "yes" if a.liquid_split else "no", behaviour=True,
                          detail="a liquid split appears" if a.liquid_split
                          else "the liquid split vanishes"))
    alpha_b = (b.alpha_min, b.alpha_max)
    alpha_a = (a.alpha_min, a.alpha_max)
    if any((x is None) != (y is None) or (x is not None and y is not None and
                                          abs(y / x - 1.0) > ALPHA_RELATIVE)
           for x, y in zip(alpha_b, alpha_a, strict=True)):
        out.append(Change("relative volatility", label,
                          f"{_fmt(b.alpha_min)} – {_fmt(b.alpha_max)}",
                          f"{_fmt(a.alpha_min)} – {_fmt(a.alpha_max)}"))
    if (b.stages_min is None) != (a.stages_min is None) or (
            b.stages_min is not None and a.stages_min is not None
            and abs(a.stages_min - b.stages_min) > STAGES):
        out.append(Change("minimum stages", label, _fmt(b.stages_min, ".2f"),
                          _fmt(a.stages_min, ".2f")))
    if b.converged != a.converged:
        out.append(Change("convergence", label, "all points" if b.converged else "incomplete",
                          "all points" if a.converged else "incomplete"))
    return out


def compare(before: PairSummary | None, after: PairSummary | None) -> list[Change]:
    """The differences a reader would notice between two versions of one pair."""
    if before is None and after is None:
        return []
    if before is None or after is None:
        present = after if before is None else before
        assert present is not None
        state = "published" if not present.error else "not published (does not load)"
        return [Change("pair", "", "absent" if before is None else state,
                       state if before is None else "absent", behaviour=True)]
    out: list[Change] = []
    if before.error or after.error:
        if before.error != after.error:
            out.append(Change("pair", "", "not published" if before.error else "published",
                              "not published" if after.error else "published",
                              behaviour=True, detail=after.error or before.error))
        return out
    for what, old, new in (("model", before.model, after.model),
                           ("data quality", before.quality, after.quality),
                           ("source", before.source, after.source)):
        if old != new:
            out.append(Change(what, "", old, new))
    if before.T_range_K != after.T_range_K:
        out.append(Change("validity range", "", _range(before.T_range_K),
                          _range(after.T_range_K)))
    for label in sorted(set(before.conditions) | set(after.conditions)):
        b, a = before.conditions.get(label), after.conditions.get(label)
        if b is None or a is None:
            out.append(Change("condition", label, "absent" if b is None else "published",
                              "published" if b is None else "absent"))
            continue
        out += _compare_condition(label, b, a)
    for name in sorted(set(before.checks) | set(after.checks)):
        old_pass, new_pass = before.checks.get(name), after.checks.get(name)
        if old_pass != new_pass:
            out.append(Change("check", "", _verdict(old_pass), _verdict(new_pass),
                              detail=name))
    return out


def _verdict(passed: bool | None) -> str:
    return "—" if passed is None else ("pass" if passed else "FAIL")


def _range(T: tuple[float, float] | None) -> str:
    if T is None:
        return "—"
    return f"{T[0] - 273.15:.1f} – {T[1] - 273.15:.1f} °C"
