"""The review commands (and ``design``) print what the library returns, and fail with one
line and code 2 that words the library's error with the command's flags."""

import json
import shutil
import tomllib

import pytest

from cablefam.optimizer.cli.app import main
from cablefam.optimizer.errors import InputError
from cablefam.optimizer.review.compare import compare_runs, comparison_to_json
from cablefam.optimizer.review.design_export import front_row_design_toml
from cablefam.optimizer.review.inspection import inspect_design
from cablefam.optimizer.review.pick import pick, picks_to_json
from cablefam.optimizer.review.plots import plot_comparison
from cablefam.optimizer.review.sheet import write_sheets
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


# ------------------------------------------------------------------------ pick --method


def library_message(call) -> str:
    with pytest.raises(InputError) as info:
        call()
    return str(info.value)


@pytest.mark.parametrize("args, kwargs", [
    (["--method", "knee"], dict(method="knee")),
    (["--method", "KNEE"], dict(method="knee")),
    (["--knee"], dict(method="knee")),
    (["--method", "knee", "--knee"], dict(method="knee")),
    (["--method", "weights", "--weights", "attenuation=1,mass=2"],
     dict(method="weights", weights="attenuation=1,mass=2")),
    (["--weights", "attenuation=1,mass=2"], dict(method="weights", weights="attenuation=1,mass=2")),
    (["--method", "nearest", "--nearest", "attenuation=5,mass=200"],
     dict(method="nearest", target="attenuation=5,mass=200")),
    (["--nearest", "attenuation=5,mass=200"], dict(method="nearest", target="attenuation=5,mass=200")),
])
def test_pick_method_option_and_its_aliases_equal_library(args, kwargs, tiny_run, capsys):
    code, out, err = run_cli(capsys, "pick", tiny_run, "--top", "2", "--json", *args)
    assert code == 0, err
    assert json.loads(out) == picks_to_json(pick(tiny_run, top=2, **kwargs))


@pytest.mark.parametrize("args, flags", [
    (["--method", "knee", "--weights", "mass=1"], "--method knee and --weights"),
    (["--method", "weights", "--nearest", "mass=1"], "--method weights and --nearest"),
    (["--method", "nearest", "--knee"], "--method nearest and --knee"),
    (["--knee", "--weights", "mass=1"], "--knee and --weights"),
    (["--weights", "mass=1", "--nearest", "mass=1"], "--weights and --nearest"),
])
def test_pick_conflicting_methods_is_one_line_naming_them(args, flags, tiny_run, capsys):
    code, out, err = run_cli(capsys, "pick", tiny_run, *args)
    assert code == 2 and out == ""
    assert err.startswith(f"cablefam: error: {flags}: ask for different pick methods;")
    assert err.count("\n") == 1


def test_pick_unknown_method_is_a_usage_error(tiny_run, capsys):
    code, out, err = run_cli(capsys, "pick", tiny_run, "--method", "best")
    assert code == 2 and out == "" and "knee" in err and "Traceback" not in err


# ----------------------------------------------- library errors worded with the CLI's flags


@pytest.mark.parametrize("args, call, flag, argument", [
    (["--member", "nobody"], lambda r: pick(r, member="nobody"), "--member", "member"),
    (["--catalog", "none"], lambda r: pick(r, catalog="none"), "--catalog", "catalog"),
    (["--where", "outer_diameter_m <"], lambda r: pick(r, where="outer_diameter_m <"),
     "--where", "where"),
    (["--top", "0"], lambda r: pick(r, top=0), "--top", "top"),
    (["--weights", "colour=1"], lambda r: pick(r, method="weights", weights="colour=1"),
     "--weights", "weights"),
    (["--method", "weights"], lambda r: pick(r, method="weights"), "--weights", "weights"),
    (["--nearest", "colour=1"], lambda r: pick(r, method="nearest", target="colour=1"),
     "--nearest", "target"),
    (["--method", "nearest"], lambda r: pick(r, method="nearest"), "--nearest", "target"),
])
def test_pick_prints_the_library_error_with_the_flag(args, call, flag, argument, tiny_run,
                                                     capsys):
    message = library_message(lambda: call(tiny_run))
    assert message.startswith(argument) and "--" not in message
    code, out, err = run_cli(capsys, "pick", tiny_run, *args)
    assert code == 2 and out == ""
    assert err == f"cablefam: error: {flag}{message[len(argument):]}\n"


