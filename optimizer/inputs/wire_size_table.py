"""Standard centre-conductor sizes the search can snap to (``[search] inner_diameter_series``).

The metric series are read from the bundled ``catalogs/wire-sizes/standard-sizes.toml`` (each
with its source); the AWG series is generated from its ASTM B258 definition over the gauge range
that file gives.
"""

from __future__ import annotations

import tomllib
from importlib import resources

import numpy as np

from cablefam.physics.wire_sizes import awg_diameter, awg_gauges

#: series name in a sweep file -> table of the sizes file
SERIES = {"metric": "metric", "metric-fine": "metric_fine", "awg": "awg"}


def standard_diameters(series: str) -> np.ndarray:
    """Sorted standard diameters [m] of a series (``metric``, ``metric-fine`` or ``awg``)."""
    text = resources.files("cablefam.catalogs").joinpath("wire-sizes", "standard-sizes.toml").read_text(
        encoding="utf-8")
    table = tomllib.loads(text)[SERIES[series]]
    if series == "awg":
        d = awg_diameter(awg_gauges(table["min_gauge"], table["max_gauge"]))
    else:
        d = np.asarray(table["diameters_m"], dtype=float)
    return np.sort(np.asarray(d, dtype=float))
