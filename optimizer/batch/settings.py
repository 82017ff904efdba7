"""The effective settings of a run (recorded in run-state.json, compared on resume)."""

from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True)
class SweepSettings:
    """Effective settings of a run: the sweep file's, with command-line overrides."""

    seed: int
    generations: int
    population: int
    record_evaluated: bool = False
    evaluations_per_task: int | None = None
    """The sweep file's ``search.evaluations_per_task`` or its override (None: default)."""
