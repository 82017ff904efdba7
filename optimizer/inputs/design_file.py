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
                 (void_fraction: the values are the solid's; reference_frequency_hz: the
                 frequency they hold at; see cablefam.optimizer.model.effective_dielectric)
    [jacket]     optional: id or thermal_resistivity_k_m_per_w, max_temperature_c, ...
    outer conductor (optional, in [geometry]): shield_construction ("tube" default, "foil",
                 "braid", "foil-braid", "double-braid"), braid_carriers, braid_ends,
                 braid_wire_diameter_m, braid_angle_deg, foil_thickness_m; shield_thickness_m
                 belongs to "tube" only; [foil] optional table (id or inline) for the foil's
                 material (default: the shield's)
    [operating]  frequency_hz, peak_voltage_v, current_a, field_safety_factor, power_w,
                 ambient_c, vswr (default 1), solar_irradiance_w_per_m2 (default 0),
                 screening_band_hz = [low, high] (optional)

A material table that gives ``id`` takes the record from the catalog; any other keys in the
table override the catalog's values.
"""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path
from typing import Annotated, Any, Literal

import numpy as np
from pydantic import Field, ValidationError, create_model, model_validator

from cablefam.optimizer.errors import InputError
from cablefam.optimizer.inputs.catalog import Catalog, load_catalog
from cablefam.optimizer.inputs.cladding import check_layer_fits, layer_numbers
from cablefam.optimizer.inputs.materials import (DESIGN_RECORDS, ConductorMaterial,
                                                 DielectricMaterial, JacketMaterial, Positive,
                                                 Record, ScreeningBand, Temperature,
                                                 check_band_order, read_toml, rule_error,
                                                 validate_record, validation_problems)
from cablefam.optimizer.model.slots import MATERIAL_SLOTS
from cablefam.physics.stranding import strand_layup

#: design-file table -> (catalog kind, record model), one entry per material slot
MATERIAL_TABLES = {s.name: (s.kind, DESIGN_RECORDS[s.kind]) for s in MATERIAL_SLOTS}


class Geometry(Record):
    """Radii and thicknesses [m]."""

    inner_radius_m: Annotated[float, Field(gt=0, lt=1.0)]
    dielectric_radius_m: Annotated[float, Field(gt=0, lt=1.0)]
    shield_thickness_m: Annotated[float, Field(gt=0, lt=1.0)] | None = None
    jacket_thickness_m: Annotated[float, Field(ge=0, lt=1.0)] = 0.0
    eccentricity_m: Annotated[float, Field(ge=0, lt=1.0)] = 0.0
    inner_strands: Literal[1, 7, 19, 37] = 1
    # --- outer conductors as built (braid, foil; issue 12) ---
    shield_construction: Literal["tube", "foil", "braid", "foil-braid",
                                 "double-braid"] | None = None
    braid_carriers: Annotated[int, Field(ge=2, le=200, strict=True)] | None = None
    braid_ends: Annotated[int, Field(ge=1, le=100, strict=True)] | None = None
    braid_wire_diameter_m: Annotated[float, Field(gt=0, lt=0.01)] | None = None
    braid_angle_deg: Annotated[float, Field(gt=0, lt=90)] | None = None
    foil_thickness_m: Annotated[float, Field(gt=0, lt=0.01)] | None = None

    @model_validator(mode="after")
    def _outer_conductor_keys(self):
        """Each construction has its keys and no others (see :mod:`outer_conductor_keys`)."""
        from cablefam.optimizer.model.outer_conductor import check_geometry_keys
        problem = check_geometry_keys(self)
        if problem is not None:
            raise rule_error(*problem)
        return self
    # --- end of the outer-conductor keys ---

    @model_validator(mode="after")
    def _conductors_apart(self):
        """b > a, and the offset centre conductor does not touch the shield."""
        a, b = self.inner_radius_m, self.dielectric_radius_m
        if b <= a:
            raise rule_error("dielectric_radius_m", b, f"must be greater than inner_radius_m "
                                                       f"= {a!r}")
        if self.eccentricity_m >= b - a:
            raise rule_error("eccentricity_m", self.eccentricity_m,
                             f"must be less than dielectric_radius_m - inner_radius_m = "
                             f"{b - a!r} (the conductors touch)")
        return self


class Operating(Record):
    """Operating point of one design."""

    frequency_hz: Annotated[float, Field(gt=0, le=1e12)]
    peak_voltage_v: Annotated[float, Field(ge=0)] | None = None
    current_a: Positive | None = None
    field_safety_factor: Annotated[float, Field(ge=1.0)] = 1.0
    power_w: Annotated[float, Field(ge=0)] | None = None
    ambient_c: Temperature = 20.0
    # ratings on the safe side: standing wave (power_w is the delivered power) and sun
    vswr: Annotated[float, Field(ge=1.0, le=1e3)] = 1.0
    solar_irradiance_w_per_m2: Annotated[float, Field(ge=0, le=1500.0)] = 0.0
    screening_band_hz: ScreeningBand | None = None
    """[low, high] over which the largest transfer impedance is reported (issue 12)."""

    @model_validator(mode="after")
    def _band_order(self):
        check_band_order(self.screening_band_hz)
        return self


#: The file's top level: the slot tables stay raw here (an ``id`` pulls a catalog record in
#: first), each is validated as its record model after that merge.
DesignFile = create_model(
    "DesignFile", __base__=Record, __doc__="Top level of a design file.",
    name=(str | None, None), description=(str | None, None), catalog=(str | None, None),
    geometry=(Geometry, ...),
    **{s.name: (dict[str, Any] | None, None) if s.optional else (dict[str, Any], ...)
       for s in MATERIAL_SLOTS},
    operating=(Operating, ...),
    foil=(dict[str, Any] | None, None))


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
    layers: dict[str, dict[str, float]] | None = None
    """Clad/plated layer and roughness keys of the conductor and shield tables
    (:func:`cablefam.optimizer.inputs.cladding.layer_numbers`); None: none."""
    foil: ConductorMaterial | None = None
    """Material of the foil (None: the shield's)."""


def _material(data: dict, table: str, catalog: Catalog | None, where: str):
    kind, model = MATERIAL_TABLES[table]
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
        if "cladding" in data:  # the design's own layer replaces the record's
            for key in ("cladding", "cladding_thickness_m", "cladding_area_fraction"):
                base.pop(key, None)
        data = {**base, **data}
    return validate_record(model, data, where, table), material_id


def parse_design(raw: dict, where: str, base_dir: Path) -> Design:
    """Validate a parsed design table (from TOML or built by a tool)."""
    try:
        spec = DesignFile.model_validate(raw)
    except ValidationError as exc:
        raise InputError(validation_problems(exc, where, DesignFile)[0]) from None
    catalog = None if spec.catalog is None else load_catalog(base_dir / spec.catalog)
    ids = {}
    records = {}
    for table in MATERIAL_TABLES:
        data = getattr(spec, table)
        if data is None:
            records[table], ids[table] = None, None
            continue
        records[table], ids[table] = _material(data, table, catalog, where)
    name = spec.name if spec.name is not None else Path(where).stem
    layers = _layers(records, spec.geometry, catalog, where)
    foil = None
    if spec.foil is not None:
        foil = _foil_material(spec.foil, catalog, where)
    return Design(name=name, geometry=spec.geometry, operating=spec.operating,
                  material_ids=ids, catalog=catalog, **records, layers=layers, foil=foil)


def _layers(records, g: Geometry, catalog, where):
    """Clad/plated layers of the two conductors, checked against the metal they cover."""
    strand = g.inner_radius_m / float(strand_layup(g.inner_strands).diameter_ratio)
    room = {"conductor": (strand, "[geometry] inner_radius_m" if g.inner_strands == 1
                          else "the strand radius"),
            "shield": _shield_metal(g)}
    layers = {}
    for table, (space, space_key) in room.items():
        numbers = layer_numbers(records[table], catalog, where, table)
        check_layer_fits(numbers, space, where, table, space_key)
        if numbers:
            layers[table] = numbers
    return layers or None


def _shield_metal(g: Geometry):
    """The thinnest metal a shield plating covers, and the key that gives it: the tube's wall,
    a braid wire's radius or the foil (braid and foil constructions)."""
    if g.shield_thickness_m is not None:
        return g.shield_thickness_m, "[geometry] shield_thickness_m"
    if g.braid_wire_diameter_m is not None:
        return 0.5 * g.braid_wire_diameter_m, "half of [geometry] braid_wire_diameter_m"
    return g.foil_thickness_m, "[geometry] foil_thickness_m"


def _foil_material(data: dict, catalog: Catalog | None, where: str):
    """The [foil] table: a conductor record (``id`` from the catalog, keys override)."""
    data = dict(data)
    material_id = data.pop("id", None)
    if material_id is not None:
        if catalog is None or not isinstance(material_id, str):
            raise InputError(f"{where}: [foil] id = {material_id!r}: needs a string id and a "
                             "top-level `catalog = \"path/to/catalog.toml\"`")
        base = catalog.get("conductor", material_id, f"{where}: [foil]").model_dump(
            exclude_none=True)
        data = {**base, **data}
    return validate_record(ConductorMaterial, data, where, "foil")


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

    from cablefam.optimizer.model.outer_conductor import design_outer_fields

    g = design.geometry
    layers = design.layers or {}
    inner, shield = table(design.conductor), table(design.shield)
    inner.update({k: np.array([v]) for k, v in layers.get("conductor", {}).items()})
    shield.update({k: np.array([v]) for k, v in layers.get("shield", {}).items()})
    outer = design_outer_fields(g, table(design.foil))
    designs = Designs(
        inner_radius=np.array([g.inner_radius_m]),
        dielectric_radius=np.array([g.dielectric_radius_m]),
        shield_thickness=np.array([outer.pop("shield_thickness")]),
        jacket_thickness=np.array([g.jacket_thickness_m]),
        inner=inner, shield=shield,
        dielectric=table(design.dielectric), jacket=table(design.jacket),
        eccentricity=np.array([g.eccentricity_m]), inner_strands=np.array([g.inner_strands]),
        **outer)
    o = design.operating
    op = OperatingPoint(frequency_hz=o.frequency_hz, peak_voltage_v=o.peak_voltage_v,
                        current_a=o.current_a, field_safety_factor=o.field_safety_factor,
                        power_w=o.power_w, ambient_c=o.ambient_c, vswr=o.vswr,
                        solar_irradiance_w_per_m2=o.solar_irradiance_w_per_m2,
                        screening_band_hz=(None if o.screening_band_hz is None
                                           else tuple(o.screening_band_hz)))
    return designs, op
