"""The build cache: per-pair and per-component work, keyed by a hash of all it depends on.

A pair's computed results, figures and page depend on its catalogue file, its two
components' files, the reference files those cite, the site settings, the
templates of the pair page and the code that computes, draws and renders them.
:func:`pair_key` hashes exactly those (SHA-256 of the file bytes, the settings
and :func:`code_version`); a stored entry is used only when the key matches,
so an edited file or template, another setting or another version of the
builder never reuses stale work.  A component's figure is keyed the same way
by its own file.

Entries are pickles under ``<cache>/work/<k[:2]>/<key>.pickle``, written to a
temporary name and renamed, so a killed build leaves no half-written entry.  A
pair's own files (page, downloads, figures) are kept apart, in ``<key>.files``
beside its entry and written before it, so that a build reads the small entry of
every pair and the files only of those it writes (:mod:`.assemble`).
The cache lives outside the published folder (by default ``.atlas-cache/``
beside the output folder; git-ignored) and may be deleted at any time;
``atlas build --no-cache`` ignores what it holds.
"""

from __future__ import annotations

import functools
import hashlib
import os
import pickle
import re
from dataclasses import asdict
from pathlib import Path
from typing import Any

from builder.catalogue.loader import Catalogue
from builder.site import TEMPLATES
from builder.site.settings import SiteSettings

__all__ = ["BuildCache", "FileDigests", "code_version", "component_key", "default_cache_dir",
           "pair_key"]

#: The builder package (every ``.py`` under it is part of the code version).
_PACKAGE = Path(__file__).resolve().parent.parent
#: The templates of a pair page (rendered with the pair's work, :mod:`.pair_page`).
PAIR_PAGE_TEMPLATES = ("pair.md.j2", "_macros.j2")
#: ``ref: some-id`` in a catalogue file: the references a file cites.
_REF = re.compile(r"\bref:\s*['\"]?([a-z0-9]+(?:-[a-z0-9]+)*)")


@functools.lru_cache(maxsize=1)
def code_version() -> str:
    """SHA-256 of the builder package's sources (paths and bytes), as hex."""
    digest = hashlib.sha256()
    for path in sorted(_PACKAGE.rglob("*.py")):
        digest.update(path.relative_to(_PACKAGE).as_posix().encode())
        digest.update(b"\0")
        digest.update(path.read_bytes())
        digest.update(b"\0")
    return digest.hexdigest()


def default_cache_dir(out_dir: Path) -> Path:
    """``.atlas-cache/`` beside the output folder (never inside it)."""
    return out_dir.resolve().parent / ".atlas-cache"


def _settings_text(settings: SiteSettings) -> str:
    data = asdict(settings)
    data.pop("file", None)  # where the settings came from does not change any output
    return repr(sorted(data.items()))


def _file_bytes(path: Path) -> bytes:
    try:
        return path.read_bytes()
    except OSError:
        return b"(missing)"


class FileDigests:
    """Files' SHA-256 digests, with the reference files they cite, read once per build.

    Every pair's key hashes the group tables and the pair-page templates, and each
    component's file is hashed for all its pairs: thousands of reads of the same files
    at full size.  One build reads and hashes each file, and each set of files, once (a
    new instance for every build, so that an edit between builds is always seen).
    """

    def __init__(self) -> None:
        self._files: dict[str, tuple[bytes, frozenset[str]]] = {}
        self._sets: dict[tuple[str, tuple[tuple[str, str], ...]], bytes] = {}

    def _file(self, path: str) -> tuple[bytes, frozenset[str]]:
        known = self._files.get(path)
        if known is None:
            data = _file_bytes(Path(path))
            known = self._files[path] = (hashlib.sha256(data).digest(), frozenset(
                _REF.findall(data.decode("utf-8", "replace"))))
        return known

    def of(self, root: Path, files: tuple[tuple[str, str], ...]) -> bytes:
        """The digest of ``files`` (name, path) and of the reference files (under
        ``root/references``) they cite (``ref: some-id``)."""
        memo = (str(root), files)
        known = self._sets.get(memo)
        if known is None:
            digest = hashlib.sha256()
            cited: set[str] = set()
            for name, path in files:
                file_digest, refs = self._file(path)
                cited |= refs
                digest.update(name.encode() + b"\0" + file_digest)
            for ref in sorted(cited):
                path = os.path.join(root, "references", f"{ref}.yaml")
                digest.update(f"references/{ref}".encode() + b"\0" + self._file(path)[0])
            known = self._sets[memo] = digest.digest()
        return known


