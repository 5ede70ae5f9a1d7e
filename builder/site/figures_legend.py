"""A figure legend laid out in a few lines of arithmetic instead of matplotlib's boxes.

matplotlib builds a legend as a tree of boxes (a packer of columns, each a
packer of entries, each a packer of a drawing area and a text area) and lays the
tree out again every time it is drawn; in an atlas figure that is a quarter of
the time.  :class:`LightLegend` places the same entries at the same places
(within a hundredth of a point, tested against matplotlib's own legend) with the
arithmetic those boxes do for the atlas's legends: entries filled column by
column, each a handle (a line with its marker in the middle, or a patch) and
its label on a shared baseline, no frame and no title.  Its texts are drawn by
:func:`~builder.site.figures_text.draw_text`, its line samples by
:func:`~builder.site.figures_lines.draw_line`.

The settings are matplotlib's (``legend.handlelength``, ``legend.labelspacing``,
...) and are read when the legend is made, as matplotlib's legend reads them.
"""

from __future__ import annotations

from collections.abc import Sequence
from typing import Any

import matplotlib as mpl
import numpy as np
from matplotlib.artist import Artist
from matplotlib.font_manager import FontProperties
from matplotlib.lines import Line2D
from matplotlib.patches import Patch, Rectangle
from matplotlib.text import Text
from matplotlib.transforms import IdentityTransform, Transform

from builder.site.figures_lines import LightLine
from builder.site.figures_text import draw_text, line_metrics

__all__ = ["LightLegend"]

#: Where the legend's corner sits on its anchor point: (x, y) fractions of its size.
_CORNERS = {"upper left": (0.0, 1.0), "lower left": (0.0, 0.0), "upper right": (1.0, 1.0),
            "lower right": (1.0, 0.0)}


