"""Checks of the finished site: offline for real, every local reference resolves.

Read independently of the engine that assembled the site, from the files on
disk:

* HTML: every resource a browser would load (``script``, ``link``, ``img``,
  ``source``, ``iframe``, ``embed``, ``object``, media, SVG ``image``/``use``,
  ``url()`` and ``@import`` in ``style``) must be local -- no scheme, no
  ``//host`` -- and must exist inside the site; local ``<a href>`` targets must
  exist too.  Links to other hosts are counted (the generated pages have none).
* CSS: ``url()`` and ``@import`` local and existing (the vendored KaTeX fonts).
* SVG figures: no script, no reference to another host.

A problem list that is not empty fails the build.
"""

from __future__ import annotations

import re
from dataclasses import dataclass, field
from html.parser import HTMLParser
from pathlib import Path
from urllib.parse import unquote, urlsplit

__all__ = ["SiteCheck", "verify_site"]

_RESOURCE_ATTRS = {
    "script": ("src",), "img": ("src", "srcset"), "source": ("src", "srcset"),
    "iframe": ("src",), "embed": ("src",), "object": ("data",), "video": ("src", "poster"),
    "audio": ("src",), "track": ("src",), "image": ("href", "xlink:href"),
    "use": ("href", "xlink:href"), "input": ("src",),
}
_CSS_URL = re.compile(r"""url\(\s*(['"]?)([^'")]+)\1\s*\)|@import\s+(['"])([^'"]+)\3""")


@dataclass
class SiteCheck:
    """What the check found; ``problems`` fail the build."""

    problems: list[str] = field(default_factory=list)
    external_links: int = 0
    files: int = 0
    size_bytes: int = 0
    html_pages: int = 0


def _external(url: str) -> bool:
    parts = urlsplit(url.strip())
    return bool(parts.netloc) or parts.scheme not in ("", "data", "blob", "about",
                                                      "javascript", "mailto")


def _local_target(root: Path, here: Path, url: str) -> Path | None:
    parts = urlsplit(url.strip())
    if parts.scheme or parts.netloc or not parts.path:
        return None
    path = unquote(parts.path)
    target = (root / path.lstrip("/")) if path.startswith("/") else (here.parent / path)
    return target.resolve()


class _Page(HTMLParser):
    def __init__(self) -> None:
        super().__init__(convert_charrefs=True)
        self.resources: list[tuple[str, str]] = []  # (what, url)
        self.anchors: list[str] = []
        self.styles: list[str] = []
        self._in_style = False

    def handle_starttag(self, tag: str, attrs: list[tuple[str, str | None]]) -> None:
        a = {k: v or "" for k, v in attrs}
        if tag == "link" and a.get("href"):
            rel = a.get("rel", "").lower()
            if rel not in ("canonical", "alternate", "prev", "next"):
                self.resources.append((f"<link rel={rel}>", a["href"]))
        for name in _RESOURCE_ATTRS.get(tag, ()):
            value = a.get(name)
            if not value:
                continue
            urls = ([u.strip().split(" ")[0] for u in value.split(",")] if name == "srcset"
                    else [value])
            self.resources.extend((f"<{tag} {name}>", u) for u in urls if u)
        if tag == "a" and a.get("href"):
            self.anchors.append(a["href"])
        if tag == "meta" and a.get("http-equiv", "").lower() == "refresh":
            self.resources.append(("<meta refresh>", a.get("content", "").split("url=")[-1]))
        if a.get("style"):
            self.styles.append(a["style"])
        self._in_style = tag == "style"

    def handle_endtag(self, tag: str) -> None:
        self._in_style = False

    def handle_data(self, data: str) -> None:
        if self._in_style:
            self.styles.append(data)


def _css_urls(text: str) -> list[str]:
    return [m.group(2) or m.group(4) for m in _CSS_URL.finditer(text)]


def verify_site(root: Path) -> SiteCheck:
    """Check every HTML, CSS and SVG file under ``root``."""
    root = root.resolve()
    check = SiteCheck()

    def local(here: Path, what: str, url: str, must_exist: bool = True) -> None:
        if _external(url):
            check.problems.append(f"{here.relative_to(root)}: {what} from another host: {url}")
            return
        target = _local_target(root, here, url)
        if target is None:
            return
        if root not in target.parents and target != root:
            check.problems.append(f"{here.relative_to(root)}: {what} outside the site: {url}")
        elif must_exist and not target.exists():
            check.problems.append(f"{here.relative_to(root)}: {what} not found: {url}")

    for path in sorted(root.rglob("*")):
        if not path.is_file():
            continue
        check.files += 1
        check.size_bytes += path.stat().st_size
        suffix = path.suffix.lower()
        if suffix == ".html":
            check.html_pages += 1
            page = _Page()
            page.feed(path.read_text(encoding="utf-8"))
            for what, url in page.resources:
                local(path, what, url)
            for style in page.styles:
                for url in _css_urls(style):
                    local(path, "style url()", url)
            for url in page.anchors:
                if url.strip().lower().startswith("javascript:"):
                    check.problems.append(f"{path.relative_to(root)}: script link: {url}")
                elif _external(url):
                    check.external_links += 1
                elif urlsplit(url).path:
                    local(path, "link", url)
        elif suffix == ".css":
            for url in _css_urls(path.read_text(encoding="utf-8")):
                local(path, "css url()", url)
        elif suffix == ".svg":
            text = path.read_text(encoding="utf-8")
            if re.search(r"<script|\son[a-z]+\s*=", text, re.IGNORECASE):
                check.problems.append(f"{path.relative_to(root)}: script in an SVG figure")
            for url in re.findall(r"""(?:xlink:)?href\s*=\s*["']([^"']+)""", text):
                if _external(url):
                    check.problems.append(f"{path.relative_to(root)}: reference to another "
                                          f"host: {url}")
    return check
