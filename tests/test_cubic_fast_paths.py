"""The vectorised paths of the Peng–Robinson (φ–φ) solvers against the element-by-element
paths they replace and against outside references.

* ``pr_ln_phi_phases`` (liquid and vapour rows in one evaluation) against ``pr_ln_phi``
  of each phase (the same arithmetic: equal bit for bit) and against thermo's ``PRMIX``;
* the cubic's roots against numpy's polynomial roots (eigenvalues of the companion
  matrix, an independent method);
* the Newton solve of many points at once against the same points solved one at a time,
  and bubble pressures of a whole isotherm against thermo's ``FlashVL`` point by point;
* the critical-point march that solves its next trials together against the march one
  trial at a time (``SPECULATIVE_TRIALS = 1``), against the values the one-at-a-time code
  gave before this change (commit ec94f42, recorded here) and against CoolProp's
  mixture critical points.
"""

from __future__ import annotations

import numpy as np
import pytest

from builder.analysis import curves
from builder.thermo import cubic_equilibrium as ce
from builder.thermo import equilibrium as eq
from builder.thermo.cubic import CubicMixture, pr_ln_phi, pr_ln_phi_phases, pr_z_roots
from tests.references import thermo_pr_flasher

PROPANE_BUTANE = ((369.83, 425.12), (4.248e6, 3.796e6), (0.152, 0.200), 0.0033)


