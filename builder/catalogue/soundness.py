"""Numerical soundness of a correlation or an activity model, checked when it is loaded.

A typing slip in a catalogue file (a lost minus sign, a constant in °C with the
unit K, an exponent too many) must be reported at the file and field, not end
in a division by zero or an empty-array error deep inside a solver.  These
functions evaluate a correlation over its whole validity range and an activity
model over its temperature range and the whole composition range, and return a
description of the first problem found (or ``None``).

The limits are wide, physical ones (common practice): a vapour pressure between
1e-20 Pa and 1 GPa, rising with temperature, with no pole of the equation in
the range; activity coefficients finite with ``|ln γ| <= 40`` (γ at infinite
dilution up to 2e17, far beyond any measured system).
"""

from __future__ import annotations

import numpy as np

from builder.thermo.activity import ActivityModel
from builder.thermo.vapour_pressure import Antoine, VapourPressure

__all__ = ["LN_GAMMA_LIMIT", "P_MAX_PA", "P_MIN_PA", "model_problem",
           "vapour_pressure_problem"]

P_MIN_PA = 1e-20
P_MAX_PA = 1e9
LN_GAMMA_LIMIT = 40.0
_POINTS = 201


def vapour_pressure_problem(vp: VapourPressure) -> str | None:
    """What is wrong with a correlation over ``[T_min_K, T_max_K]``, or None.

    >>> from builder.thermo.vapour_pressure import Antoine
    >>> good = Antoine.from_published(5.33675, 1648.220, 230.918, log_base="10", P_unit="bar",
    ...                               T_unit="C", T_min_K=276.5, T_max_K=369.54)
    >>> vapour_pressure_problem(good) is None
    True
    >>> pole = Antoine.from_published(5.33675, 1648.220, -26.85, log_base="10", P_unit="bar",
    ...                               T_unit="C", T_min_K=276.5, T_max_K=369.54)
    >>> vapour_pressure_problem(pole)
    'the equation has a pole (T + C = 0) at 300.00 K, inside the validity range'
    """
    T = np.linspace(vp.T_min_K, vp.T_max_K, _POINTS)
    if isinstance(vp, Antoine):
        pole_K = -vp.C
        if vp.T_min_K <= pole_K <= vp.T_max_K:
            return (f"the equation has a pole (T + C = 0) at {pole_K:.2f} K, inside the validity "
                    "range")
        if vp.B <= 0:
            return "a positive B (the pressure must rise with temperature)"
        if vp.T_min_K + vp.C < 0:
            return ("T + C positive over the validity range (found negative: is the temperature "
                    "unit right?)")
    with np.errstate(all="ignore"):
        P = np.asarray(vp.pressure_Pa(T), dtype=float)
        slope = np.asarray(vp.dlnP_dT(T), dtype=float)
    if not np.all(np.isfinite(P)):
        return "a finite pressure over the whole validity range (it overflows or is undefined)"
    if np.any(P < P_MIN_PA) or np.any(P > P_MAX_PA):
        return (f"pressures between {P_MIN_PA:g} Pa and {P_MAX_PA:g} Pa over the validity "
                f"range; found {float(P.min()):.3g} Pa to {float(P.max()):.3g} Pa")
    if not np.all(np.isfinite(slope)) or np.any(slope <= 0) or np.any(np.diff(P) <= 0):
        return "a pressure rising with temperature over the whole validity range"
    return None


def model_problem(model: ActivityModel, T_min_K: float, T_max_K: float) -> str | None:
    """What is wrong with an activity model over its temperature range, or None.

    >>> from builder.thermo.activity import Margules, TemperatureFunction
    >>> model_problem(Margules(TemperatureFunction(a=1.0), TemperatureFunction(a=1.2)),
    ...               300.0, 350.0) is None
    True
    >>> model_problem(Margules(TemperatureFunction(a=1e4), TemperatureFunction(a=1.2)),
    ...               300.0, 350.0)
    'activity coefficients with |ln γ| at most 40 (found 1e+04 at 300.0 K)'
    """
    x1 = np.concatenate(([0.0], np.linspace(0.01, 0.99, 21), [1.0]))
    for T in np.linspace(T_min_K, T_max_K, 5):
        try:
            with np.errstate(all="ignore"):
                ln1, ln2 = model.ln_gamma(x1, float(T))
                ln = np.concatenate((np.asarray(ln1, dtype=float), np.asarray(ln2, dtype=float)))
        except (ArithmeticError, ValueError) as error:
            return f"activity coefficients that can be evaluated (found {error})"
        if not np.all(np.isfinite(ln)):
            return (f"finite activity coefficients over the whole composition range (not at "
                    f"{T:.1f} K: a parameter overflows)")
        worst = float(np.max(np.abs(ln)))
        if worst > LN_GAMMA_LIMIT:
            return (f"activity coefficients with |ln γ| at most {LN_GAMMA_LIMIT:g} "
                    f"(found {worst:.3g} at {T:.1f} K)")
    return None
