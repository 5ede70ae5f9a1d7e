"""Second virial coefficients of gases and the virial fugacity coefficients of a binary vapour.

The vapour of a mixture at low to moderate pressure is described by the
virial equation truncated after the second coefficient, in its pressure
form ``Z = 1 + B P / (R T)`` with ``B = Σ_i Σ_j y_i y_j B_ij`` [3].  The
pure coefficients ``B_ii`` come from the corresponding-states correlation of
Tsonopoulos [1] with its polar and hydrogen-bonding terms (updated for the
alkanols by Tsonopoulos and Dymond [2]); the cross coefficient ``B_12`` from
the same correlation with combined critical constants (:func:`cross_constants`).

Validity: the truncated virial equation holds while the density is below
about half the critical density, i.e. roughly ``P < 0.5 P_c T/T_c`` for the
vapour [3, ch. 5]; closer to the critical region a cubic equation of state
(:mod:`builder.thermo.cubic`) is used instead.

References
----------
[1] C. Tsonopoulos, "An empirical correlation of second virial coefficients",
    AIChE J. 20 (1974) 263-272.
[2] C. Tsonopoulos, J. H. Dymond, "Second virial coefficients of normal alkanes,
    linear 1-alkanols (and water), alkyl ethers, and their mixtures", Fluid Phase
    Equilib. 133 (1997) 11-34.
[3] J. M. Prausnitz, R. N. Lichtenthaler, E. G. de Azevedo, Molecular Thermodynamics
    of Fluid-Phase Equilibria, 3rd ed., Prentice Hall, 1999, ch. 5.
[4] R. R. Tarakad, R. P. Danner, "An improved corresponding states method for polar
    fluids: correlation of second virial coefficients", AIChE J. 23 (1977) 685-695.
"""

from __future__ import annotations

from dataclasses import dataclass, fields

import numpy as np
from numpy.typing import ArrayLike, NDArray

from builder.thermo.units import GAS_CONSTANT_J_PER_MOL_K

__all__ = [
    "TSONOPOULOS_CLASSES",
    "TsonopoulosConstants",
    "cross_constants",
    "reduced_dipole",
    "second_virial_from_constants",
    "second_virial_tsonopoulos",
    "tsonopoulos_constants",
    "tsonopoulos_polar_parameters",
    "virial_ln_phi",
]

FloatArray = NDArray[np.float64]

#: Classes of Tsonopoulos' polar terms [1, 2], with the rule each uses for ``a`` and ``b``.
TSONOPOULOS_CLASSES = {
    "normal": "non-polar or slightly polar: a = b = 0",
    "ketone": "a = -2.14e-4 μr - 4.308e-21 μr^8, b = 0",
    "aldehyde": "a = -2.14e-4 μr - 4.308e-21 μr^8, b = 0",
    "alkyl-nitrile": "a = -2.14e-4 μr - 4.308e-21 μr^8, b = 0",
    "ether": "a = -2.14e-4 μr - 4.308e-21 μr^8, b = 0",
    "ester": "a = -2.14e-4 μr - 4.308e-21 μr^8, b = 0",
    "carboxylic-acid": "a = -2.14e-4 μr - 4.308e-21 μr^8, b = 0 (the physical part; "
                       "dimerisation is treated chemically)",
    "other-polar": "a = -2.14e-4 μr - 4.308e-21 μr^8, b = 0 (the rule of the polar, "
                   "non-hydrogen-bonding classes, applied by analogy; e.g. pyridine)",
    "alkyl-halide": "a = -2.188e-11 μr^4 - 7.831e-21 μr^8, b = 0",
    "alkanol": "a = 0.0878, b = 0.00908 + 0.0006957 μr",
    "methanol": "a = 0.0878, b = 0.0525",
    "water": "a = -0.0109, b = 0",
}

_KETONE_LIKE = ("ketone", "aldehyde", "alkyl-nitrile", "ether", "ester", "carboxylic-acid",
                "other-polar")


def reduced_dipole(dipole_debye: float, Tc_K: float, Pc_Pa: float) -> float:
    """Tsonopoulos' reduced dipole moment ``μr = 10^5 μ² P_c / T_c²`` [1].

    μ in debye, ``P_c`` in atm, ``T_c`` in K (the units of the definition).
    Acetone (μ = 2.9 D, T_c = 508.1 K, P_c = 4.70 MPa) has μr ≈ 151:

    >>> round(reduced_dipole(2.9, 508.1, 4.70e6), 1)
    151.1
    """
    return 1e5 * dipole_debye**2 * (Pc_Pa / 101325.0) / Tc_K**2


