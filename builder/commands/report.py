"""``atlas calc azeotrope | volatility | quicklook``: condition analyses for the command line.

Each prints a readable report or, with ``--json``, one JSON object whose
compositions refer to the first named component.  The numbers come from
:func:`builder.results.compute_condition`, the same code the site uses.
"""

from __future__ import annotations

import argparse
import json
import math
from typing import Any

from builder.analysis.point import system_for
from builder.analysis.results import ConditionResult, compute_condition, swapped_pair
from builder.analysis.trace import trace_azeotrope
from builder.catalogue.loader import Catalogue
from builder.catalogue.lookup import find_pair_or_prediction
from builder.catalogue.records import PairRecord
from builder.errors import AtlasError
from builder.thermo.units import format_pressure, format_temperature

__all__ = ["ANALYSES", "condition_json", "run"]

ANALYSES = ("azeotrope", "volatility", "quicklook")


def _number(value: float | None) -> float | None:
    return None if value is None or not math.isfinite(value) else value


def condition_json(result: ConditionResult, what: str) -> dict[str, Any]:
    """The JSON object of one analysis of one condition."""
    data: dict[str, Any] = {"condition": result.kind}
    data["P_Pa" if result.kind == "isobar" else "T_K"] = result.condition
    if what == "azeotrope":
        data["azeotropes"] = [a.to_json() for a in result.azeotropes]
        data["search_complete"] = result.azeotrope_search_complete
        tp = result.three_phase
        data["three_phase"] = None if tp is None else {
            "T_K": tp.T_K, "P_Pa": tp.P_Pa, "liquid_x1": [tp.x1_a, tp.x1_b], "y1": tp.y1,
            "heterogeneous_azeotrope": tp.heterogeneous_azeotrope}
    elif what == "volatility":
        v = result.volatility
        data.update({
            "alpha12_infinite_dilution": [v.alpha_infinite_dilution_1,
                                          v.alpha_infinite_dilution_2],
            "alpha12_min": v.alpha_min, "x1_at_min": v.x1_at_min,
            "alpha12_max": v.alpha_max, "x1_at_max": v.x1_at_max,
            "grade": v.grade, "grade_text": v.grade_text,
            "table": [{"x1": r.x1, "y1": r.y1, "T_K": r.T_K, "P_Pa": r.P_Pa,
                       "gamma": [r.gamma1, r.gamma2], "alpha12": r.alpha12,
                       "converged": r.converged} for r in v.table],
        })
    else:
        q = result.quicklook
        assert q is not None
        split = q.split
        data.update({
            "requested": {"distillate_x1": q.requested.distillate_x1,
                          "bottoms_x1": q.requested.bottoms_x1,
                          "feed_x1": q.requested.feed_x1},
            "split": None if split is None else {
                "distillate_x1": _number(split.distillate_x1),
                "bottoms_x1": _number(split.bottoms_x1), "feed_x1": _number(split.feed_x1)},
            "top_component": q.top_component,
            "limited_by": q.limited_by,
            "stages_min": q.stages_min, "fenske_stages": q.fenske_stages,
            "alpha_top": q.alpha_top, "alpha_bottom": q.alpha_bottom,
            "reflux_min": q.reflux_min, "pinch": q.pinch, "pinch_x1": q.pinch_x1,
            "reason": q.reason,
        })
    data["warnings"] = list(result.warnings)
    return data


def run(args: argparse.Namespace, catalogue: Catalogue) -> int:
    """Run one analysis from parsed ``atlas calc`` arguments."""
    if args.x is not None or args.y is not None:
        raise AtlasError(f"{args.kind} analyses the whole composition range: drop --x/--y")
    if (args.P is None) == (args.T is None):
        raise AtlasError(f"{args.kind} needs either --P (an isobar) or --T (an isotherm)")
    if args.kind == "quicklook" and args.P is None:
        raise AtlasError("quicklook is for an isobar: give --P")
    given = [args.distillate, args.bottoms, args.feed]
    if args.kind != "quicklook" and any(v is not None for v in given):
        raise AtlasError("--distillate, --bottoms and --feed go with quicklook")
    split = None
    if any(v is not None for v in given):
        if not all(v is not None for v in given):
            raise AtlasError("give all three of --distillate, --bottoms and --feed")
        D, B, F = given
        if not (min(D, B) < F < max(D, B)):
            raise AtlasError("the feed must lie between the bottoms and the distillate")
        split = (D, B, F)
    pair, swapped, c1, c2 = find_pair_or_prediction(catalogue, args.first, args.second,
                                                    getattr(args, "model", "auto"))
    kind = "isobar" if args.P is not None else "isotherm"
    result = compute_condition(catalogue, pair, kind, args.P if args.P is not None else args.T,
                               swapped=swapped, split_x1=split)
    data = {"analysis": args.kind, "pair": pair.id, "components": [c1.id, c2.id],
            "model": pair.model.name, "quality": pair.quality,
            **condition_json(result, args.kind)}
    if getattr(args, "trace", False):
        if args.kind != "azeotrope" or kind != "isobar":
            raise AtlasError("--trace goes with azeotrope at a pressure (--P)")
        data["trace"] = _trace_json(catalogue, pair, swapped, result)
    if args.json:
        print(json.dumps(data, indent=2))
    else:
        print(_text(args.kind, data, c1.name, c2.name))
    return 0


