"""The run report's HTML: one self-contained page (styles, plotly.js and the data inlined).

The page needs no server and no network: the plotly.js bundle shipped with the ``plotly``
Python package (:func:`plotly.offline.get_plotlyjs`) is written into a ``<script>`` element,
each figure's JSON into a ``<script type="application/json">`` element, and one small script
draws them with ``Plotly.newPlot``: the scatter plots at once, the parallel-coordinates plot
(WebGL) when they come near the visible part of the page (every plot at once when the page is
opened as ``report.html#all-plots``). On ``<body>`` the script sets
``data-plots-total``, ``data-plots-drawn`` (so far), ``data-first-render-ms`` (milliseconds
since the page started, when the plots drawn at once are done), ``data-render-ms`` (when every
plot is done) and, on a failure, ``data-plot-error``. Tests and the benchmark read them.

Colours: the Okabe-Ito palette (:mod:`.figure_style`); text at 15 px on a page at most
1200 px wide, readable on a laptop screen.
"""

from __future__ import annotations

import html
import json

#: Plotly configuration of every plot: no logo link, no cloud button, resizes with the page.
PLOT_CONFIG = {"responsive": True, "displaylogo": False, "showLink": False,
               "plotGlPixelRatio": 1,
               "modeBarButtonsToRemove": ["sendDataToCloud", "lasso2d"],
               "toImageButtonOptions": {"format": "png", "scale": 2}}

STYLE = """
:root{--ink:#1d1d1d;--muted:#555;--rule:#c8c8c8;--band:#f3f3f3;--warn:#D55E00;--link:#0072B2}
*{box-sizing:border-box}
body{font:15px/1.45 system-ui,-apple-system,"Segoe UI",Roboto,sans-serif;color:var(--ink);
 max-width:1200px;margin:0 auto;padding:0 1.2em 3em}
h1{font-size:1.6em;margin:.8em 0 .2em}h2{font-size:1.3em;margin:1.6em 0 .4em;
 border-bottom:2px solid var(--rule);padding-bottom:.2em}h3{font-size:1.08em;margin:1.2em 0 .3em}
a{color:var(--link)}nav{position:sticky;top:0;background:#fff;padding:.4em 0;
 border-bottom:1px solid var(--rule);z-index:10}nav a{margin-right:1.1em;white-space:nowrap}
table{border-collapse:collapse;margin:.4em 0 .8em;font-size:.93em}
td,th{border:1px solid var(--rule);padding:.2em .55em;text-align:left;vertical-align:top}
th{background:var(--band)}td.num{text-align:right;font-variant-numeric:tabular-nums}
tr.binding td{background:#fdf0e6}
.verdict{font-size:1.05em;border-left:5px solid var(--link);background:var(--band);
 padding:.5em .8em;margin:.5em 0}
.caution{border:2px solid var(--warn);padding:.6em .9em;margin:1em 0}
.missing{border:2px dashed var(--warn);padding:.6em .9em;margin:1em 0}
.note{color:var(--muted);font-size:.9em}.plot{width:100%;min-height:520px}
.scroll{overflow-x:auto}code{background:var(--band);padding:0 .25em}
"""


def e(text) -> str:
    """HTML-escaped text."""
    return html.escape(str(text))


def table(headers, rows, numeric=(), row_classes=None) -> str:
    """An HTML table; ``rows`` hold HTML (escape text with :func:`e` first); columns whose
    index is in ``numeric`` are right-aligned."""
    out = ["<div class=\"scroll\"><table>",
           "<tr>" + "".join(f"<th>{h}</th>" for h in headers) + "</tr>"]
    for k, row in enumerate(rows):
        cls = f" class=\"{row_classes[k]}\"" if row_classes and row_classes[k] else ""
        cells = "".join(f"<td class=\"num\">{c}</td>" if j in numeric else f"<td>{c}</td>"
                        for j, c in enumerate(row))
        out.append(f"<tr{cls}>{cells}</tr>")
    out.append("</table></div>")
    return "\n".join(out)


