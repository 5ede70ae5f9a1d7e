"""A pair page prints as one datasheet: one A4 page and one Letter page, in Chromium.

Reference: common practice (a datasheet for a design meeting is one sheet of the office's
paper, A4 or US Letter; the figures keep a readable size).  Chromium prints each page to
PDF as a person would (print media, the page's own stylesheet); the pages are counted with
pypdf.
"""

from __future__ import annotations

import io
from pathlib import Path

import pytest

from tests.browser.conftest import Watched

pypdf = pytest.importorskip("pypdf", reason="the test extra is not installed: "
                                             "pip install -e '.[test]'")

#: Pages printed per paper size: every page of a small atlas, an even sample of a large one.
SAMPLE = 60
#: Always printed: long pages (four conditions, two liquids, many warnings).
ALWAYS = ("ethanol--water", "water--1-butanol", "acetone--chloroform", "ethanol--toluene")


def _sample(site: Path) -> list[Path]:
    pages = sorted((site / "pairs").glob("*.html"))
    chosen = [p for p in pages if p.stem in ALWAYS]
    step = max(1, len(pages) // SAMPLE)
    chosen += [p for p in pages[::step] if p not in chosen]
    return chosen


def _printed_pages(pdf: bytes) -> int:
    return len(pypdf.PdfReader(io.BytesIO(pdf)).pages)


@pytest.mark.parametrize("paper", ["A4", "Letter"])
def test_every_pair_prints_on_one_page(site: Path, watched: Watched, paper: str) -> None:
    page = watched.page
    pages = _sample(site)
    assert pages, "no pair pages in the site"
    too_long = {}
    for path in pages:
        page.goto(path.as_uri())
        page.wait_for_load_state("load")
        count = _printed_pages(page.pdf(format=paper, print_background=True))
        if count != 1:
            too_long[path.stem] = count
    assert too_long == {}, f"pair pages printing on more than one {paper} page: {too_long}"
    watched.check()


def test_datasheet_shows_the_meeting_parts_in_print_only(site: Path, watched: Watched) -> None:
    page = watched.page
    page.goto((site / "pairs" / "ethanol--water.html").as_uri())
    page.wait_for_load_state("load")
    extra = page.locator(".atlas-sheet-extra")
    assert not extra.is_visible()  # on screen the full page has these parts in full
    page.emulate_media(media="print")
    assert extra.is_visible()
    text = extra.inner_text()
    for part in ("Azeotropes", "Relative volatility at 101.325 kPa",
                 "Distillation quick look at 101.325 kPa", "Screening only", "Ethanol",
                 "safety data sheet"):
        assert part in text, part
    # Printed: the summary, two figures (Txy at the summary pressure and xy), nothing else
    # of the page body (the tables at round compositions, parameters, downloads).
    shown = page.locator("figure.atlas-figure:visible img").evaluate_all(
        "imgs => imgs.map(i => i.getAttribute('src').split('/').pop())")
    assert shown == ["txy-isobar-101-325kpa.svg", "xy.svg"]
    assert page.locator(".atlas-summary").is_visible()
    assert not page.locator("#tables-at-round-compositions").is_visible()
    assert not page.locator("#model-and-parameters").is_visible()
    # Readable figures: the Txy diagram is drawn at least 85 mm wide on paper (96 px/in).
    width_px = page.locator("figure.atlas-sheet-figure img").first.evaluate(
        "i => i.getBoundingClientRect().width")
    assert width_px * 25.4 / 96 >= 85
    watched.check()
