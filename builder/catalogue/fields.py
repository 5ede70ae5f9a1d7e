"""The catalogue's file format, declared once: every field with its type, unit and range.

The loader (:mod:`builder.catalogue.loader`) reads each value through these
declarations, so a field's type, unit, allowed range and whether it is required
are checked in one way everywhere; the JSON Schema that editors use
(:mod:`builder.catalogue.schema`) is generated from the same declarations.

To add a field, declare it here in its block, for example::

    Field("boiling_range", "quantity", "temperature", required=False,
          minimum=1.0, maximum=2000.0, help="...")

then read it in the loader with ``entry.get("boiling_range")`` (a value in SI,
or NaN/None/"" with a located error already recorded).  Regenerate the schema
with ``atlas schema``; a test fails while the committed schema is stale.

Ranges of dimensional values are in SI (K, Pa, kg/mol, m3/mol, J/mol); they
are the physically possible span of the quantity, not a quality judgement:
a value outside it is a typing error (a unit slip, a lost exponent).
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field

__all__ = [
    "BLOCKS",
    "COMPONENT",
    "KINDS",
    "PAIR",
    "REFERENCE",
    "SOURCE",
    "Block",
    "Field",
]

#: What a field may hold.  ``quantity``: a number and a unit in one string (``dimension``);
#: ``coefficient``: a signed number with exactly the unit ``unit``; ``tfunction``: a number or
#: ``{a, b: '... K', c, d: '... 1/K'}`` (``a + b/T + c ln T + d T``); ``label``: a text or a
#: number (a volume or page); ``range``: two quantities, low then high; ``quantities``: a list
#: of quantities; ``block``/``blocks``: a nested mapping / a list of them; ``counts``: a
#: mapping of names to positive whole numbers (UNIFAC subgroups), checked by its reader.
KINDS = ("text", "slug", "number", "integer", "quantity", "coefficient", "choice", "boolean",
         "texts", "label", "tfunction", "range", "quantities", "block", "blocks", "counts")


@dataclass(frozen=True)
class Field:
    """One field of a catalogue file: its name, kind, unit, range and meaning."""

    name: str
    kind: str
    dimension: str = ""  # quantity, range, quantities: temperature, pressure, ...
    required: bool = True
    help: str = ""
    minimum: float | None = None  # inclusive, in SI
    maximum: float | None = None
    exclusive: bool = False  # minimum and maximum are exclusive bounds
    choices: tuple[str, ...] = ()
    unit: str = ""  # coefficient: the one unit allowed (K or 1/K)
    pattern: str = ""  # text, slug: a regular expression the whole text must match
    block: Block | None = None  # block, blocks
    sourced: bool = False  # may also be written {value: ..., source: {...}}
    min_items: int = 0  # texts, quantities, blocks
    max_items: int | None = None
    unique: bool = False  # texts: no repeated items

    def __post_init__(self) -> None:
        if self.kind not in KINDS:
            raise ValueError(f"field {self.name!r}: unknown kind {self.kind!r}")
        if self.kind in ("block", "blocks") and self.block is None:
            raise ValueError(f"field {self.name!r}: a {self.kind} needs its block")
        if self.kind in ("quantity", "range", "quantities") and not self.dimension:
            raise ValueError(f"field {self.name!r}: a {self.kind} needs a dimension")

    def bounds_text(self) -> str:
        """``between 0 and 1`` and the like, for error messages."""
        if self.minimum is None and self.maximum is None:
            return ""
        low, high = ("above", "below") if self.exclusive else ("at least", "at most")
        if self.minimum is not None and self.maximum is not None:
            word = "strictly between" if self.exclusive else "between"
            return f"{word} {self.minimum:g} and {self.maximum:g}"
        if self.minimum is not None:
            return f"{low} {self.minimum:g}"
        return f"{high} {self.maximum:g}"

    def within(self, value: float) -> bool:
        if self.minimum is not None and (value < self.minimum or
                                         (self.exclusive and value == self.minimum)):
            return False
        return not (self.maximum is not None and (value > self.maximum or
                                                  (self.exclusive and value == self.maximum)))


@dataclass(frozen=True)
class Block:
    """A mapping in a catalogue file: its fields, and fields that depend on one choice.

    ``variants`` adds fields according to the value of the field named ``selector``
    (the activity model selects its parameters, the vapour-pressure equation its
    constants).  ``one_of`` lists groups of fields of which exactly one group must be
    given (whole), and no field of the other groups.
    """

    name: str
    fields: tuple[Field, ...]
    help: str = ""
    selector: str = ""
    variants: Mapping[str, tuple[Field, ...]] = field(default_factory=dict)
    one_of: tuple[tuple[str, ...], ...] = ()

    def all_fields(self, variant: str = "") -> dict[str, Field]:
        """The fields of this block, with those of ``variant`` (when given)."""
        out = {f.name: f for f in self.fields}
        for f in self.variants.get(variant, ()):
            out[f.name] = f
        return out

    def field(self, name: str, variant: str = "") -> Field:
        try:
            return self.all_fields(variant)[name]
        except KeyError:
            for fields in self.variants.values():
                for f in fields:
                    if f.name == name:
                        return f
            raise KeyError(f"block {self.name!r} declares no field {name!r}") from None


# ---------------------------------------------------------------------------
# Shared blocks
# ---------------------------------------------------------------------------

#: Identifiers become file names and URLs: lower-case letters, digits, single hyphens.
SLUG_PATTERN = r"^[a-z0-9]+(?:-[a-z0-9]+)*$"
PAIR_ID_PATTERN = r"^[a-z0-9]+(?:-[a-z0-9]+)*--[a-z0-9]+(?:-[a-z0-9]+)*$"
#: CAS registry number: 2 to 7 digits (no leading zero), 2 digits, a check digit.
CAS_PATTERN = r"^[1-9][0-9]{1,6}-[0-9]{2}-[0-9]$"

#: A plain number that no physical parameter of the catalogue reaches in magnitude.
HUGE = 1e12

SOURCE = Block("source", (
    Field("ref", "slug", help="the id of a file in references/"),
    Field("where", "text", help="table, page, equation or entry in that work"),
    Field("note", "text", required=False,
          help="how the numbers were read (transcription route, conversions)"),
    Field("from_memory", "boolean", required=False,
          help="true when the value was recalled rather than read from the printed source"),
), help="where a group of numbers comes from")


def _source(required: bool = True, help: str = "where these numbers come from") -> Field:
    return Field("source", "block", block=SOURCE, required=required, help=help)


# ---------------------------------------------------------------------------
# references/<id>.yaml
# ---------------------------------------------------------------------------

REFERENCE_KINDS = ("book", "article", "database", "handbook", "standard")

REFERENCE = Block("reference", (
    Field("id", "slug", pattern=SLUG_PATTERN, help="equal to the file name without .yaml"),
    Field("kind", "choice", choices=REFERENCE_KINDS, help="what sort of publication"),
    Field("authors", "text", help="authors or editors, as printed"),
    Field("title", "text", help="title of the work"),
    Field("year", "integer", minimum=1800, maximum=2100, help="year of publication"),
    Field("publisher", "text", required=False, help="publisher and place"),
    Field("journal", "text", required=False, help="journal or series"),
    Field("volume", "label", required=False, help="volume (and part) of the journal or series"),
    Field("pages", "label", required=False, help="pages"),
    Field("edition", "text", required=False, help="edition, e.g. 5th"),
    Field("doi", "text", required=False, help="digital object identifier"),
    Field("note", "text", required=False, help="anything a reader should know"),
), help="one published work that catalogue numbers come from")


# ---------------------------------------------------------------------------
# components/<id>.yaml
# ---------------------------------------------------------------------------

CONSTANTS = Block("constants", (
    Field("molar_mass", "quantity", "molar_mass", sourced=True, minimum=1e-3, maximum=2.0,
          help="molar mass, e.g. '46.07 g/mol' (1 g/mol to 2 kg/mol)"),
    Field("normal_boiling_point", "quantity", "temperature", sourced=True, minimum=4.0,
          maximum=1500.0, help="boiling point at 101.325 kPa, e.g. '351.4 K' (4 K to 1500 K)"),
    Field("critical_temperature", "quantity", "temperature", sourced=True, minimum=5.0,
          maximum=2500.0, help="critical temperature, e.g. '514 K' (5 K to 2500 K)"),
    Field("critical_pressure", "quantity", "pressure", sourced=True, minimum=1e5,
          maximum=1e8, help="critical pressure, e.g. '6.137 MPa' (0.1 MPa to 100 MPa)"),
    Field("acentric_factor", "number", sourced=True, minimum=-0.5, maximum=2.0,
          help="Pitzer acentric factor, dimensionless (-0.5 to 2)"),
    Field("liquid_molar_volume", "quantity", "molar_volume", sourced=True, minimum=1e-5,
          maximum=2e-3, help="liquid molar volume near 25 °C, e.g. '58.7 cm3/mol' "
          "(10 to 2000 cm3/mol)"),
    _source(help="the source of every constant written without its own source"),
), help="pure-component constants; each may be written {value: ..., source: ...}")

HAZARD = Block("hazard", (
    Field("summary", "text", help="flammability and health hazards in one or two sentences"),
    _source(),
), help="hazards, with a published source")

UNIQUAC_RQ = Block("uniquac", (
    Field("r", "number", minimum=0.0, maximum=100.0, exclusive=True,
          help="UNIQUAC volume parameter r, dimensionless"),
    Field("q", "number", minimum=0.0, maximum=100.0, exclusive=True,
          help="UNIQUAC surface parameter q, dimensionless"),
    _source(),
), help="UNIQUAC pure-component parameters (needed by UNIQUAC pairs)")

GROUPS = Block("groups", (
    Field("unifac", "counts", required=False,
          help="original UNIFAC subgroup counts, e.g. {CH3: 1, CH2: 1, OH: 1}"),
    Field("dortmund", "counts", required=False,
          help="modified UNIFAC (Dortmund) subgroup counts, e.g. {CH3: 1, CH2: 1, 'OH(P)': 1}"),
    _source(help="the published group definitions the assignment follows"),
), help="UNIFAC subgroups for the predictive models, per model variant (names as spelled in "
        "the group tables, pairs/groups/); at least one variant")

PRESSURE_UNITS = ("Pa", "kPa", "bar", "mmHg", "atm", "MPa")

VAPOUR_PRESSURE = Block("vapour_pressure", (
    Field("equation", "choice", choices=("antoine", "dippr101"),
          help="antoine: log(P/unit) = A - B/(T + C); dippr101: ln(P/unit) = A + B/T + "
          "C ln T + D T^E with T in K"),
    Field("pressure_unit", "choice", choices=PRESSURE_UNITS, help="unit of P in the equation"),
    Field("A", "number", minimum=-1000.0, maximum=1000.0, help="constant A"),
    Field("B", "number", minimum=-1e6, maximum=1e6, help="constant B (Antoine: positive)"),
    Field("C", "number", minimum=-1000.0, maximum=1000.0, help="constant C"),
    Field("T_min", "quantity", "temperature", minimum=1.0, maximum=2500.0,
          help="lower end of the published validity range"),
    Field("T_max", "quantity", "temperature", minimum=1.0, maximum=2500.0,
          help="upper end of the published validity range (at most the critical "
          "temperature)"),
    _source(),
), selector="equation", variants={
    "antoine": (
        Field("log", "choice", choices=("10", "e"), help="base of the logarithm"),
        Field("temperature_unit", "choice", choices=("K", "C"),
              help="unit of T in the equation (C: degrees Celsius)"),
    ),
    "dippr101": (
        Field("D", "number", minimum=-HUGE, maximum=HUGE, help="constant D"),
        Field("E", "number", minimum=-10.0, maximum=10.0, help="exponent E"),
    ),
}, help="vapour-pressure correlation as published, with its validity range")

#: Tsonopoulos classes of the second virial coefficient (builder.thermo.virial).
VIRIAL_CLASSES = ("normal", "ketone", "aldehyde", "alkyl-nitrile", "ether", "ester",
                  "carboxylic-acid", "other-polar", "alkyl-halide", "alkanol", "methanol",
                  "water")

DIMERISATION = Block("dimerisation", (
    Field("A", "number", minimum=-100.0, maximum=100.0,
          help="A of log10(K/Pa⁻¹) = A + B/T, the vapour dimerisation constant"),
    Field("B", "coefficient", unit="K", minimum=-1e5, maximum=1e5, help="B of the same, in K"),
    _source(),
), help="vapour dimerisation constant of a carboxylic acid (chemical theory)")

VIRIAL = Block("virial", (
    Field("class", "choice", choices=VIRIAL_CLASSES,
          help="Tsonopoulos class, which sets the polar and hydrogen-bonding terms"),
    Field("dipole_moment", "coefficient", unit="D", sourced=True, required=False,
          minimum=0.0, maximum=20.0,
          help="dipole moment in debye (needed by the classes using the reduced dipole)"),
    Field("critical_volume", "quantity", "molar_volume", sourced=True, minimum=1e-6,
          maximum=5e-3, help="critical volume, for the cross coefficient"),
    Field("dimerisation", "block", block=DIMERISATION, required=False),
    _source(required=False),
), help="constants of the second virial coefficient (the default vapour treatment)")

COMPONENT = Block("component", (
    Field("id", "slug", pattern=SLUG_PATTERN, help="equal to the file name without .yaml"),
    Field("name", "text", help="the name shown to readers"),
    Field("synonyms", "texts", required=False, unique=True,
          help="every other spelling a user may type; unique in the catalogue"),
    Field("cas", "text", pattern=CAS_PATTERN,
          help="CAS registry number; its check digit is verified"),
    Field("formula", "text", help="molecular formula, e.g. C2H6O"),
    Field("hazard", "block", block=HAZARD),
    Field("constants", "block", block=CONSTANTS),
    Field("uniquac", "block", block=UNIQUAC_RQ, required=False),
    Field("groups", "block", block=GROUPS, required=False),
    Field("virial", "block", block=VIRIAL, required=False),
    Field("vapour_pressure", "block", block=VAPOUR_PRESSURE),
), help="one pure component")


# ---------------------------------------------------------------------------
# binaries/<id1>--<id2>.yaml
# ---------------------------------------------------------------------------

QUALITIES = {
    "regressed": "fitted by its authors to measured VLE data",
    "predicted": "estimated by a predictive method, not fitted to data of this pair",
    "unverified": "transcribed from memory; not yet checked against the printed source",
    "ideal": "ideal-solution assumption (no mixture parameters)",
    "demo": "invented demonstration data, not for any use",
}

AZEOTROPE_KINDS = ("minimum-boiling", "maximum-boiling")

#: Bounds of a dimensionless activity parameter's constant term; wider values are typing
#: errors (ln γ at infinite dilution of 50 is a γ of 5e21).
TFUNC_A = 50.0
#: Bounds of an interaction energy (J/mol) and of a temperature coefficient b (K).
ENERGY_J_PER_MOL = 1e6
COEFFICIENT_B_K = 1e5
COEFFICIENT_D_PER_K = 1.0

TEMPERATURE_FUNCTION = Block("temperature function", (
    Field("a", "number", required=False, minimum=-TFUNC_A, maximum=TFUNC_A,
          help="constant term"),
    Field("b", "coefficient", required=False, unit="K", minimum=-COEFFICIENT_B_K,
          maximum=COEFFICIENT_B_K, help="coefficient of 1/T, in K, e.g. '-103.3 K'"),
    Field("c", "number", required=False, minimum=-TFUNC_A, maximum=TFUNC_A,
          help="coefficient of ln T"),
    Field("d", "coefficient", required=False, unit="1/K", minimum=-COEFFICIENT_D_PER_K,
          maximum=COEFFICIENT_D_PER_K, help="coefficient of T, in 1/K, e.g. '0.0052 1/K'"),
), help="a + b/T + c ln T + d T")


def _tfunc(name: str, help: str, required: bool = True) -> Field:
    return Field(name, "tfunction", block=TEMPERATURE_FUNCTION, required=required,
                 minimum=-TFUNC_A, maximum=TFUNC_A, help=help)


def _energy(name: str, help: str) -> Field:
    return Field(name, "quantity", "molar_energy", required=False,
                 minimum=-ENERGY_J_PER_MOL, maximum=ENERGY_J_PER_MOL, help=help)


def _parameters(name: str, fields: tuple[Field, ...], one_of: tuple[tuple[str, ...], ...] = (),
                help: str = "") -> Block:
    return Block(name, fields, one_of=one_of, help=help)


MODEL_PARAMETERS: dict[str, Block] = {
    "ideal": _parameters("ideal parameters", (), help="none"),
    "margules": _parameters("Margules parameters", (
        _tfunc("A12", "ln γ1 at infinite dilution"),
        _tfunc("A21", "ln γ2 at infinite dilution"),
    )),
    "van-laar": _parameters("van Laar parameters", (
        _tfunc("A12", "ln γ1 at infinite dilution"),
        _tfunc("A21", "ln γ2 at infinite dilution (same sign as A12)"),
    )),
    "wilson": _parameters("Wilson parameters", (
        _energy("lambda12", "Δλ12: Λ12 = (V2/V1) exp(-Δλ12/RT)"),
        _energy("lambda21", "Δλ21: Λ21 = (V1/V2) exp(-Δλ21/RT)"),
        _tfunc("ln_Lambda12", "ln Λ12 as a temperature function", required=False),
        _tfunc("ln_Lambda21", "ln Λ21 as a temperature function", required=False),
    ), one_of=(("lambda12", "lambda21"), ("ln_Lambda12", "ln_Lambda21"))),
    "nrtl": _parameters("NRTL parameters", (
        _energy("g12", "Δg12: τ12 = Δg12/(R T)"),
        _energy("g21", "Δg21: τ21 = Δg21/(R T)"),
        _tfunc("tau12", "τ12 as a temperature function", required=False),
        _tfunc("tau21", "τ21 as a temperature function", required=False),
        Field("alpha", "tfunction", block=TEMPERATURE_FUNCTION, minimum=0.0, maximum=1.0,
              help="non-randomness α (its constant term between 0 and 1)"),
    ), one_of=(("g12", "g21"), ("tau12", "tau21"))),
    "uniquac": _parameters("UNIQUAC parameters", (
        _energy("u12", "Δu12: τ12 = exp(-Δu12/(R T))"),
        _energy("u21", "Δu21: τ21 = exp(-Δu21/(R T))"),
        _tfunc("ln_tau12", "ln τ12 as a temperature function", required=False),
        _tfunc("ln_tau21", "ln τ21 as a temperature function", required=False),
    ), one_of=(("u12", "u21"), ("ln_tau12", "ln_tau21"))),
}

ACTIVITY = Block("activity", (
    Field("model", "choice", choices=tuple(MODEL_PARAMETERS), help="liquid activity model"),
    Field("T_range", "range", "temperature", minimum=1.0, maximum=2500.0,
          help="temperatures where the parameters were fitted, e.g. ['50 C', '100 C']"),
    Field("quality", "choice", choices=tuple(QUALITIES),
          help="; ".join(f"{k}: {v}" for k, v in QUALITIES.items())),
    _source(),
), selector="model", variants={
    kind: (Field("parameters", "block", block=block, required=kind != "ideal",
                 help=f"the {kind} parameters as published"),)
    for kind, block in MODEL_PARAMETERS.items()
}, help="the liquid activity model and its published parameters")

#: Published conditions: pressures from a deep vacuum to a high-pressure column.
PUBLISH_P_MIN_PA, PUBLISH_P_MAX_PA = 100.0, 5e7

PUBLISH = Block("publish", (
    Field("isobars", "quantities", "pressure", required=False, minimum=PUBLISH_P_MIN_PA,
          maximum=PUBLISH_P_MAX_PA, help="pressures of the published isobars (100 Pa to "
          "50 MPa); default [101.325 kPa]"),
    Field("isotherms", "quantities", "temperature", required=False, minimum=1.0,
          maximum=2500.0, help="temperatures of the published isotherms"),
), help="the conditions drawn and tabulated (at least one)")

RECORDED_AZEOTROPE = Block("recorded azeotrope", (
    Field("P", "quantity", "pressure", minimum=PUBLISH_P_MIN_PA, maximum=PUBLISH_P_MAX_PA,
          help="pressure"),
    Field("T", "quantity", "temperature", required=False, minimum=1.0, maximum=2500.0,
          help="boiling temperature of the azeotrope"),
    Field("x1", "number", required=False, minimum=0.0, maximum=1.0, exclusive=True,
          help="mole fraction of component 1"),
    Field("kind", "choice", choices=AZEOTROPE_KINDS, help="minimum- or maximum-boiling"),
    _source(),
), help="an azeotrope as a published table lists it")

RECORDED = Block("recorded", (
    Field("azeotropes", "blocks", block=RECORDED_AZEOTROPE, required=False,
          help="published azeotropes"),
    Field("zeotropic_at", "quantities", "pressure", required=False,
          minimum=PUBLISH_P_MIN_PA, maximum=PUBLISH_P_MAX_PA,
          help="pressures at which the tables list the pair as non-azeotropic"),
    Field("liquid_split", "boolean", required=False,
          help="whether the literature records two liquid phases at the bubble point"),
    _source(required=False, help="the source of zeotropic_at and liquid_split"),
), help="what the literature records, for the reference checks")

SPLIT = Block("split", tuple(
    Field(name, "number", minimum=0.0, maximum=1.0, exclusive=True, help=help)
    for name, help in (("distillate_x1", "distillate mole fraction of component 1"),
                       ("bottoms_x1", "bottoms mole fraction of component 1"),
                       ("feed_x1", "saturated-liquid feed mole fraction of component 1"))
), help="the split of the distillation quick look")

VAPOUR = Block("vapour", (
    Field("model", "choice", choices=("ideal-gas", "virial", "associating", "peng-robinson"),
          help="vapour treatment: ideal-gas, virial (default), associating (carboxylic "
          "acids, with activity parameters regressed with it), peng-robinson (phi-phi, no "
          "activity block)"),
    Field("kij", "number", required=False, minimum=-0.5, maximum=0.5, exclusive=True,
          help="binary interaction parameter k12 (peng-robinson: required)"),
    Field("T_range", "range", "temperature", required=False, minimum=1.0, maximum=2500.0,
          help="peng-robinson: temperatures the kij applies to"),
    Field("quality", "choice", choices=tuple(QUALITIES), required=False,
          help="peng-robinson: quality of the kij"),
    _source(required=False),
), help="the vapour treatment (default virial)")

PAIR = Block("pair", (
    Field("id", "text", pattern=PAIR_ID_PATTERN,
          help="the two component ids joined by '--', equal to the file name"),
    Field("components", "texts", min_items=2, max_items=2, unique=True, pattern=SLUG_PATTERN,
          help="component 1 and component 2 (ids of files in components/)"),
    Field("activity", "block", block=ACTIVITY, required=False,
          help="the liquid activity model (every pair but a peng-robinson one)"),
    Field("vapour", "block", block=VAPOUR, required=False),
    Field("publish", "block", block=PUBLISH, required=False),
    Field("recorded", "block", block=RECORDED, required=False),
    Field("split", "block", block=SPLIT, required=False),
    Field("tags", "texts", required=False, help="keywords for the index"),
    Field("notes", "text", required=False, help="free text shown on the page"),
), help="one binary pair: an activity block (γ–φ; the vapour by default virial, or as its "
        "vapour block says: ideal-gas, virial, associating) or a peng-robinson vapour block "
        "alone (φ–φ)")

#: The three kinds of catalogue file: folder name -> top-level block.
BLOCKS: dict[str, Block] = {"references": REFERENCE, "components": COMPONENT,
                            "binaries": PAIR}
