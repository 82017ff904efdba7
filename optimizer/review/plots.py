"""Plots of runs, comparisons and design sheets: PNG and SVG, matplotlib's Agg backend.

Colours are the Okabe-Ito palette, chosen to stay distinguishable under the common forms of
colour-vision deficiency: M. Okabe, K. Ito, "Color Universal Design (CUD): how to make figures
and presentations that are friendly to colorblind people", J*FLY, 2008
(https://jfly.uni-koeln.de/color/). Catalogs or fronts get colours; material choices get
marker shapes, so no information rests on colour alone. Axis labels come from
:data:`cablefam.optimizer.model.objectives.OBJECTIVES` (unit in brackets); lengths are shown in millimetres.

Every figure is ``FIGURE_SIZE_IN`` at ``DPI`` (800 x 600 pixels) and is written atomically.
pyplot is imported only inside the functions, after selecting the Agg backend, so that no
display is needed.
"""

from __future__ import annotations

import re
from pathlib import Path

import numpy as np
import pandas as pd

from cablefam.optimizer.atomic import atomic_path
from cablefam.optimizer.model.objectives import OBJECTIVES

#: Okabe-Ito colours (source in the module docstring), in the order used for categories.
OKABE_ITO = {
    "orange": "#E69F00",
    "sky blue": "#56B4E9",
    "bluish green": "#009E73",
    "blue": "#0072B2",
    "vermillion": "#D55E00",
    "reddish purple": "#CC79A7",
    "yellow": "#F0E442",
    "black": "#000000",
}
PALETTE = tuple(OKABE_ITO.values())
MARKERS = ("o", "s", "^", "D", "v", "P", "X", "<", ">", "*")
FIGURE_SIZE_IN = (8.0, 6.0)
DPI = 100
FORMATS = ("png", "svg")
MATERIAL_COLUMNS = ("conductor", "shield", "dielectric", "jacket")
_FADED = "#BBBBBB"


def _pyplot():
    import matplotlib
    matplotlib.use("Agg")
    import matplotlib.pyplot as plt
    return plt


def safe_name(text: str) -> str:
    """A file-name stem made of letters, digits, '.', '_' and '-'."""
    return re.sub(r"[^A-Za-z0-9._-]+", "_", str(text)).strip("_") or "unnamed"


def save_figure(fig, stem, formats=FORMATS) -> list[Path]:
    """Write ``fig`` as ``stem.<format>`` for each format, atomically; close it."""
    plt = _pyplot()
    paths = []
    try:
        for fmt in formats:
            path = Path(f"{stem}.{fmt}")
            meta = {"Date": None} if fmt == "svg" else {}
            with atomic_path(path) as tmp:
                fig.savefig(tmp, format=fmt, dpi=DPI, metadata=meta)
            paths.append(path)
    finally:
        plt.close(fig)
    return paths


def display(column: str):
    """(scale, axis label) for a front column: objective labels, lengths in mm."""
    label = next((o.label for o in OBJECTIVES.values() if o.column == column), None)
    if label is None:
        label = {"z0_ohm": "|Z0| [ohm]", "inner_radius_m": "inner radius a [m]",
                 "dielectric_radius_m": "dielectric radius b [m]",
                 "shield_thickness_m": "shield thickness [m]",
                 "jacket_thickness_m": "jacket thickness [m]"}.get(column, column)
    if label.endswith("[m]"):
        return 1e3, label[:-3] + "[mm]"
    return 1.0, label


def _pairs(objectives):
    k = len(objectives)
    return [(i, j) for i in range(k) for j in range(i + 1, k)]


def _panels(plt, n: int):
    cols = int(np.ceil(np.sqrt(n)))
    rows = int(np.ceil(n / cols))
    fig, axes = plt.subplots(rows, cols, figsize=FIGURE_SIZE_IN, dpi=DPI, layout="constrained",
                             squeeze=False)
    for ax in axes.flat[n:]:
        ax.set_visible(False)
    return fig, list(axes.flat[:n])


