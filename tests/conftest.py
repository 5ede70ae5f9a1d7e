"""Shared fixtures: the shipped catalogue, each pair's results and equilibrium system, and
the small sites that several test modules read.

Everything expensive is made once per test session and shared read-only: one catalogue
load, each shipped pair computed once (whichever test asks first), one store of the build's
per-pair and per-component work for the test builds, and one build of each small site.
"""

from __future__ import annotations

import os
import shutil
import warnings
from pathlib import Path

import pytest

from builder.analysis.point import system_for
from builder.analysis.results import PairResults, compute_pair
from builder.catalogue.loader import Catalogue, load_catalogue
from builder.site.context import AtlasView, build_views
from builder.site.pair_files import pair_files
from builder.site.settings import SiteSettings
from builder.thermo.equilibrium import BinarySystem

# The reference libraries print deprecation chatter on import; it is not ours.
warnings.filterwarnings("ignore", category=DeprecationWarning)
os.environ.setdefault("MPLBACKEND", "Agg")

REPO = Path(__file__).resolve().parent.parent


def atlas_view(settings: SiteSettings, catalogue: Catalogue,
               atlas: dict[str, PairResults]) -> AtlasView:
    """The atlas-wide view of computed results, from the pairs' entries as the build's
    workers make them (without figures; a pair not in ``catalogue`` is a prediction)."""
    entries = {pid: pair_files(catalogue, results, (), None, settings,
                               pid not in catalogue.pairs).entry
               for pid, results in atlas.items()}
    return build_views(settings, catalogue, entries)


@pytest.fixture(scope="session")
def catalogue() -> Catalogue:
    return load_catalogue()


class ShippedResults(dict[str, PairResults]):
    """``compute_pair`` of each shipped pair, computed on first use and then kept (the
    records are read-only): a test that needs three pairs computes three, and no pair is
    computed twice in a session."""

    def __init__(self, catalogue: Catalogue) -> None:
        super().__init__()
        self.catalogue = catalogue

    def __missing__(self, pid: str) -> PairResults:
        value = self[pid] = compute_pair(self.catalogue, self.catalogue.pairs[pid])
        return value


@pytest.fixture(scope="session")
def shipped_results(catalogue: Catalogue) -> ShippedResults:
    return ShippedResults(catalogue)


@pytest.fixture(scope="session")
def atlas_results(shipped_results: ShippedResults) -> dict[str, PairResults]:
    """Every pair computed once per test session (read-only records), in id order as
    ``builder.analysis.results.compute_atlas`` gives them."""
    return {pid: shipped_results[pid] for pid in sorted(shipped_results.catalogue.pairs)}


@pytest.fixture(scope="session")
def systems(catalogue: Catalogue) -> dict[str, BinarySystem]:
    return {pid: system_for(pair, catalogue) for pid, pair in catalogue.pairs.items()}


# -- the test builds -----------------------------------------------------------------------


def _link_or_copy(source: str, target: str) -> None:
    """Hard-link a stored entry (the cache replaces entries, never rewrites them in place);
    copy where the two folders are on different file systems."""
    try:
        os.link(source, target)
    except OSError:
        shutil.copy2(source, target)


@pytest.fixture(scope="session")
def shared_work(tmp_path_factory: pytest.TempPathFactory) -> Path:
    """One store of the build's per-pair and per-component work (results and figures, keyed
    by a hash of the code, the settings and every file they rest on) for the test builds:
    a build of two pairs from the shipped files still draws all 88 component figures, and
    those are the same in every such build.  When CI has just built the atlas
    ($ATLAS_SITE), its store seeds this one.  Each build keeps its own assembly and site
    check (see :func:`cache_sharing_work`); the tests of the cache itself use their own.
    """
    work = tmp_path_factory.mktemp("shared-cache") / "work"
    given = os.environ.get("ATLAS_SITE")
    seed = Path(given).resolve().parent / ".atlas-cache" / "work" if given else None
    if seed is not None and seed.is_dir():
        shutil.copytree(seed, work, copy_function=_link_or_copy)
    else:
        work.mkdir()
    return work


def cache_sharing_work(shared_work: Path, root: Path) -> Path:
    """A build cache folder under ``root`` whose work store is ``shared_work``."""
    cache = root / "test-cache"
    cache.mkdir(parents=True)
    (cache / "work").symlink_to(shared_work, target_is_directory=True)
    return cache


SMALL = ("acetone--chloroform", "ethanol--water")
HOSTILE_NAME = 'Chloro<script>window.__pwned=1</script>form'


def hostile_catalogue(root: Path) -> Path:
    """A copy of the shipped catalogue whose texts carry markup, script and Markdown links."""
    import yaml

    target = root / "hostile-pairs"
    shutil.copytree(REPO / "pairs", target)
    path = target / "components" / "chloroform.yaml"
    data = yaml.safe_load(path.read_text(encoding="utf-8"))
    data["name"] = HOSTILE_NAME
    data["synonyms"] = ['<img src=x onerror="window.__pwned=2">', "trichloromethane"]
    data["hazard"]["summary"] = ('Toxic <iframe src="javascript:window.__pwned=4"></iframe> '
                                 "[x](javascript:window.__pwned=5)")
    path.write_text(yaml.safe_dump(data, allow_unicode=True), encoding="utf-8")
    path = target / "binaries" / "acetone--chloroform.yaml"
    data = yaml.safe_load(path.read_text(encoding="utf-8"))
    data["notes"] = ("[click](javascript:window.__pwned=3) **bold** "
                     '<b onmouseover="window.__pwned=6">b</b> $x^2$ {: onclick="x"} '
                     "<https://evil.example/x.js> ![img](https://evil.example/a.png)\n"
                     "# heading\n- list")
    path.write_text(yaml.safe_dump(data, allow_unicode=True), encoding="utf-8")
    path = target / "references" / "horsley-1973.yaml"
    data = yaml.safe_load(path.read_text(encoding="utf-8"))
    data["title"] = ('Azeotropic <svg onload="window.__pwned=7"> Data '
                     "<link rel=stylesheet href=https://evil.example/x.css>")
    path.write_text(yaml.safe_dump(data, allow_unicode=True), encoding="utf-8")
    return target


@pytest.fixture(scope="session")
def small_site(tmp_path_factory: pytest.TempPathFactory, shared_work: Path) -> Path:
    """A strict build of the pairs in SMALL from the shipped catalogue (read-only)."""
    pytest.importorskip("material", reason="the site extra is not installed: "
                                           "pip install -e '.[site]'")
    from builder.site.build import build_site

    root = tmp_path_factory.mktemp("small")
    out = root / "site"
    build_site(out_dir=out, only=SMALL, strict=True,
               cache_dir=cache_sharing_work(shared_work, root), quiet_progress=True)
    return out


@pytest.fixture(scope="session")
def hostile_site(tmp_path_factory: pytest.TempPathFactory, shared_work: Path) -> Path:
    """A strict build of acetone-chloroform from :func:`hostile_catalogue` (read-only);
    test_site.py reads its files, the browser tests open it in Chromium."""
    pytest.importorskip("material", reason="the site extra is not installed: "
                                           "pip install -e '.[site]'")
    from builder.site.build import build_site

    root = tmp_path_factory.mktemp("hostile")
    out = root / "site"
    build_site(hostile_catalogue(root), out_dir=out, only=["acetone--chloroform"], strict=True,
               cache_dir=cache_sharing_work(shared_work, root), quiet_progress=True)
    return out
