"""The last stage: write the generated sources and let mkdocs assemble the HTML site.

This and its plugin :mod:`~.raw_html` are the only modules that know about
mkdocs (1.6, with the Material theme); another static-site engine would
replace these alone.  It
writes the :class:`~.content.SiteContent` and the static assets of
``site_templates/assets`` into a source folder, derives ``mkdocs.yml`` from
``site_templates/mkdocs.base.yml`` and runs the mkdocs build in-process.
Every warning mkdocs or a plugin logs is collected; in strict mode any
warning fails the build (the privacy plugin warns on each external asset, so
an external font, script, stylesheet or image fails a strict build).

The output folder is emptied by mkdocs before it writes, so it must be new,
empty or a site this assembler wrote before (marked by ``.atlas-site``).
"""

from __future__ import annotations

import html
import json
import logging
import os
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

import yaml

from builder.errors import AtlasError
from builder.site import TEMPLATES
from builder.site.content import SiteContent
from builder.site.settings import SiteSettings

__all__ = ["MARKER", "AssembleError", "AssembleReport", "assemble", "check_output_folder"]

#: File that marks a folder as an atlas site this tool may overwrite.
MARKER = ".atlas-site"
#: File that marks a folder of generated sources (``--keep-source``) the same way.
SOURCE_MARKER = ".atlas-source"

NAV = [{"Pairs": "index.md"}, {"Components": "components/index.md"},
       {"Matrix": "matrix.md"}, {"Methods": "methods.md"}, {"Catalogue": "catalogue.md"}]


class AssembleError(AtlasError):
    """The site could not be assembled (refused output folder, mkdocs failure)."""


@dataclass
class AssembleReport:
    warnings: list[str] = field(default_factory=list)


class _Collect(logging.Handler):
    def __init__(self) -> None:
        super().__init__(logging.WARNING)
        self.messages: list[str] = []

    def emit(self, record: logging.LogRecord) -> None:
        self.messages.append(f"{record.name}: {record.getMessage()}")


def check_output_folder(out_dir: Path) -> None:
    """Refuse to let the build empty a folder that is not an earlier atlas site."""
    if not out_dir.exists():
        return
    if not out_dir.is_dir():
        raise AssembleError(f"output {out_dir} exists and is not a folder")
    if any(out_dir.iterdir()) and not (out_dir / MARKER).is_file():
        raise AssembleError(f"output folder {out_dir} is not empty and was not written by "
                            "'atlas build' (no .atlas-site marker): refusing to replace it; "
                            "choose another folder with --out")


def _config(settings: SiteSettings, docs_dir: Path, site_dir: Path) -> dict[str, Any]:
    base = yaml.safe_load((TEMPLATES / "mkdocs.base.yml").read_text(encoding="utf-8"))
    config: dict[str, Any] = dict(base)
    # The theme inserts site_name and site_description as they are: escape them here.
    config["site_name"] = html.escape(settings.title)
    config["site_description"] = html.escape(settings.description)
    owner = f"{html.escape(settings.organisation)}. " if settings.organisation else ""
    config["copyright"] = (f"{owner}Screening only: design rests on measured data, local "
                           "codes and licensed engineering practice.")
    config["docs_dir"] = str(docs_dir)
    config["site_dir"] = str(site_dir)
    config["theme"] = dict(config["theme"], custom_dir=str(TEMPLATES / "overrides"))
    config["nav"] = NAV
    return config


#: The pairs' files the sources hold, by bundle: ``{name: [key, [paths]]}``.
_BUNDLES = ".atlas-bundles.json"


def _wanted(content: SiteContent) -> dict[str, bytes]:
    files = {path.relative_to(TEMPLATES).as_posix(): path.read_bytes()
             for path in sorted((TEMPLATES / "assets").rglob("*")) if path.is_file()}
    files.update(content.files)
    return files


def _write_if_changed(docs_dir: Path, path: str, data: bytes, existing: set[str]) -> None:
    """Write one file unless it holds these bytes already (its time stamp then stays, and
    an incremental assembly leaves its page alone)."""
    target = docs_dir / path
    if path in existing and target.stat().st_size == len(data) and target.read_bytes() == data:
        return
    target.parent.mkdir(parents=True, exist_ok=True)
    target.write_bytes(data)


