"""``atlas schema`` and ``atlas new``: help for people writing catalogue files.

``atlas schema`` writes the JSON Schema of the three kinds of file into the
catalogue's ``schema/`` folder (``--check``: only report whether they are up to
date).  ``atlas new component NAME`` and ``atlas new pair A B`` write a starting
file with every required field in place (:mod:`builder.catalogue.scaffold`).
"""

from __future__ import annotations

import argparse
import re
from typing import Any

from builder.catalogue.records import PAIR_SEPARATOR, SLUG
from builder.catalogue.scaffold import component_scaffold, pair_scaffold
from builder.catalogue.schema import write_schemas
from builder.errors import AtlasError

__all__ = ["COMMANDS", "add_parsers", "run"]

COMMANDS = ("schema", "new")


def add_parsers(commands: Any) -> None:
    """Add ``schema`` and ``new`` to the ``atlas`` subcommands (an argparse subparsers)."""
    schema = commands.add_parser(
        "schema", help="write the JSON Schema of the catalogue files",
        description="Write the JSON Schema of reference, component and pair files into the "
                    "catalogue's schema/ folder, generated from the loader's field "
                    "declarations. Editors that follow the yaml-language-server comment on "
                    "each file's first line validate and complete with it.")
    schema.add_argument("--check", action="store_true",
                        help="write nothing; exit 1 when a schema file is missing or stale")
    new = commands.add_parser(
        "new", help="start a new component or pair file",
        description="Write a catalogue file with every required field, unit and source "
                    "block in place. It fails 'atlas check' with located messages until "
                    "every '<fill in ...>' value is replaced by the published one.")
    new.add_argument("kind", choices=("component", "pair"))
    new.add_argument("names", nargs="+", metavar="NAME",
                     help="component: its name (the id is made from it); pair: the two "
                          "component ids")
    new.add_argument("--force", action="store_true", help="overwrite an existing file")


def _slug(name: str) -> str:
    """``Ethyl Acetate`` -> ``ethyl-acetate``.

    >>> _slug("1,2-Dichloroethane"), _slug("Ethyl  Acetate")
    ('1-2-dichloroethane', 'ethyl-acetate')
    """
    return re.sub(r"[^a-z0-9]+", "-", name.casefold()).strip("-")


def run(args: argparse.Namespace) -> int:
    if args.command == "schema":
        stale = write_schemas(args.catalogue, check=args.check)
        if args.check:
            for path in stale:
                print(f"stale or missing: {path} (run 'atlas schema')")
            return 1 if stale else 0
        for path in stale:
            print(f"wrote {path}")
        if not stale:
            print("schemas up to date")
        return 0
    if args.kind == "component":
        if len(args.names) != 1:
            raise AtlasError("atlas new component takes one name, e.g. 'Larchmoor resin A'")
        name = args.names[0]
        cid = _slug(name)
        if not cid or not SLUG.match(cid):
            raise AtlasError(f"cannot make an id from {name!r}: use letters and digits")
        path = args.catalogue / "components" / f"{cid}.yaml"
        text = component_scaffold(cid, name)
    else:
        if len(args.names) != 2:
            raise AtlasError("atlas new pair takes two component ids, e.g. 'ethanol water'")
        first, second = args.names
        for cid in (first, second):
            if not SLUG.match(cid):
                raise AtlasError(f"{cid!r} is not a component id (lower-case letters, digits "
                                 "and single hyphens)")
        if first == second:
            raise AtlasError("a pair needs two different components")
        reverse = args.catalogue / "binaries" / f"{second}{PAIR_SEPARATOR}{first}.yaml"
        if reverse.exists():
            raise AtlasError(f"the pair is already in the catalogue as {reverse}")
        path = args.catalogue / "binaries" / f"{first}{PAIR_SEPARATOR}{second}.yaml"
        text = pair_scaffold(first, second)
    if path.exists() and not args.force:
        raise AtlasError(f"{path} exists (use --force to overwrite)")
    path.parent.mkdir(parents=True, exist_ok=True)
    path.write_text(text, encoding="utf-8")
    print(f"wrote {path}: fill in every '<fill in ...>' value from its source, then run "
          f"'atlas check'")
    return 0
