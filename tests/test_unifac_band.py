"""Each fitted parameter set against a predictive UNIFAC estimate (a broad sanity band).

Reference: original UNIFAC (Fredenslund, Jones & Prausnitz, AIChE J. 21 (1975) 1086, with
the parameter revision of Hansen et al., Ind. Eng. Chem. Res. 30 (1991) 2352) as computed
by the ``thermo`` package with its DDBST group assignments.  UNIFAC is an estimate, so a
pair outside the band is flagged (reported as a warning with its numbers), not failed; the
test fails only if the band is missed by a large part of the catalogue, which points at a
systematic error (wrong units, swapped parameters) rather than at UNIFAC's own error.
"""

from __future__ import annotations

import math
import warnings

import numpy as np
import pytest

from builder.catalogue.loader import Catalogue

#: |ln γ∞(model) - ln γ∞(UNIFAC)| allowed before a pair is flagged (common practice:
#: UNIFAC's infinite-dilution errors of a factor of two or so are usual).
BAND = 1.0


def _unifac_ln_gamma_inf(cas1: str, cas2: str, T: float) -> tuple[float, float] | None:
    from thermo.unifac import UFIP, UFSG, UNIFAC, UNIFAC_group_assignment_DDBST

    groups = [UNIFAC_group_assignment_DDBST(c, "UNIFAC") for c in (cas1, cas2)]
    if not all(groups):
        return None
    mains = {UFSG[k].main_group_id for g in groups for k in g}
    for a in mains:  # thermo uses zero for a missing interaction: check coverage ourselves
        for b in mains:
            if a != b and not (a in UFIP and b in UFIP[a]):
                return None
    eps = 1e-10
    at1 = UNIFAC.from_subgroups(T=T, xs=[eps, 1 - eps], chemgroups=groups, version=0).gammas()
    at2 = UNIFAC.from_subgroups(T=T, xs=[1 - eps, eps], chemgroups=groups, version=0).gammas()
    return math.log(at1[0]), math.log(at2[1])


def test_fitted_sets_within_a_unifac_band(catalogue: Catalogue) -> None:
    compared, outside, uncovered = 0, [], []
    for pair in catalogue.pairs.values():
        if pair.model_kind == "ideal":
            continue
        c1, c2 = (catalogue.components[c] for c in (pair.component1, pair.component2))
        T = 0.5 * (pair.T_min_K + pair.T_max_K)
        ref = _unifac_ln_gamma_inf(c1.cas, c2.cas, T)
        if ref is None:
            uncovered.append(pair.id)
            continue
        ln1, _ = pair.model.ln_gamma(np.array([0.0]), T)
        _, ln2 = pair.model.ln_gamma(np.array([1.0]), T)
        compared += 1
        d1, d2 = float(ln1[0]) - ref[0], float(ln2[0]) - ref[1]
        if max(abs(d1), abs(d2)) > BAND:
            outside.append(f"{pair.id}: ln γ∞ model {float(ln1[0]):.2f}/{float(ln2[0]):.2f}, "
                           f"UNIFAC {ref[0]:.2f}/{ref[1]:.2f}")
    for line in outside:
        warnings.warn(f"outside the UNIFAC band: {line}", stacklevel=1)
    if uncovered:
        warnings.warn(f"no UNIFAC estimate (groups or interactions missing): {uncovered}",
                      stacklevel=1)
    assert compared >= 5
    assert len(outside) <= compared // 3, outside


@pytest.mark.parametrize(("cas1", "cas2"), [("64-17-5", "7732-18-5")])
def test_unifac_reference_itself(cas1: str, cas2: str) -> None:
    """UNIFAC's ethanol-in-water γ∞ near 350 K is about 7 (thermo); the model set from
    DECHEMA gives about 5-6 at the same temperature: the band is meaningful."""
    ref = _unifac_ln_gamma_inf(cas1, cas2, 350.0)
    assert ref is not None
    assert math.exp(ref[0]) == pytest.approx(7.0, rel=0.1)
