"""``cablefam pick``: choose a few candidates per family member from a run's front.

Rows are filtered (member, catalog, a ``--where`` condition in pandas expression syntax), the
non-dominated designs among them are kept, and those are ranked by one method:

``knee``
    distance below the hyperplane through the extreme points, Das (1999)
    (:func:`cablefam.optimizer.review.tradeoff.knee_distances`); largest first;
``weights``
    weighted sum of the objectives normalized to the front's range
    (:func:`cablefam.optimizer.review.tradeoff.weighted_scores`); smallest first;
``nearest``
    distance to a target point in range-normalized objective space
    (:func:`cablefam.optimizer.review.tradeoff.nearest_distances`); smallest first.

Normalization uses the range of the designs being ranked (the member's non-dominated set after
filtering). Each pick also carries Deb's pseudo-weights, the preference it stands for.
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import dataclass
from pathlib import Path

import numpy as np
import pandas as pd

from cablefam.optimizer.errors import InputError
from cablefam.optimizer.model.objectives import OBJECTIVES, objective_matrix, resolutions
from cablefam.optimizer.inputs.sweep_spec import GEOMETRY_KEYS
from cablefam.optimizer.model.quantities import display
from cablefam.optimizer.model.slots import SLOT_NAMES
from cablefam.optimizer.review import tradeoff
from cablefam.optimizer.text_table import format_table
from cablefam.optimizer.run_folder.reader import read_front

METHODS = ("knee", "weights", "nearest")
#: Column of a design's position among its member's rows of front.parquet (file order): the
#: ``--index`` of ``cablefam design``.
INDEX_COLUMN = "index"
SCORE_MEANING = {
    "knee": "normalized distance below the hyperplane through the front's extremes "
            "(Das 1999); larger is a sharper knee",
    "weights": "weighted sum of range-normalized objectives; smaller is better",
    "nearest": "distance to the target in range-normalized objective space; smaller is closer",
}


@dataclass(frozen=True)
class PickResult:
    """Picked designs of one ``pick`` call."""

    run_dir: Path
    objectives: tuple[str, ...]
    method: str
    picks: pd.DataFrame
    """One row per pick: the front.parquet row plus ``rank``, ``index``, ``score`` and
    ``pseudo_weight_<objective>``, ordered by member (file order) then rank."""
    candidates: dict[str, int]
    """member -> number of non-dominated designs ranked."""
    weights: dict[str, float] | None = None
    target: dict[str, float] | None = None
    diverse: bool = True
    """Picks spread along the front (False: the best-ranked distinct designs)."""


def _objective_name(key: str, objectives, option: str) -> str:
    for name in objectives:
        if key in (name, OBJECTIVES[name].column):
            return name
    known = ", ".join(objectives)
    raise InputError(f"{option}: {key!r} is not an objective of this run (objectives: {known})")


def parse_objective_values(text, objectives, option: str) -> dict[str, float]:
    """``"attenuation=2, mass=1"`` (or a mapping) -> {objective name: float}.

    Keys are objective names or their column names; values are in the column's units.
    """
    if isinstance(text, Mapping):
        items = [(str(k), v) for k, v in text.items()]
    else:
        items = []
        for part in str(text).split(","):
            if not part.strip():
                continue
            key, sep, value = part.partition("=")
            if not sep:
                raise InputError(f"{option} = {text!r}: write name=value pairs separated by "
                                 f"commas, e.g. {objectives[0]}=1")
            items.append((key.strip(), value.strip()))
    if not items:
        raise InputError(f"{option} = {text!r}: give at least one name=value pair")
    out: dict[str, float] = {}
    for key, value in items:
        name = _objective_name(key, objectives, option)
        try:
            number = float(value)
        except (TypeError, ValueError):
            raise InputError(f"{option}: {key} = {value!r}: not a number") from None
        if not math.isfinite(number):
            raise InputError(f"{option}: {key} = {value!r}: must be finite")
        if name in out:
            raise InputError(f"{option}: {key!r} is given twice")
        out[name] = number
    return out


def apply_where(df: pd.DataFrame, where: str | None) -> pd.DataFrame:
    """Rows for which ``where`` (pandas ``DataFrame.eval`` syntax over the columns) is true."""
    if where is None or not where.strip():
        return df
    try:
        mask = df.eval(where)
    except Exception as exc:  # pandas raises many types for a bad expression; report any
        reason = str(exc).splitlines()[0] if str(exc) else type(exc).__name__
        raise InputError(f"where = {where!r}: not a valid condition over the front's "
                         f"columns ({type(exc).__name__}: {reason})") from None
    if not isinstance(mask, pd.Series) or mask.dtype != bool or len(mask) != len(df):
        raise InputError(f"where = {where!r}: must be a condition that is true or false for "
                         "each row, e.g. \"outer_diameter_m < 8e-3 and dielectric == 'foam-pe'\"")
    return df[mask]


def _rank(f: np.ndarray, method: str, weights, target) -> tuple[np.ndarray, np.ndarray]:
    """Scores and the order (best first) of candidate rows."""
    if method == "knee":
        score = tradeoff.knee_distances(f)
        order = np.lexsort((np.arange(len(f)), -score))
    elif method == "weights":
        score = tradeoff.weighted_scores(f, weights)
        order = np.lexsort((np.arange(len(f)), score))
    else:
        score = tradeoff.nearest_distances(f, target)
        order = np.lexsort((np.arange(len(f)), score))
    return score, order


def pick(run_dir, *, member: str | None = None, catalog: str | None = None,
         where: str | None = None, method: str = "knee", weights=None, target=None,
         top: int = 5, diverse: bool = True) -> PickResult:
    """Rank the non-dominated designs of each member (or of ``member``) and keep the ``top``.

    Parameters
    ----------
    run_dir : path
        Run folder written by ``cablefam sweep``.
    member, catalog : str, optional
        Only this member / only rows of this catalog.
    where : str, optional
        Extra condition in pandas expression syntax (``DataFrame.eval``), e.g.
        ``"outer_diameter_m < 8e-3"``.
    method : {"knee", "weights", "nearest"}
    weights : str or mapping, for ``method="weights"``
        Weight per objective (``"attenuation=2,mass=1"``); objectives left out weigh 0.
    target : str or mapping, for ``method="nearest"``
        Target value per objective in the column's units; objectives left out are ignored.
    top : int
        Designs kept per member, >= 1. Two picks always differ by more than one resolution
        step (the run's, see :data:`cablefam.optimizer.model.objectives.RESOLUTIONS`) in at
        least one objective: a design next to a better-ranked one is passed over.
    diverse : bool
        Spread the picks along the front (default): after the best-ranked design, each next
        pick is the best-ranked one at least ``1/top`` of the front's normalized range from
        every earlier pick (:func:`cablefam.optimizer.review.tradeoff.spread_first`). False:
        the best-ranked designs that are merely distinct, often neighbours of the first.
    """
    if method not in METHODS:
        raise InputError(f"method = {method!r}: use one of {', '.join(METHODS)}")
    if top < 1:
        raise InputError(f"top = {top}: must be >= 1")
    df, provenance = read_front(run_dir)
    objectives = tuple(provenance.get("objectives", ()))
    if not objectives or any(o not in OBJECTIVES for o in objectives):
        raise InputError(f"{run_dir}: provenance objectives = {list(objectives)!r}: unknown")
    position = df.groupby("member", sort=False).cumcount()  # `cablefam design --index`
    members = list(dict.fromkeys(df["member"]))
    if member is not None:
        if member not in members:
            known = ", ".join(members) or "none"
            raise InputError(f"member = {member!r}: not in this run (members: {known})")
        members = [member]
    if catalog is not None and catalog not in set(df["catalog"]):
        known = ", ".join(sorted(set(df["catalog"]))) or "none"
        raise InputError(f"catalog = {catalog!r}: not in this run (catalogs: {known})")
    w_vec = t_vec = None
    w_map = t_map = None
    if method == "weights":
        if weights is None:
            raise InputError("weights: give name=value pairs, e.g. "
                             + ",".join(f"{o}=1" for o in objectives))
        w_map = parse_objective_values(weights, objectives, "weights")
        w_vec = np.array([w_map.get(o, 0.0) for o in objectives])
        if np.any(w_vec < 0.0) or not w_vec.sum() > 0.0:
            raise InputError(f"weights = {weights!r}: weights must be >= 0 and not all zero")
    elif method == "nearest":
        if target is None:
            raise InputError("target: give the target per objective, e.g. "
                             + ",".join(f"{o}=..." for o in objectives))
        t_map = parse_objective_values(target, objectives, "target")
        t_vec = np.array([t_map.get(o, np.nan) for o in objectives])
        # maximised objectives are negated in the matrix, so is their target
        t_vec = np.array([-v if OBJECTIVES[o].maximise else v for o, v in zip(objectives, t_vec)])

    # designs closer than one resolution step in every objective count as one
    resolution = resolutions(objectives, provenance.get("resolution"))
    rows = df[df["member"].isin(members)]
    if catalog is not None:
        rows = rows[rows["catalog"] == catalog]
    rows = apply_where(rows, where)
    picked, candidates = [], {}
    for name in members:
        sub = rows[rows["member"] == name]
        f = objective_matrix(sub, objectives) if len(sub) else np.empty((0, len(objectives)))
        finite = np.all(np.isfinite(f), axis=1)
        sub, f = sub[finite], f[finite]
        if len(sub) == 0:
            candidates[name] = 0
            continue
        keep = tradeoff.nondominated_mask(f)
        sub, f = sub[keep], f[keep]
        candidates[name] = len(sub)
        score, order = _rank(f, method, w_vec, t_vec)
        pw = tradeoff.pseudo_weights(f)
        if diverse:
            chosen = tradeoff.spread_first(f, order, resolution, top)
        else:
            chosen = tradeoff.distinct_first(f, order, resolution, top)
        out = sub.iloc[chosen].copy()
        out.insert(0, "rank", np.arange(1, len(chosen) + 1))
        out.insert(3, INDEX_COLUMN, position.loc[out.index].to_numpy())
        out["score"] = score[chosen]
        for j, o in enumerate(objectives):
            out[f"pseudo_weight_{o}"] = pw[chosen, j]
        picked.append(out)
    picks = (pd.concat(picked, ignore_index=True) if picked
             else pd.DataFrame(columns=["rank", "member", "catalog", INDEX_COLUMN, "score"]))
    return PickResult(run_dir=Path(run_dir), objectives=objectives, method=method,
                      picks=picks, candidates=candidates, weights=w_map, target=t_map,
                      diverse=diverse)


# ------------------------------------------------------------------------------------ output

#: Shown when the run had a [tolerance] table.
YIELD_COLUMNS = ("impedance_yield", "z0_3sigma_low_ohm", "z0_3sigma_high_ohm")


def _key_columns(objectives) -> list[str]:
    cols = [OBJECTIVES[o].column for o in objectives]
    for extra in ("z0_ohm", "outer_diameter_m"):
        if extra not in cols:
            cols.append(extra)
    return cols


def _json_value(v):
    if isinstance(v, (bool, np.bool_)):
        return bool(v)
    if isinstance(v, (int, np.integer)):
        return int(v)
    if isinstance(v, (float, np.floating)):
        return float(v) if math.isfinite(v) else None
    return v


def picks_to_json(result: PickResult) -> dict:
    """The ``--json`` object: method, objectives and one object per pick (SI, units in keys)."""
    cols = (["rank", "member", "catalog", INDEX_COLUMN, *SLOT_NAMES, *GEOMETRY_KEYS]
            + _key_columns(result.objectives) + list(YIELD_COLUMNS) + ["score"]
            + [f"pseudo_weight_{o}" for o in result.objectives])
    picks = []
    for _, row in result.picks.iterrows():
        obj = {c: _json_value(row[c]) for c in cols if c in row.index}
        obj["design_command"] = (f"cablefam design {result.run_dir} --member {row['member']} "
                                 f"--index {int(row[INDEX_COLUMN])}")
        picks.append(obj)
    return {
        "run": str(result.run_dir),
        "method": result.method,
        "score_meaning": SCORE_MEANING[result.method],
        "objectives": list(result.objectives),
        "weights": result.weights,
        "target": result.target,
        "candidates": result.candidates,
        "diverse": result.diverse,
        "picks": picks,
    }


def format_picks(result: PickResult) -> str:
    """The table of ``cablefam pick``: key columns with units, one block per member."""
    obj_cols = _key_columns(result.objectives)
    shown = {c: display(c) for c in obj_cols}   # (factor, label with the shown unit)
    with_yield = "impedance_yield" in result.picks.columns and bool(
        result.picks["impedance_yield"].notna().any())
    headers = (["rank", "catalog", "index", *SLOT_NAMES, "a [mm]", "b [mm]"]
               + [shown[c][1] for c in obj_cols]
               + (["yield", "Z0 3-sigma [ohm]"] if with_yield else []) + ["score"])
    lines = [f"cablefam pick: {result.run_dir}, method {result.method} "
             f"({SCORE_MEANING[result.method]})",
             "picks spread along the front (--neighbours: the best-ranked distinct designs)"
             if result.diverse else "the best-ranked distinct designs (--diverse: spread "
             "along the front)"]
    if result.weights:
        lines.append("weights: " + ", ".join(f"{k}={v:g}" for k, v in result.weights.items()))
    if result.target:
        lines.append("target: " + ", ".join(f"{k}={v:g}" for k, v in result.target.items()))
    for member, n in result.candidates.items():
        sub = result.picks[result.picks["member"] == member] if len(result.picks) else []
        lines += ["", f"member {member}: {n} non-dominated candidate(s)"]
        if n == 0:
            lines.append("  no design matches")
            continue
        rows = []
        for _, r in sub.iterrows():
            rows.append([int(r["rank"]), r["catalog"], int(r[INDEX_COLUMN])]
                        + [r[t] or "-" for t in SLOT_NAMES]
                        + [1e3 * float(r["inner_radius_m"]), 1e3 * float(r["dielectric_radius_m"])]
                        + [shown[c][0] * float(r[c]) for c in obj_cols]
                        + ([f"{float(r['impedance_yield']):.4f}",
                            f"{float(r['z0_3sigma_low_ohm']):.4g}-"
                            f"{float(r['z0_3sigma_high_ohm']):.4g}"] if with_yield else [])
                        + [float(r["score"])])
        lines.append(format_table(headers, rows, indent="  "))
    lines += ["", f"export one: cablefam design {result.run_dir} --member MEMBER --index INDEX"]
    return "\n".join(lines)
