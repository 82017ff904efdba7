r"""Transfer impedance of coaxial outer conductors: tube, foil, braid and layers of them.

The transfer impedance :math:`Z_T` [ohm m^-1] is the voltage per metre induced on the inside
of a shield per ampere of current on its outside (and vice versa); :math:`Z_T(0) = R_{dc}`.
Layers in electrical contact combine through their surface impedances (Schelkunoff's
transmission-line analogy, [1]_):

.. math:: Z_T = \frac{Z_{T1} Z_{T2}}{Z_{o1} + Z_{i2}},\qquad
          Z_i = Z_{i1} - \frac{Z_{T1}^2}{Z_{o1} + Z_{i2}}

with :math:`Z_{i}` the surface impedance seen from inside (return current inside),
:math:`Z_{o}` that seen from outside. Both reduce to the parallel DC resistances at
:math:`f \to 0`. For a braid as the inner layer, :math:`Z_i` uses only its diffusion part of
:math:`Z_{T1}` (the line's current reaches the outer layer through the metal; the hole and
braid inductances couple outside fields and enter :math:`Z_T` only).

References
----------
.. [1] S. A. Schelkunoff, "The electromagnetic theory of coaxial transmission lines and
   cylindrical shields", *Bell Syst. Tech. J.* 13 (1934) 532-579.
.. [2] E. F. Vance, "Shielding effectiveness of braided-wire shields", *IEEE Trans.
   Electromagn. Compat.* EMC-17 (1975) 71-77.
.. [3] M. Tyni, "The transfer impedance of coaxial cables with braided outer conductor",
   *Proc. EMC Symposium Wroclaw* (1976) 410-419.
.. [4] F. M. Tesche, M. V. Ianoz, T. Karlsson, *EMC Analysis Methods and Computational
   Models*, Wiley, 1997, Ch. 9 (braided-shield models of [2]_ and [3]_ collected).
"""

from __future__ import annotations

import numpy as np
from scipy import special

from cablefam.physics.braid import braid_dc_resistance, braid_geometry
from cablefam.physics.constants import mu_0
from cablefam.physics.skin import skin_depth


def _gamma_t(thickness, resistivity, frequency, relative_permeability):
    r""":math:`\gamma t = (1+j)\,t/\delta` [-] (complex)."""
    u = np.asarray(thickness, dtype=float) / skin_depth(resistivity, frequency,
                                                        relative_permeability)
    return (1.0 + 1.0j) * u


#: Wall (or wire) thickness in skin depths beyond which the diffusion factor
#: :math:`|x/\sinh x| = 2\sqrt{2}u e^{-u}` is below 1e-15 and taken as 0.
_NEGLIGIBLE_DIFFUSION = 40.0


def _diffusion_parts(u):
    r"""Real and imaginary parts of :func:`_diffusion_factor` (real arithmetic only)."""
    u = np.asarray(u, dtype=float)
    # no special case for large u: the terms fall smoothly to ~0 (|denominator| -> 1)
    q = np.exp(-u)
    q2 = q * q
    den_re = (1.0 - q2) * np.cos(u)
    den_im = (1.0 + q2) * np.sin(u)
    with np.errstate(invalid="ignore", divide="ignore"):
        scale = 2.0 * u * q / (den_re * den_re + den_im * den_im)
    small = u < 1e-8
    return (np.where(small, 1.0, scale * (den_re + den_im)),
            np.where(small, 0.0, scale * (den_re - den_im)))


def braid_transfer_impedance_modulus(dielectric_radius, carriers, ends, wire_diameter, angle,
                                     resistivity, frequency, relative_permeability=1.0,
                                     inductance=None):
    r""":math:`|Z_T|` of :func:`braid_transfer_impedance` in real arithmetic [ohm m^-1].

    Same parameters; :math:`|Z_T|^2 = (R_0 F_r)^2 + (R_0 F_i + \omega M)^2` with
    :math:`F = \gamma d/\sinh\gamma d = F_r + jF_i` and :math:`M = M_{12} + L_b`.
    """
    r0 = braid_dc_resistance(carriers, ends, wire_diameter, angle, resistivity)
    f_re, f_im = _diffusion_parts(np.asarray(wire_diameter, dtype=float) / skin_depth(
        resistivity, frequency, relative_permeability))
    m = (braid_transfer_inductance(dielectric_radius, carriers, ends, wire_diameter, angle)
         if inductance is None else np.asarray(inductance, dtype=float))
    x = r0 * f_im + 2.0 * np.pi * np.asarray(frequency, dtype=float) * m
    r = r0 * f_re
    return np.sqrt(r * r + x * x)


