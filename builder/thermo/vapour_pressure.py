"""Pure-component vapour-pressure correlations, in SI.

Each correlation is a frozen record holding its coefficients already
converted to SI (ln of pascals, kelvin) at load time, so evaluation is a
single numpy expression.  The published forms are read by the
``from_published`` constructors, which do the unit conversion once.

Two forms are supported:

* :class:`Antoine` -- ``log10(P/u) = A - B/(t + C)`` or ``ln(P/u) = ...``,
  with ``P`` in Pa, kPa, bar or mmHg and ``t`` in °C or K, as handbooks print
  it.  Stored as ``ln(P/Pa) = A - B/(T/K + C)``.
* :class:`ExtendedAntoine` -- DIPPR equation 101,
  ``ln(P/Pa) = A + B/T + C ln T + D T**E``, with ``T`` in K.

Both carry a validity range ``[T_min_K, T_max_K]``; evaluating outside it is
allowed (the caller reports it as an extrapolation).

Reference for the example coefficients: B. E. Poling, J. M. Prausnitz,
J. P. O'Connell, *The Properties of Gases and Liquids*, 5th ed.,
McGraw-Hill, 2001, Appendix A (Antoine constants; P in bar, T in K with
``T + C - 273.15`` in the denominator, i.e. C for t in °C).
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Literal, Protocol

import numpy as np
from numpy.typing import ArrayLike, NDArray

from builder.thermo.solvers import solve_bracketed
from builder.thermo.units import to_si

__all__ = ["Antoine", "ExtendedAntoine", "VapourPressure"]

FloatArray = NDArray[np.float64]
_LN10 = math.log(10.0)
_ZERO_CELSIUS_K = 273.15


class VapourPressure(Protocol):
    """What the equilibrium solvers need from a vapour-pressure correlation."""

    @property
    def T_min_K(self) -> float: ...

    @property
    def T_max_K(self) -> float: ...

    def pressure_Pa(self, T_K: ArrayLike) -> FloatArray: ...

    def dlnP_dT(self, T_K: ArrayLike) -> FloatArray: ...

    def temperature_K(self, P_Pa: ArrayLike) -> FloatArray: ...

    def equation(self) -> str: ...


@dataclass(frozen=True)
class Antoine:
    r"""Antoine equation, stored in SI: ``ln(P/Pa) = A - B / (T/K + C)``.

    Validity: the published range ``[T_min_K, T_max_K]``; typically from about
    1 kPa to a few bar.  Outside it the equation extrapolates poorly, above
    all towards the critical point.

    Build one from the form a handbook prints with :meth:`from_published`.

    Examples
    --------
    Water, Poling et al. (2001) Appendix A: log10(P/bar) = 5.11564 -
    1687.537/(t/°C + 230.17), 273.20-473.20 K.  At 373.15 K the reference
    value is 101.325 kPa (normal boiling point); the correlation gives:

    >>> water = Antoine.from_published(5.11564, 1687.537, 230.17, log_base="10",
    ...                                P_unit="bar", T_unit="C",
    ...                                T_min_K=273.20, T_max_K=473.20)
    >>> round(float(water.pressure_Pa(373.15)) / 1e3, 2)
    101.05
    >>> round(float(water.temperature_K(101325.0)), 2)
    373.22
    """

    A: float
    B: float
    C: float
    T_min_K: float
    T_max_K: float

    @classmethod
    def from_published(
        cls,
        A: float,
        B: float,
        C: float,
        *,
        log_base: Literal["10", "e"],
        P_unit: str,
        T_unit: Literal["K", "C"],
        T_min_K: float,
        T_max_K: float,
    ) -> Antoine:
        """Convert ``log_b(P/P_unit) = A - B/(T + C)`` (T in ``T_unit``) to SI."""
        if log_base not in ("10", "e"):
            raise ValueError(f"log_base must be '10' or 'e', found {log_base!r}")
        if T_unit not in ("K", "C"):
            raise ValueError(f"T_unit must be 'K' or 'C', found {T_unit!r}")
        factor = _LN10 if log_base == "10" else 1.0
        ln_unit = math.log(to_si(1.0, P_unit, "pressure"))
        C_K = C - _ZERO_CELSIUS_K if T_unit == "C" else C
        return cls(A=factor * A + ln_unit, B=factor * B, C=C_K, T_min_K=T_min_K, T_max_K=T_max_K)

    def pressure_Pa(self, T_K: ArrayLike) -> FloatArray:
        """Saturation pressure, Pa, at ``T_K``."""
        T = np.asarray(T_K, dtype=float)
        return np.exp(self.A - self.B / (T + self.C))

    def dlnP_dT(self, T_K: ArrayLike) -> FloatArray:
        """``d ln(P) / dT``, 1/K: ``B / (T + C)**2``."""
        T = np.asarray(T_K, dtype=float)
        return self.B / (T + self.C) ** 2

    def temperature_K(self, P_Pa: ArrayLike) -> FloatArray:
        """Saturation temperature, K, at ``P_Pa`` (the exact inverse)."""
        P = np.asarray(P_Pa, dtype=float)
        return self.B / (self.A - np.log(P)) - self.C

    def equation(self) -> str:
        return f"ln(P/Pa) = {self.A:.6g} - {self.B:.6g}/(T/K + {self.C:.6g})"


@dataclass(frozen=True)
class ExtendedAntoine:
    r"""DIPPR equation 101: ``ln(P/Pa) = A + B/T + C ln(T) + D T**E`` (T in K).

    Validity: the published range ``[T_min_K, T_max_K]``; DIPPR fits usually
    run from the triple point to the critical point.

    Examples
    --------
    Water, Perry's Chemical Engineers' Handbook, 8th ed., Table 2-8
    (DIPPR 101 coefficients, 273.16-647.1 K).  Reference: 101.325 kPa at
    373.124 K (IAPWS-95 normal boiling point); the fit is within 0.2 %.

    >>> water = ExtendedAntoine(A=73.649, B=-7258.2, C=-7.3037, D=4.1653e-06, E=2.0,
    ...                         T_min_K=273.16, T_max_K=647.1)
    >>> round(float(water.pressure_Pa(373.124)) / 1e3, 2)
    101.17
    >>> round(float(water.temperature_K(101325.0)), 2)
    373.17
    """

    A: float
    B: float
    C: float
    D: float
    E: float
    T_min_K: float
    T_max_K: float

    @classmethod
    def from_published(
        cls,
        A: float,
        B: float,
        C: float,
        D: float,
        E: float,
        *,
        P_unit: str,
        T_min_K: float,
        T_max_K: float,
    ) -> ExtendedAntoine:
        """Convert ``ln(P/P_unit) = A + B/T + C ln T + D T**E`` to pascals."""
        return cls(A=A + math.log(to_si(1.0, P_unit, "pressure")), B=B, C=C, D=D, E=E,
                   T_min_K=T_min_K, T_max_K=T_max_K)

    def pressure_Pa(self, T_K: ArrayLike) -> FloatArray:
        """Saturation pressure, Pa, at ``T_K``."""
        T = np.asarray(T_K, dtype=float)
        return np.exp(self.A + self.B / T + self.C * np.log(T) + self.D * T**self.E)

    def dlnP_dT(self, T_K: ArrayLike) -> FloatArray:
        """``d ln(P) / dT``, 1/K."""
        T = np.asarray(T_K, dtype=float)
        return -self.B / T**2 + self.C / T + self.D * self.E * T ** (self.E - 1.0)

    def temperature_K(self, P_Pa: ArrayLike) -> FloatArray:
        """Saturation temperature, K, at ``P_Pa``, by a bracketed Newton solve.

        ``ln P(T)`` is monotonic over any physical range, so the solve is
        bracketed between a tenth of ``T_min_K`` and twice ``T_max_K``; a
        pressure outside that span returns NaN.
        """
        P = np.atleast_1d(np.asarray(P_Pa, dtype=float))
        lnP = np.log(P)
        lo = np.full(P.shape, 0.5 * self.T_min_K)
        hi = np.full(P.shape, 1.5 * self.T_max_K)

        def residual(T: FloatArray, mask: NDArray[np.bool_]) -> FloatArray:
            return np.log(self.pressure_Pa(T)) - lnP.ravel()[mask]

        result = solve_bracketed(residual, lo.ravel(), hi.ravel())
        T_out = np.where(result.converged, result.root, np.nan).reshape(P.shape)
        return T_out if np.ndim(P_Pa) else T_out.reshape(())

    def equation(self) -> str:
        return (f"ln(P/Pa) = {self.A:.6g} + {self.B:.6g}/T + {self.C:.6g} ln T"
                f" + {self.D:.6g} T^{self.E:.6g}")
