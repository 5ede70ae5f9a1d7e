"""Benchmark: the site build -- figures, cold and incremental builds, scaling with the atlas.

Prints, for docs/benchmarks.md:

* **Figures**: per-pair figure time (wall and CPU, median) and mean SVG size, for the
  shipped (fitted) pairs, for the shipped pairs cut to their 101.325 kPa isobar (a fitted
  page's set of figures for one condition) and for predicted pairs (the combinations of
  :data:`PREDICTED_AMONG` without a fitted set: one combined Txy + xy figure per page);
* **Site build**: a cold build of the shipped catalogue (``atlas build --no-cache``),
  its peak memory (the build and its worker processes together), site and search-index
  size; then an incremental rebuild after editing one pair file;
* **Scaling**: cold builds of synthetic catalogues of 100, 300, 1,000 and 3,000 pairs.

The scaling catalogues are BENCHMARK DATA, generated in a temporary folder and never
shipped: copies of the shipped components under generated ids (``ethanol-b3``, named
"Ethanol (benchmark copy 3)", with a generated CAS number) and copies of the shipped
pairs between those copies, with the shipped parameters.  They measure the build's
cost per pair and per page honestly; they say nothing about any real mixture.

Run: ``python benchmarks/build.py`` (all parts), ``--sizes 100 300`` to choose the
scaling sizes, ``--skip figures,site,scaling`` to leave parts out, ``--workers N``.
"""

from __future__ import annotations

import argparse
import math
import os
import resource
import shutil
import statistics
import subprocess
import sys
import tempfile
import threading
import time
from collections.abc import Callable
from pathlib import Path

import yaml

REPO = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(REPO))

from builder.analysis.results import compute_pair  # noqa: E402
from builder.catalogue.loader import load_catalogue  # noqa: E402
from builder.site.figures import Figure, component_figure, pair_figures  # noqa: E402
from builder.site.settings import SiteSettings  # noqa: E402

ATMOSPHERE = "101.325 kPa"


# -- figures -------------------------------------------------------------------------------


def _figure_times(results: list, draw: Callable[..., tuple[Figure, ...]],
                  settings: SiteSettings) -> tuple[list[float], list[float], list[int]]:
    walls, cpus, sizes = [], [], []
    draw(results[0], settings)  # warm up (fonts, kept figures)
    for r in results:
        w, c = time.perf_counter(), time.process_time()
        figures = draw(r, settings)
        walls.append(time.perf_counter() - w)
        cpus.append(time.process_time() - c)
        sizes.extend(len(f.svg) for f in figures)
    return walls, cpus, sizes


#: The components whose combinations give the predicted pairs timed (a spread of kinds:
#: one liquid, azeotropes, a liquid split).
PREDICTED_AMONG = ("acetone", "benzene", "cyclohexane", "ethanol", "methanol", "n-hexane",
                   "toluene", "water")


def bench_figures(sample: int | None = None) -> None:
    from dataclasses import replace

    from builder.site.predicted import select_predicted
    from builder.site.predicted_figures import predicted_figure

    catalogue = load_catalogue()
    settings = SiteSettings()
    pids = sorted(catalogue.pairs)[:sample]
    fitted = [compute_pair(catalogue, catalogue.pairs[pid]) for pid in pids]
    one = []
    for pid in pids:
        pair = catalogue.pairs[pid]
        one.append(compute_pair(catalogue, replace(pair, isobars_Pa=(101325.0,),
                                                   isotherms_K=())))
    selection = select_predicted(catalogue, tuple(c for c in PREDICTED_AMONG
                                                  if c in catalogue.components))
    work = replace(catalogue, pairs={**catalogue.pairs, **selection.records})
    predicted = [compute_pair(work, work.pairs[pid])
                 for pid in sorted(selection.records)[:sample]]
    print("## Figures")
    print("| pairs | figures per pair | per-pair time, median (wall / CPU) | mean SVG |")
    print("|---|---|---|---|")
    for label, results, draw in (
            (f"fitted (shipped, {len(pids)})", fitted, pair_figures),
            (f"one isobar, fitted page's set ({len(pids)})", one, pair_figures),
            (f"predicted page (combined Txy + xy, {len(predicted)})", predicted,
             predicted_figure)):
        walls, cpus, sizes = _figure_times(results, draw, settings)
        print(f"| {label} | {len(sizes) / len(results):.1f} | "
              f"{statistics.median(walls) * 1e3:.0f} ms / {statistics.median(cpus) * 1e3:.0f} ms"
              f" | {statistics.mean(sizes) / 1e3:.1f} KB |")
    comps = sorted(catalogue.components)
    w = time.perf_counter()
    sizes = [len(component_figure(catalogue.components[c], settings).svg) for c in comps]
    print(f"| component (vapour pressure, {len(comps)}) | 1 | "
          f"{(time.perf_counter() - w) / len(comps) * 1e3:.0f} ms | "
          f"{statistics.mean(sizes) / 1e3:.1f} KB |")
    print()


