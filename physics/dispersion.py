r"""Dielectric dispersion: the wideband Debye (Djordjevic-Sarkar) model, fitted at one frequency.

A continuum of Debye relaxations with relaxation frequencies spread evenly over the logarithm
of frequency between :math:`\omega_1` and :math:`\omega_2` ([1]_) gives

.. math::
    \varepsilon(\omega) = \varepsilon_\infty + \frac{\Delta\varepsilon}{m_2 - m_1}
    \log_{10}\frac{\omega_2 + j\omega}{\omega_1 + j\omega}, \qquad m_i = \log_{10}\omega_i,

(the sign of :math:`j` for the :math:`e^{j\omega t}` convention, losses
:math:`\varepsilon = \varepsilon' - j\varepsilon''`). The ratio of logarithms does not
depend on their base, so it is evaluated here as
:math:`\ln((\omega_2 + j\omega)/(\omega_1 + j\omega)) / \ln(\omega_2/\omega_1)`, and with
:math:`\omega_2/\omega_1 = f_2/f_1` frequencies in hertz serve as well as angular ones.
:math:`\varepsilon''` is nearly constant between :math:`f_1` and :math:`f_2` and
:math:`\varepsilon'` falls slowly with frequency, as in most polymers. Being a sum of Debye
terms, the model is causal: its real and imaginary parts obey the Kramers-Kronig relations by
construction (checked numerically in the tests).

The two parameters :math:`\varepsilon_\infty, \Delta\varepsilon` are fitted so that
:math:`\varepsilon'` and :math:`\tan\delta` are exact at a reference frequency
:math:`f_{ref}` (closed form, as in [1]_; the same fit as scikit-rf's
``djordjevicsvensson`` model [2]_):

.. math::
    \Delta\varepsilon = \frac{\varepsilon'_{ref}\tan\delta_{ref}}{-\mathrm{Im}\,F(f_{ref})},
    \quad \varepsilon_\infty = \varepsilon'_{ref} - \Delta\varepsilon\,\mathrm{Re}\,F(f_{ref}),
    \quad F(f) = \frac{\ln\left((f_2 + jf)/(f_1 + jf)\right)}{\ln(f_2/f_1)}.

The default corner frequencies 1 kHz and 1 THz are the usual choice of implementations of the
model ([2]_ and others); :math:`f_{ref}` should lie well inside them.

References
----------
.. [1] A. R. Djordjevic, R. M. Biljic, V. D. Likar-Smiljanic, T. K. Sarkar, "Wideband
   frequency-domain characterization of FR-4 and time-domain causality", IEEE Trans.
   Electromagn. Compat. 43(4) (2001) 662-667.
.. [2] scikit-rf, ``skrf.media.DefinedAEpTandZ0`` with ``model='djordjevicsvensson'``.
"""

from __future__ import annotations

import numpy as np

from cablefam.physics._checks import positive, require

#: Default lower and upper corner frequencies of the relaxation band [Hz].
LOWER_CORNER_HZ = 1.0e3
UPPER_CORNER_HZ = 1.0e12


def _shape_function(f, f1, f2):
    """F(f) = ln((f2 + j f)/(f1 + j f)) / ln(f2/f1) [-] (complex), from real parts:
    ln|.| = ln((f2^2 + f^2)/(f1^2 + f^2)) / 2, arg = atan(f/f2) - atan(f/f1)."""
    f = np.asarray(f, dtype=float)
    scale = 1.0 / np.log(np.asarray(f2, dtype=float) / f1)
    real = 0.5 * np.log((f2 * f2 + f * f) / (f1 * f1 + f * f)) * scale
    imag = (np.arctan(f / f2) - np.arctan(f / f1)) * scale
    return real + 1j * imag


def wideband_debye_parameters(relative_permittivity, loss_tangent, reference_frequency,
                              lower_corner=LOWER_CORNER_HZ, upper_corner=UPPER_CORNER_HZ):
    r"""Fit :math:`\varepsilon_\infty` and :math:`\Delta\varepsilon` to one measured point [-].

    Parameters
    ----------
    relative_permittivity, loss_tangent : array_like
        :math:`\varepsilon'` and :math:`\tan\delta` at the reference frequency [-].
    reference_frequency : array_like
        [Hz], > 0.
    lower_corner, upper_corner : float, optional
        :math:`f_1 < f_2` [Hz].

    Returns
    -------
    eps_inf, delta_eps : numpy.ndarray
        High-frequency permittivity and relaxation strength [-] (see the module docstring).
    """
    f_ref = positive("reference_frequency", reference_frequency)
    require(np.asarray(upper_corner) > np.asarray(lower_corner), "upper_corner",
            "> lower_corner", np.asarray(upper_corner, dtype=float))
    eps = np.asarray(relative_permittivity, dtype=float)
    tan = np.asarray(loss_tangent, dtype=float)
    k = _shape_function(f_ref, lower_corner, upper_corner)
    delta = eps * tan / -k.imag
    return eps - delta * k.real, delta


def wideband_debye_permittivity(frequency, eps_inf, delta_eps, lower_corner=LOWER_CORNER_HZ,
                                upper_corner=UPPER_CORNER_HZ):
    r"""Complex relative permittivity :math:`\varepsilon' - j\varepsilon''` at ``frequency`` [-].

    .. math:: \varepsilon(f) = \varepsilon_\infty + \Delta\varepsilon\,F(f)

    ``frequency`` [Hz] (>= 0) broadcasts against the parameters.
    """
    f = np.asarray(frequency, dtype=float)
    require(f >= 0.0, "frequency", ">= 0", f)
    return (np.asarray(eps_inf, dtype=float)
            + np.asarray(delta_eps, dtype=float) * _shape_function(f, lower_corner, upper_corner))


def dispersive_permittivity_loss_tangent(frequency, relative_permittivity, loss_tangent,
                                         reference_frequency, lower_corner=LOWER_CORNER_HZ,
                                         upper_corner=UPPER_CORNER_HZ):
    r""":math:`\varepsilon'(f)` and :math:`\tan\delta(f)` of a material given at one frequency.

    Parameters
    ----------
    frequency : array_like
        Where to evaluate [Hz]; broadcasts against the material arrays (designs x
        frequencies: give ``frequency[None, :]`` and the materials as ``[:, None]``).
    relative_permittivity, loss_tangent : array_like
        :math:`\varepsilon'` and :math:`\tan\delta` at ``reference_frequency`` [-].
    reference_frequency : array_like
        [Hz], > 0.

    Returns
    -------
    eps, tan_d : numpy.ndarray
        :math:`\varepsilon'(f)` and :math:`\tan\delta(f) = \varepsilon''/\varepsilon'` [-];
        exact (to rounding) at the reference frequency, constant where the loss is 0.
    """
    eps_inf, delta = wideband_debye_parameters(relative_permittivity, loss_tangent,
                                               reference_frequency, lower_corner, upper_corner)
    eps = wideband_debye_permittivity(frequency, eps_inf, delta, lower_corner, upper_corner)
    return eps.real, -eps.imag / eps.real
