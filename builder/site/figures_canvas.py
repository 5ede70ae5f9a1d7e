"""Figures to SVG bytes, quickly: text measured once per process, figures kept for reuse.

matplotlib measures every piece of text anew for each figure it writes (its
cache of text sizes belongs to one renderer, and each ``savefig`` makes a new
one); an atlas build writes thousands of figures with the same tick labels,
titles and legend entries.  :func:`svg_bytes` writes a figure with a renderer
that keeps the sizes for the whole process: the bytes are the same as
``savefig(format="svg")`` gives (tested), only faster.  Its writer
(:class:`_Writer`) writes each tag in one step with quoted attribute values
kept, and it writes a line's markers at once (points from one call of
matplotlib's path cleaning, the style worked out once per line, element ids
kept for the process); the lines themselves are drawn by
:func:`~builder.site.figures_lines.draw_line`.

:func:`plot_line` adds a line to axes as ``plot`` would, without ``plot``'s
argument parsing and with ``add_line``'s steps done directly (one clip box per
axes, the data limits grown by the line's path).

:class:`Kept` holds one prepared figure per kind (size and grid of axes) for
reuse: a worker process draws hundreds of figures of the same kind, and making
the figure and its axes anew costs as much as drawing it.  :meth:`Kept.take`
returns the figure with everything drawn on it before taken away, so a figure
drawn on a kept figure is the same, byte for byte, as one drawn on a fresh
figure (tested).
"""

from __future__ import annotations

import io
import threading
from typing import Any, Literal

import matplotlib as mpl
import numpy as np
from matplotlib import colors as mcolors
from matplotlib import font_manager
from matplotlib.axes import Axes
from matplotlib.axis import Axis
from matplotlib.backends.backend_svg import (
    FigureCanvasSVG,
    RendererSVG,
    _escape_cdata,
    _generate_css,
    _generate_transform,
    _quote_escape_attrib,
    _short_float_fmt,
    _XMLWriter,
)
from matplotlib.figure import Figure as MplFigure
from matplotlib.font_manager import FontProperties, findfont, get_font
from matplotlib.lines import Line2D
from matplotlib.path import Path
from matplotlib.ticker import AutoLocator, NullFormatter, NullLocator, ScalarFormatter
from matplotlib.transforms import Affine2D, Bbox

from builder.site.figures_axes import light_axes
from builder.site.figures_lines import LightLine, clip_to_axes
from builder.site.figures_text import make_light
from builder.site.svg import compact

__all__ = ["Kept", "plot_line", "svg_bytes"]

_SIZES: dict[tuple[str, Any, FontProperties], tuple[float, float, float]] = {}
_HEIGHTS: dict[FontProperties, tuple[Any, Any, Any]] = {}
_TEXT_CSS: dict[tuple[FontProperties, Any, str], str] = {}
_IDS: dict[tuple[str, str, str], str] = {}


#: Attribute values as matplotlib's SVG writer quotes them, kept for the process (styles,
#: clip paths and references repeat from element to element and figure to figure).
_QUOTED: dict[str, str] = {}


def _quoted(value: str) -> str:
    quoted = _QUOTED.get(value)
    if quoted is None:
        quoted = _quote_escape_attrib(value)
        if len(value) < 200 and len(_QUOTED) < 50_000:
            _QUOTED[value] = quoted
    return quoted


#: Path codes of one vertex each (what a line of markers is made of).
_POINT_CODES = {Path.MOVETO, Path.LINETO, Path.CLOSEPOLY}


def _tag(name: str) -> str:
    return _escape_cdata(name) if ("&" in name or "<" in name or ">" in name) else name


