"""Load and validate the YAML catalogue into frozen records.

Layout of a catalogue folder (the shipped one is ``pairs/``)::

    references/<id>.yaml   one published work per file
    components/<id>.yaml   one pure component per file
    binaries/<id1>--<id2>.yaml   one pair per file

Loading is strict: unknown keys, missing fields, numbers without units where
a unit is required, values outside their physical range, wrong types and
references to unknown ids are all errors naming the file, the entry and the
field.  Every field's kind, unit and range is declared once, in
:mod:`builder.catalogue.fields` (the JSON Schema is generated from the same
declarations); files are read by :mod:`builder.catalogue.reader` (bounded
size and depth, no duplicate keys, safe YAML only) and every correlation and
activity model is checked numerically over its range
(:mod:`builder.catalogue.soundness`).  Every problem in the whole catalogue is
collected and reported at once (:class:`CatalogueErrors`).  The file format is
described in ``DEVELOPERS.md``.
"""

from __future__ import annotations

import math
import re
from collections.abc import Callable, Iterable, Mapping
from dataclasses import dataclass
from dataclasses import replace as _replace
from pathlib import Path
from typing import Any, TypeVar

from builder.catalogue import fields
from builder.catalogue import vapour as vapour_fields
from builder.catalogue.fields import AZEOTROPE_KINDS, QUALITIES, Block, Field
from builder.catalogue.group_tables import DEFAULT_GROUPS, group_tables
from builder.catalogue.groups import parse_groups
from builder.catalogue.reader import ReadProblem, read_yaml
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
from builder.catalogue.soundness import model_problem, vapour_pressure_problem
from builder.errors import CatalogueError, CatalogueErrors
from builder.thermo import activity as act
from builder.thermo.cubic import EquationOfStateLiquid
from builder.thermo.units import (
    GAS_CONSTANT_J_PER_MOL_K,
    SI_UNIT,
    UnitError,
    parse_quantity,
    split_quantity,
    to_si,
)
from builder.thermo.vapour_pressure import Antoine, ExtendedAntoine, VapourPressure

__all__ = ["AZEOTROPE_KINDS", "DEFAULT_CATALOGUE", "QUALITIES", "Catalogue", "load_catalogue"]

#: The catalogue shipped with the project.
DEFAULT_CATALOGUE = Path(__file__).resolve().parents[2] / "pairs"

T = TypeVar("T")


class _Entry:
    """One mapping of a YAML file read through its declared :class:`Block`.

    Every value is read with :meth:`get`, which applies the field's declared kind,
    unit and range (:mod:`builder.catalogue.fields`) and records each problem with
    the file, entry and field.  :meth:`finish` reports undeclared keys, missing
    required fields and incomplete alternatives.
    """

    def __init__(self, file: str, entry: str, data: Any, errors: list[CatalogueError],
                 block: Block, prefix: str = "", variant: str = "") -> None:
        self.file = file
        self.entry = entry
        self.errors = errors
        self.prefix = prefix
        self.block = block
        self.variant = variant
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
        """Report undeclared keys, missing required fields and incomplete alternatives."""
        declared = self.block.all_fields(self.variant)
        other_variants = {f.name for fs in self.block.variants.values() for f in fs}
        for key in self.data:
            if key in declared or key in self.used:
                continue
            if not self.variant and key in other_variants:
                continue  # the selector itself is wrong and reported
            known = ", ".join(sorted(declared)) or "none"
            self._fail(str(key), f"only known fields here ({known})", "an unknown field")
        for name, spec in declared.items():
            if spec.required and name not in self.used and self.data.get(name) is None:
                self._fail(name, _expected(spec), "nothing (the field is missing)")
        if self.block.one_of:
            given = [g for g in self.block.one_of if any(self.data.get(k) is not None
                                                         for k in g)]
            if len(given) != 1:
                forms = " or ".join("/".join(g) for g in self.block.one_of)
                self._fail("", f"exactly one of {forms}",
                           ", ".join(sorted(map(str, self.data))) or "none of them")
            else:
                for name in given[0]:
                    if self.data.get(name) is None:
                        self._fail(name, _expected(declared[name]),
                                   "nothing (the field is missing)")

    # -- access -------------------------------------------------------------
    def has(self, name: str) -> bool:
        return self.data.get(name) is not None

    def spec(self, name: str) -> Field:
        return self.block.field(name, self.variant)

    def get(self, name: str) -> Any:
        """The value of a declared field, converted to SI and checked against its range.

        A missing optional field gives None; a bad or missing required one records a
        located error and gives an empty value of the field's type (NaN for numbers).
        """
        spec = self.spec(name)
        self.used.add(name)
        raw = self.data.get(name)
        if raw is None:
            if spec.required:
                self._fail(name, _expected(spec), "nothing (the field is missing)")
                return _EMPTY.get(spec.kind)
            return None
        return _READERS[spec.kind](self, spec, raw)

    def child(self, name: str) -> _Entry | None:
        """A nested block (None when absent; an error when required and absent).

        A block with a selector (``model``, ``equation``) is read with the fields of the
        selected variant.
        """
        spec = self.spec(name)
        assert spec.block is not None
        self.used.add(name)
        raw = self.data.get(name)
        if raw is None:
            if spec.required:
                self._fail(name, _expected(spec), "nothing (the field is missing)")
            return None
        variant = ""
        selector = spec.block.selector
        if selector and isinstance(raw, Mapping):
            chosen = raw.get(selector)
            variant = chosen if isinstance(chosen, str) and chosen in spec.block.variants else ""
        return _Entry(self.file, self.entry, raw, self.errors, spec.block,
                      prefix=f"{self._path(name)}.", variant=variant)

    def children(self, name: str) -> list[_Entry]:
        """A list of nested blocks (empty when absent)."""
        spec = self.spec(name)
        assert spec.block is not None
        self.used.add(name)
        raw = self.data.get(name)
        if raw is None:
            return []
        if not isinstance(raw, list):
            self.fail(name, f"a list of {spec.block.name} entries", raw)
            return []
        return [_Entry(self.file, self.entry, item, self.errors, spec.block,
                       prefix=f"{self._path(name)}[{index}].")
                for index, item in enumerate(raw)]


