"""Turn a row of ``front.parquet`` back into a design file that ``cablefam inspect`` accepts.

The TOML is written by tomli-w (strings of any Unicode, floats that read back bit for bit);
tomllib reads it back to the same values.
"""

from __future__ import annotations

import math

import tomli_w

from cablefam.optimizer.inputs.cladding import inline_layer
from cablefam.optimizer.inputs.design_file import MATERIAL_TABLES
from cablefam.optimizer.errors import InputError
from cablefam.optimizer.run_folder.reader import read_front, run_catalog
from cablefam.optimizer.inputs.sweep_spec import GEOMETRY_KEYS
from cablefam.optimizer.model.outer_conductor import outer_geometry_keys

_OPERATING = ("frequency_hz", "peak_voltage_v", "power_w", "ambient_c", "field_safety_factor",
              "vswr", "solar_irradiance_w_per_m2")


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


def _comment(text: str) -> str:
    """``text`` as one TOML comment line: control characters written as escapes."""
    return "# " + "".join(c if c.isprintable() else repr(c)[1:-1] for c in text)


def _front_row_document(run_dir, member: str, index: int, catalog: str | None):
    """The design file's tables (materials inline) of one front row, its catalog name and
    where each material table comes from (``conductor id 'copper'``)."""
    df, provenance = read_front(run_dir)
    row = select_row(df, member, index, catalog)
    cat = run_catalog(run_dir, row["catalog"])
    doc: dict = {"name": f"{member}-{row['catalog']}-{index}",
                 "geometry": {k: float(row[k]) for k in GEOMETRY_KEYS}}
    if int(row.get("inner_strands", 1)) != 1:
        doc["geometry"]["inner_strands"] = int(row["inner_strands"])
    outer = outer_geometry_keys(row)
    if outer.get("shield_construction", "tube") != "tube":
        del doc["geometry"]["shield_thickness_m"]  # the build follows from the layers
    doc["geometry"].update(outer)
    ids = {}
    for table, (kind, _) in MATERIAL_TABLES.items():
        mid = row[table]
        if not mid:
            continue
        ids[table] = f"{kind} id {mid!r}"
        doc[table] = cat.get(kind, mid, f"run {run_dir}").model_dump(exclude_none=True)
        if doc[table].get("foamable") and "void_fraction" in row:  # the search's void fraction
            doc[table]["void_fraction"] = float(row["void_fraction"])
        if kind == "conductor":  # a clad record's layer, inline too
            doc[table] = inline_layer(doc[table], cat, f"run {run_dir}")
    doc["operating"] = {k: float(row[k]) for k in _OPERATING
                        if k in row and not math.isnan(float(row[k]))}
    band = next((m.get("screening_band_hz") for m in provenance.get("members", ())
                 if m.get("name") == member), None)
    if band is not None:  # the member's screening band, for the same |Z_T| max
        doc["operating"]["screening_band_hz"] = [float(v) for v in band]
    return doc, row["catalog"], ids


def front_row_design_toml(run_dir, member: str, index: int, catalog: str | None = None) -> str:
    """A self-contained design file (materials inline) for one front row."""
    doc, catalog_name, ids = _front_row_document(run_dir, member, index, catalog)
    header = [f"Design exported from run {run_dir}: member {member}, catalog {catalog_name}, "
              f"row {index}.", "Materials copied inline from the run's catalog copy."]
    parts = ["\n".join(_comment(line) for line in header) + "\n"
             + tomli_w.dumps({"name": doc.pop("name")})]
    for table, values in doc.items():  # one table at a time: a comment above each material
        comment = _comment(ids[table]) + "\n" if table in ids else ""
        parts.append(comment + tomli_w.dumps({table: values}))
    return "\n".join(parts)
