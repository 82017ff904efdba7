"""Sweep files: a family of cables (members) x material catalogs, searched in one batch.

Keys are a contract (add freely, rename none); see the README for a full example. Every
problem is found before any search starts and raises one :class:`InputError` line naming the
key and the value.
"""

from __future__ import annotations

import re
import tomllib
from dataclasses import dataclass
from importlib import resources
from pathlib import Path
from typing import Annotated, Literal

from pydantic import Field, ValidationError, create_model, field_validator, model_validator

from cablefam.optimizer.errors import InputError
from cablefam.optimizer.inputs.catalog import Catalog, catalog_from_text, load_catalog
from cablefam.optimizer.inputs.materials import (Positive, Record, ScreeningBand, Temperature,
                                                 check_band_order, read_toml,
                                                 rule_error, validation_problems)
from cablefam.optimizer.model.objectives import OBJECTIVES
from cablefam.optimizer.model.slots import MATERIAL_SLOTS

Bounds = Annotated[list[float], Field(min_length=2, max_length=2)]
#: Geometry decision variables, in the order of the decision vector.
GEOMETRY_KEYS = ("inner_radius_m", "dielectric_radius_m", "shield_thickness_m",
                 "jacket_thickness_m")
#: Outer-conductor decision variables (issue 12), after the geometry ones when present.
OUTER_KEYS = ("braid_wire_diameter_m", "braid_angle_deg", "braid_carriers", "braid_ends",
              "foil_thickness_m")
#: Material subsets: sweep-file key -> (design table, catalog kind), one per material slot
MATERIAL_KEYS = {s.sweep_key: (s.name, s.kind) for s in MATERIAL_SLOTS}
_NAME = re.compile(r"^[A-Za-z0-9][A-Za-z0-9._-]*$")


def _check_bounds(value, allow_zero=False):
    lo, hi = value
    if not (lo >= 0.0 if allow_zero else lo > 0.0):
        raise ValueError(f"lower bound must be {'>= 0' if allow_zero else '> 0'}")
    if lo > hi:
        raise ValueError("lower bound is greater than upper bound")
    if hi >= 1.0:
        raise ValueError("upper bound must be < 1 m")
    return value