_EXAMPLES = {
    "temperature": "'351.4 K' or '78.3 C'",
    "pressure": "'101.325 kPa', '1 atm' or '760 mmHg'",
    "molar_energy": "'-57.96 cal/mol', '1200 J/mol' or '150 K' (energy/R)",
    "molar_mass": "'46.07 g/mol'",
    "molar_volume": "'58.7 cm3/mol'",
}

_PLAIN_NUMBER = re.compile(r"^\s*[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?\s*$")


def _expected(spec: Field) -> str:
    kind = spec.kind
    if kind in ("quantity", "range", "quantities"):
        dim = spec.dimension.replace("_", " ")
        what = f"a {dim} with a unit, such as {_EXAMPLES[spec.dimension]}"
        if kind == "range":
            return "a list of two temperatures, such as ['50 C', '100 C']"
        if kind == "quantities":
            return f"a list of {spec.dimension.replace('_', ' ')}s with units"
        return what
    if kind == "choice":
        return "one of " + ", ".join(repr(c) for c in spec.choices)
    if kind in ("block", "blocks"):
        return "a mapping" if kind == "block" else "a list of mappings"
    return {"text": "a text", "slug": "a slug of lower-case letters, digits and single hyphens",
            "number": "a number", "integer": "a whole number", "boolean": "true or false",
            "texts": "a list of texts", "label": "a text or a number",
            "tfunction": "a number or a mapping of a, b, c, d",
            "coefficient": f"a coefficient with the unit {spec.unit}"}.get(kind, "a value")


def _read_text(entry: _Entry, spec: Field, raw: Any) -> str:
    if not isinstance(raw, str) or not raw.strip():
        entry.fail(spec.name, "a non-empty text", raw)
        return ""
    value = raw.strip()
    if spec.kind == "slug" and not SLUG.match(value):
        entry.fail(spec.name, "a slug of lower-case letters, digits and single hyphens", value)
        return ""
    if spec.pattern and not re.match(spec.pattern, value):
        entry.fail(spec.name, _PATTERN_TEXT.get(spec.pattern, f"a text matching {spec.pattern}"),
                   value)
        return ""
    return value


def _read_number(entry: _Entry, spec: Field, raw: Any) -> float:
    if isinstance(raw, bool) or not isinstance(raw, (int, float)):
        hint = " (a number in quotes is a text)" if isinstance(raw, str) and \
            _PLAIN_NUMBER.match(raw) else ""
        entry.fail(spec.name, "a plain number" + hint, raw)
        return math.nan
    try:
        value = float(raw)
    except OverflowError:
        entry._fail(spec.name, "a number of ordinary size", f"an integer of {len(str(raw))} digits")
        return math.nan
    if not math.isfinite(value):
        entry.fail(spec.name, "a finite number", raw)
        return math.nan
    if spec.kind == "integer" and value != int(value):
        entry.fail(spec.name, "a whole number", raw)
        return math.nan
    if not spec.within(value):
        entry.fail(spec.name, f"a number {spec.bounds_text()}", raw)
        return math.nan
    return value


def _si_bounds(spec: Field) -> str:
    text = spec.bounds_text()
    return f"{text} {SI_UNIT[spec.dimension]}" if text else ""


def _convert(entry: _Entry, spec: Field, raw: Any, name: str = "") -> float:
    """A dimensional value written with its unit, converted to SI and range-checked."""
    name = name or spec.name
    dimension = spec.dimension
    expected = f"a {dimension.replace('_', ' ')} with a unit, such as {_EXAMPLES[dimension]}"
    if isinstance(raw, bool) or not isinstance(raw, (str, int, float)):
        entry.fail(name, expected, raw)
        return math.nan
    if not isinstance(raw, str) or _PLAIN_NUMBER.match(raw):
        entry._fail(name, expected, f"{_show(raw)} (no unit)")
        return math.nan
    try:
        if dimension in ("temperature", "pressure"):
            value = parse_quantity(raw, dimension)
        else:
            number, unit = split_quantity(raw)
            value = to_si(number, unit, dimension)
    except (UnitError, OverflowError) as error:
        detail = "" if str(error).startswith("expected") else f" ({error})"
        entry.fail(name, expected + detail, raw)
        return math.nan
    if not spec.within(value):
        entry.fail(name, f"a {dimension.replace('_', ' ')} {_si_bounds(spec)}", raw)
        return math.nan
    return value


