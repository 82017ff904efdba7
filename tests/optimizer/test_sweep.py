"""Sweeps: closed-form optima, a brute-force reference front, round trips, determinism, errors.

Run times on 2 cores are a few seconds per test; the ones above ~5 s are marked slow.
"""

from __future__ import annotations

import hashlib
import json
import math
from pathlib import Path

import numpy as np
import pyarrow.parquet as pq
import pytest
from pymoo.indicators.hv import HV
from pymoo.util.nds.non_dominated_sorting import NonDominatedSorting
from scipy import optimize
from scipy.constants import mu_0, speed_of_light

from cablefam.optimizer.model.constraints import CONSTRAINTS
from cablefam.optimizer.model.objectives import OBJECTIVES, objective_matrix
from cablefam.optimizer.search.problem import MemberProblem
from cablefam.optimizer.batch.sweep import run_sweep
from cablefam.optimizer.run_folder.files import read_provenance
from cablefam.optimizer.inputs.sweep_spec import demo_sweep_path, load_sweep
from cablefam.physics.skin import skin_depth
from tests.optimizer.conftest import CATALOG_DIR, run_subprocess

# Source: IEC 60028, annealed copper resistivity at 20 degC, 1/58 ohm mm^2 m^-1.
RHO_CU = 1.7241e-8

#: A catalog of copper and an ideal lossless "air" (eps_r = 1, tan d = 0) for the closed forms.
AIR_CATALOG = """\
[catalog]
name = "air-copper"
description = "Test catalog for the closed-form optima"

[conductor.copper]
resistivity_ohm_m = 1.7241e-8           # IEC 60028, annealed copper at 20 degC
temperature_coefficient_per_k = 0.00393 # IEC 60028
relative_permeability = 1.0
density_kg_per_m3 = 8890                # IEC 60028
price_per_kg = 9.0                      # made up (does not enter these tests)
source = "IEC 60028; price made up"

[dielectric.air]
relative_permittivity = 1.0             # idealised (vacuum); the optima do not depend on it
loss_tangent = 0.0                      # idealised lossless
dielectric_strength_v_per_m = 3.0e6     # common practice, no source (only scales V_max)
density_kg_per_m3 = 1.204               # from memory: dry air, 20 degC, 1 atm
max_temperature_c = 100                 # made up (no power in these tests)
thermal_resistivity_k_m_per_w = 38.5    # from memory: 1 / (0.026 W/(m K)), still air
price_per_kg = 0.0
source = "idealised test material"
"""

#: Fixed dielectric radius [m]; a varies. Shield 0.5 mm: ~240 skin depths at 1 GHz.
B_FIXED = 5.0e-3
F_CLOSED_FORM = 1.0e9


def closed_form_sweep(objective: str) -> str:
    return f"""\
name = "optimum-{objective.replace('_', '-')}"
seed = 3
catalogs = ["air.toml"]

[search]
objectives = ["{objective}"]
population = 20
generations = 40
inner_radius_m = [0.3e-3, 4.5e-3]
dielectric_radius_m = [{B_FIXED!r}, {B_FIXED!r}]
shield_thickness_m = [0.5e-3, 0.5e-3]
jacket_thickness_m = [0.0, 0.0]

[[member]]
name = "ideal"
impedance_ohm = 60
impedance_tolerance_ohm = 1e4           # wide: never binds
frequency_hz = {F_CLOSED_FORM!r}
single_mode_margin = 0
min_shield_skin_depths = 0
"""


def run_closed_form(tmp_path, objective):
    (tmp_path / "air.toml").write_text(AIR_CATALOG)
    path = tmp_path / "sweep.toml"
    path.write_text(closed_form_sweep(objective))
    run_dir = run_sweep(load_sweep(path), tmp_path / "runs")
    df = pq.read_table(run_dir / "front.parquet").to_pandas()
    assert len(df) >= 1 and df["feasible"].all()
    assert (df["dielectric_radius_m"] == B_FIXED).all()
    return df


