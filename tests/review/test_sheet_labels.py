"""Design sheets for people: the member table in labels and units, a link to the report."""

import re

from cablefam.optimizer.model.quantities import MEMBER_KEYS, member_label
from cablefam.optimizer.inputs.sweep_spec import MemberSpec
from cablefam.optimizer.review.pick import pick
from cablefam.optimizer.review.sheet import write_sheets


def test_every_member_key_has_a_label():
    assert set(MemberSpec.model_fields) <= set(MEMBER_KEYS)
    assert member_label("ambient_c") == "ambient temperature [degC]"
    assert member_label("a_key_from_the_future") == "a_key_from_the_future"


def test_member_table_reads_labels_and_units(tiny_run, tmp_path):
    result = pick(tiny_run, member="mast-feeder-50", top=1)
    paths = write_sheets(result, tmp_path / "sheets")
    text = next(p for p in paths if p.suffix == ".md").read_text()
    table = text.split("## Member specification", 1)[1].split("## Geometry", 1)[0]
    assert "| ambient temperature | 35 degC | ambient_c |" in table
    assert "| min shield wall thickness | 2 skin depths | min_shield_skin_depths |" in table
    assert "| highest operating frequency | 470 MHz | frequency_hz |" in table
    assert "| max outer diameter | 22 mm | max_outer_diameter_m |" in table
    # the first column holds no raw key
    first = [row.split("|")[1].strip() for row in table.strip().splitlines()[2:]]
    assert not any(re.fullmatch(r"[a-z0-9_]+_(c|m|hz|w|v|ohm|depths)", c) for c in first)


def test_sheet_links_back_to_the_report(tiny_run, tmp_path):
    result = pick(tiny_run, top=1)
    paths = write_sheets(result, tiny_run / "sheets-test-links")
    try:
        page = next(p for p in paths if p.suffix == ".html").read_text()
        assert '<a href="../report.html">Run report</a>' in page
    finally:
        for p in paths:
            p.unlink()
        (tiny_run / "sheets-test-links").rmdir()
