"""The review commands stay light: neither importing them nor running them loads pymoo or dask.

Each check runs in a fresh interpreter, since this test session has imported both already.
"""

import json
import subprocess
import sys

import pytest

#: Modules behind runs, pick, compare, plot, design and inspect.
REVIEW_MODULES = [f"cablefam.optimizer.review.{m}" for m in (
    "pick", "compare", "plots", "sheet", "design_export", "inspection", "report",
    "report_figures", "report_page", "report_sections", "sheet_document")] + [
    f"cablefam.optimizer.run_folder.{m}" for m in ("reader", "index")]
HEAVY = ("pymoo", "dask")

_PROBE = """
import json, sys
{body}
print(json.dumps(sorted({{m.split(".")[0] for m in sys.modules}} & set({heavy!r}))))
"""


def loaded_heavy(body: str) -> list[str]:
    """Top-level heavy packages in ``sys.modules`` after running ``body`` in a new process."""
    code = _PROBE.format(body=body, heavy=HEAVY)
    proc = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                          timeout=300)
    assert proc.returncode == 0, proc.stderr
    return json.loads(proc.stdout.strip().splitlines()[-1])


def test_importing_review_modules_loads_neither_pymoo_nor_dask():
    body = "\n".join(f"import {m}" for m in REVIEW_MODULES)
    assert loaded_heavy(body) == []


def _run_cli(*argv) -> str:
    return ("from cablefam.optimizer.cli.app import main\n"
            "try:\n"
            f"    main({[str(a) for a in argv]!r})\n"
            "except SystemExit as exc:\n"
            "    assert not exc.code, exc.code\n")


@pytest.mark.parametrize("command", ["runs", "pick", "compare", "design", "report"])
def test_review_commands_run_without_pymoo_or_dask(tiny_run, tmp_path, command):
    argv = {
        "runs": ["runs", tiny_run.parent],
        "pick": ["pick", tiny_run, "--top", "1", "--sheet", tmp_path / "sheets"],
        "compare": ["compare", tiny_run, "--json"],
        "design": ["design", tiny_run, "--member", "mast-feeder-50", "--index", "0"],
        "report": ["report", tiny_run, "--out", tmp_path / "report.html", "--no-sheets"],
    }[command]
    body = "import contextlib, io\nwith contextlib.redirect_stdout(io.StringIO()):\n" + "".join(
        "    " + line + "\n" for line in _run_cli(*argv).splitlines())
    assert loaded_heavy(body) == []
