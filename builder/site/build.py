"""``atlas build``: the whole pipeline, stage by stage.

    settings -> load and validate the catalogue -> compute and draw every pair
    (through an executor, from the cache where nothing changed) -> generate
    downloads and pages (in memory) -> assemble with mkdocs -> write the search
    index -> verify -> publish

Everything is read and computed before anything is written.  The site is
assembled in a staging folder beside the output folder, verified there, and
only then swapped in by two renames (:mod:`.publish`): a build that fails --
a catalogue error, a computation error, a template error, a failed check --
or is killed leaves the previously published site as it was.  The
verification fails the build whenever the site would load anything from
another host or refers to a file it does not contain; ``strict``
additionally fails on any warning of the assembler (the privacy plugin's
external-asset warnings among them).

The build cache (:mod:`.cache`, ``.atlas-cache/`` beside the output folder
unless told otherwise) holds each pair's results and figures under a hash of
what they depend on, and the previous assembly, so that a rebuild after an
edit recomputes one pair and re-assembles the pages that changed; its output
is byte-identical to a cold build (``use_cache=False``).

A pair whose computation raises does not stop the build (:class:`~.work.PairFailure`,
never cached, so the next build retries it).  A failed *predicted* pair is listed
with the reason on the page of combinations without a page; a failed *fitted* pair
is withheld like a set that fails its checks: a notice page says why, the index lists
it, the build warns, and a ``strict`` build fails (see :func:`build_site`).

Each stage's start is announced (``  stage: <name>`` in :data:`STAGE_MARKER`
form) on the progress channel, and its duration when it ends.
"""

from __future__ import annotations

import functools
import hashlib
import shutil
import time
from collections.abc import Callable, Iterable
from dataclasses import dataclass, field, replace
from pathlib import Path
from typing import Any

from builder.analysis.catalogue_checks import failed_sets
from builder.analysis.predicted import Unpredictable
from builder.catalogue.loader import DEFAULT_CATALOGUE, load_catalogue
from builder.errors import AtlasError
from builder.site import DEFAULT_OUTPUT, TEMPLATES
from builder.site.assemble import (
    MARKER,
    SOURCE_MARKER,
    AssembleError,
    assemble,
    check_output_folder,
)
from builder.site.cache import (
    BuildCache,
    FileDigests,
    code_version,
    component_key,
    default_cache_dir,
    pair_key,
)
from builder.site.content import Bundle, site_content
from builder.site.executor import Executor, LocalExecutor, default_workers
from builder.site.pair_entry import PairEntry
from builder.site.predicted import select_predicted
from builder.site.progress import Progress
from builder.site.publish import publish, recover, staging_folder
from builder.site.search import search_documents, write_search_index
from builder.site.settings import SiteSettings, load_settings
from builder.site.staging_copy import stage_copy
from builder.site.verify import verify_site
from builder.site.withheld import withheld_pairs
from builder.site.work import (
    PairFailure,
    PairOutput,
    component_task,
    pair_task,
    run_component,
    run_pair,
)

__all__ = ["DEFAULT_OUTPUT", "STAGE_MARKER", "BuildFailure", "BuildReport", "build_site"]

#: How the start of a stage is announced on the progress channel.
STAGE_MARKER = "  stage: {}"


class BuildFailure(AtlasError):
    """The finished site failed its checks (an external resource, a missing file, a
    warning in a strict build), or work came from a different version of the builder."""


