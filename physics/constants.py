"""Physical constants and reference values used in more than one physics module (SI units)."""

from scipy.constants import mu_0, speed_of_light

#: Impedance of free space, eta_0 = mu_0 c_0 [ohm].
FREE_SPACE_IMPEDANCE_OHM = mu_0 * speed_of_light