def tsonopoulos_polar_parameters(species_class: str, dipole_debye: float, Tc_K: float,
                                 Pc_Pa: float) -> tuple[float, float]:
    """The polar (``a``) and hydrogen-bonding (``b``) parameters of a component [1, 2].

    The rules by class are in :data:`TSONOPOULOS_CLASSES`.  For acetone
    (a ketone, μ = 2.9 D) ``a = -2.14e-4 × 151.1 - 4.308e-21 × 151.1^8 ≈ -0.0335``:

    >>> [round(v, 4) for v in tsonopoulos_polar_parameters("ketone", 2.9, 508.1, 4.70e6)]
    [-0.0335, 0.0]
    >>> tsonopoulos_polar_parameters("water", 1.8, 647.1, 22.06e6)
    (-0.0109, 0.0)
    """
    if species_class not in TSONOPOULOS_CLASSES:
        raise ValueError(f"unknown Tsonopoulos class {species_class!r}; use one of "
                         + ", ".join(TSONOPOULOS_CLASSES))
    if species_class == "normal":
        return 0.0, 0.0
    if species_class == "methanol":
        return 0.0878, 0.0525
    if species_class == "water":
        return -0.0109, 0.0
    mu_r = reduced_dipole(dipole_debye, Tc_K, Pc_Pa)
    if species_class in _KETONE_LIKE:
        return -2.14e-4 * mu_r - 4.308e-21 * mu_r**8, 0.0
    if species_class == "alkyl-halide":
        # 2.188e-11 as printed in [1] and Poling et al. (5th ed., ch. 4) (from memory); the
        # chemicals package (1.5.2) uses 2.188e-4, which makes a of chloroform about -60.
        return -2.188e-11 * mu_r**4 - 7.831e-21 * mu_r**8, 0.0
    return 0.0878, 0.00908 + 0.0006957 * mu_r  # alkanol


def second_virial_tsonopoulos(T_K: ArrayLike, Tc_K: ArrayLike, Pc_Pa: ArrayLike,
                              omega: ArrayLike, a: ArrayLike = 0.0,
                              b: ArrayLike = 0.0) -> FloatArray:
    """Second virial coefficient ``B`` [m³/mol] by the Tsonopoulos correlation [1].

    ``B P_c / (R T_c) = f0(T_r) + ω f1(T_r) + a / T_r^6 - b / T_r^8`` with
    ``f0 = 0.1445 - 0.330/T_r - 0.1385/T_r² - 0.0121/T_r³ - 0.000607/T_r^8`` and
    ``f1 = 0.0637 + 0.331/T_r² - 0.423/T_r³ - 0.008/T_r^8``; ``T_r = T/T_c``.

    Parameters: ``T_K`` temperature [K]; ``Tc_K``, ``Pc_Pa``, ``omega`` the
    critical temperature [K], pressure [Pa] and acentric factor; ``a``, ``b``
    the polar parameters (:func:`tsonopoulos_polar_parameters`).  Fitted to
    data for reduced temperatures of about 0.4 to 4 [1].

    Example: the worked example of Perry's Chemical Engineers' Handbook, 8th
    ed., p. 2-499 (T 430 K, T_c 405.65 K, P_c 11.28 MPa, ω 0.252608, μ 1.469 D
    in the polar non-hydrogen-bonding rule), as reproduced in the chemicals
    package's documentation: B = -9.6797e-5 m³/mol:

    >>> a, b = tsonopoulos_polar_parameters("ketone", 1.469, 405.65, 11.28e6)
    >>> round(float(second_virial_tsonopoulos(430.0, 405.65, 11.28e6, 0.252608, a, b)), 9)
    -9.6797e-05
    """
    return second_virial_from_constants(T_K, tsonopoulos_constants(Tc_K, Pc_Pa, omega, a, b))


@dataclass(frozen=True)
class TsonopoulosConstants:
    """The Tsonopoulos correlation of one or more gases arranged as a polynomial in
    ``r = 1/T_r``: ``B = scale (c0 + c1 r + c2 r² + c3 r³ + a r⁶ - c8 r⁸)`` with
    ``c0 = 0.1445 + 0.0637 ω``, ``c2 = -0.1385 + 0.331 ω``, ``c3 = -0.0121 - 0.423 ω``,
    ``c8 = 0.000607 + 0.008 ω + b`` and ``scale = R T_c / P_c`` [m³/mol] (the equation
    of :func:`second_virial_tsonopoulos`, its terms gathered once so that each evaluation
    costs a few array operations; the solvers evaluate B at every trial temperature)."""

    Tc_K: FloatArray
    scale_m3_per_mol: FloatArray
    c0: FloatArray
    c2: FloatArray
    c3: FloatArray
    a: FloatArray
    c8: FloatArray

    def for_ndim(self, ndim: int) -> TsonopoulosConstants:
        """The same constants of k gases shaped (k, 1, ...), to broadcast against an array
        of temperatures of ``ndim`` dimensions (the result then has k rows)."""
        shape = (-1,) + (1,) * ndim
        return TsonopoulosConstants(*(np.reshape(getattr(self, f.name), shape)
                                      for f in fields(self)))


