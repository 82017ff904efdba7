"""The sections of the run report (:mod:`.report`) as HTML fragments: the header with the
verdicts and the cautions, one section per family member, the run's provenance."""

from __future__ import annotations

import math

import pandas as pd

from cablefam.optimizer.cautions import CAUTION_LINES
from cablefam.optimizer.model.objectives import OBJECTIVES
from cablefam.optimizer.model.quantities import display
from cablefam.optimizer.model.slots import SLOT_NAMES
from cablefam.optimizer.review.compare import REFERENCE_FACTOR
from cablefam.optimizer.review.figure_style import safe_name
from cablefam.optimizer.review.report_figures import front_figure, parallel_figure
from cablefam.optimizer.review.report_page import e, plot_block, table

#: What each constraint's margin measures against (a member key or the material's limit).
CONSTRAINT_LIMITS = {
    "geometry": "b > 1.01 a",
    "impedance": "impedance_ohm +/- impedance_tolerance_ohm",
    "peak_field": "peak_voltage_v x field_safety_factor vs dielectric strength",
    "conductor_temperature": "dielectric max temperature at power_w",
    "jacket_temperature": "jacket max temperature at power_w",
    "single_mode": "TE11 cutoff >= single_mode_margin x frequency_hz",
    "outer_diameter": "max_outer_diameter_m",
    "shield_skin_depths": "shield wall >= min_shield_skin_depths skin depths",
    "impedance_yield": "min_impedance_yield",
}


def num(v, fmt: str = ".4g") -> str:
    try:
        v = float(v)
    except (TypeError, ValueError):
        return "-" if v is None else e(v)
    return format(v, fmt) if math.isfinite(v) else "-"


def _anchor(member: str) -> str:
    return "member-" + safe_name(member)


def header_section(contents, comparison) -> list[str]:
    prov, info = contents.provenance, contents.run_info or {}
    name = prov.get("sweep_name", contents.run_dir.name)
    when = info.get("finished_utc") or info.get("started_utc") or "-"
    objectives = ", ".join(OBJECTIVES[o].label for o in prov.get("objectives", ())
                           if o in OBJECTIVES)
    out = [f"<h1>Run report: {e(name)}</h1>",
           f"<p class=\"note\">Run folder <code>{e(contents.run_dir)}</code>, finished "
           f"{e(when)}. Objectives: {e(objectives)}. Catalogs: "
           f"{e(', '.join(contents.catalogs))}.</p>",
           "<nav>" + "".join(f"<a href=\"#{_anchor(m)}\">{e(m)}</a>" for m in contents.members)
           + "<a href=\"#parallel-coordinates\">parallel coordinates</a>"
           "<a href=\"#provenance\">provenance</a><a href=\"#cautions\">cautions</a></nav>",
           f"<div class=\"caution\" id=\"cautions\">{e(' '.join(CAUTION_LINES))}</div>"]
    if contents.missing:
        out.append("<div class=\"missing\"><b>Missing from the run folder</b> (the report "
                   "shows what is there):<ul>"
                   + "".join(f"<li>{e(m)}</li>" for m in contents.missing) + "</ul></div>")
    out.append("<h2>Which catalog wins where</h2>")
    out += [f"<p class=\"verdict\">{e(mc.verdict)}</p>" for mc in comparison.members]
    return out


def _spec_table(spec: dict) -> str:
    from cablefam.optimizer.review.sheet import member_rows

    rows = [(e(label), e(value), f"<code>{e(key)}</code>")
            for label, value, key in member_rows(spec) if key != "name"]
    return table(("operating point / limit", "value", "sweep-file key"), rows, numeric=(1,))


def _compare_tables(mc, objectives) -> list[str]:
    cols = [OBJECTIVES[o].column for o in objectives]
    headers = ["front (catalog)", "designs", "hypervolume", "share of combined front"] + [
        "best " + e(display(c)[1]) for c in cols]
    rows = []
    for s in mc.summaries.values():
        share = "-" if s.combined_share is None else f"{100 * s.combined_share:.0f} %"
        rows.append([e(s.label), str(s.designs), num(s.hypervolume), share]
                    + [num(display(c)[0] * s.best[c] if s.best[c] is not None else None)
                       for c in cols])
    out = [table(headers, rows, numeric=tuple(range(1, len(headers)))),
           f"<p class=\"note\">Hypervolume of each front with the objectives normalized to "
           f"the union of the member's fronts, reference point {REFERENCE_FACTOR:g} in each "
           "(larger is better). Coverage C(row, column): share of the column's front weakly "
           "dominated by the row's (Zitzler and Thiele 1999).</p>"]
    labels = list(mc.labels)
    cov_rows = [[e(a)] + ["-" if a == b or mc.coverage[a][b] is None
                          else f"{100 * mc.coverage[a][b]:.0f} %" for b in labels]
                for a in labels]
    out.append(table(["C(row, column)"] + [e(b) for b in labels], cov_rows,
                     numeric=tuple(range(1, len(labels) + 1))))
    return out


