r"""Stranded centre conductors: concentric lay-ups of 1, 7, 19 and 37 equal round strands.

A concentric lay-up has a centre strand and :math:`k` layers around it, layer :math:`j` holding
:math:`6j` strands whose centres lie at radius :math:`j\,d` (strand diameter :math:`d`; each
layer rests on the circle circumscribing the one below). Hence

.. math::
    n = 1 + 3k(k + 1) = 1, 7, 19, 37, \qquad D = (2k + 1)\,d = d, 3d, 5d, 7d, \qquad
    \frac{n d^2}{D^2} = 1, \tfrac{7}{9}, \tfrac{19}{25}, \tfrac{37}{49}

for the overall diameter :math:`D` and the metal fill of the circumscribed circle. Solid
(``n_strands = 1``) gives every factor exactly 1 and stays the default everywhere.

What this module gives for a stranded centre conductor of overall radius :math:`a_o = D/2`:

*Effective radius* (for :math:`C`, :math:`L_e` and :math:`Z_0`): the radius of the solid round
conductor with the same capacitance to a surrounding shield. For a shield far from the strands
compared with the strand size this is the logarithmic capacity (outer conformal radius) of the
cross-section [1]_: :math:`\Lambda = \ln(b/a_\mathrm{eff})`, to within terms of order
:math:`(a_o/b)^{2N}`, :math:`N = 6k` the symmetry of the outer layer (computed with the shield
included, the error in :math:`\Lambda` for 7 strands is 2e-8 at :math:`b/a_o = 3.2`, 1e-6 at
2.3 and 1.6e-4 at 1.5; far less for more strands). The values, :data:`EFFECTIVE_RADIUS_FACTORS`,
were computed for this module by solving the exterior 2-D potential problem of the outer
contour (multipole expansions about every outer-layer strand, least squares on the contour,
converged to 10 digits; the slits of 3.5 % and 4.2 % of a strand diameter between the strands
of the 12- and 18-strand layers are closed at their narrowest point, which changed nothing at
that precision) and are recomputed independently in
``tests/physics/test_stranding.py``. The 7-strand value 0.9388 agrees with the ~0.94 that is
commonly quoted for it (from memory). The values assume the dielectric fills the grooves between
the outer strands (one permittivity everywhere outside the metal). Air left in the grooves is not
modelled: the grooves (inside the circumscribed circle) hold about 4.2 %, 2.2 % and 1.5 % of the
electric energy of a 7-, 19- and 37-strand line with :math:`b/a_o = 3.3` (estimated for this
module from the same field solution), so air there would raise :math:`Z_0` by up to about
:math:`(1 - 1/\varepsilon_r)` times that share, some 1 ohm for a 50 ohm PE cable. :math:`L_e`
and the skin-effect factor below do not depend on it (the magnetic field does not see the
dielectric).

*DC resistance*: the metal area is :math:`n\pi d^2/4`, and each strand of layer :math:`j` is a
helix of radius :math:`j d` and lay length :math:`L_j = m\,(2j + 1)\,d` (lay ratio :math:`m`,
lay length over the diameter over that layer), longer than the cable by
:math:`f_j = \sqrt{1 + (2\pi j d/L_j)^2}`. With the strands in parallel

.. math::
    \frac{R_\mathrm{dc}}{R_\mathrm{dc,solid}(D)} = \frac{D^2}{n d^2}\,
        \frac{n}{1 + \sum_j 6j/f_j}

(geometry only; the take-up factor is 1.013 for 7 strands at :math:`m = 12`).

*Skin-effect resistance* (skin depth small against the strand radius): the current flows on the
exposed surface of the outer layer, with the surface density of the exterior field of the same
2-D problem. Its resistance relative to a solid wire of the same overall diameter is

.. math::
    F = \frac{a_o}{2\pi}\oint |\nabla u|^2\,dl \times f_k, \qquad u \sim \ln|z|

(Wheeler's incremental-inductance rule [2]_ in its surface-integral form; 1 for a circle), times
the path-length factor :math:`f_k` of the outer layer, whose strands the current follows (it
cannot cross between strands at the bottom of the grooves, where the field vanishes). The 2-D
values, :data:`SKIN_EFFECT_FACTORS_STRAIGHT`, come from the same computation. This is an
idealized figure (smooth, round, straight-in-section strands, ideal contact), so a *lower*
estimate: measured radio-frequency resistances of stranded conductors are usually higher
(surface condition, plating, strand deformation, contact between strands), by amounts that are
empirical and not given here. Between the DC and the skin-effect regime (skin depth comparable
with the strand radius) neither factor applies; proximity effect between strands is not modelled.

*Crown field*: the field on the surface of the outer strands is largest at their crowns,
:data:`CROWN_FIELD_FACTORS` times the field of the smooth conductor of the effective radius
(same 2-D solution; :func:`stranded_crown_field_factor`).

References
----------
.. [1] T. Ransford, *Potential Theory in the Complex Plane*, London Mathematical Society
   Student Texts 28, Cambridge University Press, 1995, Ch. 5 (logarithmic capacity, Robin
   constant).
.. [2] H. A. Wheeler, "Formulas for the skin effect", *Proc. IRE* 30 (1942) 412-424.
"""

