"""The build pipeline: cache, executors, atomic publishing and the parsing site check.

References: the project's own contract (the same catalogue gives the same
site, byte for byte, whichever way it is built) and "common practice"
(publishing by rename; an SVG check that parses XML).
"""

from __future__ import annotations

import os
import queue
import shutil
import signal
import subprocess
import sys
import threading
import time
from pathlib import Path

import pytest
import yaml

from builder.catalogue.loader import load_catalogue
from builder.errors import CatalogueErrors
from builder.site import build as build_module
from builder.site.build import STAGE_MARKER, BuildFailure, build_site
from builder.site.predicted import select_predicted
from builder.site.progress import Progress
from builder.site.settings import load_settings
from builder.site.verify import SiteCheck, svg_problems, verify_site

pytest.importorskip("material", reason="the site extra is not installed: pip install -e '.[site]'")

REPO = Path(__file__).resolve().parent.parent
PAIRS = ("acetone--chloroform", "ethanol--water")


def small_catalogue(root: Path, pairs: tuple[str, ...] = PAIRS) -> Path:
    """A copy of the shipped catalogue cut down to ``pairs`` and their components."""
    target = root / "pairs"
    shutil.copytree(REPO / "pairs" / "references", target / "references")
    (target / "components").mkdir(parents=True)
    (target / "binaries").mkdir()
    for pid in pairs:
        shutil.copy(REPO / "pairs" / "binaries" / f"{pid}.yaml", target / "binaries")
        for cid in pid.split("--"):
            shutil.copy(REPO / "pairs" / "components" / f"{cid}.yaml", target / "components")
    return target


def edit_notes(catalogue: Path, pid: str, notes: str) -> None:
    path = catalogue / "binaries" / f"{pid}.yaml"
    data = yaml.safe_load(path.read_text(encoding="utf-8"))
    data["notes"] = notes
    path.write_text(yaml.safe_dump(data, allow_unicode=True, sort_keys=False), encoding="utf-8")


def snapshot(folder: Path) -> dict[str, bytes]:
    return {p.relative_to(folder).as_posix(): p.read_bytes()
            for p in sorted(folder.rglob("*")) if p.is_file()}


def assert_same_tree(a: Path, b: Path) -> None:
    left, right = snapshot(a), snapshot(b)
    assert sorted(left) == sorted(right), set(left) ^ set(right)
    differ = [name for name in left if left[name] != right[name]]
    assert differ == [], f"{len(differ)} files differ, e.g. {differ[:5]}"


@pytest.fixture(scope="module")
def cold_and_incremental(tmp_path_factory: pytest.TempPathFactory) -> dict[str, object]:
    """A warm build, an edit of one pair file and an incremental rebuild; and a cold build
    of the edited catalogue elsewhere."""
    root = tmp_path_factory.mktemp("incremental")
    catalogue = small_catalogue(root)
    out = root / "warm" / "site"
    build_site(catalogue, out, strict=True, workers=2, quiet_progress=True)
    edit_notes(catalogue, "ethanol--water", "Edited: the incremental build must show this.")
    again = build_site(catalogue, out, strict=True, workers=2, quiet_progress=True)
    cold_out = root / "cold" / "site"
    cold = build_site(catalogue, cold_out, strict=True, workers=2, use_cache=False,
                      quiet_progress=True)
    return {"catalogue": catalogue, "out": out, "again": again, "cold_out": cold_out,
            "cold": cold}


def test_incremental_rebuild_equals_a_cold_build(cold_and_incremental: dict) -> None:
    again, cold = cold_and_incremental["again"], cold_and_incremental["cold"]
    assert again.computed == 1  # the edited pair; both components and the other pair cached
    assert cold.cached == 0
    out = cold_and_incremental["out"]
    assert "the incremental build must show this" in (
        out / "pairs" / "ethanol--water.html").read_text(encoding="utf-8")
    assert_same_tree(out, cold_and_incremental["cold_out"])
    # The cache and the staging folder live beside the site, never inside it.
    assert not (out / ".atlas-cache").exists()
    assert (out.parent / ".atlas-cache").is_dir()
    # The edited pair's old entry is pruned: one entry per pair and per component remains.
    # The shipped settings also predict the combinations of listed solvents among the four
    # components (acetone-ethanol, acetone-water): one entry each.
    stored = list((out.parent / ".atlas-cache" / "work").glob("*/*.pickle"))
    predicted = select_predicted(load_catalogue(cold_and_incremental["catalogue"]),
                                 load_settings().predicted_pairs).records
    assert len(stored) == len(PAIRS) + len(predicted) + 4
    assert [p.name for p in out.parent.iterdir() if ".staging-" in p.name] == []
    # The rebuild's staging copy linked the unchanged files of the first build's site
    # (builder/site/staging_copy.py) and still equals the cold build; that site is
    # deleted after the swap, so no published file is shared with anything left over.
    figure = next((out / "pairs" / "acetone--chloroform").glob("*.svg"))
    assert figure.stat().st_nlink == 1


