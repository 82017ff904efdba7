"""The cautions printed with every report and design sheet (also in the README)."""

CAUTION_LINES = [
    "CAUTION: these results are engineering estimates from idealised models (solid round",
    "conductors, smooth solid-tube shield, uniform materials, matched line, still free air).",
    "Verify every design by prototype tests and measurement before use. Cables carry high",
    "voltage and RF power, both hazardous: follow the applicable standards, local codes and",
    "licensed engineering practice.",
]
