"""The UNIFAC group tables in ``pairs/groups/``: subgroups (R, Q, atoms) and interactions.

Four files, two per model variant (``unifac`` = original UNIFAC, ``dortmund`` =
modified UNIFAC (Dortmund))::

    <variant>-subgroups.yaml     main groups (number: name); subgroups, a text block
                                 of lines "name id main-group R Q atoms"
    <variant>-interactions.yaml  a text block, one line per ordered pair of main
                                 groups: unifac "m n a_mn" (a_mn in K);
                                 dortmund "m n a_mn b_mn c_mn" (K, -, 1/K)

Each file names its sources (reference ids of ``pairs/references/``) and how the
numbers were transcribed.  Loading is strict like the catalogue's: every problem is
reported with the file, the entry (subgroup name or row) and the field.  The tables
are read once per process (:func:`group_tables`).  The rows are plain text blocks
(whitespace-separated numbers) rather than YAML lists: 2,500 rows then load in a few
milliseconds instead of a few hundred.
"""

from __future__ import annotations

import functools
import math
from collections.abc import Mapping
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import yaml

from builder.catalogue.formula import FormulaError, atoms_of
from builder.catalogue.records import SLUG, Source
from builder.errors import CatalogueError, CatalogueErrors

__all__ = ["DEFAULT_GROUPS", "VARIANT_NAMES", "GroupTable", "Subgroup", "group_tables",
           "load_group_table"]

#: The group tables shipped with the project.
DEFAULT_GROUPS = Path(__file__).resolve().parents[2] / "pairs" / "groups"

#: Display names of the model variants.
VARIANT_NAMES = {"unifac": "original UNIFAC", "dortmund": "modified UNIFAC (Dortmund)"}

#: Number of parameters per interaction row after m and n.
_PARAMETERS = {"unifac": 1, "dortmund": 3}

_Loader: Any = getattr(yaml, "CSafeLoader", yaml.SafeLoader)


@dataclass(frozen=True)
class Subgroup:
    """One UNIFAC subgroup: its number, main group, volume R, surface area Q and atoms."""

    name: str
    number: int
    main_group: int
    R: float
    Q: float
    atoms: dict[str, int]


@dataclass(frozen=True)
class GroupTable:
    """The subgroups and main-group interaction parameters of one model variant.

    ``interactions[(m, n)]`` is ``(a_mn,)`` [K] for original UNIFAC and
    ``(a_mn [K], b_mn [-], c_mn [1/K])`` for modified UNIFAC (Dortmund).
    """

    variant: str
    main_groups: dict[int, str]
    subgroups: dict[str, Subgroup]
    interactions: dict[tuple[int, int], tuple[float, ...]]
    sources: tuple[Source, ...]
    transcription: str

    def main_group_name(self, number: int) -> str:
        return self.main_groups.get(number, f"main group {number}")

    def missing_interactions(self, main_groups: set[int]) -> list[tuple[int, int]]:
        """Pairs (m < n) of the given main groups with no published parameter either way."""
        ordered = sorted(main_groups)
        return [(m, n) for i, m in enumerate(ordered) for n in ordered[i + 1:]
                if (m, n) not in self.interactions or (n, m) not in self.interactions]


def _fail(errors: list[CatalogueError], file: str, entry: str, field: str, expected: str,
          found: Any) -> None:
    text = repr(found)
    errors.append(CatalogueError(file, entry, field, expected,
                                 text if len(text) <= 80 else text[:77] + "..."))


def _number(value: Any) -> bool:
    return (isinstance(value, (int, float)) and not isinstance(value, bool)
            and math.isfinite(value))


def _read(path: Path, errors: list[CatalogueError]) -> Mapping[str, Any] | None:
    try:
        data = yaml.load(path.read_text(encoding="utf-8"), Loader=_Loader)  # a safe loader
    except (OSError, yaml.YAMLError) as error:
        _fail(errors, str(path), path.stem, "", "a readable YAML file", str(error).split("\n")[0])
        return None
    if not isinstance(data, Mapping):
        _fail(errors, str(path), path.stem, "", "a mapping of field names to values", data)
        return None
    return data


