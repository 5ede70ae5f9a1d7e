"""The Peng–Robinson (1976) equation of state for a binary mixture: roots and fugacities.

``P = R T / (V - b) - a(T) / (V (V + b) + b (V - b))`` [1], for a pure fluid
``a = Ω_a R² T_c² α(T) / P_c``, ``b = Ω_b R T_c / P_c`` (Ω_a ≈ 0.45724, Ω_b ≈ 0.07780),
``α = [1 + m (1 - (T/T_c)^½)]²``, ``m = 0.37464 + 1.54226 ω - 0.26992 ω²``.
Mixture (van der Waals one-fluid rules): ``a = Σ_i Σ_j x_i x_j (a_i a_j)^½ (1 - k_ij)``,
``b = Σ_i x_i b_i`` with a binary interaction parameter ``k_12``.  In terms of
``A = a P/(R T)²`` and ``B = b P/(R T)`` the compressibility factor solves

``Z³ - (1 - B) Z² + (A - 3B² - 2B) Z - (A B - B² - B³) = 0``;

the liquid takes the smallest root above B, the vapour the largest.  The
fugacity coefficient of component i in a phase of composition x [1, eq. 16]:

``ln φ_i = (b_i/b)(Z - 1) - ln(Z - B)
- A/(2√2 B) (2 Σ_j x_j a_ij / a - b_i/b) ln[(Z + (1+√2)B)/(Z + (1-√2)B)]``.

Validity: hydrocarbons, light gases and their mixtures over the whole fluid
range, including the critical region (where a γ–φ treatment fails); liquid
densities are poor (not used here).

References
----------
[1] D.-Y. Peng, D. B. Robinson, "A new two-constant equation of state",
    Ind. Eng. Chem. Fundam. 15 (1976) 59-64.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np
from numpy.typing import ArrayLike, NDArray

from builder.thermo.units import GAS_CONSTANT_J_PER_MOL_K

__all__ = ["CubicMixture", "EquationOfStateLiquid", "pr_ln_phi", "pr_ln_phi_phases", "pr_pure_ab",
           "pr_z_roots"]

FloatArray = NDArray[np.float64]
_SQRT2 = float(np.sqrt(2.0))

#: The constants of the critical conditions, exactly; [1] prints them rounded, 0.45724 and
#: 0.07780 (the exact values are those of the thermo package, used here as the reference).
OMEGA_A = 0.45723552892138218938
OMEGA_B = 0.077796073903888455972


def pr_pure_ab(T_K: ArrayLike, Tc_K: float, Pc_Pa: float, omega: float
               ) -> tuple[FloatArray, float]:
    """Peng–Robinson ``a(T)`` [Pa m⁶/mol²] and ``b`` [m³/mol] of a pure fluid [1].

    Propane (T_c 369.83 K, P_c 4.248 MPa, ω 0.152) at 300 K:

    >>> a, b = pr_pure_ab(300.0, 369.83, 4.248e6, 0.152)
    >>> round(float(a), 5), round(b * 1e6, 4)
    (1.14326, 56.3131)
    """
    R = GAS_CONSTANT_J_PER_MOL_K
    m = 0.37464 + 1.54226 * omega - 0.26992 * omega**2
    alpha = (1.0 + m * (1.0 - np.sqrt(np.asarray(T_K, dtype=float) / Tc_K))) ** 2
    return OMEGA_A * R**2 * Tc_K**2 / Pc_Pa * alpha, OMEGA_B * R * Tc_K / Pc_Pa


def pr_z_roots(A: ArrayLike, B: ArrayLike) -> tuple[FloatArray, FloatArray]:
    """Liquid-like (smallest) and vapour-like (largest) real roots above B of the PR cubic.

    Vectorised over points: the roots in closed form (Cardano, or the
    trigonometric form when all three are real), each polished by two Newton
    steps.  Where one real root exists both are that root.  A pure vapour of
    propane at 300 K and 1 bar (A = 0.01754, B = 0.002258) is nearly ideal:

    >>> zl, zv = pr_z_roots(0.017540, 0.0022580)
    >>> round(float(zv), 4)
    0.9846
    """
    A_arr, B_arr = np.broadcast_arrays(np.asarray(A, dtype=float), np.asarray(B, dtype=float))
    shape = A_arr.shape
    liquid, vapour = _z_roots_flat(A_arr.ravel(), B_arr.ravel())
    return liquid.reshape(shape), vapour.reshape(shape)


#: The angles of the three real roots in the trigonometric form, 2πk/3 for k = 0, 1, 2.
_ROOT_ANGLES = np.array([2.0 * np.pi * k / 3.0 for k in range(3)])[:, None]


def _z_roots_flat(a: FloatArray, b: FloatArray) -> tuple[FloatArray, FloatArray]:
    """:func:`pr_z_roots` of flat arrays ``A``, ``B`` (the arithmetic of the public function,
    with the fewest array operations: it runs inside every Newton step of the φ–φ solvers)."""
    c2 = -(1.0 - b)
    c1 = a - 3.0 * b**2 - 2.0 * b
    c0 = -(a * b - b**2 - b**3)
    # Depressed cubic t^3 + p t + q = 0 with Z = t - c2/3.
    shift = -c2 / 3.0
    p = c1 - c2**2 / 3.0
    q = 2.0 * c2**3 / 27.0 - c2 * c1 / 3.0 + c0
    disc = (q / 2.0) ** 2 + (p / 3.0) ** 3
    one = disc > 0
    # Where every point has one real root (or every point three), the other form is not
    # evaluated; each point's arithmetic is the same either way.
    every = bool(one.all())
    none = not every and not one.any()
    with np.errstate(invalid="ignore", divide="ignore"):
        if not none:
            root_d = np.sqrt(np.where(one, disc, 0.0))
            single = np.cbrt(-q / 2.0 + root_d) + np.cbrt(-q / 2.0 - root_d) + shift
        if not every:
            m = 2.0 * np.sqrt(np.where(one, 0.0, -p / 3.0))
            arg = np.minimum(np.maximum(
                np.where(one | (p == 0), 0.0, 3.0 * q / (p * m)), -1.0), 1.0)
            theta = np.arccos(arg) / 3.0
            three = m * np.cos(theta - _ROOT_ANGLES) + shift
        roots = (single[None, :] if every else three if none
                 else np.where(one, single, three))
        for _ in range(2):
            f = ((roots + c2) * roots + c1) * roots + c0
            df = (3.0 * roots + 2.0 * c2) * roots + c1
            roots = roots - np.where(df != 0, f / df, 0.0)
    valid = roots > b
    liquid = np.where(valid, roots, np.inf).min(axis=0)
    vapour = np.where(valid, roots, -np.inf).max(axis=0)
    return liquid, vapour


class _Mixing:
    """The van der Waals one-fluid mixing of Peng–Robinson at given points, and ``ln φ``
    from a compressibility factor: the parts :func:`pr_ln_phi` and
    :func:`pr_ln_phi_phases` share (the same arithmetic, in the same order)."""

    def __init__(self, x: FloatArray, T: FloatArray, P: FloatArray,
                 Tc_K: tuple[float, float], Pc_Pa: tuple[float, float],
                 omega: tuple[float, float], kij: float) -> None:
        R = GAS_CONSTANT_J_PER_MOL_K
        a1, b1 = pr_pure_ab(T, Tc_K[0], Pc_Pa[0], omega[0])
        a2, b2 = pr_pure_ab(T, Tc_K[1], Pc_Pa[1], omega[1])
        a12 = np.sqrt(a1 * a2) * (1.0 - kij)
        x2 = 1.0 - x
        self.a = x * x * a1 + 2.0 * x * x2 * a12 + x2 * x2 * a2
        self.b = x * b1 + x2 * b2
        self.A = self.a * P / (R * T) ** 2
        self.B = self.b * P / (R * T)
        self.terms = ((b1, x * a1 + x2 * a12), (b2, x * a12 + x2 * a2))

    def ln_phi(self, Z: FloatArray) -> tuple[FloatArray, FloatArray, FloatArray]:
        """``ln φ1, ln φ2`` and ``Z`` at the compressibility factor ``Z`` of each point."""
        A, B = self.A, self.B
        log_term = np.log((Z + (1.0 + _SQRT2) * B) / (Z + (1.0 - _SQRT2) * B))
        common = -np.log(Z - B)
        factor = A / (2.0 * _SQRT2 * B)
        out = []
        for bi, sum_a in self.terms:
            ratio = bi / self.b
            out.append(ratio * (Z - 1.0) + common
                       - factor * (2.0 * sum_a / self.a - ratio) * log_term)
        return out[0], out[1], Z


def pr_ln_phi(x1: ArrayLike, T_K: ArrayLike, P_Pa: ArrayLike,
              Tc_K: tuple[float, float], Pc_Pa: tuple[float, float],
              omega: tuple[float, float], kij: float, phase: str
              ) -> tuple[FloatArray, FloatArray, FloatArray]:
    """``ln φ1, ln φ2`` and ``Z`` of a binary phase of composition ``x1`` by Peng–Robinson.

    ``phase`` is ``"liquid"`` (smallest root) or ``"vapour"`` (largest).  An
    equimolar propane/n-butane vapour at 330 K and 1 MPa, k12 = 0.003:

    >>> l1, l2, z = pr_ln_phi(0.5, 330.0, 1e6, (369.83, 425.12), (4.248e6, 3.796e6),
    ...                       (0.152, 0.2), 0.003, "vapour")
    >>> round(float(l1), 4), round(float(l2), 4), round(float(z), 4)
    (-0.1244, -0.2216, 0.8136)
    """
    if phase not in ("liquid", "vapour"):
        raise ValueError(f"phase must be 'liquid' or 'vapour', found {phase!r}")
    x = np.asarray(x1, dtype=float)
    T = np.asarray(T_K, dtype=float)
    P = np.asarray(P_Pa, dtype=float)
    mix = _Mixing(x, T, P, Tc_K, Pc_Pa, omega, kij)
    z_liquid, z_vapour = pr_z_roots(mix.A, mix.B)
    return mix.ln_phi(z_liquid if phase == "liquid" else z_vapour)


def pr_ln_phi_phases(z1: FloatArray, T_K: FloatArray, P_Pa: FloatArray,
                     Tc_K: tuple[float, float], Pc_Pa: tuple[float, float],
                     omega: tuple[float, float], kij: float, vapour: NDArray[np.bool_]
                     ) -> tuple[FloatArray, FloatArray, FloatArray]:
    """:func:`pr_ln_phi` for flat arrays of points, each in its own phase: the vapour root
    where ``vapour`` is True, the liquid root elsewhere.

    The same arithmetic, element by element, as :func:`pr_ln_phi` of each phase, so the
    φ–φ solvers evaluate a liquid and its vapour (and the neighbouring points of a
    finite-difference Jacobian) in one call.  The equimolar propane/n-butane vapour of
    :func:`pr_ln_phi` beside its liquid at the same state:

    >>> l1, l2, z = pr_ln_phi_phases(np.array([0.5, 0.5]), np.array([330.0, 330.0]),
    ...                              np.array([1e6, 1e6]), (369.83, 425.12),
    ...                              (4.248e6, 3.796e6), (0.152, 0.2), 0.003,
    ...                              np.array([False, True]))
    >>> [round(float(v), 4) for v in l1], round(float(z[1]), 4)
    ([0.3982, -0.1244], 0.8136)
    """
    mix = _Mixing(z1, T_K, P_Pa, Tc_K, Pc_Pa, omega, kij)
    z_liquid, z_vapour = _z_roots_flat(mix.A, mix.B)
    return mix.ln_phi(np.where(vapour, z_vapour, z_liquid))


@dataclass(frozen=True)
class CubicMixture:
    """A binary described in both phases by Peng–Robinson (the φ–φ treatment).

    Used as the ``vapour`` of a :class:`builder.thermo.equilibrium.BinarySystem`;
    ``phi_phi`` tells the solvers to take both phases from the equation of state.
    """

    Tc_K: tuple[float, float]
    Pc_Pa: tuple[float, float]
    omega: tuple[float, float]
    kij: float = 0.0
    name: str = "peng-robinson"
    phi_phi: bool = True

    def ln_phi_phase(self, z1: ArrayLike, T_K: ArrayLike, P_Pa: ArrayLike, phase: str
                     ) -> tuple[FloatArray, FloatArray]:
        """``ln φ_i`` in the liquid or vapour of composition ``z1``."""
        l1, l2, _ = pr_ln_phi(z1, T_K, P_Pa, self.Tc_K, self.Pc_Pa, self.omega, self.kij, phase)
        return l1, l2

    def ln_phi(self, y1: ArrayLike, T_K: ArrayLike, P_Pa: ArrayLike
               ) -> tuple[FloatArray, FloatArray]:
        """``ln φ_i`` of the vapour (the vapour-model interface)."""
        return self.ln_phi_phase(y1, T_K, P_Pa, "vapour")

    def ln_liquid_reference(self, T_K: ArrayLike, P_Pa: ArrayLike, psat1_Pa: ArrayLike,
                            psat2_Pa: ArrayLike) -> tuple[FloatArray, FloatArray]:
        raise TypeError("a cubic mixture is φ–φ: the liquid comes from the equation of state")

    def swapped(self) -> CubicMixture:
        return CubicMixture(self.Tc_K[::-1], self.Pc_Pa[::-1], self.omega[::-1], self.kij,
                            self.name, self.phi_phi)


@dataclass(frozen=True)
class EquationOfStateLiquid:
    """The liquid "model" of a φ–φ pair: both phases come from the equation of state.

    It stands where a γ–φ pair has its activity model, so that pages and the
    analysis name the treatment; the φ–φ solvers never use ``ln γ`` (it is
    zero here, and the liquid is taken as one phase, as for the light
    hydrocarbon pairs this treatment is for).

    >>> EquationOfStateLiquid(0.0033).parameters_text()
    {'k12': '0.0033'}
    """

    kij: float
    name: str = field(default="Peng-Robinson", init=False)

    def ln_gamma(self, x1: ArrayLike, T_K: ArrayLike) -> tuple[FloatArray, FloatArray]:
        shape = np.broadcast(np.asarray(x1), np.asarray(T_K)).shape
        return np.zeros(shape), np.zeros(shape)

    def parameters_text(self) -> dict[str, str]:
        return {"k12": f"{self.kij:g}"}
