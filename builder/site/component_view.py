"""The view of a component page: identity, constants, vapour pressure, hazard, sources."""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from typing import Protocol

from builder.catalogue.loader import Catalogue
from builder.catalogue.records import Component, Source
from builder.site.display import Display, Row
from builder.site.text import fmt, one_line, safe_id

__all__ = ["ComponentView", "component_view", "pair_title", "source_text"]


#: Words in a hazard summary that say the component is not classified as hazardous.
_NOT_HAZARDOUS = ("no ghs", "not classified", "no hazard")


@dataclass(frozen=True)
class ComponentView:
    id: str
    url: str  # site-relative path of the page, e.g. components/ethanol.md
    name: str
    synonyms: tuple[str, ...]
    cas: str
    formula: str
    identity: tuple[Row, ...]
    constants: tuple[Row, ...]
    vapour_pressure: tuple[Row, ...]
    vp_T_range_K: tuple[float, float]
    hazard: str
    hazard_source: str
    hazardous: bool
    sources: tuple[Row, ...]
    pairs: tuple[tuple[str, str, str], ...]  # (url, title, other component)
    boiling_point: str
    boiling_value: float  # in the displayed unit, for sorting

    @property
    def search_key(self) -> str:
        """``cas67663`` for CAS 67-66-3: one search token (see assets/js/atlas-search.js)."""
        return "cas" + self.cas.replace("-", "")


def _hazardous(text: str) -> bool:
    lowered = text.casefold()
    return bool(text.strip()) and not any(lowered.startswith(w) for w in _NOT_HAZARDOUS)


def source_text(catalogue: Catalogue, source: Source | None) -> str:
    return one_line(catalogue.source_text(source)) if source else ""


class PairOfComponents(Protocol):
    """A pair as a component page lists it (a catalogue record or a build's pair entry)."""

    @property
    def id(self) -> str: ...

    @property
    def component1(self) -> str: ...

    @property
    def component2(self) -> str: ...


def component_view(catalogue: Catalogue, component: Component, display: Display,
                   pairs: Sequence[PairOfComponents]) -> ComponentView:
    cid = safe_id(component.id)
    vp = component.vapour_pressure
    identity = (
        Row("Name", component.name),
        Row("Synonyms", ", ".join(component.synonyms) or "—"),
        Row("CAS number", component.cas),
        Row("Formula", component.formula),
        Row("Molar mass", f"{fmt(component.molar_mass_kg_per_mol * 1e3, 6)} g/mol"),
    )
    constants = (
        Row("Normal boiling point", display.T(component.normal_boiling_point_K, 2),
            f"{fmt(component.normal_boiling_point_K, 5)} K"),
        Row("Critical temperature", display.T(component.critical_temperature_K, 1),
            f"{fmt(component.critical_temperature_K, 5)} K"),
        Row("Critical pressure", display.P(component.critical_pressure_Pa),
            f"{fmt(component.critical_pressure_Pa / 1e6, 5)} MPa"),
        Row("Acentric factor ω", fmt(component.acentric_factor, 4)),
        Row("Liquid molar volume", f"{fmt(component.liquid_molar_volume_m3_per_mol * 1e6, 5)}"
            " cm³/mol"),
    )
    uq: tuple[Row, ...] = ()
    if component.uniquac_r is not None and component.uniquac_q is not None:
        uq = (Row("UNIQUAC r, q", f"{fmt(component.uniquac_r, 5)}, "
                  f"{fmt(component.uniquac_q, 5)}"),)
    vp_rows = (
        Row("Equation (SI)", vp.equation()),
        Row("Validity range", f"{display.T(vp.T_min_K, 1)} to {display.T(vp.T_max_K, 1)}",
            f"{fmt(vp.T_min_K, 5)} K to {fmt(vp.T_max_K, 5)} K"),
        Row("Source", source_text(catalogue, component.vapour_pressure_source)),
    )
    sources = tuple(Row(name.replace("_", " ").capitalize(), source_text(catalogue, src))
                    for name, src in sorted(component.constants_sources.items()))
    if component.uniquac_source is not None:
        sources += (Row("UNIQUAC r, q", source_text(catalogue, component.uniquac_source)),)
    member = []
    for pair in pairs:
        if component.id in (pair.component1, pair.component2):
            other_id = pair.component2 if pair.component1 == component.id else pair.component1
            other = catalogue.components[other_id]
            member.append((f"pairs/{safe_id(pair.id)}.md", pair_title(catalogue, pair),
                           other.name))
    return ComponentView(
        id=cid, url=f"components/{cid}.md", name=one_line(component.name),
        synonyms=tuple(component.synonyms), cas=component.cas, formula=component.formula,
        identity=identity, constants=constants + uq, vapour_pressure=vp_rows,
        vp_T_range_K=(vp.T_min_K, vp.T_max_K),
        hazard=one_line(component.hazard), hazard_source=source_text(catalogue,
                                                                  component.hazard_source),
        hazardous=_hazardous(component.hazard), sources=sources, pairs=tuple(member),
        boiling_point=display.T(component.normal_boiling_point_K, 1),
        boiling_value=display.T_value(component.normal_boiling_point_K))


def pair_title(catalogue: Catalogue, pair: PairOfComponents) -> str:
    c1 = catalogue.components[pair.component1]
    c2 = catalogue.components[pair.component2]
    return f"{one_line(c1.name)} + {one_line(c2.name)}"
