"""Report benchmark: size of the demo's report.html and its render time in headless Chromium.

Builds the report of a run folder (default ``runs/larkspur-harbour``, from ``make demo``) into
a temporary file (the run folder is not touched: no sheets are written), then opens it from
disk in headless Chromium (:mod:`tests.review.chromium`, laptop window 1366 x 768) several
times and reads the timings the page records on ``<body>`` (milliseconds since navigation
start, ``performance.now()``):

- ``page as opened``: ``data-first-render-ms``, every front plot drawn (the parallel
  coordinates, WebGL, are drawn when scrolled near);
- ``all plots``: ``data-render-ms`` of the page opened as ``report.html#all-plots``, every
  plot drawn at once, the parallel coordinates included;

and the wall time of the Chromium process (start-up included) next to that of an empty page.
Targets (from the report issue): under 15 MB, renders in under 5 s.

Run from the repository root::

    .venv/bin/python tests/benchmarks/bench_report.py [RUN] [--repeats 3]

The file name does not start with ``test_``: pytest does not collect it.
"""

from __future__ import annotations

import argparse
import json
import os
import statistics
import sys
import tempfile
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

from cablefam.optimizer.review.report import build_report  # noqa: E402
from tests.review.chromium import chromium_path, page_requests, render  # noqa: E402


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("run", nargs="?", default="runs/larkspur-harbour")
    parser.add_argument("--repeats", type=int, default=3)
    args = parser.parse_args()
    if chromium_path() is None:
        sys.exit("headless Chromium not installed (Debian: apt-get install chromium)")
    load = os.getloadavg()[0]
    print(f"load average (1 min) at start: {load:.2f}")
    start = time.perf_counter()
    page, report = build_report(args.run, sheets=False)
    build_s = time.perf_counter() - start
    size = len(page.encode("utf-8"))
    print(f"report of {args.run}: {size / 1e6:.2f} MB, built in {build_s:.1f} s "
          f"({len(report.members)} members)")
    first, every, wall_first, wall_all, wall_empty = [], [], [], [], []
    requests = []
    with tempfile.TemporaryDirectory() as tmp:
        path = Path(tmp) / "report.html"
        path.write_text(page, encoding="utf-8")
        empty = Path(tmp) / "empty.html"
        empty.write_text("<!DOCTYPE html><html><body>empty</body></html>", encoding="utf-8")
        for _ in range(args.repeats):
            r = render(path)
            first.append(float(r.body["data-first-render-ms"]) / 1e3)
            wall_first.append(r.seconds)
            requests += page_requests(r.requests)
            r = render(path, fragment="all-plots")
            if r.body.get("data-plots-drawn") != r.body.get("data-plots-total"):
                sys.exit(f"not every plot drew: {r.body}")
            every.append(float(r.body["data-render-ms"]) / 1e3)
            wall_all.append(r.seconds)
            requests += page_requests(r.requests)
            wall_empty.append(render(empty).seconds)
    med = statistics.median
    print(f"page as opened (front plots drawn) [s]: median {med(first):.2f}, runs "
          + ", ".join(f"{v:.2f}" for v in first))
    print(f"all plots (#all-plots) [s]:             median {med(every):.2f}, runs "
          + ", ".join(f"{v:.2f}" for v in every))
    print(f"chromium wall time [s]: as opened {med(wall_first):.2f}, all plots "
          f"{med(wall_all):.2f}, empty page {med(wall_empty):.2f}")
    print(f"requests to the network by the page: {len(requests)}")
    print(json.dumps({"bytes": size, "build_seconds": round(build_s, 2),
                      "first_view_seconds": round(med(first), 2),
                      "all_plots_seconds": round(med(every), 2),
                      "chromium_wall_first_view_seconds": round(med(wall_first), 2),
                      "chromium_wall_all_plots_seconds": round(med(wall_all), 2),
                      "chromium_wall_empty_page_seconds": round(med(wall_empty), 2),
                      "page_network_requests": len(requests),
                      "load_average_1min_at_start": round(load, 2)}))


if __name__ == "__main__":
    main()
