"""``cablefam report RUN [--out FILE]``: the run's report page (one self-contained HTML file)."""

from __future__ import annotations

from pathlib import Path
from typing import Annotated, Optional

import typer

from cablefam.optimizer.cli.common import flags_for


def report_command(
    run: Annotated[Path, typer.Argument(help="Run folder.")],
    out: Annotated[Optional[Path], typer.Option(
        "--out", metavar="FILE", help="Write the report to this file (default: "
        "RUN/report.html).")] = None,
    sheets: Annotated[bool, typer.Option(
        "--sheets/--no-sheets", help="Write the design sheets of the picks that are not in "
        "RUN/sheets yet (default), or only link the ones there.")] = True,
    top: Annotated[int, typer.Option("--top", metavar="N", help="Picks per member.")] = 3,
):
    """Write one HTML page per run: fronts, picks, verdicts, constraints, provenance."""
    from cablefam.optimizer.review.report import format_report_summary, write_report

    with flags_for(out="--out", top="--top"):
        report = write_report(run, out, sheets=sheets, top=top)
    typer.echo(str(report.path))
    typer.echo(format_report_summary(report), err=True)