class _Writer(_XMLWriter):
    """matplotlib's SVG writer, the same bytes in fewer steps: one write per tag, quoted
    attribute values kept, and :meth:`empty_elements` for many elements at once.  It
    keeps its state in :class:`_XMLWriter`'s own (private) attributes: a renderer's
    writer becomes one after the renderer wrote its header."""

    def _open(self) -> list[str]:
        """Close a start tag left open and write pending text (as ``__flush``); the open
        tags."""
        state: Any = self
        if state._XMLWriter__open or state._XMLWriter__data:
            state._XMLWriter__flush()
        tags: list[str] = state._XMLWriter__tags
        return tags

    def start(self, tag: str, attrib: Any = None, **extra: Any) -> int:
        state: Any = self
        tags = self._open()
        tag = _tag(tag)
        tags.append(tag)
        out = [state._XMLWriter__indentation[:len(tags) - 1], "<", tag]
        items = ({**attrib, **extra} if extra else attrib) if attrib else extra
        for k, v in items.items():
            if v:
                out.append(f" {_tag(k)}={_quoted(v)}")
        state._XMLWriter__write("".join(out))
        state._XMLWriter__open = 1
        return len(tags) - 1

    def end(self, tag: str | None = None, indent: bool = True) -> None:
        state: Any = self
        tags: list[str] = state._XMLWriter__tags
        if tag:
            assert tags, f"unbalanced end({tag})"
            assert _tag(tag) == tags[-1], f"expected end({tags[-1]}), got {tag}"
        else:
            assert tags, "unbalanced end()"
        tag = tags.pop()
        if state._XMLWriter__data:
            state._XMLWriter__flush(indent)
        elif state._XMLWriter__open:
            state._XMLWriter__open = 0
            state._XMLWriter__write("/>\n")
            return
        if indent:
            state._XMLWriter__write(f"{state._XMLWriter__indentation[:len(tags)]}</{tag}>\n")
        else:
            state._XMLWriter__write(f"</{tag}>\n")

    def element(self, tag: str, text: str | None = None, attrib: Any = None,
                **extra: Any) -> None:
        self.start(tag, attrib, **extra)
        if text:
            self.data(text)
        self.end(indent=False)

    def empty_elements(self, tag: str, attributes: list[str]) -> None:
        """Elements ``tag`` without content, one per string of attributes, as
        :meth:`element` writes them (each attribute `` name="value"``, quoted as
        :meth:`start` quotes it, and none with an empty value)."""
        if not attributes:
            return
        state: Any = self
        tags = self._open()
        head = f"{state._XMLWriter__indentation[:len(tags)]}<{_tag(tag)}"
        state._XMLWriter__write("".join(f"{head}{text}/>\n" for text in attributes))


