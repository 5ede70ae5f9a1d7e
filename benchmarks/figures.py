"""Benchmark: the figures alone, CPU time per pair, on results computed beforehand.

Prints, for docs/benchmarks.md (section "Figures"), the median CPU time per pair of
``pair_figures`` on the first ``--pairs`` shipped (fitted) pairs and of
``predicted_figure`` on the first ``--predicted`` predicted pairs among the components of
``benchmarks/build.py``'s ``PREDICTED_AMONG``, the figures per pair and the mean SVG size.
The results are computed once, in this process, and handed to the timed processes, so
only the figures are timed.

``--against DIR`` also times the figure code of another checkout (for example
``git worktree add /tmp/before <commit>``) on the same results: each round runs this
checkout and the other one after the other, each in a fresh process, so that both see
the same machine load.  CPU time (``time.process_time``), not wall time: the machine may
be shared.

Run: ``python benchmarks/figures.py [--pairs 8] [--predicted 12] [--rounds 2]
[--against DIR]``.
"""

from __future__ import annotations

import argparse
import json
import os
import pickle
import statistics
import subprocess
import sys
import tempfile
import time
from dataclasses import replace
from pathlib import Path

REPO = Path(__file__).resolve().parent.parent


def _compute(pairs: int, predicted: int) -> dict[str, list]:
    sys.path.insert(0, str(REPO))
    sys.path.insert(0, str(REPO / "benchmarks"))
    from build import PREDICTED_AMONG  # type: ignore[import-not-found]

    from builder.analysis.results import compute_pair
    from builder.catalogue.loader import load_catalogue
    from builder.site.predicted import select_predicted

    catalogue = load_catalogue()
    fitted = [compute_pair(catalogue, catalogue.pairs[pid])
              for pid in sorted(catalogue.pairs)[:pairs]]
    selection = select_predicted(catalogue, tuple(c for c in PREDICTED_AMONG
                                                  if c in catalogue.components))
    work = replace(catalogue, pairs={**catalogue.pairs, **selection.records})
    chosen = [compute_pair(work, work.pairs[pid])
              for pid in sorted(selection.records)[:predicted]]
    return {"fitted": fitted, "predicted": chosen}


def _time(results_file: str) -> None:
    """Runs in the checkout to time (its folder first on ``PYTHONPATH``): prints JSON."""
    from builder.site.figures import pair_figures
    from builder.site.predicted_figures import predicted_figure
    from builder.site.settings import SiteSettings

    with open(results_file, "rb") as handle:
        results = pickle.load(handle)
    settings = SiteSettings()
    out = {}
    for kind, draw in (("fitted", pair_figures), ("predicted", predicted_figure)):
        pairs = results[kind]
        draw(pairs[0], settings)  # warm up: fonts, kept figures
        cpus, sizes = [], []
        for r in pairs:
            start = time.process_time()
            figures = draw(r, settings)
            cpus.append(time.process_time() - start)
            sizes.extend(len(f.svg) for f in figures)
        out[kind] = {"cpu_ms": statistics.median(cpus) * 1e3,
                     "figures": len(sizes) / len(pairs),
                     "svg_kb": statistics.mean(sizes) / 1e3}
    print(json.dumps(out))


def _run(code: Path, results_file: str) -> dict:
    env = dict(os.environ, PYTHONPATH=str(code), MPLBACKEND="Agg")
    done = subprocess.run([sys.executable, str(Path(__file__).resolve()), "--time",
                           results_file], env=env, cwd=str(code), check=True,
                          capture_output=True, text=True)
    return dict(json.loads(done.stdout.strip().splitlines()[-1]))


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--pairs", type=int, default=8, help="first N shipped pairs")
    parser.add_argument("--predicted", type=int, default=12, help="first N predicted pairs")
    parser.add_argument("--rounds", type=int, default=2)
    parser.add_argument("--against", type=Path, default=None,
                        help="another checkout whose figure code is timed too")
    parser.add_argument("--time", default=None, help=argparse.SUPPRESS)
    args = parser.parse_args()
    if args.time:
        _time(args.time)
        return
    results = _compute(args.pairs, args.predicted)
    codes = [("this checkout", REPO)]
    if args.against is not None:
        codes.insert(0, (f"against {args.against}", args.against.resolve()))
    with tempfile.TemporaryDirectory() as folder:
        results_file = str(Path(folder) / "results.pickle")
        with open(results_file, "wb") as handle:
            pickle.dump(results, handle)
        print(f"## Figures alone ({len(results['fitted'])} fitted, "
              f"{len(results['predicted'])} predicted pairs; CPU time, median per pair)")
        print("| code | round | load avg | fitted: figures, CPU | predicted: CPU | "
              "mean SVG (fitted / predicted) |")
        print("|---|---|---|---|---|---|")
        for round_ in range(1, args.rounds + 1):
            for label, code in codes:
                load = os.getloadavg()[0]
                t = _run(code, results_file)
                f, p = t["fitted"], t["predicted"]
                print(f"| {label} | {round_} | {load:.1f} | {f['figures']:.1f}, "
                      f"{f['cpu_ms']:.0f} ms | {p['cpu_ms']:.0f} ms | "
                      f"{f['svg_kb']:.1f} / {p['svg_kb']:.1f} KB |", flush=True)


if __name__ == "__main__":
    main()
