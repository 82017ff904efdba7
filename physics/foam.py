r"""Foamed (cellular) dielectrics: a solid polymer with gas-filled cells of void fraction v.

Every function takes the solid polymer's value and the void fraction :math:`v` (volume share of
gas, :math:`0 \le v < 1`) and returns the foam's value; at :math:`v = 0` each returns the
solid's value exactly. The gas in the cells is taken as lossless, non-polar air
(:math:`\varepsilon_r = 1`).

Permittivity: Looyenga's rule [1]_ (cube roots of the permittivities mix linearly),

.. math:: \varepsilon_{eff}^{1/3} = (1 - v)\,\varepsilon_s^{1/3} + v\,\varepsilon_g^{1/3}.

Why Looyenga and not Bruggeman's symmetric rule [2]_: both are symmetric in the two phases and
agree within 0.5 % for polyethylene/air at every v (the contrast 2.25 is small); Looyenga is
one closed form that takes the complex permittivity directly (the loss follows from the same
rule), can be inverted for v in closed form, and is the rule that matches dry snow, the best
measured closed two-phase dielectric/air mixture (within 3 % of the measured density laws of
[6]_ and [7]_ up to 0.5 g/cm^3; see the tests). Bruggeman's rule assumes spherical grains of
both phases and needs a quadratic root; its percolation threshold is meaningless for closed
cells.

Loss: the same rule applied to the complex permittivity
:math:`\varepsilon_s (1 - j \tan\delta_s)` with lossless gas; the foam's loss tangent is
:math:`-\mathrm{Im}\,\varepsilon_{eff} / \mathrm{Re}\,\varepsilon_{eff}` (to first order
:math:`\tan\delta_s (1 - v)\varepsilon_s^{1/3} / \varepsilon_{eff}^{1/3}`).

Density: :math:`(1 - v)\rho_s` (the gas's mass, 1.2 kg/m^3 for air, is left out: about
0.3 % of the foam's mass at v = 0.7 and a polymer of 900 kg/m^3).

Thermal conductivity: the Maxwell-Eucken rule with the polymer as the continuous phase and the
gas cells dispersed in it ([3]_, [4]_; form ME1 of [5]_), the rule the catalogs' foamed grades
were derived with. It is the Hashin-Shtrikman upper bound of the conductivity of an isotropic
mixture, so the lowest thermal resistivity: [5]_ places closed-cell ("external porosity")
materials between it and the effective-medium value, so the temperature rise of a foamed
design is an optimistic estimate (radiation and convection in the cells neglected).

Dielectric strength: a conservative rule of our own, no published rule found (common
practice, no source): the foam holds no more than the solid, and no more than the average field
at which the field inside a spherical gas cell, :math:`3\varepsilon_s/(2\varepsilon_s + 1)`
times the field around it (a dielectric sphere in a uniform field, Sec. 4.4 of [8]_; the cell's
surroundings taken as the solid polymer, which gives the larger factor), reaches the
uniform-field breakdown strength of the gas. This is the inception field of partial discharges
in the cells; cells much smaller than a millimetre break down only at higher fields (Paschen),
so the rule errs on the safe side.

References
----------
.. [1] H. Looyenga, "Dielectric constants of heterogeneous mixtures", Physica 31 (1965)
   401-406.
.. [2] D. A. G. Bruggeman, "Berechnung verschiedener physikalischer Konstanten von heterogenen
   Substanzen. I.", Annalen der Physik 24 (1935) 636-664.
.. [3] J. C. Maxwell, A Treatise on Electricity and Magnetism, 3rd ed., Oxford 1891, vol. 1,
   Art. 314 (conduction through a medium with spherical inclusions).
.. [4] A. Eucken, "Die Wärmeleitfähigkeit keramischer feuerfester Stoffe", VDI
   Forschungsheft 353 (1932).
.. [5] J. K. Carson, S. J. Lovatt, D. J. Tanner, A. C. Cleland, "Thermal conductivity bounds
   for isotropic, porous materials", Int. J. Heat Mass Transfer 48 (2005) 2150-2158.
.. [6] M. T. Hallikainen, F. T. Ulaby, M. Abdelrazik, "Dielectric properties of snow in the
   3 to 37 GHz range", IEEE Trans. Antennas Propag. 34(11) (1986) 1329-1340.
.. [7] M. Tiuri, A. Sihvola, E. Nyfors, M. Hallikainen, "The complex dielectric constant of
   snow at microwave frequencies", IEEE J. Oceanic Eng. 9(5) (1984) 377-382.
.. [8] J. D. Jackson, Classical Electrodynamics, 3rd ed., Wiley 1999.
"""

