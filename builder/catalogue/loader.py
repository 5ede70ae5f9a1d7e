"""Load and validate the YAML catalogue into frozen records.

Layout of a catalogue folder (the shipped one is ``pairs/``)::

    references/<id>.yaml   one published work per file
    components/<id>.yaml   one pure component per file
    binaries/<id1>--<id2>.yaml   one pair per file

Loading is strict: unknown keys, missing fields, numbers without units where
a unit is required, wrong types and references to unknown ids are all
errors naming the file, the entry and the field.  Every problem in the whole
catalogue is collected and reported at once (:class:`CatalogueErrors`).
Only ``yaml.safe_load`` is used.  The file format is described in
``DEVELOPERS.md``.
"""

from __future__ import annotations

import math
from collections.abc import Callable, Iterable, Mapping
from dataclasses import dataclass
from pathlib import Path
from typing import Any, TypeVar

import yaml

from builder.catalogue.group_tables import DEFAULT_GROUPS, group_tables
from builder.catalogue.groups import parse_groups
from builder.catalogue.records import (
    PAIR_SEPARATOR,
    SLUG,
    Component,
    PairRecord,
    RecordedAzeotrope,
    RecordedBehaviour,
    Reference,
    Source,
)
from builder.errors import CatalogueError, CatalogueErrors
from builder.thermo import activity as act
from builder.thermo.units import (
    GAS_CONSTANT_J_PER_MOL_K,
    UnitError,
    parse_quantity,
    split_quantity,
    to_si,
)
from builder.thermo.vapour_pressure import Antoine, ExtendedAntoine, VapourPressure

__all__ = ["DEFAULT_CATALOGUE", "Catalogue", "load_catalogue"]

#: The catalogue shipped with the project.
DEFAULT_CATALOGUE = Path(__file__).resolve().parents[2] / "pairs"

T = TypeVar("T")

_EXAMPLES = {
    "temperature": "'351.4 K' or '78.3 C'",
    "pressure": "'101.325 kPa', '1 atm' or '760 mmHg'",
    "molar_energy": "'-57.96 cal/mol', '1200 J/mol' or '150 K' (energy/R)",
    "molar_mass": "'46.07 g/mol'",
    "molar_volume": "'58.7 cm3/mol'",
}

QUALITIES = {
    "regressed": "fitted by its authors to measured VLE data",
    "predicted": "estimated by a predictive method, not fitted to data of this pair",
    "unverified": "transcribed from memory; not yet checked against the printed source",
    "ideal": "ideal-solution assumption (no mixture parameters)",
    "demo": "invented demonstration data, not for any use",
}

AZEOTROPE_KINDS = ("minimum-boiling", "maximum-boiling")