def _picks_table(picks: pd.DataFrame, objectives, links, result, run_dir) -> list[str]:
    if picks.empty:
        return ["<p>No design to pick.</p>"]
    cols = [OBJECTIVES[o].column for o in objectives]
    cols += [c for c in ("outer_diameter_m", "z0_ohm") if c not in cols]
    headers = (["rank", "design sheet", "catalog", "row"] + list(SLOT_NAMES)
               + ["a [mm]", "b [mm]"] + [e(display(c)[1]) for c in cols] + ["score"])
    rows = []
    for _, r in picks.iterrows():
        link = links.get((str(r["member"]), int(r["index"])))
        sheet = f"<a href=\"{e(link)}\">sheet</a>" if link else "not written"
        rows.append([str(int(r["rank"])), sheet, e(r["catalog"]), str(int(r["index"]))]
                    + [e(r[s] or "-") for s in SLOT_NAMES]
                    + [num(1e3 * r["inner_radius_m"]), num(1e3 * r["dielectric_radius_m"])]
                    + [num(display(c)[0] * r[c]) for c in cols] + [num(r["score"], ".3g")])
    first = len(SLOT_NAMES) + 4
    member = str(picks["member"].iloc[0])
    out = [table(headers, rows, numeric=(0, 3, *range(first, len(headers))))]
    out.append(f"<p class=\"note\">Ranked by {e(result.method)} (score: "
               f"{e(_score_meaning(result.method))}), spread along the front: two picks are at "
               "least a share of the front apart and differ by more than one resolution step. "
               f"More: <code>cablefam pick {e(run_dir)} --member {e(member)} --top 10</code>; "
               f"export one: <code>cablefam design {e(run_dir)} --member {e(member)} --index "
               "ROW</code>.</p>")
    return out


def _score_meaning(method: str) -> str:
    from cablefam.optimizer.review.pick import SCORE_MEANING

    return SCORE_MEANING[method]


def _binding_table(rows: list[dict], threshold: float) -> list[str]:
    active = [r for r in rows if r["active"]]
    idle = [r["constraint"] for r in rows if not r["active"]]
    out = []
    if active:
        body, classes = [], []
        for r in active:
            picks = ", ".join(str(k) for k in r["binding_picks"]) or "none"
            body.append([e(r["constraint"].replace("_", " ")),
                         e(CONSTRAINT_LIMITS.get(r["constraint"], "")),
                         f"{r['binding']} of {r['designs']} ({100 * r['share']:.0f} %)",
                         num(r["min_margin"], ".3g"), num(r["median_margin"], ".3g"), picks])
            classes.append("binding" if r["share"] >= 0.5 else "")
        out.append(table(("constraint", "limit", f"designs within {100 * threshold:g} % of it",
                          "smallest margin", "median margin", "binding at picks"),
                         body, numeric=(2, 3, 4), row_classes=classes))
        out.append("<p class=\"note\">Margin: distance to the limit as a fraction of it (0 = at "
                   "the limit). A constraint binding for most of the front (shaded) is what "
                   "stops the designs from being better: relaxing it moves the front.</p>")
    if idle:
        out.append(f"<p class=\"note\">Not set for this member: "
                   f"{e(', '.join(c.replace('_', ' ') for c in idle))}.</p>")
    return out


def member_section(n, member, front, objectives, contents, mc, picks, links, binding,
                   result, threshold: float) -> list[str]:
    spec = next((m for m in contents.provenance.get("members", ())
                 if m.get("name") == member), {})
    out = [f"<h2 id=\"{_anchor(member)}\">Member {e(member)}</h2>"]
    if front.empty:
        out.append("<p>No feasible design was found for this member.</p>")
        return out + ["<h3>Operating point and limits</h3>", _spec_table(spec)]
    out += [f"<h3>Fronts of every catalog ({len(front)} designs)</h3>",
            "<p class=\"note\">Hover a point for its materials, radii and key quantities; "
            "choose the quantities on the axes with the menus; click a catalog in the legend "
            "to hide it, double-click to show it alone. Stars: the picks below.</p>",
            plot_block(f"front-{n}", front_figure(member, front, objectives, picks,
                                                  contents.catalogs)),
            "<h3>Top picks</h3>"]
    out += _picks_table(picks, objectives, links, result, contents.run_dir)
    if mc is not None:
        out += ["<h3>Catalogs compared</h3>", f"<p class=\"verdict\">{e(mc.verdict)}</p>"]
        out += _compare_tables(mc, objectives)
    out += ["<h3>Binding constraints</h3>"]
    out += _binding_table(binding, threshold)
    k = [m for m in contents.members if (contents.front["member"] == m).any()].index(member)
    out += [f"<p><a href=\"#parallel-coordinates\" class=\"show-trace\" data-plot=\"parallel\" "
            f"data-trace=\"{k}\" data-title=\"member {e(member)}\">Parallel coordinates of "
            f"this member</a> (filter the front by ranges of its objectives and "
            f"dimensions).</p>",
            "<h3>Operating point and limits</h3>", _spec_table(spec)]
    return out


