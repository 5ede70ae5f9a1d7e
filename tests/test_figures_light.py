"""Text and legends drawn without matplotlib's general layout, checked against matplotlib.

Reference: matplotlib itself. :func:`~builder.site.figures_text.draw_text` and
:class:`~builder.site.figures_legend.LightLegend` must write the SVG that matplotlib's
own ``Text.draw`` and ``Legend`` write for the same texts and entries, byte for byte.
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
from builder.site.figures_canvas import raw_svg
from builder.site.figures_legend import LightLegend
from builder.site.figures_text import LightText, make_light

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


def test_light_text_writes_what_matplotlib_writes() -> None:
    """Every alignment, rotations 0, 90 and 30 degrees in both rotation modes, bold,
    italic, transparent, titles and axis labels: the same SVG bytes as matplotlib's."""
    with matplotlib.rc_context(STYLE):  # type: ignore[arg-type]
        reference = raw_svg(_text_figure(light=False))
        light = raw_svg(_text_figure(light=True))
    assert b"center_baseline" in reference
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
