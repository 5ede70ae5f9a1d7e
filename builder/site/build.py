"""``atlas build``: the whole pipeline, stage by stage.

    settings -> load and validate the catalogue -> compute every pair ->
    generate figures, downloads and pages (in memory) -> assemble with mkdocs ->
    verify the finished site

Everything is read and computed before anything is written; a catalogue
error, a computation error or a template error leaves the output folder as it
was.  The verification fails the build whenever the site would load anything
from another host or refers to a file it does not contain; ``strict``
additionally fails on any warning of the assembler (the privacy plugin's
external-asset warnings among them).
"""

from __future__ import annotations

import tempfile
import time
from collections.abc import Callable, Iterable
from dataclasses import dataclass, field, replace
from pathlib import Path

from builder.analysis.catalogue_checks import failed_sets
from builder.analysis.results import compute_atlas, compute_pair
from builder.analysis.second_opinion import second_opinions
from builder.catalogue.loader import DEFAULT_CATALOGUE, load_catalogue
from builder.errors import AtlasError
from builder.site import DEFAULT_OUTPUT
from builder.site.assemble import assemble, check_output_folder
from builder.site.content import generate
from builder.site.predicted import select_predicted
from builder.site.settings import load_settings
from builder.site.verify import verify_site

__all__ = ["DEFAULT_OUTPUT", "BuildFailure", "BuildReport", "build_site"]



class BuildFailure(AtlasError):
    """The finished site failed its checks (an external resource, a missing file, a
    warning in a strict build)."""


@dataclass
class BuildReport:
    out_dir: Path
    pairs: int = 0
    components: int = 0
    pages: int = 0
    files: int = 0
    size_bytes: int = 0
    timings_s: dict[str, float] = field(default_factory=dict)
    warnings: list[str] = field(default_factory=list)
    external_links: int = 0
    #: Pairs not published because they fail their checks (pair id -> failures).
    withheld: dict[str, list[str]] = field(default_factory=dict)
    #: Pairs published with a banner despite failed checks (``allow_failed_checks``).
    published_failing: dict[str, list[str]] = field(default_factory=dict)

    def summary(self) -> str:
        stages = ", ".join(f"{k} {v:.1f} s" for k, v in self.timings_s.items())
        notes = ""
        if self.withheld:
            notes += (f"Not published (failed checks; see 'atlas check'): "
                      f"{', '.join(sorted(self.withheld))}.\n")
        if self.published_failing:
            notes += (f"Published with a failed-checks banner: "
                      f"{', '.join(sorted(self.published_failing))}.\n")
        index = self.out_dir / "index.html"
        return notes + (f"Built the atlas: {self.pairs} pairs, {self.components} components, "
                f"{self.pages} pages, {self.files} files, {self.size_bytes / 1e6:.1f} MB in "
                f"{sum(self.timings_s.values()):.1f} s ({stages}).\n"
                f"Open {index.as_uri()} in a browser (no server needed), or run "
                "'atlas serve' for a local preview.")


def build_site(catalogue_dir: Path | str = DEFAULT_CATALOGUE, out_dir: Path | str = DEFAULT_OUTPUT,
               *, settings_file: Path | str | None = None, strict: bool = False,
               source_dir: Path | str | None = None, only: Iterable[str] = (),
               workers: int | None = None, allow_failed_checks: bool = False,
               progress: Callable[[str], None] | None = None) -> BuildReport:
    """Build the site from ``catalogue_dir`` into ``out_dir``; raise on any failure."""
    out = Path(out_dir).resolve()
    report = BuildReport(out_dir=out)
    say = progress or (lambda _message: None)

    def stage(name: str, started: float) -> None:
        report.timings_s[name] = time.perf_counter() - started
        say(f"  {name:<9} {report.timings_s[name]:6.1f} s")

    check_output_folder(out)  # refuse early, before minutes of work
    t = time.perf_counter()
    settings = load_settings(settings_file)
    catalogue = load_catalogue(catalogue_dir, only=only)
    stage("load", t)
    t = time.perf_counter()
    atlas = compute_atlas(catalogue)
    failed = failed_sets(catalogue, atlas)
    if failed and not allow_failed_checks:
        # The same validation as `atlas check`: a set that fails its checks is withheld.
        atlas = {pid: r for pid, r in atlas.items() if pid not in failed}
        catalogue = replace(catalogue, pairs={pid: p for pid, p in catalogue.pairs.items()
                                              if pid not in failed})
        report.withheld = failed
    elif failed:
        report.published_failing = failed
    if not atlas:
        raise BuildFailure("no pair passes its checks; nothing to publish:\n" + "\n".join(
            f"  - {line}" for lines in failed.values() for line in lines))
    stage("compute", t)
    t = time.perf_counter()
    selection = select_predicted(catalogue, settings.predicted_pairs)
    atlas.update((pid, compute_pair(catalogue, record))
                 for pid, record in sorted(selection.records.items()))
    stage("predict", t)
    t = time.perf_counter()
    opinions = (second_opinions(catalogue, atlas, settings.summary_pressure_Pa)
                if settings.second_opinion else {})
    stage("compare", t)
    t = time.perf_counter()
    view, content = generate(settings, catalogue, atlas, workers=workers, opinions=opinions,
                             selection=selection)
    stage("render", t)
    t = time.perf_counter()
    with tempfile.TemporaryDirectory(prefix="atlas-src-") as scratch:
        where = Path(source_dir) if source_dir is not None else Path(scratch)
        assembled = assemble(content, settings, out, where, strict=strict)
    stage("assemble", t)
    t = time.perf_counter()
    check = verify_site(out)
    stage("verify", t)
    report.pairs, report.components = len(view.pairs), len(view.components)
    report.pages, report.files, report.size_bytes = check.html_pages, check.files, check.size_bytes
    report.warnings = assembled.warnings
    report.external_links = check.external_links
    if check.problems:
        shown = "\n".join(f"  - {p}" for p in check.problems[:50])
        more = len(check.problems) - 50
        raise BuildFailure(f"the built site failed {len(check.problems)} check(s):\n{shown}"
                           + (f"\n  ... and {more} more" if more > 0 else ""))
    return report
