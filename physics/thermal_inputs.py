r"""Inputs of the coax thermal model, grouped, broadcast and checked once; the resistivity law.

:class:`CoaxThermalInputs` holds the arrays that describe a population of coax designs for
:mod:`cablefam.physics.thermal` (geometry, frequency, ambient, materials).
:func:`checked_flat_inputs` broadcasts them to one shape, flattens and checks them, so that
the solvers work on 1-D arrays that are known to be valid. The conductor resistivities follow
their temperatures by :func:`resistivity_at_temperature`.
"""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass

import numpy as np

from cablefam.physics import _checks, eccentricity
from cablefam.physics.constants import REFERENCE_TEMPERATURE_C
from cablefam.physics.conductor_surface import ConductorSurface, take_surface
from cablefam.physics.stranding import stranded_effective_radius


def resistivity_at_temperature(resistivity_20c, temperature_coefficient, temperature_c):
    r"""Resistivity of a conductor at its operating temperature.

    Parameters
    ----------
    resistivity_20c : array_like
        Resistivity at 20 degC, :math:`\rho_{20}` [ohm m].
    temperature_coefficient : array_like
        Constant-mass temperature coefficient at 20 degC, :math:`\alpha_{20}` [K^-1].
    temperature_c : array_like
        Conductor temperature :math:`\theta` [degC].

    Returns
    -------
    numpy.ndarray
        :math:`\rho(\theta)` [ohm m].

    Notes
    -----
    .. math:: \rho(\theta) = \rho_{20}\left[1 + \alpha_{20}(\theta - 20)\right]

    the temperature correction of the d.c. resistance in clause 2.1.1 of [1]_ (the same
    factor multiplies :math:`R_0`); values of :math:`\rho_{20}` and :math:`\alpha_{20}` for
    copper and aluminium are in Table 1 of [1]_. The reference temperature is
    :data:`cablefam.physics.constants.REFERENCE_TEMPERATURE_C`.

    References
    ----------
    .. [1] IEC 60287-1-1:2006+AMD1:2014, clause 2.1.1 and Table 1.
    """
    return np.asarray(resistivity_20c, dtype=float) * (
        1.0 + np.asarray(temperature_coefficient, dtype=float)
        * (np.asarray(temperature_c, dtype=float) - REFERENCE_TEMPERATURE_C))


