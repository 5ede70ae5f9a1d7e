"""Analysis of one pair: curves, liquid stability, azeotropes, volatility, distillation.

:mod:`.curves` (Txy, Pxy), :mod:`.stability` (liquid split, three-phase line),
:mod:`.azeotropes`, :mod:`.trace` (one condition analysed, the azeotrope against
pressure), :mod:`.volatility`, :mod:`.distillation` (quick look), :mod:`.point` (a catalogue
pair as a binary system; point calculations), :mod:`.checks` (a pair against what the
literature records), :mod:`.results` (every published condition of a pair) and
:mod:`.catalogue_checks` (the reference checks of the whole catalogue).
"""