def _int(text: str) -> int | None:
    return int(text) if text.isdigit() else None


def _float(text: str) -> float | None:
    try:
        value = float(text)
    except ValueError:
        return None
    return value if math.isfinite(value) else None


def _lines(data: Mapping[str, Any], key: str, file: str, variant: str,
           errors: list[CatalogueError]) -> list[tuple[int, list[str]]]:
    """The rows of a text block: (line number in the block, fields), comments skipped."""
    block = data.get(key)
    if not isinstance(block, str) or not block.strip():
        _fail(errors, file, variant, key, "a text block of rows, one per line", block)
        return []
    return [(index, line.split()) for index, line in enumerate(block.splitlines(), 1)
            if line.strip() and not line.lstrip().startswith("#")]


def _header(data: Mapping[str, Any], file: str, variant: str, table: str,
            known_refs: set[str] | None, errors: list[CatalogueError]
            ) -> tuple[tuple[Source, ...], str]:
    if data.get("table") != table:
        _fail(errors, file, variant, "table", repr(table), data.get("table"))
    if data.get("model") != variant:
        _fail(errors, file, variant, "model", repr(variant), data.get("model"))
    sources: list[Source] = []
    raw = data.get("sources")
    if not isinstance(raw, list) or not raw:
        _fail(errors, file, variant, "sources", "a list of {ref, where} source blocks", raw)
        raw = []
    for index, item in enumerate(raw):
        field = f"sources[{index}]"
        if not isinstance(item, Mapping) or not isinstance(item.get("ref"), str) \
                or not isinstance(item.get("where"), str) or set(item) - {"ref", "where", "note"}:
            _fail(errors, file, variant, field, "a source block {ref, where, note}", item)
            continue
        ref = item["ref"]
        if not SLUG.match(ref) or (known_refs is not None and ref not in known_refs):
            _fail(errors, file, variant, f"{field}.ref", "the id of a file in references/", ref)
            continue
        sources.append(Source(ref=ref, where=item["where"], note=item.get("note", "")))
    transcription = data.get("transcription", "")
    if not isinstance(transcription, str) or not transcription.strip():
        _fail(errors, file, variant, "transcription", "a note on how the numbers were "
              "transcribed", transcription)
        transcription = ""
    return tuple(sources), transcription


_SUBGROUP_KEYS = {"table", "model", "title", "sources", "transcription", "main_groups",
                  "subgroups"}
_INTERACTION_KEYS = {"table", "model", "title", "sources", "transcription", "columns",
                     "parameters"}


