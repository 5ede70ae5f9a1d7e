"""``atlas diff BASE [HEAD]``: what a catalogue change does to the atlas's readers.

BASE and HEAD are catalogue folders or git revisions of the repository (HEAD
defaults to the working tree's catalogue).  The Markdown report (default) reads
as a pull-request comment: one summary table, then the details of each pair.
``--json`` prints the same as one JSON object.  ``--fail-on behaviour`` exits 1
when a pair's behaviour changes (a behaviour class, an azeotrope or a liquid
split appears or vanishes, a pair appears or disappears); ``--fail-on checks``
exits 1 when a reference check newly fails or a changed file does not load.
"""

from __future__ import annotations

import argparse
import dataclasses
import json
import tempfile
from pathlib import Path
from typing import Any

from builder.analysis.catalogue_diff import CatalogueDiff, PairDiff, diff_catalogues
from builder.catalogue.revisions import materialise

__all__ = ["COMMANDS", "add_parsers", "markdown", "run", "to_json"]

COMMANDS = ("diff",)
FORMAT = "vle-atlas-diff/1"


def add_parsers(commands: Any) -> None:
    diff = commands.add_parser(
        "diff", help="what a catalogue change does to the atlas",
        description="Compare two catalogue versions (folders or git revisions) for a reader: "
                    "for each pair added, removed or changed (directly or through a component "
                    "or reference), the behaviour, azeotropes, liquid split, relative "
                    "volatility, stage count, validity range, data quality and reference "
                    "checks at every published condition. Only affected pairs are computed.")
    diff.add_argument("base", help="base catalogue: a folder or a git revision (e.g. main)")
    diff.add_argument("head", nargs="?", default=None,
                      help="head catalogue: a folder or a git revision (default: the "
                           "catalogue in the working tree)")
    diff.add_argument("--json", action="store_true", help="print one JSON object")
    diff.add_argument("--fail-on", choices=("behaviour", "checks"), action="append",
                      default=[], help="exit 1 when a behaviour changes / a check newly "
                                       "fails (repeatable)")
    diff.add_argument("--out", type=Path, default=None, help="also write the report here")


def _cell(text: str) -> str:
    """Catalogue text is data: neutralise Markdown table and HTML characters."""
    for char in "\\`*_[]<>|":
        text = text.replace(char, "\\" + char)
    return text.replace("\n", " ")


def _headline(pair: PairDiff) -> str:
    if pair.status in ("added", "removed"):
        side = pair.after if pair.status == "added" else pair.before
        if side is not None and side.error:
            return "does not load"
        return f"{pair.status}"
    if pair.after is not None and pair.after.error:
        return "does not load in head"
    behaviour = [c for c in pair.changes if c.behaviour]
    if behaviour:
        c = behaviour[0]
        return f"{c.condition}: {c.detail or c.what + ' ' + c.before + ' → ' + c.after}"
    moved = [c for c in pair.changes if c.what == "azeotrope"]
    if moved:
        return f"{moved[0].condition}: {moved[0].detail}"
    if pair.changes:
        return f"{len(pair.changes)} change(s), behaviour unchanged"
    return "no change a reader would see"


def _atm(pair: PairDiff, side: str) -> str:
    summary = pair.before if side == "before" else pair.after
    if summary is None:
        return "—"
    if summary.error:
        return "not published"
    at = summary.conditions.get("isobar 101.325 kPa") or next(iter(summary.conditions.values()),
                                                               None)
    return at.behaviour if at is not None else "—"


def _reasons(reasons: tuple[str, ...]) -> str:
    """The first reasons a pair is affected (pair and components first), for the table."""
    shown = "; ".join(reasons[:3])
    return shown + (f"; and {len(reasons) - 3} more" if len(reasons) > 3 else "")


def _checks(pair: PairDiff) -> str:
    if pair.after is None:
        return "—"
    if pair.after.error:
        return "FAIL (does not load)"
    failed = pair.after.failed_checks
    new = pair.newly_failing
    text = f"{len(pair.after.checks) - len(failed)}/{len(pair.after.checks)} pass"
    return text + (f", {len(new)} newly failing" if new else "")


