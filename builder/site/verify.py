"""Checks of the finished site: offline for real, every local reference resolves.

Read independently of the engine that assembled the site, from the files on
disk:

* HTML: every resource a browser would load (``script``, ``link``, ``img``,
  ``source``, ``iframe``, ``embed``, ``object``, media, SVG ``image``/``use``,
  ``url()`` and ``@import`` in ``style``) must be local -- no scheme, no
  ``//host`` -- and must exist inside the site; local ``<a href>`` targets must
  exist too.  Links to other hosts are counted (the generated pages have none).
* CSS: ``url()`` and ``@import`` local and existing (the vendored KaTeX fonts).
* SVG figures, parsed as XML: no ``<script>`` or ``<foreignObject>`` element, no
  event-handler attribute (``on...``), no reference (``href``, ``url()`` in a
  style) to another host.  Text inside ``<text>`` is text, whatever it says: a
  component named "Ethanol onset=early" is not an event handler.

A problem list that is not empty fails the build.
"""

from __future__ import annotations

import re
import xml.etree.ElementTree as ElementTree
from dataclasses import dataclass, field
from html.parser import HTMLParser
from pathlib import Path
from urllib.parse import unquote, urlsplit

__all__ = ["SiteCheck", "svg_problems", "verify_site"]

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


def _local_name(name: str) -> str:
    """``{http://www.w3.org/2000/svg}script`` -> ``script`` (the same for attributes)."""
    return name.rsplit("}", 1)[-1].lower()


def svg_problems(text: str) -> list[str]:
    """What is wrong with one SVG figure, read as XML (an empty list when nothing is)."""
    try:
        tree = ElementTree.fromstring(text)
    except ElementTree.ParseError as error:
        return [f"not well-formed XML ({error})"]
    problems: list[str] = []
    for element in tree.iter():
        tag = _local_name(str(element.tag))
        if tag in ("script", "foreignobject", "iframe", "embed", "object"):
            problems.append(f"a <{tag}> element")
        for name, value in element.attrib.items():
            attribute = _local_name(name)
            if attribute.startswith("on"):
                problems.append(f"an event-handler attribute {attribute}= on <{tag}>")
            elif attribute == "href" and _external(value):
                problems.append(f"a reference to another host: {value}")
            elif attribute == "style":
                problems.extend(f"a style url() from another host: {url}"
                                for url in _css_urls(value) if _external(url))
        if tag == "style" and element.text:
            problems.extend(f"a style url() from another host: {url}"
                            for url in _css_urls(element.text) if _external(url))
    return problems


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
            check.problems.extend(f"{path.relative_to(root)}: SVG figure: {problem}"
                                  for problem in svg_problems(path.read_text(encoding="utf-8")))
    return check