def _colours(labels) -> dict[str, str]:
    return {lab: PALETTE[i % len(PALETTE)] for i, lab in enumerate(labels)}


def material_choice(df: pd.DataFrame) -> pd.Series:
    """Material combination per row, naming only the tables that vary within ``df``."""
    varying = [c for c in MATERIAL_COLUMNS if c in df and df[c].nunique() > 1]
    if not varying:
        varying = [c for c in ("conductor", "dielectric") if c in df]
    return df[varying].astype(str).agg(" / ".join, axis=1).rename(" / ".join(varying))


def _markers(choice: pd.Series) -> dict[str, str]:
    counts = choice.value_counts(sort=True)
    names = list(counts.index)
    if len(names) > len(MARKERS):
        names = names[:len(MARKERS) - 1]
        out = {n: MARKERS[i] for i, n in enumerate(names)}
        out.update({n: MARKERS[-1] for n in counts.index[len(MARKERS) - 1:]})
        return out
    return {n: MARKERS[i] for i, n in enumerate(names)}


def front_scatter_figure(front: pd.DataFrame, objectives, evaluated: pd.DataFrame | None = None,
                         title: str = ""):
    """Pairwise objective scatter of one member's front: colour = catalog, marker = materials;
    feasible evaluated designs faded behind when given."""
    plt = _pyplot()
    from matplotlib.lines import Line2D

    pairs = _pairs(objectives) or [(0, 0)]
    fig, axes = _panels(plt, len(pairs))
    catalogs = list(dict.fromkeys(front["catalog"]))
    colours = _colours(catalogs)
    choice = material_choice(front)
    markers = _markers(choice)
    for ax, (i, j) in zip(axes, pairs):
        cx, cy = OBJECTIVES[objectives[i]].column, OBJECTIVES[objectives[j]].column
        sx, lx = display(cx)
        sy, ly = display(cy)
        if evaluated is not None and len(evaluated) and cx in evaluated and cy in evaluated:
            ev = evaluated[evaluated["feasible"]] if "feasible" in evaluated else evaluated
            ax.scatter(sx * ev[cx], sy * ev[cy], s=4, c=_FADED, alpha=0.35, linewidths=0,
                       rasterized=True, zorder=1)
        for cat in catalogs:
            for mat, marker in markers.items():
                sel = (front["catalog"] == cat) & (choice == mat)
                if sel.any():
                    ax.scatter(sx * front.loc[sel, cx], sy * front.loc[sel, cy], s=18,
                               marker=marker, facecolors="none" if marker != "o" else
                               colours[cat], edgecolors=colours[cat], linewidths=0.9,
                               alpha=0.85, zorder=2)
        ax.set_xlabel(lx)
        ax.set_ylabel(ly)
        ax.grid(True, color="#DDDDDD", linewidth=0.6)
    handles = [Line2D([], [], linestyle="", marker="s", markersize=8, color=colours[c],
                      label=f"catalog {c}") for c in catalogs]
    handles += [Line2D([], [], linestyle="", marker=m, markersize=7, color="#444444",
                       markerfacecolor="none", label=n) for n, m in markers.items()]
    if evaluated is not None and len(evaluated):
        handles.append(Line2D([], [], linestyle="", marker="o", markersize=4, color=_FADED,
                              label="feasible evaluated"))
    fig.legend(handles=handles, loc="outside right center", fontsize=8,
               title=f"materials: {choice.name}", title_fontsize=8)
    fig.suptitle(title)
    return fig