class LightLegend(Artist):
    """Legend entries (``handles``: proxy lines or patches carrying their labels) in
    ``ncol`` columns, with the corner ``loc`` at ``anchor`` (in ``transform``'s
    coordinates), ``border_pad`` font sizes inside the anchor as matplotlib's
    ``borderaxespad``.  A proxy line that belongs to no figure is drawn itself (the
    legend sets its data, transform and marker placement), any other handle is copied."""

    def __init__(self, handles: Sequence[Line2D | Patch], *, anchor: tuple[float, float],
                 transform: Transform, loc: str = "upper left", ncol: int = 1,
                 fontsize: float | None = None, handlelength: float | None = None,
                 columnspacing: float | None = None, border_pad: float | None = None) -> None:
        super().__init__()
        rc: Any = mpl.rcParams
        self._prop = FontProperties(size=rc["legend.fontsize"] if fontsize is None
                                    else fontsize)
        self._fontsize = self._prop.get_size_in_points()
        self._handlelength = float(rc["legend.handlelength"] if handlelength is None
                                   else handlelength)
        self._columnspacing = float(rc["legend.columnspacing"] if columnspacing is None
                                    else columnspacing)
        self._axespad = float(rc["legend.borderaxespad"] if border_pad is None else border_pad)
        self._borderpad = float(rc["legend.borderpad"])
        self._labelspacing = float(rc["legend.labelspacing"])
        self._textpad = float(rc["legend.handletextpad"])
        self._handleheight = float(rc["legend.handleheight"])
        self._ncol = ncol
        self._corner = _CORNERS[loc]
        self._anchor = anchor
        self._anchor_transform = transform
        colour = rc["legend.labelcolor"]
        if colour in (None, "None"):
            colour = rc["text.color"]
        self._entries: list[tuple[Artist, str]] = []
        for handle in handles:
            artist: Artist
            if isinstance(handle, Line2D) and handle.get_figure(root=False) is None:
                artist = handle  # a proxy drawn nowhere else: drawn as it is (no copy)
                if type(handle) is Line2D:
                    handle.__class__ = LightLine  # drawn by draw_line (the same SVG)
            elif isinstance(handle, Line2D):
                artist = LightLine([], [])
                artist.update_from(handle)
            else:
                artist = Rectangle((0.0, 0.0), 1.0, 1.0)
                artist.update_from(handle)
            if isinstance(artist, Line2D):
                artist.set_markevery([1])
            artist.set_transform(IdentityTransform())
            self._entries.append((artist, str(handle.get_label())))
        # One text drawn at every entry in turn (making a text costs more than drawing it).
        self._text = Text(0.0, 0.0, "", fontproperties=self._prop, va="baseline", ha="left",
                          color=colour, transform=IdentityTransform())
        self.set_zorder(5)

    def set_figure(self, fig: Any) -> None:
        super().set_figure(fig)
        for artist, _label in self._entries:
            artist.set_figure(fig)
        self._text.set_figure(fig)

    def get_children(self) -> list[Artist]:
        return [*(artist for artist, _label in self._entries), self._text]

    def draw(self, renderer: Any) -> None:
        if not self.get_visible() or not self._entries:
            return
        renderer.open_group("legend", gid=self.get_gid())
        for artist, label, xy in self._layout(renderer):
            artist.draw(renderer)
            self._text.set_text(label)
            self._text.set_position(xy)
            draw_text(self._text, renderer)
        renderer.close_group("legend")
        self.stale = False

    def _layout(self, renderer: Any) -> list[tuple[Artist, str, tuple[float, float]]]:
        """Place every entry (display units, y up) as matplotlib's legend boxes would."""
        scale = renderer.points_to_pixels(1.0)
        fs = self._fontsize
        dpi = self.get_figure(root=True).dpi  # type: ignore[union-attr]
        handle_descent = 0.35 * fs * (self._handleheight - 0.7) * scale
        handle_width = self._handlelength * fs * scale
        handle_height = fs * self._handleheight * scale - handle_descent
        text_x = handle_width + self._textpad * fs * scale
        # Each entry: its width, and how far it reaches below and above its baseline.
        _w, lp_height, lp_descent = renderer.get_text_width_height_descent(
            "lp", self._prop, ismath=False)
        sizes = []
        for _artist, label in self._entries:
            width, ascent, descent = line_metrics(renderer, label, self._prop, dpi)
            above = max(lp_height - lp_descent, ascent)
            sizes.append((text_x + width, min(-handle_descent, -descent),
                          max(handle_height - handle_descent, above)))
        # Columns as numpy's array_split deals them: the first columns take one more.
        columns = [list(c) for c in np.array_split(np.arange(len(sizes)), self._ncol)
                   if len(c)]
        sep_y = self._labelspacing * fs * scale
        sep_x = self._columnspacing * fs * scale
        placed: list[tuple[int, float, float]] = []  # entry, x, baseline y (from box top)
        x = 0.0
        low = high = 0.0  # the handle box's extent about its baseline
        for column in columns:
            top = 0.0  # distance from the column's top down to the entry's top
            tops = []
            for i in column:
                tops.append(top)
                top += sizes[i][2] - sizes[i][1] + sep_y
            height = top - sep_y
            first_top = sizes[column[0]][2]
            # The column's baseline is its first entry's baseline.
            for i, t in zip(column, tops, strict=True):
                placed.append((i, x, -(t + sizes[i][2] - first_top)))
            low = min(low, first_top - height)
            high = max(high, first_top)
            x += max(sizes[i][0] for i in column) + sep_x
        box_width = x - sep_x
        pad = self._borderpad * fs * scale
        width, height = box_width + 2 * pad, high - low + 2 * pad
        anchor_x, anchor_y = self._anchor_transform.transform(self._anchor)
        axes_pad = self._axespad * fs * scale
        fx, fy = self._corner
        # The corner moves inward by the pad, as matplotlib anchors a box in a padded one.
        left = anchor_x + axes_pad * (1 - 2 * fx) - fx * width
        bottom = anchor_y + axes_pad * (1 - 2 * fy) - fy * height
        base_x, base_y = left + pad, bottom + pad - low
        out: list[tuple[Artist, str, tuple[float, float]]] = []
        for i, x0, y0 in placed:
            artist, label = self._entries[i]
            ex, ey = base_x + x0, base_y + y0
            if isinstance(artist, Rectangle):
                artist.set_bounds(ex, ey - handle_descent, handle_width, handle_height)
            else:
                assert isinstance(artist, Line2D)
                middle = ey + (handle_height - handle_descent) / 2
                artist.set_data([ex, ex + handle_width / 2, ex + handle_width], [middle] * 3)
            out.append((artist, label, (ex + text_x, ey)))
        return out
