"""Benchmark: the site search in Chromium -- index size and time to the first result.

Opens a built site from file:// in Debian's Chromium (Playwright, never a downloaded
browser), focuses the search box (the index loads then), types a query and measures the
time from the first key press to the first result shown, for a name, a formula and a
CAS number.  Run: ``python benchmarks/search.py SITE_FOLDER`` (e.g. ``site``).
"""

from __future__ import annotations

import statistics
import sys
import time
from pathlib import Path

QUERIES = ("chloroform", "CHCl3", "67-66-3", "ethanol")


def main() -> None:
    site = Path(sys.argv[1] if len(sys.argv) > 1 else "site").resolve()
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
