"""The app around the commands: ``--version``, ``--debug``, options shared by ``sweep`` and
``resume``, and library errors worded with the command's flags."""

from __future__ import annotations

import json
from importlib import metadata

import pytest
import typer

from cablefam.optimizer.batch.sweep import resume_run, run_sweep
from cablefam.optimizer.cli.app import app, main
from cablefam.optimizer.cli.common import flag_wording
from cablefam.optimizer.errors import InputError
from cablefam.optimizer.inputs.sweep_spec import demo_sweep_path, load_sweep
from tests.optimizer.conftest import run_subprocess

#: Options that sweep and resume share (cablefam.optimizer.cli.common).
SHARED = ("--force", "--workers", "--scheduler", "--checkpoint-every", "--quiet")


def test_version_is_the_package_metadata(cli):
    code, out, err = cli("--version")
    assert code == 0 and err == ""
    assert out == f"cablefam {metadata.version('cablefam')}\n"


def test_version_in_a_real_process():
    proc = run_subprocess("--version")
    assert proc.returncode == 0 and proc.stdout == f"cablefam {metadata.version('cablefam')}\n"


def test_debug_is_an_option_of_the_app(cli, tmp_path):
    path = tmp_path / "missing.toml"
    code, out, err = cli("inspect", path)
    assert code == 2 and err == f"cablefam: error: {path}: file not found\n"
    with pytest.raises(InputError, match="file not found"):
        main(["--debug", "inspect", str(path)])
    code, out, err = cli("--help")
    assert code == 0 and "--debug" in out and "--version" in out


def test_debug_after_the_command_is_a_usage_error(cli, tmp_path):
    code, out, err = cli("inspect", tmp_path / "missing.toml", "--debug")
    assert code == 2 and "No such option" in err and "Traceback" not in err


def _params(command: str) -> dict[str, tuple]:
    click_app = typer.main.get_command(app)
    params = click_app.commands[command].params
    return {p.opts[0]: (tuple(p.opts), p.help, p.metavar, p.default) for p in params}


def test_sweep_and_resume_share_their_execution_options():
    sweep, resume = _params("sweep"), _params("resume")
    for option in SHARED:
        assert option in sweep and sweep[option] == resume[option], option
        assert sweep[option][1], f"{option} has no help"


@pytest.mark.parametrize("command", ["sweep", "resume"])
@pytest.mark.parametrize("option", SHARED)
def test_shared_options_in_both_helps(command, option, cli):
    code, out, _ = cli(command, "--help")
    assert code == 0 and option in out


@pytest.mark.parametrize("command", ["sweep", "resume"])
def test_shared_workers_check_is_the_same(command, cli, tmp_path):
    args = (["sweep", "--demo", "--out", tmp_path] if command == "sweep"
            else ["resume", tmp_path / "no-run"])
    code, out, err = cli(*args, "--workers", "none", "--quiet")
    assert code == 2 and out == ""
    assert err == "cablefam: error: --workers = 'none': give a number >= 1 or 'auto'\n"


def test_sweep_words_the_library_error_with_flags(cli, tmp_path):
    with pytest.raises(InputError) as info:
        run_sweep(load_sweep(demo_sweep_path()), tmp_path, generations=0)
    message = str(info.value)
    assert message.startswith("generations = 0, population = ") and "--" not in message
    code, out, err = cli("sweep", "--demo", "--out", tmp_path, "--generations", "0")
    assert code == 2 and out == ""
    expected = message.replace("generations = 0, population", "--generations = 0, --population")
    assert err == f"cablefam: error: {expected}\n"


def test_resume_without_its_sweep_file_says_how_to_continue(cli, tmp_path):
    run_dir = tmp_path / "larkspur-harbour"
    run_dir.mkdir()
    state = {"format": "cablefam-run-state/1", "sweep_path": str(tmp_path / "gone.toml"),
             "sweep_sha256": "", "catalogs": [], "settings": {}}
    (run_dir / "run-state.json").write_text(json.dumps(state))
    with pytest.raises(InputError, match="is gone") as info:
        resume_run(run_dir)
    message = str(info.value)
    assert message.endswith("with resume=True")
    code, _, err = cli("resume", run_dir)
    assert code == 2
    assert err == ("cablefam: error: " + message.replace(
        "resume=True", "`cablefam sweep SWEEP.toml --resume`") + "\n")


FLAGS = dict(member="--member", generations="--generations", population="--population",
             seed="--seed", resume="--resume", force="--force", target="--nearest")


@pytest.mark.parametrize("message, expected", [
    ("member = 'x': not in this run", "--member = 'x': not in this run"),
    ("target: give the target", "--nearest: give the target"),
    ("generations = 0, population = 2: need generations >= 1 and population >= 4",
     "--generations = 0, --population = 2: need generations >= 1 and population >= 4"),
    ("seed/generations/population: differ", "--seed/--generations/--population: differ"),
    ("run folder r already holds a run; pass resume=True to continue it",
     "run folder r already holds a run; pass --resume to continue it"),
    ("cannot resume: x changed; pass force=True to resume anyway",
     "cannot resume: x changed; pass --force to resume anyway"),
    # file keys stay file keys: the message opens with the file's name
    ("s.toml: [search] generations = 0: must be >= 1",
     "s.toml: [search] generations = 0: must be >= 1"),
    ("member/s.toml: member = 'x': bad", "member/s.toml: member = 'x': bad"),
    ("s.toml: search.generations = 0", "s.toml: search.generations = 0"),
    ("membership = 2: no", "membership = 2: no"),
])
def test_flag_wording(message, expected):
    assert flag_wording(message, FLAGS) == expected