def _states(n: int, seed: int) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Random propane/n-butane states spanning one- and three-root regions."""
    rng = np.random.default_rng(seed)
    return rng.uniform(0.0, 1.0, n), rng.uniform(200.0, 460.0, n), 10 ** rng.uniform(4, 6.8, n)


def test_phases_in_one_call_equal_each_phase_alone() -> None:
    """The same arithmetic element by element: equal to the last bit."""
    z, T, P = _states(400, 1)
    vapour = np.random.default_rng(2).uniform(size=z.size) < 0.5
    l1, l2, Z = pr_ln_phi_phases(z, T, P, *PROPANE_BUTANE, vapour)
    for phase, rows in (("liquid", ~vapour), ("vapour", vapour)):
        r1, r2, rZ = pr_ln_phi(z[rows], T[rows], P[rows], *PROPANE_BUTANE, phase)
        np.testing.assert_array_equal(l1[rows], r1)
        np.testing.assert_array_equal(l2[rows], r2)
        np.testing.assert_array_equal(Z[rows], rZ)


@pytest.mark.parametrize("T_K, P_Pa, z1", [(300.0, 8.0e5, 0.3), (330.0, 1.0e6, 0.5),
                                            (250.0, 1.0e5, 0.2), (360.0, 2.0e6, 0.7)])
def test_phases_in_one_call_against_thermo(T_K: float, P_Pa: float, z1: float) -> None:
    """Reference: thermo.PRMIX (same equation, same Ω_a, Ω_b), liquid and vapour roots of
    states where the cubic has three real roots."""
    from thermo import PRMIX

    Tc, Pc, w, k = PROPANE_BUTANE
    e = PRMIX(T=T_K, P=P_Pa, zs=[z1, 1 - z1], Tcs=list(Tc), Pcs=list(Pc), omegas=list(w),
              kijs=[[0, k], [k, 0]])
    l1, l2, Z = pr_ln_phi_phases(np.full(2, z1), np.full(2, T_K), np.full(2, P_Pa),
                                 *PROPANE_BUTANE, np.array([False, True]))
    for row, (ref, Z_ref) in enumerate(((e.lnphis_l, e.Z_l), (e.lnphis_g, e.Z_g))):
        np.testing.assert_allclose([l1[row], l2[row]], ref, rtol=1e-9)
        assert Z[row] == pytest.approx(Z_ref, rel=1e-9)


def test_cubic_roots_against_numpy_polynomial_roots() -> None:
    """Reference: numpy.roots (companion-matrix eigenvalues) of
    Z³ - (1 - B) Z² + (A - 3B² - 2B) Z - (A B - B² - B³); smallest and largest real root
    above B."""
    rng = np.random.default_rng(3)
    A, B = rng.uniform(0.001, 1.5, 300), rng.uniform(0.0005, 0.2, 300)
    liquid, vapour = pr_z_roots(A, B)
    for a, b, zl, zv in zip(A, B, liquid, vapour, strict=True):
        roots = np.roots([1.0, -(1.0 - b), a - 3 * b**2 - 2 * b, -(a * b - b**2 - b**3)])
        real = np.sort(roots[np.abs(roots.imag) < 1e-7 * np.abs(roots)].real)
        real = real[real > b]
        assert zl == pytest.approx(real[0], rel=1e-8, abs=1e-12)
        assert zv == pytest.approx(real[-1], rel=1e-8, abs=1e-12)


def _former_z_roots(A: np.ndarray, B: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """``pr_z_roots`` as it was before its array operations were pared (commit ec94f42),
    kept verbatim as the reference of the faster form."""
    a, b = A.ravel(), B.ravel()
    c2 = -(1.0 - b)
    c1 = a - 3.0 * b**2 - 2.0 * b
    c0 = -(a * b - b**2 - b**3)
    shift = -c2 / 3.0
    p = c1 - c2**2 / 3.0
    q = 2.0 * c2**3 / 27.0 - c2 * c1 / 3.0 + c0
    disc = (q / 2.0) ** 2 + (p / 3.0) ** 3
    one = disc > 0
    with np.errstate(invalid="ignore", divide="ignore"):
        root_d = np.sqrt(np.where(one, disc, 0.0))
        single = np.cbrt(-q / 2.0 + root_d) + np.cbrt(-q / 2.0 - root_d) + shift
        m = 2.0 * np.sqrt(np.where(one, 0.0, -p / 3.0))
        arg = np.clip(np.where(one | (p == 0), 0.0, 3.0 * q / (p * m)), -1.0, 1.0)
        theta = np.arccos(arg) / 3.0
        three = np.stack([m * np.cos(theta - 2.0 * np.pi * k / 3.0) + shift for k in range(3)])
    roots = np.where(one[None, :], single[None, :], three)
    for _ in range(2):
        f = ((roots + c2) * roots + c1) * roots + c0
        df = (3.0 * roots + 2.0 * c2) * roots + c1
        with np.errstate(invalid="ignore", divide="ignore"):
            roots = roots - np.where(df != 0, f / df, 0.0)
    valid = roots > b[None, :]
    return (np.where(valid, roots, np.inf).min(axis=0),
            np.where(valid, roots, -np.inf).max(axis=0))


@pytest.mark.parametrize("A_range, B_range", [
    ((0.001, 1.5), (0.0005, 0.2)),  # some points with one real root, some with three
    ((1.0, 1.5), (0.0005, 0.2)),  # all with one
    ((0.1, 0.2), (0.005, 0.01))])  # all with three
def test_cubic_roots_equal_the_former_form(A_range: tuple[float, float],
                                           B_range: tuple[float, float]) -> None:
    """Bit for bit, whether the points have one real root, three, or some of each (the
    faster form skips the unused closed form when all points agree)."""
    rng = np.random.default_rng(4)
    A, B = rng.uniform(*A_range, 200), rng.uniform(*B_range, 200)
    for ours, former in zip(pr_z_roots(A, B), _former_z_roots(A, B), strict=True):
        np.testing.assert_array_equal(ours, former)
    assert all(r.shape == (0,) for r in pr_z_roots(np.array([]), np.array([])))


def test_newton_rows_are_independent(systems: dict[str, eq.BinarySystem]) -> None:
    """A solve of many points gives each point exactly what it gets solved alone (the
    stacked evaluation changes nothing, the premise of the speculative march)."""
    system = systems["propane--n-butane"]
    x = np.array([0.0, 0.1, 0.37, 0.5, 0.81, 1.0])
    together = ce.bubble_temperature(system, x, np.full(x.size, 2.0e6))
    assert together.converged.all()
    for i in range(x.size):
        alone = ce.bubble_temperature(system, x[i:i + 1], np.full(1, 2.0e6))
        assert alone.T_K[0] == pytest.approx(together.T_K[i], rel=1e-12)
        assert alone.y1[0] == pytest.approx(together.y1[i], abs=1e-12)


def test_isotherm_bubble_pressures_against_thermo_flash(systems: dict[str, eq.BinarySystem]
                                                        ) -> None:
    """Reference: thermo.FlashVL with PRMIX in both phases (T, VF = 0), point by point;
    ours one vectorised call for the whole isotherm at 90 °C (near propane's critical
    temperature, 96.7 °C)."""
    system = systems["propane--n-butane"]
    assert isinstance(system.vapour, CubicMixture)
    flash = thermo_pr_flasher(system.vapour, (44.1, 58.12))
    x = np.linspace(0.05, 0.95, 7)
    ours = ce.bubble_pressure(system, x, np.full(x.size, 363.15))
    assert ours.converged.all()
    for i, x1 in enumerate(x):
        ref = flash.flash(T=363.15, VF=0, zs=[x1, 1 - x1])
        assert ours.P_Pa[i] == pytest.approx(ref.P, rel=1e-7)
        assert ours.y1[i] == pytest.approx(ref.gas.zs[0], abs=1e-6)


#: Critical points by the one-trial-at-a-time march before this change (commit ec94f42):
#: pair, curve, condition, x1, T_K, P_Pa, points on the path.
FORMER_CRITICAL = [
    ("propane--n-butane", "isotherm", 383.15, 0.8047468199814741, 383.15, 4302940.23210557, 17),
    ("propane--n-butane", "isobar", 4.0e6, 0.20833948385700696, 415.9621907927193, 4.0e6, 12),
    ("ethane--propane", "isotherm", 323.15, 0.7923682675325143, 323.15, 5064232.301031523, 6),
    ("ethane--propane", "isobar", 4.5e6, 0.1543224516107728, 362.6847858906386, 4.5e6, 18),
]


@pytest.mark.parametrize("pid, kind, value, x1, T_K, P_Pa, steps", FORMER_CRITICAL)
def test_speculative_march_equals_one_trial_at_a_time(
        systems: dict[str, eq.BinarySystem], monkeypatch: pytest.MonkeyPatch, pid: str,
        kind: str, value: float, x1: float, T_K: float, P_Pa: float, steps: int) -> None:
    """The march solving three trials per round takes the very steps of the march trying
    one at a time, and both give the former code's critical point."""
    system = systems[pid]
    draw = curves.isobar if kind == "isobar" else curves.isotherm
    fast = draw(system, value).critical
    monkeypatch.setattr(ce, "SPECULATIVE_TRIALS", 1)
    one_by_one = draw(system, value).critical
    assert fast is not None and fast == one_by_one
    assert len(fast.path) == steps
    assert (fast.x1, fast.T_K, fast.P_Pa) == pytest.approx((x1, T_K, P_Pa), rel=1e-12)


