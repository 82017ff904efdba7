r"""Higher-order modes: cutoff of the first non-TEM mode (TE11) of a coax."""

from __future__ import annotations

import numpy as np
from scipy import special
from scipy.constants import speed_of_light
from scipy.optimize import elementwise


def _te11_cross_product(x, ratio):
    """J1'(x) Y1'(p x) - J1'(p x) Y1'(x), scaled by x^2 to stay O(1) for small x."""
    px = ratio * x
    return (special.jvp(1, x) * special.yvp(1, px) - special.jvp(1, px) * special.yvp(1, x)) * (
        x * x)


def te11_cutoff_wavenumber(a, b):
    r"""Exact cutoff wavenumber :math:`k_c` of the TE11 mode [rad m^-1].

    Parameters
    ----------
    a, b : array_like
        Centre-conductor radius and dielectric (shield inner) radius [m], ``b > a``.

    Returns
    -------
    numpy.ndarray
        :math:`k_c` [m^-1], the first root of the Bessel cross-product equation.

    Notes
    -----
    The TE11 cutoff satisfies (Sec. 3.5 of [1]_; Marcuvitz [2]_, Sec. 2.4)

    .. math:: J_1'(k_c a)\,Y_1'(k_c b) - J_1'(k_c b)\,Y_1'(k_c a) = 0 .

    With :math:`x = k_c a` and :math:`p = b/a` the first root lies in
    :math:`x(1+p)/2 \in [0.5, 1.1]` for every :math:`p > 1` (it tends to 1 as
    :math:`p \to 1` and to :math:`j'_{1,1}(1+p)/(2p) \to 0.92` as :math:`p \to \infty`);
    it is found per element with SciPy's vectorized bracketing root finder.

    References
    ----------
    .. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012, Sec. 3.5.
    .. [2] N. Marcuvitz, *Waveguide Handbook*, MIT Rad. Lab. Series vol. 10, 1951.
    """
    a, b = np.broadcast_arrays(np.asarray(a, dtype=float), np.asarray(b, dtype=float))
    if not np.all((a > 0) & (b > a)):
        raise ValueError("te11_cutoff_wavenumber needs 0 < a < b for every design")
    p = b / a
    scale = 2.0 / (1.0 + p)
    res = elementwise.find_root(_te11_cross_product, (0.5 * scale, 1.1 * scale), args=(p,),
                                tolerances=dict(xrtol=1e-13, xatol=0.0))
    return res.x / a


def te11_cutoff_frequency(a, b, relative_permittivity):
    r"""Exact TE11 cutoff frequency :math:`f_c = c_0 k_c / (2\pi\sqrt{\varepsilon_r})` [Hz].

    See :func:`te11_cutoff_wavenumber` for the root and its references.
    """
    return speed_of_light * te11_cutoff_wavenumber(a, b) / (
        2.0 * np.pi * np.sqrt(np.asarray(relative_permittivity, dtype=float)))


def te11_cutoff_frequency_approx(a, b, relative_permittivity):
    r"""Usual estimate :math:`f_c \approx c_0 / (\pi (a+b) \sqrt{\varepsilon_r})` [Hz].

    From :math:`k_c \approx 2/(a+b)` (Sec. 3.5 of [1]_); 0.6-2.8 % *below*
    :func:`te11_cutoff_frequency` for usual :math:`1.5 \le b/a \le 5` (so on the safe side
    there), equal to it near :math:`b/a \approx 8.5` and above it for thinner centre
    conductors (up to 8.6 % as :math:`b/a \to \infty`).

    References
    ----------
    .. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012, Sec. 3.5.
    """
    return speed_of_light / (np.pi * (np.asarray(a, dtype=float) + np.asarray(b, dtype=float))
                             * np.sqrt(np.asarray(relative_permittivity, dtype=float)))
