"""Vapour-phase models of the γ–φ treatment: what corrects Raoult's law for a real vapour.

In the γ–φ treatment the equilibrium ratio of component i is [1, ch. 10]

``K_i = y_i / x_i = γ_i P_i^sat φ_i^sat exp(V_i^L (P - P_i^sat) / RT) / (φ_i P)``

with ``φ_i`` the fugacity coefficient of i in the vapour mixture at (y, T, P),
``φ_i^sat`` that of the pure saturated vapour at ``P_i^sat`` and the
exponential the Poynting factor of the liquid (molar volume ``V_i^L``, taken
as constant).  A vapour model supplies ``ln φ_i`` and the pure-liquid terms;
:func:`ln_correction` combines them into ``ln c_i`` with
``K_i = γ_i P_i^sat c_i / P``.

* :class:`IdealGas`: ``c_i = 1`` (the modified Raoult's law, no Poynting factor).
* :class:`VirialVapour`: second virial coefficients by Tsonopoulos
  (:mod:`builder.thermo.virial`), the Poynting factor with the catalogue's
  liquid molar volume.
* :class:`builder.thermo.association.DimerisingVapour`: the chemical theory of
  dimerising carboxylic acids.

References
----------
[1] J. M. Prausnitz, R. N. Lichtenthaler, E. G. de Azevedo, Molecular Thermodynamics
    of Fluid-Phase Equilibria, 3rd ed., Prentice Hall, 1999.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, field
from typing import Protocol

import numpy as np
from numpy.typing import ArrayLike, NDArray

from builder.thermo import virial
from builder.thermo.units import GAS_CONSTANT_J_PER_MOL_K

__all__ = [
    "IDEAL_GAS",
    "IdealGas",
    "VapourModel",
    "VirialComponent",
    "VirialVapour",
    "correction_at",
    "ln_correction",
]

FloatArray = NDArray[np.float64]
Pair = tuple[FloatArray, FloatArray]


class VapourModel(Protocol):
    """What the γ–φ solvers need from a vapour model."""

    @property
    def name(self) -> str:
        """Short id shown on pages and in JSON: ``ideal-gas``, ``virial``, ``peng-robinson``."""
        ...

    def ln_phi(self, y1: ArrayLike, T_K: ArrayLike, P_Pa: ArrayLike) -> Pair:
        """``ln φ_i`` of the two components in a vapour of ``y1`` at ``T_K``, ``P_Pa``."""
        ...

    def ln_liquid_reference(self, T_K: ArrayLike, P_Pa: ArrayLike, psat1_Pa: ArrayLike,
                            psat2_Pa: ArrayLike) -> Pair:
        """``ln φ_i^sat + V_i^L (P - P_i^sat)/RT``: the pure liquid's fugacity terms."""
        ...

    def swapped(self) -> VapourModel:
        """The same model with components 1 and 2 exchanged."""
        ...


@dataclass(frozen=True)
class IdealGas:
    """The ideal-gas vapour of the modified Raoult's law: ``φ_i = φ_i^sat = 1``, no Poynting.

    >>> [float(v) for v in IDEAL_GAS.ln_phi(0.3, 350.0, 1e5)]
    [0.0, 0.0]
    """

    name: str = "ideal-gas"

    def ln_phi(self, y1: ArrayLike, T_K: ArrayLike, P_Pa: ArrayLike) -> Pair:
        zero = np.zeros(np.broadcast(np.asarray(y1), np.asarray(T_K), np.asarray(P_Pa)).shape)
        return zero, zero.copy()

    def ln_liquid_reference(self, T_K: ArrayLike, P_Pa: ArrayLike, psat1_Pa: ArrayLike,
                            psat2_Pa: ArrayLike) -> Pair:
        zero = np.zeros(np.broadcast(np.asarray(T_K), np.asarray(P_Pa)).shape)
        return zero, zero.copy()

    def swapped(self) -> IdealGas:
        return self


#: The one ideal-gas vapour model.
IDEAL_GAS = IdealGas()


@dataclass(frozen=True)
class VirialComponent:
    """A component's constants for its second virial coefficient (SI)."""

    Tc_K: float
    Pc_Pa: float
    Vc_m3_per_mol: float
    omega: float
    a: float  # Tsonopoulos polar parameter
    b: float  # Tsonopoulos hydrogen-bonding parameter
    liquid_volume_m3_per_mol: float  # for the Poynting factor

    def B(self, T_K: ArrayLike) -> FloatArray:
        """Second virial coefficient of the pure gas, m³/mol."""
        return virial.second_virial_tsonopoulos(T_K, self.Tc_K, self.Pc_Pa, self.omega,
                                                self.a, self.b)


