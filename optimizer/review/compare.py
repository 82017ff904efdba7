"""``cablefam compare``: which run or catalog wins where, per family member.

A *front* is the set of rows of one (run, catalog) for one member. Per member every front is
normalized with the ideal and nadir of the union of all compared fronts (maximised objectives
negated first), and the hypervolume of each is computed by moocore against one
reference point, ``REFERENCE_FACTOR`` (1.1) in every normalized objective: 1.1 x the nadir of
the union after normalization, so that the union's extreme points still add volume (a common
choice, no source). Set coverage C(A, B) (Zitzler and Thiele 1999) gives the share of each
front weakly dominated by another. The verdict line is derived from the combined
(non-dominated) front of the member: which front holds which part of it, along the outer
diameter.

Fronts are only comparable when the runs minimised the same objectives and, for a member name
that appears in several runs, used the same member specification (operating point and
limits); otherwise :func:`compare_runs` refuses with one line naming the difference.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from pathlib import Path

import numpy as np
import pandas as pd

from cablefam.optimizer.errors import InputError
from cablefam.optimizer.model.objectives import OBJECTIVES, objective_matrix
from cablefam.optimizer.run_folder.reader import read_front
from cablefam.optimizer.text_table import format_table
from cablefam.optimizer.review import tradeoff

#: Reference point of the hypervolume, per objective, in the union-normalized space.
REFERENCE_FACTOR = 1.1
#: Column along which the verdict describes who holds the combined front.
VERDICT_AXIS = "outer_diameter_m"
#: More segments than this along the axis and the verdict reports shares instead.
MAX_SEGMENTS = 3


@dataclass(frozen=True)
class FrontSummary:
    label: str
    run: str
    catalog: str
    designs: int
    hypervolume: float
    best: dict[str, float | None]
    """objective column -> best value (min, or max for a maximised objective); None if empty."""
    combined_share: float | None
    """Share of the member's combined front held by this front (None when that is empty)."""


@dataclass(frozen=True)
class MemberComparison:
    member: str
    objectives: tuple[str, ...]
    labels: tuple[str, ...]
    summaries: dict[str, FrontSummary]
    coverage: dict[str, dict[str, float | None]]
    """coverage[a][b] = C(a, b): share of b's front weakly dominated by a's."""
    ideal: list[float]
    nadir: list[float]
    """Normalization bounds of the union, objectives as minimised (maximised ones negated)."""
    reference_point: list[float]
    verdict: str
    fronts: dict[str, pd.DataFrame]


@dataclass(frozen=True)
class Comparison:
    runs: tuple[str, ...]
    objectives: tuple[str, ...]
    members: tuple[MemberComparison, ...]


def _first_difference(a: dict, b: dict) -> str | None:
    """First key, in sorted order, whose value differs between two member specifications.

    Keys present in only one (a key added to the sweep format after the older run) are not
    compared: a run written before a key existed ran with its default.
    """
    for key in sorted(set(a) & set(b)):
        if a[key] != b[key]:
            return key
    return None


def check_comparable(provenances: dict[str, dict]) -> tuple[str, ...]:
    """The common objectives of the runs; InputError when objectives or members differ."""
    items = list(provenances.items())
    first_run, first = items[0]
    objectives = tuple(first.get("objectives", ()))
    members: dict[str, tuple[str, dict]] = {}
    for run, prov in items:
        obj = tuple(prov.get("objectives", ()))
        if sorted(obj) != sorted(objectives):
            raise InputError(f"{run}: objectives = {list(obj)!r} but {first_run} used "
                             f"{list(objectives)!r}: runs with different objectives cannot be "
                             "compared")
        for m in prov.get("members", ()):
            name = m.get("name")
            key = _first_difference(members[name][1], m) if name in members else None
            if key is not None:
                other_run, other = members[name]
                raise InputError(f"member {name!r}: {key} = {m.get(key)!r} in {run} but "
                                 f"{other.get(key)!r} in {other_run}: the runs used different "
                                 "operating points or limits for this member; rename one")
            members.setdefault(name, (run, m))
    if not objectives or any(o not in OBJECTIVES for o in objectives):
        raise InputError(f"{first_run}: provenance objectives = {list(objectives)!r}: unknown")
    return objectives


