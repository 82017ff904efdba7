"""``cablefam init FILE``: a commented starter sweep file that runs as written.

Two family members (a 50 ohm link and a 75 ohm video line), the three bundled catalogs
(referred to by their path relative to the new file), bounds that give feasible designs for
both, and a budget that runs in seconds (raise it for real runs). Every key is explained in a comment; units are
in the key names. The file is refused when it exists, unless ``overwrite``.
"""

from __future__ import annotations

import os
from importlib import resources
from pathlib import Path

from cablefam.optimizer.atomic import write_text_atomic
from cablefam.optimizer.errors import InputError

#: The bundled catalogs the starter file names, in order.
STARTER_CATALOGS = ("baseline", "lightweight", "high-temperature")

_TEMPLATE = '''\
# cablefam sweep file: one batch search per family member x material catalog.
# Written by `cablefam init`; edit it, then run:  cablefam sweep {file_name}
# Units are in the key names (_m metres, _hz hertz, _w watts, _v volts, _c degrees Celsius,
# _ohm ohms). Keys marked "optional" may be deleted. The full reference is in the README
# ("File formats").

name = "my-cable-family"   # names the run folder: runs/my-cable-family/ (letters, digits, . _ -)
seed = 1                   # random seed: the same file and seed give the same front, byte for byte
description = "Starter family: a 50 ohm link and a 75 ohm video line"   # optional, free text

# Material catalogs (TOML), relative to this file. Each catalog is searched on its own, so the
# report can say which catalog wins where. These are the catalogs bundled with cablefam; copy
# one next to this file to change materials or prices (`cablefam catalog check FILE`).
catalogs = [
{catalog_lines}
]

[search]
# What to minimise: "attenuation" (dB/100 m), "mass" (kg/km), "outer_diameter" (m), "cost"
# (per km), "dc_loop_resistance" (ohm/km); maximised: "max_power" (W), "max_peak_voltage" (V),
# "impedance_yield" (needs [tolerance]). Two or three objectives give fronts that are easy to read.
objectives = ["attenuation", "mass"]
evaluations_per_task = 100000  # optional: designs evaluated per member x catalog (all stages);
                               # must exceed population x generations + 64. More = finer front.
population = 64                # genetic stage: population size ...
generations = 20               # ... times generations (overnight runs: 100-200 generations)
# Bounds [low, high] of the decision variables, metres (equal bounds fix a variable). The
# dielectric radius is solved from the impedance target, inside these bounds.
inner_radius_m = [0.2e-3, 3.0e-3]        # centre-conductor radius a
dielectric_radius_m = [0.6e-3, 10e-3]    # dielectric outer radius b (= shield inner radius)
shield_thickness_m = [0.1e-3, 0.8e-3]    # solid shield wall
jacket_thickness_m = [0.5e-3, 1.5e-3]    # jacket; [0, 0] leaves the jacket out
# inner_strands = 7                      # optional: 1 (solid, default), 7, 19 or 37 strands
# inner_diameter_series = "metric"       # optional: snap the centre conductor to standard
#                                        # wire sizes: "metric", "metric-fine" or "awg"
# void_fraction = [0.0, 0.7]              # optional: foam the dielectrics marked foamable
#                                        # (void share 0 <= v < 1, a continuous variable)
# Optional outer conductors as built (default: every shield a solid tube). With any braid or
# foil construction, give the bounds of its variables (integers for carriers and ends), and
# raise evaluations_per_task to about 100000 per free variable (README, "Budget for richer
# search spaces"):
# shield_constructions = ["tube", "braid", "foil-braid"]
# braid_wire_diameter_m = [0.1e-3, 0.2e-3]   # diameter of one braid wire
# braid_angle_deg = [20, 40]                 # angle between a braid wire and the cable axis
# braid_carriers = [16, 24]                  # carriers (groups of wires) of the braid
# braid_ends = [5, 10]                       # wires per carrier
# foil_thickness_m = [20e-6, 50e-6]          # foil of the foil kinds
# Optional subsets of catalog ids per material slot (default: every id of the catalogs):
# conductors = ["copper", "aluminium"]
# shields = ["copper"]
# dielectrics = ["solid-pe", "foam-pe-50"]
# jackets = ["pe"]

# [search.resolution]     # optional: the front keeps one design per resolution box, in the
# attenuation = 0.01      # objective's unit (defaults: 0.01 dB/100 m, 0.1 kg/km, 0.01 mm, ...);
# mass = 0.1              # picks always differ by more than one step

# [tolerance]             # optional: manufacturing spread, for the impedance yield
# samples = 1000                    # Monte Carlo draws (the same for every task and seed)
# inner_radius_sd_m = 4e-6          # standard deviations (or *_band_m: +/- band, uniform)
# dielectric_radius_sd_m = 15e-6
# eccentricity_sd_m = 20e-6         # centre conductor off the axis, per axis
# relative_permittivity_sd = 0.01   # relative to the permittivity

# One [[member]] table per cable of the family.
[[member]]
name = "link-50"                 # member name (letters, digits, . _ -)
impedance_ohm = 50               # nominal characteristic impedance |Z0|
impedance_tolerance_ohm = 1.5    # +/- band every design must meet
frequency_hz = 2.45e9            # highest operating frequency: loss and single mode are checked here
power_w = 20                     # optional: CW power in a matched line; enables the temperature limits
peak_voltage_v = 300             # optional: enables the peak-field limit
ambient_c = 40                   # ambient temperature (default 20)
max_outer_diameter_m = 10e-3     # optional: largest outer diameter
field_safety_factor = 3.0        # dielectric strength / peak field must be >= this (default 1)
single_mode_margin = 1.5         # TE11 cutoff >= margin x frequency_hz (0 disables; default 1)
min_shield_skin_depths = 2.0     # shield wall >= this many skin depths (0 disables; default 2)
# min_impedance_yield = 0.997    # optional: share of made cables within tolerance; needs [tolerance]
# vswr = 1.5                     # optional: standing-wave ratio of the load (default 1);
#                                #   power_w is then the delivered power
# solar_irradiance_w_per_m2 = 1000   # optional: direct sun on the cable (default 0: shaded)
# min_velocity_factor = 0.8      # optional: velocity factor >= this
# max_capacitance_f_per_m = 100e-12  # optional: capacitance per metre <= this
# screening_band_hz = [1e6, 1e9] # optional: band of the screening limits (default: frequency_hz)
# max_transfer_impedance_ohm_per_m = 0.05  # optional: |Z_T| <= this over the screening band
# min_braid_optical_coverage = 0.85        # optional: braid optical coverage >= this

[[member]]
name = "video-75"
impedance_ohm = 75
impedance_tolerance_ohm = 3.0
frequency_hz = 1.0e9
power_w = 2
peak_voltage_v = 60
ambient_c = 30
max_outer_diameter_m = 8e-3
single_mode_margin = 1.3
'''


