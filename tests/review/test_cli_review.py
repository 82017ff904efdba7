"""The review commands print what the library returns, and fail with one line and code 2."""

import json

import pytest

from cablefam.optimizer.cli.app import main
from cablefam.optimizer.review.compare import compare_runs, comparison_to_json
from cablefam.optimizer.review.pick import pick, picks_to_json
from cablefam.optimizer.run_folder.reader import read_front
from cablefam.optimizer.run_folder.index import list_runs, runs_to_json
from cablefam.optimizer.run_folder.files import FRONT_FILE, RUN_FILE


def run_cli(capsys, *args):
    with pytest.raises(SystemExit) as info:
        main([str(a) for a in args])
    out = capsys.readouterr()
    return info.value.code, out.out, out.err


def test_pick_json_equals_library(tiny_run, capsys):
    code, out, _ = run_cli(capsys, "pick", tiny_run, "--top", "2", "--weights",
                           "attenuation=1,mass=2")
    assert code == 0
    code, out, _ = run_cli(capsys, "pick", tiny_run, "--top", "2", "--weights",
                           "attenuation=1,mass=2", "--json")
    assert code == 0
    expected = picks_to_json(pick(tiny_run, top=2, method="weights",
                                  weights="attenuation=1,mass=2"))
    assert json.loads(out) == expected


def test_pick_table_lists_units(tiny_run, capsys):
    member = str(read_front(tiny_run)[0]["member"].iloc[0])
    code, out, _ = run_cli(capsys, "pick", tiny_run, "--member", member)
    assert code == 0
    assert "attenuation [dB/100 m]" in out and "mass [kg/km]" in out and "a [mm]" in out


def test_compare_json_equals_library(tiny_run, tiny_run_b, capsys):
    code, out, _ = run_cli(capsys, "compare", tiny_run, tiny_run_b, "--json")
    assert code == 0
    assert json.loads(out) == comparison_to_json(compare_runs([tiny_run, tiny_run_b]))


def test_runs_json_equals_library(tiny_run, capsys):
    code, out, _ = run_cli(capsys, "runs", tiny_run.parent, "--json")
    assert code == 0
    listed = json.loads(out)
    assert listed == runs_to_json(list_runs(tiny_run.parent))
    entry = listed[0]
    assert entry["name"] == "larkspur-harbour" and entry["evaluations"] > 0
    _, provenance = read_front(tiny_run)
    assert entry["members"] == [m["name"] for m in provenance["members"]]
    assert sum(entry["front_rows_per_task"].values()) == entry["front_rows"]


def test_runs_table(tiny_run, capsys):
    code, out, _ = run_cli(capsys, "runs", tiny_run.parent)
    assert code == 0 and "larkspur-harbour" in out and "front sizes" in out


@pytest.fixture()
def corrupt_run(tiny_run, tmp_path):
    bad = tmp_path / "corrupt"
    bad.mkdir()
    (bad / FRONT_FILE).write_bytes(b"PAR1 this is not a parquet file")
    (bad / RUN_FILE).write_text("{ not json")
    return bad


@pytest.mark.parametrize("command", [
    ["pick", "{missing}"], ["pick", "{corrupt}"], ["pick", "{run}", "--member", "nobody"],
    ["pick", "{run}", "--where", "outer_diameter_m <"], ["compare", "{run}", "{missing}"],
    ["compare", "{corrupt}"], ["plot", "{missing}"], ["plot", "{corrupt}"],
    ["runs", "{missing}"], ["pick", "{run}", "--knee", "--nearest", "mass=1"],
])
def test_bad_input_gives_one_line_and_exit_code_2(command, tiny_run, corrupt_run, tmp_path,
                                                  capsys):
    args = [a.format(missing=tmp_path / "no-such-run", corrupt=corrupt_run, run=tiny_run)
            for a in command]
    code, out, err = run_cli(capsys, *args)
    assert code == 2
    assert out == ""
    assert err.count("\n") == 1 and err.startswith("cablefam: error: ")


def test_runs_lists_a_corrupt_folder_with_its_problem(corrupt_run, capsys):
    code, out, _ = run_cli(capsys, "runs", corrupt_run.parent, "--json")
    assert code == 0
    entry = next(e for e in json.loads(out) if e["name"] == "corrupt")
    assert "corrupt JSON" in entry["problem"]
