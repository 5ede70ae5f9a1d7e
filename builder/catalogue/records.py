"""Validated, frozen records of the catalogue: references, components, pairs.

Everything here is already in SI; the loader (:mod:`builder.catalogue`) has
done the unit conversion and the checking.  Records are plain data: the
thermodynamic objects they carry (a vapour-pressure correlation, an activity
model) come from :mod:`builder.vapour_pressure` and :mod:`builder.activity`.
"""

from __future__ import annotations

import re
from dataclasses import dataclass, field
from typing import TYPE_CHECKING

from builder.thermo.activity import ActivityModel
from builder.thermo.vapour_pressure import VapourPressure

if TYPE_CHECKING:
    from builder.catalogue.vapour import PairVapour, VirialConstants

__all__ = [
    "SLUG",
    "Component",
    "ComponentGroups",
    "PairRecord",
    "RecordedAzeotrope",
    "RecordedBehaviour",
    "Reference",
    "Source",
]

#: Identifiers become file names and URLs: lower-case letters, digits, single hyphens.
SLUG = re.compile(r"^[a-z0-9]+(?:-[a-z0-9]+)*$")

#: A pair's id joins its two component ids with a double hyphen.
PAIR_SEPARATOR = "--"


@dataclass(frozen=True)
class Reference:
    """A published work that catalogue numbers come from."""

    id: str
    authors: str
    title: str
    year: int
    kind: str  # book, article, database, handbook, standard
    publisher: str = ""
    journal: str = ""
    volume: str = ""
    pages: str = ""
    edition: str = ""
    doi: str = ""
    note: str = ""

    def citation(self) -> str:
        """One-line citation, e.g. ``Poling, B. E. ...; The Properties of ...; 2001``."""
        parts = [self.authors, self.title]
        if self.edition:
            parts.append(f"{self.edition} ed.")
        venue = " ".join(p for p in (self.journal, self.volume) if p)
        if venue:
            parts.append(venue)
        if self.pages:
            parts.append(f"pp. {self.pages}")
        if self.publisher:
            parts.append(self.publisher)
        parts.append(str(self.year))
        if self.doi:
            parts.append(f"doi:{self.doi}")
        text = ""
        for part in parts:  # a part that ends in a full stop ("2nd ed.") gets no second one
            text += part if not text else (" " if text.endswith(".") else ". ") + part
        return text if text.endswith(".") else text + "."


@dataclass(frozen=True)
class Source:
    """Where one group of numbers comes from: a reference and the place in it."""

    ref: str
    where: str
    note: str = ""
    from_memory: bool = False

    def text(self, references: dict[str, Reference]) -> str:
        ref = references.get(self.ref)
        body = ref.citation() if ref else self.ref
        if self.where:
            body += f" {self.where}."
        if self.note:
            body += f" {self.note}"
        if self.from_memory:
            body += " (from memory; verify)"
        return body


@dataclass(frozen=True)
class ComponentGroups:
    """A component's UNIFAC subgroups: name -> count, per model variant.

    ``unifac`` uses the subgroups of original UNIFAC, ``dortmund`` those of modified
    UNIFAC (Dortmund); either is ``None`` where the published tables have no groups
    for the substance.  Names are spelled as in the group tables (``pairs/groups/``).
    """

    unifac: dict[str, int] | None
    dortmund: dict[str, int] | None
    source: Source

    def of(self, variant: str) -> dict[str, int] | None:
        """The subgroups of one variant: ``"unifac"`` or ``"dortmund"``."""
        if variant not in ("unifac", "dortmund"):
            raise ValueError(f"unknown UNIFAC variant {variant!r}; expected unifac or dortmund")
        return self.unifac if variant == "unifac" else self.dortmund


@dataclass(frozen=True)
class Component:
    """A pure component with its constants (SI) and vapour-pressure correlation."""

    id: str
    name: str
    synonyms: tuple[str, ...]
    cas: str
    formula: str
    molar_mass_kg_per_mol: float
    normal_boiling_point_K: float
    critical_temperature_K: float
    critical_pressure_Pa: float
    acentric_factor: float
    liquid_molar_volume_m3_per_mol: float
    vapour_pressure: VapourPressure
    vapour_pressure_source: Source
    constants_sources: dict[str, Source]
    hazard: str
    hazard_source: Source | None
    uniquac_r: float | None = None
    uniquac_q: float | None = None
    uniquac_source: Source | None = None
    file: str = ""
    virial: VirialConstants | None = None  # second-virial constants (builder.catalogue.vapour)
    #: UNIFAC subgroup counts for the predictive models (None: not assigned yet).
    groups: ComponentGroups | None = None

    def names(self) -> tuple[str, ...]:
        """Every spelling a user may type for this component."""
        return (self.id, self.name, *self.synonyms, self.cas, self.formula)


@dataclass(frozen=True)
class RecordedAzeotrope:
    """An azeotrope as a published table lists it (for the reference checks)."""

    P_Pa: float
    T_K: float | None
    x1: float | None
    kind: str
    source: Source


@dataclass(frozen=True)
class RecordedBehaviour:
    """What the literature records about a pair, for the checks to compare."""

    azeotropes: tuple[RecordedAzeotrope, ...]
    zeotropic_at_Pa: tuple[float, ...]
    liquid_split: bool | None
    source: Source | None


@dataclass(frozen=True)
class PairRecord:
    """A binary pair: two components, the activity model as published, what to publish."""

    id: str
    component1: str
    component2: str
    model: ActivityModel
    model_kind: str
    published_parameters: dict[str, str]
    T_min_K: float
    T_max_K: float
    source: Source
    quality: str
    isobars_Pa: tuple[float, ...]
    isotherms_K: tuple[float, ...]
    recorded: RecordedBehaviour | None = None
    notes: str = ""
    file: str = ""
    tags: tuple[str, ...] = field(default=())
    #: The published parameters as numbers, in SI or with the unit in the key: an energy
    #: ``g12_J_per_mol``, a temperature function ``{"a": ..., "b_K": ..., "c": ...,
    #: "d_per_K": ...}``, a plain dimensionless value as a number.
    parameters: dict[str, float | dict[str, float]] = field(default_factory=dict)
    #: Optional split for the distillation quick look: mole fractions of component 1 in
    #: distillate, bottoms and a saturated-liquid feed.  None: 95/5 % of the lighter one.
    split_x1: tuple[float, float, float] | None = None
    #: The vapour treatment as written (None or model "": the default, see
    #: builder.catalogue.vapour).
    vapour: PairVapour | None = None
