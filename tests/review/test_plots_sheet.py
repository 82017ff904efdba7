"""Plots (valid PNGs of the expected size, no display needed) and design sheets."""

import os
import re
import struct
import subprocess
import sys
import xml.etree.ElementTree as ET
from pathlib import Path


from cablefam.optimizer.cautions import CAUTION_LINES
from cablefam.optimizer.review.compare import compare_runs
from cablefam.optimizer.review.inspection import REPORT_LAYOUT
from cablefam.optimizer.review.pick import pick
from cablefam.optimizer.run_folder.reader import read_front
from cablefam.optimizer.review.plots import DPI, FIGURE_SIZE_IN, plot_comparison, plot_run
from cablefam.optimizer.review.sheet import write_sheets

PNG_SIGNATURE = b"\x89PNG\r\n\x1a\n"
EXPECTED_PX = (round(FIGURE_SIZE_IN[0] * DPI), round(FIGURE_SIZE_IN[1] * DPI))


def png_size(path: Path) -> tuple[int, int]:
    """Width and height from the IHDR chunk (PNG specification, ISO/IEC 15948, 11.2.2)."""
    # Source: ISO/IEC 15948:2004 (PNG): 8-byte signature, then the IHDR chunk whose data
    # starts with the width and height as 4-byte big-endian integers.
    data = path.read_bytes()[:24]
    assert data[:8] == PNG_SIGNATURE and data[12:16] == b"IHDR"
    return struct.unpack(">II", data[16:24])


def first_member(run_dir) -> str:
    """The first member with designs on the front of a run."""
    return str(read_front(run_dir)[0]["member"].iloc[0])


def test_plot_run_writes_valid_png_and_svg(tiny_run, tmp_path):
    paths = plot_run(tiny_run, tmp_path / "plots")
    pngs = [p for p in paths if p.suffix == ".png"]
    svgs = [p for p in paths if p.suffix == ".svg"]
    # a scatter and a parallel-coordinates view per member with designs
    members = read_front(tiny_run)[0]["member"].nunique()
    assert members >= 1 and len(pngs) == 2 * members and len(svgs) == 2 * members
    for p in pngs:
        assert png_size(p) == EXPECTED_PX
    for p in svgs:
        assert ET.parse(p).getroot().tag.endswith("svg")
    assert not list((tmp_path / "plots").glob(".*.tmp"))      # atomic writes left nothing


def test_plot_command_needs_no_display(tiny_run, tmp_path):
    env = {k: v for k, v in os.environ.items() if k not in ("DISPLAY", "WAYLAND_DISPLAY",
                                                            "MPLBACKEND")}
    out = tmp_path / "p"
    proc = subprocess.run([sys.executable, "-m", "cablefam", "plot", str(tiny_run),
                           "--out", str(out)], env=env, capture_output=True, text=True,
                          timeout=120)
    assert proc.returncode == 0, proc.stderr
    listed = [Path(line) for line in proc.stdout.splitlines()]
    assert listed and all(p.is_file() for p in listed)
    assert all(png_size(p) == EXPECTED_PX for p in listed if p.suffix == ".png")


def test_comparison_overlay(tiny_run, tiny_run_b, tmp_path):
    member = first_member(tiny_run)
    c = compare_runs([tiny_run, tiny_run_b], member=member)
    paths = plot_comparison(c, tmp_path, formats=("png",))
    assert [p.name for p in paths] == [f"{member}-compare.png"]
    assert png_size(paths[0]) == EXPECTED_PX


def test_design_sheet_contents(tiny_run, tmp_path):
    result = pick(tiny_run, member=first_member(tiny_run), top=1)
    paths = write_sheets(result, tmp_path / "sheets")
    md = next(p for p in paths if p.suffix == ".md")
    page = next(p for p in paths if p.suffix == ".html")
    text, html = md.read_text(), page.read_text()
    caution = " ".join(CAUTION_LINES)
    assert caution in text
    assert caution.replace("'", "&#x27;") in html
    # every quantity of the report layout that the design has
    for _, rows in REPORT_LAYOUT:
        for key, _, _ in rows:
            if key in result.picks.columns:
                assert f"| {key} |" in text
    # materials with their sources, the four plots next to the pages, no external resources
    assert "IEC 60889" in text or "IEC 60028" in text
    images = re.findall(r'<img src="([^"]+)"', html)
    # section, profiles, frequency, front; and the transfer impedance of a braid or foil
    screening = any(name.endswith("-screening.png") for name in images)
    assert len(images) == 4 + screening
    assert screening == ("shield_construction" in result.picks.columns)
    for name in images:
        assert "/" not in name and png_size(page.parent / name) == EXPECTED_PX
    assert "<script" not in html and "http" not in html and "<link" not in html
    assert re.findall(r"!\[[^\]]*\]\(([^)]+)\)", text) == images