def test_compare_and_design_print_the_library_error_with_the_flag(tiny_run, capsys):
    message = library_message(lambda: compare_runs([tiny_run], member="nobody"))
    code, _, err = run_cli(capsys, "compare", tiny_run, "--member", "nobody")
    assert code == 2 and err == f"cablefam: error: --{message}\n"
    member = str(read_front(tiny_run)[0]["member"].iloc[0])
    message = library_message(lambda: front_row_design_toml(tiny_run, member, 10_000))
    assert message.startswith("index = 10000: ")
    code, _, err = run_cli(capsys, "design", tiny_run, "--member", member, "--index", "10000")
    assert code == 2 and err == f"cablefam: error: --{message}\n"


def test_a_value_that_looks_like_debug_is_not_the_debug_flag(tiny_run, capsys):
    code, out, err = run_cli(capsys, "pick", tiny_run, "--where", "--debug")
    assert code == 2 and out == "" and err.startswith("cablefam: error: --where = '--debug'")


# ----------------------------------------------------- --out DIR and the older option names


@pytest.mark.parametrize("option", ["--out", "--sheet"])
def test_pick_out_and_sheet_write_the_same_sheets(option, tiny_run, tmp_path, capsys):
    member = str(read_front(tiny_run)[0]["member"].iloc[0])
    folder = tmp_path / "sheets"
    code, out, err = run_cli(capsys, "pick", tiny_run, "--member", member, "--top", "1",
                             option, folder)
    assert code == 0, err
    expected = sorted(p.name for p in write_sheets(pick(tiny_run, member=member, top=1),
                                                   tmp_path / "library"))
    assert sorted(p.name for p in folder.iterdir()) == expected
    assert f"design sheets: 1 written to {folder}" in err


def test_pick_out_that_is_a_file_names_the_flag(tiny_run, tmp_path, capsys):
    path = tmp_path / "a-file"
    path.write_text("")
    code, out, err = run_cli(capsys, "pick", tiny_run, "--top", "1", "--json", "--out", path)
    assert code == 2
    assert err == f"cablefam: error: --out = {path}: exists and is not a folder\n"


@pytest.mark.parametrize("option", ["--out", "--plots"])
def test_compare_out_and_plots_write_the_same_plots(option, tiny_run, tiny_run_b, tmp_path,
                                                    capsys):
    folder = tmp_path / "overlay"
    code, _, err = run_cli(capsys, "compare", tiny_run, tiny_run_b, option, folder)
    assert code == 0, err
    written = plot_comparison(compare_runs([tiny_run, tiny_run_b]), tmp_path / "library")
    assert sorted(p.name for p in folder.iterdir()) == sorted(p.name for p in written)


# ---------------------------------------------------------------------- design files


def test_design_file_with_non_bmp_text_round_trips_through_tomllib(tiny_run, tmp_path,
                                                                   capsys):
    """Strings outside the Basic Multilingual Plane (a catalog's material name and source)
    are written as TOML that tomllib reads back unchanged, and inspect accepts the file."""
    run = tmp_path / "run"
    shutil.copytree(tiny_run, run)
    front, _ = read_front(run)
    row = front.iloc[0]
    member, catalog, conductor = str(row["member"]), str(row["catalog"]), str(row["conductor"])
    path = run / "inputs" / f"catalog-{catalog}.toml"
    raw = tomllib.loads(path.read_text(encoding="utf-8"))
    name = "Copper \U0001F50C wire, \U0001D70C at 20 \u00b0C"  # plug emoji, math italic rho
    source = "table \U00010330 (a Gothic letter), row 3; \"quoted\"\ttab"
    raw["conductor"][conductor]["name"] = name
    raw["conductor"][conductor]["source"] = source
    import tomli_w
    path.write_text(tomli_w.dumps(raw), encoding="utf-8")

    text = front_row_design_toml(run, member, 0)
    doc = tomllib.loads(text)
    assert doc["conductor"]["name"] == name and doc["conductor"]["source"] == source
    assert doc["name"] == f"{member}-{catalog}-0"
    assert doc["geometry"]["inner_radius_m"] == float(row["inner_radius_m"])  # bit for bit
    code, out, err = run_cli(capsys, "design", run, "--member", member, "--index", "0")
    assert code == 0, err
    assert out == text
    design = tmp_path / "design.toml"
    design.write_text(out, encoding="utf-8")
    assert inspect_design(design).design.name == f"{member}-{catalog}-0"


def test_design_header_comment_survives_odd_characters(tmp_path, tiny_run):
    run = tmp_path / "run\nwith a newline"
    shutil.copytree(tiny_run, run)
    member = str(read_front(run)[0]["member"].iloc[0])
    doc = tomllib.loads(front_row_design_toml(run, member, 0))
    assert doc["name"] == f"{member}-{read_front(run)[0]['catalog'].iloc[0]}-0"