def test_cricondenbar_equals_one_trial_at_a_time(systems: dict[str, eq.BinarySystem],
                                                 monkeypatch: pytest.MonkeyPatch) -> None:
    """Eight marches at once, three trials each per round: the former value (ec94f42,
    4.302116068691222 MPa), also one trial at a time."""
    system = systems["propane--n-butane"]
    ce.cricondenbar.cache_clear()
    fast = ce.cricondenbar(system)
    monkeypatch.setattr(ce, "SPECULATIVE_TRIALS", 1)
    ce.cricondenbar.cache_clear()
    slow = ce.cricondenbar(system)
    ce.cricondenbar.cache_clear()
    assert fast == slow == pytest.approx(4302116.068691222, rel=1e-12)


@pytest.mark.parametrize("pid, kind, value, name", [
    ("ethane--propane", "isotherm", 323.15, "Ethane&Propane"),
    ("propane--n-butane", "isobar", 4.0e6, "Propane&n-Butane")])
def test_critical_points_against_coolprop(systems: dict[str, eq.BinarySystem], pid: str,
                                          kind: str, value: float, name: str) -> None:
    """Reference: CoolProp 8.0 mixture critical point at the composition we locate; the
    models differ (Peng–Robinson with one k12 against multi-parameter mixture models), so
    within 2 K and 3 % in pressure (measured 1.0 K and 2.0 % for ethane–propane at 50 °C,
    0.63 K and 1.0 % for propane–n-butane at 4 MPa)."""
    import CoolProp

    draw = curves.isobar if kind == "isobar" else curves.isotherm
    c = draw(systems[pid], value).critical
    assert c is not None
    state = CoolProp.AbstractState("HEOS", name)
    state.set_mole_fractions([c.x1, 1 - c.x1])
    physical = [p for p in state.all_critical_points() if p.p > 0]
    assert physical, "CoolProp found no critical point"
    ref = min(physical, key=lambda p: abs(p.T - c.T_K))
    assert abs(ref.T - c.T_K) < 2.0
    assert abs(ref.p / c.P_Pa - 1.0) < 0.03
