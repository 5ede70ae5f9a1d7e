"""The staging copy of the site links what the published site holds unchanged and copies
the rest (builder/site/staging_copy.py).  Reference: the project's own contract (the
published site is byte for byte the assembled one, and a build never writes into the
published site); common practice for copying by size and time stamp.
"""

from __future__ import annotations

import filecmp
import os
import shutil
from pathlib import Path

from builder.site.staging_copy import stage_copy


def _same(a: Path, b: Path) -> bool:
    names = sorted(p.relative_to(a).as_posix() for p in a.rglob("*"))
    if names != sorted(p.relative_to(b).as_posix() for p in b.rglob("*")):
        return False
    return all(filecmp.cmp(a / n, b / n, shallow=False) for n in names if (a / n).is_file())


def test_unchanged_files_are_linked_and_changed_ones_copied(tmp_path: Path) -> None:
    assembly = tmp_path / "html"
    (assembly / "pairs" / "a--b").mkdir(parents=True)
    (assembly / "index.html").write_text("index", encoding="utf-8")
    (assembly / "pairs" / "a--b" / "fig.svg").write_text("<svg/>", encoding="utf-8")
    (assembly / "pairs" / "c--d.html").write_text("c", encoding="utf-8")
    published = tmp_path / "site"
    assert stage_copy(assembly, published) == 3  # nothing published yet: all copied
    # One page rewritten (same size, new time stamp), one pair gone, one added.
    page = assembly / "index.html"
    page.write_text("INDEX", encoding="utf-8")
    stamp = page.stat().st_mtime_ns + 1_000_000
    os.utime(page, ns=(stamp, stamp))
    (assembly / "pairs" / "c--d.html").unlink()
    (assembly / "pairs" / "e--f.html").write_text("new", encoding="utf-8")
    staging = tmp_path / "staging"
    assert stage_copy(assembly, staging, published) == 2
    assert _same(assembly, staging)
    figure = staging / "pairs" / "a--b" / "fig.svg"
    assert figure.stat().st_ino == (published / "pairs" / "a--b" / "fig.svg").stat().st_ino
    assert (staging / "index.html").stat().st_ino != (published / "index.html").stat().st_ino
    # The published site is never written: its old page is as it was.
    assert (published / "index.html").read_text(encoding="utf-8") == "index"
    # After the swap the old site is deleted; the new one keeps the linked files.
    shutil.rmtree(published)
    assert figure.read_text(encoding="utf-8") == "<svg/>"


def test_a_published_file_changed_in_place_is_not_linked(tmp_path: Path) -> None:
    assembly = tmp_path / "html"
    assembly.mkdir()
    (assembly / "index.html").write_text("index", encoding="utf-8")
    published = tmp_path / "site"
    stage_copy(assembly, published)
    (published / "index.html").write_text("edited by hand", encoding="utf-8")
    staging = tmp_path / "staging"
    assert stage_copy(assembly, staging, published) == 1
    assert (staging / "index.html").read_text(encoding="utf-8") == "index"
