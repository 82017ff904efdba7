"""Shared helpers of the optimizer-layer tests: run the CLI in-process, paths of test data."""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path

import pytest

from cablefam.optimizer.cli.app import main

DATA = Path(__file__).parent / "data"
REPO = Path(__file__).resolve().parents[2]
CATALOG_DIR = REPO / "catalogs"
BUNDLED_CATALOGS = sorted(CATALOG_DIR.glob("*.toml"))


@pytest.fixture
def cli(capsys):
    """Run ``cablefam`` in-process: ``cli(*argv) -> (exit code, stdout, stderr)``."""

    def run(*argv):
        capsys.readouterr()  # drop anything printed before
        try:
            main([str(a) for a in argv])
            code = 0
        except SystemExit as exc:
            code = 0 if exc.code is None else exc.code
        out, err = capsys.readouterr()
        return code, out, err

    return run


def run_subprocess(*argv, cwd=None, timeout=300):
    """Run ``python -m cablefam.optimizer.cli.app`` in a fresh interpreter; return the CompletedProcess."""
    return subprocess.run([sys.executable, "-m", "cablefam", *map(str, argv)],
                          capture_output=True, text=True, cwd=cwd, timeout=timeout)
