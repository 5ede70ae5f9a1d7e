"""Keep the pages' raw HTML out of the Markdown parser: it is set aside before the
conversion and put back, unchanged, after it.

The atlas's pages are mostly HTML the templates wrote (summary boxes, figure
grids, tables) between a few Markdown headings.  Python-Markdown passes a raw
HTML block through verbatim, but only after parsing it twice with
:class:`html.parser.HTMLParser` (its own block extraction, and mkdocs's scan
for anchor ids): about nine tenths of the assembly time of a pair page.  The
plugin here replaces each such block by a one-word paragraph before the
conversion and substitutes the block for that paragraph afterwards, which
gives the same HTML (the test suite compares a whole site built both ways).

A block qualifies when it is a run of non-blank lines, after a blank line or
the front matter, whose first line opens a block-level element (``div``,
``table``, ``p``, ...) and every line of which starts with ``<``: the shape of
everything the templates write.  Anything else (headings, Markdown tables,
admonitions, prose) goes to Markdown as before.  Raw HTML is never checked by
mkdocs's link validation (it never was: only Markdown links are), and the
ids inside it are left out of mkdocs's anchor check (an INFO-level check; the
atlas's own verification, :mod:`builder.site.verify`, checks every link and
anchor of the built site).
"""

from __future__ import annotations

import re
from typing import Any

from mkdocs.plugins import BasePlugin, event_priority

__all__ = ["RawHtmlPassThrough", "put_back", "set_aside"]

#: Block-level elements that open a raw HTML block in Python-Markdown (a subset of its
#: ``block_level_elements``: those the templates begin a block with).
_BLOCK_TAGS = frozenset({
    "address", "article", "aside", "blockquote", "details", "div", "dl", "figure",
    "footer", "form", "header", "hr", "nav", "ol", "p", "pre", "section", "table", "ul"})
_VOID_TAGS = frozenset({"hr"})
_OPENING = re.compile(r"<([a-z][a-z0-9]*)[\s>/]")
_TOKEN = "ATLASRAWHTML{:06d}"
_PUT_BACK = re.compile(r"<p>(ATLASRAWHTML\d{6})</p>")


def _block_end(lines: list[str], start: int) -> int | None:
    """The index after the raw HTML block that opens at ``lines[start]``, or None.

    The block runs, across blank lines, until the element opened on its first
    line is closed; then on through following lines that each open another
    block-level element, closed in turn, up to a blank line.  None where the
    region has another shape: it is left to Markdown.
    """
    i = start
    while True:
        match = _OPENING.match(lines[i])
        if match is None or match.group(1) not in _BLOCK_TAGS:
            return None
        name = match.group(1)
        opens, closes = re.compile(rf"<{name}[\s>/]"), f"</{name}>"
        depth = 0
        while i < len(lines):
            depth += len(opens.findall(lines[i])) - lines[i].count(closes)
            i += 1
            if depth <= 0 or name in _VOID_TAGS:
                break
        if (depth > 0 and name not in _VOID_TAGS) or depth < 0:
            return None
        if i == len(lines) or lines[i].strip() == "":
            return i


def set_aside(markdown: str) -> tuple[str, dict[str, str]]:
    """Replace every raw HTML block of ``markdown`` (of the shape above) by a token
    paragraph; returns the text and the blocks by token.

    >>> text, blocks = set_aside("# Title\\n\\n<div>\\n<p>a &#60; b</p>\\n\\n</div>\\n\\nProse\\n")
    >>> text
    '# Title\\n\\nATLASRAWHTML000000\\n\\nProse\\n'
    >>> blocks["ATLASRAWHTML000000"]
    '<div>\\n<p>a &#60; b</p>\\n\\n</div>'
    >>> set_aside("<span>inline</span> text\\n")[1]
    {}
    """
    lines = markdown.split("\n")
    out: list[str] = []
    blocks: dict[str, str] = {}
    i = 0
    while i < len(lines):
        starts_run = lines[i].strip() != "" and (i == 0 or lines[i - 1].strip() == "")
        end = _block_end(lines, i) if starts_run else None
        if end is None:
            out.append(lines[i])
            i += 1
            continue
        token = _TOKEN.format(len(blocks))
        blocks[token] = "\n".join(lines[i:end])
        out.append(token)
        i = end
    return "\n".join(out), blocks


def put_back(html: str, blocks: dict[str, str]) -> str:
    """Substitute the blocks set aside by :func:`set_aside` for their token paragraphs,
    each followed by an empty line (but the last thing of the page) as Python-Markdown
    writes a raw block.

    >>> put_back("<h1>Title</h1>\\n<p>ATLASRAWHTML000000</p>\\n<p>Prose</p>",
    ...          {"ATLASRAWHTML000000": "<hr>"})
    '<h1>Title</h1>\\n<hr>\\n\\n<p>Prose</p>'
    """
    if not blocks:
        return html

    def block(match: re.Match[str]) -> str:
        token = match.group(1)
        if token not in blocks:
            return match.group(0)
        return blocks[token] + ("" if match.end() == len(html) else "\n")

    return _PUT_BACK.sub(block, html)


class RawHtmlPassThrough(BasePlugin):
    """mkdocs plugin: :func:`set_aside` before the Markdown conversion, :func:`put_back`
    right after it (before any other plugin reads the page's HTML)."""

    def __init__(self) -> None:
        super().__init__()
        self._blocks: dict[str, dict[str, str]] = {}

    @event_priority(100)
    def on_page_markdown(self, markdown: str, /, *, page: Any, config: Any, files: Any) -> str:
        text, blocks = set_aside(markdown)
        self._blocks[page.file.src_uri] = blocks
        return text

    @event_priority(100)
    def on_page_content(self, html: str, /, *, page: Any, config: Any, files: Any) -> str:
        return put_back(html, self._blocks.pop(page.file.src_uri, {}))
