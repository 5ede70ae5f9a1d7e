"""Benchmark: the bubble points added beside three-phase lines (the dew branches).

:func:`builder.analysis.dew_branches.refine` adds 27 bubble points to each one-liquid
stretch beside a three-phase line that the composition grid covers with fewer than 12
drawable points (one solver call and one stability test per condition).  This script
counts the conditions it touches and what it costs them:

* every shipped (fitted) pair, and the predicted pairs of the catalogued components with
  water (``--predicted N``: the first N in id order, 0 for none);
* per pair: the conditions with points added, the points added, the processor time of
  ``refine`` per affected condition, and ``compute_pair`` with and without it (processor
  time, median of ``--repeat`` runs after a warm-up; ``refine`` replaced by a no-op for
  "without");
* the summary: how many conditions and pairs were touched, the median and largest extra
  time per affected condition, and the pairs with no extra solver call at all.

Run: ``python benchmarks/dew_branches.py [--repeat N] [--predicted N]``.
"""

from __future__ import annotations

import argparse
import statistics
import sys
import time
from pathlib import Path
from typing import Any

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

from builder.analysis import dew_branches, results
from builder.analysis.predicted import combinations_without_fitted_set
from builder.catalogue.loader import load_catalogue
from builder.catalogue.predictive import CannotPredict, predicted_pair
from builder.catalogue.records import PairRecord

_REFINE = dew_branches.refine


def _unchanged(*args: Any) -> Any:
    import numpy as np

    curve, phases = args[4], args[5]
    return curve, phases, np.zeros(curve.x1.shape, dtype=bool)


def _median_cpu(run: Any, repeat: int) -> float:
    times = []
    for _ in range(repeat):
        start = time.process_time()
        run()
        times.append(time.process_time() - start)
    return statistics.median(times)


def measure(catalogue: Any, pair: PairRecord, repeat: int
            ) -> tuple[list[tuple[float, int]], float, float]:
    """Per affected condition (refine's processor seconds, points added), and the pair's
    median processor seconds without and with the added points."""
    calls: list[tuple[float, int]] = []

    def timed(*args: Any) -> Any:
        start = time.process_time()
        out = _REFINE(*args)
        calls.append((time.process_time() - start, int(out[2].sum())))
        return out

    results.dew_branches.refine = timed  # type: ignore[assignment]
    results.compute_pair(catalogue, pair)  # warm-up, and the calls of one run
    affected = [c for c in calls if c[1]]
    per_condition: list[list[float]] = [[] for _ in affected]
    for _ in range(repeat):
        calls.clear()
        results.compute_pair(catalogue, pair)
        for k, (seconds, _) in enumerate(c for c in calls if c[1]):
            per_condition[k].append(seconds)
    affected = [(statistics.median(t), n) for t, (_, n) in zip(per_condition, affected,
                                                                 strict=True)]
    results.dew_branches.refine = _unchanged  # type: ignore[assignment]
    without = _median_cpu(lambda: results.compute_pair(catalogue, pair), repeat)
    results.dew_branches.refine = _REFINE  # type: ignore[assignment]
    with_points = _median_cpu(lambda: results.compute_pair(catalogue, pair), repeat)
    return affected, without, with_points


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--repeat", type=int, default=5, help="runs per pair (median)")
    parser.add_argument("--predicted", type=int, default=12,
                        help="predicted pairs with water to include (first N by id)")
    args = parser.parse_args()
    catalogue = load_catalogue()
    pairs = {pid: catalogue.pairs[pid] for pid in sorted(catalogue.pairs)}
    with_water = [(a, b) for a, b in combinations_without_fitted_set(catalogue)
                  if "water" in (a, b)]
    for a, b in with_water[:args.predicted]:
        try:
            record = predicted_pair(catalogue.components[a], catalogue.components[b])
        except CannotPredict:
            continue
        pairs[record.id] = record
    print(f"{len(pairs)} pairs ({len(catalogue.pairs)} fitted); processor ms, median of "
          f"{args.repeat} runs")
    print(f"{'pair':<36}{'touched':>8}{'added':>7}{'ms/cond':>9}{'without':>9}{'with':>8}")
    extra: list[float] = []
    untouched = 0
    for pid, pair in pairs.items():
        affected, without, with_points = measure(catalogue, pair, args.repeat)
        if not affected:
            untouched += 1
            continue
        conditions = len(pair.isobars_Pa) + len(pair.isotherms_K)
        extra += [seconds for seconds, _ in affected]
        print(f"{pid:<36}{len(affected):>4}/{conditions:<3}"
              f"{sum(n for _, n in affected):>7}"
              f"{statistics.median(s for s, _ in affected) * 1e3:>9.1f}"
              f"{without * 1e3:>9.1f}{with_points * 1e3:>8.1f}")
    print(f"\n{len(extra)} conditions of {len(pairs) - untouched} pairs touched; extra per "
          f"touched condition: median {statistics.median(extra) * 1e3:.1f} ms, largest "
          f"{max(extra) * 1e3:.1f} ms" if extra else "\nno condition touched")
    print(f"{untouched} pairs untouched: no added point, no extra solver call")


if __name__ == "__main__":
    main()
