"""Commands of the morning after a sweep: ``pick``, ``compare``, ``plot``, ``runs``.

Each command parses its options, calls one library function, prints the result and sets the
exit code; bad input raises :class:`cablefam.optimizer.errors.InputError`, which ``cablefam``
turns into one line and exit code 2.
"""

from __future__ import annotations

from enum import Enum
from pathlib import Path
from typing import Annotated, Optional

import typer

from cablefam.optimizer.cli.common import (catalog_option, echo_json, flags_for, json_option,
                                           member_option, out_dir_option)
from cablefam.optimizer.errors import InputError


class PickMethod(str, Enum):
    """How ``pick`` ranks the non-dominated designs (:data:`cablefam.optimizer.review.pick.METHODS`)."""

    knee = "knee"
    weights = "weights"
    nearest = "nearest"


#: Library arguments of pick() and write_sheets() -> the flags that set them.
PICK_FLAGS = dict(member="--member", catalog="--catalog", where="--where", top="--top",
                  method="--method", weights="--weights", target="--nearest", out_dir="--out")


def pick_method(method: PickMethod | None, knee: bool, weights: str | None,
                nearest: str | None) -> str:
    """The one ranking method that ``--method``, ``--knee``, ``--weights`` and ``--nearest``
    ask for (default knee); InputError when they ask for different ones.

    ``--weights W`` and ``--nearest T`` give the values and imply their method; ``--knee`` is
    ``--method knee``.
    """
    asked = [(f"--method {method.value}", method.value)] if method is not None else []
    asked += [(flag, name) for flag, name, given in (
        ("--knee", "knee", knee), ("--weights", "weights", weights is not None),
        ("--nearest", "nearest", nearest is not None)) if given]
    if len({name for _, name in asked}) > 1:
        raise InputError(f"{' and '.join(flag for flag, _ in asked)}: ask for different pick "
                         "methods; give one of --method knee|weights|nearest, --knee, "
                         "--weights W, --nearest T")
    return asked[0][1] if asked else "knee"


def pick_command(
    run: Annotated[Path, typer.Argument(help="Run folder.")],
    member: Annotated[Optional[str], member_option()] = None,
    catalog: Annotated[Optional[str], catalog_option()] = None,
    where: Annotated[Optional[str], typer.Option(
        "--where", metavar="EXPR", help="Condition over front.parquet columns, pandas "
        "expression syntax, e.g. \"outer_diameter_m < 8e-3 and conductor == 'copper'\".")] = None,
    method: Annotated[Optional[PickMethod], typer.Option(
        "--method", case_sensitive=False, help="Ranking: knee distance (Das 1999, the "
        "default), weighted sum of range-normalized objectives (needs --weights) or distance "
        "to a target (needs --nearest).")] = None,
    knee: Annotated[bool, typer.Option(
        "--knee", help="Rank by knee distance: same as --method knee.")] = False,
    weights: Annotated[Optional[str], typer.Option(
        "--weights", metavar="W", help="Weights per objective, e.g. attenuation=2,mass=1; "
        "implies --method weights.")] = None,
    nearest: Annotated[Optional[str], typer.Option(
        "--nearest", metavar="T", help="Target per objective in the columns' units, e.g. "
        "attenuation=5,mass=200; implies --method nearest.")] = None,
    top: Annotated[int, typer.Option("--top", metavar="N", help="Designs per member.")] = 5,
    diverse: Annotated[bool, typer.Option(
        "--diverse/--neighbours", help="Spread the picks along the front (default), or take "
        "the best-ranked designs that differ by more than one resolution step (--neighbours, "
        "the older behaviour).")] = True,
    json_out: Annotated[bool, json_option()] = False,
    out: Annotated[Optional[Path], out_dir_option(
        "Write a design sheet (Markdown, HTML, PNG) per pick into this folder (older name: "
        "--sheet).", "--sheet")] = None,
):
    """Pick candidates per member from a run's front: knee, weights or nearest to a target."""
    from cablefam.optimizer.review.pick import format_picks, pick, picks_to_json

    chosen = pick_method(method, knee, weights, nearest)
    with flags_for(**PICK_FLAGS):
        result = pick(run, member=member, catalog=catalog, where=where, method=chosen,
                      weights=weights, target=nearest, top=top, diverse=diverse)
    if json_out:
        echo_json(picks_to_json(result))
    else:
        typer.echo(format_picks(result))
    if out is not None:
        from cablefam.optimizer.review.sheet import write_sheets
        with flags_for(**PICK_FLAGS):
            written = write_sheets(result, out)
        pages = [p for p in written if p.suffix in (".md", ".html")]
        typer.echo(f"design sheets: {len(pages) // 2} written to {out}", err=True)


def compare_command(
    runs: Annotated[list[Path], typer.Argument(help="Run folders (one or more).")],
    member: Annotated[Optional[str], member_option()] = None,
    json_out: Annotated[bool, json_option("Print one JSON object.")] = False,
    out: Annotated[Optional[Path], out_dir_option(
        "Also write overlay plots of the compared fronts into this folder (older name: "
        "--plots).", "--plots")] = None,
):
    """Compare fronts per member: hypervolume, set coverage, best values, verdict."""
    from cablefam.optimizer.review.compare import (compare_runs, comparison_to_json,
                                                   format_comparison)

    with flags_for(member="--member"):
        comparison = compare_runs(runs, member=member)
    if json_out:
        echo_json(comparison_to_json(comparison))
    else:
        typer.echo(format_comparison(comparison))
    if out is not None:
        from cablefam.optimizer.review.plots import plot_comparison
        written = plot_comparison(comparison, out)
        typer.echo(f"comparison plots: {len(written)} files written to {out}", err=True)


def plot_command(
    run: Annotated[Path, typer.Argument(help="Run folder.")],
    out: Annotated[Optional[Path], out_dir_option(
        "Folder for the plots (default: RUN/plots).")] = None,
):
    """Plot each member's front (scatter by catalog and materials, parallel coordinates)."""
    from cablefam.optimizer.review.plots import plot_run

    for path in plot_run(run, out):
        typer.echo(str(path))


def runs_command(
    folder: Annotated[Path, typer.Argument(help="Folder holding run folders.")] = Path("runs"),
    json_out: Annotated[bool, json_option("Print a JSON list.")] = False,
):
    """List runs: name, date, members, catalogs, evaluations, wall time, front sizes."""
    from cablefam.optimizer.run_folder.index import format_runs, list_runs, runs_to_json

    entries = list_runs(folder)
    if json_out:
        echo_json(runs_to_json(entries))
    else:
        typer.echo(format_runs(entries, folder))