def load_group_table(folder: Path | str, variant: str,
                     known_refs: set[str] | None = None) -> GroupTable:
    """Read and validate one variant's two files; raise :class:`CatalogueErrors`."""
    if variant not in VARIANT_NAMES:
        raise ValueError(f"unknown UNIFAC variant {variant!r}; expected unifac or dortmund")
    folder = Path(folder)
    errors: list[CatalogueError] = []
    sub_path = folder / f"{variant}-subgroups.yaml"
    int_path = folder / f"{variant}-interactions.yaml"
    sub_file, int_file = str(sub_path), str(int_path)
    main_groups: dict[int, str] = {}
    subgroups: dict[str, Subgroup] = {}
    interactions: dict[tuple[int, int], tuple[float, ...]] = {}
    sources: list[Source] = []
    notes: list[str] = []

    data = _read(sub_path, errors)
    if data is not None:
        for key in set(data) - _SUBGROUP_KEYS:
            _fail(errors, sub_file, variant, str(key), "only the known fields "
                  f"({', '.join(sorted(_SUBGROUP_KEYS))})", "an unknown field")
        found_sources, note = _header(data, sub_file, variant, "subgroups", known_refs, errors)
        sources.extend(found_sources)
        notes.append(note)
        raw_mains = data.get("main_groups")
        if not isinstance(raw_mains, Mapping) or not raw_mains:
            _fail(errors, sub_file, variant, "main_groups", "a mapping of main group number "
                  "to name", raw_mains)
            raw_mains = {}
        for number, name in raw_mains.items():
            if isinstance(number, bool) or not isinstance(number, int) or number <= 0 \
                    or not isinstance(name, str) or not name:
                _fail(errors, sub_file, variant, f"main_groups.{number}", "a positive main "
                      "group number and its name", {number: name})
                continue
            main_groups[number] = name
        numbers: dict[int, str] = {}
        for line_no, fields in _lines(data, "subgroups", sub_file, variant, errors):
            entry = fields[0] if fields else f"subgroups line {line_no}"
            expected = "name, subgroup id, main group id, R, Q and atoms, such as " \
                "'CH3 1 1 0.9011 0.848 CH3'"
            if len(fields) != 6:
                _fail(errors, sub_file, f"subgroups line {line_no}", "", expected,
                      " ".join(fields))
                continue
            name, number_text, main_text, R_text, Q_text, formula = fields
            number, main = _int(number_text), _int(main_text)
            if number is None or number in numbers or name in subgroups:
                _fail(errors, sub_file, entry, "subgroup id", "a subgroup name and number "
                      "used once", number_text)
                continue
            numbers[number] = entry
            if main not in main_groups:
                _fail(errors, sub_file, entry, "main group id", "a number listed in "
                      "main_groups", main_text)
                continue
            R, Q = _float(R_text), _float(Q_text)
            if R is None or Q is None or R <= 0 or Q < 0:
                _fail(errors, sub_file, entry, "R, Q", "a positive R and a non-negative Q",
                      f"{R_text} {Q_text}")
                continue
            try:
                atoms = atoms_of(formula)
            except FormulaError:
                _fail(errors, sub_file, entry, "atoms", "the formula of the group, such as "
                      "'CH3' or 'C2H3O2'", formula)
                continue
            subgroups[name] = Subgroup(name, number, main, R, Q, atoms)

    data = _read(int_path, errors)
    if data is not None:
        for key in set(data) - _INTERACTION_KEYS:
            _fail(errors, int_file, variant, str(key), "only the known fields "
                  f"({', '.join(sorted(_INTERACTION_KEYS))})", "an unknown field")
        found_sources, note = _header(data, int_file, variant, "interactions", known_refs,
                                      errors)
        sources.extend(found_sources)
        notes.append(note)
        width = 2 + _PARAMETERS[variant]
        for line_no, fields in _lines(data, "parameters", int_file, variant, errors):
            entry = f"parameters line {line_no}"
            m, n = (_int(fields[0]), _int(fields[1])) if len(fields) == width else (None, None)
            values = [_float(v) for v in fields[2:]]
            if m is None or n is None or any(v is None for v in values):
                _fail(errors, int_file, entry, "", f"{width} numbers: m, n, "
                      + ("a_mn" if width == 3 else "a_mn, b_mn, c_mn"), " ".join(fields))
                continue
            if m not in main_groups or n not in main_groups or m == n:
                _fail(errors, int_file, entry, "m, n", "two different main groups of "
                      f"{variant}-subgroups.yaml", f"{m} {n}")
                continue
            if (m, n) in interactions:
                _fail(errors, int_file, entry, "m, n", "a pair of main groups listed once",
                      f"{m} {n}")
                continue
            interactions[(m, n)] = tuple(float(v) for v in values if v is not None)
    if errors:
        raise CatalogueErrors(errors)
    return GroupTable(variant=variant, main_groups=main_groups, subgroups=subgroups,
                      interactions=interactions, sources=tuple(sources),
                      transcription=" ".join(n for n in notes if n))


@functools.lru_cache(maxsize=8)
def _cached(folder: str, variant: str) -> GroupTable:
    references = Path(folder).parent / "references"
    known = {p.stem for p in references.glob("*.yaml")} if references.is_dir() else None
    return load_group_table(folder, variant, known)


def group_tables(variant: str, folder: Path | str = DEFAULT_GROUPS) -> GroupTable:
    """One variant's group table, read once per process and folder."""
    return _cached(str(Path(folder).resolve()), variant)
