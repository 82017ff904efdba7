"""Turn a row of ``front.parquet`` back into a design file that ``cablefam inspect`` accepts."""

from __future__ import annotations

import json
import math

from cablefam.optimizer.inputs.design_file import MATERIAL_TABLES
from cablefam.optimizer.errors import InputError
from cablefam.optimizer.run_folder.reader import read_front, run_catalog
from cablefam.optimizer.inputs.sweep_spec import GEOMETRY_KEYS

_OPERATING = ("frequency_hz", "peak_voltage_v", "power_w", "ambient_c", "field_safety_factor")


def _toml_value(v) -> str:
    if isinstance(v, str):
        return json.dumps(v)  # a TOML basic string
    if isinstance(v, bool):
        return "true" if v else "false"
    return repr(float(v)) if isinstance(v, float) else str(v)


def select_row(df, member: str, index: int, catalog: str | None = None):
    rows = df[df["member"] == member]
    if rows.empty:
        known = ", ".join(sorted(df["member"].unique()))
        raise InputError(f"member = {member!r}: not in this run (members: {known})")
    if catalog is not None:
        rows = rows[rows["catalog"] == catalog]
        if rows.empty:
            raise InputError(f"catalog = {catalog!r}: no rows of member {member!r}")
    if not 0 <= index < len(rows):
        raise InputError(f"index = {index}: member {member!r} has rows 0..{len(rows) - 1}")
    return rows.iloc[index]


def front_row_design_toml(run_dir, member: str, index: int, catalog: str | None = None) -> str:
    """A self-contained design file (materials inline) for one front row."""
    df, _ = read_front(run_dir)
    row = select_row(df, member, index, catalog)
    cat = run_catalog(run_dir, row["catalog"])
    lines = [f"# Design exported from run {run_dir}: member {member}, catalog {row['catalog']},",
             f"# row {index}. Materials copied inline from the run's catalog copy.",
             f"name = {_toml_value(member + '-' + row['catalog'] + '-' + str(index))}", "",
             "[geometry]"]
    lines += [f"{k} = {_toml_value(float(row[k]))}" for k in GEOMETRY_KEYS]
    if int(row.get("inner_strands", 1)) != 1:
        lines.append(f"inner_strands = {int(row['inner_strands'])}")
    for table, (kind, _) in MATERIAL_TABLES.items():
        mid = row[table]
        if not mid:
            continue
        record = cat.get(kind, mid, f"run {run_dir}")
        lines += ["", f"[{table}]  # {kind} id {mid!r}"]
        for k, v in record.model_dump(exclude_none=True).items():
            lines.append(f"{k} = {_toml_value(v)}")
    lines += ["", "[operating]"]
    for k in _OPERATING:
        v = float(row[k])
        if not math.isnan(v):
            lines.append(f"{k} = {_toml_value(v)}")
    return "\n".join(lines) + "\n"
