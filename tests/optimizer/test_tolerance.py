"""Impedance yield: Monte Carlo with common random numbers against the analytic estimate, the
normal-distribution value, determinism, and a sweep with a yield requirement."""

import dataclasses
import re
from pathlib import Path

import numpy as np
import pandas as pd
import pytest
from scipy.constants import mu_0, speed_of_light
from scipy.stats import norm

from cablefam.optimizer.errors import InputError
from cablefam.optimizer.batch.sweep import run_sweep
from cablefam.optimizer.inputs.sweep_spec import demo_sweep_path, load_sweep
from cablefam.optimizer.model.tolerance import (Spread, common_draws, impedance_mean_sd_analytic,
                                 impedance_yield_analytic, impedance_yield_monte_carlo)

ETA_0 = mu_0 * speed_of_light
CATALOGS = Path(__file__).resolve().parents[2] / "catalogs"


def _design_for(z0, eps_r, a=1.0e-3):
    return a, a * np.exp(2 * np.pi * np.sqrt(eps_r) * z0 / ETA_0)


def test_centred_design_yield_equals_normal_distribution_value():
    # Source: the normal distribution, P(|X - mu| <= k sigma) = 2 Phi(k) - 1 (e.g. Abramowitz
    # & Stegun 26.2.2); with one spread variable the first-order impedance spread is exactly
    # linear in it, so a design centred in the band has this yield.
    eps = 2.25
    a, b = _design_for(50.0, eps)
    k = ETA_0 / (2 * np.pi * np.sqrt(eps))
    sd_b = 10e-6
    sd_z = k / b * sd_b
    tol = 2.0 * sd_z  # a +/- 2 sigma band
    spread = Spread(dielectric_radius_m=sd_b)
    y_an, lo, hi = impedance_yield_analytic([a], [b], [eps], 50.0, tol, spread)
    assert y_an[0] == pytest.approx(2 * norm.cdf(2.0) - 1, rel=1e-12)  # 0.9545
    assert hi[0] - lo[0] == pytest.approx(6 * sd_z, rel=1e-12)
    draws = common_draws(spread, 200_000, seed=3)
    y_mc, _, _ = impedance_yield_monte_carlo([a], [b], [eps], 50.0, tol, spread, draws)
    # MC standard error sqrt(p(1-p)/n) = 4.7e-4; ln(b + db) is not exactly linear: 1e-3
    assert y_mc[0] == pytest.approx(0.9545, abs=2e-3)


def test_monte_carlo_and_analytic_agree_on_realistic_spreads():
    eps = np.array([2.25, 1.5, 2.1])
    z_target = np.array([50.0, 75.0, 50.0])
    a = np.array([1.3e-3, 0.5e-3, 0.45e-3])
    b = a * np.exp(2 * np.pi * np.sqrt(eps) * (z_target + np.array([0.3, -1.0, 0.8])) / ETA_0)
    spread = Spread(inner_radius_m=4e-6, dielectric_radius_m=15e-6, eccentricity_m=20e-6,
                    relative_permittivity=0.01)
    draws = common_draws(spread, 100_000, seed=11)
    y_mc, lo_mc, hi_mc = impedance_yield_monte_carlo(a, b, eps, z_target, 1.5, spread, draws)
    y_an, lo_an, hi_an = impedance_yield_analytic(a, b, eps, z_target, 1.5, spread)
    diff = np.abs(y_mc - y_an)
    # reported difference of the two estimates (the offset term is skewed, not normal)
    print("MC - analytic yield difference:", diff)
    assert np.all(diff < 0.01)
    assert np.allclose(lo_mc, lo_an, atol=0.05) and np.allclose(hi_mc, hi_an, atol=0.05)


def test_common_random_numbers_are_deterministic_by_seed():
    spread = Spread(inner_radius_m=5e-6, eccentricity_m=1e-5)
    d1 = common_draws(spread, 1000, seed=5)
    d2 = common_draws(spread, 1000, seed=5)
    d3 = common_draws(spread, 1000, seed=6)
    assert all(np.array_equal(d1[k], d2[k]) for k in d1)
    assert not np.array_equal(d1["inner_radius_m"], d3["inner_radius_m"])


