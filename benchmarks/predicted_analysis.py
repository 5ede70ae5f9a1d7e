"""Benchmark: the analysis of predicted pairs (UNIFAC), one isobar each.

Times :func:`builder.analysis.results.compute_pair` on predicted pairs (modified
UNIFAC (Dortmund), or original UNIFAC where Dortmund lacks groups), made the way the
site build makes them (:func:`builder.analysis.predicted.predicted_pairs`): the
101.325 kPa isobar (curve, liquid stability and three-phase line, azeotropes,
volatility, quick look), the azeotrope traced against pressure and the reference
checks.  Either a random sample of the predictable combinations
(``--sample N --seed S``) or every one of them (``--all``).

Per pair the processor time of this process (``time.process_time``), best of
``--repeat`` runs (2 by default; the first run also warms the pair's caches).
Printed: median, mean, 90th and 99th percentiles, maximum and total over the pairs,
the slowest pairs, and the counts of combinations that cannot be predicted and of
pairs whose analysis raised (listed with the error: each one is a bug).
Run: ``python benchmarks/predicted_analysis.py --all`` (several minutes) or
``python benchmarks/predicted_analysis.py --sample 200 --seed 1``.
"""

from __future__ import annotations

import argparse
import random
import sys
import time
import traceback
from dataclasses import replace
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

import numpy as np

from builder.analysis.predicted import predicted_pairs, unpredictable_pairs
from builder.analysis.results import compute_pair
from builder.catalogue.loader import Catalogue, load_catalogue
from builder.catalogue.records import PairRecord


def time_pair(catalogue: Catalogue, pair: PairRecord, repeat: int) -> float:
    """Best processor time (s) of ``repeat`` runs of ``compute_pair``."""
    best = float("inf")
    for _ in range(repeat):
        c0 = time.process_time()
        compute_pair(catalogue, pair)
        best = min(best, time.process_time() - c0)
    return best


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    which = parser.add_mutually_exclusive_group(required=True)
    which.add_argument("--all", action="store_true", help="every predictable combination")
    which.add_argument("--sample", type=int, help="a random sample of N combinations")
    parser.add_argument("--seed", type=int, default=1, help="seed of the random sample")
    parser.add_argument("--repeat", type=int, default=2, help="runs per pair (best of)")
    parser.add_argument("--slowest", type=int, default=10, help="slowest pairs listed")
    parser.add_argument("--save", type=Path, help="write 'pair seconds' lines to this file")
    args = parser.parse_args()

    catalogue = load_catalogue()
    records = predicted_pairs(catalogue)
    unpredictable = unpredictable_pairs(catalogue)
    work = replace(catalogue, pairs={**catalogue.pairs, **records})
    ids = sorted(records)
    if args.sample is not None:
        ids = sorted(random.Random(args.seed).sample(ids, min(args.sample, len(ids))))
    print(f"catalogue: {len(catalogue.components)} components; {len(records)} predicted "
          f"pairs, {len(unpredictable)} combinations cannot be predicted; timing "
          f"{len(ids)} pairs, best of {args.repeat}")

    times: dict[str, float] = {}
    raised: dict[str, str] = {}
    start = time.perf_counter()
    for pid in ids:
        try:
            times[pid] = time_pair(work, records[pid], args.repeat)
        except Exception as error:  # every failure is listed, as a bug
            last = traceback.extract_tb(error.__traceback__)[-1]
            raised[pid] = (f"{type(error).__name__}: {error} "
                           f"({Path(last.filename).name}:{last.lineno})")
    wall = time.perf_counter() - start

    ms = np.array(list(times.values())) * 1e3
    if ms.size:
        print(f"per pair (CPU ms): median {np.median(ms):.1f}, mean {ms.mean():.1f}, "
              f"p90 {np.percentile(ms, 90):.1f}, p99 {np.percentile(ms, 99):.1f}, "
              f"max {ms.max():.0f}; total {ms.sum() / 1e3:.1f} s over {ms.size} pairs "
              f"(benchmark wall time {wall:.0f} s)")
        print(f"{args.slowest} slowest pairs:")
        for pid in sorted(times, key=times.__getitem__, reverse=True)[:args.slowest]:
            print(f"  {times[pid] * 1e3:8.0f} ms  {pid} ({records[pid].model.name})")
    print(f"cannot be predicted: {len(unpredictable)}; raised: {len(raised)}")
    for pid, message in sorted(raised.items()):
        print(f"  {pid}: {message}")
    if args.save is not None:
        args.save.write_text("".join(f"{pid} {t:.6f}\n" for pid, t in sorted(times.items())))


if __name__ == "__main__":
    main()
