r"""A conductor's surface as the line sees it: a clad or plated layer and the roughness.

:class:`ConductorSurface` is the optional argument of
:func:`cablefam.physics.line.conductor_impedances` (None: homogeneous and smooth, the old
numbers bit for bit). The centre conductor's layer is solved exactly
(:func:`cablefam.physics.layered_conductor.clad_wire_resistance_reactance`); the shield's
plating by the planar two-layer surface impedance (:func:`planar_layer_impedance_ratio`),
whose ratio to the bare base metal's multiplies the tube's internal impedance. That holds where
the wall is thick against the plating and the skin depth small against the radius (every
practical shield above a few hundred kHz); at DC the ratio is 1, and the plating's own small
share of the DC conduction is counted in the DC resistance only. Roughness:
:func:`cablefam.physics.roughness.roughness_factor` with the skin depth of the surface metal,
on the resistance. Each layer has its own resistivity at 20 degC and temperature coefficient,
so the thermal iteration heats both metals (:func:`surface_at_temperature`).
"""

from __future__ import annotations

from typing import NamedTuple

import numpy as np

from cablefam.physics.constants import REFERENCE_TEMPERATURE_C
from cablefam.physics.layered_conductor import (clad_wire_resistance_reactance, core_radius,
                                                parallel_resistivity)
from cablefam.physics.roughness import roughness_factor
from cablefam.physics.skin import skin_depth


class ConductorSurface(NamedTuple):
    """A conductor's surface layer and roughness; arrays broadcasting with the designs.

    ``thickness == 0`` means no layer (the conductor is homogeneous, its numbers unchanged).
    """

    thickness: np.ndarray
    """Layer thickness [m] (on each strand, for a stranded conductor)."""
    area_fraction: np.ndarray
    """The layer's share of each wire's cross-section [-] (sets the DC resistance)."""
    resistivity_20c: np.ndarray
    """Layer resistivity at 20 degC [ohm m]."""
    temperature_coefficient: np.ndarray
    """Its temperature coefficient at 20 degC [K^-1]."""
    relative_permeability: np.ndarray
    """Its relative permeability [-]."""
    roughness_rms: np.ndarray
    """RMS roughness of the conductor's current-carrying surface [m] (0: smooth)."""
    temperature_c: np.ndarray | float = REFERENCE_TEMPERATURE_C
    """Layer temperature [degC] at which its resistivity is taken."""

    @property
    def resistivity(self):
        """Layer resistivity at :attr:`temperature_c` [ohm m] (clause 2.1.1 of IEC 60287-1-1)."""
        return np.asarray(self.resistivity_20c, dtype=float) * (
            1.0 + np.asarray(self.temperature_coefficient, dtype=float)
            * (np.asarray(self.temperature_c, dtype=float) - REFERENCE_TEMPERATURE_C))


def surface_at_temperature(surface: ConductorSurface | None, temperature_c):
    """``surface`` with its layer at ``temperature_c`` [degC]; None stays None."""
    return None if surface is None else surface._replace(temperature_c=temperature_c)


def take_surface(surface: ConductorSurface | None, index):
    """The designs at ``index`` of a surface of 1-D arrays (scalars kept); None stays None."""
    if surface is None:
        return None
    return ConductorSurface(*(x[index] if np.ndim(x) else x for x in surface))


# --------------------------------------------------------------------------- planar layer


def planar_layer_impedance_ratio(thickness, layer_resistivity, base_resistivity, frequency,
                                 layer_relative_permeability=1.0, base_relative_permeability=1.0):
    r"""Surface impedance of a plated metal over that of the bare base metal (complex) [-].

    Parameters
    ----------
    thickness : array_like
        Plating thickness :math:`t` [m], >= 0 (0: ratio 1).
    layer_resistivity, base_resistivity : array_like
        :math:`\rho_2` (plating), :math:`\rho_1` (base) [ohm m].
    frequency : array_like
        [Hz], > 0.
    layer_relative_permeability, base_relative_permeability : array_like, optional
        [-].

    Returns
    -------
    tuple of numpy.ndarray
        Real and imaginary parts of :math:`Z_s/\eta_1`.

    Notes
    -----
    A layer on a half-space, as a transmission line of the layer's wave impedance
    :math:`\eta_2` terminated by :math:`\eta_1` (Sec. 5.5 and 5.6 of [1]_):

    .. math:: \frac{Z_s}{\eta_1} = n\,\frac{1 + nT}{n + T}, \qquad
        n = \frac{\eta_2}{\eta_1} = \sqrt{\frac{\mu_2\rho_2}{\mu_1\rho_1}}, \qquad
        T = \tanh(\gamma_2 t) = \frac{1 - E}{1 + E}, \quad E = e^{-2(1+j)t/\delta_2}

    (:math:`|E| \le 1`, so no overflow). An insulating base (:math:`n \to 0`) gives
    :math:`Z_s = \eta_2\coth(\gamma_2 t)`. Planar: the plating and the skin depth are taken as
    small against the radius (module notes).

    References
    ----------
    .. [1] S. Ramo, J. R. Whinnery, T. Van Duzer, *Fields and Waves in Communication
       Electronics*, 3rd ed., Wiley, 1994.
    """
    t = np.asarray(thickness, dtype=float)
    delta2 = skin_depth(layer_resistivity, frequency, layer_relative_permeability)
    n = np.sqrt(np.asarray(layer_relative_permeability, dtype=float)
                * np.asarray(layer_resistivity, dtype=float)
                / (np.asarray(base_relative_permeability, dtype=float)
                   * np.asarray(base_resistivity, dtype=float)))
    e = np.exp(-2.0 * (1.0 + 1.0j) * (t / delta2))
    tanh = (1.0 - e) / (1.0 + e)
    ratio = n * (1.0 + n * tanh) / (n + tanh)
    ratio = np.where(t > 0.0, ratio, 1.0 + 0.0j)
    return ratio.real, ratio.imag


