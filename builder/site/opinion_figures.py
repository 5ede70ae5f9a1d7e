"""The second opinion drawn on the fitted pair's figures.

On each Txy diagram (the summary pressure, and the vacuum and pressure isobars
where the fitted set is extrapolated), the predicted bubble and dew lines
(one line style of their own: thin, dotted, dark grey, no markers, named in the
legend); on the azeotrope-against-pressure figure, the predicted azeotrope's
composition and temperature.  Each overlay reads the computed
:class:`~builder.analysis.second_opinion.SecondOpinion` only.
"""

from __future__ import annotations

from collections.abc import Callable

import numpy as np
from matplotlib.axes import Axes
from matplotlib.lines import Line2D

from builder.analysis.results import ConditionResult
from builder.analysis.second_opinion import SecondOpinion
from builder.site.context import Display

__all__ = ["PREDICTED_STYLE", "Overlay", "TraceOverlay", "trace_overlay", "txy_overlay"]

#: Draws on a diagram's axes and returns legend handles.
Overlay = Callable[[Axes], list[Line2D]]
TraceOverlay = Callable[[Axes, Axes], list[Line2D]]

#: The predicted model's line: dotted (the dashed style means "extrapolated"), no markers.
PREDICTED_COLOUR = "#262626"
PREDICTED_STYLE = {"color": PREDICTED_COLOUR, "linestyle": (0, (1.2, 1.6)), "linewidth": 1.4}


def _short(model: str) -> str:
    """The model's name short enough for a legend ("modified UNIFAC" is the Dortmund one)."""
    return model.replace(" (Dortmund)", "")


def txy_overlay(opinion: SecondOpinion, display: Display,
                result: ConditionResult) -> Overlay | None:
    """The predicted Txy lines on an isobar the opinion has (summary or other pressure)."""
    predicted = opinion.isobar_at(result.condition) if result.kind == "isobar" else None
    if predicted is None:
        return None

    def draw(ax: Axes) -> list[Line2D]:
        curve = predicted.curve
        ok = np.asarray(predicted.drawable, dtype=bool)
        T = np.where(ok, display.T_values(np.asarray(curve.T_K, dtype=float)), np.nan)
        ax.plot(curve.x1, T, zorder=4, **PREDICTED_STYLE)  # type: ignore[arg-type]
        ax.plot(curve.y1, T, zorder=4, **PREDICTED_STYLE)  # type: ignore[arg-type]
        return [Line2D([], [], label=f"predicted ({_short(opinion.model)})",
                       **PREDICTED_STYLE)]  # type: ignore[arg-type]

    return draw


def trace_overlay(opinion: SecondOpinion, display: Display) -> TraceOverlay | None:
    """The predicted azeotrope against pressure (composition left, temperature right)."""
    trace = opinion.trace
    if trace is None:
        return None

    def draw(left: Axes, right: Axes) -> list[Line2D]:
        P = np.asarray(trace.P_Pa, dtype=float) / display.settings.pressure_factor
        left.plot(P, trace.x1, marker="^", markersize=3.5, markerfacecolor="white",
                  **PREDICTED_STYLE)  # type: ignore[arg-type]
        right.plot(P, display.T_values(np.asarray(trace.T_K, dtype=float)), marker="^",
                   markersize=3.5, markerfacecolor="white",
                   **PREDICTED_STYLE)  # type: ignore[arg-type]
        return [Line2D([], [], color="#0072B2", marker="o", label="fitted set"),
                Line2D([], [], marker="^", markerfacecolor="white",
                       label=f"predicted ({_short(opinion.model)})",
                       **PREDICTED_STYLE)]  # type: ignore[arg-type]

    return draw
