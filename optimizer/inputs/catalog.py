"""Material catalogs: ``[catalog]`` plus ``[conductor.<id>]``, ``[dielectric.<id>]``,
``[jacket.<id>]`` tables in TOML (keys: :mod:`cablefam.optimizer.inputs.materials`)."""

from __future__ import annotations

import hashlib
import tomllib
from dataclasses import dataclass, field
from pathlib import Path

from pydantic import ValidationError, create_model

from cablefam.optimizer.errors import InputError
from cablefam.optimizer.inputs.materials import CATALOG_RECORDS, Record, read_toml, validation_problems
from cablefam.optimizer.model.slots import CATALOG_KINDS

#: Kind of material -> record model. The table names are a contract.
KINDS = {kind: CATALOG_RECORDS[kind] for kind in CATALOG_KINDS}


class CatalogHeader(Record):
    """The ``[catalog]`` table."""

    name: str
    description: str = ""
    source: str | None = None


#: A whole catalog file: the header and one mapping id -> record per kind (every kind optional).
CatalogFile = create_model(
    "CatalogFile", __base__=Record, __doc__="A catalog file: [catalog] and [kind.<id>] tables.",
    catalog=(CatalogHeader, ...),
    **{kind: (dict[str, model], {}) for kind, model in KINDS.items()})


@dataclass(frozen=True)
class Catalog:
    """A validated catalog: materials by kind and id, with the file's SHA-256."""

    name: str
    description: str
    path: Path
    sha256: str
    materials: dict[str, dict[str, object]] = field(default_factory=dict)

    def get(self, kind: str, material_id: str, where: str):
        """The record of ``kind`` and ``material_id``, or an InputError naming what exists."""
        table = self.materials[kind]
        if material_id not in table:
            known = ", ".join(sorted(table)) or "none"
            raise InputError(f"{where}: {kind} id {material_id!r} is not in catalog "
                             f"{self.path} (it has: {known})")
        return table[material_id]


def file_sha256(path) -> str:
    """SHA-256 of a file's bytes, hex."""
    return hashlib.sha256(Path(path).read_bytes()).hexdigest()


def catalog_problems(path) -> tuple[list[str], Catalog | None]:
    """All problems of a catalog file, one line each, and the catalog when there are none."""
    path = Path(path)
    try:
        raw = read_toml(path)
    except InputError as exc:
        return [str(exc)], None
    return _problems_of_raw(raw, path, file_sha256(path))


def catalog_from_text(text: str, path) -> Catalog:
    """A catalog from its TOML text (as shipped to remote workers); ``path`` labels messages."""
    try:
        raw = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise InputError(f"{path}: not valid TOML ({exc})") from None
    problems, catalog = _problems_of_raw(raw, Path(path),
                                         hashlib.sha256(text.encode("utf-8")).hexdigest())
    if problems:
        raise InputError(problems[0])
    return catalog


def _problems_of_raw(raw: dict, path: Path, sha256: str) -> tuple[list[str], Catalog | None]:
    try:
        spec = CatalogFile.model_validate(raw)
    except ValidationError as exc:
        return validation_problems(exc, str(path), CatalogFile), None
    problems = _cladding_problems(spec, path)  # clad conductors name another record
    if problems:
        return problems, None
    return [], Catalog(name=spec.catalog.name, description=spec.catalog.description, path=path,
                       sha256=sha256, materials={kind: dict(getattr(spec, kind)) for kind in KINDS})


def _cladding_problems(spec, path) -> list[str]:
    """A conductor's ``cladding`` must name an unclad conductor of the same catalog."""
    conductors = dict(getattr(spec, "conductor", {}) or {})
    problems = []
    for mid, record in conductors.items():
        layer = record.cladding
        if layer is None:
            continue
        if layer not in conductors:
            known = ", ".join(sorted(conductors))
            problems.append(f"{path}: [conductor.{mid}] cladding = {layer!r}: not a conductor "
                            f"of this catalog (it has: {known})")
        elif conductors[layer].cladding is not None:
            problems.append(f"{path}: [conductor.{mid}] cladding = {layer!r}: a layer metal "
                            "cannot itself be clad")
    return problems


def load_catalog(path) -> Catalog:
    """Load and validate a catalog; the first problem raises :class:`InputError`."""
    problems, catalog = catalog_problems(path)
    if problems:
        more = f" (and {len(problems) - 1} more: run `cablefam catalog check`)" if len(
            problems) > 1 else ""
        raise InputError(problems[0] + more)
    return catalog


def catalog_table(catalog: Catalog) -> str:
    """A plain-text table of every material and its key properties."""
    rows = [("kind", "id", "name", "key properties", "price/kg")]
    for kind, table in catalog.materials.items():
        for mid, m in table.items():
            if kind == "conductor":
                props = (f"rho={m.resistivity_ohm_m:.4g} ohm m, "
                         f"alpha={m.temperature_coefficient_per_k:.4g} /K, "
                         f"mu_r={m.relative_permeability:g}, {m.density_kg_per_m3:g} kg/m3")
                if m.cladding is not None:  # a clad conductor: the values above are its core's
                    size = (f"{m.cladding_thickness_m * 1e6:g} um" if m.cladding_thickness_m
                            else f"{100 * m.cladding_area_fraction:g} % of the area")
                    props = f"core {props}; clad with {m.cladding}, {size}"
            elif kind == "dielectric":
                props = (f"eps_r={m.relative_permittivity:g}, tan_d={m.loss_tangent:.3g}, "
                         f"E_bd={m.dielectric_strength_v_per_m / 1e6:g} kV/mm, "
                         f"max {m.max_temperature_c:g} degC, rho_T={m.thermal_resistivity_k_m_per_w:g}"
                         f" K m/W, {m.density_kg_per_m3:g} kg/m3")
                # foamed dielectric by void fraction and dispersion (solid values above)
                props += "".join((f", solid at void fraction {m.void_fraction:g}"
                                  if m.void_fraction is not None else "",
                                  f", at {m.reference_frequency_hz:g} Hz"
                                  if m.reference_frequency_hz is not None else "",
                                  ", foamable" if m.foamable else ""))
            else:
                props = (f"rho_T={m.thermal_resistivity_k_m_per_w:g} K m/W, max "
                         f"{m.max_temperature_c:g} degC, {m.density_kg_per_m3:g} kg/m3")
            rows.append((kind, mid, m.name or "", props, f"{m.price_per_kg:g}"))
    widths = [max(len(r[i]) for r in rows) for i in range(len(rows[0]))]
    lines = [f"catalog {catalog.name!r}: {catalog.description}".rstrip(": "),
             f"file {catalog.path} (sha256 {catalog.sha256[:12]})", ""]
    for i, row in enumerate(rows):
        lines.append("  ".join(cell.ljust(w) for cell, w in zip(row, widths)).rstrip())
        if i == 0:
            lines.append("  ".join("-" * w for w in widths))
    return "\n".join(lines)
