"""The report in a real browser: headless Chromium draws every plot from the file alone.

Skipped where Chromium is not installed (Debian package ``chromium``; ``.ci/run`` installs
it). The page is opened from disk as ``report.html#all-plots`` (every plot drawn at once,
also the parallel coordinates, otherwise drawn when scrolled near); Chromium's network goes through a proxy that records and refuses
every request (:mod:`tests.review.chromium`). Speed is measured in
``tests/benchmarks/bench_report.py``, not here.
"""

import re
import shutil

import pytest

from cablefam.optimizer.review.report import write_report

from .chromium import chromium_path, page_requests, render

pytestmark = pytest.mark.skipif(
    chromium_path() is None,
    reason="headless Chromium not installed (Debian: apt-get install chromium; .ci/run "
           "installs it)")


@pytest.fixture(scope="module")
def rendered(tiny_run, tmp_path_factory):
    run = tmp_path_factory.mktemp("browser") / tiny_run.name
    shutil.copytree(tiny_run, run)
    report = write_report(run)
    source = report.path.read_text(encoding="utf-8")
    return source, render(report.path, fragment="all-plots")


def test_every_plot_drew(rendered):
    source, page = rendered
    targets = re.findall(r'class="plot-data"[^>]*data-target="([^"]+)"', source)
    assert len(targets) >= 2
    assert "data-plot-error" not in page.body
    assert page.body.get("data-plots-total") == str(len(targets))
    assert page.body.get("data-plots-drawn") == str(len(targets))
    for target in targets:
        # plotly marks a drawn plot's div and puts its SVG layers inside
        div = re.search(rf'<div class="([^"]*)" id="{re.escape(target)}"', page.dom)
        assert div and "js-plotly-plot" in div.group(1), target
        inside = page.dom[div.start():].split("</script>", 1)[0]
        assert 'class="main-svg"' in inside, target
    assert page.dom.count('class="main-svg"') >= len(targets)


def test_front_plots_drew_their_points_and_menus(rendered):
    source, page = rendered
    fronts = re.findall(r'data-target="(front-\d+)"', source)
    for target in fronts:
        inside = page.dom[page.dom.index(f'id="{target}"'):].split("</script>", 1)[0]
        assert inside.count('class="point') > 0
        assert inside.count('class="updatemenu-header"') == 2  # the x and y menus


def test_nothing_is_fetched_from_the_network(rendered):
    source, page = rendered
    assert page_requests(page.requests) == []
    scripts = re.findall(r"<script([^>]*)>", page.dom)
    assert all("src=" not in s for s in scripts)
    assert not re.search(r'<link[^>]+href="(https?:)?//', page.dom)


def test_page_as_opened_draws_the_fronts_at_once(rendered, tmp_path):
    source, _ = rendered
    page = tmp_path / "report.html"
    page.write_text(source, encoding="utf-8")
    opened = render(page)
    fronts = len(re.findall(r'data-target="front-\d+"', source))
    assert "data-first-render-ms" in opened.body
    assert int(opened.body["data-plots-drawn"]) >= fronts
