"""Physics of a coaxial cable: pure, vectorized functions in SI units.

Modules, one per physical area:

- :mod:`physics.skin` -- skin depth and surface resistance.
- :mod:`physics.internal_impedance` -- internal impedance of the round centre conductor and of
  the tubular shield (exact Bessel forms, exponentially scaled, with large-argument series).
- :mod:`physics.line` -- R, L, G, C, characteristic impedance, propagation constant, attenuation.
- :mod:`physics.fields` -- B(r), J(r), E(r) in the four regions; peak field and voltage rating.
- :mod:`physics.modes` -- TE11 cutoff (exact Bessel cross-product root and the usual estimate).
- :mod:`physics.thermal` -- IEC 60287 steady-state temperature rise and power rating.
- :mod:`physics.mass` -- mass, cost, outer diameter and DC loop resistance.
- :mod:`physics.eccentricity` -- offset centre conductor: arccosh impedance, Wheeler loss
  factors, field crowding.
- :mod:`physics.sensitivity` -- analytic derivatives of Z0 and attenuation by each radius.
- :mod:`physics.stranding` -- 7/19/37-strand centre conductors: effective radius, resistance.
- :mod:`physics.wire_sizes` -- the AWG series (ASTM B258) and snapping to standard sizes.
- :mod:`physics.units` -- the unit conversions used at the edges.

Every function broadcasts over numpy arrays of any shape, so one call evaluates a whole
population of designs. Nothing here does I/O or keeps state.
"""
