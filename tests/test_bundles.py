"""A pair's own files reach the site sources as a bundle, read only when they must be
written (``builder.site.content.Bundle``, ``builder.site.assemble._write_sources``).

Reference: the project's own contract (an incremental build writes what changed and its
output equals a cold build's; common practice for build caches keyed by content).
"""

from __future__ import annotations

from collections.abc import Callable
from pathlib import Path

import pytest

from builder.site.assemble import AssembleError, _write_sources
from builder.site.content import Bundle, SiteContent
from builder.site.pair_files import Files
from builder.site.text import UnsafeName

FILES = (("pairs/a--b.md", b"# A + B\n"), ("pairs/a--b/curve.csv", b"x1,T_K\n0,300\n"))


def _never() -> tuple[tuple[str, bytes], ...]:
    raise AssertionError("an unchanged bundle was read")


def _content(key: str, read: Callable[[], Files] = lambda: FILES,
             files: Files = FILES) -> SiteContent:
    content = SiteContent()
    content.add("index.md", "# Pairs\n")
    content.add_bundle("a--b", Bundle(key, tuple(path for path, _ in files), read))
    return content


def test_an_unchanged_bundle_is_not_read_again(tmp_path: Path) -> None:
    docs, _removed = _write_sources(_content("k1"), tmp_path)
    assert (docs / "pairs/a--b.md").read_bytes() == FILES[0][1]
    stamp = (docs / "pairs/a--b/curve.csv").stat().st_mtime_ns
    # The same key and paths: the files are there, nothing is read or rewritten.
    _write_sources(_content("k1", read=_never), tmp_path)
    assert (docs / "pairs/a--b/curve.csv").stat().st_mtime_ns == stamp
    # No key (e.g. made in this process): always read; equal bytes keep their time stamp.
    _write_sources(_content(""), tmp_path)
    assert (docs / "pairs/a--b/curve.csv").stat().st_mtime_ns == stamp


def test_a_changed_or_missing_bundle_is_written(tmp_path: Path) -> None:
    docs, _removed = _write_sources(_content("k1"), tmp_path)
    changed = (FILES[0], ("pairs/a--b/curve.csv", b"x1,T_K\n0,301\n"))
    _write_sources(_content("k2", read=lambda: changed, files=changed), tmp_path)
    assert (docs / "pairs/a--b/curve.csv").read_bytes() == changed[1][1]
    # A file of the bundle deleted behind the build's back: written again.
    (docs / "pairs/a--b.md").unlink()
    _write_sources(_content("k2", read=lambda: changed, files=changed), tmp_path)
    assert (docs / "pairs/a--b.md").is_file()


def test_a_killed_write_leaves_no_record_of_the_bundles(tmp_path: Path) -> None:
    _write_sources(_content("k1"), tmp_path)

    def killed() -> tuple[tuple[str, bytes], ...]:
        raise KeyboardInterrupt

    changed = (FILES[0], ("pairs/a--b/curve.csv", b"changed\n"))
    with pytest.raises(KeyboardInterrupt):
        _write_sources(_content("k2", read=killed, files=changed), tmp_path)
    # Without the record the next assembly reads every bundle: the stale file is replaced.
    docs, _removed = _write_sources(_content("k1", read=lambda: changed, files=changed),
                                    tmp_path)
    assert (docs / "pairs/a--b/curve.csv").read_bytes() == b"changed\n"


def test_files_no_bundle_lists_are_removed(tmp_path: Path) -> None:
    _write_sources(_content("k1"), tmp_path)
    fewer = FILES[:1]
    docs, removed = _write_sources(_content("k2", read=lambda: fewer, files=fewer), tmp_path)
    assert removed == ["pairs/a--b/curve.csv"] and not (docs / "pairs/a--b").exists()


def test_a_bundle_must_hold_the_files_it_lists(tmp_path: Path) -> None:
    other = (("pairs/a--b.md", b"x"), ("pairs/x--y.md", b"y"))
    with pytest.raises(AssembleError, match="not those its entry lists"):
        _write_sources(_content("k1", read=lambda: other), tmp_path)


def test_bundle_paths_are_checked_like_every_generated_path() -> None:
    content = SiteContent()
    content.add("pairs/a--b.md", "x")
    with pytest.raises(UnsafeName, match="share the path"):
        content.add_bundle("a--b", Bundle("k", ("pairs/a--b.md",), lambda: ()))
    with pytest.raises(UnsafeName, match="unsafe path"):
        content.add_bundle("c--d", Bundle("k", ("../c.md",), lambda: ()))
