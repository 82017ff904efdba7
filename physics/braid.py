r"""Braided and foil outer conductors: geometry, DC resistance, mass and RF resistance.

A braid is woven from :math:`C` carriers (half turning each way), each of :math:`N` parallel
wires ("ends") of diameter :math:`d`, laid at the angle :math:`\alpha` to the cable axis over
the dielectric of diameter :math:`2b`. Its mean diameter is :math:`D_m = 2b + 2d` (the braid is
two wire diameters thick, a double braid four). Everything is per metre of cable and vectorized.

Symbols: carriers :math:`C`, ends :math:`N`, wire diameter :math:`d` [m], braid angle
:math:`\alpha` [rad], mean braid diameter :math:`D_m` [m], fill factor :math:`F`, optical
coverage :math:`K`.
"""

from __future__ import annotations

from typing import NamedTuple

import numpy as np

from cablefam.physics.skin import surface_resistance

#: Braid loss factor :math:`k_b`: the RF resistance of a braid over that of a smooth sheet whose
#: current runs along the wires (the helical-path factor :math:`1/\cos^2\alpha` is applied
#: separately). It stands for the wire crossings, the contact resistance between wires and the
#: uneven inner surface, which no closed-form model at hand reproduces. Calibrated (this one
#: number, rounded to 2.0 from 2.03) on the attenuation of RG-213/U at 150 MHz, 2.53 dB/100 ft,
#: in Table 6-1 of the ARRL General Class License Manual (corrected table published at
#: arrl.org, "Chapter 6 Antennas"), with the RG-213/U construction of
#: ``tests/physics/test_braid_attenuation.py``; RG-58, RG-59 and RG-174 of that table and the
#: RG-58C/U and RG-213/U values of a second table are held out there.
BRAID_LOSS_FACTOR = 2.0


class BraidGeometry(NamedTuple):
    """Geometry of a braid; arrays of a common shape."""

    mean_diameter: np.ndarray
    r"""Mean braid diameter :math:`D_m = 2b + 2d` [m]."""
    fill_factor: np.ndarray
    r"""Fill factor :math:`F` (one direction) [-]."""
    optical_coverage: np.ndarray
    r"""Optical coverage :math:`K = 2F - F^2` [-]."""
    picks_per_m: np.ndarray
    r"""Picks (wire crossings of one direction along a generator line) [m^-1]."""
    lay_length: np.ndarray
    r"""Length along the axis of one turn of a carrier, :math:`\pi D_m/\tan\alpha` [m]."""
    lay_factor: np.ndarray
    r"""Wire length per cable length, :math:`1/\cos\alpha` [-]."""
    hole_width: np.ndarray
    r"""Width of the gap between neighbouring carriers,
    :math:`w = 2\pi D_m\cos\alpha/C - N d` [m] (negative: over-filled)."""


def braid_geometry(dielectric_radius, carriers, ends, wire_diameter, angle):
    r"""Picks, fill factor and optical coverage of a braid after MIL-C-17.

    Parameters
    ----------
    dielectric_radius : array_like
        Radius under the braid :math:`b` [m].
    carriers, ends : array_like
        Number of carriers :math:`C` and wires per carrier :math:`N` [-].
    wire_diameter : array_like
        Braid wire diameter :math:`d` [m].
    angle : array_like
        Braid angle :math:`\alpha` to the cable axis [rad], in (0, pi/2).

    Returns
    -------
    BraidGeometry

    Notes
    -----
    The specification's formulas ([1]_, braid angle and coverage; also [2]_):

    .. math::
        \tan\alpha = \frac{2\pi D_m P}{C},\qquad F = \frac{N P d}{\sin\alpha}
        = \frac{N C d}{2\pi D_m\cos\alpha},\qquad K = 2F - F^2

    with :math:`P` the picks per unit length and :math:`D_m = 2b + 2d`.

    References
    ----------
    .. [1] MIL-C-17G, *Cables, radio frequency, flexible and semirigid, general specification
       for*, braid angle and percent coverage formulas.
    .. [2] MIL-HDBK-216, *R.F. transmission lines and fittings*, braid coverage.
    """
    b, c, n, d, alpha = np.broadcast_arrays(*(np.asarray(x, dtype=float) for x in (
        dielectric_radius, carriers, ends, wire_diameter, angle)))
    dm = 2.0 * b + 2.0 * d
    cos_a = np.cos(alpha)
    fill = n * c * d / (2.0 * np.pi * dm * cos_a)
    picks = c * np.tan(alpha) / (2.0 * np.pi * dm)
    return BraidGeometry(mean_diameter=dm, fill_factor=fill, optical_coverage=fill * (2.0 - fill),
                         picks_per_m=picks, lay_length=np.pi * dm / np.tan(alpha),
                         lay_factor=1.0 / cos_a,
                         hole_width=2.0 * np.pi * dm * cos_a / c - n * d)