class _Entry:
    """Typed access to one mapping of a YAML file, recording every problem found."""

    def __init__(self, file: str, entry: str, data: Any, errors: list[CatalogueError],
                 prefix: str = "") -> None:
        self.file = file
        self.entry = entry
        self.errors = errors
        self.prefix = prefix
        self._errors_before = len(errors)
        if not isinstance(data, Mapping):
            self._fail("", "a mapping of field names to values", _show(data))
            data = {}
        self.data: Mapping[str, Any] = data
        self.used: set[str] = set()

    # -- reporting --------------------------------------------------------
    @property
    def ok(self) -> bool:
        """No problem recorded in this entry (or its children) so far."""
        return len(self.errors) == self._errors_before

    def _path(self, name: str) -> str:
        return f"{self.prefix}{name}" if name else self.prefix.rstrip(".")

    def _fail(self, name: str, expected: str, found: str) -> None:
        self.errors.append(CatalogueError(self.file, self.entry, self._path(name), expected, found))

    def fail(self, name: str, expected: str, found: Any) -> None:
        self._fail(name, expected, _show(found))

    def finish(self) -> None:
        """Report keys nobody asked for (typos, unsupported fields)."""
        for key in self.data:
            if key not in self.used:
                known = ", ".join(sorted(self.used)) or "none"
                self._fail(str(key), f"only known fields here ({known})", "an unknown field")

    # -- access -------------------------------------------------------------
    def has(self, name: str) -> bool:
        return name in self.data

    def raw(self, name: str, default: Any = ..., expected: str = "a value") -> Any:
        self.used.add(name)
        if name not in self.data or self.data[name] is None:
            if default is ...:
                self._fail(name, expected, "nothing (the field is missing)")
                return None
            return default
        return self.data[name]

    def text(self, name: str, default: Any = ...) -> str:
        value = self.raw(name, default, "a text")
        if value is None:
            return ""
        if default is not ... and value is default:
            return str(value)
        if not isinstance(value, str) or not value.strip():
            self.fail(name, "a non-empty text", value)
            return ""
        return value.strip()

    def slug(self, name: str) -> str:
        value = self.text(name)
        if value and not SLUG.match(value):
            self.fail(name, "a slug of lower-case letters, digits and single hyphens", value)
            return ""
        return value

    def number(self, name: str, default: Any = ..., positive: bool = False) -> float:
        value = self.raw(name, default, "a number")
        if value is None:
            return math.nan
        if (isinstance(value, bool) or not isinstance(value, (int, float))
                or not math.isfinite(value)):
            self.fail(name, "a plain number", value)
            return math.nan
        if positive and value <= 0:
            self.fail(name, "a positive number", value)
        return float(value)

    def quantity(self, name: str, dimension: str) -> float:
        """A required dimensional value, converted to SI (NaN and an error if missing)."""
        value = self.raw(name, expected=f"a {dimension.replace('_', ' ')} with a unit")
        if value is None:
            return math.nan
        return self.convert(name, value, dimension)

    def convert(self, name: str, value: Any, dimension: str) -> float:
        expected = f"a {dimension.replace('_', ' ')} with a unit, such as {_EXAMPLES[dimension]}"
        if not isinstance(value, str):
            self.fail(name, expected, value)
            return math.nan
        try:
            if dimension in ("temperature", "pressure"):
                return parse_quantity(value, dimension)
            number, unit = split_quantity(value)
            result = to_si(number, unit, dimension)
        except UnitError as error:
            self.fail(name, expected + f" ({error})", value)
            return math.nan
        if dimension in ("molar_mass", "molar_volume") and result <= 0:
            self.fail(name, f"a positive {dimension.replace('_', ' ')}", value)
        return result

    def choice(self, name: str, options: Iterable[str], default: Any = ...) -> str:
        options = tuple(options)
        value = self.raw(name, default, "one of " + ", ".join(options))
        if value is None:
            return ""
        if value not in options:
            self.fail(name, "one of " + ", ".join(repr(o) for o in options), value)
            return ""
        return str(value)

    def text_list(self, name: str) -> tuple[str, ...]:
        value = self.raw(name, [], "a list of texts")
        if not isinstance(value, list) or not all(isinstance(v, str) and v.strip() for v in value):
            self.fail(name, "a list of non-empty texts", value)
            return ()
        return tuple(v.strip() for v in value)

    def child(self, name: str, default: Any = ...) -> _Entry | None:
        value = self.raw(name, default, "a mapping")
        if value is None:
            return None
        return _Entry(self.file, self.entry, value, self.errors, prefix=f"{self._path(name)}.")

    def boolean(self, name: str, default: Any = ...) -> bool | None:
        value = self.raw(name, default, "true or false")
        if value is None:
            return None
        if not isinstance(value, bool):
            self.fail(name, "true or false", value)
            return None
        return value


def _show(value: Any) -> str:
    text = repr(value)
    return text if len(text) <= 80 else text[:77] + "..."


# ---------------------------------------------------------------------------
# Field groups shared by several record kinds
# ---------------------------------------------------------------------------


