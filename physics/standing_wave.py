r"""Current, voltage and heat of a line carrying power: matched (from Re Z0) and with a standing
wave (VSWR), and how far the conductors' axial heat flow smooths the standing wave's hot spots.

Matched line
    A wave travelling on a line of complex characteristic impedance :math:`Z_0` has
    :math:`V = Z_0 I`, so the power it carries is :math:`P = \mathrm{Re}(VI^*) =
    |I|^2\,\mathrm{Re}\,Z_0` (Sec. 2.1 and 2.7 of [1]_). Per metre the line turns
    :math:`R|I|^2 + G|V|^2 = -\mathrm{d}P/\mathrm{d}z = 2\,\mathrm{Re}(\gamma)\,P` into heat.

Standing wave
    With a load of reflection coefficient :math:`\Gamma` (:math:`|\Gamma| = (S-1)/(S+1)`,
    :math:`S` the VSWR) the current and voltage along a low-loss line are
    :math:`|I|^2 = |I^+|^2(1 + |\Gamma|^2 - 2|\Gamma|\cos\psi)` and
    :math:`|V|^2 = |V^+|^2(1 + |\Gamma|^2 + 2|\Gamma|\cos\psi)`, :math:`\psi = 2\beta z -
    \arg\Gamma` (Sec. 2.3 of [1]_), while the power delivered to the load is
    :math:`P = |I^+|^2\,\mathrm{Re}\,Z_0\,(1 - |\Gamma|^2)`. For the same delivered power the
    conductor heat is the matched heat times :math:`m_\mathrm{avg} \mp m_\mathrm{rip}\cos\psi`
    and the dielectric heat times :math:`m_\mathrm{avg} \pm m_\mathrm{rip}\cos\psi`, with

    .. math::
        m_\mathrm{avg} = \frac{1 + |\Gamma|^2}{1 - |\Gamma|^2}, \qquad
        m_\mathrm{rip} = \frac{2|\Gamma|}{1 - |\Gamma|^2}, \qquad
        m_\mathrm{avg} + m_\mathrm{rip} = S, \qquad m_\mathrm{avg} - m_\mathrm{rip} = 1/S.

    Current maxima (conductor hot spots, factor :math:`S`) and voltage maxima (dielectric hot
    spots, factor :math:`S`, voltage :math:`(1 + |\Gamma|)|V^+|`) alternate every quarter
    wavelength.

Hot spot or length average
    The heat pattern repeats every half wavelength. Heat flowing along the metal evens the
    temperature out over the *thermal length* :math:`L_{th} = \sqrt{K T}` (axial thermal
    conductance :math:`K = \lambda_m A` [W m K^-1] of a conductor, radial thermal resistance
    :math:`T` [K m W^-1] from it): for a heat source :math:`q_0 + q_1\cos(kz)` the steady fin
    equation :math:`K\theta'' - \theta/T = -q` gives the temperature
    :math:`T q_0 + T q_1\cos(kz)/(1 + (kL_{th})^2)` (Ch. 3.6 of [2]_ for the fin equation;
    the cosine solution by substitution). With :math:`k = 2\beta` the ripple that reaches the
    temperatures is therefore :math:`s\,m_\mathrm{rip}`,

    .. math:: s = \frac{1}{1 + (2\beta L_{th})^2}

    so the hot spot (:math:`s \to 1`) applies where a quarter wavelength is long against the
    thermal length and the length average (:math:`s \to 0`) where it is short.
    The rating takes :math:`L_{th}` of the centre conductor alone (its own metal, no help from
    the shield) against the dielectric's :math:`T_1` alone. A solid-tube shield has the larger
    axial conductance and sees the larger external resistance :math:`T_3 + T_4`, so this is
    the shortest thermal length of the cable's network and gives the least smoothing: the rule
    errs on the side of the hot spot where unsure.
    The metal's thermal conductivity comes from its resistivity by the Wiedemann-Franz law
    (:func:`metal_thermal_conductivity`).

References
----------
.. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012, Sec. 2.1, 2.3 and 2.7.
.. [2] F. P. Incropera, D. P. DeWitt, T. L. Bergman, A. S. Lavine, *Fundamentals of Heat and
   Mass Transfer*, 6th ed., Wiley, 2007, Sec. 3.6 (extended surfaces).
.. [3] C. Kittel, *Introduction to Solid State Physics*, 8th ed., Wiley, 2005, Ch. 6
   (Wiedemann-Franz law, Lorenz number).
"""

from __future__ import annotations

import numpy as np

#: Sommerfeld value of the Lorenz number, :math:`L_0 = (\pi^2/3)(k_B/e)^2` [W ohm K^-2]
#: (Ch. 6 of Kittel, *Introduction to Solid State Physics*, 8th ed.).
LORENZ_NUMBER = np.pi ** 2 / 3.0 * (1.380649e-23 / 1.602176634e-19) ** 2


def reflection_magnitude(vswr):
    r""":math:`|\Gamma| = (S - 1)/(S + 1)` of a voltage standing-wave ratio :math:`S \ge 1` [-]
    (Eq. 2.41 of Pozar, *Microwave Engineering*, 4th ed.)."""
    s = np.asarray(vswr, dtype=float)
    return (s - 1.0) / (s + 1.0)


