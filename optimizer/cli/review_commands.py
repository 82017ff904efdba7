"""Commands of the morning after a sweep: ``pick``, ``compare``, ``plot``, ``runs``.

Registered on the main app by :func:`register` (called from :mod:`cablefam.optimizer.cli.app`). Each
command parses its options, calls one library function, prints the result and sets the exit
code; bad input raises :class:`cablefam.optimizer.errors.InputError`, which ``cablefam`` turns into one
line and exit code 2.
"""

from __future__ import annotations

import json
from pathlib import Path
from typing import Annotated, Optional

import typer

from cablefam.optimizer.errors import InputError


def _json(obj) -> str:
    return json.dumps(obj, indent=2, allow_nan=False)


def pick_command(
    run: Annotated[Path, typer.Argument(help="Run folder.")],
    member: Annotated[Optional[str], typer.Option("--member", help="Only this member.")] = None,
    catalog: Annotated[Optional[str], typer.Option("--catalog",
                                                   help="Only rows of this catalog.")] = None,
    where: Annotated[Optional[str], typer.Option(
        "--where", help="Condition over front.parquet columns, pandas expression syntax, "
                        "e.g. \"outer_diameter_m < 8e-3 and conductor == 'copper'\".")] = None,
    knee: Annotated[bool, typer.Option(
        "--knee", help="Rank by knee distance (Das 1999); the default.")] = False,
    weights: Annotated[Optional[str], typer.Option(
        "--weights", help="Rank by weighted sum of range-normalized objectives, "
                          "e.g. attenuation=2,mass=1.")] = None,
    nearest: Annotated[Optional[str], typer.Option(
        "--nearest", help="Rank by distance to a target in the columns' units, "
                          "e.g. attenuation=5,mass=200.")] = None,
    top: Annotated[int, typer.Option("--top", help="Designs per member.")] = 5,
    json_out: Annotated[bool, typer.Option("--json", help="One JSON object, SI units.")] = False,
    sheet: Annotated[Optional[Path], typer.Option(
        "--sheet", help="Write a design sheet (Markdown, HTML, PNG) per pick here.")] = None,
):
    """Pick candidates per member from a run's front: knee, weights or nearest to a target."""
    from cablefam.optimizer.review.pick import format_picks, pick, picks_to_json

    chosen = [name for name, given in (("--knee", knee), ("--weights", weights is not None),
                                       ("--nearest", nearest is not None)) if given]
    if len(chosen) > 1:
        raise InputError(f"{' and '.join(chosen)}: give only one of --knee, --weights, "
                         "--nearest")
    method = {"--weights": "weights", "--nearest": "nearest"}.get(chosen[0] if chosen else "",
                                                                   "knee")
    result = pick(run, member=member, catalog=catalog, where=where, method=method,
                  weights=weights, target=nearest, top=top)
    typer.echo(_json(picks_to_json(result)) if json_out else format_picks(result))
    if sheet is not None:
        from cablefam.optimizer.review.sheet import write_sheets
        written = write_sheets(result, sheet)
        pages = [p for p in written if p.suffix in (".md", ".html")]
        typer.echo(f"design sheets: {len(pages) // 2} written to {sheet}", err=True)


def compare_command(
    runs: Annotated[list[Path], typer.Argument(help="Run folders (one or more).")],
    member: Annotated[Optional[str], typer.Option("--member", help="Only this member.")] = None,
    json_out: Annotated[bool, typer.Option("--json", help="One JSON object.")] = False,
    plots: Annotated[Optional[Path], typer.Option(
        "--plots", help="Also write overlay plots of the compared fronts here.")] = None,
):
    """Compare fronts per member: hypervolume, set coverage, best values, verdict."""
    from cablefam.optimizer.review.compare import compare_runs, comparison_to_json, format_comparison

    comparison = compare_runs(runs, member=member)
    typer.echo(_json(comparison_to_json(comparison)) if json_out
               else format_comparison(comparison))
    if plots is not None:
        from cablefam.optimizer.review.plots import plot_comparison
        written = plot_comparison(comparison, plots)
        typer.echo(f"comparison plots: {len(written)} files written to {plots}", err=True)


def plot_command(
    run: Annotated[Path, typer.Argument(help="Run folder.")],
    out: Annotated[Optional[Path], typer.Option(
        "--out", help="Folder for the plots (default: RUN/plots).")] = None,
):
    """Plot each member's front (scatter by catalog and materials, parallel coordinates)."""
    from cablefam.optimizer.review.plots import plot_run

    for path in plot_run(run, out):
        typer.echo(str(path))


def runs_command(
    folder: Annotated[Path, typer.Argument(help="Folder holding run folders.")] = Path("runs"),
    json_out: Annotated[bool, typer.Option("--json", help="A JSON list.")] = False,
):
    """List runs: name, date, members, catalogs, evaluations, wall time, front sizes."""
    from cablefam.optimizer.run_folder.index import format_runs, list_runs, runs_to_json

    entries = list_runs(folder)
    typer.echo(_json(runs_to_json(entries)) if json_out else format_runs(entries, folder))


def register(app: typer.Typer) -> None:
    """Add ``pick``, ``compare``, ``plot`` and ``runs`` to ``app``."""
    app.command("pick")(pick_command)
    app.command("compare")(compare_command)
    app.command("plot")(plot_command)
    app.command("runs")(runs_command)
