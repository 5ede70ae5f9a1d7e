"""Vapour-pressure correlations of the catalogue against independent references.

References: CoolProp 8.0 reference equations of state (HEOS) where CoolProp has the fluid;
otherwise Perry's Chemical Engineers' Handbook, 8th ed., Table 2-8 (DIPPR 101), as
transcribed in the ``chemicals`` package.  Tolerance 2 % over the correlation's validity
range (the catalogue's acceptance criterion).
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

from builder.catalogue.loader import Catalogue
from builder.thermo.vapour_pressure import Antoine, ExtendedAntoine
from tests.references import COOLPROP_HEOS, coolprop_psat_Pa


def _perry_2_8_Pa(cas: str, T_K: np.ndarray) -> np.ndarray:
    from chemicals.dippr import EQ101
    from chemicals.vapor_pressure import Psat_data_Perrys2_8

    row = Psat_data_Perrys2_8.loc[cas]
    return np.array([EQ101(float(t), *(float(row[k]) for k in ("C1", "C2", "C3", "C4", "C5")))
                     for t in T_K])


def _wagner_references(cas: str, T_K: np.ndarray) -> dict[str, np.ndarray]:
    """Wagner-equation fits: McGarry (Ind. Eng. Chem. Process Des. Dev. 22 (1983) 313) and
    Poling et al. (2001) Appendix A, as transcribed in the chemicals package (NaN below
    their lower limit)."""
    from chemicals.vapor_pressure import (
        Psat_data_WagnerMcGarry,
        Psat_data_WagnerPoling,
        Wagner,
        Wagner_original,
    )

    out = {}
    for name, table, form in (("McGarry Wagner", Psat_data_WagnerMcGarry, Wagner_original),
                              ("Poling Wagner", Psat_data_WagnerPoling, Wagner)):
        if cas in table.index:
            r = table.loc[cas]
            values = [form(float(t), r["Tc"], r["Pc"], r["A"], r["B"], r["C"], r["D"])
                      if t >= r["Tmin"] and t <= r["Tc"] else np.nan for t in T_K]
            out[name] = np.array(values, dtype=float)
    return out


def test_coolprop_fluids_within_two_percent(catalogue: Catalogue) -> None:
    """CoolProp reference equations of state: 2 % over each correlation's validity range."""
    worst = {}
    for cid, component in catalogue.components.items():
        if cid not in COOLPROP_HEOS:
            continue
        vp = component.vapour_pressure
        T = np.linspace(vp.T_min_K, vp.T_max_K, 40)
        worst[cid] = float(np.max(np.abs(vp.pressure_Pa(T) / coolprop_psat_Pa(cid, T) - 1.0)))
    failing = {k: f"{v:.2%}" for k, v in worst.items() if v > 0.02}
    assert len(worst) >= 20
    assert not failing, f"vapour pressure off CoolProp by more than 2 %: {failing}"


#: Components whose correlation differs from every available independent fit by more than
#: 2 % somewhere above 10 kPa, with the smallest such deviation measured (2026-12).  The
#: published fits disagree among themselves here; these are open for the catalogue team to
#: resolve against measured data.  A listed component must not get worse than its bound.
KNOWN_DISAGREEMENTS = {
    "aniline": 0.021,  # Poling Antoine vs McGarry Wagner: 2.1 % near 388 K (no Perry 2-8 entry)
    "ethylene-glycol": 0.025,  # Landolt Antoine vs McGarry Wagner 2.4 % near 412 K, Perry 2-8 2.7 %
    "2-butanol": 0.035,  # Landolt Antoine vs McGarry / Poling Wagner: 3.1-3.5 % near 320 K
    "2-propanol": 0.029,  # Poling Antoine vs both Wagner fits and Perry: 2.9 % near 10 kPa
    "methyl-isobutyl-ketone": 0.052,  # Perry 2-8 vs Wagner fits: 5.2-5.7 %
    "n-butyl-acetate": 0.035,  # Perry 2-8 vs McGarry Wagner: 3.5 %
    "styrene": 0.08,  # Perry 2-8 vs McGarry Wagner: 8.0 %
}


