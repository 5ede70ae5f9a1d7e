"""Two versions of the catalogue side by side: folders or git revisions, and what changed.

``atlas diff`` compares a base and a head catalogue.  Each is a folder or a git
revision of the repository holding the catalogue (materialised into a
temporary folder with ``git archive``; nothing in the working tree changes).
:func:`affected_pairs` finds the pairs a change touches: a pair file added,
removed or edited, a component it uses, or a reference that it or its
components cite.
"""

from __future__ import annotations

import io
import subprocess
import tarfile
from collections.abc import Mapping
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from builder.catalogue.reader import ReadProblem, read_yaml
from builder.errors import AtlasError

__all__ = ["Revision", "affected_pairs", "changed_files", "materialise"]

FOLDERS = ("references", "components", "binaries")


@dataclass(frozen=True)
class Revision:
    """A catalogue folder and how the user named it."""

    label: str
    root: Path


def _git(repo: Path, *args: str) -> bytes:
    try:
        done = subprocess.run(["git", "-C", str(repo), *args], capture_output=True, check=False,
                              timeout=120)
    except (OSError, subprocess.TimeoutExpired) as error:
        raise AtlasError(f"cannot run git: {error}") from None
    if done.returncode != 0:
        message = done.stderr.decode(errors="replace").strip()
        raise AtlasError(f"git {' '.join(args[:2])}: {message}")
    return done.stdout


def materialise(spec: str, catalogue: Path, scratch: Path) -> Revision:
    """``spec`` as a catalogue folder: itself if it is a folder, else a git revision of the
    repository holding ``catalogue`` (extracted under ``scratch``)."""
    as_path = Path(spec)
    if as_path.is_dir():
        return Revision(spec, as_path)
    folder = catalogue.resolve()
    top = Path(_git(folder, "rev-parse", "--show-toplevel").decode().strip())
    relative = folder.relative_to(top).as_posix()
    data = _git(top, "archive", "--format=tar", spec, "--", relative)
    target = scratch / f"rev-{len(list(scratch.iterdir()))}"
    target.mkdir(parents=True)
    with tarfile.open(fileobj=io.BytesIO(data)) as archive:
        members = [m for m in archive.getmembers() if (m.isfile() or m.isdir())
                   and not m.name.startswith(("/", "..")) and ".." not in Path(m.name).parts]
        archive.extractall(target, members=members)  # members checked above
    root = target / relative
    if not root.is_dir():
        raise AtlasError(f"revision {spec!r} has no catalogue folder {relative!r}")
    return Revision(spec, root)


def changed_files(base: Path, head: Path) -> dict[str, dict[str, str]]:
    """Per folder: file stem -> 'added', 'removed' or 'changed'."""
    out: dict[str, dict[str, str]] = {}
    for folder in FOLDERS:
        old = {p.stem: p for p in sorted((base / folder).glob("*.yaml"))}
        new = {p.stem: p for p in sorted((head / folder).glob("*.yaml"))}
        changes: dict[str, str] = {}
        for stem in sorted(set(old) | set(new)):
            if stem not in old:
                changes[stem] = "added"
            elif stem not in new:
                changes[stem] = "removed"
            elif old[stem].read_bytes() != new[stem].read_bytes():
                changes[stem] = "changed"
        out[folder] = changes
    return out


def _refs(data: Any) -> set[str]:
    """Every ``ref:`` value anywhere in a file's data."""
    found: set[str] = set()
    stack = [data]
    while stack:
        item = stack.pop()
        if isinstance(item, Mapping):
            ref = item.get("ref")
            if isinstance(ref, str):
                found.add(ref)
            stack.extend(item.values())
        elif isinstance(item, list):
            stack.extend(item)
    return found


def _data(path: Path) -> Any:
    try:
        return read_yaml(path)
    except (ReadProblem, OSError):
        return None


def affected_pairs(base: Path, head: Path) -> dict[str, list[str]]:
    """Pair id -> why it is affected, for every pair a change between the two touches."""
    changes = changed_files(base, head)
    why: dict[str, list[str]] = {}
    for stem, state in changes["binaries"].items():
        why.setdefault(stem, []).append(f"pair file {state}")
    for root in (base, head):
        component_refs = {p.stem: _refs(_data(p)) for p in (root / "components").glob("*.yaml")}
        for path in sorted((root / "binaries").glob("*.yaml")):
            data = _data(path)
            ids = data.get("components") if isinstance(data, Mapping) else None
            ids = [c for c in ids if isinstance(c, str)] if isinstance(ids, list) else []
            reasons = why.setdefault(path.stem, [])
            for cid in ids:
                component_state = changes["components"].get(cid)
                text = f"component {cid} {component_state}"
                if component_state and text not in reasons:
                    reasons.append(text)
            refs = _refs(data) | set().union(*(component_refs.get(c, set()) for c in ids))
            for ref in sorted(refs):
                ref_state = changes["references"].get(ref)
                text = f"reference {ref} {ref_state}"
                if ref_state and text not in reasons:
                    reasons.append(text)
    return {pid: reasons for pid, reasons in sorted(why.items()) if reasons}
