"""Vapour treatments: virial (γ–φ) and Peng–Robinson (φ–φ), against thermo, chemicals and CoolProp.

References named per test: the ``chemicals`` package (Tsonopoulos second virial coefficients
and the Tarakad–Danner combining rules), the ``thermo`` package (Peng–Robinson mixture and
its vapour–liquid flash, the virial gas phase) and CoolProp's multi-parameter mixture model
(GERG-type Helmholtz-energy mixture) for light hydrocarbons.
"""

from __future__ import annotations

import numpy as np
import pytest

from builder.analysis import curves
from builder.analysis.point import solve_point, system_for
from builder.analysis.results import compute_condition
from builder.catalogue.loader import Catalogue, load_catalogue
from builder.errors import CatalogueErrors
from builder.thermo import equilibrium as eq
from builder.thermo import virial
from builder.thermo.activity import Ideal
from builder.thermo.cubic import CubicMixture, pr_ln_phi
from builder.thermo.vapour import IDEAL_GAS, VirialVapour
from tests.references import thermo_pr_flasher

# Our Tsonopoulos classes as the chemicals package spells them.
_CHEMICALS_CLASS = {
    "normal": "normal", "ketone": "ketone", "aldehyde": "aldehyde", "ether": "ether",
    "ester": "ester", "alkyl-nitrile": "alkyl nitrile", "alkyl-halide": "alkyl halide",
    "alkanol": "alkanol", "methanol": "methyl alcohol", "water": "water",
    "carboxylic-acid": "carboxylic acid", "other-polar": "ketone",
}


# The chemicals package's method name for each publication our virial constants cite.
_VC_METHOD = {"iupac-critical": "IUPAC", "crc-handbook-95": "CRC"}
_DIPOLE_METHOD = {"poling-2001": "POLING", "nist-cccbdb": "CCCBDB", "muller-2012": "MULLER"}


def test_virial_constants_match_the_tables_they_were_transcribed_from(
        catalogue: Catalogue) -> None:
    """Reference: the chemicals package's copies of the cited tables (chemicals.critical.Vc
    with method IUPAC or CRC; chemicals.dipole.dipole_moment with method POLING, CCCBDB or
    MULLER), for every critical volume and every dipole moment not marked as recalled."""
    from chemicals.critical import Vc
    from chemicals.dipole import dipole_moment

    volumes = dipoles = 0
    for component in catalogue.components.values():
        v = component.virial
        if v is None:
            continue
        source = v.sources["critical_volume"]
        if not source.from_memory and source.ref in _VC_METHOD:
            table = Vc(component.cas, method=_VC_METHOD[source.ref])
            assert v.critical_volume_m3_per_mol == pytest.approx(table, rel=1e-3), component.id
            volumes += 1
        source = v.sources.get("dipole_moment")
        if source is not None and not source.from_memory and source.ref in _DIPOLE_METHOD:
            table = dipole_moment(component.cas, method=_DIPOLE_METHOD[source.ref])
            assert v.dipole_debye == pytest.approx(table, abs=0.006), component.id
            dipoles += 1
    assert volumes > 70 and dipoles > 40


def test_every_component_but_the_carboxylic_acids_has_virial_constants(
        catalogue: Catalogue) -> None:
    """The virial vapour is the default treatment, so a component without its constants
    drops every one of its pairs to an ideal-gas vapour. The acids (a COOH group) get
    theirs with an associating vapour. Project convention."""
    missing = sorted(c.id for c in catalogue.components.values()
                     if c.virial is None
                     and not (c.groups and c.groups.unifac and "COOH" in c.groups.unifac))
    assert missing == []


