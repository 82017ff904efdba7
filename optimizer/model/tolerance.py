r"""Manufacturing spread and impedance yield, vectorized over population x samples.

A made cable differs from its drawing: the radii scatter, the centre conductor wanders off the
axis, the permittivity of a foamed dielectric varies. The *impedance yield* is the share of made
cables whose impedance stays inside the member's tolerance band. Two estimates:

- **Monte Carlo with common random numbers** (default): one fixed set of standard draws per
  task (from the task seed), so the search sees a smooth, reproducible objective; every design
  of a generation is evaluated against the same draws in one array operation of shape
  (population, samples).
- **Analytic**: first-order propagation of the spreads through the closed-form sensitivities
  of the lossless impedance, plus the second-order mean shift of the offset (Z0 only falls with
  eccentricity), with a normal approximation of the result.

The spread is applied to the lossless impedance (the arccosh form of
:mod:`cablefam.physics.eccentricity`) and scaled by the nominal design's ratio of :math:`|Z_0|` at the
operating frequency to its lossless value, which the spread leaves unchanged to first order.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from scipy.special import ndtr

from cablefam.physics.line import characteristic_impedance_lossless
from cablefam.physics.sensitivity import impedance_offset_sensitivity, impedance_sensitivity

#: Standard deviations of a uniform distribution on [-w, w] per unit w.
_UNIFORM_SD = 1.0 / np.sqrt(3.0)


@dataclass(frozen=True)
class Spread:
    """Standard deviations (or uniform half-bands) of the manufacturing variables."""

    inner_radius_m: float = 0.0
    dielectric_radius_m: float = 0.0
    eccentricity_m: float = 0.0
    """Per axis: the offset vector is 2-D normal, its length Rayleigh distributed."""
    relative_permittivity: float = 0.0
    """Relative: a fraction of the nominal permittivity."""
    uniform: tuple[str, ...] = ()
    """Names of the variables given as +/- bands (uniform) instead of standard deviations."""

    def sd(self, name):
        v = getattr(self, name)
        return v * _UNIFORM_SD if name in self.uniform else v


def common_draws(spread: Spread, n_samples: int, seed: int) -> dict[str, np.ndarray]:
    """Fixed standard draws of one task: unit-variance normal, or uniform on [-1, 1] for bands."""
    rng = np.random.default_rng(seed)
    out = {}
    for name in ("inner_radius_m", "dielectric_radius_m", "relative_permittivity"):
        out[name] = (rng.uniform(-1.0, 1.0, n_samples) if name in spread.uniform
                     else rng.standard_normal(n_samples))
    if "eccentricity_m" in spread.uniform:
        # uniform offset inside a disc of radius band: r = band sqrt(u), angle uniform
        r = np.sqrt(rng.uniform(0.0, 1.0, n_samples))
        phi = rng.uniform(0.0, 2.0 * np.pi, n_samples)
        out["offset_x"], out["offset_y"] = r * np.cos(phi), r * np.sin(phi)
    else:
        out["offset_x"] = rng.standard_normal(n_samples)
        out["offset_y"] = rng.standard_normal(n_samples)
    return out


def impedance_samples(a, b, relative_permittivity, spread: Spread, draws, z0_scale=1.0):
    """Impedance of every sample of every design [ohm], shape (n_designs, n_samples)."""
    a = np.asarray(a, dtype=float)[:, None]
    b = np.asarray(b, dtype=float)[:, None]
    eps = np.asarray(relative_permittivity, dtype=float)[:, None]
    aa = a + spread.inner_radius_m * draws["inner_radius_m"]
    bb = b + spread.dielectric_radius_m * draws["dielectric_radius_m"]
    ee = eps * (1.0 + spread.relative_permittivity * draws["relative_permittivity"])
    dx = spread.eccentricity_m * draws["offset_x"]
    dy = spread.eccentricity_m * draws["offset_y"]
    offset = np.hypot(dx, dy) + 0.0 * aa
    # a sample whose conductors touch is simply out of tolerance
    ok = (aa > 0) & (bb - aa > offset)
    aa_s = np.where(ok, aa, 1.0)
    bb_s = np.where(ok, bb, 2.0)
    off_s = np.where(ok, offset, 0.0)
    z = characteristic_impedance_lossless(aa_s, bb_s, np.maximum(ee, 1.0), off_s)
    return np.where(ok, z * np.asarray(z0_scale, dtype=float).reshape(-1, 1), np.inf)


def impedance_yield_monte_carlo(a, b, relative_permittivity, target, tolerance, spread, draws,
                                z0_scale=1.0):
    """Share of samples within ``target +/- tolerance`` and the mean +/- 3 sd band [ohm]."""
    z = impedance_samples(a, b, relative_permittivity, spread, draws, z0_scale)
    target = np.asarray(target, dtype=float).reshape(-1, 1) if np.ndim(target) else target
    inside = np.abs(z - target) <= tolerance
    finite = np.isfinite(z)
    zf = np.where(finite, z, np.nan)
    with np.errstate(invalid="ignore"):
        mean = np.nanmean(zf, axis=1)
        sd = np.nanstd(zf, axis=1)
    return inside.mean(axis=1), mean - 3.0 * sd, mean + 3.0 * sd


def impedance_mean_sd_analytic(a, b, relative_permittivity, spread: Spread, z0_scale=1.0):
    r"""Mean and standard deviation of the impedance from first-order propagation [ohm].

    .. math::
        \sigma_Z^2 = \left(Z_a\sigma_a\right)^2 + \left(Z_b\sigma_b\right)^2
                     + \left(Z_\varepsilon\varepsilon_r\sigma_\varepsilon\right)^2
                     + Z_{D^2}^2\,\mathrm{Var}\,D^2, \qquad
        \bar Z = Z + Z_{D^2}\,E\,D^2

    with the derivatives of the lossless impedance at the nominal (concentric) design from
    :mod:`cablefam.physics.sensitivity` (:math:`Z_a = -K/a`, :math:`Z_b = K/b`,
    :math:`Z_\varepsilon = -Z/(2\varepsilon_r)`, :math:`Z_{D^2} = -K/(b^2-a^2)`,
    :math:`K = \eta_0/(2\pi\sqrt{\varepsilon_r})`), :math:`\sigma_\varepsilon` relative, and
    the offset :math:`D^2 = X^2 + Y^2` of two normal axes (:math:`E D^2 = 2\sigma_e^2`,
    :math:`\mathrm{Var}\,D^2 = 4\sigma_e^4`). All scaled by ``z0_scale``.
    """
    a = np.asarray(a, dtype=float)
    b = np.asarray(b, dtype=float)
    eps = np.asarray(relative_permittivity, dtype=float)
    scale = np.asarray(z0_scale, dtype=float)
    z = characteristic_impedance_lossless(a, b, eps) * scale
    dz = impedance_sensitivity(a, b, eps)
    g = -impedance_offset_sensitivity(a, b, eps) * scale  # K / (b^2 - a^2)
    se = spread.sd("eccentricity_m")
    if "eccentricity_m" in spread.uniform:  # uniform disc of radius w: E D^2 = w^2/2
        mean_d2 = 0.5 * spread.eccentricity_m ** 2
        var_d2 = spread.eccentricity_m ** 4 / 12.0
    else:
        mean_d2 = 2.0 * se ** 2
        var_d2 = 4.0 * se ** 4
    var = ((dz.dz0_da * scale * spread.sd("inner_radius_m")) ** 2
           + (dz.dz0_db * scale * spread.sd("dielectric_radius_m")) ** 2
           + (dz.dz0_deps * eps * scale * spread.sd("relative_permittivity")) ** 2
           + g * g * var_d2)
    return z - g * mean_d2, np.sqrt(var)


def impedance_yield_analytic(a, b, relative_permittivity, target, tolerance, spread,
                             z0_scale=1.0):
    """Normal-approximation yield and the mean +/- 3 sd band [ohm]."""
    mean, sd = impedance_mean_sd_analytic(a, b, relative_permittivity, spread, z0_scale)
    sd_safe = np.maximum(sd, 1e-300)
    inside = ndtr((target + tolerance - mean) / sd_safe) - ndtr((target - tolerance - mean) / sd_safe)
    exact_inside = (np.abs(mean - target) <= tolerance).astype(float)
    return np.where(sd > 0, inside, exact_inside), mean - 3.0 * sd, mean + 3.0 * sd
