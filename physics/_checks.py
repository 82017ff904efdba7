"""Input checks shared by the physics modules: each raises ValueError naming what failed.

Physics functions check only what would otherwise give a silent wrong answer or NaN; a check
names the argument, the requirement and a failing value, so that the caller can fix the input.
"""

from __future__ import annotations

import numpy as np


def require(condition, name, requirement, values):
    """Raise ValueError naming the first element of ``values`` where ``condition`` is False.

    Parameters
    ----------
    condition : numpy.ndarray of bool
        True where the values are acceptable (NaN comparisons give False, so NaN fails).
    name : str
        Argument name used in the message.
    requirement : str
        What the values must be, e.g. ``"> 0"``.
    values : numpy.ndarray
        The checked values, same shape as ``condition``.
    """
    bad = ~np.asarray(condition)
    if bad.any():
        flat = bad.ravel()
        i = int(np.flatnonzero(flat)[0])
        raise ValueError(f"{name} must be {requirement}; element {i} is "
                         f"{np.asarray(values).ravel()[i]!r} ({int(flat.sum())} of {flat.size} "
                         "fail)")


def coax_radii(a, b, offset=0.0):
    """Broadcast float arrays ``a, b, |offset|``; ValueError unless ``0 < a < b``, ``|D| < b - a``.

    The message counts the failing designs and gives the radii and offset of the first [m].
    """
    a, b, d = np.broadcast_arrays(*(np.asarray(x, dtype=float) for x in (a, b, offset)))
    d = np.abs(d)
    bad = ~((a > 0.0) & (b > a) & (d < b - a))  # also catches NaN
    if bad.any():
        i = np.flatnonzero(bad.ravel())[0]
        raise ValueError(
            f"{np.count_nonzero(bad)} design(s) outside 0 < a < b and 0 <= |offset| < b - a, "
            f"e.g. a = {float(a.ravel()[i]):.6g} m, b = {float(b.ravel()[i]):.6g} m, "
            f"offset = {float(d.ravel()[i]):.6g} m")
    return a, b, d


def positive(name, values):
    """Float array of ``values``; ValueError naming ``name`` unless every element is > 0."""
    x = np.asarray(values, dtype=float)
    bad = ~(x > 0.0)
    if bad.any():
        raise ValueError(f"{name} must be > 0, got {float(x[bad].ravel()[0]):.6g}")
    return x