def _trace_json(catalogue: Catalogue, pair: PairRecord, swapped: bool,
                result: ConditionResult) -> dict[str, Any] | None:
    if not result.azeotropes:
        return None
    record = swapped_pair(pair) if swapped else pair
    trace = trace_azeotrope(system_for(record, catalogue), record.model, result.azeotropes[0],
                            (pair.T_min_K, pair.T_max_K))
    if trace is None:
        return None
    return {
        "kind": trace.kind,
        "P_Pa": trace.P_Pa.tolist(),
        "x1": [None if math.isnan(v) else v for v in trace.x1.tolist()],
        "T_K": [None if math.isnan(v) else v for v in trace.T_K.tolist()],
        "heterogeneous": trace.heterogeneous.tolist(),
        "extrapolated": trace.extrapolated.tolist(),
        "shift_x1": trace.shift_x1,
        "pressure_sensitive": trace.pressure_sensitive,
        "events": list(trace.events),
    }


def _text(what: str, data: dict[str, Any], name1: str, name2: str) -> str:
    at = (format_pressure(data["P_Pa"]) if data["condition"] == "isobar"
          else format_temperature(data["T_K"]))
    lines = [f"{what.capitalize()} of {name1} (1) + {name2} (2) at {at} "
             f"(model: {data['model']})", ""]
    if data.get("quality") == "predicted":
        lines[1:1] = [f"predicted: no fitted set is used; {data['model']} estimates this pair "
                      "from group contributions"]
    if what == "azeotrope":
        if not data["azeotropes"]:
            lines.append("No azeotrope: the whole composition range was searched." if
                         data["search_complete"] else
                         "No azeotrope found, but the search could not cover the whole range.")
        for a in data["azeotropes"]:
            text = (f"  {a['kind']} azeotrope at x1 = {a['x1']:.4f}, "
                    f"{format_temperature(a['T_K'])}, {format_pressure(a['P_Pa'])}")
            if a["heterogeneous"]:
                xa, xb = a["liquid_x1"]
                text += f"; heterogeneous: liquids x1 = {xa:.4f} and {xb:.4f}"
            lines.append(text)
        trace = data.get("trace")
        if trace:
            lines += ["", f"  followed against pressure ({trace['kind']}):",
                      f"  {'P (kPa)':>10} {'x1':>8} {'T (K)':>9}"]
            for P, x, T, ext in zip(trace["P_Pa"], trace["x1"], trace["T_K"],
                                    trace["extrapolated"], strict=True):
                row = (f"  {P / 1e3:>10.4g} {'none':>8} {'':>9}" if x is None else
                       f"  {P / 1e3:>10.4g} {x:>8.4f} {T:>9.2f}")
                lines.append(row + ("  (extrapolated)" if ext and x is not None else ""))
            verdict = ("moves enough to matter: pressure-swing distillation deserves a look"
                       if trace["pressure_sensitive"] else "moves little with pressure")
            lines.append(f"  composition shift {trace['shift_x1']:.3f} across the range: "
                         f"{verdict} (common practice: 0.05 or more)")
            lines += [f"  {event}" for event in trace["events"]]
        tp = data["three_phase"]
        if tp and not tp["heterogeneous_azeotrope"]:
            lines.append(f"  two liquids (x1 = {tp['liquid_x1'][0]:.4f} and "
                         f"{tp['liquid_x1'][1]:.4f}) boil together at "
                         f"{format_temperature(tp['T_K'])}; vapour y1 = {tp['y1']:.4f}")
    elif what == "volatility":
        inf1, inf2 = data["alpha12_infinite_dilution"]
        lines += [f"  α12 at infinite dilution: {inf1:.4g} (x1 → 0), {inf2:.4g} (x1 → 1)",
                  f"  α12 from {data['alpha12_min']:.4g} (x1 = {data['x1_at_min']:.3f}) to "
                  f"{data['alpha12_max']:.4g} (x1 = {data['x1_at_max']:.3f})",
                  f"  difficulty: {data['grade_text']}", "",
                  f"  {'x1':>6} {'y1':>8} {'T (K)':>9} {'P (kPa)':>10} {'γ1':>8} {'γ2':>8} "
                  f"{'α12':>8}"]
        for r in data["table"]:
            lines.append(f"  {r['x1']:>6.2f} {r['y1']:>8.4f} {r['T_K']:>9.2f} "
                         f"{r['P_Pa'] / 1e3:>10.3f} {r['gamma'][0]:>8.4f} {r['gamma'][1]:>8.4f} "
                         f"{r['alpha12']:>8.4f}" + ("" if r["converged"] else "  (not converged)"))
    else:
        req, split = data["requested"], data["split"]
        lines.append(f"  requested: distillate x1 = {req['distillate_x1']:.3f}, bottoms x1 = "
                     f"{req['bottoms_x1']:.3f}, saturated-liquid feed x1 = {req['feed_x1']:.3f}")
        if data["limited_by"]:
            lines.append(f"  note: {data['limited_by']}")
            if split:
                lines.append(f"  computed instead for the reachable side: distillate x1 = "
                             f"{split['distillate_x1']:.3f}, bottoms x1 = "
                             f"{split['bottoms_x1']:.3f}, feed x1 = {split['feed_x1']:.3f}")
        if data["stages_min"] is not None:
            lines.append(f"  minimum theoretical stages (total reflux, reboiler included): "
                         f"{data['stages_min']:.2f}")
        if data["fenske_stages"] is not None:
            lines.append(f"  Fenske estimate (geometric-mean α {data['alpha_top']:.3g}/"
                         f"{data['alpha_bottom']:.3g}): {data['fenske_stages']:.2f}")
        if data["reflux_min"] is not None:
            lines.append(f"  minimum reflux ratio: {data['reflux_min']:.3f} ({data['pinch']} "
                         f"pinch at x1 = {data['pinch_x1']:.3f})")
        if data["reason"]:
            lines.append(f"  {data['reason']}")
    for warning in data["warnings"]:
        lines.append(f"warning: {warning}")
    lines.append("Screening estimate; design rests on measured data, local codes and licensed "
                 "engineering practice.")
    return "\n".join(lines)
