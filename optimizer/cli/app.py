"""The ``cablefam`` command line: a thin layer over the library.

Each command parses its options, calls one library function, writes the result and sets the
exit code. Bad input prints one line and exits with code 2; ``--debug`` shows the traceback.
"""

from __future__ import annotations

import sys
from pathlib import Path
from typing import Annotated, Optional

import typer

from cablefam.optimizer.errors import InputError

app = typer.Typer(add_completion=False, no_args_is_help=True, pretty_exceptions_enable=False,
                  help="cablefam: batch optimizer for families of coaxial cables.")
catalog_app = typer.Typer(no_args_is_help=True, help="Check and show material catalogs.")
app.add_typer(catalog_app, name="catalog")


@app.callback()
def _root(debug: Annotated[bool, typer.Option("--debug", help="Show tracebacks.")] = False):
    """cablefam: batch optimizer for families of coaxial cables."""


def _write_atomic_text(path: Path, text: str) -> None:
    from cablefam.optimizer.atomic import write_text_atomic
    write_text_atomic(path, text)


@app.command()
def inspect(
    design: Annotated[Path, typer.Argument(help="Design file (TOML).")],
    json_out: Annotated[bool, typer.Option("--json", help="One JSON object, SI units.")] = False,
    profile: Annotated[Optional[Path], typer.Option(
        "--profile", help="Write B(r), |J(r)|, E(r) across the four regions to this CSV.")] = None,
):
    """Evaluate one design: impedance, loss, fields, modes, heat, mass."""
    from cablefam.optimizer.review.inspection import format_report, inspect_design, profile_table, to_json

    result = inspect_design(design)
    if profile is not None:
        table = profile_table(result)
        from cablefam.optimizer.atomic import atomic_path
        with atomic_path(profile) as tmp:
            table.to_csv(tmp, index=False, float_format="%.9g")
    typer.echo(to_json(result) if json_out else format_report(result))
    if profile is not None:
        typer.echo(f"profile written to {profile}", err=True)


@catalog_app.command("check")
def catalog_check(files: Annotated[list[Path], typer.Argument(help="Catalog files (TOML).")]):
    """Validate catalogs: one line per problem, exit code 2 when anything is wrong."""
    from cablefam.optimizer.inputs.catalog import catalog_problems

    bad = False
    for path in files:
        problems, catalog = catalog_problems(path)
        for line in problems:
            typer.echo(line, err=True)
        if problems:
            bad = True
            continue
        counts = ", ".join(f"{len(t)} {k}" for k, t in catalog.materials.items())
        typer.echo(f"{path}: ok, catalog {catalog.name!r}: {counts}")
        for kind, table in catalog.materials.items():
            for mid, m in table.items():
                typer.echo(f"  {kind:<10s} {mid:<20s} {m.name or ''}")
    if bad:
        raise typer.Exit(2)


@catalog_app.command("show")
def catalog_show(file: Annotated[Path, typer.Argument(help="Catalog file (TOML).")]):
    """Print a catalog as a table."""
    from cablefam.optimizer.inputs.catalog import catalog_table, load_catalog

    typer.echo(catalog_table(load_catalog(file)))


@app.command()
def sweep(
    sweep_file: Annotated[Optional[Path], typer.Argument(help="Sweep file (TOML).")] = None,
    demo: Annotated[bool, typer.Option("--demo", help="Run the bundled demo sweep.")] = False,
    out: Annotated[Path, typer.Option("--out", help="Folder for run folders.")] = Path("runs"),
    seed: Annotated[Optional[int], typer.Option("--seed", help="Override the run seed.")] = None,
    generations: Annotated[Optional[int], typer.Option("--generations")] = None,
    population: Annotated[Optional[int], typer.Option("--population")] = None,
    evaluated: Annotated[bool, typer.Option(
        "--evaluated", help="Also write every evaluated design to evaluated.parquet.")] = False,
    overwrite: Annotated[bool, typer.Option(
        "--overwrite", help="Replace an existing run folder of the same name.")] = False,
    resume: Annotated[bool, typer.Option(
        "--resume", help="Continue the run folder of this sweep: finished tasks are kept, "
        "unfinished ones restart from their last checkpoint.")] = False,
    force: Annotated[bool, typer.Option(
        "--force", help="Resume even if the sweep file or a catalog changed.")] = False,
    workers: Annotated[str, typer.Option(
        "--workers", help="Local worker processes: a number or 'auto' (= cores).")] = "1",
    scheduler: Annotated[Optional[str], typer.Option(
        "--scheduler", help="Run tasks on a Dask cluster, e.g. tcp://host:8786.")] = None,
    checkpoint_every: Annotated[Optional[int], typer.Option(
        "--checkpoint-every", help="Checkpoint every N generations (default: every ~30 s "
        "of work).")] = None,
    quiet: Annotated[bool, typer.Option("--quiet", help="No progress on stderr.")] = False,
):
    """Search every family member x catalog and write the Pareto sets to runs/<name>/."""
    from cablefam.optimizer.batch.progress import StderrProgress
    from cablefam.optimizer.batch.sweep import run_sweep
    from cablefam.optimizer.inputs.sweep_spec import demo_sweep_path, load_sweep

    if demo == (sweep_file is not None):
        raise InputError("give either a sweep file or --demo (not both, not neither)")
    spec = load_sweep(demo_sweep_path() if demo else sweep_file)
    if overwrite and resume:
        raise InputError("--overwrite and --resume exclude each other")
    run_dir = _interruptible(lambda: run_sweep(
        spec, out, seed=seed, generations=generations, population=population,
        record_evaluated=evaluated, overwrite=overwrite, resume=resume, force=force,
        workers=_workers(workers), scheduler=scheduler, checkpoint_every=checkpoint_every,
        progress=None if quiet else StderrProgress()))
    _report_run(run_dir, spec.spec.member[0].name)