def _read_quantity(entry: _Entry, spec: Field, raw: Any) -> float:
    return _convert(entry, spec, raw)


def _read_coefficient(entry: _Entry, spec: Field, raw: Any) -> float:
    """A signed coefficient that must carry exactly the unit ``spec.unit`` (K or 1/K)."""
    example = "-103.3 K" if spec.unit == "K" else "-0.00523 1/K"
    if isinstance(raw, str):
        try:
            number, found = split_quantity(raw)
        except UnitError:
            found = ""
        if found == spec.unit and math.isfinite(number):
            if not spec.within(number):
                entry.fail(spec.name, f"a coefficient {spec.bounds_text()} {spec.unit}", raw)
                return math.nan
            return number
    entry.fail(spec.name, f"a coefficient with the unit {spec.unit}, such as {example!r}", raw)
    return math.nan


def _read_choice(entry: _Entry, spec: Field, raw: Any) -> str:
    if not isinstance(raw, str) or raw not in spec.choices:
        entry.fail(spec.name, "one of " + ", ".join(repr(c) for c in spec.choices), raw)
        return ""
    return raw


def _read_boolean(entry: _Entry, spec: Field, raw: Any) -> bool | None:
    if not isinstance(raw, bool):
        entry.fail(spec.name, "true or false", raw)
        return None
    return raw


def _read_texts(entry: _Entry, spec: Field, raw: Any) -> tuple[str, ...]:
    if not isinstance(raw, list) or not all(isinstance(v, str) and v.strip() for v in raw):
        entry.fail(spec.name, "a list of non-empty texts", raw)
        return ()
    values = tuple(v.strip() for v in raw)
    if len(values) < spec.min_items or (spec.max_items is not None and
                                        len(values) > spec.max_items):
        count = (str(spec.min_items) if spec.min_items == spec.max_items
                 else f"{spec.min_items} or more")
        entry.fail(spec.name, f"a list of {count} texts", raw)
        return ()
    if spec.pattern and not all(re.match(spec.pattern, v) for v in values):
        entry.fail(spec.name, "a list of " + _PATTERN_TEXT.get(spec.pattern, "texts") + "s", raw)
        return ()
    if spec.unique and len(set(values)) != len(values):
        entry.fail(spec.name, "a list without repeated items", raw)
        return ()
    return values


def _read_label(entry: _Entry, spec: Field, raw: Any) -> str:
    if isinstance(raw, bool) or not isinstance(raw, (str, int, float)) or not str(raw).strip():
        entry.fail(spec.name, "a text or a number", raw)
        return ""
    return str(raw).strip()


def _read_tfunction(entry: _Entry, spec: Field, raw: Any) -> act.TemperatureFunction:
    """A dimensionless parameter: a number, or ``{a, b: '... K', c, d: '... 1/K'}``."""
    if isinstance(raw, Mapping):
        block = entry.child(spec.name)
        assert block is not None
        a = block.get("a")
        if a is not None and math.isfinite(a) and not spec.within(a):
            block.fail("a", f"a number {spec.bounds_text()}", a)
        b, c, d = block.get("b"), block.get("c"), block.get("d")
        block.finish()
        return act.TemperatureFunction(a=_or0(a), b=_or0(b), c=_or0(c), d=_or0(d))
    return act.TemperatureFunction(a=_or0(_read_number(entry, spec, raw)))


def _or0(value: float | None) -> float:
    return 0.0 if value is None or not math.isfinite(value) else float(value)


def _read_range(entry: _Entry, spec: Field, raw: Any) -> tuple[float, float]:
    if not isinstance(raw, list) or len(raw) != 2:
        entry.fail(spec.name, _expected(spec), raw)
        return math.nan, math.nan
    low, high = (_convert(entry, spec, item) for item in raw)
    if math.isfinite(low) and math.isfinite(high) and low >= high:
        entry.fail(spec.name, "a lower then a higher temperature", raw)
    return low, high


def _read_quantities(entry: _Entry, spec: Field, raw: Any) -> tuple[float, ...]:
    if not isinstance(raw, list):
        entry.fail(spec.name, _expected(spec), raw)
        return ()
    return tuple(_convert(entry, spec, item) for item in raw)


def _read_counts(entry: _Entry, spec: Field, raw: Any) -> Any:
    """The mapping as written: its names are checked against the group tables by
    :func:`builder.catalogue.groups.parse_groups`, which knows them."""
    return raw


def _read_block(entry: _Entry, spec: Field, raw: Any) -> _Entry | None:
    return entry.child(spec.name)


