"""Binary vapour-liquid equilibrium atlas: catalogue, thermodynamics, figures and site.

The thermodynamic modules (:mod:`builder.vapour_pressure`, :mod:`builder.activity`,
:mod:`builder.equilibrium`) are pure functions and records over numpy arrays in SI units;
:mod:`builder.catalogue` turns the YAML catalogue into validated records;
:mod:`builder.cli` is the ``atlas`` command.
"""

__version__ = "0.1.0"
