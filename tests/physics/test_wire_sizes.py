"""AWG diameters, metric size lists, snapping (physics.wire_sizes, catalogs/wire-sizes/standard-sizes.toml)."""

import tomllib
from pathlib import Path

import numpy as np
import pytest

from cablefam.physics.wire_sizes import awg_diameter, awg_gauge_number, awg_gauges, snap_to_sizes

CATALOG = Path(__file__).resolve().parents[2] / "catalogs" / "wire-sizes" / "standard-sizes.toml"


def load_sizes():
    with CATALOG.open("rb") as f:
        return tomllib.load(f)


# ------------------------------------------------------------------ AWG


def test_awg_follows_the_astm_b258_formula():
    # Source: ASTM B258, defining formula d = 0.005 in x 92^((36 - n)/39), written out here in
    # millimetres; rtol 1e-14, rounding only.
    n = np.arange(-3, 57)
    expected_mm = 0.127 * 92.0 ** ((36.0 - n) / 39.0)
    np.testing.assert_allclose(awg_diameter(n) * 1e3, expected_mm, rtol=1e-14)


def test_awg_anchors_are_exact():
    # Source: ASTM B258 anchors of the series: AWG 0000 = 0.4600 in, AWG 36 = 0.0050 in.
    assert awg_diameter(-3) == pytest.approx(0.4600 * 25.4e-3, rel=1e-14)
    assert awg_diameter(36) == pytest.approx(0.0050 * 25.4e-3, rel=1e-14)
    assert awg_diameter("0000") == awg_diameter(-3) == awg_diameter("4/0")


@pytest.mark.parametrize("gauge, tabulated_mm", [
    (-3, 11.684), (-2, 10.405), (-1, 9.266), (0, 8.251), (10, 2.588), (12, 2.053),
    (14, 1.628), (18, 1.024), (20, 0.812), (22, 0.644), (24, 0.511), (30, 0.255),
])
def test_awg_matches_tabulated_sizes(gauge, tabulated_mm):
    # from memory: the usual AWG table (the ASTM B258 inch values, 0.4600 in for 0000,
    # 0.1019 in for 10, 0.0808 in for 12, 0.0403 in for 18, 0.0201 in for 24, converted to mm
    # and given to 3 decimals). rtol 1.5e-3: a table rounded to 4 significant inch figures.
    assert awg_diameter(gauge) * 1e3 == pytest.approx(tabulated_mm, rel=1.5e-3)


def test_awg_rules_of_the_series():
    # Six gauges halve the diameter (92^(6/39) = 2.005) and three gauges halve the area to
    # within 0.5 % (common practice, no source; implied by the formula).
    d = awg_diameter(np.arange(0, 30))
    assert np.all(np.abs(d[:-6] / d[6:] / 2.0 - 1.0) < 5e-3)
    assert np.all(np.abs((d[:-3] / d[3:]) ** 2 / 2.0 - 1.0) < 5e-3)
    assert np.all(np.diff(d) < 0.0)


def test_gauge_names():
    assert [awg_gauge_number(x) for x in ("0000", "000", "00", "0")] == [-3, -2, -1, 0]
    assert [awg_gauge_number(x) for x in ("4/0", "3/0", "2/0", "1/0")] == [-3, -2, -1, 0]
    assert awg_gauge_number("18") == 18 and awg_gauge_number(24) == 24
    np.testing.assert_array_equal(awg_diameter(["00", "10", "24"]), awg_diameter([-1, 10, 24]))
    for bad in ("00000", "5/0", "12.5", "AWG 12", "-4", "012"):
        with pytest.raises(ValueError, match="AWG size"):
            awg_gauge_number(bad)


def test_invalid_gauges_raise_naming_the_value():
    with pytest.raises(ValueError, match="-4"):
        awg_diameter([10, -4])
    with pytest.raises(ValueError, match="12.5"):
        awg_diameter(12.5)
    with pytest.raises(ValueError):
        awg_diameter(np.nan)


def test_awg_gauges_range():
    np.testing.assert_array_equal(awg_gauges(-3, 2), [-3, -2, -1, 0, 1, 2])
    np.testing.assert_array_equal(awg_gauges("0000", "00"), [-3, -2, -1])
    assert awg_gauges(18, 18).tolist() == [18]
    with pytest.raises(ValueError, match="above"):
        awg_gauges(20, 10)


