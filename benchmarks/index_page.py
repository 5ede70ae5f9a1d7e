"""Benchmark: the index of pairs in Chromium -- page weight, time to a usable page and to
the first filtered result.

Opens ``index.html`` of a built site from file:// in Debian's Chromium (Playwright, never a
downloaded browser), a new browser context each run (nothing cached), and measures:

- page weight: ``index.html`` in bytes, and the inline row data in it
  (``<script id="atlas-index-data">``, if the page has it);
- first contentful paint (the browser's own paint timing), DOMContentLoaded and load;
- usable: from the start of navigation to the first frame with the row count shown above
  the table (the script has set up the filters and the rows are on screen);
- first filtered result: from choosing a behaviour in the filter (and, separately, from
  typing a component name into Find) to the next frame painted with the rows that match.

Run: ``python benchmarks/index_page.py SITE_FOLDER [--runs 5]``; it prints a Markdown table
(median of the runs) for ``docs/benchmarks.md``.
"""

from __future__ import annotations

import argparse
import re
import statistics
from pathlib import Path
from typing import Any

#: In the page: change a filter control, wait for the next painted frame, return the time.
_FILTER = """([selector, value, kind]) => new Promise(done => {
  const el = document.querySelector(selector);
  const t0 = performance.now();
  el.value = value;
  el.dispatchEvent(new Event(kind, {bubbles: true}));
  requestAnimationFrame(() => setTimeout(() => done({
    ms: performance.now() - t0,
    count: document.getElementById('atlas-count').textContent}), 0));
})"""

#: The browser's own timings of the navigation, in ms from its start.
_TIMINGS = """() => {
  const nav = performance.getEntriesByType('navigation')[0];
  const paint = performance.getEntriesByName('first-contentful-paint')[0];
  return {fcp: paint ? paint.startTime : null, dcl: nav.domContentLoadedEventEnd,
          load: nav.loadEventEnd};
}"""


def page_weight(site: Path) -> tuple[int, int]:
    """Bytes of ``index.html`` and of its inline row data (0 if it has none)."""
    html = (site / "index.html").read_text(encoding="utf-8")
    match = re.search(r'<script type="application/json" id="atlas-index-data">(.*?)</script>',
                      html, re.S)
    return len(html.encode("utf-8")), len(match.group(1).encode("utf-8")) if match else 0


def one_run(browser: Any, url: str) -> dict[str, float]:
    context = browser.new_context(viewport={"width": 1280, "height": 900})
    page = context.new_page()
    page.set_default_timeout(120000)
    page.goto(url, wait_until="commit")
    usable_ms = page.wait_for_function(
        "() => { const c = document.getElementById('atlas-count');"
        " return c && c.textContent.trim().length > 0 && performance.now(); }",
        polling="raf").json_value()
    page.wait_for_load_state("load")
    timings = page.evaluate(_TIMINGS)
    behaviour = page.evaluate(_FILTER, ["#atlas-behaviour", "minimum-boiling", "change"])
    page.evaluate(_FILTER, ["#atlas-behaviour", "", "change"])
    find = page.evaluate(_FILTER, ["#atlas-text", "toluene", "input"])
    context.close()
    return {"fcp": timings["fcp"] or float("nan"), "dcl": timings["dcl"],
            "load": timings["load"], "usable": usable_ms, "filter": behaviour["ms"],
            "find": find["ms"], "filter_count": behaviour["count"], "find_count": find["count"]}


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("site", type=Path, nargs="?", default=Path("site"))
    parser.add_argument("--runs", type=int, default=5)
    args = parser.parse_args()
    site = args.site.resolve()
    html_bytes, data_bytes = page_weight(site)
    print(f"index.html: {html_bytes / 1e6:.2f} MB"
          + (f" (inline row data {data_bytes / 1e6:.2f} MB)" if data_bytes else ""))
    from playwright.sync_api import sync_playwright

    runs = []
    with sync_playwright() as playwright:
        browser = playwright.chromium.launch(executable_path="/usr/bin/chromium")
        for _ in range(args.runs):
            runs.append(one_run(browser, (site / "index.html").as_uri()))
        browser.close()
    print(f"after choosing a behaviour: {runs[-1]['filter_count']}")
    print(f"after typing 'toluene': {runs[-1]['find_count']}")
    print(f"\nmedian of {len(runs)} runs (a new browser context each):\n")
    print("| first contentful paint | DOMContentLoaded | load | usable (row count shown) "
          "| first result of a behaviour filter | of typing in Find |")
    print("|---|---|---|---|---|---|")
    med = {k: statistics.median(r[k] for r in runs)
           for k in ("fcp", "dcl", "load", "usable", "filter", "find")}
    print(f"| {med['fcp']:.0f} ms | {med['dcl']:.0f} ms | {med['load']:.0f} ms "
          f"| {med['usable']:.0f} ms | {med['filter']:.0f} ms | {med['find']:.0f} ms |")


if __name__ == "__main__":
    main()
