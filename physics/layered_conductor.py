r"""Clad and plated conductors: a metal core under a surface layer of another metal.

A *clad wire* (copper-clad steel, copper-clad aluminium, silver-plated or tinned copper) is a
round core of radius :math:`r_1` (resistivity :math:`\rho_1`, permeability :math:`\mu_1`)
inside a bonded layer out to :math:`r_2` (:math:`\rho_2`, :math:`\mu_2`).
:func:`clad_wire_resistance_reactance` solves the diffusion equation in both regions exactly
(Bessel functions, exponentially scaled, with Hankel series for large arguments, as
:mod:`cablefam.physics.internal_impedance` does for the homogeneous wire); the planar
approximation fails once the skin depth nears the radius, which for a steel core happens at
CATV frequencies.

A plated shield and the surface roughness are in :mod:`cablefam.physics.conductor_surface`
(the planar two-layer ratio, the hooks of :func:`cablefam.physics.line.conductor_impedances`).

A stranded clad conductor is taken as made of clad strands, each with the same layer (its
thickness and area share): the layered impedance of the overall radius with that layer over an
equivalent core that holds the inner strands' layers
(:func:`cablefam.physics.conductor_surface.inner_surface_impedance`), times the stranding
factor of :mod:`cablefam.physics.stranding`, never below the DC resistance of the strands with
their layers in parallel.
"""

from __future__ import annotations

from functools import lru_cache

import numpy as np
from scipy import special

from cablefam.physics.hankel_series import (directed_ratio_series, hankel_coefficient_tables,
                                            horner)
from cablefam.physics.internal_impedance import (ASYMPTOTIC_MIN_RATIO, ASYMPTOTIC_TERMS,
                                                 wire_resistance_reactance)
from cablefam.physics.skin import skin_depth

#: Layer thickness in its own skin depths beyond which the core no longer matters to double
#: precision (the coupling through the layer is exp(-2 t/delta) < exp(-40) ~ 4e-18): the wire
#: is then a homogeneous wire of the layer metal.
THICK_LAYER_SKIN_DEPTHS = 20.0


# --------------------------------------------------------------------------- geometry, DC


def core_radius(outer_radius, thickness=0.0, area_fraction=0.0):
    r"""Core radius [m] under a layer given by its thickness or by its area share.

    :math:`r_1 = r_2 - t` where ``thickness > 0``, else :math:`r_1 = r_2\sqrt{1 - f}`;
    never below 0.
    """
    r2 = np.asarray(outer_radius, dtype=float)
    t = np.asarray(thickness, dtype=float)
    f = np.asarray(area_fraction, dtype=float)
    return np.maximum(np.where(t > 0.0, r2 - t, r2 * np.sqrt(np.clip(1.0 - f, 0.0, 1.0))), 0.0)


def parallel_resistivity(core_resistivity, layer_resistivity, area_fraction):
    r"""Resistivity of a wire with its layers in parallel [ohm m] (DC).

    .. math:: \rho_{dc} = \left(\frac{1 - f}{\rho_1} + \frac{f}{\rho_2}\right)^{-1}

    :math:`R = \rho/A` for each layer (clause 2.1.1 of IEC 60287-1-1), conductances added.
    """
    f = np.asarray(area_fraction, dtype=float)
    return 1.0 / ((1.0 - f) / np.asarray(core_resistivity, dtype=float)
                  + f / np.asarray(layer_resistivity, dtype=float))


def clad_dc_resistance(outer_radius, core_resistivity, layer_resistivity, area_fraction):
    r"""DC resistance per unit length of a clad round wire [ohm m^-1].

    .. math:: R_{dc} = \left(\frac{\pi r_1^2}{\rho_1} + \frac{\pi(r_2^2 - r_1^2)}{\rho_2}
              \right)^{-1}, \qquad \pi(r_2^2 - r_1^2) = f\,\pi r_2^2
    """
    r2 = np.asarray(outer_radius, dtype=float)
    return parallel_resistivity(core_resistivity, layer_resistivity, area_fraction) / (
        np.pi * r2 * r2)


def layer_mass_and_cost(area, area_fraction, core_density, layer_density, core_price,
                        layer_price):
    r"""Mass [kg m^-1] and material cost [currency m^-1] of a two-layer conductor.

    ``area`` is the metal cross-section [m^2]; the layer takes ``area_fraction`` of it:
    :math:`m = A[(1 - f)\rho_{m,1} + f\rho_{m,2}]`, cost :math:`A[(1-f)\rho_{m,1}p_1 +
    f\rho_{m,2}p_2]`.
    """
    a = np.asarray(area, dtype=float)
    f = np.asarray(area_fraction, dtype=float)
    m_core = a * (1.0 - f) * np.asarray(core_density, dtype=float)
    m_layer = a * f * np.asarray(layer_density, dtype=float)
    return m_core + m_layer, m_core * np.asarray(core_price, dtype=float) + m_layer * np.asarray(
        layer_price, dtype=float)


