"""Our own NRTL fit for formic acid-water, with the associating (dimerising) vapour.

No published activity parameter set regressed with a chemical-theory vapour could be read
for formic acid-water (the other acid pairs use published DECHEMA sets), so its
parameters are fitted here, reproducibly, to published experimental data, with exactly
the vapour treatment the catalogue uses for it (``vapour: {model: associating}``: the
chemical theory of dimerisation with the acid's published dimerisation constant,
builder.thermo.association).  The data are published; the fit is ours.  The model is NRTL
with ``τ12 = b12/T``, ``τ21 = b21/T`` (b in K) and a fixed ``α = 0.3`` (common practice
for a two-parameter NRTL fit).

The fit: least squares (scipy) over measured T-x-y points at 760 mmHg, residuals
``(T_calc - T_exp) / 0.5 K`` and ``(y_calc - y_exp) / 0.01`` at the measured liquid
compositions (bubble-point calculation).

The data, with their source (also written into the pair's catalogue entry): formic
acid-water at 760 mmHg, Lange's Handbook of Chemistry, 10th ed. (1967), vapour-liquid
equilibrium table, read as transcribed on the Wikipedia data page of formic acid
("Distillation data"); only the rows we could read are used (the acid-rich part, up to
41.1 mole % water, which reaches the azeotrope).  The acetic acid-water table of the same
handbook (via the acetic acid data page) is kept here too: the tests use it to check the
published acetic acid-water set.

Run:  python benchmarks/regress_acid_pairs.py   (prints the parameters and the deviations
to paste into pairs/binaries/; takes a minute or two).
"""

from __future__ import annotations

import sys
from pathlib import Path

import numpy as np
from scipy.optimize import least_squares

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

from builder.catalogue.loader import Catalogue, load_catalogue
from builder.catalogue.records import Component
from builder.catalogue.vapour import PairVapour, vapour_model_for
from builder.thermo import equilibrium as eq
from builder.thermo.activity import NRTL, TemperatureFunction

P_ATM_PA = 101325.0
ALPHA = 0.3

#: Acetic acid (1) - water (2) at 760 mmHg: (T / degC, mole % water in the liquid, in the
#: vapour). Lange's Handbook of Chemistry, 10th ed., via the Wikipedia data page of acetic
#: acid (the rows we could read).
ACETIC_ACID_WATER = (
    (116.5, 2.2, 5.8), (114.6, 5.4, 12.3), (113.4, 8.6, 16.8), (113.5, 9.9, 18.3),
    (113.1, 10.1, 18.8), (110.6, 18.9, 29.8), (107.8, 30.3, 43.3), (106.1, 41.3, 54.5),
    (104.4, 52.2, 64.9), (103.1, 62.4, 73.5), (102.3, 69.6, 79.2),
)

#: Formic acid (1) - water (2) at 760 mmHg, same columns and source (Wikipedia data page
#: of formic acid).
FORMIC_ACID_WATER = (
    (102.3, 4.05, 2.45), (104.6, 15.5, 10.2), (105.9, 21.8, 16.2), (107.1, 32.1, 27.9),
    (107.6, 40.9, 40.2), (107.6, 41.1, 40.5),
)


def nrtl(b12_K: float, b21_K: float) -> NRTL:
    return NRTL(TemperatureFunction(b=b12_K), TemperatureFunction(b=b21_K),
                TemperatureFunction(a=ALPHA))


def associating_system(c1: Component, c2: Component, b12_K: float, b21_K: float
                       ) -> eq.BinarySystem:
    vapour = vapour_model_for(PairVapour(model="associating"), c1, c2)
    return eq.BinarySystem(c1.vapour_pressure, c2.vapour_pressure, nrtl(b12_K, b21_K), vapour)


def isobar_points(rows: tuple[tuple[float, float, float], ...]
                  ) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """``T_K, x1, y1`` (component 1 the acid) from rows of (degC, mol % water, mol % water)."""
    data = np.array(rows, dtype=float)
    return data[:, 0] + 273.15, 1.0 - data[:, 1] / 100.0, 1.0 - data[:, 2] / 100.0


def isobar_deviations(system: eq.BinarySystem, T_K: np.ndarray, x1: np.ndarray,
                      y1: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Calculated minus measured bubble temperature (K) and vapour fraction."""
    r = eq.bubble_temperature(system, x1, np.full_like(x1, P_ATM_PA))
    if not r.converged.all():
        return np.full_like(x1, 50.0), np.full_like(x1, 1.0)
    return r.T_K - T_K, r.y1 - y1


def fit_isobar(c1: Component, c2: Component, rows: tuple[tuple[float, float, float], ...],
               start: tuple[float, float]) -> tuple[float, float]:
    T_K, x1, y1 = isobar_points(rows)

    def residuals(p: np.ndarray) -> np.ndarray:
        dT, dy = isobar_deviations(associating_system(c1, c2, *p), T_K, x1, y1)
        return np.concatenate([dT / 0.5, dy / 0.01])

    fit = least_squares(residuals, np.array(start), x_scale=100.0)
    return float(fit.x[0]), float(fit.x[1])


def main() -> None:
    catalogue: Catalogue = load_catalogue()
    c = catalogue.components
    isobars = (("formic-acid", "water", FORMIC_ACID_WATER, (-300.0, -100.0)),)
    for id1, id2, rows, start in isobars:
        b12, b21 = fit_isobar(c[id1], c[id2], rows, start)
        T_K, x1, y1 = isobar_points(rows)
        dT, dy = isobar_deviations(associating_system(c[id1], c[id2], b12, b21), T_K, x1, y1)
        print(f"{id1}--{id2}: tau12 b = {b12:.3f} K, tau21 b = {b21:.3f} K, alpha {ALPHA}; "
              f"{len(rows)} points, mean |dT| {np.mean(np.abs(dT)):.2f} K "
              f"(max {np.max(np.abs(dT)):.2f}), mean |dy| {np.mean(np.abs(dy)):.4f} "
              f"(max {np.max(np.abs(dy)):.4f})")


if __name__ == "__main__":
    main()