def test_dask_cluster_build_equals_the_local_build(cold_and_incremental: dict,
                                                   tmp_path: Path) -> None:
    distributed = pytest.importorskip("distributed")
    from builder.site.executor import DaskExecutor

    with distributed.LocalCluster(n_workers=1, threads_per_worker=1, processes=False,
                                  dashboard_address=None) as cluster:
        executor = DaskExecutor(cluster.scheduler_address)
        try:
            report = build_site(cold_and_incremental["catalogue"], tmp_path / "site",
                                strict=True, executor=executor, use_cache=False,
                                quiet_progress=True)
        finally:
            executor.close()
    assert report.executor.startswith("dask")
    assert_same_tree(tmp_path / "site", cold_and_incremental["cold_out"])


def test_search_index_is_compact_and_names_cas_numbers(cold_and_incremental: dict) -> None:
    out = cold_and_incremental["out"]
    index = (out / "search" / "search_index.js").read_text(encoding="utf-8")
    assert index.startswith("var __index = {")
    assert "cas64175" in index and "64-17-5" in index  # ethanol, as key and as printed
    assert "C2H6O" in index and "ethyl alcohol" in index.lower()
    assert "<table" not in index  # not whole pages
    assert cold_and_incremental["cold"].search_index_bytes < 40_000


# -- publishing: a failed or killed build leaves the published site as it was ----------


@pytest.fixture(scope="module")
def published_once(tmp_path_factory: pytest.TempPathFactory) -> Path:
    """One build of acetone-chloroform: its catalogue, site and cache under one folder."""
    root = tmp_path_factory.mktemp("published")
    build_site(small_catalogue(root, ("acetone--chloroform",)), root / "site", workers=1,
               quiet_progress=True)
    return root


@pytest.fixture()
def published(tmp_path: Path, published_once: Path) -> tuple[Path, Path, dict[str, bytes]]:
    """A fresh copy of that build (catalogue, published site and the cache beside it) for
    each test to break."""
    shutil.copytree(published_once, tmp_path, dirs_exist_ok=True)
    out = tmp_path / "site"
    return tmp_path / "pairs", out, snapshot(out)


def test_catalogue_error_leaves_the_site(published: tuple[Path, Path, dict[str, bytes]]
                                         ) -> None:
    catalogue, out, before = published
    path = catalogue / "components" / "acetone.yaml"
    path.write_text(path.read_text(encoding="utf-8").replace("molar_mass:", "molar_mass: oops #"),
                    encoding="utf-8")
    with pytest.raises(CatalogueErrors):
        build_site(catalogue, out, workers=1, quiet_progress=True)
    assert snapshot(out) == before


def test_failed_verification_leaves_the_site(published: tuple[Path, Path, dict[str, bytes]],
                                             monkeypatch: pytest.MonkeyPatch) -> None:
    catalogue, out, before = published
    edit_notes(catalogue, "acetone--chloroform", "A new note that is never published.")
    monkeypatch.setattr(build_module, "verify_site",
                        lambda root, memo=None, workers=1: SiteCheck(
                            problems=["x.html: planted problem"]))
    with pytest.raises(BuildFailure, match="planted problem"):
        build_site(catalogue, out, workers=1, quiet_progress=True)
    assert snapshot(out) == before
    assert [p.name for p in out.parent.iterdir() if ".staging-" in p.name] == []


@pytest.mark.parametrize(("stage", "delay_s"), [("compute", 0.0), ("render", 0.0),
                                                ("assemble", 0.0), ("assemble", 1.5),
                                                ("verify", 0.0)])