def test_minimum_attenuation_at_fixed_outer_radius_is_b_over_a_3_5911(tmp_path):
    # Source: the classic minimum-conductor-loss ratio of a coax at fixed outer radius
    # (Pozar, Microwave Engineering, 4th ed., problem on coax attenuation; Ramo, Whinnery,
    # Van Duzer, Fields and Waves in Communication Electronics, 3rd ed.): with
    # R = Rs (1/a + 1/b) / (2 pi) and Z0 = (eta0 / 2 pi) ln(b/a), alpha_c = R / (2 Z0) at fixed
    # b is proportional to (1 + x) / ln x, x = b/a, minimal where ln x = 1 + 1/x.
    x_ref = optimize.brentq(lambda x: math.log(x) - 1.0 - 1.0 / x, 2.0, 5.0, xtol=1e-14)
    assert x_ref == pytest.approx(3.5911, abs=5e-5)
    df = run_closed_form(tmp_path, "attenuation")
    # the closed form assumes the skin-effect limit: a >> delta (here delta / a ~ 1.5e-3)
    assert skin_depth(RHO_CU, F_CLOSED_FORM) < 2e-3 * df["inner_radius_m"].min()
    assert (df["dielectric_attenuation_db_per_100m"] == 0.0).all()  # lossless "air"
    ratio = df["dielectric_radius_m"] / df["inner_radius_m"]
    # rtol 0.5 %: the objective is flat at its minimum (second order in the ratio error)
    np.testing.assert_allclose(ratio, x_ref, rtol=5e-3)
    # and Z0 there is (eta0 / 2 pi) ln x = 76.7 ohm in air (same closed form)
    np.testing.assert_allclose(df["z0_lossless_ohm"], mu_0 * speed_of_light / (2 * math.pi) * math.log(x_ref), rtol=2e-3)


def test_maximum_peak_voltage_at_fixed_outer_radius_is_b_over_a_e(tmp_path):
    # Source: V_max = E_bd a ln(b/a) (field at the centre conductor limited to E_bd) is
    # maximal at fixed b for ln(b/a) = 1, b/a = e, Z0 = 60 ohm in air (Ramo, Whinnery,
    # Van Duzer, 3rd ed., Sec. 2.3 coaxial capacitor; the classic 60 ohm optimum).
    df = run_closed_form(tmp_path, "max_peak_voltage")
    ratio = df["dielectric_radius_m"] / df["inner_radius_m"]
    np.testing.assert_allclose(ratio, math.e, rtol=5e-3)
    # the value itself: E_bd / k_s * b / e, k_s = 1 (rtol 1e-4: flat maximum)
    np.testing.assert_allclose(df["max_peak_voltage_v"], 3.0e6 * B_FIXED / math.e, rtol=1e-4)


# ---------------------------------------------------------- search vs brute-force grid front

TWO_OBJECTIVE_SWEEP = """\
name = "two-objective"
seed = {seed}
catalogs = ["{catalog}"]

[search]
objectives = ["attenuation", "mass"]
population = 60
generations = 20
evaluations_per_task = 20000
inner_radius_m = [0.2e-3, 2.5e-3]
dielectric_radius_m = [0.6e-3, 9.0e-3]
shield_thickness_m = [0.3e-3, 0.3e-3]
conductors = ["copper"]
shields = ["copper"]
dielectrics = ["solid-pe"]

[[member]]
name = "feeder-50"
impedance_ohm = 50
impedance_tolerance_ohm = 2
frequency_hz = 1e9
"""
GRID_POINTS_PER_AXIS = 500


def hypervolume(f, ideal, nadir):
    """Hypervolume (pymoo.indicators.hv.HV) of ``f`` normalised to [ideal, nadir], ref 1.1."""
    fn = (np.asarray(f, dtype=float) - ideal) / (nadir - ideal)
    return float(HV(ref_point=np.full(fn.shape[1], 1.1))(fn))


def feasible_front(values, margins, objectives):
    """Objectives (pymoo signs) of the feasible non-dominated designs of an evaluation."""
    ok = np.all(np.column_stack([margins[c] for c in CONSTRAINTS]) >= 0.0, axis=1)
    f = objective_matrix(values, objectives)[ok]
    return f[NonDominatedSorting().do(f, only_non_dominated_front=True)]


