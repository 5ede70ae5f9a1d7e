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

Parsing is the costly part (about 20 ms an HTML page) and each file is parsed
from its own bytes alone (:func:`read_findings`), so :func:`verify_site` can
spread the files it has not parsed before over ``workers`` local processes, in
chunks; the checks of what each file asks of the others then run in this process
in the order of the files, so the findings and their order do not depend on the
number of workers.
"""

from __future__ import annotations

import hashlib
import multiprocessing
import posixpath
import re
import xml.etree.ElementTree as ElementTree
from collections.abc import Sequence
from concurrent.futures import ProcessPoolExecutor
from dataclasses import dataclass, field
from html.parser import HTMLParser
from pathlib import Path
from urllib.parse import unquote, urlsplit

__all__ = ["Findings", "SiteCheck", "read_findings", "svg_problems", "verify_site"]

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


@dataclass(frozen=True)
class Findings:
    """What one file asks of the rest of the site, read from its bytes alone."""

    resources: tuple[tuple[str, str], ...] = ()  # (what, url): must be local and exist
    anchors: tuple[str, ...] = ()  # <a href>
    problems: tuple[str, ...] = ()  # problems of the file itself (SVG)
    html: bool = False


def read_findings(suffix: str, data: bytes) -> Findings:
    """Parse one HTML, CSS or SVG file (other files ask nothing)."""
    if suffix == ".html":
        page = _Page()
        page.feed(data.decode("utf-8"))
        resources = list(page.resources)
        resources += [("style url()", url) for style in page.styles for url in _css_urls(style)]
        return Findings(tuple(resources), tuple(page.anchors), html=True)
    if suffix == ".css":
        return Findings(tuple(("css url()", url) for url in _css_urls(data.decode("utf-8"))))
    if suffix == ".svg":
        return Findings(problems=tuple(f"SVG figure: {problem}"
                                       for problem in svg_problems(data.decode("utf-8"))))
    return Findings()


def _target(here: str, url: str) -> str | None:
    """The site-relative path a local URL points to ("" for the root, ".." outside)."""
    parts = urlsplit(url.strip())
    if parts.scheme or parts.netloc or not parts.path:
        return None
    path = unquote(parts.path)
    joined = path.lstrip("/") if path.startswith("/") else posixpath.join(
        posixpath.dirname(here), path)
    normal = posixpath.normpath(joined) if joined else "."
    return "" if normal == "." else normal


#: Below this many files to parse, worker processes cost more than they save.
_PARALLEL_FROM = 40
#: Chunks per worker: small enough to even out the load, large enough to keep the
#: pickling of tasks and findings negligible.
_CHUNKS_PER_WORKER = 4


def _read_chunk(chunk: Sequence[tuple[str, str, str]]) -> list[tuple[str, Findings]]:
    """:func:`read_findings` of each ``(key, suffix, path)`` (a worker's share)."""
    return [(key, read_findings(suffix, Path(path).read_bytes())) for key, suffix, path in chunk]


def _read_all(todo: list[tuple[str, str, str]], workers: int) -> dict[str, Findings]:
    """The findings of every ``(key, suffix, path)`` in ``todo``, parsed by ``workers``
    processes (in this process when one, or when there are few)."""
    if workers <= 1 or len(todo) < _PARALLEL_FROM:
        return dict(_read_chunk(todo))
    count = min(len(todo), workers * _CHUNKS_PER_WORKER)
    chunks = [todo[i::count] for i in range(count)]  # interleaved: big and small pages mix
    method = "fork" if "fork" in multiprocessing.get_all_start_methods() else "spawn"
    with ProcessPoolExecutor(max_workers=workers,
                             mp_context=multiprocessing.get_context(method)) as pool:
        return {key: found for part in pool.map(_read_chunk, chunks) for key, found in part}


def verify_site(root: Path, memo: dict[str, Findings] | None = None,
                workers: int = 1) -> SiteCheck:
    """Check every HTML, CSS and SVG file under ``root``.

    ``memo`` maps a hash of a file's bytes to what it was found to ask (kept by the
    build between builds): an unchanged file is not parsed again; the checks of what
    it asks always run against the site as it is now.  ``workers`` local processes
    parse the files not in the memo (the result is the same for any number).
    """
    root = root.resolve()
    check = SiteCheck()
    files = sorted(p for p in root.rglob("*") if p.is_file())
    present = {p.relative_to(root).as_posix() for p in files}
    present |= {posixpath.dirname(name) for name in present}
    folders = {f for name in present for f in _parents(name)}
    present |= folders | {""}

    def local(here: str, what: str, url: str) -> None:
        if _external(url):
            check.problems.append(f"{here}: {what} from another host: {url}")
            return
        target = _target(here, url)
        if target is None:
            return
        if target == ".." or target.startswith("../"):
            check.problems.append(f"{here}: {what} outside the site: {url}")
        elif target not in present:
            check.problems.append(f"{here}: {what} not found: {url}")

    known = memo or {}
    keys: list[tuple[str, str]] = []  # (site-relative name, key) of each file to check
    todo: dict[str, tuple[str, str, str]] = {}  # key -> (key, suffix, path) to parse
    for path in files:
        data = path.read_bytes()
        check.files += 1
        check.size_bytes += len(data)
        suffix = path.suffix.lower()
        if suffix not in (".html", ".css", ".svg"):
            continue
        key = hashlib.sha256(suffix.encode() + b"\0" + data).hexdigest()
        keys.append((path.relative_to(root).as_posix(), key))
        if key not in known and key not in todo:
            todo[key] = (key, suffix, str(path))
    parsed = _read_all(list(todo.values()), workers)

    seen: dict[str, Findings] = {}
    for here, key in keys:
        found = known[key] if key in known else parsed[key]
        seen[key] = found
        check.html_pages += found.html
        check.problems.extend(f"{here}: {problem}" for problem in found.problems)
        for what, url in found.resources:
            local(here, what, url)
        for url in found.anchors:
            if url.strip().lower().startswith("javascript:"):
                check.problems.append(f"{here}: script link: {url}")
            elif _external(url):
                check.external_links += 1
            elif urlsplit(url).path:
                local(here, "link", url)
    if memo is not None:
        memo.clear()
        memo.update(seen)
    return check


def _parents(name: str) -> list[str]:
    out = []
    while name:
        name = posixpath.dirname(name)
        out.append(name)
    return out