def test_killed_build_leaves_the_site(published: tuple[Path, Path, dict[str, bytes]],
                                      stage: str, delay_s: float) -> None:
    catalogue, out, before = published
    edit_notes(catalogue, "acetone--chloroform", "A new note; the killed build never shows it.")
    env = dict(os.environ, PYTHONPATH=str(REPO), MPLBACKEND="Agg", NO_MKDOCS_2_WARNING="1")
    process = subprocess.Popen(
        [sys.executable, "-m", "builder", "--catalogue", str(catalogue), "build", "--out",
         str(out), "--workers", "1"], stdout=subprocess.PIPE, stderr=subprocess.DEVNULL,
        text=True, env=env, cwd=REPO)
    assert process.stdout is not None
    marker = STAGE_MARKER.format(stage)
    lines: queue.Queue[str | None] = queue.Queue()

    def read() -> None:
        assert process.stdout is not None
        for line in process.stdout:
            lines.put(line.rstrip("\n"))
        lines.put(None)

    threading.Thread(target=read, daemon=True).start()
    seen: list[str] = []
    while (line := lines.get(timeout=600)) is not None:
        seen.append(line)
        if line == marker:
            # Kill within the stage: after delay_s, or as soon as the next stage starts
            # (on a fast machine a small catalogue's assembly can take less than delay_s).
            deadline = time.monotonic() + delay_s
            while (left := deadline - time.monotonic()) > 0:
                try:
                    following = lines.get(timeout=left)
                except queue.Empty:
                    break
                if following is None or following.startswith(STAGE_MARKER.format("")):
                    break
            process.send_signal(signal.SIGKILL)
            break
    process.wait(timeout=60)
    assert marker in seen, seen
    assert process.returncode == -signal.SIGKILL
    assert snapshot(out) == before
    # The next build recovers: it publishes the edited catalogue.
    build_site(catalogue, out, workers=1, quiet_progress=True)
    assert "the killed build never shows it" in (
        out / "pairs" / "acetone--chloroform.html").read_text(encoding="utf-8")
    assert [p.name for p in out.parent.iterdir() if p.name.startswith(".site.")] == []


# -- the site check parses what it checks ------------------------------------------------


def test_svg_check_reads_text_as_text() -> None:
    """Regression: text like "onset=early" inside <text> was taken for an event handler."""
    text = ('<svg xmlns="http://www.w3.org/2000/svg"><text x="1" y="2">Ethanol onset=early'
            ' (1) + Water (2)</text></svg>')
    assert svg_problems(text) == []
    hostile = ('<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink">'
               '<g onload="x()"/><script>x()</script>'
               '<image xlink:href="https://evil.example/a.png"/></svg>')
    found = " ".join(svg_problems(hostile))
    assert "onload" in found and "<script>" in found and "evil.example" in found


def test_component_named_like_an_event_handler_builds(tmp_path: Path) -> None:
    catalogue = small_catalogue(tmp_path, ("ethanol--water",))
    path = catalogue / "components" / "ethanol.yaml"
    data = yaml.safe_load(path.read_text(encoding="utf-8"))
    data["name"] = "Ethanol onset=early"
    path.write_text(yaml.safe_dump(data, allow_unicode=True, sort_keys=False), encoding="utf-8")
    out = tmp_path / "site"
    build_site(catalogue, out, strict=True, workers=1, quiet_progress=True)
    assert verify_site(out).problems == []
    assert "onset=early" in (out / "pairs" / "ethanol--water" / "xy.svg").read_text(
        encoding="utf-8")


# -- progress -----------------------------------------------------------------------------


def test_progress_prints_plain_lines_when_not_a_terminal() -> None:
    import io

    stream = io.StringIO()
    with Progress("pairs", 4, stream=stream, every_s=0.0) as progress:
        for _ in range(4):
            progress.step()
    lines = stream.getvalue().splitlines()
    assert lines and lines[-1].startswith("  pairs 4/4 (100.0 %)")
    assert "left" in lines[0] and "/s" in lines[0]


# -- compact figures ----------------------------------------------------------------------


def test_compact_svg_keeps_text_and_drawing(catalogue: object) -> None:
    """The compacted figure is well-formed, keeps every label and is much smaller."""
    import io
    import xml.etree.ElementTree as ElementTree

    from matplotlib.backends.backend_svg import FigureCanvasSVG
    from matplotlib.figure import Figure as MplFigure

    from builder.site.svg import compact

    fig = MplFigure(figsize=(4, 3))
    FigureCanvasSVG(fig)
    ax = fig.add_subplot()
    x = [i / 200 for i in range(201)]
    ax.plot(x, [v * v for v in x], marker="o", markevery=20, label="x² & <y> = 0.894")
    ax.plot([0, 1], [0, 1])  # a straight line of 2 points stays 2 points
    ax.legend()
    buffer = io.BytesIO()
    with __import__("matplotlib").rc_context({"svg.fonttype": "none",
                                              "svg.hashsalt": "test"}):
        fig.savefig(buffer, format="svg")
    raw = buffer.getvalue()
    small = compact(raw)
    tree = ElementTree.fromstring(small)
    texts = ["".join(t.itertext()) for t in tree.iter("{http://www.w3.org/2000/svg}text")]
    assert "x² & <y> = 0.894" in texts
    assert len(small) < 0.6 * len(raw)
    assert svg_problems(small.decode()) == []
