"""Design files: one coax described in TOML, read and validated for ``cablefam inspect``.

Keys (a contract: add freely, rename none)::

    name = "..."                      # optional
    catalog = "catalogs/baseline.toml"   # optional, relative to this file
    [geometry]   inner_radius_m, dielectric_radius_m, shield_thickness_m, jacket_thickness_m,
                 eccentricity_m (offset of the centre conductor, default 0),
                 inner_strands (1, 7, 19 or 37; inner_radius_m is then the overall radius)
    [conductor]  id = "copper"  or  resistivity_ohm_m, temperature_coefficient_per_k, ...
    [shield]     same keys as [conductor]
    [dielectric] id or relative_permittivity, loss_tangent, dielectric_strength_v_per_m, ...
    [jacket]     optional: id or thermal_resistivity_k_m_per_w, max_temperature_c, ...
    [operating]  frequency_hz, peak_voltage_v, current_a, field_safety_factor, power_w,
                 ambient_c

A material table that gives ``id`` takes the record from the catalog; any other keys in the
table override the catalog's values.
"""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path
from typing import Annotated, Literal

import numpy as np
from pydantic import Field

from cablefam.optimizer.inputs.catalog import Catalog, load_catalog
from cablefam.optimizer.errors import InputError
from cablefam.optimizer.inputs.materials import (ConductorMaterial, DielectricMaterial, JacketMaterial, Positive,
                                 Record, Temperature, read_toml, validate_record)

_TOP_KEYS = {"name", "description", "catalog", "geometry", "conductor", "shield", "dielectric",
             "jacket", "operating"}
#: design-file table -> (catalog kind, record model)
MATERIAL_TABLES = {
    "conductor": ("conductor", ConductorMaterial),
    "shield": ("conductor", ConductorMaterial),
    "dielectric": ("dielectric", DielectricMaterial),
    "jacket": ("jacket", JacketMaterial),
}


class Geometry(Record):
    """Radii and thicknesses [m]."""

    inner_radius_m: Annotated[float, Field(gt=0, lt=1.0)]
    dielectric_radius_m: Annotated[float, Field(gt=0, lt=1.0)]
    shield_thickness_m: Annotated[float, Field(gt=0, lt=1.0)]
    jacket_thickness_m: Annotated[float, Field(ge=0, lt=1.0)] = 0.0
    eccentricity_m: Annotated[float, Field(ge=0, lt=1.0)] = 0.0
    inner_strands: Literal[1, 7, 19, 37] = 1


class Operating(Record):
    """Operating point of one design."""

    frequency_hz: Annotated[float, Field(gt=0, le=1e12)]
    peak_voltage_v: Annotated[float, Field(ge=0)] | None = None
    current_a: Positive | None = None
    field_safety_factor: Annotated[float, Field(ge=1.0)] = 1.0
    power_w: Annotated[float, Field(ge=0)] | None = None
    ambient_c: Temperature = 20.0


@dataclass(frozen=True)
class Design:
    """A validated design file."""

    name: str
    geometry: Geometry
    conductor: ConductorMaterial
    shield: ConductorMaterial
    dielectric: DielectricMaterial
    jacket: JacketMaterial | None
    operating: Operating
    material_ids: dict[str, str | None]
    catalog: Catalog | None = None


def check_geometry(g: Geometry, where: str) -> None:
    """The one geometric condition pydantic cannot see field by field: b > a."""
    if g.dielectric_radius_m <= g.inner_radius_m:
        raise InputError(f"{where}: [geometry] dielectric_radius_m = {g.dielectric_radius_m!r}: "
                         f"must be greater than inner_radius_m = {g.inner_radius_m!r}")
    if g.eccentricity_m >= g.dielectric_radius_m - g.inner_radius_m:
        raise InputError(f"{where}: [geometry] eccentricity_m = {g.eccentricity_m!r}: must be "
                         "less than dielectric_radius_m - inner_radius_m = "
                         f"{g.dielectric_radius_m - g.inner_radius_m!r} (the conductors touch)")


