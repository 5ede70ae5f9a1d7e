"""A compact, comparable snapshot of every published analysis result of the catalogue.

:func:`snapshot` reduces one pair's results to plain JSON (the curve at sample
compositions, the volatility table at the round compositions, azeotropes,
three-phase points, the volatility summary, the quick look, the azeotrope traced
against pressure, warnings and checks); ``tests/data/analysis_regression.json``
holds the snapshot of the shipped catalogue made before the analysis was made
faster, and :mod:`tests.test_analysis_regression` recomputes and compares.

Regenerate (only after a deliberate change of results, stating why in the commit):
``python -m tests.analysis_snapshot``.
"""

from __future__ import annotations

import json
import math
from pathlib import Path
from typing import Any

import numpy as np

from builder.analysis.results import ConditionResult, PairResults

FIXTURE = Path(__file__).parent / "data" / "analysis_regression.json"

#: Liquid compositions at which the published curve (bubble and dew line) is sampled.
SAMPLE_X1 = (0.0, 0.001, 0.05, 0.25, 0.5, 0.75, 0.95, 0.999, 1.0)


def _num(value: Any) -> Any:
    if value is None:
        return None
    if isinstance(value, (bool, np.bool_)):
        return bool(value)
    value = float(value)
    # 12 significant digits: far below every comparison tolerance, a third of the size.
    return float(f"{value:.12g}") if math.isfinite(value) else None


def _azeotrope(a: Any) -> dict[str, Any]:
    return {"x1": _num(a.x1), "T_K": _num(a.T_K), "P_Pa": _num(a.P_Pa), "kind": a.kind,
            "heterogeneous": a.heterogeneous,
            "liquid_x1": [_num(x) for x in a.liquid_x1] if a.liquid_x1 is not None else None}


def _condition(c: ConditionResult) -> dict[str, Any]:
    curve = c.curve
    idx = [int(np.argmin(np.abs(curve.x1 - x))) for x in SAMPLE_X1]
    three = c.three_phase
    look = c.quicklook
    v = c.volatility
    stable = c.liquid_stable if c.liquid_stable is not None else np.ones_like(curve.converged)
    return {
        "kind": c.kind, "condition": _num(c.condition),
        "points": int(curve.x1.size),
        "converged": int(curve.converged.sum()), "drawable": int(c.drawable.sum()),
        "liquid_stable": int(stable.sum()), "extrapolated": int(c.extrapolated.sum()),
        "curve": {name: [_num(getattr(curve, name)[i]) for i in idx]
                  for name in ("x1", "y1", "T_K", "P_Pa", "alpha12")},
        "table": {name: [_num(getattr(row, name)) for row in v.table]
                  for name in ("x1", "y1", "T_K", "P_Pa", "alpha12", "converged")},
        "azeotropes": [_azeotrope(a) for a in c.azeotropes],
        "complete": c.azeotrope_search_complete,
        "three_phase": None if three is None else {
            "T_K": _num(three.T_K), "P_Pa": _num(three.P_Pa), "x1_a": _num(three.x1_a),
            "x1_b": _num(three.x1_b), "y1": _num(three.y1)},
        "volatility": {name: _num(getattr(v, name)) for name in (
            "alpha_infinite_dilution_1", "alpha_infinite_dilution_2", "alpha_min",
            "x1_at_min", "alpha_max", "x1_at_max", "lighter_over_heavier_min")}
        | {"grade": v.grade},
        "quicklook": None if look is None else {
            "split": None if look.split is None else [
                _num(look.split.distillate_x1), _num(look.split.bottoms_x1),
                _num(look.split.feed_x1)],
            "top_component": look.top_component, "limited_by": look.limited_by,
            "stages_min": _num(look.stages_min), "fenske_stages": _num(look.fenske_stages),
            "alpha_top": _num(look.alpha_top), "alpha_bottom": _num(look.alpha_bottom),
            "reflux_min": _num(look.reflux_min), "pinch": look.pinch,
            "pinch_x1": _num(look.pinch_x1), "reason": look.reason},
        "warnings": list(c.warnings),
    }


def snapshot(results: PairResults) -> dict[str, Any]:
    """Everything published about one pair, as plain JSON-ready data."""
    trace = results.trace
    return {
        "conditions": [_condition(c) for c in results.conditions],
        "trace": None if trace is None else {
            "P_Pa": [_num(p) for p in trace.P_Pa], "x1": [_num(x) for x in trace.x1],
            "T_K": [_num(t) for t in trace.T_K],
            "heterogeneous": [bool(h) for h in trace.heterogeneous],
            "extrapolated": [bool(e) for e in trace.extrapolated],
            "kind": trace.kind, "shift_x1": _num(trace.shift_x1),
            "pressure_sensitive": trace.pressure_sensitive, "events": list(trace.events)},
        "checks": [[c.name, c.passed] for c in results.checks],
    }


def main() -> None:
    from builder.analysis.results import compute_atlas
    from builder.catalogue.loader import load_catalogue

    atlas = compute_atlas(load_catalogue())
    data = {pid: snapshot(r) for pid, r in atlas.items()}
    FIXTURE.parent.mkdir(parents=True, exist_ok=True)
    FIXTURE.write_text(json.dumps(data, separators=(",", ":"), allow_nan=False) + "\n",
                       encoding="utf-8")
    print(f"wrote {FIXTURE} ({FIXTURE.stat().st_size / 1024:.0f} KiB, {len(data)} pairs)")


if __name__ == "__main__":
    main()