def _diffusion_factor(u):
    r""":math:`x/\sinh x` for :math:`x = (1+j)u`, :math:`u \ge 0` real, in real arithmetic.

    Numerator and denominator times :math:`2e^{-u}`:
    :math:`x/\sinh x = 2(1+j)u e^{-u} / [(1 - e^{-2u})\cos u + j(1 + e^{-2u})\sin u]`.
    """
    u = np.asarray(u, dtype=float)
    far = u > _NEGLIGIBLE_DIFFUSION
    if far.all():  # below 1e-15 of the DC value: 0 (and no work)
        return np.zeros(u.shape, dtype=complex)
    if far.any():
        out = np.zeros(u.shape, dtype=complex)
        out[~far] = _diffusion_factor(u[~far])
        return out
    q = np.exp(-u)
    q2 = q * q
    den_re = (1.0 - q2) * np.cos(u)
    den_im = (1.0 + q2) * np.sin(u)
    num = 2.0 * u * q
    with np.errstate(invalid="ignore", divide="ignore"):
        scale = num / (den_re * den_re + den_im * den_im)
    # (1 + j) / (den_re + j den_im) = ((den_re + den_im) + j (den_re - den_im)) / |den|^2
    out = np.empty(np.shape(u), dtype=complex)
    out.real = np.where(u < 1e-8, 1.0, scale * (den_re + den_im))
    out.imag = np.where(u < 1e-8, 0.0, scale * (den_re - den_im))
    return out


def _x_coth(z):
    r""":math:`z\coth z` for complex ``z`` with :math:`\mathrm{Re}\,z \ge 0`, no overflow."""
    q = np.exp(-2.0 * z)
    with np.errstate(invalid="ignore", divide="ignore"):
        out = z * (1.0 + q) / (1.0 - q)
    return np.where(np.abs(z) < 1e-8, 1.0 + 0.0j, out)


def tube_transfer_impedance(inner_radius, outer_radius, resistivity, frequency,
                            relative_permeability=1.0):
    r"""Transfer impedance of a solid tube, exact (Schelkunoff) [ohm m^-1], complex.

    Parameters
    ----------
    inner_radius, outer_radius : array_like
        :math:`b < c` [m].
    resistivity : array_like
        [ohm m].
    frequency : array_like
        [Hz], > 0.
    relative_permeability : array_like, optional
        [-].

    Notes
    -----
    Eq. (47) of [1]_ (module references), :math:`\gamma = (1+j)/\delta`:

    .. math:: Z_T = \frac{\rho}{2\pi b c\,[I_1(\gamma c)K_1(\gamma b)
                    - I_1(\gamma b)K_1(\gamma c)]}

    evaluated with ``ive``/``kve``; the scale factors leave
    :math:`e^{\gamma b - c/\delta}` of modulus :math:`e^{-t/\delta} \le 1`, so nothing
    overflows (a wall of many skin depths gives 0, not NaN). Where :math:`b/\delta \ge 12`
    the Bessel functions are replaced by their Hankel series to second order (A&S 9.7.1,
    9.7.2), :math:`x = \gamma b`, :math:`y = \gamma c`,
    :math:`P(z) = 1 + \tfrac{3}{8z} - \tfrac{15}{128z^2}`,
    :math:`M(z) = 1 - \tfrac{3}{8z} - \tfrac{15}{128z^2}`:

    .. math:: Z_T = \frac{\rho\gamma}{\pi\sqrt{bc}}\,
              \frac{e^{-\gamma t}}{M(y)P(x) - e^{-2\gamma t}M(x)P(y)}

    (measured against the Bessel form: below 2e-5 relative at :math:`b/\delta = 12` for
    walls from 1e-4 b to 3 b).
    """
    b, c, rho, f, mu_r = np.broadcast_arrays(*(np.asarray(x, dtype=float) for x in (
        inner_radius, outer_radius, resistivity, frequency, relative_permeability)))
    delta = skin_depth(rho, f, mu_r)
    big = b >= _TUBE_SERIES_MIN_RATIO * delta
    if big.all():
        return _tube_transfer_series(b, c, rho, delta)
    if big.any():
        out = np.empty(b.shape, dtype=complex)
        out[big] = _tube_transfer_series(b[big], c[big], rho[big], delta[big])
        small = ~big
        out[small] = _tube_transfer_bessel(b[small], c[small], rho[small], delta[small])
        return out
    return _tube_transfer_bessel(b, c, rho, delta)


