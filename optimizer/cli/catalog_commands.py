"""``cablefam catalog check FILE...`` and ``cablefam catalog show FILE``."""

from __future__ import annotations

from pathlib import Path
from typing import Annotated

import typer

catalog_app = typer.Typer(no_args_is_help=True, help="Check and show material catalogs.")


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
