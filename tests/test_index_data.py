"""The index page's inline row data (builder/site/index_data.py): every pair once, the cells
the page printed before, sort keys as numbers (null where there is no value), and no
catalogue text able to leave its script element.

References: azeotropes at 101.325 kPa from the azeotrope tables of the CRC Handbook of
Chemistry and Physics ("Azeotropic data for binary mixtures"; from memory; verify):
ethanol + water minimum-boiling at 78.2 °C, x(ethanol) 0.89; acetone + chloroform
maximum-boiling at 64.5 °C, x(acetone) about 0.34.  Water boils at 100.0 °C at
101.325 kPa (common practice).  Script-element escaping: common practice.
"""

from __future__ import annotations

import json
import math
import re
from typing import Any

import pytest

from builder.analysis.results import PairResults
from builder.catalogue.loader import Catalogue
from builder.site.content import generate
from builder.site.index_data import ROW_FIELDS, index_script
from builder.site.settings import SiteSettings
from tests.conftest import ShippedResults

PAIRS = ("ethanol--water", "acetone--chloroform", "benzene--toluene", "water--1-butanol")
_BLOCK = re.compile(r'<script type="application/json" id="atlas-index-data">(.*?)</script>',
                    re.S)


def index_data_of(page: str) -> dict[str, Any]:
    """The inline data of a rendered index page."""
    blocks = _BLOCK.findall(page)
    assert len(blocks) == 1, "the index page carries exactly one data block"
    data: dict[str, Any] = json.loads(blocks[0])
    return data


def index_rows(page: str) -> list[dict[str, Any]]:
    """The rows of a rendered index page, each as {field: value} with names resolved."""
    data = index_data_of(page)
    out = []
    for raw in data["rows"]:
        row = dict(zip(data["fields"], raw, strict=True))
        row["component1"] = data["components"][row["component1"]][0]
        row["component2"] = data["components"][row["component2"]][0]
        row["behaviour"] = data["behaviours"][row["behaviour"]][0]
        row["model"] = data["models"][row["model"]]
        row["quality"] = data["qualities"][row["quality"]]
        row["predicted"] = bool(row["predicted"])
        out.append(row)
    return out


@pytest.fixture(scope="module")
def index_page(catalogue: Catalogue, shipped_results: ShippedResults) -> str:
    atlas: dict[str, PairResults] = {pid: shipped_results[pid] for pid in PAIRS}
    # The component figures (drawn by every site build) are not what these tests check.
    _view, content = generate(SiteSettings(), catalogue, atlas, comp_figs={})
    return content.files["index.md"].decode()


def test_every_pair_once_with_its_azeotrope(index_page: str) -> None:
    rows = {r["id"]: r for r in index_rows(index_page)}
    assert sorted(rows) == sorted(PAIRS)
    assert list(index_data_of(index_page)["fields"]) == list(ROW_FIELDS)
    ew = rows["ethanol--water"]
    assert (ew["component1"], ew["component2"]) == ("ethanol", "water")
    assert ew["behaviour"] == "minimum-boiling" and not ew["predicted"]
    assert ew["azeotrope_T_sort"] == pytest.approx(78.2, abs=0.6)
    assert ew["azeotrope_x1_sort"] == pytest.approx(0.89, abs=0.03)
    assert ew["azeotrope_T"] == f"{ew['azeotrope_T_sort']:.1f}"
    ac = rows["acetone--chloroform"]
    assert ac["behaviour"] == "maximum-boiling"
    assert ac["azeotrope_T_sort"] == pytest.approx(64.5, abs=1.0)
    assert ac["azeotrope_x1_sort"] == pytest.approx(0.34, abs=0.06)
    bt = rows["benzene--toluene"]
    assert bt["behaviour"] == "zeotropic"
    # No azeotrope: a dash to read and no sort key (the script sorts it last).
    assert bt["azeotrope_T"] == "—" and bt["azeotrope_T_sort"] is None
    assert bt["alpha_sort"] > 1  # benzene is the more volatile over the whole range
    assert rows["water--1-butanol"]["behaviour"] == "heterogeneous"


def test_components_carry_boiling_point_and_search_text(index_page: str) -> None:
    data = index_data_of(index_page)
    water = next(c for c in data["components"] if c[0] == "water")
    assert water[2] == "100.0" and water[3] == pytest.approx(100.0, abs=0.05)
    assert "7732-18-5" in water[4] and "h2o" in water[4]
    assert water[4] == water[4].lower()


def test_the_page_without_script_lists_the_fitted_pairs(index_page: str) -> None:
    for pid in PAIRS:  # all fitted here
        assert f'href="pairs/{pid}.html"' in index_page
    assert index_page.count('data-quality="fitted"') == len(PAIRS)


def test_no_catalogue_text_leaves_the_script_element() -> None:
    hostile = 'Chloro</script><script>window.__pwned=1</script>form & <!-- \u2028'
    data = {"components": [["x", hostile]], "rows": [], "missing": None}
    block = str(index_script(data))
    assert block.count("</script>") == 1 and block.endswith("</script>")
    assert "<script>" not in block and "<!--" not in block and "\u2028" not in block
    assert json.loads(_BLOCK.findall(block)[0]) == data
    with pytest.raises(ValueError):
        index_script({"x": math.nan})  # never a NaN the browser's JSON cannot read