def _read_blocks(entry: _Entry, spec: Field, raw: Any) -> list[_Entry]:
    return entry.children(spec.name)


_READERS: dict[str, Callable[[_Entry, Field, Any], Any]] = {
    "text": _read_text, "slug": _read_text, "number": _read_number, "integer": _read_number,
    "quantity": _read_quantity, "coefficient": _read_coefficient, "choice": _read_choice,
    "boolean": _read_boolean, "texts": _read_texts, "label": _read_label,
    "tfunction": _read_tfunction, "range": _read_range, "quantities": _read_quantities,
    "block": _read_block, "blocks": _read_blocks, "counts": _read_counts,
}

_EMPTY: dict[str, Any] = {
    "text": "", "slug": "", "number": math.nan, "integer": math.nan, "quantity": math.nan,
    "coefficient": math.nan, "choice": "", "texts": (), "label": "",
    "tfunction": act.TemperatureFunction(), "range": (math.nan, math.nan), "quantities": (),
}

_PATTERN_TEXT = {
    fields.CAS_PATTERN: "a CAS registry number such as '64-17-5' (2 to 7 digits not starting "
                        "with 0, 2 digits, a check digit)",
    fields.PAIR_ID_PATTERN: "two component ids joined by '--'",
    fields.SLUG_PATTERN: "a slug of lower-case letters, digits and single hyphens",
}


def _show(value: Any) -> str:
    text = repr(value)
    return text if len(text) <= 80 else text[:77] + "..."


# ---------------------------------------------------------------------------
# Field groups shared by several record kinds
# ---------------------------------------------------------------------------


def _source(entry: _Entry, references: Mapping[str, Reference],
            name: str = "source") -> Source | None:
    block = entry.child(name)
    if block is None:
        return None
    ref = block.get("ref")
    if ref and ref not in references:
        block.fail("ref", "the id of a file in references/", ref)
    source = Source(ref=ref or "", where=block.get("where") or "", note=block.get("note") or "",
                    from_memory=bool(block.get("from_memory")))
    block.finish()
    return source


def _sourced(entry: _Entry, name: str, references: Mapping[str, Reference]
             ) -> tuple[Any, Source | None]:
    """A value written plainly or as ``{value: ..., source: {...}}``."""
    raw = entry.data.get(name)
    spec = entry.spec(name)
    if not (spec.sourced and isinstance(raw, Mapping)):
        return entry.get(name), None
    entry.used.add(name)
    block = Block(name, (_replace(spec, name="value", sourced=False),
                         Field("source", "block", block=fields.SOURCE)))
    sub = _Entry(entry.file, entry.entry, raw, entry.errors, block,
                 prefix=f"{entry._path(name)}.")
    value = sub.get("value")
    source = _source(sub, references)
    sub.finish()
    return value, source


def _vapour_pressure(entry: _Entry) -> VapourPressure | None:
    equation = entry.get("equation")
    T_min, T_max = entry.get("T_min"), entry.get("T_max")
    if math.isfinite(T_min) and math.isfinite(T_max) and T_min >= T_max:
        entry.fail("T_max", f"a temperature above T_min ({T_min:.2f} K)", f"{T_max:.2f} K")
    P_unit = entry.get("pressure_unit")
    A, B, C = entry.get("A"), entry.get("B"), entry.get("C")
    vp: VapourPressure | None = None
    if equation == "antoine":
        log, T_unit = entry.get("log"), entry.get("temperature_unit")
        if entry.ok and log and T_unit and P_unit:
            vp = Antoine.from_published(A, B, C, log_base="10" if log == "10" else "e",
                                        P_unit=P_unit, T_unit="K" if T_unit == "K" else "C",
                                        T_min_K=T_min, T_max_K=T_max)
    elif equation == "dippr101":
        D, E = entry.get("D"), entry.get("E")
        if entry.ok and P_unit:
            vp = ExtendedAntoine.from_published(A, B, C, D, E, P_unit=P_unit, T_min_K=T_min,
                                                T_max_K=T_max)
    if vp is not None:
        problem = vapour_pressure_problem(vp)
        if problem is not None:
            entry.fail("", problem, f"A = {A:g}, B = {B:g}, C = {C:g} over "
                       f"{T_min:.2f} K to {T_max:.2f} K")
            return None
    return vp


# ---------------------------------------------------------------------------
# Files
# ---------------------------------------------------------------------------


def _read_file(path: Path, root: Path, errors: list[CatalogueError]) -> tuple[bool, Any]:
    shown = _display(path, root)
    try:
        return True, read_yaml(path)
    except ReadProblem as problem:
        errors.append(CatalogueError(shown, path.stem, "", problem.expected, problem.found))
    except OSError as error:
        errors.append(CatalogueError(shown, path.stem, "", "a readable file",
                                     error.strerror or str(error)))
    return False, None


def _display(path: Path, root: Path) -> str:
    try:
        return str(path.relative_to(root.parent))
    except ValueError:
        return str(path)


