r"""Surface roughness of a conductor: the factor by which it raises the surface resistance.

The model is Hammerstad and Jensen's [1]_ (1980), chosen over Groiss et al. (1996) because it
is stated with the rms roughness (the quantity a conductor record gives as
``surface_roughness_m``), it is the one most widely tabulated and used for cables and
printed lines alike, and it is a closed form with no fitted constant other than its own.
Both saturate at a factor of 2 for a very rough surface; Groiss's rises more slowly at first.

What the factor does to the internal reactance is not part of the published model (it was
fitted to measured loss): the reactance is left as it is, so a rough conductor's internal
inductance is that of the smooth one. A causal roughness model would raise the internal
reactance about as much as the resistance; this is small against the external inductance of a
coax (a fraction of a percent of :math:`\omega L` at radio frequencies) and not modelled.
"""

from __future__ import annotations

import numpy as np

#: The constant 1.4 of the Hammerstad-Jensen roughness factor (:func:`roughness_factor`).
HAMMERSTAD_JENSEN_CONSTANT = 1.4


def roughness_factor(roughness_rms, skin_depth):
    r"""Hammerstad-Jensen factor by which surface roughness multiplies the surface resistance.

    Parameters
    ----------
    roughness_rms : array_like
        RMS surface roughness :math:`\Delta` [m], >= 0 (0: smooth, factor 1 exactly).
    skin_depth : array_like
        Skin depth :math:`\delta` of the metal at the surface [m], > 0.

    Returns
    -------
    numpy.ndarray
        :math:`K_r` [-], from 1 (smooth, or :math:`\Delta \ll \delta`) to 2 (very rough).

    Notes
    -----
    .. math:: K_r = 1 + \frac{2}{\pi}\arctan\left(1.4\left(\frac{\Delta}{\delta}\right)^2\right)

    ([1]_). It multiplies the resistance only (module notes).

    References
    ----------
    .. [1] E. Hammerstad, O. Jensen, "Accurate models for microstrip computer-aided design",
       IEEE MTT-S International Microwave Symposium Digest, 1980, pp. 407-409.
    .. [2] S. Groiss, I. Bardi, O. Biro, K. Preis, K. R. Richter, "Parameters of lossy cavity
       resonators calculated by the finite element method", IEEE Trans. Magn. 32(3) (1996)
       894-897 (the alternative model, not used here).
    """
    ratio = np.asarray(roughness_rms, dtype=float) / np.asarray(skin_depth, dtype=float)
    return 1.0 + (2.0 / np.pi) * np.arctan(HAMMERSTAD_JENSEN_CONSTANT * ratio * ratio)
