"""Write the UNIFAC deviation table: ``python -m builder.commands.deviations OUT.md``.

Reads the shipped catalogue and ``pairs/recorded-azeotropes.yaml``, predicts every
combination at 101.325 kPa (:mod:`builder.analysis.deviations`) and writes the Markdown
page (the committed one is ``docs/unifac-deviations.md``).
"""

from __future__ import annotations

import sys
from collections.abc import Sequence
from pathlib import Path

from builder.analysis.deviations import deviations, markdown
from builder.catalogue.loader import load_catalogue
from builder.catalogue.recorded_table import load_recorded_azeotropes
from builder.errors import AtlasError

__all__ = ["main", "report_text"]


def report_text() -> str:
    """The deviation page of the shipped catalogue."""
    catalogue = load_catalogue()
    return markdown(catalogue, deviations(catalogue, load_recorded_azeotropes(catalogue)))


def main(argv: Sequence[str] | None = None) -> int:
    args = list(sys.argv[1:] if argv is None else argv)
    if len(args) != 1:
        print("usage: python -m builder.commands.deviations OUT.md", file=sys.stderr)
        return 2
    try:
        text = report_text()
    except AtlasError as error:
        print(f"atlas: error: {error}", file=sys.stderr)
        return 2
    out = Path(args[0])
    out.parent.mkdir(parents=True, exist_ok=True)
    out.write_text(text, encoding="utf-8")
    print(f"deviation table written to {out}")
    return 0


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
