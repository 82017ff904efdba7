"""Material records shared by design files and catalogs, validated with pydantic.

One format serves both: a design file's slot tables (``[conductor]``, ``[shield]``,
``[dielectric]``, ``[jacket]``: :mod:`cablefam.optimizer.model.slots`) take the same keys as
the catalog tables of the slot's kind (``[conductor.<id>]`` for both conductor and shield). In a design
file the keys that only the thermal rating, mass or cost need are optional; in a catalog every
physical key is required (:class:`CatalogConductor` and friends).

Problems come out as one line each, ``file: [table] key = value: message``
(:func:`problem_line`); rules across fields are model validators raising :func:`rule_error`.
"""

from __future__ import annotations

import tomllib
from pathlib import Path
from types import UnionType
from typing import Annotated, Any, Union, get_args, get_origin

from pydantic import BaseModel, ConfigDict, Field, ValidationError, model_validator
from pydantic_core import PydanticCustomError

from cablefam.optimizer.errors import InputError

#: Temperatures accepted anywhere [degC]: below -100 or above 400 is a typo, not a material.
TEMPERATURE_RANGE_C = (-100.0, 400.0)

Temperature = Annotated[float, Field(ge=TEMPERATURE_RANGE_C[0], le=TEMPERATURE_RANGE_C[1])]
Positive = Annotated[float, Field(gt=0)]
Density = Annotated[float, Field(gt=0, le=25_000)]
Price = Annotated[float, Field(ge=0)]
#: Total emissivity of a surface (absent: the IEC 60287-2-1 black-surface constants).
Emissivity = Annotated[float, Field(gt=0, le=1)]
#: Absorption coefficient of a surface for solar radiation.
Absorption = Annotated[float, Field(ge=0, le=1)]
#: [low, high] of a screening band [Hz] (design files' [operating] and sweep members).
ScreeningBand = Annotated[list[Annotated[float, Field(gt=0, le=1e12)]],
                          Field(min_length=2, max_length=2)]
#: Error type of :func:`rule_error`.
RULE_ERROR = "rule"
#: pydantic error types of a value that should have been a table.
_NOT_A_TABLE = ("model_type", "dict_type", "model_attributes_type")


class Record(BaseModel):
    """Strict base: unknown keys are errors, strings are not numbers, inf and nan are not
    values, records are immutable."""

    model_config = ConfigDict(extra="forbid", strict=True, frozen=True, allow_inf_nan=False)


class CladdingLayer(Record):
    """A conductor's surface layer in a design file, ``[conductor.cladding]`` /
    ``[shield.cladding]``: the layer metal (catalog ``id`` and/or inline keys) and exactly one
    of ``thickness_m`` or ``area_fraction`` (its share of each wire's cross-section)."""

    id: str | None = None
    resistivity_ohm_m: Annotated[float, Field(gt=0, lt=1e-5)] | None = None
    temperature_coefficient_per_k: Annotated[float, Field(ge=-0.01, le=0.02)] | None = None
    relative_permeability: Annotated[float, Field(ge=1.0, le=1e5)] | None = None
    density_kg_per_m3: Density | None = None
    price_per_kg: Price | None = None
    name: str | None = None
    source: str | None = None
    thickness_m: Annotated[float, Field(gt=0, lt=1.0)] | None = None
    area_fraction: Annotated[float, Field(gt=0, lt=1)] | None = None

    @model_validator(mode="after")
    def _one_size(self):
        """Exactly one of thickness_m and area_fraction; a metal by id or resistivity."""
        if (self.thickness_m is None) == (self.area_fraction is None):
            value = (self.thickness_m, self.area_fraction)
            raise rule_error("thickness_m" if self.thickness_m is not None else "area_fraction",
                             value if self.thickness_m is not None else None,
                             "give exactly one of thickness_m and area_fraction")
        if self.id is None and self.resistivity_ohm_m is None:
            raise rule_error("resistivity_ohm_m", None,
                             "the layer needs a catalog id or its own resistivity_ohm_m")
        return self