from __future__ import annotations

import numpy as np

from cablefam.physics._checks import require

#: Thermal conductivity of still dry air near 20 degC [W m^-1 K^-1] (from memory: tables give
#: 0.0257 at 20 degC and 0.0263 at 300 K; the catalogs' foamed grades use 0.026).
AIR_THERMAL_CONDUCTIVITY = 0.026
#: Uniform-field breakdown strength of air at 1 atm over gaps of about a centimetre
#: [V m^-1] (from memory, the usual 3 kV/mm; smaller gaps hold more, Paschen's law).
AIR_BREAKDOWN_FIELD = 3.0e6


def _void(void_fraction):
    v = np.asarray(void_fraction, dtype=float)
    require((v >= 0.0) & (v < 1.0), "void_fraction", "in [0, 1)", v)
    return v


def looyenga_permittivity(solid_permittivity, void_fraction, gas_permittivity=1.0):
    r"""Complex or real relative permittivity of a foam by Looyenga's rule [-].

    Parameters
    ----------
    solid_permittivity : array_like (real or complex)
        Relative permittivity of the solid polymer :math:`\varepsilon_s` [-]
        (complex: :math:`\varepsilon' - j\varepsilon''`).
    void_fraction : array_like
        Volume share of gas :math:`v`, in [0, 1) [-].
    gas_permittivity : array_like, optional
        Relative permittivity of the gas [-] (default 1).

    Returns
    -------
    numpy.ndarray
        :math:`\left((1 - v)\varepsilon_s^{1/3} + v\varepsilon_g^{1/3}\right)^3` [-] (Looyenga
        [1]_ in the module references); the principal cube root of a complex value.
    """
    v = _void(void_fraction)
    eps = np.asarray(solid_permittivity)
    mixed = ((1.0 - v) * np.power(eps, 1.0 / 3.0)
             + v * np.power(np.asarray(gas_permittivity), 1.0 / 3.0)) ** 3
    return np.where(v == 0.0, eps, mixed)


def void_fraction_for_permittivity(solid_permittivity, foam_permittivity):
    r"""The void fraction whose Looyenga permittivity is ``foam_permittivity`` (air cells) [-].

    .. math:: v = \frac{\varepsilon_s^{1/3} - \varepsilon_{eff}^{1/3}}{\varepsilon_s^{1/3} - 1}
    """
    es = np.cbrt(np.asarray(solid_permittivity, dtype=float))
    return (es - np.cbrt(np.asarray(foam_permittivity, dtype=float))) / (es - 1.0)