def test_pure_second_virial_coefficients_against_chemicals(catalogue: Catalogue) -> None:
    """Reference: chemicals.virial.BVirial_Tsonopoulos_extended, same equation: with our a and
    b passed in for every component, and with chemicals deriving a and b itself (same rules)
    for every class but the alkyl halides (see the next test)."""
    from chemicals.virial import BVirial_Tsonopoulos_extended

    checked = 0
    for component in catalogue.components.values():
        v = component.virial
        if v is None:
            continue
        Tc, Pc, w = (component.critical_temperature_K, component.critical_pressure_Pa,
                     component.acentric_factor)
        for T in (0.6 * Tc, 0.8 * Tc, 1.1 * Tc):
            ours = float(virial.second_virial_tsonopoulos(T, Tc, Pc, w, v.a, v.b))
            if v.a or v.b:
                given = BVirial_Tsonopoulos_extended(T, Tc, Pc, w, a=v.a, b=v.b)
                assert ours == pytest.approx(given, rel=1e-9), component.id
            if v.species_class != "alkyl-halide" and (v.a or v.b or v.species_class == "normal"):
                derived = BVirial_Tsonopoulos_extended(
                    T, Tc, Pc, w, species_type=_CHEMICALS_CLASS[v.species_class],
                    dipole=v.dipole_debye)
                assert ours == pytest.approx(derived, rel=1e-9), component.id
            checked += 1
    assert checked > 100


def test_alkyl_halide_polar_term_as_printed() -> None:
    """Tsonopoulos' rule for alkyl halides, a = -2.188e-11 μr^4 - 7.831e-21 μr^8 (Poling et
    al., The Properties of Gases and Liquids, 5th ed., ch. 4; from memory).  chemicals 1.5.2
    prints 2.188e-4 there, which would give chloroform (μr about 23) a = -61, a second virial
    coefficient some hundred times too negative; ours stays small."""
    a, b = virial.tsonopoulos_polar_parameters("alkyl-halide", 1.1, 536.4, 5.47e6)
    mu_r = virial.reduced_dipole(1.1, 536.4, 5.47e6)
    assert a == pytest.approx(-2.188e-11 * mu_r**4 - 7.831e-21 * mu_r**8, rel=1e-12)
    assert -1e-4 < a < 0 and b == 0.0


def test_cross_coefficient_against_chemicals_combining_rules() -> None:
    """Reference: chemicals' Tarakad–Danner rules (T_c12, P_c12, ω_12, k_12 from V_c) and
    BVirial_Tsonopoulos_extended at the combined constants; acetone–water constants."""
    from chemicals.virial import (
        BVirial_Tsonopoulos_extended,
        Tarakad_Danner_virial_CSP_kijs,
        Tarakad_Danner_virial_CSP_omegaijs,
        Tarakad_Danner_virial_CSP_Pcijs,
        Tarakad_Danner_virial_CSP_Tcijs,
    )

    Tcs, Pcs, Vcs, ws = [508.1, 647.096], [4.70e6, 22.064e6], [213e-6, 55.95e-6], [0.307, 0.344]
    kij = Tarakad_Danner_virial_CSP_kijs(Vcs)
    Tcij = Tarakad_Danner_virial_CSP_Tcijs(Tcs, kij)
    Pcij = Tarakad_Danner_virial_CSP_Pcijs(Tcs, Pcs, Vcs, Tcij)
    wij = Tarakad_Danner_virial_CSP_omegaijs(ws)
    Tc12, Pc12, w12 = virial.cross_constants((Tcs[0], Tcs[1]), (Pcs[0], Pcs[1]),
                                             (Vcs[0], Vcs[1]), (ws[0], ws[1]))
    assert Tc12 == pytest.approx(Tcij[0][1], rel=1e-12)
    assert Pc12 == pytest.approx(Pcij[0][1], rel=1e-12)
    assert w12 == pytest.approx(wij[0][1], rel=1e-15)
    B12 = float(virial.second_virial_tsonopoulos(350.0, Tc12, Pc12, w12))
    assert B12 == pytest.approx(BVirial_Tsonopoulos_extended(350.0, Tc12, Pc12, w12), rel=1e-9)