class _SearchFields(Record):
    """``[search]`` without the material subsets (those come from the slot registry)."""

    objectives: Annotated[list[str], Field(min_length=1)]
    population: Annotated[int, Field(ge=4, le=100_000)] = 100
    generations: Annotated[int, Field(ge=1, le=1_000_000)] = 100
    inner_radius_m: Bounds
    dielectric_radius_m: Bounds
    shield_thickness_m: Bounds
    jacket_thickness_m: Bounds = [0.0, 0.0]
    inner_strands: Literal[1, 7, 19, 37] = 1
    inner_diameter_series: Literal["metric", "metric-fine", "awg"] | None = None
    evaluations_per_task: Annotated[int, Field(ge=64, le=10**10)] | None = None
    """Evaluations per member x catalog task (both stages); default: see search.budget."""
    resolution: dict[str, Annotated[float, Field(gt=0.0, allow_inf_nan=False)]] = {}
    """Objective name -> resolution of the front in the objective's unit."""
    # foamed dielectric by void fraction: bounds of the void fraction of the foamable
    # dielectrics (records with foamable = true), a continuous design variable when lo < hi
    void_fraction: Bounds | None = None

    @field_validator("void_fraction")
    @classmethod
    def _void_fraction_bounds(cls, v):
        if v is not None and not 0.0 <= v[0] <= v[1] < 1.0:
            raise ValueError("bounds must satisfy 0 <= lower <= upper < 1")
        return v
    # --- outer conductors as built (issue 12): absent = every design a tube, as before ---
    shield_constructions: Annotated[list[Literal["tube", "foil", "braid", "foil-braid",
                                                 "double-braid"]],
                                    Field(min_length=1)] | None = None
    braid_wire_diameter_m: Bounds | None = None
    braid_angle_deg: Bounds | None = None
    braid_carriers: Bounds | None = None
    braid_ends: Bounds | None = None
    foil_thickness_m: Bounds | None = None

    @model_validator(mode="after")
    def _outer_conductor_bounds(self):
        """Bounds for every construction listed; angles in (0, 90) deg, counts integers."""
        kinds = self.shield_constructions or ["tube"]
        if len(set(kinds)) != len(kinds):
            raise rule_error("shield_constructions", kinds, "constructions repeat")
        need = set()
        if any(k in ("braid", "foil-braid", "double-braid") for k in kinds):
            need |= {"braid_wire_diameter_m", "braid_angle_deg", "braid_carriers", "braid_ends"}
        if any(k in ("foil", "foil-braid") for k in kinds):
            need.add("foil_thickness_m")
        for key in ("braid_wire_diameter_m", "braid_angle_deg", "braid_carriers", "braid_ends",
                    "foil_thickness_m"):
            value = getattr(self, key)
            if value is None:
                if key in need:
                    raise rule_error(key, None, f"required key is missing for "
                                                f"shield_constructions = {kinds!r}")
                continue
            lo, hi = value
            if key not in need:
                raise rule_error(key, value, f"does not apply to shield_constructions = "
                                             f"{kinds!r}")
            if lo > hi:
                raise rule_error(key, value, "lower bound is greater than upper bound")
            if key == "braid_angle_deg" and not (0.0 < lo and hi < 90.0):
                raise rule_error(key, value, "must lie in (0, 90) deg")
            if key in ("braid_carriers", "braid_ends") and not (
                    lo >= 1 and float(lo).is_integer() and float(hi).is_integer()):
                raise rule_error(key, value, "bounds must be integers >= 1")
            if key.endswith("_m") and not (0.0 < lo and hi < 0.01):
                raise rule_error(key, value, "must lie in (0, 0.01) m")
        return self
    # --- end of the outer-conductor keys ---

    @field_validator("resolution")
    @classmethod
    def _known_resolutions(cls, v):
        for n in v:
            if n not in OBJECTIVES:
                raise ValueError(f"unknown objective {n!r} (known: {', '.join(OBJECTIVES)})")
        return v

    @field_validator("objectives")
    @classmethod
    def _known_objectives(cls, names):
        for n in names:
            if n not in OBJECTIVES:
                raise ValueError(f"unknown objective {n!r} (known: {', '.join(OBJECTIVES)})")
        if len(set(names)) != len(names):
            raise ValueError("objectives repeat")
        return names

    @field_validator("inner_radius_m", "dielectric_radius_m", "shield_thickness_m")
    @classmethod
    def _positive_bounds(cls, v):
        return _check_bounds(v)

    @field_validator("jacket_thickness_m")
    @classmethod
    def _jacket_bounds(cls, v):
        return _check_bounds(v, allow_zero=True)

    @model_validator(mode="after")
    def _some_b_above_a(self):
        a_lo, b_hi = self.inner_radius_m[0], self.dielectric_radius_m[1]
        if b_hi <= a_lo:
            raise rule_error("dielectric_radius_m", self.dielectric_radius_m,
                             f"upper bound must be greater than the lower bound of "
                             f"inner_radius_m ({a_lo!r}): no design would have b > a")
        return self


#: ``[search]``: objectives, budget, geometry bounds and, per material slot, an optional list
#: of the ids to try (``conductors``, ``shields``, ...; absent: every id of the slot's kind).
SearchSpec = create_model(
    "SearchSpec", __base__=_SearchFields, __doc__="The [search] table of a sweep file.",
    **{s.sweep_key: (list[str] | None, None) for s in MATERIAL_SLOTS})


_SPREAD_VARIABLES = ("inner_radius", "dielectric_radius", "eccentricity", "relative_permittivity")


class ToleranceSpec(Record):
    """Manufacturing spread: a standard deviation (``*_sd``) or a +/- band (``*_band``, uniform)
    per variable; lengths in metres, the permittivity spread relative to its value."""

    method: Literal["monte-carlo", "analytic"] = "monte-carlo"
    samples: Annotated[int, Field(ge=10, le=1_000_000)] = 1000
    inner_radius_sd_m: Annotated[float, Field(ge=0, lt=0.01)] = 0.0
    inner_radius_band_m: Annotated[float, Field(ge=0, lt=0.01)] = 0.0
    dielectric_radius_sd_m: Annotated[float, Field(ge=0, lt=0.01)] = 0.0
    dielectric_radius_band_m: Annotated[float, Field(ge=0, lt=0.01)] = 0.0
    eccentricity_sd_m: Annotated[float, Field(ge=0, lt=0.01)] = 0.0
    eccentricity_band_m: Annotated[float, Field(ge=0, lt=0.01)] = 0.0
    relative_permittivity_sd: Annotated[float, Field(ge=0, lt=0.5)] = 0.0
    relative_permittivity_band: Annotated[float, Field(ge=0, lt=0.5)] = 0.0

    @model_validator(mode="after")
    def _sd_or_band(self):
        for var in _SPREAD_VARIABLES:
            unit = "" if var == "relative_permittivity" else "_m"
            band = getattr(self, f"{var}_band{unit}")
            if getattr(self, f"{var}_sd{unit}") > 0 and band > 0:
                raise rule_error(f"{var}_band{unit}", band, f"give either {var}_sd{unit} or "
                                                            f"{var}_band{unit}, not both")
        return self

    def spread(self):
        """The :class:`cablefam.optimizer.model.tolerance.Spread` these keys describe."""
        from cablefam.optimizer.model.tolerance import Spread

        values, uniform = {}, []
        for var in _SPREAD_VARIABLES:
            unit = "" if var == "relative_permittivity" else "_m"
            sd = getattr(self, f"{var}_sd{unit}")
            band = getattr(self, f"{var}_band{unit}")
            if band > 0:
                uniform.append(f"{var}{unit}")
            values[f"{var}{unit}"] = band if band > 0 else sd
        return Spread(**values, uniform=tuple(uniform))


