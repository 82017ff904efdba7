"""The files of a run folder: their names, and Parquet and JSON I/O with provenance.

Layout of ``runs/<name>/``::

    front.parquet       feasible Pareto set of every task (provenance in the key-value metadata)
    evaluated.parquet   every evaluated design (with --evaluated)
    run.json            provenance, timings and counts
    run-state.json      settings and SHA-256 of the inputs (for resume)
    inputs/             copies of the sweep file and catalogs
    tasks/              finished tasks and checkpoints (:mod:`cablefam.optimizer.batch.task_store`)
"""

from __future__ import annotations

import json
from pathlib import Path

import pandas as pd
import pyarrow as pa
import pyarrow.parquet as pq

from cablefam.optimizer.atomic import atomic_path
from cablefam.optimizer.errors import InputError

FRONT_FILE = "front.parquet"
EVALUATED_FILE = "evaluated.parquet"
RUN_FILE = "run.json"
#: Parquet key-value metadata key holding the provenance JSON.
METADATA_KEY = b"cablefam"
STATE_FILE = "run-state.json"
INPUTS_DIR = "inputs"


def write_parquet(df: pd.DataFrame, path: Path, provenance: dict) -> None:
    """Write a frame with the provenance as Parquet key-value metadata, atomically."""
    table = pa.Table.from_pandas(df, preserve_index=False)
    meta = dict(table.schema.metadata or {})
    meta[METADATA_KEY] = json.dumps(provenance, sort_keys=True).encode()
    table = table.replace_schema_metadata(meta)
    with atomic_path(path) as tmp:
        pq.write_table(table, tmp)


def read_provenance(path) -> dict:
    """The provenance stored in a cablefam Parquet file."""
    meta = pq.read_schema(path).metadata or {}
    if METADATA_KEY not in meta:
        raise InputError(f"{path}: not a cablefam Parquet file (no provenance metadata)")
    return json.loads(meta[METADATA_KEY])


def read_json(path: Path, missing: str) -> dict:
    """A JSON file of a run folder; ``missing`` is the message when it does not exist."""
    try:
        return json.loads(path.read_text(encoding="utf-8"))
    except FileNotFoundError:
        raise InputError(missing) from None
    except (json.JSONDecodeError, UnicodeDecodeError) as exc:
        raise InputError(f"{path}: corrupt JSON ({exc})") from None
