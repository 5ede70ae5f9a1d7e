"""The solvent-screening views: each component's partner table and the behaviour matrix.

References: common practice (the relative volatility of 2 over 1 is 1/α12; a binary
azeotrope's composition in component 2 is 1 - x1; a component pair is one unordered
pair, so the matrix is symmetric) and IUPAC nomenclature for the chemical families.
"""

from __future__ import annotations

import re

import pytest
import yaml

from builder.analysis.results import PairResults
from builder.catalogue.loader import Catalogue
from builder.catalogue.reader import _StrictLoader
from builder.site.context import AtlasView, summary_condition
from builder.site.families import FAMILIES, family, family_of_groups
from builder.site.matrix import MARKS, behaviour_matrix, family_starts
from builder.site.pages import render_pages
from builder.site.partners import NO_PAGE, partner_rows
from builder.site.settings import SiteSettings
from tests.conftest import ShippedResults, atlas_view

PAIRS = ("ethanol--water", "water--1-butanol", "acetone--chloroform", "benzene--toluene")


@pytest.fixture(scope="module")
def small(catalogue: Catalogue, shipped_results: ShippedResults
          ) -> tuple[AtlasView, dict[str, PairResults]]:
    atlas = {pid: shipped_results[pid] for pid in PAIRS}
    return atlas_view(SiteSettings(), catalogue, atlas), atlas


@pytest.mark.parametrize(("cid", "expected"), [
    ("water", "water"), ("ethanol", "alcohols"), ("tert-butanol", "alcohols"),
    ("acetic-acid", "acids"), ("formic-acid", "acids"), ("acetonitrile", "nitrogen"),
    ("pyridine", "nitrogen"), ("chloroform", "halogenated"), ("ethyl-acetate", "esters"),
    ("acetone", "ketones"), ("methyl-tert-butyl-ether", "ethers"),
    ("tetrahydrofuran", "ethers"), ("1-4-dioxane", "ethers"), ("toluene", "aromatics"),
    ("styrene", "aromatics"), ("propylene", "alkenes"), ("cyclohexane", "alkanes"),
    ("n-octane", "alkanes"),
])
def test_families_from_groups(catalogue: Catalogue, cid: str, expected: str) -> None:
    """IUPAC classes by functional group; the first family in FAMILIES wins."""
    assert family(catalogue.components[cid]) == expected


def test_family_precedence_and_unknown_groups() -> None:
    assert family_of_groups({"CH3": 1, "COOH": 1, "OH": 1}) == "acids"  # functional group first
    assert family_of_groups({"CH2=CH": 1, "ACH": 5, "AC": 1}) == "aromatics"
    assert family_of_groups({"SOMETHING-NEW": 1}) == "other"
    assert family_of_groups({}) == "other"
    assert set(FAMILIES) >= {"water", "alcohols", "aromatics", "alkanes", "other"}


def test_partner_rows_are_every_other_component(catalogue: Catalogue,
                                                small: tuple[AtlasView, dict]) -> None:
    view, _atlas = small
    rows = partner_rows(view, catalogue)
    n = len(catalogue.components)
    assert set(rows) == set(catalogue.components)
    for cid, partners in rows.items():
        assert len(partners) == n - 1
        assert cid not in {r.partner.id for r in partners}
    water = {r.partner.id: r for r in rows["water"]}
    assert water["1-butanol"].behaviour == "heterogeneous"
    assert water["1-butanol"].origin == "fitted" and water["1-butanol"].has_page
    assert water["n-octane"].behaviour == NO_PAGE and not water["n-octane"].has_page
    assert "no page" in water["n-octane"].behaviour_label  # says why


def test_partner_rows_are_written_for_the_page_component(catalogue: Catalogue,
                                                          small: tuple[AtlasView, dict]
                                                          ) -> None:
    view, atlas = small
    rows = partner_rows(view, catalogue)
    on_ethanol = {r.partner.id: r for r in rows["ethanol"]}["water"]
    on_water = {r.partner.id: r for r in rows["water"]}["ethanol"]
    assert on_ethanol.behaviour == on_water.behaviour == "minimum-boiling"
    # Composition of the page's own component: x and 1 - x.
    assert on_ethanol.azeotrope_x_sort + on_water.azeotrope_x_sort == pytest.approx(1.0)
    assert on_ethanol.azeotrope_x_sort > 0.8  # ethanol-rich azeotrope (handbook tables)
    # Relative volatility of the page's component over the partner: α21 = 1/α12.
    summary = summary_condition(atlas["ethanol--water"], view.settings)
    assert summary is not None
    v = summary.volatility
    assert on_ethanol.alpha_sort == pytest.approx(v.alpha_min)
    assert on_water.alpha_sort == pytest.approx(1.0 / v.alpha_max)
    assert on_ethanol.azeotrope_T == on_water.azeotrope_T


