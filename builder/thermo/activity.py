"""Liquid-phase activity-coefficient models for binary mixtures.

Two layers:

* Pure functions of numpy arrays, one per model, mapping the mole fraction
  of component 1 and the model's dimensionless parameters to
  ``(ln γ1, ln γ2)``.  They broadcast: ``x1`` may be a whole curve and the
  parameters scalars or arrays of the same shape (one temperature per point).
* Frozen model records (:class:`Margules`, :class:`NRTL`, ...) that hold the
  temperature dependence of those parameters as published and evaluate
  ``ln_gamma(x1, T_K)``.

Temperature dependence.  Every parameter ``p`` of a model is stored in the
form ``p(T) = a + b/T + c ln(T) + d T`` (:class:`TemperatureFunction`, ``b``
in K, ``d`` in 1/K), which covers the published forms: constants (``a``),
``τ = Δg/(RT)`` (``b = Δg/R``), Wilson's ``Λ = (Vj/Vi) exp(-Δλ/RT)``
(``a = ln(Vj/Vi)``, ``b = -Δλ/R``), UNIQUAC's ``τ = exp(-Δu/RT)`` and
linear-in-T forms.  The catalogue loader converts published energies
(J/mol, cal/mol, K) to these coefficients once.

References
----------
[1] M. Margules, Sitzungsber. Akad. Wiss. Wien 104 (1895) 1243.
[2] J. J. van Laar, Z. Phys. Chem. 72 (1910) 723; 83 (1913) 599.
[3] G. M. Wilson, J. Am. Chem. Soc. 86 (1964) 127-130.
[4] H. Renon, J. M. Prausnitz, AIChE J. 14 (1968) 135-144.
[5] D. S. Abrams, J. M. Prausnitz, AIChE J. 21 (1975) 116-128.
[6] B. E. Poling, J. M. Prausnitz, J. P. O'Connell, The Properties of Gases
    and Liquids, 5th ed., McGraw-Hill, 2001, chapter 8 (the binary forms).
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Protocol

import numpy as np
from numpy.typing import ArrayLike, NDArray

__all__ = [
    "NRTL",
    "UNIQUAC",
    "ActivityModel",
    "Ideal",
    "Margules",
    "Swapped",
    "TemperatureFunction",
    "VanLaar",
    "Wilson",
    "excess_gibbs_RT",
    "margules_ln_gamma",
    "nrtl_ln_gamma",
    "uniquac_ln_gamma",
    "van_laar_ln_gamma",
    "wilson_ln_gamma",
]

FloatArray = NDArray[np.float64]
LnGamma = tuple[FloatArray, FloatArray]

#: UNIQUAC lattice coordination number (common practice, as in [5]).
UNIQUAC_Z = 10.0


# ---------------------------------------------------------------------------
# Pure functions
# ---------------------------------------------------------------------------


def margules_ln_gamma(x1: ArrayLike, A12: ArrayLike, A21: ArrayLike) -> LnGamma:
    """Two-parameter (three-suffix) Margules equation [1].

    ``ln γ1 = x2² [A12 + 2 (A21 - A12) x1]``,
    ``ln γ2 = x1² [A21 + 2 (A12 - A21) x2]``;
    ``A12 = ln γ1∞`` and ``A21 = ln γ2∞`` (dimensionless).  With
    ``A12 = A21 = A`` it is the one-parameter (two-suffix) form ``ln γ1 = A x2²``.

    >>> [round(float(v), 6) for v in margules_ln_gamma(0.25, 1.0, 1.0)]
    [0.5625, 0.0625]
    """
    x1 = np.asarray(x1, dtype=float)
    x2 = 1.0 - x1
    A12 = np.asarray(A12, dtype=float)
    A21 = np.asarray(A21, dtype=float)
    ln_g1 = x2**2 * (A12 + 2.0 * (A21 - A12) * x1)
    ln_g2 = x1**2 * (A21 + 2.0 * (A12 - A21) * x2)
    return ln_g1, ln_g2


def van_laar_ln_gamma(x1: ArrayLike, A12: ArrayLike, A21: ArrayLike) -> LnGamma:
    """Van Laar equation [2].

    ``ln γ1 = A12 (A21 x2 / (A12 x1 + A21 x2))²``,
    ``ln γ2 = A21 (A12 x1 / (A12 x1 + A21 x2))²``;
    ``A12 = ln γ1∞``, ``A21 = ln γ2∞``.  Both must have the same sign (or both
    be zero), otherwise the denominator vanishes inside the composition range.

    >>> [round(float(v), 6) for v in van_laar_ln_gamma(0.5, 1.0, 2.0)]
    [0.444444, 0.222222]
    """
    x1 = np.asarray(x1, dtype=float)
    x2 = 1.0 - x1
    A12 = np.asarray(A12, dtype=float)
    A21 = np.asarray(A21, dtype=float)
    denominator = A12 * x1 + A21 * x2
    with np.errstate(divide="ignore", invalid="ignore"):
        ln_g1 = np.where(denominator == 0, 0.0, A12 * (A21 * x2 / denominator) ** 2)
        ln_g2 = np.where(denominator == 0, 0.0, A21 * (A12 * x1 / denominator) ** 2)
    return ln_g1, ln_g2


def wilson_ln_gamma(x1: ArrayLike, L12: ArrayLike, L21: ArrayLike) -> LnGamma:
    """Wilson equation [3] with the dimensionless ``Λ12``, ``Λ21`` (> 0).

    ``ln γ1 = -ln(x1 + Λ12 x2) + x2 D``, ``ln γ2 = -ln(x2 + Λ21 x1) - x1 D``,
    ``D = Λ12/(x1 + Λ12 x2) - Λ21/(x2 + Λ21 x1)``.  Wilson's equation cannot
    predict two liquid phases.

    >>> [round(float(v), 6) for v in wilson_ln_gamma(0.5, 0.5, 0.5)]
    [0.287682, 0.287682]
    """
    x1 = np.asarray(x1, dtype=float)
    x2 = 1.0 - x1
    L12 = np.asarray(L12, dtype=float)
    L21 = np.asarray(L21, dtype=float)
    s1 = x1 + L12 * x2
    s2 = x2 + L21 * x1
    D = L12 / s1 - L21 / s2
    return -np.log(s1) + x2 * D, -np.log(s2) - x1 * D


def nrtl_ln_gamma(
    x1: ArrayLike, tau12: ArrayLike, tau21: ArrayLike, alpha: ArrayLike
) -> LnGamma:
    """NRTL equation [4].

    ``G12 = exp(-α τ12)``, ``G21 = exp(-α τ21)``;
    ``ln γ1 = x2² [τ21 (G21/(x1 + x2 G21))² + τ12 G12/(x2 + x1 G12)²]``,
    ``ln γ2 = x1² [τ12 (G12/(x2 + x1 G12))² + τ21 G21/(x1 + x2 G21)²]``.
    With ``α = 0`` it reduces to two-suffix Margules with ``A = τ12 + τ21``.

    Same values as the ``thermo`` package's NRTL class for these parameters:

    >>> [round(float(v), 6) for v in nrtl_ln_gamma(0.3, 0.5, 1.2, 0.3)]
    [0.690158, 0.157539]
    """
    x1 = np.asarray(x1, dtype=float)
    x2 = 1.0 - x1
    tau12 = np.asarray(tau12, dtype=float)
    tau21 = np.asarray(tau21, dtype=float)
    alpha = np.asarray(alpha, dtype=float)
    G12 = np.exp(-alpha * tau12)
    G21 = np.exp(-alpha * tau21)
    s1 = x1 + x2 * G21
    s2 = x2 + x1 * G12
    ln_g1 = x2**2 * (tau21 * (G21 / s1) ** 2 + tau12 * G12 / s2**2)
    ln_g2 = x1**2 * (tau12 * (G12 / s2) ** 2 + tau21 * G21 / s1**2)
    return ln_g1, ln_g2


def uniquac_ln_gamma(
    x1: ArrayLike,
    r1: float,
    r2: float,
    q1: float,
    q2: float,
    tau12: ArrayLike,
    tau21: ArrayLike,
    z: float = UNIQUAC_Z,
) -> LnGamma:
    """UNIQUAC equation [5] (combinatorial plus residual part), ``z = 10``.

    ``Φi = ri xi / Σ rj xj``, ``θi = qi xi / Σ qj xj``,
    ``li = z/2 (ri - qi) - (ri - 1)``;
    ``ln γi^C = ln(Φi/xi) + z/2 qi ln(θi/Φi) + li - (Φi/xi) Σ xj lj``;
    ``ln γ1^R = -q1 ln(θ1 + θ2 τ21) + θ2 q1 [τ21/(θ1 + θ2 τ21) - τ12/(θ2 + θ1 τ12)]``
    and symmetrically for component 2.  ``τij = exp(-Δuij/RT)`` (> 0).

    Same values as the ``thermo`` package's UNIQUAC class for these parameters:

    >>> [round(float(v), 6) for v in uniquac_ln_gamma(0.5, 2.1055, 0.92, 1.972, 1.4, 0.9, 1.1)]
    [0.098829, 0.203605]
    """
    x1 = np.asarray(x1, dtype=float)
    x2 = 1.0 - x1
    tau12 = np.asarray(tau12, dtype=float)
    tau21 = np.asarray(tau21, dtype=float)
    rx = r1 * x1 + r2 * x2
    qx = q1 * x1 + q2 * x2
    phi1_x1, phi2_x2 = r1 / rx, r2 / rx  # Φi/xi, finite at xi -> 0
    theta1, theta2 = q1 * x1 / qx, q2 * x2 / qx
    theta1_phi1 = (q1 / r1) * rx / qx  # θi/Φi
    theta2_phi2 = (q2 / r2) * rx / qx
    l1 = 0.5 * z * (r1 - q1) - (r1 - 1.0)
    l2 = 0.5 * z * (r2 - q2) - (r2 - 1.0)
    xl = x1 * l1 + x2 * l2
    ln_c1 = np.log(phi1_x1) + 0.5 * z * q1 * np.log(theta1_phi1) + l1 - phi1_x1 * xl
    ln_c2 = np.log(phi2_x2) + 0.5 * z * q2 * np.log(theta2_phi2) + l2 - phi2_x2 * xl
    s1 = theta1 + theta2 * tau21
    s2 = theta2 + theta1 * tau12
    ln_r1 = q1 * (-np.log(s1) + theta2 * (tau21 / s1 - tau12 / s2))
    ln_r2 = q2 * (-np.log(s2) + theta1 * (tau12 / s2 - tau21 / s1))
    return ln_c1 + ln_r1, ln_c2 + ln_r2


def excess_gibbs_RT(model: ActivityModel, x1: ArrayLike, T_K: ArrayLike) -> FloatArray:
    """Molar excess Gibbs energy over RT, ``gE/RT = x1 ln γ1 + x2 ln γ2``.

    >>> round(float(excess_gibbs_RT(Margules.constant(1.0, 1.0), 0.5, 300.0)), 6)
    0.25
    """
    x1 = np.asarray(x1, dtype=float)
    ln_g1, ln_g2 = model.ln_gamma(x1, T_K)
    return x1 * ln_g1 + (1.0 - x1) * ln_g2


# ---------------------------------------------------------------------------
# Temperature-dependent model records
# ---------------------------------------------------------------------------


@dataclass(frozen=True)
class TemperatureFunction:
    """``p(T) = a + b/T + c ln(T) + d T`` with T in K (b in K, d in 1/K).

    >>> float(TemperatureFunction(a=1.0, b=300.0)(300.0))
    2.0
    """

    a: float = 0.0
    b: float = 0.0
    c: float = 0.0
    d: float = 0.0

    def __call__(self, T_K: ArrayLike) -> FloatArray:
        T = np.asarray(T_K, dtype=float)
        value = self.a + self.b / T
        if self.c:
            value = value + self.c * np.log(T)
        if self.d:
            value = value + self.d * T
        return np.asarray(value, dtype=float)

    def text(self) -> str:
        parts = [f"{self.a:.6g}"]
        if self.b:
            parts.append(f"{self.b:+.6g}/T")
        if self.c:
            parts.append(f"{self.c:+.6g} ln T")
        if self.d:
            parts.append(f"{self.d:+.6g} T")
        return " ".join(parts)


class ActivityModel(Protocol):
    """What the equilibrium solvers need: ``(ln γ1, ln γ2)`` at ``(x1, T)``."""

    @property
    def name(self) -> str: ...

    def ln_gamma(self, x1: ArrayLike, T_K: ArrayLike) -> LnGamma: ...

    def parameters_text(self) -> dict[str, str]: ...


@dataclass(frozen=True)
class Ideal:
    """Ideal liquid solution (Raoult's law): ``γ1 = γ2 = 1``."""

    name: str = field(default="ideal", init=False)

    def ln_gamma(self, x1: ArrayLike, T_K: ArrayLike) -> LnGamma:
        shape = np.broadcast(np.asarray(x1), np.asarray(T_K)).shape
        return np.zeros(shape), np.zeros(shape)

    def parameters_text(self) -> dict[str, str]:
        return {}


@dataclass(frozen=True)
class Margules:
    """Two-parameter Margules with ``A12(T)``, ``A21(T)`` (see :func:`margules_ln_gamma`)."""

    A12: TemperatureFunction
    A21: TemperatureFunction
    name: str = field(default="Margules", init=False)

    @classmethod
    def constant(cls, A12: float, A21: float) -> Margules:
        return cls(TemperatureFunction(a=A12), TemperatureFunction(a=A21))

    def ln_gamma(self, x1: ArrayLike, T_K: ArrayLike) -> LnGamma:
        return margules_ln_gamma(x1, self.A12(T_K), self.A21(T_K))

    def parameters_text(self) -> dict[str, str]:
        return {"A12": self.A12.text(), "A21": self.A21.text()}


@dataclass(frozen=True)
class VanLaar:
    """Van Laar with ``A12(T)``, ``A21(T)`` (see :func:`van_laar_ln_gamma`)."""

    A12: TemperatureFunction
    A21: TemperatureFunction
    name: str = field(default="van Laar", init=False)

    def ln_gamma(self, x1: ArrayLike, T_K: ArrayLike) -> LnGamma:
        return van_laar_ln_gamma(x1, self.A12(T_K), self.A21(T_K))

    def parameters_text(self) -> dict[str, str]:
        return {"A12": self.A12.text(), "A21": self.A21.text()}


@dataclass(frozen=True)
class Wilson:
    """Wilson with ``ln Λ12(T)`` and ``ln Λ21(T)`` (see :func:`wilson_ln_gamma`).

    Published as ``Λij = (Vj/Vi) exp(-Δλij/(R T))``: ``ln Λij = ln(Vj/Vi) - (Δλij/R)/T``.
    """

    ln_L12: TemperatureFunction
    ln_L21: TemperatureFunction
    name: str = field(default="Wilson", init=False)

    def ln_gamma(self, x1: ArrayLike, T_K: ArrayLike) -> LnGamma:
        return wilson_ln_gamma(x1, np.exp(self.ln_L12(T_K)), np.exp(self.ln_L21(T_K)))

    def parameters_text(self) -> dict[str, str]:
        return {"ln Λ12": self.ln_L12.text(), "ln Λ21": self.ln_L21.text()}


@dataclass(frozen=True)
class NRTL:
    """NRTL with ``τ12(T)``, ``τ21(T)`` and ``α(T)`` (see :func:`nrtl_ln_gamma`).

    Published as ``τij = Δgij/(R T)``: ``b = Δgij/R``.
    """

    tau12: TemperatureFunction
    tau21: TemperatureFunction
    alpha: TemperatureFunction
    name: str = field(default="NRTL", init=False)

    def ln_gamma(self, x1: ArrayLike, T_K: ArrayLike) -> LnGamma:
        return nrtl_ln_gamma(x1, self.tau12(T_K), self.tau21(T_K), self.alpha(T_K))

    def parameters_text(self) -> dict[str, str]:
        return {"τ12": self.tau12.text(), "τ21": self.tau21.text(), "α": self.alpha.text()}


@dataclass(frozen=True)
class UNIQUAC:
    """UNIQUAC with ``ln τ12(T)``, ``ln τ21(T)`` and the pure-component r, q.

    Published as ``τij = exp(-Δuij/(R T))``: ``ln τij = -(Δuij/R)/T``.
    """

    ln_tau12: TemperatureFunction
    ln_tau21: TemperatureFunction
    r1: float
    r2: float
    q1: float
    q2: float
    name: str = field(default="UNIQUAC", init=False)

    def ln_gamma(self, x1: ArrayLike, T_K: ArrayLike) -> LnGamma:
        return uniquac_ln_gamma(x1, self.r1, self.r2, self.q1, self.q2,
                                np.exp(self.ln_tau12(T_K)), np.exp(self.ln_tau21(T_K)))

    def parameters_text(self) -> dict[str, str]:
        return {"ln τ12": self.ln_tau12.text(), "ln τ21": self.ln_tau21.text(),
                "r1": f"{self.r1:.6g}", "r2": f"{self.r2:.6g}",
                "q1": f"{self.q1:.6g}", "q2": f"{self.q2:.6g}"}


@dataclass(frozen=True)
class Swapped:
    """The same model with the component order reversed (1 <-> 2)."""

    inner: ActivityModel

    @property
    def name(self) -> str:
        return self.inner.name

    def ln_gamma(self, x1: ArrayLike, T_K: ArrayLike) -> LnGamma:
        ln_g2, ln_g1 = self.inner.ln_gamma(1.0 - np.asarray(x1, dtype=float), T_K)
        return ln_g1, ln_g2

    def parameters_text(self) -> dict[str, str]:
        return self.inner.parameters_text()