#: Radius-to-skin-depth ratio from which the tube's transfer impedance uses the Hankel series.
_TUBE_SERIES_MIN_RATIO = 12.0


def _tube_transfer_series(b, c, rho, delta):
    """Schelkunoff's tube transfer impedance from the Hankel series (see the caller)."""
    gamma = (1.0 + 1.0j) / delta
    x_inv, y_inv = 1.0 / (gamma * b), 1.0 / (gamma * c)

    def p(w):
        return 1.0 + w * (0.375 - 0.1171875 * w)

    def m(w):
        return 1.0 - w * (0.375 + 0.1171875 * w)

    e = np.exp(-gamma * (c - b))
    return rho * gamma / (np.pi * np.sqrt(b * c)) * e / (
        m(y_inv) * p(x_inv) - e * e * m(x_inv) * p(y_inv))


def _tube_transfer_bessel(b, c, rho, delta):
    """Schelkunoff's tube transfer impedance from scaled Bessel functions (see the caller)."""
    ub, uc = b / delta, c / delta
    x = (1.0 + 1.0j) * ub
    y = (1.0 + 1.0j) * uc
    e = np.exp((x - y) + (ub - uc))
    den = special.kve(1, x) * special.ive(1, y) - special.ive(1, x) * special.kve(1, y) * e
    scale = np.exp((ub - uc) + 1.0j * ub)
    return rho / (2.0 * np.pi * b * c) * scale / den


def thin_tube_transfer_impedance(inner_radius, outer_radius, resistivity, frequency,
                                 relative_permeability=1.0):
    r"""Transfer impedance of a thin tube or foil, closed form [ohm m^-1], complex.

    Notes
    -----
    The planar-wall limit of the exact form (:math:`t \ll b`; [1]_, [2]_ of the module):

    .. math:: Z_T = R_{dc}\,\frac{\gamma t}{\sinh\gamma t},\qquad
              R_{dc} = \frac{\rho}{\pi(c^2 - b^2)},\ t = c - b
    """
    b = np.asarray(inner_radius, dtype=float)
    c = np.asarray(outer_radius, dtype=float)
    rho = np.asarray(resistivity, dtype=float)
    r_dc = rho / (np.pi * (c * c - b * b))
    return r_dc * _diffusion_factor(
        (c - b) / skin_depth(rho, frequency, relative_permeability))


def thin_tube_surface_impedance(inner_radius, outer_radius, resistivity, frequency,
                                relative_permeability=1.0):
    r"""Surface impedance of a thin tube or foil, either face [ohm m^-1], complex.

    :math:`Z_i = Z_o = R_{dc}\,\gamma t\coth\gamma t` (thin-wall limit, [1]_ of the module).
    """
    b = np.asarray(inner_radius, dtype=float)
    c = np.asarray(outer_radius, dtype=float)
    rho = np.asarray(resistivity, dtype=float)
    r_dc = rho / (np.pi * (c * c - b * b))
    return r_dc * _x_coth(_gamma_t(c - b, rho, frequency, relative_permeability))