def test_virial_fugacity_coefficients_against_thermo_virial_gas(
        systems: dict[str, eq.BinarySystem]) -> None:
    """Reference: thermo.phases.VirialGas with the same B_ij and no third coefficient.

    thermo truncates the density series (Z = 1 + B/V), we the pressure series
    (Z = 1 + BP/RT), the usual form of the γ–φ treatment; they agree to second order in
    BP/RT: the relative difference in ln φ is of the order of |BP/RT| (below 1e-3 at 2 kPa),
    while the first-order terms (B_ij, the mixing rule) must agree exactly.
    """
    from thermo.phases import VirialCSP, VirialGas

    system = systems["acetone--water"]
    vapour = system.vapour
    assert isinstance(vapour, VirialVapour)
    c1, c2 = vapour.component1, vapour.component2
    T, P, y1 = 330.0, 2.0e3, 0.4
    B11, B22, B12 = (float(b) for b in vapour.coefficients(T))
    from chemicals.virial import Tarakad_Danner_virial_CSP_kijs

    a12, b12 = 0.5 * (c1.a + c2.a), 0.5 * (c1.b + c2.b)  # both polar: averaged (Tsonopoulos)
    model = VirialCSP(Tcs=[c1.Tc_K, c2.Tc_K], Pcs=[c1.Pc_Pa, c2.Pc_Pa],
                      Vcs=[c1.Vc_m3_per_mol, c2.Vc_m3_per_mol], omegas=[c1.omega, c2.omega],
                      B_model="VIRIAL_B_TSONOPOULOS_EXTENDED", cross_B_model="Tarakad-Danner",
                      cross_B_model_kijs=Tarakad_Danner_virial_CSP_kijs(
                          [c1.Vc_m3_per_mol, c2.Vc_m3_per_mol]),
                      B_model_Tsonopoulos_extended_as=[[c1.a, a12], [a12, c2.a]],
                      B_model_Tsonopoulos_extended_bs=[[c1.b, b12], [b12, c2.b]],
                      C_model="VIRIAL_C_ZERO", T=T)
    np.testing.assert_allclose(model.B_pures(), [B11, B22], rtol=1e-9)
    assert model.B_interactions()[0][1] == pytest.approx(B12, rel=1e-9)
    gas = VirialGas(model=model, T=T, P=P, zs=[y1, 1 - y1])
    ours = vapour.ln_phi(y1, T, P)
    np.testing.assert_allclose([float(v) for v in ours], gas.lnphis(), rtol=1e-3, atol=1e-9)


def test_gamma_phi_bubble_point_satisfies_its_equations(systems: dict[str, eq.BinarySystem]
                                                        ) -> None:
    """The virial bubble point obeys y_i φ_i P = x_i γ_i P_i^sat φ_i^sat exp(V_i (P - P_i^sat)/RT)
    (common practice: the γ–φ equations themselves), and differs from Raoult's law."""
    system = systems["ethanol--water"]
    x = np.array([0.0, 0.1, 0.5, 0.894, 1.0])
    real = eq.bubble_temperature(system, x, 101325.0)
    ideal = eq.bubble_temperature(eq.BinarySystem(system.psat1, system.psat2, system.activity),
                                  x, 101325.0)
    assert real.converged.all()
    K1, K2 = real.k_values(system)
    np.testing.assert_allclose(x * K1 + (1 - x) * K2, 1.0, rtol=1e-10)
    np.testing.assert_allclose((x * K1)[1:-1], real.y1[1:-1], rtol=1e-9)
    assert np.abs(real.T_K - ideal.T_K).max() > 0.01  # beyond round-off
    assert system.vapour.name == "virial" and IDEAL_GAS.name == "ideal-gas"


def test_dew_and_bubble_pressure_with_virial_vapour_agree(
        systems: dict[str, eq.BinarySystem]) -> None:
    """A dew point of the bubble vapour returns the liquid (common practice: consistency)."""
    system = systems["acetone--methanol"]
    bubble = eq.bubble_pressure(system, np.array([0.2, 0.6]), 330.0)
    dew = eq.dew_pressure(system, bubble.y1, 330.0)
    np.testing.assert_allclose(dew.x1, bubble.x1, atol=1e-9)
    np.testing.assert_allclose(dew.P_Pa, bubble.P_Pa, rtol=1e-9)
    dew_T = eq.dew_temperature(system, bubble.y1, bubble.P_Pa)
    np.testing.assert_allclose(dew_T.T_K, 330.0, atol=1e-6)


@pytest.mark.parametrize("T_K, P_Pa, z1, phase", [
    (300.0, 3.0e6, 0.3, "liquid"), (330.0, 1.0e6, 0.5, "vapour"), (250.0, 1.0e5, 0.2, "vapour"),
    (250.0, 1.0e5, 0.2, "liquid"), (400.0, 4.0e6, 0.6, "vapour")])
