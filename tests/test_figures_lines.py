"""Lines drawn directly (:mod:`builder.site.figures_lines`) and the quicker SVG writer and
marker writing of :mod:`builder.site.figures_canvas`.

Reference: matplotlib itself.  A line drawn by :func:`draw_line` must give the SVG that
:meth:`Line2D.draw` gives (the same bytes), and the renderer's writer and markers the
SVG that matplotlib's ``savefig`` writes.
"""

from __future__ import annotations

import io
from typing import Any

import matplotlib
import numpy as np
import pytest
from matplotlib.backends.backend_svg import FigureCanvasSVG, _XMLWriter
from matplotlib.figure import Figure as MplFigure
from matplotlib.lines import Line2D

from builder.site.figures import STYLE
from builder.site.figures_canvas import _Writer, raw_svg
from builder.site.figures_lines import LightLine

#: Lines of every kind the atlas draws and some it does not: solid, dashed and dotted,
#: markers (every point, every few points, open, half filled, with an edge colour left
#: to follow the face), a gap of missing values, transparency, clipping off, a line
#: reaching outside the axes and the figure, and a line with a link (drawn by
#: matplotlib's own code).
_X = np.linspace(-0.2, 1.3, 61)
_Y = 60 + 40 * _X**2
_Y_GAP = _Y.copy()
_Y_GAP[20:23] = np.nan
LINES: list[tuple[tuple[Any, Any], dict[str, Any]]] = [
    ((_X, _Y_GAP), {"color": "#0b4f8a", "linewidth": 1.6, "solid_capstyle": "butt"}),
    ((_X, _Y + 5), {"color": "#c2410c", "linestyle": (0, (4.0, 2.2)), "linewidth": 1.6}),
    ((_X, _Y - 5), {"color": "#5b6770", "linestyle": (0, (1, 2)), "linewidth": 0.9,
                    "alpha": 0.6}),
    ((_X[::6], _Y[::6]), {"color": "#0b4f8a", "marker": "o", "linestyle": "none",
                          "markeredgewidth": 1.1}),
    ((_X[::6], _Y[::6] + 8), {"color": "#c2410c", "marker": "s", "linestyle": "none",
                              "markerfacecolor": "white", "markeredgewidth": 1.1}),
    ((_X, _Y + 12), {"color": "#009E73", "marker": "^", "markevery": [0, 10, 30]}),
    (([0.4], [70.0]), {"marker": "*", "markersize": 12, "color": "black",
                       "markeredgecolor": "white", "markeredgewidth": 0.6,
                       "linestyle": "none"}),
    (([0.6], [80.0]), {"marker": "o", "fillstyle": "left", "color": "#CC79A7",
                       "markerfacecoloralt": "#E69F00", "linestyle": "none"}),
    (([0.1, 0.9], [75.0, 75.0]), {"color": "#4b4b4b", "linewidth": 3.2, "clip_on": False,
                                  "solid_capstyle": "butt"}),
    ((_X, _Y + 20), {"color": "#56B4E9", "marker": "D", "alpha": 0.5,
                     "markerfacecolor": (1.0, 0.0, 0.0, 0.3)}),
    ((_X, _Y + 25), {"color": "black", "url": "https://example.invalid/line"}),
]


def _draw(kind: type[Line2D], log: bool) -> bytes:
    fig = MplFigure(figsize=(4.4, 3.0))
    FigureCanvasSVG(fig)
    ax = fig.subplots()
    for (x, y), style in LINES:
        ax.add_line(kind(x, y, **style))
    ax.set_xlim(0.0, 1.0)
    ax.set_ylim(55.0, 130.0)
    if log:
        ax.set_yscale("log")
    # A line in axes coordinates beyond the figure's edge: markers clipped by the page.
    ax.add_line(kind([0.5, 1.5], [0.5, 0.5], transform=ax.transAxes, marker="o",
                     clip_on=False))
    return raw_svg(fig)


@pytest.mark.parametrize("log", [False, True])
def test_light_line_writes_what_matplotlibs_line_writes(log: bool) -> None:
    """Every line of :data:`LINES` on linear and logarithmic axes: the same SVG, byte for
    byte, as matplotlib's :meth:`Line2D.draw` (reference: matplotlib)."""
    with matplotlib.rc_context(STYLE):  # type: ignore[arg-type]
        reference, light = _draw(Line2D, log), _draw(LightLine, log)
    assert reference.count(b"<path") >= 10 and reference.count(b"<use") > 40
    assert b"<a " in reference  # the linked line is drawn by matplotlib's code
    assert light == reference


def test_figure_with_markers_off_the_page_writes_what_savefig_writes() -> None:
    """Markers partly beyond the figure's edge (matplotlib clips their positions to the
    page): the renderer of :mod:`.figures_canvas` writes what ``savefig`` writes
    (reference: matplotlib)."""
    with matplotlib.rc_context(STYLE):  # type: ignore[arg-type]
        fig = MplFigure(figsize=(4.4, 3.0))
        FigureCanvasSVG(fig)
        ax = fig.subplots()
        ax.plot([0.2, 0.5, 1.4, 2.5, np.nan, 0.7], [0.5, 0.5, 0.5, 1.7, 0.2, 0.3],
                marker="o", transform=ax.transAxes, clip_on=False)
        ax.plot([0.1, 0.3], [0.2, 0.4], marker="s", markerfacecolor="white")
        buffer = io.BytesIO()
        fig.savefig(buffer, format="svg", metadata={"Date": None, "Creator": None})
        assert raw_svg(fig) == buffer.getvalue()


def test_writer_writes_what_matplotlibs_writer_writes() -> None:
    """Elements with attributes that need escaping and quoting, empty values, nested
    elements, text and the many-elements call: the same text as matplotlib's SVG writer
    (reference: matplotlib's ``_XMLWriter``)."""

    def write(writer: _XMLWriter, many: bool) -> None:
        writer.start("svg", width="10pt", height="")
        writer.start("g", id="a&b", style='font-family: "x" \'y\'')
        writer.element("text", "1 < 2 & 3", x="1", y="2")
        writer.element("path", d="M 0 0 L 1 1", style="")
        if many:
            assert isinstance(writer, _Writer)
            writer.empty_elements("use", [' xlink:href="#m" x="1" y="2"',
                                          ' xlink:href="#m" x="3" y="4"'])
        else:
            writer.element("use", attrib={"xlink:href": "#m", "x": "1", "y": "2"})
            writer.element("use", attrib={"xlink:href": "#m", "x": "3", "y": "4"})
        writer.start("defs")
        writer.end("defs")
        writer.end("g")
        writer.data("tail")
        writer.end("svg")

    reference, fast = io.StringIO(), io.StringIO()
    write(_XMLWriter(reference), many=False)
    write(_Writer(fast), many=True)
    assert "&amp;" in reference.getvalue() and "&lt;" in reference.getvalue()
    assert fast.getvalue() == reference.getvalue()