def _run_names(run_dirs: list[Path]) -> list[str]:
    """Folder names; parent/name when two folders share a name; else the paths as given."""
    for names in ([p.name for p in run_dirs],
                  [f"{p.resolve().parent.name}/{p.name}" for p in run_dirs]):
        if len(set(names)) == len(names):
            return names
    return [str(p) for p in run_dirs]


def _best(df: pd.DataFrame, objectives) -> dict[str, float | None]:
    out = {}
    for o in objectives:
        ob = OBJECTIVES[o]
        v = df[ob.column].to_numpy(dtype=float) if len(df) else np.empty(0)
        v = v[np.isfinite(v)]
        out[ob.column] = None if v.size == 0 else float(v.max() if ob.maximise else v.min())
    return out


def _matrix(df: pd.DataFrame, objectives) -> np.ndarray:
    if df.empty:
        return np.empty((0, len(objectives)))
    f = objective_matrix(df, objectives)
    return f[np.all(np.isfinite(f), axis=1)]


def _segments(owner: list[str]) -> list[tuple[str, int, int]]:
    """Runs of equal owners: (owner, first position, last position)."""
    segs: list[tuple[str, int, int]] = []
    for k, o in enumerate(owner):
        if segs and segs[-1][0] == o:
            segs[-1] = (o, segs[-1][1], k)
        else:
            segs.append((o, k, k))
    return segs


def verdict_line(member: str, fronts: dict[str, pd.DataFrame], objectives,
                 coverage: dict[str, dict[str, float | None]],
                 hypervolumes: dict[str, float]) -> tuple[str, dict[str, float | None]]:
    """One sentence per member, derived from the combined front; and each front's share."""
    nonempty = [lab for lab, df in fronts.items() if len(_matrix(df, objectives))]
    empty = [lab for lab in fronts if lab not in nonempty]
    shares: dict[str, float | None] = {lab: None for lab in fronts}
    if not nonempty:
        return f"{member}: no front holds a feasible design", shares
    tail = f" ({', '.join(empty)}: no feasible design)" if empty else ""
    if len(nonempty) == 1:
        shares[nonempty[0]] = 1.0
        return f"{member}: only {nonempty[0]} found feasible designs{tail}", shares
    points, owner, axis = [], [], []
    for lab in nonempty:
        df = fronts[lab]
        f = objective_matrix(df, objectives)
        ok = np.all(np.isfinite(f), axis=1)
        points.append(f[ok])
        owner += [lab] * int(ok.sum())
        axis.append(df[VERDICT_AXIS].to_numpy(dtype=float)[ok])
    f_all, axis_all = np.vstack(points), np.concatenate(axis)
    owner_arr = np.array(owner, dtype=object)
    keep = tradeoff.nondominated_mask(f_all)
    held = owner_arr[keep]
    for lab in nonempty:
        shares[lab] = float(np.mean(held == lab))
    order = np.argsort(axis_all[keep], kind="stable")
    along, by = axis_all[keep][order], list(held[order])
    segs = _segments(by)
    best_hv = max(nonempty, key=lambda lab: hypervolumes[lab])
    others_hv = ", ".join(f"{lab} {hypervolumes[lab]:.3g}" for lab in nonempty if lab != best_hv)
    hv_text = f"best hypervolume {best_hv} ({hypervolumes[best_hv]:.3g} vs {others_hv})"
    scale, unit = 1e3, "mm outer diameter"
    if len(segs) == 1:
        winner = segs[0][0]
        losers = [lab for lab in nonempty if lab != winner]
        cov = ", ".join(f"{100 * coverage[winner][lab]:.0f} % of {lab}" for lab in losers)
        text = (f"{member}: {winner} dominates {', '.join(losers)} everywhere: it holds the "
                f"whole combined front and covers {cov}")
    elif len(segs) <= MAX_SEGMENTS:
        cuts = [0.5 * scale * (along[segs[k][2]] + along[segs[k + 1][1]])
                for k in range(len(segs) - 1)]
        parts = [f"{segs[0][0]} below {cuts[0]:.3g} {unit}"]
        for k in range(1, len(segs) - 1):
            parts.append(f"{segs[k][0]} from {cuts[k - 1]:.3g} to {cuts[k]:.3g} mm")
        parts.append(f"{segs[-1][0]} above {cuts[-1]:.3g} mm")
        text = f"{member}: the combined front is held by " + ", ".join(parts)
        if len(nonempty) == 2 and len(segs) == 2:
            lo, hi = segs[0][0], segs[1][0]
            text = (f"{member}: {hi} dominates {lo} above {cuts[0]:.3g} {unit}, {lo} "
                    f"dominates below")
    else:
        ranked = sorted(nonempty, key=lambda lab: -shares[lab])
        text = (f"{member}: mixed, no clean split along the outer diameter: "
                + ", ".join(f"{lab} holds {100 * shares[lab]:.0f} %" for lab in ranked)
                + " of the combined front")
    return f"{text}; {hv_text}{tail}", shares