class MemberSpec(Record):
    name: str
    impedance_ohm: Positive
    impedance_tolerance_ohm: Positive
    frequency_hz: Annotated[float, Field(gt=0, le=1e12)]
    power_w: Annotated[float, Field(ge=0)] | None = None
    peak_voltage_v: Annotated[float, Field(ge=0)] | None = None
    ambient_c: Temperature = 20.0
    max_outer_diameter_m: Positive | None = None
    field_safety_factor: Annotated[float, Field(ge=1.0)] = 1.0
    single_mode_margin: Annotated[float, Field(ge=0.0)] = 1.0
    min_shield_skin_depths: Annotated[float, Field(ge=0.0)] = 2.0
    min_impedance_yield: Annotated[float, Field(gt=0.0, le=1.0)] | None = None
    # foamed dielectric by void fraction: limits on the velocity factor and the capacitance
    min_velocity_factor: Annotated[float, Field(gt=0.0, le=1.0)] | None = None
    max_capacitance_f_per_m: Annotated[float, Field(gt=0.0, lt=1e-6)] | None = None
    # ratings on the safe side: standing wave (power_w is the delivered power) and sun
    vswr: Annotated[float, Field(ge=1.0, le=1e3)] = 1.0
    solar_irradiance_w_per_m2: Annotated[float, Field(ge=0, le=1500.0)] = 0.0
    # --- screening (issue 12) ---
    screening_band_hz: ScreeningBand | None = None
    """[low, high] of the band of the transfer-impedance limit (default: the frequency)."""
    max_transfer_impedance_ohm_per_m: Positive | None = None
    min_braid_optical_coverage: Annotated[float, Field(gt=0.0, le=1.0)] | None = None

    @model_validator(mode="after")
    def _band_order(self):
        check_band_order(self.screening_band_hz)
        return self
    # --- end of the screening keys ---

    @field_validator("name")
    @classmethod
    def _name(cls, v):
        if not _NAME.match(v):
            raise ValueError("use letters, digits, '.', '_' and '-' only")
        return v


class SweepFile(Record):
    name: str
    seed: Annotated[int, Field(ge=0, lt=2**63)] = 0
    description: str | None = None
    catalogs: Annotated[list[str], Field(min_length=1)]
    search: SearchSpec
    tolerance: ToleranceSpec | None = None
    member: Annotated[list[MemberSpec], Field(min_length=1)]

    @field_validator("name")
    @classmethod
    def _name(cls, v):
        if not _NAME.match(v):
            raise ValueError("use letters, digits, '.', '_' and '-' only (it names a folder)")
        return v

    @model_validator(mode="after")
    def _members_and_tolerance(self):
        """Yield requirements need a [tolerance] table; member names are unique."""
        if self.tolerance is None:
            for i, m in enumerate(self.member):
                if m.min_impedance_yield is not None:
                    raise rule_error(f"member.{i}.min_impedance_yield", m.min_impedance_yield,
                                     f"needs a [tolerance] table (member {m.name!r})")
            if "impedance_yield" in self.search.objectives:
                raise rule_error("search.objectives", self.search.objectives,
                                 "'impedance_yield' needs a [tolerance] table")
        names = [m.name for m in self.member]
        dup = sorted({n for n in names if names.count(n) > 1})
        if dup:
            raise rule_error("member.name", dup[0], "names must be unique")
        return self