def test_awg_shapes():
    assert np.shape(awg_diameter(12)) == ()
    assert awg_diameter([[10, 12], [14, 16]]).shape == (2, 2)
    assert awg_diameter([10, 12]).tolist() == [float(awg_diameter(10)), float(awg_diameter(12))]


# ------------------------------------------------------------------ metric list (the catalog)


def test_catalog_lists_have_sources_and_are_sorted():
    data = load_sizes()
    assert data["wire_sizes"]["source"] and data["wire_sizes"]["description"]
    for table in ("metric", "metric_fine"):
        sizes = np.array(data[table]["diameters_m"])
        assert data[table]["source"]
        assert np.all(np.diff(sizes) > 0.0) and sizes[0] > 0.0
    assert data["awg"]["source"].startswith("ASTM B258")
    assert (data["awg"]["min_gauge"], data["awg"]["max_gauge"]) == (-3, 40)
    # The [awg] formula as written in the file is the one implemented.
    assert "92**((36 - n)/39)" in data["awg"]["formula"]


@pytest.mark.parametrize("table, steps", [("metric", 20), ("metric_fine", 40)])
def test_metric_lists_are_iso_3_preferred_numbers(table, steps):
    # Source: ISO 3, series R20 / R40: rounded values of 10^(i/20), 10^(i/40), three
    # significant figures. From memory, the rounded R40 values deviate from the theoretical
    # ones by between -1.01 % and +1.26 %, R20 by less; check that bound and that the list is
    # the complete series over its range (one value per step, no gaps, no extras).
    mm = np.array(load_sizes()[table]["diameters_m"]) * 1e3
    exponent = np.round(np.log10(mm) * steps)
    np.testing.assert_array_equal(np.diff(exponent), 1.0)
    deviation = mm / 10.0 ** (exponent / steps) - 1.0
    assert np.all((deviation > -0.0102) & (deviation < 0.0127))
    mantissa = mm / 10.0 ** np.floor(np.log10(mm) + 1e-12)
    np.testing.assert_allclose(mantissa, np.round(mantissa, 2), atol=1e-12)
    # R20 is every other R40 value.
    if table == "metric_fine":
        np.testing.assert_allclose(mm[::2], np.array(load_sizes()["metric"]["diameters_m"]) * 1e3,
                                   rtol=1e-15)


# ------------------------------------------------------------------ snapping


def test_snap_to_nearest_with_ties_to_the_larger():
    sizes = [1.0, 2.0, 4.0]  # exactly representable: the tie at 1.5 and 3.0 is exact
    d = np.array([0.5, 1.0, 1.2, 1.5, 1.7, 2.0, 2.9, 3.0, 3.1, 4.0, 9.0])
    np.testing.assert_array_equal(snap_to_sizes(d, sizes),
                                  [1.0, 1.0, 1.0, 2.0, 2.0, 2.0, 2.0, 4.0, 4.0, 4.0, 4.0])
    # order of the list does not matter
    np.testing.assert_array_equal(snap_to_sizes(d, sizes[::-1]), snap_to_sizes(d, sizes))


def test_snap_to_metric_and_awg_sizes():
    metric = np.array(load_sizes()["metric"]["diameters_m"])
    rng = np.random.default_rng(20240607)
    d = rng.uniform(metric[0], metric[-1], 1000)
    snapped = snap_to_sizes(d, metric)
    assert np.all(np.isin(snapped, metric))
    # nearest: no listed size is closer than the chosen one
    assert np.all(np.abs(snapped - d)[:, None] <= np.abs(metric[None, :] - d[:, None]) + 0.0)
    # a standard size snaps to itself
    np.testing.assert_array_equal(snap_to_sizes(metric, metric), metric)
    awg = awg_diameter(awg_gauges(-3, 40))
    assert snap_to_sizes(1.0e-3, awg) == awg_diameter(18)  # AWG 18 = 1.024 mm
    assert snap_to_sizes(2.6e-3, awg) == awg_diameter(10)  # AWG 10 = 2.588 mm


def test_snap_shapes_and_errors():
    sizes = [1e-3, 2e-3]
    assert np.shape(snap_to_sizes(1.4e-3, sizes)) == ()
    assert snap_to_sizes([[1.4e-3], [1.6e-3]], sizes).shape == (2, 1)
    with pytest.raises(ValueError, match="empty"):
        snap_to_sizes(1e-3, [])
    with pytest.raises(ValueError, match="diameter"):
        snap_to_sizes([1e-3, np.nan], sizes)
    with pytest.raises(ValueError, match="standard size"):
        snap_to_sizes(1e-3, [1e-3, -1e-3])
