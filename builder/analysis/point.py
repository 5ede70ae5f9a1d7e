"""Answer a point question about a catalogued pair: bubble or dew, T or P.

This is the layer between the command line and the thermodynamics: it
resolves what the user typed (names in either order, mass or mole
fractions), runs one solver call, and gathers the warnings a user must see
(extrapolated correlations, a component above its critical temperature, a
point that did not converge).  Numbers stay SI; the command line formats.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, field
from typing import Any, Literal

import numpy as np
from numpy.typing import ArrayLike

from builder.catalogue.loader import Catalogue
from builder.catalogue.lookup import find_pair_or_prediction
from builder.catalogue.records import Component, PairRecord
from builder.thermo import equilibrium as eq

__all__ = ["POINT_KINDS", "PointAnswer", "mass_to_mole", "mole_to_mass", "solve_point",
           "system_for", "validity_warnings"]

PointKind = Literal["bubble-t", "dew-t", "bubble-p", "dew-p"]
POINT_KINDS: dict[str, str] = {
    "bubble-t": "Bubble temperature",
    "dew-t": "Dew temperature",
    "bubble-p": "Bubble pressure",
    "dew-p": "Dew pressure",
}


def mass_to_mole(w1: float, M1: float, M2: float) -> float:
    """Mole fraction of component 1 from its mass fraction.

    95.6 mass % ethanol in water (M = 46.068 and 18.015 g/mol) is 0.8947 mol/mol:

    >>> round(mass_to_mole(0.956, 46.068, 18.015), 4)
    0.8947
    """
    n1, n2 = w1 / M1, (1.0 - w1) / M2
    return n1 / (n1 + n2)


def mole_to_mass(x1: float, M1: float, M2: float) -> float:
    """Mass fraction of component 1 from its mole fraction (inverse of :func:`mass_to_mole`).

    >>> round(mole_to_mass(mass_to_mole(0.3, 58.08, 119.38), 58.08, 119.38), 12)
    0.3
    """
    m1, m2 = x1 * M1, (1.0 - x1) * M2
    return m1 / (m1 + m2)


def system_for(pair: PairRecord, catalogue: Catalogue, swapped: bool = False) -> eq.BinarySystem:
    """The equilibrium system of a pair, in the record's order or swapped."""
    system = eq.BinarySystem(catalogue.components[pair.component1].vapour_pressure,
                             catalogue.components[pair.component2].vapour_pressure, pair.model)
    return system.swapped() if swapped else system


def validity_warnings(pair: PairRecord, components: tuple[Component, Component],
                      T_K: float) -> list[str]:
    """Plain-words warnings for a temperature outside what the data support."""
    warnings = []
    for component in components:
        vp = component.vapour_pressure
        if not (vp.T_min_K <= T_K <= vp.T_max_K):
            warnings.append(
                f"{T_K:.2f} K is outside the range of the vapour-pressure correlation of "
                f"{component.name} ({vp.T_min_K:.2f}-{vp.T_max_K:.2f} K): extrapolated")
        if T_K >= component.critical_temperature_K:
            warnings.append(
                f"{component.name} is above its critical temperature "
                f"({component.critical_temperature_K:.2f} K): it cannot exist as a liquid and "
                "the result has no physical meaning")
    if not (pair.T_min_K <= T_K <= pair.T_max_K):
        warnings.append(
            f"{T_K:.2f} K is outside the temperature range of the {pair.model.name} parameters "
            f"({pair.T_min_K:.2f}-{pair.T_max_K:.2f} K): extrapolated")
    return warnings


@dataclass(frozen=True)
class PointAnswer:
    """One equilibrium point, components in the order the user named them."""

    kind: str
    pair: PairRecord
    components: tuple[Component, Component]
    T_K: float
    P_Pa: float
    x: tuple[float, float]
    y: tuple[float, float]
    gamma: tuple[float, float]
    K: tuple[float, float]
    alpha12: float
    converged: bool
    warnings: list[str] = field(default_factory=list)

    def to_json(self) -> dict[str, Any]:
        """The stable JSON object of ``atlas calc ... --json``."""
        M = [c.molar_mass_kg_per_mol for c in self.components]
        return {
            "calculation": self.kind,
            "pair": self.pair.id,
            "components": [c.id for c in self.components],
            "model": self.pair.model.name,
            "quality": self.pair.quality,
            "T_K": self.T_K,
            "P_Pa": self.P_Pa,
            "x": list(self.x),
            "y": list(self.y),
            "x_mass": _mass_pair(self.x[0], M),
            "y_mass": _mass_pair(self.y[0], M),
            "gamma": list(self.gamma),
            "K": list(self.K),
            "alpha12": self.alpha12,
            "converged": self.converged,
            "warnings": list(self.warnings),
        }


def _mass_pair(x1: float, M: list[float]) -> list[float]:
    w1 = mole_to_mass(x1, M[0], M[1])
    return [w1, 1.0 - w1]


def solve_point(catalogue: Catalogue, first: str, second: str, kind: str, *,
                composition: float, T_K: float | None = None, P_Pa: float | None = None,
                mass: bool = False, model: str = "auto") -> PointAnswer:
    """Solve one bubble or dew point; ``composition`` is of the first named component.

    For ``bubble-*`` it is the liquid, for ``dew-*`` the vapour; a mass
    fraction when ``mass`` is true.  ``T_K`` goes with ``*-p``, ``P_Pa`` with ``*-t``.
    ``model``: ``"auto"`` (the fitted set, else a prediction), ``"fitted"``, ``"unifac"``
    or ``"dortmund"`` (:func:`builder.catalogue.lookup.find_pair_or_prediction`).
    """
    if kind not in POINT_KINDS:
        raise ValueError(f"unknown calculation {kind!r}; use one of {', '.join(POINT_KINDS)}")
    if not (0.0 <= composition <= 1.0):
        raise ValueError(f"composition must be a fraction in [0, 1]; found {composition}")
    pair, swapped, c1, c2 = find_pair_or_prediction(catalogue, first, second, model)
    system = system_for(pair, catalogue, swapped)
    z = mass_to_mole(composition, c1.molar_mass_kg_per_mol, c2.molar_mass_kg_per_mol) \
        if mass else composition

    solvers: dict[str, Callable[[eq.BinarySystem, ArrayLike, ArrayLike], eq.EquilibriumResult]]
    solvers = {"bubble-t": eq.bubble_temperature, "dew-t": eq.dew_temperature,
               "bubble-p": eq.bubble_pressure, "dew-p": eq.dew_pressure}
    condition = P_Pa if kind.endswith("-t") else T_K
    if condition is None:
        needed = "pressure (--P)" if kind.endswith("-t") else "temperature (--T)"
        raise ValueError(f"{kind} needs a {needed}")
    result = solvers[kind](system, np.array([z]), condition)

    T, P = float(result.T_K[0]), float(result.P_Pa[0])
    x1, y1 = float(result.x1[0]), float(result.y1[0])
    K1, K2 = (float(k[0]) for k in result.k_values(system))
    converged = bool(result.converged[0])
    warnings = validity_warnings(pair, (c1, c2), T) if np.isfinite(T) else []
    if not converged:
        warnings.insert(0, "the solver did not converge: the numbers below are not a valid "
                           "equilibrium point")
    return PointAnswer(
        kind=kind, pair=pair, components=(c1, c2), T_K=T, P_Pa=P,
        x=(x1, 1.0 - x1), y=(y1, 1.0 - y1),
        gamma=(float(result.gamma1[0]), float(result.gamma2[0])),
        K=(K1, K2), alpha12=K1 / K2, converged=converged, warnings=warnings,
    )
