"""The ``atlas`` command line.

    atlas calc bubble-t ethanol water --x 0.30 --P 1atm
    atlas calc dew-p acetone chloroform --y 0.5 --T 50C --json
    atlas list

Errors a user can act on (unknown component, bad unit, bad catalogue entry)
are printed as one message with exit status 2, never as a traceback.
"""

from __future__ import annotations

import argparse
import json
import sys
from collections.abc import Sequence
from pathlib import Path
from typing import Any

from builder.analysis import point
from builder.catalogue.loader import DEFAULT_CATALOGUE, Catalogue, load_catalogue
from builder.catalogue.lookup import MODEL_CHOICES
from builder.commands import authoring, report
from builder.commands import diff as diff_command
from builder.commands import site as site_commands
from builder.errors import AtlasError, CatalogueError
from builder.thermo.units import UnitError, format_pressure, format_temperature, parse_quantity

__all__ = ["main"]


def _fraction(text: str) -> float:
    try:
        value = float(text)
    except ValueError:
        raise argparse.ArgumentTypeError(
            f"expected a fraction such as 0.30, found {text!r}") from None
    if not (0.0 <= value <= 1.0):
        raise argparse.ArgumentTypeError(
            f"a fraction must lie in [0, 1]; found {text} (for 30 % write 0.30)")
    return value


def _temperature(text: str) -> float:
    try:
        return parse_quantity(text, "temperature")
    except UnitError as error:
        raise argparse.ArgumentTypeError(
            f"{error}; write for example 351.4K, 78C or 172F") from None


def _pressure(text: str) -> float:
    try:
        return parse_quantity(text, "pressure")
    except UnitError as error:
        raise argparse.ArgumentTypeError(
            f"{error}; write for example 101.325kPa, 1atm, 760mmHg or 1.2bar") from None


def _parser() -> argparse.ArgumentParser:
    parser = argparse.ArgumentParser(
        prog="atlas",
        description="Binary vapour-liquid equilibrium atlas: point calculations and the site.",
    )
    parser.add_argument("--catalogue", type=Path, default=DEFAULT_CATALOGUE,
                        help="catalogue folder (default: the shipped pairs/)")
    commands = parser.add_subparsers(dest="command", required=True, metavar="COMMAND")

    calc = commands.add_parser("calc", help="bubble or dew point of any two components",
                               description="Bubble or dew point of any two catalogued "
                               "components: the fitted set where the catalogue has one, "
                               "otherwise a UNIFAC prediction (said so in the output). "
                               "Compositions refer to the first named component.")
    calc.add_argument("kind", choices=[*point.POINT_KINDS, *report.ANALYSES],
                      help="bubble-t / dew-t at a pressure, bubble-p / dew-p at a "
                      "temperature; azeotrope, volatility (at --P or --T) and quicklook "
                      "(at --P)")
    calc.add_argument("first", help="component 1: id, name, synonym or CAS number")
    calc.add_argument("second", help="component 2")
    calc.add_argument("--x", type=_fraction, help="liquid fraction of component 1 (bubble points)")
    calc.add_argument("--y", type=_fraction, help="vapour fraction of component 1 (dew points)")
    calc.add_argument("--T", type=_temperature, help="temperature with unit: 351.4K, 78C, 172F")
    calc.add_argument("--P", type=_pressure, help="pressure with unit: 101.325kPa, 1atm, 760mmHg")
    calc.add_argument("--distillate", type=_fraction,
                      help="quicklook: distillate mole fraction of component 1")
    calc.add_argument("--bottoms", type=_fraction,
                      help="quicklook: bottoms mole fraction of component 1")
    calc.add_argument("--feed", type=_fraction,
                      help="quicklook: saturated-liquid feed mole fraction of component 1")
    calc.add_argument("--trace", action="store_true",
                      help="azeotrope: also follow it from 10 kPa to 1 MPa (clipped to the "
                      "correlations' ranges)")
    calc.add_argument("--mass", action="store_true",
                      help="the fraction given is a mass fraction (default: mole fraction)")
    calc.add_argument("--model", choices=MODEL_CHOICES, default="auto",
                      help="auto (default): the fitted set, else modified UNIFAC (Dortmund) or "
                      "original UNIFAC; fitted: the fitted set only; unifac, dortmund: that "
                      "prediction")
    calc.add_argument("--json", action="store_true", help="print one JSON object")

    check = commands.add_parser(
        "check", help="validate the catalogue and run its reference checks",
        description="Validate the whole catalogue (or the named pair files) and run the "
        "reference checks; exit status 1 when any check fails.")
    check.add_argument("files", nargs="*", type=Path,
                       help="pair files (binaries/*.yaml) to check; default: all pairs")
    check.add_argument("--report", type=Path,
                       help="also write the check results and sources as Markdown here")

    listing = commands.add_parser("list", help="the catalogued components and pairs")
    listing.add_argument("--json", action="store_true", help="print JSON")
    site_commands.add_parsers(commands)
    authoring.add_parsers(commands)
    diff_command.add_parsers(commands)
    return parser


