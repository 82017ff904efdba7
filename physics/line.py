r"""Transmission-line parameters of a coax: R, L, G, C and the lossless impedance.

What follows from R, L, G, C for any line (propagation constant, characteristic impedance,
attenuation split, velocity) is in :mod:`cablefam.physics.propagation`, re-exported here.

Geometry symbols (used throughout :mod:`physics`): centre-conductor radius :math:`a`,
dielectric outer radius :math:`b` (= shield inner radius), shield outer radius :math:`c`.
The dielectric is taken as non-magnetic.
"""

from __future__ import annotations

from typing import NamedTuple

import numpy as np

from cablefam.physics import conductor_surface, eccentricity, outer_conductor
from cablefam.physics.eccentricity import impedance_per_geometry_factor  # noqa: F401 (re-export)
from cablefam.physics.constants import epsilon_0, mu_0
from cablefam.physics.internal_impedance import (tube_dc_resistance,
                                                 tube_resistance_reactance, wire_dc_resistance,
                                                 wire_resistance_reactance)
from cablefam.physics.propagation import (attenuation_split,  # noqa: F401 (re-exported)
                                          characteristic_impedance,
                                          characteristic_impedance_modulus, delay_per_metre,
                                          propagation_constant, velocity_factor)
from cablefam.physics.stranding import stranded_effective_radius, strand_layup


class LineParameters(NamedTuple):
    """Per-unit-length parameters of a line; arrays of a common shape."""

    r: np.ndarray
    """Series resistance, centre conductor + shield [ohm m^-1]."""
    l: np.ndarray  # noqa: E741 - the symbol of the trade
    """Series inductance, external + internal [H m^-1]."""
    g: np.ndarray
    """Shunt conductance [S m^-1]."""
    c: np.ndarray
    """Shunt capacitance [F m^-1]."""
    r_inner: np.ndarray
    """Resistance of the centre conductor alone [ohm m^-1]."""
    r_shield: np.ndarray
    """Resistance of the shield alone [ohm m^-1]."""


class LineFixedParts(NamedTuple):
    """Parts of the line parameters that do not depend on the conductor resistivities.

    They do not change with the conductor temperatures, so a thermal iteration computes them
    once (:func:`line_fixed_parts`) and only the internal impedances per pass
    (:func:`conductor_impedances`). A factor is ``None`` where it is 1 for every design.
    """

    geometry_factor: np.ndarray
    r""":math:`\Lambda` of the (effective) centre-conductor radius and :math:`b` [-]."""
    l_external: np.ndarray
    """External inductance [H m^-1]."""
    c: np.ndarray
    """Capacitance [F m^-1]."""
    g: np.ndarray
    """Shunt conductance [S m^-1]."""
    inner_loss_factor: np.ndarray | None
    """Wheeler factor of the centre conductor (offset line) [-]; None: concentric."""
    shield_loss_factor: np.ndarray | None
    """Wheeler factor of the shield (offset line) [-]; None: concentric."""
    inner_skin_effect_factor: np.ndarray | None
    """Skin-effect factor of a stranded centre conductor [-]; None: solid."""
    inner_dc_resistance_factor: np.ndarray | None
    """DC resistance of the strands over that of a solid wire of the overall radius [-];
    None: solid."""


def _lambda(a, b, offset, geometry_factor):
    """The caller's geometry factor, or :func:`cablefam.physics.eccentricity.geometry_factor`."""
    if geometry_factor is None:
        return eccentricity.geometry_factor(a, b, offset)
    return np.asarray(geometry_factor, dtype=float)


def capacitance(a, b, relative_permittivity, offset=0.0, geometry_factor=None):
    r"""Capacitance per unit length, :math:`C = 2\pi\varepsilon_0\varepsilon_r/\ln(b/a)` [F m^-1].

    Parameters
    ----------
    a, b : array_like
        Centre-conductor radius and dielectric outer radius [m], ``b > a``.
    relative_permittivity : array_like
        :math:`\varepsilon_r` of the dielectric [-].
    offset : array_like, optional
        Eccentricity of the centre conductor [m]; :math:`\ln(b/a)` becomes the arccosh form
        of :func:`cablefam.physics.eccentricity.geometry_factor`.
    geometry_factor : array_like, optional
        :math:`\Lambda` of ``a, b, offset`` when the caller has it already [-] (then ``a``,
        ``b`` and ``offset`` are not used).

    References
    ----------
    .. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012, Table 2.1.
    """
    return 2.0 * np.pi * epsilon_0 * np.asarray(relative_permittivity, dtype=float) / (
        _lambda(a, b, offset, geometry_factor))


