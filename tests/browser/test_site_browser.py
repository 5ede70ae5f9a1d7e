"""The built atlas in Chromium, from file:// and over a local HTTP server.

Reference: common practice (an offline site loads nothing from another host; search,
filters and sorting work in the page itself).
"""

from __future__ import annotations

import re
from collections.abc import Iterator
from pathlib import Path
from typing import Any

import pytest

from builder.site.serve import Preview
from tests.browser.conftest import Watched
from tests.conftest import HOSTILE_NAME

#: Predicted pair pages opened by the figure test: an even sample (they share one template
#: and one figure kind); every fitted page is opened.
PREDICTED_SAMPLE = 20
PREDICTED_PAGE = re.compile(r'class="atlas-summary[^"]*\batlas-predicted\b')


@pytest.fixture(scope="module")
def server(site: Path) -> Iterator[str]:
    preview = Preview(site, "127.0.0.1", 0, quiet=True).start()
    yield preview.url
    preview.close()


def _search(page: Any, query: str) -> list[str]:
    """Type into the site search as a person would (the index loads on focus)."""
    box = page.locator("input.md-search__input")
    box.click()
    box.fill("")
    # The results of the previous query must be gone before this one is typed, else the
    # wait below passes on them (at full size the search answers each key press late).
    page.wait_for_function(
        "() => { const m = document.querySelector('.md-search-result__meta');"
        " return !m || !/matching/.test(m.textContent); }")
    page.keyboard.type(query, delay=20)
    page.wait_for_function(
        "() => { const m = document.querySelector('.md-search-result__meta');"
        " return m && /matching|No matching/.test(m.textContent); }")
    # Then until the list stops changing (the answer to the last key press has arrived).
    shown: list[str] | None = None
    for _ in range(40):
        page.wait_for_timeout(250)
        now = [t.strip() for t in page.locator(".md-search-result__item h1").all_inner_texts()]
        if now == shown:
            break
        shown = now
    return shown or []


def _all_images_loaded(page: Any) -> int:
    page.wait_for_load_state("load")
    broken = page.evaluate("() => [...document.images].filter(i => !i.complete ||"
                           " i.naturalWidth === 0).map(i => i.src)")
    assert broken == [], f"figures that did not load: {broken}"
    return int(page.evaluate("() => document.images.length"))


@pytest.mark.parametrize("origin", ["file", "http"])
def test_search_finds_components_by_name_and_cas(site: Path, server: str, origin: str,
                                                 watched: Watched) -> None:
    page = watched.page
    page.goto((site / "index.html").as_uri() if origin == "file" else server)
    assert "chloroform" in page.title().lower() or page.title()
    results = _search(page, "chloroform")
    assert "Chloroform" in results[:3]
    assert any("Chloroform" in r and "+" in r for r in results)
    assert "Chloroform" in _search(page, "CHCl3")  # formula
    assert "Ethanol" in _search(page, "ethyl alcohol")  # synonym
    assert _search(page, "67-66-3")[0] == "Chloroform"  # CAS number
    page.locator(".md-search-result__item").first.click()
    page.wait_for_url(re.compile(r".*/components/chloroform\.html(\?.*)?$"))
    assert _all_images_loaded(page) >= 1
    watched.check()


@pytest.mark.parametrize("origin", ["file", "http"])
def test_pair_pages_show_every_figure(site: Path, server: str, origin: str,
                                      watched: Watched) -> None:
    page = watched.page
    page.goto((site / "index.html").as_uri() if origin == "file" else server)
    # The index shows a page of rows at a time: find the pair first, as a reader would.
    page.locator("#atlas-text").fill("ethanol water")
    page.get_by_role("link", name="Ethanol + Water", exact=True).click()
    page.wait_for_url("**/pairs/ethanol--water.html")
    assert page.locator("h1").inner_text() == "Ethanol + Water"
    summary = page.locator(".atlas-summary").inner_text()
    assert "minimum-boiling azeotrope" in summary
    count = _all_images_loaded(page)
    assert count >= 6  # Txy, Pxy, xy, ln γ, α (and the azeotrope trace)
    alts = page.locator("img").evaluate_all("imgs => imgs.map(i => i.alt)")
    assert all(len(a) > 40 for a in alts)
    assert page.locator("text=Screening only").count() >= 1
    # Every fitted pair of the shipped catalogue and an even sample of the predicted ones: a
    # page whose figures all load (from disk; over HTTP a sample, the files being the same).
    links = sorted((site / "pairs").glob("*.html"))
    fitted = [p for p in links if not PREDICTED_PAGE.search(p.read_text(encoding="utf-8"))]
    predicted = [p for p in links if p not in fitted]
    links = fitted + predicted[::max(1, len(predicted) // PREDICTED_SAMPLE)]
    for link in links if origin == "file" else links[:3]:
        page.goto(link.as_uri() if origin == "file" else f"{server}pairs/{link.name}")
        # A predicted page carries one combined Txy + xy figure; a fitted page at least Txy,
        # xy, ln γ and α for its one published condition (more with more conditions).
        expected = 1 if page.locator(".atlas-predicted").count() else 4
        assert _all_images_loaded(page) >= expected, link.name
    watched.check()


def test_methods_page_renders_math_offline(site: Path, watched: Watched) -> None:
    page = watched.page
    page.goto((site / "methods.html").as_uri())
    page.wait_for_selector(".arithmatex .katex")
    unrendered = page.evaluate("() => [...document.querySelectorAll('.arithmatex')]"
                               ".filter(e => !e.querySelector('.katex')).length")
    assert unrendered == 0
    assert any("katex" in url and url.endswith(".woff2") for url in watched.requests)
    watched.check()


def test_hostile_catalogue_text_shows_as_text(hostile_site: Path, watched: Watched) -> None:
    """The hostile site of tests/conftest.py (built once; test_site.py reads its files)."""
    out = hostile_site
    page = watched.page
    for name in ("pairs/acetone--chloroform.html", "components/chloroform.html",
                 "methods.html", "index.html"):
        page.goto((out / name).as_uri())
        page.wait_for_load_state("load")
        page.mouse.move(300, 300)
        assert page.evaluate("() => window.__pwned") is None, name
        assert page.locator("a[href^='javascript']").count() == 0
    # The index draws its rows from inline data: the name arrives there as text too.
    page.goto((out / "index.html").as_uri())
    page.locator("#atlas-text").fill("acetone")
    assert any(HOSTILE_NAME in t for t in
               page.locator("#atlas-pairs tbody tr td:first-child").all_inner_texts())
    assert page.locator("#atlas-pairs tbody script").count() == 0
    assert page.evaluate("() => window.__pwned") is None
    page.goto((out / "pairs/acetone--chloroform.html").as_uri())
    assert HOSTILE_NAME in page.locator("h1").inner_text()
    assert "[click](javascript:" in page.locator(".atlas-notes").inner_text()
    assert HOSTILE_NAME in page.title()
    results = _search(page, "pwned")
    assert results and page.evaluate("() => window.__pwned") is None
    assert page.locator(".md-search-result script, .md-search-result img").count() == 0
    watched.check()
