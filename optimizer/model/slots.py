"""The material slots of a coax: where a material sits in the cable, one table for every reader.

A *slot* is a place in the cable that takes one material: the centre conductor, the shield,
the dielectric between them and the optional jacket. The slot's name is, at once, the table of
a design file (``[conductor]``), the column of ``front.parquet`` holding the material id, and
the key of :attr:`cablefam.optimizer.inputs.design_file.Design.material_ids`. Its *kind* is the
catalog table its materials come from (``[conductor.<id>]``).

The word "conductor" has two meanings here, kept apart by these two fields:

- as a slot (a design-file table, a front column) ``conductor`` is the **centre conductor**;
- as a catalog kind ``conductor`` is **any conductor material**: both the ``conductor`` slot
  and the ``shield`` slot take their records from the catalog's ``[conductor.<id>]`` tables.

Everything that walks the slots (design files, sweep files, the search problem, the front's
columns, pick, plots, design sheets) reads :data:`MATERIAL_SLOTS`; adding a slot here is the
one edit of this vocabulary (the physics and the record models still need to know it).
"""

from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True)
class MaterialSlot:
    """One place in the cable that takes a material."""

    name: str
    """Design-file table, ``front.parquet`` column and ``material_ids`` key."""
    kind: str
    """Catalog kind (the ``[kind.<id>]`` tables) its materials come from."""
    label: str
    """What the slot is, in words, for tables and legends."""
    sweep_key: str
    """Key of a sweep file's ``[search]`` table that restricts the slot to some ids."""
    optional: bool = False
    """May be absent: a design without it is still a cable."""
    thickness_key: str | None = None
    """For an optional slot: the geometry key whose zero value leaves the slot out."""


#: The slots, from the axis outwards (the order of the front's columns and of every listing).
MATERIAL_SLOTS = (
    MaterialSlot("conductor", "conductor", "centre conductor", "conductors"),
    MaterialSlot("shield", "conductor", "shield", "shields"),
    MaterialSlot("dielectric", "dielectric", "dielectric", "dielectrics"),
    MaterialSlot("jacket", "jacket", "jacket", "jackets", optional=True,
                 thickness_key="jacket_thickness_m"),
)
#: slot name -> slot
SLOTS = {s.name: s for s in MATERIAL_SLOTS}
#: Slot names in order: the material columns of ``front.parquet``.
SLOT_NAMES = tuple(SLOTS)
#: slot name -> catalog kind
SLOT_KINDS = {s.name: s.kind for s in MATERIAL_SLOTS}
#: Catalog kinds in order of first use (the material tables a catalog may hold).
CATALOG_KINDS = tuple(dict.fromkeys(s.kind for s in MATERIAL_SLOTS))
