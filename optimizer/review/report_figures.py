"""The interactive figures of the run report, as plotly figure objects (plain dicts).

Two figures per family member, both drawn by plotly.js in the browser (the library's bundle is
inlined in the page by :mod:`.report_page`; nothing here imports plotly):

- :func:`front_figure`: the fronts of every catalog on one scatter plot, one trace per catalog
  (Okabe-Ito colour *and* marker shape, :mod:`.figure_style`), the picks as black stars; the
  hover box shows the design's materials, radii and key quantities; two drop-down menus choose
  the quantity on each axis (:data:`AXIS_CANDIDATES`, objectives first).
- :func:`parallel_figure`: parallel coordinates (plotly ``parcoords``) of the member's front:
  objectives, geometry and |Z0|, lines coloured by catalog; dragging along an axis brushes
  (keeps only the lines inside the range), several axes combine.

Values are shown in the units of :func:`cablefam.optimizer.model.quantities.display` (lengths in
mm) and rounded to :data:`SIGNIFICANT` significant figures, which keeps the page small.
"""

from __future__ import annotations

import math

import numpy as np
import pandas as pd

from cablefam.optimizer.model.objectives import OBJECTIVES
from cablefam.optimizer.model.quantities import display
from cablefam.optimizer.model.slots import SLOT_NAMES
from cablefam.optimizer.review.figure_style import PALETTE

#: Significant figures of the numbers written into the page.
SIGNIFICANT = 5
#: Quantities offered on the axes of the front plot (after the run's objectives), when the
#: front holds them with more than one finite value.
AXIS_CANDIDATES = ("attenuation_db_per_100m", "mass_kg_per_km", "outer_diameter_m",
                   "cost_per_km", "max_power_w", "max_peak_voltage_v",
                   "dc_loop_resistance_ohm_per_km", "impedance_yield", "z0_ohm",
                   "conductor_temperature_c", "velocity_factor", "inner_radius_m",
                   "dielectric_radius_m")
#: Shown in the hover box of every design (when present), after the objectives.
HOVER_COLUMNS = ("inner_radius_m", "dielectric_radius_m", "shield_thickness_m",
                 "jacket_thickness_m", "outer_diameter_m", "z0_ohm", "attenuation_db_per_100m",
                 "mass_kg_per_km", "cost_per_km", "max_power_w", "conductor_temperature_c",
                 "impedance_yield")
#: Plotly marker symbols per catalog (with the colour: no information on colour alone).
SYMBOLS = ("circle", "square", "diamond", "triangle-up", "cross", "x", "triangle-down",
           "pentagon")
PLOT_HEIGHT_PX = 520
FONT = {"family": "system-ui, -apple-system, 'Segoe UI', Roboto, sans-serif", "size": 13}


def rounded(values) -> list:
    """A list of floats rounded to :data:`SIGNIFICANT` figures; None for NaN/inf (JSON null)."""
    out = []
    for v in np.asarray(values, dtype=float).ravel():
        out.append(float(f"{v:.{SIGNIFICANT}g}") if math.isfinite(v) else None)
    return out


def catalog_colours(catalogs) -> dict[str, str]:
    return {c: PALETTE[i % len(PALETTE)] for i, c in enumerate(catalogs)}


def _usable(front: pd.DataFrame, col: str) -> bool:
    if col not in front:
        return False
    v = pd.to_numeric(front[col], errors="coerce").to_numpy(dtype=float)
    v = v[np.isfinite(v)]
    return v.size > 0 and np.ptp(v) > 0.0


def axis_columns(front: pd.DataFrame, objectives) -> list[str]:
    """The columns offered on the axes: objectives first, then :data:`AXIS_CANDIDATES`."""
    cols = [OBJECTIVES[o].column for o in objectives]
    cols += [c for c in AXIS_CANDIDATES if c not in cols and _usable(front, c)]
    return cols


def _scaled(df: pd.DataFrame, col: str) -> list:
    factor, _ = display(col)
    return rounded(factor * pd.to_numeric(df[col], errors="coerce").to_numpy(dtype=float))