class _Renderer(RendererSVG):
    """matplotlib's SVG renderer with text sizes kept for the process."""

    def __init__(self, *args: Any, **kwargs: Any) -> None:
        super().__init__(*args, **kwargs)
        self.writer.__class__ = _Writer  # the same state, fewer steps per element

    def get_text_width_height_descent(self, s: str, prop: FontProperties,
                                      ismath: Any) -> tuple[float, float, float]:
        key = (s, ismath, prop.copy())  # a copy: FontProperties hash by their (mutable) state
        size = _SIZES.get(key)
        if size is None:
            size = super().get_text_width_height_descent(s, prop, ismath)
            if len(_SIZES) < 20_000:
                _SIZES[key] = size
        return size

    def _get_font_height_metrics(self, prop: FontProperties) -> tuple[Any, Any, Any]:
        """The font's ascent, descent and line gap (points), read from its tables once per
        process; matplotlib's text layout asks for them for every text it draws (a hook
        of matplotlib's own vector backends, here with the numbers matplotlib would
        compute itself at 72 dpi, the resolution an SVG is drawn at)."""
        key = prop.copy()
        metrics = _HEIGHTS.get(key)
        if metrics is None:
            metrics = (None, None, None)
            font = get_font(findfont(prop))
            for name, gap, up, down in (("OS/2", "sTypoLineGap", "sTypoAscender",
                                         "sTypoDescender"),
                                        ("hhea", "lineGap", "ascent", "descent")):
                table: Any = font.get_sfnt_table(name)  # type: ignore[call-overload]
                if table is None:
                    continue
                head: Any = font.get_sfnt_table("head")
                scale = prop.get_size_in_points() / head["unitsPerEm"]
                metrics = (table[up] * scale, -table[down] * scale, table[gap] * scale)
                break
            _HEIGHTS[key] = metrics
        return metrics


    def _make_id(self, type: str, content: Any) -> str:
        """matplotlib's id of an element (a hash of the salt and the element's content),
        kept for the process (marker definitions and clips repeat from figure to
        figure)."""
        salt = mpl.rcParams["svg.hashsalt"]
        if salt is None:
            return str(super()._make_id(type, content))
        key = (salt, type, str(content))
        oid = _IDS.get(key)
        if oid is None:
            oid = _IDS[key] = str(super()._make_id(type, content))
            if len(_IDS) > 20_000:
                _IDS.clear()
        return oid

    def draw_markers(self, gc: Any, marker_path: Any, marker_trans: Any, path: Any,
                     trans: Any, rgbFace: Any = None) -> None:
        """matplotlib's markers (the same bytes: a definition once, then one ``<use>`` per
        point), with the style every ``<use>`` repeats worked out once per line instead
        of once per marker."""
        if not len(path.vertices):
            return
        writer = self.writer
        path_data = self._convert_path(marker_path, marker_trans + Affine2D().scale(1.0, -1.0),
                                       simplify=False)
        style = self._get_style_dict(gc, rgbFace)
        css = _generate_css(style)
        dictkey = (path_data, css)
        oid = self._markers.get(dictkey)
        stroke = _generate_css({k: v for k, v in style.items() if k.startswith("stroke")})
        if oid is None:
            oid = self._make_id("m", dictkey)
            writer.start("defs")
            writer.element("path", id=oid, d=path_data, style=stroke)
            writer.end("defs")
            self._markers[dictkey] = oid
        writer.start("g", **self._get_clip_attrs(gc))
        if gc.get_url() is not None:
            writer.start("a", {"xlink:href": gc.get_url(), "target": "_blank"})
        trans_and_flip = self._make_flip_transform(trans)
        clip = (0, 0, self.width * 72, self.height * 72)
        # The points ``path.iter_segments`` gives (the same call of matplotlib's path
        # cleaning), each written as the ``<use>`` element matplotlib writes for it.
        cleaned = path.cleaned(transform=trans_and_flip, remove_nans=True, clip=clip,
                               snap=False, stroke_width=1.0, simplify=False, curves=True)
        codes = cleaned.codes.tolist()
        count = codes.index(Path.STOP) if Path.STOP in codes else len(codes)
        if set(codes[:count]) <= _POINT_CODES:
            points = cleaned.vertices[:count]
        else:  # curves in a marker line: as matplotlib walks them
            points = np.array([vertices[-2:] for vertices, _code in path.iter_segments(
                trans_and_flip, clip=clip, simplify=False) if len(vertices)]).reshape(-1, 2)
        head = f'xlink:href={_quoted(f"#{oid}")}'
        use_style = css  # what self._get_style(gc, rgbFace) gives
        tail = f" style={_quoted(use_style)}" if use_style else ""
        attributes = [f' {head} x="{_short_float_fmt(x)}" y="{_short_float_fmt(y)}"{tail}'
                      for x, y in points.tolist()]
        writer.empty_elements("use", attributes)
        if gc.get_url() is not None:
            writer.end("a")
        writer.end("g")


    def write_text_line(self, s: str, prop: FontProperties, colour: Any, alpha: float | None,
                        ha: str, xy: tuple[float, float], anchor: tuple[float, float],
                        angle: float) -> None:
        """One line of text as matplotlib's SVG renderer writes it for a text anchored at
        ``anchor`` (display units, y up) and laid out to start at ``xy`` (y down), with
        no clip or link (the same bytes), its style worked out once per font, colour and
        alignment for the process."""
        rgba = mcolors.to_rgba(colour) if alpha is None else mcolors.to_rgba(colour, alpha)
        key = (prop.copy(), rgba, ha)
        style = _TEXT_CSS.get(key)
        if style is None:
            color_style = {}
            hex_colour = mcolors.rgb2hex(rgba)
            if hex_colour != "#000000":
                color_style["fill"] = hex_colour
            if rgba[3] != 1:
                color_style["opacity"] = _short_float_fmt(rgba[3])
            anchor_css = {"left": "start", "right": "end", "center": "middle"}[ha]
            style = _generate_css({**_font_css(prop), "text-anchor": anchor_css,
                                   **color_style})
            if len(_TEXT_CSS) < 5_000:
                _TEXT_CSS[key] = style
        x, y = xy
        ax, ay = anchor[0], self.height - anchor[1]
        # The vertical layout moved onto the anchor point, as matplotlib's renderer does.
        angle_rad = np.deg2rad(angle)
        dir_vert = np.array([np.sin(angle_rad), np.cos(angle_rad)])
        v_offset = np.dot(dir_vert, [(x - ax), (y - ay)])
        ax = ax + v_offset * dir_vert[0]
        ay = ay + v_offset * dir_vert[1]
        self.writer.element("text", s, attrib={
            "style": style, "x": _short_float_fmt(ax), "y": _short_float_fmt(ay),
            "transform": _generate_transform([("rotate", (-angle, ax, ay))])})