@dataclass(frozen=True)
class VirialVapour:
    """A binary vapour by the second virial coefficient (Tsonopoulos), with Poynting factors.

    The cross coefficient uses :func:`builder.thermo.virial.cross_constants`
    with ``kij`` (None: the critical-volume estimate); its polar terms are
    ``a_12 = (a_1 + a_2)/2``, ``b_12 = (b_1 + b_2)/2`` when both components
    have polar terms and zero otherwise [Tsonopoulos 1974].

    Propane and n-butane at 330 K and 1 MPa, equimolar vapour:

    >>> c3 = VirialComponent(369.83, 4.248e6, 2.0e-4, 0.152, 0.0, 0.0, 8.98e-5)
    >>> c4 = VirialComponent(425.12, 3.796e6, 2.55e-4, 0.200, 0.0, 0.0, 1.0e-4)
    >>> [round(float(v), 4) for v in VirialVapour(c3, c4).ln_phi(0.5, 330.0, 1e6)]
    [-0.1118, -0.2036]
    """

    component1: VirialComponent
    component2: VirialComponent
    kij: float | None = None
    name: str = "virial"
    #: The correlation's constants of B11, B22 and B12 (in that order), so that one
    #: evaluation gives all three (the solvers ask for them at every trial temperature),
    #: flat and as columns for a 1-D array of temperatures.
    _constants: virial.TsonopoulosConstants = field(init=False, repr=False, compare=False)
    _columns: virial.TsonopoulosConstants = field(init=False, repr=False, compare=False)

    def __post_init__(self) -> None:
        c1, c2 = self.component1, self.component2
        Tc, Pc, omega = virial.cross_constants((c1.Tc_K, c2.Tc_K), (c1.Pc_Pa, c2.Pc_Pa),
                                               (c1.Vc_m3_per_mol, c2.Vc_m3_per_mol),
                                               (c1.omega, c2.omega), self.kij)
        both_polar = (c1.a or c1.b) and (c2.a or c2.b)
        a12 = 0.5 * (c1.a + c2.a) if both_polar else 0.0
        b12 = 0.5 * (c1.b + c2.b) if both_polar else 0.0
        constants = virial.tsonopoulos_constants(
            [c1.Tc_K, c2.Tc_K, Tc], [c1.Pc_Pa, c2.Pc_Pa, Pc], [c1.omega, c2.omega, omega],
            [c1.a, c2.a, a12], [c1.b, c2.b, b12])
        object.__setattr__(self, "_constants", constants)
        object.__setattr__(self, "_columns", constants.for_ndim(1))

    def coefficients(self, T_K: ArrayLike) -> tuple[FloatArray, FloatArray, FloatArray]:
        """``B11, B22, B12`` in m³/mol at ``T_K`` (one evaluation of the correlation)."""
        T = np.asarray(T_K, dtype=float)
        constants = self._columns if T.ndim == 1 else self._constants.for_ndim(T.ndim)
        B = virial.second_virial_from_constants(T, constants)
        return B[0], B[1], B[2]

    def ln_phi(self, y1: ArrayLike, T_K: ArrayLike, P_Pa: ArrayLike) -> Pair:
        B11, B22, B12 = self.coefficients(T_K)
        return virial.virial_ln_phi(y1, T_K, P_Pa, B11, B22, B12)

    def ln_liquid_reference(self, T_K: ArrayLike, P_Pa: ArrayLike, psat1_Pa: ArrayLike,
                            psat2_Pa: ArrayLike) -> Pair:
        T = np.asarray(T_K, dtype=float)
        P = np.asarray(P_Pa, dtype=float)
        RT = GAS_CONSTANT_J_PER_MOL_K * T
        out = []
        for component, psat in ((self.component1, psat1_Pa), (self.component2, psat2_Pa)):
            ps = np.asarray(psat, dtype=float)
            out.append((component.B(T) * ps + component.liquid_volume_m3_per_mol * (P - ps)) / RT)
        return out[0], out[1]

    def correction_terms(self, T_K: ArrayLike, P_Pa: ArrayLike, psat1_Pa: ArrayLike,
                         psat2_Pa: ArrayLike) -> tuple[FloatArray, FloatArray, FloatArray]:
        """``(a1, a2, s)`` of ``ln c1 = a1 - s y2²``, ``ln c2 = a2 - s y1²`` at (T, P).

        ``a_i = (B_ii P_i^sat + V_i^L (P - P_i^sat))/RT - B_ii P/RT`` (the pure liquid's
        terms less the part of ``ln φ_i`` that does not depend on y) and
        ``s = P δ12 / RT``, ``δ12 = 2 B12 - B11 - B22`` [1, eq. 5-34].

        Propane and n-butane at 330 K and 1 MPa (saturation pressures 1.7 and 0.6 MPa);
        at ``y1 = 0.5`` these give :func:`ln_correction`'s -0.107775 and 0.093676:

        >>> c3 = VirialComponent(369.83, 4.248e6, 2.0e-4, 0.152, 0.0, 0.0, 8.98e-5)
        >>> c4 = VirialComponent(425.12, 3.796e6, 2.55e-4, 0.200, 0.0, 0.0, 1.0e-4)
        >>> terms = VirialVapour(c3, c4).correction_terms(330.0, 1e6, 1.7e6, 0.6e6)
        >>> [round(float(v), 6) for v in terms]
        [-0.103884, 0.097567, 0.015563]
        """
        B11, B22, B12 = self.coefficients(T_K)
        T = np.asarray(T_K, dtype=float)
        P = np.asarray(P_Pa, dtype=float)
        RT = GAS_CONSTANT_J_PER_MOL_K * T
        scale = P / RT
        ps1, ps2 = np.asarray(psat1_Pa, dtype=float), np.asarray(psat2_Pa, dtype=float)
        V1 = self.component1.liquid_volume_m3_per_mol
        V2 = self.component2.liquid_volume_m3_per_mol
        a1 = (B11 * ps1 + V1 * (P - ps1)) / RT - scale * B11
        a2 = (B22 * ps2 + V2 * (P - ps2)) / RT - scale * B22
        return a1, a2, scale * (2.0 * B12 - B11 - B22)

    def swapped(self) -> VirialVapour:
        return VirialVapour(self.component2, self.component1, self.kij, self.name)


