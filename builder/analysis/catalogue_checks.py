"""``atlas check``: validate the catalogue and run its reference checks.

What a catalogue pull request runs.  Three groups of checks:

* **Components.** The vapour-pressure correlation's boiling point at
  101.325 kPa against the catalogue's normal boiling point (0.5 K); the
  correlation against CoolProp's reference equation of state wherever
  CoolProp has the fluid (2 % over the validity range); against the
  ``chemicals`` package's transcription of the Poling et al. Antoine table
  where present (0.5 %: a transcription check).  CoolProp and chemicals are
  the test extra's packages; without them these checks are reported skipped.
* **Pairs.** Every published condition converges and was searched over the
  whole composition range; the model's azeotrope at 101.325 kPa against the
  recorded one (1 K, 0.03 mole fraction), "no azeotrope" where the tables list
  the pair as zeotropic, and the liquid-liquid behaviour against the record
  (:mod:`builder.checks`).
* **Sources.** Every reference named in the catalogue exists (the loader
  enforces this) and is listed in the report.

Failures name the file, entry and field with the expected and found values;
the exit status is non-zero when any check fails.
"""

from __future__ import annotations

import math
import warnings
from collections.abc import Iterable, Mapping, Sequence
from dataclasses import dataclass
from typing import Protocol

import numpy as np

from builder.analysis.results import PairResults, compute_pair
from builder.catalogue.loader import Catalogue
from builder.catalogue.records import Component

__all__ = ["COOLPROP_HEOS", "ComponentCheck", "check_component", "check_components",
           "failed_sets", "failure_lines", "markdown_report", "run_checks"]

#: Catalogue ids of fluids that CoolProp 8 models with a reference (Helmholtz) equation
#: of state, and CoolProp's names for them.
COOLPROP_HEOS = {
    "water": "Water", "methanol": "Methanol", "ethanol": "Ethanol", "acetone": "Acetone",
    "benzene": "Benzene", "toluene": "Toluene", "ethylbenzene": "EthylBenzene",
    "o-xylene": "o-Xylene", "m-xylene": "m-Xylene", "p-xylene": "p-Xylene",
    "n-pentane": "n-Pentane", "isopentane": "Isopentane", "n-hexane": "n-Hexane",
    "n-heptane": "n-Heptane", "n-octane": "n-Octane", "cyclohexane": "CycloHexane",
    "cyclopentane": "Cyclopentane", "diethyl-ether": "DiethylEther", "propane": "n-Propane",
    "n-butane": "n-Butane", "isobutane": "IsoButane", "propylene": "Propylene",
    "1-2-dichloroethane": "Dichloroethane", "1-butene": "1-Butene",
    "n-nonane": "n-Nonane", "n-decane": "n-Decane", "n-undecane": "n-Undecane",
    "n-dodecane": "n-Dodecane", "2-methylpentane": "Isohexane",
}

BOILING_POINT_TOLERANCE_K = 0.5
COOLPROP_TOLERANCE = 0.02
TRANSCRIPTION_TOLERANCE = 0.005


@dataclass(frozen=True)
class ComponentCheck:
    component: str
    file: str
    name: str
    passed: bool | None  # None: skipped (reference not available)
    expected: str
    found: str
    deviation: float | None = None  # K for boiling points, fraction for pressures


def _coolprop_deviation(component: Component) -> float | None:
    try:
        from CoolProp.CoolProp import PropsSI
    except ImportError:
        return None
    name = COOLPROP_HEOS[component.id]
    vp = component.vapour_pressure
    T = np.linspace(vp.T_min_K, vp.T_max_K, 40)
    reference = []
    for t in T:
        try:
            reference.append(PropsSI("P", "T", float(t), "Q", 0, "HEOS::" + name))
        except ValueError:  # below CoolProp's triple point or above its critical point
            reference.append(math.nan)
    ref = np.array(reference)
    ok = np.isfinite(ref)
    if not ok.any():
        return None
    return float(np.max(np.abs(vp.pressure_Pa(T[ok]) / ref[ok] - 1.0)))


def _poling_deviation(component: Component) -> float | None:
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            from chemicals.vapor_pressure import Psat_data_AntoinePoling
    except ImportError:
        return None
    if component.cas not in Psat_data_AntoinePoling.index:
        return None
    row = Psat_data_AntoinePoling.loc[component.cas]
    vp = component.vapour_pressure
    T = np.linspace(vp.T_min_K, vp.T_max_K, 20)
    # The chemicals table stores log10(P/Pa) = A - B/(T/K + C).
    ref = 10.0 ** (float(row["A"]) - float(row["B"]) / (T + float(row["C"])))
    return float(np.max(np.abs(vp.pressure_Pa(T) / ref - 1.0)))


