r"""Fields of a coax in its four regions: centre conductor, dielectric, shield wall, outside.

Radii: centre conductor :math:`a`, dielectric :math:`b`, shield outer :math:`c`. A current
:math:`I` flows out on the centre conductor and back on the shield; :math:`V` is the voltage of
the centre conductor against the shield. All functions broadcast ``r`` against the design
arrays, so ``r`` of shape ``(n_points, 1)`` with designs of shape ``(n_designs,)`` gives an
``(n_points, n_designs)`` profile.
"""

from __future__ import annotations

import numpy as np
from scipy import special
from cablefam.physics import eccentricity
from cablefam.physics.constants import mu_0
from cablefam.physics.skin import skin_depth


def _as_float(*arrays):
    return np.broadcast_arrays(*(np.asarray(x, dtype=float) for x in arrays))


def magnetic_field_dc(r, a, b, c, current, inner_relative_permeability=1.0,
                      shield_relative_permeability=1.0):
    r"""Magnetic flux density :math:`B_\varphi(r)` of a DC current (uniform current density).

    Parameters
    ----------
    r : array_like
        Radius [m], >= 0.
    a, b, c : array_like
        Radii of the centre conductor, dielectric and shield outer surface [m].
    current : array_like
        Current :math:`I` [A].
    inner_relative_permeability, shield_relative_permeability : array_like, optional
        :math:`\mu_r` of the conductors [-]; the dielectric and the outside are non-magnetic.

    Returns
    -------
    numpy.ndarray
        :math:`B_\varphi` [T].

    Notes
    -----
    Ampere's circuital law around a circle of radius :math:`r` (Sec. 2.3 of [1]_):

    .. math::
        B = \mu\frac{I r}{2\pi a^2}\ (r<a), \quad
        \frac{\mu_0 I}{2\pi r}\ (a \le r < b), \quad
        \mu\frac{I}{2\pi r}\frac{c^2-r^2}{c^2-b^2}\ (b \le r < c), \quad 0\ (r \ge c).

    References
    ----------
    .. [1] S. Ramo, J. R. Whinnery, T. Van Duzer, *Fields and Waves in Communication
       Electronics*, 3rd ed., Wiley, 1994.
    """
    r, a, b, c, i, mu_a, mu_c = _as_float(r, a, b, c, current, inner_relative_permeability,
                                          shield_relative_permeability)
    with np.errstate(divide="ignore", invalid="ignore"):
        h = np.select(
            [r < a, r < b, r < c],
            [i * r / (2.0 * np.pi * a * a),
             i / (2.0 * np.pi * r),
             i * (c * c - r * r) / (2.0 * np.pi * r * (c * c - b * b))],
            default=0.0)
    mu = np.select([r < a, r < b, r < c], [mu_a, 1.0, mu_c], default=1.0)
    return mu_0 * mu * h


def current_density_dc(r, a, b, c, current):
    r"""Axial current density of a DC current [A m^-2]: :math:`I/(\pi a^2)` in the centre
    conductor, :math:`-I/(\pi(c^2-b^2))` in the shield wall, zero elsewhere."""
    r, a, b, c, i = _as_float(r, a, b, c, current)
    return np.select([r < a, r < b, r < c],
                     [i / (np.pi * a * a), 0.0 * i, -i / (np.pi * (c * c - b * b))],
                     default=0.0)


def _wire_profiles(r, a, i, delta):
    """H and J inside the round wire from scaled Bessel functions (no overflow)."""
    k = (1.0 - 1.0j) / delta
    rr = np.clip(r, 0.0, a)
    scale = np.exp((rr - a) / delta)
    j1a = special.jve(1, k * a)
    h = i / (2.0 * np.pi * a) * special.jve(1, k * rr) / j1a * scale
    j = i * k / (2.0 * np.pi * a) * special.jve(0, k * rr) / j1a * scale
    return h, j