def _materials(df: pd.DataFrame) -> list[str]:
    slots = [s for s in SLOT_NAMES if s in df]
    return [" / ".join(str(v) if v else "-" for v in row)
            for row in df[slots].itertuples(index=False)]


def _hover(df: pd.DataFrame, objectives) -> tuple[list, str]:
    """customdata rows and the hover template that reads them."""
    cols = list(dict.fromkeys([OBJECTIVES[o].column for o in objectives]
                              + [c for c in HOVER_COLUMNS if c in df]))
    data = [rounded(df["index"]) if "index" in df else [None] * len(df)]
    data += [_scaled(df, c) for c in cols]
    custom = [list(row) for row in zip(*data)] if len(df) else []
    slots = " / ".join(s for s in SLOT_NAMES if s in df)
    lines = ["<b>%{text}</b> <i>(" + slots + ")</i>", "catalog %{meta}, front row %{customdata[0]}"]
    for k, c in enumerate(cols, start=1):
        _, label = display(c)
        lines.append(f"{label} = %{{customdata[{k}]}}")
    return custom, "<br>".join(lines) + "<extra></extra>"


def _axis_menu(axis: str, cols: list[str], traces: list[pd.DataFrame], x: float,
               active: int) -> dict:
    buttons = []
    for c in cols:
        _, label = display(c)
        buttons.append({"label": label, "method": "update", "args": [
            {axis: [_scaled(t, c) for t in traces]},
            {f"{axis}axis.title.text": label}]})
    return {"buttons": buttons, "direction": "down", "showactive": True, "active": active,
            "x": x, "xanchor": "left", "y": 1.16, "yanchor": "top",
            "bgcolor": "#FFFFFF", "bordercolor": "#888888", "font": {"size": 12}}


def front_figure(member: str, front: pd.DataFrame, objectives, picks: pd.DataFrame,
                 catalogs) -> dict:
    """The member's fronts of every catalog on one plot, axis quantities selectable.

    ``front`` holds the member's rows with an ``index`` column (the ``cablefam design
    --index``); ``picks`` the picked rows (may be empty).
    """
    cols = axis_columns(front, objectives)
    cx = cols[0]
    cy = cols[1] if len(cols) > 1 else cols[0]
    colours = catalog_colours(catalogs)
    data, frames = [], []
    for n, cat in enumerate(catalogs):  # colour and marker by position among all catalogs
        df = front[front["catalog"] == cat]
        if df.empty:
            continue
        custom, template = _hover(df, objectives)
        data.append({"type": "scatter", "mode": "markers", "name": f"catalog {cat}",
                     "meta": cat, "x": _scaled(df, cx), "y": _scaled(df, cy),
                     "text": _materials(df), "customdata": custom,
                     "hovertemplate": template,
                     "marker": {"color": colours[cat], "symbol": SYMBOLS[n % len(SYMBOLS)],
                                "size": 7, "opacity": 0.75,
                                "line": {"width": 0.5, "color": "#333333"}}})
        frames.append(df)
    if len(picks):
        custom, template = _hover(picks, objectives)
        data.append({"type": "scatter", "mode": "markers+text", "name": "picks (rank)",
                     "meta": "picked", "x": _scaled(picks, cx), "y": _scaled(picks, cy),
                     "text": [str(int(r)) for r in picks["rank"]], "textposition": "top right",
                     "customdata": custom,
                     "hovertemplate": template.replace("<b>%{text}</b>", "<b>pick %{text}</b>"),
                     "marker": {"color": "#000000", "symbol": "star", "size": 16,
                                "line": {"width": 1, "color": "#FFFFFF"}}})
        frames.append(picks)
    layout = {
        "height": PLOT_HEIGHT_PX, "font": FONT, "hovermode": "closest",
        "margin": {"l": 70, "r": 20, "t": 80, "b": 60},
        "xaxis": {"title": {"text": display(cx)[1]}, "gridcolor": "#E5E5E5", "zeroline": False},
        "yaxis": {"title": {"text": display(cy)[1]}, "gridcolor": "#E5E5E5", "zeroline": False},
        "legend": {"orientation": "h", "x": 0.0, "y": -0.14, "yanchor": "top"},
        "plot_bgcolor": "#FFFFFF",
        "updatemenus": [_axis_menu("x", cols, frames, 0.08, 0),
                        _axis_menu("y", cols, frames, 0.55, cols.index(cy))],
        "annotations": [
            {"text": "x axis:", "x": 0.0, "xref": "paper", "y": 1.145, "yref": "paper",
             "showarrow": False, "xanchor": "left"},
            {"text": "y axis:", "x": 0.47, "xref": "paper", "y": 1.145, "yref": "paper",
             "showarrow": False, "xanchor": "left"}],
    }
    return {"data": data, "layout": layout}