# --------------------------------------------------------------------------- hooks of line.py


def inner_surface_impedance(a, resistivity, frequency, relative_permeability,
                            surface: ConductorSurface, r_plain, x_plain, method="auto"):
    r"""Centre-conductor :math:`(R, X_i)` with its layer and roughness [ohm m^-1].

    ``r_plain, x_plain`` are the homogeneous wire's values (kept bit for bit where the design
    has neither layer nor roughness). The roughness factor
    (:func:`cablefam.physics.roughness.roughness_factor`) uses the skin depth of the surface
    metal and multiplies :math:`R` only.

    A stranded conductor (``surface.thickness`` is each strand's layer, ``area_fraction`` its
    share of each strand): the wire of the overall radius :math:`a` carries that layer on its
    surface, and inside it an equivalent core that also holds the inner strands' layers, of
    resistivity :math:`\rho_1' = (1 - f_o)/(1/\rho_{dc} - f_o/\rho_2)` with
    :math:`f_o = 1 - (1 - t/a)^2` and :math:`\rho_{dc}` the strands' layers in parallel
    (:func:`inner_dc_resistivity`), so that its DC resistance is that of the strands' metal
    over the overall circle (a solid clad wire: :math:`f_o = f`, :math:`\rho_1' = \rho_1`).
    """
    rho2 = surface.resistivity
    mu2 = surface.relative_permeability
    t = np.asarray(surface.thickness, dtype=float)
    clad = t > 0.0
    r_i, x_i = r_plain, x_plain
    if np.any(clad):
        r1 = core_radius(a, t)
        f_strand = np.asarray(surface.area_fraction, dtype=float)
        f_overall = 1.0 - (r1 / a) ** 2
        rho_dc = parallel_resistivity(resistivity, rho2, f_strand)
        rho1 = np.where(np.abs(f_overall - f_strand) > 1e-12,
                        (1.0 - f_overall) / (1.0 / rho_dc - f_overall / rho2), resistivity)
        r_c, x_c = clad_wire_resistance_reactance(
            a, r1, rho1, rho2, frequency, relative_permeability, mu2,
            method="exact" if method == "exact" else "auto")
        r_i, x_i = np.where(clad, r_c, r_i), np.where(clad, x_c, x_i)
    rough = np.asarray(surface.roughness_rms, dtype=float) > 0.0
    if np.any(rough):
        k = surface_roughness_factor(surface, resistivity, frequency, relative_permeability)
        r_i = np.where(rough, r_i * k, r_i)
    return r_i, x_i


def surface_roughness_factor(surface: ConductorSurface, resistivity, frequency,
                             relative_permeability):
    r"""Roughness factor of a conductor's surface [-]: Hammerstad-Jensen
    (:func:`cablefam.physics.roughness.roughness_factor`) with the skin depth of the surface
    metal, the layer's where the conductor has one (``surface.thickness > 0``), else its own
    (``resistivity`` [ohm m], ``relative_permeability`` [-], ``frequency`` [Hz])."""
    delta = np.where(np.asarray(surface.thickness, dtype=float) > 0.0,
                     skin_depth(surface.resistivity, frequency, surface.relative_permeability),
                     skin_depth(resistivity, frequency, relative_permeability))
    return roughness_factor(surface.roughness_rms, delta)


def inner_dc_resistivity(resistivity, surface: ConductorSurface | None):
    """The centre conductor's DC resistivity: its own, or its layers in parallel [ohm m]."""
    if surface is None:
        return resistivity
    f = np.asarray(surface.area_fraction, dtype=float)
    return np.where(f > 0.0, parallel_resistivity(resistivity, surface.resistivity, f),
                    resistivity)


def shield_surface_impedance(resistivity, frequency, relative_permeability,
                             surface: ConductorSurface, r_plain, x_plain):
    r"""Shield :math:`(R, X_i)` with its plating (planar ratio) and roughness [ohm m^-1].

    The complex ratio of :func:`planar_layer_impedance_ratio` multiplies :math:`R + jX_i`; the
    roughness factor then multiplies :math:`R`. Values are kept bit for bit where the design has
    neither plating nor roughness.
    """
    t = np.asarray(surface.thickness, dtype=float)
    plated = t > 0.0
    r_s, x_s = r_plain, x_plain
    rho2 = surface.resistivity
    mu2 = surface.relative_permeability
    if np.any(plated):
        k_re, k_im = planar_layer_impedance_ratio(t, rho2, resistivity, frequency, mu2,
                                                  relative_permeability)
        r_s, x_s = (np.where(plated, r_plain * k_re - x_plain * k_im, r_plain),
                    np.where(plated, r_plain * k_im + x_plain * k_re, x_plain))
    rough = np.asarray(surface.roughness_rms, dtype=float) > 0.0
    if np.any(rough):
        k = surface_roughness_factor(surface, resistivity, frequency, relative_permeability)
        r_s = np.where(rough, r_s * k, r_s)
    return r_s, x_s
