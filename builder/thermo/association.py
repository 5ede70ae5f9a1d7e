"""The chemical theory of vapour dimerisation (carboxylic acids): true species and fugacities.

A carboxylic acid vapour is a mixture of monomers and hydrogen-bonded dimers
in chemical equilibrium; treating the true species as an ideal gas [1, 2]:

``z_D11 = K11 P z_M1²``, ``z_D22 = K22 P z_M2²``, ``z_D12 = K12 P z_M1 z_M2``,
``z_M1 + z_M2 + z_D11 + z_D22 + z_D12 = 1``

with ``K_ij`` [1/Pa] the dimerisation constants, ``K12 = 2 (K11 K22)^½`` for
a cross dimer of two acids [2] (and zero when either component does not
dimerise).  The apparent (stoichiometric) vapour composition is
``y1 = (z_M1 + 2 z_D11 + z_D12) / (z_M1 + z_M2 + 2 z_D11 + 2 z_D22 + 2 z_D12)``.
The fugacity of an apparent component is that of its monomer, ``f_i = z_Mi P``,
so its fugacity coefficient is ``φ_i = z_Mi / y_i`` and that of the pure
saturated vapour ``φ_i^sat = z_Mi^sat = [(1 + 4 K_ii P_i^sat)^½ - 1] / (2 K_ii P_i^sat)``.

The constants follow ``log10(K / Pa⁻¹) = A + B/T`` as tabulated (for
example by Tsonopoulos and Prausnitz [1] or Marek and Standart [2]).
Activity parameters must have been regressed with the same vapour treatment
to be used with it.

References
----------
[1] C. Tsonopoulos, J. M. Prausnitz, "Fugacity coefficients in vapor-phase
    mixtures of water and carboxylic acids", Chem. Eng. J. 1 (1970) 273-278.
[2] J. Marek, G. Standart, "Vapor-liquid equilibria in mixtures containing an
    associating substance. I.", Collect. Czech. Chem. Commun. 19 (1954) 1074-1084.
[3] J. M. Prausnitz, R. N. Lichtenthaler, E. G. de Azevedo, Molecular Thermodynamics
    of Fluid-Phase Equilibria, 3rd ed., Prentice Hall, 1999, ch. 5.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray

from builder.thermo.solvers import solve_bracketed
from builder.thermo.units import GAS_CONSTANT_J_PER_MOL_K

__all__ = ["DimerisingVapour", "dimer_monomer_fractions", "pure_monomer_fraction"]

FloatArray = NDArray[np.float64]


def pure_monomer_fraction(K_per_Pa: ArrayLike, P_Pa: ArrayLike) -> FloatArray:
    """True mole fraction of monomer in a pure dimerising vapour, ``z_M = [(1+4KP)^½ - 1]/(2KP)``.

    From ``z_D = K P z_M²`` and ``z_M + z_D = 1``; 1 when ``K P = 0``.  With
    ``K P = 3.6`` (an acid near its normal boiling point) about 41 % of the
    true molecules are monomers:

    >>> round(float(pure_monomer_fraction(3.6 / 101325.0, 101325.0)), 4)
    0.406
    """
    kp = np.asarray(K_per_Pa, dtype=float) * np.asarray(P_Pa, dtype=float)
    with np.errstate(invalid="ignore", divide="ignore"):
        z = (np.sqrt(1.0 + 4.0 * kp) - 1.0) / (2.0 * kp)
    return np.asarray(np.where(kp > 1e-12, z, 1.0 - kp), dtype=float)


def dimer_monomer_fractions(y1: ArrayLike, P_Pa: ArrayLike, K11: ArrayLike, K22: ArrayLike,
                            K12: ArrayLike) -> tuple[FloatArray, FloatArray]:
    """True monomer fractions ``z_M1, z_M2`` of a vapour of apparent composition ``y1``.

    For each trial ``z_M1`` the sum of true fractions fixes ``z_M2`` (a
    quadratic); ``z_M1`` is then solved (bracketed, all points at once) so that
    the apparent composition is ``y1``.  A vapour of acid (1) with a
    non-associating component (2), K11 P = 2, y1 = 0.5: by hand, ``a + 4a² = b``
    and ``a + b + 2a² = 1`` give ``6a² + 2a - 1 = 0``, ``a = (√28 - 2)/12``:

    >>> a, b = dimer_monomer_fractions(0.5, 1e5, 2e-5, 0.0, 0.0)
    >>> round(float(a), 6), round(float(b), 6)
    (0.274292, 0.575236)
    """
    y, P, k11, k22, k12 = np.broadcast_arrays(*(np.asarray(v, dtype=float) for v in (
        y1, P_Pa, K11, K22, K12)))
    if not np.any(k22) and not np.any(k12):
        return _acid_with_inert(y, P, k11)
    if not np.any(k11) and not np.any(k12):
        b, a = _acid_with_inert(1.0 - y, P, k22)
        return a, b
    shape = y.shape
    y, P, k11, k22, k12 = (v.ravel() for v in (y, P, k11, k22, k12))
    a11, a22, a12 = k11 * P, k22 * P, k12 * P

    def monomer2(a: FloatArray, m: NDArray[np.bool_]) -> FloatArray:
        # a22 b² + (1 + a12 a) b + (a + a11 a² - 1) = 0, positive root
        lin = 1.0 + a12[m] * a
        const = a + a11[m] * a * a - 1.0
        quad = a22[m]
        with np.errstate(invalid="ignore", divide="ignore"):
            root = (-lin + np.sqrt(np.maximum(lin * lin - 4.0 * quad * const, 0.0))) / (2.0 * quad)
        return np.where(quad > 1e-300, root, -const / lin)

    def residual(a: FloatArray, m: NDArray[np.bool_]) -> FloatArray:
        b = monomer2(a, m)
        n1 = a + 2.0 * a11[m] * a * a + a12[m] * a * b
        n2 = b + 2.0 * a22[m] * b * b + a12[m] * a * b
        return n1 / (n1 + n2) - y[m]

    a_max = pure_monomer_fraction(k11, P)
    result = solve_bracketed(residual, np.zeros_like(y), a_max, a_max * y, xtol=1e-15,
                             ftol=1e-15)
    everything = np.ones_like(y, dtype=bool)
    a = np.where(y >= 1.0, a_max, np.where(y <= 0.0, 0.0, result.root))
    b = monomer2(a, everything)
    return a.reshape(shape), b.reshape(shape)


def _acid_with_inert(y1: FloatArray, P_Pa: FloatArray, K11: FloatArray
                     ) -> tuple[FloatArray, FloatArray]:
    """Monomer fractions of an acid (1) with a component that does not dimerise (2).

    With ``D = K11 P a²`` the apparent fraction is ``y1 = (a + 2D)/(1 + D)``, so
    ``K11 P (2 - y1) a² + a - y1 = 0``: ``a = 2 y1 / (1 + [1 + 4 K11 P (2 - y1) y1]^½)``
    (the root written without cancellation), and ``b = 1 - a - D``.  Same answer as the
    general solve of :func:`dimer_monomer_fractions`, in closed form:

    >>> a, b = _acid_with_inert(np.array(0.5), np.array(1e5), np.array(2e-5))
    >>> round(float(a), 6), round(float(b), 6)
    (0.274292, 0.575236)
    """
    kp = K11 * P_Pa
    y = np.clip(y1, 0.0, 1.0)
    a = 2.0 * y / (1.0 + np.sqrt(1.0 + 4.0 * kp * (2.0 - y) * y))
    b = 1.0 - a - kp * a * a
    return np.asarray(a, dtype=float), np.asarray(np.maximum(b, 0.0), dtype=float)


@dataclass(frozen=True)
class DimerisingVapour:
    """A binary vapour with dimerising components (chemical theory), with Poynting factors.

    ``log10(K_ii / Pa⁻¹) = A_i + B_i / T``; a component that does not dimerise
    has ``A = -inf``.  The cross constant is ``K12 = 2 (K11 K22)^½`` [2].

    An acid (1) whose ``K11 P`` is 2 at 400 K and 1 bar, with a non-associating
    component (2), equimolar: ``φ1 = z_M1 / y1``, ``φ2 = z_M2 / y2`` (above 1: the
    dimers leave the inert component a larger share of the true molecules):

    >>> v = DimerisingVapour(A=(np.log10(2e-5) - 1.0, -np.inf), B=(400.0, 0.0),
    ...                      liquid_volume_m3_per_mol=(5.7e-5, 1.8e-5))
    >>> [round(float(np.exp(p)), 6) for p in v.ln_phi(0.5, 400.0, 1e5)]
    [0.548584, 1.150472]
    """

    A: tuple[float, float]
    B: tuple[float, float]  # K
    liquid_volume_m3_per_mol: tuple[float, float]
    name: str = "associating"

    def constants(self, T_K: ArrayLike) -> tuple[FloatArray, FloatArray, FloatArray]:
        """``K11, K22, K12`` in 1/Pa at ``T_K``."""
        T = np.asarray(T_K, dtype=float)
        k11 = 10.0 ** (self.A[0] + self.B[0] / T)
        k22 = 10.0 ** (self.A[1] + self.B[1] / T)
        return k11, k22, 2.0 * np.sqrt(k11 * k22)

    def ln_phi(self, y1: ArrayLike, T_K: ArrayLike, P_Pa: ArrayLike
               ) -> tuple[FloatArray, FloatArray]:
        y = np.asarray(y1, dtype=float)
        if not (np.isfinite(self.A[0]) and np.isfinite(self.A[1])):
            return self._ln_phi_with_inert(y, T_K, P_Pa)
        k11, k22, k12 = self.constants(T_K)
        a, b = dimer_monomer_fractions(y, P_Pa, k11, k22, k12)
        with np.errstate(divide="ignore", invalid="ignore"):
            # At y_i = 0 the limit z_Mi / y_i is the infinite-dilution value.
            eps = 1e-9
            a_dilute, _ = dimer_monomer_fractions(np.full_like(a, eps), P_Pa, k11, k22, k12)
            _, b_dilute = dimer_monomer_fractions(np.full_like(a, 1.0 - eps), P_Pa, k11, k22,
                                                  k12)
            phi1 = np.where(y > 0.0, a / y, a_dilute / eps)
            phi2 = np.where(y < 1.0, b / (1.0 - y), b_dilute / eps)
        return np.log(phi1), np.log(phi2)

    def _ln_phi_with_inert(self, y1: FloatArray, T_K: ArrayLike, P_Pa: ArrayLike
                           ) -> tuple[FloatArray, FloatArray]:
        """One component dimerises, the other does not: closed forms.

        With the acid as component 1 and ``κ = K11 P``: ``φ1 = z_M1 / y1 =
        2 / (1 + [1 + 4 κ (2 - y1) y1]^½)`` (from :func:`_acid_with_inert`) and,
        since ``1 - y1 = z_M2 / (1 + z_D11)``, ``φ2 = z_M2 / y2 = 1 + κ z_M1²``;
        both finite at infinite dilution (``φ1 → 1`` as ``y1 → 0``).  The same
        values as the general route of :meth:`ln_phi` (the test suite compares).
        """
        acid = 0 if np.isfinite(self.A[0]) else 1
        y = np.clip(y1 if acid == 0 else 1.0 - y1, 0.0, 1.0)
        kp = 10.0 ** (self.A[acid] + self.B[acid] / np.asarray(T_K, dtype=float)) \
            * np.asarray(P_Pa, dtype=float)
        phi_acid = 2.0 / (1.0 + np.sqrt(1.0 + 4.0 * kp * (2.0 - y) * y))
        a = phi_acid * y
        ln_acid, ln_inert = np.log(phi_acid), np.log1p(kp * a * a)
        return (ln_acid, ln_inert) if acid == 0 else (ln_inert, ln_acid)

    def ln_liquid_reference(self, T_K: ArrayLike, P_Pa: ArrayLike, psat1_Pa: ArrayLike,
                            psat2_Pa: ArrayLike) -> tuple[FloatArray, FloatArray]:
        T = np.asarray(T_K, dtype=float)
        P = np.asarray(P_Pa, dtype=float)
        RT = GAS_CONSTANT_J_PER_MOL_K * T
        k11, k22, _ = self.constants(T)
        out = []
        for K, psat, V in ((k11, psat1_Pa, self.liquid_volume_m3_per_mol[0]),
                           (k22, psat2_Pa, self.liquid_volume_m3_per_mol[1])):
            ps = np.asarray(psat, dtype=float)
            out.append(np.log(pure_monomer_fraction(K, ps)) + V * (P - ps) / RT)
        return out[0], out[1]

    def swapped(self) -> DimerisingVapour:
        return DimerisingVapour(self.A[::-1], self.B[::-1], self.liquid_volume_m3_per_mol[::-1],
                                self.name)
