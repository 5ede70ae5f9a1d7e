"""One line of figure text drawn without matplotlib's general text layout.

matplotlib lays out every text it draws anew (:meth:`Text._get_layout`: lines,
wrapping, rotated boxes, alignment of several lines), and the SVG writer builds
the same style attribute from the font's properties for every label; an atlas
figure draws some thirty texts, each one line.  :func:`draw_text` draws one such
text with the same arithmetic for a single line (width, ascent and descent from
the renderer, the font's own minimum ascent and descent, the alignment point)
and hands it to the renderer as :meth:`Text.draw` does, so that the SVG is the
same, byte for byte (tested against matplotlib's own drawing); anything else
(several lines, wrapping, mathematics, a box around the text, path effects,
TeX) goes through :meth:`Text.draw` unchanged.

:class:`LightText` is a :class:`~matplotlib.text.Text` drawn that way;
:func:`make_light` turns an axes' own texts (titles, axis labels) into it.
"""

from __future__ import annotations

import math
from typing import Any

import matplotlib as mpl
import numpy as np
from matplotlib import colors as mcolors
from matplotlib.axes import Axes
from matplotlib.font_manager import FontProperties, findfont, get_font
from matplotlib.text import Text

__all__ = ["LightText", "draw_text", "line_metrics", "make_light"]

#: The font's minimum ascent and descent per font (points at 72 dpi), as matplotlib's layout
#: reads them from the font's OS/2 (or hhea) table.
_FONT_HEIGHTS: dict[FontProperties, tuple[float, float] | None] = {}


def _font_heights(renderer: Any, prop: FontProperties, dpi: float) -> tuple[float, float] | None:
    """The font's minimum ascent and descent as :meth:`Text._get_layout` uses them."""
    if hasattr(renderer, "_get_font_height_metrics"):
        up, down, _gap = renderer._get_font_height_metrics(prop)
        if up is not None and down is not None:
            return float(up), float(down)
    key = prop.copy()
    if key in _FONT_HEIGHTS:
        heights = _FONT_HEIGHTS[key]
    else:
        heights = None
        font = get_font(findfont(prop))
        for name, up_key, down_key in (("OS/2", "sTypoAscender", "sTypoDescender"),
                                       ("hhea", "ascent", "descent")):
            table: Any = font.get_sfnt_table(name)  # type: ignore[call-overload]
            if table is None:
                continue
            head: Any = font.get_sfnt_table("head")
            scale = prop.get_size_in_points() / head["unitsPerEm"]
            heights = (table[up_key] * scale, -table[down_key] * scale)
            break
        _FONT_HEIGHTS[key] = heights
    if heights is None:
        return None
    return heights[0] * dpi / 72, heights[1] * dpi / 72


def line_metrics(renderer: Any, text: str, prop: FontProperties,
                 dpi: float) -> tuple[float, float, float]:
    """Width, ascent and descent (display units) of one line of text as matplotlib's
    layout counts them: at least the font's own ascent and descent."""
    width, height, descent = renderer.get_text_width_height_descent(text, prop, ismath=False)
    ascent = height - descent
    heights = _font_heights(renderer, prop, dpi)
    if heights is None:  # as matplotlib: the size of "lp" instead
        _w, lp_height, lp_descent = renderer.get_text_width_height_descent("lp", prop,
                                                                           ismath=False)
        heights = (lp_height - lp_descent, lp_descent)
    return float(width), max(ascent, heights[0]), max(descent, heights[1])


def _plain(text: Text) -> bool:
    """Whether ``text`` is one plain line (the case :func:`draw_text` draws itself)."""
    s = text.get_text()
    return ("\n" not in s and "$" not in s and not text.get_wrap() and not text.get_usetex()
            and text.get_bbox_patch() is None and not text.get_path_effects()
            and text.get_rotation_mode() in ("default", "anchor", None))


