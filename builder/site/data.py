"""The numbers behind the pages, as downloads: CSV of every curve and table, and JSON.

CSV files are in SI (K, Pa, mole fractions) whatever the pages show, with the
unit in each column name; a column header names component 1 and 2 by their
catalogue ids (safe slugs), never by free text, so no spreadsheet formula can
arrive through a name.  ``atlas.json`` holds each pair's key results for other
intranet tools (format ``vle-atlas/2``, described by ``docs/atlas-json.schema.json``):
every number is a JSON number in SI or with its unit in the key, model parameters are
objects (``{"g12_J_per_mol": -242.5}``, ``{"a": -1.42, "b_K": -390.2}``); each pair also
has its own JSON.
"""

from __future__ import annotations

import csv
import dataclasses
import io
import json
import math
from collections.abc import Iterable, Mapping
from typing import TYPE_CHECKING, Any

import numpy as np

from builder.analysis.results import ConditionResult, PairResults
from builder.catalogue.loader import Catalogue
from builder.catalogue.records import Component
from builder.site.behaviour import behaviour, summary_condition
from builder.site.pair_view import PairView
from builder.site.settings import SiteSettings
from builder.site.text import safe_id
from builder.thermo.vapour_pressure import Antoine, ExtendedAntoine

if TYPE_CHECKING:  # the view imports the pair entries, which write with plain() of this module
    from builder.site.context import AtlasView

__all__ = ["FORMAT", "atlas_json", "condition_csvs", "pair_json", "plain"]

FORMAT = "vle-atlas/2"


def plain(value: Any) -> Any:
    """A result object as JSON-ready data (dataclasses, numpy arrays, NaN as null)."""
    if value is None or isinstance(value, (bool, str)):
        return value
    if isinstance(value, (int, np.integer)):
        return int(value)
    if isinstance(value, (float, np.floating)):
        number = float(value)
        return number if math.isfinite(number) else None
    if isinstance(value, np.ndarray):
        return [plain(v) for v in value.tolist()]
    to_json = getattr(value, "to_json", None)
    if callable(to_json):
        return plain(to_json())
    if dataclasses.is_dataclass(value) and not isinstance(value, type):
        data = {f.name: plain(getattr(value, f.name)) for f in dataclasses.fields(value)}
        for name in ("heterogeneous_azeotrope",):
            if hasattr(value, name):
                data[name] = plain(getattr(value, name))
        return data
    if isinstance(value, Mapping):
        return {str(k): plain(v) for k, v in value.items()}
    if isinstance(value, Iterable):
        return [plain(v) for v in value]
    return str(value)


def _csv(header: list[str], rows: Iterable[Iterable[object]]) -> bytes:
    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\n")
    writer.writerow(header)
    for row in rows:
        writer.writerow(["" if v is None else v for v in row])
    return buffer.getvalue().encode("utf-8")


def _number(value: float) -> str:
    return "" if not math.isfinite(value) else f"{value:.10g}"


def condition_csvs(results: PairResults, result: ConditionResult) -> tuple[bytes, bytes]:
    """The whole curve and the table at round compositions of one condition."""
    i1, i2 = safe_id(results.component1.id), safe_id(results.component2.id)
    c = result.curve
    header = [f"x1 ({i1}, liquid)", f"y1 ({i1}, vapour)", "T_K", "P_Pa",
              f"gamma1 ({i1})", f"gamma2 ({i2})", "alpha12", "converged", "drawn",
              "extrapolated"]
    curve = _csv(header, (
        [_number(c.x1[i]), _number(c.y1[i]), _number(c.T_K[i]), _number(c.P_Pa[i]),
         _number(c.gamma1[i]), _number(c.gamma2[i]), _number(c.alpha12[i]),
         int(bool(c.converged[i])), int(bool(result.drawable[i])),
         int(bool(result.extrapolated[i]))]
        for i in range(c.x1.size)))
    table = _csv(header[:8], (
        [_number(r.x1), _number(r.y1), _number(r.T_K), _number(r.P_Pa), _number(r.gamma1),
         _number(r.gamma2), _number(r.alpha12), int(r.converged)]
        for r in result.volatility.table))
    return curve, table


def _component(component: Component, pair_ids: list[str]) -> dict[str, Any]:
    return {
        "id": component.id, "name": component.name, "synonyms": list(component.synonyms),
        "cas": component.cas, "formula": component.formula,
        "molar_mass_kg_per_mol": component.molar_mass_kg_per_mol,
        "normal_boiling_point_K": component.normal_boiling_point_K,
        "critical_temperature_K": component.critical_temperature_K,
        "critical_pressure_Pa": component.critical_pressure_Pa,
        "acentric_factor": component.acentric_factor,
        "vapour_pressure": _vapour_pressure(component),
        "hazard": component.hazard,
        "page": f"components/{safe_id(component.id)}.html",
        "pairs": pair_ids,
    }


def _vapour_pressure(component: Component) -> dict[str, Any]:
    """The correlation in SI: ``ln(P/Pa) = A - B_K/(T/K + C_K)`` or the DIPPR-101 form."""
    vp = component.vapour_pressure
    data: dict[str, Any] = {"equation": vp.equation(), "T_min_K": vp.T_min_K,
                            "T_max_K": vp.T_max_K}
    if isinstance(vp, Antoine):
        data.update(form="ln(P/Pa) = A - B_K/(T/K + C_K)", A=vp.A, B_K=vp.B, C_K=vp.C)
    elif isinstance(vp, ExtendedAntoine):
        data.update(form="ln(P/Pa) = A + B_K/(T/K) + C ln(T/K) + D (T/K)^E", A=vp.A,
                    B_K=vp.B, C=vp.C, D=vp.D, E=vp.E)
    return data