def _source(entry: _Entry, name: str, references: Mapping[str, Reference],
            required: bool = True) -> Source | None:
    block = entry.child(name, ... if required else None)
    if block is None:
        return None
    ref = block.slug("ref")
    if ref and ref not in references:
        block.fail("ref", "the id of a file in references/", ref)
    source = Source(
        ref=ref,
        where=block.text("where"),
        note=block.text("note", ""),
        from_memory=bool(block.boolean("from_memory", False)),
    )
    block.finish()
    return source


def _vapour_pressure(entry: _Entry) -> VapourPressure | None:
    equation = entry.choice("equation", ("antoine", "dippr101"))
    T_min = entry.quantity("T_min", "temperature")
    T_max = entry.quantity("T_max", "temperature")
    if math.isfinite(T_min) and math.isfinite(T_max) and T_min >= T_max:
        entry.fail("T_max", f"a temperature above T_min ({T_min:.2f} K)", f"{T_max:.2f} K")
    P_unit = entry.choice("pressure_unit", ("Pa", "kPa", "bar", "mmHg", "atm", "MPa"))
    A, B, C = entry.number("A"), entry.number("B"), entry.number("C")
    if equation == "antoine":
        log = entry.choice("log", ("10", "e"))
        T_unit = entry.choice("temperature_unit", ("K", "C"))
        if not (entry.ok and log and T_unit and P_unit):
            return None
        return Antoine.from_published(A, B, C, log_base="10" if log == "10" else "e",
                                      P_unit=P_unit, T_unit="K" if T_unit == "K" else "C",
                                      T_min_K=T_min, T_max_K=T_max)
    if equation == "dippr101":
        D, E = entry.number("D"), entry.number("E")
        if not (entry.ok and P_unit):
            return None
        return ExtendedAntoine.from_published(A, B, C, D, E, P_unit=P_unit, T_min_K=T_min,
                                              T_max_K=T_max)
    return None


# ---------------------------------------------------------------------------
# Files
# ---------------------------------------------------------------------------


def _read_yaml(path: Path, root: Path, errors: list[CatalogueError]) -> Any:
    shown = _display(path, root)
    try:
        with path.open(encoding="utf-8") as handle:
            return yaml.safe_load(handle)
    except yaml.YAMLError as error:
        mark = getattr(error, "problem_mark", None)
        where = f" at line {mark.line + 1}, column {mark.column + 1}" if mark else ""
        errors.append(CatalogueError(shown, path.stem, "", "valid YAML",
                                     f"a syntax error{where}: {getattr(error, 'problem', error)}"))
    except OSError as error:
        errors.append(CatalogueError(shown, path.stem, "", "a readable file", str(error)))
    return None


def _display(path: Path, root: Path) -> str:
    try:
        return str(path.relative_to(root.parent))
    except ValueError:
        return str(path)


def _load_reference(entry: _Entry) -> Reference:
    year = entry.number("year")
    if math.isfinite(year) and not (1800 <= year <= 2100 and year == int(year)):
        entry.fail("year", "a four-digit year", year)
    reference = Reference(
        id=entry.slug("id"),
        authors=entry.text("authors"),
        title=entry.text("title"),
        year=int(year) if math.isfinite(year) else 0,
        kind=entry.choice("kind", ("book", "article", "database", "handbook", "standard",
                                   "software")),
        publisher=entry.text("publisher", ""),
        journal=entry.text("journal", ""),
        volume=str(entry.raw("volume", "")),
        pages=str(entry.raw("pages", "")),
        edition=entry.text("edition", ""),
        doi=entry.text("doi", ""),
        note=entry.text("note", ""),
    )
    entry.finish()
    return reference


_CONSTANTS = {
    "molar_mass": "molar_mass",
    "normal_boiling_point": "temperature",
    "critical_temperature": "temperature",
    "critical_pressure": "pressure",
    "liquid_molar_volume": "molar_volume",
}