def parallel_figure(front: pd.DataFrame, objectives, title: str = ""):
    """Parallel coordinates of one member's front: objectives, geometry and |Z0|, each axis
    scaled to the front's range (limits printed at the ends), lines coloured by catalog."""
    plt = _pyplot()
    from matplotlib.collections import LineCollection
    from matplotlib.lines import Line2D

    columns = [OBJECTIVES[o].column for o in objectives]
    columns += [c for c in ("inner_radius_m", "dielectric_radius_m", "shield_thickness_m",
                            "jacket_thickness_m", "z0_ohm")
                if c in front and c not in columns and front[c].nunique() > 1]
    fig, ax = plt.subplots(figsize=FIGURE_SIZE_IN, dpi=DPI, layout="constrained")
    values = front[columns].to_numpy(dtype=float)
    lo, hi = np.nanmin(values, axis=0), np.nanmax(values, axis=0)
    span = np.where(hi > lo, hi - lo, 1.0)
    z = (values - lo) / span
    x = np.arange(len(columns))
    catalogs = list(dict.fromkeys(front["catalog"]))
    colours = _colours(catalogs)
    for cat in catalogs:
        sel = (front["catalog"] == cat).to_numpy()
        segs = [np.column_stack([x, row]) for row in z[sel]]
        ax.add_collection(LineCollection(segs, colors=colours[cat], linewidths=0.7, alpha=0.4))
    labels = []
    for k, col in enumerate(columns):
        scale, label = display(col)
        ax.axvline(k, color="#444444", linewidth=0.8)
        ax.text(k, -0.04, f"{scale * lo[k]:.4g}", ha="center", va="top", fontsize=8)
        ax.text(k, 1.04, f"{scale * hi[k]:.4g}", ha="center", va="bottom", fontsize=8)
        labels.append(label.replace(" [", "\n["))
    ax.set_xticks(x, labels, fontsize=8)
    ax.set_xlim(-0.3, len(columns) - 0.7)
    ax.set_ylim(-0.12, 1.12)
    ax.set_yticks([0.0, 1.0], ["front min", "front max"], fontsize=8)
    fig.legend(handles=[Line2D([], [], color=colours[c], label=f"catalog {c}")
                        for c in catalogs], loc="outside lower center", ncols=len(catalogs),
               fontsize=8)
    ax.set_title(title)
    return fig


def plot_run(run_dir, out_dir=None, formats=FORMATS) -> list[Path]:
    """All plots of a run folder (per member: objective scatter, parallel coordinates).

    Written to ``out_dir`` (default ``RUN/plots``); returns the paths written.
    """
    from cablefam.optimizer.run_folder.reader import read_front
    from cablefam.optimizer.run_folder.files import EVALUATED_FILE

    run_dir = Path(run_dir)
    front, provenance = read_front(run_dir)
    objectives = list(provenance["objectives"])
    evaluated = None
    if (run_dir / EVALUATED_FILE).is_file():
        evaluated = read_evaluated(run_dir / EVALUATED_FILE)
    out_dir = Path(out_dir) if out_dir is not None else run_dir / "plots"
    paths: list[Path] = []
    for member in dict.fromkeys(front["member"]):
        sub = front[front["member"] == member]
        if sub.empty:
            continue
        ev = evaluated[evaluated["member"] == member] if evaluated is not None else None
        name = safe_name(member)
        paths += save_figure(front_scatter_figure(
            sub, objectives, ev, f"{run_dir.name}: {member}, Pareto fronts by catalog"),
            out_dir / f"{name}-front", formats)
        paths += save_figure(parallel_figure(
            sub, objectives, f"{run_dir.name}: {member}, parallel coordinates of the front"),
            out_dir / f"{name}-parallel", formats)
    return paths


def read_evaluated(path) -> pd.DataFrame:
    """``evaluated.parquet``; unreadable -> InputError."""
    import pyarrow as pa
    import pyarrow.parquet as pq

    from cablefam.optimizer.errors import InputError
    try:
        return pq.read_table(path).to_pandas()
    except (pa.ArrowException, OSError) as exc:
        raise InputError(f"{path}: unreadable or corrupt Parquet file ({exc})") from None


# ------------------------------------------------------------------------- comparison overlay

