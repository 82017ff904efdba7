"""Comparing fronts of catalogs and runs (cablefam.optimizer.review.compare)."""

import numpy as np
import pytest
from pymoo.indicators.hv import HV

from cablefam.optimizer.review.compare import REFERENCE_FACTOR, compare_runs, comparison_to_json
from cablefam.optimizer.errors import InputError
from cablefam.optimizer.run_folder.files import FRONT_FILE, read_provenance

from .conftest import copy_run_with_provenance, synthetic_run


def _two_catalog_run(tmp_path):
    """cat-a holds the light, lossy, thin end of the combined front (od 2-4 mm), cat-b the
    heavy, low-loss, thick end (od 6-9 mm); each also has dominated designs in the other's
    range."""
    att_a = np.array([5.0, 6.0, 8.0, 10.0, 2.0, 3.0])
    mass_a = np.array([20.0, 16.0, 12.0, 10.0, 60.0, 40.0]) * 1.0
    mass_a[4:] *= 1.2                                   # dominated by cat-b
    od_a = np.array([4.0, 3.5, 3.0, 2.0, 6.5, 6.0]) * 1e-3
    att_b = np.array([1.0, 2.0, 3.0, 4.0, 8.0])
    mass_b = np.array([100.0, 50.0, 33.0, 25.0, 15.0])  # (8, 15) is dominated by cat-a (8, 12)
    od_b = np.array([9.0, 8.0, 7.0, 6.0, 3.0]) * 1e-3
    rows = {"catalog": ["cat-a"] * 6 + ["cat-b"] * 5,
            "attenuation_db_per_100m": np.concatenate([att_a, att_b]),
            "mass_kg_per_km": np.concatenate([mass_a, mass_b]),
            "outer_diameter_m": np.concatenate([od_a, od_b])}
    return synthetic_run(tmp_path, rows)


def test_hypervolume_against_hand_and_pymoo(tmp_path):
    # Source: hand computation. Raw front (2, 50), (3, 30), (4, 10) normalizes to (0, 1),
    # (0.5, 0.5), (1, 0); against (1.1, 1.1) its hypervolume is 0.46 (see test_tradeoff).
    run = synthetic_run(tmp_path, {"attenuation_db_per_100m": np.array([2.0, 3.0, 4.0]),
                                   "mass_kg_per_km": np.array([50.0, 30.0, 10.0])})
    mc = compare_runs([run]).members[0]
    assert mc.summaries["cat-a"].hypervolume == pytest.approx(0.46, rel=1e-12)
    # Source: pymoo's HV on the same points normalized by hand.
    z = (np.array([[2.0, 50.0], [3.0, 30.0], [4.0, 10.0]]) - [2.0, 10.0]) / [2.0, 40.0]
    ref = np.full(2, REFERENCE_FACTOR)
    assert mc.summaries["cat-a"].hypervolume == pytest.approx(HV(ref_point=ref)(z), rel=1e-12)
    assert mc.reference_point == [1.1, 1.1]


def test_coverage_best_values_and_verdict(tmp_path):
    c = compare_runs([_two_catalog_run(tmp_path)])
    mc = c.members[0]
    # Source: set coverage by hand (Zitzler and Thiele 1999): cat-b dominates a's two
    # heavy designs (2 of 6); cat-a dominates b's (8, 15) (1 of 5).
    assert mc.coverage["cat-b"]["cat-a"] == pytest.approx(2 / 6)
    assert mc.coverage["cat-a"]["cat-b"] == pytest.approx(1 / 5)
    assert mc.summaries["cat-a"].best == {"attenuation_db_per_100m": 2.0, "mass_kg_per_km": 10.0}
    assert mc.summaries["cat-b"].best == {"attenuation_db_per_100m": 1.0, "mass_kg_per_km": 15.0}
    # combined front: a holds od 2-4 mm, b holds 6-9 mm: split at 5 mm
    assert "cat-b dominates cat-a above 5 mm outer diameter" in mc.verdict
    assert mc.summaries["cat-a"].combined_share == pytest.approx(4 / 8)


def test_one_front_holding_everything_is_called_dominant(tmp_path):
    rows = {"catalog": ["cat-a"] * 3 + ["cat-b"] * 3,
            "attenuation_db_per_100m": np.array([1.0, 2.0, 3.0, 1.5, 2.5, 3.5]),
            "mass_kg_per_km": np.array([30.0, 20.0, 10.0, 31.0, 21.0, 11.0])}
    mc = compare_runs([synthetic_run(tmp_path, rows)]).members[0]
    assert mc.verdict.startswith("m1: cat-a dominates cat-b everywhere")
    assert mc.coverage["cat-a"]["cat-b"] == 1.0 and mc.coverage["cat-b"]["cat-a"] == 0.0


def test_compare_across_runs_and_json(tiny_run, tiny_run_b):
    name = read_provenance(tiny_run / FRONT_FILE)["members"][0]["name"]
    c = compare_runs([tiny_run, tiny_run_b], member=name)
    assert [m.member for m in c.members] == [name]
    labels = c.members[0].labels
    n_catalogs = len(read_provenance(tiny_run / FRONT_FILE)["catalogs"])
    assert len(labels) == 2 * n_catalogs and all("/" in lab for lab in labels)
    obj = comparison_to_json(c)
    assert obj["members"][0]["verdict"] == c.members[0].verdict
    assert {f["label"] for f in obj["members"][0]["fronts"]} == set(labels)


def test_refuses_different_objectives(tiny_run, tmp_path):
    other = copy_run_with_provenance(
        tiny_run, tmp_path / "other", lambda p: p.__setitem__("objectives", ["attenuation",
                                                                             "cost"]))
    with pytest.raises(InputError, match="different objectives") as info:
        compare_runs([tiny_run, other])
    assert "\n" not in str(info.value)


def test_refuses_different_operating_point(tiny_run, tmp_path):
    def change(p):
        p["members"][0]["frequency_hz"] = 1.0e9
    other = copy_run_with_provenance(tiny_run, tmp_path / "other", change)
    with pytest.raises(InputError) as info:
        compare_runs([tiny_run, other])
    message = str(info.value)
    name = read_provenance(tiny_run / FRONT_FILE)["members"][0]["name"]
    assert "frequency_hz" in message and name in message and "\n" not in message


def test_unknown_member_and_repeated_run(tiny_run):
    with pytest.raises(InputError, match="^member = 'nobody'"):
        compare_runs([tiny_run], member="nobody")
    with pytest.raises(InputError, match="twice"):
        compare_runs([tiny_run, tiny_run])
