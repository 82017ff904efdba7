"""Design sheets: one Markdown and one HTML page per picked design, with its plots beside it.

A sheet re-evaluates the design from the run folder (the front row exported as a design file,
materials from the run's catalog copy) and holds every computed quantity, the materials and
their sources, the constraint margins, a cross-section to scale, the B(r), |J(r)| and E(r)
profiles at the operating point, attenuation and power handling versus frequency, the design's
place on its member's front, and the cautions. The HTML page is self-contained apart from the
PNG files next to it (relative links): no external script or style sheet.
"""

from __future__ import annotations

import dataclasses
import math
import tomllib
from pathlib import Path

import numpy as np
import pandas as pd

from cablefam.optimizer.model.outer_conductor import shield_build_m
from cablefam.optimizer.atomic import write_text_atomic
from cablefam.optimizer.cautions import CAUTION_LINES
from cablefam.optimizer.errors import InputError
from cablefam.optimizer.inputs.design_file import Design, design_arrays, parse_design
from cablefam.optimizer.model.evaluate import Designs, evaluate
from cablefam.optimizer.model.objectives import OBJECTIVES
from cablefam.optimizer.model.quantities import MEMBER_KEYS, QUANTITIES
from cablefam.optimizer.model.slots import SLOTS
from cablefam.optimizer.review.design_export import front_row_design_toml
from cablefam.optimizer.review.figure_style import safe_name, save_figure
from cablefam.optimizer.review.inspection import (REPORT_LAYOUT, Inspection, engineering,
                                                  inspect_loaded, profile_table)
from cablefam.optimizer.review.sheet_document import (Code, Heading, Image, Link,  # noqa: F401
                                                     Paragraph, Table, render_html,
                                                     render_markdown)
from cablefam.optimizer.review.sheet_figures import (cross_section_figure, frequency_figure,
                                                     front_position_figure, profile_figure)
from cablefam.optimizer.review.sheet_screening import screening_sheet_figures, spec_of

#: Points of the frequency sweep on a sheet.
FREQUENCY_POINTS = 40
#: Frequency sweep from operating / FREQUENCY_SPAN_BELOW to operating * FREQUENCY_SPAN_ABOVE,
#: but not beyond the TE11 cutoff (the TEM model does not hold above it).
FREQUENCY_SPAN_BELOW = 100.0
FREQUENCY_SPAN_ABOVE = 10.0
#: Relative difference above which a re-evaluated quantity is flagged against the run's value.
REEVALUATION_RTOL = 1e-6


# --------------------------------------------------------------------------------- physics

def _repeat(designs: Designs, n: int) -> Designs:
    """Every array field of a one-design :class:`Designs` repeated ``n`` times."""
    def rep(v):
        return np.repeat(np.asarray(v, dtype=float).reshape(-1), n)

    changes = {}
    for fld in dataclasses.fields(designs):
        value = getattr(designs, fld.name)
        if isinstance(value, dict):
            changes[fld.name] = {k: rep(v) for k, v in value.items()}
        elif value is not None:
            changes[fld.name] = rep(value)
    return dataclasses.replace(designs, **changes)


def frequency_response(design: Design, te11_cutoff_hz: float | None,
                       n: int = FREQUENCY_POINTS) -> pd.DataFrame:
    """Attenuation (20 degC conductors, and at the operating power) and max CW power versus
    frequency, from operating/100 to min(10 x operating, TE11 cutoff); one vectorized call per
    curve."""
    designs, op = design_arrays(design)
    f0 = float(op.frequency_hz)
    top = FREQUENCY_SPAN_ABOVE * f0
    if te11_cutoff_hz is not None and math.isfinite(te11_cutoff_hz):
        top = max(min(top, te11_cutoff_hz), 1.01 * f0)
    f = np.geomspace(f0 / FREQUENCY_SPAN_BELOW, top, n)
    many = _repeat(designs, n)
    cold = evaluate(many, dataclasses.replace(op, frequency_hz=f, power_w=None),
                    include_max_power=True)
    out = {"frequency_hz": f, "attenuation_20c_db_per_100m": cold["attenuation_db_per_100m"]}
    if "max_power_w" in cold:
        out["max_power_w"] = cold["max_power_w"]
    if op.power_w:
        hot = evaluate(many, dataclasses.replace(op, frequency_hz=f), include_max_power=False)
        att = np.where(hot.get("thermal_converged", np.ones(n)) > 0.0,
                       hot["attenuation_db_per_100m"], np.nan)
        out["attenuation_hot_db_per_100m"] = att
    return pd.DataFrame(out)


