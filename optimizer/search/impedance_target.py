r"""The impedance target by construction: the dielectric radius solved from the other choices.

The feasible designs of a member are a thin sliver of the (a, b) box: ``b/a`` must sit within
a few percent of :math:`\exp(2\pi\sqrt{\varepsilon_r} Z_0/\eta_0)`. Instead of searching b and
discarding most of the box, the search varies the centre-conductor radius and an *impedance
offset* :math:`u \in [-1, 1]` and solves b so that

.. math:: |Z_0(a, b)| = Z_{target} = Z_{nom} + u \, s \, \Delta Z

with :math:`\Delta Z` the member's tolerance and :math:`s` = :data:`OFFSET_SPAN` (a little under
1, so that the residual of the solve and the operating temperature keep the design inside the
band). The lossless line gives b in closed form (the electrical radius of a stranded conductor
in place of a); one Newton step on :math:`\ln b` then corrects for the complex :math:`|Z_0|` of
the lossy line (internal inductance and resistance at low frequency), using
:math:`\partial |Z_0| / \partial \ln b \approx \eta_0/(2\pi\sqrt{\varepsilon_r})`.
The impedance constraint stays as a check.
"""

from __future__ import annotations

import numpy as np

from cablefam.optimizer.model import conductor_layers
from cablefam.optimizer.model.evaluate import Designs
from cablefam.physics import line
from cablefam.physics.constants import FREE_SPACE_IMPEDANCE

#: Share of the tolerance band the impedance offset spans.
OFFSET_SPAN = 0.95
#: Newton corrections for the lossy |Z0| (one brings the residual below 1e-4 of Z0 at 1 kHz).
NEWTON_STEPS = 1


def target_impedance(nominal_ohm, tolerance_ohm, offset):
    """Z_target = nominal + offset x span x tolerance [ohm] (offset in [-1, 1])."""
    return nominal_ohm + np.asarray(offset, dtype=float) * OFFSET_SPAN * tolerance_ohm


def impedance_slope(relative_permittivity):
    """d|Z0|/d ln(b) of the concentric lossless line, eta_0 / (2 pi sqrt(eps_r)) [ohm]."""
    return FREE_SPACE_IMPEDANCE / (2.0 * np.pi * np.sqrt(relative_permittivity))


def dielectric_radius_lossless(electrical_inner_radius, relative_permittivity, z0_ohm):
    """b of a concentric lossless line of impedance ``z0_ohm`` [m]."""
    return electrical_inner_radius * np.exp(z0_ohm / impedance_slope(relative_permittivity))


def solve_dielectric_radius(a, a_el, c_minus_b, frequency, target_ohm, inner, shield,
                            dielectric, inner_strands=1, steps=NEWTON_STEPS):
    """Dielectric radius b [m] whose lossy |Z0| at 20 degC equals ``target_ohm``.

    Parameters
    ----------
    a, a_el : ndarray
        Overall and electrical centre-conductor radius [m].
    c_minus_b : ndarray
        Shield thickness [m].
    frequency : float
        [Hz].
    target_ohm : ndarray
        Wanted |Z0| [ohm].
    inner, shield, dielectric : dict of ndarray
        Material properties (catalog key names).
    """
    eps = dielectric["relative_permittivity"]
    slope = impedance_slope(eps)
    b = dielectric_radius_lossless(a_el, eps, target_ohm)
    for _ in range(steps):
        # clad/plated conductors and roughness: their layers as the evaluation sees them
        d = Designs(a, b, c_minus_b, 0.0, inner, shield, dielectric, None,
                    inner_strands=inner_strands)
        lp = line.line_parameters(a, b, b + c_minus_b, frequency, inner["resistivity_ohm_m"],
                                  shield["resistivity_ohm_m"], eps, dielectric["loss_tangent"],
                                  inner.get("relative_permeability", 1.0),
                                  shield.get("relative_permeability", 1.0),
                                  inner_strands=inner_strands,
                                  inner_surface=conductor_layers.inner_surface(d),
                                  shield_surface=conductor_layers.shield_surface(d))
        z0 = np.abs(line.characteristic_impedance(lp.r, lp.l, lp.g, lp.c, frequency))
        b = b * np.exp((target_ohm - z0) / slope)
    return b