def standing_wave_heat_factors(vswr):
    r"""Average and ripple of the local heat over the matched heat at the same delivered power.

    Parameters
    ----------
    vswr : array_like
        Voltage standing-wave ratio :math:`S \ge 1` [-].

    Returns
    -------
    average, ripple : numpy.ndarray
        :math:`m_\mathrm{avg} = (1 + |\Gamma|^2)/(1 - |\Gamma|^2)` and
        :math:`m_\mathrm{rip} = 2|\Gamma|/(1 - |\Gamma|^2)` [-] (module notes): conductor heat
        between :math:`1/S` and :math:`S` times the matched heat, averaging :math:`m_\mathrm{avg}`.
        Exactly (1, 0) at :math:`S = 1`.
    """
    s = np.asarray(vswr, dtype=float)
    # in S directly: 1 - G^2 = 4S/(S+1)^2, 1 + G^2 = 2(S^2+1)/(S+1)^2
    return (s * s + 1.0) / (2.0 * s), (s * s - 1.0) / (2.0 * s)


def voltage_maximum_factor(vswr):
    r"""Largest voltage along the line over the incident wave's, :math:`1 + |\Gamma|` [-]."""
    return 1.0 + reflection_magnitude(vswr)


def metal_thermal_conductivity(resistivity, temperature_c=20.0):
    r"""Thermal conductivity of a metal from its resistivity, :math:`\lambda = L_0 T/\rho`
    [W m^-1 K^-1] (Wiedemann-Franz law, Ch. 6 of [3]_ in the module notes; 4 % high for
    annealed copper at 20 degC: 415 against 401).

    Parameters
    ----------
    resistivity : array_like
        :math:`\rho` [ohm m].
    temperature_c : array_like, optional
        Temperature [degC].
    """
    return LORENZ_NUMBER * (np.asarray(temperature_c, dtype=float) + 273.15) / np.asarray(
        resistivity, dtype=float)


def standing_wave_smoothing(beta, axial_conductance, radial_thermal_resistance):
    r"""Share of the standing wave's heat ripple that reaches the temperatures [-].

    Parameters
    ----------
    beta : array_like
        Phase constant :math:`\beta` [rad m^-1].
    axial_conductance : array_like
        :math:`K = \lambda_m A` of the conductor that carries heat along the line [W m K^-1].
    radial_thermal_resistance : array_like
        :math:`T` from that conductor to its heat sink [K m W^-1].

    Returns
    -------
    numpy.ndarray
        :math:`s = 1/(1 + (2\beta L_{th})^2)`, :math:`L_{th} = \sqrt{KT}` (module notes); 1:
        hot spot, 0: length average.
    """
    k = 2.0 * np.asarray(beta, dtype=float)
    return 1.0 / (1.0 + k * k * np.asarray(axial_conductance, dtype=float)
                  * np.asarray(radial_thermal_resistance, dtype=float))


def matched_line_squares(r, x, g, b):
    r"""Current and voltage of a matched line per watt carried, from :math:`\mathrm{Re}\,Z_0`.

    Parameters
    ----------
    r, x : array_like
        Series resistance and reactance :math:`R`, :math:`\omega L` [ohm m^-1].
    g, b : array_like
        Shunt conductance and susceptance :math:`G`, :math:`\omega C` [S m^-1].

    Returns
    -------
    current_sq, voltage_sq : numpy.ndarray
        :math:`|I|^2/P = 1/\mathrm{Re}\,Z_0` [A^2 W^-1] and
        :math:`|V|^2/P = |Z_0|^2/\mathrm{Re}\,Z_0` [V^2 W^-1] (RMS if :math:`P` is the mean
        power), so that :math:`R|I|^2 + G|V|^2 = 2\,\mathrm{Re}(\gamma)P` (module notes).

    Notes
    -----
    In real arithmetic: :math:`Z_0 = |Z_0|e^{j\varphi}`,
    :math:`|Z_0| = (|R + jX|/|G + jB|)^{1/2}`,
    :math:`\varphi = (\arg(R + jX) - \arg(G + jB))/2 \in (-\pi/4, \pi/4)`, so

    .. math:: \cos\varphi = \sqrt{\tfrac{1}{2}\left(1 + \frac{RG + XB}{|R + jX|\,|G + jB|}
              \right)}, \qquad \mathrm{Re}\,Z_0 = |Z_0|\cos\varphi

    (Eq. 2.7 of [1]_ in the module notes).
    """
    r, x, g, b = (np.asarray(v, dtype=float) for v in (r, x, g, b))
    z_mod = np.sqrt(r * r + x * x)  # per-metre parameters: far from over- or underflow
    y_mod = np.sqrt(g * g + b * b)
    z0 = np.sqrt(z_mod / y_mod)
    cos_phi = np.sqrt(0.5 * (1.0 + (r * g + x * b) / (z_mod * y_mod)))
    re_z0 = z0 * cos_phi
    return 1.0 / re_z0, z0 * z0 / re_z0
