"""Publishing: the verified site replaces the published one by renames, never file by file.

A build writes its site into a staging folder beside the output folder
(``.site.staging-<pid>`` for ``site/``, on the same file system, so renames
are cheap and atomic), verifies it there, and then:

* on Linux, exchanges the staging folder and the published folder in one
  atomic ``renameat2(RENAME_EXCHANGE)`` call, then deletes the old site
  (now under the staging name);
* elsewhere, renames the published folder to ``.site.old-<pid>``, the staging
  folder to ``site``, and deletes the old one.

A build that fails or is killed before publishing leaves the published site
untouched (and a staging folder that the next build removes).  If a build is
killed between the two renames of the fallback, the next build's
:func:`recover` renames the old site back before doing anything else.
"""

from __future__ import annotations

import ctypes
import ctypes.util
import os
import shutil
import sys
from pathlib import Path

__all__ = ["publish", "recover", "staging_folder"]

_RENAME_EXCHANGE = 2
_AT_FDCWD = -100


def staging_folder(out_dir: Path) -> Path:
    """Where this process assembles the next site (beside ``out_dir``); must not exist."""
    path = out_dir.parent / f".{out_dir.name}.staging-{os.getpid()}"
    if path.exists():
        shutil.rmtree(path)
    out_dir.parent.mkdir(parents=True, exist_ok=True)
    return path


def _alive(pid: int) -> bool:
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except PermissionError:
        return True
    return True


def _leftovers(out_dir: Path, kind: str) -> list[tuple[int, Path]]:
    found = []
    for path in out_dir.parent.glob(f".{out_dir.name}.{kind}-*"):
        suffix = path.name.rsplit("-", 1)[-1]
        if suffix.isdigit() and path.is_dir():
            found.append((int(suffix), path))
    return sorted(found)


def recover(out_dir: Path) -> None:
    """Undo what a killed build left: restore an old site renamed away, remove staging
    folders of builds that are no longer running."""
    olds = _leftovers(out_dir, "old")
    if olds and not out_dir.exists():
        os.rename(olds[-1][1], out_dir)
        olds = olds[:-1]
    for pid, path in olds + _leftovers(out_dir, "staging"):
        if pid != os.getpid() and not _alive(pid):
            shutil.rmtree(path, ignore_errors=True)


def _exchange(a: Path, b: Path) -> bool:
    """Swap two paths atomically (Linux ``renameat2``); False where that is not available."""
    if not sys.platform.startswith("linux"):
        return False
    try:
        libc = ctypes.CDLL(ctypes.util.find_library("c") or "libc.so.6", use_errno=True)
        renameat2 = libc.renameat2
    except (OSError, AttributeError):
        return False
    renameat2.argtypes = [ctypes.c_int, ctypes.c_char_p, ctypes.c_int, ctypes.c_char_p,
                          ctypes.c_uint]
    if renameat2(_AT_FDCWD, os.fsencode(a), _AT_FDCWD, os.fsencode(b), _RENAME_EXCHANGE) == 0:
        return True
    return False  # e.g. a file system without the flag: fall back to two renames


def publish(staging: Path, out_dir: Path) -> None:
    """Put the verified site in ``staging`` at ``out_dir``; delete the site it replaces."""
    if not out_dir.exists():
        os.rename(staging, out_dir)
        return
    if _exchange(staging, out_dir):
        shutil.rmtree(staging)  # now the previous site
        return
    old = out_dir.parent / f".{out_dir.name}.old-{os.getpid()}"
    os.rename(out_dir, old)
    os.rename(staging, out_dir)
    shutil.rmtree(old)