def inductance_external(a, b, offset=0.0, geometry_factor=None):
    r"""External inductance per unit length, :math:`L_e = \mu_0 \ln(b/a) / (2\pi)` [H m^-1].

    With an ``offset`` [m] of the centre conductor, :math:`\ln(b/a)` becomes the arccosh form
    of :func:`cablefam.physics.eccentricity.geometry_factor`; ``geometry_factor`` as in
    :func:`capacitance`.

    References
    ----------
    .. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012, Table 2.1.
    """
    return mu_0 / (2.0 * np.pi) * _lambda(a, b, offset, geometry_factor)


def conductance(capacitance_f_per_m, frequency, loss_tangent):
    r"""Shunt conductance from the loss tangent, :math:`G = \omega C \tan\delta` [S m^-1].

    References
    ----------
    .. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012, Sec. 2.1 (lossy dielectric).
    """
    return 2.0 * np.pi * np.asarray(frequency, dtype=float) * capacitance_f_per_m * np.asarray(
        loss_tangent, dtype=float)


def line_fixed_parts(a, b, frequency, relative_permittivity, loss_tangent, offset=0.0,
                     inner_strands=1, geometry_factor=None):
    r"""The parts of :func:`line_parameters` that do not depend on the resistivities.

    Parameters
    ----------
    a, b, frequency, relative_permittivity, loss_tangent, offset, inner_strands
        As in :func:`line_parameters`.
    geometry_factor : array_like, optional
        :math:`\Lambda` of the effective centre-conductor radius (stranded: that of
        :func:`cablefam.physics.stranding.stranded_effective_radius`), ``b`` and ``offset``,
        when the caller has it already [-].

    Returns
    -------
    LineFixedParts
        :math:`\Lambda`, :math:`L_e`, :math:`C`, :math:`G` and the conductor factors (see
        :func:`line_parameters` for the formulas).
    """
    a_ext = a
    skin_factor = dc_factor = None
    if np.any(np.asarray(inner_strands) != 1):
        a_ext = stranded_effective_radius(a, inner_strands)
        layup = strand_layup(inner_strands)
        skin_factor, dc_factor = layup.skin_effect_factor, layup.dc_resistance_factor
    lam = _lambda(a_ext, b, offset, geometry_factor)
    f_inner = f_shield = None
    if np.any(offset):
        f_inner, f_shield = eccentricity.wheeler_loss_factors(a_ext, b, offset)
    cap = capacitance(a_ext, b, relative_permittivity, geometry_factor=lam)
    return LineFixedParts(
        geometry_factor=lam, l_external=inductance_external(a_ext, b, geometry_factor=lam),
        c=cap, g=conductance(cap, frequency, loss_tangent), inner_loss_factor=f_inner,
        shield_loss_factor=f_shield, inner_skin_effect_factor=skin_factor,
        inner_dc_resistance_factor=dc_factor)


class ConductorImpedances(NamedTuple):
    """Internal resistance and reactance of each conductor [ohm m^-1]; arrays of one shape."""

    r_inner: np.ndarray
    x_inner: np.ndarray
    r_shield: np.ndarray
    x_shield: np.ndarray


