"""Ticks, tick labels and grid of a figure's axes drawn as a few artists.

matplotlib draws every tick as an object of its own (a tick mark, a grid line
and a label, each a separate artist with its own transform and style), which
is most of the time an atlas figure takes.  :func:`light_axes` asks the axes'
own locators and formatters where the ticks go and what they say, then draws
the same marks with one line of tick markers per axis and kind, one grid line
(its segments separated by gaps) and one text per label, and turns the
matplotlib ticks off.  The axis labels keep their place beside the tick
labels (their padding grows by what the tick labels took).

Positions, sizes and styles come from the same settings as matplotlib's own
ticks (``xtick.major.size``, ``xtick.major.pad``, ``grid.color``, ...), so a
figure looks the same; its SVG is smaller (a tick mark is one ``<use>``).  The
marks and grid lines are drawn by :func:`~builder.site.figures_lines.draw_line`.
"""

from __future__ import annotations

from collections.abc import Callable
from functools import lru_cache
from typing import Any, cast

import matplotlib as mpl
import numpy as np
from matplotlib.artist import Artist
from matplotlib.axes import Axes
from matplotlib.axis import Axis
from matplotlib.font_manager import FontProperties, findfont, get_font
from matplotlib.lines import Line2D
from matplotlib.markers import TICKDOWN, TICKLEFT
from matplotlib.text import Text
from matplotlib.textpath import TextToPath
from matplotlib.ticker import NullLocator
from matplotlib.transforms import ScaledTranslation

from builder.site.figures_lines import LightLine, clip_to_axes
from builder.site.figures_text import draw_text

__all__ = ["light_axes", "text_size_pt"]

_TEXT = TextToPath()


@lru_cache(maxsize=4096)
def _text_size(text: str, size_pt: float, family: tuple[str, ...]) -> tuple[float, float]:
    """Width and height of a text's box as matplotlib lays it out: the height is at least
    the font's own ascent and descent (its OS/2 table), as in ``Text._get_layout``."""
    prop = FontProperties(family=list(family), size=size_pt)
    width, height, descent = _TEXT.get_text_width_height_descent(text, prop, ismath=False)
    ascent = height - descent
    font = get_font(findfont(prop))
    table: Any = font.get_sfnt_table("OS/2") or font.get_sfnt_table("hhea")
    head: Any = font.get_sfnt_table("head")
    if table is not None and head is not None:
        scale = size_pt / head["unitsPerEm"]
        up, down = (("sTypoAscender", "sTypoDescender") if "sTypoAscender" in table
                    else ("ascent", "descent"))
        ascent = max(ascent, table[up] * scale)
        descent = max(descent, -table[down] * scale)
    return float(width), float(ascent + descent)


def text_size_pt(text: str, size_pt: float) -> tuple[float, float]:
    """Width and height (points) of one line of text in the current sans-serif face."""
    family = (str(mpl.rcParams["font.family"][0]),)
    return _text_size(text, float(size_pt), family)


#: One group of tick labels: the text that draws them and their places and words.
_Group = tuple[Text, list[tuple[float, float, str]]]


class _AxisArtists(Artist):
    """An axis' tick marks, grid and tick labels drawn together, in the order given: one
    artist on the axes instead of several (adding an artist to axes costs more than
    making it).  Each group of labels is drawn with one text whose words and place change
    from label to label (making a text costs more than drawing it)."""

    def __init__(self, ax: Axes, parts: list[Line2D | _Group]) -> None:
        super().__init__()
        self._parts = parts
        self.set_zorder(1.5)
        for part in parts:
            artist = part if isinstance(part, Line2D) else part[0]
            artist.set_figure(ax.figure)
            artist.axes = ax

    def get_children(self) -> list[Artist]:
        return [part if isinstance(part, Line2D) else part[0] for part in self._parts]

    def draw(self, renderer: Any) -> None:
        if not self.get_visible():
            return
        for part in self._parts:
            if isinstance(part, Line2D):
                part.draw(renderer)
                continue
            text, labels = part
            for x, y, label in labels:
                text.set_text(label)
                text.set_position((x, y))
                draw_text(text, renderer)


def _ticks(axis: Axis, minor: bool) -> tuple[list[float], list[str]]:
    """The tick positions inside the view and their labels, as matplotlib would draw them."""
    locs = np.asarray(axis.get_minorticklocs() if minor else axis.get_majorticklocs(),
                      dtype=float)
    formatter = axis.get_minor_formatter() if minor else axis.get_major_formatter()
    labels = formatter.format_ticks(list(locs))
    lo, hi = sorted(axis.get_view_interval())
    to_screen = axis.get_transform()
    screen_lo, screen_hi = to_screen.transform([lo, hi])
    low, high = min(screen_lo, screen_hi), max(screen_lo, screen_hi)
    slack = 1e-10 * (high - low)  # as matplotlib: ticks on the limits are drawn
    screen = to_screen.transform(locs) if locs.size else locs
    inside = (screen >= low - slack) & (screen <= high + slack)
    return ([float(v) for v in locs[inside]],
            [label for label, keep in zip(labels, inside, strict=True) if keep])