def foam_permittivity_loss_tangent(solid_permittivity, solid_loss_tangent, void_fraction):
    r"""Relative permittivity and loss tangent of a foam with lossless air cells [-].

    Looyenga's rule [1]_ applied to :math:`\varepsilon_s (1 - j\tan\delta_s)` and 1.

    Parameters
    ----------
    solid_permittivity, solid_loss_tangent : array_like
        The solid polymer's :math:`\varepsilon'` and :math:`\tan\delta` [-].
    void_fraction : array_like
        [-], in [0, 1).

    Returns
    -------
    eps_eff, tan_d_eff : numpy.ndarray
        Real part of the foam's permittivity and its loss tangent [-]; the solid's values
        unchanged where ``v = 0``.
    """
    v = _void(void_fraction)
    eps_s = np.asarray(solid_permittivity, dtype=float)
    tan_s = np.asarray(solid_loss_tangent, dtype=float)
    # the complex rule in real arithmetic (faster than complex powers): the principal cube root
    # of eps_s (1 - j tan_s) = r e^{-j theta} is r^(1/3) e^{-j theta/3}; mixed with v,
    # X - jY, and cubed: X^3 - 3 X Y^2 - j (3 X^2 Y - Y^3)
    theta = np.arctan(tan_s)
    root = np.cbrt(eps_s * np.hypot(1.0, tan_s))
    x = (1.0 - v) * root * np.cos(theta / 3.0) + v
    y = (1.0 - v) * root * np.sin(theta / 3.0)
    real = x * (x * x - 3.0 * y * y)
    eps = np.where(v == 0.0, eps_s, real)
    tan = np.where(v == 0.0, tan_s, y * (3.0 * x * x - y * y) / real)
    return eps, tan


def foam_density(solid_density, void_fraction):
    r""":math:`(1 - v)\rho_s` [kg m^-3] (gas mass neglected, see the module notes)."""
    v = _void(void_fraction)
    rho = np.asarray(solid_density, dtype=float)
    return np.where(v == 0.0, rho, (1.0 - v) * rho)


def maxwell_eucken_conductivity(matrix_conductivity, void_fraction,
                                cell_conductivity=AIR_THERMAL_CONDUCTIVITY):
    r"""Thermal conductivity of cells dispersed in a continuous matrix [W m^-1 K^-1].

    .. math:: k = k_m \frac{2k_m + k_d - 2v(k_m - k_d)}{2k_m + k_d + v(k_m - k_d)}

    (Maxwell [3]_ Art. 314, Eucken [4]_; form ME1 of [5]_ in the module references.)
    """
    v = _void(void_fraction)
    km = np.asarray(matrix_conductivity, dtype=float)
    kd = np.asarray(cell_conductivity, dtype=float)
    return km * (2.0 * km + kd - 2.0 * v * (km - kd)) / (2.0 * km + kd + v * (km - kd))


def foam_thermal_resistivity(solid_thermal_resistivity, void_fraction,
                             cell_conductivity=AIR_THERMAL_CONDUCTIVITY):
    """Thermal resistivity of the foam [K m W^-1] by :func:`maxwell_eucken_conductivity`;
    the solid's value unchanged where ``v = 0``."""
    v = _void(void_fraction)
    rs = np.asarray(solid_thermal_resistivity, dtype=float)
    foam = 1.0 / maxwell_eucken_conductivity(1.0 / rs, v, cell_conductivity)
    return np.where(v == 0.0, rs, foam)


def foam_dielectric_strength(solid_strength, void_fraction, solid_permittivity,
                             gas_breakdown_field=AIR_BREAKDOWN_FIELD):
    r"""Conservative dielectric strength of a foam [V m^-1] (common practice, no source).

    .. math:: E_{foam} = \min\left(E_s,\; E_g \frac{2\varepsilon_s + 1}
              {3\varepsilon_s}\right) \quad (v > 0)

    the average field at which the field in a spherical gas cell reaches the gas's breakdown
    strength ``gas_breakdown_field``; see the module notes. The solid's value where ``v = 0``.

    Parameters
    ----------
    solid_strength : array_like
        Dielectric strength of the solid polymer [V m^-1].
    void_fraction : array_like
        [-], in [0, 1).
    solid_permittivity : array_like
        Real relative permittivity of the solid polymer [-].
    gas_breakdown_field : array_like, optional
        [V m^-1] (default: air, :data:`AIR_BREAKDOWN_FIELD`).
    """
    v = _void(void_fraction)
    es = np.asarray(solid_strength, dtype=float)
    eps = np.asarray(solid_permittivity, dtype=float)
    inception = gas_breakdown_field * (2.0 * eps + 1.0) / (3.0 * eps)
    return np.where(v == 0.0, es, np.minimum(es, inception))
