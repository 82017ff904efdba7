r"""Physical constants and fixed references of :mod:`cablefam.physics`, each defined once.

The SI constants come from :mod:`scipy.constants` (CODATA values); the modules of
:mod:`cablefam.physics` import them from here, together with the few derived constants and
references they share, so that none of them is written twice.

References
----------
.. [1] CODATA recommended values of the fundamental physical constants, as shipped in
   :mod:`scipy.constants`.
.. [2] IEC 60287-1-1:2006+AMD1:2014, clause 2.1.1 and Table 1 (resistivities and temperature
   coefficients stated at 20 degC).
"""

from __future__ import annotations

from scipy.constants import epsilon_0, mu_0, speed_of_light

__all__ = ["FREE_SPACE_IMPEDANCE", "REFERENCE_TEMPERATURE_C", "SQRT_ARGUMENT_FLOOR", "epsilon_0",
           "mu_0", "speed_of_light"]

#: Impedance of free space :math:`\eta_0 = \mu_0 c_0` [ohm] (about 376.73 ohm), [1]_.
FREE_SPACE_IMPEDANCE = mu_0 * speed_of_light

#: Temperature at which conductor resistivities and their temperature coefficients are stated
#: [degC]: the catalogs' ``resistivity_ohm_m`` and ``temperature_coefficient_per_k`` are
#: :math:`\rho_{20}` and :math:`\alpha_{20}` of [2]_.
REFERENCE_TEMPERATURE_C = 20.0

#: Floor put under the argument of a square root that vanishes only at a removable
#: singularity (a concentric line, offset :math:`D = 0`), where the caller then selects the
#: limit with ``numpy.where``: it keeps the discarded branch finite (no division warnings).
SQRT_ARGUMENT_FLOOR = 1e-300