def test_peng_robinson_fugacity_against_thermo(T_K: float, P_Pa: float, z1: float,
                                               phase: str) -> None:
    """Reference: thermo.PRMIX (same equation, same constants Ω_a, Ω_b)."""
    from thermo import PRMIX

    Tc, Pc, w, k = (369.83, 425.12), (4.248e6, 3.796e6), (0.152, 0.200), 0.0033
    e = PRMIX(T=T_K, P=P_Pa, zs=[z1, 1 - z1], Tcs=list(Tc), Pcs=list(Pc), omegas=list(w),
              kijs=[[0, k], [k, 0]])
    ref = e.lnphis_l if phase == "liquid" else e.lnphis_g
    Z_ref = e.Z_l if phase == "liquid" else e.Z_g
    l1, l2, Z = pr_ln_phi(z1, T_K, P_Pa, Tc, Pc, w, k, phase)
    np.testing.assert_allclose([float(l1), float(l2)], ref, rtol=1e-9)
    assert float(Z) == pytest.approx(Z_ref, rel=1e-9)


def test_peng_robinson_bubble_and_dew_against_thermo_flash(systems: dict[str, eq.BinarySystem]
                                                           ) -> None:
    """Reference: thermo.FlashVL with Peng–Robinson (PRMIX) in both phases, same inputs."""
    system = systems["propane--n-butane"]
    assert isinstance(system.vapour, CubicMixture)
    flash = thermo_pr_flasher(system.vapour, (44.1, 58.12))
    for P in (1.0e6, 2.0e6):
        for x in (0.25, 0.5):
            ref = flash.flash(P=P, VF=0, zs=[x, 1 - x])
            ours = eq.bubble_temperature(system, [x], P)
            assert ours.T_K[0] == pytest.approx(ref.T, abs=1e-8)
            assert ours.y1[0] == pytest.approx(ref.gas.zs[0], abs=1e-6)
            ref_dew = flash.flash(P=P, VF=1, zs=[x, 1 - x])
            dew = eq.dew_temperature(system, [x], P)
            assert dew.T_K[0] == pytest.approx(ref_dew.T, abs=1e-6)


_COOLPROP_NAMES = {"propane": "Propane", "n-butane": "n-Butane", "ethane": "Ethane",
                   "propylene": "Propylene", "n-pentane": "n-Pentane", "n-hexane": "n-Hexane",
                   "n-heptane": "n-Heptane"}


def _coolprop_deviation(catalogue: Catalogue, pid: str, pressures: tuple[float, ...]
                        ) -> float:
    from CoolProp.CoolProp import PropsSI

    pair = catalogue.pairs[pid]
    system = system_for(pair, catalogue)
    a, b = _COOLPROP_NAMES[pair.component1], _COOLPROP_NAMES[pair.component2]
    xs = np.array([0.1, 0.25, 0.5, 0.75, 0.9])
    worst = 0.0
    for P in pressures:
        bubble = eq.bubble_temperature(system, xs, P)
        dew = eq.dew_temperature(system, xs, P)
        assert bubble.converged.all() and dew.converged.all()
        for i, x in enumerate(xs):
            fluid = f"HEOS::{a}[{x}]&{b}[{1 - x}]"
            worst = max(worst, abs(bubble.T_K[i] - PropsSI("T", "P", P, "Q", 0, fluid)),
                        abs(dew.T_K[i] - PropsSI("T", "P", P, "Q", 1, fluid)))
    return worst