def tsonopoulos_constants(Tc_K: ArrayLike, Pc_Pa: ArrayLike, omega: ArrayLike,
                          a: ArrayLike = 0.0, b: ArrayLike = 0.0) -> TsonopoulosConstants:
    """:class:`TsonopoulosConstants` of gases (arguments as :func:`second_virial_tsonopoulos`)."""
    Tc, Pc, w, a_, b_ = (np.asarray(v, dtype=float) for v in (Tc_K, Pc_Pa, omega, a, b))
    return TsonopoulosConstants(
        Tc_K=Tc, scale_m3_per_mol=GAS_CONSTANT_J_PER_MOL_K * Tc / Pc,
        c0=0.1445 + 0.0637 * w, c2=-0.1385 + 0.331 * w, c3=-0.0121 - 0.423 * w, a=a_,
        c8=0.000607 + 0.008 * w + b_)


def second_virial_from_constants(T_K: ArrayLike, constants: TsonopoulosConstants
                                 ) -> FloatArray:
    """``B`` [m³/mol] at ``T_K`` [K] from :func:`tsonopoulos_constants` (broadcast).

    n-Butane (T_c 425.12 K, P_c 3.796 MPa, ω 0.200) at 300 K, as
    :func:`second_virial_tsonopoulos`:

    >>> k = tsonopoulos_constants(425.12, 3.796e6, 0.200)
    >>> round(float(second_virial_from_constants(300.0, k)) * 1e6, 3)
    -713.847
    """
    k = constants
    r = k.Tc_K / np.asarray(T_K, dtype=float)  # 1/T_r
    r2 = r * r
    r6 = r2 * r2 * r2
    reduced = k.c0 + r * (-0.33 + r * (k.c2 + r * k.c3)) + r6 * (k.a - r2 * k.c8)
    return np.asarray(k.scale_m3_per_mol * reduced, dtype=float)


def cross_constants(Tc_K: tuple[float, float], Pc_Pa: tuple[float, float],
                    Vc_m3_per_mol: tuple[float, float], omega: tuple[float, float],
                    kij: float | None = None) -> tuple[float, float, float]:
    """Combined critical constants ``(T_c12, P_c12, ω_12)`` for the cross coefficient.

    ``T_c12 = (T_c1 T_c2)^½ (1 - k_12)``,
    ``P_c12 = 4 T_c12 (P_c1 V_c1/T_c1 + P_c2 V_c2/T_c2) / (V_c1^⅓ + V_c2^⅓)³``,
    ``ω_12 = (ω_1 + ω_2)/2`` [1, 4].  Without a fitted ``k_12`` the estimate
    from the critical volumes ``k_12 = 1 - 8 (V_c1 V_c2)^½ / (V_c1^⅓ + V_c2^⅓)³``
    is used [4].  ``B_12`` is then :func:`second_virial_tsonopoulos` at these
    constants with ``a_12 = b_12 = 0`` unless both components are polar [1].

    Propane and n-butane:

    >>> Tc, Pc, w = cross_constants((369.83, 425.12), (4.248e6, 3.796e6), (2.0e-4, 2.55e-4),
    ...                             (0.152, 0.2))
    >>> round(Tc, 2), round(Pc / 1e6, 4), w
    (395.54, 3.996, 0.176)
    """
    Vc1, Vc2 = Vc_m3_per_mol
    cube = (Vc1 ** (1.0 / 3.0) + Vc2 ** (1.0 / 3.0)) ** 3
    if kij is None:
        kij = 1.0 - 8.0 * np.sqrt(Vc1 * Vc2) / cube
    Tc12 = float(np.sqrt(Tc_K[0] * Tc_K[1]) * (1.0 - kij))
    Pc12 = 4.0 * Tc12 * (Pc_Pa[0] * Vc1 / Tc_K[0] + Pc_Pa[1] * Vc2 / Tc_K[1]) / cube
    return Tc12, float(Pc12), 0.5 * (omega[0] + omega[1])


def virial_ln_phi(y1: ArrayLike, T_K: ArrayLike, P_Pa: ArrayLike, B11: ArrayLike,
                  B22: ArrayLike, B12: ArrayLike) -> tuple[FloatArray, FloatArray]:
    """Vapour fugacity coefficients of a binary by the pressure-explicit virial equation.

    ``ln φ1 = P (B11 + y2² δ12) / (R T)``, ``ln φ2 = P (B22 + y1² δ12) / (R T)``,
    ``δ12 = 2 B12 - B11 - B22`` [3, eq. 5-34]; B in m³/mol, P in Pa, T in K.
    A pure component (``y1 = 1``) has ``ln φ1 = B11 P / (R T)``:

    >>> [round(float(v), 6) for v in virial_ln_phi(1.0, 300.0, 1e5, -1e-3, -2e-3, -1.2e-3)]
    [-0.040091, -0.056127]
    """
    y = np.asarray(y1, dtype=float)
    scale = np.asarray(P_Pa, dtype=float) / (GAS_CONSTANT_J_PER_MOL_K * np.asarray(T_K))
    B11, B22, B12 = (np.asarray(v, dtype=float) for v in (B11, B22, B12))
    delta = 2.0 * B12 - B11 - B22
    return scale * (B11 + (1.0 - y) ** 2 * delta), scale * (B22 + y**2 * delta)
