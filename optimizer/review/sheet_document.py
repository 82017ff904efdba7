"""The building blocks of a design sheet and their Markdown and HTML forms.

A sheet is a list of blocks (:class:`Heading`, :class:`Paragraph`, :class:`Table`,
:class:`Image`, :class:`Code`, :class:`Link`); :func:`render_markdown` and :func:`render_html`
write the same list as either page. The HTML page is self-contained apart from the images next
to it (relative links): no external script or style sheet.
"""

from __future__ import annotations

import dataclasses
import html

@dataclasses.dataclass(frozen=True)
class Heading:
    level: int
    text: str


@dataclasses.dataclass(frozen=True)
class Paragraph:
    text: str


@dataclasses.dataclass(frozen=True)
class Table:
    headers: tuple[str, ...]
    rows: tuple[tuple[str, ...], ...]


@dataclasses.dataclass(frozen=True)
class Image:
    path: str
    """Relative to the page."""
    alt: str


@dataclasses.dataclass(frozen=True)
class Code:
    text: str


@dataclasses.dataclass(frozen=True)
class Link:
    """A line of text that links to another page (relative to this one)."""

    href: str
    text: str
    note: str = ""
    """Text after the link."""


def _md_cell(text: str) -> str:
    return str(text).replace("|", "\\|").replace("\n", " ")


def render_markdown(blocks) -> str:
    out = []
    for b in blocks:
        if isinstance(b, Heading):
            out.append("#" * b.level + " " + b.text)
        elif isinstance(b, Paragraph):
            out.append(b.text)
        elif isinstance(b, Table):
            out.append("| " + " | ".join(_md_cell(h) for h in b.headers) + " |")
            out.append("|" + "|".join(" --- " for _ in b.headers) + "|")
            out += ["| " + " | ".join(_md_cell(c) for c in row) + " |" for row in b.rows]
        elif isinstance(b, Image):
            out.append(f"![{b.alt}]({b.path})")
        elif isinstance(b, Code):
            out.append("```\n" + b.text.rstrip("\n") + "\n```")
        elif isinstance(b, Link):
            out.append(f"[{b.text}]({b.href}){b.note}")
        out.append("")
    return "\n".join(out)


_STYLE = ("body{font-family:sans-serif;max-width:60em;margin:2em auto;padding:0 1em;"
          "color:#222}table{border-collapse:collapse;margin:0.5em 0}"
          "td,th{border:1px solid #bbb;padding:0.2em 0.6em;text-align:left;vertical-align:top}"
          "th{background:#eee}img{max-width:100%}pre{background:#f4f4f4;padding:0.6em;"
          "overflow-x:auto}.caution{border:2px solid #D55E00;padding:0.6em}")


def render_html(blocks, title: str) -> str:
    e = html.escape
    out = ["<!DOCTYPE html>", "<html lang=\"en\">", "<head>", "<meta charset=\"utf-8\">",
           f"<title>{e(title)}</title>", f"<style>{_STYLE}</style>", "</head>", "<body>"]
    for b in blocks:
        if isinstance(b, Heading):
            out.append(f"<h{b.level}>{e(b.text)}</h{b.level}>")
        elif isinstance(b, Paragraph):
            cls = " class=\"caution\"" if b.text.startswith("CAUTION") else ""
            out.append(f"<p{cls}>{e(b.text)}</p>")
        elif isinstance(b, Table):
            out.append("<table>")
            out.append("<tr>" + "".join(f"<th>{e(h)}</th>" for h in b.headers) + "</tr>")
            out += ["<tr>" + "".join(f"<td>{e(str(c))}</td>" for c in row) + "</tr>"
                    for row in b.rows]
            out.append("</table>")
        elif isinstance(b, Image):
            out.append(f"<p><img src=\"{e(b.path)}\" alt=\"{e(b.alt)}\"></p>")
        elif isinstance(b, Code):
            out.append(f"<pre>{e(b.text)}</pre>")
        elif isinstance(b, Link):
            out.append(f"<p><a href=\"{e(b.href)}\">{e(b.text)}</a>{e(b.note)}</p>")
    out += ["</body>", "</html>", ""]
    return "\n".join(out)