def test_other_fluids_agree_with_an_independent_fit(catalogue: Catalogue) -> None:
    """Fluids CoolProp lacks: the published fits disagree among themselves by several per
    cent for some of them (2-propanol: Perry's Table 2-8 is 3 % above both Wagner fits), so
    the correlation must agree within 2 % above 10 kPa with at least one independent
    published fit other than its own source (Perry 2-8, McGarry's or Poling's Wagner equation; the
    latter is fitted separately from the same book's Antoine constants)."""
    from chemicals.vapor_pressure import Psat_data_Perrys2_8

    disagree, without = {}, []
    for cid, component in catalogue.components.items():
        if cid in COOLPROP_HEOS:
            continue
        vp = component.vapour_pressure
        T = np.linspace(vp.T_min_K, vp.T_max_K, 40)
        P = vp.pressure_Pa(T)
        refs = _wagner_references(component.cas, T)
        own = component.vapour_pressure_source.ref
        if component.cas in Psat_data_Perrys2_8.index and own != "perry-8":
            refs["Perry 2-8"] = _perry_2_8_Pa(component.cas, T)
        deviations = {}
        for name, ref in refs.items():
            ok = np.isfinite(ref) & (P >= 10e3)
            if ok.sum() >= 5:
                deviations[name] = float(np.max(np.abs(P[ok] / ref[ok] - 1.0)))
        if not deviations:
            without.append(cid)
        elif min(deviations.values()) > KNOWN_DISAGREEMENTS.get(cid, 0.02) + 5e-4:
            disagree[cid] = {k: f"{v:.2%}" for k, v in deviations.items()}
    assert not disagree, disagree
    assert len(without) <= 6, without


def test_boiling_point_of_each_correlation(catalogue: Catalogue) -> None:
    """Correlation inverse at 101.325 kPa against the catalogue's normal boiling point
    (CRC Handbook / IAPWS-95), within 0.5 K (the catalogue's acceptance criterion)."""
    off = {}
    for cid, component in catalogue.components.items():
        Tb = float(component.vapour_pressure.temperature_K(101325.0))
        if abs(Tb - component.normal_boiling_point_K) > 0.5:
            off[cid] = (round(Tb, 2), component.normal_boiling_point_K)
    assert not off


def test_published_forms_are_the_same_equation() -> None:
    """Water, Poling et al. (2001) Appendix A, written three ways a handbook might print it:
    log10 bar with °C, log10 Pa with K (the chemicals package's storage), and ln mmHg."""
    bar_C = Antoine.from_published(5.11564, 1687.537, 230.17, log_base="10", P_unit="bar",
                                   T_unit="C", T_min_K=273.2, T_max_K=473.2)
    pa_K = Antoine.from_published(10.11564, 1687.537, -42.98, log_base="10", P_unit="Pa",
                                  T_unit="K", T_min_K=273.2, T_max_K=473.2)
    to_mmHg = math.log(1e5 / (101325.0 / 760.0))
    ln_mmHg = Antoine.from_published(
        5.11564 * math.log(10) + to_mmHg, 1687.537 * math.log(10), 230.17, log_base="e",
        P_unit="mmHg", T_unit="C", T_min_K=273.2, T_max_K=473.2)
    T = np.linspace(280.0, 470.0, 20)
    np.testing.assert_allclose(pa_K.pressure_Pa(T), bar_C.pressure_Pa(T), rtol=1e-12)
    np.testing.assert_allclose(ln_mmHg.pressure_Pa(T), bar_C.pressure_Pa(T), rtol=1e-12)


def test_dippr101_against_chemicals_implementation() -> None:
    """DIPPR 101 evaluated by the ``chemicals`` package's EQ101 (Perry's Table 2-8, water)."""
    from chemicals.dippr import EQ101

    water = ExtendedAntoine(73.649, -7258.2, -7.3037, 4.1653e-06, 2.0, 273.16, 647.096)
    for T in (280.0, 373.15, 500.0, 640.0):
        assert float(water.pressure_Pa(T)) == pytest.approx(
            EQ101(T, 73.649, -7258.2, -7.3037, 4.1653e-06, 2.0), rel=1e-12)
        dlnP = float(water.dlnP_dT(T))
        h = 1e-4
        numeric = (math.log(EQ101(T + h, 73.649, -7258.2, -7.3037, 4.1653e-06, 2.0))
                   - math.log(EQ101(T - h, 73.649, -7258.2, -7.3037, 4.1653e-06, 2.0))) / (2 * h)
        assert dlnP == pytest.approx(numeric, rel=1e-6)


@given(st.floats(min_value=300.0, max_value=600.0))
def test_inverse_round_trips(T: float) -> None:
    """Saturation temperature at the saturation pressure returns the temperature."""
    antoine = Antoine.from_published(5.11564, 1687.537, 230.17, log_base="10", P_unit="bar",
                                     T_unit="C", T_min_K=273.2, T_max_K=473.2)
    dippr = ExtendedAntoine(73.649, -7258.2, -7.3037, 4.1653e-06, 2.0, 273.16, 647.096)
    for vp in (antoine, dippr):
        assert float(vp.temperature_K(vp.pressure_Pa(T))) == pytest.approx(T, abs=1e-8)


def test_inverse_is_vectorised() -> None:
    dippr = ExtendedAntoine(73.649, -7258.2, -7.3037, 4.1653e-06, 2.0, 273.16, 647.096)
    T = np.array([300.0, 350.0, 400.0, 450.0])
    np.testing.assert_allclose(dippr.temperature_K(dippr.pressure_Pa(T)), T, atol=1e-8)
