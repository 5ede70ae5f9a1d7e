"""Benchmark: compute the whole atlas (every pair, every published condition).

Times :func:`builder.results.compute_atlas` on the shipped catalogue: curves, liquid
stability and three-phase lines, azeotrope searches, volatility tables, the distillation
quick look and the azeotrope traced over pressure; prints the total, the slowest pairs and
the peak memory of the computation (tracemalloc).  Run: python benchmarks/analysis.py
"""

from __future__ import annotations

import sys
import time
import tracemalloc
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

from builder.analysis.results import compute_pair
from builder.catalogue.loader import load_catalogue


def main() -> None:
    start = time.perf_counter()
    catalogue = load_catalogue()
    loaded = time.perf_counter() - start
    times = {}
    begin = time.perf_counter()
    for pid in sorted(catalogue.pairs):
        t0 = time.perf_counter()
        compute_pair(catalogue, catalogue.pairs[pid])
        times[pid] = time.perf_counter() - t0
    total = time.perf_counter() - begin
    # Memory in a second pass: tracemalloc slows numpy down several times.
    tracemalloc.start()
    for pid in sorted(catalogue.pairs):
        compute_pair(catalogue, catalogue.pairs[pid])
    _, peak = tracemalloc.get_traced_memory()
    tracemalloc.stop()
    conditions = sum(len(p.isobars_Pa) + len(p.isotherms_K) for p in catalogue.pairs.values())
    print(f"catalogue: {len(catalogue.components)} components, {len(catalogue.pairs)} pairs, "
          f"{conditions} published conditions; loaded in {loaded * 1e3:.0f} ms")
    print(f"computed in {total:.2f} s ({total / len(times) * 1e3:.0f} ms per pair), "
          f"peak traced memory {peak / 2**20:.1f} MiB")
    print("slowest pairs:")
    for pid, seconds in sorted(times.items(), key=lambda kv: -kv[1])[:5]:
        print(f"  {pid:<40}{seconds * 1e3:>8.0f} ms")


if __name__ == "__main__":
    main()
