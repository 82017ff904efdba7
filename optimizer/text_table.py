"""Plain-text tables for the review commands (pick, compare, runs)."""

from __future__ import annotations

import math


def fmt(value, digits: int = 4) -> str:
    """A cell: floats to ``digits`` significant figures, None/NaN as ``-``."""
    if value is None:
        return "-"
    if isinstance(value, bool):
        return "yes" if value else "no"
    if isinstance(value, float):
        if math.isnan(value):
            return "-"
        if math.isinf(value):
            return "inf" if value > 0 else "-inf"
        return f"{value:.{digits}g}"
    return str(value)


def format_table(headers, rows, indent: str = "") -> str:
    """Columns padded to their widest cell; text left-aligned, numbers right-aligned."""
    cells = [[fmt(v) for v in row] for row in rows]
    numeric = [all(isinstance(row[j], (int, float)) and not isinstance(row[j], bool)
                   or row[j] is None for row in rows) if rows else False
               for j in range(len(headers))]
    widths = [max([len(h)] + [len(r[j]) for r in cells]) for j, h in enumerate(headers)]

    def line(values):
        parts = [v.rjust(w) if num else v.ljust(w)
                 for v, w, num in zip(values, widths, numeric)]
        return (indent + "  ".join(parts)).rstrip()

    out = [line(list(headers)), indent + "  ".join("-" * w for w in widths)]
    out += [line(r) for r in cells]
    return "\n".join(out)