# -- builds --------------------------------------------------------------------------------


def _tree_memory(pid: int) -> tuple[int, int]:
    """The process tree's memory: the sum of resident sizes (RSS) and the sum of
    proportional set sizes (PSS, Linux).

    The worker processes are forked, and share the pages they inherited until they write
    to them: a sum of RSS counts each shared page once per process that maps it, the sum
    of PSS divides it among them, which is the physical memory the tree takes.
    """
    import psutil

    try:
        processes = [psutil.Process(pid)]
        processes += processes[0].children(recursive=True)
    except psutil.Error:
        return 0, 0
    rss = pss = 0
    for process in processes:
        try:
            full = process.memory_full_info()
        except psutil.Error:
            continue
        rss += full.rss
        pss += getattr(full, "pss", full.rss)
    return int(rss), int(pss)


def run_build(catalogue: Path, out: Path, *extra: str, workers: int) -> dict[str, float]:
    """One ``atlas build`` in a subprocess: wall time, CPU time, peak memory of the tree."""
    env = dict(os.environ, PYTHONPATH=str(REPO), MPLBACKEND="Agg", NO_MKDOCS_2_WARNING="1")
    before = resource.getrusage(resource.RUSAGE_CHILDREN)
    start = time.perf_counter()
    process = subprocess.Popen([sys.executable, "-m", "builder", "--catalogue", str(catalogue),
                                "build", "--out", str(out), "--workers", str(workers), *extra],
                               stdout=subprocess.PIPE, stderr=subprocess.STDOUT, text=True,
                               env=env, cwd=REPO)
    peak = [0, 0]

    def sample() -> None:
        while process.poll() is None:
            rss, pss = _tree_memory(process.pid)
            peak[0], peak[1] = max(peak[0], rss), max(peak[1], pss)
            time.sleep(0.2)

    sampler = threading.Thread(target=sample, daemon=True)
    sampler.start()
    output, _ = process.communicate()
    wall = time.perf_counter() - start
    sampler.join()
    after = resource.getrusage(resource.RUSAGE_CHILDREN)
    if process.returncode != 0:
        raise SystemExit(f"build failed:\n{output}")
    cpu = (after.ru_utime - before.ru_utime) + (after.ru_stime - before.ru_stime)
    size = sum(p.stat().st_size for p in out.rglob("*") if p.is_file())
    index = (out / "search" / "search_index.js").stat().st_size
    stages = [line.strip() for line in output.splitlines()
              if line.startswith("  ") and line.rstrip().endswith(" s")
              and not line.startswith("  stage:")]
    return {"wall": wall, "cpu": cpu, "peak": peak[0], "peak_pss": peak[1], "size": size,
            "index": index,
            "stages": "; ".join(" ".join(s.split()) for s in stages)}  # type: ignore[dict-item]


def bench_site(workers: int) -> None:
    with tempfile.TemporaryDirectory(prefix="atlas-bench-") as scratch:
        root = Path(scratch)
        catalogue = root / "pairs"
        shutil.copytree(REPO / "pairs", catalogue)
        out = root / "site"
        cold = run_build(catalogue, out, "--no-cache", workers=workers)
        path = catalogue / "binaries" / "ethanol--water.yaml"
        path.write_text(path.read_text(encoding="utf-8").rstrip("\n")
                        + "\n# benchmark edit: one changed line\n", encoding="utf-8")
        data = yaml.safe_load(path.read_text(encoding="utf-8"))
        data["notes"] = (data.get("notes") or "") + " (edited by the benchmark)"
        path.write_text(yaml.safe_dump(data, allow_unicode=True, sort_keys=False),
                        encoding="utf-8")
        warm = run_build(catalogue, out, workers=workers)
    print("## Site build (shipped catalogue, 39 pairs)")
    print("| build | wall | CPU | peak memory | site | search index |")
    print("|---|---|---|---|---|---|")
    for label, r in (("cold (--no-cache)", cold), ("after editing one pair file", warm)):
        print(f"| {label} | {r['wall']:.1f} s | {r['cpu']:.1f} s | {r['peak'] / 2**20:.0f} MiB"
              f" | {r['size'] / 1e6:.1f} MB | {r['index'] / 1e3:.0f} KB |")
    print(f"\nincremental / cold: {warm['wall'] / cold['wall']:.1%} (wall)")
    print(f"cold stages: {cold['stages']}")
    print(f"incremental stages: {warm['stages']}\n")