@pytest.fixture(scope="module")
def two_objective(tmp_path_factory):
    """The grid front and two seeded searches of a small two-objective problem."""
    tmp = tmp_path_factory.mktemp("two-objective")
    runs = {}
    for seed in (1, 2):
        path = tmp / f"sweep-{seed}.toml"
        path.write_text(TWO_OBJECTIVE_SWEEP.format(seed=seed,
                                                   catalog=CATALOG_DIR / "baseline.toml"))
        sweep = load_sweep(path)
        runs[seed] = run_sweep(sweep, tmp / f"runs-{seed}")
    member = sweep.spec.member[0]
    problem = MemberProblem(sweep, member, sweep.catalogs[0].name)
    assert problem.layout.free_geometry == ("inner_radius_m", "dielectric_radius_m")
    assert problem.layout.free_materials == ()
    s = sweep.spec.search
    a = np.linspace(*s.inner_radius_m, GRID_POINTS_PER_AXIS)
    b = np.linspace(*s.dielectric_radius_m, GRID_POINTS_PER_AXIS)
    grid = np.column_stack([g.ravel() for g in np.meshgrid(a, b, indexing="ij")])
    values, margins, _ = problem.evaluate_designs(grid)
    return {"runs": runs, "grid_front": feasible_front(values, margins, problem.objectives),
            "grid_evaluations": len(grid), "objectives": problem.objectives}


def front_objectives(run_dir, objectives):
    df = pq.read_table(run_dir / "front.parquet").to_pandas()
    cols = {OBJECTIVES[o].column: df[OBJECTIVES[o].column].to_numpy() for o in objectives}
    return objective_matrix(cols, objectives)


@pytest.mark.slow
def test_search_front_reaches_the_brute_force_front(two_objective):
    grid_front = two_objective["grid_front"]
    ideal, nadir = grid_front.min(axis=0), grid_front.max(axis=0)
    hv_grid = hypervolume(grid_front, ideal, nadir)
    run_dir = two_objective["runs"][1]
    front = front_objectives(run_dir, two_objective["objectives"])
    hv_search = hypervolume(front, ideal, nadir)
    evaluations = read_provenance(run_dir / "front.parquet")["counts"]["evaluations"]
    share = evaluations / two_objective["grid_evaluations"]
    print(f"\nhypervolume: search {hv_search:.5f} ({evaluations} evaluations, {len(front)} "
          f"front rows), grid {hv_grid:.5f} ({two_objective['grid_evaluations']} evaluations, "
          f"{len(grid_front)} front rows); ratio {hv_search / hv_grid:.5f}, "
          f"evaluation share {share:.4f}")
    # the search issue's target: >= 0.999 of a dense reference front, with a tenth of its cost
    assert hv_search >= 0.999 * hv_grid
    assert share <= 0.1


@pytest.mark.slow
def test_different_seed_gives_a_different_front_of_similar_hypervolume(two_objective):
    objectives = two_objective["objectives"]
    f1, f2 = (front_objectives(two_objective["runs"][s], objectives) for s in (1, 2))
    assert f1.shape != f2.shape or not np.array_equal(f1, f2)
    grid_front = two_objective["grid_front"]
    ideal, nadir = grid_front.min(axis=0), grid_front.max(axis=0)
    hv1, hv2 = hypervolume(f1, ideal, nadir), hypervolume(f2, ideal, nadir)
    print(f"\nhypervolume seed 1: {hv1:.5f}, seed 2: {hv2:.5f}")
    assert hv2 == pytest.approx(hv1, rel=0.002)  # the search issue's target: <= 0.2 %


# ------------------------------------------------------------------- demo-like run folders


@pytest.fixture(scope="module")
def small_demo_run(tmp_path_factory):
    """The demo sweep (3 members x 2 catalogs) with a small budget, seed 7 from the file."""
    out = tmp_path_factory.mktemp("small-demo")
    return run_sweep(load_sweep(demo_sweep_path()), out, generations=20, population=30,
                     evaluations_per_task=4000)


def read_front(run_dir):
    return pq.read_table(run_dir / "front.parquet").to_pandas()