def braid_metal_area(carriers, ends, wire_diameter):
    r"""Cross-section of all braid wires, :math:`A = N C \pi d^2/4` [m^2]."""
    return (np.asarray(ends, dtype=float) * np.asarray(carriers, dtype=float) * np.pi / 4.0
            * np.asarray(wire_diameter, dtype=float) ** 2)


def braid_dc_resistance(carriers, ends, wire_diameter, angle, resistivity):
    r"""DC resistance per metre of cable of a braid, along the lay [ohm m^-1].

    Notes
    -----
    The :math:`NC` wires in parallel, each :math:`1/\cos\alpha` long per metre of cable
    (Eq. (2) of [1]_ in the form :math:`R_0 = 4/(\pi d^2 N C\sigma\cos\alpha)`):

    .. math:: R_{dc} = \frac{\rho}{N C \pi d^2/4\,\cos\alpha}

    References
    ----------
    .. [1] E. F. Vance, "Shielding effectiveness of braided-wire shields", *IEEE Trans.
       Electromagn. Compat.* EMC-17 (1975) 71-77.
    """
    return np.asarray(resistivity, dtype=float) / (
        braid_metal_area(carriers, ends, wire_diameter) * np.cos(np.asarray(angle, dtype=float)))


def braid_mass(carriers, ends, wire_diameter, angle, density):
    r"""Mass per metre of cable of a braid, along the lay [kg m^-1] (``density`` [kg m^-3]):
    :math:`m = \rho_m N C\pi d^2/(4\cos\alpha)`."""
    return np.asarray(density, dtype=float) * braid_metal_area(carriers, ends, wire_diameter) / (
        np.cos(np.asarray(angle, dtype=float)))


def foil_dc_resistance(radius, thickness, resistivity):
    r"""DC resistance per metre of a closed foil tube of inner radius ``radius`` [ohm m^-1].

    :math:`R = \rho/(\pi((b+t)^2 - b^2))`; the overlap of a wrapped foil is not counted.
    """
    b = np.asarray(radius, dtype=float)
    t = np.asarray(thickness, dtype=float)
    return np.asarray(resistivity, dtype=float) / (np.pi * t * (2.0 * b + t))


def braid_internal_impedance(radius, carriers, ends, wire_diameter, angle, resistivity, frequency,
                             relative_permeability=1.0, loss_factor=BRAID_LOSS_FACTOR):
    r"""Internal resistance and reactance of a braid as the return conductor of a coax.

    Parameters
    ----------
    radius : array_like
        Radius under the braid :math:`b` [m].
    carriers, ends, wire_diameter, angle
        As in :func:`braid_geometry` ([-], [-], [m], [rad]).
    resistivity : array_like
        Resistivity of the braid wire [ohm m].
    frequency : array_like
        Frequency [Hz], > 0.
    relative_permeability : array_like, optional
        Of the braid wire [-].
    loss_factor : array_like, optional
        :math:`k_b`, default :data:`BRAID_LOSS_FACTOR` (calibrated, see there).

    Returns
    -------
    tuple of numpy.ndarray
        :math:`(R, X_i)` [ohm m^-1].

    Notes
    -----
    The sheet current of each half of the braid runs along its wires, at :math:`\alpha` to the
    axis, so the surface current density is :math:`K_z/\cos\alpha` and the loss per unit area
    :math:`R_s K_z^2/\cos^2\alpha` (the helical-path argument of [1]_). With the braid loss
    factor :math:`k_b` for crossings, contacts and the uneven surface (calibrated,
    :data:`BRAID_LOSS_FACTOR`) the high-frequency part is

    .. math:: R_{hf} = X_{hf} = k_b\,\frac{R_s}{2\pi b\cos^2\alpha},\qquad
              R = \sqrt{R_{dc}^2 + R_{hf}^2}

    where :math:`R_{dc}` is :func:`braid_dc_resistance`; the root-sum-square joins the DC limit
    to the skin-effect regime (common practice, no source; it is exact in both limits).

    References
    ----------
    .. [1] J. L. Goldberg, R. J. Slaughter, "Braid construction and attenuation of coaxial
       cables at microwave frequencies", *Proc. IEE* 113 (1966) 384-389.
    """
    alpha = np.asarray(angle, dtype=float)
    cos_a = np.cos(alpha)
    r_dc = braid_dc_resistance(carriers, ends, wire_diameter, alpha, resistivity)
    r_hf = np.asarray(loss_factor, dtype=float) * surface_resistance(
        resistivity, frequency, relative_permeability) / (
            2.0 * np.pi * np.asarray(radius, dtype=float) * cos_a * cos_a)
    return np.sqrt(r_dc * r_dc + r_hf * r_hf), r_hf
