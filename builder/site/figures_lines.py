"""Lines of a figure drawn without matplotlib's general line drawing.

:meth:`Line2D.draw <matplotlib.lines.Line2D.draw>` sets up a drawing state for
every line it draws (a graphics context with a dozen properties, the style
written out from it, its clip worked out again), and an atlas figure draws some
twenty lines: the curves, their markers, the tick marks and grid, the legend's
samples.  :func:`draw_line` draws such a line with the same steps for the SVG
writer of :mod:`.figures_canvas`: the same path (matplotlib's own path
transformation and conversion to SVG path data), the clip worked out from the
line's clip box, and the style attribute that the graphics context would give,
worked out once per colour, width, dash pattern, join and cap for the process;
its markers go to the renderer's ``draw_markers`` as :meth:`Line2D.draw` sends
them.  The SVG is the same, byte for byte (tested against matplotlib's own
drawing).  Anything else (another renderer, path effects, a sketch, a link, a
drawing style other than straight lines, a gap colour, a clip path, a
rasterised line, a very long sorted line that matplotlib draws in part) goes
through :meth:`Line2D.draw` unchanged.

:class:`LightLine` is a :class:`~matplotlib.lines.Line2D` drawn that way.
"""

from __future__ import annotations

import weakref
from numbers import Real
from typing import Any

from matplotlib import cbook
from matplotlib import colors as mcolors
from matplotlib.axes import Axes
from matplotlib.backends.backend_svg import RendererSVG
from matplotlib.lines import Line2D, _mark_every_path  # type: ignore[attr-defined]
from matplotlib.transforms import Bbox, TransformedBbox

__all__ = ["LightLine", "clip_to_axes", "draw_line"]

#: The clip box of lines clipped to axes (one per axes patch, shared by its lines: the box
#: follows the axes as the one ``set_clip_path(ax.patch)`` makes for each line does).
_CLIP_BOXES: weakref.WeakKeyDictionary[Any, TransformedBbox] = weakref.WeakKeyDictionary()

#: The style attribute of a line's path per colour, width, dash pattern, join and cap.
_STYLES: dict[tuple[Any, ...], str] = {}


def clip_to_axes(line: Line2D, ax: Axes) -> None:
    """What ``line.set_clip_path(ax.patch)`` does for the axes' rectangle, with the clip box
    shared by the axes' lines (making one costs as much as adding the line)."""
    box = _CLIP_BOXES.get(ax.patch)
    if box is None:
        box = _CLIP_BOXES[ax.patch] = TransformedBbox(Bbox.unit(), ax.patch.get_transform())
    line.clipbox = box
    line._clippath = None  # type: ignore[attr-defined]
    line.pchanged()
    line.stale = True


class _Clip:
    """The clip of a line as its graphics context would hold it: a clip box, no path."""

    __slots__ = ("rectangle",)

    def __init__(self, rectangle: Any) -> None:
        self.rectangle = rectangle

    def get_clip_rectangle(self) -> Any:
        return self.rectangle

    def get_clip_path(self) -> tuple[None, None]:
        return None, None


def _plain(line: Line2D, renderer: Any) -> bool:
    """Whether ``line`` is drawn by :func:`draw_line` itself."""
    state: Any = line
    return (isinstance(renderer, RendererSVG) and hasattr(renderer.writer, "empty_elements")
            and not line.get_path_effects() and line.get_sketch_params() is None
            and line.get_url() is None and line.get_drawstyle() == "default"
            and state._gapcolor is None and state._clippath is None
            and not line.get_rasterized() and line.get_agg_filter() is None
            and state._linewidth > 0)


def _path_style(renderer: RendererSVG, line: Line2D) -> str:
    """The style attribute matplotlib's SVG renderer writes for the line's path."""
    state: Any = line
    colour = mcolors.to_rgba(state._color, state._alpha)
    if line.is_dashed():
        cap, join = state._dashcapstyle, state._dashjoinstyle
    else:
        cap, join = state._solidcapstyle, state._solidjoinstyle
    offset, dashes = state._dash_pattern
    key = (colour, state._linewidth, offset, None if dashes is None else tuple(dashes),
           join, cap)
    style = _STYLES.get(key)
    if style is None:
        gc = renderer.new_gc()
        gc.set_linewidth(state._linewidth)
        gc.set_joinstyle(join)
        gc.set_capstyle(cap)
        gc.set_foreground(colour, isRGBA=True)
        gc.set_dashes(offset, dashes)
        style = renderer._get_style(gc, None)
        gc.restore()
        if len(_STYLES) < 5_000:
            _STYLES[key] = style
    return style


