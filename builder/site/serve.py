"""``atlas serve``: preview a built site over HTTP on the loopback interface only."""

from __future__ import annotations

import functools
import ipaddress
import threading
from http.server import SimpleHTTPRequestHandler, ThreadingHTTPServer
from pathlib import Path
from typing import Any

from builder.errors import AtlasError

__all__ = ["Preview", "serve"]


class _Quiet(SimpleHTTPRequestHandler):
    def log_message(self, format: str, *args: Any) -> None:
        pass


class Preview:
    """A running preview server (``url``); :meth:`close` stops it."""

    def __init__(self, site: Path, host: str = "127.0.0.1", port: int = 8000,
                 quiet: bool = False) -> None:
        try:
            loopback = ipaddress.ip_address(host).is_loopback
        except ValueError:
            loopback = host == "localhost"
        if not loopback:
            raise AtlasError(f"the preview serves on the loopback interface only "
                             f"(127.0.0.1 or ::1), not {host!r}; for an intranet server copy "
                             "the site folder to it")
        if not (site / "index.html").is_file():
            raise AtlasError(f"no built site in {site} (no index.html): run 'atlas build' first")
        handler = functools.partial(_Quiet if quiet else SimpleHTTPRequestHandler,
                                    directory=str(site))
        self.server = ThreadingHTTPServer((host, port), handler)
        self.server.daemon_threads = True
        shown = f"[{host}]" if ":" in host else host
        self.url = f"http://{shown}:{self.server.server_address[1]}/"
        self._thread: threading.Thread | None = None

    def start(self) -> Preview:
        """Serve in a background thread (for tests)."""
        self._thread = threading.Thread(target=self.server.serve_forever, daemon=True)
        self._thread.start()
        return self

    def close(self) -> None:
        self.server.shutdown()
        self.server.server_close()


def serve(site: Path, host: str = "127.0.0.1", port: int = 8000) -> None:
    """Serve until interrupted (Ctrl-C)."""
    preview = Preview(site, host, port)
    print(f"Serving {site} at {preview.url} (Ctrl-C to stop)", flush=True)
    try:
        preview.server.serve_forever()
    except KeyboardInterrupt:
        pass
    finally:
        preview.server.server_close()
