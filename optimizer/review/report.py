"""``cablefam report RUN``: one self-contained HTML page per run, for the morning after.

The page (``RUN/report.html`` by default) shows, per family member: the fronts of every
catalog on one interactive plot (axes selectable, hover shows materials, radii and key
quantities), a parallel-coordinates view that filters the front by brushing, the compare
verdict and table (:mod:`.compare`), the top picks (:mod:`.pick`, spread along the front) with
links to their design sheets (:mod:`.sheet`), and the binding constraints (margins within
:data:`BINDING_MARGIN` of the limit); then the run's provenance (sweep file, catalogs, seed,
budgets, timings from ``run.json``) and the cautions.

Design sheets of the picks are written to ``RUN/sheets/`` (where ``cablefam pick RUN --out
RUN/sheets`` puts them) when they are not there yet; an existing sheet is linked, never
rewritten. With ``sheets=False`` nothing but the report is written.

A run folder with missing parts: without ``front.parquet`` (a run that has not finished) the
report is refused with one line naming what is missing and how to continue; without
``run.json``, ``inputs/`` or a catalog copy the report shows what is there and lists what is
missing. Nothing in the run folder is modified except the report (written atomically) and
new sheets.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from pathlib import Path

import pandas as pd

from cablefam.optimizer.atomic import write_text_atomic
from cablefam.optimizer.errors import InputError
from cablefam.optimizer.run_folder.files import (EVALUATED_FILE, FRONT_FILE, INPUTS_DIR,
                                                 RUN_FILE, STATE_FILE, read_json)
from cablefam.optimizer.run_folder.reader import read_front

#: Default file name of the report inside the run folder.
REPORT_FILE = "report.html"
#: Folder of the design sheets inside the run folder (``pick --out RUN/sheets``).
SHEETS_DIR = "sheets"
#: Picks per member shown in the report (and sheets written).
REPORT_PICKS = 3
#: A constraint is *binding* for a design whose margin (fraction of the limit) is below this.
BINDING_MARGIN = 0.02
#: Folder of the task results (written by the batch layer; only counted here).
TASKS_DIR = "tasks"


@dataclass
class RunContents:
    """What a run folder holds, read once, and what is missing from it."""

    run_dir: Path
    front: pd.DataFrame
    provenance: dict
    run_info: dict | None
    missing: list[str] = field(default_factory=list)
    catalogs: list[str] = field(default_factory=list)
    members: list[str] = field(default_factory=list)
    has_evaluated: bool = False


def _unfinished_message(run_dir: Path) -> str:
    tasks = run_dir / TASKS_DIR
    done = len(list(tasks.glob("*/result.json"))) if tasks.is_dir() else 0
    begun = len([p for p in tasks.iterdir() if p.is_dir()]) if tasks.is_dir() else 0
    state = (run_dir / STATE_FILE).is_file()
    if not state and not begun:
        return f"{run_dir}: not a run folder (no {FRONT_FILE}, no {STATE_FILE})"
    return (f"{run_dir}: the run has not finished (no {FRONT_FILE}; {done} task(s) finished, "
            f"{begun - done} begun): continue it with `cablefam resume {run_dir}`, then "
            "report it")


def read_run_contents(run_dir) -> RunContents:
    """Read a run folder for the report; InputError when there is no front to report."""
    run_dir = Path(run_dir)
    if not run_dir.is_dir():
        raise InputError(f"{run_dir}: no such run folder")
    if not (run_dir / FRONT_FILE).is_file():
        raise InputError(_unfinished_message(run_dir))
    front, provenance = read_front(run_dir)
    missing = []
    run_info = None
    if (run_dir / RUN_FILE).is_file():
        run_info = read_json(run_dir / RUN_FILE, "")
        if not isinstance(run_info, dict):
            missing.append(f"{RUN_FILE} is not a JSON object: timings and task counts not shown")
            run_info = None
    else:
        missing.append(f"{RUN_FILE}: timings and per-task counts are not shown")
    catalogs = [c.get("name") for c in provenance.get("catalogs", ()) if c.get("name")]
    catalogs += [c for c in dict.fromkeys(front["catalog"]) if c not in catalogs]
    inputs = run_dir / INPUTS_DIR
    if not inputs.is_dir():
        missing.append(f"{INPUTS_DIR}/ (the copies of the sweep file and catalogs): design "
                       "sheets cannot be written")
    else:
        if not (inputs / "sweep.toml").is_file():
            missing.append(f"{INPUTS_DIR}/sweep.toml (the copy of the sweep file)")
        for cat in catalogs:
            if not (inputs / f"catalog-{cat}.toml").is_file():
                missing.append(f"{INPUTS_DIR}/catalog-{cat}.toml: design sheets of catalog "
                               f"{cat} cannot be written")
    members = [m.get("name") for m in provenance.get("members", ()) if m.get("name")]
    members += [m for m in dict.fromkeys(front["member"]) if m not in members]
    for m in members:
        if not (front["member"] == m).any():
            missing.append(f"member {m}: no rows in {FRONT_FILE} (no feasible design found)")
    front = front.copy()
    front.insert(3, "index", front.groupby("member", sort=False).cumcount())
    return RunContents(run_dir=run_dir, front=front, provenance=provenance, run_info=run_info,
                       missing=missing, catalogs=catalogs, members=members,
                       has_evaluated=(run_dir / EVALUATED_FILE).is_file())


# -------------------------------------------------------------------------------- analysis

def binding_constraints(front: pd.DataFrame, picks: pd.DataFrame,
                        threshold: float = BINDING_MARGIN) -> list[dict]:
    """Per ``margin_<name>`` column of a member's front: how many designs sit within
    ``threshold`` of the limit, the smallest margin, and which picks are binding.

    A constraint whose margin is exactly 1 everywhere is not set for the member (the search
    gives an unused constraint unit margin) and is reported as such.
    """
    out = []
    for col in [c for c in front.columns if c.startswith("margin_")]:
        v = pd.to_numeric(front[col], errors="coerce")
        finite = v[v.notna()]
        name = col[len("margin_"):]
        if finite.empty or bool((finite == 1.0).all()):
            out.append({"constraint": name, "active": False})
            continue
        bind = finite < threshold
        picked = []
        if len(picks) and col in picks:
            pv = pd.to_numeric(picks[col], errors="coerce")
            picked = [int(r) for r, m in zip(picks["rank"], pv) if m < threshold]
        out.append({"constraint": name, "active": True, "binding": int(bind.sum()),
                    "designs": int(len(finite)), "share": float(bind.mean()),
                    "min_margin": float(finite.min()), "median_margin": float(finite.median()),
                    "binding_picks": picked})
    return sorted(out, key=lambda d: (not d["active"], -d.get("share", 0.0)))


def sheet_name(member: str, catalog: str, index: int) -> str:
    """File name of a design sheet's HTML page (:func:`cablefam.optimizer.review.sheet.sheet_stem`)."""
    from cablefam.optimizer.review.sheet import sheet_stem

    return sheet_stem(member, catalog, index) + ".html"


