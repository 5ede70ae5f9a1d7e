"""The units of work an executor runs: one pair (compute, then draw) or one component (draw).

Each task carries only what its work reads -- a slice of the catalogue with
the pair, its two components and the references -- so that it pickles small
for another process or another machine.  Each output carries the
:func:`~builder.site.cache.code_version` of the process that made it: the
build refuses work done by a different version of the builder (a cluster
worker with another checkout).
"""

from __future__ import annotations

from dataclasses import dataclass

from builder.analysis.results import PairResults, compute_pair
from builder.analysis.second_opinion import SecondOpinion, second_opinion
from builder.catalogue.loader import Catalogue
from builder.site.cache import code_version
from builder.site.figures import Figure, component_figure, pair_figures
from builder.site.predicted_figures import predicted_figure
from builder.site.settings import SiteSettings

__all__ = ["ComponentOutput", "ComponentTask", "PairOutput", "PairTask", "component_task",
           "pair_task", "run_component", "run_pair"]


@dataclass(frozen=True)
class PairTask:
    pair_id: str
    catalogue: Catalogue  # the pair, its two components and the references
    settings: SiteSettings
    predicted: bool = False  # a predicted pair (no fitted set): one combined figure


@dataclass(frozen=True)
class PairOutput:
    results: PairResults
    figures: tuple[Figure, ...]
    opinion: SecondOpinion | None  # the predictive model beside a fitted pair
    code_version: str


@dataclass(frozen=True)
class ComponentTask:
    component_id: str
    catalogue: Catalogue  # the component and the references
    settings: SiteSettings


@dataclass(frozen=True)
class ComponentOutput:
    figure: Figure
    code_version: str


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


def run_pair(task: PairTask) -> PairOutput:
    """Compute one pair (and, for a fitted pair, the predictive model's second opinion when
    the settings ask for it) and draw its figures."""
    results = compute_pair(task.catalogue, task.catalogue.pairs[task.pair_id])
    if task.predicted:
        return PairOutput(results, predicted_figure(results, task.settings), None,
                          code_version())
    opinion = (second_opinion(task.catalogue, results, task.settings.summary_pressure_Pa)
               if task.settings.second_opinion else None)
    return PairOutput(results, pair_figures(results, task.settings, opinion), opinion,
                      code_version())


def run_component(task: ComponentTask) -> ComponentOutput:
    """Draw one component's figure."""
    component = task.catalogue.components[task.component_id]
    return ComponentOutput(component_figure(component, task.settings), code_version())
