"""Clad and plated conductors in input files: resolve a record's layer into the flat keys of
:mod:`cablefam.optimizer.model.conductor_layers`.

Two spellings, one meaning:

- a catalog conductor record: ``cladding = "<id>"`` (another conductor of the same catalog)
  with ``cladding_thickness_m`` or ``cladding_area_fraction``; the record's own keys are the
  core metal's;
- a design file: a ``[conductor.cladding]`` / ``[shield.cladding]`` table
  (:class:`cablefam.optimizer.inputs.materials.CladdingLayer`) with the layer metal by ``id``
  and/or inline keys, and ``thickness_m`` or ``area_fraction``.

Both may give ``surface_roughness_m`` on the conductor record (rms, >= 0).
"""

from __future__ import annotations

import numpy as np

from cablefam.optimizer.errors import InputError
from cablefam.optimizer.inputs.materials import CladdingLayer, validate_record
from cablefam.optimizer.model.conductor_layers import LAYER_KEYS

#: Keys of the layer metal copied (with a ``cladding_`` prefix) into the designs' tables.
_METAL_KEYS = ("resistivity_ohm_m", "temperature_coefficient_per_k", "relative_permeability",
               "density_kg_per_m3", "price_per_kg")


def _metal(catalog, metal_id, where, label):
    if catalog is None:
        raise InputError(f"{where}: {label} = {metal_id!r}: needs a top-level "
                         "`catalog = \"path/to/catalog.toml\"`")
    record = catalog.get("conductor", metal_id, f"{where}: {label}")
    if record.cladding is not None:
        raise InputError(f"{where}: {label} = {metal_id!r}: a layer metal cannot itself be "
                         f"clad (that record names cladding = {record.cladding!r})")
    return record.model_dump(exclude_none=True)


def layer_numbers(record, catalog, where: str, table: str) -> dict[str, float]:
    """The layer and roughness keys of one conductor record (empty: homogeneous, smooth)."""
    out = {}
    if record.surface_roughness_m is not None:
        out["surface_roughness_m"] = float(record.surface_roughness_m)
    layer = record.cladding
    if layer is None:
        return out
    if isinstance(layer, str):
        metal = _metal(catalog, layer, where, f"[{table}] cladding")
        thickness, fraction = record.cladding_thickness_m, record.cladding_area_fraction
    else:
        spec = validate_record(CladdingLayer, layer, where, f"{table}.cladding")
        metal = {} if spec.id is None else _metal(catalog, spec.id, where,
                                                  f"[{table}.cladding] id")
        metal.update(spec.model_dump(exclude_none=True))
        thickness, fraction = spec.thickness_m, spec.area_fraction
    out["cladding_thickness_m"] = float(thickness or 0.0)
    out["cladding_area_fraction"] = float(fraction or 0.0)
    for key in _METAL_KEYS:
        if key in metal:
            out[f"cladding_{key}"] = float(metal[key])
    return out


def plain_numbers(record) -> dict[str, float]:
    """The numeric keys of a record other than its layer keys."""
    return {k: v for k, v in record.model_dump().items()
            if isinstance(v, (int, float)) and not isinstance(v, bool) and k not in LAYER_KEYS}


def check_layer_fits(numbers: dict[str, float], room: float, where: str, table: str,
                     room_key: str):
    """InputError unless a layer given by thickness is thinner than the metal it covers."""
    t = numbers.get("cladding_thickness_m", 0.0)
    if t > 0.0 and t >= room:
        raise InputError(f"{where}: [{table}] cladding thickness = {t!r}: must be less than "
                         f"{room_key} = {room!r} (the layer is thicker than the wire)")


def property_table(records, catalog, where: str) -> dict[str, np.ndarray]:
    """One array per numeric key over conductor records (a search's material choices).

    Without any layer or roughness: exactly the records' numeric keys. With some: every record
    gets every layer key; those without a layer get thickness and area share 0 (the physics then
    keeps their homogeneous numbers) and their own metal's values.
    """
    rows = [plain_numbers(r) for r in records]
    layers = [layer_numbers(r, catalog, where, "conductor") for r in records]
    if not any(layers):
        return {k: np.array([row[k] for row in rows], dtype=float) for k in rows[0]}
    keys = list(rows[0]) + [k for k in LAYER_KEYS if any(k in lay for lay in layers)]
    table = {}
    for key in keys:
        values = []
        for row, lay in zip(rows, layers):
            if key in row:
                values.append(row[key])
            elif key in lay:
                values.append(lay[key])
            elif key.startswith("cladding_") and key[len("cladding_"):] in row:
                values.append(row[key[len("cladding_"):]])
            elif key == "cladding_relative_permeability":
                values.append(1.0)
            else:
                values.append(0.0)
        table[key] = np.array(values, dtype=float)
    return table


def inline_layer(record: dict, catalog, where: str) -> dict:
    """A dumped conductor record with a catalog-style layer (``cladding = "<id>"``) rewritten
    as an inline ``cladding`` table (the layer metal's keys and its size), for a
    self-contained design file; other records are returned unchanged."""
    layer = record.get("cladding")
    if not isinstance(layer, str):
        return record
    out = dict(record)
    del out["cladding"]
    metal = _metal(catalog, layer, where, "cladding")
    thickness = out.pop("cladding_thickness_m", None)
    fraction = out.pop("cladding_area_fraction", None)
    if thickness is not None:
        metal["thickness_m"] = thickness
    if fraction is not None:
        metal["area_fraction"] = fraction
    out["cladding"] = metal
    return out