def _condition(result: ConditionResult, view_csv: tuple[str, str]) -> dict[str, Any]:
    v = result.volatility
    data: dict[str, Any] = {
        "kind": result.kind,
        "P_Pa" if result.kind == "isobar" else "T_K": result.condition,
        "label": result.label,
        "behaviour": behaviour(result) if result.kind == "isobar" else None,
        "azeotropes": plain(result.azeotropes),
        "azeotrope_search_complete": result.azeotrope_search_complete,
        "volatility": {
            "alpha12_infinite_dilution_1": plain(v.alpha_infinite_dilution_1),
            "alpha12_infinite_dilution_2": plain(v.alpha_infinite_dilution_2),
            "alpha12_min": plain(v.alpha_min), "x1_at_min": plain(v.x1_at_min),
            "alpha12_max": plain(v.alpha_max), "x1_at_max": plain(v.x1_at_max),
            "lighter_over_heavier_min": plain(v.lighter_over_heavier_min),
            "grade": v.grade, "grade_text": v.grade_text,
        },
        "warnings": list(result.warnings),
        "vapour_model": result.curve.vapour_model,
        "critical_point": None if result.curve.critical is None else {
            "x1": result.curve.critical.x1, "T_K": result.curve.critical.T_K,
            "P_Pa": result.curve.critical.P_Pa},
        "no_two_phase": result.curve.no_two_phase or None,
        "curve_csv": view_csv[0],
        "table_csv": view_csv[1],
    }
    for name, value in (("three_phase", result.three_phase), ("quicklook", result.quicklook)):
        if value is not None:
            data[name] = plain(value)
    return data


def vapour_model(results: PairResults) -> str:
    """The vapour treatment the pair's curves were computed with."""
    conditions = results.conditions
    return conditions[0].curve.vapour_model if conditions else ""


def pair_json(results: PairResults, view: PairView, settings: SiteSettings) -> dict[str, Any]:
    """Key results of one pair (SI), for ``atlas.json`` and the pair's own JSON file."""
    pair = results.pair
    summary = summary_condition(results, settings)
    data: dict[str, Any] = {
        "id": pair.id,
        "page": view.url.replace(".md", ".html"),
        "components": [results.component1.id, results.component2.id],
        "names": [results.component1.name, results.component2.name],
        "cas": [results.component1.cas, results.component2.cas],
        "normal_boiling_points_K": [results.component1.normal_boiling_point_K,
                                    results.component2.normal_boiling_point_K],
        "model": pair.model.name,
        "vapour_model": vapour_model(results),
        "parameters": dict(pair.parameters),
        "parameters_T_range_K": [pair.T_min_K, pair.T_max_K],
        "quality": pair.quality,
        "source": {"ref": pair.source.ref, "where": pair.source.where,
                   "from_memory": pair.source.from_memory},
        "summary_P_Pa": summary.condition if summary is not None else None,
        "behaviour": behaviour(summary),
        "conditions": [_condition(r, (v.curve_csv, v.table_csv))
                       for r, v in zip(results.conditions, view.conditions, strict=True)],
        "warnings": list(view.warnings),
    }
    if results.trace is not None:
        data["trace"] = plain(results.trace)
    data["checks"] = plain(results.checks)
    return data


#: Where the pairs' entries go in the text of ``atlas.json`` (see :func:`atlas_json`).
_PAIRS_SLOT = "\0pairs\0"


def atlas_json(view: AtlasView, catalogue: Catalogue) -> bytes:
    """The machine-readable atlas: every pair's key results and every component.

    Each pair's entry comes as the compact JSON its worker wrote
    (:attr:`~.pair_entry.PairEntry.json`), one pair per line; the rest is indented.
    """
    members: dict[str, list[str]] = {cid: [] for cid in catalogue.components}
    for entry in view.pairs:
        members[entry.component1].append(entry.id)
        members[entry.component2].append(entry.id)
    data = {
        "format": FORMAT,
        "title": view.settings.title,
        "units": {"temperature": "K", "pressure": "Pa", "composition":
                  "mole fraction of component 1 (the first of 'components')"},
        "summary_pressure_Pa": view.settings.summary_pressure_Pa,
        "caution": "Screening only: design rests on measured data, local codes and licensed "
                   "engineering practice.",
        "pairs": _PAIRS_SLOT,
        "components": [_component(catalogue.components[cid], sorted(members[cid]))
                       for cid in sorted(catalogue.components)],
        "references": {rid: ref.citation() for rid, ref in sorted(catalogue.references.items())},
    }
    text = json.dumps(plain(data), indent=1, ensure_ascii=False, allow_nan=False)
    pairs = ",\n".join(e.json for e in sorted(view.pairs, key=lambda e: e.id))
    # The slot is the first string value after the title (the settings' own text), so the
    # first match is it.
    text = text.replace(json.dumps(_PAIRS_SLOT), f"[\n{pairs}\n ]" if pairs else "[]", 1)
    return (text + "\n").encode("utf-8")
