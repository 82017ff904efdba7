"""Provenance of a run: package versions, input hashes and settings, without timings or paths."""

from __future__ import annotations

import hashlib
import platform
from importlib import metadata

from cablefam.optimizer.model.objectives import resolutions
from cablefam.optimizer.search.budget import task_budget

from cablefam.optimizer.batch.settings import SweepSettings
from cablefam.optimizer.inputs.sweep_spec import Sweep

_PACKAGES = ("cablefam", "numpy", "scipy", "pymoo", "pandas", "pyarrow", "pydantic")


def package_versions() -> dict[str, str]:
    out = {"python": platform.python_version()}
    for name in _PACKAGES:
        try:
            out[name] = metadata.version(name)
        except metadata.PackageNotFoundError:
            out[name] = "unknown"
    return out


def sha256_text(text: str) -> str:
    """SHA-256 of a text file's UTF-8 bytes, hex."""
    return hashlib.sha256(text.encode("utf-8")).hexdigest()


def front_provenance(sweep: Sweep, settings: SweepSettings, counts: dict) -> dict:
    """Provenance without timings or absolute paths: equal runs give equal bytes."""
    return {
        "format": "cablefam-front/1",
        "sweep_name": sweep.spec.name,
        "sweep_file": sweep.path.name,
        "sweep_sha256": sha256_text(sweep.text),
        "sweep_text": sweep.text,
        "catalogs": [{"name": c.name, "file": c.path.name, "sha256": c.sha256}
                     for c in sweep.catalogs],
        "seed": settings.seed,
        "generations": settings.generations,
        "population": settings.population,
        "objectives": list(sweep.spec.search.objectives),
        "evaluations_per_task": task_budget(settings.population, settings.generations,
                                            settings.evaluations_per_task).total,
        "resolution": dict(zip(sweep.spec.search.objectives, resolutions(
            sweep.spec.search.objectives, sweep.spec.search.resolution).tolist())),
        "members": [m.model_dump() for m in sweep.spec.member],
        "packages": package_versions(),
        "counts": counts,
    }


def run_state(sweep: Sweep, settings: SweepSettings) -> dict:
    """``run-state.json``: what a resume needs to check that the inputs are unchanged."""
    return {"format": "cablefam-run-state/1",
            "sweep_path": str(sweep.path.resolve()),
            "sweep_sha256": sha256_text(sweep.text),
            "catalogs": [{"name": c.name, "path": str(c.path.resolve()), "sha256": c.sha256}
                         for c in sweep.catalogs],
            "settings": {"seed": settings.seed, "generations": settings.generations,
                         "population": settings.population,
                         "record_evaluated": settings.record_evaluated,
                         "evaluations_per_task": settings.evaluations_per_task}}
