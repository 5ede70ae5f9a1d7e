"""Errors a user can act on.

A catalogue error names the file, the entry and the field, what was expected
and what was found, in one message format:

    pairs/components/ethanol.yaml: entry 'ethanol', field 'constants.critical_pressure':
    expected a pressure with a unit, such as '6.1 MPa'; found '6.1'

They subclass :class:`ValueError`, so callers may catch either.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

__all__ = ["AtlasError", "CatalogueError", "CatalogueErrors", "LookupFailure"]


class AtlasError(Exception):
    """Base of the errors the command line reports without a traceback."""


@dataclass
class CatalogueError(AtlasError, ValueError):
    """One bad value in one catalogue file."""

    file: str
    entry: str
    field: str
    expected: str
    found: str

    def __str__(self) -> str:
        where = f"{self.file}: entry {self.entry!r}"
        if self.field:
            where += f", field {self.field!r}"
        return f"{where}: expected {self.expected}; found {self.found}"


class CatalogueErrors(AtlasError, ValueError):
    """Every problem found while loading a catalogue, reported together."""

    def __init__(self, errors: Sequence[CatalogueError]):
        self.errors = list(errors)
        super().__init__(self.__str__())

    def __str__(self) -> str:
        count = len(self.errors)
        head = f"{count} problem{'s' if count != 1 else ''} in the catalogue:"
        return "\n".join([head, *(f"  - {e}" for e in self.errors)])


@dataclass
class LookupFailure(AtlasError, LookupError):
    """A component or pair the user named is not in the catalogue."""

    what: str
    query: str
    suggestions: Sequence[str] = ()

    def __str__(self) -> str:
        text = f"no {self.what} matches {self.query!r}"
        if self.suggestions:
            text += "; did you mean " + ", ".join(repr(s) for s in self.suggestions) + "?"
        return text