def raw_svg(fig: MplFigure) -> bytes:
    """``fig`` as SVG, byte for byte what ``fig.savefig(format="svg")`` writes without
    date and creator metadata."""
    buffer = io.StringIO()
    dpi = fig.dpi
    width, height = fig.get_size_inches()
    fig.dpi = 72  # SVG is written at 72 dpi, as matplotlib's own canvas does
    try:
        # matplotlib's print_svg wraps the renderer for rasterised artists; the atlas
        # draws none, so the SVG renderer draws directly (the same bytes, tested).
        renderer = _Renderer(width * 72, height * 72, buffer, image_dpi=dpi,
                             metadata={"Date": None, "Creator": None})
        fig.draw(renderer)
        renderer.finalize()
    finally:
        fig.dpi = dpi
    return buffer.getvalue().encode("utf-8")


def svg_bytes(fig: MplFigure) -> bytes:
    """The figure's compact SVG (:func:`~builder.site.svg.compact`), its ticks, tick labels
    and grid drawn by :func:`~builder.site.figures_axes.light_axes`."""
    restore = [light_axes(ax) for ax in fig.axes]
    try:
        raw = raw_svg(fig)
    finally:
        for step in restore:
            step()
    return compact(raw)


def _font_css(prop: FontProperties) -> dict[str, str]:
    """The CSS font properties matplotlib's SVG renderer gives a text set in ``prop`` (its
    ``_draw_text_as_text``)."""
    style: dict[str, str] = {}
    if prop.get_style() != "normal":
        style["font-style"] = prop.get_style()
    if prop.get_variant() != "normal":
        style["font-variant"] = prop.get_variant()
    weight: Any = prop.get_weight()
    weight = font_manager.weight_dict.get(weight, weight)
    if weight != 400:
        style["font-weight"] = f"{weight}"

    def normal_sans(name: str) -> str:
        return "sans-serif" if name in ("sans", "sans serif") else name

    names = []
    for entry in prop.get_family():
        entry = normal_sans(entry)
        if entry in font_manager.font_family_aliases:
            names += [normal_sans(name) for name in
                      font_manager.FontManager._expand_aliases(entry)]  # type: ignore[attr-defined]
        names.append(entry)
    quoted = [name if name in font_manager.font_family_aliases else repr(name)
              for name in names]
    style["font-size"] = f"{_short_float_fmt(prop.get_size())}px"
    style["font-family"] = ", ".join(dict.fromkeys(quoted))
    if prop.get_stretch() != "normal":
        style["font-stretch"] = str(prop.get_stretch())
    return style


def plot_line(ax: Axes, x: Any, y: Any, **style: Any) -> Line2D:
    """What ``ax.plot(x, y, **style)`` draws for one line whose colour is given, without
    ``plot``'s reading of its arguments and property cycle (a third of its time): the
    line added to the axes and their limits asked to follow the data, as ``plot``
    does.  A line in data coordinates on plain axes is added as ``Axes.add_line`` adds
    it, with the clip box shared by the axes' lines and the data limits grown by the
    line's path directly."""
    line = LightLine(x, y, **style)
    if "transform" in style or "clip_path" in style or ax.name != "rectilinear":
        ax.add_line(line)
    else:
        _add_line(ax, line)
    ax.autoscale(enable=None)  # type: ignore[arg-type]  # None: as they are set (documented)
    return line


