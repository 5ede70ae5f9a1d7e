"""Benchmark: a 201-point Txy curve at 101.325 kPa for an NRTL pair.

The vectorised solver (one call for the whole curve) against a loop of bubble-point
calculations with the ``thermo`` package (0.6.1) for the same NRTL parameters and the same
published Antoine table (Poling et al. 2001, via thermo's ANTOINE_POLING method):

* thermo's general-purpose ``FlashVL`` (P, VF = 0) flash, point by point;
* a bracketed scalar solve (scipy ``brentq``) of sum(x_i γ_i P_i^sat) = P over thermo's
  NRTL activity coefficients, point by point (a lighter reference).

Both references treat the vapour as an ideal gas, so they are compared with this project's
solver on the same pair with the ideal-gas vapour; the atlas's default, the virial vapour
(second virial coefficients and Poynting factors), is timed beside it.  Prints the times,
the ratio and the largest differences in T (K) and y.  The remaining difference (about
5e-7 K) sits at the water-rich end, above ethanol's Antoine range (369.54 K), where thermo
switches from the Antoine equation to its own extrapolation.
Target (issue 2):
at least 300 times faster than the flash loop, agreeing to 1e-6 in T and y.
Run:  python benchmarks/curves.py  (needs the test extra: thermo, chemicals).
"""

from __future__ import annotations

import statistics
import sys
import time
import warnings
from pathlib import Path

import numpy as np

warnings.filterwarnings("ignore")
sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

from builder.analysis.curves import isobar  # noqa: E402
from builder.analysis.point import system_for  # noqa: E402
from builder.catalogue.loader import load_catalogue  # noqa: E402
from builder.thermo.equilibrium import BinarySystem  # noqa: E402
from tests.references import thermo_flasher  # noqa: E402

PAIR = "ethanol--water"
P_PA = 101325.0
POINTS = 201


def _best_of(function, repeats: int) -> tuple[float, object]:  # type: ignore[no-untyped-def]
    times, result = [], None
    for _ in range(repeats):
        start = time.perf_counter()
        result = function()
        times.append(time.perf_counter() - start)
    return min(times), result


def main() -> None:
    catalogue = load_catalogue()
    pair = catalogue.pairs[PAIR]
    virial = system_for(pair, catalogue)
    system = BinarySystem(virial.psat1, virial.psat2, virial.activity)  # ideal-gas vapour
    c1, c2 = (catalogue.components[c] for c in (pair.component1, pair.component2))
    x = np.linspace(0.0, 1.0, POINTS)

    ours_s, curve = _best_of(lambda: isobar(system, P_PA, x), 50)
    virial_s, _ = _best_of(lambda: isobar(virial, P_PA, x), 50)

    flasher = thermo_flasher(
        pair, c1.cas, c2.cas, (c1.critical_temperature_K, c2.critical_temperature_K),
        (c1.critical_pressure_Pa, c2.critical_pressure_Pa),
        (c1.acentric_factor, c2.acentric_factor),
        (c1.molar_mass_kg_per_mol * 1e3, c2.molar_mass_kg_per_mol * 1e3))

    def flash_loop() -> tuple[np.ndarray, np.ndarray]:
        T, y = np.empty(POINTS), np.empty(POINTS)
        for i, x1 in enumerate(x):
            state = flasher.flash(P=P_PA, VF=0, zs=[float(x1), 1.0 - float(x1)])
            T[i], y[i] = state.T, state.gas.zs[0] if x1 < 1 else 1.0
        return T, y

    flash_s, (T_flash, y_flash) = _best_of(flash_loop, 2)

    import thermo
    from scipy.optimize import brentq
    from thermo import VaporPressure
    from thermo.vapor_pressure import ANTOINE_POLING

    vps = [VaporPressure(CASRN=c, method=ANTOINE_POLING) for c in (c1.cas, c2.cas)]
    m = pair.model
    ge = thermo.NRTL(T=350.0, xs=[0.5, 0.5], tau_bs=[[0, m.tau12.b], [m.tau21.b, 0]],  # type: ignore[attr-defined]
                     alpha_cs=[[0, m.alpha.a], [m.alpha.a, 0]])  # type: ignore[attr-defined]

    def brentq_loop() -> tuple[np.ndarray, np.ndarray]:
        T, y = np.empty(POINTS), np.empty(POINTS)
        for i, x1 in enumerate(x):
            xs = [float(x1), 1.0 - float(x1)]

            def f(t: float, xs: list[float] = xs) -> float:
                g = ge.to_T_xs(t, xs).gammas()
                return xs[0] * g[0] * vps[0](t) + xs[1] * g[1] * vps[1](t) - P_PA

            T[i] = brentq(f, 330.0, 390.0, xtol=1e-12)
            g = ge.to_T_xs(T[i], xs).gammas()
            y[i] = xs[0] * g[0] * vps[0](T[i]) / P_PA
        return T, y

    brentq_s, (T_brentq, y_brentq) = _best_of(brentq_loop, 3)

    print(f"Txy curve, {POINTS} points, {PAIR} (NRTL) at {P_PA / 1e3:.3f} kPa")
    print(f"{'method':<44}{'time (ms)':>12}{'ratio':>10}{'max |dT| (K)':>15}{'max |dy|':>12}")
    print(f"{'vectorised solver (this project)':<44}{ours_s * 1e3:>12.3f}{1.0:>10.0f}"
          f"{0.0:>15.1e}{0.0:>12.1e}")
    print(f"{'  the same with the virial vapour':<44}{virial_s * 1e3:>12.3f}"
          f"{virial_s / ours_s:>10.1f}{'-':>15}{'-':>12}")
    for name, seconds, T_ref, y_ref in (
        ("thermo FlashVL loop", flash_s, T_flash, y_flash),
        ("brentq loop over thermo NRTL gammas", brentq_s, T_brentq, y_brentq),
    ):
        dT = float(np.max(np.abs(curve.T_K - T_ref)))
        dy = float(np.max(np.abs(curve.y1 - y_ref)))
        print(f"{name:<44}{seconds * 1e3:>12.1f}{seconds / ours_s:>10.0f}{dT:>15.1e}{dy:>12.1e}")
    print(f"(best of repeated runs; {statistics.median([ours_s]) * 1e6 / POINTS:.2f} µs per "
          "point for the vectorised solver)")


if __name__ == "__main__":
    main()