def _load_reference(entry: _Entry) -> Reference:
    year = entry.get("year")
    reference = Reference(
        id=entry.get("id"),
        authors=entry.get("authors"),
        title=entry.get("title"),
        year=int(year) if math.isfinite(year) else 0,
        kind=entry.get("kind"),
        publisher=entry.get("publisher") or "",
        journal=entry.get("journal") or "",
        volume=entry.get("volume") or "",
        pages=entry.get("pages") or "",
        edition=entry.get("edition") or "",
        doi=entry.get("doi") or "",
        note=entry.get("note") or "",
    )
    entry.finish()
    return reference


_CONSTANTS = ("molar_mass", "normal_boiling_point", "critical_temperature",
              "critical_pressure", "acentric_factor", "liquid_molar_volume")


def _load_component(entry: _Entry, references: Mapping[str, Reference],
                    groups_folder: Path = DEFAULT_GROUPS) -> Component | None:
    cid = entry.get("id")
    name = entry.get("name")
    synonyms = entry.get("synonyms") or ()
    cas = entry.get("cas")
    if cas and not _valid_cas(cas):
        entry.fail("cas", "a CAS registry number with a valid check digit, such as '64-17-5'", cas)
    formula = entry.get("formula")
    hazard_block = entry.child("hazard")
    hazard, hazard_source = "", None
    if hazard_block is not None:
        hazard = hazard_block.get("summary")
        hazard_source = _source(hazard_block, references)
        hazard_block.finish()

    constants = entry.child("constants")
    values: dict[str, float] = {}
    sources: dict[str, Source] = {}
    if constants is not None:
        default_source = _source(constants, references)
        for key in _CONSTANTS:
            value, own_source = _sourced(constants, key, references)
            values[key] = math.nan if value is None else value
            chosen = own_source or default_source
            if chosen is not None:
                sources[key] = chosen
        constants.finish()

    uniquac = entry.child("uniquac")
    r = q = None
    uniquac_source = None
    if uniquac is not None:
        r, q = uniquac.get("r"), uniquac.get("q")
        uniquac_source = _source(uniquac, references)
        uniquac.finish()

    groups_block = entry.child("groups")
    groups = None
    if groups_block is not None:
        groups = parse_groups(groups_block, lambda b: _source(b, references),
                              lambda v: group_tables(v, groups_folder), formula,
                              values.get("molar_mass", math.nan))

    virial_block = entry.child("virial")
    virial = None if virial_block is None else vapour_fields.component_virial(
        virial_block, values.get("critical_temperature", math.nan),
        values.get("critical_pressure", math.nan),
        lambda e, n: _sourced(e, n, references), lambda e: _source(e, references))

    vp_block = entry.child("vapour_pressure")
    vapour_pressure = vp_source = None
    if vp_block is not None:
        vapour_pressure = _vapour_pressure(vp_block)
        vp_source = _source(vp_block, references)
        vp_block.finish()
    entry.finish()

    if not entry.ok or vapour_pressure is None or vp_source is None:
        return None
    Tb, Tc = values["normal_boiling_point"], values["critical_temperature"]
    if Tb >= Tc:
        entry.fail("constants.normal_boiling_point",
                   f"a temperature below the critical temperature ({Tc:.2f} K)", f"{Tb:.2f} K")
        return None
    # 1 K of slack: a correlation's range and the critical constant often come from
    # different sources, each rounded (styrene: 636 K against 635.2 K).
    if vapour_pressure.T_max_K > Tc + 1.0:
        entry.fail("vapour_pressure.T_max", f"a temperature at most the critical temperature "
                   f"({Tc:.2f} K)", f"{vapour_pressure.T_max_K:.2f} K")
        return None
    if vapour_pressure.T_min_K <= Tb <= vapour_pressure.T_max_K:
        P_at_Tb = float(vapour_pressure.pressure_Pa(Tb))
        if not 0.5 * 101325.0 <= P_at_Tb <= 2.0 * 101325.0:
            entry.fail("vapour_pressure", "a correlation giving about 101.325 kPa at the normal "
                       f"boiling point {Tb:.2f} K (are the units right?)",
                       f"{P_at_Tb / 1e3:.4g} kPa")
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
        virial=virial,
    )


def _valid_cas(cas: str) -> bool:
    """CAS numbers end in a check digit: the weighted digit sum mod 10.

    >>> _valid_cas("64-17-5"), _valid_cas("64-17-6"), _valid_cas("00-00-0")
    (True, False, False)
    """
    if not re.match(fields.CAS_PATTERN, cas):
        return False
    parts = cas.split("-")
    digits = (parts[0] + parts[1])[::-1]
    total = sum((i + 1) * int(d) for i, d in enumerate(digits))
    return total % 10 == int(parts[2])


# -- activity parameters -----------------------------------------------------


def _energy_over_R(entry: _Entry, name: str) -> float:
    """An interaction energy in J/mol, cal/mol or K, returned as energy/R in K."""
    value = entry.get(name)
    return math.nan if value is None else value / GAS_CONSTANT_J_PER_MOL_K


