"""Where the per-pair work runs: one small interface, local processes or a Dask cluster.

The build hands its units of work (one pair: compute and draw; one
component: draw) to an :class:`Executor` as a function and a list of
picklable tasks, and receives ``(index, result)`` pairs as they finish, in
any order.  The build puts them back in task order, so the site does not
depend on which worker finished first.

* :class:`LocalExecutor` -- the default: ``workers`` processes on this
  machine (``atlas build --workers N``); one worker runs in the build's own
  process, with no pool at all.
* :class:`DaskExecutor` -- an existing Dask distributed cluster
  (``atlas build --executor dask --scheduler tcp://HOST:8786``); needs the
  optional extra ``.[cluster]`` on the build machine and the same version of
  this package on every worker (the build checks it: each result carries the
  worker's code version, see :func:`builder.site.cache.code_version`).

A task function must be a module-level function of one argument; the tasks
and the results must pickle.
"""

from __future__ import annotations

import multiprocessing
import os
from collections.abc import Callable, Iterator, Sequence
from concurrent.futures import FIRST_COMPLETED, Future, ProcessPoolExecutor, wait
from typing import Any, Protocol, TypeVar

from builder.errors import AtlasError

__all__ = ["DaskExecutor", "Executor", "ExecutorError", "LocalExecutor", "default_workers",
           "make_executor"]

T = TypeVar("T")
R = TypeVar("R")


class ExecutorError(AtlasError):
    """The executor could not be set up (unknown kind, no scheduler, Dask not installed)."""


class Executor(Protocol):
    """Runs ``fn(task)`` for every task; yields ``(index, result)`` as each finishes."""

    name: str

    def run(self, fn: Callable[[Any], Any], tasks: Sequence[Any]) -> Iterator[tuple[int, Any]]:
        ...  # pragma: no cover - a protocol

    def close(self) -> None:
        ...  # pragma: no cover - a protocol


def default_workers() -> int:
    """Local worker processes when none are asked for: the cores, at most 4."""
    return max(1, min(4, os.cpu_count() or 1))


class LocalExecutor:
    """``workers`` processes on this machine (forked where the platform allows)."""

    def __init__(self, workers: int | None = None) -> None:
        self.workers = default_workers() if workers is None else max(1, int(workers))
        self.name = f"local, {self.workers} process{'es' if self.workers > 1 else ''}"
        self._pool: ProcessPoolExecutor | None = None

    def _get_pool(self) -> ProcessPoolExecutor:
        if self._pool is None:
            method = "fork" if "fork" in multiprocessing.get_all_start_methods() else "spawn"
            self._pool = ProcessPoolExecutor(max_workers=self.workers,
                                             mp_context=multiprocessing.get_context(method))
        return self._pool

    def run(self, fn: Callable[[Any], Any], tasks: Sequence[Any]) -> Iterator[tuple[int, Any]]:
        if self.workers == 1 or len(tasks) <= 1:
            for index, task in enumerate(tasks):
                yield index, fn(task)
            return
        pool = self._get_pool()
        # A bounded window of tasks in flight: results are handed on (and may be
        # dropped by the caller) as they finish, so memory does not grow with the atlas.
        window = 4 * self.workers
        pending: dict[Future[Any], int] = {}
        queue = iter(enumerate(tasks))
        for index, task in queue:
            pending[pool.submit(fn, task)] = index
            if len(pending) >= window:
                break
        while pending:
            done, _ = wait(pending, return_when=FIRST_COMPLETED)
            for future in sorted(done, key=pending.__getitem__):
                index = pending.pop(future)
                yield index, future.result()
                nxt = next(queue, None)
                if nxt is not None:
                    pending[pool.submit(fn, nxt[1])] = nxt[0]

    def close(self) -> None:
        if self._pool is not None:
            self._pool.shutdown(cancel_futures=True)
            self._pool = None


class DaskExecutor:
    """The workers of an existing Dask distributed cluster, reached through its scheduler."""

    def __init__(self, scheduler: str, timeout_s: float = 30.0) -> None:
        try:
            from distributed import Client
        except ImportError:
            raise ExecutorError("the Dask executor needs the optional extra: "
                                "pip install -e '.[cluster]'") from None
        try:
            self._client = Client(scheduler, timeout=timeout_s, set_as_default=False)
        except OSError as error:
            raise ExecutorError(f"no Dask scheduler answered at {scheduler}: {error}") from None
        self.name = f"dask, scheduler {scheduler}"

    def run(self, fn: Callable[[Any], Any], tasks: Sequence[Any]) -> Iterator[tuple[int, Any]]:
        from distributed import as_completed

        if not tasks:
            return
        futures = self._client.map(fn, list(tasks), pure=False)
        index = {future.key: i for i, future in enumerate(futures)}
        for future in as_completed(futures, loop=self._client.loop):
            i = index[future.key]
            yield i, future.result()
            future.release()

    def close(self) -> None:
        self._client.close()


def make_executor(kind: str = "local", *, workers: int | None = None,
                  scheduler: str | None = None) -> Executor:
    """The executor the command line asks for (``local`` or ``dask``)."""
    if kind == "local":
        return LocalExecutor(workers)
    if kind == "dask":
        if not scheduler:
            raise ExecutorError("the Dask executor needs a scheduler address: "
                                "--scheduler tcp://HOST:8786")
        return DaskExecutor(scheduler)
    raise ExecutorError(f"unknown executor {kind!r}: expected 'local' or 'dask'")