def test_matrix_is_symmetric_grouped_and_complete(catalogue: Catalogue,
                                                  small: tuple[AtlasView, dict]) -> None:
    view, _atlas = small
    mx = behaviour_matrix(view, partner_rows(view, catalogue))
    n = len(catalogue.components)
    assert len(mx.columns) == len(mx.rows) == n and sum(k for _l, k in mx.groups) == n
    ids = [c.id for c in mx.columns]
    for i, row in enumerate(mx.rows):
        assert row.component.id == ids[i] and len(row.cells) == n
        assert row.cells[i].symbol == "" and row.cells[i].css.startswith("s")
        for j, cell in enumerate(row.cells):
            assert (cell.symbol, cell.url) == (mx.rows[j].cells[i].symbol,
                                               mx.rows[j].cells[i].url)
    # Families are contiguous and in the published order.
    labels = [r.family_label for r in mx.rows]
    starts = family_starts(mx.groups)
    assert [labels[s] for s in starts] == [label for label, _n in mx.groups]
    assert len(set(labels)) == len(mx.groups)
    assert sum(k for _t, k in mx.counts) == n * (n - 1) // 2
    # Every catalogued pair of the build links to its page, outlined as fitted.
    at = {c.id: i for i, c in enumerate(mx.columns)}
    for pid in PAIRS:
        a, b = catalogue.pairs[pid].component1, catalogue.pairs[pid].component2
        cell = mx.rows[at[a]].cells[at[b]]
        assert cell.url == f"pairs/{pid}.md" and " f" in f" {cell.css} "
    # A combination this build leaves out carries no words (the legend says it); one that
    # cannot be predicted names the reason.
    left_out = mx.rows[at["water"]].cells[at["n-octane"]]
    assert left_out.symbol == "×" and left_out.url == "" and left_out.title == ""
    rows = partner_rows(view, catalogue, lambda a, b: "cannot be predicted: no groups")
    mx = behaviour_matrix(view, rows)
    assert mx.rows[at["water"]].cells[at["n-octane"]].title.endswith("no groups")


def test_marks_differ_by_symbol_not_colour_alone() -> None:
    symbols = [symbol for _css, symbol, _text in MARKS.values()]
    assert len(set(symbols)) == len(symbols)
    assert all(symbols)


def test_screening_pages_render_light(catalogue: Catalogue,
                                      small: tuple[AtlasView, dict]) -> None:
    view, _atlas = small
    pages = render_pages(view, {}, {}, partners=partner_rows(view, catalogue))
    matrix = pages["matrix.md"]
    assert "style=" not in matrix and "<script" not in matrix
    n = len(catalogue.components)
    assert matrix.count("<td") == n * n
    assert len(matrix.encode()) / (n * n) < 100  # bytes per cell, links and classes only
    water = pages["components/water.md"]
    table = water[water.index('id="atlas-partners"'):]
    assert table.count('<tr data-behaviour="') == n - 1
    assert 'data-behaviour="heterogeneous" data-quality="fitted"' in table
    assert re.search(r'<option value="heterogeneous">', water)


def test_every_page_is_left_out_of_the_theme_search(catalogue: Catalogue,
                                                    small: tuple[AtlasView, dict]) -> None:
    # The atlas writes its own compact index (builder/site/search.py); a page the theme's
    # search plugin does not skip is parsed in full for nothing (a component page's partner
    # table made that a fifth of the assembly time).  A second "search:" key in the front
    # matter once overrode "exclude: true": duplicate keys are refused here.
    view, _atlas = small
    pages = render_pages(view, {}, {}, partners=partner_rows(view, catalogue))
    for path, text in pages.items():
        front = text.split("---\n", 2)[1]
        meta = yaml.load(front, Loader=_StrictLoader)
        assert meta["search"] == {"exclude": True}, path