def compare_member(member: str, fronts: dict[str, pd.DataFrame], objectives,
                   runs_catalogs: dict[str, tuple[str, str]]) -> MemberComparison:
    """Hypervolume, coverage, best values and verdict of one member's fronts."""
    mats = {lab: _matrix(df, objectives) for lab, df in fronts.items()}
    k = len(objectives)
    nonempty = [m for m in mats.values() if len(m)]
    if nonempty:
        union = np.vstack(nonempty)
        ideal, nadir = tradeoff.front_range(union)
    else:
        ideal, nadir = np.zeros(k), np.ones(k)
    reference = np.full(k, REFERENCE_FACTOR)
    normalized = {lab: tradeoff.normalize(m, ideal, nadir) if len(m) else m
                  for lab, m in mats.items()}
    hv = {lab: tradeoff.hypervolume(z, reference) for lab, z in normalized.items()}
    cov = {a: {b: (None if a == b else tradeoff.coverage(mats[a], mats[b])) for b in mats}
           for a in mats}
    verdict, shares = verdict_line(member, fronts, objectives, cov, hv)
    summaries = {lab: FrontSummary(label=lab, run=runs_catalogs[lab][0],
                                   catalog=runs_catalogs[lab][1], designs=len(mats[lab]),
                                   hypervolume=hv[lab], best=_best(fronts[lab], objectives),
                                   combined_share=shares[lab])
                 for lab in fronts}
    return MemberComparison(member=member, objectives=tuple(objectives),
                            labels=tuple(fronts), summaries=summaries, coverage=cov,
                            ideal=[float(v) for v in ideal], nadir=[float(v) for v in nadir],
                            reference_point=[float(v) for v in reference], verdict=verdict,
                            fronts=fronts)


