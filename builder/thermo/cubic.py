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

from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray

from builder.thermo.units import GAS_CONSTANT_J_PER_MOL_K

__all__ = ["CubicMixture", "pr_ln_phi", "pr_pure_ab", "pr_z_roots"]

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

    Vectorised over points (the eigenvalues of a stack of companion matrices).
    Where one real root exists both are that root.  A pure vapour of
    propane at 300 K and 1 bar (A = 0.01754, B = 0.002258) is nearly ideal:

    >>> zl, zv = pr_z_roots(0.017540, 0.0022580)
    >>> round(float(zv), 4)
    0.9846
    """
    A_arr, B_arr = np.broadcast_arrays(np.asarray(A, dtype=float), np.asarray(B, dtype=float))
    shape = A_arr.shape
    a, b = A_arr.ravel(), B_arr.ravel()
    c2 = -(1.0 - b)
    c1 = a - 3.0 * b**2 - 2.0 * b
    c0 = -(a * b - b**2 - b**3)
    n = a.size
    companion = np.zeros((n, 3, 3))
    companion[:, 0, :] = np.stack([-c2, -c1, -c0], axis=1)
    companion[:, 1, 0] = 1.0
    companion[:, 2, 1] = 1.0
    roots = np.linalg.eigvals(companion) if n else np.zeros((0, 3), dtype=complex)
    real = np.abs(roots.imag) <= 1e-9 * np.maximum(np.abs(roots.real), 1.0)
    valid = real & (roots.real > b[:, None])
    values = roots.real
    liquid = np.where(valid, values, np.inf).min(axis=1)
    vapour = np.where(valid, values, -np.inf).max(axis=1)
    # One Newton polish of each chosen root (eigenvalues are accurate to ~1e-13).
    for z in (liquid, vapour):
        f = ((z + c2) * z + c1) * z + c0
        df = (3.0 * z + 2.0 * c2) * z + c1
        with np.errstate(invalid="ignore", divide="ignore"):
            step = np.where(np.isfinite(z) & (df != 0), f / df, 0.0)
        z -= step
    return liquid.reshape(shape), vapour.reshape(shape)


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
    R = GAS_CONSTANT_J_PER_MOL_K
    a1, b1 = pr_pure_ab(T, Tc_K[0], Pc_Pa[0], omega[0])
    a2, b2 = pr_pure_ab(T, Tc_K[1], Pc_Pa[1], omega[1])
    a12 = np.sqrt(a1 * a2) * (1.0 - kij)
    x2 = 1.0 - x
    a = x * x * a1 + 2.0 * x * x2 * a12 + x2 * x2 * a2
    b = x * b1 + x2 * b2
    A = a * P / (R * T) ** 2
    B = b * P / (R * T)
    z_liquid, z_vapour = pr_z_roots(A, B)
    Z = z_liquid if phase == "liquid" else z_vapour
    log_term = np.log((Z + (1.0 + _SQRT2) * B) / (Z + (1.0 - _SQRT2) * B))
    common = -np.log(Z - B)
    factor = A / (2.0 * _SQRT2 * B)
    out = []
    for bi, sum_a in ((b1, x * a1 + x2 * a12), (b2, x * a12 + x2 * a2)):
        ratio = bi / b
        out.append(ratio * (Z - 1.0) + common - factor * (2.0 * sum_a / a - ratio) * log_term)
    return out[0], out[1], Z


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
