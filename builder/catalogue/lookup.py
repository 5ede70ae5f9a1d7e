"""Find components and pairs by what a user types: id, name, synonym or CAS number."""

from __future__ import annotations

import difflib
import re

from builder.catalogue.loader import Catalogue
from builder.catalogue.predictive import predicted_pair
from builder.catalogue.records import Component, PairRecord
from builder.errors import AtlasError, LookupFailure

__all__ = ["MODEL_CHOICES", "find_component", "find_pair", "find_pair_or_prediction",
           "normalise"]


def normalise(text: str) -> str:
    """Case, spaces, hyphens and underscores do not matter.

    >>> normalise("Ethyl  Acetate"), normalise("ethyl-acetate"), normalise("N_Hexane")
    ('ethylacetate', 'ethylacetate', 'nhexane')
    """
    return re.sub(r"[\s_\-]+", "", text.casefold())


def _index(catalogue: Catalogue) -> dict[str, str]:
    index: dict[str, str] = {}
    for component in catalogue.components.values():
        for name in component.names():
            index.setdefault(normalise(name), component.id)
        index[component.cas] = component.id  # CAS keeps its hyphens
    return index


def find_component(catalogue: Catalogue, query: str) -> Component:
    """The component a user means, or :class:`LookupFailure` with close names.

    Exact matches on id, name, synonym, CAS number or formula (in that
    order of preference) win; otherwise the error suggests close spellings.
    """
    index = _index(catalogue)
    key = query.strip()
    cid = index.get(key) or index.get(normalise(key))
    if cid is not None:
        return catalogue.components[cid]
    owner: dict[str, str] = {}
    for component in catalogue.components.values():
        for name in (component.id, component.name, *component.synonyms):
            owner.setdefault(normalise(name), component.id)
    close = difflib.get_close_matches(normalise(key), list(owner), n=6, cutoff=0.6)
    # Substring matches help for partial names ("xylene" -> "o-xylene", ...).
    partial = [s for s in owner if normalise(key) and normalise(key) in s]
    # One suggestion per component, shown by its id.
    suggestions = list(dict.fromkeys(owner[s] for s in [*close, *partial]))[:5]
    raise LookupFailure("component", query, suggestions)


def find_pair(catalogue: Catalogue, first: str, second: str
              ) -> tuple[PairRecord, bool, Component, Component]:
    """The pair of two named components in either order.

    Returns the record, whether the user's order is the reverse of the
    record's, and the two components in the user's order.
    """
    c1 = find_component(catalogue, first)
    c2 = find_component(catalogue, second)
    if c1.id == c2.id:
        raise LookupFailure("pair", f"{first} + {second}",
                            ["two different components"])
    found = catalogue.pair_of(c1.id, c2.id)
    if found is None:
        partners = sorted({p.component2 if p.component1 == c1.id else p.component1
                           for p in catalogue.pairs.values() if c1.id in (p.component1,
                                                                           p.component2)})
        hint = [f"{c1.id} with {o}" for o in partners[:5]]
        raise LookupFailure("catalogued pair", f"{c1.id} + {c2.id}", hint)
    record, swapped = found
    return record, swapped, c1, c2


#: What ``--model`` may ask for: the fitted set, a UNIFAC variant, or either (fitted first).
MODEL_CHOICES = ("auto", "fitted", "unifac", "dortmund")


def find_pair_or_prediction(catalogue: Catalogue, first: str, second: str, model: str = "auto"
                            ) -> tuple[PairRecord, bool, Component, Component]:
    """Like :func:`find_pair`, but any two catalogued components have an answer.

    ``model`` ``"auto"``: the fitted set if there is one, else the default prediction
    (modified UNIFAC (Dortmund), or original UNIFAC where Dortmund cannot predict);
    ``"fitted"``: the fitted set or an error; ``"unifac"``/``"dortmund"``: that
    prediction.  A prediction is built in the user's order (never swapped).
    """
    if model not in MODEL_CHOICES:
        raise ValueError(f"unknown model {model!r}; use one of {', '.join(MODEL_CHOICES)}")
    c1 = find_component(catalogue, first)
    c2 = find_component(catalogue, second)
    if c1.id == c2.id:
        raise LookupFailure("pair", f"{first} + {second}", ["two different components"])
    found = catalogue.pair_of(c1.id, c2.id)
    if model in ("auto", "fitted") and found is not None:
        record, swapped = found
        return record, swapped, c1, c2
    if model == "fitted":
        raise AtlasError(f"no fitted parameter set for {c1.id} + {c2.id} in the catalogue; "
                         "--model dortmund or --model unifac gives a prediction")
    return predicted_pair(c1, c2, None if model == "auto" else model), False, c1, c2
