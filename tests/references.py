"""Independent references built from the PyPI packages ``thermo``, ``chemicals`` and ``CoolProp``.

Each helper builds the reference calculation with the reference library's own code, from
the same published parameters the catalogue holds, so a test compares two implementations
of the same model.
"""

from __future__ import annotations

import warnings
from typing import Any

import numpy as np

from builder.catalogue.records import PairRecord
from builder.thermo.activity import NRTL, UNIQUAC, Ideal, Margules, Swapped, Wilson
from builder.thermo.cubic import CubicMixture

warnings.filterwarnings("ignore")

# CoolProp fluids with a reference equation of state, by catalogue id (shared with
# ``atlas check``).
from builder.analysis.catalogue_checks import COOLPROP_HEOS  # noqa: E402


def coolprop_psat_Pa(component_id: str, T_K: np.ndarray) -> np.ndarray:
    from CoolProp.CoolProp import PropsSI

    name = "HEOS::" + COOLPROP_HEOS[component_id]
    return np.array([PropsSI("P", "T", float(t), "Q", 0, name) for t in T_K])


def thermo_gammas(model: object, x1: float, T_K: float) -> tuple[float, float]:
    """Activity coefficients from the ``thermo`` package's own class for the same parameters.

    thermo has no Margules or van Laar class: Margules goes through NRTL with α = 0 when
    A12 = A21 (two-suffix Margules is NRTL with α = 0 and τ12 + τ21 = A); other forms are
    not available there and raise ``LookupError``.
    """
    import thermo

    xs = [x1, 1.0 - x1]
    if isinstance(model, Swapped):
        g2, g1 = thermo_gammas(model.inner, 1.0 - x1, T_K)
        return g1, g2
    if isinstance(model, Ideal):
        return 1.0, 1.0
    if isinstance(model, NRTL):
        ge = thermo.NRTL(T=T_K, xs=xs,
                         tau_as=[[0, model.tau12.a], [model.tau21.a, 0]],
                         tau_bs=[[0, model.tau12.b], [model.tau21.b, 0]],
                         tau_es=[[0, model.tau12.c], [model.tau21.c, 0]],
                         tau_fs=[[0, model.tau12.d], [model.tau21.d, 0]],
                         alpha_cs=[[0, model.alpha.a], [model.alpha.a, 0]],
                         alpha_ds=[[0, model.alpha.d], [model.alpha.d, 0]])
    elif isinstance(model, Wilson):
        ge = thermo.Wilson(T=T_K, xs=xs,
                           lambda_as=[[0, model.ln_L12.a], [model.ln_L21.a, 0]],
                           lambda_bs=[[0, model.ln_L12.b], [model.ln_L21.b, 0]],
                           lambda_cs=[[0, model.ln_L12.c], [model.ln_L21.c, 0]],
                           lambda_ds=[[0, model.ln_L12.d], [model.ln_L21.d, 0]])
    elif isinstance(model, UNIQUAC):
        ge = thermo.UNIQUAC(T=T_K, xs=xs, rs=[model.r1, model.r2], qs=[model.q1, model.q2],
                            tau_as=[[0, model.ln_tau12.a], [model.ln_tau21.a, 0]],
                            tau_bs=[[0, model.ln_tau12.b], [model.ln_tau21.b, 0]],
                            tau_cs=[[0, model.ln_tau12.c], [model.ln_tau21.c, 0]],
                            tau_ds=[[0, model.ln_tau12.d], [model.ln_tau21.d, 0]])
    elif isinstance(model, Margules) and model.A12 == model.A21:
        A = model.A12(T_K)
        ge = thermo.NRTL(T=T_K, xs=xs, tau_as=[[0, float(A) / 2], [float(A) / 2, 0]],
                         alpha_cs=[[0, 0.0], [0.0, 0]])
    else:
        raise LookupError(f"thermo has no class for {type(model).__name__}")
    g = ge.gammas()
    return float(g[0]), float(g[1])


def van_laar_closed_form(x1: float, A12: float, A21: float) -> tuple[float, float]:
    """ln γ from van Laar's excess Gibbs energy gE/RT = A12 A21 x1 x2 / (A12 x1 + A21 x2),
    differentiated numerically at constant total moles (independent of the builder's formula)."""

    def G(n1: float, n2: float) -> float:
        n = n1 + n2
        return n * A12 * A21 * (n1 / n) * (n2 / n) / (A12 * n1 / n + A21 * n2 / n)

    h = 1e-6
    n1, n2 = x1, 1.0 - x1
    ln_g1 = (G(n1 + h, n2) - G(n1 - h, n2)) / (2 * h)
    ln_g2 = (G(n1, n2 + h) - G(n1, n2 - h)) / (2 * h)
    return ln_g1, ln_g2



