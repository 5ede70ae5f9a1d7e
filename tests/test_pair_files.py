"""A pair's page, downloads and view made in the worker (``builder.site.pair_files``) are
those the main process makes from the whole atlas, byte for byte.

Reference: the project's own contract (the same catalogue gives the same site whichever
way it is built; the pair page reads nothing of other pairs).  Covered: fitted pairs with
and without a liquid split (water + 1-butanol), with the second opinion, and predicted
pairs (combinations of the same components without a fitted set).
"""

from __future__ import annotations

import shutil
from dataclasses import replace
from pathlib import Path

import pytest

from builder.analysis.results import compute_pair
from builder.analysis.second_opinion import second_opinion
from builder.catalogue.loader import Catalogue
from builder.site import TEMPLATES, cache
from builder.site.content import Bundle, generate, site_content
from builder.site.context import build_views
from builder.site.figures import component_figure, pair_figures
from builder.site.pair_files import pair_files
from builder.site.predicted import select_predicted
from builder.site.predicted_figures import predicted_figure
from builder.site.settings import load_settings
from builder.site.work import pair_task
from tests.conftest import ShippedResults

FITTED = ("acetone--chloroform", "ethanol--water", "water--1-butanol")


def test_worker_files_equal_the_main_process_files(catalogue: Catalogue,
                                                  shipped_results: ShippedResults) -> None:
    settings = load_settings()
    assert settings.second_opinion  # the shipped settings: fitted pages carry it
    ids = sorted({cid for pid in FITTED for cid in pid.split("--")})
    part = Catalogue(root=catalogue.root, references=catalogue.references,
                     components={cid: catalogue.components[cid] for cid in ids},
                     pairs={pid: catalogue.pairs[pid] for pid in FITTED})
    selection = select_predicted(part, tuple(ids))
    assert len(selection.records) >= 2
    predicted = sorted(selection.records)[:2]
    work = replace(part, pairs={**part.pairs, **selection.records})
    atlas = {pid: shipped_results[pid] for pid in FITTED}
    atlas |= {pid: compute_pair(work, work.pairs[pid]) for pid in predicted}
    opinions = {pid: second_opinion(work, atlas[pid], settings.summary_pressure_Pa)
                for pid in FITTED}
    figures = {pid: (predicted_figure(atlas[pid], settings) if pid in predicted
                     else pair_figures(atlas[pid], settings, opinions[pid]))
               for pid in atlas}
    selection = replace(selection, records={pid: selection.records[pid] for pid in predicted})
    comp_figs = {cid: component_figure(part.components[cid], settings) for cid in ids}
    view, content = generate(settings, part, atlas, figures, comp_figs, opinions=opinions,
                             selection=selection)
    made = {}
    for pid in sorted(atlas):
        task = pair_task(work, pid, settings, predicted=pid in predicted)
        made[pid] = pair_files(task.catalogue, atlas[pid], figures[pid], opinions.get(pid),
                               settings, pid in predicted)
        page = made[pid].page
        assert page == content.files[f"pairs/{pid}.md"].decode("utf-8"), pid
        paths = [path for path, _data in made[pid].files]
        assert paths == list(made[pid].entry.files)
        # The page, a curve and a table per condition, the JSON, the figures.
        assert len(paths) == 1 + 2 * len(atlas[pid].conditions) + 1 + len(figures[pid])
        for path, data in made[pid].files:
            assert data == content.files[path], path
        assert ("Prediction, not fitted data" in page) == (pid in predicted)
        if pid not in predicted:
            assert "Second opinion" in page
    # The entries the workers made, given this atlas's component views, are the main ones
    # (compared as text: a missing value is NaN, and NaN != NaN).
    assert repr(build_views(settings, part, {pid: m.entry for pid, m in made.items()})
                ) == repr(view)
    # And the whole site content is the same, the pairs' files read as bundles when written.
    _again, from_workers = site_content(
        settings, part, {pid: m.entry for pid, m in made.items()}, comp_figs,
        selection=selection, bundles={pid: Bundle("", m.entry.files, lambda m=m: m.files)
                                      for pid, m in made.items()})
    assert from_workers.files == {path: data for path, data in content.files.items()
                                  if not any(path in m.entry.files for m in made.values())}
    assert sorted(from_workers.bundles) == sorted(made)


@pytest.mark.parametrize("name", ["pair.md.j2", "_macros.j2"])
def test_pair_key_follows_the_pair_page_templates(name: str, catalogue: Catalogue,
                                                   monkeypatch: pytest.MonkeyPatch,
                                                   tmp_path: Path) -> None:
    """The worker renders the page, so the pair's cache key covers its templates (and no
    other page's)."""
    settings = load_settings()
    before = cache.pair_key(catalogue, "ethanol--water", settings)
    copy = tmp_path / "templates"
    shutil.copytree(TEMPLATES, copy)
    with (copy / "pages" / name).open("a", encoding="utf-8") as handle:
        handle.write("\n")
    monkeypatch.setattr(cache, "TEMPLATES", copy)
    assert cache.pair_key(catalogue, "ethanol--water", settings) != before
    (copy / "pages" / "index.md.j2").write_text("changed", encoding="utf-8")
    with (copy / "pages" / name).open("r+", encoding="utf-8") as handle:
        text = handle.read()
        handle.seek(0)
        handle.write(text[:-1])
        handle.truncate()
    assert cache.pair_key(catalogue, "ethanol--water", settings) == before