def conductor_impedances(a, b, c, frequency, inner_resistivity, shield_resistivity,
                         fixed: LineFixedParts, inner_relative_permeability=1.0,
                         shield_relative_permeability=1.0, method="auto",
                         inner_surface=None, shield_surface=None, outer=None):
    r"""Internal impedances of the centre conductor and of the shield in the line.

    Parameters
    ----------
    a, b, c, frequency, inner_resistivity, shield_resistivity : array_like
        As in :func:`line_parameters` [m], [Hz], [ohm m].
    fixed : LineFixedParts
        From :func:`line_fixed_parts` for the same designs (its conductor factors are used).
    inner_relative_permeability, shield_relative_permeability, method : optional
        As in :func:`line_parameters`.
    inner_surface, shield_surface : cablefam.physics.conductor_surface.ConductorSurface, optional
        A clad or plated layer and the surface roughness of each conductor (None: homogeneous
        and smooth, the plain numbers bit for bit); see :func:`line_parameters`.
    outer : cablefam.physics.outer_conductor.OuterConductor, optional
        Braid and foil outer conductors (None: every shield is a tube; see
        :func:`line_parameters`).

    Returns
    -------
    ConductorImpedances
        :math:`R` and :math:`X_i` of each conductor [ohm m^-1] (real arrays), with the
        stranding and offset factors of :func:`line_parameters` applied.
    """
    r_i, x_i = wire_resistance_reactance(a, inner_resistivity, frequency,
                                         inner_relative_permeability, method=method)
    # --- clad centre conductor and its roughness (conductor_surface); None: homogeneous ---
    inner_dc_resistivity = inner_resistivity
    if inner_surface is not None:
        r_i, x_i = conductor_surface.inner_surface_impedance(
            a, inner_resistivity, frequency, inner_relative_permeability, inner_surface, r_i,
            x_i, method=method)
        inner_dc_resistivity = conductor_surface.inner_dc_resistivity(inner_resistivity,
                                                                      inner_surface)
    # --- end of the clad centre conductor ---
    # --- outer conductors other than the tube (braid, foil; issue 12) ---
    tube = True if outer is None else np.asarray(outer.construction) == 0
    if np.any(tube) or np.all(tube):  # np.all: an empty population takes the tube path
        r_s, x_s = tube_resistance_reactance(b, c, shield_resistivity, frequency,
                                             shield_relative_permeability, method=method)
    if not np.all(tube):
        r_o, x_o = outer_conductor.internal_impedance(outer, b, shield_resistivity, frequency,
                                                      shield_relative_permeability)
        if np.any(tube):
            r_s, x_s = np.where(tube, r_s, r_o), np.where(tube, x_s, x_o)
        else:
            shape = np.broadcast_shapes(np.shape(r_i), np.shape(r_o))
            r_s, x_s = np.broadcast_to(r_o, shape), np.broadcast_to(x_o, shape)
    # --- end of the outer-conductor addition ---
    if fixed.inner_skin_effect_factor is not None:
        skin = fixed.inner_skin_effect_factor
        r_dc = wire_dc_resistance(a, inner_dc_resistivity) * fixed.inner_dc_resistance_factor
        # solid wires (factor exactly 1) untouched: the same bits as in an all-solid population
        r_i = np.where(skin == 1.0, r_i, np.maximum(r_i * skin, r_dc))
        x_i = x_i * skin
    if shield_surface is not None:  # plated shield, roughness (conductor_surface)
        r_s, x_s = conductor_surface.shield_surface_impedance(
            shield_resistivity, frequency, shield_relative_permeability, shield_surface, r_s, x_s)
    if fixed.inner_loss_factor is not None:
        # Wheeler's factors on the skin-effect part only: the DC resistance of an offset line
        # is that of the concentric one (eccentricity.skin_regime_loss_factor)
        r_dc_i = wire_dc_resistance(a, inner_dc_resistivity)
        if fixed.inner_dc_resistance_factor is not None:
            r_dc_i = r_dc_i * fixed.inner_dc_resistance_factor
        f_i = eccentricity.skin_regime_loss_factor(fixed.inner_loss_factor, r_i, r_dc_i)
        f_s = eccentricity.skin_regime_loss_factor(
            fixed.shield_loss_factor, r_s, tube_dc_resistance(b, c, shield_resistivity))
        r_i, x_i = r_i * f_i, x_i * f_i
        r_s, x_s = r_s * f_s, x_s * f_s
    return ConductorImpedances(r_i, x_i, r_s, x_s)