def test_eccentricity_only_lowers_the_impedance():
    a, b = _design_for(50.0, 2.25)
    mean, sd = impedance_mean_sd_analytic([a], [b], [2.25], Spread(eccentricity_m=50e-6))
    assert mean[0] < 50.0 and sd[0] > 0


def test_bands_are_uniform():
    # Source: a uniform distribution on [-w, w] has standard deviation w / sqrt(3)
    a, b = _design_for(50.0, 2.25)
    k = ETA_0 / (2 * np.pi * 1.5)
    _, sd = impedance_mean_sd_analytic([a], [b], [2.25], Spread(dielectric_radius_m=30e-6,
                                                                 uniform=("dielectric_radius_m",)))
    assert sd[0] == pytest.approx(k / b * 30e-6 / np.sqrt(3), rel=1e-12)


def _demo_text():
    text = demo_sweep_path().read_text()
    return text.replace('"../../catalogs/', f'"{CATALOGS.as_posix()}/')


def _yield_sweep(tmp_path, min_yield="0.99"):
    """The demo's first member (it carries a yield requirement), on a small budget."""
    text = re.sub(r"(?m)^population = \d+$", "population = 40", _demo_text())
    text = re.sub(r"(?m)^generations = \d+$", "generations = 30", text)
    text = re.sub(r"(?m)^evaluations_per_task = \d+", "evaluations_per_task = 8000", text)
    text = re.sub(r"(?m)^min_impedance_yield = .*$", f"min_impedance_yield = {min_yield}", text)
    assert "[tolerance]" in text and "min_impedance_yield" in text
    head, first, *_ = text.split("[[member]]")
    path = tmp_path / "yield.toml"
    path.write_text(head + "[[member]]" + first)
    return path


@pytest.mark.slow
def test_sweep_with_yield_requirement_meets_it_on_resampling(tmp_path):
    sweep = load_sweep(_yield_sweep(tmp_path))
    run = run_sweep(sweep, tmp_path / "runs")
    df = pd.read_parquet(run / "front.parquet")
    assert len(df) > 0
    assert (df["impedance_yield"] >= 0.99).all()
    assert (df["z0_3sigma_low_ohm"] < df["z0_ohm"]).all()
    # re-sample with fresh, independent draws and 20x the samples
    spread = sweep.spec.tolerance.spread()
    draws = common_draws(spread, 8000, seed=12345)
    cats = {c.name: c for c in sweep.catalogs}
    eps = np.array([cats[c].materials["dielectric"][d].relative_permittivity
                    for c, d in zip(df["catalog"], df["dielectric"])])
    scale = df["z0_ohm"] / df["z0_lossless_ohm"]
    y, _, _ = impedance_yield_monte_carlo(df["inner_radius_m"], df["dielectric_radius_m"], eps,
                                          50.0, 1.5, spread, draws, scale.to_numpy())
    # the search's 400 common draws carry a standard error of sqrt(0.99 * 0.01 / 400) = 0.005
    assert np.all(y >= 0.99 - 3 * 0.005), y.min()


def test_yield_requirement_without_tolerance_table_is_an_input_error(tmp_path):
    text = _demo_text()
    text = re.sub(r"(?ms)^\[tolerance\].*?(?=^\[\[member\]\])", "", text)
    assert "[tolerance]" not in text and "min_impedance_yield" in text
    path = tmp_path / "bad.toml"
    path.write_text(text)
    with pytest.raises(InputError, match="min_impedance_yield"):
        load_sweep(path)


def test_yield_is_reproducible_in_a_sweep(tmp_path):
    path = _yield_sweep(tmp_path)
    sweep = load_sweep(path)
    sweep = dataclasses.replace(sweep, spec=sweep.spec.model_copy(update={
        "search": sweep.spec.search.model_copy(update={"generations": 4, "population": 12})}))
    r1 = run_sweep(sweep, tmp_path / "a")
    r2 = run_sweep(sweep, tmp_path / "b")
    assert (r1 / "front.parquet").read_bytes() == (r2 / "front.parquet").read_bytes()
