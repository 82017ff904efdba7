"""Headless Chromium for the report tests and the report benchmark.

:func:`render` opens a page from disk in headless Chromium (Debian package ``chromium``) and
returns the DOM after the page's scripts ran, and every request the browser tried to send to
the network: Chromium is given a proxy (:class:`RecordingProxy`, on 127.0.0.1) that records
each request and refuses it, so a page that fetched a script, a style sheet or a font from
the network would show up there. ``file://`` pages do not go through the proxy.
"""

from __future__ import annotations

import http.server
import re
import shutil
import subprocess
import tempfile
import threading
import time
from dataclasses import dataclass
from pathlib import Path

CHROMIUM_CANDIDATES = ("/usr/bin/chromium", "chromium", "chromium-browser")
#: The flags of every run (no sandbox: tests may run as root in a container).
FLAGS = ("--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking",
         "--disable-component-update", "--no-first-run", "--disable-sync",
         "--disable-default-apps", "--disable-extensions", "--mute-audio",
         "--disable-features=OptimizationHints,MediaRouter,Translate")
WINDOW = "1366,768"
"""A laptop screen."""
#: Hosts Chromium itself talks to (component updates, accounts, clock), whatever the page:
#: requests to them are the browser's, not the page's.
BROWSER_HOSTS = ("update.googleapis.com", "clients2.google.com", "accounts.google.com",
                 "optimizationguide-pa.googleapis.com", "redirector.gvt1.com",
                 "safebrowsingohttpgateway.googleapis.com", "content-autofill.googleapis.com")


def page_requests(requests) -> list[str]:
    """The recorded requests that are not the browser's own (:data:`BROWSER_HOSTS`)."""
    out = []
    for r in requests:
        target = r.split(" ", 1)[-1]
        host = re.sub(r"^[a-z]+://", "", target).split("/", 1)[0].split(":", 1)[0]
        if host not in BROWSER_HOSTS and not host.endswith(".gvt1.com"):
            out.append(r)
    return out


def chromium_path() -> str | None:
    for name in CHROMIUM_CANDIDATES:
        found = shutil.which(name)
        if found:
            return found
    return None


class _Recorder(http.server.BaseHTTPRequestHandler):
    def _refuse(self):
        self.server.requests.append(f"{self.command} {self.path}")
        self.send_response(403)
        self.send_header("Content-Length", "0")
        self.end_headers()

    do_GET = do_POST = do_HEAD = do_CONNECT = do_PUT = do_OPTIONS = _refuse

    def log_message(self, *args):  # quiet
        pass


class RecordingProxy:
    """An HTTP proxy on 127.0.0.1 that records and refuses every request."""

    def __enter__(self):
        self.server = http.server.ThreadingHTTPServer(("127.0.0.1", 0), _Recorder)
        self.server.requests = []
        self.thread = threading.Thread(target=self.server.serve_forever, daemon=True)
        self.thread.start()
        return self

    @property
    def address(self) -> str:
        return f"http://127.0.0.1:{self.server.server_address[1]}"

    @property
    def requests(self) -> list[str]:
        return list(self.server.requests)

    def __exit__(self, *exc):
        self.server.shutdown()
        self.server.server_close()


@dataclass(frozen=True)
class Rendered:
    dom: str
    seconds: float
    """Wall time of the Chromium process (start-up included)."""
    requests: list[str]
    """Requests sent to the network (through the recording proxy)."""
    body: dict[str, str]
    """The attributes of ``<body>`` after the scripts ran."""


def render(page: Path, *, fragment: str = "", window: str = WINDOW,
           virtual_time_ms: int = 30000, timeout_s: float = 300.0,
           chromium: str | None = None) -> Rendered:
    """Open ``page`` in headless Chromium and return the DOM once its scripts ran."""
    chromium = chromium or chromium_path()
    url = Path(page).resolve().as_uri() + (f"#{fragment}" if fragment else "")
    with tempfile.TemporaryDirectory(prefix="cablefam-chromium-") as profile, \
            RecordingProxy() as proxy:
        argv = [chromium, *FLAGS, f"--user-data-dir={profile}", f"--window-size={window}",
                f"--proxy-server={proxy.address}", "--proxy-bypass-list=<-loopback>",
                f"--virtual-time-budget={virtual_time_ms}", "--dump-dom", url]
        start = time.perf_counter()
        proc = subprocess.run(argv, capture_output=True, text=True, timeout=timeout_s)
        seconds = time.perf_counter() - start
        requests = proxy.requests
    if proc.returncode != 0:
        raise RuntimeError(f"chromium exited with {proc.returncode}: {proc.stderr[-2000:]}")
    match = re.search(r"<body([^>]*)>", proc.stdout)
    body = dict(re.findall(r'([\w-]+)="([^"]*)"', match.group(1))) if match else {}
    return Rendered(dom=proc.stdout, seconds=seconds, requests=requests, body=body)
