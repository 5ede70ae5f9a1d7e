"""The atoms of a UNIFAC subgroup, read from its name as printed in the published tables.

Group names are formulas written in capitals (``CH2CL`` is CH2Cl, ``SIH2O`` is SiH2O)
with a few conventions of the tables (common practice, from the published group
definitions): a leading ``A`` marks an aromatic carbon (``ACH``, ``ACCH3``), ``CY-`` a
ring member, ``(P)``/``(S)``/``(T)`` a primary, secondary or tertiary
alcohol, ``AM`` the amide group CON, ``SU`` the sulfone group SO2, ``CB`` the
carbonate group CO3, and bonds (``=``, ``-``) and ion charges are not atoms.  A few
groups are named after a whole molecule or ring part; their formulas are listed below
from the published group definitions (from memory, as structure).
"""

from __future__ import annotations

import re

from builder.catalogue.formula import atoms_of

#: Groups named after a molecule or ring part (structure from the group definitions).
NAMED = {
    "FURFURAL": "C5H4O2",   # the whole molecule
    "DOH": "C2H6O2",        # ethylene glycol, HOCH2CH2OH
    "DMSO": "C2H6OS",       # dimethyl sulfoxide
    "ACRY": "C3H3N",        # acrylonitrile
    "DMF": "C3H7NO",        # N,N-dimethylformamide
    "MORPH": "C4H9NO",      # morpholine
    "TRIOXAN": "CH2O",      # one ring CH2-O of trioxane
    "NEP": "C2H2NO",        # ring CON-CH2 of N-ethylpyrrolidone
    "NIPP": "C2HNO",        # ring CON-CH of N-isopropylpyrrolidone
    "NTBP": "C2NO",         # ring CON-C of N-tert-butylpyrrolidone
    "IMIDAZOL": "C3H3N2",
    "BTI": "C2F6NO4S2",     # bis(trifluoromethylsulfonyl)imide
    "OTF-": "CF3O3S",       # triflate
    "CL-(C=C)": "Cl",       # a chlorine on a double-bonded carbon
}

#: Named differently in the two variants: NMP is the whole molecule in original UNIFAC,
#: the ring part CON-CH3 in modified UNIFAC (Dortmund) (with three CY-CH2 groups).
#: THF is the ring CH2-O in original UNIFAC (tetrahydrofuran = 3 CH2 + 1 THF) but the
#: ring CH2-O-CH2 in modified UNIFAC (Dortmund) (tetrahydrofuran = 2 CY-CH2 + 1 THF,
#: 1,4-dioxane = 2 THF), as the DDBST group assignments show.
NAMED_BY_MODEL = {("unifac", "NMP"): "C5H9NO", ("dortmund", "NMP"): "C2H3NO",
                  ("unifac", "THF"): "CH2O", ("dortmund", "THF"): "C2H4O"}


def group_formula(name: str, model: str) -> str:
    """The formula of a subgroup from its name, e.g. ``CH2CL`` -> ``CH2Cl``."""
    if (model, name) in NAMED_BY_MODEL:
        return NAMED_BY_MODEL[(model, name)]
    if name in NAMED:
        return NAMED[name]
    text = re.sub(r"\((P|S|T)\)$", "", name)     # primary/secondary/tertiary OH
    text = text.removeprefix("CY-").rstrip("+-")
    text = re.sub(r"^A(?=C)", "", text)           # aromatic carbon marker
    text = text.replace("AM", "CON").replace("SU", "SO2").replace("CB", "CO3")
    text = text.replace("-", "").replace("=", "")
    text = text.replace("CL", "Cl").replace("BR", "Br").replace("SI", "Si")
    return text


def group_atoms(name: str, model: str) -> dict[str, int]:
    return atoms_of(group_formula(name, model))