def _load_component(entry: _Entry, references: Mapping[str, Reference],
                    groups_folder: Path = DEFAULT_GROUPS) -> Component | None:
    cid = entry.slug("id")
    name = entry.text("name")
    synonyms = entry.text_list("synonyms")
    cas = entry.text("cas")
    if cas and not _valid_cas(cas):
        entry.fail("cas", "a CAS registry number with a valid check digit, such as '64-17-5'", cas)
    formula = entry.text("formula")
    hazard_block = entry.child("hazard")
    hazard, hazard_source = "", None
    if hazard_block is not None:
        hazard = hazard_block.text("summary")
        hazard_source = _source(hazard_block, "source", references)
        hazard_block.finish()

    constants = entry.child("constants")
    values: dict[str, float] = {}
    sources: dict[str, Source] = {}
    if constants is not None:
        default_source = _source(constants, "source", references)
        for key, dimension in [*_CONSTANTS.items(), ("acentric_factor", "")]:
            raw = constants.raw(key, expected="a value with a unit" if dimension else "a number")
            own_source = None
            if isinstance(raw, Mapping):
                sub = constants.child(key)
                assert sub is not None
                raw = sub.raw("value")
                own_source = _source(sub, "source", references)
                sub.finish()
            if raw is None:
                continue
            if dimension:
                values[key] = constants.convert(key, raw, dimension)
            elif isinstance(raw, (int, float)) and not isinstance(raw, bool):
                values[key] = float(raw)
            else:
                constants.fail(key, "a plain number", raw)
            chosen = own_source or default_source
            if chosen is not None:
                sources[key] = chosen
        constants.finish()

    uniquac = entry.child("uniquac", None)
    r = q = None
    uniquac_source = None
    if uniquac is not None:
        r = uniquac.number("r", positive=True)
        q = uniquac.number("q", positive=True)
        uniquac_source = _source(uniquac, "source", references)
        uniquac.finish()

    groups_block = entry.child("groups", None)
    groups = None
    if groups_block is not None:
        groups = parse_groups(groups_block, lambda b: _source(b, "source", references),
                              lambda v: group_tables(v, groups_folder), formula,
                              values.get("molar_mass", math.nan))

    vp_block = entry.child("vapour_pressure")
    vapour_pressure = vp_source = None
    if vp_block is not None:
        vapour_pressure = _vapour_pressure(vp_block)
        vp_source = _source(vp_block, "source", references)
        vp_block.finish()
    entry.finish()

    if not entry.ok or vapour_pressure is None or vp_source is None:
        return None
    Tb, Tc = values["normal_boiling_point"], values["critical_temperature"]
    if Tb >= Tc:
        entry.fail("constants.normal_boiling_point",
                   f"a temperature below the critical temperature ({Tc:.2f} K)", f"{Tb:.2f} K")
        return None
    return Component(
        id=cid, name=name, synonyms=synonyms, cas=cas, formula=formula,
        molar_mass_kg_per_mol=values["molar_mass"],
        normal_boiling_point_K=Tb,
        critical_temperature_K=Tc,
        critical_pressure_Pa=values["critical_pressure"],
        acentric_factor=values["acentric_factor"],
        liquid_molar_volume_m3_per_mol=values["liquid_molar_volume"],
        vapour_pressure=vapour_pressure, vapour_pressure_source=vp_source,
        constants_sources=sources, hazard=hazard, hazard_source=hazard_source,
        uniquac_r=r, uniquac_q=q, uniquac_source=uniquac_source, file=entry.file,
        groups=groups,
    )


def _valid_cas(cas: str) -> bool:
    """CAS numbers end in a check digit: the weighted digit sum mod 10.

    >>> _valid_cas("64-17-5"), _valid_cas("64-17-6")
    (True, False)
    """
    parts = cas.split("-")
    if len(parts) != 3 or not all(p.isdigit() for p in parts) or len(parts[2]) != 1:
        return False
    digits = (parts[0] + parts[1])[::-1]
    total = sum((i + 1) * int(d) for i, d in enumerate(digits))
    return total % 10 == int(parts[2])


# -- activity parameters -----------------------------------------------------


