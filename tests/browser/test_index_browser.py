"""The index of pairs in Chromium, from file://: rows drawn a page at a time from the page's
own data, filters, find, sorting and paging on that data, the view kept in the address
(a link opens it, Back returns to the previous one), the keyboard, and the page without
JavaScript.

Reference: the site's atlas.json (written by builder/site/data.py from the computed
results, a route apart from the index page and its script) gives every pair's page,
components, behaviour, data quality and normal boiling points; the counts and orders the
page shows are checked against it.  Paging, linking and Back: common practice.
"""

from __future__ import annotations

import json
import re
from pathlib import Path
from typing import Any

import pytest

from tests.browser.conftest import Watched

COUNT = "#atlas-count"
ROWS = "#atlas-pairs tbody tr"


@pytest.fixture(scope="module")
def atlas(site: Path) -> dict[str, Any]:
    return json.loads((site / "atlas.json").read_text(encoding="utf-8"))


def _count(page: Any) -> tuple[int, int, int]:
    """First and last row shown and the number of matching pairs, from the count line."""
    text = page.locator(COUNT).inner_text().replace(",", "")
    match = re.match(r"showing (\d+)–(\d+) of (\d+)", text)
    assert match, f"unexpected count line: {text!r}"
    first, last, of = (int(g) for g in match.groups())
    return first, last, of


def _ids(page: Any) -> list[str]:
    hrefs = page.locator(f"{ROWS} td:first-child a").evaluate_all(
        "links => links.map(a => a.getAttribute('href'))")
    return [re.sub(r"^pairs/|\.html$", "", h) for h in hrefs]


def _all_shown(page: Any) -> list[str]:
    """Every pair of the current view, page after page (through the Next button)."""
    ids = _ids(page)
    nxt = page.locator("#atlas-pager button", has_text="Next")
    while nxt.count() and nxt.is_visible() and nxt.is_enabled():
        before = _count(page)[0]
        nxt.click()
        page.wait_for_function(f"() => !document.querySelector('{COUNT}').textContent"
                               f".startsWith('showing {before:,}–')")
        ids += _ids(page)
    return ids


def _open(page: Any, site: Path, hash_: str = "") -> None:
    """A fresh load of the index (never only a change of the address after "#")."""
    page.goto("about:blank")
    page.goto((site / "index.html").as_uri() + hash_)
    page.wait_for_function(f"() => document.querySelector('{COUNT}').textContent.length > 0")


def test_every_pair_is_listed_once_page_by_page(site: Path, atlas: dict,
                                                watched: Watched) -> None:
    page = watched.page
    _open(page, site)
    pairs = {p["id"]: p for p in atlas["pairs"]}
    first, last, of = _count(page)
    assert (first, of) == (1, len(pairs))
    assert last == min(100, len(pairs)) == page.locator(ROWS).count()
    ids = _all_shown(page)
    assert sorted(ids) == sorted(pairs), "the pages together list every pair exactly once"
    for pid in ids[:3] + ids[-3:]:
        assert (site / pairs[pid]["page"]).is_file()
    predicted = page.locator(f"{ROWS} .atlas-badge-small", has_text="predicted").count()
    shown = _ids(page)
    assert predicted == sum(pairs[p]["quality"] == "predicted" for p in shown)
    watched.check()


def test_filters_match_the_atlas_data(site: Path, atlas: dict, watched: Watched) -> None:
    page = watched.page
    _open(page, site)
    pairs = atlas["pairs"]
    page.select_option("#atlas-page-size", "1000")
    page.select_option("#atlas-behaviour", "minimum-boiling")
    expected = {p["id"] for p in pairs if p["behaviour"] == "minimum-boiling"}
    assert expected and "ethanol--water" in expected
    assert _count(page)[2] == len(expected)
    assert set(_all_shown(page)) == expected
    page.select_option("#atlas-component", "water")
    with_water = {p["id"] for p in pairs if p["behaviour"] == "minimum-boiling"
                  and "water" in p["components"]}
    assert set(_ids(page)) == with_water and _count(page)[2] == len(with_water)
    kinds = page.locator(ROWS).evaluate_all("rows => rows.map(r => r.dataset.behaviour)")
    assert set(kinds) == {"minimum-boiling"}
    page.select_option("#atlas-behaviour", "")
    page.select_option("#atlas-component", "")
    for kind in ("fitted", "predicted"):
        page.select_option("#atlas-quality", kind)
        want = {p["id"] for p in pairs if (p["quality"] == "predicted") == (kind == "predicted")}
        assert _count(page)[2] == len(want)
        assert set(_all_shown(page)) == want
    page.select_option("#atlas-quality", "")
    # Find: a CAS number; two words (every word must match: water and ethanol's CAS number).
    page.locator("#atlas-text").fill("7732-18-5")
    water = {p["id"] for p in pairs if "7732-18-5" in p["cas"]}
    assert set(_all_shown(page)) == water and _count(page)[2] == len(water)
    page.locator("#atlas-text").fill("water 64-17-5")
    assert _ids(page) == ["ethanol--water"]
    page.locator("#atlas-text").fill("no such solvent")
    assert page.locator(ROWS).count() == 0
    assert page.locator(COUNT).inner_text().startswith("no pair matches")
    watched.check()