def _form(entry: _Entry) -> int:
    """Which of the block's alternative groups is given (-1: none or several; reported)."""
    given = [i for i, group in enumerate(entry.block.one_of)
             if any(entry.has(name) for name in group)]
    return given[0] if len(given) == 1 else -1


def _tf(entry: _Entry, name: str) -> act.TemperatureFunction:
    value = entry.get(name)
    return value if isinstance(value, act.TemperatureFunction) else act.TemperatureFunction()


def _build_margules(entry: _Entry, c1: Component, c2: Component) -> act.ActivityModel:
    return act.Margules(_tf(entry, "A12"), _tf(entry, "A21"))


def _build_van_laar(entry: _Entry, c1: Component, c2: Component) -> act.ActivityModel:
    A12, A21 = _tf(entry, "A12"), _tf(entry, "A21")
    if A12.a * A21.a < 0 and not (A12.b or A21.b):
        entry.fail("A21", "the same sign as A12 (van Laar is singular otherwise)", A21.a)
    return act.VanLaar(A12, A21)


def _build_wilson(entry: _Entry, c1: Component, c2: Component) -> act.ActivityModel | None:
    form = _form(entry)
    if form == 0:
        # Λ12 = (V2/V1) exp(-Δλ12/RT), Λ21 = (V1/V2) exp(-Δλ21/RT)
        ratio = math.log(c2.liquid_molar_volume_m3_per_mol / c1.liquid_molar_volume_m3_per_mol)
        return act.Wilson(act.TemperatureFunction(a=ratio, b=-_energy_over_R(entry, "lambda12")),
                          act.TemperatureFunction(a=-ratio, b=-_energy_over_R(entry, "lambda21")))
    if form == 1:
        return act.Wilson(_tf(entry, "ln_Lambda12"), _tf(entry, "ln_Lambda21"))
    return None


def _build_nrtl(entry: _Entry, c1: Component, c2: Component) -> act.ActivityModel | None:
    form = _form(entry)
    alpha = _tf(entry, "alpha")
    if form == 0:
        return act.NRTL(act.TemperatureFunction(b=_energy_over_R(entry, "g12")),
                        act.TemperatureFunction(b=_energy_over_R(entry, "g21")), alpha)
    if form == 1:
        return act.NRTL(_tf(entry, "tau12"), _tf(entry, "tau21"), alpha)
    return None


def _build_uniquac(entry: _Entry, c1: Component, c2: Component) -> act.ActivityModel | None:
    form = _form(entry)
    if form == 0:
        ln12 = act.TemperatureFunction(b=-_energy_over_R(entry, "u12"))
        ln21 = act.TemperatureFunction(b=-_energy_over_R(entry, "u21"))
    elif form == 1:
        ln12, ln21 = _tf(entry, "ln_tau12"), _tf(entry, "ln_tau21")
    else:
        return None
    if not (c1.uniquac_r and c1.uniquac_q and c2.uniquac_r and c2.uniquac_q):
        return None  # reported once, at the component (see load_catalogue)
    return act.UNIQUAC(ln12, ln21, c1.uniquac_r, c2.uniquac_r, c1.uniquac_q, c2.uniquac_q)


def _build_ideal(entry: _Entry, c1: Component, c2: Component) -> act.ActivityModel:
    return act.Ideal()


_MODELS: dict[str, Callable[[_Entry, Component, Component], act.ActivityModel | None]] = {
    "ideal": _build_ideal,
    "margules": _build_margules,
    "van-laar": _build_van_laar,
    "wilson": _build_wilson,
    "nrtl": _build_nrtl,
    "uniquac": _build_uniquac,
}


def _typed_parameters(params: _Entry) -> dict[str, float | dict[str, float]]:
    """The published parameters as numbers (SI, or the unit in the key), for ``atlas.json``."""
    out: dict[str, float | dict[str, float]] = {}
    units = {"b": "b_K", "d": "d_per_K"}
    for name, raw in params.data.items():
        if raw is None or name not in params.block.all_fields(params.variant):
            continue
        spec = params.spec(name)
        try:
            if spec.kind == "quantity":
                number, unit = split_quantity(str(raw))
                out[f"{name}_{SI_UNIT[spec.dimension].replace('/', '_per_')}"] = to_si(
                    number, unit, spec.dimension)
            elif isinstance(raw, Mapping):
                out[str(name)] = {units.get(str(k), str(k)): (
                    split_quantity(str(v))[0] if isinstance(v, str) else float(v))
                    for k, v in raw.items() if v is not None}
            elif isinstance(raw, (int, float)) and not isinstance(raw, bool):
                out[str(name)] = float(raw)
        except (UnitError, ValueError, TypeError):
            continue  # already reported by the loader
    return out


def _missing_uniquac(components: Mapping[str, Component], ids: Iterable[str]) -> list[str]:
    return [cid for cid in ids if cid in components and (
        components[cid].uniquac_r is None or components[cid].uniquac_q is None)]