def _add_line(ax: Axes, line: Line2D) -> None:
    """``ax.add_line(line)`` for a line in the axes' data coordinates."""
    ax._set_artist_props(line)  # type: ignore[attr-defined]
    if line.get_clip_on() and line.get_clip_path() is None:
        clip_to_axes(line, ax)
    path: Any = line.get_path()
    if path.vertices.size:
        ax.dataLim.update_from_path(path, ax.ignore_existing_data_limits, updatex=True,
                                    updatey=True)
        ax.ignore_existing_data_limits = False
    if not line.get_label():
        line.set_label(f"_child{len(ax._children)}")  # type: ignore[attr-defined]
    ax._children.append(line)  # type: ignore[attr-defined]
    line._remove_method = ax._children.remove  # type: ignore[attr-defined]
    ax.stale = True
    line._set_in_autoscale(True)  # type: ignore[attr-defined]


class Kept:
    """Prepared figures kept per kind for reuse within a process (one set per thread: a
    cluster worker may draw in several threads)."""

    def __init__(self) -> None:
        self._local = threading.local()

    def take(self, kind: Any, size_in: tuple[float, float], rows: int = 1,
             cols: int = 1) -> tuple[MplFigure, list[Axes]]:
        """A figure of ``size_in`` with ``rows`` x ``cols`` axes, as if new."""
        key = (kind, rows, cols)
        figures: dict[Any, MplFigure] = self._local.__dict__.setdefault("figures", {})
        fig = figures.get(key)
        if fig is None:
            fig = MplFigure(figsize=size_in)
            FigureCanvasSVG(fig)
            for ax in fig.subplots(rows, cols, squeeze=False).flat:
                make_light(ax)
            figures[key] = fig
        else:
            fig.set_size_inches(size_in)
            for legend in list(fig.legends):
                legend.remove()
            for artist in [*fig.texts, *fig.artists]:
                artist.remove()
            for ax in fig.axes:
                _reset(ax)
        return fig, list(fig.axes)


def _plain_linear(axis: Axis) -> bool:
    """Whether a linear axis still has the ticks a new axis has (then its scale need not be
    set again, which costs as much as drawing a line)."""
    return (type(axis.get_major_locator()) is AutoLocator
            and type(axis.get_major_formatter()) is ScalarFormatter
            and type(axis.get_minor_locator()) is NullLocator
            and type(axis.get_minor_formatter()) is NullFormatter)


def _reset(ax: Axes) -> None:
    """Take everything drawn off ``ax`` and set it back as new: titles, axis labels, scales,
    limits, aspect and colour cycle (what the atlas figures change; cheaper than
    ``Axes.clear``, which rebuilds the axes' ticks and spines)."""
    for artist in [*ax.lines, *ax.texts, *ax.patches, *ax.collections, *ax.artists,
                   *ax.images, *ax.tables]:
        artist.remove()
    legend = ax.get_legend()
    if legend is not None:
        legend.remove()
    pad = float(mpl.rcParams["axes.titlepad"])
    # The left title always (it also sets the titles' shared padding back); the others
    # only if they were given a text (their look is set back with it).
    titles: tuple[tuple[Literal["center", "left", "right"], Any], ...] = (
        ("center", ax.title), ("left", ax._left_title),  # type: ignore[attr-defined]
        ("right", ax._right_title))  # type: ignore[attr-defined]
    for loc, title in titles:
        if loc == "left" or title.get_text():
            ax.set_title("", loc=loc, pad=pad)
    labelpad = float(mpl.rcParams["axes.labelpad"])
    ax.set_xlabel("", labelpad=labelpad)
    ax.set_ylabel("", labelpad=labelpad)
    if ax.get_xscale() != "linear" or not _plain_linear(ax.xaxis):
        ax.set_xscale("linear")
    if ax.get_yscale() != "linear" or not _plain_linear(ax.yaxis):
        ax.set_yscale("linear")
    ax.set_aspect("auto")
    ax.set_prop_cycle(None)
    ax.dataLim.set(Bbox.null())
    ax.ignore_existing_data_limits = True
    ax.viewLim.set(Bbox.unit())
    ax.set_autoscale_on(True)
    ax.set_xmargin(float(mpl.rcParams["axes.xmargin"]))
    ax.set_ymargin(float(mpl.rcParams["axes.ymargin"]))
