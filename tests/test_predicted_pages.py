"""Predicted pair pages: badged as predictions on the page, in the index, in search titles
and in atlas.json; one combined figure; the combinations without a page say why.

References: common practice (a prediction is never presented as fitted data; a missing
group or parameter is a reason, never a silent zero).
"""

from __future__ import annotations

import dataclasses
import json
import re
from pathlib import Path

import pytest

from builder.analysis.results import PairResults, compute_pair
from builder.catalogue.loader import Catalogue
from builder.site.content import SiteContent, generate
from builder.site.pair_files import page_view
from builder.site.predicted import NOT_BUILT, select_predicted
from builder.site.settings import SiteSettings, load_settings
from tests.conftest import ShippedResults

FITTED = ("ethanol--water",)
AMONG = ("water", "n-heptane", "ethanol")


@pytest.fixture(scope="module")
def built(catalogue: Catalogue, shipped_results: ShippedResults
          ) -> tuple[SiteContent, dict[str, PairResults], set[str]]:
    selection = select_predicted(catalogue, AMONG)
    atlas = {pid: shipped_results[pid] for pid in FITTED}
    atlas.update((pid, compute_pair(catalogue, r)) for pid, r in selection.records.items())
    # The component figures (drawn by every site build) are not what these tests check.
    _view, content = generate(SiteSettings(second_opinion=False), catalogue, atlas,
                              comp_figs={}, selection=selection)
    return content, atlas, set(selection.records)


def test_selection_among_components(catalogue: Catalogue) -> None:
    selection = select_predicted(catalogue, AMONG)
    # Three components: three combinations, one of them fitted (ethanol-water).
    assert set(selection.records) == {"ethanol--n-heptane", "n-heptane--water"}
    assert all(r.quality == "predicted" for r in selection.records.values())
    assert selection.reason("water", "toluene") == NOT_BUILT
    assert select_predicted(catalogue, ()).records == {}
    # A listed id the catalogue does not hold is skipped and named (a typo shows up in the
    # build's output; a catalogue built in part holds only some of the listed components).
    partial = select_predicted(catalogue, ("water", "no-such-thing", "n-heptane"))
    assert set(partial.records) == {"n-heptane--water"}
    assert partial.not_in_catalogue == ("no-such-thing",)


def test_unpredictable_combinations_are_listed_with_the_reason(catalogue: Catalogue) -> None:
    water = dataclasses.replace(catalogue.components["water"], groups=None)
    bare = dataclasses.replace(catalogue, components={**catalogue.components, "water": water})
    selection = select_predicted(bare, AMONG)
    assert set(selection.records) == {"ethanol--n-heptane"}
    assert [(u.component1, u.component2) for u in selection.unpredictable] == [
        ("n-heptane", "water")]
    assert selection.reason("water", "n-heptane").startswith("cannot be predicted: ")
    assert "water" in selection.reason("water", "n-heptane")


def test_predicted_pages_are_badged_everywhere(built: tuple) -> None:
    content, _atlas, predicted = built
    files = content.files
    page = files["pairs/n-heptane--water.md"].decode()
    assert 'title: "n-Heptane + Water (predicted)"' in page or "(predicted)" in page.split(
        "\n---", 1)[0]
    assert "atlas-predicted" in page and "Prediction, not fitted data" in page
    assert "UNIFAC" in page
    figures = [p for p in files if p.startswith("pairs/n-heptane--water/") and p.endswith(".svg")]
    assert len(figures) == 1 and "txy-xy-" in figures[0]  # one combined figure
    fitted = [p for p in files if p.startswith("pairs/ethanol--water/") and p.endswith(".svg")]
    assert len(fitted) >= 5
    index = files["index.md"].decode()
    assert index.count('data-quality="predicted"') == len(predicted)
    assert index.count('data-quality="fitted"') == len(FITTED)
    assert 'id="atlas-quality"' in index
    data = json.loads(files["atlas.json"])
    by_id = {p["id"]: p for p in data["pairs"]}
    assert by_id["n-heptane--water"]["quality"] == "predicted"
    assert "UNIFAC" in by_id["n-heptane--water"]["model"]
    assert by_id["ethanol--water"]["quality"] != "predicted"
    listing = files["unpredictable.md"].decode()
    assert "Combinations that cannot be predicted" in listing
    water = files["components/water.md"].decode()
    assert 'data-quality="predicted"' in water and 'data-quality="fitted"' in water


BROWSER_SETTINGS = Path(__file__).resolve().parent / "data" / "browser-site.yaml"


def test_shipped_settings_predict_every_combination(catalogue: Catalogue) -> None:
    """The shipped atlas has a page for every combination of catalogued components; the
    browser tests' own smaller build lists components with no typo (a listed id the
    catalogue lacks would only be skipped, with a line in the build output)."""
    assert load_settings().predicted_pairs == ("all",)
    listed = load_settings(BROWSER_SETTINGS).predicted_pairs
    assert listed and listed != ("all",)
    assert set(listed) <= set(catalogue.components)
    assert select_predicted(catalogue, listed).not_in_catalogue == ()


def test_summary_states_the_volatility_of_the_lighter_component(catalogue: Catalogue) -> None:
    # 1-Butanol (1) boils at 117.7 °C, 2-butanone (2) at 79.6 °C: component 2 is the light
    # one everywhere, so α12 < 1.  The sentence grades the split by α21 = 1/α12 and says so,
    # rather than printing α12 values below one beside "an easy split".  Common practice:
    # relative volatility is quoted for the lighter component over the heavier.
    selection = select_predicted(catalogue, ("1-butanol", "2-butanone"))
    (record,) = selection.records.values()
    assert (record.component1, record.component2) == ("1-butanol", "2-butanone")
    work = dataclasses.replace(catalogue, pairs={record.id: record})
    results = compute_pair(work, record)
    pair = page_view(work, results, SiteSettings(second_opinion=False))
    volatility = results.isobars[0].volatility
    assert volatility.alpha_max < 1.0
    assert "relative volatility of 2-Butanone over 1-Butanol" in pair.sentence
    low, high = (float(v) for v in re.findall(r"runs from ([\d.]+) to ([\d.]+)",
                                                pair.sentence)[0])
    assert low == pytest.approx(1.0 / volatility.alpha_max, rel=1e-3)
    assert high == pytest.approx(1.0 / volatility.alpha_min, rel=1e-3)
    assert 1.0 < low < high
    facts = dict((row.label, row.value) for row in pair.summary)
    (alpha,) = [value for label, value in facts.items() if label.startswith("Relative vol")]
    assert f"α21 = 1/α12 from {low:.3g} to {high:.3g}" in alpha


def test_a_predicted_liquid_split_carries_its_caution(catalogue: Catalogue) -> None:
    # n-Heptane and water are almost immiscible (common practice): the prediction shows
    # two liquids and says how far to trust a predicted split; toluene + n-heptane mix
    # (common practice), and a fitted pair's own split (water + 1-butanol) is not a
    # prediction.
    selection = select_predicted(catalogue, ("n-heptane", "toluene", "water"))
    work = dataclasses.replace(catalogue, pairs={**catalogue.pairs, **selection.records})
    caution = "predicted by a group-contribution model"
    split = compute_pair(work, work.pairs["n-heptane--water"])
    assert not all(c.liquid_stable.all() for c in split.conditions)
    assert any(caution in w for w in split.warnings)
    mixed = compute_pair(work, work.pairs["n-heptane--toluene"])
    assert not any(caution in w for w in mixed.warnings)
    fitted = compute_pair(catalogue, catalogue.pairs["water--1-butanol"])
    assert not any(caution in w for w in fitted.warnings)