def _load_pair(entry: _Entry, components: Mapping[str, Component],
               references: Mapping[str, Reference], broken: set[str],
               needs_uniquac: dict[str, list[str]]) -> PairRecord | None:
    pid = entry.get("id")
    ids: tuple[str, ...] = entry.get("components")
    if any(cid in broken for cid in ids):
        # The component's own errors are reported; the pair is not loaded.
        entry.used.update(entry.data)
        return None
    for cid in ids:
        if cid not in components:
            entry.fail("components", "ids of files in components/", cid)
    if pid and len(ids) == 2 and pid != PAIR_SEPARATOR.join(ids):
        entry.fail("id", f"the two component ids joined by '{PAIR_SEPARATOR}' "
                   f"({PAIR_SEPARATOR.join(ids)!r})", pid)
    known = len(ids) == 2 and all(c in components for c in ids)

    pair_vapour = vapour_fields.pair_vapour(entry.child("vapour"),
                                            lambda e: _source(e, references))
    cubic = pair_vapour.model == "peng-robinson"
    model_block = entry.child("activity")
    if cubic and model_block is not None:
        model_block.fail("", "no activity block (a peng-robinson pair takes both phases from "
                         "the equation of state)", "an activity block")
    if not cubic and model_block is None:
        entry.fail("activity", "the liquid activity model (every pair but a peng-robinson one)",
                   "nothing (the field is missing)")
    if pair_vapour.model == "associating" and known:
        _check_associating(entry, [components[c] for c in ids])

    model: act.ActivityModel | None = None
    kind = ""
    T_min = T_max = math.nan
    source: Source | None = None
    quality = ""
    published: dict[str, str] = {}
    typed: dict[str, float | dict[str, float]] = {}
    uniquac_missing: list[str] = []
    if model_block is not None:
        kind = model_block.get("model")
        T_min, T_max = model_block.get("T_range")
        source = _source(model_block, references)
        quality = model_block.get("quality")
        params = model_block.child("parameters") if kind else None
        if not kind:
            model_block.used.add("parameters")
        if params is not None and kind and known:
            published = {str(k): str(v) for k, v in params.data.items()}
            typed = _typed_parameters(params)
            uniquac_missing = (_missing_uniquac(components, ids) if kind == "uniquac" else [])
            model = _MODELS[kind](params, components[ids[0]], components[ids[1]])
            params.finish()
        elif kind == "ideal" and known:
            model = act.Ideal()
        model_block.finish()
        if (model is not None and entry.ok and math.isfinite(T_min) and math.isfinite(T_max)):
            problem = model_problem(model, T_min, T_max)
            if problem is not None:
                model_block.fail("parameters", problem, published)
                model = None
    for cid in uniquac_missing:
        needs_uniquac.setdefault(cid, []).append(pid or entry.entry)

    publish = entry.child("publish")
    isobars: tuple[float, ...] = (101325.0,)
    isotherms: tuple[float, ...] = ()
    if publish is not None:
        given_P = publish.get("isobars")
        given_T = publish.get("isotherms")
        isobars = given_P if given_P is not None else isobars
        isotherms = given_T or ()
        if not isobars and not isotherms:
            publish.fail("", "at least one isobar or isotherm to publish", dict(publish.data))
        if known and isotherms:
            Tc = max(components[c].critical_temperature_K for c in ids)
            for T in isotherms:
                if math.isfinite(T) and T >= Tc:
                    publish.fail("isotherms", f"temperatures below the higher critical "
                                 f"temperature of the two components ({Tc:.2f} K)", f"{T:.2f} K")
        publish.finish()

    if cubic and pair_vapour.kij is not None:
        model, kind, source = EquationOfStateLiquid(pair_vapour.kij), "peng-robinson", \
            pair_vapour.source
        quality, T_min, T_max = pair_vapour.quality, pair_vapour.T_min_K, pair_vapour.T_max_K
        published = {"k12": f"{pair_vapour.kij:g}"}
    recorded = _recorded(entry, references)
    split = _split(entry)
    notes = entry.get("notes") or ""
    tags = entry.get("tags") or ()
    entry.finish()
    if not entry.ok or model is None or source is None or len(ids) != 2:
        return None
    first, second = ids
    return PairRecord(
        id=pid, component1=first, component2=second, model=model, model_kind=kind,
        published_parameters=published, T_min_K=T_min, T_max_K=T_max, source=source,
        quality=quality, isobars_Pa=isobars, isotherms_K=isotherms, recorded=recorded,
        notes=notes, file=entry.file, tags=tags, split_x1=split, parameters=typed,
        vapour=pair_vapour,
    )


def _check_associating(entry: _Entry, pair_components: list[Component]) -> None:
    """An associating vapour needs both components' virial blocks and a dimerising acid."""
    lacking = [c.id for c in pair_components if c.virial is None]
    if lacking:
        entry.fail("vapour.model", "components with a virial block (the associating vapour "
                   "reads the acid's dimerisation constant there)",
                   f"associating, but {', '.join(lacking)} has no virial block")
    elif not any(c.virial is not None and c.virial.dimerisation_A is not None
                 for c in pair_components):
        entry.fail("vapour.model", "a component whose virial block gives a dimerisation "
                   "constant (associating is for carboxylic acids)",
                   "associating, but neither component dimerises")