#: The hydrocarbon pairs CoolProp has, the pressures checked (those of issue 11 for
#: propane-n-butane, the published isobars' range for the others) and, where the
#: catalogue's model misses 0.5 K, the reason (measured; see the pair notes).
_COOLPROP_PAIRS = {
    "propane--n-butane": (1.0e6, 1.5e6, 2.0e6),
    "ethane--propane": (1.0e6, 2.0e6, 3.0e6),
    "propylene--propane": (1.0e6, 1.8e6),
    "n-butane--n-pentane": (1.0e5, 5.0e5, 1.0e6),
    # γ–φ (ideal liquid, virial vapour): of the catalogue's other hydrocarbon pairs CoolProp
    # has binary mixture parameters only for this one (none for the aromatic pairs).
    "n-hexane--n-heptane": (3.0e4, 101325.0, 3.0e5),
}
_MISSES_HALF_A_KELVIN = {
    "propane--n-butane": "with the published k12 (0.0033) 0.51, 0.60, 0.65 K low at 1, 1.5, 2 "
                         "MPa; with pure-fluid vapour pressures made exact it would be 0.43 K: "
                         "what takes it past 0.5 K is Peng-Robinson's own vapour pressures "
                         "(n-butane 0.13-0.42 K low); no published alpha function tried "
                         "passes it without breaking another pair (docs/cubic-accuracy.md)",
    "ethane--propane": "with the published k12 (0.0011) up to 0.85 K low at x1 = 0.5; with "
                       "pure-fluid vapour pressures made exact still 0.55-0.71 K (0.46-0.61 K "
                       "with k12 = 0): the mixing rule would need a negative k12 (about -0.002 "
                       "to -0.004) that no published table gives (docs/cubic-accuracy.md)",
    "n-hexane--n-heptane": "the catalogue's ideal-solution liquid: CoolProp's mixture shows a "
                           "slight positive deviation from Raoult's law, bubble and dew points "
                           "up to 0.54 K lower mid-range; the pure ends agree within 0.1 K",
}
#: Worst deviation measured with the catalogue's model (guards against a drift).
_MEASURED_WORST_K = {"propane--n-butane": 0.65, "ethane--propane": 0.85,
                     "propylene--propane": 0.33, "n-butane--n-pentane": 0.19,
                     "n-hexane--n-heptane": 0.54}


@pytest.mark.parametrize("pid", [
    pytest.param(p, marks=pytest.mark.xfail(strict=True, reason=_MISSES_HALF_A_KELVIN[p]))
    if p in _MISSES_HALF_A_KELVIN else p for p in _COOLPROP_PAIRS])
def test_hydrocarbon_pairs_within_half_a_kelvin_of_coolprop(catalogue: Catalogue,
                                                            pid: str) -> None:
    """Reference: CoolProp 8.0 multi-parameter mixture model; issue 11's target: bubble and
    dew temperatures within 0.5 K (x1 = 0.1-0.9)."""
    assert _coolprop_deviation(catalogue, pid, _COOLPROP_PAIRS[pid]) < 0.5


@pytest.mark.parametrize("pid", sorted(_MEASURED_WORST_K))
def test_hydrocarbon_pairs_against_coolprop_as_measured(catalogue: Catalogue, pid: str) -> None:
    """Reference: CoolProp 8.0 mixture model; the measured worst deviation, rounded up by
    0.02 K (Raoult's law is 2.0-3.4 K off for propane-n-butane at 1-2 MPa)."""
    assert _coolprop_deviation(catalogue, pid, _COOLPROP_PAIRS[pid]) < _MEASURED_WORST_K[pid] + 0.02


@pytest.mark.parametrize(("cid", "pressures"), [
    ("ethane", (1.0e6, 2.0e6, 3.0e6)), ("propylene", (1.0e6, 1.8e6)),
    ("propane", (1.0e6, 1.5e6, 2.0e6, 3.0e6)), ("n-butane", (1.0e5, 1.0e6, 1.5e6, 2.0e6)),
    ("n-pentane", (1.0e5, 5.0e5, 1.0e6))])
def test_peng_robinson_saturation_temperatures_against_coolprop(
        catalogue: Catalogue, cid: str, pressures: tuple[float, ...]) -> None:
    """Reference: CoolProp 8.0 reference equations of state (saturation temperature).  The
    pure-fluid part of the mixture deviations: Peng-Robinson (1976) with the catalogue's
    critical constants and acentric factor is within 0.45 K at the pressures of the
    checks above (measured: n-butane 0.42 K low at 2 MPa, the largest)."""
    from CoolProp.CoolProp import PropsSI

    from builder.thermo.cubic import CubicMixture

    c = catalogue.components[cid]
    mixture = CubicMixture((c.critical_temperature_K,) * 2, (c.critical_pressure_Pa,) * 2,
                           (c.acentric_factor,) * 2)
    system = eq.BinarySystem(c.vapour_pressure, c.vapour_pressure, Ideal(), vapour=mixture)
    for P in pressures:
        ours = eq.bubble_temperature(system, np.array([1.0]), P)
        assert ours.converged[0]
        T_ref = PropsSI("T", "P", P, "Q", 0, "HEOS::" + _COOLPROP_NAMES[cid])
        assert abs(ours.T_K[0] - T_ref) < 0.45, (cid, P, ours.T_K[0] - T_ref)


