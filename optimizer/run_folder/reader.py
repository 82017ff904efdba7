"""Reading run folders written by :mod:`cablefam.optimizer.batch` (missing or corrupt -> InputError)."""

from __future__ import annotations

import json
from pathlib import Path

import pandas as pd
import pyarrow as pa
import pyarrow.parquet as pq

from cablefam.optimizer.inputs.catalog import Catalog, load_catalog
from cablefam.optimizer.errors import InputError
from cablefam.optimizer.run_folder.files import FRONT_FILE, RUN_FILE, read_json, read_provenance


def read_front(run_dir) -> tuple[pd.DataFrame, dict]:
    """``front.parquet`` of a run folder and its provenance."""
    run_dir = Path(run_dir)
    path = run_dir / FRONT_FILE
    if not run_dir.is_dir():
        raise InputError(f"{run_dir}: no such run folder")
    if not path.is_file():
        raise InputError(f"{run_dir}: not a run folder (no {FRONT_FILE})")
    try:
        provenance = read_provenance(path)
        df = pq.read_table(path).to_pandas()
    except (pa.ArrowException, OSError, json.JSONDecodeError) as exc:
        raise InputError(f"{path}: unreadable or corrupt Parquet file ({exc})") from None
    return df, provenance


def read_run_info(run_dir) -> dict:
    """``run.json`` of a run folder."""
    return read_json(Path(run_dir) / RUN_FILE, f"{run_dir}: not a run folder (no {RUN_FILE})")


def run_catalog(run_dir, name: str) -> Catalog:
    """The copy of catalog ``name`` kept in the run folder's ``inputs/``."""
    path = Path(run_dir) / "inputs" / f"catalog-{name}.toml"
    if not path.is_file():
        raise InputError(f"{run_dir}: catalog copy {path.name} is missing from inputs/")
    return load_catalog(path)