def check_component(component: Component) -> list[ComponentCheck]:
    """Boiling point, CoolProp and Poling-table checks of one component."""
    out: list[ComponentCheck] = []
    Tb = float(component.vapour_pressure.temperature_K(101325.0))
    dT = Tb - component.normal_boiling_point_K
    out.append(ComponentCheck(
        component.id, component.file, "vapour_pressure: boiling point at 101.325 kPa",
        abs(dT) <= BOILING_POINT_TOLERANCE_K,
        f"{component.normal_boiling_point_K:.2f} K ± {BOILING_POINT_TOLERANCE_K} K "
        "(constants.normal_boiling_point)", f"{Tb:.2f} K", dT))
    if component.id in COOLPROP_HEOS:
        dev = _coolprop_deviation(component)
        out.append(ComponentCheck(
            component.id, component.file, "vapour_pressure: against CoolProp (HEOS)",
            None if dev is None else dev <= COOLPROP_TOLERANCE,
            f"within {COOLPROP_TOLERANCE:.0%} over the validity range",
            "skipped (CoolProp not installed)" if dev is None else f"max {dev:.2%}", dev))
    dev = _poling_deviation(component)
    if dev is not None and component.vapour_pressure_source.ref == "poling-2001":
        out.append(ComponentCheck(
            component.id, component.file,
            "vapour_pressure: transcription of Poling et al. Appendix A",
            dev <= TRANSCRIPTION_TOLERANCE,
            f"the table as in the chemicals package, within {TRANSCRIPTION_TOLERANCE:.1%}",
            f"max {dev:.3%}", dev))
    return out


def check_components(catalogue: Catalogue) -> list[ComponentCheck]:
    """Boiling point, CoolProp and Poling-table checks of every component."""
    return [check for component in catalogue.components.values()
            for check in check_component(component)]


def failure_lines(checks: Iterable[ComponentCheck]) -> tuple[str, ...]:
    """The located line of each failed component check (file, entry, check, expected,
    found)."""
    return tuple(f"{c.file}: entry {c.component!r}, check {c.name!r}: expected {c.expected}; "
                 f"found {c.found}" for c in checks if c.passed is False)


@dataclass(frozen=True)
class CheckRun:
    components: list[ComponentCheck]
    pairs: dict[str, PairResults]
    #: Files that did not load and pairs whose computation failed, one located line each.
    problems: tuple[str, ...] = ()

    @property
    def failures(self) -> list[str]:
        lines = list(self.problems)
        lines += failure_lines(self.components)
        for result in self.pairs.values():
            for check in result.failed_checks:
                lines.append(f"{result.pair.file}: entry {result.pair.id!r}, check "
                             f"{check.name!r}: {check.detail} (reference: {check.reference})")
        return lines


class CheckedPair(Protocol):
    """A computed pair as :func:`failed_sets` reads it (e.g. the build's pair entries)."""

    @property
    def component1(self) -> str: ...

    @property
    def component2(self) -> str: ...

    @property
    def failed_checks(self) -> Sequence[tuple[str, str]]:
        """Every failed check: ``(name, detail)``."""
        ...


def failed_sets(catalogue: Catalogue, pairs: Mapping[str, CheckedPair],
                components: Mapping[str, Sequence[str]] | None = None
                ) -> dict[str, list[str]]:
    """Pair id -> the located failures of every pair whose checks fail (its own reference
    checks, or a failed check of one of its components): what ``atlas build`` withholds.

    ``pairs``: every computed pair by id; one of ``catalogue`` is located by its file, a
    predicted one by its id.  ``components``: each component's failed checks as located
    lines (:func:`failure_lines`; the build takes them from its cached component work),
    else they are checked here."""
    if components is None:
        components = {c.id: failure_lines(check_component(c))
                      for c in catalogue.components.values()}
    out: dict[str, list[str]] = {}
    for pid, computed in pairs.items():
        record = catalogue.pairs.get(pid)
        where = record.file if record is not None else f"predicted pair {pid}"
        lines = [f"{where}: entry {pid!r}, check {name!r}: {detail}"
                 for name, detail in computed.failed_checks]
        for cid in (computed.component1, computed.component2):
            lines += components.get(cid, ())
        if lines:
            out[pid] = lines
    return out


def run_checks(catalogue: Catalogue, problems: Iterable[str] = ()) -> CheckRun:
    """Every component and pair check; a pair whose computation fails is reported (file,
    entry, what failed) and the other pairs are still checked."""
    results: dict[str, PairResults] = {}
    failed = list(problems)
    for pid in sorted(catalogue.pairs):
        pair = catalogue.pairs[pid]
        try:
            with np.errstate(all="ignore"), warnings.catch_warnings():
                warnings.simplefilter("ignore", RuntimeWarning)
                results[pid] = compute_pair(catalogue, pair)
        except (ArithmeticError, ValueError) as error:
            failed.append(f"{pair.file}: entry {pid!r}: expected a pair the solvers can "
                          f"compute; found {type(error).__name__}: {error}")
    return CheckRun(check_components(catalogue), results, tuple(failed))