def _relative(target: Path, start: Path) -> str:
    import os

    return Path(os.path.relpath(target.resolve(), start.resolve())).as_posix()


def ensure_sheets(contents: RunContents, result, sheets_dir: Path, report_path: Path,
                  write: bool) -> dict[tuple[str, int], str | None]:
    """(member, index) -> link to the pick's sheet (relative to the report), writing the
    sheets that are missing when ``write``; None when there is no sheet."""
    from cablefam.optimizer.review.pick import SCORE_MEANING
    from cablefam.optimizer.review.sheet import design_sheet

    links: dict[tuple[str, int], str | None] = {}
    for _, row in result.picks.iterrows():
        member, catalog, index = str(row["member"]), str(row["catalog"]), int(row["index"])
        path = sheets_dir / sheet_name(member, catalog, index)
        can = (contents.run_dir / INPUTS_DIR / f"catalog-{catalog}.toml").is_file()
        if not path.is_file() and write and can:
            sheets_dir.mkdir(parents=True, exist_ok=True)
            design_sheet(contents.run_dir, row, contents.front[contents.front["member"] == member],
                         contents.provenance, sheets_dir, method=result.method,
                         score_meaning=SCORE_MEANING[result.method],
                         report_href=_relative(report_path, sheets_dir))
        links[(member, index)] = (_relative(path, report_path.parent) if path.is_file()
                                  else None)
    return links