def _temperature_function(entry: _Entry, name: str) -> act.TemperatureFunction:
    """A dimensionless parameter: a number, or ``{a, b: '... K', c, d: '... 1/K'}``."""
    raw = entry.raw(name, expected="a number or a mapping of a, b, c, d")
    if raw is None:
        return act.TemperatureFunction()
    if isinstance(raw, (int, float)) and not isinstance(raw, bool):
        return act.TemperatureFunction(a=float(raw))
    block = entry.child(name)
    assert block is not None
    a = block.number("a", 0.0)
    b = _kelvin(block, "b", block.raw("b")) if block.has("b") else 0.0
    c = block.number("c", 0.0)
    d = 0.0
    if block.has("d"):
        d_raw = block.raw("d")
        d = _per_kelvin(block, "d", d_raw)
    block.finish()
    return act.TemperatureFunction(a=a, b=b, c=c, d=d)


def _coefficient(entry: _Entry, name: str, raw: Any, unit: str, example: str) -> float:
    """A signed coefficient that must carry exactly ``unit`` (K or 1/K)."""
    if isinstance(raw, str):
        try:
            number, found = split_quantity(raw)
        except UnitError:
            found = ""
        if found == unit:
            return number
    entry.fail(name, f"a coefficient with the unit {unit}, such as {example!r}", raw)
    return 0.0


def _kelvin(entry: _Entry, name: str, raw: Any) -> float:
    return _coefficient(entry, name, raw, "K", "-103.3 K")


def _per_kelvin(entry: _Entry, name: str, raw: Any) -> float:
    return _coefficient(entry, name, raw, "1/K", "-0.00523 1/K")


def _energy_over_R(entry: _Entry, name: str) -> float:
    """An interaction energy in J/mol, cal/mol or K, returned as energy/R in K."""
    return entry.quantity(name, "molar_energy") / GAS_CONSTANT_J_PER_MOL_K


def _pick(entry: _Entry, energy: tuple[str, str], direct: tuple[str, str],
          fail: Callable[[str], None]) -> str:
    has_energy = entry.has(energy[0]) or entry.has(energy[1])
    has_direct = entry.has(direct[0]) or entry.has(direct[1])
    if has_energy == has_direct:
        fail(f"either {energy[0]}/{energy[1]} (interaction energies with units) or "
             f"{direct[0]}/{direct[1]} (dimensionless temperature functions), not both")
        return ""
    return "energy" if has_energy else "direct"


def _build_margules(entry: _Entry, c1: Component, c2: Component,
                    fail: Callable[[str], None]) -> act.ActivityModel:
    return act.Margules(_temperature_function(entry, "A12"), _temperature_function(entry, "A21"))


def _build_van_laar(entry: _Entry, c1: Component, c2: Component,
                    fail: Callable[[str], None]) -> act.ActivityModel:
    A12, A21 = _temperature_function(entry, "A12"), _temperature_function(entry, "A21")
    if A12.a * A21.a < 0 and not (A12.b or A21.b):
        entry.fail("A21", "the same sign as A12 (van Laar is singular otherwise)", A21.a)
    return act.VanLaar(A12, A21)


def _build_wilson(entry: _Entry, c1: Component, c2: Component,
                  fail: Callable[[str], None]) -> act.ActivityModel | None:
    form = _pick(entry, ("lambda12", "lambda21"), ("ln_Lambda12", "ln_Lambda21"), fail)
    if form == "energy":
        # Λ12 = (V2/V1) exp(-Δλ12/RT), Λ21 = (V1/V2) exp(-Δλ21/RT)
        ratio = math.log(c2.liquid_molar_volume_m3_per_mol / c1.liquid_molar_volume_m3_per_mol)
        return act.Wilson(act.TemperatureFunction(a=ratio, b=-_energy_over_R(entry, "lambda12")),
                          act.TemperatureFunction(a=-ratio, b=-_energy_over_R(entry, "lambda21")))
    if form == "direct":
        return act.Wilson(_temperature_function(entry, "ln_Lambda12"),
                          _temperature_function(entry, "ln_Lambda21"))
    return None


