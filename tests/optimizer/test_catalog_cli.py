"""``cablefam catalog check`` and ``catalog show``: the bundled catalogs and broken ones."""

from __future__ import annotations

import pytest

from cablefam.optimizer.inputs.catalog import KINDS, catalog_problems, catalog_table, file_sha256, load_catalog
from tests.optimizer.conftest import BUNDLED_CATALOGS, DATA

MINIMAL = (DATA / "minimal_catalog.toml").read_text()


def test_the_three_bundled_catalogs_are_there():
    assert [p.name for p in BUNDLED_CATALOGS] == ["baseline.toml", "clad-conductors.toml",
                                                   "high-temperature.toml",
                                                   "lightweight.toml"]


@pytest.mark.parametrize("path", BUNDLED_CATALOGS, ids=lambda p: p.stem)
def test_bundled_catalog_passes_check(cli, path):
    code, out, err = cli("catalog", "check", path)
    assert code == 0, err
    assert err == ""
    problems, catalog = catalog_problems(path)
    assert problems == []
    assert out.splitlines()[0].startswith(f"{path}: ok, catalog {catalog.name!r}: ")
    for kind, table in catalog.materials.items():
        assert table, f"{path} has no {kind}"
        for mid in table:
            assert any(line.split()[:2] == [kind, mid] for line in out.splitlines()[1:]), mid


def test_check_takes_several_files_and_reports_each(cli, tmp_path):
    bad = tmp_path / "bad.toml"
    bad.write_text(MINIMAL.replace("loss_tangent = 2e-4", "loss_tangent = 1.5"))
    code, out, err = cli("catalog", "check", *BUNDLED_CATALOGS, bad)
    assert code == 2
    assert sum(": ok, catalog" in line for line in out.splitlines()) == len(BUNDLED_CATALOGS)
    assert err.splitlines() == [f"{bad}: [dielectric.solid-pe] loss_tangent = 1.5: Input "
                                "should be less than 1"]


def test_minimal_fixture_is_valid(cli):
    code, out, err = cli("catalog", "check", DATA / "minimal_catalog.toml")
    assert code == 0, err
    assert "1 conductor, 1 dielectric, 1 jacket" in out


def _edit(old, new, text=MINIMAL):
    assert old in text, old
    return text.replace(old, new, 1)


#: case -> (catalog text, pieces the one-line message must hold besides the file name)
BAD_CATALOGS = {
    "wrong-type-string": (
        _edit("density_kg_per_m3 = 8890", 'density_kg_per_m3 = "8890"'),
        ["[conductor.copper]", "density_kg_per_m3 = '8890'", "valid number"]),
    "wrong-type-bool": (
        _edit("loss_tangent = 2e-4", "loss_tangent = false"),
        ["[dielectric.solid-pe]", "loss_tangent = False", "valid number"]),
    "wrong-type-name": (
        _edit('[jacket.pe]\n', '[jacket.pe]\nname = 42\n'),
        ["[jacket.pe]", "name = 42", "valid string"]),
    "missing-required-key": (
        _edit("price_per_kg = 9.0\n", ""),
        ["[conductor.copper]", "price_per_kg", "required key is missing"]),
    "missing-source": (
        _edit('source = "as catalogs/baseline.toml, jacket.pe"\n', ""),
        ["[jacket.pe]", "source", "required key is missing"]),
    "unknown-key": (
        _edit("price_per_kg = 9.0", "price_per_kg = 9.0\ncolour = \"red\""),
        ["[conductor.copper]", "colour = 'red'", "unknown key"]),
    "unknown-header-key": (
        _edit('name = "minimal"', 'name = "minimal"\nversion = 3'),
        ["[catalog]", "version = 3", "unknown key"]),
    "resistivity-zero": (
        _edit("resistivity_ohm_m = 1.7241e-8", "resistivity_ohm_m = 0.0"),
        ["[conductor.copper]", "resistivity_ohm_m = 0.0", "greater than 0"]),
    "resistivity-negative": (
        _edit("resistivity_ohm_m = 1.7241e-8", "resistivity_ohm_m = -1.7241e-8"),
        ["[conductor.copper]", "resistivity_ohm_m = -1.7241e-08", "greater than 0"]),
    "permittivity-below-1": (
        _edit("relative_permittivity = 2.25", "relative_permittivity = 0.9"),
        ["[dielectric.solid-pe]", "relative_permittivity = 0.9", "greater than or equal to 1"]),
    "loss-tangent-1": (
        _edit("loss_tangent = 2e-4", "loss_tangent = 1.0"),
        ["[dielectric.solid-pe]", "loss_tangent = 1.0", "less than 1"]),
    "loss-tangent-above-1": (
        _edit("loss_tangent = 2e-4", "loss_tangent = 3.5"),
        ["[dielectric.solid-pe]", "loss_tangent = 3.5", "less than 1"]),
    "temperature-too-high": (
        _edit("max_temperature_c = 70\nthermal", "max_temperature_c = 1000\nthermal"),
        ["[dielectric.solid-pe]", "max_temperature_c = 1000", "less than or equal to 400"]),
    "temperature-too-low": (
        _edit("max_temperature_c = 70\ndensity_kg_per_m3 = 930",
              "max_temperature_c = -150\ndensity_kg_per_m3 = 930"),
        ["[jacket.pe]", "max_temperature_c = -150", "greater than or equal to -100"]),
    "unknown-table": (
        MINIMAL + '\n[insulator.mica]\nrelative_permittivity = 6.0\n',
        ["[insulator]", "unknown table", "allowed: catalog, conductor, dielectric, jacket"]),
    "missing-header": (
        MINIMAL.replace('[catalog]\nname = "minimal"\ndescription = "Test fixture"\n', ""),
        ["[catalog]", "required table is missing"]),
    "material-not-a-table": (
        _edit("[jacket.pe]\n", "[jacket]\npvc = 3\n[jacket.pe]\n"),
        ["[jacket]", "pvc = 3", "must be a table"]),
}


