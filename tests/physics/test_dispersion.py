"""The wideband Debye (Djordjevic-Sarkar) model: the fit, causality, a second implementation
and published dielectric data of polyethylene and PTFE over frequency."""

import numpy as np
import pytest
from scipy import integrate

from cablefam.physics import dispersion


def test_exact_at_the_reference_frequency():
    eps = np.array([2.25, 2.1, 4.3])
    tan = np.array([2e-4, 3e-4, 0.02])
    fref = np.array([1e9, 3e9, 1e6])
    e, t = dispersion.dispersive_permittivity_loss_tangent(fref, eps, tan, fref)
    np.testing.assert_allclose(e, eps, rtol=1e-14)
    np.testing.assert_allclose(t, tan, rtol=1e-12)


def test_lossless_material_has_no_dispersion():
    f = np.logspace(3, 11, 9)
    e, t = dispersion.dispersive_permittivity_loss_tangent(f, 2.1, 0.0, 1e9)
    np.testing.assert_array_equal(e, 2.1)
    np.testing.assert_array_equal(t, 0.0)


def test_designs_by_frequencies_broadcast():
    eps = np.array([2.25, 2.1])[:, None]
    tan = np.array([2e-4, 3e-4])[:, None]
    f = np.logspace(6, 10, 5)[None, :]
    e, t = dispersion.dispersive_permittivity_loss_tangent(f, eps, tan, 1e9)
    assert e.shape == t.shape == (2, 5)
    for i in range(2):  # same numbers one design at a time
        e1, t1 = dispersion.dispersive_permittivity_loss_tangent(f[0], eps[i, 0], tan[i, 0], 1e9)
        np.testing.assert_array_equal(e[i], e1)
        np.testing.assert_array_equal(t[i], t1)


def test_limits_static_and_optical():
    eps_inf, delta = dispersion.wideband_debye_parameters(2.25, 2e-4, 1e9)
    static = dispersion.wideband_debye_permittivity(0.0, eps_inf, delta)
    np.testing.assert_allclose(static, eps_inf + delta, rtol=1e-15)
    high = dispersion.wideband_debye_permittivity(1e20, eps_inf, delta)
    np.testing.assert_allclose(high.real, eps_inf, rtol=1e-8)


@pytest.mark.parametrize("f0", [3e5, 1e9, 4e10])
def test_kramers_kronig(f0):
    """eps'(w) - eps_inf = (2/pi) P int_0^inf x eps''(x) / (x^2 - w^2) dx (frequencies in Hz:
    the relation is scale free). The principal value near x = w by quad's Cauchy weight, the
    rest decade by decade."""
    eps_inf, delta = dispersion.wideband_debye_parameters(2.25, 3e-4, 1e9)

    def loss(x):
        return -dispersion.wideband_debye_permittivity(x, eps_inf, delta).imag

    near, _ = integrate.quad(lambda x: x * loss(x) / (x + f0), 0.0, 2.0 * f0, weight="cauchy",
                             wvar=f0, limit=400, epsabs=0.0, epsrel=1e-11)
    edges = np.concatenate([[2.0 * f0], np.logspace(np.log10(2.0 * f0) + 1.0, 18.0, 40)])
    far = sum(integrate.quad(lambda x: x * loss(x) / (x * x - f0 * f0), lo, hi, limit=200,
                             epsabs=0.0, epsrel=1e-11)[0] for lo, hi in zip(edges, edges[1:]))
    tail = loss(1e18) * 1e18 / 1e18  # int_X^inf x (c/x) / x^2 dx = c/X with eps'' = c/x
    kk = 2.0 / np.pi * (near + far + tail)
    direct = dispersion.wideband_debye_permittivity(f0, eps_inf, delta).real - eps_inf
    np.testing.assert_allclose(kk, direct, rtol=1e-9)


def test_against_scikit_rf():
    """The same model in a second implementation."""
    # Source: scikit-rf (skrf.media.DefinedAEpTandZ0, model='djordjevicsvensson', corners
    # f_low = 1 kHz, f_high = 1 THz, fitted at f_epr_tand), an independent implementation
    skrf = pytest.importorskip("skrf")
    freq = skrf.Frequency(1, 20000, 41, unit="MHz")
    media = skrf.media.DefinedAEpTandZ0(freq, ep_r=2.25, tanD=2e-4, f_low=1e3, f_high=1e12,
                                        f_ep=1e9, model="djordjevicsvensson")
    e, t = dispersion.dispersive_permittivity_loss_tangent(freq.f, 2.25, 2e-4, 1e9)
    np.testing.assert_allclose(e, media.ep_r_f.real, rtol=1e-12)
    np.testing.assert_allclose(t, media.tand_f, rtol=1e-9)


# Polyethylene and PTFE over frequency, 25 degC: A. von Hippel (ed.), Dielectric Materials and
# Applications, MIT Press 1954, tables of dielectric materials (from memory):
# frequency [Hz] -> (eps', tan delta)
_POLYETHYLENE = {1e2: (2.26, 2e-4), 1e6: (2.26, 2e-4), 1e8: (2.26, 2e-4),
                 3e9: (2.26, 3.1e-4), 1e10: (2.26, 3.6e-4)}
_PTFE = {1e2: (2.1, 5e-4), 1e6: (2.1, 2e-4), 1e8: (2.1, 2e-4), 3e9: (2.1, 1.5e-4),
         1e10: (2.08, 3.7e-4)}


@pytest.mark.parametrize("table", [_POLYETHYLENE, _PTFE], ids=["PE", "PTFE"])
def test_against_published_polymer_tables(table):
    """Fitted at 3 GHz, the model keeps eps' within 1.1 % of the tables from 1 MHz to 10 GHz
    (the tables' own steps are 0.01 to 0.02 on 2.1) and tan delta within a factor 2.5 (the
    tables' loss tangents scatter by that much; the model's is nearly flat, as theirs roughly
    is). 100 Hz lies below the model's lower corner (1 kHz), where its loss falls off: left out."""
    f = np.array(sorted(x for x in table if x >= 1e6))
    eps_pub = np.array([table[x][0] for x in f])
    tan_pub = np.array([table[x][1] for x in f])
    e, t = dispersion.dispersive_permittivity_loss_tangent(f, table[3e9][0], table[3e9][1], 3e9)
    np.testing.assert_allclose(e, eps_pub, rtol=0.011)
    assert np.all(t / tan_pub < 2.5) and np.all(tan_pub / t < 2.5)