def parallel_section(contents, objectives) -> list[str]:
    fronts = {m: contents.front[contents.front["member"] == m] for m in contents.members}
    if not any(len(f) for f in fronts.values()):
        return []
    return ["<h2 id=\"parallel-coordinates\">Parallel coordinates</h2>",
            "<p class=\"note\">One member at a time (menu at the top left). Drag along an "
            "axis to keep only the designs inside that range (several axes combine; click the "
            "axis outside the range to clear); drag an axis title to reorder. Colour and last "
            "axis: the catalog.</p>",
            plot_block("parallel", parallel_figure(fronts, objectives, contents.catalogs),
                       lazy=True)]


def _kv(rows) -> str:
    return table(("item", "value"), [(e(k), v) for k, v in rows if v is not None])


def provenance_section(contents) -> list[str]:
    prov, info = contents.provenance, contents.run_info or {}
    both = {**prov, **info}
    sweep = both.get("sweep_path") or both.get("sweep_file")
    resolution = both.get("resolution") or {}
    rows = [
        ("sweep", e(both.get("sweep_name", "-"))),
        ("sweep file", f"<code>{e(sweep)}</code> (copy in <code>inputs/sweep.toml</code>)"
         if sweep else None),
        ("sweep file SHA-256", f"<code>{e(both['sweep_sha256'])}</code>"
         if both.get("sweep_sha256") else None),
        ("command", f"<code>{e(both['command'])}</code>" if both.get("command") else None),
        ("seed", e(both.get("seed", "-"))),
        ("objectives", e(", ".join(both.get("objectives", ())))),
        ("resolution", e(", ".join(f"{k} {v:g}" for k, v in resolution.items())) or None),
        ("genetic stage", f"population {e(both.get('population', '-'))} x generations "
                          f"{e(both.get('generations', '-'))}"),
        ("evaluations per task", e(both.get("evaluations_per_task", "-"))),
        ("time budget [s]", e(both["time_budget_s"]) if both.get("time_budget_s") else None),
        ("started (UTC)", e(info.get("started_utc", "-"))),
        ("finished (UTC)", e(info.get("finished_utc", "-"))),
        ("wall time [s]", num(info.get("wall_seconds"))),
        ("evaluations", e((info.get("counts") or {}).get("evaluations", "-"))),
        ("front rows", str(len(contents.front))),
        ("tasks from an earlier session", e(info["tasks_taken_from_earlier_session"])
         if "tasks_taken_from_earlier_session" in info else None),
        ("resumed with --force", "yes" if info.get("resumed_with_force") else None),
        ("evaluated.parquet", "present" if contents.has_evaluated else "not written"),
        ("packages", e(", ".join(f"{k} {v}" for k, v in (both.get("packages") or {}).items()))
         or None),
    ]
    out = ["<h2 id=\"provenance\">Provenance</h2>", _kv(rows), "<h3>Catalogs</h3>"]
    paths = info.get("catalog_paths") or []
    cats = []
    for k, c in enumerate(both.get("catalogs", ())):
        cats.append((e(c.get("name", "-")), f"<code>{e(paths[k] if k < len(paths) else c.get('file', '-'))}</code>",
                     f"<code>{e(c.get('sha256', '-'))}</code>"))
    out.append(table(("catalog", "file", "SHA-256"), cats))
    tasks = info.get("tasks") or []
    if tasks:
        keys = ("evaluations", "feasible_evaluated", "front_rows", "seconds", "physics_seconds")
        out += ["<h3>Tasks (member x catalog)</h3>", table(
            ("member", "catalog", "seed", "evaluations", "feasible evaluated", "front rows",
             "time [s]", "physics [s]"),
            [[e(t.get("member")), e(t.get("catalog")), e(t.get("seed", "-"))]
             + [num(t.get(k), ".6g") for k in keys] for t in tasks],
            numeric=(2, 3, 4, 5, 6, 7))]
    return out
