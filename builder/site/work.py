"""The units of work an executor runs: one pair (compute, then draw) or one component (draw).

Each task carries only what its work reads -- a slice of the catalogue with
the pair, its two components and the references -- so that it pickles small
for another process or another machine.  Each output carries the
:func:`~builder.site.cache.code_version` of the process that made it: the
build refuses work done by a different version of the builder (a cluster
worker with another checkout).

A pair whose computation or drawing raises does not stop the build: the
worker returns a :class:`PairFailure` (which pair, the exception's type and
message, where it was raised) instead of a :class:`PairOutput`, and the
build reports it (:mod:`.build`) and never stores it in the cache, so the
next build tries the pair again.
"""

from __future__ import annotations

import traceback
from dataclasses import dataclass, replace
from pathlib import Path

from builder.analysis.catalogue_checks import check_component, failure_lines
from builder.analysis.results import compute_pair
from builder.analysis.second_opinion import second_opinion
from builder.catalogue.loader import Catalogue
from builder.site.cache import code_version
from builder.site.figures import Figure, component_figure, pair_figures
from builder.site.pair_entry import PairEntry
from builder.site.pair_files import Files, pair_files
from builder.site.predicted_figures import predicted_figure
from builder.site.settings import SiteSettings

__all__ = ["ComponentOutput", "ComponentTask", "PairFailure", "PairOutput", "PairTask",
           "component_task", "pair_task", "run_component", "run_pair"]

#: The builder package: where a failure was raised is named relative to its parent.
_PACKAGE_PARENT = Path(__file__).resolve().parent.parent.parent


@dataclass(frozen=True)
class PairTask:
    pair_id: str
    catalogue: Catalogue  # the pair, its two components and the references
    settings: SiteSettings
    predicted: bool = False  # a predicted pair (no fitted set): one combined figure


@dataclass(frozen=True)
class PairOutput:
    """One pair's work: its entry for the atlas-wide pages and its own files.

    The build keeps the files apart (in the cache, :meth:`~.cache.BuildCache.put`) and
    holds only the entry (:meth:`lean`); the assembler reads the files when it writes
    them.
    """

    entry: PairEntry
    code_version: str
    files: Files = ()  # its page, downloads and figures (:mod:`.pair_files`)

    def lean(self) -> PairOutput:
        """This output without its files."""
        return replace(self, files=())


@dataclass(frozen=True)
class PairFailure:
    """A pair whose computation (or drawing) raised: reported by the build, never cached."""

    pair_id: str
    error_type: str  # the exception's class name, e.g. "ZeroDivisionError"
    message: str  # the exception's message
    where: str  # the innermost frame in the builder's code, "builder/x.py:123 in f"
    predicted: bool
    code_version: str

    @property
    def reason(self) -> str:
        """One line for a page or a list: ``the computation failed: <type>: <message>``."""
        text = " ".join(self.message.split()) or "(no message)"
        return f"the computation failed: {self.error_type}: {text}"


def _where(error: BaseException) -> str:
    """The innermost frame of ``error``'s traceback that lies in the builder's own code."""
    found = ""
    for frame in traceback.extract_tb(error.__traceback__):
        path = Path(frame.filename).resolve()
        if _PACKAGE_PARENT in path.parents:
            found = f"{path.relative_to(_PACKAGE_PARENT).as_posix()}:{frame.lineno} in {frame.name}"
    return found


@dataclass(frozen=True)
class ComponentTask:
    component_id: str
    catalogue: Catalogue  # the component and the references
    settings: SiteSettings


@dataclass(frozen=True)
class ComponentOutput:
    figure: Figure
    code_version: str
    #: Its failed reference checks, located (file, entry, check): a pair of a component
    #: that fails one is withheld (:func:`builder.analysis.catalogue_checks.failed_sets`).
    failures: tuple[str, ...] = ()


def pair_task(catalogue: Catalogue, pair_id: str, settings: SiteSettings,
              predicted: bool = False) -> PairTask:
    pair = catalogue.pairs[pair_id]
    components = {cid: catalogue.components[cid] for cid in (pair.component1, pair.component2)}
    part = Catalogue(root=catalogue.root, references=catalogue.references,
                     components=components, pairs={pair_id: pair})
    return PairTask(pair_id, part, settings, predicted)


def component_task(catalogue: Catalogue, component_id: str,
                   settings: SiteSettings) -> ComponentTask:
    part = Catalogue(root=catalogue.root, references=catalogue.references,
                     components={component_id: catalogue.components[component_id]}, pairs={})
    return ComponentTask(component_id, part, settings)


def run_pair(task: PairTask) -> PairOutput | PairFailure:
    """Compute one pair (and, for a fitted pair, the predictive model's second opinion when
    the settings ask for it), draw its figures and make its page and downloads; a
    :class:`PairFailure` when that raises.

    Any :class:`Exception` is caught -- one numerical corner case among thousands of
    combinations must not stop the atlas -- and reported with the pair; an interrupt
    (``KeyboardInterrupt``, ``SystemExit``) still ends the build.
    """
    try:
        return _compute_and_draw(task)
    except Exception as error:
        return PairFailure(task.pair_id, type(error).__name__, str(error), _where(error),
                           task.predicted, code_version())


def _compute_and_draw(task: PairTask) -> PairOutput:
    results = compute_pair(task.catalogue, task.catalogue.pairs[task.pair_id])
    opinion = None
    if task.predicted:
        figures = predicted_figure(results, task.settings)
    else:
        opinion = (second_opinion(task.catalogue, results, task.settings.summary_pressure_Pa)
                   if task.settings.second_opinion else None)
        figures = pair_figures(results, task.settings, opinion)
    made = pair_files(task.catalogue, results, figures, opinion, task.settings,
                      task.predicted)
    return PairOutput(made.entry, code_version(), made.files)


def run_component(task: ComponentTask) -> ComponentOutput:
    """Draw one component's figure and check its vapour pressure against the references
    (kept with the figure in the cache: the reference libraries are not loaded again for
    an unchanged component)."""
    component = task.catalogue.components[task.component_id]
    return ComponentOutput(component_figure(component, task.settings), code_version(),
                           failure_lines(check_component(component)))
