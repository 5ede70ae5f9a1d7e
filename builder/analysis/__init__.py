"""Analysis of one pair: curves, liquid stability, azeotropes, volatility, distillation.

:mod:`.curves` (Txy, Pxy), :mod:`.stability` (liquid split, three-phase line),
:mod:`.azeotropes`, :mod:`.phase_lines` (azeotropes and three-phase points solved from
their own equations, many pressures at once), :mod:`.dew_branches` (bubble points added
beside a three-phase line where the grid is sparse), :mod:`.trace` (one condition analysed, the
azeotrope against pressure), :mod:`.volatility`, :mod:`.distillation` (quick look),
:mod:`.point` (a catalogue pair as a binary system; point calculations), :mod:`.record`
(the typed, versioned result record), :mod:`.checks` (a record against what the
literature records), :mod:`.results` (computes the record of every published condition
of a pair and attaches the checks) and :mod:`.catalogue_checks` (the reference checks of
the whole catalogue).
"""