@dataclass(frozen=True, eq=False)
class CoaxThermalInputs:
    """A population of coax designs as the thermal model sees it; array_like fields.

    Units as in :func:`cablefam.physics.thermal.coax_thermal_state`, whose parameters these
    are. After :func:`checked_flat_inputs` every field is a 1-D float array of one length.
    """

    a: np.ndarray
    """Centre-conductor radius [m] (overall radius when stranded)."""
    b: np.ndarray
    """Dielectric outer radius [m]."""
    c: np.ndarray
    """Shield outer radius [m]."""
    d: np.ndarray
    """Jacket outer radius [m]; ``d == c``: no jacket."""
    frequency: np.ndarray
    """Frequency [Hz]."""
    ambient_c: np.ndarray
    """Ambient air temperature [degC]."""
    inner_resistivity_20c: np.ndarray
    """Centre-conductor resistivity at 20 degC [ohm m]."""
    inner_temperature_coefficient: np.ndarray
    """Its temperature coefficient at 20 degC [K^-1]."""
    shield_resistivity_20c: np.ndarray
    """Shield resistivity at 20 degC [ohm m]."""
    shield_temperature_coefficient: np.ndarray
    """Its temperature coefficient at 20 degC [K^-1]."""
    relative_permittivity: np.ndarray
    """Relative permittivity of the dielectric [-]."""
    loss_tangent: np.ndarray
    """Loss tangent of the dielectric [-]."""
    dielectric_thermal_resistivity: np.ndarray
    """Thermal resistivity of the dielectric [K m W^-1]."""
    jacket_thermal_resistivity: np.ndarray
    """Thermal resistivity of the jacket [K m W^-1]; any value where ``d == c``."""
    inner_relative_permeability: np.ndarray = 1.0
    """Relative permeability of the centre conductor [-]."""
    shield_relative_permeability: np.ndarray = 1.0
    """Relative permeability of the shield [-]."""
    offset: np.ndarray = 0.0
    """Offset of the centre conductor from the axis [m]."""
    inner_strands: np.ndarray = 1
    """Strand count of the centre conductor (1, 7, 19, 37)."""
    geometry_factor: np.ndarray | None = None
    r""":math:`\Lambda` of the effective centre-conductor radius, ``b`` and ``offset`` [-]
    (:func:`cablefam.physics.eccentricity.geometry_factor`), when the caller has it; None:
    :func:`checked_flat_inputs` computes it."""
    # ratings on the safe side: standing wave, surface emissivity, sun
    vswr: np.ndarray = 1.0
    """Voltage standing-wave ratio on the line, >= 1 [-] (1: matched); the power is the
    delivered (net) power (:mod:`cablefam.physics.standing_wave`)."""
    surface_emissivity: np.ndarray = 0.0
    """Total emissivity of the outer surface (jacket, or the shield where ``d == c``), in
    (0, 1]: natural convection and radiation (:mod:`cablefam.physics.surface_heat`); 0 (the
    default): the IEC 60287-2-1 free-air constants of a black surface."""
    solar_irradiance: np.ndarray = 0.0
    """Intensity of direct solar radiation on the cable :math:`H` [W m^-2], >= 0."""
    solar_absorption: np.ndarray = 0.0
    """Absorption coefficient of the outer surface for solar radiation, in [0, 1] [-]."""
    # clad/plated conductors and roughness: each layer follows its conductor's temperature
    inner_surface: ConductorSurface | None = None
    """Layer and roughness of the centre conductor (None: homogeneous, smooth)."""
    shield_surface: ConductorSurface | None = None
    """Plating and roughness of the shield (None: homogeneous, smooth)."""


#: Fields of :class:`CoaxThermalInputs` that hold a :class:`ConductorSurface` (or None).
SURFACE_FIELDS = ("inner_surface", "shield_surface")
#: Names of the array fields of :class:`CoaxThermalInputs`, in order.
INPUT_FIELDS = tuple(f.name for f in dataclasses.fields(CoaxThermalInputs)
                     if f.name not in SURFACE_FIELDS)
#: Fields that must be > 0.
_POSITIVE = ("frequency", "inner_resistivity_20c", "shield_resistivity_20c",
             "dielectric_thermal_resistivity", "inner_relative_permeability",
             "shield_relative_permeability")


