"""Crown field of stranded centre conductors (physics.stranding.CROWN_FIELD_FACTORS).

Recomputed independently of the module's multipole solver by a charge-simulation method written
for this test: every strand of the lay-up (centre and all layers, the slits left open) is an
equipotential carrying m line charges on a circle of 0.7 of its radius; the charges (total 1)
and the common potential V are fitted by least squares to u = V at 2m points on each strand's
surface (the lay-up's 6-fold symmetry reduces the unknowns to one strand per orbit). The
potential u = sum q ln|z - z_j| ~ ln|z| at infinity, so exp(V) is the logarithmic capacity (the effective radius, T. Ransford, Potential Theory in the Complex Plane,
CUP 1995, Ch. 5) and the crown factor is exp(V) |grad u| at the crown of an outer strand.

Mesh study (charges per strand m -> crown factor, d = 1), run for this test:

=====  ===========  ===========  ===========
m      7 strands    19 strands   37 strands
=====  ===========  ===========  ===========
16     1.3174385    1.3590371    1.3723197
32     1.3218440    1.3655177    1.3802487
64     1.3218798    1.3655478    1.3803161
128    1.3218790    1.3655477    1.3803162
=====  ===========  ===========  ===========

so m = 64 is within 1e-6 of the converged value (m = 32 within 1e-4); the module's values agree
to 1e-7.
"""

import numpy as np
import pytest

from cablefam.physics.fields import peak_electric_field
from cablefam.physics.stranding import (CROWN_FIELD_FACTORS, EFFECTIVE_RADIUS_FACTORS,
                                        stranded_crown_field_factor, stranded_effective_radius)


def orbit_representatives(k, d=1.0):
    """One strand centre of each orbit of the lay-up under rotation by 60 degrees (the centre
    strand and j strands of layer j; the other strands are these rotated)."""
    centres = [0j]
    for j in range(1, k + 1):
        centres += list(j * d * np.exp(2j * np.pi * np.arange(j) / (6 * j)))
    return np.array(centres)


def charge_simulation(k, m, depth=0.7):
    """(crown factor, effective radius over overall radius) of a k-layer lay-up, m charges
    per strand (module notes). The lay-up's 6-fold symmetry is used: one unknown charge stands
    for its six rotations, collocation on one strand of each orbit."""
    c, r = orbit_representatives(k), 0.5
    rotations = np.exp(2j * np.pi * np.arange(6) / 6)
    theta = 2 * np.pi * (np.arange(m) + 0.5) / m
    sources = (c[:, None] + depth * r * np.exp(1j * theta)[None, :]).ravel()
    theta_c = 2 * np.pi * np.arange(2 * m) / (2 * m)
    points = (c[:, None] + r * np.exp(1j * theta_c)[None, :]).ravel()
    n = sources.size
    system = np.zeros((points.size + 1, n + 1))
    for rot in rotations:
        system[:-1, :n] += np.log(np.abs(points[:, None] - rot * sources[None, :]))
    system[:-1, n] = -1.0
    system[-1, :n] = 6e3  # total charge (six rotations of each) 1, weighted to hold exactly
    rhs = np.zeros(points.size + 1)
    rhs[-1] = 1e3
    x = np.linalg.lstsq(system, rhs, rcond=None)[0]
    q, v = x[:n], x[n]
    crown = k + 0.5  # outermost point of the first outer strand, on the positive real axis
    field = abs(sum(np.sum(q / (crown - rot * sources)) for rot in rotations))
    return np.exp(v) * field, np.exp(v) / (k + 0.5)


@pytest.mark.parametrize("k, m, rtol", [(1, 64, 2e-6), (2, 64, 2e-6), (3, 64, 2e-6)])
def test_crown_factor_by_charge_simulation(k, m, rtol):
    # Source: independent 2-D computation (charge simulation, mesh study in the module notes)
    crown, kappa = charge_simulation(k, m)
    assert CROWN_FIELD_FACTORS[k] == pytest.approx(crown, rel=rtol)
    assert EFFECTIVE_RADIUS_FACTORS[k] == pytest.approx(kappa, rel=rtol)


def test_mesh_study_converges():
    coarse, _ = charge_simulation(1, 16)
    medium, _ = charge_simulation(1, 32)
    fine, _ = charge_simulation(1, 64)
    assert abs(fine - medium) < 0.05 * abs(medium - coarse)


def test_crown_factor_values_and_use():
    assert stranded_crown_field_factor(1) == 1.0
    np.testing.assert_allclose(stranded_crown_field_factor([7, 19, 37]),
                               [1.3218790, 1.3655477, 1.3803162])
    # the figures: 1.32 (7 strands) and 1.37 (19 strands)
    assert round(float(stranded_crown_field_factor(7)), 2) == 1.32
    assert round(float(stranded_crown_field_factor(19)), 2) == 1.37
    # the crown field of a 7-strand conductor is above the smooth conductor of the overall
    # radius too (the effective radius alone would lower the estimate)
    a_o, b, v = 1e-3, 3.5e-3, 1000.0
    a_eff = stranded_effective_radius(a_o, 7)
    crown = stranded_crown_field_factor(7) * peak_electric_field(a_eff, b, v)
    assert crown > peak_electric_field(a_o, b, v)
