"""The second opinion: the predictive model (UNIFAC) beside a fitted pair.

References: the handbook azeotrope tables for the 1-atm behaviour classes; from memory
(verify): the ethanol-water azeotrope moves toward pure ethanol under vacuum and
disappears near 10 kPa, which temperature-dependent models reproduce and a set of
temperature-independent 1-atm parameters does not; common practice for the rest
(a pair is compared with itself in the same units; a missing parameter is never zero).
"""

from __future__ import annotations

import dataclasses

import numpy as np
import pytest

from builder.analysis.results import PairResults
from builder.analysis.second_opinion import (
    SHIFT_TOLERANCE,
    behaviour_class,
    predicted_record,
    second_opinion,
)
from builder.catalogue.loader import Catalogue
from builder.site.context import behaviour
from tests.conftest import ShippedResults


@pytest.fixture(scope="module")
def ethanol_water(shipped_results: ShippedResults) -> PairResults:
    return shipped_results["ethanol--water"]


def test_ethanol_water_second_opinion(catalogue: Catalogue, ethanol_water: PairResults) -> None:
    op = second_opinion(catalogue, ethanol_water)
    assert op.available and "Dortmund" in op.model
    # Handbook azeotrope table: minimum-boiling at 1 atm; both models say so.
    assert op.fitted_class == op.predicted_class == "minimum-boiling"
    assert 0.0 <= op.max_dT_K < 3.0 and 0.0 <= op.x1_at_max <= 1.0
    assert "same behaviour" in op.agreement()
    # From memory (verify): toward ethanol under vacuum in the predicted trace ...
    trace = op.trace
    assert trace is not None
    i_low = int(np.nanargmin(trace.P_Pa))
    i_atm = int(np.argmin(np.abs(trace.P_Pa - 101325.0)))
    assert trace.x1[i_low] > trace.x1[i_atm] + 0.03
    # ... while the fitted set's trace hardly moves: the verdict says they disagree and
    # names both models instead of one confident answer.
    assert ethanol_water.trace is not None and ethanol_water.trace.shift_x1 < SHIFT_TOLERANCE
    assert op.verdict.startswith("The models disagree")
    assert "NRTL" in op.verdict and "Dortmund" in op.verdict
    # The vacuum and pressure isobars the page publishes have their predicted twins.
    others = sorted(r.condition for r in op.other_isobars)
    assert others == sorted(r.condition for r in ethanol_water.isobars
                            if abs(r.condition - 101325.0) >= 1.0)
    assert op.isobar_at(101325.0) is op.predicted


def test_zeotropic_pair_agrees_without_a_verdict(catalogue: Catalogue,
                                                 shipped_results: ShippedResults) -> None:
    results = shipped_results["benzene--toluene"]
    op = second_opinion(catalogue, results)
    # Benzene-toluene is the textbook near-ideal zeotropic pair (common practice).
    assert op.fitted_class == op.predicted_class == "zeotropic"
    assert op.max_dT_K < 1.5
    assert op.trace is None and op.verdict == ""


def test_no_prediction_says_why(catalogue: Catalogue, ethanol_water: PairResults) -> None:
    water = dataclasses.replace(catalogue.components["water"], groups=None)
    bare = dataclasses.replace(catalogue, components={**catalogue.components, "water": water})
    op = second_opinion(bare, ethanol_water)
    assert not op.available and "water" in op.reason
    assert op.agreement().startswith("no prediction")


def test_predicted_record_keeps_the_pair(catalogue: Catalogue) -> None:
    pair = catalogue.pairs["ethanol--water"]
    record = predicted_record(pair, catalogue)
    assert (record.id, record.component1, record.component2) == (pair.id, "ethanol", "water")
    assert record.quality == "predicted" and record.model is not pair.model


def test_behaviour_class_matches_the_site_classes(ethanol_water: PairResults,
                                                  shipped_results: ShippedResults) -> None:
    """One classification in the analysis and on the pages (consistency)."""
    results = [ethanol_water, shipped_results["water--1-butanol"]]
    for r in results:
        for condition in r.isobars:
            assert behaviour_class(condition) == behaviour(condition)