def _build_nrtl(entry: _Entry, c1: Component, c2: Component,
                fail: Callable[[str], None]) -> act.ActivityModel | None:
    form = _pick(entry, ("g12", "g21"), ("tau12", "tau21"), fail)
    alpha = _temperature_function(entry, "alpha")
    if not (0.0 <= alpha.a <= 1.0):
        entry.fail("alpha", "a non-randomness α between 0 and 1", alpha.a)
    if form == "energy":
        return act.NRTL(act.TemperatureFunction(b=_energy_over_R(entry, "g12")),
                        act.TemperatureFunction(b=_energy_over_R(entry, "g21")), alpha)
    if form == "direct":
        return act.NRTL(_temperature_function(entry, "tau12"),
                        _temperature_function(entry, "tau21"), alpha)
    return None


def _build_uniquac(entry: _Entry, c1: Component, c2: Component,
                   fail: Callable[[str], None]) -> act.ActivityModel | None:
    missing = [c.id for c in (c1, c2) if c.uniquac_r is None or c.uniquac_q is None]
    if missing:
        fail("components with UNIQUAC r and q; missing for " + ", ".join(missing))
        return None
    form = _pick(entry, ("u12", "u21"), ("ln_tau12", "ln_tau21"), fail)
    if form == "energy":
        ln12 = act.TemperatureFunction(b=-_energy_over_R(entry, "u12"))
        ln21 = act.TemperatureFunction(b=-_energy_over_R(entry, "u21"))
    elif form == "direct":
        ln12 = _temperature_function(entry, "ln_tau12")
        ln21 = _temperature_function(entry, "ln_tau21")
    else:
        return None
    assert c1.uniquac_r and c1.uniquac_q and c2.uniquac_r and c2.uniquac_q
    return act.UNIQUAC(ln12, ln21, c1.uniquac_r, c2.uniquac_r, c1.uniquac_q, c2.uniquac_q)


def _build_ideal(entry: _Entry, c1: Component, c2: Component,
                 fail: Callable[[str], None]) -> act.ActivityModel:
    return act.Ideal()


_MODELS: dict[str, Callable[..., act.ActivityModel | None]] = {
    "ideal": _build_ideal,
    "margules": _build_margules,
    "van-laar": _build_van_laar,
    "wilson": _build_wilson,
    "nrtl": _build_nrtl,
    "uniquac": _build_uniquac,
}


