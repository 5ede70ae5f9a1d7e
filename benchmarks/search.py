"""Benchmark: the site search in Chromium -- index size and time to the first result.

Opens a built site from file:// in Debian's Chromium (Playwright, never a downloaded
browser), focuses the search box (the index loads then), types a query and measures the
time from the first key press to the first result shown, for a name, a formula and a
CAS number.  Run: ``python benchmarks/search.py SITE_FOLDER`` (e.g. ``site``).

``--pairs N`` first copies the site to a temporary folder and inflates its index to N
pair entries by repeating the existing pair entries under generated page names
(BENCHMARK DATA: the size and load time of a full atlas's index, not real pairs).
"""

from __future__ import annotations

import argparse
import json
import shutil
import statistics
import tempfile
import time
from pathlib import Path

QUERIES = ("chloroform", "CHCl3", "67-66-3", "ethanol")


def inflate(site: Path, pairs: int, target: Path) -> Path:
    """A copy of ``site`` whose index holds ``pairs`` pair entries (repeated, renamed)."""
    shutil.copytree(site, target)
    path = target / "search" / "search_index.json"
    data = json.loads(path.read_text(encoding="utf-8"))
    docs = data["docs"]
    pair_docs = [d for d in docs if d["location"].startswith("pairs/")]
    others = [d for d in docs if not d["location"].startswith("pairs/")]
    grown = []
    for n in range(pairs):
        entry = dict(pair_docs[n % len(pair_docs)])
        if n >= len(pair_docs):
            entry["location"] = entry["location"].replace(".html", f"-b{n}.html")
        grown.append(entry)
    data["docs"] = others + grown
    text = json.dumps(data, ensure_ascii=False, separators=(",", ":"))
    path.write_text(text, encoding="utf-8")
    (target / "search" / "search_index.js").write_text(f"var __index = {text}",
                                                        encoding="utf-8")
    return target


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("site", type=Path, nargs="?", default=Path("site"))
    parser.add_argument("--pairs", type=int, default=0)
    args = parser.parse_args()
    with tempfile.TemporaryDirectory(prefix="atlas-search-") as scratch:
        site = args.site.resolve()
        if args.pairs:
            site = inflate(site, args.pairs, Path(scratch) / "site")
        measure(site)


def measure(site: Path) -> None:
    index = site / "search" / "search_index.js"
    print(f"search index: {index.stat().st_size / 1e6:.2f} MB ({index})")
    from playwright.sync_api import sync_playwright

    with sync_playwright() as playwright:
        browser = playwright.chromium.launch(executable_path="/usr/bin/chromium")
        print("| query | first results shown after | results |")
        print("|---|---|---|")
        firsts = []
        for query in QUERIES:
            page = browser.new_page()  # a new page: the index is loaded anew each time
            page.goto((site / "index.html").as_uri())
            page.wait_for_load_state("load")
            box = page.locator("input.md-search__input")
            start = time.perf_counter()
            box.click()
            page.keyboard.type(query, delay=0)
            page.wait_for_function(
                "() => document.querySelectorAll('.md-search-result__item').length > 0",
                timeout=60000)
            elapsed = time.perf_counter() - start
            firsts.append(elapsed)
            count = page.locator(".md-search-result__item").count()
            print(f"| {query} | {elapsed * 1e3:.0f} ms | {count} |")
            page.close()
        browser.close()
    print(f"\nmedian time to first result: {statistics.median(firsts) * 1e3:.0f} ms")


if __name__ == "__main__":
    main()