# ---------------------------------------------------------------------------------- sheets

def _fmt(v, unit="") -> str:
    if v is None or (isinstance(v, float) and math.isnan(v)):
        return "-"
    if isinstance(v, float):
        return engineering(v, unit) if unit else f"{v:.4g}"
    return str(v)


def _quantity_rows(values: dict[str, float]) -> list[Table | Heading]:
    blocks: list = []
    seen = set()
    for title, rows in REPORT_LAYOUT:
        present = [(k, label, u) for k, label, u in rows if k in values]
        if not present:
            continue
        blocks.append(Heading(3, title))
        blocks.append(Table(("quantity", "value", "key"),
                            tuple((label.strip(), engineering(values[k], u), k)
                                  for k, label, u in present)))
        seen.update(k for k, _, _ in present)
    rest = [k for k in values if k not in seen]
    if rest:
        blocks.append(Heading(3, "Other"))
        blocks.append(Table(("quantity", "value", "key"), tuple(
            (QUANTITIES[k].label if k in QUANTITIES else k,
             ("yes" if values[k] else "no") if k == "thermal_converged"
             else f"{values[k]:.6g}", k) for k in rest)))
    return blocks


def sheet_stem(member: str, catalog: str, index: int) -> str:
    """File name stem of a design's sheet (``.md``, ``.html`` and its PNGs)."""
    return safe_name(f"{member}-{catalog}-{int(index)}")


def member_rows(spec: dict) -> list[tuple[str, str, str]]:
    """The member's operating point and limits as (label, value with unit, sweep-file key)
    (labels from :data:`cablefam.optimizer.model.quantities.MEMBER_KEYS`); the report's
    table too."""
    rows = []
    known = list(MEMBER_KEYS)
    ordered = sorted(spec, key=lambda k: known.index(k) if k in known else len(known))
    for key in ordered:  # the table's order (provenance JSON keeps them sorted by name)
        value = spec[key]
        q = MEMBER_KEYS.get(key)
        if key == "name" or q is None:
            text = _fmt(value)
        elif value is None:
            text = "not set"
        elif isinstance(value, (int, float)) and q.unit != "-":
            text = engineering(float(value), q.unit)
        else:
            text = _fmt(float(value) if isinstance(value, int) else value)
        rows.append((q.label if q is not None else key, text, key))
    return rows


def _relative_href(target: Path, start: Path) -> str:
    import os

    return Path(os.path.relpath(Path(target).resolve(), Path(start).resolve())).as_posix()


def _material_rows(design: Design, ids: dict[str, str]) -> Table:
    rows = []
    for table, slot in SLOTS.items():
        record = getattr(design, table)
        if record is None:
            continue
        data = record.model_dump(exclude_none=True)
        props = ", ".join(f"{k} = {str(v).lower() if isinstance(v, bool) else f'{v:.6g}'}"
                          for k, v in data.items() if isinstance(v, (int, float)))
        rows.append((slot.label, ids.get(table) or "-", data.get("name", "-"), props,
                     data.get("source", "not given")))
    return Table(("layer", "id", "material", "properties (SI, units in names)", "source"),
                 tuple(rows))


def _reevaluation_notes(values: dict[str, float], row: pd.Series) -> list[str]:
    notes = []
    for k, v in values.items():
        if k in row.index and isinstance(row[k], (float, np.floating)):
            stored = float(row[k])
            if math.isfinite(stored) and math.isfinite(v) and not math.isclose(
                    v, stored, rel_tol=REEVALUATION_RTOL, abs_tol=1e-12):
                notes.append(f"{k}: run {stored:.6g}, now {v:.6g}")
    return notes


