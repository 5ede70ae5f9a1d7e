"""Bring a copy of a folder up to date by copying only what changed.

The build assembles the site in its cache (``assembly/html``) and publishes a
verified copy of it; after an edit of one pair, mkdocs rewrites a few pages of
the assembly, and copying all of it (hundreds of megabytes for the full atlas)
would cost more than the rest of the rebuild.  The build keeps the site it
replaced (:mod:`.publish`) and :func:`mirror` turns that into a copy of the new
assembly: files whose size and modification time equal the source's are kept
(the copies carry their source's modification time, and mkdocs writes every
file it changes anew), every other file is copied, and files and folders the
source no longer has are removed.
"""

from __future__ import annotations

import os
import shutil
from pathlib import Path

__all__ = ["mirror"]


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


def mirror(source: Path, target: Path) -> int:
    """Make ``target`` a copy of ``source`` (both folders); the number of files copied."""
    wanted, present = _files(source), _files(target)
    for name in present.keys() - wanted.keys():
        (target / name).unlink()
    copied = 0
    for name, stat in wanted.items():
        have = present.get(name)
        if have is not None and (have.st_size, have.st_mtime_ns) == (stat.st_size,
                                                                      stat.st_mtime_ns):
            continue
        destination = target / name
        destination.parent.mkdir(parents=True, exist_ok=True)
        shutil.copy2(source / name, destination)
        copied += 1
    for folder, _subfolders, _names in os.walk(target, topdown=False):
        if Path(folder) != target:
            try:
                os.rmdir(folder)  # only an empty folder goes
            except OSError:
                pass
    return copied
