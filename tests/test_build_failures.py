"""A pair whose computation raises does not stop ``atlas build``.

A failed fitted pair is withheld (a notice page, the index, a warning; a strict build
fails with a message a user can act on), a failed predicted pair is listed among the
combinations without a page, and a failure is never cached: the next build retries it.
Reference: the project's own contract (issue 9: one misbehaving pair must not stop a
full atlas); the failure is made by construction, replacing the worker's
``compute_pair`` for two pair ids (one fitted, one predicted) in a build that runs its
work in-process (``workers=1``).
"""

from __future__ import annotations

import html
from collections.abc import Iterator
from pathlib import Path
from typing import Any

import pytest

from builder.catalogue.loader import load_catalogue
from builder.site import work
from builder.site.build import BuildFailure, BuildReport, build_site
from builder.site.predicted import select_predicted
from builder.site.settings import load_settings
from tests.test_build_pipeline import small_catalogue

pytest.importorskip("material", reason="the site extra is not installed: pip install -e '.[site]'")

FITTED = "ethanol--water"
#: A combination the shipped settings predict among the small catalogue's components.
PREDICTED = "acetone--water"
MESSAGE = "overflow in the bubble-point solver (made to fail by the test)"
REAL_COMPUTE_PAIR = work.compute_pair


def failing(pair_ids: set[str]) -> Any:
    """The worker's ``compute_pair``, raising for ``pair_ids``."""
    def compute_pair(catalogue: Any, pair: Any) -> Any:
        if pair.id in pair_ids:
            raise FloatingPointError(MESSAGE)
        return REAL_COMPUTE_PAIR(catalogue, pair)

    return compute_pair


@pytest.fixture(scope="module")
def builds(tmp_path_factory: pytest.TempPathFactory) -> Iterator[dict[str, Any]]:
    """In order, with one private cache: a build where both pairs fail; a strict build
    where they fail again (the fitted failure stops it); a strict build where only the
    prediction fails; and a build where nothing fails."""
    root = tmp_path_factory.mktemp("failures")
    catalogue = small_catalogue(root)
    cache = root / "cache"
    out: dict[str, Any] = {"site": root / "site", "catalogue": catalogue}

    def build(target: Path, strict: bool = False) -> BuildReport:
        return build_site(catalogue, target, strict=strict, workers=1, cache_dir=cache,
                          quiet_progress=True)

    with pytest.MonkeyPatch.context() as patch:
        patch.setattr(work, "compute_pair", failing({FITTED, PREDICTED}))
        out["failing"] = build(out["site"])
        # Read as text: the pages escape catalogue and error text (":" as "&#58;" etc.).
        out["failing_pages"] = {name: html.unescape((out["site"] / name).read_text("utf-8"))
                                for name in ("index.html", "unpredictable.html",
                                             f"pairs/{FITTED}.html", "components/water.html")}
        with pytest.raises(BuildFailure) as error:
            build(root / "strict", strict=True)
        out["strict_error"] = str(error.value)
        patch.setattr(work, "compute_pair", failing({PREDICTED}))
        out["strict_predicted"] = build(root / "strict", strict=True)
    out["again"] = build(out["site"])
    yield out


def test_failed_pairs_do_not_stop_the_build(builds: dict[str, Any]) -> None:
    report = builds["failing"]
    assert sorted(report.failed) == [PREDICTED, FITTED]
    assert report.failed[FITTED].error_type == "FloatingPointError"
    assert report.failed[FITTED].where.startswith("tests/test_build_failures.py:")
    reason = f"the computation failed: FloatingPointError: {MESSAGE}"
    assert report.withheld == {FITTED: [reason]}
    # acetone--chloroform and the combinations the shipped settings predict among the four
    # components, but the one that failed (acetone--water)
    predicted = select_predicted(load_catalogue(builds["catalogue"]),
                                 load_settings().predicted_pairs).records
    assert PREDICTED in predicted and FITTED not in predicted
    assert report.pairs == 1 + len(predicted) - 1
    assert [w for w in report.warnings if FITTED in w] == [
        f"{FITTED}: {reason} (at {report.failed[FITTED].where}); the pair is withheld from "
        "this build"]
    summary = report.summary()
    assert f"Not published (the computation failed): {FITTED}." in summary
    assert ("2 pair computation(s) failed: 1 predicted (listed as combinations without a "
            "page), 1 fitted (withheld).") in summary
    assert "Not published (failed checks" not in summary


def test_failed_fitted_pair_has_a_withheld_notice(builds: dict[str, Any]) -> None:
    pages = builds["failing_pages"]
    notice = pages[f"pairs/{FITTED}.html"]
    assert "Withheld from this build: the computation of this pair failed" in notice
    assert MESSAGE in notice
    # No numbers, no figures.
    assert 'class="atlas-summary' not in notice and 'class="atlas-figure' not in notice
    index = pages["index.html"]
    assert "Withheld from this build" in index
    assert f'href="pairs/{FITTED}.html"' in index
    assert "withheld in this build: the computation failed" in pages["components/water.html"]


def test_failed_prediction_is_listed_without_a_page(builds: dict[str, Any]) -> None:
    site = builds["site"]
    listing = builds["failing_pages"]["unpredictable.html"]
    assert f"the computation failed: FloatingPointError: {MESSAGE}" in listing
    row = listing[listing.index('href="components/acetone.html"'):]
    assert row.index('href="components/water.html"') < row.index("the computation failed")
    assert "withheld" not in listing
    # The next build computed it: the failure was not cached.
    assert (site / "pairs" / f"{PREDICTED}.html").is_file()


def test_strict_build_fails_on_a_failed_fitted_pair_only(builds: dict[str, Any]) -> None:
    error = builds["strict_error"]
    assert error.startswith("the computation of 1 fitted pair(s) failed, and a strict build "
                            "publishes every fitted pair:")
    assert (f"pairs/binaries/{FITTED}.yaml: entry '{FITTED}': the computation failed: "
            f"FloatingPointError: {MESSAGE}") in error
    assert "Traceback" not in error and "build without --strict" in error
    report = builds["strict_predicted"]
    assert list(report.failed) == [PREDICTED] and report.withheld == {}


def test_failures_are_not_cached(builds: dict[str, Any]) -> None:
    # The strict builds recomputed the fitted pair (it failed again, then passed and was
    # stored); the last build computes the prediction that failed every time before.
    again = builds["again"]
    assert again.failed == {} and again.withheld == {}
    assert again.computed == 1
    page = (builds["site"] / "pairs" / f"{FITTED}.html").read_text(encoding="utf-8")
    assert "Withheld" not in page and 'class="atlas-summary' in page
    assert "Withheld from this build" not in (builds["site"] / "index.html").read_text("utf-8")