# -- synthetic catalogues ------------------------------------------------------------------


def _cas(number: int) -> str:
    digits = str(number)
    check = sum((i + 1) * int(d) for i, d in enumerate(digits[::-1])) % 10
    return f"{digits[:-2]}-{digits[-2:]}-{check}"


def synthetic_catalogue(target: Path, pairs_wanted: int) -> tuple[int, int]:
    """BENCHMARK DATA: ``pairs_wanted`` pairs between generated copies of shipped components."""
    shipped = REPO / "pairs"
    pair_files = sorted((shipped / "binaries").glob("*.yaml"))
    copies = max(1, math.ceil(math.sqrt(pairs_wanted / len(pair_files))))
    combos = sorted((max(i, j), i, j, k) for i in range(copies) for j in range(copies)
                     for k in range(len(pair_files)))[:pairs_wanted]
    shutil.copytree(shipped / "references", target / "references")
    (target / "components").mkdir()
    (target / "binaries").mkdir()
    (target / "README.txt").write_text(
        "BENCHMARK DATA generated by benchmarks/build.py: copies of the shipped catalogue "
        "under generated ids and CAS numbers. Not a catalogue of real mixtures.\n",
        encoding="utf-8")

    def cid(base: str, copy: int) -> str:
        return base if copy == 0 else f"{base}-b{copy}"

    used: set[tuple[str, int]] = set()
    for _, i, j, k in combos:
        data = yaml.safe_load(pair_files[k].read_text(encoding="utf-8"))
        a, b = data["components"]
        used |= {(a, i), (b, j)}
        data["components"] = [cid(a, i), cid(b, j)]
        data["id"] = f"{cid(a, i)}--{cid(b, j)}"
        (target / "binaries" / f"{data['id']}.yaml").write_text(
            yaml.safe_dump(data, allow_unicode=True, sort_keys=False), encoding="utf-8")
    for n, (base, copy) in enumerate(sorted(used)):
        data = yaml.safe_load((shipped / "components" / f"{base}.yaml").read_text("utf-8"))
        if copy:
            data["id"] = cid(base, copy)
            data["name"] = f"{data['name']} (benchmark copy {copy})"
            data["synonyms"] = []
            data["cas"] = _cas(9_000_000 + n)
        (target / "components" / f"{data['id']}.yaml").write_text(
            yaml.safe_dump(data, allow_unicode=True, sort_keys=False), encoding="utf-8")
    return len(combos), len(used)


def bench_scaling(sizes: list[int], workers: int) -> None:
    print("## Scaling (synthetic BENCHMARK DATA catalogues, cold builds)")
    print("| pairs | components | wall | per pair | CPU | peak memory | site | search index |")
    print("|---|---|---|---|---|---|---|---|")
    for size in sizes:
        with tempfile.TemporaryDirectory(prefix="atlas-bench-") as scratch:
            root = Path(scratch)
            pairs, components = synthetic_catalogue(root / "pairs", size)
            r = run_build(root / "pairs", root / "site", "--no-cache", workers=workers)
        print(f"| {pairs} | {components} | {r['wall']:.0f} s | {r['wall'] / pairs:.2f} s | "
              f"{r['cpu']:.0f} s | {r['peak'] / 2**20:.0f} MiB | {r['size'] / 1e6:.0f} MB | "
              f"{r['index'] / 1e6:.2f} MB |", flush=True)
        print(f"<!-- stages: {r['stages']} -->", flush=True)
    print()


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--sizes", type=int, nargs="*", default=[100, 300, 1000, 3000])
    parser.add_argument("--skip", default="", help="comma-separated: figures,site,scaling")
    parser.add_argument("--workers", type=int, default=2)
    parser.add_argument("--figure-pairs", type=int, default=None,
                        help="time the figures of the first N shipped pairs only")
    args = parser.parse_args()
    skip = set(filter(None, args.skip.split(",")))
    print(f"machine: {os.cpu_count()} cores; load average {os.getloadavg()[0]:.1f} at start\n")
    if "figures" not in skip:
        bench_figures(args.figure_pairs)
    if "site" not in skip:
        bench_site(args.workers)
    if "scaling" not in skip:
        bench_scaling(args.sizes, args.workers)


if __name__ == "__main__":
    main()
