"""Binary vapour-liquid equilibrium atlas: catalogue, thermodynamics, figures and site.

The subpackages follow the flow of data through a build:

* :mod:`builder.thermo` -- units, vapour pressure, activity models, the vectorised solvers
  and bubble/dew points: pure functions and records over numpy arrays, SI inside;
* :mod:`builder.catalogue` -- the YAML catalogue read into validated, frozen records;
* :mod:`builder.analysis` -- curves, liquid stability, azeotropes, volatility, the
  distillation quick look and every pair's results and reference checks;
* :mod:`builder.site` -- results turned into the offline HTML atlas;
* :mod:`builder.commands` -- the ``atlas`` command line (``python -m builder``).
"""

__version__ = "0.1.0"