def _offset(text: Text, width: float, ascent: float, descent: float) -> tuple[float, float]:
    """Where the line's baseline starts relative to the text's position (display units,
    y up), the arithmetic of :meth:`Text._get_layout` for one line."""
    angle = text.get_rotation()
    rad = math.radians(angle)
    cos, sin = (1.0, 0.0) if angle == 0 else (math.cos(rad), math.sin(rad))

    def rotate(x: float, y: float) -> tuple[float, float]:
        return (x, y) if angle == 0 else (cos * x - sin * y, sin * x + cos * y)

    halign, valign = text.get_horizontalalignment(), text.get_verticalalignment()
    corners = [(0.0, -(ascent + descent)), (0.0, 0.0), (width, 0.0), (width, -(ascent + descent))]
    baseline = ascent
    if text.get_rotation_mode() != "anchor":
        xs, ys = zip(*(rotate(x, y) for x, y in corners), strict=True)
        xmin, xmax, ymin, ymax = min(xs), max(xs), min(ys), max(ys)
        offset_x = xmin if halign == "left" else xmax if halign == "right" else (xmin + xmax) / 2
        offset_y = (ymin if valign == "bottom" else ymax if valign == "top" else
                    (ymin + ymax) / 2 if valign == "center" else
                    ymin + descent if valign == "baseline" else
                    ymin + (ymax - ymin) - baseline / 2)
    else:
        (xmin1, ymin1), (xmax1, ymax1) = corners[0], corners[2]
        offset_x = xmin1 if halign == "left" else xmax1 if halign == "right" else \
            (xmin1 + xmax1) / 2
        offset_y = (ymin1 if valign == "bottom" else ymax1 if valign == "top" else
                    (ymin1 + ymax1) / 2 if valign == "center" else
                    ymax1 - baseline if valign == "baseline" else ymax1 - baseline / 2)
        offset_x, offset_y = rotate(offset_x, offset_y)
    x, y = rotate(0.0, -ascent)
    return x - offset_x, y - offset_y


def draw_text(text: Text, renderer: Any) -> None:
    """Draw ``text`` as :meth:`Text.draw` would (the same SVG), one plain line directly."""
    if not _plain(text):
        Text.draw(text, renderer)
        return
    text._renderer = renderer  # type: ignore[attr-defined]
    if not text.get_visible() or text.get_text() == "":
        return
    renderer.open_group("text", text.get_gid())
    s = text.get_text()
    prop = text.get_fontproperties()
    dpi = text.get_figure(root=True).dpi  # type: ignore[union-attr]
    width, ascent, descent = line_metrics(renderer, s, prop, dpi)
    dx, dy = _offset(text, width, ascent, descent)
    x, y = text._x, text._y  # type: ignore[attr-defined]
    posx, posy = text.get_transform().transform((float(text.convert_xunits(x)),
                                                 float(text.convert_yunits(y))))
    if not (np.isfinite(posx) and np.isfinite(posy)):
        renderer.close_group("text")
        return
    x_draw, y_draw = dx + posx, dy + posy
    if renderer.flipy():
        y_draw = renderer.get_canvas_width_height()[1] - y_draw
    angle = text.get_rotation()
    write = getattr(renderer, "write_text_line", None)
    if (write is not None and text.get_url() is None and mpl.rcParams["svg.fonttype"] == "none"
            and (angle == 0 or text.get_rotation_mode() == "anchor")
            and not (text.get_clip_on() and (text.get_clip_box() is not None
                                             or text.get_clip_path() is not None))):
        # What the SVG renderer's draw_text writes for such a text (text kept as text),
        # without its drawing state.
        write(s, prop, text.get_color(), text.get_alpha(), text.get_horizontalalignment(),
              (x_draw, y_draw), (posx, posy), angle)
        renderer.close_group("text")
        text.stale = False
        return
    gc = renderer.new_gc()
    gc.set_foreground(mcolors.to_rgba(text.get_color()), isRGBA=True)
    gc.set_alpha(text.get_alpha())
    gc.set_url(text.get_url())
    gc.set_antialiased(text._antialiased)  # type: ignore[attr-defined]
    gc.set_snap(text.get_snap())
    text._set_gc_clip(gc)  # type: ignore[attr-defined]
    renderer.draw_text(gc, x_draw, y_draw, s, prop, angle, ismath=False, mtext=text)
    gc.restore()
    renderer.close_group("text")
    text.stale = False


class LightText(Text):
    """A :class:`~matplotlib.text.Text` drawn by :func:`draw_text`."""

    def draw(self, renderer: Any) -> None:
        draw_text(self, renderer)


def make_light(ax: Axes) -> None:
    """Draw the axes' titles and axis labels with :func:`draw_text` (they keep every other
    behaviour of matplotlib's texts)."""
    for text in (ax.title, ax._left_title, ax._right_title,  # type: ignore[attr-defined]
                 ax.xaxis.label, ax.yaxis.label):
        if type(text) is Text:
            text.__class__ = LightText

