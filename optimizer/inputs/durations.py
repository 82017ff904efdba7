"""Durations as people write them: ``8h``, ``90m``, ``1h30m``, ``45s``, ``3600`` (seconds)."""

from __future__ import annotations

import re

from cablefam.optimizer.errors import InputError

_UNIT_S = {"d": 86400.0, "h": 3600.0, "m": 60.0, "s": 1.0}
_PART = re.compile(r"(\d+(?:\.\d*)?|\.\d+)([dhms])")


def parse_duration(text: str, name: str = "time_budget") -> float:
    """Seconds of a duration: a number of seconds, or parts like ``1h30m`` (d, h, m, s)."""
    s = str(text).strip().lower()
    try:
        seconds = float(s)
    except ValueError:
        parts = _PART.findall(s)
        if not parts or "".join(n + u for n, u in parts) != s:
            raise InputError(f"{name} = {text!r}: give a duration like 8h, 90m, 1h30m or a "
                             "number of seconds") from None
        seconds = sum(float(n) * _UNIT_S[u] for n, u in parts)
    if not 0.0 < seconds < float("inf"):
        raise InputError(f"{name} = {text!r}: must be a positive, finite duration")
    return seconds