def design_sheet(run_dir, row: pd.Series, member_front: pd.DataFrame, provenance: dict,
                 out_dir, *, method: str, score_meaning: str,
                 report_href: str | None = None) -> list[Path]:
    """Write the sheet of one picked front row (Markdown, HTML, PNGs); return the paths.

    The sheet links back to the run's report, ``report_href`` (relative to the sheet; default
    ``RUN/report.html`` as seen from ``out_dir``, where ``cablefam report RUN`` writes it).
    """
    run_dir, out_dir = Path(run_dir), Path(out_dir)
    if report_href is None:
        report_href = _relative_href(run_dir / "report.html", out_dir)
    member, catalog, index = str(row["member"]), str(row["catalog"]), int(row["index"])
    objectives = list(provenance["objectives"])
    toml_text = front_row_design_toml(run_dir, member, index)
    where = f"{run_dir} member {member} index {index}"
    design = parse_design(tomllib.loads(toml_text), where, run_dir)
    result: Inspection = inspect_loaded(design)
    values = result.values
    g = design.geometry
    a, b = g.inner_radius_m, g.dielectric_radius_m
    c = b + shield_build_m(g)
    d = c + g.jacket_thickness_m
    offset = float(getattr(g, "eccentricity_m", 0.0) or 0.0)
    stem = sheet_stem(member, catalog, index)
    ids = {t: row.get(t) for t in SLOTS}
    names = {t: f"{ids[t]}" for t in ids if ids[t]}

    profile = profile_table(result)
    o = design.operating
    re_z0 = values.get("z0_real_ohm", values["z0_ohm"])  # P = |I|^2 Re Z0
    if o.power_w:
        note = (f"{o.power_w:g} W CW in a matched line: "
                f"I = {math.sqrt(2 * o.power_w / re_z0):.4g} A peak")
    else:
        note = "I = 1 A"
    if o.peak_voltage_v is not None:
        note += f", V = {o.peak_voltage_v:g} V peak"
    if offset > 0.0:
        note += "; concentric profile, the offset conductor is not drawn here"
    freq = frequency_response(design, values.get("te11_cutoff_hz"))
    paths: list[Path] = []
    images = {}
    figures = {
        "section": (cross_section_figure(a, b, c, d, names, offset),
                    "cross-section to scale"),
        "profiles": (profile_figure(profile, a, b, c, d, note),
                     "B(r), |J(r)| and E(r) at the operating point"),
        "frequency": (frequency_figure(freq, o.frequency_hz, values.get("te11_cutoff_hz"),
                                       o.power_w),
                      "attenuation and power handling versus frequency"),
        "front": (front_position_figure(
            member_front, row, objectives, f"{member}: this design on the member's front"),
            "position on the member's front"),
    }
    figures.update(screening_sheet_figures(design, spec_of(provenance, member),
                                           figures["section"][0]))
    for key, (fig, alt) in figures.items():
        written = save_figure(fig, out_dir / f"{stem}-{key}", formats=("png",))
        paths += written
        images[key] = Image(written[0].name, alt)

    spec = next((m for m in provenance.get("members", ()) if m.get("name") == member), {})
    title = f"Design sheet: {member}, catalog {catalog}, front row {index}"
    blocks: list = [
        Heading(1, title),
        Paragraph(f"Run {run_dir.name} ({run_dir}); picked by {method}, rank {int(row['rank'])}, "
                  f"score {float(row['score']):.4g} ({score_meaning}). Engineering estimate: "
                  "see the cautions at the end."),
        Paragraph("Export this design as a design file:"),
        Code(f"cablefam design {run_dir} --member {member} --index {index} > {stem}.toml\n"
             f"cablefam inspect {stem}.toml"),
        Link(report_href, "Run report", f" (all members, fronts, picks; made by `cablefam "
             f"report {run_dir}`)"),
        Heading(2, "Member specification (operating point and limits)"),
        Table(("quantity", "value", "key"), tuple(member_rows(spec))),
        Heading(2, "Geometry"),
        Table(("dimension", "value"), (
            ("centre-conductor radius a", engineering(a, "m")),
            ("dielectric radius b", engineering(b, "m")),
            ("shield outer radius c", engineering(c, "m")),
            ("outer radius d", engineering(d, "m")),
            ("shield thickness", engineering(shield_build_m(g), "m")),
            ("jacket thickness", engineering(g.jacket_thickness_m, "m")),
            ("centre-conductor offset (eccentricity)", engineering(offset, "m")),
            ("b/a", f"{b / a:.4g}"))),
        images["section"],
        Heading(2, "Materials and their sources"),
        _material_rows(design, ids),
        Heading(2, "Objectives"),
        Table(("objective", "value", "pseudo-weight (Deb 2001)"), tuple(
            (OBJECTIVES[ob].label, f"{float(row[OBJECTIVES[ob].column]):.6g}",
             f"{float(row.get(f'pseudo_weight_{ob}', float('nan'))):.3f}")
            for ob in objectives)),
        Heading(2, "Every computed quantity (re-evaluated at the operating point)"),
    ]
    blocks += _quantity_rows(values)
    notes = _reevaluation_notes(values, row)
    if notes:
        blocks.append(Paragraph("Re-evaluation differs from the run's stored values (code or "
                                "catalog changed since the run?): " + "; ".join(notes)))
    margins = [(k[len("margin_"):], f"{float(row[k]):.4g}") for k in row.index
               if k.startswith("margin_")]
    if "impedance_yield" in row.index and pd.notna(row["impedance_yield"]):
        blocks += [
            Heading(2, "Manufacturing yield (the run's [tolerance] spreads)"),
            Table(("quantity", "value"), (
                ("impedance yield (share within the tolerance band)",
                 f"{float(row['impedance_yield']):.4f}"),
                ("Z0 3-sigma band [ohm]", f"{float(row['z0_3sigma_low_ohm']):.4g} .. "
                                          f"{float(row['z0_3sigma_high_ohm']):.4g}"))),
        ]
    blocks += [
        Heading(2, "Constraint margins (fraction of the limit; >= 0 is within it)"),
        Table(("constraint", "margin"), tuple(margins)),
        Heading(2, "Field profiles at the operating point"),
        Paragraph(f"Amplitudes across centre conductor, dielectric, shield wall and outside "
                  f"({note})."),
        images["profiles"],
        Heading(2, "Attenuation and power handling versus frequency"),
        images["frequency"],
        *([Heading(2, "Transfer impedance versus frequency"), images["screening"]]
          if "screening" in images else []),
        Heading(2, "Position on the member's front"),
        images["front"],
        Heading(2, "Cautions"),
        Paragraph(" ".join(CAUTION_LINES)),
    ]
    md = out_dir / f"{stem}.md"
    page = out_dir / f"{stem}.html"
    write_text_atomic(md, render_markdown(blocks))
    write_text_atomic(page, render_html(blocks, title))
    return [md, page] + paths


def write_sheets(result, out_dir) -> list[Path]:
    """Design sheets of every pick of a :class:`cablefam.optimizer.review.pick.PickResult`."""
    from cablefam.optimizer.review.pick import SCORE_MEANING
    from cablefam.optimizer.run_folder.reader import read_front

    if result.picks.empty:
        return []
    front, provenance = read_front(result.run_dir)
    out_dir = Path(out_dir)
    if out_dir.exists() and not out_dir.is_dir():
        raise InputError(f"out_dir = {out_dir}: exists and is not a folder")
    paths: list[Path] = []
    for _, row in result.picks.iterrows():
        member_front = front[front["member"] == row["member"]]
        paths += design_sheet(result.run_dir, row, member_front, provenance, out_dir,
                              method=result.method,
                              score_meaning=SCORE_MEANING[result.method])
    return paths