def braid_transfer_inductance(dielectric_radius, carriers, ends, wire_diameter, angle):
    r"""Hole inductance (Vance) plus braid inductance (Tyni) of a braid [H m^-1].

    Notes
    -----
    Hole inductance of the rhombic apertures as ellipses of eccentricity :math:`e` ([2]_,
    as collected in [4]_):

    .. math::
        M_{12} = \frac{\pi\mu_0}{6C}(1-K)^{3/2}\frac{e^2}{E(e) - (1-e^2)K(e)},\
        e = \sqrt{1-\tan^2\alpha}\quad (\alpha < 45^\circ)

        M_{12} = \frac{\pi\mu_0}{6C}(1-K)^{3/2}\frac{e^2/\sqrt{1-e^2}}{K(e) - E(e)},\
        e = \sqrt{1-\cot^2\alpha}\quad (\alpha > 45^\circ)

    (:math:`K(e)`, :math:`E(e)`: complete elliptic integrals of modulus :math:`e`). Braid
    (porpoising) inductance of the two wire layers [3]_:

    .. math:: L_b = -\frac{\mu_0 h}{4\pi D_m}(1 - \tan^2\alpha),\qquad
              h = \frac{2d^2}{w + d},\ w = \frac{2\pi D_m\cos\alpha}{C} - N d

    The total is :math:`M_{12} + L_b`. At :math:`\alpha = 45^\circ` (:math:`e = 0`) both
    shape factors tend to :math:`4/\pi` (series of :math:`K` and :math:`E`), which is used
    there. An over-filled braid (:math:`K \ge 1`) has no holes: :math:`M_{12} = 0`; :math:`w`
    is floored at 0.
    """
    b, c, n, d, alpha = np.broadcast_arrays(*(np.asarray(x, dtype=float) for x in (
        dielectric_radius, carriers, ends, wire_diameter, angle)))
    g = braid_geometry(b, c, n, d, alpha)
    tan_a = np.tan(alpha)
    small = tan_a <= 1.0
    ratio = np.where(small, tan_a, 1.0 / tan_a)
    m = np.clip(1.0 - ratio * ratio, 0.0, 1.0)  # e^2 (scipy takes the parameter m = e^2)
    k_m, e_m = special.ellipk(m), special.ellipe(m)
    with np.errstate(invalid="ignore", divide="ignore"):
        shape_small = m / (e_m - (1.0 - m) * k_m)
        shape_large = m / np.sqrt(1.0 - m) / (k_m - e_m)
    # e -> 0 (alpha = 45 deg): both ratios tend to 4/pi (series of K and E in m)
    limit = 4.0 / np.pi
    shape = np.where(m < 1e-8, limit, np.where(small, shape_small, shape_large))
    open_share = np.clip(1.0 - g.optical_coverage, 0.0, 1.0)
    m12 = np.pi * mu_0 / (6.0 * c) * open_share ** 1.5 * shape
    w = np.maximum(g.hole_width, 0.0)
    h = 2.0 * d * d / (w + d)
    l_b = -mu_0 * h / (4.0 * np.pi * g.mean_diameter) * (1.0 - tan_a * tan_a)
    return m12 + l_b


def braid_transfer_impedance(dielectric_radius, carriers, ends, wire_diameter, angle,
                             resistivity, frequency, relative_permeability=1.0,
                             inductance=None):
    r"""Transfer impedance of a single braid, Vance diffusion + hole + Tyni braid inductance.

    inductance : array_like, optional
        :math:`M_{12} + L_b` of :func:`braid_transfer_inductance` when the caller has it
        (it does not depend on frequency) [H m^-1].

    Returns
    -------
    numpy.ndarray of complex
        :math:`Z_T` [ohm m^-1].

    Notes
    -----
    Eqs. of [2]_ with the braid inductance of [3]_ (module references):

    .. math:: Z_T = R_0\frac{\gamma d}{\sinh\gamma d} + j\omega(M_{12} + L_b),\qquad
              R_0 = \frac{4\rho}{\pi d^2 N C\cos\alpha}

    :math:`M_{12} + L_b` from :func:`braid_transfer_inductance`; :math:`Z_T(0) = R_0`, the DC
    resistance of :func:`cablefam.physics.braid.braid_dc_resistance`.
    """
    r0 = braid_dc_resistance(carriers, ends, wire_diameter, angle, resistivity)
    u = np.asarray(wire_diameter, dtype=float) / skin_depth(resistivity, frequency,
                                                            relative_permeability)
    diffusion = r0 * _diffusion_factor(u)
    m = (braid_transfer_inductance(dielectric_radius, carriers, ends, wire_diameter, angle)
         if inductance is None else np.asarray(inductance, dtype=float))
    return diffusion + 2.0j * np.pi * np.asarray(frequency, dtype=float) * m


def layered(z_t1, z_o1, z_i1, z_t2, z_i2):
    r"""Two shield layers in contact, inner (1) and outer (2): :math:`(Z_T, Z_i)`.

    Parameters
    ----------
    z_t1, z_o1, z_i1 : array_like of complex
        Transfer, outer-surface and inner-surface impedance of the inner layer [ohm m^-1].
    z_t2, z_i2 : array_like of complex
        Transfer and inner-surface impedance of the outer layer [ohm m^-1].

    Returns
    -------
    tuple of numpy.ndarray of complex
        :math:`Z_T` and :math:`Z_i` of the pair (formulas in the module docstring).
    """
    den = z_o1 + z_i2
    return z_t1 * z_t2 / den, z_i1 - z_t1 * z_t1 / den
