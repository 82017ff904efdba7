"""Picks spread along the front (default) or the best-ranked distinct designs (--neighbours)."""

import json

import numpy as np
import pytest

from cablefam.optimizer.cli.app import main
from cablefam.optimizer.model.objectives import objective_matrix, resolutions
from cablefam.optimizer.review import tradeoff
from cablefam.optimizer.review.pick import pick, picks_to_json

from .conftest import synthetic_run


@pytest.fixture()
def dense_parabola_run(tmp_path):
    """attenuation t, mass (1 - t)^2 on 401 points: neighbours closer than the spread."""
    t = np.linspace(0.0, 1.0, 401)
    return synthetic_run(tmp_path, {"attenuation_db_per_100m": 10.0 + 10.0 * t,
                                    "mass_kg_per_km": 100.0 + 400.0 * (1.0 - t) ** 2})


def _normalized(picks):
    f = objective_matrix(picks, ["attenuation", "mass"])
    # the front's range: attenuation 10..20, mass 100..500
    return (f - [10.0, 100.0]) / [10.0, 400.0]


def test_spread_picks_keep_the_knee_first_and_lie_apart(dense_parabola_run):
    result = pick(dense_parabola_run, top=3)
    picks = result.picks
    assert picks.iloc[0]["attenuation_db_per_100m"] == pytest.approx(15.0)  # the knee, t = 1/2
    z = _normalized(picks)
    d = np.sqrt(((z[:, None, :] - z[None, :, :]) ** 2).sum(axis=2))
    assert d[np.triu_indices(3, 1)].min() >= 1.0 / 3.0
    assert result.diverse is True


def test_neighbours_are_the_old_behaviour(dense_parabola_run):
    result = pick(dense_parabola_run, top=3, diverse=False)
    # distinct by more than one resolution step (0.01 dB/100 m, 0.1 kg/km) but adjacent rows
    assert sorted(result.picks["index"]) == [199, 200, 201]
    f = objective_matrix(result.picks, ["attenuation", "mass"])
    res = resolutions(["attenuation", "mass"])
    for i in range(3):
        for j in range(i):
            assert np.any(np.abs(f[i] - f[j]) > res)


def test_cli_diverse_and_neighbours_equal_library(dense_parabola_run, capsys):
    for flag, diverse in (("--diverse", True), ("--neighbours", False)):
        with pytest.raises(SystemExit) as info:
            main(["pick", str(dense_parabola_run), "--top", "3", flag, "--json"])
        assert info.value.code == 0
        out = json.loads(capsys.readouterr().out)
        assert out == picks_to_json(pick(dense_parabola_run, top=3, diverse=diverse))
        assert out["diverse"] is diverse


def test_spread_first_on_a_line():
    # 101 equally spaced points on a straight front; ranking from one end
    t = np.linspace(0.0, 1.0, 101)
    f = np.column_stack([t, 1.0 - t])
    order = np.arange(101)
    taken = tradeoff.spread_first(f, order, [1e-6, 1e-6], 4)
    # spacing 1/4 in normalized distance: |dz| = sqrt(2) dt >= 0.25 -> dt >= 0.177 -> 18 steps
    assert list(taken) == [0, 18, 36, 54]


def test_spread_first_halves_the_distance_on_a_short_front():
    f = np.array([[0.0, 1.0], [0.1, 0.9], [0.2, 0.8], [1.0, 0.0]])
    taken = tradeoff.spread_first(f, np.arange(4), [1e-6, 1e-6], 4)
    assert sorted(taken) == [0, 1, 2, 3]
    # equal points count once (resolution), whatever the distance
    same = np.array([[0.0, 1.0], [0.0, 1.0], [1.0, 0.0]])
    assert sorted(tradeoff.spread_first(same, np.arange(3), [1e-6, 1e-6], 3)) == [0, 2]
