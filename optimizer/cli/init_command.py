"""``cablefam init FILE [--overwrite]``: write a commented starter sweep file."""

from __future__ import annotations

from pathlib import Path
from typing import Annotated

import typer

from cablefam.optimizer.cli.common import flags_for


def init_command(
    file: Annotated[Path, typer.Argument(help="Sweep file to write (TOML).")],
    overwrite: Annotated[bool, typer.Option(
        "--overwrite", help="Replace the file if it exists.")] = False,
):
    """Write a starter sweep file: every key explained, two members, the bundled catalogs."""
    from cablefam.optimizer.inputs.starter import write_starter_sweep

    with flags_for(overwrite="--overwrite"):
        path = write_starter_sweep(file, overwrite=overwrite)
    typer.echo(str(path))
    typer.echo(f"next: edit it, then  cablefam sweep {path}", err=True)
