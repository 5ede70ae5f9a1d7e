"""Benchmark: predicted pairs (UNIFAC) — group tables, one evaluation, one pair.

Prints the time to read the group tables (once per process), to build every predicted
pair record, one evaluation of ln γ by modified UNIFAC (Dortmund) for 1 and 201 points
(against NRTL for the same points), and compute_pair of a few predicted pairs (the
101.325 kPa isobar and the azeotrope traced over pressure).
Run: python benchmarks/predicted.py
"""

from __future__ import annotations

import sys
import time
import timeit
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

from builder.analysis.predicted import predicted_pairs
from builder.analysis.results import compute_pair
from builder.catalogue.group_tables import load_group_table
from builder.catalogue.loader import DEFAULT_CATALOGUE, load_catalogue
from builder.catalogue.predictive import predicted_pair

PAIRS = [("acetone", "toluene"), ("methanol", "cyclohexane"), ("n-heptane", "water")]


def main() -> None:
    start = time.perf_counter()
    for variant in ("unifac", "dortmund"):
        load_group_table(DEFAULT_CATALOGUE / "groups", variant)
    print(f"group tables (both variants): {(time.perf_counter() - start) * 1e3:.0f} ms")
    catalogue = load_catalogue()
    start = time.perf_counter()
    records = predicted_pairs(catalogue)
    print(f"{len(records)} predicted pair records: {(time.perf_counter() - start) * 1e3:.0f} ms")
    model = predicted_pair(catalogue.components["ethanol"], catalogue.components["water"]).model
    nrtl = catalogue.pairs["ethanol--water"].model
    for n in (1, 201):
        x, T = np.linspace(0.0, 1.0, n), np.full(n, 350.0)
        reps = 200
        t_u = timeit.timeit(lambda m=model, x=x, T=T: m.ln_gamma(x, T), number=reps) / reps
        t_n = timeit.timeit(lambda m=nrtl, x=x, T=T: m.ln_gamma(x, T), number=reps) / reps
        print(f"ln γ, {n:>3} points: Dortmund {t_u * 1e6:.0f} µs, NRTL {t_n * 1e6:.0f} µs")
    for a, b in PAIRS:
        record = predicted_pair(catalogue.components[a], catalogue.components[b])
        start = time.perf_counter()
        compute_pair(catalogue, record)
        print(f"compute_pair {record.id} ({record.model.name}): "
              f"{(time.perf_counter() - start) * 1e3:.0f} ms")


if __name__ == "__main__":
    main()