def _draw_axis(ax: Axes, axis: Axis, which: str) -> Callable[[], None]:
    """Tick marks, labels and grid of one axis (``which``: "x" or "y")."""
    rc: Any = mpl.rcParams
    label_size = FontProperties(size=rc[f"{which}tick.labelsize"]).get_size_in_points()
    colour = rc[f"{which}tick.color"]
    label_colour = rc[f"{which}tick.labelcolor"]
    if label_colour == "inherit":
        label_colour = colour
    reach = 0.0  # how far the tick labels reach from the axes (points)
    parts: list[Line2D | _Group] = []  # drawn in this order
    groups: list[_Group] = []  # drawn after the marks and grid
    for minor in (False, True):
        if minor and isinstance(axis.get_minor_locator(), NullLocator):
            continue  # a linear axis: no minor ticks (and no need to ask)
        locs, labels = _ticks(axis, minor)
        if not locs:
            continue
        kind = "minor" if minor else "major"
        size = float(rc[f"{which}tick.{kind}.size"])
        pad = float(rc[f"{which}tick.{kind}.pad"]) + size
        # The axes' edge ("grid" transform) is where the spines sit (never moved here);
        # asking for the spine's own transform would make matplotlib's ticks after all.
        edge = ax.get_xaxis_transform("grid") if which == "x" else \
            ax.get_yaxis_transform("grid")
        if which == "x":
            marks = LightLine(locs, [0.0] * len(locs), transform=edge, marker=cast(Any, TICKDOWN),
                           linestyle="none")
            text_transform = edge + ScaledTranslation(0, -pad / 72, ax.figure.dpi_scale_trans)
            va, ha = "top", rc["xtick.alignment"]
        else:
            marks = LightLine([0.0] * len(locs), locs, transform=edge, marker=cast(Any, TICKLEFT),
                           linestyle="none")
            text_transform = edge + ScaledTranslation(-pad / 72, 0, ax.figure.dpi_scale_trans)
            va, ha = rc["ytick.alignment"], "right"
        marks.set(color=colour, markersize=size,
                  markeredgewidth=float(rc[f"{which}tick.{kind}.width"]), clip_on=False,
                  zorder=1.5)
        parts.append(marks)
        placed: list[tuple[float, float, str]] = []
        for loc, label in zip(locs, labels, strict=True):
            if not label:
                continue
            placed.append((loc, 0.0, label) if which == "x" else (0.0, loc, label))
            width, height = text_size_pt(label, label_size)
            reach = max(reach, pad + (height if which == "x" else width))
        if placed:
            groups.append((Text(0.0, 0.0, "", transform=text_transform, va=va, ha=ha,
                                fontsize=label_size, color=label_colour, clip_on=False),
                           placed))
        if not minor and rc["axes.grid"] and rc["axes.grid.which"] in ("major", "both") \
                and rc["axes.grid.axis"] in ("both", which):
            nan = float("nan")
            along = [v for loc in locs for v in (loc, loc, nan)]
            across = [v for _ in locs for v in (0.0, 1.0, nan)]
            grid = LightLine(along, across, transform=edge) if which == "x" else \
                LightLine(across, along, transform=edge)
            grid.set(color=rc["grid.color"], linewidth=float(rc["grid.linewidth"]),
                     linestyle=rc["grid.linestyle"], alpha=rc["grid.alpha"], zorder=1.5)
            clip_to_axes(grid, ax)  # inside the axes, as added to them
            parts.append(grid)
    offset = axis.get_major_formatter().get_offset()
    if offset:
        if which == "x":
            groups.append((Text(0.0, 0.0, "", va="top", ha="right", fontsize=label_size,
                                color=label_colour, clip_on=False, transform=ax.transAxes
                                + ScaledTranslation(0, -(reach + 2) / 72,
                                                    ax.figure.dpi_scale_trans)),
                           [(1.0, 0.0, offset)]))
        else:
            groups.append((Text(0.0, 0.0, "", va="bottom", ha="left", fontsize=label_size,
                                color=label_colour, clip_on=False, transform=ax.transAxes
                                + ScaledTranslation(0, 2 / 72, ax.figure.dpi_scale_trans)),
                           [(0.0, 1.0, offset)]))
    parts += groups
    if parts:
        ax.add_artist(_AxisArtists(ax, parts))
    major, minor_locator = axis.get_major_locator(), axis.get_minor_locator()
    axis.set_major_locator(NullLocator())
    axis.set_minor_locator(NullLocator())
    axis.labelpad = float(rc["axes.labelpad"]) + reach

    def restore() -> None:
        axis.set_major_locator(major)
        axis.set_minor_locator(minor_locator)

    return restore


def light_axes(ax: Axes) -> Callable[[], None]:
    """Replace the matplotlib ticks and grid of ``ax`` by :mod:`this module's <.figures_axes>`
    few artists (call once, after the axes' limits and scales are final); returns what puts
    the axes' tick locators back after the figure is written."""
    ax.get_xlim()  # settles any pending autoscaling before the ticks are read
    ax.get_ylim()
    restore_x = _draw_axis(ax, ax.xaxis, "x")
    restore_y = _draw_axis(ax, ax.yaxis, "y")

    def restore() -> None:
        restore_x()
        restore_y()

    return restore
