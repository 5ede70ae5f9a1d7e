"""Thermodynamics: pure functions and records over numpy arrays, SI units throughout.

:mod:`.units` converts at the edges, :mod:`.vapour_pressure` and :mod:`.activity` are the
correlations and models, :mod:`.solvers` the vectorised bracketed root finder and
:mod:`.equilibrium` the bubble and dew points of a binary system.
"""
