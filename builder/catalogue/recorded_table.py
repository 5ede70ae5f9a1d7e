"""``pairs/recorded-azeotropes.yaml``: published azeotropic behaviour of unfitted pairs.

The reference data of the UNIFAC deviation table: for combinations of catalogued
components without a fitted set, what a published azeotrope table records at
101.325 kPa (behaviour, whether two liquids form, temperature, mass fraction).
Read strictly: every problem names the file, the entry (the pair) and the field.
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import yaml

from builder.catalogue.loader import DEFAULT_CATALOGUE, Catalogue
from builder.catalogue.records import Source
from builder.errors import CatalogueError, CatalogueErrors
from builder.thermo.units import UnitError, parse_quantity

__all__ = ["BEHAVIOURS", "RECORDED_FILE", "RecordedCombination", "load_recorded_azeotropes"]

#: The shipped file.
RECORDED_FILE = DEFAULT_CATALOGUE / "recorded-azeotropes.yaml"

BEHAVIOURS = ("minimum-boiling", "maximum-boiling", "zeotropic")


@dataclass(frozen=True)
class RecordedCombination:
    """What a published table records for one pair at 101.325 kPa."""

    component1: str
    component2: str
    behaviour: str                 # minimum-boiling, maximum-boiling or zeotropic
    heterogeneous: bool | None     # None: the table does not say
    T_K: float | None
    x1: float | None               # mole fraction of component 1 (from the mass fraction)
    w1: float | None               # mass fraction of component 1, as tabulated
    source: Source

    @property
    def behaviour_class(self) -> str:
        """zeotropic, minimum-boiling, maximum-boiling or heterogeneous."""
        return "heterogeneous" if self.heterogeneous else self.behaviour


def _fail(errors: list[CatalogueError], file: str, entry: str, field: str, expected: str,
          found: Any) -> None:
    errors.append(CatalogueError(file, entry, field, expected, repr(found)[:80]))


def _source(raw: Any, file: str, entry: str, refs: Mapping[str, Any],
            errors: list[CatalogueError]) -> Source | None:
    if not isinstance(raw, Mapping) or not isinstance(raw.get("ref"), str) \
            or not isinstance(raw.get("where"), str) \
            or set(raw) - {"ref", "where", "note", "from_memory"}:
        _fail(errors, file, entry, "source", "a source block {ref, where, note, from_memory}",
              raw)
        return None
    if raw["ref"] not in refs:
        _fail(errors, file, entry, "source.ref", "the id of a file in references/", raw["ref"])
        return None
    return Source(ref=raw["ref"], where=raw["where"], note=str(raw.get("note", "")),
                  from_memory=bool(raw.get("from_memory", False)))


def load_recorded_azeotropes(catalogue: Catalogue, path: Path | str = RECORDED_FILE
                             ) -> list[RecordedCombination]:
    """Read and validate the file against the catalogue; raise :class:`CatalogueErrors`."""
    path = Path(path)
    file = str(path)
    errors: list[CatalogueError] = []
    try:
        data = yaml.safe_load(path.read_text(encoding="utf-8"))
    except (OSError, yaml.YAMLError) as error:
        raise CatalogueErrors([CatalogueError(file, path.stem, "", "a readable YAML file",
                                              str(error).split("\n")[0])]) from error
    if not isinstance(data, Mapping) or set(data) != {"source", "combinations"}:
        raise CatalogueErrors([CatalogueError(file, path.stem, "", "the fields source and "
                                              "combinations", repr(data)[:80])])
    default = _source(data["source"], file, path.stem, catalogue.references, errors)
    rows = data["combinations"] if isinstance(data["combinations"], list) else []
    out: list[RecordedCombination] = []
    seen: set[frozenset[str]] = set()
    for index, raw in enumerate(rows):
        entry = f"combinations[{index}]"
        if not isinstance(raw, Mapping):
            _fail(errors, file, entry, "", "a mapping", raw)
            continue
        ids = raw.get("components")
        if isinstance(ids, list) and len(ids) == 2:
            entry = "--".join(str(i) for i in ids)
        known = {"components", "behaviour", "heterogeneous", "T", "w1", "source"}
        for key in set(raw) - known:
            _fail(errors, file, entry, str(key), f"only known fields ({', '.join(sorted(known))})",
                  "an unknown field")
        if not (isinstance(ids, list) and len(ids) == 2 and ids[0] != ids[1]
                and all(i in catalogue.components for i in ids)):
            _fail(errors, file, entry, "components", "two different catalogued component ids",
                  ids)
            continue
        if frozenset(ids) in seen:
            _fail(errors, file, entry, "components", "a pair listed once", ids)
            continue
        seen.add(frozenset(ids))
        if catalogue.pair_of(ids[0], ids[1]) is not None:
            _fail(errors, file, entry, "components", "a pair without a fitted set", ids)
        behaviour = raw.get("behaviour")
        if behaviour not in BEHAVIOURS:
            _fail(errors, file, entry, "behaviour", "one of " + ", ".join(BEHAVIOURS), behaviour)
            continue
        hetero = raw.get("heterogeneous")
        if hetero is not None and not isinstance(hetero, bool):
            _fail(errors, file, entry, "heterogeneous", "true or false", hetero)
            continue
        T_K = w1 = x1 = None
        if behaviour != "zeotropic":
            try:
                T_K = parse_quantity(str(raw.get("T")), "temperature")
            except UnitError:
                _fail(errors, file, entry, "T", "a temperature with a unit, such as '78.2 C'",
                      raw.get("T"))
                continue
            w1 = raw.get("w1")
            if isinstance(w1, bool) or not isinstance(w1, (int, float)) \
                    or not (0.0 < w1 < 1.0) or not math.isfinite(w1):
                _fail(errors, file, entry, "w1", "a mass fraction strictly between 0 and 1", w1)
                continue
            M1, M2 = (catalogue.components[i].molar_mass_kg_per_mol for i in ids)
            x1 = (w1 / M1) / (w1 / M1 + (1.0 - w1) / M2)
        elif "T" in raw or "w1" in raw:
            _fail(errors, file, entry, "T", "no azeotrope data for a zeotropic pair", raw)
            continue
        source = (_source(raw["source"], file, entry, catalogue.references, errors)
                  if "source" in raw else default)
        if source is None:
            continue
        out.append(RecordedCombination(ids[0], ids[1], behaviour, hetero, T_K, x1,
                                       None if w1 is None else float(w1), source))
    if errors:
        raise CatalogueErrors(errors)
    return out
