"""cablefam's orchestration layer: design files, catalogs, evaluation, search, runs and CLI.

Imports point down only: ``optimizer.cli`` -> the rest of ``optimizer`` -> ``physics``.
"""

__version__ = "0.1.0"
