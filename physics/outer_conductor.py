r"""Outer conductors as cables are built: tube, foil, braid, foil + braid, double braid.

A population may mix constructions: :class:`OuterConductor` holds one integer code per design
(:data:`CONSTRUCTIONS` gives the names) and the braid and foil arrays; every function here
evaluates each construction where it occurs and picks per design with ``numpy.where`` (no
loop over designs). The tube itself stays with :mod:`cablefam.physics.internal_impedance`;
the functions here give the tube's numbers only where a caller asks for a mixed population.

Radial build (the shield layer from :math:`b` to :math:`c`): tube, its wall; foil, its
thickness :math:`t_f`; braid, :math:`2d`; foil + braid, :math:`t_f + 2d`; double braid,
:math:`4d`.
"""

from __future__ import annotations

from typing import NamedTuple

import numpy as np

from cablefam.physics import braid, transfer_impedance as zt
from cablefam.physics.internal_impedance import tube_dc_resistance, tube_resistance_reactance

#: Names of the constructions, in code order (the code is the index).
CONSTRUCTIONS = ("tube", "foil", "braid", "foil-braid", "double-braid")
TUBE, FOIL, BRAID, FOIL_BRAID, DOUBLE_BRAID = range(len(CONSTRUCTIONS))


class OuterConductor(NamedTuple):
    """Arrays (one per design, or scalars) describing the outer conductor beyond the tube.

    The braid wire is the shield material (resistivity, permeability, density of the caller's
    shield table); the foil has its own. Fields of constructions a design does not use are
    ignored for it (any finite value).
    """

    construction: np.ndarray
    """Code, index into :data:`CONSTRUCTIONS` [-]."""
    carriers: np.ndarray
    ends: np.ndarray
    wire_diameter: np.ndarray
    """Braid wire diameter [m]."""
    angle: np.ndarray
    """Braid angle to the axis [rad]."""
    foil_thickness: np.ndarray
    """[m]."""
    foil_resistivity: np.ndarray
    """[ohm m]."""
    foil_relative_permeability: np.ndarray | float = 1.0


def _has(code, *kinds):
    return np.isin(np.asarray(code), kinds)


def radial_build(oc: OuterConductor, shield_thickness):
    r"""Thickness of the shield layer :math:`c - b` of each design [m] (module docstring)."""
    code = np.asarray(oc.construction)
    d = np.asarray(oc.wire_diameter, dtype=float)
    t_f = np.asarray(oc.foil_thickness, dtype=float)
    return np.select([code == TUBE, code == FOIL, code == BRAID, code == FOIL_BRAID],
                     [np.asarray(shield_thickness, dtype=float) + 0.0 * d, t_f + 0.0 * d,
                      2.0 * d + 0.0 * t_f, t_f + 2.0 * d], 4.0 * d + 0.0 * t_f)


def _braid_radius(oc: OuterConductor, b):
    """Radius under the (first) braid: over the foil where there is one [m]."""
    return np.asarray(b, dtype=float) + np.where(np.asarray(oc.construction) == FOIL_BRAID,
                                                 np.asarray(oc.foil_thickness, dtype=float), 0.0)


def dc_resistance(oc: OuterConductor, b, c, shield_resistivity):
    r"""DC resistance per metre of the outer conductor [ohm m^-1].

    Tube: :math:`\rho/(\pi(c^2-b^2))`; foil: :func:`cablefam.physics.braid.foil_dc_resistance`;
    braid: :func:`cablefam.physics.braid.braid_dc_resistance` (along the lay); layers in
    parallel.
    """
    code = np.asarray(oc.construction)
    r_tube = tube_dc_resistance(b, c, shield_resistivity)
    r_braid = braid.braid_dc_resistance(oc.carriers, oc.ends, oc.wire_diameter, oc.angle,
                                        shield_resistivity)
    r_foil = braid.foil_dc_resistance(b, oc.foil_thickness, oc.foil_resistivity)
    return np.select([code == TUBE, code == FOIL, code == BRAID, code == FOIL_BRAID],
                     [r_tube, r_foil + 0.0 * r_tube, r_braid + 0.0 * r_tube,
                      r_foil * r_braid / (r_foil + r_braid)], 0.5 * r_braid + 0.0 * r_tube)


def shield_mass(oc: OuterConductor, b, c, shield_density, foil_density):
    r"""Metal mass per metre of the outer conductor [kg m^-1].

    Tube: :math:`\rho_m\pi(c^2-b^2)`; braid: :func:`cablefam.physics.braid.braid_mass` (along
    the lay), the outer braid of a double braid at its own (larger) radius with the same
    carriers, ends and angle; foil: :math:`\rho_f\pi((b+t)^2-b^2)`.
    """
    code = np.asarray(oc.construction)
    b = np.asarray(b, dtype=float)
    tube = np.asarray(shield_density, dtype=float) * np.pi * (np.asarray(c) ** 2 - b * b)
    one_braid = braid.braid_mass(oc.carriers, oc.ends, oc.wire_diameter, oc.angle,
                                 shield_density)
    t_f = np.asarray(oc.foil_thickness, dtype=float)
    foil = np.asarray(foil_density, dtype=float) * np.pi * t_f * (2.0 * b + t_f)
    return np.select([code == TUBE, code == FOIL, code == BRAID, code == FOIL_BRAID],
                     [tube, foil + 0.0 * tube, one_braid + 0.0 * tube, foil + one_braid],
                     2.0 * one_braid + 0.0 * tube)


