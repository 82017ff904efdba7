"""The cautions printed with every report and design sheet (also in the README)."""

CAUTION_LINES = [
    "CAUTION: these results are engineering estimates from idealised models (round conductors",
    "and layers, an averaged braid calibrated on few published cables, mixing rules for foam,",
    "still free air).",
    "Verify every design by prototype tests and measurement before use. Cables carry high",
    "voltage and RF power, both hazardous: follow the applicable standards, local codes and",
    "licensed engineering practice.",
]