class ConductorMaterial(Record):
    """Metal of the centre conductor or of the shield (tube, braid wires or foil)."""

    resistivity_ohm_m: Annotated[float, Field(gt=0, lt=1e-5)]
    temperature_coefficient_per_k: Annotated[float, Field(ge=-0.01, le=0.02)] | None = None
    relative_permeability: Annotated[float, Field(ge=1.0, le=1e5)] = 1.0
    density_kg_per_m3: Density | None = None
    price_per_kg: Price | None = None
    name: str | None = None
    source: str | None = None
    # ratings on the safe side: a bare outer conductor's surface (used where there is no jacket)
    surface_emissivity: Emissivity | None = None
    solar_absorption: Absorption | None = None
    # clad and plated conductors, surface roughness (the record's own keys are the core's)
    cladding: str | dict[str, Any] | None = None
    """A catalog id (with cladding_thickness_m or cladding_area_fraction), or in a design file
    a :class:`CladdingLayer` table (validated when the design is read)."""
    cladding_thickness_m: Annotated[float, Field(gt=0, lt=1.0)] | None = None
    cladding_area_fraction: Annotated[float, Field(gt=0, lt=1)] | None = None
    surface_roughness_m: Annotated[float, Field(ge=0, lt=1e-3)] | None = None

    @model_validator(mode="after")
    def _cladding_size(self):
        """A catalog-style ``cladding = "<id>"`` takes exactly one of cladding_thickness_m and
        cladding_area_fraction; a cladding table carries its own; no cladding, neither."""
        t, f = self.cladding_thickness_m, self.cladding_area_fraction
        key = "cladding_thickness_m" if t is not None else "cladding_area_fraction"
        value = t if t is not None else f
        if isinstance(self.cladding, str):
            if (t is None) == (f is None):
                raise rule_error(key, value, "with cladding = \"<id>\" give exactly one of "
                                             "cladding_thickness_m and cladding_area_fraction")
        elif t is not None or f is not None:
            where = "inside the cladding table" if self.cladding is not None else (
                "only with cladding = \"<id>\"")
            raise rule_error(key, value, f"allowed {where}")
        return self


class DielectricMaterial(Record):
    """Insulation between centre conductor and shield (non-magnetic)."""

    relative_permittivity: Annotated[float, Field(ge=1.0, le=100.0)]
    loss_tangent: Annotated[float, Field(ge=0.0, lt=1.0)]
    dielectric_strength_v_per_m: Annotated[float, Field(gt=0, le=1e10)] | None = None
    density_kg_per_m3: Density | None = None
    max_temperature_c: Temperature | None = None
    thermal_resistivity_k_m_per_w: Positive | None = None
    price_per_kg: Price | None = None
    name: str | None = None
    source: str | None = None
    # foamed dielectric by void fraction and dielectric dispersion: with void_fraction the
    # values above are the solid polymer's; with reference_frequency_hz the permittivity and
    # loss tangent hold at that frequency (elsewhere the wideband Debye model); foamable: a
    # sweep's [search] void_fraction sets this dielectric's void fraction
    void_fraction: Annotated[float, Field(ge=0.0, lt=1.0)] | None = None
    reference_frequency_hz: Annotated[float, Field(gt=0, le=1e12)] | None = None
    foamable: bool | None = None


class JacketMaterial(Record):
    """Outer sheath over the shield."""

    thermal_resistivity_k_m_per_w: Positive | None = None
    max_temperature_c: Temperature | None = None
    density_kg_per_m3: Density | None = None
    price_per_kg: Price | None = None
    name: str | None = None
    source: str | None = None
    # ratings on the safe side: surface emissivity (absent: IEC black surface) and sun
    surface_emissivity: Emissivity | None = None
    solar_absorption: Absorption | None = None


class CatalogConductor(ConductorMaterial):
    cladding: str | None = None
    temperature_coefficient_per_k: Annotated[float, Field(ge=-0.01, le=0.02)]
    density_kg_per_m3: Density
    price_per_kg: Price
    source: str


class CatalogDielectric(DielectricMaterial):
    dielectric_strength_v_per_m: Annotated[float, Field(gt=0, le=1e10)]
    density_kg_per_m3: Density
    max_temperature_c: Temperature
    thermal_resistivity_k_m_per_w: Positive
    price_per_kg: Price
    source: str


class CatalogJacket(JacketMaterial):
    thermal_resistivity_k_m_per_w: Positive
    max_temperature_c: Temperature
    density_kg_per_m3: Density
    price_per_kg: Price
    source: str


#: Catalog kind (:data:`cablefam.optimizer.model.slots.CATALOG_KINDS`) -> record of a design
#: file's slot table of that kind, and of a catalog's ``[kind.<id>]`` table.
DESIGN_RECORDS = {"conductor": ConductorMaterial, "dielectric": DielectricMaterial,
                  "jacket": JacketMaterial}
CATALOG_RECORDS = {"conductor": CatalogConductor, "dielectric": CatalogDielectric,
                   "jacket": CatalogJacket}


def read_toml(path) -> dict:
    """Parse a TOML file; an unreadable or malformed file is an :class:`InputError`."""
    path = Path(path)
    try:
        with open(path, "rb") as fh:
            return tomllib.load(fh)
    except FileNotFoundError:
        raise InputError(f"{path}: file not found") from None
    except IsADirectoryError:
        raise InputError(f"{path}: is a folder, not a TOML file") from None
    except tomllib.TOMLDecodeError as exc:
        raise InputError(f"{path}: not valid TOML ({exc})") from None
    except (OSError, UnicodeDecodeError) as exc:
        raise InputError(f"{path}: cannot read ({exc})") from None