#: Axes of the parallel-coordinates view after the objectives (when they vary on the front);
#: few, since each axis costs drawing time where WebGL runs in software.
PARALLEL_COLUMNS = ("inner_radius_m", "dielectric_radius_m", "shield_thickness_m",
                    "outer_diameter_m", "z0_ohm")


def parallel_columns(front: pd.DataFrame, objectives) -> list[str]:
    cols = [OBJECTIVES[o].column for o in objectives]
    cols += [c for c in PARALLEL_COLUMNS if c not in cols and _usable(front, c)]
    return cols


def parallel_trace(front: pd.DataFrame, objectives, catalogs) -> dict:
    """One member's front as a ``parcoords`` trace, lines coloured by catalog (the last axis
    is the catalog too, so no information rests on colour alone)."""
    cols = parallel_columns(front, objectives)
    colours = catalog_colours(catalogs)
    code = {c: k for k, c in enumerate(catalogs)}
    n = max(len(catalogs), 1)
    scale = []
    for k, c in enumerate(catalogs):  # one constant colour per catalog code
        lo, hi = k / n, (k + 1) / n
        scale += [[lo, colours[c]], [hi, colours[c]]]
    dims = []
    for c in cols:
        _, label = display(c)
        label = label.replace("attenuation", "atten.")
        dims.append({"label": label, "values": _scaled(front, c)})
    dims.append({"label": "catalog", "values": [code[c] for c in front["catalog"]],
                 "tickvals": list(range(len(catalogs))), "ticktext": list(catalogs),
                 "range": [-0.5, len(catalogs) - 0.5]})
    values = np.array([code[c] for c in front["catalog"]], dtype=float)
    line = {"color": ((values + 0.5) / n).tolist(), "colorscale": scale, "cmin": 0.0,
            "cmax": 1.0, "showscale": False}
    return {"type": "parcoords", "line": line, "dimensions": dims, "labelangle": -20,
            "labelside": "top"}


def parallel_figure(fronts: dict[str, pd.DataFrame], objectives, catalogs) -> dict:
    """Parallel coordinates of every member's front in one figure, one member shown at a
    time (a menu chooses it); brushing an axis filters the lines.

    One figure rather than one per member: each figure sets up its own WebGL layers, which
    takes about a second where WebGL runs in software; the traces of one figure share them.
    """
    members = [m for m, f in fronts.items() if len(f)]
    data = []
    for k, m in enumerate(members):
        trace = parallel_trace(fronts[m], objectives, catalogs)
        trace["name"] = m
        trace["visible"] = k == 0
        data.append(trace)
    buttons = [{"label": m, "method": "update",
                "args": [{"visible": [j == k for j in range(len(members))]},
                         {"title.text": f"member {m}"}]} for k, m in enumerate(members)]
    layout = {"height": PLOT_HEIGHT_PX + 40, "font": FONT,
              "title": {"text": f"member {members[0]}" if members else "", "x": 0.2,
                        "y": 0.985},
              "margin": {"l": 70, "r": 70, "t": 130, "b": 40},
              "updatemenus": [{"buttons": buttons, "direction": "down", "active": 0,
                               "x": 0.0, "xanchor": "left", "y": 1.3, "yanchor": "top",
                               "bgcolor": "#FFFFFF", "bordercolor": "#888888",
                               "font": {"size": 12}}]}
    return {"data": data, "layout": layout}