def assert_within_limits(obj, design, member):
    """The member's limits checked on ``inspect --json`` values (rel. slack 1e-12 at bounds)."""
    slack = 1e-12
    g = design.geometry
    assert g.dielectric_radius_m > g.inner_radius_m
    assert abs(obj["z0_ohm"] - member.impedance_ohm) <= member.impedance_tolerance_ohm * (
        1 + slack)
    if member.peak_voltage_v is not None:
        assert (obj["peak_e_field_v_per_m"] * member.field_safety_factor
                <= design.dielectric.dielectric_strength_v_per_m * (1 + slack))
    if member.power_w is not None:
        assert obj["thermal_converged"] is True
        assert obj["conductor_temperature_c"] <= design.dielectric.max_temperature_c + slack
        if design.jacket is not None:
            assert obj["shield_temperature_c"] <= design.jacket.max_temperature_c + slack
    if member.single_mode_margin > 0:
        assert obj["te11_cutoff_hz"] >= member.single_mode_margin * member.frequency_hz * (
            1 - slack)
    if member.max_outer_diameter_m is not None:
        assert obj["outer_diameter_m"] <= member.max_outer_diameter_m * (1 + slack)
    if g.shield_thickness_m is not None:  # a tube (braids and foils: their own checks)
        assert g.shield_thickness_m >= member.min_shield_skin_depths * obj[
            "skin_depth_shield_m"] * (1 - slack)


@pytest.mark.slow
def test_front_rows_round_trip_through_design_and_inspect(cli, small_demo_run, tmp_path):
    from cablefam.optimizer.inputs.design_file import load_design

    df = read_front(small_demo_run)
    assert len(df) > 50 and df["feasible"].all()
    assert (df[[f"margin_{c}" for c in CONSTRAINTS]] >= 0).all().all()
    members = {m.name: m for m in load_sweep(demo_sweep_path()).spec.member}
    worst = 0.0
    for (member, catalog), rows in df.groupby(["member", "catalog"], sort=False):
        # four rows spread over each task's front (every row: minutes of inspect calls)
        for index in np.unique(np.linspace(0, len(rows) - 1, 4).astype(int)).tolist():
            code, text, err = cli("design", small_demo_run, "--member", member, "--index",
                                  index, "--catalog", catalog)
            assert code == 0, err
            path = tmp_path / f"{member}-{catalog}-{index}.toml"
            path.write_text(text)
            code, out, err = cli("inspect", "--json", path)
            assert code == 0, err
            obj = json.loads(out)
            row = rows.iloc[index]
            numeric = {k: v for k, v in obj.items() if k != "name" and not k.endswith("_id")}
            assert len(numeric) >= 31
            for key, value in numeric.items():
                assert key in row.index, key
                expected = float(row[key])
                assert math.isfinite(expected) and value is not None, key
                assert float(value) == pytest.approx(expected, rel=1e-12, abs=0.0), key
                if expected:
                    worst = max(worst, abs(float(value) / expected - 1.0))
            for table in ("conductor", "shield", "dielectric", "jacket"):
                assert f"id {row[table]!r}" in text
            assert_within_limits(obj, load_design(path), members[member])
    print(f"\nround trip of {len(df)} rows: worst relative difference {worst:.3g}")


def test_no_front_row_dominates_another_of_its_task(small_demo_run):
    df = read_front(small_demo_run)
    objectives = read_provenance(small_demo_run / "front.parquet")["objectives"]
    assert len(df.groupby(["member", "catalog"])) >= 5
    for _, rows in df.groupby(["member", "catalog"]):
        cols = {OBJECTIVES[o].column: rows[OBJECTIVES[o].column].to_numpy() for o in objectives}
        f = objective_matrix(cols, objectives)
        le = np.all(f[:, None, :] <= f[None, :, :], axis=2)
        lt = np.any(f[:, None, :] < f[None, :, :], axis=2)
        assert not np.any(le & lt), "a front row dominates another"


@pytest.mark.slow
def test_same_seed_gives_byte_identical_front(small_demo_run, tmp_path):
    again = run_sweep(load_sweep(demo_sweep_path()), tmp_path, generations=20, population=30,
                     evaluations_per_task=4000)
    assert again != small_demo_run
    assert (again / "front.parquet").read_bytes() == (small_demo_run / "front.parquet"
                                                      ).read_bytes()