def line_parameters(a, b, c, frequency, inner_resistivity, shield_resistivity,
                    relative_permittivity, loss_tangent, inner_relative_permeability=1.0,
                    shield_relative_permeability=1.0, method="auto", offset=0.0,
                    inner_strands=1, geometry_factor=None, inner_surface=None,
                    shield_surface=None, outer=None):
    r"""R, L, G, C of a coax at frequency :math:`f`, with exact conductor internal impedance.

    Parameters
    ----------
    a, b, c : array_like
        Centre-conductor radius, dielectric radius, shield outer radius [m], ``a < b < c``.
    frequency : array_like
        Frequency [Hz], > 0.
    inner_resistivity, shield_resistivity : array_like
        Resistivities of centre conductor and shield at their temperatures [ohm m].
    relative_permittivity, loss_tangent : array_like
        Dielectric constants [-].
    inner_relative_permeability, shield_relative_permeability : array_like, optional
        Relative permeabilities of the conductors [-].
    method : {"auto", "exact", "asymptotic"}
        Passed to the internal-impedance functions.
    offset : array_like, optional
        Eccentricity of the centre conductor [m]: external L and C from the arccosh form,
        internal impedances times Wheeler's per-conductor factors on their skin-effect part
        (:func:`cablefam.physics.eccentricity.skin_regime_loss_factor`; DC unchanged).
    inner_strands : array_like of int, optional
        Strand count of the centre conductor (1, 7, 19, 37; ``a`` is then its overall
        radius): external L and C use the effective radius of
        :func:`cablefam.physics.stranding.stranded_effective_radius`; the internal impedance
        is that of a solid wire of the overall radius times the stranding skin-effect factor,
        its resistance never below the DC resistance of the strands.
    geometry_factor : array_like, optional
        :math:`\Lambda` of the effective centre-conductor radius, ``b`` and ``offset`` when
        the caller has it already [-] (computed here otherwise).
    inner_surface, shield_surface : cablefam.physics.conductor_surface.ConductorSurface, optional
        A surface layer (clad or plated conductor) and the rms roughness of each conductor:
        the centre conductor by the exact two-layer wire
        (:func:`cablefam.physics.layered_conductor.clad_wire_resistance_reactance`; stranded:
        each strand clad), the shield by the planar plating ratio
        (:func:`cablefam.physics.conductor_surface.planar_layer_impedance_ratio`); roughness
        by :func:`cablefam.physics.roughness.roughness_factor`. None: homogeneous and smooth.
    outer : cablefam.physics.outer_conductor.OuterConductor, optional
        Outer conductor per design (tube, foil, braid, foil + braid, double braid); the
        shield's internal impedance of the non-tube ones is
        :func:`cablefam.physics.outer_conductor.internal_impedance`. None: tubes.

    Returns
    -------
    LineParameters
        ``r`` [ohm m^-1], ``l`` [H m^-1], ``g`` [S m^-1], ``c`` [F m^-1] and the split of ``r``.

    Notes
    -----
    .. math::
        R + j\omega L = Z_{i,\mathrm{wire}}(a) + Z_{i,\mathrm{tube}}(b, c)
                        + j\omega\frac{\mu_0}{2\pi}\ln\frac{b}{a}, \qquad
        G + j\omega C = (\tan\delta + j)\,\omega\frac{2\pi\varepsilon_0\varepsilon_r}{\ln(b/a)}

    (Sec. IV of [1]_). The resistivity-free parts come from :func:`line_fixed_parts`, the
    internal impedances from :func:`conductor_impedances`.

    References
    ----------
    .. [1] S. A. Schelkunoff, *Bell Syst. Tech. J.* 13 (1934) 532-579.
    """
    (a, b, c, frequency, inner_resistivity, shield_resistivity, relative_permittivity,
     loss_tangent) = np.broadcast_arrays(*(np.asarray(x, dtype=float) for x in (
         a, b, c, frequency, inner_resistivity, shield_resistivity, relative_permittivity,
         loss_tangent)))
    omega = 2.0 * np.pi * frequency
    fixed = line_fixed_parts(a, b, frequency, relative_permittivity, loss_tangent, offset,
                             inner_strands, geometry_factor)
    z = conductor_impedances(a, b, c, frequency, inner_resistivity, shield_resistivity, fixed,
                             inner_relative_permeability, shield_relative_permeability, method,
                             inner_surface=inner_surface, shield_surface=shield_surface,
                             outer=outer)
    ind = fixed.l_external + (z.x_inner + z.x_shield) / omega
    return LineParameters(r=z.r_inner + z.r_shield, l=ind, g=fixed.g, c=fixed.c,
                          r_inner=z.r_inner, r_shield=z.r_shield)


def characteristic_impedance_lossless(a, b, relative_permittivity, offset=0.0,
                                      geometry_factor=None):
    r"""Lossless characteristic impedance :math:`\sqrt{L_e/C}` [ohm].

    :math:`\eta_0\ln(b/a)/(2\pi\sqrt{\varepsilon_r})`, i.e. :math:`K\Lambda` with
    :math:`K` of :func:`impedance_per_geometry_factor`; ``offset`` and ``geometry_factor`` as
    in :func:`capacitance`.

    References
    ----------
    .. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012, Table 2.1.
    """
    return impedance_per_geometry_factor(relative_permittivity) * _lambda(a, b, offset,
                                                                          geometry_factor)