def markdown(diff: CatalogueDiff) -> str:
    """The report as Markdown: summary table first, details after."""
    changed = [p for p in diff.pairs if p.status != "unchanged"]
    lines = [f"## Atlas diff: {_cell(diff.base)} → {_cell(diff.head)}", ""]
    counts = {s: sum(p.status == s for p in diff.pairs) for s in ("added", "removed", "changed",
                                                                   "unchanged")}
    lines.append(f"{len(diff.pairs)} pair(s) affected by the change ({counts['added']} added, "
                 f"{counts['removed']} removed, {counts['changed']} changed for readers, "
                 f"{counts['unchanged']} unchanged); {diff.unaffected} other pair(s) not "
                 "recomputed. Behaviour changed: "
                 f"**{'yes' if diff.behaviour_changed else 'no'}**; newly failing checks: "
                 f"**{'yes' if diff.checks_fail else 'no'}**.")
    lines.append("")
    if diff.pairs:
        lines += ["| pair | status | at 101.325 kPa (before → after) | headline | checks (head) "
                  "| why affected |", "|---|---|---|---|---|---|"]
        for p in diff.pairs:
            lines.append(f"| {_cell(p.pair)} | {p.status} | {_cell(_atm(p, 'before'))} → "
                         f"{_cell(_atm(p, 'after'))} | {_cell(_headline(p))} | "
                         f"{_cell(_checks(p))} | {_cell(_reasons(p.reasons))} |")
        lines.append("")
    for problems, side in ((diff.head_problems, "head"), (diff.base_problems, "base")):
        if problems:
            lines += [f"### Files that do not load ({side})", ""]
            lines += [f"- {_cell(msg)}" for msg in problems[:30]]
            lines.append("")
    for p in changed:
        lines += [f"### {_cell(p.pair)} ({p.status})", "", f"Affected by: "
                  f"{_cell('; '.join(p.reasons))}.", ""]
        for side, summary in (("before", p.before), ("after", p.after)):
            if summary is not None and summary.error:
                lines.append(f"- does not load ({side}): {_cell(summary.error)}")
        if p.changes:
            lines += ["| condition | what | before | after | note |", "|---|---|---|---|---|"]
            for c in p.changes:
                lines.append(f"| {_cell(c.condition or 'pair')} | {_cell(c.what)} | "
                             f"{_cell(c.before)} | {_cell(c.after)} | {_cell(c.detail)} |")
        if p.status == "added" and p.after is not None and not p.after.error:
            lines += ["", "| condition | behaviour | azeotropes | α12 range | min. stages |",
                      "|---|---|---|---|---|"]
            for cond in p.after.conditions.values():
                az = "; ".join(f"{a.kind} x1 = {a.x1:.3f} at {a.T_K - 273.15:.2f} °C"
                               for a in cond.azeotropes) or "none"
                alpha = ("—" if cond.alpha_min is None or cond.alpha_max is None
                         else f"{cond.alpha_min:.3g} – {cond.alpha_max:.3g}")
                stages = "—" if cond.stages_min is None else f"{cond.stages_min:.2f}"
                lines.append(f"| {_cell(cond.condition)} | {_cell(cond.behaviour)} | "
                             f"{_cell(az)} | {alpha} | {stages} |")
        if p.newly_failing:
            lines += ["", "Newly failing checks: " + _cell("; ".join(p.newly_failing)) + "."]
        lines.append("")
    lines.append("Screening data: design rests on measured data, local codes and licensed "
                 "engineering practice.")
    return "\n".join(lines) + "\n"


def to_json(diff: CatalogueDiff) -> dict[str, Any]:
    data = dataclasses.asdict(diff)
    data["format"] = FORMAT
    data["behaviour_changed"] = diff.behaviour_changed
    data["checks_fail"] = diff.checks_fail
    for entry, pair in zip(data["pairs"], diff.pairs, strict=True):
        entry["newly_failing"] = pair.newly_failing
        entry["behaviour_changed"] = pair.behaviour_changed
    return data


def run(args: argparse.Namespace) -> int:
    catalogue: Path = args.catalogue
    with tempfile.TemporaryDirectory(prefix="atlas-diff-") as scratch:
        base = materialise(args.base, catalogue, Path(scratch))
        head = (materialise(args.head, catalogue, Path(scratch)) if args.head is not None
                else None)
        head_root = head.root if head is not None else catalogue
        head_label = head.label if head is not None else "working tree"
        diff = diff_catalogues(base.root, head_root, base.label, head_label)
    text = (json.dumps(to_json(diff), indent=1, ensure_ascii=False, allow_nan=False) + "\n"
            if args.json else markdown(diff))
    print(text, end="")
    if args.out is not None:
        args.out.write_text(text, encoding="utf-8")
    failing = (("behaviour" in args.fail_on and diff.behaviour_changed)
               or ("checks" in args.fail_on and diff.checks_fail))
    return 1 if failing else 0