def _fmt(value: float | None, spec: str) -> str:
    return "—" if value is None else format(value, spec)


def markdown_report(catalogue: Catalogue, run: CheckRun) -> str:
    """The catalogue's check results and sources as a Markdown page for the docs."""
    lines = [
        "# Catalogue checks and sources",
        "",
        "Generated by `atlas check --report`. Screening data: design rests on measured data, "
        "local codes and licensed engineering practice.",
        "",
        f"{len(catalogue.components)} components, {len(catalogue.pairs)} pairs, "
        f"{len(catalogue.references)} references; {len(run.failures)} failed checks.",
        "",
        "## Azeotropes at 101.325 kPa against published tables",
        "",
        "Tolerance 1 K and 0.03 mole fraction (common practice for screening). Recorded values "
        "marked *(m)* were transcribed from memory and await verification against the "
        "printed table.",
        "",
        "| pair | model | kind | model x1 | model T (°C) | recorded x1 | recorded T (°C) | ΔT (K) "
        "| Δx1 | result |",
        "|---|---|---|---|---|---|---|---|---|---|",
    ]
    for pid, result in run.pairs.items():
        recorded = result.pair.recorded
        at_atm = result.at_atmospheric()
        if recorded is None or at_atm is None:
            continue
        for check in result.checks:
            if "azeotrope at 101.325 kPa" not in check.name:
                continue
            memo = " *(m)*" if "from memory" in check.reference else ""
            if check.name.startswith("no azeotrope"):
                lines.append(f"| {pid} | {result.pair.model.name} | zeotropic{memo} | — | — | — "
                             f"| — | — | — | {'pass' if check.passed else 'FAIL'}: "
                             f"{check.detail} |")
                continue
            kind = check.name.split(" azeotrope")[0]
            model = min((a for a in at_atm.azeotropes if a.kind == kind),
                        key=lambda a: abs(check.deviation_x1 or 0.0), default=None)
            rec = next((a for a in recorded.azeotropes if a.kind == kind), None)
            lines.append(
                f"| {pid} | {result.pair.model.name} | {kind}{memo} | "
                f"{_fmt(model.x1 if model else None, '.3f')} | "
                f"{_fmt(model.T_K - 273.15 if model else None, '.2f')} | "
                f"{_fmt(rec.x1 if rec else None, '.3f')} | "
                f"{_fmt(rec.T_K - 273.15 if rec and rec.T_K else None, '.2f')} | "
                f"{_fmt(check.deviation_T_K, '+.2f')} | {_fmt(check.deviation_x1, '+.3f')} | "
                f"{'pass' if check.passed else 'FAIL'} |")
    lines += ["", "## Other pair checks", "", "| pair | check | result | detail |",
              "|---|---|---|---|"]
    for pid, result in run.pairs.items():
        for check in result.checks:
            if "azeotrope at 101.325 kPa" in check.name:
                continue
            lines.append(f"| {pid} | {check.name} | {'pass' if check.passed else 'FAIL'} | "
                         f"{check.detail} |")
    lines += ["", "## Vapour pressures", "",
              "| component | check | expected | found | result |", "|---|---|---|---|---|"]
    for c in run.components:
        verdict = "skipped" if c.passed is None else ("pass" if c.passed else "FAIL")
        lines.append(f"| {c.component} | {c.name} | {c.expected} | {c.found} | {verdict} |")
    lines += ["", "## Sources", ""]
    for ref in sorted(catalogue.references.values(), key=lambda r: r.id):
        lines.append(f"- **{ref.id}**: {_escape(ref.citation())}")
    return "\n".join(lines) + "\n"


def _escape(text: str) -> str:
    """Catalogue text is data: neutralise Markdown/HTML markup characters."""
    for char in "\\`*_{}[]<>#|":
        text = text.replace(char, "\\" + char)
    return text


def summary_lines(run: CheckRun) -> Iterable[str]:
    comp_total = sum(1 for c in run.components if c.passed is not None)
    comp_pass = sum(1 for c in run.components if c.passed)
    skipped = sum(1 for c in run.components if c.passed is None)
    pair_checks = [c for r in run.pairs.values() for c in r.checks]
    yield f"{'checks':<28}{'passed':>8}{'failed':>8}{'skipped':>9}"
    yield (f"{'components':<28}{comp_pass:>8}{comp_total - comp_pass:>8}{skipped:>9}")
    yield (f"{'pairs':<28}{sum(c.passed for c in pair_checks):>8}"
           f"{sum(not c.passed for c in pair_checks):>8}{0:>9}")
