"""``cablefam sweep``, ``cablefam resume`` and ``cablefam design``: run folders in and out.

``sweep`` and ``resume`` share their execution options (:mod:`cablefam.optimizer.cli.common`);
both print the run folder on stdout and what to do next on stderr. ``design`` writes one front
row back as a design file on stdout.
"""

from __future__ import annotations

import sys
from pathlib import Path
from typing import Annotated, Optional

import typer

from cablefam.optimizer.cli.common import (CheckpointEvery, Force, Quiet, Scheduler, TimeBudget,
                                           Workers,
                                           catalog_option, flags_for, member_option,
                                           out_dir_option, parse_workers)
from cablefam.optimizer.errors import InputError

#: Library arguments of run_sweep / resume_run -> the flags that set them.
SWEEP_FLAGS = dict(seed="--seed", generations="--generations", population="--population",
                   resume="--resume", overwrite="--overwrite", force="--force",
                   scheduler="--scheduler")
RESUME_FLAGS = dict(force="--force", scheduler="--scheduler",
                    resume="`cablefam sweep SWEEP.toml --resume`")


def sweep_command(
    sweep_file: Annotated[Optional[Path], typer.Argument(help="Sweep file (TOML).")] = None,
    demo: Annotated[bool, typer.Option("--demo", help="Run the bundled demo sweep.")] = False,
    out: Annotated[Path, out_dir_option("Folder for run folders.")] = Path("runs"),
    seed: Annotated[Optional[int], typer.Option("--seed", help="Override the run seed.")] = None,
    generations: Annotated[Optional[int], typer.Option(
        "--generations", metavar="N", help="Override search.generations.")] = None,
    population: Annotated[Optional[int], typer.Option(
        "--population", metavar="N", help="Override search.population.")] = None,
    evaluations: Annotated[Optional[int], typer.Option(
        "--evaluations", metavar="N", help="Override search.evaluations_per_task.")] = None,
    evaluated: Annotated[bool, typer.Option(
        "--evaluated", help="Also write every evaluated design to evaluated.parquet.")] = False,
    overwrite: Annotated[bool, typer.Option(
        "--overwrite", help="Replace an existing run folder of the same name.")] = False,
    resume: Annotated[bool, typer.Option(
        "--resume", help="Continue the run folder of this sweep: finished tasks are kept, "
        "unfinished ones restart from their last checkpoint.")] = False,
    force: Force = False,
    workers: Workers = "1",
    scheduler: Scheduler = None,
    checkpoint_every: CheckpointEvery = None,
    time_budget: TimeBudget = None,
    quiet: Quiet = False,
):
    """Search every family member x catalog and write the Pareto sets to runs/<name>/."""
    from cablefam.optimizer.batch.sweep import run_sweep
    from cablefam.optimizer.inputs.sweep_spec import demo_sweep_path, load_sweep

    if demo == (sweep_file is not None):
        raise InputError("give either a sweep file or --demo (not both, not neither)")
    spec = load_sweep(demo_sweep_path() if demo else sweep_file)
    if overwrite and resume:
        raise InputError("--overwrite and --resume exclude each other")
    n_workers = parse_workers(workers)
    with flags_for(**SWEEP_FLAGS):
        run_dir = _interruptible(lambda: run_sweep(
            spec, out, seed=seed, generations=generations, population=population,
            record_evaluated=evaluated, overwrite=overwrite, resume=resume, force=force,
            workers=n_workers, scheduler=scheduler, checkpoint_every=checkpoint_every,
            time_budget_s=_seconds(time_budget), evaluations_per_task=evaluations,
            progress=_progress(quiet)))
    _report_run(run_dir, spec.spec.member[0].name)


def _seconds(time_budget):
    from cablefam.optimizer.inputs.durations import parse_duration

    return None if time_budget is None else parse_duration(time_budget, "--time-budget")


def resume_command(
    run: Annotated[Path, typer.Argument(help="Run folder of a killed or interrupted sweep.")],
    force: Force = False,
    workers: Workers = "1",
    scheduler: Scheduler = None,
    checkpoint_every: CheckpointEvery = None,
    time_budget: TimeBudget = None,
    quiet: Quiet = False,
):
    """Continue a run: finished tasks kept, unfinished ones from their last checkpoint."""
    from cablefam.optimizer.batch.sweep import resume_run
    from cablefam.optimizer.run_folder.reader import read_front

    n_workers = parse_workers(workers)
    with flags_for(**RESUME_FLAGS):
        run_dir = _interruptible(lambda: resume_run(
            run, force=force, workers=n_workers, scheduler=scheduler,
            checkpoint_every=checkpoint_every, time_budget_s=_seconds(time_budget),
            progress=_progress(quiet)))
    df, _ = read_front(run_dir)
    _report_run(run_dir, str(df["member"].iloc[0]) if len(df) else "MEMBER")


def design_command(
    run: Annotated[Path, typer.Argument(help="Run folder.")],
    member: Annotated[str, member_option("Family member name.")],
    index: Annotated[int, typer.Option("--index", metavar="I", help="Row of that member in "
                                       "front.parquet (0-based, file order).")],
    catalog: Annotated[Optional[str], catalog_option()] = None,
):
    """Write one front row back as a design file (TOML on stdout) that inspect accepts."""
    from cablefam.optimizer.review.design_export import front_row_design_toml

    with flags_for(member="--member", index="--index", catalog="--catalog"):
        text = front_row_design_toml(run, member, index, catalog)
    typer.echo(text, nl=False)


def _progress(quiet: bool):
    from cablefam.optimizer.batch.progress import StderrProgress
    return None if quiet else StderrProgress()


def _interruptible(call):
    """Run a sweep; an interruption prints how to continue and exits with 130."""
    from cablefam.optimizer.batch.sweep import SweepInterrupted
    try:
        return call()
    except SweepInterrupted as exc:
        print(f"cablefam: {exc}", file=sys.stderr)
        raise typer.Exit(130) from None


def _report_run(run_dir: Path, first_member: str) -> None:
    typer.echo(str(run_dir))
    typer.echo(f"results: {run_dir / 'front.parquet'} (Pareto sets), {run_dir / 'run.json'} "
               "(provenance and timings)", err=True)
    typer.echo("next:\n"
               f"  cablefam report {run_dir}                     # one page: fronts, picks, "
               f"verdicts ({run_dir / 'report.html'})\n"
               f"  cablefam pick {run_dir} --top 3 --out {run_dir}/sheets   # candidates, "
               "design sheets\n"
               f"  cablefam compare {run_dir}                    # which catalog wins where\n"
               f"  cablefam plot {run_dir} --out {run_dir}/plots   # PNG/SVG fronts\n"
               f"  cablefam design {run_dir} --member {first_member} --index 0 > design.toml"
               " && cablefam inspect design.toml", err=True)