# --------------------------------------------------------------------------- clad round wire


def _core_ratio(u1):
    """I0(y)/I1(y) at y = (1 + j) u1: scaled Bessel below the switch, Hankel series above."""
    out = np.empty(u1.shape, dtype=complex)
    big = u1 >= ASYMPTOTIC_MIN_RATIO
    if big.any():
        re_c, im_c = directed_ratio_series(complex(-0.5, 0.5), ASYMPTOTIC_TERMS)
        v = 1.0 / u1[big]
        out[big] = horner(re_c, v) + 1j * horner(im_c, v)
    small = ~big
    if small.any():
        y = (1.0 + 1.0j) * u1[small]
        out[small] = special.ive(0, y) / special.ive(1, y)
    return out


def _layer_ratio_exact(x1, x2, zeta):
    """N/D of the clad wire from scaled Bessel functions (see :func:`clad_wire_...`)."""
    e = np.exp((x1 - x2) + (x1 - x2).real)
    p = special.ive(0, x1) - zeta * special.ive(1, x1)
    q = special.kve(0, x1) + zeta * special.kve(1, x1)
    return ((special.ive(0, x2) * q - p * special.kve(0, x2) * e)
            / (special.ive(1, x2) * q + p * special.kve(1, x2) * e))


@lru_cache(maxsize=None)
def _series_rows(n_terms):
    """Rows a_k(0), a_k(0)(-1)^k, a_k(1), a_k(1)(-1)^k, highest power first."""
    a0, a1, alt = hankel_coefficient_tables(n_terms)
    return np.stack((a0, a0 * alt, a1, a1 * alt))[:, ::-1].copy()


def _series(x):
    """s0, t0, s1, t1 at x: s_nu = sum a_k(nu) x^-k (K), t_nu = sum (-1)^k a_k(nu) x^-k (I)."""
    rows = _series_rows(ASYMPTOTIC_TERMS)
    w = 1.0 / x
    y = rows[:, :1] * w + rows[:, 1:2]
    for k in range(2, rows.shape[1]):
        y = y * w + rows[:, k:k + 1]
    return y


def _layer_ratio_asymptotic(u1, u2, zeta):
    """N/D of the clad wire from the Hankel series of I and K at both layer surfaces."""
    s0a, t0a, s1a, t1a = _series((1.0 + 1.0j) * u1)
    s0b, t0b, s1b, t1b = _series((1.0 + 1.0j) * u2)
    p = (t0a - zeta * t1a) / (s0a + zeta * s1a)
    q = np.exp(-2.0 * (1.0 + 1.0j) * (u2 - u1))
    return (t0b - q * p * s0b) / (t1b + q * p * s1b)