def _load_pair(entry: _Entry, components: Mapping[str, Component],
               references: Mapping[str, Reference], broken: set[str]) -> PairRecord | None:
    pid = entry.text("id")
    ids: tuple[str, ...] = entry.text_list("components")
    if len(ids) != 2 or ids[0] == ids[1]:
        entry.fail("components", "two different component ids", list(ids))
        ids = ()
    if any(cid in broken for cid in ids):
        # The component's own errors are reported; the pair is not loaded.
        entry.used.update(entry.data)
        return None
    for cid in ids:
        if cid not in components:
            entry.fail("components", "ids of files in components/", cid)
    if pid and ids and pid != PAIR_SEPARATOR.join(ids):
        entry.fail("id", f"the two component ids joined by '{PAIR_SEPARATOR}' "
                   f"({PAIR_SEPARATOR.join(ids)!r})", pid)

    model_block = entry.child("activity")
    model = None
    kind = ""
    T_min = T_max = math.nan
    source: Source | None = None
    quality = ""
    published: dict[str, str] = {}
    if model_block is not None:
        kind = model_block.choice("model", tuple(_MODELS))
        params = model_block.child("parameters", {} if kind == "ideal" else ...)
        T_range = model_block.raw("T_range", expected="a list of two temperatures")
        if isinstance(T_range, list) and len(T_range) == 2:
            T_min = model_block.convert("T_range", T_range[0], "temperature")
            T_max = model_block.convert("T_range", T_range[1], "temperature")
            if T_min >= T_max:
                model_block.fail("T_range", "a lower then a higher temperature", T_range)
        elif T_range is not None:
            model_block.fail("T_range", "a list of two temperatures, such as ['50 C', '100 C']",
                             T_range)
        source = _source(model_block, "source", references)
        quality = model_block.choice("quality", tuple(QUALITIES))
        model_block.finish()
        if params is not None and kind and all(c in components for c in ids) and ids:
            published = {str(k): str(v) for k, v in params.data.items()}

            def fail(expected: str, _block: _Entry = params) -> None:
                _block.fail("", expected, sorted(_block.data))

            model = _MODELS[kind](params, components[ids[0]], components[ids[1]], fail)
            params.finish()

    publish = entry.child("publish", {})
    isobars: tuple[float, ...] = (101325.0,)
    isotherms: tuple[float, ...] = ()
    if publish is not None:
        isobars = _quantity_list(publish, "isobars", "pressure", [101325.0])
        isotherms = _quantity_list(publish, "isotherms", "temperature", [])
        publish.finish()

    recorded = _recorded(entry, references)
    split = _split(entry)
    notes = entry.text("notes", "")
    tags = entry.text_list("tags")
    entry.finish()
    if not entry.ok or model is None or source is None or len(ids) != 2:
        return None
    first, second = ids
    return PairRecord(
        id=pid, component1=first, component2=second, model=model, model_kind=kind,
        published_parameters=published, T_min_K=T_min, T_max_K=T_max, source=source,
        quality=quality, isobars_Pa=isobars, isotherms_K=isotherms, recorded=recorded,
        notes=notes, file=entry.file, tags=tags, split_x1=split,
    )


def _split(entry: _Entry) -> tuple[float, float, float] | None:
    block = entry.child("split", None)
    if block is None:
        return None
    values = tuple(block.number(k) for k in ("distillate_x1", "bottoms_x1", "feed_x1"))
    block.finish()
    if not all(0.0 < v < 1.0 for v in values):
        entry.fail("split", "mole fractions strictly between 0 and 1", list(values))
        return None
    D, B, F = values
    if not (min(D, B) < F < max(D, B)):
        entry.fail("split.feed_x1", "a feed between the bottoms and the distillate", F)
        return None
    return D, B, F


def _quantity_list(entry: _Entry, name: str, dimension: str, default: list[float]
                   ) -> tuple[float, ...]:
    raw = entry.raw(name, default)
    if not isinstance(raw, list):
        entry.fail(name, f"a list of {dimension}s with units", raw)
        return ()
    if raw is default:
        return tuple(default)
    return tuple(entry.convert(name, item, dimension) for item in raw)


def _recorded(entry: _Entry, references: Mapping[str, Reference]) -> RecordedBehaviour | None:
    block = entry.child("recorded", None)
    if block is None:
        return None
    azeotropes: list[RecordedAzeotrope] = []
    raw_list = block.raw("azeotropes", [])
    if not isinstance(raw_list, list):
        block.fail("azeotropes", "a list of azeotropes", raw_list)
        raw_list = []
    for index, item in enumerate(raw_list):
        az = _Entry(entry.file, entry.entry, item, entry.errors,
                    prefix=f"{block.prefix}azeotropes[{index}].")
        P = az.quantity("P", "pressure")
        T_az = az.quantity("T", "temperature") if az.has("T") else None
        x1 = az.number("x1", None) if az.has("x1") else None
        if x1 is not None and not (0.0 < x1 < 1.0):
            az.fail("x1", "a mole fraction strictly between 0 and 1", x1)
        kind = az.choice("kind", AZEOTROPE_KINDS)
        src = _source(az, "source", references)
        az.finish()
        if src is not None:
            azeotropes.append(RecordedAzeotrope(P_Pa=P, T_K=T_az, x1=x1, kind=kind, source=src))
    zeotropic = _quantity_list(block, "zeotropic_at", "pressure", [])
    split = block.boolean("liquid_split", None)
    source = _source(block, "source", references, required=False)
    block.finish()
    return RecordedBehaviour(tuple(azeotropes), zeotropic, split, source)


