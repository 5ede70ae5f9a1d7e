"""Predictive activity models of two catalogued components from their UNIFAC groups.

:func:`predictive_model` builds original UNIFAC (``"unifac"``) or modified UNIFAC
(Dortmund) (``"dortmund"``) from the components' ``groups:`` blocks and the group
tables in ``pairs/groups/``; :func:`default_prediction` takes modified UNIFAC
(Dortmund) and falls back to original UNIFAC where Dortmund lacks groups or
parameters.  A pair that cannot be predicted raises :class:`CannotPredict` with the
reason (no groups for a component, or no parameters for a pair of main groups).
"""

from __future__ import annotations

from pathlib import Path

from builder.catalogue.group_tables import DEFAULT_GROUPS, group_tables
from builder.catalogue.records import PAIR_SEPARATOR, Component, PairRecord, Source
from builder.errors import AtlasError
from builder.thermo.unifac import UNIFAC, VARIANT_NAMES, MissingInteraction

__all__ = ["PREDICTED_T_RANGE_K", "PREFERENCE", "SUMMARY_PRESSURE_PA", "CannotPredict",
           "default_prediction", "predicted_pair", "predictive_model"]

#: Variants in order of preference for a pair without a fitted set.
PREFERENCE = ("dortmund", "unifac")

#: The isobar a predicted pair publishes: the site's summary pressure (1 atm).
SUMMARY_PRESSURE_PA = 101325.0

#: Temperatures of most of the VLE data the group parameters were fitted to; outside
#: them a prediction is marked extrapolated (Gmehling et al. 1993; from memory; verify).
PREDICTED_T_RANGE_K = (275.0, 425.0)

#: The publication of each variant's method, cited as the source of a predicted set.
_METHOD_SOURCES = {
    "unifac": Source(ref="fredenslund-1975", where="the method; group parameters as revised "
                     "by Hansen et al. 1991 and Wittig et al. 2003 (pairs/groups/)",
                     note="Predicted from the components' groups (groups: in the component "
                     "files); not fitted to data of this pair."),
    "dortmund": Source(ref="weidlich-gmehling-1987", where="the method; group parameters of "
                       "Gmehling et al. 1993, 1998, 2002 and Jakob et al. 2006 (pairs/groups/)",
                       note="Predicted from the components' groups (groups: in the component "
                       "files); not fitted to data of this pair."),
}


class CannotPredict(AtlasError, ValueError):
    """Neither UNIFAC variant can predict a pair; ``reasons`` gives one line per variant."""

    def __init__(self, first: str, second: str, reasons: list[str]):
        self.first, self.second, self.reasons = first, second, reasons
        super().__init__(f"{first}–{second}: " + "; ".join(reasons))


def predictive_model(c1: Component, c2: Component, variant: str,
                     folder: Path | str = DEFAULT_GROUPS) -> UNIFAC:
    """The ``variant`` UNIFAC model of ``c1`` (component 1) with ``c2`` (component 2).

    Raises :class:`CannotPredict` when a component has no groups for the variant or a
    pair of main groups has no published parameter.
    """
    table = group_tables(variant, folder)
    counts = []
    for component in (c1, c2):
        groups = component.groups.of(variant) if component.groups else None
        if not groups:
            raise CannotPredict(c1.id, c2.id, [
                f"cannot predict this pair: no {VARIANT_NAMES[variant]} groups for "
                f"{component.id}"])
        counts.append(groups)
    subgroups = {name: (s.main_group, s.R, s.Q) for name, s in table.subgroups.items()}
    try:
        return UNIFAC.from_groups(variant, counts[0], counts[1], subgroups, table.interactions,
                                  table.main_groups)
    except MissingInteraction as error:
        raise CannotPredict(c1.id, c2.id, [str(error)]) from error


def default_prediction(c1: Component, c2: Component,
                       folder: Path | str = DEFAULT_GROUPS) -> UNIFAC:
    """Modified UNIFAC (Dortmund), or original UNIFAC where Dortmund cannot predict."""
    reasons: list[str] = []
    for variant in PREFERENCE:
        try:
            return predictive_model(c1, c2, variant, folder)
        except CannotPredict as error:
            reasons.extend(error.reasons)
    raise CannotPredict(c1.id, c2.id, reasons)


def predicted_pair(c1: Component, c2: Component, variant: str | None = None,
                   folder: Path | str = DEFAULT_GROUPS) -> PairRecord:
    """A pair record of ``c1`` and ``c2`` with a predicted model, quality ``"predicted"``.

    ``variant`` None takes :func:`default_prediction`; the record publishes the
    101.325 kPa isobar and carries no recorded behaviour.  Raises :class:`CannotPredict`.
    """
    model = (default_prediction(c1, c2, folder) if variant is None
             else predictive_model(c1, c2, variant, folder))
    T_min, T_max = PREDICTED_T_RANGE_K
    return PairRecord(
        id=f"{c1.id}{PAIR_SEPARATOR}{c2.id}", component1=c1.id, component2=c2.id,
        model=model, model_kind=model.variant, published_parameters=model.parameters_text(),
        T_min_K=T_min, T_max_K=T_max, source=_METHOD_SOURCES[model.variant],
        quality="predicted", isobars_Pa=(SUMMARY_PRESSURE_PA,), isotherms_K=(),
        recorded=None, notes=f"Predicted by {model.name}: a screening estimate from group "
        "contributions, not fitted to measured data of this pair.", tags=("predicted",))
