"""``cablefam inspect DESIGN``: the report (or JSON) of one design, optionally its field profile."""

from __future__ import annotations

from pathlib import Path
from typing import Annotated, Optional

import typer

from cablefam.optimizer.cli.common import json_option


def inspect_command(
    design: Annotated[Path, typer.Argument(help="Design file (TOML).")],
    json_out: Annotated[bool, json_option()] = False,
    profile: Annotated[Optional[Path], typer.Option(
        "--profile", metavar="FILE", help="Also write B(r), |J(r)|, E(r) across the four "
        "regions to this CSV file.")] = None,
):
    """Evaluate one design: impedance, loss, fields, modes, heat, mass."""
    from cablefam.optimizer.atomic import atomic_path
    from cablefam.optimizer.review.inspection import (format_report, inspect_design,
                                                      profile_table, to_json)

    result = inspect_design(design)
    if profile is not None:
        with atomic_path(profile) as tmp:
            profile_table(result).to_csv(tmp, index=False, float_format="%.9g")
    typer.echo(to_json(result) if json_out else format_report(result))
    if profile is not None:
        typer.echo(f"profile written to {profile}", err=True)