@dataclass
class BuildReport:
    out_dir: Path
    pairs: int = 0
    components: int = 0
    pages: int = 0
    files: int = 0
    size_bytes: int = 0
    search_index_bytes: int = 0
    computed: int = 0  # pairs and components worked on in this build (not from the cache)
    cached: int = 0  # taken from the cache
    executor: str = ""
    timings_s: dict[str, float] = field(default_factory=dict)
    warnings: list[str] = field(default_factory=list)
    external_links: int = 0
    #: Pairs not published because they fail their checks (pair id -> failures).
    withheld: dict[str, list[str]] = field(default_factory=dict)
    #: Pairs published with a banner despite failed checks (``allow_failed_checks``).
    published_failing: dict[str, list[str]] = field(default_factory=dict)
    #: Pairs whose computation failed in this build (fitted ones are also in ``withheld``).
    failed: dict[str, PairFailure] = field(default_factory=dict)

    def summary(self) -> str:
        stages = ", ".join(f"{k} {v:.1f} s" for k, v in self.timings_s.items())
        notes = ""
        checks = sorted(pid for pid in self.withheld if pid not in self.failed)
        if checks:
            notes += (f"Not published (failed checks; see 'atlas check'): "
                      f"{', '.join(checks)}.\n")
        fitted = sorted(pid for pid, f in self.failed.items() if not f.predicted)
        if fitted:
            notes += f"Not published (the computation failed): {', '.join(fitted)}.\n"
        failed = ""
        if self.failed:
            failed = (f" {len(self.failed)} pair computation(s) failed: "
                      f"{len(self.failed) - len(fitted)} predicted (listed as combinations "
                      f"without a page), {len(fitted)} fitted (withheld).")
        if self.published_failing:
            notes += (f"Published with a failed-checks banner: "
                      f"{', '.join(sorted(self.published_failing))}.\n")
        index = self.out_dir / "index.html"
        return notes + (f"Built the atlas: {self.pairs} pairs, {self.components} components, "
                f"{self.pages} pages, {self.files} files, {self.size_bytes / 1e6:.1f} MB in "
                f"{sum(self.timings_s.values()):.1f} s ({stages}); {self.computed} worked on "
                f"({self.executor}), {self.cached} from the cache.{failed}\n"
                f"Open {index.as_uri()} in a browser (no server needed), or run "
                "'atlas serve' for a local preview.")


def _assembly_key(settings: SiteSettings, strict: bool) -> str:
    """What a previous assembly must share with this one to be reused (templates, assets,
    settings, code)."""
    digest = hashlib.sha256(code_version().encode())
    digest.update(repr((settings, strict)).encode())
    for path in sorted(TEMPLATES.rglob("*")):
        if path.is_file():
            digest.update(path.relative_to(TEMPLATES).as_posix().encode() + b"\0")
            digest.update(hashlib.sha256(path.read_bytes()).digest())
    return digest.hexdigest()[:16]


def _keep_source(source: Path, kept: Path) -> None:
    """Copy the generated sources to ``kept`` (``--keep-source``): a new or empty folder, or
    one an earlier build kept sources in."""
    if kept.exists():
        if any(kept.iterdir()) and not (kept / SOURCE_MARKER).is_file():
            raise AssembleError(f"{kept} exists and was not written by 'atlas build': "
                                "refusing to replace it; choose another source folder")
        shutil.rmtree(kept)
    shutil.copytree(source, kept)


def _run_work(tasks: list[tuple[str, str, Any]], fn: Callable[[Any], Any], label: str,
              executor: Executor, cache: BuildCache, quiet: bool,
              with_files: bool = False) -> dict[str, Any]:
    """Run the tasks ``(id, cache key, task)`` not in the cache; every output by id.

    ``with_files``: the outputs carry files (a pair's :class:`~.work.PairOutput`), which
    are stored apart in the cache and not returned (see :meth:`BuildCache.files`).
    """
    outputs: dict[str, Any] = {}
    todo: list[tuple[str, str, Any]] = []
    for ident, key, task in tasks:
        hit = cache.get(key, with_files=with_files)
        if hit is not None:
            outputs[ident] = hit
        else:
            todo.append((ident, key, task))
    with Progress(label, len(todo), enabled=not quiet) as progress:
        for index, output in executor.run(fn, [task for _i, _k, task in todo]):
            ident, key, _task = todo[index]
            if output.code_version != code_version():
                raise BuildFailure(f"{ident} was worked on by another version of the builder "
                                   f"({output.code_version[:12]}, this is "
                                   f"{code_version()[:12]}): install the same version on every "
                                   "worker")
            if isinstance(output, PairOutput):
                cache.put(key, output.lean(), files=output.files)
                output = output.lean()
            elif not isinstance(output, PairFailure):  # a failure is retried by the next build
                cache.put(key, output)
            outputs[ident] = output
            progress.step()
    return outputs


