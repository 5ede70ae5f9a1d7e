"""The build cache's keys (builder/site/cache.py): every input a pair's work depends on
changes its key, and one build reads each input file once.

Reference: the project's own contract (common practice for content-addressed build caches:
a key is a hash of every input, so a stale result is never reused).
"""

from __future__ import annotations

import shutil
from collections import Counter
from pathlib import Path

import pytest

from builder.catalogue.loader import Catalogue, load_catalogue
from builder.site import cache
from builder.site.settings import SiteSettings


@pytest.fixture
def copied(catalogue: Catalogue, tmp_path: Path) -> Catalogue:
    shutil.copytree(catalogue.root, tmp_path / "pairs")
    return load_catalogue(tmp_path / "pairs")


def test_one_build_reads_each_file_once(copied: Catalogue,
                                        monkeypatch: pytest.MonkeyPatch) -> None:
    reads: Counter[str] = Counter()
    original = cache._file_bytes

    def counted(path: Path) -> bytes:
        reads[str(path)] += 1
        return original(path)

    settings = SiteSettings()
    alone = {pid: cache.pair_key(copied, pid, settings) for pid in copied.pairs}
    monkeypatch.setattr(cache, "_file_bytes", counted)
    digests = cache.FileDigests()
    shared = {pid: cache.pair_key(copied, pid, settings, digests) for pid in copied.pairs}
    assert shared == alone  # the same keys, whether or not the digests are shared
    assert reads and max(reads.values()) == 1
    assert len(set(shared.values())) == len(shared)


def test_a_cited_reference_or_a_group_table_changes_the_key(copied: Catalogue) -> None:
    settings = SiteSettings()
    before = cache.pair_key(copied, "ethanol--water", settings)
    pair_file = (copied.root / "binaries" / "ethanol--water.yaml").read_text(encoding="utf-8")
    cited = sorted(cache._REF.findall(pair_file))
    assert cited
    reference = copied.root / "references" / f"{cited[0]}.yaml"
    reference.write_text(reference.read_text(encoding="utf-8") + "\n# edited\n",
                         encoding="utf-8")
    after_reference = cache.pair_key(copied, "ethanol--water", settings)
    assert after_reference != before
    table = sorted((copied.root / "groups").glob("*.yaml"))[0]
    table.write_text(table.read_text(encoding="utf-8") + "\n# edited\n", encoding="utf-8")
    after_table = cache.pair_key(copied, "ethanol--water", settings)
    assert after_table not in (before, after_reference)
    # A reference the pair's files do not cite leaves its key alone.
    unrelated = copied.root / "references" / "unrelated-note.yaml"
    unrelated.write_text("x: 1\n", encoding="utf-8")
    assert cache.pair_key(copied, "ethanol--water", settings) == after_table