def _write_sources(content: SiteContent, source_dir: Path) -> tuple[Path, list[str]]:
    """Bring ``source_dir/docs`` to ``content`` (and the static assets).

    Only files whose bytes change are written, so an unchanged file keeps its
    time stamp and an incremental assembly leaves its page alone; files no longer
    generated are removed.  A pair's bundle of files is read only when it is not
    already there: the sources record each bundle's key and paths (``.atlas-bundles.json``,
    written once every file is), and a bundle of the same key and paths whose files all
    exist is left as it is.  Returns the docs folder and the removed paths.
    """
    docs_dir = source_dir / "docs"
    marker = source_dir / SOURCE_MARKER
    if docs_dir.exists() and any(docs_dir.iterdir()) and not marker.is_file():
        raise AssembleError(f"{docs_dir} exists and was not written by 'atlas build': "
                            "refusing to replace it; choose another source folder")
    docs_dir.mkdir(parents=True, exist_ok=True)
    marker.write_text("Generated sources of 'atlas build'; replaced by the next build.\n",
                      encoding="utf-8")
    record = source_dir / _BUNDLES
    try:
        written = json.loads(record.read_text(encoding="utf-8"))
    except (OSError, ValueError):
        written = {}
    record.unlink(missing_ok=True)  # written back once every file below is in place
    wanted = _wanted(content)
    existing = {p.relative_to(docs_dir).as_posix() for p in docs_dir.rglob("*") if p.is_file()}
    every = set(wanted).union(*(b.paths for b in content.bundles.values()))
    removed = sorted(existing - every)
    for path in removed:
        (docs_dir / path).unlink()
    for path, data in wanted.items():
        _write_if_changed(docs_dir, path, data, existing)
    for name, bundle in content.bundles.items():
        if (bundle.key and written.get(name) == [bundle.key, list(bundle.paths)]
                and existing.issuperset(bundle.paths)):
            continue
        files = bundle.read()
        if sorted(path for path, _data in files) != sorted(bundle.paths):
            raise AssembleError(f"the files of {name} are not those its entry lists: the "
                                "build cache may have been changed during the build; run "
                                "'atlas build --no-cache'")
        for path, data in files:
            _write_if_changed(docs_dir, path, data, existing)
    for folder in sorted((p for p in docs_dir.rglob("*") if p.is_dir()), reverse=True):
        if not any(folder.iterdir()):
            folder.rmdir()
    record.write_text(json.dumps({name: [b.key, list(b.paths)]
                                  for name, b in sorted(content.bundles.items())}),
                      encoding="utf-8")
    return docs_dir, removed


#: The warning mkdocs logs on every incremental ("dirty") build.  The atlas's pages do not
#: depend on one another's HTML (a fixed, four-entry navigation; the search index is written
#: by the atlas), so an incremental assembly equals a full one: the test suite checks it.
_DIRTY_WARNING = "A 'dirty' build is being performed"


def _not_the_dirty_warning(record: logging.LogRecord) -> bool:
    return not record.getMessage().startswith(_DIRTY_WARNING)


def assemble(content: SiteContent, settings: SiteSettings, out_dir: Path, source_dir: Path,
             strict: bool = False, incremental: bool = False) -> AssembleReport:
    """Write ``content`` under ``source_dir`` and build the HTML site into ``out_dir``.

    ``incremental``: ``source_dir`` and ``out_dir`` hold the previous assembly of
    the same templates and settings; only pages whose source changed are rebuilt.
    """
    out_dir = out_dir.resolve()
    source_dir = source_dir.resolve()
    check_output_folder(out_dir)
    if source_dir == out_dir or out_dir in source_dir.parents or source_dir in out_dir.parents:
        raise AssembleError("the source folder and the output folder must not contain each "
                            "other")
    docs_dir, removed = _write_sources(content, source_dir)
    incremental = incremental and (out_dir / MARKER).is_file()
    (out_dir / MARKER).unlink(missing_ok=True)  # written back when the assembly is complete
    if incremental:
        for path in removed:  # an incremental mkdocs build keeps stale output files
            (out_dir / (path[:-3] + ".html" if path.endswith(".md") else path)).unlink(
                missing_ok=True)
    config_file = source_dir / "mkdocs.yml"
    config_file.write_text(yaml.safe_dump(_config(settings, docs_dir, out_dir),
                                          sort_keys=False, allow_unicode=True),
                           encoding="utf-8")

    os.environ.setdefault("NO_MKDOCS_2_WARNING", "1")
    from mkdocs import exceptions as mkdocs_exceptions
    from mkdocs.commands.build import build
    from mkdocs.config import load_config

    from builder.site.page_memory import ReleasePageText
    from builder.site.raw_html import RawHtmlPassThrough

    collector = _Collect()
    build_logger = logging.getLogger("mkdocs.commands.build")
    build_logger.addFilter(_not_the_dirty_warning)
    logger = logging.getLogger("mkdocs")
    logger.addHandler(collector)
    previous, propagate = logger.level, logger.propagate
    logger.setLevel(logging.INFO)
    logger.propagate = False  # reported by the caller, once
    try:
        config = load_config(config_file=str(config_file), strict=strict)
        config.plugins["atlas-raw-html"] = RawHtmlPassThrough()
        config.plugins["atlas-release-pages"] = ReleasePageText()
        build(config, dirty=incremental)
    except mkdocs_exceptions.MkDocsException as error:
        details = "; ".join(collector.messages)
        raise AssembleError(f"mkdocs could not build the site: {error}"
                            + (f" ({details})" if details else "")) from None
    finally:
        logger.removeHandler(collector)
        build_logger.removeFilter(_not_the_dirty_warning)
        logger.setLevel(previous)
        logger.propagate = propagate
    (out_dir / MARKER).write_text("Written by 'atlas build'; the next build replaces this "
                                  "folder.\n", encoding="utf-8")
    return AssembleReport(warnings=collector.messages)