def _material(raw: dict, table: str, catalog: Catalog | None, where: str):
    kind, model = MATERIAL_TABLES[table]
    data = raw.get(table)
    if not isinstance(data, dict):
        raise InputError(f"{where}: [{table}] must be a table, got {data!r}")
    data = dict(data)
    material_id = data.pop("id", None)
    if material_id is not None:
        if not isinstance(material_id, str):
            raise InputError(f"{where}: [{table}] id = {material_id!r}: must be a string")
        if catalog is None:
            raise InputError(f"{where}: [{table}] id = {material_id!r}: needs a top-level "
                             "`catalog = \"path/to/catalog.toml\"`")
        base = catalog.get(kind, material_id, f"{where}: [{table}]").model_dump(
            exclude_none=True)
        data = {**base, **data}
    return validate_record(model, data, where, table), material_id


def parse_design(raw: dict, where: str, base_dir: Path) -> Design:
    """Validate a parsed design table (from TOML or built by a tool)."""
    for key in raw:
        if key not in _TOP_KEYS:
            raise InputError(f"{where}: {key} = {raw[key]!r}: unknown key (allowed: "
                             + ", ".join(sorted(_TOP_KEYS)) + ")")
    for table in ("geometry", "conductor", "shield", "dielectric", "operating"):
        if table not in raw:
            raise InputError(f"{where}: [{table}]: required table is missing")
    catalog = None
    if "catalog" in raw:
        if not isinstance(raw["catalog"], str):
            raise InputError(f"{where}: catalog = {raw['catalog']!r}: must be a path string")
        catalog = load_catalog(base_dir / raw["catalog"])
    geometry = validate_record(Geometry, raw["geometry"], where, "geometry")
    check_geometry(geometry, where)
    operating = validate_record(Operating, raw["operating"], where, "operating")
    ids = {}
    records = {}
    for table in MATERIAL_TABLES:
        if table == "jacket" and "jacket" not in raw:
            records[table], ids[table] = None, None
            continue
        records[table], ids[table] = _material(raw, table, catalog, where)
    name = raw.get("name", Path(where).stem)
    if not isinstance(name, str):
        raise InputError(f"{where}: name = {name!r}: must be a string")
    return Design(name=name, geometry=geometry, operating=operating, material_ids=ids,
                  catalog=catalog, **records)


def load_design(path) -> Design:
    """Read and validate a design file; problems raise :class:`InputError`."""
    path = Path(path)
    return parse_design(read_toml(path), str(path), path.parent)


def design_arrays(design: Design):
    """The design as one-element arrays for :func:`cablefam.optimizer.model.evaluate.evaluate`."""
    from cablefam.optimizer.model.evaluate import Designs, OperatingPoint

    def table(record):
        if record is None:
            return None
        return {k: np.array([v], dtype=float) for k, v in record.model_dump(
            exclude_none=True).items() if isinstance(v, (int, float))}

    g = design.geometry
    designs = Designs(
        inner_radius=np.array([g.inner_radius_m]),
        dielectric_radius=np.array([g.dielectric_radius_m]),
        shield_thickness=np.array([g.shield_thickness_m]),
        jacket_thickness=np.array([g.jacket_thickness_m]),
        inner=table(design.conductor), shield=table(design.shield),
        dielectric=table(design.dielectric), jacket=table(design.jacket),
        eccentricity=np.array([g.eccentricity_m]), inner_strands=np.array([g.inner_strands]))
    o = design.operating
    op = OperatingPoint(frequency_hz=o.frequency_hz, peak_voltage_v=o.peak_voltage_v,
                        current_a=o.current_a, field_safety_factor=o.field_safety_factor,
                        power_w=o.power_w, ambient_c=o.ambient_c)
    return designs, op