def test_isotherm_above_a_critical_temperature_ends_at_the_critical_point(
        systems: dict[str, eq.BinarySystem]) -> None:
    """Propane–n-butane at 110 °C (above propane's T_c, 96.7 °C): the curve ends at the
    located mixture critical point and no point lies past it (common practice)."""
    curve = curves.isotherm(systems["propane--n-butane"], 383.15)
    c = curve.critical
    assert c is not None
    assert 0.75 < c.x1 < 0.85 and 4.2e6 < c.P_Pa < 4.4e6
    at = np.flatnonzero(curve.x1 == c.x1)
    assert at.size == 1 and curve.y1[at[0]] == c.x1 and curve.converged[at[0]]
    assert not curve.converged[curve.x1 > c.x1].any()
    drawn = curve.converged & (curve.x1 < c.x1)
    assert drawn.sum() > 60
    assert np.all(curve.P_Pa[drawn] < c.P_Pa)  # the critical point is the top of the loop
    assert np.all(curve.y1[drawn] >= curve.x1[drawn])


def test_critical_point_against_coolprop(systems: dict[str, eq.BinarySystem]) -> None:
    """Reference: CoolProp 8.0 mixture critical point at the composition we locate; the two
    models differ, so within 2 K and 3 % in pressure (measured: see the report)."""
    import CoolProp

    curve = curves.isotherm(systems["propane--n-butane"], 383.15)
    c = curve.critical
    assert c is not None
    state = CoolProp.AbstractState("HEOS", "Propane&n-Butane")
    state.set_mole_fractions([c.x1, 1 - c.x1])
    points = state.all_critical_points()
    assert points, "CoolProp found no critical point"
    T_ref, P_ref = points[0].T, points[0].p
    assert abs(T_ref - 383.15) < 2.0
    assert abs(P_ref / c.P_Pa - 1.0) < 0.03


def test_isobar_above_the_cricondenbar_has_no_two_phase_region(catalogue: Catalogue) -> None:
    """5 MPa is above the cricondenbar of propane–n-butane (about 4.3 MPa by Peng–Robinson):
    reported in words, nothing drawn, and the convergence check passes."""
    pair = catalogue.pairs["propane--n-butane"]
    result = compute_condition(catalogue, pair, "isobar", 5.0e6)
    assert result.curve.no_two_phase.startswith("no two-phase region at this pressure")
    assert not result.drawable.any()
    assert curves.unconverged(result.curve) == 0
    assert result.warnings == (result.curve.no_two_phase,)


def test_isobar_between_critical_pressures_ends_at_the_critical_point(
        systems: dict[str, eq.BinarySystem]) -> None:
    """4 MPa lies between the critical pressures of n-butane (3.80) and propane (4.25 MPa):
    the bubble line starts at pure propane and ends at the mixture critical point."""
    curve = curves.isobar(systems["propane--n-butane"], 4.0e6)
    c = curve.critical
    assert c is not None and 0.15 < c.x1 < 0.3
    assert curve.converged[curve.x1 == 1.0].all()
    assert not curve.converged[curve.x1 < c.x1].any()
    drawn = curve.converged & (curve.x1 > c.x1)
    assert np.all(curve.T_K[drawn] < c.T_K)


def test_point_json_names_the_vapour_treatment(catalogue: Catalogue) -> None:
    """``atlas calc --json`` carries vapour_model and phi per component."""
    answer = solve_point(catalogue, "ethanol", "water", "bubble-t", composition=0.5,
                         P_Pa=101325.0)
    data = answer.to_json()
    assert data["vapour_model"] == "virial"
    assert len(data["phi"]) == 2 and all(0.9 < p < 1.0 for p in data["phi"])
    pr = solve_point(catalogue, "propane", "n-butane", "bubble-t", composition=0.5,
                     P_Pa=1.5e6).to_json()
    assert pr["vapour_model"] == "peng-robinson" and pr["converged"]
    assert 0.7 < pr["phi"][0] < 0.95


