"""Regression: every published result of the shipped catalogue against a stored snapshot.

Reference: the project's own results before the analysis was vectorised
(``tests/data/analysis_regression.json``, made by ``python -m tests.analysis_snapshot``
from commit "Regression fixture of every published analysis result").  Not an outside
reference: the outside checks of the same numbers are in test_azeotropes.py,
test_equilibrium.py and test_distillation.py; this test guards that a faster path to the
same equations gives the same answers.

Tolerances: every solver in the analysis converges to about 1e-12 relative in T and P and
1e-13 in mole fraction (bracketed Newton, ``builder.thermo.solvers``); the three-phase
temperature to 1e-10 K (Brent) and the binodal to 1e-13 in logit composition.  A
different but equally converged solution path (a Newton solve of the azeotrope's own
equations instead of a root search along bubble points) may land anywhere inside those
tolerances, so numbers are compared to 1e-8 relative and 1e-9 absolute: four orders above
the solver tolerances, four orders below the smallest change a model or data edit makes
(1e-4 in x1, 0.01 K).  One exception: the quick look's pinch composition is where a
smooth curve has its maximum, which round-off fixes only to about the square root of the
machine precision (1e-8); it is compared to 1e-6.  Counts, kinds, flags, grades and every
published text (warnings, trace events, check names) must match exactly.

Three entries were corrected when the three-phase point came to be solved from its own
equations: at those points the former Brent search over binodals had fallen back to the
hull estimate of the liquids (a 1e-3 grid), so its answer missed the equations.  The
stored values now satisfy them to 1e-14: water--n-butyl-acetate at 101.325 kPa (liquids
0.1675/0.9975 from the grid, now 0.167636/0.997874; T 0.005 K lower) and its trace at
two pressures, ethyl-acetate--water's trace at 17.5 kPa and water--1-butanol's at
114 kPa (former residual in ln P 6e-7).

Regenerated when the virial vapour (second virial coefficients and Poynting factors)
became the default vapour treatment and four pairs moved to Peng-Robinson: a deliberate
change of results (against the ideal-gas snapshot, temperatures moved by up to 2.2 K,
mostly a few tenths of a kelvin at 101.325 kPa, compositions by up to 0.033).

Extended, not regenerated, when the five carboxylic-acid pairs came back with the
associating vapour: their entries are those pairs' first results; every other entry is
unchanged.  n-butane--n-pentane regenerated alone when its k12 went from the DECHEMA
0.0174 to 0 (bubble and dew temperatures up by up to 2.1 K, vapour compositions by up to
0.034; the other pairs unchanged).

Three entries regenerated alone when the one-liquid stretches beside a three-phase line
came to get their own bubble points (``builder.analysis.dew_branches``: a stretch with
fewer than 12 drawable grid points gets 27, so that its dew branch is drawn from the pure
component's boiling point to the three-phase line): the water-rich stretch of
isobutanol--water and water--1-butanol (5-6 grid points) and of water--n-butyl-acetate
(2-3 grid points).  Each condition of
those pairs has 27 more points (134 instead of 107; drawable, converged and stable counts
up by 27; the extrapolated count up by 27 where the whole curve is extrapolated), and
water--n-butyl-acetate's smallest relative volatility at 101.325 and 30 kPa now lies at
the water-rich three-phase liquid (x1 0.99788 and 0.99876, alpha12 lower by 0.3 % and
1.3 %) instead of the nearest grid point (0.998, 0.999).  The sampled curve, azeotropes,
three-phase points, traces, warnings and checks are unchanged, and so is every other
entry.
"""

from __future__ import annotations

import json
import math
from typing import Any

import pytest

from builder.catalogue.loader import Catalogue
from tests.analysis_snapshot import FIXTURE, snapshot
from tests.conftest import ShippedResults

REL_TOL = 1e-8
ABS_TOL = 1e-9
#: Per-field absolute tolerances where a quantity is less well defined than the solvers.
FIELD_TOL = {"pinch_x1": 1e-6}

EXPECTED: dict[str, Any] = json.loads(FIXTURE.read_text(encoding="utf-8"))


def _differences(expected: Any, found: Any, where: str, abs_tol: float = ABS_TOL) -> list[str]:
    if isinstance(expected, dict) and isinstance(found, dict):
        if expected.keys() != found.keys():
            return [f"{where}: keys {sorted(expected)} != {sorted(found)}"]
        return [d for k in expected for d in _differences(expected[k], found[k], f"{where}.{k}",
                                                          FIELD_TOL.get(k, ABS_TOL))]
    if isinstance(expected, list) and isinstance(found, list):
        if len(expected) != len(found):
            return [f"{where}: length {len(expected)} != {len(found)}"]
        return [d for i, (e, f) in enumerate(zip(expected, found, strict=True))
                for d in _differences(e, f, f"{where}[{i}]", abs_tol)]
    if isinstance(expected, float) and isinstance(found, float) and not isinstance(found, bool):
        if math.isclose(expected, found, rel_tol=REL_TOL, abs_tol=abs_tol):
            return []
        return [f"{where}: expected {expected!r}, found {found!r}"]
    if expected != found or type(expected) is not type(found):
        return [f"{where}: expected {expected!r}, found {found!r}"]
    return []


def test_every_shipped_pair_is_in_the_snapshot(catalogue: Catalogue) -> None:
    assert sorted(catalogue.pairs) == sorted(EXPECTED)


@pytest.mark.parametrize("pid", sorted(EXPECTED))
def test_results_match_the_snapshot(pid: str, shipped_results: ShippedResults) -> None:
    found = json.loads(json.dumps(snapshot(shipped_results[pid]), allow_nan=False))
    problems = _differences(EXPECTED[pid], found, pid)
    assert not problems, "\n".join(problems[:20])


def test_the_comparison_can_fail() -> None:
    """The comparator itself: a change of 1e-6 in a composition is caught."""
    assert _differences({"x1": [0.5]}, {"x1": [0.500001]}, "p")
    assert not _differences({"x1": [0.5]}, {"x1": [0.5 + 1e-12]}, "p")
    assert _differences({"kind": "minimum-boiling"}, {"kind": "maximum-boiling"}, "p")
