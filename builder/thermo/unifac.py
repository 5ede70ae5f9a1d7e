"""Group-contribution activity models: original UNIFAC and modified UNIFAC (Dortmund).

A molecule is cut into subgroups ``k`` (counts ``ν_k^(i)``), each with a volume
``R_k`` and a surface area ``Q_k`` (dimensionless), and each belonging to a main
group; main groups ``m, n`` interact through ``Ψ_mn``.  For a binary mixture:

``ln γi = ln γi^C + ln γi^R``.

Combinatorial part, with ``ri = Σ_k ν_k^(i) R_k``, ``qi = Σ_k ν_k^(i) Q_k``,
``Vi = ri / Σ_j xj rj``, ``Fi = qi / Σ_j xj qj``:

* original UNIFAC [1]: ``ln γi^C = 1 - Vi + ln Vi - 5 qi (1 - Vi/Fi + ln(Vi/Fi))``;
* modified UNIFAC (Dortmund) [3]: the same with ``Vi' = ri^(3/4) / Σ_j xj rj^(3/4)``
  in the first three terms: ``1 - Vi' + ln Vi' - 5 qi (1 - Vi/Fi + ln(Vi/Fi))``.

Residual part: ``ln γi^R = Σ_k ν_k^(i) (ln Γ_k - ln Γ_k^(i))``, with

``ln Γ_k = Q_k [1 - ln(Σ_m Θ_m Ψ_mk) - Σ_m Θ_m Ψ_km / Σ_n Θ_n Ψ_nm]``,

``Θ_m = Q_m X_m / Σ_n Q_n X_n`` (``X_m`` the group mole fraction), and
``ln Γ_k^(i)`` the same in pure component ``i``.  Interaction:

* original UNIFAC: ``Ψ_mn = exp(-a_mn / T)``, ``a_mn`` in K [1, 2];
* modified UNIFAC (Dortmund): ``Ψ_mn = exp(-(a_mn + b_mn T + c_mn T²) / T)``,
  ``a_mn`` in K, ``b_mn`` dimensionless, ``c_mn`` in 1/K [3, 4].

T in K.  Validity: UNIFAC is a screening estimate; the parameters were fitted to VLE
data mostly between about 275 and 425 K, and original UNIFAC is poor for infinite
dilution and liquid-liquid splits.  A pair of main groups without a published
parameter cannot be predicted: :class:`MissingInteraction` is raised, never a zero.

References
----------
[1] Aa. Fredenslund, R. L. Jones, J. M. Prausnitz, AIChE J. 21 (1975) 1086-1099.
[2] H. K. Hansen, P. Rasmussen, Aa. Fredenslund, M. Schiller, J. Gmehling,
    Ind. Eng. Chem. Res. 30 (1991) 2352-2355 (revised parameter tables).
[3] U. Weidlich, J. Gmehling, Ind. Eng. Chem. Res. 26 (1987) 1372-1381.
[4] J. Gmehling, J. Li, M. Schiller, Ind. Eng. Chem. Res. 32 (1993) 178-193.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field

import numpy as np
from numpy.typing import ArrayLike, NDArray

from builder.errors import AtlasError

__all__ = ["UNIFAC", "VARIANT_NAMES", "MissingInteraction", "unifac_ln_gamma"]

FloatArray = NDArray[np.float64]
LnGamma = tuple[FloatArray, FloatArray]

#: Display names of the two variants.
VARIANT_NAMES = {"unifac": "UNIFAC", "dortmund": "modified UNIFAC (Dortmund)"}

#: Lattice coordination number z/2 = 5 in the combinatorial part (as in [1]).
HALF_Z = 5.0


class MissingInteraction(AtlasError, ValueError):
    """No published interaction parameter for a pair of main groups."""

    def __init__(self, variant: str, pairs: list[tuple[str, str]]):
        self.variant = variant
        self.pairs = pairs
        names = ", ".join(f"{a}–{b}" for a, b in pairs)
        super().__init__(f"cannot predict this pair: no parameters for main groups {names} "
                         f"in {VARIANT_NAMES.get(variant, variant)}")


def unifac_ln_gamma(x1: ArrayLike, T_K: ArrayLike, nu: ArrayLike, R: ArrayLike, Q: ArrayLike,
                    a: ArrayLike, b: ArrayLike, c: ArrayLike, dortmund: bool) -> LnGamma:
    """``(ln γ1, ln γ2)`` of a binary mixture by UNIFAC; see the module text for equations.

    ``x1`` and ``T_K`` [K] broadcast together; ``nu`` is the (2, k) array of subgroup
    counts, ``R`` and ``Q`` the k subgroup volumes and areas, ``a`` [K], ``b`` [-] and
    ``c`` [1/K] the (k, k) interaction coefficients between the subgroups' main groups
    (zero within a main group); ``dortmund`` selects the modified combinatorial part.

    Ethanol (CH3, CH2, OH) with water (H2O) at 340 K, x1 = 0.3, original UNIFAC with
    the parameters of [2]; the ``thermo`` package gives 0.506051, 0.203032:

    >>> nu = [[1, 1, 1, 0], [0, 0, 0, 1]]
    >>> R, Q = [0.9011, 0.6744, 1.0, 0.92], [0.848, 0.540, 1.2, 1.4]
    >>> a = [[0, 0, 986.5, 1318.0], [0, 0, 986.5, 1318.0],
    ...      [156.4, 156.4, 0, 353.5], [300.0, 300.0, -229.1, 0]]
    >>> z = np.zeros((4, 4))
    >>> [round(float(v), 6) for v in unifac_ln_gamma(0.3, 340.0, nu, R, Q, a, z, z, False)]
    [0.506051, 0.203032]
    """
    return _Prepared.of(nu, R, Q, a, b, c, dortmund).ln_gamma(x1, T_K)


def _interaction_classes(a: FloatArray, b: FloatArray, c: FloatArray) -> list[list[int]]:
    """Subgroups that interact identically, in order of first appearance.

    Two subgroups of one main group have the same ``Ψ`` row and column and ``Ψ = 1``
    between them, so the residual part depends only on their summed area fraction;
    computing it per class rather than per subgroup gives the same numbers with
    fewer exponentials.
    """
    k = a.shape[0]
    params = np.stack([a, b, c])                                       # (3, k, k)
    classes: list[list[int]] = []
    for i in range(k):
        for members in classes:
            j = members[0]
            if (np.array_equal(params[:, i, :], params[:, j, :])
                    and np.array_equal(params[:, :, i], params[:, :, j])
                    and not params[:, i, j].any() and not params[:, j, i].any()):
                members.append(i)
                break
        else:
            classes.append([i])
    return classes


@dataclass(frozen=True, eq=False)
class _Prepared:
    """The composition- and temperature-independent parts of :func:`unifac_ln_gamma`.

    Computed once per model, so that one evaluation is a handful of array operations
    (the solvers call it thousands of times with small arrays).  The residual part is
    carried per interaction class M (the subgroups of one main group, see
    :func:`_interaction_classes`): ``ln γi^R = Σ_M (Σ_(k in M) ν_k^(i) Q_k)(G_M - G_M^(i))``
    with ``ln Γ_k = Q_k G_M`` for k in M.
    """

    r: FloatArray            # (2,) ri
    q: FloatArray            # (2,) qi
    r34: FloatArray          # (2,) ri^(3/4) (Dortmund) or ri (original)
    nuQ: FloatArray          # (2, M) Σ_(k in M) ν_k^(i) Q_k
    theta_pure: FloatArray   # (2, M) Θ_M in pure i
    a: FloatArray            # (M, M)
    b: FloatArray | None     # (M, M), None when zero
    c: FloatArray | None

    @classmethod
    def of(cls, nu: ArrayLike, R: ArrayLike, Q: ArrayLike, a: ArrayLike, b: ArrayLike,
           c: ArrayLike, dortmund: bool) -> _Prepared:
        nu_a = np.asarray(nu, dtype=float)
        R_a, Q_a = np.asarray(R, dtype=float), np.asarray(Q, dtype=float)
        a_a = np.asarray(a, dtype=float)
        b_a, c_a = np.asarray(b, dtype=float), np.asarray(c, dtype=float)
        r, q = nu_a @ R_a, nu_a @ Q_a
        classes = _interaction_classes(a_a, b_a, c_a)
        first = [members[0] for members in classes]
        nuQ = np.stack([(nu_a * Q_a)[:, members].sum(axis=1) for members in classes], axis=1)
        pick = np.ix_(first, first)
        return cls(r=r, q=q, r34=r**0.75 if dortmund else r, nuQ=nuQ,
                   theta_pure=nuQ / nuQ.sum(axis=1, keepdims=True), a=a_a[pick],
                   b=b_a[pick] if b_a.any() else None, c=c_a[pick] if c_a.any() else None)

    def ln_gamma(self, x1: ArrayLike, T_K: ArrayLike) -> LnGamma:
        """``(ln γ1, ln γ2)`` with ``x1`` and ``T_K`` broadcast together.

        Each part is computed on the shape it depends on and broadcast only at the
        end: the combinatorial part on ``x1``'s shape, ``Ψ`` and the pure-component
        residuals on ``T_K``'s shape, so a grid of compositions against a column of
        temperatures (the tangent-plane test) costs one ``Ψ`` per temperature.
        """
        x1_a, T_a = np.asarray(x1, dtype=float), np.asarray(T_K, dtype=float)
        if x1_a.ndim == 1 and T_a.shape == x1_a.shape and x1_a.size >= _POINTS_LAYOUT:
            return self._points(x1_a, T_a)
        shape = np.broadcast_shapes(x1_a.shape, T_a.shape)
        x1v = x1_a[..., None]                                           # (*Sx, 1)
        x2v = 1.0 - x1v
        # Combinatorial part (last axis: component 1, component 2).
        V = self.r / (x1v * self.r[0] + x2v * self.r[1])                # (*Sx, 2)
        F = self.q / (x1v * self.q[0] + x2v * self.q[1])
        Vp = self.r34 / (x1v * self.r34[0] + x2v * self.r34[1])
        V_F = V / F
        ln_c = 1.0 - Vp + np.log(Vp) - HALF_Z * self.q * (1.0 - V_F + np.log(V_F))
        # Residual part.  Ψ and the pure components depend on T only.
        T = T_a[..., None, None]
        exponent = self.a / T
        if self.b is not None:
            exponent = exponent + self.b
        if self.c is not None:
            exponent = exponent + self.c * T
        psi = np.exp(-exponent)                                         # (*ST, M, M)
        # Pure components: the two Θ rows against every Ψ, (*ST, 2, M).
        pure = np.sum(self.nuQ * _G_rows(self.theta_pure, psi), axis=-1)  # (*ST, 2)
        mix = x1v * self.nuQ[0] + x2v * self.nuQ[1]                     # (*Sx, M)
        G = _G_mixture(mix / mix.sum(axis=-1, keepdims=True), psi)      # (*S, M)
        # G_M of a class absent from i is multiplied by Σ ν Q = 0 (finite: Ψ > 0).
        ln_g1 = ln_c[..., 0] + G @ self.nuQ[0] - pure[..., 0]
        ln_g2 = ln_c[..., 1] + G @ self.nuQ[1] - pure[..., 1]
        return (np.broadcast_to(ln_g1, shape).copy() if ln_g1.shape != shape else ln_g1,
                np.broadcast_to(ln_g2, shape).copy() if ln_g2.shape != shape else ln_g2)


    def _points(self, x1: FloatArray, T: FloatArray) -> LnGamma:
        """:meth:`ln_gamma` of n points, each at its own temperature (1-D ``x1`` and ``T``).

        The same equations with the points as the last axis, ``Ψ`` laid out (M, M, n):
        every operation runs over rows of n numbers instead of n small matrix products
        (about twice as fast for the long arrays of a curve's bubble points).
        """
        x2 = 1.0 - x1
        exponent = self.a[:, :, None] / T
        if self.b is not None:
            exponent = exponent + self.b[:, :, None]
        if self.c is not None:
            exponent = exponent + self.c[:, :, None] * T
        psi = np.exp(-exponent)                                         # psi[N, M, k]
        S = np.tensordot(self.theta_pure, psi, axes=(1, 0))             # (2, M, n)
        inner = np.einsum("rNk,MNk->rMk", self.theta_pure[:, :, None] / S, psi)
        pure = np.einsum("rM,rMk->rk", self.nuQ, 1.0 - np.log(S) - inner)  # (2, n)
        mix = self.nuQ[0][:, None] * x1 + self.nuQ[1][:, None] * x2     # (M, n)
        theta = mix / mix.sum(axis=0)
        S_mix = np.einsum("Nk,NMk->Mk", theta, psi)
        G = 1.0 - np.log(S_mix) - np.einsum("Nk,MNk->Mk", theta / S_mix, psi)
        residual = self.nuQ @ G - pure                                  # (2, n)
        out = []
        for i in (0, 1):
            V = self.r[i] / (x1 * self.r[0] + x2 * self.r[1])
            F = self.q[i] / (x1 * self.q[0] + x2 * self.q[1])
            Vp = self.r34[i] / (x1 * self.r34[0] + x2 * self.r34[1])
            V_F = V / F
            out.append(1.0 - Vp + np.log(Vp) - HALF_Z * self.q[i] * (1.0 - V_F + np.log(V_F))
                       + residual[i])
        return out[0], out[1]


#: Points from which :meth:`_Prepared.ln_gamma` uses the layout with the points last.
_POINTS_LAYOUT = 64


def _G_rows(theta: FloatArray, psi: FloatArray) -> FloatArray:
    """``G_M = 1 - ln(Σ_N Θ_N Ψ_NM) - Σ_N Θ_N Ψ_MN / Σ_L Θ_L Ψ_LN`` for every row of
    ``theta`` (R, M) against every ``Ψ`` of ``psi`` (*B, M, M): (*B, R, M).

    Matrix products with the rows as the matrix dimension (one product per ``Ψ``).
    """
    S = theta @ psi                                                     # Σ_N Θ_N Ψ_NM
    return np.asarray(1.0 - np.log(S) - (theta / S) @ np.swapaxes(psi, -1, -2), dtype=float)


def _G_mixture(theta: FloatArray, psi: FloatArray) -> FloatArray:
    """:func:`_G_rows`'s ``G`` for area fractions ``theta`` (*Sx, M) and ``Ψ`` (*ST, M, M)
    broadcast together: (*S, M).

    Three layouts, by speed: one temperature for every composition (a matrix
    product over all rows), a composition grid against a column of temperatures
    (rows per temperature), and one temperature per composition (element-wise).
    """
    Sx, ST = theta.shape[:-1], psi.shape[:-2]
    M = theta.shape[-1]
    if not ST:
        return _G_rows(theta.reshape(-1, M), psi).reshape(*Sx, M)
    if len(Sx) == len(ST) == 2 and Sx[0] == 1 and ST[1] == 1:
        rows = _G_rows(theta.reshape(-1, M), psi.reshape(ST[0], M, M))  # (N, W, M)
        return rows.reshape(ST[0], Sx[1], M)
    S = np.einsum("...n,...nm->...m", theta, psi)
    inner = np.einsum("...mn,...n->...m", psi, theta / S)
    return np.asarray(1.0 - np.log(S) - inner, dtype=float)


@dataclass(frozen=True, eq=False)
class UNIFAC:
    """A binary mixture by original UNIFAC (``variant="unifac"``) or modified UNIFAC
    (Dortmund) (``variant="dortmund"``), with the subgroups of both components.

    Build it with :meth:`from_groups` from the group tables; ``ln_gamma(x1, T_K)``
    evaluates :func:`unifac_ln_gamma`.
    """

    variant: str
    subgroups: tuple[str, ...]
    nu: FloatArray          # (2, k) counts
    R: FloatArray           # (k,)
    Q: FloatArray           # (k,)
    a: FloatArray           # (k, k) [K]
    b: FloatArray           # (k, k) [-]
    c: FloatArray           # (k, k) [1/K]
    main_group_pairs: tuple[str, ...] = field(default=())
    _prepared: _Prepared = field(init=False, repr=False)

    def __post_init__(self) -> None:
        object.__setattr__(self, "_prepared", _Prepared.of(
            self.nu, self.R, self.Q, self.a, self.b, self.c, self.variant == "dortmund"))

    @property
    def name(self) -> str:
        return VARIANT_NAMES[self.variant]

    def ln_gamma(self, x1: ArrayLike, T_K: ArrayLike) -> LnGamma:
        """``(ln γ1, ln γ2)``; ``x1`` and ``T_K`` [K] broadcast (see :func:`unifac_ln_gamma`)."""
        return self._prepared.ln_gamma(x1, T_K)

    def parameters_text(self) -> dict[str, str]:
        def groups(i: int) -> str:
            counts = zip(self.subgroups, self.nu[i], strict=True)
            return ", ".join(f"{int(n)} {name}" for name, n in counts if n)
        text = {"groups of 1": groups(0), "groups of 2": groups(1)}
        if self.main_group_pairs:
            text["main-group pairs"] = "; ".join(self.main_group_pairs)
        return text

    @classmethod
    def from_groups(cls, variant: str, groups1: Mapping[str, int], groups2: Mapping[str, int],
                    subgroups: Mapping[str, tuple[int, float, float]],
                    interactions: Mapping[tuple[int, int], tuple[float, ...]],
                    main_group_names: Mapping[int, str]) -> UNIFAC:
        """The model of two components given as subgroup name -> count.

        ``subgroups[name] = (main group, R, Q)``; ``interactions[(m, n)]`` is ``(a_mn,)``
        or ``(a_mn, b_mn, c_mn)``.  Raises :class:`MissingInteraction` when a pair of
        the main groups involved has no parameter (either direction), and ``KeyError``
        for an unknown subgroup.
        """
        if variant not in VARIANT_NAMES:
            raise ValueError(f"unknown UNIFAC variant {variant!r}; expected unifac or dortmund")
        names = tuple(dict.fromkeys([*groups1, *groups2]))
        mains = [subgroups[n][0] for n in names]
        missing: list[tuple[str, str]] = []
        used_pairs: list[str] = []
        for m in sorted(set(mains)):
            for n in sorted(set(mains)):
                if m < n:
                    if (m, n) not in interactions or (n, m) not in interactions:
                        missing.append((main_group_names.get(m, str(m)),
                                        main_group_names.get(n, str(n))))
                    else:
                        used_pairs.append(f"{main_group_names.get(m, m)}–"
                                          f"{main_group_names.get(n, n)}")
        if missing:
            raise MissingInteraction(variant, missing)
        k = len(names)
        coefficients = np.zeros((3, k, k))
        for i, mi in enumerate(mains):
            for j, mj in enumerate(mains):
                if mi != mj:
                    values = interactions[(mi, mj)]
                    coefficients[: len(values), i, j] = values
        nu = np.array([[groups1.get(n, 0) for n in names], [groups2.get(n, 0) for n in names]],
                      dtype=float)
        return cls(variant=variant, subgroups=names, nu=nu,
                   R=np.array([subgroups[n][1] for n in names]),
                   Q=np.array([subgroups[n][2] for n in names]),
                   a=coefficients[0], b=coefficients[1], c=coefficients[2],
                   main_group_pairs=tuple(used_pairs))