from __future__ import annotations

from typing import NamedTuple

import numpy as np

from cablefam.physics.internal_impedance import wire_dc_resistance

#: Strand counts of the supported concentric lay-ups, index = number of layers k.
LAYUPS = (1, 7, 19, 37)

#: Radius of the equivalent solid conductor (same capacitance) over the overall radius, for
#: ``LAYUPS``; computed for this module (2-D exterior potential problem, see the module notes),
#: recomputed in tests/physics/test_stranding.py.
EFFECTIVE_RADIUS_FACTORS = (1.0, 0.9387505988, 0.9687517902, 0.9790404747)

#: Skin-effect resistance over that of a solid wire of the same overall diameter, straight
#: strands (2-D), for ``LAYUPS``; same computation.
SKIN_EFFECT_FACTORS_STRAIGHT = (1.0, 1.1373871019, 1.1145168785, 1.1068866073)

#: Lay length over the diameter over the layer, used when none is given. Common practice, no
#: source: concentric-lay conductors are usually laid at 8 to 16 times the layer diameter; 12 is
#: taken as typical. Pass ``numpy.inf`` for straight strands.
DEFAULT_LAY_RATIO = 12.0


class StrandLayup(NamedTuple):
    """Factors of a concentric lay-up; arrays of a common shape."""

    n_strands: np.ndarray
    """Number of strands n [-] (int)."""
    layers: np.ndarray
    """Number of layers k around the centre strand [-] (int)."""
    diameter_ratio: np.ndarray
    """Overall diameter over strand diameter, D/d = 2k + 1 [-]."""
    area_ratio: np.ndarray
    """Metal area over the area of the circumscribed circle, n d^2 / D^2 [-]."""
    effective_radius_factor: np.ndarray
    """Equivalent solid radius for C, L_e and Z0 over the overall radius [-]."""
    dc_resistance_factor: np.ndarray
    """DC resistance over that of a solid wire of the overall diameter [-]."""
    skin_effect_factor: np.ndarray
    """Skin-effect resistance over that of a solid wire of the overall diameter [-]."""


def _layers(n_strands):
    """Number of layers k for each strand count; ValueError naming an unsupported count."""
    n = np.asarray(n_strands)
    if n.dtype.kind not in "iuf" or n.dtype == bool:
        raise ValueError(f"n_strands must be a number of strands, one of {LAYUPS}, "
                         f"got {n_strands!r}")
    table = np.asarray(LAYUPS, dtype=float)
    nf = n.astype(float)
    k = np.clip(np.searchsorted(table, nf), 0, len(LAYUPS) - 1)
    bad = table[k] != nf  # also NaN
    if bad.any():
        raise ValueError(f"n_strands = {nf[bad].ravel()[0]:g} is not a supported concentric "
                         f"lay-up; use one of {LAYUPS} (1 = solid, 7 = 1+6, 19 = 1+6+12, "
                         f"37 = 1+6+12+18)")
    return k


def _layer_take_up(j, lay_ratio):
    """Length of a strand of layer j per unit cable length, sqrt(1 + (2 pi j / (m (2j+1)))^2)."""
    m = np.asarray(lay_ratio, dtype=float)
    if np.any(~(m > 0.0)):
        raise ValueError(f"lay_ratio must be > 0 (numpy.inf for straight strands), got "
                         f"{float(np.ravel(m)[~(np.ravel(m) > 0.0)][0]):g}")
    tan_lay = 2.0 * np.pi * j / (m * (2.0 * j + 1.0))
    return np.sqrt(1.0 + tan_lay * tan_lay)


