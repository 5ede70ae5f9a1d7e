"""Display formatting: temperatures and pressures in the site's units, label-value rows.

Nothing here computes thermodynamics: values are read from the results and
formatted for the page.  Views hold plain strings and numbers, never markup:
the templates escape every value (:mod:`.text`).
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from builder.analysis.results import ConditionResult
from builder.site.settings import SiteSettings
from builder.site.text import fmt

__all__ = ["NO_MATRIX", "Display", "Matrix", "Row", "alpha_range", "matrix"]


@dataclass(frozen=True)
class Display:
    """Temperatures and pressures in the units the settings ask for."""

    settings: SiteSettings

    @property
    def T_unit(self) -> str:
        return self.settings.temperature_symbol

    @property
    def P_unit(self) -> str:
        return self.settings.pressure_unit

    def T_value(self, T_K: float) -> float:
        return T_K - 273.15 if self.settings.temperature_unit == "C" else T_K

    def T_values(self, T_K: NDArray[np.float64]) -> NDArray[np.float64]:
        return np.asarray(self.T_value(T_K), dtype=float)  # type: ignore[arg-type]

    def P_value(self, P_Pa: float) -> float:
        return P_Pa / self.settings.pressure_factor

    def T(self, T_K: float | None, decimals: int = 1) -> str:
        if T_K is None or not math.isfinite(T_K):
            return "—"
        return f"{fmt(self.T_value(T_K), decimals, fixed=True)} {self.T_unit}"

    def P(self, P_Pa: float | None, digits: int = 4) -> str:
        if P_Pa is None or not math.isfinite(P_Pa):
            return "—"
        return f"{fmt(self.P_value(P_Pa), digits)} {self.P_unit}"

    def condition(self, result: ConditionResult) -> str:
        """``101.325 kPa`` for an isobar, ``50 °C`` for an isotherm (in the site's units)."""
        if result.kind == "isobar":
            return self.P(result.condition, 6)
        return f"{fmt(self.T_value(result.condition), 6)} {self.T_unit}"


@dataclass(frozen=True)
class Row:
    """A label and a value for a two-column table."""

    label: str
    value: str
    note: str = ""


@dataclass(frozen=True)
class Matrix:
    """A table of quantities (rows) by condition (columns)."""

    columns: tuple[str, ...]
    rows: tuple[tuple[str, tuple[str, ...]], ...]

    def __bool__(self) -> bool:
        return bool(self.rows)


#: A table with no rows (a section the pair does not have).
NO_MATRIX = Matrix((), ())


def matrix(columns: Sequence[str], per_column: Sequence[Sequence[Row]]) -> Matrix:
    """Rows of several conditions side by side; a quantity one condition lacks shows "—"."""
    labels: list[str] = []
    for rows in per_column:
        for row in rows:
            if row.label not in labels:
                labels.append(row.label)
    values = [{row.label: row.value for row in rows} for rows in per_column]
    return Matrix(tuple(columns), tuple((label, tuple(v.get(label, "—") for v in values))
                                        for label in labels))


def alpha_range(result: ConditionResult) -> str:
    v = result.volatility
    return f"{fmt(v.alpha_min, 3)} – {fmt(v.alpha_max, 3)}"