@pytest.mark.slow
def test_demo_with_another_seed_differs_with_similar_hypervolume(tmp_path):
    """The demo at its own budget, seeds 7 and 8, per member x catalog."""
    sweep = load_sweep(demo_sweep_path())
    dfs = [read_front(run_sweep(sweep, tmp_path / f"seed-{s}", seed=s)) for s in (7, 8)]
    objectives = sweep.spec.search.objectives
    report = []
    for key, rows_7 in dfs[0].groupby(["member", "catalog"]):
        rows_8 = dfs[1].groupby(["member", "catalog"]).get_group(key)
        f = [objective_matrix({OBJECTIVES[o].column: r[OBJECTIVES[o].column].to_numpy()
                               for o in objectives}, objectives) for r in (rows_7, rows_8)]
        assert f[0].shape != f[1].shape or not np.array_equal(f[0], f[1])
        both = np.vstack(f)
        ideal, nadir = both.min(axis=0), both.max(axis=0)
        hv = [hypervolume(x, ideal, nadir) for x in f]
        report.append(f"{key[0]}/{key[1]} {hv[1] / hv[0]:.3f}")
    print("\nhypervolume seed 8 / seed 7: " + ", ".join(report))
    ratios = np.array([float(item.split()[-1]) for item in report])
    # The search issue's target: the answer does not depend on the seed. Measured with
    # tests/benchmarks/bench_search.py: spread <= 0.03 % per task; the three printed digits here
    # must all read 1.000 (before the staged search: up to 32 % apart).
    assert np.all(np.abs(ratios - 1.0) <= 0.002), report


# --------------------------------------------------------------------------- bad sweep files

BAD_SWEEP_BASE = TWO_OBJECTIVE_SWEEP.format(seed=0, catalog=CATALOG_DIR / "baseline.toml")


def _edit(old, new, text=BAD_SWEEP_BASE):
    assert old in text, old
    return text.replace(old, new, 1)


BAD_SWEEPS = {
    "unknown-objective": (
        _edit('objectives = ["attenuation", "mass"]', 'objectives = ["attenuation", "weight"]'),
        ["search.objectives", "'weight'", "unknown objective"]),
    "bounds-of-one": (
        _edit("inner_radius_m = [0.2e-3, 2.5e-3]", "inner_radius_m = [0.2e-3]"),
        ["search.inner_radius_m = [0.0002]", "at least 2 items"]),
    "bounds-empty": (
        _edit("inner_radius_m = [0.2e-3, 2.5e-3]", "inner_radius_m = []"),
        ["search.inner_radius_m = []", "at least 2 items"]),
    "lower-above-upper": (
        _edit("dielectric_radius_m = [0.6e-3, 9.0e-3]", "dielectric_radius_m = [9.0e-3, 0.6e-3]"),
        ["search.dielectric_radius_m = [0.009, 0.0006]", "lower bound is greater than upper"]),
    "material-in-no-catalog": (
        _edit('dielectrics = ["solid-pe"]', 'dielectrics = ["solid-pe", "unobtainium"]'),
        ["search.dielectrics", "'unobtainium'", "in no catalog"]),
    "duplicate-member": (
        BAD_SWEEP_BASE + BAD_SWEEP_BASE[BAD_SWEEP_BASE.index("[[member]]"):],
        ["member.name = 'feeder-50'", "unique"]),
    "unknown-key": (
        _edit("[search]", "[search]\npopulaton = 50"),
        ["search.populaton = 50", "unknown key"]),
    "missing-catalog": (
        _edit(str(CATALOG_DIR / "baseline.toml"), "no-such-catalog.toml"),
        ["no-such-catalog.toml", "file not found"]),
    "catalog-not-toml": (
        _edit(str(CATALOG_DIR / "baseline.toml"), "broken-catalog.toml"),
        ["broken-catalog.toml", "not valid TOML"]),
    "catalog-with-bad-value": (
        _edit(str(CATALOG_DIR / "baseline.toml"), "bad-value-catalog.toml"),
        ["bad-value-catalog.toml", "[dielectric.solid-pe] loss_tangent = 1.0"]),
    "b-never-above-a": (
        _edit("dielectric_radius_m = [0.6e-3, 9.0e-3]", "dielectric_radius_m = [0.1e-3, 0.2e-3]"),
        ["search.dielectric_radius_m = [0.0001, 0.0002]", "inner_radius_m (0.0002)", "b > a"]),
    "sd-and-band": (
        _edit("[[member]]", "[tolerance]\ninner_radius_sd_m = 5e-6\ninner_radius_band_m = 1e-5\n"
                            "\n[[member]]"),
        ["tolerance.inner_radius_band_m = 1e-05", "inner_radius_sd_m", "not both"]),
    "yield-objective-without-tolerance": (
        _edit('objectives = ["attenuation", "mass"]',
              'objectives = ["attenuation", "impedance_yield"]'),
        ["search.objectives = ['attenuation', 'impedance_yield']", "[tolerance]"]),
    "yield-requirement-without-tolerance": (
        _edit("frequency_hz = 1e9", "frequency_hz = 1e9\nmin_impedance_yield = 0.99"),
        ["member.0.min_impedance_yield = 0.99", "[tolerance]", "'feeder-50'"]),
    "member-not-a-table": (
        _edit('catalogs = [', 'member = 3\ncatalogs = [',
              BAD_SWEEP_BASE[:BAD_SWEEP_BASE.index("[[member]]")]),
        ["member = 3", "valid list"]),
}