def clad_wire_resistance_reactance(outer_radius, core_radius_m, core_resistivity,
                                   layer_resistivity, frequency, core_relative_permeability=1.0,
                                   layer_relative_permeability=1.0, method="auto"):
    r"""Internal resistance and reactance of a clad round wire (exact two-layer solution).

    Parameters
    ----------
    outer_radius : array_like
        Wire radius :math:`r_2` [m], > 0.
    core_radius_m : array_like
        Core radius :math:`r_1` [m], ``0 <= r1 <= r2`` (0: all layer metal; ``r2``: no layer).
    core_resistivity, layer_resistivity : array_like
        :math:`\rho_1`, :math:`\rho_2` [ohm m], > 0.
    frequency : array_like
        [Hz], > 0.
    core_relative_permeability, layer_relative_permeability : array_like, optional
        :math:`\mu_{r1}`, :math:`\mu_{r2}` [-] (a steel core: its stated value).
    method : {"auto", "exact"}
        ``"exact"`` uses the scaled Bessel functions wherever the layer is thinner than
        :data:`THICK_LAYER_SKIN_DEPTHS`; ``"auto"`` switches each region to its Hankel series
        at :data:`~cablefam.physics.internal_impedance.ASYMPTOTIC_MIN_RATIO`.

    Returns
    -------
    tuple of numpy.ndarray
        :math:`(R, X_i)` [ohm m^-1].

    Notes
    -----
    With :math:`k_n = (1+j)/\delta_n` and :math:`\eta_n = k_n\rho_n`, the axial field is
    :math:`A I_0(k_1r)` in the core and :math:`B I_0(k_2r) + C K_0(k_2r)` in the layer;
    :math:`E_z` and :math:`H_\varphi = E_z'/(j\omega\mu)` are continuous at :math:`r_1`
    (Sec. 5.5 of [1]_, Eq. (37)-(40) of [2]_). With :math:`x_n = k_2 r_n` and the core's
    normalised wave impedance at its surface

    .. math:: \zeta = \sqrt{\frac{\mu_1\rho_1}{\mu_2\rho_2}}\frac{I_0(k_1r_1)}{I_1(k_1r_1)},
        \qquad
        Z_i = \frac{\eta_2}{2\pi r_2}\,
        \frac{I_0(x_2)Q - P K_0(x_2)}{I_1(x_2)Q + P K_1(x_2)},

    :math:`P = I_0(x_1) - \zeta I_1(x_1)`, :math:`Q = K_0(x_1) + \zeta K_1(x_1)`. Written with
    ``ive``/``kve`` the exponentials collapse to :math:`e^{(x_1-x_2)+\mathrm{Re}(x_1-x_2)}`
    (modulus :math:`e^{-2t/\delta_2}`). Where :math:`r_1/\delta_2` (or :math:`r_1/\delta_1`
    for :math:`\zeta`) reaches the switch, the Hankel series (A&S 9.7.1-9.7.2 in [3]_) replace
    the Bessel functions, giving
    :math:`(t_0(x_2) - q\,p\,s_0(x_2))/(t_1(x_2) + q\,p\,s_1(x_2))`,
    :math:`p = (t_0 - \zeta t_1)/(s_0 + \zeta s_1)` at :math:`x_1`,
    :math:`q = e^{-2(x_2 - x_1)}`. A layer thicker than :data:`THICK_LAYER_SKIN_DEPTHS` is a
    homogeneous wire of its metal. Limits: equal metals give the homogeneous wire; DC gives the
    layers in parallel (:func:`clad_dc_resistance`); an insulating core gives the planar
    :math:`R/R_s = (\sinh 2\tau + \sin 2\tau)/(\cosh 2\tau - \cos 2\tau)`,
    :math:`\tau = t/\delta_2`, for :math:`r \gg \delta`.

    References
    ----------
    .. [1] S. Ramo, J. R. Whinnery, T. Van Duzer, *Fields and Waves in Communication
       Electronics*, 3rd ed., Wiley, 1994, Sec. 5.5.
    .. [2] S. A. Schelkunoff, *Bell Syst. Tech. J.* 13 (1934) 532-579.
    .. [3] M. Abramowitz, I. A. Stegun, *Handbook of Mathematical Functions*, NBS, 1964.
    """
    if method not in ("auto", "exact"):
        raise ValueError(f"method must be 'auto' or 'exact', got {method!r}")
    r2, r1, rho1, rho2, f, mu1, mu2 = np.broadcast_arrays(*(np.asarray(x, dtype=float) for x in (
        outer_radius, core_radius_m, core_resistivity, layer_resistivity, frequency,
        core_relative_permeability, layer_relative_permeability)))
    shape = r2.shape
    r2, r1, rho1, rho2, f, mu1, mu2 = (x.ravel() for x in (r2, r1, rho1, rho2, f, mu1, mu2))
    delta1 = skin_depth(rho1, f, mu1)
    delta2 = skin_depth(rho2, f, mu2)
    u1, u2 = r1 / delta2, r2 / delta2
    no_layer = r1 >= r2
    layered = ~no_layer & (r1 > 0.0) & (u2 - u1 < THICK_LAYER_SKIN_DEPTHS)
    r_out = np.empty(r2.shape)
    x_out = np.empty(r2.shape)
    # the homogeneous ends, where one metal does not matter: a wire of the other
    for end, rho, mu in ((no_layer, rho1, mu1), (~no_layer & ~layered, rho2, mu2)):
        if end.any():
            r_out[end], x_out[end] = wire_resistance_reactance(r2[end], rho[end], f[end],
                                                               mu[end])
    if layered.any():
        i = np.flatnonzero(layered)
        ratio_mu_rho = np.sqrt(mu1[i] * rho1[i] / (mu2[i] * rho2[i]))
        zeta = ratio_mu_rho * _core_ratio(r1[i] / delta1[i]) if method == "auto" else (
            ratio_mu_rho * special.ive(0, (1 + 1j) * r1[i] / delta1[i])
            / special.ive(1, (1 + 1j) * r1[i] / delta1[i]))
        ratio = np.empty(i.size, dtype=complex)
        big = (u1[i] >= ASYMPTOTIC_MIN_RATIO) if method == "auto" else np.zeros(i.size, bool)
        if big.any():
            ratio[big] = _layer_ratio_asymptotic(u1[i][big], u2[i][big], zeta[big])
        small = ~big
        if small.any():
            x1 = (1.0 + 1.0j) * u1[i][small]
            x2 = (1.0 + 1.0j) * u2[i][small]
            ratio[small] = _layer_ratio_exact(x1, x2, zeta[small])
        # (1 + j) s ratio, s = rho2 / (2 pi r2 delta2)
        z = (1.0 + 1.0j) * (rho2[i] / (2.0 * np.pi * r2[i] * delta2[i])) * ratio
        r_out[i], x_out[i] = z.real, z.imag
    return r_out.reshape(shape), x_out.reshape(shape)
