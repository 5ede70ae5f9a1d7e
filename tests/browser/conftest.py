"""Browser tests: Playwright driving Debian's Chromium (/usr/bin/chromium), never a download.

The site under test is taken from $ATLAS_SITE when CI has just built the full atlas with
``atlas build --strict``; otherwise it is built once per session from the shipped
catalogue with ``tests/data/browser-site.yaml`` (predicted pages for fifteen solvents, not
every combination, to keep a local run short).  Outside CI the tests
are skipped when Chromium or Playwright is missing; in CI (CI=true) that is a failure.
"""

from __future__ import annotations

import ipaddress
import os
from collections.abc import Iterator
from pathlib import Path
from typing import Any
from urllib.parse import urlsplit

import pytest

from builder.site.build import build_site
from tests.conftest import cache_sharing_work

pytest.importorskip("material", reason="the site extra is not installed: pip install -e '.[site]'")

CHROMIUM = Path("/usr/bin/chromium")
BROWSER_SETTINGS = Path(__file__).resolve().parent.parent / "data" / "browser-site.yaml"


def _need(condition: bool, reason: str) -> None:
    if not condition:
        if os.environ.get("CI"):
            pytest.fail(f"{reason} (required in CI)")
        pytest.skip(reason)


@pytest.fixture(scope="session")
def site(tmp_path_factory: pytest.TempPathFactory, shared_work: Path) -> Path:
    given = os.environ.get("ATLAS_SITE")
    if given:
        path = Path(given).resolve()
        assert (path / "index.html").is_file(), f"ATLAS_SITE={given} holds no built site"
        return path
    root = tmp_path_factory.mktemp("browser")
    out = root / "site"
    build_site(out_dir=out, strict=True, settings_file=BROWSER_SETTINGS,
               cache_dir=cache_sharing_work(shared_work, root))
    return out


@pytest.fixture(scope="session")
def browser() -> Iterator[Any]:
    _need(CHROMIUM.exists(), f"{CHROMIUM} is missing (apt-get install -y chromium)")
    try:
        from playwright.sync_api import sync_playwright
    except ImportError:  # pragma: no cover - depends on the machine
        _need(False, "playwright is not installed (pip install -e '.[test]')")
        raise
    with sync_playwright() as playwright:
        instance = playwright.chromium.launch(executable_path=str(CHROMIUM))
        yield instance
        instance.close()


def is_local(url: str) -> bool:
    """file:, data:, blob:, about: and loopback http(s) only."""
    parts = urlsplit(url)
    if parts.scheme in ("file", "data", "blob", "about", "chrome-error"):
        return True
    if parts.scheme in ("http", "https", "ws", "wss"):
        host = parts.hostname or ""
        if host == "localhost":
            return True
        try:
            return ipaddress.ip_address(host).is_loopback
        except ValueError:
            return False
    return False


class Watched:
    """A page that records every request, console error and page error."""

    def __init__(self, page: Any) -> None:
        self.page = page
        self.requests: list[str] = []
        self.foreign: list[str] = []
        self.errors: list[str] = []
        page.on("request", self._request)
        page.on("pageerror", lambda error: self.errors.append(f"page error: {error}"))
        page.on("console", self._console)
        # Never let a request leave the machine, even if one slips in: abort and record it.
        page.route("**/*", self._route)

    def _request(self, request: Any) -> None:
        self.requests.append(request.url)
        if not is_local(request.url):
            self.foreign.append(request.url)

    def _route(self, route: Any) -> None:
        if is_local(route.request.url):
            route.continue_()
        else:
            route.abort()

    def _console(self, message: Any) -> None:
        if message.type == "error":
            self.errors.append(f"console: {message.text}")

    def check(self) -> None:
        assert self.foreign == [], f"requests to non-local addresses: {self.foreign}"
        assert self.errors == [], f"errors in the page: {self.errors}"


@pytest.fixture()
def watched(browser: Any) -> Iterator[Watched]:
    context = browser.new_context(viewport={"width": 1280, "height": 900})
    page = context.new_page()
    page.set_default_timeout(15000)
    yield Watched(page)
    context.close()
