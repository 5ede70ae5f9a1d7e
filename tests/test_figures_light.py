"""Text and legends drawn without matplotlib's general layout, checked against matplotlib.

Reference: matplotlib itself. :func:`~builder.site.figures_text.draw_text`,
:class:`~builder.site.figures_legend.LightLegend` and
:func:`~builder.site.figures_canvas.plot_line` must write the SVG that matplotlib's own
``Text.draw``, ``Legend`` and ``Axes.plot`` write for the same texts, entries and lines,
byte for byte.
"""

from __future__ import annotations

import itertools

import matplotlib
import numpy as np
import pytest
from matplotlib.backends.backend_svg import FigureCanvasSVG
from matplotlib.figure import Figure as MplFigure
from matplotlib.lines import Line2D
from matplotlib.patches import Patch
from matplotlib.text import Text

from builder.site.figures import STYLE
from builder.site.figures_canvas import plot_line, raw_svg
from builder.site.figures_legend import LightLegend
from builder.site.figures_text import LightText, make_light
from builder.site.svg import _path

ALIGNMENTS = list(itertools.product(("left", "center", "right"),
                                    ("top", "bottom", "center", "baseline", "center_baseline"),
                                    (0, 90, 30), ("default", "anchor")))


def _text_figure(light: bool) -> MplFigure:
    fig = MplFigure(figsize=(4.4, 3.0))
    FigureCanvasSVG(fig)
    ax = fig.subplots()
    ax.plot([0, 1], [0, 1])
    ax.set_title("Txy at 101.325 kPa", loc="left", pad=15)
    ax.set_xlabel("x1 (liquid): mole fraction of água")
    ax.set_ylabel("Temperature / °C")
    kind = LightText if light else Text
    for i, (ha, va, rotation, mode) in enumerate(ALIGNMENTS):
        ax.add_artist(kind(0.05 + 0.03 * (i % 30), 0.1 + 0.08 * (i // 30), f"lp {ha} {va} Ég",
                           ha=ha, va=va, rotation=rotation, rotation_mode=mode, fontsize=7.5,
                           color="#3a444c", fontweight="bold" if i % 4 == 0 else "normal",
                           style="italic" if i % 5 == 0 else "normal", alpha=0.5 if i % 7 == 0
                           else None, transform=ax.transAxes))
    # Drawn by matplotlib either way: two lines, a boxed text, mathematics.
    ax.add_artist(kind(0.5, 0.5, "two\nlines", transform=ax.transAxes))
    ax.add_artist(kind(0.5, 0.6, "boxed", bbox={"fc": "white"}, transform=ax.transAxes))
    ax.add_artist(kind(0.5, 0.7, r"$\gamma_1$ math", transform=ax.transAxes))
    if light:
        make_light(ax)
    return fig


@pytest.mark.parametrize("fonttype", ["none", "path"])
def test_light_text_writes_what_matplotlib_writes(fonttype: str) -> None:
    """Every alignment, rotations 0, 90 and 30 degrees in both rotation modes, bold,
    italic, transparent, titles and axis labels, text kept as text or drawn as outlines:
    the same SVG bytes as matplotlib's."""
    with matplotlib.rc_context({**STYLE, "svg.fonttype": fonttype}):  # type: ignore[arg-type]
        reference = raw_svg(_text_figure(light=False))
        light = raw_svg(_text_figure(light=True))
    assert b"center_baseline" in reference
    assert (b"<text" in reference) == (fonttype == "none")
    assert light == reference


def _handles() -> list[Line2D | Patch]:
    return [Line2D([], [], color="#0b4f8a", marker="o", label="bubble line (liquid x1)"),
            Line2D([], [], color="#c2410c", marker="s", markerfacecolor="white",
                   label="dew line (vapour y1)"),
            Line2D([], [], color="#4b4b4b", linewidth=3.2, label="three-phase line"),
            Line2D([], [], marker="*", markersize=11, color="black", linestyle="none",
                   label="azeotrope x1 = 0.894, 78.2 °C"),
            Patch(color="#e8f0f7", label="validity range"),
            Line2D([], [], color="grey", linestyle=(0, (4.0, 2.2)), linewidth=1.4,
                   label="extrapolated (dashed)"),
            Line2D([], [], color="black", linewidth=0.9, linestyle=(0, (1, 2)),
                   label="α12 = 1 (azeotrope), ln γ")]


@pytest.mark.parametrize("count, ncol, where", [(7, 2, "axes"), (5, 3, "axes"), (1, 2, "axes"),
                                                (6, 4, "figure"), (3, 4, "figure")])
def test_light_legend_writes_what_matplotlibs_legend_writes(count: int, ncol: int,
                                                            where: str) -> None:
    """The atlas's legends (under the axes from its upper left corner, or along the
    figure's foot from its lower left corner; lines with and without markers, a marker
    alone, a patch, dashes; columns filled unevenly): the same SVG bytes as
    matplotlib's legend with the same settings."""

    def draw(light: bool) -> bytes:
        fig = MplFigure(figsize=(4.4, 3.8))
        FigureCanvasSVG(fig)
        ax = fig.subplots()
        fig.subplots_adjust(bottom=0.3)
        ax.plot(np.linspace(0, 1, 5), np.linspace(0, 1, 5) ** 2)
        handles = _handles()[:count]
        if where == "axes":
            options = {"loc": "upper left", "ncol": ncol, "handlelength": 2.4,
                       "columnspacing": 1.4, "fontsize": 7.5}
            if light:
                ax.add_artist(LightLegend(handles, anchor=(-0.1, -0.2),
                                          transform=ax.transAxes, border_pad=0.0, **options))
            else:
                ax.legend(handles=handles, bbox_to_anchor=(-0.1, -0.2), frameon=False,
                          borderaxespad=0.0, **options)
        else:
            if light:
                fig.add_artist(LightLegend(handles, anchor=(0.06, 0.0),
                                           transform=fig.transFigure, loc="lower left",
                                           ncol=ncol))
            else:
                fig.legend(handles=handles, bbox_to_anchor=(0.06, 0.0), frameon=False,
                           loc="lower left", ncol=ncol)
        return raw_svg(fig)

    with matplotlib.rc_context(STYLE):  # type: ignore[arg-type]
        reference, light = draw(light=False), draw(light=True)
    assert b"<text" in reference and b"legend" in reference
    assert light == reference


def test_plot_line_draws_what_plot_draws() -> None:
    """Lines added by ``plot_line`` (solid, dashed, markers every few points, a gap of
    missing values, limits left to follow the data): the same SVG as ``Axes.plot``
    (reference: matplotlib)."""

    def draw(fast: bool) -> bytes:
        fig = MplFigure(figsize=(4.4, 3.0))
        FigureCanvasSVG(fig)
        ax = fig.subplots()
        x = np.linspace(0.0, 1.0, 41)
        y = 60 + 40 * x**2
        y[20:23] = np.nan
        lines = [((x, y), {"color": "#0b4f8a", "marker": "o", "markevery": [0, 10, 30]}),
                 ((x, y + 5), {"color": "#c2410c", "linestyle": (0, (4.0, 2.2)),
                               "linewidth": 1.6, "zorder": 3}),
                 (([0.2], [70.0]), {"marker": "*", "markersize": 12, "color": "black",
                                    "linestyle": "none", "zorder": 7})]
        for (xs, ys), style in lines:
            if fast:
                plot_line(ax, xs, ys, **style)
            else:
                ax.plot(xs, ys, **style)
        return raw_svg(fig)

    with matplotlib.rc_context(STYLE):  # type: ignore[arg-type]
        reference, fast = draw(fast=False), draw(fast=True)
    assert reference.count(b"<path") >= 3
    assert fast == reference


def test_compact_reads_a_path_the_same_with_or_without_spaces() -> None:
    """A path as matplotlib writes it (numbers and commands separated by spaces, read by
    splitting) and the same path run together (read by the general tokenizer): the same
    compact path, curves, closing and exponents included."""
    spaced = ("M 0 0 \nL 1.26 3.4 \nL 2.000001 5 \nL 3 7.05 \nC 1 2 3 4 5 6 \nQ 1 1 2 2 \n"
              "L 1e-05 -2.5e-01 \nz \nM 10 10 \nL 20 20 \nL 30 30.04")
    joined = ("M0 0L1.26 3.4L2.000001 5L3 7.05C1 2 3 4 5 6Q1 1 2 2L1e-05-2.5e-01z"
              "M10 10L20 20L30 30.04")
    assert _path(spaced) == _path(joined)
    assert _path(spaced).startswith("M0 0L1.3 3.4")
    assert "M10 10L30 30" in _path(spaced)  # a straight run keeps its ends only


def test_compact_keeps_a_line_after_a_curve_a_line() -> None:
    """A rounded box (lines between quarter curves, as matplotlib draws the box behind the
    "extrapolated" label) stays one closed outline: a line after a curve is not turned
    into a move, which would break the box's fill into slivers."""
    box = ("M 207.888 141.318648 \nL 255.907922 141.318648 \n"
           "Q 257.032922 141.318648 257.032922 140.193648 \nL 257.032922 132.693062 \n"
           "Q 257.032922 131.568062 255.907922 131.568062 \nL 207.888 131.568062 \nz")
    assert _path(box) == ("M207.9 141.3L255.9 141.3Q257 141.3 257 140.2L257 132.7"
                          "Q257 131.6 255.9 131.6L207.9 131.6z")
