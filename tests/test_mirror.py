"""A kept copy of the site is brought up to date by copying only what changed
(builder/site/mirror.py).  Reference: the project's own contract (the published site is
byte for byte the assembled one); common practice for mirroring by size and time stamp.
"""

from __future__ import annotations

import filecmp
import os
import shutil
from pathlib import Path

from builder.site.mirror import mirror


def _same(a: Path, b: Path) -> bool:
    names = sorted(p.relative_to(a).as_posix() for p in a.rglob("*"))
    if names != sorted(p.relative_to(b).as_posix() for p in b.rglob("*")):
        return False
    return all(filecmp.cmp(a / n, b / n, shallow=False) for n in names if (a / n).is_file())


def test_mirror_copies_what_changed_and_removes_what_went(tmp_path: Path) -> None:
    source = tmp_path / "html"
    (source / "pairs" / "a--b").mkdir(parents=True)
    (source / "pairs" / "c--d").mkdir(parents=True)
    (source / "index.html").write_text("index", encoding="utf-8")
    (source / "pairs" / "a--b" / "fig.svg").write_text("<svg/>", encoding="utf-8")
    (source / "pairs" / "c--d" / "fig.svg").write_text("<svg/>", encoding="utf-8")
    kept = tmp_path / "kept"
    shutil.copytree(source, kept)
    assert mirror(source, kept) == 0  # copies keep their source's time stamps
    # One page rewritten (same size, new time stamp), one pair gone, one file added.
    page = source / "index.html"
    page.write_text("INDEX", encoding="utf-8")
    stamp = page.stat().st_mtime_ns + 1_000_000
    os.utime(page, ns=(stamp, stamp))
    shutil.rmtree(source / "pairs" / "c--d")
    (source / "pairs" / "e--f.html").write_text("new", encoding="utf-8")
    assert mirror(source, kept) == 2
    assert _same(source, kept)
    assert not (kept / "pairs" / "c--d").exists()
    assert (kept / "index.html").read_text(encoding="utf-8") == "INDEX"
