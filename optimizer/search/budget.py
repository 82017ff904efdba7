"""How a task spends its evaluations: dense quasi-random, refinement, then the genetic search.

``population`` and ``generations`` keep their meaning from the sweep file: the size and length
of the genetic stage (pymoo's NSGA-II, or GA / NSGA-III). The dense and refinement stages come
before it and share the rest of the task's budget, ``evaluations_per_task``
(:data:`DENSE_SHARE` of it dense); without that key the budget is
``max(DEFAULT_EVALUATIONS_PER_TASK, 2 x population x generations)``, so the vectorized stages
always get at least half. All counts are whole numbers fixed before the task starts: equal
settings give equal runs. A wall-clock budget (``time_budget_s``) instead lets the genetic
stage run until the task's share of the time is used (not byte-reproducible).
"""

from __future__ import annotations

from dataclasses import dataclass

#: Evaluations per task when the sweep file gives none (about half a second of physics).
DEFAULT_EVALUATIONS_PER_TASK = 100_000
#: Share of the non-genetic evaluations that goes to the dense stage (the rest: refinement).
DENSE_SHARE = 0.4
#: Smallest dense stage: a few quasi-random points per material combination at least.
MIN_DENSE_EVALUATIONS = 64


@dataclass(frozen=True)
class Budget:
    """Evaluation counts of one task."""

    total: int
    dense: int
    refine: int
    population: int
    generations: int
    """Generations of the genetic stage (its first one evaluates the seeded population)."""


def task_budget(population: int, generations: int,
                evaluations_per_task: int | None = None) -> Budget:
    """Split a task's evaluations between the dense stage and the genetic stage."""
    genetic = population * generations
    if evaluations_per_task is None:
        total = max(DEFAULT_EVALUATIONS_PER_TASK, 2 * genetic)
    else:
        total = int(evaluations_per_task)
    rest = max(total - genetic, MIN_DENSE_EVALUATIONS)
    dense = max(int(round(DENSE_SHARE * rest)), MIN_DENSE_EVALUATIONS)
    return Budget(total=rest + genetic, dense=dense, refine=rest - dense,
                  population=population, generations=generations)
