"""Distillation quick look.

References: Fenske's equation and Underwood's minimum reflux for a saturated-liquid feed,
which must agree exactly with the stage-by-stage count and the pinch construction when α is
constant (M. R. Fenske, Ind. Eng. Chem. 24 (1932) 482; A. J. V. Underwood, Chem. Eng. Prog.
44 (1948) 603); ethanol-water's tangent pinch near the azeotrope (a fact of the trade,
common practice); invariants by property-based tests.
"""

from __future__ import annotations

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from builder.analysis.distillation import Split, fenske_stages, quick_look, underwood_minimum_reflux
from builder.analysis.results import compute_condition
from builder.catalogue.loader import Catalogue
from builder.thermo import equilibrium as eq
from builder.thermo.activity import Ideal
from builder.thermo.vapour_pressure import Antoine


def _constant_alpha(alpha: float) -> eq.BinarySystem:
    heavy = Antoine(A=21.0, B=3000.0, C=0.0, T_min_K=200.0, T_max_K=500.0)
    light = Antoine(A=21.0 + math.log(alpha), B=3000.0, C=0.0, T_min_K=200.0, T_max_K=500.0)
    return eq.BinarySystem(light, heavy, Ideal())


@settings(max_examples=40, deadline=None)
@given(alpha=st.floats(1.2, 6.0), top=st.floats(0.7, 0.995), bottom=st.floats(0.005, 0.2),
       feed_share=st.floats(0.1, 0.9))
def test_constant_alpha_agrees_with_fenske_and_underwood(alpha: float, top: float,
                                                         bottom: float,
                                                         feed_share: float) -> None:
    feed = bottom + feed_share * (top - bottom)
    look = quick_look(_constant_alpha(alpha), 101325.0, (), None, Split(top, bottom, feed), 1)
    assert look.stages_min == pytest.approx(fenske_stages(top, bottom, alpha), rel=1e-9)
    assert look.fenske_stages == pytest.approx(fenske_stages(top, bottom, alpha), rel=1e-9)
    expected = underwood_minimum_reflux(top, feed, alpha)
    if expected > 0:
        assert look.reflux_min == pytest.approx(expected, rel=1e-7, abs=1e-9)
        assert look.pinch == "feed"


def test_heavy_first_ordering_gives_the_same_numbers() -> None:
    """Naming the heavy component first mirrors the compositions, not the answer."""
    a = quick_look(_constant_alpha(2.5), 101325.0, (), None, Split(0.95, 0.05, 0.5), 1)
    mirrored = _constant_alpha(2.5).swapped()
    b = quick_look(mirrored, 101325.0, (), None, Split(0.05, 0.95, 0.5), 2)
    assert b.top_component == 2
    assert b.stages_min == pytest.approx(a.stages_min, rel=1e-9)
    assert b.reflux_min == pytest.approx(a.reflux_min, rel=1e-9)


def test_ethanol_water_split_is_limited_by_the_azeotrope(catalogue: Catalogue) -> None:
    pair = catalogue.pairs["ethanol--water"]
    result = compute_condition(catalogue, pair, "isobar", 101325.0)
    look = result.quicklook
    assert look is not None and "azeotrope" in look.limited_by
    assert look.split is not None
    assert look.split.distillate_x1 < result.azeotropes[0].x1
    assert look.stages_min is not None and look.stages_min > 0
    assert look.pinch.startswith("tangent")  # the ethanol-water pinch near the azeotrope


@settings(max_examples=30, deadline=None)
@given(data=st.data(), top=st.floats(0.6, 0.99), bottom=st.floats(0.01, 0.3),
       share=st.floats(0.2, 0.8))
def test_stage_counts_are_positive_or_explained(data: st.DataObject, catalogue: Catalogue,
                                                top: float, bottom: float,
                                                share: float) -> None:
    pid = data.draw(st.sampled_from(sorted(catalogue.pairs)))
    feed = bottom + share * (top - bottom)
    result = compute_condition(catalogue, catalogue.pairs[pid], "isobar", 101325.0,
                               split_x1=(top, bottom, feed))
    look = result.quicklook
    assert look is not None
    if look.stages_min is None:
        assert look.reason, "a missing stage count needs a stated reason"
    else:
        assert 0 < look.stages_min < 500 and math.isfinite(look.stages_min)
        assert look.reflux_min is not None and look.reflux_min >= 0