def comparison_figure(member_comparison):
    """Overlay of every compared front of one member (colour and marker per front)."""
    plt = _pyplot()
    mc = member_comparison
    objectives = list(mc.objectives)
    pairs = _pairs(objectives) or [(0, 0)]
    fig, axes = _panels(plt, len(pairs))
    colours = _colours(mc.labels)
    for ax, (i, j) in zip(axes, pairs):
        cx, cy = OBJECTIVES[objectives[i]].column, OBJECTIVES[objectives[j]].column
        sx, lx = display(cx)
        sy, ly = display(cy)
        for n, label in enumerate(mc.labels):
            df = mc.fronts[label]
            if df.empty:
                continue
            hv = mc.summaries[label].hypervolume
            ax.scatter(sx * df[cx], sy * df[cy], s=16, marker=MARKERS[n % len(MARKERS)],
                       facecolors="none", edgecolors=colours[label], linewidths=0.9,
                       label=f"{label} (HV {hv:.3g})", zorder=2)
        ax.set_xlabel(lx)
        ax.set_ylabel(ly)
        ax.grid(True, color="#DDDDDD", linewidth=0.6)
    axes[0].legend(fontsize=8)
    fig.suptitle(f"{mc.member}: fronts compared", fontsize=11)
    return fig


def plot_comparison(comparison, out_dir, formats=FORMATS) -> list[Path]:
    """One overlay per member of a :class:`cablefam.optimizer.review.compare.Comparison`."""
    paths: list[Path] = []
    for mc in comparison.members:
        if all(df.empty for df in mc.fronts.values()):
            continue
        paths += save_figure(comparison_figure(mc), Path(out_dir) / f"{safe_name(mc.member)}"
                             "-compare", formats)
    return paths


# ------------------------------------------------------------------------ design-sheet plots

def cross_section_figure(a, b, c, d, names: dict[str, str], offset: float = 0.0):
    """The cable's cross-section to scale (axes in mm, equal aspect); the centre conductor
    is drawn ``offset`` [m] off the axis when it is eccentric."""
    plt = _pyplot()
    from matplotlib.patches import Circle

    fig, ax = plt.subplots(figsize=FIGURE_SIZE_IN, dpi=DPI, layout="constrained")
    layers = [("jacket", d, OKABE_ITO["black"]), ("shield", c, OKABE_ITO["blue"]),
              ("dielectric", b, OKABE_ITO["yellow"]), ("conductor", a, OKABE_ITO["vermillion"])]
    for table, radius, colour in layers:
        if table == "jacket" and d <= c:
            continue
        centre = (1e3 * offset if table == "conductor" else 0.0, 0.0)
        ax.add_patch(Circle(centre, 1e3 * radius, facecolor=colour, edgecolor="#333333",
                            linewidth=0.6, alpha=0.85 if table == "jacket" else 1.0,
                            label=f"{table}: {names.get(table) or '-'}, "
                                  f"r = {1e3 * radius:.4g} mm"))
    lim = 1.08e3 * max(c, d)
    ax.set_xlim(-lim, lim)
    ax.set_ylim(-lim, lim)
    ax.set_aspect("equal")
    ax.set_xlabel("x [mm]")
    ax.set_ylabel("y [mm]")
    fig.legend(loc="outside lower center", ncols=2, fontsize=8)
    ax.set_title("Cross-section to scale")
    return fig


def profile_figure(profile: pd.DataFrame, a, b, c, d, note: str = ""):
    """B(r), |J(r)| and E(r) amplitudes across the regions, boundaries dashed."""
    plt = _pyplot()
    fig, axes = plt.subplots(3, 1, figsize=FIGURE_SIZE_IN, dpi=DPI, layout="constrained",
                             sharex=True)
    r_mm = 1e3 * profile["r_m"].to_numpy()
    j = profile["j_a_per_m2"].to_numpy(dtype=float)
    series = [("b_t", "|B| [mT]", 1e3 * profile["b_t"].to_numpy(), "linear"),
              ("j_a_per_m2", "|J| [A/m$^2$]", np.where(j > 0.0, j, np.nan), "log"),
              ("e_v_per_m", "E [kV/m]", 1e-3 * profile["e_v_per_m"].to_numpy(), "linear")]
    colours = (OKABE_ITO["blue"], OKABE_ITO["vermillion"], OKABE_ITO["bluish green"])
    for ax, (_, label, y, scale), colour in zip(axes, series, colours):
        ax.plot(r_mm, y, color=colour, linewidth=1.2)
        ax.set_yscale(scale)
        ax.set_ylabel(label)
        for radius in (a, b, c, d):
            ax.axvline(1e3 * radius, color="#666666", linestyle="--", linewidth=0.7)
        ax.grid(True, color="#DDDDDD", linewidth=0.6)
    if np.any(j > 0.0):
        peak = float(np.nanmax(j))
        axes[1].set_ylim(peak * 1e-4, peak * 2.0)  # four decades: the skin layers
    axes[-1].set_xlabel("radius r [mm] (dashed: a, b, c, d)")
    axes[0].set_title(f"Field profiles at the operating point{': ' + note if note else ''}",
                      fontsize=10)
    return fig


