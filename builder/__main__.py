"""``python -m builder`` is the ``atlas`` command."""

import sys

from builder.commands.cli import main

sys.exit(main())