# ---------------------------------------------------------------------------
# The catalogue
# ---------------------------------------------------------------------------


@dataclass(frozen=True)
class Catalogue:
    """Every reference, component and pair of one catalogue folder, validated."""

    root: Path
    references: dict[str, Reference]
    components: dict[str, Component]
    pairs: dict[str, PairRecord]

    def pair_of(self, first: str, second: str) -> tuple[PairRecord, bool] | None:
        """The pair of two component ids in either order, and whether it is swapped."""
        direct = self.pairs.get(f"{first}{PAIR_SEPARATOR}{second}")
        if direct is not None:
            return direct, False
        reverse = self.pairs.get(f"{second}{PAIR_SEPARATOR}{first}")
        if reverse is not None:
            return reverse, True
        return None

    def source_text(self, source: Source | None) -> str:
        return source.text(self.references) if source else ""


def _files(folder: Path) -> list[Path]:
    return sorted(folder.glob("*.yaml")) if folder.is_dir() else []


def load_catalogue(root: Path | str = DEFAULT_CATALOGUE, only: Iterable[str] = ()) -> Catalogue:
    """Read, validate and convert a catalogue folder; raise :class:`CatalogueErrors`.

    ``only`` restricts the pairs loaded to the given pair ids (components and
    references are always loaded in full, since pairs refer to them).
    """
    root = Path(root)
    errors: list[CatalogueError] = []
    if not root.is_dir():
        raise CatalogueErrors([CatalogueError(str(root), "", "", "a catalogue folder with "
                                              "references/, components/ and binaries/",
                                              "no such folder")])

    def load_all(folder: str, loader: Callable[[_Entry], T | None]) -> dict[str, T]:
        out: dict[str, T] = {}
        for path in _files(root / folder):
            data = _read_yaml(path, root, errors)
            if data is None and errors and errors[-1].file == _display(path, root):
                continue
            entry_name = data.get("id", path.stem) if isinstance(data, Mapping) else path.stem
            entry = _Entry(_display(path, root), str(entry_name), data, errors)
            record = loader(entry)
            if record is None:
                continue
            rid = str(getattr(record, "id"))  # noqa: B009 - every record kind has an id
            if rid != path.stem:
                entry.fail("id", f"the file name without .yaml ({path.stem!r})", rid)
            elif rid in out:
                entry.fail("id", "an id used by no other file", rid)
            else:
                out[rid] = record
        return out

    references = load_all("references", _load_reference)
    groups_folder = root / "groups" if (root / "groups").is_dir() else DEFAULT_GROUPS
    components = load_all("components", lambda e: _load_component(e, references, groups_folder))
    broken = {p.stem for p in _files(root / "components")} - set(components)
    wanted = set(only)
    pairs = load_all("binaries", lambda e: _load_pair(e, components, references, broken))
    if wanted:
        unknown = wanted - set(pairs)
        for name in sorted(unknown):
            errors.append(CatalogueError(str(root / "binaries"), name, "", "a pair in the "
                                         "catalogue", "no such pair file"))
        pairs = {k: v for k, v in pairs.items() if k in wanted}
    _check_names_unique(components, errors)
    if errors:
        raise CatalogueErrors(errors)
    return Catalogue(root=root, references=references, components=components, pairs=pairs)


def _check_names_unique(components: Mapping[str, Component], errors: list[CatalogueError]) -> None:
    """A name, synonym or CAS number must point to one component only."""
    owner: dict[str, str] = {}
    for component in components.values():
        for name in {n.casefold() for n in component.names() if n != component.formula}:
            other = owner.setdefault(name, component.id)
            if other != component.id:
                errors.append(CatalogueError(component.file, component.id, "synonyms",
                                             f"names not used by another component ({other})",
                                             repr(name)))