def rule_error(key: str, value, reason: str) -> PydanticCustomError:
    """The error a model validator raises for a rule across fields: it names the key (dotted
    below the model that checks it) and the value, as every other problem line does."""
    return PydanticCustomError(RULE_ERROR, "{reason}", {"key": key, "value": value,
                                                          "reason": reason})


def check_band_order(band):
    """A model validator's check of a :data:`ScreeningBand`: low <= high."""
    if band is not None and not band[0] <= band[1]:
        raise rule_error("screening_band_hz", band, "low must not exceed high")


def _unwrap(tp):
    """``X`` of ``Annotated[X, ...]`` and of ``X | None``."""
    while True:
        origin = get_origin(tp)
        if origin is Annotated:
            tp = get_args(tp)[0]
        elif origin in (Union, UnionType):
            args = [a for a in get_args(tp) if a is not type(None)]
            if len(args) != 1:
                return tp
            tp = args[0]
        else:
            return tp


def _is_model(tp) -> bool:
    tp = _unwrap(tp)
    return isinstance(tp, type) and issubclass(tp, BaseModel)


def _is_table(tp) -> bool:
    """A TOML table: a model or a mapping."""
    tp = _unwrap(tp)
    return _is_model(tp) or tp is dict or get_origin(tp) is dict


def _entry_type(tp, part):
    """Type of entry ``part`` of ``tp`` (model field, mapping value, list item), or None."""
    tp = _unwrap(tp)
    if _is_model(tp):
        field = tp.model_fields.get(part) if isinstance(part, str) else None
        return None if field is None else field.annotation
    if get_origin(tp) in (dict, list):
        return get_args(tp)[-1]
    return None


def problem_line(err: dict, where: str, model: type[BaseModel], table: str | None = None,
                 tables: bool = True) -> str:
    """One pydantic error as ``where: [table] key = value: message``.

    ``model`` is the model that was validated and ``table`` the TOML table it stands for
    (``None``: the whole file). With ``tables`` the location is split into the innermost TOML
    table, in brackets, and the key in it; without, the location is one dotted key.
    """
    loc = list(err["loc"])
    value = err.get("input")
    if err["type"] == RULE_ERROR:
        loc += err["ctx"]["key"].split(".")
        value = err["ctx"]["value"]
    types = [model]
    for part in loc:
        types.append(_entry_type(types[-1], part) if types[-1] is not None else None)
    split = max(i for i in range(len(loc)) if _is_table(types[i])) if loc and tables else 0
    prefix = [table] if table else []
    table_parts = prefix + [str(p) for p in loc[:split]]
    key = ".".join(str(p) for p in (loc[split:] if tables else loc))
    head = f"{where}: [{'.'.join(table_parts)}]" if tables and table_parts else f"{where}:"
    kind = err["type"]
    if not key:
        return f"{head} {err['msg']}"
    parent = _unwrap(types[len(loc) - 1])
    if kind == "missing":
        if _is_table(types[-1]):
            return f"{where}: [{'.'.join(table_parts + [key])}]: required table is missing"
        return f"{head} {key}: required key is missing"
    if kind == "extra_forbidden":
        allowed = list(parent.model_fields) if _is_model(parent) else []
        known = f" (allowed: {', '.join(allowed)})" if allowed else ""
        if allowed and all(_is_table(f.annotation) for f in parent.model_fields.values()):
            return f"{head} [{key}]: unknown table{known}"
        return f"{head} {key} = {value!r}: unknown key{known}"
    if kind in _NOT_A_TABLE and _is_table(types[-1]):
        return f"{head} {key} = {value!r}: must be a table"
    message = err["msg"]
    if kind == "value_error":  # a field validator's ValueError: its text, without the prefix
        message = str(err["ctx"]["error"])
    return f"{head} {key} = {value!r}: {message}"


def validation_problems(exc: ValidationError, where: str, model: type[BaseModel],
                        table: str | None = None, tables: bool = True) -> list[str]:
    """One line per pydantic error (:func:`problem_line`), in pydantic's order."""
    return [problem_line(err, where, model, table, tables) for err in exc.errors()]


def validate_record(model: type[Record], data, where: str, table: str):
    """Validate ``data`` as ``model``; raise one :class:`InputError` line on the first problem."""
    if not isinstance(data, dict):
        raise InputError(f"{where}: [{table}] must be a table, got {data!r}")
    try:
        return model.model_validate(data)
    except ValidationError as exc:
        raise InputError(validation_problems(exc, where, model, table)[0]) from None
