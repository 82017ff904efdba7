r"""Standard solid-wire sizes: the AWG series of ASTM B258 and snapping to a list of sizes.

The American Wire Gauge is a geometric series defined by two anchors, gauge 36 = 0.005 in
(0.127 mm) and gauge 0000 = 0.4600 in (11.684 mm), with 39 steps between them:

.. math:: d(n) = 0.127\,\mathrm{mm} \times 92^{(36 - n)/39}

where the gauges 0000, 000, 00 and 0 carry the numbers :math:`n = -3, -2, -1, 0` [1]_. The
metric diameters live in ``catalogs/wire-sizes/standard-sizes.toml`` (a data file, read at the edge by the
caller; nothing here does I/O).

References
----------
.. [1] ASTM B258, *Standard Specification for Standard Nominal Diameters and Cross-Sectional
   Areas of AWG Sizes of Solid Round Wires Used as Electrical Conductors*, ASTM International
   (defining formula of the gauge series).
"""

from __future__ import annotations

import numpy as np
from scipy.constants import inch

#: Diameter of AWG 36, one anchor of the series: 0.005 in = 0.127 mm exactly (ASTM B258).
AWG_36_DIAMETER = 0.005 * inch
#: Ratio of the AWG 0000 diameter (0.4600 in) to the AWG 36 diameter (0.0050 in) (ASTM B258).
AWG_SPAN_RATIO = 92.0
#: Number of gauge steps between AWG 0000 (n = -3) and AWG 36 (ASTM B258).
AWG_SPAN_STEPS = 39
#: Largest size of the series, AWG 0000, as a gauge number.
AWG_LARGEST_GAUGE = -3

_AUGHT_NAMES = {"0000": -3, "000": -2, "00": -1, "0": 0,
                "4/0": -3, "3/0": -2, "2/0": -1, "1/0": 0}


def awg_gauge_number(name):
    """Gauge number of an AWG size name: ``"0000"``/``"4/0"`` -> -3, ``"00"`` -> -1, ``"18"`` -> 18.

    Parameters
    ----------
    name : str or int
        A gauge as written on wire: ``"0000"`` (or ``"4/0"``), ``"000"``, ``"00"``, ``"0"``,
        or a whole number from 1 up, as a string or an int.

    Returns
    -------
    int
        The number :math:`n` of the ASTM B258 formula.

    Raises
    ------
    ValueError
        For a name that is not an AWG size.
    """
    if isinstance(name, str):
        key = name.strip()
        if key in _AUGHT_NAMES:
            return _AUGHT_NAMES[key]
        if key.isdigit() and not key.startswith("0"):
            return int(key)
        raise ValueError(f"AWG size {name!r} is not a gauge: use 0000, 000, 00, 0 (or 4/0 ... "
                         f"1/0) or a whole number such as 18")
    if isinstance(name, (int, np.integer)) and not isinstance(name, bool):
        return int(_checked_gauges(np.asarray(name)))
    raise ValueError(f"AWG size {name!r} is not a gauge name or number")


def _checked_gauges(gauge):
    """Gauge numbers as a float array; ValueError unless whole and >= -3."""
    g = np.asarray(gauge)
    if g.dtype.kind in "USO":
        g = np.vectorize(awg_gauge_number, otypes=[float])(g)
    g = np.asarray(g, dtype=float)
    bad = ~(np.isfinite(g) & (g == np.round(g)) & (g >= AWG_LARGEST_GAUGE))
    if bad.any():
        raise ValueError(f"AWG gauge {float(g[bad].ravel()[0])!r} is not a whole gauge number "
                         f">= {AWG_LARGEST_GAUGE} (0000 is -3, 000 is -2, 00 is -1)")
    return g