def lay_take_up_factor(n_strands, lay_ratio=DEFAULT_LAY_RATIO):
    r"""DC resistance increase of a lay-up from the helical strand paths [-].

    Parameters
    ----------
    n_strands : array_like of int
        Strand count, one of :data:`LAYUPS`.
    lay_ratio : array_like, optional
        Lay length over the diameter over the layer, :math:`m` [-], the same for every layer;
        ``numpy.inf`` for straight strands.

    Returns
    -------
    numpy.ndarray
        :math:`n/(1 + \sum_{j=1}^{k} 6j/f_j)`, :math:`f_j = \sqrt{1 + (2\pi j/(m(2j+1)))^2}`
        (strands in parallel; 1 for a solid wire). Geometry of a helix; see the module notes.
    """
    k = _layers(n_strands)
    k, m = np.broadcast_arrays(k, np.asarray(lay_ratio, dtype=float))
    conductance = np.ones(k.shape)  # centre strand, straight
    for j in range(1, len(LAYUPS)):  # over the few layers, not over designs
        conductance = conductance + np.where(k >= j, 6.0 * j / _layer_take_up(j, m), 0.0)
    n = 1.0 + 3.0 * k * (k + 1.0)
    return n / conductance


def strand_layup(n_strands, lay_ratio=DEFAULT_LAY_RATIO):
    r"""Geometry and resistance factors of a concentric lay-up of equal round strands.

    Parameters
    ----------
    n_strands : array_like of int
        Strand count, one of :data:`LAYUPS` = (1, 7, 19, 37).
    lay_ratio : array_like, optional
        Lay length over the diameter over the layer [-] (:data:`DEFAULT_LAY_RATIO`);
        ``numpy.inf`` for straight strands.

    Returns
    -------
    StrandLayup
        ``diameter_ratio`` :math:`2k+1`, ``area_ratio`` :math:`n/(2k+1)^2`,
        ``effective_radius_factor``, ``dc_resistance_factor``, ``skin_effect_factor`` (all
        [-]; exactly 1 for ``n_strands = 1``).

    Raises
    ------
    ValueError
        For a strand count not in :data:`LAYUPS` (the message names it) or ``lay_ratio <= 0``.

    Notes
    -----
    .. math::
        n = 1 + 3k(k+1), \quad \frac{D}{d} = 2k + 1, \quad
        \frac{R_\mathrm{dc}}{R_\mathrm{dc,solid}} = \frac{(2k+1)^2}{n}\,t(m), \quad
        F_\mathrm{skin} = F_\mathrm{2D}(k)\,f_k(m)

    with the take-up :math:`t` of :func:`lay_take_up_factor`, the outer-layer path factor
    :math:`f_k` and the computed :math:`F_\mathrm{2D}` of the module notes. The effective
    radius is the logarithmic capacity of the cross-section ([1]_ in the module notes),
    computed for this module; the skin-effect factor is an idealized lower estimate.
    """
    k = _layers(n_strands)
    k, m = np.broadcast_arrays(k, np.asarray(lay_ratio, dtype=float))
    n = 1 + 3 * k * (k + 1)
    ratio = 2.0 * k + 1.0
    area = n / (ratio * ratio)
    outer = np.where(k > 0, _layer_take_up(k, m), 1.0)
    return StrandLayup(
        n_strands=n,
        layers=k,
        diameter_ratio=ratio,
        area_ratio=area,
        effective_radius_factor=np.asarray(EFFECTIVE_RADIUS_FACTORS)[k],
        dc_resistance_factor=lay_take_up_factor(n_strands, m) / area,
        skin_effect_factor=np.asarray(SKIN_EFFECT_FACTORS_STRAIGHT)[k] * outer,
    )


def stranded_metal_fraction(n_strands, lay_ratio=DEFAULT_LAY_RATIO):
    r"""Metal per unit length of a stranded centre conductor over that of a solid one [-].

    Parameters
    ----------
    n_strands : array_like of int
        Strand count, one of :data:`LAYUPS`.
    lay_ratio : array_like, optional
        Lay length over the diameter over the layer [-].

    Returns
    -------
    numpy.ndarray
        :math:`\frac{n d^2}{D^2}\,t(m)`: the metal fill of the circumscribed circle
        (``strand_layup(...).area_ratio``) times the take-up :math:`t` of
        :func:`lay_take_up_factor` (helical strands are longer than the cable; to first
        order in the lay angle the same factor for the mass as for the resistance). 1 for a
        solid wire. Multiply the mass (or density) of a solid conductor of the overall radius
        by it; the voids between the strands count as empty.
    """
    return strand_layup(n_strands, lay_ratio).area_ratio * lay_take_up_factor(n_strands,
                                                                              lay_ratio)


def stranded_effective_radius(overall_radius, n_strands):
    r"""Radius of the solid conductor with the capacitance of a stranded one [m].

    Parameters
    ----------
    overall_radius : array_like
        Radius of the circle circumscribing the strands, :math:`a_o = D/2` [m].
    n_strands : array_like of int
        Strand count, one of :data:`LAYUPS`.

    Returns
    -------
    numpy.ndarray
        :math:`a_\mathrm{eff} = \kappa_k a_o` [m], :math:`\kappa_k` =
        :data:`EFFECTIVE_RADIUS_FACTORS`; use it for ``a`` in
        :func:`cablefam.physics.line.capacitance`, :func:`cablefam.physics.line.inductance_external` and
        :func:`cablefam.physics.line.characteristic_impedance_lossless`. The overall radius stays the
        one for the dielectric's inner surface, mass and fit.

    Raises
    ------
    ValueError
        For a strand count not in :data:`LAYUPS`.
    """
    k = _layers(n_strands)
    return np.asarray(overall_radius, dtype=float) * np.asarray(EFFECTIVE_RADIUS_FACTORS)[k]


