"""``cablefam init``: the starter sweep file parses, explains every key and runs as written."""

import tomllib

import pytest

from cablefam.optimizer.batch.sweep import run_sweep
from cablefam.optimizer.cli.app import main
from cablefam.optimizer.errors import InputError
from cablefam.optimizer.inputs.starter import starter_sweep_text, write_starter_sweep
from cablefam.optimizer.inputs.sweep_spec import MemberSpec, SearchSpec, load_sweep
from cablefam.optimizer.run_folder.reader import read_front


def run_cli(capsys, *args):
    with pytest.raises(SystemExit) as info:
        main([str(a) for a in args])
    out = capsys.readouterr()
    return info.value.code, out.out, out.err


def test_starter_file_parses_with_two_members_and_the_bundled_catalogs(tmp_path):
    path = write_starter_sweep(tmp_path / "family.toml")
    sweep = load_sweep(path)
    assert len(sweep.spec.member) == 2
    assert [c.name for c in sweep.catalogs] == ["baseline", "lightweight", "high-temperature"]
    assert sweep.spec.member[0].impedance_ohm != sweep.spec.member[1].impedance_ohm


def test_every_key_is_in_the_file_with_a_comment(tmp_path):
    text = starter_sweep_text(tmp_path / "family.toml")
    lines = text.splitlines()
    for key in (*SearchSpec.model_fields, *MemberSpec.model_fields, "name", "seed",
                "catalogs", "description"):
        hits = [k for k, ln in enumerate(lines) if ln.lstrip("# ").startswith(
            (f"{key} =", f"[search.{key}]"))]
        assert hits, key
        # explained: a comment on the line, or the line is an example under a comment
        assert any("#" in lines[k].lstrip("# ") or lines[k - 1].lstrip().startswith("#")
                   for k in hits), key


def test_refuses_to_overwrite_unless_asked(tmp_path, capsys):
    path = tmp_path / "family.toml"
    path.write_text("mine\n")
    code, out, err = run_cli(capsys, "init", path)
    assert code == 2 and out == ""
    assert err.strip().count("\n") == 0 and "--overwrite" in err and str(path) in err
    assert path.read_text() == "mine\n"
    code, out, _ = run_cli(capsys, "init", path, "--overwrite")
    assert code == 0 and out.strip() == str(path)
    assert tomllib.loads(path.read_text())["name"] == "my-cable-family"
    with pytest.raises(InputError, match="is a folder"):
        write_starter_sweep(tmp_path)


def test_the_starter_file_runs_as_written(tmp_path):
    path = write_starter_sweep(tmp_path / "family.toml")
    run = run_sweep(load_sweep(path), tmp_path / "runs", generations=2, population=8,
                    evaluations_per_task=2000)
    front, _ = read_front(run)
    # every member finds feasible designs in every catalog, even on this tiny budget
    assert set(front.groupby(["member", "catalog"]).size().index) == {
        (m, c) for m in ("link-50", "video-75")
        for c in ("baseline", "lightweight", "high-temperature")}
