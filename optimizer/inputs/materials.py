"""Material records shared by design files and catalogs, validated with pydantic.

One format serves both: a design file's ``[conductor]``, ``[shield]``, ``[dielectric]`` and
``[jacket]`` tables take the same keys as a catalog's ``[conductor.<id>]`` tables. In a design
file the keys that only the thermal rating, mass or cost need are optional; in a catalog every
physical key is required (:class:`CatalogConductor` and friends).
"""

from __future__ import annotations

import tomllib
from pathlib import Path
from typing import Annotated

from pydantic import BaseModel, ConfigDict, Field, ValidationError

from cablefam.optimizer.errors import InputError

#: Temperatures accepted anywhere [degC]: below -100 or above 400 is a typo, not a material.
TEMPERATURE_RANGE_C = (-100.0, 400.0)

Temperature = Annotated[float, Field(ge=TEMPERATURE_RANGE_C[0], le=TEMPERATURE_RANGE_C[1])]
Positive = Annotated[float, Field(gt=0)]
Density = Annotated[float, Field(gt=0, le=25_000)]
Price = Annotated[float, Field(ge=0)]


class Record(BaseModel):
    """Strict base: unknown keys are errors, strings are not numbers, inf and nan are not
    values, records are immutable."""

    model_config = ConfigDict(extra="forbid", strict=True, frozen=True, allow_inf_nan=False)


class ConductorMaterial(Record):
    """Metal of the centre conductor or of the shield (the shield is a solid tube)."""

    resistivity_ohm_m: Annotated[float, Field(gt=0, lt=1e-5)]
    temperature_coefficient_per_k: Annotated[float, Field(ge=-0.01, le=0.02)] | None = None
    relative_permeability: Annotated[float, Field(ge=1.0, le=1e5)] = 1.0
    density_kg_per_m3: Density | None = None
    price_per_kg: Price | None = None
    name: str | None = None
    source: str | None = None


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


class JacketMaterial(Record):
    """Outer sheath over the shield."""

    thermal_resistivity_k_m_per_w: Positive | None = None
    max_temperature_c: Temperature | None = None
    density_kg_per_m3: Density | None = None
    price_per_kg: Price | None = None
    name: str | None = None
    source: str | None = None


class CatalogConductor(ConductorMaterial):
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


def validation_problems(exc: ValidationError, where: str, table: str) -> list[str]:
    """One line per pydantic error: ``where: [table] key = value: message``."""
    lines = []
    for err in exc.errors():
        loc = [str(p) for p in err["loc"]]
        key = ".".join(loc) if loc else "(table)"
        msg = err["msg"]
        if err["type"] == "missing":
            lines.append(f"{where}: [{table}] {key}: required key is missing")
        elif err["type"] == "extra_forbidden":
            lines.append(f"{where}: [{table}] {key} = {err['input']!r}: unknown key")
        else:
            lines.append(f"{where}: [{table}] {key} = {err.get('input')!r}: {msg}")
    return lines


def validate_record(model: type[Record], data, where: str, table: str):
    """Validate ``data`` as ``model``; raise one :class:`InputError` line on the first problem."""
    if not isinstance(data, dict):
        raise InputError(f"{where}: [{table}] must be a table, got {data!r}")
    try:
        return model.model_validate(data)
    except ValidationError as exc:
        raise InputError(validation_problems(exc, where, table)[0]) from None
