"""Chemical families of the catalogued components, for grouping the screening views.

A component's family is read from its original-UNIFAC subgroups (the ``groups``
block of its catalogue file): the functional groups decide, in the order of
:data:`FAMILIES` (water first, then acids, alcohols, ...; a multifunctional
molecule joins the first family it qualifies for), and a molecule of hydrocarbon
groups only is aromatic, unsaturated or saturated by its groups.  Subgroup names
are those of the published table (Hansen et al., Ind. Eng. Chem. Res. 30 (1991)
2352, Table 1) as spelled in ``pairs/groups/``.  A component without groups is
placed by its formula: hydrocarbons (C and H only) or "other".

>>> family_of_groups({"CH3": 1, "CH2": 1, "OH": 1})
'alcohols'
>>> family_of_groups({"ACH": 5, "ACCH3": 1})
'aromatics'
>>> family_of_groups({"CHCL3": 1})
'halogenated'
"""

from __future__ import annotations

import re
from collections.abc import Mapping

from builder.catalogue.records import Component

__all__ = ["FAMILIES", "family", "family_of_groups"]

#: Family key -> heading, in the order of the screening views and of precedence.
FAMILIES = {
    "water": "Water",
    "acids": "Carboxylic acids",
    "alcohols": "Alcohols and glycols",
    "phenols": "Phenols",
    "nitrogen": "Nitrogen compounds (amines, nitriles, pyridines, amides)",
    "sulfur": "Sulfur compounds",
    "halogenated": "Halogenated compounds",
    "esters": "Esters",
    "ketones": "Ketones and aldehydes",
    "ethers": "Ethers",
    "aromatics": "Aromatic hydrocarbons",
    "alkenes": "Alkenes and alkynes",
    "alkanes": "Alkanes and cycloalkanes",
    "hydrocarbons": "Hydrocarbons",
    "other": "Other",
}

#: Original-UNIFAC subgroup -> family (Hansen et al. 1991, Table 1; main groups 1-55).
_SUBGROUP_FAMILY: dict[str, str] = {
    "H2O": "water",
    "COOH": "acids", "HCOOH": "acids",
    "OH": "alcohols", "CH3OH": "alcohols", "DOH": "alcohols", "C2H5O2": "alcohols",
    "C2H4O2": "alcohols",
    "ACOH": "phenols",
    **{name: "nitrogen" for name in (
        "CH3NH2", "CH2NH2", "CHNH2", "CH3NH", "CH2NH", "CHNH", "CH3N", "CH2N", "ACNH2",
        "C5H5N", "C5H4N", "C5H3N", "CH3CN", "CH2CN", "CH3NO2", "CH2NO2", "CHNO2", "ACNO2",
        "ACRY", "DMF", "HCON(CH2)2", "NMP", "AMH2", "AMHCH3", "AMHCH2", "AM(CH3)2",
        "AMCH3CH2", "AM(CH2)2", "MORPH", "NCO")},
    **{name: "sulfur" for name in (
        "CS2", "CH3SH", "CH2SH", "DMSO", "CH3S", "CH2S", "CHS", "C4H4S", "C4H3S", "C4H2S",
        "(CH2)2SU", "CH2CHSU")},
    **{name: "halogenated" for name in (
        "CH2CL", "CHCL", "CCL", "CH2CL2", "CHCL2", "CCL2", "CHCL3", "CCL3", "CCL4", "ACCL",
        "I", "BR", "CL-(C=C)", "ACF", "CF3", "CF2", "CF", "CCL3F", "CCL2F", "HCCL2F",
        "HCCLF", "CCLF2", "HCCLF2", "CCLF3", "CCL2F2")},
    "CH3COO": "esters", "CH2COO": "esters", "HCOO": "esters", "COO": "esters",
    "CH3CO": "ketones", "CH2CO": "ketones", "CHO": "ketones", "FURFURAL": "ketones",
    "CH3O": "ethers", "CH2O": "ethers", "CH-O": "ethers", "THF": "ethers",
    "ACH": "aromatics", "AC": "aromatics", "ACCH3": "aromatics", "ACCH2": "aromatics",
    "ACCH": "aromatics",
    "CH2=CH": "alkenes", "CH=CH": "alkenes", "CH2=C": "alkenes", "CH=C": "alkenes",
    "C=C": "alkenes", "CH=-C": "alkenes", "C=-C": "alkenes",
    "CH3": "alkanes", "CH2": "alkanes", "CH": "alkanes", "C": "alkanes",
}

_ORDER = {key: i for i, key in enumerate(FAMILIES)}


def family_of_groups(groups: Mapping[str, int]) -> str:
    """The family (a key of :data:`FAMILIES`) of a molecule made of these subgroups."""
    found = {_SUBGROUP_FAMILY.get(name.upper(), _SUBGROUP_FAMILY.get(name, "other"))
             for name, count in groups.items() if count > 0}
    if not found:
        return "other"
    return min(found, key=_ORDER.__getitem__)


def family(component: Component) -> str:
    """The family of a catalogued component (its UNIFAC groups, else its formula)."""
    groups = getattr(component, "groups", None)
    subgroups = groups.of("unifac") if groups is not None else None
    if subgroups:
        return family_of_groups(subgroups)
    elements = set(re.findall(r"[A-Z][a-z]?", component.formula))
    if component.formula in ("H2O",):
        return "water"
    return "hydrocarbons" if elements and elements <= {"C", "H"} else "other"