def _wall_profiles(r, b, c, i, delta):
    """H and J in the shield wall (return current), scaled as in the tube impedance."""
    gamma = (1.0 + 1.0j) / delta
    rr = np.clip(r, b, c)

    def brackets(x):
        weight = np.exp((gamma + 1.0 / delta) * (x - c))
        gx = gamma * x
        p = special.ive(1, gx) * special.kve(1, gamma * c) * weight - special.kve(
            1, gx) * special.ive(1, gamma * c)
        n = special.ive(0, gx) * special.kve(1, gamma * c) * weight + special.kve(
            0, gx) * special.ive(1, gamma * c)
        return p, n

    p_r, n_r = brackets(rr)
    p_b, _ = brackets(b)
    shift = np.exp(-gamma * (rr - b))
    h_b = i / (2.0 * np.pi * b)
    return h_b * shift * p_r / p_b, gamma * h_b * shift * n_r / p_b


def magnetic_field_ac(r, a, b, c, current, frequency, inner_resistivity, shield_resistivity,
                      inner_relative_permeability=1.0, shield_relative_permeability=1.0):
    r"""Phasor :math:`B_\varphi(r)` of a sinusoidal current with skin effect (exact Bessel form).

    Parameters
    ----------
    r, a, b, c : array_like
        Radius and the three conductor radii [m].
    current : array_like
        Current phasor amplitude :math:`I` [A] (peak or RMS, as you like: the result follows).
    frequency : array_like
        Frequency [Hz], > 0.
    inner_resistivity, shield_resistivity : array_like
        Resistivities [ohm m].
    inner_relative_permeability, shield_relative_permeability : array_like, optional
        Relative permeabilities [-].

    Returns
    -------
    numpy.ndarray of complex
        :math:`B_\varphi` phasor [T]; ``abs()`` gives the amplitude.

    Notes
    -----
    With :math:`k = (1-j)/\delta` in the wire and :math:`\gamma = (1+j)/\delta` in the wall
    (Sec. 5.5 of [1]_; Schelkunoff [2]_):

    .. math::
        H = \frac{I}{2\pi a}\frac{J_1(kr)}{J_1(ka)}\ (r<a), \qquad
        H = \frac{I}{2\pi b}\,
            \frac{I_1(\gamma r)K_1(\gamma c) - K_1(\gamma r)I_1(\gamma c)}
                 {I_1(\gamma b)K_1(\gamma c) - K_1(\gamma b)I_1(\gamma c)}\ (b \le r < c),

    :math:`I/(2\pi r)` in the dielectric and zero outside; :math:`B = \mu H`. Evaluated with
    ``jve``, ``ive``, ``kve`` and explicit exponential weights, so that it holds for any
    :math:`a/\delta`.

    References
    ----------
    .. [1] S. Ramo, J. R. Whinnery, T. Van Duzer, *Fields and Waves in Communication
       Electronics*, 3rd ed., Wiley, 1994.
    .. [2] S. A. Schelkunoff, *Bell Syst. Tech. J.* 13 (1934) 532-579.
    """
    r, a, b, c, i, f, rho_a, rho_c, mu_a, mu_c = _as_float(
        r, a, b, c, current, frequency, inner_resistivity, shield_resistivity,
        inner_relative_permeability, shield_relative_permeability)
    h_wire, _ = _wire_profiles(r, a, i, skin_depth(rho_a, f, mu_a))
    h_wall, _ = _wall_profiles(r, b, c, i, skin_depth(rho_c, f, mu_c))
    with np.errstate(divide="ignore", invalid="ignore"):
        h_diel = i / (2.0 * np.pi * r)
    h = np.select([r < a, r < b, r < c], [mu_a * h_wire, h_diel + 0j, mu_c * h_wall],
                  default=0.0 + 0j)
    return mu_0 * h


def current_density_ac(r, a, b, c, current, frequency, inner_resistivity, shield_resistivity,
                       inner_relative_permeability=1.0, shield_relative_permeability=1.0):
    r"""Phasor of the axial current density :math:`J_z(r)` with skin effect [A m^-2].

    Parameters as in :func:`magnetic_field_ac`. In the wire
    :math:`J = \frac{Ik}{2\pi a}\frac{J_0(kr)}{J_1(ka)}`; in the wall
    :math:`J = \gamma H(b)\frac{I_0(\gamma r)K_1(\gamma c) + K_0(\gamma r)I_1(\gamma c)}
    {I_1(\gamma b)K_1(\gamma c) - K_1(\gamma b)I_1(\gamma c)}` (negative: the return
    current); zero in the dielectric and outside. References as in :func:`magnetic_field_ac`.
    """
    r, a, b, c, i, f, rho_a, rho_c, mu_a, mu_c = _as_float(
        r, a, b, c, current, frequency, inner_resistivity, shield_resistivity,
        inner_relative_permeability, shield_relative_permeability)
    _, j_wire = _wire_profiles(r, a, i, skin_depth(rho_a, f, mu_a))
    _, j_wall = _wall_profiles(r, b, c, i, skin_depth(rho_c, f, mu_c))
    return np.select([r < a, r < b, r < c], [j_wire, 0j * i, j_wall], default=0.0 + 0j)