def correction_at(vapour: VapourModel, T_K: ArrayLike, P_Pa: ArrayLike, psat1_Pa: ArrayLike,
                  psat2_Pa: ArrayLike) -> Callable[[ArrayLike], Pair]:
    """:func:`ln_correction` at fixed (T, P) as a function of ``y1`` alone, with everything
    that does not depend on ``y1`` (the liquid terms, the virial coefficients) done once.

    >>> f = correction_at(IDEAL_GAS, 300.0, 1e5, 5e4, 2e4)
    >>> [float(v) for v in f(0.5)]
    [0.0, 0.0]
    """
    if isinstance(vapour, VirialVapour):
        a1, a2, sd = vapour.correction_terms(T_K, P_Pa, psat1_Pa, psat2_Pa)

        def virial_correction(y1: ArrayLike) -> Pair:
            y = np.asarray(y1, dtype=float)
            return a1 - sd * (1.0 - y) ** 2, a2 - sd * y * y

        return virial_correction

    ref1, ref2 = vapour.ln_liquid_reference(T_K, P_Pa, psat1_Pa, psat2_Pa)

    def general(y1: ArrayLike) -> Pair:
        phi1, phi2 = vapour.ln_phi(y1, T_K, P_Pa)
        return ref1 - phi1, ref2 - phi2

    return general


def ln_correction(vapour: VapourModel, y1: ArrayLike, T_K: ArrayLike, P_Pa: ArrayLike,
                  psat1_Pa: ArrayLike, psat2_Pa: ArrayLike) -> Pair:
    """``ln c_i = ln φ_i^sat + V_i^L (P - P_i^sat)/RT - ln φ_i``, so ``K_i = γ_i P_i^sat c_i / P``.

    >>> [float(v) for v in ln_correction(IDEAL_GAS, 0.5, 300.0, 1e5, 5e4, 2e4)]
    [0.0, 0.0]
    """
    if isinstance(vapour, VirialVapour):
        # The pure liquids' terms and ln φ from one evaluation of B11, B22 and B12 (the same
        # numbers as VirialComponent.B, element by element).
        B11, B22, B12 = vapour.coefficients(T_K)
        T = np.asarray(T_K, dtype=float)
        P = np.asarray(P_Pa, dtype=float)
        RT = GAS_CONSTANT_J_PER_MOL_K * T
        ps1, ps2 = np.asarray(psat1_Pa, dtype=float), np.asarray(psat2_Pa, dtype=float)
        ref1 = (B11 * ps1 + vapour.component1.liquid_volume_m3_per_mol * (P - ps1)) / RT
        ref2 = (B22 * ps2 + vapour.component2.liquid_volume_m3_per_mol * (P - ps2)) / RT
        phi1, phi2 = virial.virial_ln_phi(y1, T_K, P_Pa, B11, B22, B12)
        return ref1 - phi1, ref2 - phi2
    ref1, ref2 = vapour.ln_liquid_reference(T_K, P_Pa, psat1_Pa, psat2_Pa)
    phi1, phi2 = vapour.ln_phi(y1, T_K, P_Pa)
    return ref1 - phi1, ref2 - phi2