def plot_block(div_id: str, figure: dict, lazy: bool = False) -> str:
    """A plot's ``<div>`` and its figure as inline JSON (``</`` escaped inside the script).

    A ``lazy`` plot is drawn when it comes near the visible part of the page (the WebGL
    plot: it costs seconds to set up where WebGL runs in software), the others at once.
    """
    data = json.dumps(figure, separators=(",", ":"), allow_nan=False).replace("</", "<\\/")
    flag = " data-lazy=\"1\"" if lazy else ""
    return (f"<div class=\"plot\" id=\"{e(div_id)}\"></div>\n"
            f"<script type=\"application/json\" class=\"plot-data\"{flag} "
            f"data-target=\"{e(div_id)}\">{data}</script>")


_DRAW = """
(function () {
  var config = %s;
  var blocks = Array.prototype.slice.call(document.querySelectorAll('script.plot-data'));
  var body = document.body, drawn = 0, wanted = {};
  body.setAttribute('data-plots-total', String(blocks.length));
  function done() {
    drawn += 1;
    body.setAttribute('data-plots-drawn', String(drawn));
    if (drawn === blocks.length) {
      body.setAttribute('data-render-ms', String(Math.round(performance.now())));
    }
  }
  // show only trace k of a plot (a member of the parallel coordinates); remembered until the
  // plot is drawn
  function show(id, k, title) {
    var plot = document.getElementById(id);
    if (!plot || !plot.data) { wanted[id] = [k, title]; return; }
    Plotly.update(plot, {visible: plot.data.map(function (t, j) { return j === k; })},
                  {'updatemenus[0].active': k, 'title.text': title});
  }
  function draw(block) {
    if (block.getAttribute('data-drawn')) { return Promise.resolve(); }
    block.setAttribute('data-drawn', '1');
    var id = block.getAttribute('data-target');
    var fig = JSON.parse(block.textContent);
    return Plotly.newPlot(id, fig.data, fig.layout, config).then(function () {
      if (wanted[id]) { show(id, wanted[id][0], wanted[id][1]); delete wanted[id]; }
      done();
    }, function (err) {
      body.setAttribute('data-plot-error', String(err));
    });
  }
  document.querySelectorAll('a.show-trace').forEach(function (link) {
    link.addEventListener('click', function () {
      show(link.getAttribute('data-plot'), Number(link.getAttribute('data-trace')),
           link.getAttribute('data-title'));
    });
  });
  var lazy = blocks.filter(function (b) { return b.getAttribute('data-lazy'); });
  var first = blocks.filter(function (b) { return !b.getAttribute('data-lazy'); });
  if (!('IntersectionObserver' in window) || location.hash === '#all-plots') {
    first = blocks; lazy = [];
  }
  Promise.all(first.map(draw)).then(function () {
    body.setAttribute('data-first-render-ms', String(Math.round(performance.now())));
    var seen = new IntersectionObserver(function (entries) {
      entries.forEach(function (entry) {
        if (!entry.isIntersecting) { return; }
        seen.unobserve(entry.target);
        draw(document.querySelector('script.plot-data[data-target="' +
                                   entry.target.id + '"]'));
      });
    }, {rootMargin: '400px 0px'});
    lazy.forEach(function (b) { seen.observe(document.getElementById(
      b.getAttribute('data-target'))); });
  });
})();
"""


def plotly_bundle() -> str:
    """The plotly.js bundle of the installed ``plotly`` package (no network)."""
    from plotly.offline import get_plotlyjs

    return get_plotlyjs()


def render_page(title: str, body: list[str], bundle: str | None = None) -> str:
    """The whole page: ``body`` is a list of HTML fragments, plots included."""
    bundle = plotly_bundle() if bundle is None else bundle
    draw = _DRAW % json.dumps(PLOT_CONFIG)
    bundle = bundle.replace("</script", "<\\/script")
    return "\n".join([
        "<!DOCTYPE html>", "<html lang=\"en\">", "<head>", "<meta charset=\"utf-8\">",
        "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">",
        f"<title>{e(title)}</title>", f"<style>{STYLE}</style>",
        f"<script>{bundle}</script>", "</head>", "<body>",
        *body, f"<script>{draw}</script>", "</body>", "</html>", ""])