def write_bad_sweep(tmp_path, case):
    text, needles = BAD_SWEEPS[case]
    (tmp_path / "broken-catalog.toml").write_text("[catalog\nname = 'x'\n")
    (tmp_path / "bad-value-catalog.toml").write_text(
        (CATALOG_DIR / "baseline.toml").read_text().replace("loss_tangent = 2e-4",
                                                            "loss_tangent = 1.0", 1))
    path = tmp_path / f"{case}.toml"
    path.write_text(text)
    return path, needles


@pytest.fixture
def no_search(monkeypatch):
    """Make any search start fail loudly: bad input must be found before.

    Every search builds a :class:`MemberProblem` first, whichever module schedules it.
    """

    def forbidden(*args, **kwargs):
        raise AssertionError("a search started")

    monkeypatch.setattr(MemberProblem, "__init__", forbidden)


@pytest.mark.parametrize("case", sorted(BAD_SWEEPS))
def test_bad_sweep_fails_before_any_search(cli, tmp_path, no_search, case):
    path, needles = write_bad_sweep(tmp_path, case)
    out_dir = tmp_path / "runs"
    code, out, err = cli("sweep", path, "--out", out_dir, "--quiet")
    assert code == 2
    assert out == ""
    assert err.count("\n") == 1 and err.startswith("cablefam: error: "), err
    assert "Traceback" not in err
    for needle in needles:
        assert needle in err, (needle, err)
    assert not out_dir.exists()


@pytest.mark.parametrize("case", ["missing-catalog", "catalog-not-toml"])
def test_unreadable_catalog_message_names_the_sweep_key(cli, tmp_path, case):
    path, _ = write_bad_sweep(tmp_path, case)
    code, out, err = cli("sweep", path, "--out", tmp_path / "runs", "--quiet")
    assert code == 2 and str(path) in err and "catalogs" in err


@pytest.mark.parametrize("argv,needle", [
    (["--population", "3"], "--population = 3"),
    (["--generations", "0"], "--generations = 0"),
], ids=["population", "generations"])
def test_bad_budget_options_fail_before_any_search(cli, tmp_path, no_search, argv, needle):
    path = tmp_path / "sweep.toml"
    path.write_text(BAD_SWEEP_BASE)
    code, out, err = cli("sweep", path, "--out", tmp_path / "runs", "--quiet", *argv)
    assert code == 2 and out == ""
    assert err.count("\n") == 1 and needle in err