def _calc(args: argparse.Namespace, catalogue: Catalogue) -> int:
    if args.kind in report.ANALYSES:
        return report.run(args, catalogue)
    bubble = args.kind.startswith("bubble")
    given, other = ("x", "y") if bubble else ("y", "x")
    composition = getattr(args, given)
    if composition is None:
        raise AtlasError(f"{args.kind} needs the {'liquid' if bubble else 'vapour'} composition: "
                         f"--{given} (for example --{given} 0.30)")
    if getattr(args, other) is not None:
        raise AtlasError(f"{args.kind} takes --{given}, not --{other}")
    at_T = args.kind.endswith("-p")
    if at_T and args.T is None:
        raise AtlasError(f"{args.kind} needs a temperature: --T (for example --T 78C)")
    if not at_T and args.P is None:
        raise AtlasError(f"{args.kind} needs a pressure: --P (for example --P 1atm)")
    answer = point.solve_point(catalogue, args.first, args.second, args.kind,
                               composition=composition, T_K=args.T if at_T else None,
                               P_Pa=None if at_T else args.P, mass=args.mass,
                               model=args.model)
    if args.json:
        print(json.dumps(answer.to_json(), indent=2))
    else:
        print(_point_table(answer, show_mass=args.mass))
    return 0 if answer.converged else 1


def _point_table(answer: point.PointAnswer, show_mass: bool = False) -> str:
    c1, c2 = answer.components
    width = max(len(c1.name), len(c2.name), 10)
    fixed = "P" if answer.kind.endswith("-t") else "T"
    condition = (format_pressure(answer.P_Pa) if fixed == "P"
                 else format_temperature(answer.T_K))
    lines = [
        f"{point.POINT_KINDS[answer.kind]} of {c1.name} (1) + {c2.name} (2) at {condition}",
        f"model: {answer.pair.model.name} (parameter quality: {answer.pair.quality})",
        *([f"predicted: no fitted set is used; {answer.pair.model.name} estimates this pair "
           "from group contributions"] if answer.pair.quality == "predicted" else []),
        "",
        f"  {'T':<26}{format_temperature(answer.T_K)}",
        f"  {'P':<26}{format_pressure(answer.P_Pa)}",
        f"  {'':<26}{c1.name:>{width}}  {c2.name:>{width}}",
    ]
    rows = [
        ("liquid x (mol/mol)", answer.x),
        ("vapour y (mol/mol)", answer.y),
        ("activity coeff. γ", answer.gamma),
        ("K-value y/x", answer.K),
    ]
    if show_mass:
        M1, M2 = c1.molar_mass_kg_per_mol, c2.molar_mass_kg_per_mol
        w_x = point.mole_to_mass(answer.x[0], M1, M2)
        w_y = point.mole_to_mass(answer.y[0], M1, M2)
        rows[2:2] = [("liquid (mass fraction)", (w_x, 1.0 - w_x)),
                     ("vapour (mass fraction)", (w_y, 1.0 - w_y))]
    for label, (a, b) in rows:
        lines.append(f"  {label:<26}{a:>{width}.5f}  {b:>{width}.5f}")
    lines.append(f"  {'relative volatility α12':<26}{answer.alpha12:>{width}.5f}")
    for warning in answer.warnings:
        lines.append(f"warning: {warning}")
    lines.append("Screening estimate; design rests on measured data, local codes and licensed "
                 "engineering practice.")
    return "\n".join(lines)


def _check(args: argparse.Namespace) -> int:
    from builder.analysis import catalogue_checks as catalogue_check

    only = [path.stem for path in args.files]
    problems: list[CatalogueError] = []
    catalogue = load_catalogue(args.catalogue, only=only, problems=problems)
    print(f"catalogue {args.catalogue}: {len(catalogue.references)} references, "
          f"{len(catalogue.components)} components, {len(catalogue.pairs)} pairs: loaded"
          + (f"; {len(problems)} problem(s) in files that did not load" if problems else ""))
    run = catalogue_check.run_checks(catalogue, [str(p) for p in problems])
    failures = run.failures
    for line in failures:
        print(f"FAIL {line}")
    for line in catalogue_check.summary_lines(run):
        print(line)
    if args.report:
        args.report.parent.mkdir(parents=True, exist_ok=True)
        args.report.write_text(catalogue_check.markdown_report(catalogue, run), encoding="utf-8")
        print(f"report written to {args.report}")
    return 1 if failures else 0


def _list(args: argparse.Namespace, catalogue: Catalogue) -> int:
    if args.json:
        data: dict[str, Any] = {
            "components": [{"id": c.id, "name": c.name, "cas": c.cas}
                           for c in catalogue.components.values()],
            "pairs": [{"id": p.id, "components": [p.component1, p.component2],
                       "model": p.model.name} for p in catalogue.pairs.values()],
        }
        print(json.dumps(data, indent=2))
        return 0
    print(f"{len(catalogue.components)} components:")
    for c in catalogue.components.values():
        print(f"  {c.id:<24} {c.name:<28} CAS {c.cas}")
    print(f"{len(catalogue.pairs)} pairs:")
    for p in catalogue.pairs.values():
        print(f"  {p.id:<40} {p.model.name}")
    return 0


def main(argv: Sequence[str] | None = None) -> int:
    """Entry point of ``atlas`` and ``python -m builder``."""
    parser = _parser()
    args = parser.parse_args(argv)
    try:
        if args.command in site_commands.COMMANDS:
            return site_commands.run(args)
        if args.command in authoring.COMMANDS:
            return authoring.run(args)
        if args.command in diff_command.COMMANDS:
            return diff_command.run(args)
        if args.command == "check":
            return _check(args)
        catalogue = load_catalogue(args.catalogue)
        if args.command == "calc":
            return _calc(args, catalogue)
        if args.command == "list":
            return _list(args, catalogue)
    except (AtlasError, ValueError) as error:
        print(f"atlas: error: {error}", file=sys.stderr)
        return 2
    except BrokenPipeError:  # output piped into head or similar
        return 0
    parser.error(f"unknown command {args.command!r}")
    return 2  # pragma: no cover - parser.error exits


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