def test_bad_vapour_fields_are_located(tmp_path: object) -> None:
    """A missing critical volume and a Peng–Robinson pair without k12 name file and field."""
    import shutil
    from pathlib import Path

    from builder.catalogue.loader import DEFAULT_CATALOGUE

    root = Path(str(tmp_path)) / "pairs"
    shutil.copytree(DEFAULT_CATALOGUE, root)
    component = root / "components" / "ethane.yaml"
    component.write_text(component.read_text().replace("  critical_volume:", "  volume:"))
    pair = root / "binaries" / "propylene--propane.yaml"
    pair.write_text(pair.read_text().replace("  kij: 0.0078\n", ""))
    with pytest.raises(CatalogueErrors) as caught:
        load_catalogue(root)
    text = str(caught.value)
    assert "components/ethane.yaml: entry 'ethane', field 'virial.critical_volume'" in text
    assert "binaries/propylene--propane.yaml" in text and "'vapour.kij'" in text


def test_ideal_gas_path_is_unchanged() -> None:
    """With the ideal-gas vapour the solvers take the explicit Raoult path (common practice:
    two ideal components, P = x1 P1 + x2 P2)."""
    from builder.thermo.vapour_pressure import Antoine

    p1 = Antoine(A=21.0, B=3000.0, C=0.0, T_min_K=200.0, T_max_K=500.0)
    p2 = Antoine(A=21.5, B=3400.0, C=0.0, T_min_K=200.0, T_max_K=500.0)
    system = eq.BinarySystem(p1, p2, Ideal())
    r = eq.bubble_pressure(system, np.array([0.3]), 350.0)
    expected = 0.3 * p1.pressure_Pa(350.0) + 0.7 * p2.pressure_Pa(350.0)
    assert r.P_Pa[0] == expected and r.phi1[0] == 1.0


def test_dimerising_vapour_true_species_against_a_direct_solve() -> None:
    """Two dimerising acids: the true-species equilibrium solved afresh with scipy's fsolve
    (reference: the chemical-theory equations as written by Marek and Standart, 1954)."""
    from scipy.optimize import fsolve

    from builder.thermo.association import dimer_monomer_fractions

    P, k11, k22 = 1.0e5, 3.0e-5, 1.2e-5
    k12 = 2.0 * np.sqrt(k11 * k22)
    for y1 in (0.1, 0.4, 0.8):
        def equations(z: np.ndarray, y1: float = y1) -> list[float]:
            a, b = z
            d11, d22, d12 = k11 * P * a * a, k22 * P * b * b, k12 * P * a * b
            n1, n2 = a + 2 * d11 + d12, b + 2 * d22 + d12
            return [a + b + d11 + d22 + d12 - 1.0, n1 / (n1 + n2) - y1]

        ref = fsolve(equations, [0.3, 0.3], xtol=1e-14)
        a, b = dimer_monomer_fractions(y1, P, k11, k22, k12)
        np.testing.assert_allclose([float(a), float(b)], ref, rtol=1e-9)


def test_associating_vapour_pure_ends_are_the_vapour_pressures() -> None:
    """With a dimerising vapour the pure acid still boils at its vapour pressure (φ/φsat = 1
    there), while its vapour fugacity coefficient is far below 1 (common practice)."""
    from builder.thermo.association import DimerisingVapour
    from builder.thermo.vapour_pressure import Antoine

    acid = Antoine(A=22.0, B=4300.0, C=0.0, T_min_K=250.0, T_max_K=500.0)
    other = Antoine(A=23.0, B=4700.0, C=0.0, T_min_K=250.0, T_max_K=500.0)
    vapour = DimerisingVapour(A=(-12.5, -np.inf), B=(3166.0, 0.0),
                              liquid_volume_m3_per_mol=(5.7e-5, 1.8e-5))
    system = eq.BinarySystem(acid, other, Ideal(), vapour)
    r = eq.bubble_pressure(system, np.array([0.0, 0.5, 1.0]), 380.0)
    assert r.converged.all()
    np.testing.assert_allclose(r.P_Pa[[0, 2]], [other.pressure_Pa(380.0),
                                                acid.pressure_Pa(380.0)], rtol=1e-10)
    assert r.phi1[2] < 0.7
    t = eq.bubble_temperature(system, np.array([0.3]), 101325.0)
    back = eq.dew_temperature(system, t.y1, 101325.0)
    assert back.x1[0] == pytest.approx(0.3, abs=1e-8)