def thermo_flasher(pair: PairRecord, cas1: str, cas2: str, Tc: tuple[float, float],
                   Pc: tuple[float, float], omega: tuple[float, float],
                   MW: tuple[float, float]) -> object:
    """thermo's ``FlashVL`` with a ``GibbsExcessLiquid`` of the pair's model and an ideal gas.

    Vapour pressures are thermo's own ``ANTOINE_POLING`` method: the same published table
    (Poling et al. 2001, Appendix A) as the catalogue, evaluated by thermo's code.  The
    liquid needs molar volumes (``VolumeLiquids``) or many bubble points fail.
    """
    from thermo import (
        ChemicalConstantsPackage,
        FlashVL,
        GibbsExcessLiquid,
        HeatCapacityGas,
        IdealGas,
        PropertyCorrelationsPackage,
        VaporPressure,
        VolumeLiquid,
    )
    from thermo.vapor_pressure import ANTOINE_POLING

    cas = [cas1, cas2]
    consts = ChemicalConstantsPackage(Tcs=list(Tc), Pcs=list(Pc), omegas=list(omega),
                                      MWs=list(MW), CASs=cas)
    vps = [VaporPressure(CASRN=c, method=ANTOINE_POLING) for c in cas]
    vls = [VolumeLiquid(CASRN=c) for c in cas]
    hgs = [HeatCapacityGas(CASRN=c) for c in cas]
    props = PropertyCorrelationsPackage(consts, VaporPressures=vps, VolumeLiquids=vls,
                                        HeatCapacityGases=hgs, skip_missing=True)
    ge = _thermo_excess_model(pair.model)
    liquid = GibbsExcessLiquid(VaporPressures=vps, VolumeLiquids=vls, HeatCapacityGases=hgs,
                               GibbsExcessModel=ge, equilibrium_basis="Psat",
                               caloric_basis="Psat", T=300.0, P=1e5, zs=[0.5, 0.5])
    gas = IdealGas(HeatCapacityGases=hgs, T=300.0, P=1e5, zs=[0.5, 0.5])
    return FlashVL(consts, props, liquid=liquid, gas=gas)


def _thermo_excess_model(model: object) -> object:
    import thermo

    if isinstance(model, NRTL):
        return thermo.NRTL(T=300.0, xs=[0.5, 0.5],
                           tau_as=[[0, model.tau12.a], [model.tau21.a, 0]],
                           tau_bs=[[0, model.tau12.b], [model.tau21.b, 0]],
                           alpha_cs=[[0, model.alpha.a], [model.alpha.a, 0]])
    if isinstance(model, Wilson):
        return thermo.Wilson(T=300.0, xs=[0.5, 0.5],
                             lambda_as=[[0, model.ln_L12.a], [model.ln_L21.a, 0]],
                             lambda_bs=[[0, model.ln_L12.b], [model.ln_L21.b, 0]])
    if isinstance(model, UNIQUAC):
        return thermo.UNIQUAC(T=300.0, xs=[0.5, 0.5], rs=[model.r1, model.r2],
                              qs=[model.q1, model.q2],
                              tau_as=[[0, model.ln_tau12.a], [model.ln_tau21.a, 0]],
                              tau_bs=[[0, model.ln_tau12.b], [model.ln_tau21.b, 0]])
    raise LookupError(f"no thermo flash reference for {type(model).__name__}")


__all__ = ["COOLPROP_HEOS", "coolprop_psat_Pa", "thermo_flasher", "thermo_gammas",
           "thermo_pr_flasher", "van_laar_closed_form"]


def thermo_pr_flasher(mixture: CubicMixture, molar_masses: tuple[float, float]) -> Any:
    """thermo's FlashVL with Peng–Robinson (PRMIX) in both phases, from the same critical
    constants, acentric factors and k12 as ``mixture`` (a ``CubicMixture``).  thermo's flash
    requires ideal-gas heat capacities; a constant 75 J/(mol K) is given, which does not
    enter a VF = 0 or 1 flash at given T or P (only enthalpy and entropy use it)."""
    from thermo import (
        PRMIX,
        CEOSGas,
        CEOSLiquid,
        ChemicalConstantsPackage,
        FlashVL,
        HeatCapacityGas,
        PropertyCorrelationsPackage,
    )

    m = mixture
    constants = ChemicalConstantsPackage(Tcs=list(m.Tc_K), Pcs=list(m.Pc_Pa),
                                         omegas=list(m.omega), MWs=list(molar_masses))
    cp = [HeatCapacityGas(poly_fit=(50.0, 1000.0, [0, 0, 0, 0, 75.0])) for _ in range(2)]
    kwargs = dict(Tcs=list(m.Tc_K), Pcs=list(m.Pc_Pa), omegas=list(m.omega),
                  kijs=[[0, m.kij], [m.kij, 0]])
    return FlashVL(constants, PropertyCorrelationsPackage(constants=constants,
                                                          HeatCapacityGases=cp),
                   liquid=CEOSLiquid(PRMIX, kwargs, HeatCapacityGases=cp),
                   gas=CEOSGas(PRMIX, kwargs, HeatCapacityGases=cp))
