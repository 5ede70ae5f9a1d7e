"""The result record of one pair: what the analysis hands to the checks, pages and caches.

Typed, frozen and versioned.  Every field always exists; a field is ``None`` only
where its comment says what that means.  :data:`RESULTS_VERSION` changes whenever
a field is added, removed or changes meaning, or the computed numbers change
beyond solver precision, so that a stored record of another version is never read
as if it were current (compare :attr:`PairResults.version`).

Computation is elsewhere: :mod:`.results` fills these records, :mod:`.checks`
compares them with the literature; both import this module and neither imports
the other's caller.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from builder.analysis.azeotropes import Azeotrope
from builder.analysis.curves import Curve
from builder.analysis.distillation import QuickLook
from builder.analysis.stability import ThreePhase
from builder.analysis.trace import AzeotropeTrace
from builder.analysis.volatility import Volatility
from builder.catalogue.records import Component, PairRecord

__all__ = ["ATMOSPHERIC_PA", "RESULTS_VERSION", "Check", "ConditionResult", "PairResults"]

#: Version of the record layout and of its numbers (see the module docstring).
#: 1: the first layout, with fields added over time; 2: every field always present,
#: three-phase points and pressure traces solved from their own equations; 3: bubble points
#: added to sparse one-liquid stretches beside a three-phase line (:mod:`.dew_branches`).
RESULTS_VERSION = 3

ATMOSPHERIC_PA = 101325.0


@dataclass(frozen=True)
class Check:
    """One reference check: what was compared, whether it passed, the numbers, and the
    reference (a publication id, or "common practice")."""

    name: str
    passed: bool
    detail: str
    reference: str = ""
    deviation_T_K: float | None = None  # model minus recorded; None: nothing to compare
    deviation_x1: float | None = None  # model minus recorded; None: nothing to compare


@dataclass(frozen=True)
class ConditionResult:
    """One isobar (``kind == "isobar"``, fixed ``P_Pa``) or isotherm (fixed ``T_K``)."""

    kind: str  # "isobar" or "isotherm"
    condition: float  # P in Pa for an isobar, T in K for an isotherm
    curve: Curve
    drawable: NDArray[np.bool_]  # converged points of a stable one-liquid region
    extrapolated: NDArray[np.bool_]  # per point: outside a correlation's validity range
    azeotropes: tuple[Azeotrope, ...]  # empty: none found
    azeotrope_search_complete: bool
    volatility: Volatility
    warnings: tuple[str, ...]  # what a reader must see; empty: nothing to say
    liquid_stable: NDArray[np.bool_]  # per point of the curve, tangent-plane test
    #: None: one liquid at every bubble point of the curve, or the three-phase point could
    #: not be located (then ``warnings`` says so).
    three_phase: ThreePhase | None
    quicklook: QuickLook | None  # None on an isotherm (the quick look is per isobar)

    @property
    def label(self) -> str:
        if self.kind == "isobar":
            return f"{self.condition / 1e3:.6g} kPa"
        return f"{self.condition - 273.15:.6g} °C"

    @property
    def slug(self) -> str:
        """A file-name-safe id: ``isobar-101.325kPa`` or ``isotherm-70C``."""
        if self.kind == "isobar":
            return f"isobar-{self.condition / 1e3:.6g}kPa"
        return f"isotherm-{self.condition - 273.15:.6g}C"


@dataclass(frozen=True)
class PairResults:
    """All computed results of one pair, components in the record's order."""

    pair: PairRecord
    component1: Component
    component2: Component
    isobars: tuple[ConditionResult, ...]
    isotherms: tuple[ConditionResult, ...]
    warnings: tuple[str, ...]  # about the pair as a whole; empty: nothing to say
    #: The azeotrope of the 101.325 kPa isobar (else of the first isobar) followed against
    #: pressure.  None: no azeotrope there, no isobar published, or fewer than two
    #: pressures inside the vapour-pressure correlations' ranges.
    trace: AzeotropeTrace | None
    checks: tuple[Check, ...]  # empty only before the checks are attached
    version: int = RESULTS_VERSION

    @property
    def failed_checks(self) -> tuple[Check, ...]:
        return tuple(c for c in self.checks if not c.passed)

    @property
    def conditions(self) -> tuple[ConditionResult, ...]:
        return self.isobars + self.isotherms

    def at_atmospheric(self) -> ConditionResult | None:
        """The 101.325 kPa isobar, if published."""
        for result in self.isobars:
            if abs(result.condition - ATMOSPHERIC_PA) < 1.0:
                return result
        return None
