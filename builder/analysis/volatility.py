"""Relative volatility along an isobar or isotherm, and how hard the split is.

``α12 = K1/K2 = (y1/x1)/(y2/x2) = γ1 P1sat / (γ2 P2sat)`` (modified Raoult's law),
finite at the pure ends, where it takes its infinite-dilution values.

The difficulty grade uses the volatility of the lighter component over the
heavier at each composition, ``α_LH = max(α12, 1/α12)``, and its minimum over
the range (common practice for a first look): below about 1.05 a split is
usually impractical by ordinary distillation, below 1.1 it is hard, below 1.5
moderate, and easy above.  A pair with an azeotrope cannot be split across it
by plain distillation at that condition, whatever α is elsewhere.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from builder.thermo import equilibrium as eq

__all__ = ["ROUND_COMPOSITIONS", "Volatility", "VolatilityRow", "difficulty", "volatility"]

FloatArray = NDArray[np.float64]

#: Compositions of the published tables: 0, 0.05, ..., 1.
ROUND_COMPOSITIONS = np.round(np.linspace(0.0, 1.0, 21), 10)

GRADES = (
    (1.05, "impractical", "usually impractical by ordinary distillation (α below 1.05)"),
    (1.1, "hard", "a hard split (α below 1.1)"),
    (1.5, "moderate", "a moderate split (α between 1.1 and 1.5)"),
    (float("inf"), "easy", "an easy split (α of 1.5 or more)"),
)


@dataclass(frozen=True)
class VolatilityRow:
    """One line of the table at a round composition."""

    x1: float
    y1: float
    T_K: float
    P_Pa: float
    gamma1: float
    gamma2: float
    alpha12: float
    converged: bool


@dataclass(frozen=True)
class Volatility:
    """Relative volatility summary of one condition."""

    alpha_infinite_dilution_1: float  # α12 as x1 -> 0
    alpha_infinite_dilution_2: float  # α12 as x1 -> 1
    alpha_min: float
    x1_at_min: float
    alpha_max: float
    x1_at_max: float
    lighter_over_heavier_min: float
    grade: str
    grade_text: str
    table: tuple[VolatilityRow, ...]


def difficulty(alpha_lh_min: float, has_azeotrope: bool) -> tuple[str, str]:
    """Plain-words grade from the smallest light-over-heavy volatility.

    >>> difficulty(1.08, False)
    ('hard', 'a hard split (α below 1.1)')
    >>> difficulty(2.4, True)[0]
    'azeotrope'
    """
    if has_azeotrope:
        return "azeotrope", "limited by an azeotrope: plain distillation cannot cross it"
    for limit, grade, text in GRADES:
        if alpha_lh_min < limit:
            return grade, text
    return GRADES[-1][1], GRADES[-1][2]  # pragma: no cover - inf catches everything


def volatility(system: eq.BinarySystem, x1: FloatArray, alpha12: FloatArray,
               usable: NDArray[np.bool_], *, P_Pa: float | None = None,
               T_K: float | None = None, has_azeotrope: bool = False,
               rows: eq.EquilibriumResult | None = None) -> Volatility:
    """Summarise ``alpha12`` along a curve and tabulate it at round compositions.

    ``x1``/``alpha12`` are the curve's points; ``usable`` masks points that
    converged and lie in a stable one-liquid region.  The table is solved
    afresh at :data:`ROUND_COMPOSITIONS` at the isobar ``P_Pa`` or isotherm ``T_K``
    (or read from ``rows``, those bubble points already solved).
    """
    x = np.asarray(x1, dtype=float)
    a = np.asarray(alpha12, dtype=float)
    ok = usable & np.isfinite(a)
    xs, al = x[ok], a[ok]
    lh = np.maximum(al, 1.0 / al)
    i_min, i_max = int(np.argmin(al)), int(np.argmax(al))
    grade, text = difficulty(float(lh.min()), has_azeotrope)

    if P_Pa is None and T_K is None:
        raise ValueError("give P_Pa (isobar) or T_K (isotherm)")
    if rows is None and P_Pa is not None:
        rows = eq.bubble_temperature(system, ROUND_COMPOSITIONS, P_Pa)
    elif rows is None and T_K is not None:
        rows = eq.bubble_pressure(system, ROUND_COMPOSITIONS, T_K)
    assert rows is not None
    row_alpha = rows.relative_volatility(system)
    table = tuple(
        VolatilityRow(float(rows.x1[i]), float(rows.y1[i]), float(rows.T_K[i]),
                      float(rows.P_Pa[i]), float(rows.gamma1[i]), float(rows.gamma2[i]),
                      float(row_alpha[i]), bool(rows.converged[i]))
        for i in range(ROUND_COMPOSITIONS.size))
    return Volatility(
        alpha_infinite_dilution_1=float(row_alpha[0]),
        alpha_infinite_dilution_2=float(row_alpha[-1]),
        alpha_min=float(al[i_min]), x1_at_min=float(xs[i_min]),
        alpha_max=float(al[i_max]), x1_at_max=float(xs[i_max]),
        lighter_over_heavier_min=float(lh.min()),
        grade=grade, grade_text=text, table=table,
    )
