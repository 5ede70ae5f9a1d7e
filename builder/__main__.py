"""``python -m builder`` is the ``atlas`` command."""

import sys

from .cli import main

sys.exit(main())
