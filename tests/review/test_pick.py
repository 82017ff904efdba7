"""Picking candidates from a run's front (cablefam.optimizer.review.pick)."""

import numpy as np
import pytest

from cablefam.optimizer.review.design_export import select_row
from cablefam.optimizer.errors import InputError
from cablefam.optimizer.review.pick import pick, picks_to_json
from cablefam.optimizer.run_folder.reader import read_front

from .conftest import synthetic_run


@pytest.fixture()
def parabola_run(tmp_path):
    """One member, one catalog: attenuation t, mass (1 - t)^2 + a dominated point."""
    t = np.linspace(0.0, 1.0, 41)
    att = np.append(10.0 + 10.0 * t, 30.0)          # [dB/100 m]
    mass = np.append(100.0 + 400.0 * (1.0 - t) ** 2, 600.0)  # [kg/km]
    od = np.append(np.linspace(9e-3, 3e-3, 41), 5e-3)
    return synthetic_run(tmp_path, {"attenuation_db_per_100m": att, "mass_kg_per_km": mass,
                                    "outer_diameter_m": od})


def test_knee_pick_is_the_analytic_knee(parabola_run):
    # Source: Das (1999) knee; closed form for f2 = (1 - f1)^2 (see test_tradeoff): the knee
    # is at t = 1/2, i.e. attenuation 15 dB/100 m, mass 200 kg/km.
    result = pick(parabola_run, method="knee", top=3)
    best = result.picks.iloc[0]
    assert best["attenuation_db_per_100m"] == pytest.approx(15.0)
    assert best["mass_kg_per_km"] == pytest.approx(200.0)
    assert best["index"] == 20
    assert result.candidates == {"m1": 41}       # the dominated row is not ranked
    assert list(result.picks["rank"]) == [1, 2, 3]


def test_weighted_pick_equals_hand_computation(parabola_run):
    # Source: hand computation. Normalized f1 = t, f2 = (1 - t)^2; weights 1:1 give
    # s(t) = (t + (1 - t)^2) / 2, minimal at t = 1/2 (s = 3/8); weights 3:1 give
    # (3 t + (1 - t)^2) / 4, decreasing on [0, 1] down to t = 0 (s = 1/4).
    even = pick(parabola_run, method="weights", weights="attenuation=1,mass=1", top=1)
    assert even.picks.iloc[0]["index"] == 20
    assert even.picks.iloc[0]["score"] == pytest.approx(3 / 8)
    skewed = pick(parabola_run, method="weights", weights={"attenuation": 3, "mass": 1}, top=1)
    assert skewed.picks.iloc[0]["index"] == 0
    assert skewed.picks.iloc[0]["score"] == pytest.approx(1 / 4)


def test_nearest_pick_and_column_names_as_keys(parabola_run):
    # Source: hand computation: the target (12.5 dB/100 m, any mass) is met exactly at t = 1/4.
    r = pick(parabola_run, method="nearest", target="attenuation_db_per_100m=12.5", top=1)
    assert r.picks.iloc[0]["index"] == 10
    assert r.picks.iloc[0]["score"] == pytest.approx(0.0, abs=1e-12)


def test_where_filters_before_ranking(parabola_run):
    r = pick(parabola_run, where="outer_diameter_m < 5e-3 and mass_kg_per_km < 200", top=50)
    assert (r.picks["outer_diameter_m"] < 5e-3).all()
    assert (r.picks["mass_kg_per_km"] < 200).all()
    assert r.candidates["m1"] == len(r.picks)


@pytest.mark.parametrize("kwargs, field", [
    (dict(where="outer_diameter_m <"), "where"),
    (dict(where="no_such_column > 1"), "where"),
    (dict(where="outer_diameter_m * 2"), "where"),
    (dict(member="nobody"), "member"),
    (dict(catalog="nothing"), "catalog"),
    (dict(method="weights", weights="attenuation=-1"), "weights"),
    (dict(method="weights", weights="colour=1"), "weights"),
    (dict(method="weights", weights="attenuation"), "weights"),
    (dict(method="nearest"), "target"),
    (dict(top=0), "top"),
])
def test_bad_input_is_one_line_naming_the_field(parabola_run, kwargs, field):
    with pytest.raises(InputError) as info:
        pick(parabola_run, **kwargs)
    message = str(info.value)
    # the library names its own argument; the CLI words it as the flag (test_cli_review)
    assert message.startswith((f"{field} = ", f"{field}: ")) and "\n" not in message
    assert "--" not in message


def test_maximised_objective_target_keeps_its_sign(tmp_path):
    # max_power is maximised: the matrix negates it, the target must follow.
    p = np.array([100.0, 200.0, 300.0])
    run = synthetic_run(tmp_path, {"attenuation_db_per_100m": np.array([1.0, 2.0, 3.0]),
                                   "max_power_w": p}, objectives=("attenuation", "max_power"))
    r = pick(run, method="nearest", target="max_power=200", top=1)
    assert r.picks.iloc[0]["max_power_w"] == 200.0


def test_index_is_the_design_export_row(tiny_run):
    df, _ = read_front(tiny_run)
    result = pick(tiny_run, top=3)
    assert len(result.picks)
    for _, row in result.picks.iterrows():
        exported = select_row(df, row["member"], int(row["index"]))
        for col in ("catalog", "inner_radius_m", "dielectric_radius_m", "mass_kg_per_km"):
            assert exported[col] == row[col]


def test_json_is_plain_data(tiny_run):
    obj = picks_to_json(pick(tiny_run, top=2))
    assert obj["method"] == "knee" and obj["objectives"] == ["attenuation", "mass"]
    for p in obj["picks"]:
        assert isinstance(p["index"], int) and isinstance(p["score"], float)
        assert p["design_command"].startswith(f"cablefam design {tiny_run}")
        weights = [v for k, v in p.items() if k.startswith("pseudo_weight_")]
        assert sum(weights) == pytest.approx(1.0)
