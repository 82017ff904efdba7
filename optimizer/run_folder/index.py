"""``cablefam runs``: the run folders under a folder, one line each, from their ``run.json``."""

from __future__ import annotations

from dataclasses import dataclass, field
from pathlib import Path

from cablefam.optimizer.errors import InputError
from cablefam.optimizer.run_folder.reader import read_run_info
from cablefam.optimizer.run_folder.files import RUN_FILE
from cablefam.optimizer.text_table import format_table


@dataclass(frozen=True)
class RunEntry:
    path: str
    name: str
    started_utc: str | None = None
    members: tuple[str, ...] = ()
    catalogs: tuple[str, ...] = ()
    evaluations: int | None = None
    wall_seconds: float | None = None
    front_rows: int | None = None
    front_rows_per_task: dict[str, int] = field(default_factory=dict)
    problem: str | None = None
    """Why the folder could not be read (then the other fields are empty)."""


def _entry(run_dir: Path) -> RunEntry:
    try:
        info = read_run_info(run_dir)
    except InputError as exc:
        return RunEntry(path=str(run_dir), name=run_dir.name, problem=str(exc))
    if not isinstance(info, dict):
        return RunEntry(path=str(run_dir), name=run_dir.name,
                        problem=f"{run_dir / RUN_FILE}: not a JSON object")
    counts = info.get("counts") if isinstance(info.get("counts"), dict) else {}
    per_task = {}
    for t in info.get("tasks") or []:
        if isinstance(t, dict) and "member" in t and "catalog" in t:
            per_task[f"{t['member']}/{t['catalog']}"] = int(t.get("front_rows", 0))
    if not per_task and isinstance(counts.get("front_rows_per_task"), dict):
        per_task = {k: int(v) for k, v in counts["front_rows_per_task"].items()}
    members = tuple(m.get("name", "?") for m in info.get("members") or [] if isinstance(m, dict))
    catalogs = tuple(c.get("name", "?") for c in info.get("catalogs") or []
                     if isinstance(c, dict))
    return RunEntry(
        path=str(run_dir), name=str(info.get("sweep_name", run_dir.name)),
        started_utc=info.get("started_utc"), members=members, catalogs=catalogs,
        evaluations=counts.get("evaluations"), wall_seconds=info.get("wall_seconds"),
        front_rows=counts.get("front_rows"), front_rows_per_task=per_task)


def list_runs(folder="runs") -> list[RunEntry]:
    """Every run folder directly under ``folder`` (or ``folder`` itself if it is one), newest
    first. A folder with a broken ``run.json`` is listed with its problem, not skipped."""
    folder = Path(folder)
    if not folder.is_dir():
        raise InputError(f"{folder}: no such folder")
    if (folder / RUN_FILE).exists():
        candidates = [folder]
    else:
        candidates = sorted(p for p in folder.iterdir() if p.is_dir() and (
            (p / RUN_FILE).exists() or (p / "front.parquet").exists()))
    entries = [_entry(p) for p in candidates]
    return sorted(entries, key=lambda e: (e.started_utc or "", e.name), reverse=True)


def runs_to_json(entries: list[RunEntry]) -> list[dict]:
    return [{
        "path": e.path, "name": e.name, "started_utc": e.started_utc,
        "members": list(e.members), "catalogs": list(e.catalogs),
        "evaluations": e.evaluations, "wall_seconds": e.wall_seconds,
        "front_rows": e.front_rows, "front_rows_per_task": e.front_rows_per_task,
        "problem": e.problem,
    } for e in entries]


def format_runs(entries: list[RunEntry], folder) -> str:
    if not entries:
        return f"no run folders under {folder}"
    headers = ["name", "started (UTC)", "members", "catalogs", "evaluations", "wall [s]",
               "front rows", "folder"]
    rows = [[e.name, e.started_utc, len(e.members) if e.problem is None else None,
             ", ".join(e.catalogs) or None, e.evaluations, e.wall_seconds, e.front_rows,
             e.path] for e in entries]
    lines = [format_table(headers, rows), ""]
    for e in entries:
        if e.problem is not None:
            lines.append(f"{e.name}: unreadable: {e.problem}")
            continue
        by_member: dict[str, list[str]] = {}
        for task, n in e.front_rows_per_task.items():
            member, _, catalog = task.partition("/")
            by_member.setdefault(member, []).append(f"{catalog} {n}")
        sizes = "; ".join(f"{m}: {', '.join(v)}" for m, v in by_member.items())
        lines.append(f"{e.name}: front sizes {sizes}")
    return "\n".join(lines).rstrip()
