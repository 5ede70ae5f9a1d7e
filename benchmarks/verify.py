"""Benchmark: the site check (``builder.site.verify``) of a built site, serial and parallel.

Runs :func:`~builder.site.verify.verify_site` on a built site with an empty memo (every
HTML, CSS and SVG file parsed, as in a cold build) for each number of worker processes
given, and once more from the memo (nothing parsed, as in a rebuild where nothing
changed); prints wall time and CPU time (this process and its workers, user + system)
and checks that every run finds the same.  Run:
``python benchmarks/verify.py SITE_FOLDER [--workers 1 2]``.
"""

from __future__ import annotations

import argparse
import resource
import time
from pathlib import Path
from typing import Any

from builder.site.verify import SiteCheck, verify_site


def _cpu_s() -> float:
    own = resource.getrusage(resource.RUSAGE_SELF)
    children = resource.getrusage(resource.RUSAGE_CHILDREN)
    return own.ru_utime + own.ru_stime + children.ru_utime + children.ru_stime


def timed(site: Path, memo: dict[str, Any], workers: int) -> tuple[SiteCheck, float, float]:
    """The check, its wall time and its CPU time (s)."""
    wall, cpu = time.perf_counter(), _cpu_s()
    check = verify_site(site, memo, workers=workers)
    return check, time.perf_counter() - wall, _cpu_s() - cpu


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("site", type=Path)
    parser.add_argument("--workers", type=int, nargs="+", default=[1, 2])
    args = parser.parse_args()
    first: SiteCheck | None = None
    for workers in args.workers:
        memo: dict[str, Any] = {}
        check, wall, cpu = timed(args.site, memo, workers)
        first = first or check
        assert check == first, "the findings depend on the number of workers"
        print(f"workers {workers}: {check.files} files, {check.html_pages} pages, "
              f"{len(check.problems)} problems; empty memo: wall {wall:.2f} s, "
              f"CPU {cpu:.2f} s", end="")
        check, wall, cpu = timed(args.site, memo, workers)
        assert check == first
        print(f"; from the memo: wall {wall:.2f} s, CPU {cpu:.2f} s")


if __name__ == "__main__":
    main()
