"""Reference checks of one pair's results against what the literature records.

Each check compares a computed result with the pair file's ``recorded`` block
(taken from published azeotrope tables) or with a plain requirement (every
published curve converged).  Tolerances are those a user accepts for
screening: 1 K and 0.03 in mole fraction for an azeotrope (common practice).
A failed check is reported on the pair's page and by the command line; it
is never hidden, and a parameter set is never adjusted to pass.

The checks read the result record (:mod:`.record`); :mod:`.results` computes the
record and attaches the checks, so neither this module nor the record imports it.
"""

from __future__ import annotations

from builder.analysis.record import ATMOSPHERIC_PA, Check, PairResults

__all__ = ["AZEOTROPE_T_TOLERANCE_K", "AZEOTROPE_X_TOLERANCE", "Check", "check_pair"]

AZEOTROPE_T_TOLERANCE_K = 1.0
AZEOTROPE_X_TOLERANCE = 0.03
_ATM = ATMOSPHERIC_PA


def check_pair(results: PairResults) -> tuple[Check, ...]:
    """Convergence, recorded azeotropes, zeotropy and liquid splitting of one pair."""
    checks: list[Check] = []
    for condition in results.conditions:
        failed = int((~condition.curve.converged).sum())
        checks.append(Check(
            name=f"curve converges ({condition.kind} {condition.label})",
            passed=failed == 0 and condition.azeotrope_search_complete,
            detail=("all points converged; whole range searched for azeotropes" if failed == 0
                    and condition.azeotrope_search_complete else
                    f"{failed} points did not converge"
                    + ("" if condition.azeotrope_search_complete else
                       "; azeotrope search incomplete")),
            reference="common practice"))
    recorded = results.pair.recorded
    at_atm = results.at_atmospheric()
    if recorded is None or at_atm is None:
        return tuple(checks)
    for az in recorded.azeotropes:
        if abs(az.P_Pa - _ATM) > 1.0:
            continue
        source = az.source.ref + (" (from memory)" if az.source.from_memory else "")
        candidates = [a for a in at_atm.azeotropes if a.kind == az.kind]
        if not candidates:
            kinds = ", ".join(a.kind for a in at_atm.azeotropes) or "none"
            checks.append(Check(name=f"{az.kind} azeotrope at 101.325 kPa", passed=False,
                                detail=f"recorded, but the model finds {kinds}",
                                reference=source))
            continue
        model = min(candidates, key=lambda a: abs(a.x1 - (az.x1 if az.x1 is not None else a.x1)))
        dT = model.T_K - az.T_K if az.T_K is not None else None
        dx = model.x1 - az.x1 if az.x1 is not None else None
        ok = (dT is None or abs(dT) <= AZEOTROPE_T_TOLERANCE_K) and (
            dx is None or abs(dx) <= AZEOTROPE_X_TOLERANCE)
        parts = [f"model x1 = {model.x1:.3f}, T = {model.T_K - 273.15:.2f} °C"]
        if az.x1 is not None and az.T_K is not None:
            parts.append(f"recorded x1 = {az.x1:.3f}, T = {az.T_K - 273.15:.2f} °C")
        checks.append(Check(name=f"{az.kind} azeotrope at 101.325 kPa", passed=ok,
                            detail="; ".join(parts), reference=source,
                            deviation_T_K=dT, deviation_x1=dx))
    if any(abs(P - _ATM) < 1.0 for P in recorded.zeotropic_at_Pa):
        source = recorded.source.ref if recorded.source else ""
        checks.append(Check(
            name="no azeotrope at 101.325 kPa",
            passed=not at_atm.azeotropes and at_atm.azeotrope_search_complete,
            detail=("none found over the whole range" if not at_atm.azeotropes else
                    "the model finds " + ", ".join(f"{a.kind} at x1 = {a.x1:.3f}"
                                                   for a in at_atm.azeotropes)),
            reference=source))
    if recorded.liquid_split is not None:
        predicted = at_atm.three_phase is not None or not bool(at_atm.liquid_stable.all())
        if predicted == recorded.liquid_split:
            detail = ("two liquids predicted, as recorded" if predicted
                      else "one liquid everywhere, as recorded")
        else:
            detail = ("the model predicts two liquids that the literature does not record"
                      if predicted else "the literature records two liquids; the model "
                      "predicts one")
        checks.append(Check(name="liquid-liquid split at the 101.325 kPa bubble points",
                            passed=predicted == recorded.liquid_split, detail=detail,
                            reference=recorded.source.ref if recorded.source else ""))
    return tuple(checks)