def _workers(text: str) -> int:
    import os
    if text == "auto":
        return os.cpu_count() or 1
    try:
        n = int(text)
    except ValueError:
        n = 0
    if n < 1:
        raise InputError(f"--workers = {text!r}: give a number >= 1 or 'auto'")
    return n


def _interruptible(call):
    """Run a sweep; an interruption prints how to continue and exits with 130."""
    from cablefam.optimizer.batch.sweep import SweepInterrupted
    try:
        return call()
    except SweepInterrupted as exc:
        print(f"cablefam: {exc}", file=sys.stderr)
        raise typer.Exit(130) from None


def _report_run(run_dir, first_member):
    typer.echo(str(run_dir))
    typer.echo(f"results: {run_dir / 'front.parquet'} (Pareto sets), {run_dir / 'run.json'} "
               "(provenance and timings)", err=True)
    typer.echo("next:\n"
               f"  cablefam pick {run_dir} --top 3 --sheet {run_dir}/sheets   # candidates, "
               "design sheets\n"
               f"  cablefam compare {run_dir}                    # which catalog wins where\n"
               f"  cablefam plot {run_dir} --out {run_dir}/plots   # PNG/SVG fronts\n"
               f"  cablefam design {run_dir} --member {first_member} --index 0 > design.toml"
               " && cablefam inspect design.toml", err=True)


@app.command()
def resume(
    run: Annotated[Path, typer.Argument(help="Run folder of a killed or interrupted sweep.")],
    force: Annotated[bool, typer.Option(
        "--force", help="Resume even if the sweep file or a catalog changed.")] = False,
    workers: Annotated[str, typer.Option("--workers", help="Local worker processes.")] = "1",
    scheduler: Annotated[Optional[str], typer.Option("--scheduler")] = None,
    checkpoint_every: Annotated[Optional[int], typer.Option("--checkpoint-every")] = None,
    quiet: Annotated[bool, typer.Option("--quiet", help="No progress on stderr.")] = False,
):
    """Continue a run: finished tasks kept, unfinished ones from their last checkpoint."""
    from cablefam.optimizer.batch.progress import StderrProgress
    from cablefam.optimizer.batch.sweep import resume_run

    run_dir = _interruptible(lambda: resume_run(
        run, force=force, workers=_workers(workers), scheduler=scheduler,
        checkpoint_every=checkpoint_every, progress=None if quiet else StderrProgress()))
    from cablefam.optimizer.run_folder.reader import read_front
    df, _ = read_front(run_dir)
    _report_run(run_dir, str(df["member"].iloc[0]) if len(df) else "MEMBER")


@app.command()
def design(
    run: Annotated[Path, typer.Argument(help="Run folder.")],
    member: Annotated[str, typer.Option("--member", help="Family member name.")],
    index: Annotated[int, typer.Option("--index", help="Row of that member in front.parquet "
                                       "(0-based, file order).")],
    catalog: Annotated[Optional[str], typer.Option("--catalog", help="Only rows of this "
                                                   "catalog.")] = None,
):
    """Write one front row back as a design file (TOML on stdout) that inspect accepts."""
    from cablefam.optimizer.review.design_export import front_row_design_toml

    typer.echo(front_row_design_toml(run, member, index, catalog), nl=False)


def _register_review_commands():
    """Commands of the morning after (pick, compare, plot, runs), kept in their own module."""
    try:
        from cablefam.optimizer.cli.review_commands import register
    except ModuleNotFoundError as exc:  # pragma: no cover - only while that module is absent
        if exc.name != "cablefam.optimizer.cli.review_commands":
            raise
        return
    register(app)


_register_review_commands()


def main(argv=None) -> None:
    """Console entry point: run the app, turn InputError into one line and exit code 2."""
    args = list(sys.argv[1:] if argv is None else argv)
    try:
        app(args=args, prog_name="cablefam")  # standalone: usage errors exit 2 by themselves
    except InputError as exc:
        if "--debug" in args:
            raise
        print(f"cablefam: error: {exc}", file=sys.stderr)
        sys.exit(2)


if __name__ == "__main__":
    main()