def _braid_surfaces(oc, radius, rho, f, mu_r):
    """(Z_T, Z_i) of one braid at ``radius`` (its outer surface taken as its inner one)."""
    r, x = braid.braid_internal_impedance(radius, oc.carriers, oc.ends, oc.wire_diameter,
                                          oc.angle, rho, f, mu_r)
    z_i = r + 1.0j * x
    z_t = zt.braid_transfer_impedance(radius, oc.carriers, oc.ends, oc.wire_diameter, oc.angle,
                                      rho, f, mu_r)
    return z_t, z_i


def _foil_surfaces(oc, b, f):
    """(Z_T, Z_surface) of the foil at ``b`` (thin-wall forms)."""
    c = np.asarray(b, dtype=float) + np.asarray(oc.foil_thickness, dtype=float)
    args = (b, c, oc.foil_resistivity, f, oc.foil_relative_permeability)
    return zt.thin_tube_transfer_impedance(*args), zt.thin_tube_surface_impedance(*args)


def internal_impedance(oc: OuterConductor, b, shield_resistivity, frequency,
                       shield_relative_permeability=1.0):
    r"""Internal resistance and reactance of non-tube outer conductors [ohm m^-1].

    Foil: Schelkunoff's exact tube formula with the foil's resistivity and thickness
    (:func:`cablefam.physics.internal_impedance.tube_resistance_reactance`); braid:
    :func:`cablefam.physics.braid.braid_internal_impedance`; foil + braid and double braid:
    the layers in contact (:func:`cablefam.physics.transfer_impedance.layered`). Tube designs
    get 0 here (their impedance comes from the tube formula).

    Returns
    -------
    tuple of numpy.ndarray
        :math:`(R, X_i)` [ohm m^-1].
    """
    code = np.asarray(oc.construction)
    b = np.asarray(b, dtype=float)
    rho, f, mu_r = shield_resistivity, frequency, shield_relative_permeability
    z = np.zeros(np.broadcast_shapes(np.shape(code), np.shape(b), np.shape(f)), dtype=complex)
    if np.any(code == FOIL):
        r_f, x_f = tube_resistance_reactance(b, b + np.asarray(oc.foil_thickness, dtype=float),
                                             oc.foil_resistivity, f,
                                             oc.foil_relative_permeability)
        z = np.where(code == FOIL, r_f + 1.0j * x_f, z)
    if np.any(_has(code, BRAID, FOIL_BRAID, DOUBLE_BRAID)):
        z_t_b, z_i_b = _braid_surfaces(oc, _braid_radius(oc, b), rho, f, mu_r)
        z = np.where(code == BRAID, z_i_b, z)
        if np.any(code == FOIL_BRAID):
            z_t_f, z_s_f = _foil_surfaces(oc, b, f)
            z = np.where(code == FOIL_BRAID, zt.layered(z_t_f, z_s_f, z_s_f, z_t_b, z_i_b)[1], z)
        if np.any(code == DOUBLE_BRAID):
            outer_r = b + 2.0 * np.asarray(oc.wire_diameter, dtype=float)
            z_t_2, z_i_2 = _braid_surfaces(oc, outer_r, rho, f, mu_r)
            z = np.where(code == DOUBLE_BRAID, zt.layered(z_t_b, z_i_b, z_i_b, z_t_2, z_i_2)[1],
                         z)
    return z.real, z.imag


def transfer_impedance(oc: OuterConductor, b, c, shield_resistivity, frequency,
                       shield_relative_permeability=1.0):
    r"""Transfer impedance :math:`Z_T` of every construction [ohm m^-1], complex.

    Tube: :func:`cablefam.physics.transfer_impedance.tube_transfer_impedance` (exact);
    foil: the thin-wall closed form; braid: Vance + Tyni
    (:func:`cablefam.physics.transfer_impedance.braid_transfer_impedance`); foil + braid and
    double braid: :func:`cablefam.physics.transfer_impedance.layered`.
    """
    code = np.asarray(oc.construction)
    b = np.asarray(b, dtype=float)
    rho, f, mu_r = shield_resistivity, frequency, shield_relative_permeability
    shape = np.broadcast_shapes(np.shape(code), np.shape(b), np.shape(f))
    z = np.zeros(shape, dtype=complex)
    if np.any(code == TUBE):
        z = np.where(code == TUBE, zt.tube_transfer_impedance(b, c, rho, f, mu_r), z)
    if np.any(code == FOIL):
        z = np.where(code == FOIL, _foil_surfaces(oc, b, f)[0], z)
    if np.any(_has(code, BRAID, FOIL_BRAID, DOUBLE_BRAID)):
        z_t_b, z_i_b = _braid_surfaces(oc, _braid_radius(oc, b), rho, f, mu_r)
        z = np.where(code == BRAID, z_t_b, z)
        if np.any(code == FOIL_BRAID):
            z_t_f, z_s_f = _foil_surfaces(oc, b, f)
            z = np.where(code == FOIL_BRAID, zt.layered(z_t_f, z_s_f, z_s_f, z_t_b, z_i_b)[0], z)
        if np.any(code == DOUBLE_BRAID):
            outer_r = b + 2.0 * np.asarray(oc.wire_diameter, dtype=float)
            z_t_2, z_i_2 = _braid_surfaces(oc, outer_r, rho, f, mu_r)
            z = np.where(code == DOUBLE_BRAID, zt.layered(z_t_b, z_i_b, z_i_b, z_t_2, z_i_2)[0],
                         z)
    return z
