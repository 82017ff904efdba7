"""The ``cablefam`` command line: the typer app, its error printer and :func:`main`.

The commands live one group per module (:mod:`.inspect_command`, :mod:`.catalog_commands`,
:mod:`.sweep_commands`, :mod:`.review_commands`); options they share, and the rule for naming
output folders and files, are in :mod:`.common`. Each command parses its options, calls one
library function, writes the result and sets the exit code. Bad input
(:class:`~cablefam.optimizer.errors.InputError`) prints one line and exits with code 2;
``cablefam --debug COMMAND`` shows the traceback instead.
"""

from __future__ import annotations

import sys
from typing import Annotated

import click
import typer
from typer.core import TyperGroup

from cablefam.optimizer.cli import review_commands, sweep_commands
from cablefam.optimizer.cli.catalog_commands import catalog_app
from cablefam.optimizer.cli.init_command import init_command
from cablefam.optimizer.cli.inspect_command import inspect_command
from cablefam.optimizer.cli.report_command import report_command
from cablefam.optimizer.errors import InputError


def print_error(exc: BaseException) -> None:
    """The one line a user sees for bad input (on stderr)."""
    print(f"cablefam: error: {exc}", file=sys.stderr)


class _ErrorPrintingGroup(TyperGroup):
    """Runs the commands; an InputError becomes one line and exit code 2 unless ``--debug``."""

    def invoke(self, ctx: click.Context):
        try:
            return super().invoke(ctx)
        except InputError as exc:
            if ctx.params.get("debug"):
                raise
            print_error(exc)
            ctx.exit(2)


app = typer.Typer(cls=_ErrorPrintingGroup, add_completion=False, no_args_is_help=True,
                  pretty_exceptions_enable=False,
                  help="cablefam: batch optimizer for families of coaxial cables.")


def _print_version(value: bool) -> None:
    if value:
        from cablefam import __version__  # read from the installed package's metadata
        typer.echo(f"cablefam {__version__}")
        raise typer.Exit()


@app.callback()
def _root(
    debug: Annotated[bool, typer.Option(
        "--debug", help="Show the traceback of an error instead of one line.")] = False,
    version: Annotated[bool, typer.Option(
        "--version", callback=_print_version, is_eager=True,
        help="Print the version and exit.")] = False,
):
    """cablefam: batch optimizer for families of coaxial cables."""


app.add_typer(catalog_app, name="catalog")
app.command("inspect")(inspect_command)
app.command("sweep")(sweep_commands.sweep_command)
app.command("resume")(sweep_commands.resume_command)
app.command("design")(sweep_commands.design_command)
app.command("pick")(review_commands.pick_command)
app.command("compare")(review_commands.compare_command)
app.command("plot")(review_commands.plot_command)
app.command("runs")(review_commands.runs_command)
app.command("report")(report_command)
app.command("init")(init_command)


def main(argv=None) -> None:
    """Console entry point (``cablefam``, ``python -m cablefam``); exits with the command's
    code: 0, 2 for bad input or usage, 130 when a sweep was interrupted."""
    app(args=list(sys.argv[1:] if argv is None else argv), prog_name="cablefam")


if __name__ == "__main__":
    main()
