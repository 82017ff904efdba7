"""``cablefam report``: the page's content, its self-containment, interrupted run folders."""

import hashlib
import json
import re
import shutil
from html.parser import HTMLParser

import pandas as pd
import pytest

from cablefam.optimizer.cautions import CAUTION_LINES
from cablefam.optimizer.cli.app import main
from cablefam.optimizer.errors import InputError
from cablefam.optimizer.review.compare import compare_runs
from cablefam.optimizer.review.pick import pick
from cablefam.optimizer.review.report import (REPORT_FILE, SHEETS_DIR, binding_constraints,
                                              build_report, sheet_name, write_report)
from cablefam.optimizer.review.report_figures import front_figure, parallel_figure
from cablefam.optimizer.run_folder.files import FRONT_FILE, RUN_FILE

#: A stand-in for the plotly.js bundle where the page's content, not its drawing, is tested.
FAKE_BUNDLE = "window.Plotly = {newPlot: function () { return Promise.resolve(); }};"


def run_cli(capsys, *args):
    with pytest.raises(SystemExit) as info:
        main([str(a) for a in args])
    out = capsys.readouterr()
    return info.value.code, out.out, out.err


class _Links(HTMLParser):
    """Every src/href attribute and every <link>/<script src> of a page (tags only)."""

    def __init__(self):
        super().__init__()
        self.urls, self.tags = [], []

    def handle_starttag(self, tag, attrs):
        self.tags.append(tag)
        self.urls += [v for k, v in attrs if k in ("src", "href") and v is not None]


def external_references(page: str) -> list[str]:
    parser = _Links()
    parser.feed(page)
    bad = [u for u in parser.urls if re.match(r"^(https?:)?//", u.strip(), re.I)]
    bad += ["<link>"] * parser.tags.count("link")
    bad += re.findall(r"@import|url\(\s*['\"]?(?:https?:)?//", page.split("<script", 1)[0])
    return bad


@pytest.fixture(scope="module")
def run_copy(tiny_run, tmp_path_factory):
    """A copy of the tiny demo run (the report writes sheets into it)."""
    dest = tmp_path_factory.mktemp("report") / tiny_run.name
    shutil.copytree(tiny_run, dest)
    return dest


@pytest.fixture(scope="module")
def written(run_copy):
    report = write_report(run_copy)
    return report, (run_copy / REPORT_FILE).read_text(encoding="utf-8")


def test_report_holds_every_member_section_and_the_cautions(written, run_copy):
    report, page = written
    assert report.path == run_copy / REPORT_FILE
    members = list(dict.fromkeys(pd.read_parquet(run_copy / FRONT_FILE)["member"]))
    assert list(report.members) == members
    for m in members:
        assert f"Member {m}</h2>" in page
    for verdict in (mc.verdict for mc in compare_runs([run_copy]).members):
        assert verdict.replace("&", "&amp;") in page
    assert " ".join(CAUTION_LINES) in page
    assert "Provenance" in page and "seed" in page and "wall time [s]" in page
    # one front plot per member; one parallel-coordinates plot, one trace per member, and a
    # link to it from each member's section
    assert len(re.findall(r'data-target="front-\d+"', page)) == len(members)
    assert len(re.findall(r'data-target="parallel"', page)) == 1
    assert [int(k) for k in re.findall(r'data-plot="parallel" data-trace="(\d+)"', page)] == \
        list(range(len(members)))


def test_report_is_self_contained(written):
    _, page = written
    ids = re.findall(r'<[a-z0-9]+[^>]* id="([^"]+)"', page.split("<body>", 1)[1])
    assert len(ids) == len(set(ids))            # the plots are found by id
    assert external_references(page) == []
    assert "<script src" not in page
    assert len(page.encode("utf-8")) < 15e6


def test_report_links_the_design_sheets_of_its_picks(written, run_copy):
    report, page = written
    picks = pick(run_copy, top=3).picks
    assert len(report.sheets) == len(picks)
    for _, row in picks.iterrows():
        name = sheet_name(row["member"], row["catalog"], row["index"])
        assert f'href="{SHEETS_DIR}/{name}"' in page
        sheet = (run_copy / SHEETS_DIR / name).read_text(encoding="utf-8")
        assert f'href="../{REPORT_FILE}"' in sheet      # and the sheet links back


def test_existing_sheets_are_linked_not_rewritten(written, run_copy):
    report, _ = written
    path = run_copy / report.sheets[0]
    before = path.stat().st_mtime_ns
    write_report(run_copy, run_copy / "again.html")
    assert path.stat().st_mtime_ns == before


