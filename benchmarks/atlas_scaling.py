"""Benchmark: cold builds of the real atlas with more and more predicted pair pages.

The shipped catalogue is built with ``predicted_pairs`` set to the first n components
(in id order), so the atlas holds the fitted pairs plus every predicted combination
among those n components: about 100, 300, 1,000 pairs and the whole atlas (every
combination of every component).  Prints, per size, the pair pages, wall and CPU time
(the build and its worker processes), peak memory of the process tree (the sum of its
processes' PSS, which is the physical memory it takes, and the sum of their RSS, which
counts a page the forked workers share once per process), the stages of
the build, the site size and the search index size, for docs/benchmarks.md.

Unlike the synthetic catalogues of ``benchmarks/build.py``, these are the pages an
engineer would read: predicted pairs (one isobar, one combined figure) beside the
fitted ones.

With ``--incremental``, each size is then rebuilt after one pair file of the (copied)
catalogue was edited, and the rebuild's share of the cold build is printed (the target
is at most 10 %).

Run: ``python benchmarks/atlas_scaling.py`` (all sizes; the whole atlas takes tens of
minutes on two cores), ``--components 15 25`` to choose sizes, ``--workers N``,
``--incremental``.
"""

from __future__ import annotations

import argparse
import os
import shutil
import sys
import tempfile
from math import comb
from pathlib import Path

import yaml

HERE = Path(__file__).resolve().parent
REPO = HERE.parent
sys.path.insert(0, str(REPO))
sys.path.insert(0, str(HERE))

from build import run_build  # noqa: E402  (benchmarks/build.py: one measured build)

#: Components per size: C(n, 2) combinations is about 100, 300, 1,000 and all of them.
DEFAULT_SIZES = [15, 25, 45, 0]  # 0: every component


def settings_file(target: Path, components: list[str]) -> Path:
    """The shipped site settings with ``predicted_pairs`` set to ``components``."""
    data = yaml.safe_load((REPO / "site.yaml").read_text(encoding="utf-8"))
    data["predicted_pairs"] = components
    path = target / "site.yaml"
    path.write_text(yaml.safe_dump(data, allow_unicode=True, sort_keys=False), encoding="utf-8")
    return path


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--components", type=int, nargs="*", default=DEFAULT_SIZES,
                        help="components whose combinations are predicted (0: all)")
    parser.add_argument("--workers", type=int, default=2)
    parser.add_argument("--incremental", action="store_true",
                        help="also rebuild after editing one pair file")
    args = parser.parse_args()
    ids = sorted(p.stem for p in (REPO / "pairs" / "components").glob("*.yaml"))
    print(f"machine: {os.cpu_count()} cores; load average {os.getloadavg()[0]:.1f} at start\n")
    print("| components predicted | combinations | pages built | wall | CPU | peak memory (PSS) "
          "| peak (sum of RSS) | site | search index |")
    print("|---|---|---|---|---|---|---|---|---|")
    for n in args.components:
        chosen = ids if n == 0 else ids[:n]
        with tempfile.TemporaryDirectory(prefix="atlas-scaling-") as scratch:
            root = Path(scratch)
            settings = settings_file(root, chosen)
            catalogue = root / "pairs"
            shutil.copytree(REPO / "pairs", catalogue)
            common = ("--settings", str(settings), "--cache-dir", str(root / "cache"))
            r = run_build(catalogue, root / "site", "--no-cache", *common, workers=args.workers)
            pages = len(list((root / "site" / "pairs").glob("*.html")))
            warm = None
            if args.incremental:
                edited = catalogue / "binaries" / "ethanol--water.yaml"
                edited.write_text(edited.read_text(encoding="utf-8").rstrip("\n")
                                  + "\nnotes: edited by the benchmark\n", encoding="utf-8")
                warm = run_build(catalogue, root / "site", *common, workers=args.workers)
        print(f"| {len(chosen)} | {comb(len(chosen), 2)} | {pages} pair pages | "
              f"{r['wall']:.0f} s | {r['cpu']:.0f} s | {r['peak_pss'] / 2**20:.0f} MiB | "
              f"{r['peak'] / 2**20:.0f} MiB | "
              f"{r['size'] / 1e6:.0f} MB | {r['index'] / 1e6:.2f} MB |", flush=True)
        print(f"<!-- stages: {r['stages']} -->", flush=True)
        if warm is not None:
            print(f"<!-- after editing one pair file: {warm['wall']:.0f} s wall "
                  f"({warm['wall'] / r['wall']:.1%} of cold), {warm['cpu']:.0f} s CPU "
                  f"({warm['cpu'] / r['cpu']:.1%}), peak memory {warm['peak_pss'] / 2**20:.0f} MiB "
                  f"(PSS); stages: {warm['stages']} -->", flush=True)

if __name__ == "__main__":
    main()
