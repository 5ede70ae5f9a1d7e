"""The catalogue: YAML files in ``pairs/`` turned into validated, frozen records.

:mod:`.records` holds the record types, :mod:`.loader` reads and validates the files
(every problem reported with its file, entry and field), :mod:`.lookup` finds a
component or pair by id, name, synonym or CAS number.
"""

from builder.catalogue.loader import DEFAULT_CATALOGUE, Catalogue, load_catalogue

__all__ = ["DEFAULT_CATALOGUE", "Catalogue", "load_catalogue"]
