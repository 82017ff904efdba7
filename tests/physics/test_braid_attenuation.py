"""Attenuation of standard braided constructions against published tables (physics.braid).

The braid loss factor :data:`cablefam.physics.braid.BRAID_LOSS_FACTOR` was calibrated on ONE
value: RG-213/U at 150 MHz in Table 6-1 of the ARRL General Class License Manual (corrected
table, arrl.org "Chapter 6 Antennas": loss per 100 ft at 30 and 150 MHz; that page states the
values were computed with a cable maker's on-line calculator). Everything else below is held
out. The second table is Appendix H, "Nominal attenuation in dB per 100 metres", of the Codan
"Radio Repeater Systems Training Guide" (values at 50, 150, 450 and 850 MHz).

Both tables are weak sources: the first was computed with a cable maker's calculator, the
second is a radio maker's training document, not a standard. They stand in until a published
standard's table (a MIL-DTL-17 specification sheet, or a handbook table of the RG types) is at
hand; replace them then. The 850 MHz values are outside +-10 % (pinned separately below).

Constructions (nominal MIL-C-17 dimensions, from memory; braid carriers, ends and wire
diameter from memory; the braid angle is solved from the optical coverage of the table
"Coaxial Cable Specifications, major types", compiled by P. Harden, NA5N). Copper-covered-steel
and tinned conductors are taken as copper: at 50 MHz and above the current runs in the copper
skin (the tin plating is not modelled). Dielectric: the catalog's solid LDPE.
"""

import numpy as np
import pytest

from cablefam.physics import line, outer_conductor, propagation
from cablefam.physics.units import neper_per_m_to_db_per_100m

# Source: IEC 60028, annealed copper resistivity at 20 degC, 1/58 ohm mm^2 m^-1.
RHO_CU = 1.7241e-8
# catalogs/baseline.toml, solid-pe (from memory there)
EPS_PE, TAN_PE = 2.25, 2e-4
FT_PER_M = 1.0 / 0.3048

# name: (overall centre diameter, strands, dielectric diameter, carriers, ends, braid wire
#        diameter, optical coverage)  [m, -, m, -, -, m, -]; dimensions from memory,
#        coverage from the NA5N table (RG-213 taken as its RG-8A row, 97 %)
CONSTRUCTIONS = {
    "RG-213/U": (2.26e-3, 7, 7.24e-3, 24, 8, 0.18e-3, 0.97),
    "RG-58C/U": (0.90e-3, 19, 2.95e-3, 16, 7, 0.127e-3, 0.96),
    "RG-59B/U": (0.58e-3, 1, 3.71e-3, 16, 7, 0.16e-3, 0.95),
    "RG-174/U": (0.48e-3, 7, 1.52e-3, 16, 4, 0.10e-3, 0.88),
}

# (construction, frequency [Hz], published [dB/100 m], table, used for calibration)
# Source: ARRL General Class License Manual, Table 6-1 (corrected, arrl.org), dB/100 ft * 3.2808
# (values computed there with a cable maker's calculator: a weak source, see the docstring)
ARRL = [
    ("RG-213/U", 150e6, 2.53 * FT_PER_M, "ARRL", True),
    ("RG-58C/U", 150e6, 5.63 * FT_PER_M, "ARRL", False),
    ("RG-59B/U", 150e6, 4.11 * FT_PER_M, "ARRL", False),
    ("RG-174/U", 150e6, 10.3 * FT_PER_M, "ARRL", False),
]
# Weak source, not a standard (a radio maker's training document; see the module docstring):
# Codan, Radio Repeater Systems Training Guide, Appendix H (dB per 100 m, nominal)
CODAN = [
    ("RG-58C/U", 50e6, 10.8, "Codan", False),
    ("RG-58C/U", 150e6, 20.0, "Codan", False),
    ("RG-58C/U", 450e6, 35.5, "Codan", False),
    ("RG-213/U", 50e6, 4.9, "Codan", False),
    ("RG-213/U", 150e6, 8.9, "Codan", False),
    ("RG-213/U", 450e6, 16.3, "Codan", False),
]
# Held out and outside +-10 % (reported, not hidden): at 850 MHz the tables' loss grows
# faster than this model's; the gap is of the size of a PE loss tangent of ~5e-4 instead of
# the catalog's 2e-4 (not calibrated: only the braid factor is).
CODAN_850 = [
    ("RG-58C/U", 850e6, 58.2, "Codan", False),
    ("RG-213/U", 850e6, 24.7, "Codan", False),
]


def braid_angle_for_coverage(b, carriers, ends, d, coverage):
    """The braid angle [rad] whose fill factor gives ``coverage`` (K = 2F - F^2)."""
    fill = 1.0 - np.sqrt(1.0 - coverage)
    return np.arccos(ends * carriers * d / (2.0 * np.pi * (2.0 * b + 2.0 * d) * fill))


def computed_attenuation(name, frequency):
    """Attenuation [dB/100 m] of a construction with a braid outer conductor."""
    d_in, strands, d_diel, carriers, ends, d, coverage = CONSTRUCTIONS[name]
    a, b = d_in / 2.0, d_diel / 2.0
    angle = braid_angle_for_coverage(b, carriers, ends, d, coverage)
    outer = outer_conductor.OuterConductor(np.array(outer_conductor.BRAID), carriers, ends, d,
                                           angle, 25e-6, RHO_CU)
    lp = line.line_parameters(a, b, b + 2.0 * d, frequency, RHO_CU, RHO_CU, EPS_PE, TAN_PE,
                              inner_strands=strands, outer=outer)
    gamma = propagation.propagation_constant(lp.r, lp.l, lp.g, lp.c, frequency)
    return float(neper_per_m_to_db_per_100m(gamma.real))


def attenuation_table():
    """(construction, f, published, computed, relative error, role) of every row."""
    rows = []
    for name, f, published, table, calibration in ARRL + CODAN + CODAN_850:
        computed = computed_attenuation(name, f)
        role = "calibration" if calibration else "held out"
        rows.append((name, f, published, computed, computed / published - 1.0, table, role))
    return rows


@pytest.mark.parametrize("name,f,published,table,calibration", ARRL + CODAN)
def test_attenuation_within_10_percent(name, f, published, table, calibration):
    # rtol 10 %: the acceptance band; the tables give 2-3 significant figures and
    # nominal (not measured-sample) values
    assert computed_attenuation(name, f) == pytest.approx(published, rel=0.10)


def test_calibration_point_is_met_closely():
    name, f, published, _, _ = ARRL[0]
    assert computed_attenuation(name, f) == pytest.approx(published, rel=0.02)


@pytest.mark.parametrize("name,f,published,table,calibration", CODAN_850)
def test_850_mhz_known_shortfall(name, f, published, table, calibration):
    # the documented miss at 850 MHz: low by 15-20 %, not more
    ratio = computed_attenuation(name, f) / published
    assert 0.78 < ratio < 0.9


def test_braid_adds_loss_over_a_tube_of_the_same_build():
    d_in, strands, d_diel, carriers, ends, d, coverage = CONSTRUCTIONS["RG-58C/U"]
    a, b, f = d_in / 2.0, d_diel / 2.0, 450e6
    tube = line.line_parameters(a, b, b + 2.0 * d, f, RHO_CU, RHO_CU, EPS_PE, TAN_PE,
                                inner_strands=strands)
    braided = computed_attenuation("RG-58C/U", f)
    g = propagation.propagation_constant(tube.r, tube.l, tube.g, tube.c, f)
    assert braided > 1.15 * float(neper_per_m_to_db_per_100m(g.real))
