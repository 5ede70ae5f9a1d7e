"""Shared fixtures: the shipped catalogue and the equilibrium system of each pair."""

from __future__ import annotations

import os
import warnings

import pytest

from builder.analysis.point import system_for
from builder.analysis.results import PairResults, compute_atlas
from builder.catalogue.loader import Catalogue, load_catalogue
from builder.thermo.equilibrium import BinarySystem

# The reference libraries print deprecation chatter on import; it is not ours.
warnings.filterwarnings("ignore", category=DeprecationWarning)
os.environ.setdefault("MPLBACKEND", "Agg")


@pytest.fixture(scope="session")
def catalogue() -> Catalogue:
    return load_catalogue()


@pytest.fixture(scope="session")
def atlas_results(catalogue: Catalogue) -> dict[str, PairResults]:
    """Every pair computed once per test session (read-only records)."""
    return compute_atlas(catalogue)


@pytest.fixture(scope="session")
def systems(catalogue: Catalogue) -> dict[str, BinarySystem]:
    return {pid: system_for(pair, catalogue) for pid, pair in catalogue.pairs.items()}