def electric_field(r, a, b, voltage):
    r"""Radial electric field :math:`E_r = V/(r\ln(b/a))` in the dielectric, zero in the
    conductors and outside [V m^-1] (Sec. 2.3 of Ramo, Whinnery, Van Duzer, 3rd ed.).

    The small axial field :math:`\rho J_z` inside the metal is not included.
    """
    r, a, b, v = _as_float(r, a, b, voltage)
    with np.errstate(divide="ignore", invalid="ignore"):
        e = v / (r * np.log(b / a))
    return np.where((r >= a) & (r <= b), e, 0.0)


def _geometry_and_crowding(a, b, offset, geometry_factor):
    """Lambda (the caller's or computed) and the peak-field factor (None when concentric)."""
    lam = (eccentricity.geometry_factor(a, b, offset) if geometry_factor is None
           else np.asarray(geometry_factor, dtype=float))
    crowding = eccentricity.peak_field_factor(a, b, offset) if np.any(offset) else None
    return lam, crowding


def peak_electric_field(a, b, peak_voltage, offset=0.0, geometry_factor=None):
    r"""Largest field, at the centre-conductor surface: :math:`E_{max} = V/(a\ln(b/a))` [V m^-1].

    Parameters
    ----------
    a, b : array_like
        Centre-conductor radius and dielectric radius [m] (stranded: the effective radius).
    peak_voltage : array_like
        Peak voltage :math:`V` between the conductors [V].
    offset : array_like, optional
        Offset :math:`D` of the centre conductor [m]: the field crowds on the side nearest the
        shield, :math:`E_{max} = g\,V/(a\Lambda)` with :math:`\Lambda` and :math:`g` of
        :func:`cablefam.physics.eccentricity.geometry_factor` and
        :func:`cablefam.physics.eccentricity.peak_field_factor`.
    geometry_factor : array_like, optional
        :math:`\Lambda` of ``a, b, offset`` when the caller has it already [-].

    References
    ----------
    .. [1] S. Ramo, J. R. Whinnery, T. Van Duzer, *Fields and Waves in Communication
       Electronics*, 3rd ed., Wiley, 1994, Sec. 2.3 (the coaxial capacitor) and Sec. 4.8
       (two non-concentric cylinders).
    """
    a = np.asarray(a, dtype=float)
    lam, crowding = _geometry_and_crowding(a, b, offset, geometry_factor)
    e_max = np.asarray(peak_voltage, dtype=float) / (a * lam)
    return e_max if crowding is None else e_max * crowding


def max_peak_voltage(a, b, dielectric_strength, safety_factor=1.0, offset=0.0,
                     geometry_factor=None):
    r"""Largest peak voltage that keeps :math:`E_{max} \le E_{bd}/k_s` [V].

    .. math:: V_{max} = \frac{E_{bd}}{k_s}\,\frac{a\Lambda}{g}

    with :math:`\Lambda = \ln(b/a)` and :math:`g = 1` for a concentric line (the inverse of
    :func:`peak_electric_field`).

    Parameters
    ----------
    a, b : array_like
        Radii [m].
    dielectric_strength : array_like
        Breakdown field :math:`E_{bd}` of the dielectric [V m^-1].
    safety_factor : array_like, optional
        :math:`k_s \ge 1` [-].
    offset, geometry_factor : array_like, optional
        As in :func:`peak_electric_field`.
    """
    a = np.asarray(a, dtype=float)
    lam, crowding = _geometry_and_crowding(a, b, offset, geometry_factor)
    v_max = (np.asarray(dielectric_strength, dtype=float) / np.asarray(safety_factor, dtype=float)
             * a * lam)
    return v_max if crowding is None else v_max / crowding