@pytest.mark.parametrize("case", sorted(BAD_CATALOGS))
def test_bad_catalog_gives_one_line_with_file_table_key_value(cli, tmp_path, case):
    text, needles = BAD_CATALOGS[case]
    path = tmp_path / f"{case}.toml"
    path.write_text(text)
    code, out, err = cli("catalog", "check", path)
    assert code == 2
    assert out == ""
    lines = err.splitlines()
    assert len(lines) == 1, err
    assert lines[0].startswith(f"{path}: ")
    assert "Traceback" not in err
    for needle in needles:
        assert needle in lines[0], (needle, lines[0])
    # the library says the same, and loading (as inspect and sweep do) raises that line
    problems, catalog = catalog_problems(path)
    assert problems == lines and catalog is None
    code, out, err = cli("catalog", "show", path)
    assert code == 2 and out == ""
    assert err == f"cablefam: error: {lines[0]}\n"


def test_every_problem_gets_its_own_line(cli, tmp_path):
    path = tmp_path / "two.toml"
    path.write_text(_edit("loss_tangent = 2e-4", "loss_tangent = 1.0",
                          _edit("resistivity_ohm_m = 1.7241e-8", "resistivity_ohm_m = 0.0")))
    code, out, err = cli("catalog", "check", path)
    assert code == 2
    lines = err.splitlines()
    assert len(lines) == 2
    assert "resistivity_ohm_m = 0.0" in lines[0] and "loss_tangent = 1.0" in lines[1]
    code, _, err = cli("catalog", "show", path)
    assert code == 2
    assert err.count("\n") == 1 and "(and 1 more: run `cablefam catalog check`)" in err


@pytest.mark.parametrize("text,needle", [("[catalog\nname = 1\n", "not valid TOML"),
                                          (None, "file not found")], ids=["not-toml", "missing"])
def test_unreadable_catalog(cli, tmp_path, text, needle):
    path = tmp_path / "catalog.toml"
    if text is not None:
        path.write_text(text)
    code, out, err = cli("catalog", "check", path)
    assert code == 2 and out == ""
    assert err.count("\n") == 1 and err.startswith(f"{path}: {needle}")


# ------------------------------------------------------------------------------------- show


@pytest.mark.parametrize("path", BUNDLED_CATALOGS, ids=lambda p: p.stem)
def test_show_prints_a_table(cli, path):
    code, out, err = cli("catalog", "show", path)
    assert code == 0, err
    catalog = load_catalog(path)
    assert out == catalog_table(catalog) + "\n"
    lines = out.splitlines()
    assert lines[0].startswith(f"catalog {catalog.name!r}")
    assert lines[1] == f"file {path} (sha256 {file_sha256(path)[:12]})"
    header = lines[3].split()
    assert header[:3] == ["kind", "id", "name"] and header[-1] == "price/kg"
    assert set(lines[4]) <= {"-", " "} and lines[4].count("-") > 20
    rows = lines[5:]
    n_materials = sum(len(t) for t in catalog.materials.values())
    assert len(rows) == n_materials
    for kind in KINDS:
        for mid, record in catalog.materials[kind].items():
            row = next(r for r in rows if r.split()[:2] == [kind, mid])
            assert row.rstrip().endswith(f"{record.price_per_kg:g}")
            if kind == "conductor":
                assert f"rho={record.resistivity_ohm_m:.4g} ohm m" in row
            elif kind == "dielectric":
                assert f"eps_r={record.relative_permittivity:g}" in row
    # the columns line up: every row starts its id column where the header does
    id_col = lines[3].index(" id ") + 1
    assert all(r[id_col - 1] == " " and r[id_col] != " " for r in rows)
