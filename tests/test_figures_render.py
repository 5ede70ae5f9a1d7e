"""Writing figures quickly without changing them.

References: matplotlib itself (its ``savefig`` SVG and its own tick placement are what the
fast path must reproduce), the project's contract that a build is byte-for-byte
deterministic (a kept figure draws what a fresh one draws), and common practice for
polyline thinning (Ramer-Douglas-Peucker: no dropped point farther than the tolerance).
"""

from __future__ import annotations

import io
import itertools
import math
import xml.etree.ElementTree as ElementTree
from dataclasses import replace

import matplotlib
import numpy as np
import pytest
from matplotlib.backends.backend_svg import FigureCanvasSVG
from matplotlib.figure import Figure as MplFigure

from builder.analysis.results import PairResults, compute_pair
from builder.catalogue.loader import Catalogue
from builder.catalogue.predictive import predicted_pair
from builder.site import figures, predicted_figures
from builder.site.figures import STYLE, pair_figures
from builder.site.figures_axes import light_axes
from builder.site.figures_canvas import Kept, raw_svg
from builder.site.predicted_figures import predicted_figure
from builder.site.settings import SiteSettings
from builder.site.svg import TOLERANCE_PT, _simplify

SVG = "{http://www.w3.org/2000/svg}"
#: A three-phase line and isotherms (water--1-butanol), an azeotrope traced over pressure
#: (ethanol--water), a wide relative volatility drawn on a log axis (acetone--water).
FITTED = ("water--1-butanol", "ethanol--water", "acetone--water")


def _sample_figure() -> MplFigure:
    fig = MplFigure(figsize=(4.4, 3.0))
    FigureCanvasSVG(fig)
    left, right = fig.subplots(1, 2)
    x = np.linspace(0.0, 1.0, 51)
    left.plot(x, 60 + 40 * x**2, marker="o", markevery=10, label="bubble & <dew>")
    left.set_xlabel("x1: mole fraction")
    left.set_ylabel("Temperature / °C")
    left.set_title("Txy at 101.325 kPa", loc="left")
    left.legend()
    right.plot(10 ** (3 * x), x)
    right.set_xscale("log")
    right.set_xlabel("Pressure / kPa")
    return fig


def _savefig(fig: MplFigure) -> bytes:
    buffer = io.BytesIO()
    fig.savefig(buffer, format="svg", metadata={"Date": None, "Creator": None})
    return buffer.getvalue()


def _texts(svg: bytes) -> list[tuple[str, float, float]]:
    tree = ElementTree.fromstring(svg)
    out = []
    for t in tree.iter(f"{SVG}text"):
        out.append(("".join(t.itertext()), float(t.get("x", "nan")), float(t.get("y", "nan"))))
    return out


def test_svg_writer_writes_what_savefig_writes() -> None:
    """matplotlib's savefig: the same bytes, twice (text sizes kept between figures)."""
    with matplotlib.rc_context(STYLE):  # type: ignore[arg-type]
        for _ in range(2):
            fig = _sample_figure()
            assert raw_svg(fig) == _savefig(fig)


def test_light_axes_draw_matplotlibs_ticks_and_keep_the_axis_labels_in_place() -> None:
    """The tick labels matplotlib would draw (linear and log axes, minor labels
    included), at the same places, and the axis labels where matplotlib puts them
    beside the tick labels (within 0.15 pt)."""
    with matplotlib.rc_context(STYLE):  # type: ignore[arg-type]
        fig = _sample_figure()
        right = fig.axes[1]
        figures._plain_log(right.xaxis)
        reference = _texts(_savefig(fig))
        for ax in fig.axes:
            light_axes(ax)
        light = _texts(raw_svg(fig))
    assert sorted(t for t, _, _ in light) == sorted(t for t, _, _ in reference)
    for (text, x, y), (_, rx, ry) in zip(sorted(light), sorted(reference), strict=True):
        assert abs(x - rx) <= 0.15 and abs(y - ry) <= 0.15, (text, (x, y), (rx, ry))


@pytest.fixture(scope="module")
def drawn(catalogue: Catalogue) -> tuple[list[PairResults], list[PairResults]]:
    fitted = [compute_pair(catalogue, catalogue.pairs[pid]) for pid in FITTED]
    predicted = []
    for a, b in (("acetone", "toluene"), ("n-heptane", "water")):
        record = predicted_pair(catalogue.components[a], catalogue.components[b])
        work = replace(catalogue, pairs={**catalogue.pairs, record.id: record})
        predicted.append(compute_pair(work, record))
    return fitted, predicted


def test_kept_figures_draw_the_same_bytes_as_fresh_ones(
        drawn: tuple[list[PairResults], list[PairResults]],
        monkeypatch: pytest.MonkeyPatch) -> None:
    """Figures drawn one after another on kept figures (in reverse order, so that each
    kept figure held another pair's drawing, log axes and equal aspect included) are the
    same, byte for byte, as each drawn on fresh figures."""
    fitted, predicted = drawn
    settings = SiteSettings()
    kept = {r.pair.id: pair_figures(r, settings) for r in reversed(fitted)}
    kept |= {r.pair.id: predicted_figure(r, settings) for r in reversed(predicted)}
    for r in fitted + predicted:
        monkeypatch.setattr(figures, "_KEPT", Kept())
        monkeypatch.setattr(predicted_figures, "_KEPT", Kept())
        fresh = (pair_figures(r, settings) if r in fitted else predicted_figure(r, settings))
        assert [f.path for f in fresh] == [f.path for f in kept[r.pair.id]]
        for new, old in zip(fresh, kept[r.pair.id], strict=True):
            assert new.svg == old.svg, new.path
    assert any(b"<use" in f.svg for f in kept["acetone--water"])  # tick marks as markers
    assert len(predicted_figure(predicted[0], settings)[0].svg) < 15_000


def test_thinned_polyline_stays_within_the_tolerance() -> None:
    """No dropped point is farther than the tolerance from the kept polyline, also on a
    long gentle arc where dropping point by point would let the error add up."""
    radius = 2000.0
    arc = [(radius * math.sin(t), radius * (1 - math.cos(t)))
           for t in np.linspace(0.0, 0.2, 400)]
    wiggle = [(x, 3.0 * math.sin(x / 7.0)) for x in np.linspace(0.0, 300.0, 500)]
    for points in (arc, wiggle):
        kept = _simplify(points)
        assert 2 <= len(kept) < len(points)
        assert kept[0] == points[0] and kept[-1] == points[-1]
        segments = list(itertools.pairwise(kept))
        for px, py in points:
            best = math.inf
            for (ax, ay), (bx, by) in segments:
                dx, dy = bx - ax, by - ay
                t = max(0.0, min(1.0, ((px - ax) * dx + (py - ay) * dy) / (dx * dx + dy * dy)))
                best = min(best, math.hypot(px - ax - t * dx, py - ay - t * dy))
            assert best <= TOLERANCE_PT + 1e-9
