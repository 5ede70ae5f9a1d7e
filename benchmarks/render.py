"""Benchmark: the render stage of ``atlas build`` with and without the pair files the
workers make (``builder.site.pair_files``).

Reads every pair's and component's work from a build cache (run ``atlas build`` with
``--cache-dir DIR`` first) and times :func:`builder.site.content.generate` twice: the
main process making every pair's view, page and downloads itself (as before the workers
made them), and taking them from the workers' output; checks the two give the same
files.  Run: ``python benchmarks/render.py --cache-dir DIR``.
"""

from __future__ import annotations

import argparse
import resource
import time
from dataclasses import replace
from pathlib import Path
from typing import Any

from builder.catalogue.loader import DEFAULT_CATALOGUE, load_catalogue
from builder.site.cache import BuildCache, component_key, pair_key
from builder.site.content import generate
from builder.site.predicted import select_predicted
from builder.site.settings import load_settings


def _cpu_s() -> float:
    own = resource.getrusage(resource.RUSAGE_SELF)
    return own.ru_utime + own.ru_stime


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--cache-dir", type=Path, required=True)
    parser.add_argument("--catalogue", type=Path, default=DEFAULT_CATALOGUE)
    args = parser.parse_args()
    settings = load_settings()
    catalogue = load_catalogue(args.catalogue)
    selection = select_predicted(catalogue, settings.predicted_pairs)
    work = replace(catalogue, pairs={**catalogue.pairs, **selection.records})
    cache = BuildCache(args.cache_dir.resolve())
    outputs: dict[str, Any] = {pid: cache.get(pair_key(work, pid, settings))
                               for pid in sorted(work.pairs)}
    figures: dict[str, Any] = {cid: cache.get(component_key(catalogue, cid, settings))
                               for cid in sorted(catalogue.components)}
    missing = [k for k, v in {**outputs, **figures}.items() if v is None]
    if missing:
        raise SystemExit(f"not in the cache (build with this code first): {missing[:5]}")
    atlas = {pid: out.results for pid, out in outputs.items()}
    pair_figs = {pid: out.figures for pid, out in outputs.items()}
    comp_figs = {cid: out.figure for cid, out in figures.items()}
    opinions = {pid: out.opinion for pid, out in outputs.items() if out.opinion is not None}
    made = {pid: out.files for pid, out in outputs.items()}
    contents = {}
    for label, files in (("main process makes every pair's files", None),
                         ("pair files from the workers", made)):
        wall, cpu = time.perf_counter(), _cpu_s()
        _view, contents[label] = generate(settings, catalogue, atlas, pair_figs, comp_figs,
                                          opinions=opinions, selection=selection,
                                          pair_files=files)
        print(f"{label}: {len(atlas)} pairs, {len(contents[label])} files; "
              f"wall {time.perf_counter() - wall:.2f} s, CPU {_cpu_s() - cpu:.2f} s")
    first, second = contents.values()
    assert first.files == second.files, "the two ways give different files"


if __name__ == "__main__":
    main()
