"""Benchmark: the analysis of one pair, and of the whole shipped catalogue.

Times :func:`builder.analysis.results.compute_pair` on every pair of the shipped
catalogue: curves at every published condition, liquid stability and three-phase
points, azeotrope searches, volatility tables, the distillation quick look, the
azeotrope traced against pressure and the reference checks.  Two runs:

* **all conditions**: each pair as published (3-4 isobars and isotherms, a fitted pair);
* **one isobar**: each pair restricted to its 101.325 kPa isobar (the shape of a
  predicted pair's page).

Each pair is computed ``--repeat`` times (after one warm-up); its time is the median of
those.  Printed: the median and 90th percentile over pairs, both as elapsed time and as
processor time of this process (the latter is less disturbed by other work on a busy
machine), the slowest pairs, each Peng–Robinson (φ–φ) pair (the slowest kind: mixture
critical points), every pair with ``--per-pair``, and the peak traced memory of one pass
over the catalogue.  Run: ``python benchmarks/analysis.py [--repeat N] [--per-pair]``.
"""

from __future__ import annotations

import argparse
import statistics
import sys
import time
import tracemalloc
from dataclasses import replace
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

import numpy as np

from builder.analysis.results import compute_pair
from builder.catalogue.loader import Catalogue, load_catalogue
from builder.catalogue.records import PairRecord

ATMOSPHERIC_PA = 101325.0


def one_isobar(pair: PairRecord) -> PairRecord:
    """The pair with only its 101.325 kPa isobar published."""
    return replace(pair, isobars_Pa=(ATMOSPHERIC_PA,), isotherms_K=())


def time_pairs(catalogue: Catalogue, pairs: dict[str, PairRecord], repeat: int
               ) -> dict[str, tuple[float, float]]:
    """Per pair: median elapsed and median processor seconds over ``repeat`` runs."""
    out = {}
    for pid, pair in pairs.items():
        compute_pair(catalogue, pair)  # warm-up (imports, caches of the solvers)
        wall, cpu = [], []
        for _ in range(repeat):
            w0, c0 = time.perf_counter(), time.process_time()
            compute_pair(catalogue, pair)
            cpu.append(time.process_time() - c0)
            wall.append(time.perf_counter() - w0)
        out[pid] = (statistics.median(wall), statistics.median(cpu))
    return out


def summary(name: str, times: dict[str, tuple[float, float]]) -> None:
    wall = np.array([w for w, _ in times.values()]) * 1e3
    cpu = np.array([c for _, c in times.values()]) * 1e3
    print(f"{name:<16}{len(times):>6}{np.median(wall):>10.0f}{np.percentile(wall, 90):>10.0f}"
          f"{np.median(cpu):>10.0f}{np.percentile(cpu, 90):>10.0f}")


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--repeat", type=int, default=3, help="runs per pair (median)")
    parser.add_argument("--per-pair", action="store_true",
                        help="also print every pair's processor time")
    args = parser.parse_args()
    start = time.perf_counter()
    catalogue = load_catalogue()
    loaded = time.perf_counter() - start
    pairs = {pid: catalogue.pairs[pid] for pid in sorted(catalogue.pairs)}
    conditions = sum(len(p.isobars_Pa) + len(p.isotherms_K) for p in pairs.values())
    print(f"catalogue: {len(catalogue.components)} components, {len(pairs)} pairs, "
          f"{conditions} published conditions; loaded in {loaded * 1e3:.0f} ms")
    full = time_pairs(catalogue, pairs, args.repeat)
    single = time_pairs(catalogue, {pid: one_isobar(p) for pid, p in pairs.items()},
                        args.repeat)
    print("\nper pair, ms     pairs  wall med  wall p90   cpu med   cpu p90")
    summary("all conditions", full)
    summary("one isobar", single)
    # Memory in a separate pass: tracemalloc slows numpy down several times.
    tracemalloc.start()
    begin = time.perf_counter()
    for pair in pairs.values():
        compute_pair(catalogue, pair)
    total = time.perf_counter() - begin
    _, peak = tracemalloc.get_traced_memory()
    tracemalloc.stop()
    print(f"\nwhole catalogue (traced pass): {total:.2f} s, peak traced memory "
          f"{peak / 2**20:.1f} MiB")
    print("slowest pairs, all conditions (wall / cpu ms):")
    for pid, (wall, cpu) in sorted(full.items(), key=lambda kv: -kv[1][1])[:5]:
        print(f"  {pid:<40}{wall * 1e3:>8.0f}{cpu * 1e3:>8.0f}")
    cubic = [pid for pid, pair in pairs.items() if pair.model_kind == "peng-robinson"]
    if cubic:
        print("Peng-Robinson (phi-phi) pairs (wall / cpu ms: all conditions, one isobar):")
        for pid in cubic:
            (wall, cpu), (wall1, cpu1) = full[pid], single[pid]
            print(f"  {pid:<40}{wall * 1e3:>8.0f}{cpu * 1e3:>8.0f}"
                  f"{wall1 * 1e3:>10.0f}{cpu1 * 1e3:>8.0f}")
    if args.per_pair:
        print("every pair, all conditions (cpu ms), fastest first:")
        for pid, (_, cpu) in sorted(full.items(), key=lambda kv: kv[1][1]):
            print(f"  {pid:<40}{cpu * 1e3:>8.1f}")


if __name__ == "__main__":
    main()