@dataclass(frozen=True)
class Report:
    """What :func:`write_report` wrote."""

    path: Path
    bytes: int
    members: tuple[str, ...]
    sheets: tuple[str, ...]
    missing: tuple[str, ...]


def build_report(run_dir, out=None, *, sheets: bool = True, top: int = REPORT_PICKS,
                 bundle: str | None = None) -> tuple[str, Report]:
    """The report page's HTML and what it holds; writes missing design sheets when
    ``sheets`` (see the module docstring). ``bundle`` replaces the plotly.js bundle (tests)."""
    from cablefam.optimizer.review.compare import compare_runs
    from cablefam.optimizer.review.pick import pick
    from cablefam.optimizer.review.report_page import render_page
    from cablefam.optimizer.review.report_sections import (header_section, member_section,
                                                           parallel_section,
                                                           provenance_section)

    contents = read_run_contents(run_dir)
    run_dir = contents.run_dir
    report_path = Path(out) if out is not None else run_dir / REPORT_FILE
    comparison = compare_runs([run_dir])
    by_member = {mc.member: mc for mc in comparison.members}
    result = pick(run_dir, top=top)
    links = ensure_sheets(contents, result, run_dir / SHEETS_DIR, report_path, sheets)
    objectives = list(contents.provenance.get("objectives", ()))
    body = header_section(contents, comparison)
    for n, member in enumerate(contents.members):
        front = contents.front[contents.front["member"] == member]
        picks = result.picks[result.picks["member"] == member] if len(result.picks) else \
            result.picks
        body += member_section(n, member, front, objectives, contents, by_member.get(member),
                               picks, links, binding_constraints(front, picks), result,
                               BINDING_MARGIN)
    body += parallel_section(contents, objectives)
    body += provenance_section(contents)
    title = f"cablefam report: {contents.provenance.get('sweep_name', run_dir.name)}"
    page = render_page(title, body, bundle)
    report = Report(path=report_path, bytes=len(page.encode("utf-8")),
                    members=tuple(contents.members),
                    sheets=tuple(v for v in links.values() if v),
                    missing=tuple(contents.missing))
    return page, report


def write_report(run_dir, out=None, *, sheets: bool = True, top: int = REPORT_PICKS) -> Report:
    """Write the report page (default ``RUN/report.html``) atomically; return what it holds."""
    out_path = Path(out) if out is not None else Path(run_dir) / REPORT_FILE
    if out_path.is_dir():
        raise InputError(f"out = {out_path}: is a folder; give the report's file name")
    if not out_path.parent.is_dir():
        raise InputError(f"out = {out_path}: folder {out_path.parent} does not exist")
    page, report = build_report(run_dir, out_path, sheets=sheets, top=top)
    write_text_atomic(out_path, page)
    return report


def format_report_summary(report: Report) -> str:
    """What ``cablefam report`` prints on stderr."""
    size = report.bytes / 1e6
    lines = [f"report: {report.path} ({size:.1f} MB, {len(report.members)} member(s), "
             f"{len(report.sheets)} design sheet(s) linked)"]
    lines += [f"missing: {m}" for m in report.missing]
    return "\n".join(lines)

