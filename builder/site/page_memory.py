"""Let go of each page's text as soon as mkdocs no longer needs it.

mkdocs converts every page before it writes any (the navigation and the
plugins may need every page), and keeps each page's Markdown source and its
converted HTML to the end of the build: for the full atlas, thousands of
pair pages of raw HTML twice over, several hundred megabytes.  Neither is
read again once used: the Markdown once converted (``on_page_content``, run
after every other plugin's), the converted HTML once the page's template has
been rendered around it (``on_post_page``, after every other plugin's; the
output is then written by mkdocs).  This plugin drops each at that point.
Nothing else of a page (title, table of contents, metadata, URL) is touched,
so the site is the same byte for byte (the test suite builds a site with and
without it).
"""

from __future__ import annotations

from typing import Any

from mkdocs.plugins import BasePlugin, event_priority

__all__ = ["ReleasePageText"]


class ReleasePageText(BasePlugin):
    """mkdocs plugin: drop a page's Markdown once converted and its HTML once rendered."""

    @event_priority(-100)  # after every other plugin
    def on_page_content(self, html: str, /, *, page: Any, config: Any, files: Any) -> str:
        page.markdown = None
        return html

    @event_priority(-100)
    def on_post_page(self, output: str, /, *, page: Any, config: Any) -> str:
        page.content = None
        return output