def draw_line(line: Line2D, renderer: Any) -> None:
    """Draw ``line`` as :meth:`Line2D.draw` would (the same SVG), a plain line directly."""
    state: Any = line
    if not _plain(line, renderer):
        Line2D.draw(line, renderer)
        return
    if not line.get_visible():
        return
    if state._invalidy or state._invalidx:
        line.recache()
    if state._subslice and line.axes:
        Line2D.draw(line, renderer)
        return
    state.ind_offset = 0
    renderer.open_group("line2d", line.get_gid())
    transformed = state._get_transformed_path()
    if state._lineStyles[state._linestyle] != "_draw_nothing":
        tpath, affine = transformed.get_transformed_path_and_affine()
        if len(tpath.vertices):
            # RendererSVG.draw_path for a path without fill, hatch, sketch or link.
            clip = renderer._get_clip_attrs(_Clip(line.clipbox if line.get_clip_on()
                                                  else None))
            path_data = renderer._convert_path(
                tpath, renderer._make_flip_transform(affine.frozen()), clip=True,
                simplify=tpath.should_simplify, sketch=None)
            renderer.writer.element("path", d=path_data, **clip,
                                    style=_path_style(renderer, line))
    if state._marker and state._markersize > 0:
        _draw_markers(line, renderer, transformed)
    renderer.close_group("line2d")
    line.stale = False


def _draw_markers(line: Line2D, renderer: Any, transformed: Any) -> None:
    """The markers as :meth:`Line2D.draw` hands them to the renderer."""
    state: Any = line
    gc = renderer.new_gc()
    state._set_gc_clip(gc)
    gc.set_linewidth(state._markeredgewidth)
    ec_rgba = mcolors.to_rgba(line.get_markeredgecolor(), state._alpha)
    fc_rgba = mcolors.to_rgba(state._get_markerfacecolor(), state._alpha)
    if (cbook._str_equal(state._markeredgecolor, "auto")
            and not cbook._str_lower_equal(line.get_markerfacecolor(), "none")):
        ec_rgba = (*ec_rgba[:3], fc_rgba[3])
    gc.set_foreground(ec_rgba, isRGBA=True)
    marker = state._marker
    tpath, affine = transformed.get_transformed_points_and_affine()
    if len(tpath.vertices):
        markevery = line.get_markevery()
        subsampled = (tpath if markevery is None
                      else _mark_every_path(markevery, tpath, affine, line.axes))
        snap = marker.get_snap_threshold()
        if isinstance(snap, Real):
            snap = renderer.points_to_pixels(state._markersize) >= snap
        gc.set_snap(snap)
        gc.set_joinstyle(marker.get_joinstyle())
        gc.set_capstyle(marker.get_capstyle())
        marker_path = marker.get_path()
        marker_trans = marker.get_transform()
        w = renderer.points_to_pixels(state._markersize)
        if cbook._str_equal(marker.get_marker(), ","):
            gc.set_linewidth(0)
        else:
            marker_trans = marker_trans.scale(w)
        renderer.draw_markers(gc, marker_path, marker_trans, subsampled, affine.frozen(),
                              fc_rgba)
        alt_marker_path = marker.get_alt_path()
        if alt_marker_path:
            fcalt_rgba = mcolors.to_rgba(state._get_markerfacecolor(alt=True), state._alpha)
            alt_marker_trans = marker.get_alt_transform()
            alt_marker_trans = alt_marker_trans.scale(w)
            renderer.draw_markers(gc, alt_marker_path, alt_marker_trans, subsampled,
                                  affine.frozen(), fcalt_rgba)
    gc.restore()


class LightLine(Line2D):
    """A :class:`~matplotlib.lines.Line2D` drawn by :func:`draw_line`."""

    def draw(self, renderer: Any) -> None:
        draw_line(self, renderer)