def test_sorting_by_a_column_and_back(site: Path, atlas: dict, watched: Watched) -> None:
    page = watched.page
    _open(page, site)
    boiling = {p["id"]: p["normal_boiling_points_K"][0] for p in atlas["pairs"]}
    header = page.locator("#atlas-pairs thead th", has_text="1 /")
    header.locator("button").click()
    assert header.get_attribute("aria-sort") == "ascending"
    assert "sort=boiling1" in page.url
    page.select_option("#atlas-page-size", "1000")
    ids = _all_shown(page)
    assert [boiling[i] for i in ids] == sorted(boiling.values())
    _open(page, site, "#sort=boiling1")
    # The keyboard: the heading is a button; Enter sorts the other way.
    header.locator("button").focus()
    page.keyboard.press("Enter")
    assert header.get_attribute("aria-sort") == "descending"
    keys = page.locator(f"{ROWS} td:nth-child(2)").evaluate_all(
        "cells => cells.map(c => parseFloat(c.dataset.sort))")
    assert keys == sorted(keys, reverse=True) and keys[0] == pytest.approx(
        max(boiling.values()) - 273.15, abs=0.05)
    # Missing values (no azeotrope) sort last both ways.
    az = page.locator("#atlas-pairs thead th", has_text="Azeotrope T")
    for _ in range(2):
        az.locator("button").click()
        cells = page.locator(f"{ROWS} td:nth-child(5)").evaluate_all(
            "cells => cells.map(c => c.dataset.sort)")
        present = [c for c in cells if c]
        assert present and cells[:len(present)] == present
    watched.check()


def test_a_linked_view_opens_and_back_returns(site: Path, atlas: dict,
                                              watched: Watched) -> None:
    page = watched.page
    _open(page, site, "#behaviour=minimum-boiling&component=water&sort=-azeotrope-t")
    assert page.locator("#atlas-behaviour").input_value() == "minimum-boiling"
    assert page.locator("#atlas-component").input_value() == "water"
    want = {p["id"] for p in atlas["pairs"]
            if p["behaviour"] == "minimum-boiling" and "water" in p["components"]}
    assert set(_ids(page)) == want
    temps = page.locator(f"{ROWS} td:nth-child(5)").evaluate_all(
        "cells => cells.map(c => parseFloat(c.dataset.sort))")
    assert temps == sorted(temps, reverse=True)
    page.select_option("#atlas-quality", "fitted")
    assert "set=fitted" in page.url
    page.go_back()
    page.wait_for_function("() => document.getElementById('atlas-quality').value === ''")
    assert set(_ids(page)) == want and "set=fitted" not in page.url
    # Paging is in the address too: page 2 and Back to page 1.
    _open(page, site)
    if _count(page)[2] > 100:
        page.locator("#atlas-pager button", has_text="Next").click()
        assert _count(page)[0] == 101 and "page=2" in page.url
        page.go_back()
        page.wait_for_function(f"() => document.querySelector('{COUNT}')"
                               ".textContent.startsWith('showing 1–')")
    # The pager from the keyboard: Enter on Next, twice (the focus stays on Next).
    _open(page, site, "#rows=50")
    if _count(page)[2] > 100:
        page.locator("#atlas-pager button", has_text="Next").focus()
        page.keyboard.press("Enter")
        assert page.evaluate("() => document.activeElement.dataset.step") == "next"
        page.keyboard.press("Enter")
        assert _count(page)[:2] == (101, min(150, _count(page)[2]))
        assert "page=3" in page.url and "rows=50" in page.url
    _open(page, site)
    # Typing a word makes one history entry, not one per key.
    page.locator("#atlas-text").click()
    page.keyboard.type("toluene", delay=10)
    assert "find=toluene" in page.url
    page.go_back()
    page.wait_for_function("() => document.getElementById('atlas-text').value === ''")
    watched.check()


def test_without_javascript_the_fitted_pairs_are_listed(site: Path, atlas: dict,
                                                       browser: Any) -> None:
    context = browser.new_context(java_script_enabled=False)
    page = context.new_page()
    page.goto((site / "index.html").as_uri())
    fitted = {p["id"] for p in atlas["pairs"] if p["quality"] != "predicted"}
    assert set(_ids(page)) == fitted
    assert page.locator("#atlas-index-controls").is_hidden()
    if len(fitted) < len(atlas["pairs"]):
        note = page.locator(".atlas-index-nojs").inner_text()
        assert "need JavaScript" in note
        assert page.locator(".atlas-index-nojs a").count() == 2
    for href in page.locator("#atlas-pairs a").evaluate_all("as => as.map(a => a.href)"):
        assert Path(href.removeprefix("file://")).is_file(), href
    context.close()