def _key(kind: str, settings: SiteSettings, root: Path,
         *file_sets: tuple[tuple[str, str], ...], digests: FileDigests | None) -> str:
    digests = digests or FileDigests()
    digest = hashlib.sha256()
    for name, data in (("kind", kind.encode()), ("code", code_version().encode()),
                       ("settings", _settings_text(settings).encode())):
        digest.update(name.encode() + b"\0" + hashlib.sha256(data).digest())
    for files in file_sets:
        digest.update(digests.of(root, files))
    return digest.hexdigest()


def pair_key(catalogue: Catalogue, pair_id: str, settings: SiteSettings,
             digests: FileDigests | None = None) -> str:
    """The hash of everything a pair's results and figures depend on (``digests``: the
    build's file digests, each file read once)."""
    pair = catalogue.pairs[pair_id]
    root = catalogue.root
    own = ((f"binaries/{pair_id}", str(root / "binaries" / f"{pair_id}.yaml")),
           *((f"components/{cid}", str(root / "components" / f"{cid}.yaml"))
             for cid in (pair.component1, pair.component2)))
    # The group tables: predicted pairs and the second opinion of fitted ones rest on them;
    # and the templates of the pair page, which the worker renders (.pair_files).
    shared = (*((f"groups/{path.name}", str(path))
                for path in sorted((root / "groups").glob("*.yaml"))),
              *((f"templates/{name}", str(TEMPLATES / "pages" / name))
                for name in PAIR_PAGE_TEMPLATES))
    return _key("pair", settings, root, own, shared, digests=digests)


def component_key(catalogue: Catalogue, component_id: str, settings: SiteSettings,
                  digests: FileDigests | None = None) -> str:
    """The hash of everything a component's figure depends on."""
    root = catalogue.root
    own = ((f"components/{component_id}", str(root / "components" / f"{component_id}.yaml")),)
    return _key("component", settings, root, own, digests=digests)


class BuildCache:
    """Pickled work under ``root/work/``; ``enabled=False`` reads nothing (a cold build)
    but still stores what it computes for the next build."""

    def __init__(self, root: Path, *, read: bool = True) -> None:
        self.root = root
        self.read = read
        self.hits = 0
        self.misses = 0

    def _path(self, key: str) -> Path:
        return self.root / "work" / key[:2] / f"{key}.pickle"

    def get(self, key: str, *, with_files: bool = False) -> Any | None:
        """The entry stored under ``key`` (None: not stored, unreadable, or -- with
        ``with_files`` -- stored without its files)."""
        if not self.read or (with_files and not self._path(key).with_suffix(".files").is_file()):
            self.misses += 1
            return None
        try:
            with self._path(key).open("rb") as handle:
                value = pickle.load(handle)
        except (OSError, pickle.UnpicklingError, EOFError, AttributeError, ImportError):
            self.misses += 1
            return None
        self.hits += 1
        return value

    def files(self, key: str) -> Any:
        """The files stored beside the entry of ``key`` (read whether or not this build
        reads the cache: they are what this build stored)."""
        with self._path(key).with_suffix(".files").open("rb") as handle:
            return pickle.load(handle)

    def prune(self, keep: set[str]) -> int:
        """Delete stored work whose key is not in ``keep`` (after a build of the whole
        catalogue: what no current file needs); the number of entries deleted."""
        removed = 0
        for path in (self.root / "work").glob("*/*.*"):
            if path.suffix in (".pickle", ".files") and path.stem not in keep:
                path.unlink(missing_ok=True)
                removed += path.suffix == ".pickle"
        return removed

    def load_memo(self, name: str) -> dict[str, Any]:
        """A dictionary kept between builds (e.g. the site check's parsed files)."""
        try:
            with (self.root / f"{name}.pickle").open("rb") as handle:
                memo = pickle.load(handle)
        except (OSError, pickle.UnpicklingError, EOFError, AttributeError, ImportError):
            return {}
        return memo if isinstance(memo, dict) and memo.get("\0code") == code_version() else {}

    def save_memo(self, name: str, memo: dict[str, Any]) -> None:
        memo["\0code"] = code_version()  # another version of the builder starts afresh
        self._write(self.root / f"{name}.pickle", memo)

    def put(self, key: str, value: Any, files: Any = None) -> None:
        """Store ``value`` under ``key``, and ``files`` apart beside it (:meth:`files`)."""
        if files is not None:
            self._write(self._path(key).with_suffix(".files"), files)
        self._write(self._path(key), value)

    def _write(self, path: Path, value: Any) -> None:
        path.parent.mkdir(parents=True, exist_ok=True)
        temporary = path.with_name(f"{path.name}.{os.getpid()}.tmp")
        with temporary.open("wb") as handle:
            pickle.dump(value, handle, protocol=pickle.HIGHEST_PROTOCOL)
        os.replace(temporary, path)
