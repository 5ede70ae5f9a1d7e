"""Make the staging copy of the site cheaply: unchanged files linked from the published site.

The build assembles the site in its cache (``assembly/html``) and publishes a
verified copy of it (:mod:`.publish`).  After an edit of one pair, mkdocs
rewrites a few pages of the assembly, and copying all of it (hundreds of
megabytes for the full atlas) would cost more than the rest of the rebuild.
:func:`stage_copy` copies only the files that changed since the site now
published and hard-links the others from it: a file whose size and
modification time equal the assembly's is the same file (copies carry their
source's modification time, and mkdocs writes every file it changes anew).
The published site is never written in place -- a build replaces it as a whole
folder -- so the files it shares with the new one stay as they are; the old folder is
deleted after the swap, and the new site keeps the links' files.
"""

from __future__ import annotations

import os
import shutil
from pathlib import Path

__all__ = ["stage_copy"]


def _files(root: Path) -> dict[str, os.stat_result]:
    """Every file under ``root``, by its path relative to ``root`` (``/``-separated)."""
    found: dict[str, os.stat_result] = {}
    stack = [""]
    while stack:
        prefix = stack.pop()
        with os.scandir(root / prefix if prefix else root) as entries:
            for entry in entries:
                name = f"{prefix}/{entry.name}" if prefix else entry.name
                if entry.is_dir(follow_symlinks=False):
                    stack.append(name)
                else:
                    found[name] = entry.stat(follow_symlinks=False)
    return found


def stage_copy(source: Path, target: Path, published: Path | None = None) -> int:
    """Make ``target`` (new) a copy of ``source``, linking the files ``published`` holds
    unchanged (where it can: the same file system); the number of files copied."""
    wanted = _files(source)
    have = _files(published) if published is not None and published.is_dir() else {}
    copied = 0
    made: set[Path] = set()
    for name, stat in sorted(wanted.items()):
        destination = target / name
        folder = destination.parent
        if folder not in made:
            folder.mkdir(parents=True, exist_ok=True)
            made.add(folder)
        old = have.get(name)
        if old is not None and (old.st_size, old.st_mtime_ns) == (stat.st_size,
                                                                   stat.st_mtime_ns):
            try:
                os.link(published / name, destination)  # type: ignore[operator]
                continue
            except OSError:  # another file system, or links not allowed: copy it
                pass
        shutil.copy2(source / name, destination)
        copied += 1
    return copied
