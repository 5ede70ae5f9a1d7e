"""The ``atlas build`` and ``atlas serve`` subcommands (added to :mod:`builder.commands.cli`)."""

from __future__ import annotations

import argparse
import sys
from pathlib import Path
from typing import Any

from builder.site import DEFAULT_OUTPUT

__all__ = ["COMMANDS", "add_parsers", "run"]

COMMANDS = ("build", "serve")


def add_parsers(commands: Any) -> None:
    """Add ``build`` and ``serve`` to the ``atlas`` subcommands (an argparse subparsers)."""
    build = commands.add_parser(
        "build", help="build the offline HTML atlas",
        description="Load and validate the catalogue, compute every pair, render figures "
                    "and pages, and assemble a static site that works from file:// and on "
                    "any web server, with no internet access.")
    build.add_argument("--out", type=Path, default=DEFAULT_OUTPUT,
                       help="output folder (default: site/ of the repository)")
    build.add_argument("--settings", type=Path, default=None,
                       help="site settings file (default: site.yaml of the repository)")
    build.add_argument("--strict", action="store_true",
                       help="fail on any warning (an external asset among them)")
    build.add_argument("--only", action="append", default=[], metavar="PAIR",
                       help="build only this catalogued pair id, without predicted pages "
                       "(repeatable; for quick previews)")
    build.add_argument("--keep-source", type=Path, default=None, metavar="DIR",
                       help="keep the generated Markdown, figures and mkdocs.yml in DIR")
    build.add_argument("--workers", type=int, default=None,
                       help="local processes computing and drawing the pairs (default: the "
                            "cores, at most 4)")
    build.add_argument("--executor", choices=("local", "dask"), default="local",
                       help="where the per-pair work runs: local processes (default) or an "
                            "existing Dask distributed cluster (needs --scheduler and the "
                            "'cluster' extra)")
    build.add_argument("--scheduler", default=None, metavar="ADDRESS",
                       help="the Dask scheduler, e.g. tcp://buildfarm:8786")
    build.add_argument("--no-cache", action="store_true",
                       help="a cold build: recompute every pair and re-assemble every page "
                            "(the cache is refreshed for the next build)")
    build.add_argument("--allow-failed-checks", action="store_true",
                       help="also publish parameter sets that fail their reference checks, "
                            "each with a banner on its page (default: such sets are withheld)")
    build.add_argument("--cache-dir", type=Path, default=None, metavar="DIR",
                       help="the build cache (default: .atlas-cache/ beside the output "
                            "folder)")
    preview = commands.add_parser("serve", help="preview a built atlas on 127.0.0.1",
                                  description="Serve a built site over HTTP on the loopback "
                                              "interface for a local preview.")
    preview.add_argument("--site", type=Path, default=DEFAULT_OUTPUT,
                         help="the built site (default: site/)")
    preview.add_argument("--host", default="127.0.0.1", help="loopback address (default "
                                                             "127.0.0.1)")
    preview.add_argument("--port", type=int, default=8000, help="port (default 8000)")


def run(args: argparse.Namespace) -> int:
    """Run ``build`` or ``serve``; errors propagate as :class:`AtlasError`."""
    if args.command == "build":
        from builder.site.build import build_site  # matplotlib and mkdocs load only when building
        from builder.site.executor import make_executor

        print(f"Building the atlas from {args.catalogue} into {args.out}", flush=True)
        executor = make_executor(args.executor, workers=args.workers, scheduler=args.scheduler)
        try:
            report = build_site(args.catalogue, args.out, settings_file=args.settings,
                                strict=args.strict, source_dir=args.keep_source,
                                only=args.only, executor=executor, use_cache=not args.no_cache,
                                cache_dir=args.cache_dir,
                                allow_failed_checks=args.allow_failed_checks,
                                progress=lambda line: print(line, flush=True))
        finally:
            executor.close()
        for warning in report.warnings:
            print(f"warning: {warning}", file=sys.stderr)
        print(report.summary())
        return 0
    if args.command == "serve":
        from builder.site.serve import serve

        serve(args.site, args.host, args.port)
        return 0
    raise ValueError(f"not a site command: {args.command!r}")