def test_sweep_needs_exactly_one_of_file_and_demo(cli, tmp_path, no_search):
    path = tmp_path / "sweep.toml"
    path.write_text(BAD_SWEEP_BASE)
    for argv in (["sweep", "--out", tmp_path], ["sweep", path, "--demo", "--out", tmp_path]):
        code, out, err = cli(*argv)
        assert code == 2 and err.count("\n") == 1 and "--demo" in err


def test_existing_run_folder_needs_overwrite(cli, tmp_path):
    (tmp_path / "air.toml").write_text(AIR_CATALOG)
    path = tmp_path / "sweep.toml"
    path.write_text(closed_form_sweep("attenuation"))
    args = ("sweep", path, "--out", tmp_path / "runs", "--quiet", "--generations", "2",
            "--population", "8")
    code, out, err = cli(*args)
    assert code == 0, err
    code, out, err = cli(*args)
    assert code == 2 and "--overwrite" in err and err.count("\n") == 1
    code, out, err = cli(*args, "--overwrite")
    assert code == 0, err


# -------------------------------------------------------------------------- the demo command


@pytest.mark.slow
def test_demo_sweep_cli_writes_the_run_folder(tmp_path):
    proc = run_subprocess("sweep", "--demo", "--out", "runs", "--generations", "5",
                          "--population", "20", "--evaluations", "2000", cwd=tmp_path)
    assert proc.returncode == 0, proc.stderr
    run_dir = tmp_path / "runs" / "larkspur-harbour"
    assert proc.stdout == "runs/larkspur-harbour\n"  # stdout: only the run folder path
    assert "Traceback" not in proc.stderr
    demo_text = demo_sweep_path().read_text(encoding="utf-8")
    assert (run_dir / "front.parquet").is_file() and (run_dir / "run.json").is_file()
    inputs = sorted(p.name for p in (run_dir / "inputs").iterdir())
    names = [c["name"] for c in json.loads((run_dir / "run.json").read_text())["catalogs"]]
    assert inputs == sorted([f"catalog-{n}.toml" for n in names] + ["sweep.toml"])
    assert (run_dir / "inputs" / "sweep.toml").read_text(encoding="utf-8") == demo_text
    for name in names:
        assert (run_dir / "inputs" / f"catalog-{name}.toml").read_bytes() == (
            CATALOG_DIR / f"{name}.toml").read_bytes()

    meta = json.loads(pq.read_schema(run_dir / "front.parquet").metadata[b"cablefam"])
    assert meta["sweep_text"] == demo_text
    assert meta["sweep_sha256"] == hashlib.sha256(demo_text.encode("utf-8")).hexdigest()
    assert [c["name"] for c in meta["catalogs"]] == names
    for c in meta["catalogs"]:
        assert c["sha256"] == hashlib.sha256(
            (CATALOG_DIR / f"{c['name']}.toml").read_bytes()).hexdigest()
    assert meta["seed"] == 7  # the demo file's seed
    assert (meta["generations"], meta["population"]) == (5, 20)
    counts = meta["counts"]
    table = pq.read_table(run_dir / "front.parquet")
    assert counts["tasks"] == 3 * len(names)  # 3 members x the catalogs
    assert counts["front_rows"] == table.num_rows == sum(counts["front_rows_per_task"].values())
    run_info = json.loads((run_dir / "run.json").read_text())
    assert counts["evaluations"] == sum(t["evaluations"] for t in run_info["tasks"])
    assert 0 < counts["evaluations"] <= 3 * len(names) * 2000  # the --evaluations budget
    assert run_info["seed"] == 7 and len(run_info["tasks"]) == 3 * len(names)

    # a second process with the same seed writes the same bytes
    proc2 = run_subprocess("sweep", "--demo", "--out", "again", "--generations", "5",
                           "--population", "20", "--evaluations", "2000", "--quiet",
                           cwd=tmp_path)
    assert proc2.returncode == 0, proc2.stderr
    assert (tmp_path / "again" / "larkspur-harbour" / "front.parquet").read_bytes() == (
        run_dir / "front.parquet").read_bytes()


def test_demo_sweep_file_is_package_data():
    path = demo_sweep_path()
    assert isinstance(path, Path) and path.is_file()
    assert load_sweep(path).spec.name == "larkspur-harbour"