def stranded_dc_resistance(overall_radius, n_strands, resistivity, lay_ratio=DEFAULT_LAY_RATIO):
    r"""DC resistance per unit length of a stranded centre conductor [ohm m^-1].

    Parameters
    ----------
    overall_radius : array_like
        Overall radius :math:`a_o = D/2` [m].
    n_strands : array_like of int
        Strand count, one of :data:`LAYUPS`.
    resistivity : array_like
        Resistivity of the strand metal [ohm m].
    lay_ratio : array_like, optional
        Lay length over the diameter over the layer [-].

    Returns
    -------
    numpy.ndarray
        .. math::
            R_\mathrm{dc} = \frac{\rho}{n\pi (d/2)^2}\,t(m), \qquad d = \frac{2a_o}{2k+1}

        [ohm m^-1], i.e. :math:`\rho/(\pi a_o^2)` times ``strand_layup(...).dc_resistance_factor``.

    Raises
    ------
    ValueError
        For a strand count not in :data:`LAYUPS` or ``lay_ratio <= 0``.
    """
    factor = strand_layup(n_strands, lay_ratio).dc_resistance_factor
    return wire_dc_resistance(overall_radius, resistivity) * factor


def stranded_skin_effect_factor(n_strands, lay_ratio=DEFAULT_LAY_RATIO):
    r"""Skin-effect resistance multiplier of a stranded centre conductor [-].

    Parameters
    ----------
    n_strands : array_like of int
        Strand count, one of :data:`LAYUPS`.
    lay_ratio : array_like, optional
        Lay length over the diameter over the layer [-].

    Returns
    -------
    numpy.ndarray
        :math:`F = F_\mathrm{2D}(k) f_k(m)` [-]: multiply the skin-effect resistance of a
        solid wire of the same *overall* radius, :math:`R_s/(2\pi a_o)`, by it. 1 for a solid
        wire; 1.15 for 7 strands at :math:`m = 12`. Valid where the skin depth is small against
        the strand radius; an idealized lower estimate (module notes).

    Raises
    ------
    ValueError
        For a strand count not in :data:`LAYUPS` or ``lay_ratio <= 0``.
    """
    return strand_layup(n_strands, lay_ratio).skin_effect_factor


#: Peak field at the crowns of the outer strands over the field of the smooth conductor of the
#: effective radius (same charge), for ``LAYUPS``: :math:`a_\mathrm{eff}\max|\nabla u|` on the
#: contour of the 2-D exterior problem of the module notes (u ~ ln|z|), largest at the crown
#: (the outermost point) of each outer strand. Computed for this module with the multipole
#: solver of the module notes (40 multipoles and 400 contour points per period: the values
#: change by < 1e-8 from 20 to 80 multipoles); recomputed in
#: tests/physics/test_stranding_crown_field.py by that solver and, independently, by a
#: charge-simulation solution of every strand with a mesh study.
CROWN_FIELD_FACTORS = (1.0, 1.3218790, 1.3655477, 1.3803162)


def stranded_crown_field_factor(n_strands):
    r"""Field enhancement at the strand crowns of a stranded centre conductor [-].

    Parameters
    ----------
    n_strands : array_like of int
        Strand count, one of :data:`LAYUPS`.

    Returns
    -------
    numpy.ndarray
        :math:`E_\mathrm{crown}/E_\mathrm{smooth}` (:data:`CROWN_FIELD_FACTORS`): 1 for a solid
        wire, 1.32 for 7, 1.37 for 19 and 1.38 for 37 strands. Multiply the peak field of the
        smooth conductor of :func:`stranded_effective_radius`, :math:`V/(a_\mathrm{eff}\Lambda)`,
        by it. A 2-D value (smooth round strands, the grooves filled with the dielectric, the
        shield far compared with a strand: its influence is of order :math:`(a_o/b)^{2N}` as for
        the effective radius); the lay angle, which stretches the crowns along the helix, is
        not included (it lowers the crown curvature slightly: the factor errs on the safe side).

    Raises
    ------
    ValueError
        For a strand count not in :data:`LAYUPS`.
    """
    return np.asarray(CROWN_FIELD_FACTORS)[_layers(n_strands)]