def awg_diameter(gauge):
    r"""Nominal diameter of a solid round wire of AWG size ``gauge`` [m].

    Parameters
    ----------
    gauge : array_like of int or str
        Gauge numbers :math:`n` (whole numbers :math:`\ge -3`; 0000 is -3, 000 is -2, 00 is
        -1) or gauge names (``"0000"``, ``"4/0"``, ``"18"``).

    Returns
    -------
    numpy.ndarray
        :math:`d(n)` [m], the unrounded value of the defining formula (published tables give
        it rounded).

    Raises
    ------
    ValueError
        For a gauge that is not a whole number :math:`\ge -3` or not a gauge name.

    Notes
    -----
    .. math:: d(n) = 0.127\,\mathrm{mm} \times 92^{(36 - n)/39}

    (defining formula of [1]_); each gauge step is a factor :math:`92^{1/39} \approx 1.1229`
    in diameter, six steps halve the diameter to within 0.5 %.

    References
    ----------
    .. [1] ASTM B258, *Standard Specification for Standard Nominal Diameters and
       Cross-Sectional Areas of AWG Sizes of Solid Round Wires Used as Electrical Conductors*.
    """
    n = _checked_gauges(gauge)
    return AWG_36_DIAMETER * AWG_SPAN_RATIO ** ((36.0 - n) / AWG_SPAN_STEPS)


def awg_gauges(min_gauge, max_gauge):
    """The whole gauges from ``min_gauge`` to ``max_gauge`` inclusive, largest wire first.

    Parameters
    ----------
    min_gauge, max_gauge : int or str
        Gauge numbers or names (``"0000"`` = -3), ``min_gauge <= max_gauge``.

    Returns
    -------
    numpy.ndarray of int
        ``[min_gauge, ..., max_gauge]``; feed to :func:`awg_diameter` for the diameters
        (which then decrease).

    Raises
    ------
    ValueError
        If either is not a gauge or ``min_gauge > max_gauge``.
    """
    lo = awg_gauge_number(min_gauge) if isinstance(min_gauge, str) else int(
        _checked_gauges(min_gauge))
    hi = awg_gauge_number(max_gauge) if isinstance(max_gauge, str) else int(
        _checked_gauges(max_gauge))
    if lo > hi:
        raise ValueError(f"awg_gauges: min_gauge = {lo} is above max_gauge = {hi}")
    return np.arange(lo, hi + 1)


def snap_to_sizes(diameter, sizes):
    r"""Snap each diameter to the nearest standard size; a tie goes to the larger size.

    Parameters
    ----------
    diameter : array_like
        Diameters to snap [m], finite and > 0.
    sizes : array_like
        The standard sizes [m], finite and > 0, in any order (sorted here; duplicates are
        harmless).

    Returns
    -------
    numpy.ndarray
        The nearest size to each diameter [m], same shape as ``diameter``. A diameter
        outside the range of ``sizes`` snaps to the smallest or the largest size.

    Raises
    ------
    ValueError
        If ``sizes`` is empty, or any size or diameter is not finite and positive.

    Notes
    -----
    Nearest in absolute distance,
    :math:`|d - s_{i-1}| < |s_i - d| \Rightarrow s_{i-1}`, else :math:`s_i`, with
    :math:`s_{i-1} < d \le s_i` located by ``numpy.searchsorted``; the whole population at
    once.
    """
    s = np.sort(np.asarray(sizes, dtype=float).ravel())
    if s.size == 0:
        raise ValueError("snap_to_sizes: the list of standard sizes is empty")
    if not np.all(np.isfinite(s) & (s > 0.0)):
        raise ValueError(f"snap_to_sizes: every standard size must be finite and > 0, got "
                         f"{float(s[~(np.isfinite(s) & (s > 0.0))][0])!r}")
    d = np.asarray(diameter, dtype=float)
    bad = ~(np.isfinite(d) & (d > 0.0))
    if bad.any():
        raise ValueError(f"snap_to_sizes: {np.count_nonzero(bad)} diameter(s) not finite and > 0, "
                         f"e.g. {float(d[bad].ravel()[0])!r}")
    hi_index = np.clip(np.searchsorted(s, d, side="left"), 0, s.size - 1)
    lo_index = np.clip(hi_index - 1, 0, s.size - 1)
    lo, hi = s[lo_index], s[hi_index]
    return np.where((d - lo) < (hi - d), lo, hi)