@dataclass(frozen=True)
class Sweep:
    """A validated sweep: the file's content, its catalogs and the materials per catalog."""

    spec: SweepFile
    path: Path
    text: str
    catalogs: tuple[Catalog, ...]
    materials: dict[str, dict[str, tuple[str, ...]]]
    """catalog name -> design table (conductor, shield, dielectric, jacket) -> material ids."""

    @property
    def has_jacket(self) -> bool:
        return self.spec.search.jacket_thickness_m[1] > 0.0


def parse_sweep(raw: dict, where: str, base_dir: Path, text: str = "",
                catalog_texts: dict[str, str] | None = None) -> Sweep:
    """Validate a parsed sweep table; catalogs are resolved relative to ``base_dir``.

    With ``catalog_texts`` (catalog entry of the sweep file -> TOML text) no file is read:
    that is how a task travels to a worker on another machine.
    """
    try:
        spec = SweepFile.model_validate(raw)
    except ValidationError as exc:
        raise InputError(validation_problems(exc, where, SweepFile, tables=False)[0]) from None
    loaded = []
    for entry in spec.catalogs:
        try:
            loaded.append(load_catalog(base_dir / entry) if catalog_texts is None
                          else catalog_from_text(catalog_texts[entry], base_dir / entry))
        except InputError as exc:
            raise InputError(f"{where}: catalogs = {entry!r}: {exc}") from None
    catalogs = tuple(loaded)
    cat_names = [c.name for c in catalogs]
    if len(set(cat_names)) != len(cat_names):
        raise InputError(f"{where}: catalogs = {spec.catalogs!r}: two catalogs share the "
                         "name in their [catalog] table; names must be unique")
    s = spec.search
    materials: dict[str, dict[str, tuple[str, ...]]] = {c.name: {} for c in catalogs}
    for slot in MATERIAL_SLOTS:
        key, table, kind = slot.sweep_key, slot.name, slot.kind
        wanted = getattr(s, key)
        if slot.optional and getattr(s, slot.thickness_key)[1] == 0.0:
            for c in catalogs:
                materials[c.name][table] = ()
            continue
        if wanted is not None:
            for mid in wanted:
                if not any(mid in c.materials[kind] for c in catalogs):
                    raise InputError(f"{where}: search.{key} = {wanted!r}: id {mid!r} is in no "
                                     f"catalog ({', '.join(spec.catalogs)})")
        for c in catalogs:
            ids = tuple(m for m in (wanted or sorted(c.materials[kind])) if m in c.materials[kind])
            if not ids:
                raise InputError(f"{where}: search.{key} = {wanted!r}: catalog {c.name!r} "
                                 f"({c.path}) has none of these {kind} ids")
            materials[c.name][table] = ids
    if s.void_fraction is not None:  # foamed dielectric by void fraction
        _check_foamable(catalogs, materials, where, s.void_fraction)
    return Sweep(spec=spec, path=Path(where), text=text, catalogs=catalogs, materials=materials)


def _check_foamable(catalogs, materials, where, bounds):
    """``[search] void_fraction`` needs a foamable dielectric among those searched."""
    if not any(c.materials["dielectric"][i].foamable
               for c in catalogs for i in materials[c.name]["dielectric"]):
        raise InputError(f"{where}: search.void_fraction = {bounds!r}: no dielectric searched "
                         "is foamable (give a catalog's dielectric record foamable = true)")


def load_sweep(path) -> Sweep:
    """Read and validate a sweep file."""
    path = Path(path)
    raw = read_toml(path)
    return parse_sweep(raw, str(path), path.parent, path.read_bytes().decode("utf-8"))


def sweep_payload(sweep: Sweep) -> dict:
    """Everything a worker needs to rebuild ``sweep`` without the files: plain strings."""
    return {"where": str(sweep.path), "sweep_text": sweep.text,
            "catalog_texts": {entry: c.path.read_bytes().decode("utf-8")
                              for entry, c in zip(sweep.spec.catalogs, sweep.catalogs)}}


def sweep_from_payload(payload: dict) -> Sweep:
    """Rebuild a sweep from :func:`sweep_payload` (catalog paths become labels only)."""
    raw = tomllib.loads(payload["sweep_text"])
    where = payload["where"]
    return parse_sweep(raw, where, Path(where).parent, payload["sweep_text"],
                       payload["catalog_texts"])


def demo_sweep_path() -> Path:
    """The bundled demo sweep file (package data)."""
    return Path(str(resources.files("cablefam.optimizer.demo").joinpath("sweep.toml")))


def demo_design_path() -> Path:
    """The bundled demo design file (package data)."""
    return Path(str(resources.files("cablefam.optimizer.demo").joinpath("design.toml")))
