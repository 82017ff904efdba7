"""Physics of a coaxial cable: pure, vectorized functions in SI units.

Modules, one per physical area:

- :mod:`cablefam.physics.skin` -- skin depth and surface resistance.
- :mod:`cablefam.physics.internal_impedance` -- internal impedance of the round centre conductor and of
  the tubular shield (exact Bessel forms, exponentially scaled, with large-argument series).
- :mod:`cablefam.physics.line` -- R, L, G, C of a coax and its lossless impedance.
- :mod:`cablefam.physics.propagation` -- propagation constant, characteristic impedance,
  attenuation split, velocity: what follows from R, L, G, C.
- :mod:`cablefam.physics.fields` -- B(r), J(r), E(r) in the four regions; peak field and voltage rating.
- :mod:`cablefam.physics.modes` -- TE11 cutoff (exact Bessel cross-product root and the usual estimate).
- :mod:`cablefam.physics.thermal` -- IEC 60287 steady-state temperature rise and power rating
  (re-exports :mod:`~cablefam.physics.thermal_inputs`, :mod:`~cablefam.physics.thermal_resistances`,
  :mod:`~cablefam.physics.thermal_state`, :mod:`~cablefam.physics.thermal_rating`).
- :mod:`cablefam.physics.standing_wave`, :mod:`cablefam.physics.surface_heat`,
  :mod:`cablefam.physics.thermal_surface` -- matched-line heat from Re Z0, standing wave (VSWR),
  a surface of known emissivity in still air, the sun (used by the thermal model).
- :mod:`cablefam.physics.mass` -- mass, cost, outer diameter and DC loop resistance.
- :mod:`cablefam.physics.eccentricity` -- offset centre conductor: arccosh impedance, Wheeler loss
  factors, field crowding.
- :mod:`cablefam.physics.sensitivity` -- analytic derivatives of Z0 and attenuation by each radius
  (the derivatives of the geometry factor itself are in :mod:`~cablefam.physics.eccentricity`).
- :mod:`cablefam.physics.stranding` -- 7/19/37-strand centre conductors: effective radius, resistance.
- :mod:`cablefam.physics.wire_sizes` -- the AWG series (ASTM B258) and snapping to standard sizes.
- :mod:`cablefam.physics.units` -- the unit conversions used at the edges.
- :mod:`cablefam.physics.constants` -- physical constants and references, each defined once.
- :mod:`cablefam.physics.hankel_series` -- large-argument Bessel series of the internal impedances.
- :mod:`cablefam.physics.foam` -- foamed dielectrics by void fraction (Looyenga permittivity and
  loss, density, Maxwell-Eucken heat conduction, a conservative strength).
- :mod:`cablefam.physics.dispersion` -- wideband Debye (Djordjevic-Sarkar) dispersion fitted at one
  frequency.
- :mod:`cablefam.physics.layered_conductor` -- clad wires: exact two-layer internal impedance, DC
  resistance, mass and cost per layer; :mod:`cablefam.physics.conductor_surface` -- a conductor's
  layer and roughness in the line (planar plating ratio of the shield);
  :mod:`cablefam.physics.roughness` -- Hammerstad-Jensen roughness factor.

Every function broadcasts over numpy arrays of any shape, so one call evaluates a whole
population of designs. Nothing here does I/O or keeps state.
"""
