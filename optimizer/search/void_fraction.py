"""The void fraction of foamable dielectrics as a continuous design variable of the search.

``[search] void_fraction = [low, high]`` gives the bounds. A dielectric record with
``foamable = true`` takes the design's void fraction; every other dielectric keeps its record's
(``void_fraction``, 0 when absent), so the variable is simply idle for designs that chose one.
The dielectric tables handed to the physics carry ``void_fraction`` (and
``reference_frequency_hz``, 0 where a record has none) per design; the impedance construction
solves the dielectric radius from the *effective* permittivity of each design
(:func:`cablefam.optimizer.model.effective_dielectric.resolve_table`).
"""

from __future__ import annotations

import numpy as np

from cablefam.optimizer.model.effective_dielectric import (FOAM_KEY, REFERENCE_FREQUENCY_KEY,
                                                           resolve_table)

#: Name of the decision variable (and of the front column, which evaluate writes).
VOID_FRACTION = "void_fraction"
#: Optional record keys that :func:`record_columns` turns into table columns.
FOAM_RECORD_KEYS = (FOAM_KEY, REFERENCE_FREQUENCY_KEY)


def record_columns(records, searched: bool) -> tuple[dict[str, np.ndarray], np.ndarray]:
    """Extra per-record arrays of the dielectric table and the foamable flags.

    ``void_fraction`` is there when a record has one or the search sets it (0 where absent);
    ``reference_frequency_hz`` when a record has one (0: none for that record).
    """
    foamable = np.array([bool(r.foamable) for r in records], dtype=bool)
    extra = {}
    if searched or any(r.void_fraction is not None for r in records):
        extra[FOAM_KEY] = np.array([r.void_fraction or 0.0 for r in records], dtype=float)
    if any(r.reference_frequency_hz is not None for r in records):
        extra[REFERENCE_FREQUENCY_KEY] = np.array([r.reference_frequency_hz or 0.0
                                                   for r in records], dtype=float)
    return extra, foamable


def with_design_void_fraction(dielectric: dict, foamable: np.ndarray, void_fraction):
    """The dielectric table with the design's void fraction where the material is foamable."""
    return {**dielectric, FOAM_KEY: np.where(foamable, void_fraction, dielectric[FOAM_KEY])}


def effective_permittivity_range(table: dict, foamable: np.ndarray, bounds, frequency_hz):
    """Smallest and largest effective permittivity the search can give any design [-]."""
    values = []
    cases = [None] if bounds is None else [bounds[0], bounds[1]]
    for v in cases:
        t = table if v is None else with_design_void_fraction(table, foamable, v)
        values.append(np.asarray(resolve_table(t, frequency_hz)["relative_permittivity"]))
    values = np.concatenate([np.ravel(x) for x in values])
    return float(values.min()), float(values.max())