def _split(entry: _Entry) -> tuple[float, float, float] | None:
    block = entry.child("split")
    if block is None:
        return None
    values = tuple(block.get(k) for k in ("distillate_x1", "bottoms_x1", "feed_x1"))
    block.finish()
    if not all(math.isfinite(v) for v in values):
        return None
    D, B, F = values
    if not (min(D, B) < F < max(D, B)):
        entry.fail("split.feed_x1", "a feed between the bottoms and the distillate", F)
        return None
    return D, B, F


def _recorded(entry: _Entry, references: Mapping[str, Reference]) -> RecordedBehaviour | None:
    block = entry.child("recorded")
    if block is None:
        return None
    azeotropes: list[RecordedAzeotrope] = []
    for az in block.children("azeotropes"):
        P = az.get("P")
        T_az = az.get("T")
        x1 = az.get("x1")
        kind = az.get("kind")
        src = _source(az, references)
        az.finish()
        if src is not None and az.ok:
            azeotropes.append(RecordedAzeotrope(P_Pa=P, T_K=T_az, x1=x1, kind=kind, source=src))
    zeotropic = block.get("zeotropic_at") or ()
    split = block.get("liquid_split")
    source = _source(block, references)
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


def load_catalogue(root: Path | str = DEFAULT_CATALOGUE, only: Iterable[str] = (),
                   problems: list[CatalogueError] | None = None) -> Catalogue:
    """Read, validate and convert a catalogue folder; raise :class:`CatalogueErrors`.

    ``only`` restricts the pairs loaded to the given pair ids (components and
    references are always loaded in full, since pairs refer to them).  With
    ``problems`` (a list), nothing is raised: every problem is appended there and
    the catalogue holds whatever loaded cleanly (``atlas check`` reports the broken
    files and still checks the others).
    """
    root = Path(root)
    errors: list[CatalogueError] = []
    if not root.is_dir():
        raise CatalogueErrors([CatalogueError(str(root), "", "", "a catalogue folder with "
                                              "references/, components/ and binaries/",
                                              "no such folder")])
    wanted = set(only)

    def load_all(folder: str, loader: Callable[[_Entry], T | None]) -> dict[str, T]:
        out: dict[str, T] = {}
        for path in _files(root / folder):
            if folder == "binaries" and wanted and path.stem not in wanted:
                continue
            read, data = _read_file(path, root, errors)
            if not read:
                continue
            entry_name = data.get("id", path.stem) if isinstance(data, Mapping) else path.stem
            entry = _Entry(_display(path, root), _show_id(entry_name, path), data, errors,
                           fields.BLOCKS[folder])
            try:
                record = loader(entry)
            except (ArithmeticError, ValueError) as error:  # a defect the checks above missed
                entry.fail("", "an entry the loader can evaluate", f"{type(error).__name__}: "
                           f"{error}")
                record = None
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
    needs_uniquac: dict[str, list[str]] = {}
    pairs = load_all("binaries", lambda e: _load_pair(e, components, references, broken,
                                                       needs_uniquac))
    for cid, users in sorted(needs_uniquac.items()):
        component = components[cid]
        errors.append(CatalogueError(component.file, cid, "uniquac", "UNIQUAC r and q (needed "
                                     "by the UNIQUAC pair" + ("s " if len(users) > 1 else " ")
                                     + ", ".join(users) + ")", "no uniquac block"))
    _check_reversed_pairs(pairs, errors)
    if wanted:
        present = {p.stem for p in _files(root / "binaries")}
        for name in sorted(wanted - present):
            errors.append(CatalogueError(str(root / "binaries"), name, "", "a pair in the "
                                         "catalogue", "no such pair file"))
        pairs = {k: v for k, v in pairs.items() if k in wanted}
    _check_names_unique(components, errors)
    if problems is not None:
        problems.extend(errors)
        broken_files = {e.file for e in errors}
        pairs = {k: v for k, v in pairs.items() if v.file not in broken_files}
    elif errors:
        raise CatalogueErrors(errors)
    return Catalogue(root=root, references=references, components=components, pairs=pairs)


def _show_id(value: Any, path: Path) -> str:
    return value.strip() if isinstance(value, str) and value.strip() else path.stem


def _check_reversed_pairs(pairs: Mapping[str, PairRecord], errors: list[CatalogueError]) -> None:
    """One file per pair: ``b--a`` beside ``a--b`` is the same pair twice."""
    for pid in sorted(pairs):
        pair = pairs[pid]
        reverse = f"{pair.component2}{PAIR_SEPARATOR}{pair.component1}"
        if reverse in pairs and reverse < pid:
            errors.append(CatalogueError(pair.file, pid, "components", "a pair not already in "
                                         f"the catalogue (it is, the other way round, in "
                                         f"{pairs[reverse].file})",
                                         f"[{pair.component1}, {pair.component2}]"))


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
