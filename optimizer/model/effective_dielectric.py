"""The dielectric as the line sees it: a foamed and dispersive record resolved per design.

A dielectric table (:attr:`cablefam.optimizer.model.evaluate.Designs.dielectric`) may carry

- ``void_fraction`` (0 <= v < 1): the other values are then the solid polymer's and the foam's
  follow from :mod:`cablefam.physics.foam` (Looyenga permittivity and loss, density,
  Maxwell-Eucken thermal resistivity, the conservative dielectric strength);
- ``reference_frequency_hz`` (> 0; 0 in an array means "none" for that design): the frequency
  at which the permittivity and loss tangent hold; at any other frequency the wideband Debye
  model of :mod:`cablefam.physics.dispersion` gives them.

Both are per-design arrays or scalars, like every other material property. Dispersion is
applied to the solid first (the record's values are the solid's at the reference frequency),
then the foam rule (the gas in the cells does not disperse). Designs with neither key get
their table back unchanged (the same object), so today's numbers stay bit for bit.
"""

from __future__ import annotations

import dataclasses

import numpy as np

from cablefam.physics import dispersion, foam

#: Dielectric keys this module reads (besides the ordinary material keys).
FOAM_KEY = "void_fraction"
REFERENCE_FREQUENCY_KEY = "reference_frequency_hz"


def resolve_table(dielectric: dict, frequency_hz) -> dict:
    """The dielectric table with the effective values at ``frequency_hz`` [Hz].

    The returned table no longer has ``void_fraction`` or ``reference_frequency_hz`` (so that
    resolving twice changes nothing); ``relative_permittivity``, ``loss_tangent`` and, where
    present, ``density_kg_per_m3``, ``thermal_resistivity_k_m_per_w`` and
    ``dielectric_strength_v_per_m`` are the effective ones.
    """
    if FOAM_KEY not in dielectric and REFERENCE_FREQUENCY_KEY not in dielectric:
        return dielectric
    table = {k: v for k, v in dielectric.items()
             if k not in (FOAM_KEY, REFERENCE_FREQUENCY_KEY)}
    eps = dielectric["relative_permittivity"]
    tan = dielectric["loss_tangent"]
    f_ref = dielectric.get(REFERENCE_FREQUENCY_KEY)
    if f_ref is not None:
        f_ref = np.asarray(f_ref, dtype=float)
        given = f_ref > 0.0
        if np.any(given):
            f = np.asarray(frequency_hz, dtype=float)
            e_f, t_f = dispersion.dispersive_permittivity_loss_tangent(
                f, eps, tan, np.where(given, f_ref, f))
            eps, tan = np.where(given, e_f, eps), np.where(given, t_f, tan)
    v = dielectric.get(FOAM_KEY)
    if v is not None and np.any(np.asarray(v) != 0.0):
        eps_solid = eps
        eps, tan = foam.foam_permittivity_loss_tangent(eps_solid, tan, v)
        if "density_kg_per_m3" in table:
            table["density_kg_per_m3"] = foam.foam_density(table["density_kg_per_m3"], v)
        if "thermal_resistivity_k_m_per_w" in table:
            table["thermal_resistivity_k_m_per_w"] = foam.foam_thermal_resistivity(
                table["thermal_resistivity_k_m_per_w"], v)
        if "dielectric_strength_v_per_m" in table:
            table["dielectric_strength_v_per_m"] = foam.foam_dielectric_strength(
                table["dielectric_strength_v_per_m"], v, eps_solid)
    table["relative_permittivity"] = eps
    table["loss_tangent"] = tan
    return table


def resolve(designs, frequency_hz):
    """``designs`` with the effective dielectric at ``frequency_hz``, and the outputs
    ``void_fraction`` and ``effective_relative_permittivity`` (arrays of the designs' shape)."""
    shape = np.shape(designs.inner_radius)
    raw = designs.dielectric
    table = resolve_table(raw, frequency_hz)
    out = {
        "void_fraction": np.broadcast_to(raw.get(FOAM_KEY, 0.0), shape).astype(float),
        "effective_relative_permittivity": np.broadcast_to(
            table["relative_permittivity"], shape).astype(float),
    }
    if table is raw:
        return designs, out
    return dataclasses.replace(designs, dielectric=table), out