def checked_flat_inputs(inputs: CoaxThermalInputs, *extra):
    """Broadcast the inputs (and ``extra`` arrays) to one shape, flatten and check them.

    Parameters
    ----------
    inputs : CoaxThermalInputs
        Array_like fields.
    *extra : array_like
        Further per-design arrays to broadcast with them (power, temperature limits); they are
        flattened but not checked here.

    Returns
    -------
    shape : tuple
        The broadcast shape (to reshape results with).
    flat : CoaxThermalInputs
        1-D float arrays (copies), ``geometry_factor`` filled in.
    extra_flat : list of numpy.ndarray
        The ``extra`` arrays, 1-D float copies.

    Raises
    ------
    ValueError
        Naming the first input and element that is non-finite or out of range: ``0 < a < b <
        c <= d``, frequency, resistivities, dielectric thermal resistivity and permeabilities
        > 0, ``relative_permittivity >= 1``, ``loss_tangent >= 0``, jacket thermal
        resistivity finite and > 0 where ``d > c``, resistivities positive at ambient,
        ``vswr >= 1``, emissivity and solar absorption in [0, 1], irradiance >= 0.
    """
    lam_given = inputs.geometry_factor is not None
    names = tuple(n for n in INPUT_FIELDS if lam_given or n != "geometry_factor")
    values = [getattr(inputs, name) for name in names] + list(extra)
    arrays = np.broadcast_arrays(*(np.asarray(x, dtype=float) for x in values))
    shape = arrays[0].shape
    flat = [np.array(x, dtype=float).ravel() for x in arrays]
    p = dict(zip(names, flat[:len(names)]))
    for name, x in p.items():
        if name != "jacket_thermal_resistivity":
            _checks.require(np.isfinite(x), name, "finite", x)
    _checks.require(p["a"] > 0.0, "a", "> 0", p["a"])
    _checks.require(p["b"] > p["a"], "b", "> a", p["b"])
    _checks.require(p["c"] > p["b"], "c", "> b", p["c"])
    _checks.require(p["d"] >= p["c"], "d", ">= c", p["d"])
    for name in _POSITIVE:
        _checks.require(p[name] > 0.0, name, "> 0", p[name])
    _checks.require(p["relative_permittivity"] >= 1.0, "relative_permittivity", ">= 1",
                    p["relative_permittivity"])
    _checks.require(p["loss_tangent"] >= 0.0, "loss_tangent", ">= 0", p["loss_tangent"])
    rho_j = p["jacket_thermal_resistivity"]
    _checks.require((p["d"] <= p["c"]) | (np.isfinite(rho_j) & (rho_j > 0.0)),
                    "jacket_thermal_resistivity", "finite and > 0 where there is a jacket (d > c)",
                    rho_j)
    for which in ("inner", "shield"):
        coeff = p[f"{which}_temperature_coefficient"]
        _checks.require(1.0 + coeff * (p["ambient_c"] - REFERENCE_TEMPERATURE_C) > 0.0,
                        f"{which}_temperature_coefficient",
                        "such that the resistivity at ambient_c stays > 0", coeff)
    _checks.require(p["vswr"] >= 1.0, "vswr", ">= 1", p["vswr"])
    _checks.require((p["surface_emissivity"] >= 0.0) & (p["surface_emissivity"] <= 1.0),
                    "surface_emissivity", "in (0, 1], or 0 for the IEC black-surface constants",
                    p["surface_emissivity"])
    _checks.require(p["solar_irradiance"] >= 0.0, "solar_irradiance", ">= 0",
                    p["solar_irradiance"])
    _checks.require((p["solar_absorption"] >= 0.0) & (p["solar_absorption"] <= 1.0),
                    "solar_absorption", "in [0, 1]", p["solar_absorption"])
    if lam_given:
        _checks.require(p["geometry_factor"] > 0.0, "geometry_factor", "> 0",
                        p["geometry_factor"])
    else:
        a_el = p["a"]
        if np.any(p["inner_strands"] != 1):
            a_el = stranded_effective_radius(p["a"], p["inner_strands"])
        p["geometry_factor"] = eccentricity.geometry_factor(a_el, p["b"], p["offset"])
    surfaces = {name: _flat_surface(getattr(inputs, name), shape) for name in SURFACE_FIELDS}
    return shape, CoaxThermalInputs(**p, **surfaces), flat[len(names):]


def _flat_surface(surface, shape):
    """A surface's arrays broadcast to ``shape`` and flattened (copies); None stays None."""
    if surface is None:
        return None
    return ConductorSurface(*(np.array(np.broadcast_to(np.asarray(x, dtype=float), shape),
                                       dtype=float).ravel() for x in surface))


def take(inputs: CoaxThermalInputs, index) -> CoaxThermalInputs:
    """The designs at ``index`` (integer array, boolean mask or slice) of flat inputs."""
    return CoaxThermalInputs(*(getattr(inputs, name)[index] for name in INPUT_FIELDS),
                             **{name: take_surface(getattr(inputs, name), index)
                                for name in SURFACE_FIELDS})
