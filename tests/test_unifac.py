"""Original UNIFAC and modified UNIFAC (Dortmund) against the thermo package.

References: the ``thermo`` package's UNIFAC class (version 0 original UNIFAC with UFSG/UFIP,
version 1 modified UNIFAC (Dortmund) with DOUFSG/DOUFIP2006), evaluated for the same
subgroups; a worked example from memory (acetone–n-pentane at 307 K, original UNIFAC).
"""

from __future__ import annotations

import math
import zlib

import numpy as np
import pytest

from builder.catalogue.group_tables import group_tables
from builder.catalogue.loader import Catalogue
from builder.catalogue.predictive import CannotPredict, default_prediction, predictive_model
from builder.thermo.unifac import UNIFAC

thermo_unifac = pytest.importorskip("thermo.unifac")

#: Catalogued pairs spanning alcohols, water, ketones, esters, acids, aromatics,
#: chlorinated solvents, ethers, nitrogen compounds and cyclic groups.
SAMPLE = [
    ("ethanol", "water"), ("methanol", "benzene"), ("acetone", "chloroform"),
    ("n-hexane", "water"), ("ethyl-acetate", "ethanol"), ("acetic-acid", "water"),
    ("cyclohexane", "benzene"), ("tetrahydrofuran", "water"), ("pyridine", "water"),
    ("2-propanol", "toluene"), ("tert-butanol", "water"), ("1-4-dioxane", "water"),
    ("dichloromethane", "methanol"), ("acetonitrile", "toluene"), ("formic-acid", "water"),
    ("methyl-tert-butyl-ether", "methanol"), ("methylcyclohexane", "toluene"),
    ("styrene", "ethylbenzene"), ("2-butanone", "water"), ("carbon-tetrachloride", "ethanol"),
]


def _thermo_ln_gamma(model: UNIFAC, x1: float, T: float) -> tuple[float, float]:
    table = group_tables(model.variant)
    groups = [{table.subgroups[name].number: int(n)
               for name, n in zip(model.subgroups, row, strict=True) if n} for row in model.nu]
    if model.variant == "unifac":
        ref = thermo_unifac.UNIFAC.from_subgroups(T=T, xs=[x1, 1 - x1], chemgroups=groups,
                                                  version=0)
    else:
        ref = thermo_unifac.UNIFAC.from_subgroups(
            T=T, xs=[x1, 1 - x1], chemgroups=groups, version=1,
            interaction_data=thermo_unifac.DOUFIP2006, subgroups=thermo_unifac.DOUFSG)
    g1, g2 = ref.gammas()
    return math.log(g1), math.log(g2)


@pytest.mark.parametrize("variant", ["unifac", "dortmund"])
@pytest.mark.parametrize("pair", SAMPLE, ids=["--".join(p) for p in SAMPLE])
def test_activity_coefficients_match_thermo(catalogue: Catalogue, pair: tuple[str, str],
                                            variant: str) -> None:
    c1, c2 = (catalogue.components[c] for c in pair)
    model = predictive_model(c1, c2, variant)
    rng = np.random.default_rng(zlib.crc32("|".join((*pair, variant)).encode()))
    x1 = np.concatenate([[0.0, 1.0, 1e-6], rng.uniform(0.0, 1.0, 12)])
    T = rng.uniform(260.0, 450.0, x1.size)
    ln1, ln2 = model.ln_gamma(x1, T)  # one vectorised call over all points
    for i in range(x1.size):
        xi = min(max(float(x1[i]), 1e-300), 1.0 - 1e-16)
        r1, r2 = _thermo_ln_gamma(model, xi, float(T[i]))
        # relative 1e-9 in γ: |Δ ln γ| <= 1e-9
        assert abs(float(ln1[i]) - r1) <= 1e-9 and abs(float(ln2[i]) - r2) <= 1e-9, \
            (x1[i], T[i], float(ln1[i]), r1, float(ln2[i]), r2)


def test_broadcasts_over_composition_and_temperature(catalogue: Catalogue) -> None:
    model = predictive_model(catalogue.components["ethanol"], catalogue.components["water"],
                             "dortmund")
    x1 = np.linspace(0.0, 1.0, 5)[:, None]
    T = np.array([300.0, 350.0, 400.0])[None, :]
    ln1, ln2 = model.ln_gamma(x1, T)
    assert ln1.shape == ln2.shape == (5, 3)
    single = model.ln_gamma(0.5, 350.0)
    assert float(single[0]) == pytest.approx(float(ln1[2, 1]), rel=1e-14)
    # Pure-component limits: ln γ of a pure component is zero (Gibbs-Duhem end point).
    assert np.allclose(ln1[-1], 0.0, atol=1e-12) and np.allclose(ln2[0], 0.0, atol=1e-12)


def test_acetone_n_pentane_worked_example(catalogue: Catalogue) -> None:
    """Acetone(1)–n-pentane(2), 307 K, x1 = 0.047, original UNIFAC: γ1 = 4.99, γ2 = 1.005.

    The classic worked example of the original UNIFAC method (acetone = CH3 + CH3CO,
    n-pentane = 2 CH3 + 3 CH2), as printed in textbooks (from memory; verify).
    """
    c1, c2 = catalogue.components["acetone"], catalogue.components["n-pentane"]
    assert c1.groups and c1.groups.unifac == {"CH3": 1, "CH3CO": 1}
    assert c2.groups and c2.groups.unifac == {"CH3": 2, "CH2": 3}
    ln1, ln2 = predictive_model(c1, c2, "unifac").ln_gamma(0.047, 307.0)
    assert math.exp(float(ln1)) == pytest.approx(4.99, abs=0.02)
    assert math.exp(float(ln2)) == pytest.approx(1.005, abs=0.002)


def test_missing_parameters_are_an_explicit_error(catalogue: Catalogue) -> None:
    # Original UNIFAC has no parameters between H2O and the chlorofluorocarbon group CCLF.
    table = group_tables("unifac")
    subgroups = {n: (s.main_group, s.R, s.Q) for n, s in table.subgroups.items()}
    with pytest.raises(ValueError, match="cannot predict this pair: no parameters for main "
                       "groups H2O–CCLF"):
        UNIFAC.from_groups("unifac", {"H2O": 1}, {"CCL3F": 1}, subgroups, table.interactions,
                           table.main_groups)


def test_default_prediction_falls_back_and_reports(catalogue: Catalogue) -> None:
    from dataclasses import replace

    from builder.catalogue.records import ComponentGroups

    water, ethanol = catalogue.components["water"], catalogue.components["ethanol"]
    assert default_prediction(ethanol, water).variant == "dortmund"
    assert ethanol.groups is not None
    only_unifac = replace(ethanol, groups=ComponentGroups(ethanol.groups.unifac, None,
                                                          ethanol.groups.source))
    assert default_prediction(only_unifac, water).variant == "unifac"
    none = replace(ethanol, groups=None)
    with pytest.raises(CannotPredict) as caught:
        default_prediction(none, water)
    assert len(caught.value.reasons) == 2 and "no modified UNIFAC (Dortmund) groups for " \
        "ethanol" in caught.value.reasons[0]
