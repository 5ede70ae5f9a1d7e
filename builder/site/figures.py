"""The atlas figures: matplotlib, SVG, one style across the atlas.

Every figure reads computed results (:mod:`builder.results`); none computes
thermodynamics.  The style is the atlas's own:

* lines are told apart by marker shape and fill as well as by colour (a
  colour-blind-safe palette after Okabe and Ito), so a grey print still reads:
  the bubble line has filled circles, the dew line open squares;
* the solid/dashed distinction is kept for one meaning only: a dashed part of
  a line lies outside a correlation's validity range, and it is labelled
  "extrapolated" on the plot and in the legend;
* the three-phase line (two liquids boiling together) is a thick grey bar;
  azeotropes are black stars with their numbers written beside them;
* axes carry quantity and unit (``Temperature / °C``); text stays text in the
  SVG (selectable, small files), set in a common sans-serif face.

Each :class:`Figure` carries its SVG, its file name, a caption and an alt
text that says what the figure shows in words.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from typing import Any

import matplotlib

matplotlib.use("Agg")

import numpy as np
from matplotlib.axes import Axes
from matplotlib.figure import Figure as MplFigure
from matplotlib.lines import Line2D
from matplotlib.patches import Patch
from matplotlib.ticker import FuncFormatter
from matplotlib.transforms import ScaledTranslation
from numpy.typing import NDArray

from builder.analysis.results import ConditionResult, PairResults
from builder.analysis.second_opinion import SecondOpinion
from builder.catalogue.records import Component
from builder.site.context import Display, condition_slug
from builder.site.figures_canvas import Kept, plot_line, svg_bytes
from builder.site.figures_legend import LightLegend
from builder.site.figures_text import LightText
from builder.site.opinion_figures import Overlay, TraceOverlay, trace_overlay, txy_overlay
from builder.site.settings import SiteSettings
from builder.site.text import fmt, mpl_text, one_line, safe_id

__all__ = ["Figure", "component_figure", "pair_figures"]

FloatArray = NDArray[np.float64]
BoolArray = NDArray[np.bool_]

#: Okabe-Ito colour-blind-safe palette, darkest first, for curves of several conditions.
PALETTE = ("#0072B2", "#D55E00", "#009E73", "#CC79A7", "#E69F00", "#56B4E9", "#000000")
MARKERS = ("o", "s", "^", "D", "v", "P", "X")
BUBBLE_COLOUR = "#0b4f8a"
DEW_COLOUR = "#c2410c"
GREY = "#5b6770"

STYLE = {
    "font.family": "sans-serif",
    "font.sans-serif": ["DejaVu Sans", "Liberation Sans", "Arial", "Helvetica"],
    "font.size": 9.0,
    "axes.titlesize": 10.0,
    "axes.titleweight": "bold",
    "axes.titlelocation": "left",
    "axes.titley": 1.0,  # a fixed title position: no layout pass per figure (faster)
    "axes.labelsize": 9.0,
    "axes.edgecolor": "#3a444c",
    "axes.linewidth": 0.8,
    "axes.spines.top": False,
    "axes.spines.right": False,
    "axes.grid": True,
    "grid.color": "#d5dade",
    "grid.linewidth": 0.5,
    "xtick.labelsize": 8.0,
    "ytick.labelsize": 8.0,
    "legend.fontsize": 7.5,
    "legend.frameon": True,
    "legend.framealpha": 0.92,
    "legend.edgecolor": "#c5ccd2",
    "lines.linewidth": 1.6,
    "lines.markersize": 4.2,
    "svg.fonttype": "none",
    "svg.hashsalt": "vle-atlas",
    "figure.dpi": 96,
}

SIZE_IN = (4.4, 3.0)
TOP_IN = 0.5  # room for the title and the pair's names
#: Composition axis ticks where markers sit (one every 0.1).
_MARK_AT = np.linspace(0.0, 1.0, 11)
#: Figures kept per kind for reuse in this process (see :class:`.figures_canvas.Kept`).
_KEPT = Kept()


@dataclass(frozen=True)
class Figure:
    """One rendered figure: where it goes, its SVG, caption and alt text."""

    path: str  # site-relative, e.g. pairs/ethanol--water/txy-isobar-101-325kpa.svg
    svg: bytes
    alt: str
    caption: str
    group: str  # "condition", "xy", "gamma", "alpha", "trace", "vapour-pressure"
    slug: str = ""  # the condition's slug for "condition" figures
    width_px: int = round(SIZE_IN[0] * 96)
    height_px: int = round(SIZE_IN[1] * 96)


# ---------------------------------------------------------------------------
# Drawing helpers
# ---------------------------------------------------------------------------


def _margins(fig: MplFigure, left: float = 0.62, right: float = 0.14, bottom: float = 0.48,
             top: float = TOP_IN, wspace: float = 0.3) -> None:
    """Fixed margins in inches (faster than a layout engine, and the same on every figure)."""
    width, height = fig.get_size_inches()
    fig.subplots_adjust(left=left / width, right=1 - right / width, bottom=bottom / height,
                        top=1 - top / height, wspace=wspace)


def _new(kind: str, size: tuple[float, float] = SIZE_IN) -> tuple[MplFigure, Axes]:
    """A figure of one axes (a kept one of this ``kind``, as if new) with the fixed margins."""
    fig, (ax,) = _KEPT.take(kind, size)
    _margins(fig)
    return fig, ax


def _legend_below(fig: MplFigure, ax: Axes, handles: Sequence[Line2D | Patch],
                  ncol: int = 2, left: float = 0.62, top: float = TOP_IN,
                  wspace: float = 0.3) -> None:
    """The legend under the axes, never over the data: the figure grows to hold it."""
    rows = -(-len(handles) // ncol)
    width, height = fig.get_size_inches()
    axes_height = height - 0.48 - top
    axes_width = ax.get_position().width * width
    extra = 0.1 + 0.155 * rows
    fig.set_size_inches(width, height + extra)
    _margins(fig, left=left, bottom=0.48 + extra, top=top, wspace=wspace)
    # From near the figure's left edge, so that two columns of labels have its whole width.
    ax.add_artist(LightLegend(handles, loc="upper left", transform=ax.transAxes,
                              anchor=(-(left - 0.12) / axes_width, -0.44 / axes_height),
                              ncol=ncol, border_pad=0.0, handlelength=2.4,
                              columnspacing=1.4, fontsize=7.5))


def _titles(ax: Axes, title: str, names: str = "") -> None:
    """A bold title and, above the axes under it, the pair or component it shows."""
    ax.set_title(title, loc="left", pad=15 if names else 6)
    if names:
        ax.add_artist(LightText(0.0, 1.0, names, va="bottom", ha="left", fontsize=8,
                                color="#3a444c", clip_on=False, transform=ax.transAxes
                                + ScaledTranslation(0, 4 / 72, ax.figure.dpi_scale_trans)))


def _plain_log(axis: Any) -> None:
    """Plain numbers on a logarithmic axis (10, 20, 50, 100 rather than 10^1, 10^2)."""
    axis.set_major_formatter(FuncFormatter(lambda v, _pos: f"{v:g}"))
    axis.set_minor_formatter(FuncFormatter(
        lambda v, _pos: f"{v:g}" if f"{v:.1e}"[0] in "25" else ""))


def _size_px(fig: MplFigure) -> tuple[int, int]:
    width, height = fig.get_size_inches()
    return round(width * 96), round(height * 96)


def _svg(fig: MplFigure) -> bytes:
    return svg_bytes(fig)


def _runs(mask: BoolArray) -> list[tuple[int, int]]:
    """Half-open index ranges of consecutive True values."""
    padded = np.concatenate([[False], mask, [False]]).astype(np.int8)
    edges = np.flatnonzero(np.diff(padded))
    return [(int(a), int(b)) for a, b in zip(edges[::2], edges[1::2], strict=True)]


def _mark_indices(coordinate: FloatArray, usable: BoolArray) -> list[int]:
    """Indices of usable points nearest to compositions 0, 0.1, ... 1 (for markers)."""
    idx = np.flatnonzero(usable)
    if idx.size == 0:
        return []
    # For every target at once: its nearest usable point (the first of equals) if near.
    gaps = np.abs(coordinate[idx][None, :] - _MARK_AT[:, None])
    nearest = np.argmin(gaps, axis=1)
    close = gaps[np.arange(_MARK_AT.size), nearest] < 0.04
    return sorted({int(k) for k in idx[nearest[close]]})


def _draw(ax: Axes, x: FloatArray, y: FloatArray, usable: BoolArray, extrapolated: BoolArray,
          *, colour: str, marker: str, open_marker: bool = False, along: FloatArray | None = None,
          linewidth: float | None = None) -> list[tuple[int, int]]:
    """A line over the usable points, dashed where extrapolated, with sparse markers.

    Returns the index ranges drawn dashed (for the "extrapolated" labels).
    """
    ok = usable & np.isfinite(x) & np.isfinite(y)
    dashed: list[tuple[int, int]] = []
    lw = linewidth or float(STYLE["lines.linewidth"])  # type: ignore[arg-type]
    for start, stop in _runs(ok):
        seg_ex = extrapolated[start:stop]
        for a, b in _runs(~seg_ex):
            lo, hi = start + a, start + b
            plot_line(ax, x[lo:hi], y[lo:hi], color=colour, linewidth=lw, linestyle="-",
                      solid_capstyle="butt", zorder=3)
        for a, b in _runs(seg_ex):
            lo, hi = max(start + a - 1, start), min(start + b + 1, stop)  # joins both ends
            plot_line(ax, x[lo:hi], y[lo:hi], color=colour, linewidth=lw,
                      linestyle=(0, (4.0, 2.2)), zorder=3)
            dashed.append((lo, hi))
    marks = _mark_indices(x if along is None else along, ok)
    if marks:
        plot_line(ax, x[marks], y[marks], linestyle="none", marker=marker, color=colour,
                  markerfacecolor="white" if open_marker else colour, markeredgewidth=1.1,
                  zorder=4)
    return dashed


def _label_extrapolated(ax: Axes, x: FloatArray, y: FloatArray,
                        dashed: Sequence[tuple[int, int]], total: int) -> None:
    """Write "extrapolated" beside the longest dashed stretch."""
    if not dashed:
        return
    lo, hi = max(dashed, key=lambda r: r[1] - r[0])
    if hi - lo < 2:
        return
    if hi - lo >= total - 1:
        return  # the legend says "whole curve"
    mid = (lo + hi) // 2
    ax.annotate("extrapolated", (float(x[mid]), float(y[mid])), xytext=(6, 8),
                textcoords="offset points", fontsize=7.5, style="italic", color=GREY,
                zorder=6, bbox={"boxstyle": "round,pad=0.15", "fc": "white", "ec": "none",
                                "alpha": 0.85})


def _extrapolated_handle(whole: bool = False) -> Line2D:
    text = "extrapolated: the whole curve" if whole else "extrapolated (dashed)"
    return Line2D([], [], color=GREY, linestyle=(0, (4.0, 2.2)), linewidth=1.4, label=text)


def _composition_axis(ax: Axes, name1: str, what: str = "x1 (liquid), y1 (vapour)") -> None:
    ax.set_xlim(0.0, 1.0)
    ax.set_xlabel(f"{what}: mole fraction of {mpl_text(name1)}")


def _azeotrope_marks(ax: Axes, points: Sequence[tuple[float, float]]) -> None:
    for x, y in points:
        plot_line(ax, [x], [y], marker="*", markersize=12, color="black",
                  markeredgecolor="white", markeredgewidth=0.6, linestyle="none", zorder=7)


def _hetero_mask(result: ConditionResult) -> BoolArray:
    return np.asarray(result.drawable, dtype=bool)


# ---------------------------------------------------------------------------
# Pair figures
# ---------------------------------------------------------------------------


def _diagram(results: PairResults, result: ConditionResult, display: Display,
             folder: str, overlay: Overlay | None = None) -> Figure:
    """Txy (isobar) or Pxy (isotherm) diagram of one condition (``overlay`` draws more
    lines on its axes and returns their legend handles)."""
    curve = result.curve
    n1, n2 = results.component1.name, results.component2.name
    isobar = result.kind == "isobar"
    y_values = (display.T_values(curve.T_K) if isobar
                else np.asarray(curve.P_Pa, dtype=float) / display.settings.pressure_factor)
    y_values = np.asarray(y_values, dtype=float)
    usable = _hetero_mask(result)
    extrap = np.asarray(result.extrapolated, dtype=bool)
    label = display.condition(result)
    fig, ax = _new("diagram")
    dashed = _draw(ax, curve.x1, y_values, usable, extrap, colour=BUBBLE_COLOUR, marker="o")
    dashed_dew = _draw(ax, curve.y1, y_values, usable, extrap, colour=DEW_COLOUR, marker="s",
                       open_marker=True)
    handles = [
        Line2D([], [], color=BUBBLE_COLOUR, marker="o", label="bubble line (liquid x1)"),
        Line2D([], [], color=DEW_COLOUR, marker="s", markerfacecolor="white",
               label="dew line (vapour y1)"),
    ]
    three = result.three_phase
    notes: list[str] = []
    if three is not None:
        xa, xb = three.x1_a, three.x1_b
        level = (display.T_value(three.T_K) if isobar
                 else three.P_Pa / display.settings.pressure_factor)
        plot_line(ax, [xa, xb], [level, level], color="#4b4b4b", linewidth=3.2,
                  solid_capstyle="butt", zorder=5)
        plot_line(ax, [three.y1], [level], marker="o", markersize=5, color="white",
                  markeredgecolor="#4b4b4b", markeredgewidth=1.4, linestyle="none", zorder=6)
        handles.append(Line2D([], [], color="#4b4b4b", linewidth=3.2,
                              label="three-phase line"))
        notes.append(f"a three-phase line from x1 = {fmt(xa, 3)} to {fmt(xb, 3)}")
    az_points = []
    for a in result.azeotropes:
        level = display.T_value(a.T_K) if isobar else a.P_Pa / display.settings.pressure_factor
        az_points.append((a.x1, float(level)))
        where = display.T(a.T_K) if isobar else display.P(a.P_Pa)
        handles.append(Line2D([], [], marker="*", markersize=11, color="black",
                              linestyle="none",
                              label=f"azeotrope x1 = {fmt(a.x1, 3)}, {where}"))
        notes.append(f"a {a.kind} azeotrope at x1 = {fmt(a.x1, 3)}, {where}")
    _azeotrope_marks(ax, az_points)
    critical = curve.critical
    if critical is not None:
        level = (display.T_value(critical.T_K) if isobar
                 else critical.P_Pa / display.settings.pressure_factor)
        plot_line(ax, [critical.x1], [float(level)], marker="D", markersize=7, color="white",
                  markeredgecolor="black", markeredgewidth=1.4, linestyle="none", zorder=7)
        where = display.T(critical.T_K) if isobar else display.P(critical.P_Pa)
        handles.append(Line2D([], [], marker="D", markersize=7, color="white",
                              markeredgecolor="black", linestyle="none",
                              label=f"mixture critical point x1 = {fmt(critical.x1, 3)}, {where}"))
        notes.append(f"the curve ending at the mixture critical point, x1 = "
                     f"{fmt(critical.x1, 3)}, {where}")
    if curve.no_two_phase:
        ax.text(0.5, 0.5, curve.no_two_phase, transform=ax.transAxes, ha="center",
                va="center", wrap=True)
        notes.append(curve.no_two_phase)
    if overlay is not None:
        handles += overlay(ax)
    if dashed or dashed_dew:
        drawn = int(usable.sum())
        whole = bool(dashed) and max(hi - lo for lo, hi in dashed) >= drawn - 1
        handles.append(_extrapolated_handle(whole))
        _label_extrapolated(ax, curve.x1, y_values, dashed, drawn)
    _composition_axis(ax, n1)
    ax.set_ylabel(f"Temperature / {display.T_unit}" if isobar
                  else f"Pressure / {display.P_unit}")
    kind = "Txy" if isobar else "Pxy"
    _titles(ax, f"{kind} at {label}", f"{mpl_text(n1)} (1) + {mpl_text(n2)} (2)")
    finite = y_values[usable & np.isfinite(y_values)]
    if finite.size:
        span = float(finite.max() - finite.min()) or 1.0
        ax.set_ylim(float(finite.min()) - 0.06 * span, float(finite.max()) + 0.12 * span)
    _legend_below(fig, ax, handles)
    share = float(extrap[usable].mean()) if usable.any() else 0.0
    alt = (f"{kind} diagram of {one_line(n1)} (1) and {one_line(n2)} (2) at {label}: the "
           f"bubble line (liquid) and the dew line (vapour) plotted as "
           f"{'temperature' if isobar else 'pressure'} against the mole fraction of "
           f"{one_line(n1)}"
           + (f", with {' and '.join(notes)}" if notes else ", with no azeotrope")
           + (f"; {share:.0%} of the curve is extrapolated and drawn dashed" if share else "")
           + ".")
    caption = (f"{kind} diagram at {label}. Bubble line: filled circles; dew line: open "
               "squares" + ("; dashed parts are extrapolated" if share else "") + ".")
    slug = condition_slug(result)
    width, height = _size_px(fig)
    return Figure(path=f"{folder}/{kind.lower()}-{slug}.svg", svg=_svg(fig), alt=alt,
                  caption=caption, group="condition", slug=slug, width_px=width,
                  height_px=height)


def _styles(count: int) -> list[tuple[str, str]]:
    return [(PALETTE[i % len(PALETTE)], MARKERS[i % len(MARKERS)]) for i in range(count)]


def _xy(results: PairResults, display: Display, folder: str) -> Figure:
    n1, n2 = results.component1.name, results.component2.name
    fig, ax = _new("xy", (4.4, 3.9))
    plot_line(ax, [0, 1], [0, 1], color=GREY, linewidth=0.9, linestyle=(0, (1, 2)), zorder=2)
    handles = [Line2D([], [], color=GREY, linewidth=0.9, linestyle=(0, (1, 2)),
                      label="diagonal")]
    any_dashed = False
    labels = []
    for (colour, marker), result in zip(_styles(len(results.conditions)), results.conditions,
                                        strict=True):
        curve = result.curve
        usable = _hetero_mask(result)
        dashed = _draw(ax, curve.x1, curve.y1, usable, np.asarray(result.extrapolated, bool),
                       colour=colour, marker=marker)
        any_dashed |= bool(dashed)
        three = result.three_phase
        if three is not None:
            plot_line(ax, [three.x1_a, three.x1_b], [three.y1, three.y1], color=colour,
                      linewidth=2.6, solid_capstyle="butt", zorder=3)
        for a in result.azeotropes:
            plot_line(ax, [a.x1], [a.x1], marker="*", markersize=10, color="black",
                      markeredgecolor="white", markeredgewidth=0.5, linestyle="none", zorder=6)
        cond = display.condition(result)
        labels.append(cond)
        handles.append(Line2D([], [], color=colour, marker=marker, label=cond))
    if any(r.azeotropes for r in results.conditions):
        handles.append(Line2D([], [], marker="*", markersize=9, color="black", linestyle="none",
                              label="azeotrope"))
    if any_dashed:
        handles.append(_extrapolated_handle())
    ax.set_xlim(0, 1)
    ax.set_ylim(0, 1)
    ax.set_aspect("equal")
    ax.set_xlabel(f"x1: liquid mole fraction of {mpl_text(n1)}")
    ax.set_ylabel(f"y1: vapour mole fraction of {mpl_text(n1)}")
    _titles(ax, "xy diagram", f"{mpl_text(n1)} (1) + {mpl_text(n2)} (2)")
    _legend_below(fig, ax, handles)
    alt = (f"xy diagram of {one_line(n1)} (1) and {one_line(n2)} (2): vapour mole fraction "
           f"y1 against liquid mole fraction x1 at {', '.join(labels)}, with the diagonal"
           + ("; curves cross the diagonal at azeotropes"
              if any(r.azeotropes for r in results.conditions) else "")
           + ("; dashed parts are extrapolated" if any_dashed else "") + ".")
    width, height = _size_px(fig)
    return Figure(path=f"{folder}/xy.svg", svg=_svg(fig), alt=alt,
                  caption="xy diagram with the diagonal, one curve per published condition.",
                  group="xy", width_px=width, height_px=height)


def _gamma(results: PairResults, display: Display, folder: str) -> Figure:
    n1, n2 = results.component1.name, results.component2.name
    fig, ax = _new("gamma")
    handles = []
    any_dashed = False
    # Where each curve family starts (ln γ1 at its first drawn point, ln γ2 at its last),
    # and its next point inwards: the family's label goes beside the outermost end, above
    # it where the curves fall away from their ends (positive deviations) and below it where
    # they rise, so that it never sits on a curve.
    ends1: list[tuple[float, float, float]] = []
    ends2: list[tuple[float, float, float]] = []
    for (colour, marker), result in zip(_styles(len(results.conditions)), results.conditions,
                                        strict=True):
        curve = result.curve
        usable = _hetero_mask(result)
        ex = np.asarray(result.extrapolated, bool)
        with np.errstate(divide="ignore", invalid="ignore"):
            g1 = np.log(np.asarray(curve.gamma1, dtype=float))
            g2 = np.log(np.asarray(curve.gamma2, dtype=float))
        d1 = _draw(ax, curve.x1, g1, usable, ex, colour=colour, marker=marker)
        d2 = _draw(ax, curve.x1, g2, usable, ex, colour=colour, marker=marker, open_marker=True)
        any_dashed |= bool(d1 or d2)
        ok = np.flatnonzero(usable & np.isfinite(g1) & np.isfinite(g2))
        if ok.size > 1:
            ends1.append((float(curve.x1[ok[0]]), float(g1[ok[0]]), float(g1[ok[1]])))
            ends2.append((float(curve.x1[ok[-1]]), float(g2[ok[-1]]), float(g2[ok[-2]])))
        handles.append(Line2D([], [], color=colour, marker=marker, label=display.condition(result)))
    for text, ends, side in (("ln γ1", ends1, 1), ("ln γ2", ends2, -1)):
        if ends:
            up = sum(end[1] - end[2] for end in ends) >= 0  # the curves fall inwards
            x_end, at, _ = (max if up else min)(ends, key=lambda end: end[1])
            ax.annotate(text, (x_end, at), xytext=(6 * side, 7 if up else -7),
                        textcoords="offset points", va="bottom" if up else "top",
                        ha="left" if side > 0 else "right", fontsize=8,
                        fontweight="bold", color="#3a444c",
                        bbox={"boxstyle": "square,pad=0.1", "facecolor": "white",
                              "edgecolor": "none", "alpha": 0.85})
    if ends1 or ends2:
        ax.margins(y=0.14)  # room beside the outermost ends for the labels
    handles.append(Line2D([], [], color=GREY, marker="o", linestyle="none", label="ln γ1 (filled)"))
    handles.append(Line2D([], [], color=GREY, marker="o", markerfacecolor="white",
                          linestyle="none", label="ln γ2 (open)"))
    if any_dashed:
        handles.append(_extrapolated_handle())
    ax.axhline(0.0, color="#3a444c", linewidth=0.7, zorder=2)
    _composition_axis(ax, n1, "x1")
    ax.set_ylabel("ln γ (activity coefficient)")
    _titles(ax, "Activity coefficients", f"{mpl_text(n1)} (1) + {mpl_text(n2)} (2)")
    _legend_below(fig, ax, handles)
    alt = (f"Natural logarithm of the activity coefficients of {one_line(n1)} (ln γ1, filled "
           f"markers) and {one_line(n2)} (ln γ2, open markers) against x1, on the bubble "
           f"line of each published condition; ideal solution is ln γ = 0.")
    width, height = _size_px(fig)
    return Figure(path=f"{folder}/gamma.svg", svg=_svg(fig), alt=alt, width_px=width,
                  height_px=height,
                  caption="Activity coefficients along the bubble line (model "
                          f"{results.pair.model.name}); ln γ = 0 is the ideal solution.",
                  group="gamma")


def _alpha(results: PairResults, display: Display, folder: str) -> Figure:
    n1, n2 = results.component1.name, results.component2.name
    fig, ax = _new("alpha")
    handles = []
    any_dashed = False
    values = []
    for (colour, marker), result in zip(_styles(len(results.conditions)), results.conditions,
                                        strict=True):
        curve = result.curve
        usable = _hetero_mask(result)
        alpha = np.asarray(curve.alpha12, dtype=float)
        any_dashed |= bool(_draw(ax, curve.x1, alpha, usable,
                                 np.asarray(result.extrapolated, bool), colour=colour,
                                 marker=marker))
        values.extend(alpha[usable & np.isfinite(alpha) & (alpha > 0)].tolist())
        handles.append(Line2D([], [], color=colour, marker=marker, label=display.condition(result)))
    ax.axhline(1.0, color="black", linewidth=0.9, linestyle=(0, (1, 2)), zorder=2)
    handles.append(Line2D([], [], color="black", linewidth=0.9, linestyle=(0, (1, 2)),
                          label="α12 = 1 (azeotrope)"))
    if any_dashed:
        handles.append(_extrapolated_handle())
    if values and max(values) / min(values) > 20:
        ax.set_yscale("log")
        _plain_log(ax.yaxis)
    _composition_axis(ax, n1, "x1")
    ax.set_ylabel("α12 = (y1/x1) / (y2/x2)")
    _titles(ax, "Relative volatility", f"{mpl_text(n1)} (1) + {mpl_text(n2)} (2)")
    _legend_below(fig, ax, handles)
    alt = (f"Relative volatility α12 of {one_line(n1)} to {one_line(n2)} against x1 for each "
           "published condition, with the line α12 = 1 where an azeotrope lies.")
    width, height = _size_px(fig)
    return Figure(path=f"{folder}/alpha.svg", svg=_svg(fig), alt=alt, width_px=width,
                  height_px=height,
                  caption="Relative volatility along the bubble line; below 1 component 2 is "
                          "the more volatile.", group="alpha")


def _trace(results: PairResults, display: Display, folder: str,
           overlay: TraceOverlay | None = None) -> Figure | None:
    trace = results.trace
    if trace is None:
        return None
    P = np.asarray(trace.P_Pa, dtype=float) / display.settings.pressure_factor
    x1 = np.asarray(trace.x1, dtype=float)
    T = display.T_values(np.asarray(trace.T_K, dtype=float))
    ok = np.isfinite(P) & np.isfinite(x1) & np.isfinite(T)
    if ok.sum() < 2:
        return None
    ex = np.asarray(trace.extrapolated, dtype=bool)
    fig, (left, right) = _KEPT.take("trace", (4.4, 2.8), 1, 2)
    _margins(fig, right=0.1, top=0.3, wspace=0.55)
    d1 = _draw(left, P, x1, ok, ex, colour=PALETTE[0], marker="o", along=np.linspace(0, 1, P.size))
    d2 = _draw(right, P, T, ok, ex, colour=PALETTE[1], marker="s",
               along=np.linspace(0, 1, P.size))
    for ax in (left, right):
        ax.set_xscale("log")
        _plain_log(ax.xaxis)
        ax.set_xlabel(f"Pressure / {display.P_unit}")
    left.set_ylabel("azeotrope x1")
    right.set_ylabel(f"azeotrope temperature / {display.T_unit}")
    left.set_title("Composition")
    right.set_title("Temperature")
    handles = [_extrapolated_handle()] if d1 or d2 else []
    if overlay is not None:
        handles = overlay(left, right) + handles
    if handles:
        _legend_below(fig, left, handles, top=0.3, wspace=0.55)
    n1, n2 = results.component1.name, results.component2.name
    alt = (f"The azeotrope of {one_line(n1)} and {one_line(n2)} followed against pressure: "
           "its composition x1 (left) and temperature (right) on a logarithmic pressure axis.")
    return Figure(path=f"{folder}/azeotrope-trace.svg", svg=_svg(fig), alt=alt,
                  caption="The azeotrope against pressure (pressure swing).", group="trace",
                  width_px=_size_px(fig)[0], height_px=_size_px(fig)[1])


def pair_figures(results: PairResults, settings: SiteSettings,
                 opinion: SecondOpinion | None = None) -> tuple[Figure, ...]:
    """Every figure of one pair's page (with the second opinion drawn beside the fitted
    curves when ``opinion`` is given)."""
    display = Display(settings)
    folder = f"pairs/{safe_id(results.pair.id)}"
    with matplotlib.rc_context(STYLE):  # type: ignore[arg-type]
        figures = [_diagram(results, r, display, folder,
                            txy_overlay(opinion, display, r) if opinion else None)
                   for r in results.conditions]
        if results.conditions:
            figures += [_xy(results, display, folder), _gamma(results, display, folder),
                        _alpha(results, display, folder)]
        trace = _trace(results, display, folder,
                       trace_overlay(opinion, display) if opinion else None)
        if trace is not None:
            figures.append(trace)
    return tuple(figures)


# ---------------------------------------------------------------------------
# Component figure
# ---------------------------------------------------------------------------


def component_figure(component: Component, settings: SiteSettings) -> Figure:
    """Vapour pressure over the correlation's validity range (dashed beyond it)."""
    display = Display(settings)
    vp = component.vapour_pressure
    lo, hi = vp.T_min_K, vp.T_max_K
    margin = 0.08 * (hi - lo)
    T_all = np.linspace(max(lo - margin, 1.0), min(hi + margin, component.critical_temperature_K),
                        241)
    with matplotlib.rc_context(STYLE):  # type: ignore[arg-type]
        fig, ax = _new("vapour-pressure", (4.4, 3.0))
        P = np.asarray(vp.pressure_Pa(T_all), dtype=float) / settings.pressure_factor
        inside = (T_all >= lo) & (T_all <= hi)
        Tx = display.T_values(T_all)
        dashed = _draw(ax, Tx, P, np.ones_like(inside), ~inside, colour=BUBBLE_COLOUR,
                       marker="o", along=(T_all - T_all[0]) / (T_all[-1] - T_all[0]))
        ax.axvspan(display.T_value(lo), display.T_value(hi), color="#e8f0f7", zorder=0)
        Tb = component.normal_boiling_point_K
        handles: list[Line2D | Patch] = [
                   Line2D([], [], color=BUBBLE_COLOUR, marker="o",
                          label="vapour pressure (correlation)"),
                   Patch(color="#e8f0f7", label="validity range")]
        if lo - margin <= Tb <= hi + margin:
            plot_line(ax, [display.T_value(Tb)], [101325.0 / settings.pressure_factor],
                      marker="D", color="black", markersize=5, linestyle="none", zorder=6)
            handles.append(Line2D([], [], marker="D", color="black", linestyle="none",
                                  markersize=5, label="normal boiling point"))
        if dashed:
            handles.append(_extrapolated_handle())
        ax.set_yscale("log")
        _plain_log(ax.yaxis)
        ax.set_xlabel(f"Temperature / {display.T_unit}")
        ax.set_ylabel(f"Vapour pressure / {display.P_unit}")
        _titles(ax, "Vapour pressure", mpl_text(component.name))
        _legend_below(fig, ax, handles)
        svg = _svg(fig)
        width, height = _size_px(fig)
    alt = (f"Vapour pressure of {one_line(component.name)} on a logarithmic axis against "
           f"temperature, solid over the correlation's validity range "
           f"{display.T(lo)} to {display.T(hi)} and dashed (extrapolated) beyond it.")
    return Figure(path=f"components/{safe_id(component.id)}/vapour-pressure.svg", svg=svg,
                  alt=alt, caption=f"Vapour pressure; validity range {display.T(lo)} to "
                  f"{display.T(hi)} shaded.", group="vapour-pressure", width_px=width,
                  height_px=height)