def build_site(catalogue_dir: Path | str = DEFAULT_CATALOGUE, out_dir: Path | str = DEFAULT_OUTPUT,
               *, settings_file: Path | str | None = None, strict: bool = False,
               source_dir: Path | str | None = None, only: Iterable[str] = (),
               workers: int | None = None, executor: Executor | None = None,
               use_cache: bool = True, cache_dir: Path | str | None = None,
               allow_failed_checks: bool = False,
               quiet_progress: bool = False,
               progress: Callable[[str], None] | None = None) -> BuildReport:
    """Build the site from ``catalogue_dir`` into ``out_dir``; raise on any failure.

    ``executor`` runs the per-pair work (default: :class:`LocalExecutor` with
    ``workers`` processes); ``use_cache=False`` is a cold build (the cache is
    still refreshed for the next one).

    A pair whose computation fails is reported, not fatal.  A failed fitted pair is
    withheld (a notice page, the index, a warning); under ``strict`` it fails the build,
    because a fitted pair is curated content a contributor submitted and can fix, and a
    strict build (CI, a release) must not publish an atlas that silently lacks it.  A
    failed predicted pair is listed with the reason among the combinations without a
    page and counted in the summary, and does not fail a strict build: a prediction is
    the model's guess for a combination nobody catalogued, its failure says what the
    model cannot do for that combination -- like a combination that cannot be predicted
    at all, which a strict build accepts too -- and one such corner case among thousands
    must not hold back the release of every fitted pair.
    """
    out = Path(out_dir).resolve()
    only = tuple(only)
    report = BuildReport(out_dir=out)
    say = progress or (lambda _message: None)

    def stage(name: str, started: float) -> None:
        report.timings_s[name] = time.perf_counter() - started
        say(f"  {name:<9} {report.timings_s[name]:6.1f} s")

    def start(name: str) -> float:
        say(STAGE_MARKER.format(name))
        return time.perf_counter()

    recover(out)  # a build killed between the two renames of publishing
    check_output_folder(out)  # refuse early, before minutes of work
    cache_root = Path(cache_dir).resolve() if cache_dir is not None else default_cache_dir(out)
    cache = BuildCache(cache_root, read=use_cache)
    own_executor = executor is None
    runner: Executor = executor if executor is not None else LocalExecutor(workers)
    report.executor = runner.name
    # The site check parses in as many local processes as the build computes in (a
    # cluster's workers cannot read the staging folder: there, ``workers`` or the default).
    check_workers = (runner.workers if isinstance(runner, LocalExecutor)
                     else workers or default_workers())
    try:
        t = start("load")
        settings = load_settings(settings_file)
        catalogue = load_catalogue(catalogue_dir, only=only)
        stage("load", t)

        t = start("compute")
        # Predicted pairs (site setting predicted_pairs) are worked on like fitted ones,
        # from a catalogue that holds their predicted records beside the fitted sets.
        # A build of named pairs (--only, a quick preview) builds those pairs alone.
        selection = select_predicted(catalogue, () if only else settings.predicted_pairs)
        if selection.not_in_catalogue:
            say(f"  predicted_pairs: {', '.join(selection.not_in_catalogue)} not in this "
                "catalogue; skipped")
        work_catalogue = replace(catalogue, pairs={**catalogue.pairs, **selection.records})
        pair_ids, component_ids = sorted(work_catalogue.pairs), sorted(catalogue.components)
        digests = FileDigests()  # each input file read once for all the keys
        pair_keys = {pid: pair_key(work_catalogue, pid, settings, digests) for pid in pair_ids}
        component_keys = {cid: component_key(catalogue, cid, settings, digests)
                          for cid in component_ids}
        pair_work = _run_work(
            [(pid, pair_keys[pid], pair_task(work_catalogue, pid, settings,
                                             predicted=pid in selection.records))
             for pid in pair_ids],
            run_pair, "pairs", runner, cache, quiet_progress, with_files=True)
        component_work = _run_work(
            [(cid, component_keys[cid], component_task(catalogue, cid, settings))
             for cid in component_ids], run_component, "components", runner, cache,
            quiet_progress)
        if not only:  # the whole catalogue: what no file needs any more goes
            cache.prune(set(pair_keys.values()) | set(component_keys.values()))
        stage("compute", t)
    finally:
        if own_executor:
            runner.close()
    report.computed, report.cached = cache.misses, cache.hits
    report.failed = {pid: out for pid, out in pair_work.items() if isinstance(out, PairFailure)}
    fitted_failed = {pid: f for pid, f in report.failed.items() if not f.predicted}
    failure_warnings = [f"{pid}: {f.reason}" + (f" (at {f.where})" if f.where else "")
                        + "; the pair is withheld from this build"
                        for pid, f in fitted_failed.items()]
    for pid, f in report.failed.items():
        if f.predicted:
            say(f"  note: predicted pair {pid}: {f.reason}; listed among the combinations "
                "without a page")
    if strict and fitted_failed:
        raise BuildFailure(
            f"the computation of {len(fitted_failed)} fitted pair(s) failed, and a strict "
            "build publishes every fitted pair:\n"
            + "\n".join(f"  - {catalogue.pairs[pid].file}: entry {pid!r}: {f.reason}"
                        + (f" (at {f.where})" if f.where else "")
                        for pid, f in fitted_failed.items())
            + "\nCorrect the entry, or build without --strict to publish the atlas without "
            "it (the pair's page then says it is withheld)")
    if report.failed:  # a failed prediction: among the combinations without a page
        selection = replace(
            selection,
            records={pid: r for pid, r in selection.records.items() if pid not in report.failed},
            unpredictable=tuple(sorted(
                selection.unpredictable + tuple(
                    Unpredictable(selection.records[pid].component1,
                                  selection.records[pid].component2, (f.reason,))
                    for pid, f in report.failed.items() if f.predicted),
                key=lambda u: (u.component1, u.component2))))
    computed = [pid for pid in pair_ids if pid not in report.failed]
    entries: dict[str, PairEntry] = {pid: pair_work[pid].entry for pid in computed}
    comp_figs = {cid: component_work[cid].figure for cid in component_ids}
    comp_failures = {cid: component_work[cid].failures for cid in component_ids}
    del pair_work, component_work
    failed = failed_sets(catalogue, entries, comp_failures)
    if failed and allow_failed_checks:
        report.published_failing, failed = failed, {}
    # The same validation as `atlas check`: a set that fails its checks is withheld, and
    # so is a fitted pair whose computation failed.
    report.withheld = {**failed, **{pid: [f.reason] for pid, f in fitted_failed.items()}}
    withheld = withheld_pairs(catalogue,
                              {pid: lines for pid, lines in failed.items()
                               if pid in catalogue.pairs},
                              {pid: f.reason for pid, f in fitted_failed.items()})
    if report.withheld:
        entries = {pid: e for pid, e in entries.items() if pid not in report.withheld}
        catalogue = replace(catalogue, pairs={pid: p for pid, p in catalogue.pairs.items()
                                              if pid not in report.withheld})
    if not entries:
        raise BuildFailure("no pair passes its checks; nothing to publish:\n" + "\n".join(
            f"  - {line}" for lines in report.withheld.values() for line in lines))

    t = start("render")
    # Each pair's own files stay in the cache until the assembler writes them.
    bundles = {pid: Bundle(pair_keys[pid], e.files, functools.partial(cache.files, pair_keys[pid]))
               for pid, e in entries.items()}
    view, content = site_content(settings, catalogue, entries, comp_figs,
                                 selection=selection, withheld=withheld, bundles=bundles)
    methods = content.files.get("methods.md", b"").decode("utf-8")
    del entries, comp_figs, bundles
    stage("render", t)

    t = start("assemble")
    assembly = cache_root / "assembly" / _assembly_key(settings, strict)
    html_dir = assembly / "html"
    if assembly.exists() and (not use_cache or not (html_dir / MARKER).is_file()):
        shutil.rmtree(assembly)  # a cold build, or an assembly that did not finish
    for other in (cache_root / "assembly").glob("*"):
        if other != assembly and other.is_dir():
            shutil.rmtree(other)  # another version's assembly: never reused
    staging = staging_folder(out)
    try:
        try:
            assembled = assemble(content, settings, html_dir, assembly / "source",
                                 strict=strict, incremental=True)
            report.search_index_bytes = write_search_index(html_dir,
                                                           search_documents(view, methods))
        except BaseException:
            shutil.rmtree(assembly, ignore_errors=True)
            raise
        if source_dir is not None:
            _keep_source(assembly / "source", Path(source_dir))
        # The staging copy: what changed is copied, the rest linked from the site now
        # published (a cold build copies everything).
        stage_copy(html_dir, staging, out if use_cache and (out / MARKER).is_file() else None)
        stage("assemble", t)

        t = start("verify")
        memo = cache.load_memo("verify") if use_cache else {}
        check = verify_site(staging, memo, workers=check_workers)
        cache.save_memo("verify", memo)
        stage("verify", t)
        report.pairs, report.components = len(view.pairs), len(view.components)
        report.pages, report.files = check.html_pages, check.files
        report.size_bytes = check.size_bytes
        report.warnings = failure_warnings + assembled.warnings
        report.external_links = check.external_links
        if check.problems:
            shown = "\n".join(f"  - {p}" for p in check.problems[:50])
            more = len(check.problems) - 50
            raise BuildFailure(f"the built site failed {len(check.problems)} check(s):\n{shown}"
                               + (f"\n  ... and {more} more" if more > 0 else ""))

        t = start("publish")
        publish(staging, out)
        stage("publish", t)
    finally:
        if staging.exists():
            shutil.rmtree(staging, ignore_errors=True)
    return report