def compare_runs(run_dirs, member: str | None = None) -> Comparison:
    """Compare every (run, catalog) front per member across one or more run folders."""
    run_dirs = [Path(r) for r in run_dirs]
    if not run_dirs:
        raise InputError("compare: give at least one run folder")
    resolved = [p.resolve() for p in run_dirs]
    for k, p in enumerate(resolved):
        if p in resolved[:k]:
            raise InputError(f"{run_dirs[k]}: run folder given twice")
    fronts, provenances = {}, {}
    for p in run_dirs:
        fronts[p], provenances[str(p)] = read_front(p)
    objectives = check_comparable(provenances)
    run_names = _run_names(run_dirs)
    names = list(dict.fromkeys(m.get("name") for prov in provenances.values()
                               for m in prov.get("members", ())))
    names += [m for p in run_dirs for m in dict.fromkeys(fronts[p]["member"]) if m not in names]
    if member is not None:
        if member not in names:
            raise InputError(f"member = {member!r}: not in these runs (members: "
                             f"{', '.join(names) or 'none'})")
        names = [member]
    members = []
    for name in names:
        per: dict[str, pd.DataFrame] = {}
        rc: dict[str, tuple[str, str]] = {}
        for p, run_name in zip(run_dirs, run_names):
            prov = provenances[str(p)]
            if not any(m.get("name") == name for m in prov.get("members", ())) and \
                    name not in set(fronts[p]["member"]):
                continue
            cats = [c["name"] for c in prov.get("catalogs", ())] or list(
                dict.fromkeys(fronts[p]["catalog"]))
            for cat in cats:
                lab = cat if len(run_dirs) == 1 else f"{run_name}/{cat}"
                df = fronts[p]
                per[lab] = df[(df["member"] == name) & (df["catalog"] == cat)].reset_index(
                    drop=True)
                rc[lab] = (str(p), cat)
        members.append(compare_member(name, per, objectives, rc))
    return Comparison(runs=tuple(str(p) for p in run_dirs), objectives=objectives,
                      members=tuple(members))


# ------------------------------------------------------------------------------------ output

def _num(v):
    if v is None:
        return None
    v = float(v)
    return v if math.isfinite(v) else None


def comparison_to_json(c: Comparison) -> dict:
    """The ``--json`` object (objective values in the columns' SI units)."""
    return {
        "runs": list(c.runs),
        "objectives": list(c.objectives),
        "reference_point_normalized": REFERENCE_FACTOR,
        "members": [{
            "member": mc.member,
            "verdict": mc.verdict,
            "ideal": mc.ideal,
            "nadir": mc.nadir,
            "reference_point": mc.reference_point,
            "fronts": [{
                "label": s.label, "run": s.run, "catalog": s.catalog, "designs": s.designs,
                "hypervolume": _num(s.hypervolume),
                "combined_front_share": _num(s.combined_share),
                "best": {k: _num(v) for k, v in s.best.items()},
            } for s in mc.summaries.values()],
            "coverage": {a: {b: _num(v) for b, v in row.items() if a != b}
                         for a, row in mc.coverage.items()},
        } for mc in c.members],
    }


def format_comparison(c: Comparison) -> str:
    """The report of ``cablefam compare``."""
    labels = ", ".join(OBJECTIVES[o].label for o in c.objectives)
    lines = [f"cablefam compare: {', '.join(c.runs)}",
             f"objectives: {labels}",
             f"hypervolume: per member, objectives normalized to the union of the compared "
             f"fronts, reference point {REFERENCE_FACTOR:g} in each normalized objective",
             "coverage C(row, column): share of the column's front weakly dominated by the "
             "row's (Zitzler and Thiele 1999)"]
    for mc in c.members:
        lines += ["", f"member {mc.member}"]
        headers = ["front", "designs", "hypervolume", "share of combined front"] + [
            "best " + OBJECTIVES[o].label for o in mc.objectives]
        rows = []
        for s in mc.summaries.values():
            share = None if s.combined_share is None else f"{100 * s.combined_share:.0f} %"
            rows.append([s.label, s.designs, s.hypervolume, share]
                        + [s.best[OBJECTIVES[o].column] for o in mc.objectives])
        lines.append(format_table(headers, rows, indent="  "))
        if len(mc.labels) > 1:
            cov_rows = [[a] + [("-" if a == b or mc.coverage[a][b] is None
                                else f"{100 * mc.coverage[a][b]:.0f} %") for b in mc.labels]
                        for a in mc.labels]
            lines += ["", format_table(["C(row, column)"] + list(mc.labels), cov_rows,
                                       indent="  ")]
        lines += ["", f"  verdict: {mc.verdict}"]
    return "\n".join(lines)