def bundled_catalog_path(name: str) -> Path:
    """Path of a bundled catalog (``cablefam.catalogs``) on disk."""
    return Path(str(resources.files("cablefam.catalogs") / f"{name}.toml"))


def starter_sweep_text(path) -> str:
    """The starter sweep file for ``path`` (catalog paths relative to its folder)."""
    path = Path(path)
    folder = path.resolve().parent
    lines = []
    for name in STARTER_CATALOGS:
        catalog = bundled_catalog_path(name).resolve()
        try:
            rel = Path(os.path.relpath(catalog, folder)).as_posix()
        except ValueError:  # another drive (Windows): keep the absolute path
            rel = catalog.as_posix()
        if rel.startswith("../../"):  # far away: the absolute path reads better
            rel = catalog.as_posix()
        lines.append(f'    "{rel}",')
    return _TEMPLATE.format(file_name=path.name, catalog_lines="\n".join(lines))


def write_starter_sweep(path, overwrite: bool = False) -> Path:
    """Write the starter sweep file (atomically); InputError when it exists and not
    ``overwrite``, or when its folder does not exist."""
    path = Path(path)
    if path.is_dir():
        raise InputError(f"{path}: is a folder; give the name of the sweep file to write")
    if path.exists() and not overwrite:
        raise InputError(f"{path}: exists; pass overwrite=True to replace it")
    if not path.parent.is_dir():
        raise InputError(f"{path}: folder {path.parent} does not exist")
    write_text_atomic(path, starter_sweep_text(path))
    return path
