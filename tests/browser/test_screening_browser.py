"""The screening views in Chromium: a component's partner table filters and sorts, the
behaviour matrix reads without script and links every cell that has a page.

Reference: common practice (an offline site works from file://; the heterogeneous
water azeotropes of 1-butanol and n-butyl acetate are in the handbook azeotrope tables,
and the catalogue records them).
"""

from __future__ import annotations

from pathlib import Path

from tests.browser.conftest import Watched


def test_partners_of_water_with_a_heterogeneous_azeotrope(site: Path, watched: Watched) -> None:
    page = watched.page
    page.goto((site / "components" / "water.html").as_uri())
    rows = page.locator("#atlas-partners tbody tr")
    total = rows.count()
    assert total >= 45
    page.select_option("#atlas-behaviour", "heterogeneous")
    shown = page.locator("#atlas-partners tbody tr:not([hidden]) td:first-child").all_inner_texts()
    expected = {"1-Butanol"} | ({"n-Butyl acetate"} if (
        site / "pairs" / "water--n-butyl-acetate.html").is_file() else set())
    assert expected <= set(shown)
    kinds = page.locator("#atlas-partners tbody tr:not([hidden])").evaluate_all(
        "rows => rows.map(r => r.dataset.behaviour)")
    assert set(kinds) == {"heterogeneous"}
    assert page.locator("#atlas-count").inner_text().startswith(f"{len(shown)} of {total}")
    page.select_option("#atlas-behaviour", "")
    page.select_option("#atlas-quality", "fitted")
    kinds = page.locator("#atlas-partners tbody tr:not([hidden])").evaluate_all(
        "rows => rows.map(r => r.dataset.quality)")
    assert kinds and set(kinds) == {"fitted"}
    page.select_option("#atlas-quality", "")
    header = page.locator("#atlas-partners thead th", has_text="Azeotrope T")
    header.click()
    keys = page.locator("#atlas-partners tbody tr td:nth-child(5)").evaluate_all(
        "cells => cells.map(c => parseFloat(c.dataset.sort))")
    assert keys == sorted(keys)
    page.locator("#atlas-partners a", has_text="Water + 1-Butanol").first.click()
    page.wait_for_url("**/pairs/water--1-butanol.html")
    watched.check()


def test_behaviour_matrix_links_and_reads_without_script(site: Path, watched: Watched,
                                                         browser: object) -> None:
    page = watched.page
    page.goto((site / "matrix.html").as_uri())
    cells = page.locator("table.atlas-bm td")
    n = page.locator("table.atlas-bm th.r").count()
    assert n >= 46 and cells.count() == n * n
    links = page.locator("table.atlas-bm td a").evaluate_all("as => as.map(a => a.href)")
    assert links
    for href in set(links):
        assert Path(href.removeprefix("file://")).is_file(), href
    legend = page.locator(".atlas-matrix-legend").inner_text()
    assert "minimum-boiling azeotrope" in legend and "fitted" in legend
    # Without JavaScript the matrix is the same table.
    context = browser.new_context(java_script_enabled=False)  # type: ignore[attr-defined]
    bare = context.new_page()
    bare.goto((site / "matrix.html").as_uri())
    assert bare.locator("table.atlas-bm td").count() == n * n
    context.close()
    watched.check()
