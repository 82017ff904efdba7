"""What every figure of the review commands shares: colours, markers, size, writing.

Colours are the Okabe-Ito palette, chosen to stay distinguishable under the common forms of
colour-vision deficiency: M. Okabe, K. Ito, "Color Universal Design (CUD): how to make figures
and presentations that are friendly to colorblind people", J*FLY, 2008
(https://jfly.uni-koeln.de/color/). Catalogs or fronts get colours; material choices get
marker shapes, so no information rests on colour alone. Axis labels and scales come from
:func:`cablefam.optimizer.model.quantities.display` (unit in brackets, lengths in mm).

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
from cablefam.optimizer.model.slots import SLOT_NAMES

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
FADED = "#BBBBBB"
GRID = "#DDDDDD"


def pyplot():
    import matplotlib
    matplotlib.use("Agg")
    import matplotlib.pyplot as plt
    return plt


def safe_name(text: str) -> str:
    """A file-name stem made of letters, digits, '.', '_' and '-'."""
    return re.sub(r"[^A-Za-z0-9._-]+", "_", str(text)).strip("_") or "unnamed"


def save_figure(fig, stem, formats=FORMATS) -> list[Path]:
    """Write ``fig`` as ``stem.<format>`` for each format, atomically; close it."""
    plt = pyplot()
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


def objective_pairs(objectives):
    k = len(objectives)
    return [(i, j) for i in range(k) for j in range(i + 1, k)]


def panel_grid(plt, n: int):
    cols = int(np.ceil(np.sqrt(n)))
    rows = int(np.ceil(n / cols))
    fig, axes = plt.subplots(rows, cols, figsize=FIGURE_SIZE_IN, dpi=DPI, layout="constrained",
                             squeeze=False)
    for ax in axes.flat[n:]:
        ax.set_visible(False)
    return fig, list(axes.flat[:n])


def category_colours(labels) -> dict[str, str]:
    return {lab: PALETTE[i % len(PALETTE)] for i, lab in enumerate(labels)}


def material_choice(df: pd.DataFrame) -> pd.Series:
    """Material combination per row, naming only the tables that vary within ``df``."""
    varying = [c for c in SLOT_NAMES if c in df and df[c].nunique() > 1]
    if not varying:
        varying = [c for c in ("conductor", "dielectric") if c in df]
    return df[varying].astype(str).agg(" / ".join, axis=1).rename(" / ".join(varying))


def choice_markers(choice: pd.Series) -> dict[str, str]:
    counts = choice.value_counts(sort=True)
    names = list(counts.index)
    if len(names) > len(MARKERS):
        names = names[:len(MARKERS) - 1]
        out = {n: MARKERS[i] for i, n in enumerate(names)}
        out.update({n: MARKERS[-1] for n in counts.index[len(MARKERS) - 1:]})
        return out
    return {n: MARKERS[i] for i, n in enumerate(names)}
