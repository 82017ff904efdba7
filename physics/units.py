"""Unit conversions used at the edges (reports, Parquet columns, JSON keys).

Inside :mod:`physics` everything is SI; these are the only places where other units appear.
"""

from __future__ import annotations

import numpy as np

#: Decibels per neper, 20 / ln(10) (definition of the neper and the decibel, ISO 80000-3).
DB_PER_NEPER = 20.0 / np.log(10.0)


def neper_per_m_to_db_per_100m(alpha):
    """Convert an attenuation constant [Np m^-1] to [dB (100 m)^-1]."""
    return np.asarray(alpha) * DB_PER_NEPER * 100.0


def db_per_100m_to_neper_per_m(alpha_db):
    """Convert an attenuation [dB (100 m)^-1] to an attenuation constant [Np m^-1]."""
    return np.asarray(alpha_db) / (DB_PER_NEPER * 100.0)


def per_m_to_per_km(value):
    """Convert a per-metre quantity (mass [kg m^-1], resistance [ohm m^-1], cost) to per km."""
    return np.asarray(value) * 1000.0
