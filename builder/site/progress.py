"""Progress of long work: a bar on a terminal, plain periodic lines otherwise.

On a terminal, a tqdm bar shows the count, the rate and the time left.  When
the output is not a terminal (CI, a log file), a plain line such as
``  pairs  120/3200 (3.8 %), 41.2/s, about 75 s left`` is printed at most
every ``every_s`` seconds, and once at the end, so a log stays short and
readable.
"""

from __future__ import annotations

import sys
import time
from typing import Any, TextIO

__all__ = ["Progress"]


class Progress:
    """Count ``total`` steps of one stage; use as a context manager and call :meth:`step`."""

    def __init__(self, label: str, total: int, *, stream: TextIO | None = None,
                 every_s: float = 10.0, enabled: bool = True) -> None:
        self.label = label
        self.total = total
        self.count = 0
        self.stream = stream if stream is not None else sys.stderr
        self.every_s = every_s
        self.enabled = enabled and total > 0
        self._started = time.perf_counter()
        self._last = self._started
        self._bar: Any = None
        if self.enabled and _is_terminal(self.stream):
            from tqdm import tqdm

            self._bar = tqdm(total=total, desc=f"  {label}", unit=" " + label.split()[0],
                             file=self.stream, leave=False, dynamic_ncols=True)

    def __enter__(self) -> Progress:
        return self

    def __exit__(self, *exc: object) -> None:
        self.close()

    def step(self, n: int = 1) -> None:
        self.count += n
        if not self.enabled:
            return
        if self._bar is not None:
            self._bar.update(n)
            return
        now = time.perf_counter()
        if now - self._last >= self.every_s and self.count < self.total:
            self._last = now
            self._line(now)

    def line(self) -> str:
        """The plain progress line as of now."""
        now = time.perf_counter()
        elapsed = max(now - self._started, 1e-9)
        rate = self.count / elapsed
        left = (self.total - self.count) / rate if rate > 0 else float("nan")
        share = 100.0 * self.count / self.total if self.total else 100.0
        tail = f", about {left:.0f} s left" if self.count < self.total and rate > 0 else ""
        return (f"  {self.label} {self.count}/{self.total} ({share:.1f} %), "
                f"{rate:.1f}/s{tail}")

    def _line(self, now: float) -> None:
        print(self.line(), file=self.stream, flush=True)

    def close(self) -> None:
        if not self.enabled:
            return
        if self._bar is not None:
            self._bar.close()
            self._bar = None
        elif self.total > 0 and self.count:
            self._line(time.perf_counter())
        self.enabled = False


def _is_terminal(stream: TextIO) -> bool:
    isatty = getattr(stream, "isatty", None)
    try:
        return bool(isatty and isatty())
    except ValueError:  # a closed stream
        return False
