"""Options shared by the commands, and the wording of library errors as flags.

Naming rule for what a command writes
-------------------------------------
- ``--out DIR`` is always a folder, never a file: the command writes its files into it (the
  folder is created when missing). ``sweep --out DIR`` (run folders), ``plot --out DIR`` (plot
  files), ``pick --out DIR`` (design sheets), ``compare --out DIR`` (overlay plots).
- One file is named by what it holds and takes a ``FILE``: ``inspect --profile FILE``.
  ``report --out FILE`` is the one ``--out`` that names a file: the report is one page
  (default ``RUN/report.html``).
- What a command prints goes to stdout (``design`` prints a design file: redirect it);
  progress and notes go to stderr.
- Older names stay as aliases (the CLI is a contract): ``pick --sheet DIR`` and
  ``compare --plots DIR`` are ``--out DIR``.

Options used by more than one command are defined here once, so that ``--json``,
``--workers``, ``--scheduler``, ``--checkpoint-every``, ``--force``, ``--quiet``, ``--member``
and ``--catalog`` read the same everywhere. ``--debug`` and ``--version`` belong to the app
(:mod:`cablefam.optimizer.cli.app`): ``cablefam --debug COMMAND``.

Library errors name the library's own arguments (``member = 'x': not in this run``,
``pass resume=True``); :func:`flags_for` rewords them with the command's flags.
"""

from __future__ import annotations

import json
import re
from contextlib import contextmanager
from typing import Annotated, Optional

import typer

from cablefam.optimizer.errors import InputError


def json_option(help: str = "Print one JSON object (SI units, units in the keys)."):
    """``--json``: machine-readable output on stdout instead of the table or report."""
    return typer.Option("--json", help=help)


def member_option(help: str = "Only this family member."):
    return typer.Option("--member", metavar="MEMBER", help=help)


def catalog_option(help: str = "Only rows of this catalog."):
    return typer.Option("--catalog", metavar="CATALOG", help=help)


def out_dir_option(help: str, *aliases: str):
    """``--out DIR`` (a folder, see the naming rule above), with older names as aliases."""
    return typer.Option("--out", *aliases, metavar="DIR", help=help)


Workers = Annotated[str, typer.Option(
    "--workers", metavar="N|auto", help="Local worker processes: a number or 'auto' (= cores).")]
Scheduler = Annotated[Optional[str], typer.Option(
    "--scheduler", metavar="tcp://HOST:PORT", help="Run tasks on a Dask cluster, e.g. "
    "tcp://host:8786.")]
CheckpointEvery = Annotated[Optional[int], typer.Option(
    "--checkpoint-every", metavar="N", help="Checkpoint every N generations (default: every "
    "~30 s of work).")]
Force = Annotated[bool, typer.Option(
    "--force", help="Resume even if the sweep file or a catalog changed.")]
Quiet = Annotated[bool, typer.Option("--quiet", help="No progress on stderr.")]
TimeBudget = Annotated[Optional[str], typer.Option(
    "--time-budget", metavar="DURATION", help="Wall-clock budget of the whole run (8h, 90m, "
    "1h30m, seconds), spread over the tasks still to run; each task's genetic stage runs "
    "until its share is used. Not byte-reproducible.")]


def parse_workers(text: str) -> int:
    """``--workers``: a number >= 1 or ``auto`` (the number of cores)."""
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


def echo_json(obj) -> None:
    """Print ``obj`` as indented JSON (no NaN: the library returns null for what is missing)."""
    typer.echo(json.dumps(obj, indent=2, allow_nan=False))


def flag_wording(message: str, flags: dict[str, str]) -> str:
    """``message`` with the library's argument names replaced by command-line flags.

    Replaced are the names that open the message (``member = 'x': ...``, ``weights: ...``),
    a list of them (``generations = 0, population = 3: ...``, ``seed/generations: ...``) and
    ``name=True`` anywhere (``pass force=True``). Messages that open with a file name keep
    their keys: those are file keys, not arguments.
    """
    if not flags:
        return message
    names = "|".join(re.escape(n) for n in sorted(flags, key=len, reverse=True))
    head, sep, rest = message.partition(": ")
    if (re.fullmatch(rf"(?:{names})(?:/(?:{names}))+", head)
            or re.match(rf"(?:{names})(?: = |$)", head)):
        head = re.sub(rf"(?:^|(?<=, )|(?<=/))({names})(?= = |/|$)",
                      lambda m: flags[m[1]], head)
    return re.sub(rf"(?<![\w.-])({names})=True\b", lambda m: flags[m[1]], head + sep + rest)


@contextmanager
def flags_for(**flags: str):
    """Re-raise the library's :class:`InputError` in the words of the command's flags.

    ``with flags_for(member="--member", target="--nearest"): pick(...)``
    """
    try:
        yield
    except InputError as exc:
        worded = flag_wording(str(exc), flags)
        if worded == str(exc):
            raise
        raise InputError(worded) from exc