def frequency_figure(freq: pd.DataFrame, operating_hz: float, te11_hz: float | None,
                     power_w: float | None):
    """Attenuation and maximum CW power versus frequency (log axes)."""
    plt = _pyplot()
    fig, (ax1, ax2) = plt.subplots(2, 1, figsize=FIGURE_SIZE_IN, dpi=DPI, layout="constrained",
                                   sharex=True)
    f = freq["frequency_hz"].to_numpy() / 1e6
    ax1.loglog(f, freq["attenuation_20c_db_per_100m"], color=OKABE_ITO["blue"],
               label="conductors at 20 degC")
    if "attenuation_hot_db_per_100m" in freq and power_w:
        ax1.loglog(f, freq["attenuation_hot_db_per_100m"], color=OKABE_ITO["vermillion"],
                   linestyle="--", label=f"at {power_w:g} W CW and the member's ambient")
    ax1.set_ylabel("attenuation [dB/100 m]")
    if "max_power_w" in freq:
        ax2.loglog(f, freq["max_power_w"], color=OKABE_ITO["bluish green"])
    ax2.set_ylabel("max CW power [W]")
    ax2.set_xlabel("frequency [MHz]")
    for ax in (ax1, ax2):
        ax.axvline(operating_hz / 1e6, color="#444444", linewidth=0.8,
                   label="operating frequency")
        if te11_hz is not None and te11_hz <= f[-1] * 1e6 * 1.0001:
            ax.axvline(te11_hz / 1e6, color=OKABE_ITO["reddish purple"], linestyle=":",
                       label="TE11 cutoff")
        ax.grid(True, which="both", color="#E5E5E5", linewidth=0.5)
    ax1.legend(fontsize=8)
    ax1.set_title("Attenuation and power handling versus frequency", fontsize=10)
    return fig


def front_position_figure(member_front: pd.DataFrame, row, objectives, title: str = ""):
    """The member's front by catalog, with one design marked."""
    plt = _pyplot()
    pairs = _pairs(objectives) or [(0, 0)]
    fig, axes = _panels(plt, len(pairs))
    catalogs = list(dict.fromkeys(member_front["catalog"]))
    colours = _colours(catalogs)
    for ax, (i, j) in zip(axes, pairs):
        cx, cy = OBJECTIVES[objectives[i]].column, OBJECTIVES[objectives[j]].column
        sx, lx = display(cx)
        sy, ly = display(cy)
        for n, cat in enumerate(catalogs):
            sel = member_front["catalog"] == cat
            ax.scatter(sx * member_front.loc[sel, cx], sy * member_front.loc[sel, cy], s=14,
                       marker=MARKERS[n % len(MARKERS)], facecolors="none",
                       edgecolors=colours[cat], linewidths=0.8, label=f"catalog {cat}")
        ax.scatter([sx * row[cx]], [sy * row[cy]], s=180, marker="*", color="black",
                   zorder=3, label="this design")
        ax.set_xlabel(lx)
        ax.set_ylabel(ly)
        ax.grid(True, color="#DDDDDD", linewidth=0.6)
    axes[0].legend(fontsize=8)
    fig.suptitle(title, fontsize=10)
    return fig
