"""The one figure of a predicted pair page: Txy and xy side by side.

Predicted pages are many (one per combination without a fitted set), so each
carries one combined figure instead of the fitted pages' set: the Txy diagram at
the summary pressure (bubble line filled circles, dew line open squares, the
three-phase line a thick grey bar, azeotropes black stars) and the xy diagram
beside it, in the atlas's figure style (:mod:`.figures`).  It reads the computed
results only.
"""

from __future__ import annotations

import matplotlib
import numpy as np
from matplotlib.figure import Figure as MplFigure
from matplotlib.lines import Line2D
from matplotlib.transforms import ScaledTranslation

from builder.analysis.results import ConditionResult, PairResults
from builder.site.context import Display, condition_slug, summary_condition
from builder.site.figures import BUBBLE_COLOUR, DEW_COLOUR, STYLE, Figure
from builder.site.figures_canvas import Kept, plot_line, svg_bytes
from builder.site.figures_legend import LightLegend
from builder.site.figures_text import LightText
from builder.site.settings import SiteSettings
from builder.site.text import fmt, mpl_text, one_line, safe_id

__all__ = ["predicted_figure"]

SIZE_IN = (7.6, 3.5)
_MARKS = np.linspace(0.0, 1.0, 11)
#: The combined figure, kept for reuse in this process (see :class:`.figures_canvas.Kept`).
_KEPT = Kept()


def _every_tenth(x1: np.ndarray) -> list[int]:
    return sorted({int(np.argmin(np.abs(x1 - m))) for m in _MARKS})


def _draw(results: PairResults, result: ConditionResult, display: Display) -> MplFigure:
    curve = result.curve
    ok = np.asarray(result.drawable, dtype=bool)
    T = np.where(ok, display.T_values(np.asarray(curve.T_K, dtype=float)), np.nan)
    y1 = np.where(ok, curve.y1, np.nan)
    fig, (txy, xy) = _KEPT.take("txy-xy", SIZE_IN, 1, 2)
    w, h = SIZE_IN
    fig.subplots_adjust(left=0.62 / w, right=1 - 0.15 / w, bottom=0.95 / h, top=1 - 0.5 / h,
                        wspace=0.32)
    marks = _every_tenth(curve.x1)
    plot_line(txy, curve.x1, T, color=BUBBLE_COLOUR, marker="o", markevery=marks)
    plot_line(txy, curve.y1, T, color=DEW_COLOUR, marker="s", markerfacecolor="white",
              markevery=marks)
    plot_line(xy, [0, 1], [0, 1], color="#8a8a8a", linestyle=":", linewidth=0.9)
    plot_line(xy, curve.x1, y1, color=BUBBLE_COLOUR, marker="o", markevery=marks)
    handles = [Line2D([], [], color=BUBBLE_COLOUR, marker="o", label="bubble line (x1)"),
               Line2D([], [], color=DEW_COLOUR, marker="s", markerfacecolor="white",
                      label="dew line (y1)")]
    three = result.three_phase
    if three is not None:
        level = display.T_value(three.T_K)
        plot_line(txy, [three.x1_a, three.x1_b], [level, level], color="#4b4b4b",
                  linewidth=3.2, solid_capstyle="butt", zorder=5)
        plot_line(xy, [three.x1_a, three.x1_b], [three.y1, three.y1], color="#4b4b4b",
                  linewidth=3.2, solid_capstyle="butt", zorder=5)
        handles.append(Line2D([], [], color="#4b4b4b", linewidth=3.2,
                              label="three-phase line"))
    for a in result.azeotropes:
        plot_line(txy, [a.x1], [display.T_value(a.T_K)], marker="*", markersize=11,
                  color="black", linestyle="none", zorder=7)
        plot_line(xy, [a.x1], [a.x1], marker="*", markersize=11, color="black", linestyle="none",
                  zorder=7)
        handles.append(Line2D([], [], marker="*", markersize=11, color="black",
                              linestyle="none", label=f"azeotrope x1 = {fmt(a.x1, 3)}, "
                              f"{display.T(a.T_K)}"))
    n1, n2 = mpl_text(results.component1.name), mpl_text(results.component2.name)
    txy.set_title(f"Txy at {display.condition(result)} (predicted)", loc="left", pad=15)
    txy.add_artist(LightText(0.0, 1.0, f"{n1} (1) + {n2} (2), "
                             f"{mpl_text(results.pair.model.name)}", va="bottom", ha="left",
                             fontsize=8, color="#3a444c", clip_on=False,
                             transform=txy.transAxes + ScaledTranslation(
                                 0, 4 / 72, fig.dpi_scale_trans)))
    txy.set_ylabel(f"Temperature / {display.T_unit}")
    txy.set_xlabel(f"x1, y1: mole fraction of {n1}")
    xy.set_title("xy diagram", loc="left", pad=15)
    xy.set_xlabel(f"x1 (liquid) of {n1}")
    xy.set_ylabel(f"y1 (vapour) of {n1}")
    for ax in (txy, xy):
        ax.set_xlim(0, 1)
    xy.set_ylim(0, 1)
    fig.add_artist(LightLegend(handles, loc="lower left", anchor=(0.06, 0.0),
                               transform=fig.transFigure, ncol=min(4, len(handles)),
                               fontsize=7.5))
    return fig


def predicted_figure(results: PairResults, settings: SiteSettings) -> tuple[Figure, ...]:
    """The combined Txy + xy figure of a predicted pair (none without a summary isobar)."""
    display = Display(settings)
    result = summary_condition(results, settings) or (
        results.isobars[0] if results.isobars else None)
    if result is None:
        return ()
    with matplotlib.rc_context(STYLE):  # type: ignore[arg-type]
        fig = _draw(results, result, display)
        svg = svg_bytes(fig)
    width, height = (round(v * 96) for v in fig.get_size_inches())
    n1, n2 = one_line(results.component1.name), one_line(results.component2.name)
    kinds = [a.kind for a in result.azeotropes]
    alt = (f"Predicted Txy and xy diagrams of {n1} (1) and {n2} (2) at "
           f"{display.condition(result)} ({one_line(results.pair.model.name)}): bubble and "
           f"dew lines against the mole fraction of {n1}"
           + (f", with a {' and a '.join(kinds)} azeotrope" if kinds else ", no azeotrope")
           + (", and a three-phase line" if result.three_phase is not None else "") + ".")
    slug = condition_slug(result)
    folder = f"pairs/{safe_id(results.pair.id)}"
    return (Figure(path=f"{folder}/txy-xy-{slug}.svg", svg=svg, alt=alt,
                   caption=f"Predicted by {one_line(results.pair.model.name)}: Txy (left) "
                   f"and xy (right) at {display.condition(result)}.", group="condition",
                   slug=slug, width_px=width, height_px=height),)
