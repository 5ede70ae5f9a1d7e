"""The ``atlas`` command line: :mod:`.cli` (entry point and ``calc``, ``list``, ``check``),
:mod:`.report` (the analysis subcommands' output) and :mod:`.site` (``build``, ``serve``)."""