def test_front_figure_offers_axes_and_hover_quantities(run_copy):
    df = pd.read_parquet(run_copy / FRONT_FILE)
    member = df["member"].iloc[0]
    front = df[df["member"] == member].copy()
    front.insert(3, "index", range(len(front)))
    catalogs = list(dict.fromkeys(front["catalog"]))
    picks = pick(run_copy, member=member, top=2).picks
    fig = front_figure(member, front, ["attenuation", "mass"], picks, catalogs)
    assert len(fig["data"]) == len(catalogs) + 1          # one trace per catalog + the picks
    menus = fig["layout"]["updatemenus"]
    labels = [b["label"] for b in menus[0]["buttons"]]
    assert labels[:2] == ["attenuation [dB/100 m]", "mass [kg/km]"]
    assert "outer diameter [mm]" in labels
    template = fig["data"][0]["hovertemplate"]
    assert "inner radius a [mm]" in template and "|Z0| [ohm]" in template
    assert fig["data"][0]["text"][0].count(" / ") == 3   # the four materials
    # every button gives one x array per trace, in the shown unit
    assert all(len(b["args"][0]["x"]) == len(fig["data"]) for b in menus[0]["buttons"])
    fronts = {m: df[df["member"] == m] for m in dict.fromkeys(df["member"])}
    # every catalog of the run (a tiny run may leave a catalog without designs for a member)
    par = parallel_figure(fronts, ["attenuation", "mass"], list(dict.fromkeys(df["catalog"])))
    assert [t["name"] for t in par["data"]] == list(fronts)
    assert [t["visible"] for t in par["data"]] == [True] + [False] * (len(fronts) - 1)
    dims = par["data"][0]["dimensions"]
    assert par["data"][0]["type"] == "parcoords"
    assert dims[-1]["label"] == "catalog" and len(dims[0]["values"]) == len(fronts[member])
    # the menu shows one member at a time
    buttons = par["layout"]["updatemenus"][0]["buttons"]
    assert [b["args"][0]["visible"].count(True) for b in buttons] == [1] * len(fronts)
    json.dumps(par, allow_nan=False)
    json.dumps(fig, allow_nan=False)


def test_binding_constraints_from_margins():
    front = pd.DataFrame({"margin_impedance": [0.5, 0.3, 0.2],
                          "margin_outer_diameter": [0.001, 0.0, 0.4],
                          "margin_single_mode": [1.0, 1.0, 1.0]})
    picks = pd.DataFrame({"rank": [1, 2], "margin_outer_diameter": [0.001, 0.4],
                          "margin_impedance": [0.5, 0.2]})
    rows = {r["constraint"]: r for r in binding_constraints(front, picks)}
    assert rows["outer_diameter"]["binding"] == 2 and rows["outer_diameter"]["binding_picks"] == [1]
    assert rows["impedance"]["binding"] == 0
    assert rows["single_mode"]["active"] is False       # unit margin everywhere: not set
    assert binding_constraints(front, picks)[0]["constraint"] == "outer_diameter"


def test_cli_report_writes_the_page_and_out_file(run_copy, tmp_path, capsys):
    out = tmp_path / "r.html"
    code, stdout, stderr = run_cli(capsys, "report", run_copy, "--out", out, "--no-sheets")
    assert code == 0
    assert stdout.strip() == str(out)
    assert "report:" in stderr and "MB" in stderr
    page = out.read_text(encoding="utf-8")
    assert "<!DOCTYPE html>" in page and "Plotly" in page


def _folder_digest(folder):
    return {str(p.relative_to(folder)): hashlib.sha256(p.read_bytes()).hexdigest()
            for p in sorted(folder.rglob("*")) if p.is_file()}


def test_unfinished_run_is_one_line_and_nothing_is_written(tiny_run, tmp_path, capsys):
    run = tmp_path / "cut"
    shutil.copytree(tiny_run, run)
    (run / FRONT_FILE).unlink()
    (run / RUN_FILE).unlink()
    before = _folder_digest(run)
    code, out, err = run_cli(capsys, "report", run)
    assert code == 2 and out == ""
    assert len(err.strip().splitlines()) == 1
    assert "has not finished" in err and f"cablefam resume {run}" in err
    assert _folder_digest(run) == before


def test_missing_parts_are_listed_and_the_rest_reported(tiny_run, tmp_path):
    run = tmp_path / "partial"
    shutil.copytree(tiny_run, run)
    (run / RUN_FILE).unlink()
    shutil.rmtree(run / "inputs")
    shutil.rmtree(run / SHEETS_DIR, ignore_errors=True)
    before = _folder_digest(run)
    report = write_report(run)
    page = (run / REPORT_FILE).read_text(encoding="utf-8")
    assert any(RUN_FILE in m for m in report.missing)
    assert any("inputs/" in m for m in report.missing)
    assert "Missing from the run folder" in page and "not written" in page
    after = _folder_digest(run)
    assert {k: v for k, v in after.items() if k != REPORT_FILE} == before


def test_not_a_run_folder(tmp_path):
    with pytest.raises(InputError, match="no such run folder"):
        build_report(tmp_path / "nope", bundle=FAKE_BUNDLE)
    with pytest.raises(InputError, match="not a run folder"):
        build_report(tmp_path, bundle=FAKE_BUNDLE)


def test_sweep_prints_the_report_command(tmp_path, capsys):
    from cablefam.optimizer.cli.sweep_commands import _report_run

    _report_run(tmp_path / "r", "m1")
    err = capsys.readouterr().err
    assert f"cablefam report {tmp_path / 'r'}" in err
