"""The quantity and material-slot registries cover everything their readers show."""

import pyarrow.parquet as pq
import pytest

from cablefam.optimizer.batch.assemble import MEMBER_COLUMNS
from cablefam.optimizer.inputs.catalog import KINDS
from cablefam.optimizer.inputs.design_file import MATERIAL_TABLES, DesignFile
from cablefam.optimizer.inputs.materials import CATALOG_RECORDS, DESIGN_RECORDS
from cablefam.optimizer.inputs.sweep_spec import (GEOMETRY_KEYS, MATERIAL_KEYS, SearchSpec,
                                                  demo_design_path)
from cablefam.optimizer.model.objectives import OBJECTIVES
from cablefam.optimizer.model.quantities import QUANTITIES, display, report_groups
from cablefam.optimizer.model.slots import (CATALOG_KINDS, MATERIAL_SLOTS, SLOT_KINDS,
                                            SLOT_NAMES, SLOTS)
from cablefam.optimizer.review.inspection import REPORT_LAYOUT, inspect_design


def test_every_evaluated_quantity_has_an_entry():
    values = inspect_design(demo_design_path()).values
    missing = [k for k in values if k not in QUANTITIES]
    assert not missing


def test_every_quantity_column_of_a_front_has_an_entry(tiny_run):
    columns = pq.read_schema(tiny_run / "front.parquet").names
    other = {"member", "catalog", "inner_strands", "feasible", *SLOT_NAMES, *MEMBER_COLUMNS}
    quantities = [c for c in columns if c not in other and not c.startswith("margin_")]
    assert set(GEOMETRY_KEYS) < set(quantities)
    assert [c for c in quantities if c not in QUANTITIES] == []


def test_objective_labels_come_from_the_registry():
    for o in OBJECTIVES.values():
        q = QUANTITIES[o.column]
        assert o.label == f"{q.label} [{q.unit}]"
    assert OBJECTIVES["attenuation"].label == "attenuation [dB/100 m]"
    assert OBJECTIVES["outer_diameter"].label == "outer diameter [m]"


def test_display_shows_lengths_in_mm():
    assert display("outer_diameter_m") == (1e3, "outer diameter [mm]")
    assert display("inner_radius_m") == (1e3, "inner radius a [mm]")
    assert display("mass_kg_per_km") == (1.0, "mass [kg/km]")
    assert display("no_such_column") == (1.0, "no_such_column")


def test_report_layout_is_the_registry_grouped():
    grouped = [q.key for _, qs in report_groups() for q in qs]
    assert [k for _, rows in REPORT_LAYOUT for k, _, _ in rows] == grouped
    assert len(set(grouped)) == len(grouped)
    position = {k: i for i, k in enumerate(grouped)}
    for key in grouped:
        parent = QUANTITIES[key].part_of
        if parent is not None:   # a part follows its total, in the same section
            assert position[parent] < position[key]
            assert QUANTITIES[parent].group == QUANTITIES[key].group
    assert QUANTITIES["z0_ohm"].report_label == "|Z0| (complex, at f)"
    assert QUANTITIES["conductor_attenuation_db_per_100m"].report_label.startswith("  ")


def test_slots_are_the_front_material_columns(tiny_run):
    columns = pq.read_schema(tiny_run / "front.parquet").names
    assert columns[2:2 + len(SLOT_NAMES)] == list(SLOT_NAMES)


def test_every_slot_is_read_by_files_and_catalogs():
    assert SLOT_NAMES == ("conductor", "shield", "dielectric", "jacket")
    assert SLOT_KINDS["shield"] == "conductor"          # a shield is a conductor material
    assert SLOTS["conductor"].label == "centre conductor"
    assert tuple(KINDS) == CATALOG_KINDS == ("conductor", "dielectric", "jacket")
    for slot in MATERIAL_SLOTS:
        assert slot.kind in CATALOG_RECORDS and slot.kind in DESIGN_RECORDS
        assert MATERIAL_TABLES[slot.name] == (slot.kind, DESIGN_RECORDS[slot.kind])
        assert MATERIAL_KEYS[slot.sweep_key] == (slot.name, slot.kind)
        assert slot.sweep_key in SearchSpec.model_fields
        field = DesignFile.model_fields[slot.name]
        assert field.is_required() is not slot.optional
        if slot.optional:
            assert slot.thickness_key in GEOMETRY_KEYS


@pytest.mark.parametrize("slot", [s for s in MATERIAL_SLOTS if s.optional], ids=lambda s: s.name)
def test_an_optional_slot_may_be_left_out_of_a_design(slot, tmp_path):
    text = demo_design_path().read_text()
    start = text.index(f"[{slot.name}]")
    end = text.find("\n[", start + 1)
    path = tmp_path / "design.toml"
    catalog = (demo_design_path().parent / "../../catalogs/baseline.toml").resolve()
    path.write_text((text[:start] + text[end + 1:]).replace(
        'catalog = "../../catalogs/baseline.toml"', f'catalog = "{catalog}"'))
    result = inspect_design(path)
    assert getattr(result.design, slot.name) is None
    assert result.design.material_ids[slot.name] is None
