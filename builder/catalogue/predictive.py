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
from builder.catalogue.records import Component
from builder.errors import AtlasError
from builder.thermo.unifac import UNIFAC, VARIANT_NAMES, MissingInteraction

__all__ = ["PREFERENCE", "CannotPredict", "default_prediction", "predictive_model"]

#: Variants in order of preference for a pair without a fitted set.
PREFERENCE = ("dortmund", "unifac")


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
