"""cablefam: batch optimizer for families of coaxial cables.

One import name, three layers: :mod:`cablefam.physics` (pure, vectorized physics in SI units),
:mod:`cablefam.optimizer` (everything above it, in sub-packages) and the bundled material
:mod:`cablefam.catalogs`. The folders of the repository (``physics/``, ``optimizer/``,
``catalogs/``) are installed under this name.
"""

from importlib import metadata as _metadata

try:
    __version__ = _metadata.version("cablefam")
except _metadata.PackageNotFoundError:  # running from a tree that was never installed
    __version__ = "0+unknown"
